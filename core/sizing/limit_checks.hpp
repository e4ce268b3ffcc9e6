#pragma once

#include <optional>
#include <vector>

#include "checks/check.hpp"
#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// The supersonic parachute deploy window that applies to a design: each bound of the Mars
/// heritage window on Mars; elsewhere only the bounds the design sets itself (a value other
/// than the Mars default). The checks and the window's shading on the charts both read it.
struct DeployWindow {
    std::optional<double> mach_max;
    std::optional<double> dynamic_pressure_min_Pa;
    std::optional<double> dynamic_pressure_max_Pa;

    bool any() const { return mach_max || dynamic_pressure_min_Pa || dynamic_pressure_max_Pa; }
};

DeployWindow deploy_window(const Design& design);

/// Every limit check that applies to these results, against the design's limits: the heritage
/// envelope (the launcher fairing for every design, the rest for Mars only), the parachute's
/// deploy window, the loads, the terminal descent and the timeline.
/// Judged only (Wording::judged_only), the checks carry no messages and no sources.
std::vector<Check> limit_checks(const Design& design, const Results& results,
                                Wording wording = Wording::words);

}  // namespace ds
