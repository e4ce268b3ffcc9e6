#include "verification/reference_cases.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <functional>
#include <limits>
#include <utility>

#include <fmt/format.h>
#include <boost/numeric/odeint.hpp>

#include "aeroshell/sphere_cone.hpp"
#include "atmosphere/exponential.hpp"
#include "atmosphere/us_standard_1976.hpp"
#include "body/body.hpp"
#include "constants.hpp"
#include "flight/phase.hpp"
#include "heating/heat_shield_mass.hpp"
#include "heating/sutton_graves.hpp"
#include "numerics/maximum.hpp"
#include "orbit/conic.hpp"
#include "sizing/terminal_burn.hpp"
#include "verification/allen_eggers_case.hpp"

namespace ds {

double ReferenceCase::difference() const {
    const double gap = std::abs(computed - expected);
    return absolute ? gap : gap / std::abs(expected);
}

bool ReferenceCase::agrees() const {
    const double d = difference();
    return std::isfinite(d) && d <= tolerance;
}

std::string ReferenceCase::agreement() const {
    return absolute ? fmt::format("{:.2g} {} (within {:g})", difference(), unit, tolerance)
                    : fmt::format("{:.1e} relative (within {:g})", difference(), tolerance);
}

namespace {

ReferenceCase relative_case(std::string id, std::string title, std::string source, std::string unit,
                            double expected, double computed, double tolerance) {
    return {std::move(id), std::move(title), std::move(source), std::move(unit),
            expected,      computed,         tolerance,         false};
}

ReferenceCase absolute_case(std::string id, std::string title, std::string source, std::string unit,
                            double expected, double computed, double tolerance) {
    return {std::move(id), std::move(title), std::move(source), std::move(unit),
            expected,      computed,         tolerance,         true};
}

/// The first located hit of a phase's peak, or a NaN value when it was not found (the case
/// then fails, as it should).
PeakHit peak_of(const PhaseOutcome& outcome, std::size_t index) {
    for (const PeakHit& hit : outcome.peaks) {
        if (hit.peak == index)
            return hit;
    }
    PeakHit none;
    none.value = std::numeric_limits<double>::quiet_NaN();
    none.y.setConstant(std::numeric_limits<double>::quiet_NaN());
    return none;
}

// ---- Allen and Eggers, NACA Report 1381 (1958) -----------------------------------------------
// A straight ballistic entry through an exponential atmosphere with gravity neglected: gravity
// off (mu = 0) and a planet 1e16 m in radius, so the flight-path angle stays constant as the
// theory assumes. The worked values of references.md: V_E 5500 m/s at -14 deg, beta 65 kg/m^2,
// rho0 0.020 kg/m^3, H 11.1 km.

void allen_eggers(std::vector<ReferenceCase>& cases) {
    using namespace allen_eggers_case;
    constexpr double rho0 = rho0_kg_m3;
    constexpr double scale_height = scale_height_m;
    constexpr double beta = beta_kg_m2;
    constexpr double entry_velocity = entry_velocity_m_s;
    constexpr double interface_altitude = interface_altitude_m;
    constexpr double mass = 500.0;
    const Body body{"flat", 1e16, 0.0, 0.0, Gas{188.9, 1.29, 1.9027e-4, ""}};
    const ExponentialAtmosphere atmosphere{{rho0, scale_height, 210.0}, 188.9, 1.29};
    Phase phase;
    phase.stage.drag_devices = {{mass / beta, 1.0, {}}};
    phase.stage.nose_radius_m = 0.5;
    phase.ends = {{"ground", FlightQuantity::altitude, 10000.0, EventDirection::falling}};
    phase.peaks = {{"deceleration", FlightQuantity::deceleration},
                   {"heat flux", FlightQuantity::heat_flux}};
    const FlightState y0 = make_flight_state(interface_altitude, 0.0, 0.0, entry_velocity,
                                             degrees_to_radians(entry_angle_deg), pi / 2.0, mass);
    const PhaseOutcome outcome = fly_phase(FlightModel{body, atmosphere}, phase, 0.0, y0, 1000.0,
                                           flight_integrator_settings(1e-10, 100000));

    const double sin_gamma = std::sin(std::abs(degrees_to_radians(entry_angle_deg)));
    // The closed form starts at infinite altitude; the flight at 125 km, where the thin air has
    // already taken a fraction 9e-5 of the speed: the speed the vehicle would have had at
    // infinity makes the comparison exact.
    const double rho_e = rho0 * std::exp(-interface_altitude / scale_height);
    const double v_inf = entry_velocity * std::exp(rho_e * scale_height / (2.0 * beta * sin_gamma));
    const std::string source = "Allen and Eggers, NACA Report 1381 (1958): closed form";

    const PeakHit deceleration = peak_of(outcome, 0);
    cases.push_back(relative_case(
        "allen_eggers_peak_deceleration", "Ballistic entry: peak deceleration V^2 sin|g| / (2eH)",
        source, "m/s^2", v_inf * v_inf * sin_gamma / (2.0 * std::exp(1.0) * scale_height),
        deceleration.value * standard_gravity_m_s2, 1e-6));
    cases.push_back(absolute_case(
        "allen_eggers_peak_deceleration_altitude",
        "Ballistic entry: altitude of peak deceleration H ln(rho0 H / (beta sin|g|))", source, "m",
        scale_height * std::log(rho0 * scale_height / (beta * sin_gamma)),
        deceleration.y[StateIndex::altitude], 0.01));
    cases.push_back(relative_case("allen_eggers_speed_at_peak_deceleration",
                                  "Ballistic entry: speed at peak deceleration V_E e^-1/2", source,
                                  "m/s", v_inf * std::exp(-0.5), speed(deceleration.y), 1e-6));
    const PeakHit heating = peak_of(outcome, 1);
    cases.push_back(absolute_case(
        "allen_eggers_peak_heating_altitude",
        "Ballistic entry: altitude of peak convective heating H ln(3 rho0 H / (beta sin|g|))",
        source, "m", scale_height * std::log(3.0 * rho0 * scale_height / (beta * sin_gamma)),
        heating.y[StateIndex::altitude], 0.01));
    cases.push_back(relative_case("allen_eggers_speed_at_peak_heating",
                                  "Ballistic entry: speed at peak convective heating V_E e^-1/6",
                                  source, "m/s", v_inf * std::exp(-1.0 / 6.0), speed(heating.y),
                                  1e-6));
}

// ---- The US Standard Atmosphere, 1976 ---------------------------------------------------------

void standard_atmosphere(std::vector<ReferenceCase>& cases) {
    const UsStandardAtmosphere1976 atmosphere;
    const std::string source = "US Standard Atmosphere 1976 (NOAA/NASA/USAF), its table";
    cases.push_back(relative_case("us1976_density_10km", "1976 standard: density at 10 km", source,
                                  "kg/m^3", 0.41351, atmosphere.at(10000.0).density_kg_m3, 1e-4));
    cases.push_back(absolute_case("us1976_temperature_50km", "1976 standard: temperature at 50 km",
                                  source, "K", 270.650, atmosphere.at(50000.0).temperature_K,
                                  0.01));
    cases.push_back(relative_case("us1976_pressure_30km", "1976 standard: pressure at 30 km",
                                  source, "Pa", 1197.03, atmosphere.pressure_Pa(30000.0), 1e-4));
    cases.push_back(relative_case("us1976_speed_of_sound_0km",
                                  "1976 standard: speed of sound at sea level",
                                  "US Standard Atmosphere 1976: sqrt(1.4 R* T0 / M0)", "m/s",
                                  340.294, atmosphere.at(0.0).speed_of_sound_m_s, 1e-6));
}

// ---- Aerodynamics and heating -----------------------------------------------------------------

void aerodynamics_and_heating(std::vector<ReferenceCase>& cases) {
    // Cd = (1 - sin^4 d) e^2 + 2 sin^2 d (1 - e^2 cos^2 d), by hand at d = 70 deg, e = 0.5.
    cases.push_back(relative_case(
        "newtonian_sphere_cone_drag", "Newtonian drag coefficient, 70 deg sphere-cone, e = 0.5",
        "Newtonian theory: closed form for a sphere-cone, evaluated by hand", "", 1.7695,
        newtonian_sphere_cone_drag_coefficient(degrees_to_radians(70.0), 0.5), 5e-5));
    // p02/p1 = 5.640 at Mach 2 (normal-shock table, from memory): Cp = (5.640 - 1) / 2.8.
    cases.push_back(
        relative_case("stagnation_pressure_mach_2",
                      "Stagnation pressure coefficient behind a normal shock, "
                      "Mach 2, gamma 1.4",
                      "NACA Report 1135 normal-shock table (p02/p1 = 5.640, from memory)", "",
                      1.657, stagnation_pressure_coefficient(1.4, 2.0), 2e-3));
    // k = 1.9027e-4 (CO2); sqrt(1e-4 / 0.65) V^3 at 5 km/s: 2.9502e5 W/m^2.
    cases.push_back(relative_case(
        "sutton_graves_heat_flux",
        "Sutton-Graves stagnation heat flux: CO2, rho 1e-4 kg/m^3, "
        "Rn 0.65 m, 5 km/s",
        "Sutton and Graves, NASA TR R-376 (1971): k = 1.9027e-4 for CO2, by hand", "W/cm^2", 29.50,
        sutton_graves_heat_flux_W_m2(1.9027e-4, 1e-4, 0.65, 5000.0) * 1e-4, 1e-3));
    cases.push_back(relative_case(
        "heat_shield_mass_fraction", "Heat-shield mass fraction at a heat load of 1000 J/cm^2",
        "Laub and Venkatapathy (2003): 0.091 Q^0.51575 %, constants from memory", "%", 3.2084,
        100.0 * heat_shield_mass_fraction(1000.0), 1e-4));
}

// ---- The entry from the approach and from orbit ------------------------------------------
// Mars's GM and mean radius of the NASA NSSDC fact sheet (4.2828e13 m^3/s^2, 3389.5 km), the
// interface at 125 km.

void conics(std::vector<ReferenceCase>& cases) {
    constexpr double mu = 4.2828e13;
    constexpr double radius = 3389.5e3;
    constexpr double interface_radius = radius + 125e3;
    // A 3 km/s arrival through a 20 km vacuum periapsis: v_E^2 = v_inf^2 + 2 mu / r_E.
    const HyperbolicArrival arrival =
        arrival_through_periapsis(mu, 3000.0, radius + 20e3, interface_radius);
    cases.push_back(relative_case("vis_viva_arrival_speed",
                                  "Arrival at 3 km/s: interface speed sqrt(v_inf^2 + 2 mu / r)",
                                  "Vis-viva equation of the two-body problem, by hand", "m/s",
                                  std::sqrt(3000.0 * 3000.0 + 2.0 * mu / interface_radius),
                                  arrival.interface_speed_m_s, 1e-12));
    // From a 300 km circular orbit to a periapsis 40 km below the radius, burned at apoapsis:
    // dv = sqrt(mu / r_a) (1 - sqrt(2 r_p / (r_a + r_p))). The angle it aims at is the one that
    // transfer gives: cos(gamma_E) = h / (r_E v_E).
    const double ra = radius + 300e3;
    const double rp = radius - 40e3;
    const double a = 0.5 * (ra + rp);
    const double e = (ra - rp) / (ra + rp);
    const double h = std::sqrt(mu * a * (1.0 - e * e));
    const double ve = std::sqrt(mu * (2.0 / interface_radius - 1.0 / a));
    const DeorbitBurn burn =
        deorbit_at_apoapsis(mu, ra, ra, interface_radius, -std::acos(h / (interface_radius * ve)));
    cases.push_back(relative_case(
        "hohmann_deorbit_burn", "Deorbit from a 300 km circular orbit: the burn's delta-v",
        "Hohmann transfer: first impulse, closed form", "m/s",
        std::sqrt(mu / ra) * (1.0 - std::sqrt(2.0 * rp / (ra + rp))), burn.delta_v_m_s, 1e-9));
}

// ---- The terminal burn -------------------------------------------------------------------------
// A flat, airless, non-rotating body with a uniform 3.7 m/s^2 (a huge radius with mu = g R^2
// keeps g within 1e-5 over the few kilometres flown): a lander falls straight down from 6 km at
// 60 m/s, and the burn is solved to end at 2 m/s on the ground.

void terminal_burn(std::vector<ReferenceCase>& cases) {
    constexpr double radius = 1e9;
    constexpr double g = 3.7;
    constexpr double mass = 400.0;
    constexpr double end_speed = 2.0;
    const Body body{"flat", radius, g * radius * radius, 0.0, Gas{188.9, 1.29, 1.9e-4, ""}};
    const ExponentialAtmosphere vacuum{{1e-15, 11100.0, 210.0}, 188.9, 1.29};
    const FlightModel model{body, vacuum};
    const auto settings = flight_integrator_settings(1e-10, 100000);
    DenseTrajectory record;
    Phase fall;
    fall.ends = {{"floor", FlightQuantity::altitude, -1000.0, EventDirection::falling}};
    fly_phase(model, fall, 0.0, make_flight_state(6000.0, 0.0, 0.0, 60.0, -pi / 2.0, 0.0, 500.0),
              1000.0, settings, {nullptr, &record});
    const auto solve = [&](double isp) {
        BurnRequest r;
        r.site_elevation_m = 0.0;
        r.end_velocity_m_s = end_speed;
        r.lander_mass_kg = mass;
        r.thrust_N = 2.5 * g * mass;
        r.specific_impulse_s = isp;
        r.coast_s = 0.0;
        return solve_terminal_burn(model, record, r, settings);
    };

    // An Isp of 1e12 s keeps the mass: the thrust acceleration stays a = 2.5 g.
    const BurnSolution constant = solve(1e12);
    const double a = 2.5 * g;
    const double v0 = speed(constant.ignition_state);
    const double t_burn = (v0 - end_speed) / (a - g);
    const std::string braking = "Constant-thrust vertical burn: closed form";
    cases.push_back(relative_case("braking_burn_time", "Braking burn: burn time (v0 - v) / (a - g)",
                                  braking, "s", t_burn, constant.burn_time_s, 1e-5));
    cases.push_back(relative_case("braking_burn_gravity_loss", "Braking burn: gravity loss g t",
                                  braking, "m/s", g * t_burn, constant.gravity_loss_m_s, 1e-4));
    cases.push_back(relative_case("braking_burn_ignition_height",
                                  "Braking burn: ignition height (v0^2 - v^2) / (2 (a - g))",
                                  braking, "m", (v0 * v0 - end_speed * end_speed) / (2.0 * (a - g)),
                                  constant.ignition_state[StateIndex::altitude], 1e-4));

    const BurnSolution rocket = solve(220.0);
    cases.push_back(relative_case(
        "rocket_equation_propellant", "Propellant burned, Isp 220 s: m0 (1 - exp(-dv / (Isp g0)))",
        "Tsiolkovsky rocket equation", "kg",
        mass * (1.0 - std::exp(-rocket.ideal_delta_v_m_s / (220.0 * standard_gravity_m_s2))),
        rocket.burned_kg, 1e-9));
}

// ---- An independent integration: Boost.Odeint ------------------------------------------------
// A lifting, banked entry on a rotating Mars from 20 deg north heading north-east (every term
// of the equations at work), flown to Mach 1.8 by the program and by Boost.Odeint's
// Dormand-Prince 5(4) with dense output at 1e-12, its events found by bisection on the dense
// output and its peaks by golden-section search.

using RawState = std::array<double, flight_state_size>;

FlightState to_state(const RawState& x) {
    FlightState y;
    for (int i = 0; i < flight_state_size; ++i)
        y[i] = x[static_cast<std::size_t>(i)];
    return y;
}

void independent_integration(std::vector<ReferenceCase>& cases) {
    namespace odeint = boost::numeric::odeint;
    const Body mars = *body_preset("mars");
    const ExponentialAtmosphere atmosphere({0.020, 11100.0, 210.0}, 188.9, 1.29);
    const FlightModel model{mars, atmosphere};
    Stage stage;
    stage.drag_devices = {{pi * 4.0 * 4.0 / 4.0, 1.68, {}}};
    stage.lift_to_drag = 0.22;
    stage.bank = degrees_to_radians(40.0);
    stage.nose_radius_m = 1.0;
    const FlightState y0 =
        make_flight_state(125000.0, degrees_to_radians(20.0), 0.0, 5800.0,
                          degrees_to_radians(-15.0), degrees_to_radians(45.0), 1800.0);
    constexpr double deploy_mach = 1.8;

    // The program's flight.
    Phase phase;
    phase.stage = stage;
    phase.ends = {{"deploy", FlightQuantity::mach, deploy_mach, EventDirection::falling}};
    phase.peaks = {{"deceleration", FlightQuantity::deceleration},
                   {"heat flux", FlightQuantity::heat_flux}};
    const PhaseOutcome flown =
        fly_phase(model, phase, 0.0, y0, 2000.0, flight_integrator_settings(1e-8, 100000));
    double peak_deceleration = 0.0;
    double peak_heat_flux = 0.0;
    for (const PeakHit& hit : flown.peaks) {
        double& slot = hit.peak == 0 ? peak_deceleration : peak_heat_flux;
        slot = std::max(slot, hit.value);
    }

    // The same equations through Odeint.
    const auto system = [&](const RawState& x, RawState& dxdt, double) {
        const FlightState d = flight_derivative(model, stage, to_state(x));
        for (int i = 0; i < flight_state_size; ++i)
            dxdt[static_cast<std::size_t>(i)] = d[i];
    };
    const auto conditions = [&](const RawState& x) {
        return flight_conditions(model, stage, to_state(x));
    };
    auto stepper = odeint::make_dense_output(1e-12, 1e-12, odeint::runge_kutta_dopri5<RawState>());
    RawState x;
    for (int i = 0; i < flight_state_size; ++i)
        x[static_cast<std::size_t>(i)] = y0[i];
    stepper.initialize(x, 0.0, 0.05);
    RawState probe;
    const auto state_at = [&](double t) {
        stepper.calc_state(t, probe);
        return probe;
    };
    const auto deceleration = [&](double t) { return conditions(state_at(t)).deceleration_g; };
    const auto heat_flux = [&](double t) {
        return conditions(state_at(t)).convective_heat_flux_W_m2;
    };
    double reference_deceleration = 0.0;
    double reference_heat_flux = 0.0;
    double previous_deceleration = 0.0;
    double previous_heat_flux = 0.0;
    double deploy_time = std::numeric_limits<double>::quiet_NaN();
    RawState deploy_state{};
    // At most 100000 steps: a flight that never slows to the deploy Mach leaves the NaN.
    for (int step = 0; step < 100000; ++step) {
        const auto [t0, t1] = stepper.do_step(system);
        // A maximum of a smooth quantity lies in a step whose end value has begun to fall:
        // search that step and the one before it.
        const double d = deceleration(t1);
        const double q = heat_flux(t1);
        const double from = std::max(0.0, t0 - (t1 - t0));
        if (d < previous_deceleration && reference_deceleration == 0.0)
            reference_deceleration = maximum_of(deceleration, from, t1);
        if (q < previous_heat_flux && reference_heat_flux == 0.0)
            reference_heat_flux = maximum_of(heat_flux, from, t1);
        previous_deceleration = d;
        previous_heat_flux = q;
        if (conditions(stepper.current_state()).mach <= deploy_mach) {
            double a = t0;
            double b = t1;
            while (b - a > 1e-9) {
                const double m = 0.5 * (a + b);
                (conditions(state_at(m)).mach > deploy_mach ? a : b) = m;
            }
            deploy_time = b;
            deploy_state = state_at(b);
            break;
        }
    }

    const std::string source = "Boost.Odeint, Dormand-Prince 5(4) at 1e-12, the same equations";
    cases.push_back(relative_case("odeint_deploy_time",
                                  "Lifting Mars entry: time to Mach 1.8 from the interface", source,
                                  "s", deploy_time, flown.time_s, 1e-5));
    cases.push_back(relative_case(
        "odeint_deploy_altitude", "Lifting Mars entry: altitude at Mach 1.8", source, "m",
        deploy_state[StateIndex::altitude], flown.y[StateIndex::altitude], 1e-5));
    cases.push_back(relative_case("odeint_deploy_heat_load",
                                  "Lifting Mars entry: convective heat load to Mach 1.8", source,
                                  "J/m^2", deploy_state[StateIndex::convective_heat_load],
                                  flown.y[StateIndex::convective_heat_load], 1e-5));
    cases.push_back(relative_case("odeint_peak_deceleration",
                                  "Lifting Mars entry: peak deceleration", source, "g",
                                  reference_deceleration, peak_deceleration, 1e-5));
    cases.push_back(relative_case("odeint_peak_heat_flux",
                                  "Lifting Mars entry: peak convective heat flux", source, "W/m^2",
                                  reference_heat_flux, peak_heat_flux, 1e-5));
}

}  // namespace

std::vector<ReferenceCase> run_reference_cases() {
    std::vector<ReferenceCase> cases;
    allen_eggers(cases);
    standard_atmosphere(cases);
    aerodynamics_and_heating(cases);
    conics(cases);
    terminal_burn(cases);
    independent_integration(cases);
    return cases;
}

}  // namespace ds
