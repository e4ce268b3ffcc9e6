#include "trade/success_probability.hpp"

#include <fmt/format.h>

namespace ds {

std::string success_probability_sentence(const DispersionSummary& summary) {
    constexpr double percent = 100.0;
    return fmt::format(
        "Success probability {:.2f} % ({} of {} cases with no failing check); 95 % "
        "interval {:.2f} to {:.2f} % (Wilson score interval).",
        summary.success_probability * percent, summary.successes, summary.runs,
        summary.wilson_low * percent, summary.wilson_high * percent);
}

}  // namespace ds
