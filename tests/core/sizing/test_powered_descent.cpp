// A powered descent lit during the entry (supersonic retro-propulsion), its throttle solved so that
// the burn ends at the end speed at the site, against sources outside the project:
// - a vertical constant-thrust burn in vacuum against the closed form of the rocket equation with
//   its mass loss (v(t) = v0 + g t - Isp g0 ln(m0 / m(t)), the distance its integral), the
//   throttle solved from it by Boost's TOMS 748;
// - a gravity turn into the flow with drag against an independent integration by Boost.Odeint
//   (Debian's libboost-dev: Dormand-Prince 5(4) with dense output at 1e-12, events by bisection);
// - the heavy cargo sample sized whole, read as an EDL engineer would read it;
// - energy: with no drag kept, no wind and no rotation, the change of the mechanical energy
//   v^2 / 2 - mu / r over the burn equals the thrust's work per unit mass, -integral T v / m dt,
//   integrated by Boost.Odeint beside the state.

#include <array>
#include <cmath>
#include <cstdint>

#include <doctest/doctest.h>
#include <boost/math/tools/toms748_solve.hpp>
#include <boost/numeric/odeint.hpp>

#include "atmosphere/exponential.hpp"
#include "body/body.hpp"
#include "constants.hpp"
#include "sizing/size.hpp"
#include "sizing/terminal_burn.hpp"
#include "support/flat_vacuum.hpp"
#include "support/results_lookup.hpp"
#include "support/samples.hpp"

namespace odeint = boost::numeric::odeint;

namespace {

// The flat, airless body's uniform gravity (support/flat_vacuum.hpp).
constexpr double g = ds::test::flat_gravity_m_s2;

ds::IntegratorSettings<ds::flight_state_size> tight() {
    return ds::flight_integrator_settings(1e-10, 200000);
}

/// A request for a powered descent from the entry: a gravity turn, thrust against the air.
ds::BurnRequest powered_request(double mass_kg, double full_thrust_N, double isp_s) {
    ds::BurnRequest r;
    r.site_elevation_m = 0.0;
    r.end_velocity_m_s = 2.0;
    r.lander_mass_kg = mass_kg;
    r.thrust_N = full_thrust_N;
    r.throttle = 1.0;
    r.specific_impulse_s = isp_s;
    r.coast_s = 0.0;
    r.gravity_turn = true;
    return r;
}

/// The vertical burn in closed form, at thrust T from mass m0 and downward speed v0: the time
/// to slow to v1, and the height it takes.
struct ClosedFormBurn {
    double time_s = 0.0;
    double height_m = 0.0;
    double burned_kg = 0.0;
};

ClosedFormBurn vertical_burn(double m0, double v0, double v1, double thrust, double isp) {
    const double c = isp * ds::standard_gravity_m_s2;
    const double mdot = thrust / c;
    const auto speed_at = [&](double t) { return v0 + g * t - c * std::log(m0 / (m0 - mdot * t)); };
    std::uintmax_t iterations = 200;
    const auto close = [](double a, double b) { return b - a < 1e-13; };
    const double t = boost::math::tools::toms748_solve([&](double s) { return speed_at(s) - v1; },
                                                       0.0, 0.99 * m0 / mdot, close, iterations)
                         .first;
    const double m1 = m0 - mdot * t;
    // The integral of ln(m0 / m) over the burn is t - (m1 / mdot) ln(m0 / m1).
    const double height = v0 * t + 0.5 * g * t * t - c * (t - (m1 / mdot) * std::log(m0 / m1));
    return {t, height, mdot * t};
}

using Raw = std::array<double, ds::flight_state_size + 1>;  // the state, then the thrust's work

}  // namespace

TEST_CASE("a vertical powered descent in vacuum: throttle, burn time, propellant (closed form)") {
    const ds::test::FlatVacuum v;
    const double m0 = 10000.0;
    const double v0 = 150.0;
    const double h0 = 3000.0;
    const double full = 3.0 * m0 * g;
    const double isp = 330.0;
    const ds::FlightState ignition = ds::make_flight_state(h0, 0.0, 0.0, v0, -M_PI / 2.0, 0.0, m0);
    const ds::ThrottledBurn solved = ds::solve_burn_throttle(
        v.model(), powered_request(m0, full, isp), full, 0.2, tight(), 100.0, ignition);
    REQUIRE(solved.burn.stops_in_time);
    CHECK_FALSE(solved.too_strong);

    // The throttle that makes the closed-form burn take exactly the height there is.
    std::uintmax_t iterations = 200;
    const auto close = [](double a, double b) { return b - a < 1e-12; };
    const double throttle =
        boost::math::tools::toms748_solve(
            [&](double x) { return vertical_burn(m0, v0, 2.0, x * full, isp).height_m - h0; }, 0.3,
            1.0, close, iterations)
            .first;
    const ClosedFormBurn reference = vertical_burn(m0, v0, 2.0, throttle * full, isp);
    CHECK(solved.burn.throttle == doctest::Approx(throttle).epsilon(1e-6));
    CHECK(solved.burn.burn_time_s == doctest::Approx(reference.time_s).epsilon(1e-6));
    CHECK(solved.burn.burned_kg == doctest::Approx(reference.burned_kg).epsilon(1e-6));
    CHECK(std::abs(solved.burn.end_state[ds::StateIndex::altitude]) < 1e-3);
    CHECK(ds::speed(solved.burn.end_state) == doctest::Approx(2.0).epsilon(1e-6));
    // Delta-v of the rocket equation: the speed taken off plus g t (the gravity loss).
    CHECK(solved.burn.ideal_delta_v_m_s ==
          doctest::Approx(v0 - 2.0 + g * reference.time_s).epsilon(1e-6));
}

TEST_CASE("a powered descent whose deepest throttle stops too high asks for a later ignition") {
    const ds::test::FlatVacuum v;
    const double m0 = 10000.0;
    const ds::FlightState ignition =
        ds::make_flight_state(20000.0, 0.0, 0.0, 150.0, -M_PI / 2.0, 0.0, m0);
    const double full = 3.0 * m0 * g;
    const ds::ThrottledBurn solved = ds::solve_burn_throttle(
        v.model(), powered_request(m0, full, 330.0), full, 0.5, tight(), 0.0, ignition);
    CHECK(solved.too_strong);
    CHECK(solved.burn.throttle == 0.5);
    // And one that cannot stop at all flies the most throttle and says so.
    const ds::ThrottledBurn short_of = ds::solve_burn_throttle(
        v.model(), powered_request(m0, full, 330.0), full, 0.5, tight(), 0.0,
        ds::make_flight_state(300.0, 0.0, 0.0, 150.0, -M_PI / 2.0, 0.0, m0));
    CHECK_FALSE(short_of.burn.stops_in_time);
    CHECK(short_of.burn.throttle == 1.0);
}

namespace {

/// A heavy vehicle lit at Mach 2.6 over a still, non-rotating Mars, 20 deg below the horizon,
/// half its aeroshell's drag kept under thrust.
struct GravityTurn {
    ds::Body body = [] {
        ds::Body b = *ds::body_preset("mars");
        b.rotation_rad_s = 0.0;
        return b;
    }();
    ds::ExponentialAtmosphere air{{0.020, 11100.0, 210.0}, 188.9, 1.29};
    double mass_kg = 20000.0;
    double full_thrust_N = 3.0 * 20000.0 * 3.71;
    ds::FlightState ignition = ds::make_flight_state(
        9000.0, 0.0, 0.0, 600.0, ds::degrees_to_radians(-20.0), M_PI / 2.0, 20000.0);
    ds::BurnRequest request(double drag_kept) const {
        ds::BurnRequest r = powered_request(mass_kg, full_thrust_N, 360.0);
        r.site_elevation_m = -2000.0;
        r.drag_devices = {{M_PI * 25.0, 1.6 * drag_kept, {}}};
        r.thrust_reference_area_m2 = M_PI * 25.0;
        return r;
    }
    ds::FlightModel model() const { return {body, air}; }
};

/// The reference flight of the burn at a throttle: Odeint on the project's equations, with the
/// thrust's work per unit mass beside the state; the gravity turn until the flight is within
/// gravity_turn_end_deg of the vertical, then against the ground velocity, to the end speed.
struct OdeintBurn {
    double end_time_s = 0.0;
    Raw end{};
};

OdeintBurn odeint_burn(const GravityTurn& s, const ds::BurnRequest& r, double throttle) {
    const ds::FlightModel model = s.model();
    ds::Stage stage;
    stage.drag_devices = r.drag_devices;
    stage.thrust_N = throttle * s.full_thrust_N;
    stage.specific_impulse_s = r.specific_impulse_s;
    stage.thrust_against_air = true;
    const auto to_state = [](const Raw& x) {
        ds::FlightState y;
        for (int i = 0; i < ds::flight_state_size; ++i)
            y[i] = x[static_cast<std::size_t>(i)];
        return y;
    };
    const auto system = [&](const Raw& x, Raw& dxdt, double) {
        const ds::FlightState y = to_state(x);
        const ds::FlightState d = ds::flight_derivative(model, stage, y);
        for (int i = 0; i < ds::flight_state_size; ++i)
            dxdt[static_cast<std::size_t>(i)] = d[i];
        dxdt.back() = stage.thrust_N / y[ds::StateIndex::mass] * ds::speed(y);
    };
    auto stepper = odeint::make_dense_output(1e-12, 1e-12, odeint::runge_kutta_dopri5<Raw>());
    Raw x{};
    for (int i = 0; i < ds::flight_state_size; ++i)
        x[static_cast<std::size_t>(i)] = s.ignition[i];
    stepper.initialize(x, 0.0, 0.01);
    Raw probe;
    const auto at = [&](double t) {
        stepper.calc_state(t, probe);
        return to_state(probe);
    };
    const auto crossing = [&](double a, double b, const auto& above) {
        while (b - a > 1e-10)
            (above(at(0.5 * (a + b))) ? a : b) = 0.5 * (a + b);
        return b;
    };
    const double turn_end = ds::degrees_to_radians(-90.0 + ds::gravity_turn_end_deg);
    bool turning = true;
    while (true) {
        const auto [t0, t1] = stepper.do_step(system);
        const ds::FlightState y = to_state(stepper.current_state());
        if (turning && ds::flight_path_angle_rad(y) < turn_end) {
            const double t = crossing(t0, t1, [&](const ds::FlightState& z) {
                return ds::flight_path_angle_rad(z) >= turn_end;
            });
            stepper.calc_state(t, probe);
            stepper.initialize(probe, t, 0.01);
            stage.thrust_against_air = false;  // still air: the same direction
            turning = false;
            continue;
        }
        if (ds::speed(y) <= r.end_velocity_m_s) {
            OdeintBurn out;
            out.end_time_s = crossing(t0, t1, [&](const ds::FlightState& z) {
                return ds::speed(z) > r.end_velocity_m_s;
            });
            stepper.calc_state(out.end_time_s, out.end);
            return out;
        }
    }
}

/// The burn solved by the project at a drag kept, and flown by the reference at its throttle.
struct SolvedTurn {
    GravityTurn s;
    ds::BurnRequest request;
    ds::ThrottledBurn solved;
    OdeintBurn reference;
};

SolvedTurn solved_turn(double drag_kept) {
    SolvedTurn t;
    t.request = t.s.request(drag_kept);
    t.solved = ds::solve_burn_throttle(t.s.model(), t.request, t.s.full_thrust_N, 0.2, tight(), 0.0,
                                       t.s.ignition);
    REQUIRE(t.solved.burn.stops_in_time);
    t.reference = odeint_burn(t.s, t.request, t.solved.burn.throttle);
    return t;
}

double mechanical_energy(const ds::Body& body, const ds::FlightState& y) {
    return 0.5 * ds::speed(y) * ds::speed(y) -
           body.mu_m3_s2 / (body.radius_m + y[ds::StateIndex::altitude]);
}

}  // namespace

TEST_CASE("a gravity turn into the flow with drag agrees with Boost.Odeint to 1e-5") {
    const SolvedTurn turn = solved_turn(0.5);
    const GravityTurn& s = turn.s;
    const ds::BurnRequest& r = turn.request;
    const ds::ThrottledBurn& solved = turn.solved;
    const OdeintBurn& reference = turn.reference;
    REQUIRE_FALSE(solved.too_strong);
    CHECK(solved.burn.throttle > 0.2);
    CHECK(solved.burn.throttle < 1.0);
    const double burned = s.mass_kg - reference.end[ds::StateIndex::mass];
    CHECK(solved.burn.burn_time_s == doctest::Approx(reference.end_time_s).epsilon(1e-5));
    CHECK(solved.burn.burned_kg == doctest::Approx(burned).epsilon(1e-5));
    // The reference flown at the solved throttle ends at the site too (within a centimetre of
    // the 11 km it descends), at the end speed.
    CHECK(std::abs(reference.end[ds::StateIndex::altitude] - r.site_elevation_m) < 0.01);
    CHECK(ds::speed(solved.burn.end_state) == doctest::Approx(2.0).epsilon(1e-5));
    // The turn brings the velocity to the vertical: nearly no speed across the ground is left.
    CHECK(ds::horizontal_speed(solved.burn.end_state) < 0.5);
    // The thrust coefficient at ignition, T / (q A), at the throttle flown.
    ds::Stage burning;
    burning.thrust_N = solved.burn.throttle * s.full_thrust_N;
    burning.thrust_reference_area_m2 = M_PI * 25.0;
    const ds::FlightConditions c = ds::flight_conditions(s.model(), burning, s.ignition);
    CHECK(c.thrust_coefficient ==
          doctest::Approx(burning.thrust_N / (c.dynamic_pressure_Pa * M_PI * 25.0)).epsilon(1e-12));
}

TEST_CASE("with no drag kept, the mechanical energy lost over the burn is the thrust's work") {
    const SolvedTurn turn = solved_turn(0.0);
    const GravityTurn& s = turn.s;
    const ds::ThrottledBurn& solved = turn.solved;
    const OdeintBurn& reference = turn.reference;
    const double work_per_kg = reference.end.back();
    const double lost =
        mechanical_energy(s.body, s.ignition) - mechanical_energy(s.body, solved.burn.end_state);
    CHECK(lost == doctest::Approx(work_per_kg).epsilon(1e-6));
}

// The heavy cargo sample, sized whole: what an EDL engineer reads off it.
TEST_CASE("the heavy cargo lander sizes from entry to touchdown with a closed budget") {
    const ds::Design design = ds::test::sample("heavy-cargo-lander");
    const ds::Results r = ds::size_design(design);
    REQUIRE(r.converged);
    REQUIRE(r.mass.closure);
    CHECK(r.mass.closure->converged);
    // Tens of tonnes: beyond the heritage envelope, flagged, not refused.
    CHECK(r.mass.entry_kg > 20000.0);
    ds::test::require_check(r, "aeroshell_diameter", ds::CheckStatus::marginal);
    ds::test::check_says(r, "landed_mass", ds::CheckStatus::marginal, "supersonic-retro");
    for (const ds::Check& c : r.checks) {
        CAPTURE(c.id);
        CAPTURE(c.message);
        CHECK(c.status != ds::CheckStatus::fail);
    }
    for (const char* id :
         {"ignition_trigger", "ignition_mach", "ignition_dynamic_pressure", "thrust_to_weight",
          "burn_deceleration", "propellant_fraction", "timeline_margin", "touchdown_velocity"}) {
        CAPTURE(id);
        CHECK(ds::test::find_check(r, id) != nullptr);
    }
    // No canopy: no parachute figures, and no separation in the timeline.
    CHECK_FALSE(r.parachute.deployed);
    CHECK_FALSE(r.parachute.diameter_m.has_value());
    REQUIRE(r.terminal.powered_descent);
    const ds::PoweredDescentResults& p = *r.terminal.powered_descent;
    CHECK(p.ignition_mach == doctest::Approx(2.8).epsilon(1e-6));
    CHECK(p.throttle >= design.terminal.min_throttle);
    CHECK(p.throttle <= design.terminal.throttle);
    REQUIRE(r.terminal.touchdown_velocity_m_s);
    CHECK(*r.terminal.touchdown_velocity_m_s == doctest::Approx(2.0).epsilon(1e-6));
    // The whole vehicle lands, less what it burned.
    REQUIRE(r.mass.landed_kg);
    CHECK(*r.mass.landed_kg ==
          doctest::Approx(r.mass.entry_kg - *r.terminal.burned_propellant_kg).epsilon(1e-12));
    CHECK(p.propellant_fraction ==
          doctest::Approx(*r.terminal.propellant_kg / r.mass.entry_kg).epsilon(1e-12));
    REQUIRE(r.landing);
    bool separation = false;
    for (const ds::TimelineEvent& e : r.timeline.events)
        separation = separation || e.name == "backshell separation";
    CHECK_FALSE(separation);
}

TEST_CASE("an ignition too early for the deepest throttle is delayed along the flight") {
    ds::Design design = ds::test::sample("heavy-cargo-lander");
    design.terminal.trigger_value = 3.8;  // lit high: even the deepest throttle stops too soon
    design.terminal.min_throttle = 0.9;
    const ds::Results r = ds::size_design(design);
    REQUIRE(r.terminal.powered_descent);
    CHECK(r.terminal.powered_descent->ignition_delayed);
    CHECK(r.terminal.powered_descent->throttle == 0.9);
    CHECK(r.terminal.powered_descent->ignition_mach < 3.8);
    REQUIRE(r.terminal.touchdown_velocity_m_s);
    CHECK(std::abs(*r.terminal.touchdown_velocity_m_s - 2.0) < 0.05);
}

TEST_CASE("without a parachute, landing on the canopy is a ballistic impact judged by the checks") {
    ds::Design design = ds::test::sample("small-ballistic-station");
    design.parachute.reset();
    design.terminal.method = ds::TerminalMethod::none;
    const ds::Results r = ds::size_design(design);
    REQUIRE(ds::test::find_check(r, "ballistic_impact"));
    REQUIRE(r.terminal.touchdown_velocity_m_s);
    CHECK(*r.terminal.touchdown_velocity_m_s > 30.0);  // far above any leg's qualification
    ds::test::require_check(r, "touchdown_velocity", ds::CheckStatus::fail);
}

TEST_CASE("with no throttle range the ignition point is what is solved") {
    ds::Design design = ds::test::sample("heavy-cargo-lander");
    design.terminal.min_throttle = 1.0;  // full thrust only: the burn starts where it must
    const ds::Results r = ds::size_design(design);
    REQUIRE(r.terminal.powered_descent);
    CHECK(r.terminal.powered_descent->ignition_delayed);
    CHECK(r.terminal.powered_descent->throttle == 1.0);
    REQUIRE(r.terminal.touchdown_velocity_m_s);
    CHECK(std::abs(*r.terminal.touchdown_velocity_m_s - 2.0) < 0.05);
    // Lit later than the trigger's Mach 2.8, and burning less than the throttled descent.
    CHECK(r.terminal.powered_descent->ignition_mach < 2.8);
    const ds::Results throttled = ds::size_design(ds::test::sample("heavy-cargo-lander"));
    CHECK(*r.terminal.burned_propellant_kg < *throttled.terminal.burned_propellant_kg);
}
