#pragma once

#include <string>

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// The readable summary of `descent-sizer size`: tables with units on every number, failing
/// checks first, and the caution that these are conceptual estimates.
std::string format_summary(const Design& design, const Results& results);

}  // namespace ds
