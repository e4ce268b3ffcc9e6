// The throttle solve of a powered descent lit during the entry (supersonic retro-propulsion):
// - the solved burn, flown again at its throttle, ends at the site within the metres its time
//   tolerance allows (the tolerance times the burn's mean rate of descent), and its burn time
//   within that tolerance of a solve a thousand times tighter, on the heavy cargo sample, at
//   the design's site and at another started from it;
// - a solve for a heavier vehicle guided by the closure's previous solve (in fewer flights), and
//   a dispersed case guided by the nominal vehicle's evaluation (in no more): as close as a
//   cold one;
// - the reach (the highest site the burn at the most throttle stops for) against solves just
//   under and just over it, and the site search's answer against it;
// - the closed-form first guess against the solved throttle: exact, but for the end speed, for a
//   drag-free gravity turn at constant mass over a flat airless body (the constant-acceleration
//   gravity turn in closed form, Culler and Fried, J. Appl. Phys. 28, 1957, from memory), and
//   within a stated distance on the heavy cargo sample.

#include <cmath>

#include <doctest/doctest.h>

#include "constants.hpp"
#include "sizing/environment.hpp"
#include "sizing/evaluation.hpp"
#include "sizing/size.hpp"
#include "sizing/terminal_burn.hpp"
#include "support/flat_vacuum.hpp"
#include "support/samples.hpp"
#include "support/sized_flights.hpp"

namespace {

/// The heavy cargo sample at its closed entry mass: the burn request of its powered descent,
/// lit at the trigger.
struct HeavyCargo {
    ds::Design design;
    ds::FlightEnvironment environment;
    ds::Evaluation e;

    /// With the share of the aeroshell's and decelerator's drag kept under thrust.
    explicit HeavyCargo(double drag_kept = 0.0)
        : design([&] {
              ds::Design d = ds::test::sample("heavy-cargo-lander");
              d.terminal.drag_preservation = drag_kept;
              return d;
          }()),
          environment(ds::make_environment(design)),
          e(ds::evaluate(design, environment.model(), ds::size_design(design).mass.entry_kg,
                         false)) {}

    ds::FlightModel model() const { return environment.model(); }
    ds::IntegratorSettings<ds::flight_state_size> settings(double relative_tolerance = 0.0) const {
        return ds::flight_integrator_settings(
            relative_tolerance > 0.0 ? relative_tolerance : design.solver.relative_tolerance,
            static_cast<std::size_t>(design.solver.max_steps));
    }
    ds::BurnRequest request(double site_m) const {
        ds::BurnRequest r = *e.burn_request;
        r.site_elevation_m = site_m;
        r.throttle = design.terminal.throttle;
        r.thrust_N = r.throttle * e.full_thrust_N;
        return r;
    }
    /// Flown at the design's tolerance, or at `relative_tolerance` when it is given.
    ds::ThrottledBurn solve(double site_m, const ds::ThrottleSolve& how,
                            double relative_tolerance = 0.0) const {
        return ds::solve_burn_throttle(model(), request(site_m), e.full_thrust_N,
                                       design.terminal.min_throttle, settings(relative_tolerance),
                                       e.entry.end_time_s, e.entry.end_state, nullptr, how);
    }
    /// The burn flown again at a throttle, from the same ignition.
    ds::BurnAttempt fly(double site_m, double throttle) const {
        ds::BurnRequest r = request(site_m);
        r.throttle = throttle;
        r.thrust_N = throttle * e.full_thrust_N;
        return ds::fly_burn(model(), r, settings(), e.entry.end_time_s, e.entry.end_state);
    }
};

ds::ThrottleSolve within(double seconds, const ds::BurnSolution* earlier = nullptr) {
    ds::ThrottleSolve how;
    how.end_time_tolerance_s = seconds;
    how.earlier = earlier;
    return how;
}

/// Checks a solve at a site against its burn flown again, and against the tighter solve.
void check_within_tolerance(const HeavyCargo& s, double site_m, const ds::ThrottledBurn& solved,
                            double tolerance_s) {
    REQUIRE(solved.burn.stops_in_time);
    REQUIRE_FALSE(solved.too_strong);
    const ds::BurnAttempt again = s.fly(site_m, solved.burn.throttle);
    REQUIRE(again.reached_velocity);
    const ds::FlightState& end = again.burn.end_state;
    const double above_site = end[ds::StateIndex::altitude] - site_m;
    const double mean_rate =
        (s.e.entry.end_state[ds::StateIndex::altitude] - end[ds::StateIndex::altitude]) /
        again.burn.burn_time_s;
    CHECK(above_site >= 0.0);
    CHECK(above_site <= tolerance_s * mean_rate);
    CHECK(ds::speed(end) ==
          doctest::Approx(s.design.terminal.touchdown_velocity_m_s).epsilon(1e-6));

    const ds::ThrottledBurn tighter = s.solve(site_m, within(1e-3 * tolerance_s));
    REQUIRE(tighter.burn.stops_in_time);
    CHECK(std::abs(solved.burn.burn_time_s - tighter.burn.burn_time_s) <= tolerance_s);
    CHECK(tighter.burn.throttle <= solved.burn.throttle);
}

}  // namespace

namespace {

/// A case of the heavy cargo sample's dispersion, about a standard deviation out on each key:
/// the frozen vehicle's deorbit 0.15 deg steeper, an atmosphere 10 % denser and engines 3 s of
/// specific impulse better (its burn 5.5 s longer than the nominal's).
ds::Design heavy_cargo_case(const ds::Design& frozen) {
    ds::Design dispersed = frozen;
    REQUIRE(dispersed.entry.orbit);
    dispersed.entry.orbit->flight_path_angle_deg -= 0.15;
    dispersed.atmosphere.density_scale = 1.1;
    dispersed.terminal.isp_s += 3.0;
    return dispersed;
}

}  // namespace

TEST_CASE("the solved throttle's burn ends at the site within its tolerance (heavy cargo)") {
    const HeavyCargo s;
    REQUIRE(s.e.burn);
    REQUIRE_FALSE(s.e.ignition_delayed);
    const double site = s.design.site.elevation_m;
    // The sizing's tolerance, 1e-6 s, as the sizing solved it.
    const ds::ThrottledBurn solved = s.solve(site, {});
    check_within_tolerance(s, site, solved, 1e-6);
    CHECK(solved.burn.throttle == s.e.burn->throttle);
    // The site search's: 1e-3 s at a site 2 km higher, from the design site's burn.
    const double higher = site + 2000.0;
    const ds::ThrottledBurn warm = s.solve(higher, within(1e-3, &*s.e.burn));
    check_within_tolerance(s, higher, warm, 1e-3);
    // Started from the design site's burn it flies at most three times (a cold solve at the
    // sizing's tolerance four); the flights' count, not a time.
    CHECK(warm.burn.attempts <= 3);
}

TEST_CASE("a solve for another entry mass, guided by the closure's previous one, as closely") {
    // The mass closure's next evaluation: 200 kg heavier, another entry and ignition. Guided by
    // the previous solve (its closed-form error on its own vehicle and how that error changes
    // with the throttle) it ends within the same tolerance as a cold solve, in fewer flights
    // (on this sample 3 where the cold solve takes 4, and 4 with the error taken as constant);
    // the flights' count, not a time.
    const HeavyCargo s;
    REQUIRE(s.e.burn);
    REQUIRE(s.e.throttle_offset_slope_m);
    const ds::Evaluation heavier = ds::evaluate(s.design, s.model(), s.e.entry_kg + 200.0, false);
    REQUIRE(heavier.burn_request);
    ds::BurnRequest request = *heavier.burn_request;  // as solved: at the design's throttle again
    request.throttle = s.design.terminal.throttle;
    request.thrust_N = request.throttle * heavier.full_thrust_N;
    const auto solve = [&](const ds::ThrottleSolve& how) {
        return ds::solve_burn_throttle(
            s.model(), request, heavier.full_thrust_N, s.design.terminal.min_throttle, s.settings(),
            heavier.entry.end_time_s, heavier.entry.end_state, nullptr, how);
    };
    const ds::ThrottledBurn cold = solve(within(1e-6));
    ds::ThrottleSolve guided_how = within(1e-6, &*s.e.burn);
    guided_how.earlier_request = &*s.e.burn_request;
    guided_how.offset_slope_m = s.e.throttle_offset_slope_m;
    const ds::ThrottledBurn guided = solve(guided_how);
    REQUIRE(cold.burn.stops_in_time);
    REQUIRE(guided.burn.stops_in_time);
    CHECK(std::abs(guided.burn.burn_time_s - cold.burn.burn_time_s) <= 1e-6);
    CHECK(std::abs(guided.burn.throttle - cold.burn.throttle) < 1e-6);
    CHECK(guided.burn.attempts < cold.burn.attempts);
    guided_how.offset_slope_m.reset();
    const ds::ThrottledBurn constant = solve(guided_how);
    CHECK(guided.burn.attempts < constant.burn.attempts);
}

TEST_CASE(
    "a dispersed case guided by the nominal vehicle's evaluation: as close, no more flights") {
    // A case of the sample's dispersion (heavy_cargo_case). Guided by the nominal's evaluation
    // (SizingOptions::guide) its throttle solve ends within the same 1e-6 s of burn time as a
    // cold one, in no more flights (4 and 4 here; over the sample's 200 first cases the guide
    // takes 5.6 % of the instructions off); the flights' count, not a time.
    const ds::test::FrozenSample heavy("heavy-cargo-lander");
    const ds::Evaluation& nominal = heavy.nominal;
    const ds::Design dispersed = heavy_cargo_case(heavy.frozen);
    const ds::Evaluation cold = ds::test::fly_case(dispersed, ds::Precision::design);
    const ds::Evaluation guided = ds::test::fly_case(dispersed, ds::Precision::design, &nominal);
    REQUIRE(cold.burn);
    REQUIRE(guided.burn);
    REQUIRE(cold.burn->stops_in_time);
    REQUIRE(guided.burn->stops_in_time);
    REQUIRE(nominal.burn);  // another flight than the nominal's
    CHECK(std::abs(cold.burn->burn_time_s - nominal.burn->burn_time_s) > 0.1);
    CHECK(std::abs(guided.burn->burn_time_s - cold.burn->burn_time_s) <= 1e-6);
    CHECK(std::abs(guided.burned_kg - cold.burned_kg) < 1e-3);
    CHECK(guided.burn->attempts <= cold.burn->attempts);
}

TEST_CASE(
    "a dispersed case's throttle, solved to a case's millisecond: within it, in fewer flights") {
    // The case above flown as a dispersion flies it (Precision::dispersed): the throttle solved
    // so that the burn ends within dispersed_end_time_tolerance_s of the exact throttle's, where
    // the design's own is solved to 1e-6 s. Its burn time, and the time it ends, within that
    // millisecond of the design-precision solve's; its propellant within the 10 g the constant
    // says a millisecond moves it by; in fewer flights (the flights' count, not a time).
    const ds::test::FrozenSample heavy("heavy-cargo-lander");
    const ds::Design dispersed = heavy_cargo_case(heavy.frozen);
    const ds::Evaluation exact =
        ds::test::fly_case(dispersed, ds::Precision::design, &heavy.nominal);
    const ds::Evaluation as_case =
        ds::test::fly_case(dispersed, ds::Precision::dispersed, &heavy.nominal);
    REQUIRE(exact.burn);
    REQUIRE(as_case.burn);
    REQUIRE(exact.burn->stops_in_time);
    REQUIRE(as_case.burn->stops_in_time);
    const double tolerance = ds::dispersed_end_time_tolerance_s;
    CHECK(std::abs(as_case.burn->end_time_s - exact.burn->end_time_s) <= tolerance + 1e-6);
    CHECK(std::abs(as_case.burn->burn_time_s - exact.burn->burn_time_s) <= tolerance + 1e-6);
    CHECK(std::abs(as_case.burned_kg - exact.burned_kg) < 0.01);
    CHECK(as_case.burn->attempts < exact.burn->attempts);
}

TEST_CASE("the site search's throttle solves, flown at 1e-5, time the burn as the design's 1e-8") {
    // The search's flights fly at a relative tolerance of 1e-5 (timeline_margin): the burn's
    // time, which the margin is, agrees with flights to the design's tolerance within the
    // search's 1e-3 s, at sites up to the highest feasible one.
    const HeavyCargo s;
    REQUIRE(s.e.burn);
    const double site = s.design.site.elevation_m;
    const ds::Results r = ds::size_design(s.design, {.history = false});
    REQUIRE(r.capability.max_site_elevation_m);
    for (const double above : {0.25, 0.5, 0.75, 1.0}) {
        const double at = site + above * (*r.capability.max_site_elevation_m - site);
        CAPTURE(at);
        const ds::ThrottledBurn fine = s.solve(at, within(1e-3, &*s.e.burn));
        const ds::ThrottledBurn trade = s.solve(at, within(1e-3, &*s.e.burn), 1e-5);
        REQUIRE(fine.burn.stops_in_time);
        REQUIRE(trade.burn.stops_in_time);
        CHECK(std::abs(trade.burn.burn_time_s - fine.burn.burn_time_s) < 2e-3);
    }
}

TEST_CASE("the powered descent's reach: the highest site its burn at the most throttle stops for") {
    // One flight at the design's throttle bounds the site search: a site 5 cm under the reach
    // is landed on at the end speed, at a throttle within 1e-4 of the most, its margin that of
    // the reach within the search's 1e-3 s; 5 cm over it the burn cannot stop. Both solves flown
    // at the search's 1e-5, as the reach.
    const HeavyCargo s;
    REQUIRE(s.e.burn);
    const double site = s.design.site.elevation_m;
    const auto reach = ds::powered_reach(s.design, s.model(), s.e, site);
    REQUIRE(reach);
    CHECK(reach->site_m > site + 5000.0);  // the sample reaches a site some 5.4 km higher
    const ds::ThrottledBurn under = s.solve(reach->site_m - 0.05, within(1e-3, &*s.e.burn), 1e-5);
    REQUIRE(under.burn.stops_in_time);
    CHECK(under.burn.throttle > s.design.terminal.throttle - 1e-4);
    const double under_margin = under.burn.end_time_s - under.burn.ignition_time_s -
                                s.design.sequence.ground_sensing_lock_s;
    CHECK(std::abs(under_margin - reach->margin_s) < 1e-3);
    const ds::ThrottledBurn over = s.solve(reach->site_m + 0.05, within(1e-3, &*s.e.burn), 1e-5);
    CHECK_FALSE(over.burn.stops_in_time);
    // The site search returns half its tolerance (0.5 m) inside the reach, where the margin
    // holds (it does here).
    REQUIRE(reach->margin_s >= 0.0);
    const ds::Results r = ds::size_design(s.design, {.history = false});
    REQUIRE(r.capability.max_site_elevation_m);
    CHECK(std::abs(*r.capability.max_site_elevation_m - (reach->site_m - 0.25)) < 1e-9);
}

TEST_CASE("with all the drag kept under thrust, which the closed form does not fly, as closely") {
    // The closed form is kilometres off here: the guide stalls and the Illinois method takes
    // over (run once on the bracket, not again on the one it left, the burn 1.5 km higher,
    // started from the design site's, ended 1.2e-4 m above the site and 2.1e-6 s off).
    const HeavyCargo s(1.0);
    REQUIRE(s.e.burn);
    REQUIRE_FALSE(s.e.ignition_delayed);
    const double site = s.design.site.elevation_m;
    check_within_tolerance(s, site, s.solve(site, {}), 1e-6);
    check_within_tolerance(s, site + 1500.0, s.solve(site + 1500.0, within(1e-6, &*s.e.burn)),
                           1e-6);
}

TEST_CASE("the closed-form throttle is within 0.005 of the solved one (heavy cargo)") {
    const HeavyCargo s;
    const double site = s.design.site.elevation_m;
    const double guess =
        ds::closed_form_throttle(s.model(), s.request(site), s.e.full_thrust_N,
                                 s.design.terminal.min_throttle, s.e.entry.end_state);
    // 0.005 of throttle is some 160 m of the 12 km the burn descends (the miss grows by about
    // 32 m a thousandth): the closed form flies no air, a flat body and a fixed thrust
    // acceleration in the turn; the sample's own burn is drag-free (no drag kept under thrust).
    CHECK(std::abs(guess - s.e.burn->throttle) <= 0.005);
}

TEST_CASE("a drag-free gravity turn at constant mass is flown at the closed form's throttle") {
    const ds::test::FlatVacuum v;
    const double mass = 20000.0;
    const double full = 3.0 * mass * ds::test::flat_gravity_m_s2;
    ds::BurnRequest r;
    r.end_velocity_m_s = 2.0;
    r.lander_mass_kg = mass;
    r.thrust_N = full;
    r.throttle = 1.0;
    r.specific_impulse_s = 1e7;  // the mass burned is some 1e-5 of the vehicle's
    r.gravity_turn = true;
    for (const double path_deg : {-5.0, -20.0, -45.0, -90.0}) {
        CAPTURE(path_deg);
        const ds::FlightState ignition = ds::make_flight_state(
            8000.0, 0.0, 0.0, 300.0, ds::degrees_to_radians(path_deg), M_PI / 2.0, mass);
        const double guess = ds::closed_form_throttle(v.model(), r, full, 0.2, ignition);
        const ds::ThrottledBurn solved = ds::solve_burn_throttle(
            v.model(), r, full, 0.2, ds::flight_integrator_settings(1e-10, 200000), 0.0, ignition);
        REQUIRE(solved.burn.stops_in_time);
        REQUIRE(solved.burn.throttle > 0.2);
        REQUIRE(solved.burn.throttle < 1.0);
        // The closed form turns to a stop: the last 2 m/s, some 0.3 m, it counts vertically.
        CHECK(guess == doctest::Approx(solved.burn.throttle).epsilon(1e-4));
    }
}
