#include "flight/phase.hpp"

#include <cmath>

#include "constants.hpp"

namespace ds {

double flight_quantity(FlightQuantity quantity, const FlightConditions& conditions,
                       const FlightState& y) {
    switch (quantity) {
        case FlightQuantity::altitude: return y[StateIndex::altitude];
        case FlightQuantity::velocity: return y[StateIndex::velocity];
        case FlightQuantity::mach: return conditions.mach;
        case FlightQuantity::dynamic_pressure: return conditions.dynamic_pressure_Pa;
        case FlightQuantity::deceleration: return conditions.deceleration_g;
        case FlightQuantity::heat_flux: return conditions.convective_heat_flux_W_m2;
        case FlightQuantity::radiative_heat_flux: return conditions.radiative_heat_flux_W_m2;
    }
    return 0.0;
}

TrajectorySample trajectory_sample(double time_s, const FlightConditions& c,
                                   const FlightState& y) {
    constexpr double per_cm2 = 1e-4;
    return {time_s,
            y[StateIndex::altitude],
            y[StateIndex::downrange],
            y[StateIndex::velocity],
            radians_to_degrees(y[StateIndex::flight_path_angle]),
            c.mach,
            c.dynamic_pressure_Pa,
            c.deceleration_g,
            c.convective_heat_flux_W_m2 * per_cm2,
            c.radiative_heat_flux_W_m2 * per_cm2};
}

IntegratorSettings<flight_state_size> flight_integrator_settings(double relative_tolerance,
                                                                 std::size_t max_steps) {
    IntegratorSettings<flight_state_size> s;
    s.relative_tolerance = relative_tolerance;
    s.max_steps = max_steps;
    // Absolute floors: the relative tolerance times a typical size of each state (100 km,
    // 100 km, 1 km/s, 1 rad, 1 t, 1 MJ/m^2, 1 MJ/m^2), so one tolerance sets both.
    FlightState typical;
    typical << 1e5, 1e5, 1e3, 1.0, 1e3, 1e6, 1e6;
    s.absolute_tolerance = relative_tolerance * typical;
    s.initial_step = 0.1;
    s.event_time_tolerance = 1e-7;
    return s;
}

PhaseOutcome fly_phase(const FlightModel& model, const Phase& phase, double t0,
                       const FlightState& y0, double t_max,
                       const IntegratorSettings<flight_state_size>& settings,
                       PhaseRecording recording) {
    const Stage& stage = phase.stage;
    const auto rhs = [&](double, const FlightState& y) { return flight_derivative(model, stage, y); };
    const auto quantity = [&](FlightQuantity q, const FlightState& y) {
        return flight_quantity(q, flight_conditions(model, stage, y), y);
    };

    const auto descending = [](double, const FlightState& y) {
        return y[StateIndex::flight_path_angle] < 0.0;
    };
    std::vector<Event<flight_state_size>> events;
    for (const Trigger& trigger : phase.ends) {
        events.push_back({[&, trigger](double, const FlightState& y) {
                              return quantity(trigger.quantity, y) - trigger.value;
                          },
                          trigger.direction, true});
        if (trigger.descending_only) events.back().counts = descending;
    }
    // A peak is where the logarithmic rate of its quantity falls through zero. The rate is a
    // central difference along the flow, y +- dt y', so every quantity, whatever its model,
    // is served by the same event.
    constexpr double rate_step_s = 1e-3;
    for (const Peak& peak : phase.peaks) {
        events.push_back({[&, peak](double, const FlightState& y) {
                              const FlightState dy = rate_step_s * rhs(0.0, y);
                              const double ahead = quantity(peak.quantity, y + dy);
                              const double behind = quantity(peak.quantity, y - dy);
                              if (!(ahead > 0.0 && behind > 0.0)) return 0.0;
                              return std::log(ahead / behind);
                          },
                          EventDirection::falling, false});
    }

    const auto on_step = [&](double t, const FlightState& y) {
        if (recording.history) {
            recording.history->push_back(
                trajectory_sample(t, flight_conditions(model, stage, y), y));
        }
    };
    const IntegrationOutcome<flight_state_size> run = integrate_dormand_prince<flight_state_size>(
        rhs, t0, y0, t_max, events, settings, on_step,
        recording.dense ? &recording.dense->steps() : nullptr);
    if (recording.dense) recording.dense->set_end_time(run.t);

    PhaseOutcome out;
    out.reason = run.reason;
    out.time_s = run.t;
    out.y = run.y;
    out.steps = run.accepted_steps;
    out.evaluations = run.evaluations;
    for (const EventHit<flight_state_size>& hit : run.events) {
        if (hit.index < phase.ends.size()) {
            out.ended_by = hit.index;
            continue;
        }
        const std::size_t p = hit.index - phase.ends.size();
        out.peaks.push_back({p, hit.t, quantity(phase.peaks[p].quantity, hit.y), hit.y});
    }
    return out;
}

}  // namespace ds
