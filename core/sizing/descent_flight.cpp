#include "sizing/descent_flight.hpp"

#include "sizing/environment.hpp"

namespace ds {
namespace {

Phase under_canopy_phase(const DescentPlan& plan, double floor_altitude_m) {
    Phase phase;
    phase.name = "parachute";
    phase.stage.drag_devices = {plan.canopy, plan.entry_vehicle};
    phase.ends = {{"floor", FlightQuantity::altitude, floor_altitude_m, EventDirection::falling}};
    phase.quasi_steady_when_settled = plan.quasi_steady;
    return phase;
}

/// Room for the descent's record from the start, so it is seldom copied as it grows: a
/// descent under a canopy takes some tens of steps (our choice).
constexpr std::size_t expected_descent_steps = 128;

}  // namespace

DescentFlight fly_descent(const Design& design, const FlightModel& model, const DescentPlan& plan,
                          double deploy_time_s, const FlightState& deploy_state) {
    DescentFlight out;
    out.plan = plan;
    out.deploy_time_s = deploy_time_s;
    const auto settings = design_integrator_settings(design);
    const double t_budget = design.solver.max_time_s;
    Phase under_canopy = under_canopy_phase(plan, plan.floor_altitude_m);
    out.record.steps().reserve(expected_descent_steps);
    const PhaseRecording recording{plan.record_samples ? &out.samples : nullptr, &out.record};

    // With the heat shield: until the jettison delay runs out, or the dynamic pressure falls
    // through the design's jettison value.
    const SequenceDesign& seq = design.sequence;
    double t_end = t_budget;
    if (seq.heat_shield_jettison_dynamic_pressure_Pa) {
        under_canopy.ends.push_back({"heat-shield jettison", FlightQuantity::dynamic_pressure,
                                     *seq.heat_shield_jettison_dynamic_pressure_Pa,
                                     EventDirection::falling});
    } else {
        t_end = std::min(t_budget, deploy_time_s + seq.heat_shield_jettison_delay_s.value_or(
                                                       SequenceDesign::default_jettison_delay_s));
    }
    const PhaseOutcome first =
        fly_phase(model, under_canopy, deploy_time_s, deploy_state, t_end, settings, recording);
    out.quasi_steady_steps = first.quasi_steady_steps;
    out.evaluations = first.evaluations;
    out.evaluations_with_heat_shield = first.evaluations;
    const bool floor_first = first.ended_by == std::size_t{0};
    const bool jettison_event = first.reason == StopReason::terminal_event && !floor_first;
    const bool jettison_delay = first.reason == StopReason::reached_end && t_end < t_budget;
    if (!(jettison_event || jettison_delay)) {
        out.reached_floor = floor_first;
        out.stop_reason = first.reason;
        return out;
    }
    out.jettisoned = true;
    out.jettison_time_s = first.time_s;
    out.jettison_state = first.y;

    // Without it, down to the floor.
    FlightState y = first.y;
    y[StateIndex::mass] -= plan.jettison_mass_kg;
    under_canopy.ends.resize(1);  // the floor only
    under_canopy.stage.drag_devices.back() = {plan.body_drag_area_m2, 1.0, {}};
    const PhaseOutcome second =
        fly_phase(model, under_canopy, first.time_s, y, t_budget, settings, recording);
    out.quasi_steady_steps += second.quasi_steady_steps;
    out.evaluations += second.evaluations;
    out.reached_floor = second.reason == StopReason::terminal_event;
    out.stop_reason = second.reason;
    return out;
}

void extend_descent(const Design& design, const FlightModel& model, DescentFlight& descent,
                    double floor_altitude_m) {
    if (!descent.reached_floor || !descent.jettisoned ||
        floor_altitude_m >= descent.plan.floor_altitude_m) {
        return;
    }
    const double t = descent.record.end_time();
    const FlightState y = descent.record.state_at(t);
    descent.plan.floor_altitude_m = floor_altitude_m;
    const PhaseOutcome more =
        fly_phase(model, under_canopy_phase(descent.plan, floor_altitude_m), t, y,
                  design.solver.max_time_s, design_integrator_settings(design),
                  {descent.plan.record_samples ? &descent.samples : nullptr, &descent.record});
    descent.quasi_steady_steps += more.quasi_steady_steps;
    descent.evaluations += more.evaluations;
    descent.reached_floor = more.reason == StopReason::terminal_event;
    descent.stop_reason = more.reason;
}

}  // namespace ds
