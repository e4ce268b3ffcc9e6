#include "flight/flight_model.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "constants.hpp"
#include "heating/sutton_graves.hpp"
#include "heating/tauber_sutton.hpp"

namespace ds {
namespace {

/// Altitude step of the central differences along the equilibrium: small against every scale
/// height and large against rounding, as in Atmosphere::log_density_slope_per_m.
constexpr double equilibrium_step_m = 1.0;
/// The equilibrium speed is a fixed point (the drag area depends on it through Mach), which
/// contracts by |d ln CdA / d ln M| / 2 per pass: 0 subsonic for the catalogue's canopies, about
/// 0.12 on the steepest stretch of the disk-gap-band table. It stops when a pass moves the speed
/// by a few units of rounding, or after this many passes (our bounds).
constexpr int equilibrium_passes = 60;
constexpr double equilibrium_rounding = 4.0 * std::numeric_limits<double>::epsilon();

/// The equilibrium at an altitude where drag balances gravity less the centrifugal term plus
/// `extra_m_s2`, and the flight-path angle is where flight_derivative turns the path no more;
/// a fixed point on the speed from `v_start`.
Equilibrium balance(const FlightModel& model, const Stage& stage, double altitude_m, double mass_kg,
                    double extra_m_s2, double v_start) {
    const AtmosphereSample air = model.atmosphere.at(altitude_m);
    const double r = model.body.radius_m + altitude_m;
    const double omega = model.body.rotation_rad_s;
    const double gravity = model.body.gravity_m_s2(altitude_m) - omega * omega * r;
    // d gamma/dt = 2 omega - cos(gamma) (g - omega^2 r - v^2 / r) / v without lift.
    const auto cos_gamma = [&](double v) {
        return std::clamp(2.0 * omega * v / (gravity - v * v / r), -1.0, 1.0);
    };
    double v = v_start;
    for (int pass = 0; pass < equilibrium_passes; ++pass) {
        const double c = cos_gamma(v);
        const double sink = std::sqrt(1.0 - c * c);  // -sin(gamma)
        const double next =
            std::sqrt(2.0 * mass_kg * sink * (gravity + extra_m_s2) /
                      (air.density_kg_m3 * stage.drag_area_m2(v / air.speed_of_sound_m_s)));
        const bool moved = std::abs(next - v) > equilibrium_rounding * next;  // false for NaN
        v = next;
        if (!moved) break;
    }
    const double c = cos_gamma(v);
    return {v, std::atan2(-std::sqrt(1.0 - c * c), c)};
}

/// What keeps the speed following its equilibrium, V dV/dh (the sink rate times the
/// deceleration), from the zeroth-order speeds a step either side of an altitude.
double following_term_m_s2(const Equilibrium& below, const Equilibrium& above) {
    return (above.velocity_m_s * above.velocity_m_s - below.velocity_m_s * below.velocity_m_s) /
           (4.0 * equilibrium_step_m);
}

}  // namespace

FlightConditions flight_conditions(const FlightModel& model, const Stage& stage,
                                   const FlightState& y) {
    const double altitude = y[StateIndex::altitude];
    const double velocity = y[StateIndex::velocity];
    const double mass = y[StateIndex::mass];
    const AtmosphereSample air = model.atmosphere.at(altitude);

    FlightConditions c;
    c.density_kg_m3 = air.density_kg_m3;
    c.speed_of_sound_m_s = air.speed_of_sound_m_s;
    c.mach = velocity / air.speed_of_sound_m_s;
    c.dynamic_pressure_Pa = 0.5 * air.density_kg_m3 * velocity * velocity;
    c.drag_N = c.dynamic_pressure_Pa * stage.drag_area_m2(c.mach);
    c.lift_N = stage.lift_to_drag * c.drag_N;
    c.gravity_m_s2 = model.body.gravity_m_s2(altitude);
    c.deceleration_g = std::hypot(c.drag_N, c.lift_N) / mass / standard_gravity_m_s2;
    if (stage.nose_radius_m > 0.0) {
        c.convective_heat_flux_W_m2 = sutton_graves_heat_flux_W_m2(
            model.body.gas.sutton_graves_k, air.density_kg_m3, stage.nose_radius_m, velocity);
        c.radiative_heat_flux_W_m2 =
            tauber_sutton_heat_flux_W_m2(model.body.gas.radiative_correlation, air.density_kg_m3,
                                         stage.nose_radius_m, velocity);
    }
    return c;
}

FlightState flight_derivative(const FlightModel& model, const Stage& stage, const FlightState& y) {
    const FlightConditions c = flight_conditions(model, stage, y);
    const double r = model.body.radius_m + y[StateIndex::altitude];
    const double v = y[StateIndex::velocity];
    const double gamma = y[StateIndex::flight_path_angle];
    const double m = y[StateIndex::mass];
    const double omega = model.body.rotation_rad_s;
    const double sin_g = std::sin(gamma);
    const double cos_g = std::cos(gamma);

    FlightState dy;
    dy[StateIndex::altitude] = v * sin_g;
    dy[StateIndex::downrange] = v * cos_g * model.body.radius_m / r;
    dy[StateIndex::velocity] =
        -(c.drag_N + stage.thrust_N) / m - c.gravity_m_s2 * sin_g + omega * omega * r * sin_g;
    dy[StateIndex::flight_path_angle] =
        c.lift_N * std::cos(stage.bank_angle_rad) / (m * v) - (c.gravity_m_s2 / v - v / r) * cos_g +
        2.0 * omega + omega * omega * r * cos_g / v;
    dy[StateIndex::mass] =
        stage.thrust_N > 0.0 ? -stage.thrust_N / (stage.specific_impulse_s * standard_gravity_m_s2)
                             : 0.0;
    dy[StateIndex::convective_heat_load] = c.convective_heat_flux_W_m2;
    dy[StateIndex::radiative_heat_load] = c.radiative_heat_flux_W_m2;
    return dy;
}

double unsettled_rate(const FlightModel& model, const Stage& stage, const FlightState& y) {
    const FlightState dy = flight_derivative(model, stage, y);
    const double v = y[StateIndex::velocity];
    return std::max(std::abs(dy[StateIndex::velocity]),
                    std::abs(dy[StateIndex::flight_path_angle]) * v) /
           model.body.gravity_m_s2(y[StateIndex::altitude]);
}

Equilibrium quasi_steady_equilibrium(const FlightModel& model, const Stage& stage,
                                     const FlightState& y) {
    const double h = y[StateIndex::altitude];
    const double m = y[StateIndex::mass];
    const double v = y[StateIndex::velocity];
    const double step = equilibrium_step_m;
    const double following = following_term_m_s2(balance(model, stage, h - step, m, 0.0, v),
                                                 balance(model, stage, h + step, m, 0.0, v));
    return balance(model, stage, h, m, following, v);
}

FlightState onto_equilibrium(const FlightModel& model, const Stage& stage, const FlightState& y) {
    const Equilibrium e = quasi_steady_equilibrium(model, stage, y);
    FlightState out = y;
    out[StateIndex::velocity] = e.velocity_m_s;
    out[StateIndex::flight_path_angle] = e.flight_path_angle_rad;
    return out;
}

FlightState quasi_steady_derivative(const FlightModel& model, const Stage& stage,
                                    const FlightState& y) {
    const double h = y[StateIndex::altitude];
    const double m = y[StateIndex::mass];
    const double v = y[StateIndex::velocity];
    const double gamma = y[StateIndex::flight_path_angle];
    const double r = model.body.radius_m + h;
    const double step = equilibrium_step_m;
    // The first-order equilibrium a step either side, each with its own following term.
    const Equilibrium low = balance(model, stage, h - 2.0 * step, m, 0.0, v);
    const Equilibrium mid = balance(model, stage, h, m, 0.0, v);
    const Equilibrium high = balance(model, stage, h + 2.0 * step, m, 0.0, v);
    const Equilibrium below = balance(model, stage, h - step, m, following_term_m_s2(low, mid), v);
    const Equilibrium above = balance(model, stage, h + step, m, following_term_m_s2(mid, high), v);

    FlightState dy = FlightState::Zero();
    dy[StateIndex::altitude] = v * std::sin(gamma);
    dy[StateIndex::downrange] = v * std::cos(gamma) * model.body.radius_m / r;
    dy[StateIndex::velocity] =
        (above.velocity_m_s - below.velocity_m_s) / (2.0 * step) * dy[StateIndex::altitude];
    dy[StateIndex::flight_path_angle] =
        (above.flight_path_angle_rad - below.flight_path_angle_rad) / (2.0 * step) *
        dy[StateIndex::altitude];
    if (stage.nose_radius_m > 0.0) {
        const FlightConditions c = flight_conditions(model, stage, y);
        dy[StateIndex::convective_heat_load] = c.convective_heat_flux_W_m2;
        dy[StateIndex::radiative_heat_load] = c.radiative_heat_flux_W_m2;
    }
    return dy;
}

}  // namespace ds
