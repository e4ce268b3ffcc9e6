#pragma once

#include <vector>

#include "design/design.hpp"
#include "flight/phase.hpp"

namespace ds {

/// What hangs under the canopy, and what it drops.
struct DescentPlan {
    DragDevice canopy;
    DragDevice entry_vehicle;        ///< the vehicle under the canopy, heat shield on
    double body_drag_area_m2 = 0.0;  ///< Cd A of the vehicle under it after heat-shield jettison
    double jettison_mass_kg = 0.0;   ///< dropped at heat-shield jettison
    double floor_altitude_m = 0.0;   ///< flown down to here
    /// Fly the settled descent on the quasi-steady equations (Phase::quasi_steady_when_settled);
    /// false flies the full equations throughout, to check the one against the other.
    bool quasi_steady = true;
    /// Keep a trajectory sample per step (DescentFlight::samples), for a history.
    bool record_samples = true;
};

/// The descent under the canopy from deploy: with the heat shield until its jettison, then
/// without it, down to the floor altitude, kept as a dense trajectory for the terminal solver.
struct DescentFlight {
    DescentPlan plan;
    double deploy_time_s = 0.0;
    bool jettisoned = false;
    double jettison_time_s = 0.0;
    FlightState jettison_state;
    bool reached_floor = false;
    StopReason stop_reason = StopReason::terminal_event;  ///< why, when not reached_floor
    std::size_t quasi_steady_steps = 0;  ///< of the record's steps, on the quasi-steady equations
    std::size_t evaluations = 0;  ///< of the equations by the integrator, rejected steps included
    std::size_t evaluations_with_heat_shield = 0;  ///< of those, before the heat shield's jettison
    DenseTrajectory record;
    std::vector<TrajectorySample> samples;  ///< one per accepted step, deploy to floor (if asked)
};

DescentFlight fly_descent(const Design& design, const FlightModel& model, const DescentPlan& plan,
                          double deploy_time_s, const FlightState& deploy_state);

/// Flies a descent that reached its floor on down to a lower one, extending its record (to
/// look at sites below the design's). Does nothing to a descent that stopped short.
void extend_descent(const Design& design, const FlightModel& model, DescentFlight& descent,
                    double floor_altitude_m);

}  // namespace ds
