#include "sizing/terminal_burn.hpp"

#include <cmath>
#include <cstdint>

#include <boost/math/tools/toms748_solve.hpp>

#include "constants.hpp"

namespace ds {
namespace {

constexpr double flight_time_limit_s = 3600.0;
constexpr double first_step_back_s = 2.0;  // search step back from the latest separation  // after
                                           // separation: a burn never lasts this long

struct Attempt {
    bool reached_velocity = false;
    BurnSolution burn;
};

/// Separates at t_s, coasts, burns; stops at the end velocity or the ground.
Attempt attempt(const FlightModel& model, const DenseTrajectory& descent, const BurnRequest& r,
                const IntegratorSettings<flight_state_size>& settings, double t_s,
                std::vector<TrajectorySample>* history) {
    Attempt a;
    BurnSolution& b = a.burn;
    b.separation_time_s = t_s;
    b.separation_state = descent.state_at(t_s);
    b.separation_state[StateIndex::mass] = r.lander_mass_kg;
    const Trigger ground{"ground", FlightQuantity::altitude, r.site_elevation_m,
                         EventDirection::falling};

    Phase coast;
    coast.name = "coast";
    coast.ends = {ground};
    const PhaseOutcome coasted = fly_phase(model, coast, t_s, b.separation_state, t_s + r.coast_s,
                                           settings, {history, nullptr});
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
    burn.stage.thrust_N = r.thrust_N;
    burn.stage.specific_impulse_s = r.specific_impulse_s;
    burn.ends = {
        {"end of burn", FlightQuantity::velocity, r.end_velocity_m_s, EventDirection::falling},
        ground};
    const PhaseOutcome burned =
        fly_phase(model, burn, coasted.time_s, coasted.y, coasted.time_s + flight_time_limit_s,
                  settings, {history, nullptr});
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

/// How far above its target the burn ends (negative: below it, or at the ground too fast).
/// Continuous across the two cases: at the ground, the excess speed counts as metres per
/// (m/s) times one second.
double miss(const Attempt& a, const BurnRequest& r) {
    const double target = r.site_elevation_m + r.end_height_above_site_m;
    const double height = a.burn.end_state[StateIndex::altitude] - target;
    if (a.reached_velocity)
        return height;
    constexpr double seconds = 1.0;
    return height - (speed(a.burn.end_state) - r.end_velocity_m_s) * seconds;
}

}  // namespace

BurnSolution solve_terminal_burn(const FlightModel& model, const DenseTrajectory& descent,
                                 const BurnRequest& request,
                                 const IntegratorSettings<flight_state_size>& settings,
                                 std::vector<TrajectorySample>* history) {
    const double earliest = descent.start_time();
    const auto latest_crossing = descent.time_descending_through(request.site_elevation_m);
    const double latest = latest_crossing ? *latest_crossing : descent.end_time();

    const auto miss_at = [&](double t_s) {
        return miss(attempt(model, descent, request, settings, t_s, nullptr), request);
    };
    // Separating too early fails too (the lander is still fast, the canopy has not slowed it),
    // so the search walks back from the latest separation, doubling its step, to the first
    // time that still stops in time; the solution lies between that and the step after it.
    double late = latest;
    double miss_late = miss_at(late);
    double t_solution = latest;
    bool stops = miss_late >= 0.0;
    double step = first_step_back_s;
    while (!stops && late > earliest) {
        const double early = std::max(earliest, late - step);
        const double miss_early = miss_at(early);
        if (miss_early >= 0.0) {
            std::uintmax_t iterations = 100;
            const auto close = [&](double a, double b) {
                return b - a <= request.separation_time_tolerance_s;
            };
            // The earlier end of the bracket still stops in time.
            t_solution = boost::math::tools::toms748_solve(miss_at, early, late, miss_early,
                                                           miss_late, close, iterations)
                             .first;
            stops = true;
            break;
        }
        late = early;
        miss_late = miss_early;
        step *= 2.0;
    }
    if (!stops)
        t_solution = earliest;
    Attempt solved = attempt(model, descent, request, settings, t_solution, history);
    solved.burn.stops_in_time = stops && solved.reached_velocity;
    return solved.burn;
}

}  // namespace ds
