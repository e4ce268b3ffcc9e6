#pragma once

#include <string>

#include "trade/dispersion.hpp"

namespace ds {

/// A campaign's success in one sentence, for the command line, the trade tab and the sheet:
/// "Success probability 97.50 % (39 of 40 cases with no failing check); 95 % interval 87.12 to
/// 99.56 % (Wilson score interval)."
std::string success_probability_sentence(const DispersionSummary& summary);

}  // namespace ds
