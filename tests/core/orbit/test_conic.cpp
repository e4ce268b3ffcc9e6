// The conics of an arrival and of a deorbit burn against values worked by hand from the
// fact-sheet constants (NASA NSSDC Mars fact sheet: GM 4.2828e13 m^3/s^2, mean radius
// 3389.5 km), against the two-impulse (Hohmann) closed form, and against an independent
// integration of the two-body equations by Boost.Odeint.

#include <array>
#include <cmath>

#include <doctest/doctest.h>
#include <boost/numeric/odeint.hpp>

#include "constants.hpp"
#include "orbit/conic.hpp"

namespace {

// NASA NSSDC Mars fact sheet.
constexpr double mars_mu = 4.2828e13;
constexpr double mars_radius = 3389.5e3;
constexpr double interface_radius = mars_radius + 125e3;  // 3514.5 km

double deg(double rad) {
    return ds::radians_to_degrees(rad);
}

}  // namespace

TEST_CASE("vis-viva at the interface of a 3 km/s arrival is 5776.87 m/s (by hand, Mars GM)") {
    // v_E^2 = v_inf^2 + 2 mu / r_E = 9.0e6 + 2 (4.2828e13) / 3.5145e6 = 9.0e6 + 2.437217e7
    //       = 3.337217e7 m^2/s^2, v_E = 5776.87 m/s.
    const ds::HyperbolicArrival a =
        ds::arrival_at_angle(mars_mu, 3000.0, ds::degrees_to_radians(-11.2), interface_radius);
    CHECK(a.interface_speed_m_s == doctest::Approx(5776.87).epsilon(2e-6));
    CHECK(deg(a.interface_flight_path_angle_rad) == doctest::Approx(-11.2).epsilon(1e-12));
    // h = r_E v_E cos(11.2 deg) = 3.5145e6 x 5776.865 x 0.980955 = 1.991613e10 m^2/s;
    // r_p = h^2 / (mu + sqrt(mu^2 + v_inf^2 h^2)) = 3409.40 km, 19.90 km above the radius.
    CHECK(a.periapsis_radius_m - mars_radius == doctest::Approx(19903.9).epsilon(2e-5));
    // e = sqrt(1 + v_inf^2 h^2 / mu^2) = 1.71646; b = h / v_inf = 6638.71 km;
    // turn 2 asin(1 / e) = 71.266 deg.
    CHECK(a.eccentricity == doctest::Approx(1.716462).epsilon(1e-6));
    CHECK(a.impact_parameter_m == doctest::Approx(6638.71e3).epsilon(1e-6));
    CHECK(deg(a.turn_angle_rad) == doctest::Approx(71.2664).epsilon(1e-5));
    CHECK(a.semi_major_axis_m == doctest::Approx(-4.2828e13 / 9.0e6).epsilon(1e-12));
}

TEST_CASE("a 3 km/s arrival through a 20 km periapsis enters at -11.195 deg (by hand, Mars GM)") {
    // v_p^2 = 9.0e6 + 2 mu / (3409.5 km) = 3.412274e7, v_p = 5841.468 m/s; h = r_p v_p =
    // 1.991649e10; cos(gamma_E) = h / (r_E v_E) = 0.980979, gamma_E = -11.1948 deg. True
    // anomaly: p = h^2 / mu, cos(nu) = (p / r_E - 1) / e with e = 1.716482: nu = -17.689 deg.
    const ds::HyperbolicArrival a =
        ds::arrival_through_periapsis(mars_mu, 3000.0, mars_radius + 20e3, interface_radius);
    CHECK(a.interface_speed_m_s == doctest::Approx(5776.87).epsilon(2e-6));
    CHECK(deg(a.interface_flight_path_angle_rad) == doctest::Approx(-11.19484).epsilon(2e-6));
    CHECK(a.periapsis_radius_m == doctest::Approx(mars_radius + 20e3).epsilon(1e-12));
    CHECK(a.eccentricity == doctest::Approx(1.716482).epsilon(1e-6));
    CHECK(deg(a.interface_true_anomaly_rad) == doctest::Approx(-17.6893).epsilon(1e-5));
}

TEST_CASE("the two forms of an arrival are each other's inverse, and the conic's relations hold") {
    for (const double v_inf : {100.0, 2650.0, 6000.0}) {
        for (const double gamma_deg : {-3.0, -12.5, -40.0, -85.0}) {
            CAPTURE(v_inf);
            CAPTURE(gamma_deg);
            const ds::HyperbolicArrival by_angle = ds::arrival_at_angle(
                mars_mu, v_inf, ds::degrees_to_radians(gamma_deg), interface_radius);
            const ds::HyperbolicArrival by_periapsis = ds::arrival_through_periapsis(
                mars_mu, v_inf, by_angle.periapsis_radius_m, interface_radius);
            CHECK(deg(by_periapsis.interface_flight_path_angle_rad) ==
                  doctest::Approx(gamma_deg).epsilon(1e-9));
            // Periapsis of a hyperbola: r_p = a (1 - e); impact parameter b = -a sqrt(e^2 - 1).
            const double a = by_angle.semi_major_axis_m;
            const double e = by_angle.eccentricity;
            CHECK(by_angle.periapsis_radius_m == doctest::Approx(a * (1.0 - e)).epsilon(1e-9));
            CHECK(by_angle.impact_parameter_m ==
                  doctest::Approx(-a * std::sqrt(e * e - 1.0)).epsilon(1e-9));
            // The flight-path angle from the true anomaly: tan(gamma) = e sin(nu) / (1 + e
            // cos(nu)).
            const double nu = by_angle.interface_true_anomaly_rad;
            CHECK(deg(std::atan2(e * std::sin(nu), 1.0 + e * std::cos(nu))) ==
                  doctest::Approx(gamma_deg).epsilon(1e-9));
        }
    }
}

TEST_CASE("from a circular orbit the deorbit burn is the first impulse of a Hohmann transfer") {
    // A 300 km circular orbit lowered to a periapsis 40 km below the reference radius. The
    // Hohmann closed form: dv = sqrt(mu / r_a) (1 - sqrt(2 r_p / (r_a + r_p))). The interface
    // angle of that ellipse by hand: a = (r_a + r_p) / 2, e = (r_a - r_p) / (r_a + r_p),
    // h = sqrt(mu a (1 - e^2)), v_E from vis-viva, cos(gamma) = h / (r_E v_E).
    const double ra = mars_radius + 300e3;
    const double rp = mars_radius - 40e3;
    const double a = 0.5 * (ra + rp);
    const double e = (ra - rp) / (ra + rp);
    const double h = std::sqrt(mars_mu * a * (1.0 - e * e));
    const double ve = std::sqrt(mars_mu * (2.0 / interface_radius - 1.0 / a));
    const double gamma = -std::acos(h / (interface_radius * ve));

    const ds::DeorbitBurn burn = ds::deorbit_at_apoapsis(mars_mu, ra, ra, interface_radius, gamma);
    const double hohmann = std::sqrt(mars_mu / ra) * (1.0 - std::sqrt(2.0 * rp / (ra + rp)));
    CHECK(burn.delta_v_m_s == doctest::Approx(hohmann).epsilon(1e-9));
    CHECK(burn.speed_before_m_s == doctest::Approx(std::sqrt(mars_mu / ra)).epsilon(1e-12));
    CHECK(burn.transfer_periapsis_radius_m == doctest::Approx(rp).epsilon(1e-9));
    CHECK(burn.transfer_eccentricity == doctest::Approx(e).epsilon(1e-9));
    CHECK(burn.interface_speed_m_s == doctest::Approx(ve).epsilon(1e-12));
    CHECK(burn.interface_flight_path_angle_rad == doctest::Approx(gamma).epsilon(1e-9));
    // 83.30 m/s from 300 km: sqrt(mu / r_a) = 3418.6 m/s times 1 - sqrt(2 r_p / (r_a + r_p)).
    CHECK(burn.delta_v_m_s == doctest::Approx(83.303).epsilon(1e-4));
}

TEST_CASE("from an elliptical orbit the burn is the difference of the two apoapsis speeds") {
    // A 250 x 1000 km orbit, lowered to a periapsis 10 km above the radius: vis-viva at the
    // apoapsis of each ellipse, v^2 = 2 mu r_p / (r_a (r_a + r_p)).
    const double ra = mars_radius + 1000e3;
    const double rp0 = mars_radius + 250e3;
    const double rp1 = mars_radius + 10e3;
    const auto apoapsis_speed = [&](double rp) {
        return std::sqrt(2.0 * mars_mu * rp / (ra * (ra + rp)));
    };
    const double a = 0.5 * (ra + rp1);
    const double e = (ra - rp1) / (ra + rp1);
    const double h = std::sqrt(mars_mu * a * (1.0 - e * e));
    const double ve = std::sqrt(mars_mu * (2.0 / interface_radius - 1.0 / a));
    const double gamma = -std::acos(h / (interface_radius * ve));

    const ds::DeorbitBurn burn = ds::deorbit_at_apoapsis(mars_mu, rp0, ra, interface_radius, gamma);
    CHECK(burn.speed_before_m_s == doctest::Approx(apoapsis_speed(rp0)).epsilon(1e-12));
    CHECK(burn.speed_after_m_s == doctest::Approx(apoapsis_speed(rp1)).epsilon(1e-9));
    CHECK(burn.delta_v_m_s ==
          doctest::Approx(apoapsis_speed(rp0) - apoapsis_speed(rp1)).epsilon(1e-8));
    CHECK(burn.transfer_periapsis_radius_m == doctest::Approx(rp1).epsilon(1e-9));
}

TEST_CASE("the coast from the burn to the interface matches a two-body integration (Odeint)") {
    namespace odeint = boost::numeric::odeint;
    using State = std::array<double, 4>;  // x, y, vx, vy
    const double ra = mars_radius + 400e3;
    const ds::DeorbitBurn burn = ds::deorbit_at_apoapsis(
        mars_mu, mars_radius + 200e3, ra, interface_radius, ds::degrees_to_radians(-14.0));
    // From apoapsis on the x axis, moving along +y, until the interface radius.
    State s{ra, 0.0, 0.0, burn.speed_after_m_s};
    const auto two_body = [](const State& x, State& dxdt, double) {
        const double r = std::hypot(x[0], x[1]);
        const double g = -mars_mu / (r * r * r);
        dxdt = {x[2], x[3], g * x[0], g * x[1]};
    };
    odeint::runge_kutta_dopri5<State> stepper;
    const double dt = 0.05;
    double t = 0.0;
    State previous = s;
    while (std::hypot(s[0], s[1]) > interface_radius) {
        previous = s;
        stepper.do_step(two_body, s, t, dt);
        t += dt;
    }
    // Linear interpolation of the crossing inside the last step (r falls ~50 m per step).
    const double r0 = std::hypot(previous[0], previous[1]);
    const double r1 = std::hypot(s[0], s[1]);
    const double f = (r0 - interface_radius) / (r0 - r1);
    State at;
    for (std::size_t i = 0; i < 4; ++i)
        at[i] = previous[i] + f * (s[i] - previous[i]);
    const double t_cross = t - dt + f * dt;
    const double radial = (at[0] * at[2] + at[1] * at[3]) / interface_radius;
    const double speed = std::hypot(at[2], at[3]);
    CHECK(burn.coast_s == doctest::Approx(t_cross).epsilon(1e-5));
    CHECK(burn.interface_speed_m_s == doctest::Approx(speed).epsilon(1e-6));
    CHECK(deg(std::asin(radial / speed)) == doctest::Approx(-14.0).epsilon(1e-4));
    // The angle swept about the centre from the burn.
    CHECK(deg(burn.transfer_angle_rad) ==
          doctest::Approx(deg(std::atan2(at[1], at[0]))).epsilon(1e-5));
}
