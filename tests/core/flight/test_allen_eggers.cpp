// The integrator and the equations of motion against the closed-form ballistic entry of
// Allen and Eggers, NACA Report 1381 (1958): straight-line flight through an exponential
// atmosphere with gravity neglected. Gravity is switched off (mu = 0) and the planet made
// flat (a radius of 1e16 m) so that the flight-path angle stays constant, as the theory assumes.

#include <cmath>
#include <vector>

#include <doctest/doctest.h>

#include "atmosphere/exponential.hpp"
#include "constants.hpp"
#include "flight/phase.hpp"
#include "verification/allen_eggers_case.hpp"

namespace {

// The worked check of references.md (derived from the closed form), as `descent-sizer verify`
// flies it.
constexpr double rho0 = ds::allen_eggers_case::rho0_kg_m3;
constexpr double scale_height = ds::allen_eggers_case::scale_height_m;
constexpr double beta = ds::allen_eggers_case::beta_kg_m2;
constexpr double entry_velocity = ds::allen_eggers_case::entry_velocity_m_s;
constexpr double entry_angle_deg = ds::allen_eggers_case::entry_angle_deg;
constexpr double interface_altitude = ds::allen_eggers_case::interface_altitude_m;

struct AllenEggersFlight {
    ds::Body body{"flat", 1e16, 0.0, 0.0, ds::Gas{188.9, 1.29, 1.9027e-4, ""}};
    ds::ExponentialAtmosphere atmosphere{{rho0, scale_height, 210.0}, 188.9, 1.29};
    ds::Phase phase;
    ds::PhaseOutcome outcome;
    std::vector<ds::TrajectorySample> history;

    AllenEggersFlight() {
        const double mass = 500.0;
        phase.stage.drag_devices = {{mass / beta, 1.0, {}}};
        phase.stage.nose_radius_m = 0.5;
        phase.ends = {
            {"ground", ds::FlightQuantity::altitude, 10000.0, ds::EventDirection::falling}};
        phase.peaks = {{"q", ds::FlightQuantity::deceleration},
                       {"heat", ds::FlightQuantity::heat_flux}};
        const ds::FlightState y0 =
            ds::make_flight_state(interface_altitude, 0.0, 0.0, entry_velocity,
                                  ds::degrees_to_radians(entry_angle_deg), ds::pi / 2.0, mass);
        const ds::FlightModel model{body, atmosphere};
        outcome = ds::fly_phase(model, phase, 0.0, y0, 1000.0,
                                ds::flight_integrator_settings(1e-10, 100000), {&history});
    }
};

double sin_gamma() {
    return std::sin(std::abs(ds::degrees_to_radians(entry_angle_deg)));
}

// The closed form starts at infinite altitude; the flight starts at 125 km, where the tiny
// density has already taken off a fraction 9e-5 of the speed. The speed the same vehicle
// would have had at infinity makes the comparison exact.
double velocity_at_infinity(double beta_kg_m2) {
    const double rho_e = rho0 * std::exp(-interface_altitude / scale_height);
    return entry_velocity * std::exp(rho_e * scale_height / (2.0 * beta_kg_m2 * sin_gamma()));
}

// V(h) from the interface altitude.
double closed_form_velocity(double h) {
    const double rho = rho0 * std::exp(-h / scale_height);
    const double rho_e = rho0 * std::exp(-interface_altitude / scale_height);
    return entry_velocity * std::exp(-(rho - rho_e) * scale_height / (2.0 * beta * sin_gamma()));
}

const ds::PeakHit& peak(const ds::PhaseOutcome& out, std::size_t index) {
    for (const ds::PeakHit& hit : out.peaks) {
        if (hit.peak == index)
            return hit;
    }
    FAIL("peak not found");
    return out.peaks.front();
}

}  // namespace

TEST_CASE("velocity-altitude curve matches Allen-Eggers to 1e-6 relative (NACA Report 1381)") {
    const AllenEggersFlight flight;
    REQUIRE(flight.outcome.reason == ds::StopReason::terminal_event);
    REQUIRE(flight.history.size() > 20);
    for (const ds::TrajectorySample& s : flight.history) {
        CHECK(s.velocity_m_s == doctest::Approx(closed_form_velocity(s.altitude_m)).epsilon(1e-6));
    }
}

TEST_CASE(
    "the flight-path angle stays constant with gravity and curvature off (NACA Report 1381)") {
    const AllenEggersFlight flight;
    for (const ds::TrajectorySample& s : flight.history) {
        CHECK(s.flight_path_angle_deg == doctest::Approx(entry_angle_deg).epsilon(1e-9));
    }
}

TEST_CASE(
    "peak deceleration is V_E^2 sin|gamma| / (2 e H) = 121.3 m/s^2 at 29.39 km (NACA Report "
    "1381)") {
    const AllenEggersFlight flight;
    const ds::PeakHit& hit = peak(flight.outcome, 0);
    const double a_worked =
        entry_velocity * entry_velocity * sin_gamma() / (2.0 * M_E * scale_height);
    const double h_max = scale_height * std::log(rho0 * scale_height / (beta * sin_gamma()));
    CHECK(a_worked == doctest::Approx(121.3).epsilon(1e-3));  // the references' worked value
    CHECK(h_max == doctest::Approx(29390.0).epsilon(1e-3));
    const double v_inf = velocity_at_infinity(beta);
    const double a_max = v_inf * v_inf * sin_gamma() / (2.0 * M_E * scale_height);
    CHECK(hit.value * ds::standard_gravity_m_s2 == doctest::Approx(a_max).epsilon(1e-6));
    CHECK(std::abs(hit.y[ds::StateIndex::altitude] - h_max) < 0.01);
    CHECK(ds::speed(hit.y) == doctest::Approx(v_inf * std::exp(-0.5)).epsilon(1e-6));
}

TEST_CASE("peak convective heating is at V_E e^-1/6 and 41.58 km (NACA Report 1381)") {
    const AllenEggersFlight flight;
    const ds::PeakHit& hit = peak(flight.outcome, 1);
    const double h_heat = scale_height * std::log(3.0 * rho0 * scale_height / (beta * sin_gamma()));
    CHECK(h_heat == doctest::Approx(41580.0).epsilon(1e-3));  // the references' worked value
    CHECK(std::abs(hit.y[ds::StateIndex::altitude] - h_heat) < 0.01);
    CHECK(ds::speed(hit.y) ==
          doctest::Approx(velocity_at_infinity(beta) * std::exp(-1.0 / 6.0)).epsilon(1e-6));
}

TEST_CASE("peak deceleration does not depend on the ballistic coefficient (NACA Report 1381)") {
    // Scaling the area by 3 divides beta by 3: the peak moves up by H ln 3 and keeps its size.
    AllenEggersFlight heavy;
    const double a_heavy = peak(heavy.outcome, 0).value;
    const double h_heavy = peak(heavy.outcome, 0).y[ds::StateIndex::altitude];

    ds::Body body = heavy.body;
    ds::Phase light = heavy.phase;
    light.stage.drag_devices.front().area_m2 *= 3.0;
    const ds::FlightState y0 =
        ds::make_flight_state(interface_altitude, 0.0, 0.0, entry_velocity,
                              ds::degrees_to_radians(entry_angle_deg), ds::pi / 2.0, 500.0);
    const ds::FlightModel model{body, heavy.atmosphere};
    const ds::PhaseOutcome out =
        ds::fly_phase(model, light, 0.0, y0, 1000.0, ds::flight_integrator_settings(1e-10, 100000));
    // Equal but for the start at 125 km instead of infinity (see velocity_at_infinity).
    const double start_effect =
        std::pow(velocity_at_infinity(beta / 3.0) / velocity_at_infinity(beta), 2);
    CHECK(peak(out, 0).value == doctest::Approx(a_heavy * start_effect).epsilon(1e-6));
    CHECK(peak(out, 0).y[ds::StateIndex::altitude] - h_heavy ==
          doctest::Approx(scale_height * std::log(3.0)).epsilon(1e-3));
}
