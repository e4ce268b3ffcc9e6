#include "sizing/terminal_burn.hpp"

#include <algorithm>
#include <array>
#include <cfloat>
#include <cmath>
#include <cstdint>
#include <functional>
#include <limits>
#include <optional>
#include <utility>

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

/// The flights of a solve, kept: the solution is one of them, so it is not flown again (a
/// flight is a function of what the solve varies alone). With a history to record, each flight
/// records its own samples, a small part of what flying the solution again would cost.
class FlownBurns {
public:
    explicit FlownBurns(std::vector<TrajectorySample>* history) : history_(history) {}

    /// Keeps the flight `fly(record)` flies (recording its samples into `record` when it is
    /// not null).
    template <class Fly>
    const BurnAttempt& add(Fly&& fly) {
        std::vector<TrajectorySample>* record = history_ ? &samples_.emplace_back() : nullptr;
        flown_.push_back(fly(record));
        evaluations_ += flown_.back().burn.evaluations;
        return flown_.back();
    }
    const BurnAttempt& last() const { return flown_.back(); }

    /// The solution: the kept flight `is_solution` picks, its samples appended to the history;
    /// without one, `fly(history)` flies it (again), counted with the rest. Its burn carries the
    /// attempts and evaluations of the whole solve.
    template <class IsSolution, class Fly>
    BurnAttempt solution(IsSolution&& is_solution, Fly&& fly) {
        const auto kept = std::find_if(flown_.begin(), flown_.end(), is_solution);
        BurnAttempt solved;
        std::size_t attempts = flown_.size();
        if (kept != flown_.end()) {
            solved = *kept;
            if (history_) {
                const auto& samples = samples_[static_cast<std::size_t>(kept - flown_.begin())];
                history_->insert(history_->end(), samples.begin(), samples.end());
            }
        } else {
            solved = fly(history_);
            evaluations_ += solved.burn.evaluations;
            ++attempts;
        }
        solved.burn.attempts = attempts;
        solved.burn.evaluations = evaluations_;
        return solved;
    }

private:
    std::vector<TrajectorySample>* history_;
    std::vector<BurnAttempt> flown_;
    std::vector<std::vector<TrajectorySample>> samples_;  ///< each flight's, with a history
    std::size_t evaluations_ = 0;
};

/// The burn time and the height it takes to shed `to_shed_m_s` falling vertically, at constant
/// thrust under constant gravity with no drag, the mass falling as the propellant burns (the
/// rocket equation, Tsiolkovsky): to_shed = c ln(m0 / m1) - g t with m1 = m0 - (T / c) t.
struct VerticalBurn {
    double time_s = 0.0;
    double height_m = 0.0;
};

std::optional<VerticalBurn> vertical_burn(double speed_m_s, double to_shed_m_s, double thrust_N,
                                          double mass_kg, double exhaust_m_s, double g) {
    const double flow = thrust_N / exhaust_m_s;  // kg/s
    // The constant-mass burn time is at or above the root of the convex, rising speed shed
    // against time: Newton from it falls monotonically onto the root.
    double t = to_shed_m_s / (thrust_N / mass_kg - g);
    constexpr int most_iterations = 30;
    for (int i = 0; i < most_iterations; ++i) {
        const double left = mass_kg - flow * t;
        if (!(left > 0.0))
            return std::nullopt;  // burns more than it has: the model does not apply
        const double shed = -exhaust_m_s * std::log1p(-flow * t / mass_kg) - g * t - to_shed_m_s;
        const double step = shed / (thrust_N / left - g);
        t -= step;
        if (!(std::abs(step) > 1e-13 * t))
            break;
    }
    // The speed at time s is v0 - c ln(m0 / m(s)) + g s; the integral of c ln(m0 / m(s)) over
    // the burn is (T / m0) t^2 S(x), x = flow t / m0 (the share of the mass burned), with
    // S(x) = sum over n >= 1 of x^(n-1) / (n (n + 1)) = (1 + (1 - x) ln(1 - x) / x) / x: summed
    // for a small share, where the closed form cancels (a high specific impulse).
    const double x = flow * t / mass_kg;
    double share_sum = 0.0;
    constexpr double series_below = 0.1;
    if (x < series_below) {
        double term = 1.0;
        for (int n = 1; n < 40 && term > 1e-18; ++n) {
            share_sum += term / (n * (n + 1.0));
            term *= x;
        }
    } else {
        share_sum = (1.0 + (1.0 - x) * std::log1p(-x) / x) / x;
    }
    return VerticalBurn{t,
                        speed_m_s * t - thrust_N / mass_kg * t * t * share_sum + 0.5 * g * t * t};
}

/// The vertical burn at thrust_N that slows the request's lander from speed_m_s to the end speed
/// under gravity g: by the rocket equation, or at constant mass where that would burn more than
/// there is. The thrust must hold more than the weight.
VerticalBurn lander_vertical_burn(const BurnRequest& r, double speed_m_s, double thrust_N,
                                  double g) {
    const double to_shed = speed_m_s - r.end_velocity_m_s;
    if (const auto burn = vertical_burn(speed_m_s, to_shed, thrust_N, r.lander_mass_kg,
                                        r.specific_impulse_s * standard_gravity_m_s2, g))
        return *burn;
    const double braking = thrust_N / r.lander_mass_kg - g;
    return {to_shed / braking,
            (speed_m_s * speed_m_s - r.end_velocity_m_s * r.end_velocity_m_s) / (2.0 * braking)};
}

/// The downward acceleration of a free fall from rest, halfway from the state down to
/// `target_m`: gravity less the centrifugal term of the equations (flight_derivative with no
/// force and no velocity), where inverse-square gravity takes its mean over a drop short against
/// the body's radius. Gravity at the state, without the body's turning, leaves the flown burn
/// some 1.2 m above the closed form's on the small station (the centrifugal term is 0.46 % of
/// Mars' gravity at the equator); with both, some 2 mm. The velocity's terms (Coriolis,
/// transport) are left out: the burn sheds the velocity they come from.
double free_fall_gravity(const FlightModel& model, const FlightState& y, double target_m) {
    FlightState halfway = y;
    halfway[StateIndex::altitude] = 0.5 * (y[StateIndex::altitude] + target_m);
    halfway[StateIndex::east_velocity] = 0.0;
    halfway[StateIndex::north_velocity] = 0.0;
    halfway[StateIndex::up_velocity] = 0.0;
    return -flight_derivative(model, Stage{}, halfway)[StateIndex::up_velocity];
}

/// The miss of the burn in closed form, from the separation state on the descent: a coast in
/// free fall (free_fall_gravity; the horizontal speed kept), then a burn at constant thrust
/// under the same gravity (the mass falling by the rocket equation; no drag) from the coasted
/// speed to the end speed, flown as if vertical and its height scaled by the sine of the path's
/// angle at ignition (a burn against the velocity sheds the horizontal speed without losing
/// height for it). Not the flown miss, but close to it by an offset that changes slowly along
/// the descent (millimetres for a lander that leaves its drag behind, up to metres for a
/// vehicle still oblique or dragging): the solver corrects it by what the flights measure.
double modelled_miss(const FlightModel& model, const DenseTrajectory& descent, const BurnRequest& r,
                     double t_s) {
    const FlightState y = descent.state_at(t_s);
    const double target = r.site_elevation_m + r.end_height_above_site_m;
    const double g = free_fall_gravity(model, y, target);
    const double sink = -y[StateIndex::up_velocity] + g * r.coast_s;
    const double h = y[StateIndex::altitude] + y[StateIndex::up_velocity] * r.coast_s -
                     0.5 * g * r.coast_s * r.coast_s;
    const double horizontal = horizontal_speed(y);
    const double v = std::sqrt(horizontal * horizontal + sink * sink);
    const double braking = r.thrust_N / r.lander_mass_kg - g;
    if (!(braking > 0.0))
        return h - target - v * v;  // cannot brake: a miss that only falls with time
    const double to_shed = v - r.end_velocity_m_s;
    if (!(to_shed > 0.0))
        return h - target;
    const double steepness = v > 0.0 ? sink / v : 1.0;
    return h - target - steepness * lander_vertical_burn(r, v, r.thrust_N, g).height_m;
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

/// The root of a function falling through zero before `high` (where it is f_high < 0), no
/// earlier than `floor`, by the secant method from `high` and a second point a second before it
/// (or halfway to the floor), to `tolerance` of time. Empty when the secant leaves the interval,
/// meets a rising slope or does not settle in a few steps: the caller then brackets the root.
template <class F>
std::optional<double> falling_root(F&& f, double floor, double high, double f_high,
                                   double tolerance) {
    constexpr double first_step_s = 1.0;
    constexpr int most_steps = 12;
    double x0 = high;
    double f0 = f_high;
    double x1 = std::max(floor, high - std::min(first_step_s, 0.5 * (high - floor)));
    double f1 = f(x1);
    for (int i = 0; i < most_steps; ++i) {
        if (!(x1 < x0) && !(x1 > x0))
            return std::nullopt;
        const double slope = (f1 - f0) / (x1 - x0);
        if (!(slope < 0.0))
            return std::nullopt;  // not falling here: another root, or none
        const double x2 = x1 - f1 / slope;
        if (!(x2 >= floor && x2 < high))
            return std::nullopt;
        if (std::abs(x2 - x1) <= tolerance)
            return x2;
        x0 = x1;
        f0 = f1;
        x1 = x2;
        f1 = f(x1);
    }
    return std::nullopt;
}

/// What the flights have shown of the miss against the separation time, after the modelled
/// best: the latest separation known to stop in time (miss >= 0) and the earliest known to be
/// too late (the latest separation until one is flown).
struct Bracket {
    double stops_at = 0.0;
    std::optional<double> stopping_miss;  ///< empty while no flight has stopped in time
    double late = 0.0;
    std::optional<double> late_miss;  ///< empty while no flight has been too late

    void record(double t_s, double m) {
        if (m >= 0.0 && t_s >= stops_at) {
            stops_at = t_s;
            stopping_miss = m;
        } else if (m < 0.0 && (!late_miss || t_s <= late)) {
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

void SeparationGuide::add(double t_s, double offset_m, bool stopped) {
    if (!stopped) {
        if (stopped_.empty())
            late_ = Point{t_s, offset_m};
        return;
    }
    const auto at = std::lower_bound(stopped_.begin(), stopped_.end(), t_s,
                                     [](const Point& p, double t) { return p.t_s < t; });
    if (at != stopped_.end() && at->t_s == t_s)
        return;  // flown already: the same flight
    stopped_.insert(at, Point{t_s, offset_m});
}

SeparationGuide::Estimate SeparationGuide::at(double t_s) const {
    if (stopped_.empty() && late_)
        return {late_->offset_m, Estimate::one, 0.0};
    if (stopped_.empty())
        return {prior_.value_or(0.0), prior_ ? Estimate::prior : Estimate::none, 0.0};
    if (stopped_.size() == 1) {
        const Point& p = stopped_.front();
        return {p.offset_m, Estimate::one, std::abs(t_s - p.t_s)};
    }
    // The two flights either side of t, or the two nearest on its one side.
    const auto after = std::lower_bound(stopped_.begin(), stopped_.end(), t_s,
                                        [](const Point& p, double t) { return p.t_s < t; });
    const bool between = after != stopped_.begin() && after != stopped_.end();
    const auto second = after == stopped_.begin() ? after + 1
                        : after == stopped_.end() ? after - 1
                                                  : after;
    const auto first = second - 1;
    const double slope = (second->offset_m - first->offset_m) / (second->t_s - first->t_s);
    const double distance = std::min(std::abs(t_s - first->t_s), std::abs(t_s - second->t_s));
    return {first->offset_m + (t_s - first->t_s) * slope,
            between ? Estimate::between : Estimate::beyond, distance};
}

BurnSolution solve_terminal_burn(const FlightModel& model, const DenseTrajectory& descent,
                                 const BurnRequest& request,
                                 const IntegratorSettings<flight_state_size>& settings,
                                 std::vector<TrajectorySample>* history, SeparationGuide* guide) {
    const double earliest = descent.start_time();
    const auto latest_crossing = descent.time_descending_through(request.site_elevation_m);
    const double latest = latest_crossing ? *latest_crossing : descent.end_time();
    const double tolerance = request.separation_time_tolerance_s;
    // A flight is a function of its separation time alone.
    FlownBurns flown(history);
    const auto flown_miss = [&](double t_s) {
        return burn_miss(flown.add([&](std::vector<TrajectorySample>* record) {
            return attempt(model, descent, request, settings, t_s, record);
        }),
                         request);
    };
    // The model is asked again where it was asked (the rate about a flight's time, more than
    // once; the flown time, the last secant's): it keeps its last few answers.
    std::array<std::pair<double, double>, 4> answers;
    answers.fill({std::numeric_limits<double>::quiet_NaN(), 0.0});  // NaN: equal to no time
    std::size_t answered = 0;
    const auto modelled = [&](double t_s) {
        for (const auto& [t, miss] : answers) {
            if (t == t_s)
                return miss;
        }
        const double miss = modelled_miss(model, descent, request, t_s);
        answers[answered++ % answers.size()] = {t_s, miss};
        return miss;
    };

    // The closed-form miss plus the offset the flights measured, solved on the descent record
    // (no flight), gives the next separation to fly: the offset changes slowly along the
    // descent, so each guided flight lands close to the solution, on the side that stops in
    // time (it aims half the tolerance before the corrected model's solution, not at it). The solve
    // ends on a flight that stops in time with a miss below what the tolerance moves it by, or once
    // the flights bracket the solution within the tolerance. Without either after a few guided
    // flights, the Illinois method solves the flown miss itself from its bracket, or the search
    // walks back from the latest separation.
    // Before a flight stops, the model's best separation bounds the search from below: found
    // by sampling the model along the descent, only when the secant below does not close.
    std::optional<double> best;
    const auto best_t = [&] {
        if (!best)
            best = best_modelled_separation(model, descent, request, earliest, latest);
        return *best;
    };
    Bracket b{earliest, std::nullopt, latest, std::nullopt};
    SeparationGuide own_guide;
    SeparationGuide& offsets = guide ? *guide : own_guide;
    // Where the guide says a flight of this solve that came too late would have stopped, it is
    // wrong here: the solve goes by its own flights' offsets, along the line through the last
    // two (a secant on the offset).
    std::vector<std::pair<double, double>> own;  // (t, offset) of this solve's flights
    bool own_offsets = false;
    const auto own_offset = [&](double t_s) {
        const auto [t1, o1] = own.back();
        if (own.size() < 2 || own[own.size() - 2].first == t1)
            return o1;
        const auto [t0, o0] = own[own.size() - 2];
        return o1 + (t_s - t1) * (o1 - o0) / (t1 - t0);
    };
    const auto corrected = [&](double t_s) {
        return modelled(t_s) + (own_offsets ? own_offset(t_s) : offsets.at(t_s).offset_m);
    };
    // How fast the corrected miss falls with the separation time, by a central difference
    // (a millisecond: small against the descent, large against rounding).
    const auto falling_rate = [&](double t_s) {
        constexpr double step_s = 1e-3;
        const double low = std::max(earliest, t_s - step_s);
        const double high = std::min(latest, t_s + step_s);
        return high > low ? (corrected(low) - corrected(high)) / (high - low) : 0.0;
    };
    // Done: a flight stopped in time so little above the target that the solution lies within
    // the tolerance after it (or the bracket is that narrow, or the latest separation stops).
    const auto solved = [&] {
        if (!b.stopping_miss)
            return false;
        if (b.stops_at >= latest || (b.late_miss && b.width() <= tolerance))
            return true;
        return *b.stopping_miss <= falling_rate(b.stops_at) * tolerance;
    };
    const auto fly = [&](double t_s) {
        const double m = flown_miss(t_s);
        b.record(t_s, m);
        const double offset_m = m - modelled(t_s);
        offsets.add(t_s, offset_m, m >= 0.0);
        own.emplace_back(t_s, offset_m);
        return m;
    };

    std::optional<double> t_solution;
    constexpr int most_guided_flights = 6;
    std::optional<double> bracketed;  // the bracket's width before the last flight
    for (int flight = 0; flight < most_guided_flights && !solved(); ++flight) {
        if (b.late_miss && b.width() <= tolerance)
            break;  // a bracket this narrow with no flight that stops: nothing to guide
        const double high = b.late_miss ? b.late - 0.25 * tolerance : latest;
        const double floor = b.stopping_miss ? b.stops_at + 0.25 * tolerance : earliest;
        if (!(high > floor))
            break;
        own_offsets = b.late_miss && modelled(b.late) + offsets.at(b.late).offset_m >= 0.0;
        const double at_high = corrected(high);
        double low = floor;
        double t_next = high;  // the model stops even there: try it
        if (at_high < 0.0) {
            // The corrected model's solution before `high`, by the secant from it (the model
            // falls nearly linearly there), checked to fall through zero; otherwise TOMS 748
            // from the best known (the model's best separation before a flight stops).
            std::optional<double> root =
                falling_root(corrected, floor, high, at_high, 0.1 * tolerance);
            if (!root) {
                low = b.stopping_miss ? floor : std::max(floor, best_t());
                const double at_low = corrected(low);
                if (!(at_low >= 0.0) || !(high > low)) {
                    t_next = low;  // not even the best known stops, by the model: try it
                } else {
                    std::uintmax_t iterations = 100;
                    const auto close = [&](double x, double y) { return y - x <= 0.1 * tolerance; };
                    root = boost::math::tools::toms748_solve(corrected, low, high, at_low, at_high,
                                                             close, iterations)
                               .first;
                }
            }
            if (root) {
                // Aimed before the corrected model's solution, on the side that stops: by half the
                // tolerance, or by what the offset may drift from the flights that measured it: a
                // thousandth of the way from one flight (between two flights of a solve on the
                // samples, the offset drifts by 9e-5 of the miss's own rate at the median, 3e-4
                // at the 90th percentile), 1e-4 of it from a line through two.
                SeparationGuide::Estimate e = offsets.at(*root);
                if (own_offsets)
                    e = {0.0, SeparationGuide::Estimate::one, std::abs(*root - own.back().first)};
                const double drift_allowance = e.from == SeparationGuide::Estimate::one      ? 1e-3
                                               : e.from == SeparationGuide::Estimate::beyond ? 1e-4
                                                                                             : 0.0;
                const double back_off = std::max(0.5 * tolerance, drift_allowance * e.distance_s);
                t_next = std::max(low, *root - back_off);
            }
        }
        const bool bracket = b.stopping_miss && b.late_miss;
        if (bracket && bracketed && b.width() > 0.5 * *bracketed) {
            // The last guided flight did not halve the bracket (the model is poor here: an
            // oblique, fast descent): halve it.
            t_next = 0.5 * (b.stops_at + b.late);
        } else if (bracket && (t_next <= low || t_next >= high)) {
            // The model disagrees with the bracket the flights made: the secant across it.
            const double s = *b.stopping_miss / (*b.stopping_miss - *b.late_miss);
            t_next = std::clamp(b.stops_at + s * b.width(), low, high);
        }
        if (bracket)
            bracketed = b.width();
        const double m = fly(t_next);
        if (m < 0.0 && !b.stopping_miss && t_next == low)
            break;  // the best separation fails too
    }
    if (b.stopping_miss && !b.late_miss && !solved()) {
        const double m = flown_miss(latest);  // the side too late, not flown yet
        b.record(latest, m);
    }
    if (solved()) {
        t_solution = b.stops_at;
    } else if (b.stopping_miss && b.late_miss) {
        t_solution = illinois_last_nonnegative(flown_miss, b.stops_at, *b.stopping_miss, b.late,
                                               *b.late_miss, tolerance);
    } else if (!b.stopping_miss) {
        const double late_miss = b.late_miss ? *b.late_miss : flown_miss(latest);
        if (late_miss >= 0.0)
            t_solution = latest;
        else
            t_solution = walk_back(flown_miss, earliest, b.late, late_miss, tolerance);
    }
    const double t_solved = t_solution.value_or(earliest);
    BurnAttempt solution =
        flown.solution([&](const BurnAttempt& a) { return a.burn.separation_time_s == t_solved; },
                       [&](std::vector<TrajectorySample>* record) {
                           return attempt(model, descent, request, settings, t_solved, record);
                       });
    solution.burn.stops_in_time = t_solution.has_value() && solution.reached_velocity;
    solution.burn.closed_form_offset_m = burn_miss(solution, request) - modelled(t_solved);
    return solution.burn;
}

namespace {

/// Where a drag-free powered descent from `ignition` at thrust_N ends, in closed form (under the
/// gravity of ignition, over a flat, still body). In a gravity turn at a constant thrust
/// acceleration n g against the velocity, the angle phi off the downward vertical and the speed
/// obey v dphi/dt = -g sin phi and dv/dt = -n g + g cos phi, so d ln v / dphi = n / sin phi -
/// cot phi and v = K tan^n(phi/2) / sin phi; the height lost to the vertical, the integral of
/// v^2 cot phi / g over phi, is with u = tan(phi0/2) v0^2 / (g (1 + u^2)^2) (1 / (2n - 2) - u^4 /
/// (2n + 2)): (1 - u^4 (n - 1) / (n + 1)) / (1 + u^2)^2 of the vertical burn's v0^2 / (2 (n - 1)
/// g). That share scales the vertical burn by the rocket equation, with n the thrust
/// acceleration a third of the way through that burn: the mean of its time weighted by the
/// height lost (at a steady deceleration the rate of losing height falls linearly to zero over
/// the time T, and the integral of t (T - t) over that of T - t is T / 3). A climbing start is
/// taken as level.
double modelled_end_altitude(const FlightModel& model, const BurnRequest& r, double thrust_N,
                             const FlightState& ignition) {
    const double h = ignition[StateIndex::altitude];
    const double v = speed(ignition);
    const double g = model.body.gravity_m_s2(h);
    if (!(thrust_N > r.lander_mass_kg * g))
        return h - v * v;  // cannot brake: as the separation solve's model, far below
    if (!(v > r.end_velocity_m_s))
        return h;
    const VerticalBurn vertical = lander_vertical_burn(r, v, thrust_N, g);
    const double exhaust = r.specific_impulse_s * standard_gravity_m_s2;
    const double mass_by_then = r.lander_mass_kg - thrust_N / exhaust * vertical.time_s / 3.0;
    // (at ignition where even a third of the burn would take more than there is)
    const double n = thrust_N / ((mass_by_then > 0.0 ? mass_by_then : r.lander_mass_kg) * g);
    const double cos_off_vertical = std::clamp(-ignition[StateIndex::up_velocity] / v, 0.0, 1.0);
    const double u2 = (1.0 - cos_off_vertical) / (1.0 + cos_off_vertical);  // tan^2(phi0 / 2)
    const double turn_share = (1.0 - u2 * u2 * (n - 1.0) / (n + 1.0)) / ((1.0 + u2) * (1.0 + u2));
    return h - turn_share * vertical.height_m;
}

/// Where a flown burn ended, continued below the ground for one that reached it too fast: less
/// the height its deceleration at the end, held vertically, would still take to slow to the end
/// speed. Unlike the miss (burn_miss counts the excess speed), it runs on through the target
/// with the throttle at about the same rate, so a secant can use the flights on both sides.
double continued_end_altitude(const FlightModel& model, const BurnRequest& r,
                              const BurnAttempt& a) {
    const FlightState& y = a.burn.end_state;
    const double altitude = y[StateIndex::altitude];
    const double excess = speed(y) - r.end_velocity_m_s;
    if (a.reached_velocity || !(excess > 0.0))
        return altitude;
    const double braking = r.thrust_N / y[StateIndex::mass] - model.body.gravity_m_s2(altitude);
    constexpr double seconds = 1.0;  // as burn_miss, where the thrust cannot brake
    if (!(braking > 0.0))
        return altitude - excess * seconds;
    return altitude - excess * (speed(y) + r.end_velocity_m_s) / (2.0 * braking);
}

/// The burn's mean rate of descent (m/s). A change of thrust that moves where the burn ends by a
/// metre moves when it ends by at most one over this: exactly for a vertical burn at constant
/// thrust acceleration a, whose time and height both go as 1 / (a - g); by less for the gravity
/// turn above, whose d(time)/d(height) over time/height is, with A = 1 / (n - 1) and
/// B = 1 / (n + 1), (A^2 + u^2 B^2) (A - u^4 B) / ((A - u^2 B) (A + u^2 B)^2): 1 at u = 0 and
/// below 1 elsewhere (evaluated for n from 1 to 21 and u from 0 to 1). The end speed where the
/// burn is flown for no time or no height.
double mean_descent_rate_m_s(const BurnSolution& b, double end_velocity_m_s) {
    const double drop = b.ignition_state[StateIndex::altitude] - b.end_state[StateIndex::altitude];
    return b.burn_time_s > 0.0 && drop > 0.0 ? drop / b.burn_time_s : end_velocity_m_s;
}

/// The throttle in [low, high] at which `rising` (a function rising with the throttle) crosses
/// zero, to the last bits of the throttle, by TOMS 748 (Alefeld, Potra and Shi, ACM TOMS 21,
/// 1995; Boost's); the end it points to when it does not cross zero there. Of the final bracket,
/// the end where the function is at or above zero.
template <class F>
double rising_root(F&& rising, double low, double high) {
    const double at_low = rising(low);
    if (at_low >= 0.0)
        return low;
    const double at_high = rising(high);
    if (!(at_high >= 0.0))
        return high;
    std::uintmax_t iterations = 100;
    const auto close = [](double a, double b) { return b - a <= 4.0 * DBL_EPSILON * b; };
    return boost::math::tools::toms748_solve(rising, low, high, at_low, at_high, close, iterations)
        .second;
}

}  // namespace

double closed_form_throttle(const FlightModel& model, const BurnRequest& request,
                            double full_thrust_N, double min_throttle,
                            const FlightState& ignition_state) {
    const double target = request.site_elevation_m + request.end_height_above_site_m;
    return rising_root(
        [&](double throttle) {
            return modelled_end_altitude(model, request, throttle * full_thrust_N, ignition_state) -
                   target;
        },
        std::min(min_throttle, request.throttle), request.throttle);
}

ThrottledBurn solve_burn_throttle(const FlightModel& model, const BurnRequest& request,
                                  double full_thrust_N, double min_throttle,
                                  const IntegratorSettings<flight_state_size>& settings,
                                  double ignition_time_s, const FlightState& ignition_state,
                                  std::vector<TrajectorySample>* history,
                                  const ThrottleSolve& how) {
    const auto request_at = [&](double throttle) {
        BurnRequest r = request;
        r.throttle = throttle;
        r.thrust_N = throttle * full_thrust_N;
        return r;
    };
    const auto fly_at = [&](double throttle, std::vector<TrajectorySample>* record) {
        return fly_burn(model, request_at(throttle), settings, ignition_time_s, ignition_state,
                        record);
    };
    // A flight is a function of its throttle alone.
    FlownBurns flown(history);
    const auto fly = [&](double throttle) -> const BurnAttempt& {
        return flown.add(
            [&](std::vector<TrajectorySample>* record) { return fly_at(throttle, record); });
    };
    const double max_throttle = request.throttle;
    ThrottledBurn out;
    double throttle = max_throttle;
    bool stops = false;
    if (!(min_throttle < max_throttle)) {
        // With no range to throttle over, the ignition is what is solved: the burn at the
        // trigger stops too high unless it is already on target.
        const double miss = burn_miss(fly(max_throttle), request);
        constexpr double on_target_m = 0.01;
        stops = miss >= 0.0;
        out.too_strong = miss >= on_target_m;
        throttle = std::min(min_throttle, max_throttle);
    } else {
        // The throttle is bracketed between the highest known to stop too late (the miss, which
        // grows with the throttle, below zero) and the lowest known to stop in time; the range's
        // ends until flown. The misses kept are the continued ones (the same where it stops).
        const double target = request.site_elevation_m + request.end_height_above_site_m;
        double low = min_throttle;
        double high = max_throttle;
        std::optional<double> low_miss;
        std::optional<double> high_miss;
        const auto continued_miss_at = [&](double x) {
            return continued_end_altitude(model, request_at(x), fly(x)) - target;
        };
        const auto record = [&](double x, double m) {
            (m >= 0.0 ? high : low) = x;
            (m >= 0.0 ? high_miss : low_miss) = m;
        };
        // The closed form's error, measured by the flights (and the earlier solve): where the
        // burn ended (continued below the ground) less where the closed form ends it.
        const auto modelled = [&](double x) {
            return modelled_end_altitude(model, request, x * full_thrust_N, ignition_state);
        };
        struct Measure {
            double throttle = 0.0;
            double offset_m = 0.0;
            bool exact = false;  ///< the burn reached the end speed: not continued
        };
        std::vector<Measure> measures;  // in flight order
        double tolerance_m = 0.0;       // once a burn has been flown
        const auto measure = [&](double x, double m, const BurnSolution& b, bool exact) {
            measures.push_back({x, m + target - modelled(x), exact});
            tolerance_m =
                how.end_time_tolerance_s * mean_descent_rate_m_s(b, request.end_velocity_m_s);
        };
        // (an earlier solve's for another vehicle, until this solve's first flight)
        bool foreign_measure = false;
        if (how.earlier && how.earlier->stops_in_time) {
            const BurnSolution& e = *how.earlier;
            if (how.earlier_request) {
                const BurnRequest& r = *how.earlier_request;
                measures.push_back(
                    {e.throttle,
                     e.end_state[StateIndex::altitude] -
                         modelled_end_altitude(model, r, r.thrust_N, e.ignition_state),
                     true});
                tolerance_m =
                    how.end_time_tolerance_s * mean_descent_rate_m_s(e, r.end_velocity_m_s);
                foreign_measure = true;
            } else {
                measure(e.throttle, e.end_state[StateIndex::altitude] - target, e, true);
            }
        }
        // The offset along the line through the last two measures that reached the end speed
        // when the last did (then both are where a burn ended, not continued, and the line is
        // good to second order near the last), else through the last two; the one there is
        // alone. The measures come nearer the solution with each flight.
        const auto offset_line = [&]() -> std::pair<const Measure*, const Measure*> {
            if (measures.empty())
                return {nullptr, nullptr};
            const Measure& newer = measures.back();
            const Measure* previous = nullptr;  // the last before it, at another throttle
            for (auto m = measures.rbegin() + 1; m != measures.rend(); ++m) {
                if (m->throttle == newer.throttle)
                    continue;
                if (!previous)
                    previous = &*m;
                if (!newer.exact)
                    break;
                if (m->exact)
                    return {&newer, &*m};
            }
            return {&newer, previous};
        };
        // Done: the lowest throttle known to stop stops so little above the target that its
        // burn ends within the tolerance of time of the exact throttle's (the miss over the mean
        // rate of descent), or the bracket has closed to the last bits of the throttle.
        const auto solved = [&] {
            return high_miss && (*high_miss <= tolerance_m ||
                                 (low_miss && high - low <= 4.0 * DBL_EPSILON * high));
        };
        bool decided = false;  // not stopping even at the most throttle, or too strong
        const auto decide = [&](double x, double m) {
            decided = (m >= 0.0 && x == min_throttle) || (m < 0.0 && x == max_throttle);
            out.too_strong = m >= 0.0 && x == min_throttle;
        };
        // Each guided flight aims half the tolerance above the target, at the closed form plus
        // the offset, so that it lands within the tolerance on the side that stops; where the
        // guide points at a flown end, the secant across the bracket. A flight that did not
        // halve how far the last one landed from its aim ends the guided flights: the closed
        // form is poor here (drag kept under thrust, which it does not fly, bends the miss).
        constexpr int most_guided_flights = 8;
        std::optional<double> last_gap;
        bool stalled = false;
        for (int i = 0; i < most_guided_flights && !decided && !solved() && !stalled && high > low;
             ++i) {
            // Named, not bound: a lambda may not capture a structured binding in clang 14.
            const std::pair<const Measure*, const Measure*> line = offset_line();
            const Measure* newer = line.first;
            const Measure* older = line.second;
            const auto offset_at = [&](double x) {
                if (!newer)
                    return 0.0;
                const std::optional<double> slope = older ? (newer->offset_m - older->offset_m) /
                                                                (newer->throttle - older->throttle)
                                                          : how.offset_slope_m;
                return newer->offset_m + (slope ? (x - newer->throttle) * *slope : 0.0);
            };
            const double aim = 0.5 * tolerance_m;
            double next = rising_root(
                [&](double x) { return modelled(x) + offset_at(x) - target - aim; }, low, high);
            const bool bracket = low_miss && high_miss;
            if (bracket && (next <= low || next >= high)) {
                next = low + (high - low) * -*low_miss / (*high_miss - *low_miss);
            } else if ((next == low && low_miss) || (next == high && high_miss)) {
                next = 0.5 * (low + high);
            }
            const double m = continued_miss_at(next);
            measure(next, m, flown.last().burn, flown.last().reached_velocity);
            if (std::exchange(foreign_measure, false))
                measures.erase(measures.begin());
            const double gap = std::abs(m - aim);
            record(next, m);
            decide(next, m);
            stalled = last_gap && gap > 0.5 * *last_gap;
            last_gap = gap;
        }
        // Not guided home: the range's ends flown where not yet, then the Illinois method on
        // the bracket, its tolerance of throttle the tolerance of miss at the bracket's slope;
        // again on the bracket it leaves, at its slope, where that was not enough.
        if (!decided && !solved() && !high_miss) {
            const double m = continued_miss_at(max_throttle);
            record(max_throttle, m);
            decide(max_throttle, m);
        }
        if (!decided && !solved() && !low_miss) {
            const double m = continued_miss_at(min_throttle);
            record(min_throttle, m);
            decide(min_throttle, m);
        }
        const auto falling = [&](double x) {
            const double m = continued_miss_at(-x);
            record(-x, m);
            return m;
        };
        constexpr int most_rounds = 3;
        for (int i = 0; i < most_rounds && !decided && !solved() && high > low; ++i) {
            const double slope = (*high_miss - *low_miss) / (high - low);
            illinois_last_nonnegative(falling, -high, *high_miss, -low, *low_miss,
                                      tolerance_m / slope);
        }
        const bool short_of = decided && !out.too_strong;
        throttle = short_of ? max_throttle : high;
        stops = !short_of && high_miss.has_value();
        if (const std::pair<const Measure*, const Measure*> line = offset_line(); line.second) {
            out.offset_slope_m = (line.first->offset_m - line.second->offset_m) /
                                 (line.first->throttle - line.second->throttle);
        }
    }
    const BurnAttempt solved = flown.solution(
        [&](const BurnAttempt& a) { return a.burn.throttle == throttle; },
        [&](std::vector<TrajectorySample>* record) { return fly_at(throttle, record); });
    out.burn = solved.burn;
    out.burn.stops_in_time = stops && solved.reached_velocity;
    return out;
}

}  // namespace ds
