#pragma once

#include "mass/maturity.hpp"

namespace ds {

/// Mass growth allowance of an item by design maturity, as a fraction of its basic mass:
/// estimated 18 %, layout 12 %, pre-release 8 %, released 4 %, existing 2 %, actual 0 %
/// (AIAA S-120, mass properties control, structure/thermal/mechanisms/propulsion column;
/// from memory: verify against the standard before relying on it).
double growth_allowance(Maturity maturity);

}  // namespace ds
