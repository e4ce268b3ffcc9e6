#include "sizing/terminal_burn.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <functional>
#include <limits>
#include <optional>

#include <boost/math/tools/toms748_solve.hpp>

#include "constants.hpp"
#include "numerics/illinois.hpp"

namespace ds {
namespace {

constexpr double flight_time_limit_s = 3600.0;

/// Raises a burn's peaks to what a flown phase saw (its located maxima and its two ends).
void raise_burn_peaks(const FlightModel& model, const Phase& phase, const FlightState& y0,
                      const PhaseOutcome& flown, BurnSolution& b) {
    const auto raise = [&](const FlightState& y) {
        const FlightConditions c = flight_conditions(model, phase.stage, y);
        b.peak_sensed_deceleration_g =
            std::max(b.peak_sensed_deceleration_g, c.sensed_deceleration_g);
        b.peak_dynamic_pressure_Pa = std::max(b.peak_dynamic_pressure_Pa, c.dynamic_pressure_Pa);
    };
    raise(y0);
    raise(flown.y);
    for (const PeakHit& hit : flown.peaks)
        raise(hit.y);
}

}  // namespace

Stage burn_stage(const BurnRequest& r) {
    Stage stage;
    stage.drag_devices = r.drag_devices;
    stage.thrust_N = r.thrust_N;
    stage.specific_impulse_s = r.specific_impulse_s;
    stage.throttle = r.throttle;
    stage.thrust_reference_area_m2 = r.thrust_reference_area_m2;
    return stage;
}

BurnAttempt fly_burn(const FlightModel& model, const BurnRequest& r,
                     const IntegratorSettings<flight_state_size>& settings, double t_s,
                     FlightState separation_state, std::vector<TrajectorySample>* history) {
    BurnAttempt a;
    BurnSolution& b = a.burn;
    b.throttle = r.throttle;
    b.separation_time_s = t_s;
    b.separation_state = separation_state;
    b.separation_state[StateIndex::mass] = r.lander_mass_kg;
    const Trigger ground{"ground", FlightQuantity::altitude, r.site_elevation_m,
                         EventDirection::falling};

    Phase coast;
    coast.name = "coast";
    coast.stage.drag_devices = r.drag_devices;
    coast.ends = {ground};
    const PhaseOutcome coasted = fly_phase(model, coast, t_s, b.separation_state, t_s + r.coast_s,
                                           settings, {history, nullptr});
    b.evaluations = coasted.evaluations;
    b.ignition_time_s = coasted.time_s;
    b.ignition_state = coasted.y;
    if (coasted.reason == StopReason::terminal_event) {  // hit the ground while coasting
        b.end_time_s = coasted.time_s;
        b.end_state = coasted.y;
        return a;
    }

    // Already at or below the end velocity: nothing to burn. The burn's end (the velocity
    // falling through the target) would never come, and thrust would stop the lander and lift it.
    if (speed(coasted.y) <= r.end_velocity_m_s) {
        a.reached_velocity = true;
        b.end_time_s = coasted.time_s;
        b.end_state = coasted.y;
        return a;
    }

    Phase burn;
    burn.name = "terminal burn";
    burn.stage = burn_stage(r);
    const Trigger end_of_burn{"end of burn", FlightQuantity::velocity, r.end_velocity_m_s,
                              EventDirection::falling};
    burn.ends = {end_of_burn, ground};
    double t = coasted.time_s;
    FlightState y = coasted.y;
    PhaseOutcome burned;
    if (r.gravity_turn) {
        // Into the flow until nearly vertical, then against the velocity over the ground.
        Phase turn = burn;
        turn.name = "gravity turn";
        turn.stage.thrust_against_air = true;
        turn.ends.push_back({"nearly vertical", FlightQuantity::flight_path_angle,
                             -90.0 + gravity_turn_end_deg, EventDirection::falling});
        turn.peaks = {{"peak sensed deceleration", FlightQuantity::sensed_deceleration},
                      {"peak dynamic pressure", FlightQuantity::dynamic_pressure}};
        burned =
            fly_phase(model, turn, t, y, t + flight_time_limit_s, settings, {history, nullptr});
        raise_burn_peaks(model, turn, y, burned, b);
        b.evaluations += burned.evaluations;
        const bool turned = burned.reason == StopReason::terminal_event && burned.ended_by == 2u;
        if (turned) {
            t = burned.time_s;
            y = burned.y;
            burn.name = "terminal descent";
            burn.peaks = turn.peaks;
            burned = fly_phase(model, burn, t, y, coasted.time_s + flight_time_limit_s, settings,
                               {history, nullptr});
            raise_burn_peaks(model, burn, y, burned, b);
            b.evaluations += burned.evaluations;
        }
    } else {
        burned =
            fly_phase(model, burn, t, y, t + flight_time_limit_s, settings, {history, nullptr});
        b.evaluations += burned.evaluations;
    }
    // Reaching the ground at the end velocity or slower is reaching it too: the two events
    // can fall within the event tolerance of each other when the solution is exact.
    a.reached_velocity = burned.ended_by == std::size_t{0} || speed(burned.y) <= r.end_velocity_m_s;
    b.end_time_s = burned.time_s;
    b.end_state = burned.y;
    b.burn_time_s = burned.time_s - coasted.time_s;
    const double m0 = coasted.y[StateIndex::mass];
    const double m1 = burned.y[StateIndex::mass];
    b.burned_kg = m0 - m1;
    b.ideal_delta_v_m_s = r.specific_impulse_s * standard_gravity_m_s2 * std::log(m0 / m1);
    b.gravity_loss_m_s = b.ideal_delta_v_m_s - (speed(coasted.y) - speed(burned.y));
    return a;
}

double burn_miss(const BurnAttempt& a, const BurnRequest& r) {
    const double target = r.site_elevation_m + r.end_height_above_site_m;
    const double height = a.burn.end_state[StateIndex::altitude] - target;
    if (a.reached_velocity)
        return height;
    constexpr double seconds = 1.0;
    return height - (speed(a.burn.end_state) - r.end_velocity_m_s) * seconds;
}

namespace {

/// Separates at t_s on the descent, coasts, burns.
BurnAttempt attempt(const FlightModel& model, const DenseTrajectory& descent, const BurnRequest& r,
                    const IntegratorSettings<flight_state_size>& settings, double t_s,
                    std::vector<TrajectorySample>* history) {
    return fly_burn(model, r, settings, t_s, descent.state_at(t_s), history);
}

/// The miss of the burn in closed form, from the separation state on the descent: a coast in
/// free fall under the gravity there, then a constant deceleration T/m - g (no mass loss, no
/// drag, the speed taken as vertical) from the coasted speed to the end speed. Not the flown
/// miss, but close to it by a nearly constant offset along the descent: the solver corrects it
/// by what the flights measure.
double modelled_miss(const FlightModel& model, const DenseTrajectory& descent, const BurnRequest& r,
                     double t_s) {
    const FlightState y = descent.state_at(t_s);
    const double g = model.body.gravity_m_s2(y[StateIndex::altitude]);
    const double v = speed(y) + g * r.coast_s;
    const double h =
        y[StateIndex::altitude] - speed(y) * r.coast_s - 0.5 * g * r.coast_s * r.coast_s;
    const double braking = r.thrust_N / r.lander_mass_kg - g;
    const double target = r.site_elevation_m + r.end_height_above_site_m;
    if (!(braking > 0.0))
        return h - target - v * v;  // cannot brake: a miss that only falls with time
    return h - target - (v * v - r.end_velocity_m_s * r.end_velocity_m_s) / (2.0 * braking);
}

/// The latest separation at which the modelled miss is largest: the burn the model likes best.
/// The flown miss falls after it (a later separation leaves less height), and the solution lies
/// there.
double best_modelled_separation(const FlightModel& model, const DenseTrajectory& descent,
                                const BurnRequest& r, double earliest, double latest) {
    constexpr int samples = 64;
    double best_t = latest;
    double best = -std::numeric_limits<double>::infinity();
    for (int i = 0; i <= samples; ++i) {
        const double t = earliest + (latest - earliest) * i / samples;
        const double m = modelled_miss(model, descent, r, t);
        if (m >= best) {
            best = m;
            best_t = t;
        }
    }
    return best_t;
}

/// What the flights have shown of the miss against the separation time, after the modelled
/// best: the latest separation known to stop in time (miss >= 0) and the earliest known to be
/// too late.
struct Bracket {
    double stops_at = 0.0;
    std::optional<double> stopping_miss;  ///< empty while no flight has stopped in time
    double late = 0.0;
    double late_miss = 0.0;

    void record(double t_s, double m) {
        if (m >= 0.0 && t_s >= stops_at) {
            stops_at = t_s;
            stopping_miss = m;
        } else if (m < 0.0 && t_s < late) {
            late = t_s;
            late_miss = m;
        }
    }
    double width() const { return late - stops_at; }
};

/// The search of the solver before the model guided it: walk back from the latest separation,
/// doubling the step, to a time that stops in time, then TOMS 748 between it and the step after.
/// Kept for descents where the model does not find the stopping side.
std::optional<double> walk_back(const std::function<double(double)>& miss_at, double earliest,
                                double latest, double miss_latest, double tolerance) {
    constexpr double first_step_back_s = 2.0;
    double late = latest;
    double miss_late = miss_latest;
    double step = first_step_back_s;
    while (late > earliest) {
        const double early = std::max(earliest, late - step);
        const double miss_early = miss_at(early);
        if (miss_early >= 0.0) {
            std::uintmax_t iterations = 100;
            const auto close = [&](double a, double b) { return b - a <= tolerance; };
            return boost::math::tools::toms748_solve(miss_at, early, late, miss_early, miss_late,
                                                     close, iterations)
                .first;
        }
        late = early;
        miss_late = miss_early;
        step *= 2.0;
    }
    return std::nullopt;
}

}  // namespace

BurnSolution solve_terminal_burn(const FlightModel& model, const DenseTrajectory& descent,
                                 const BurnRequest& request,
                                 const IntegratorSettings<flight_state_size>& settings,
                                 std::vector<TrajectorySample>* history) {
    const double earliest = descent.start_time();
    const auto latest_crossing = descent.time_descending_through(request.site_elevation_m);
    const double latest = latest_crossing ? *latest_crossing : descent.end_time();
    const double tolerance = request.separation_time_tolerance_s;
    // Every flight of the solve, kept: the solution is one of them, so without a history to
    // record it is not flown again (a flight is a function of its separation time alone).
    std::vector<BurnAttempt> flown;
    std::size_t evaluations = 0;
    const auto flown_miss = [&](double t_s) {
        flown.push_back(attempt(model, descent, request, settings, t_s, nullptr));
        evaluations += flown.back().burn.evaluations;
        return burn_miss(flown.back(), request);
    };
    const auto modelled = [&](double t_s) { return modelled_miss(model, descent, request, t_s); };

    std::optional<double> t_solution;
    const double miss_latest = flown_miss(latest);
    if (miss_latest >= 0.0) {
        t_solution = latest;
    } else {
        // The closed-form miss plus the offset the last flight measured, solved on the descent
        // record (no flight), gives the next separation to fly: the offset changes slowly
        // along the descent, so two such flights land either side of the solution, close to
        // it. From a bracket of flown misses, the Illinois method solves the flown miss itself.
        // Without one after a few guided flights, the search walks back from the latest
        // separation.
        Bracket b{best_modelled_separation(model, descent, request, earliest, latest), std::nullopt,
                  latest, miss_latest};
        double offset = miss_latest - modelled(latest);
        constexpr int guided_flights = 2;
        constexpr int most_guided_flights = 4;
        for (int flight = 0; flight < most_guided_flights && b.width() > tolerance; ++flight) {
            if (flight >= guided_flights && b.stopping_miss)
                break;
            const auto corrected = [&](double t_s) { return modelled(t_s) + offset; };
            const double at_low = corrected(b.stops_at);
            const double at_high = corrected(b.late);
            double t_next = 0.5 * (b.stops_at + b.late);
            if (!(at_low >= 0.0) && !b.stopping_miss) {
                t_next = b.stops_at;  // not even the best separation stops, by the model: try it
            } else if (at_low >= 0.0 && at_high < 0.0) {
                std::uintmax_t iterations = 100;
                const auto close = [&](double x, double y) { return y - x <= 0.1 * tolerance; };
                t_next = boost::math::tools::toms748_solve(corrected, b.stops_at, b.late, at_low,
                                                           at_high, close, iterations)
                             .first;
                t_next =
                    std::clamp(t_next, b.stops_at + 0.25 * tolerance, b.late - 0.25 * tolerance);
            }
            const double m = flown_miss(t_next);
            b.record(t_next, m);
            if (t_next == b.late && !b.stopping_miss)
                break;  // the best separation fails too
            offset = m - modelled(t_next);
        }
        if (b.stopping_miss) {
            t_solution = illinois_last_nonnegative(flown_miss, b.stops_at, *b.stopping_miss, b.late,
                                                   b.late_miss, tolerance);
        } else {
            t_solution = walk_back(flown_miss, earliest, b.late, b.late_miss, tolerance);
        }
    }
    const double t_solved = t_solution.value_or(earliest);
    const auto kept = std::find_if(flown.begin(), flown.end(), [&](const BurnAttempt& a) {
        return a.burn.separation_time_s == t_solved;
    });
    std::size_t attempts = flown.size();
    BurnAttempt solved;
    if (!history && kept != flown.end()) {
        solved = *kept;
    } else {
        solved = attempt(model, descent, request, settings, t_solved, history);
        evaluations += solved.burn.evaluations;
        ++attempts;
    }
    solved.burn.stops_in_time = t_solution.has_value() && solved.reached_velocity;
    solved.burn.attempts = attempts;
    solved.burn.evaluations = evaluations;
    return solved.burn;
}

ThrottledBurn solve_burn_throttle(const FlightModel& model, const BurnRequest& request,
                                  double full_thrust_N, double min_throttle,
                                  const IntegratorSettings<flight_state_size>& settings,
                                  double ignition_time_s, const FlightState& ignition_state,
                                  std::vector<TrajectorySample>* history) {
    const auto fly_at = [&](double throttle, std::vector<TrajectorySample>* record) {
        BurnRequest r = request;
        r.throttle = throttle;
        r.thrust_N = throttle * full_thrust_N;
        return fly_burn(model, r, settings, ignition_time_s, ignition_state, record);
    };
    // Every flight of the solve, kept: the solution is one of them, so without a history to
    // record it is not flown again (as solve_terminal_burn keeps its own).
    std::vector<BurnAttempt> flown;
    const auto miss_at = [&](double throttle) {
        flown.push_back(fly_at(throttle, nullptr));
        return burn_miss(flown.back(), request);
    };
    const double max_throttle = request.throttle;
    ThrottledBurn out;
    const double miss_max = miss_at(max_throttle);
    double throttle = max_throttle;
    if (miss_max >= 0.0) {
        // With no range to throttle over (min_throttle at the throttle), the ignition is what is
        // solved: the burn at the trigger stops too high unless it is already on target.
        const double miss_min = min_throttle < max_throttle ? miss_at(min_throttle) : miss_max;
        constexpr double on_target_m = 0.01;
        if (miss_min >= (min_throttle < max_throttle ? 0.0 : on_target_m)) {
            out.too_strong = true;
            throttle = std::min(min_throttle, max_throttle);
        } else if (min_throttle < max_throttle) {
            // The miss grows with the throttle: on x = -throttle it falls, as the method wants.
            // A throttle to 1e-9 moves where the burn ends by well under a millimetre.
            constexpr double throttle_tolerance = 1e-9;
            const auto falling = [&](double x) { return miss_at(-x); };
            throttle = -illinois_last_nonnegative(falling, -max_throttle, miss_max, -min_throttle,
                                                  miss_min, throttle_tolerance);
        }
    }
    const auto kept = std::find_if(flown.begin(), flown.end(), [&](const BurnAttempt& a) {
        return a.burn.throttle == throttle;
    });
    const BurnAttempt solved = !history && kept != flown.end() ? *kept : fly_at(throttle, history);
    out.burn = solved.burn;
    out.burn.stops_in_time = miss_max >= 0.0 && solved.reached_velocity;
    return out;
}

}  // namespace ds
