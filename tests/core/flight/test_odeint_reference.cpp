// The project's integrator and event location against an independent integration of the same
// equations by Boost.Odeint (Debian's libboost-dev): its Runge-Kutta-Fehlberg 7(8) stepper
// with dense output, at a tighter tolerance, with events found by bisection on its dense output
// and peaks by golden-section search. Agreement is asserted well inside the 1 % the entry
// figures are held to.

#include <array>
#include <cmath>
#include <functional>

#include <doctest/doctest.h>
#include <boost/numeric/odeint.hpp>

#include "atmosphere/exponential.hpp"
#include "body/body.hpp"
#include "constants.hpp"
#include "flight/phase.hpp"
#include "numerics/maximum.hpp"
#include "support/project_flight.hpp"

namespace odeint = boost::numeric::odeint;

namespace {

using RawState = std::array<double, ds::flight_state_size>;

ds::FlightState to_eigen(const RawState& x) {
    ds::FlightState y;
    for (int i = 0; i < ds::flight_state_size; ++i)
        y[i] = x[static_cast<std::size_t>(i)];
    return y;
}

struct Scenario {
    ds::Body body;
    ds::ExponentialAtmosphere atmosphere;
    ds::Stage stage;
    ds::FlightState y0;
    double deploy_mach;
};

// A lifting, banked entry on a rotating Mars, from 20 deg north heading north-east: every term
// of the equations is exercised.
Scenario lifting_mars_entry() {
    Scenario s{*ds::body_preset("mars"),
               ds::ExponentialAtmosphere({0.020, 11100.0, 210.0}, 188.9, 1.29),
               {},
               {},
               1.8};
    s.stage.drag_devices = {{M_PI * 4.0 * 4.0 / 4.0, 1.68, {}}};
    s.stage.lift_to_drag = 0.22;
    s.stage.bank = ds::degrees_to_radians(40.0);
    s.stage.nose_radius_m = 1.0;
    s.y0 =
        ds::make_flight_state(125000.0, ds::degrees_to_radians(20.0), 0.0, 5800.0,
                              ds::degrees_to_radians(-15.0), ds::degrees_to_radians(45.0), 1800.0);
    return s;
}

struct Reference {
    double deploy_time = 0.0;
    RawState deploy_state{};
    double peak_deceleration_g = 0.0;
    double peak_heat_flux = 0.0;
};

Reference odeint_reference(const Scenario& s) {
    const ds::FlightModel model{s.body, s.atmosphere};
    const auto system = [&](const RawState& x, RawState& dxdt, double) {
        const ds::FlightState d = ds::flight_derivative(model, s.stage, to_eigen(x));
        for (int i = 0; i < ds::flight_state_size; ++i)
            dxdt[static_cast<std::size_t>(i)] = d[i];
    };
    const auto conditions = [&](const RawState& x) {
        return ds::flight_conditions(model, s.stage, to_eigen(x));
    };
    auto stepper = odeint::make_dense_output(1e-12, 1e-12, odeint::runge_kutta_dopri5<RawState>());
    RawState x;
    for (int i = 0; i < ds::flight_state_size; ++i)
        x[static_cast<std::size_t>(i)] = s.y0[i];
    stepper.initialize(x, 0.0, 0.05);

    Reference ref;
    RawState probe;
    const auto state_at = [&](double t) {
        stepper.calc_state(t, probe);
        return probe;
    };
    using ds::maximum_of;

    const auto deceleration = [&](double t) { return conditions(state_at(t)).deceleration_g; };
    const auto heat_flux = [&](double t) {
        return conditions(state_at(t)).convective_heat_flux_W_m2;
    };

    double previous_decel = 0.0;
    double previous_heat = 0.0;
    while (true) {
        const auto [t0, t1] = stepper.do_step(system);
        // A maximum of a smooth quantity lies in a step whose end value has begun to fall;
        // search that step and the one before it.
        const double decel = deceleration(t1);
        const double heat = heat_flux(t1);
        const double lo = std::max(0.0, t0 - (t1 - t0));
        if (decel < previous_decel && ref.peak_deceleration_g == 0.0) {
            ref.peak_deceleration_g = maximum_of(deceleration, lo, t1);
        }
        if (heat < previous_heat && ref.peak_heat_flux == 0.0) {
            ref.peak_heat_flux = maximum_of(heat_flux, lo, t1);
        }
        previous_decel = decel;
        previous_heat = heat;
        if (conditions(stepper.current_state()).mach <= s.deploy_mach) {
            double a = t0;
            double b = t1;
            while (b - a > 1e-9) {
                const double m = 0.5 * (a + b);
                (conditions(state_at(m)).mach > s.deploy_mach ? a : b) = m;
            }
            ref.deploy_time = b;
            ref.deploy_state = state_at(b);
            return ref;
        }
    }
}

ds::test::ProjectFlight project_flight(const Scenario& s) {
    return ds::test::project_flight(ds::FlightModel{s.body, s.atmosphere}, s.stage, s.y0,
                                    s.deploy_mach, 1e-8, 100000);
}

}  // namespace

TEST_CASE("deploy time and state agree with Boost.Odeint to 1e-5 on a lifting Mars entry") {
    const Scenario s = lifting_mars_entry();
    const Reference ref = odeint_reference(s);
    const ds::test::ProjectFlight f = project_flight(s);
    REQUIRE(f.outcome.reason == ds::StopReason::terminal_event);
    CHECK(f.outcome.time_s == doctest::Approx(ref.deploy_time).epsilon(1e-5));
    CHECK(f.outcome.y[ds::StateIndex::altitude] ==
          doctest::Approx(ref.deploy_state[ds::StateIndex::altitude]).epsilon(1e-5));
    CHECK(ds::speed(f.outcome.y) ==
          doctest::Approx(ds::speed(to_eigen(ref.deploy_state))).epsilon(1e-5));
    CHECK(f.outcome.y[ds::StateIndex::latitude] ==
          doctest::Approx(ref.deploy_state[ds::StateIndex::latitude]).epsilon(1e-5));
    CHECK(f.outcome.y[ds::StateIndex::longitude] ==
          doctest::Approx(ref.deploy_state[ds::StateIndex::longitude]).epsilon(1e-5));
    CHECK(f.outcome.y[ds::StateIndex::convective_heat_load] ==
          doctest::Approx(ref.deploy_state[ds::StateIndex::convective_heat_load]).epsilon(1e-5));
}

TEST_CASE("peak deceleration and peak heat flux agree with Boost.Odeint to 1e-5") {
    const Scenario s = lifting_mars_entry();
    const Reference ref = odeint_reference(s);
    const ds::test::ProjectFlight f = project_flight(s);
    REQUIRE(ref.peak_deceleration_g > 0.0);
    REQUIRE(ref.peak_heat_flux > 0.0);
    CHECK(f.peak_deceleration_g == doctest::Approx(ref.peak_deceleration_g).epsilon(1e-5));
    CHECK(f.peak_heat_flux == doctest::Approx(ref.peak_heat_flux).epsilon(1e-5));
}
