#pragma once

#include <vector>

#include "checks/check.hpp"
#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// Every limit check that applies to these results, against the design's limits: the heritage
/// envelope (the launcher fairing for every design, the rest for Mars only), the parachute's
/// deploy window, the loads, the terminal descent and the timeline.
std::vector<Check> limit_checks(const Design& design, const Results& results);

}  // namespace ds
