#pragma once

// What the flight suites that check the project against an independent integration share: the
// project's own flight from a start state to a falling-Mach deploy, with its peaks (a
// reference's peaks are found by numerics/maximum.hpp's maximum_of).

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <functional>

#include "flight/phase.hpp"

namespace ds::test {

/// The project's flight: the deploy and its peaks.
struct ProjectFlight {
    PhaseOutcome outcome;
    double peak_deceleration_g = 0.0;
    double peak_heat_flux = 0.0;
};

/// Flies `stage` from `y0` (2000 s at the most) until the Mach number falls through
/// `deploy_mach`, with the integrator's `tolerance` and `max_steps`.
inline ProjectFlight project_flight(const FlightModel& model, const Stage& stage,
                                    const FlightState& y0, double deploy_mach, double tolerance,
                                    std::size_t max_steps) {
    Phase phase;
    phase.stage = stage;
    phase.ends = {{"deploy", FlightQuantity::mach, deploy_mach, EventDirection::falling}};
    phase.peaks = {{"decel", FlightQuantity::deceleration}, {"heat", FlightQuantity::heat_flux}};
    ProjectFlight f;
    f.outcome =
        fly_phase(model, phase, 0.0, y0, 2000.0, flight_integrator_settings(tolerance, max_steps));
    for (const PeakHit& hit : f.outcome.peaks) {
        double& slot = hit.peak == 0 ? f.peak_deceleration_g : f.peak_heat_flux;
        slot = std::max(slot, hit.value);
    }
    return f;
}

}  // namespace ds::test
