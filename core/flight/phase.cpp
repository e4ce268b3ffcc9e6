#include "flight/phase.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <type_traits>
#include <utility>

#include "constants.hpp"

namespace ds {

double flight_quantity(FlightQuantity quantity, const FlightConditions& conditions,
                       const FlightState& y) {
    switch (quantity) {
        case FlightQuantity::altitude:
            return y[StateIndex::altitude];
        case FlightQuantity::velocity:
            return speed(y);
        case FlightQuantity::mach:
            return conditions.mach;
        case FlightQuantity::dynamic_pressure:
            return conditions.dynamic_pressure_Pa;
        case FlightQuantity::deceleration:
            return conditions.deceleration_g;
        case FlightQuantity::heat_flux:
            return conditions.convective_heat_flux_W_m2;
        case FlightQuantity::radiative_heat_flux:
            return conditions.radiative_heat_flux_W_m2;
        case FlightQuantity::flight_path_angle:
            return radians_to_degrees(flight_path_angle_rad(y));
        case FlightQuantity::sensed_deceleration:
            return conditions.sensed_deceleration_g;
    }
    return 0.0;
}

TrajectorySample trajectory_sample(double time_s, const FlightConditions& c, const FlightState& y) {
    constexpr double per_cm2 = 1e-4;
    TrajectorySample s;
    s.time_s = time_s;
    s.altitude_m = y[StateIndex::altitude];
    s.velocity_m_s = speed(y);
    s.flight_path_angle_deg = radians_to_degrees(flight_path_angle_rad(y));
    s.mach = c.mach;
    s.dynamic_pressure_Pa = c.dynamic_pressure_Pa;
    s.deceleration_g = c.deceleration_g;
    s.heat_flux_W_cm2 = c.convective_heat_flux_W_m2 * per_cm2;
    s.radiative_heat_flux_W_cm2 = c.radiative_heat_flux_W_m2 * per_cm2;
    s.latitude_deg = radians_to_degrees(y[StateIndex::latitude]);
    s.longitude_deg = radians_to_degrees(y[StateIndex::longitude]);
    s.azimuth_deg = radians_to_degrees(azimuth_rad(y));
    s.throttle = c.throttle;
    s.thrust_coefficient = c.thrust_coefficient;
    s.sensed_deceleration_g = c.sensed_deceleration_g;
    return s;
}

IntegratorSettings<flight_state_size> flight_integrator_settings(double relative_tolerance,
                                                                 std::size_t max_steps) {
    IntegratorSettings<flight_state_size> s;
    s.relative_tolerance = relative_tolerance;
    s.max_steps = max_steps;
    // Absolute floors: the relative tolerance times a typical size of each state (100 km,
    // 0.01 rad of latitude and longitude (some 30 to 60 km), 1 km/s for each component of the
    // velocity, 1 t, 1 MJ/m^2, 1 MJ/m^2), so one tolerance sets both.
    FlightState typical;
    typical << 1e5, 1e-2, 1e-2, 1e3, 1e3, 1e3, 1e3, 1e6, 1e6;
    s.absolute_tolerance = relative_tolerance * typical;
    s.initial_step = 0.1;
    s.event_time_tolerance = 1e-7;
    return s;
}

namespace {

/// Which equations fly a stretch of a phase.
enum class Equations { full, quasi_steady };

/// A flight has settled when its fast rates (unsettled_rate) and the deceleration of the
/// quasi-steady model have both fallen below this, in g. The speed is then within some 5e-4 of
/// its equilibrium and the path within 1e-3 rad of its own, and the quasi-steady model, whose
/// error goes as the square of that deceleration, is good to about 1e-6 in speed, near the full
/// equations' own error at the default tolerance. Above it the fast modes are less than a
/// thousand times faster than the descent itself, and stiffness costs the full equations
/// little (our choice).
constexpr double settle_rate_g = 1e-3;
/// It unsettles when the quasi-steady deceleration rises past this, in g: twice the settling
/// value, so that the two changes cannot chase each other (our choice).
constexpr double unsettle_rate_g = 2e-3;

/// A trigger that counts only in descending flight asks this of the state at its crossing.
bool descending(const FlightState& y) {
    return y[StateIndex::up_velocity] < 0.0;
}

/// Altitude, speed and the flight-path angle are read off the state; the other quantities need
/// its flight conditions.
bool read_off_state(FlightQuantity q) {
    return q == FlightQuantity::altitude || q == FlightQuantity::velocity ||
           q == FlightQuantity::flight_path_angle;
}

/// The part of the flight conditions a quantity that needs them is computed from.
ConditionParts parts_for(FlightQuantity q) {
    switch (q) {
        case FlightQuantity::deceleration:
        case FlightQuantity::sensed_deceleration:
            return ConditionParts::forces;
        case FlightQuantity::heat_flux:
        case FlightQuantity::radiative_heat_flux:
            return ConditionParts::heating;
        case FlightQuantity::mach:
        case FlightQuantity::dynamic_pressure:
            return ConditionParts::air;
        case FlightQuantity::altitude:
        case FlightQuantity::velocity:
        case FlightQuantity::flight_path_angle:
            break;
    }
    return ConditionParts::all;
}

/// A quantity at a state: read off it, or from the part of its conditions the quantity needs.
double quantity_at(const FlightModel& model, const Stage& stage, FlightQuantity q,
                   const FlightState& y) {
    if (read_off_state(q))
        return flight_quantity(q, no_conditions, y);
    return flight_quantity(q, flight_conditions(model, stage, y, parts_for(q)), y);
}

/// The acceleration of the quasi-steady model (the norm of its velocity's rate), in g.
double quasi_steady_rate(const FlightModel& model, const Stage& stage, const FlightState& y) {
    const FlightState dy = quasi_steady_derivative(model, stage, y);
    return std::hypot(dy[StateIndex::east_velocity], dy[StateIndex::north_velocity],
                      dy[StateIndex::up_velocity]) /
           model.body.gravity_m_s2(y[StateIndex::altitude]);
}

/// Negative once settled: of the sign of the larger of the two rates less settle_rate_g (the
/// quasi-steady one is computed only when the fast rates are below it).
/// From the state's derivative by the full equations, dy.
double settling(const FlightModel& model, const Stage& stage, const FlightState& y,
                const FlightState& dy) {
    const double fast = unsettled_rate(model, y, dy);
    if (!(fast < settle_rate_g))
        return fast - settle_rate_g;
    return std::max(fast, quasi_steady_rate(model, stage, y)) - settle_rate_g;
}

double settling(const FlightModel& model, const Stage& stage, const FlightState& y) {
    return settling(model, stage, y, flight_derivative(model, stage, y));
}

/// The event that says a stretch's equations should change: settled on the full equations
/// (whose derivative `rhs` gives), unsettled on the quasi-steady ones.
template <class Rhs>
Event<flight_state_size> change_of_equations(const FlightModel& model, const Stage& stage,
                                             Equations equations, const Rhs& rhs) {
    if (equations == Equations::full) {
        return {[&model, &stage, &rhs](double, const FlightState& y) {
                    return settling(model, stage, y, rhs(0.0, y));
                },
                EventDirection::falling, true};
    }
    return {[&model, &stage](double, const FlightState& y) {
                return quasi_steady_rate(model, stage, y) - unsettle_rate_g;
            },
            EventDirection::rising, true};
}

/// What a phase computed at the last state its equations or its events were evaluated at: the
/// flight conditions and the derivative, each once asked for. The integrator's last stage of a
/// step is the step's end (first same as last), where every event is then asked, and a peak's
/// slope asks the derivative where its value was asked. Keyed on the state itself (the altitude
/// first: two states a step apart differ there), so a hit gives the very numbers a fresh
/// evaluation would. One state is enough: three kept the same share of hits but for a state an
/// event's root-finding left behind, and cost more to look through.
class StateMemo {
public:
    struct Entry {
        FlightState y;
        std::optional<FlightConditions> conditions;
        std::optional<FlightState> rates;
    };

    /// Whether the state is the last one.
    bool holds(const FlightState& y) const {
        return last_.y[StateIndex::altitude] == y[StateIndex::altitude] && last_.y == y;
    }

    /// The last state's entry.
    Entry& last() { return last_; }

    /// The entry of the state, a fresh one (nothing computed) when it is not the last one.
    Entry& at(const FlightState& y) {
        if (!holds(y)) {
            last_.y = y;
            last_.conditions.reset();
            last_.rates.reset();
        }
        return last_;
    }

private:
    /// Before the first state: one that equals none (NaN compares unequal to everything).
    Entry last_{FlightState::Constant(std::numeric_limits<double>::quiet_NaN()), {}, {}};
};

/// What a function returns, made where it is emplaced: std::optional::emplace(InPlace{f})
/// constructs its value from f()'s result directly (C++17's guaranteed copy elision through the
/// conversion), where assigning f() would make it and then copy it in.
template <class F>
struct InPlace {
    F make;
    operator std::invoke_result_t<F&>() { return make(); }
};
template <class F>
InPlace(F) -> InPlace<F>;  // (clang 14 deduces no aggregate's arguments without it)

/// Flies a phase on one set of equations until a trigger, t_max or the step budget, or (with
/// `may_change`) until its equations should change: that event comes after the peaks.
IntegrationOutcome<flight_state_size> fly_stretch(
    const FlightModel& model, const Phase& phase, Equations equations, bool may_change, double t0,
    const FlightState& y0, double t_max, const IntegratorSettings<flight_state_size>& settings,
    PhaseRecording recording) {
    const Stage& stage = phase.stage;
    StateMemo memo;
    // Each computed straight into the memo's entry (InPlace), not copied into it.
    const auto conditions_of = [&](StateMemo::Entry& e) -> const FlightConditions& {
        if (!e.conditions)
            e.conditions.emplace(InPlace{[&] { return flight_conditions(model, stage, e.y); }});
        return *e.conditions;
    };
    const auto conditions_at = [&](const FlightState& y) -> const FlightConditions& {
        return conditions_of(memo.at(y));
    };
    const bool air = feels_air(stage);
    // The full equations take the conditions from the memo the events read too; an interior
    // stage of a step, whose state nothing else asks for, passes it by.
    const auto rhs = [&](double, const FlightState& y, auto... interior) -> decltype(auto) {
        if constexpr (sizeof...(interior) > 0) {
            if (equations == Equations::quasi_steady)
                return quasi_steady_derivative(model, stage, y);
            return flight_derivative(model, stage, y);
        } else {
            StateMemo::Entry& e = memo.at(y);
            if (!e.rates) {
                e.rates.emplace(InPlace{[&] {
                    if (equations == Equations::quasi_steady)
                        return quasi_steady_derivative(model, stage, e.y);
                    if (!air)
                        return flight_derivative(model, stage, e.y);
                    // The frame before the conditions, as flight_derivative makes them.
                    const LocalFrame frame = local_frame(model, e.y);
                    return flight_derivative(model, stage, e.y, conditions_of(e), frame);
                }});
            }
            return std::as_const(*e.rates);
        }
    };
    // At the memo's state (a step's end, where every event is asked) a quantity takes all the
    // conditions, kept for the others; elsewhere (a search on the continuous extension, for a
    // trigger's crossing or a peak's slope, whose states nothing else asks for) quantity_at
    // computes only the part it needs, and the memo keeps its state.
    const auto quantity = [&](FlightQuantity q, const FlightState& y) {
        if (!read_off_state(q) && memo.holds(y))
            return flight_quantity(q, conditions_of(memo.last()), y);
        return quantity_at(model, stage, q, y);
    };

    std::vector<Event<flight_state_size>> events;
    events.reserve(phase.ends.size() + phase.peaks.size() + 1);
    // Each event's function holds pointers only, so std::function keeps it without allocating.
    for (const Trigger& trigger : phase.ends) {
        events.push_back({[&quantity, t = &trigger](double, const FlightState& y) {
                              return quantity(t->quantity, y) - t->value;
                          },
                          trigger.direction, true});
        if (trigger.descending_only) {
            events.back().counts = [](double, const FlightState& y) { return descending(y); };
        }
    }
    // A peak is a local maximum of its quantity: the integrator sees it from the quantity at
    // the steps' ends (in the memo: the step's last stage was evaluated there), whatever the
    // quantity's model, and places it where the logarithmic rate of the quantity falls through
    // zero. The rate is a central difference along the flow, y +- dt y', so every quantity,
    // whatever its model, is served by the same event; it is asked only near a peak.
    static constexpr double rate_step_s = 1e-3;
    for (const Peak& peak : phase.peaks) {
        Event<flight_state_size> event{
            [&quantity, q = peak.quantity](double, const FlightState& y) { return quantity(q, y); },
            EventDirection::any, false};
        event.kind = EventKind::maximum;
        event.slope = [&quantity, &rhs, q = peak.quantity](double, const FlightState& y) {
            const FlightState dy = rate_step_s * rhs(0.0, y);
            const double ahead = quantity(q, y + dy);
            const double behind = quantity(q, y - dy);
            if (!(ahead > 0.0 && behind > 0.0))
                return 0.0;
            return std::log(ahead / behind);
        };
        events.push_back(std::move(event));
    }
    if (may_change)
        events.push_back(change_of_equations(model, stage, equations, rhs));

    // A step's end is where the step's last stage and the events were evaluated: its
    // conditions are in the memo.
    const auto on_step = [&](double t, const FlightState& y) {
        if (recording.history)
            recording.history->push_back(trajectory_sample(t, conditions_at(y), y));
    };
    const IntegrationOutcome<flight_state_size> run = integrate_dormand_prince<flight_state_size>(
        rhs, t0, y0, t_max, events, settings, on_step,
        recording.dense ? &recording.dense->steps() : nullptr);
    if (recording.dense)
        recording.dense->set_end_time(run.t);
    return run;
}

/// The trigger, if any, that moving the state onto the equilibrium carries it across: the
/// full equations would have crossed it in the transient that the move skips.
std::optional<std::size_t> trigger_skipped(const FlightModel& model, const Phase& phase,
                                           const FlightState& from, const FlightState& to) {
    for (std::size_t i = 0; i < phase.ends.size(); ++i) {
        const Trigger& trigger = phase.ends[i];
        const double before =
            quantity_at(model, phase.stage, trigger.quantity, from) - trigger.value;
        const double after = quantity_at(model, phase.stage, trigger.quantity, to) - trigger.value;
        const bool counts = !trigger.descending_only || descending(to);
        if (counts && detail::crosses(before, after, trigger.direction))
            return i;
    }
    return std::nullopt;
}

/// Moves the outcome's state onto the equilibrium. True when that carries it across a trigger,
/// which then ends the phase there.
bool settle(const FlightModel& model, const Phase& phase, PhaseOutcome& out) {
    const FlightState settled = onto_equilibrium(model, phase.stage, out.y);
    out.ended_by = trigger_skipped(model, phase, out.y, settled);
    out.y = settled;
    if (!out.ended_by)
        return false;
    out.reason = StopReason::terminal_event;
    return true;
}

/// Adds a stretch to the phase's outcome: its steps, peaks, trigger and where it ended. True
/// when it ended on a change of equations.
bool add_stretch(const Phase& phase, Equations equations,
                 const IntegrationOutcome<flight_state_size>& run, PhaseOutcome& out) {
    out.reason = run.reason;
    out.time_s = run.t;
    out.y = run.y;
    out.steps += run.accepted_steps;
    out.evaluations += run.evaluations;
    if (equations == Equations::quasi_steady)
        out.quasi_steady_steps += run.accepted_steps;
    bool changed = false;
    for (const EventHit<flight_state_size>& hit : run.events) {
        if (hit.index < phase.ends.size()) {
            out.ended_by = hit.index;
            continue;
        }
        const std::size_t p = hit.index - phase.ends.size();
        if (p == phase.peaks.size()) {
            changed = true;
            continue;
        }
        out.peaks.push_back({p, hit.t, hit.value, hit.y});  // (the peak's quantity there)
    }
    return changed;
}

}  // namespace

PhaseOutcome fly_phase(const FlightModel& model, const Phase& phase, double t0,
                       const FlightState& y0, double t_max,
                       const IntegratorSettings<flight_state_size>& settings,
                       PhaseRecording recording) {
    const Stage& stage = phase.stage;
    const bool may_settle =
        phase.quasi_steady_when_settled && stage.thrust_N == 0.0 && stage.lift_to_drag == 0.0;
    Equations equations =
        may_settle && settling(model, stage, y0) < 0.0 ? Equations::quasi_steady : Equations::full;
    PhaseOutcome out;
    out.time_s = t0;
    out.y = y0;
    for (;;) {
        if (equations == Equations::quasi_steady && settle(model, phase, out))
            return out;
        IntegratorSettings<flight_state_size> budget = settings;
        budget.max_steps -= out.steps;
        const IntegrationOutcome<flight_state_size> run = fly_stretch(
            model, phase, equations, may_settle, out.time_s, out.y, t_max, budget, recording);
        if (!add_stretch(phase, equations, run, out))
            return out;
        equations = equations == Equations::full ? Equations::quasi_steady : Equations::full;
    }
}

}  // namespace ds
