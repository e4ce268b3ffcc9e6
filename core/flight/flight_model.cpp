#include "flight/flight_model.hpp"

#include <algorithm>
#include <array>
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
/// The equilibrium velocity is a fixed point (the drag area depends on it through Mach, the
/// frame's acceleration through the Coriolis and transport terms), which contracts by
/// |d ln CdA / d ln M| / 2 per pass (0 subsonic for the catalogue's canopies, about 0.12 on the
/// steepest stretch of the disk-gap-band table) plus some 2 omega V / g (1e-3 or less). It
/// stops when a pass moves the velocity by a few units of rounding, or after this many passes
/// (our bounds).
constexpr int equilibrium_passes = 60;
/// The most orders slow_manifold_equilibrium makes (each gains a factor of the deceleration in g).
constexpr int max_equilibrium_orders = 8;
constexpr double equilibrium_rounding = 4.0 * std::numeric_limits<double>::epsilon();

using Vec3 = Eigen::Vector3d;

Vec3 velocity_of(const FlightState& y) {
    return {y[StateIndex::east_velocity], y[StateIndex::north_velocity],
            y[StateIndex::up_velocity]};
}

Vec3 wind_at(const FlightModel& model, double altitude_m) {
    if (!model.wind)
        return Vec3::Zero();
    const WindVelocity w = model.wind->at(altitude_m);
    return {w.east_m_s, w.north_m_s, 0.0};
}

/// The rates of the position: altitude, latitude, longitude.
/// With the cosine of the latitude when the caller has it.
void position_rates(const FlightModel& model, const FlightState& y, double cos_latitude,
                    FlightState& dy) {
    const double r = model.body.radius_m + y[StateIndex::altitude];
    dy[StateIndex::altitude] = y[StateIndex::up_velocity];
    dy[StateIndex::latitude] = y[StateIndex::north_velocity] / r;
    dy[StateIndex::longitude] = y[StateIndex::east_velocity] / (r * cos_latitude);
}

void position_rates(const FlightModel& model, const FlightState& y, FlightState& dy) {
    position_rates(model, y, std::cos(y[StateIndex::latitude]), dy);
}

/// The equilibrium velocity at an altitude (and latitude, mass) where the drag against the
/// air balances the frame's acceleration less `follow`: drag / m = |a_frame - follow| along
/// the air velocity; a fixed point on the velocity from `v`, since the frame's acceleration
/// depends on it (Coriolis, transport) and the drag area on the Mach number.
Vec3 balance(const FlightModel& model, const Stage& stage, double altitude_m, double latitude_rad,
             double mass_kg, const Vec3& follow, Vec3 v) {
    const AtmosphereSample air = model.atmosphere.at(altitude_m);
    const Vec3 wind = wind_at(model, altitude_m);
    const LocalFrame frame(model.body, altitude_m, latitude_rad);
    for (int pass = 0; pass < equilibrium_passes; ++pass) {
        const Vec3 need = frame.acceleration(v) - follow;
        const double per_mass = need.norm();
        const double mach = (v - wind).norm() / air.speed_of_sound_m_s;
        const double air_speed =
            std::sqrt(2.0 * mass_kg * per_mass / (air.density_kg_m3 * stage.drag_area_m2(mach)));
        const Vec3 next = wind + (air_speed / per_mass) * need;
        const bool moved = (next - v).norm() > equilibrium_rounding * next.norm();  // false for NaN
        v = next;
        if (!moved)
            break;
    }
    return v;
}

/// What keeps the velocity following its equilibrium, dv/dh times the sink rate, from the
/// zeroth-order velocities a step either side of an altitude: under a canopy in still air, V
/// dV/dh upward; in a wind that changes with altitude, also the horizontal push that keeps the
/// vehicle moving with it.
Vec3 following_term_m_s2(const Vec3& below, const Vec3& above) {
    return (above - below) / (2.0 * equilibrium_step_m) * (0.5 * (above.z() + below.z()));
}

Equilibrium equilibrium_of(const Vec3& v) {
    Equilibrium e;
    e.velocity_enu_m_s = v;
    e.velocity_m_s = v.norm();
    e.flight_path_angle_rad = std::atan2(v.z(), std::hypot(v.x(), v.y()));
    e.azimuth_rad = std::atan2(v.x(), v.y());
    return e;
}

/// The balance at the state's latitude, mass and velocity, `dh` above its altitude.
Vec3 balance_near(const FlightModel& model, const Stage& stage, const FlightState& y, double dh,
                  const Vec3& follow) {
    return balance(model, stage, y[StateIndex::altitude] + dh, y[StateIndex::latitude],
                   y[StateIndex::mass], follow, velocity_of(y));
}

}  // namespace

const FlightConditions no_conditions{};

namespace {

/// The conditions with the parts asked for, the choice made at compile time so that the
/// integrator's evaluations (all of them) pay no test for it.
template <ConditionParts parts>
FlightConditions conditions_with(const FlightModel& model, const Stage& stage,
                                 const FlightState& y) {
    const double altitude = y[StateIndex::altitude];
    const double mass = y[StateIndex::mass];
    const AtmosphereSample air = model.atmosphere.at(altitude);

    FlightConditions c;
    c.air_velocity_m_s = velocity_of(y) - wind_at(model, altitude);
    const double velocity = c.air_velocity_m_s.norm();
    c.air_speed_m_s = velocity;
    c.density_kg_m3 = air.density_kg_m3;
    c.speed_of_sound_m_s = air.speed_of_sound_m_s;
    c.mach = velocity / air.speed_of_sound_m_s;
    c.dynamic_pressure_Pa = 0.5 * air.density_kg_m3 * velocity * velocity;
    c.gravity_m_s2 = model.body.gravity_m_s2(altitude);
    if constexpr (parts == ConditionParts::forces || parts == ConditionParts::all) {
        c.drag_N = c.dynamic_pressure_Pa * stage.drag_area_m2(c.mach);
        c.lift_N = stage.lift_to_drag * c.drag_N;
        // sqrt of the sum of squares, not std::hypot: forces never come near overflow, and
        // this is the integrator's innermost loop.
        c.deceleration_g =
            std::sqrt(c.drag_N * c.drag_N + c.lift_N * c.lift_N) / mass / standard_gravity_m_s2;
        if (stage.thrust_N > 0.0) {
            c.thrust_N = stage.thrust_N;
            c.throttle = stage.throttle;
            if (stage.thrust_reference_area_m2 > 0.0 && c.dynamic_pressure_Pa > 0.0) {
                c.thrust_coefficient =
                    stage.thrust_N / (c.dynamic_pressure_Pa * stage.thrust_reference_area_m2);
            }
            const double along = c.drag_N + c.thrust_N;
            c.sensed_deceleration_g =
                std::sqrt(along * along + c.lift_N * c.lift_N) / mass / standard_gravity_m_s2;
        } else {
            c.sensed_deceleration_g = c.deceleration_g;
        }
    }
    if constexpr (parts == ConditionParts::heating || parts == ConditionParts::all) {
        if (stage.nose_radius_m > 0.0) {
            c.convective_heat_flux_W_m2 = sutton_graves_heat_flux_W_m2(
                model.body.gas.sutton_graves_k, air.density_kg_m3, stage.nose_radius_m, velocity);
            c.radiative_heat_flux_W_m2 =
                tauber_sutton_heat_flux_W_m2(model.body.gas.radiative_correlation,
                                             air.density_kg_m3, stage.nose_radius_m, velocity);
        }
    }
    return c;
}

}  // namespace

FlightConditions flight_conditions(const FlightModel& model, const Stage& stage,
                                   const FlightState& y) {
    return conditions_with<ConditionParts::all>(model, stage, y);
}

FlightConditions flight_conditions(const FlightModel& model, const Stage& stage,
                                   const FlightState& y, ConditionParts parts) {
    switch (parts) {
        case ConditionParts::air:
            return conditions_with<ConditionParts::air>(model, stage, y);
        case ConditionParts::forces:
            return conditions_with<ConditionParts::forces>(model, stage, y);
        case ConditionParts::heating:
            return conditions_with<ConditionParts::heating>(model, stage, y);
        case ConditionParts::all:
            break;
    }
    return conditions_with<ConditionParts::all>(model, stage, y);
}

bool feels_air(const Stage& stage) {
    return !stage.drag_devices.empty() || stage.nose_radius_m > 0.0 ||
           (stage.thrust_N > 0.0 &&
            (stage.thrust_against_air || stage.thrust_reference_area_m2 > 0.0));
}

LocalFrame local_frame(const FlightModel& model, const FlightState& y) {
    return {model.body, y[StateIndex::altitude], y[StateIndex::latitude]};
}

FlightState flight_derivative(const FlightModel& model, const Stage& stage, const FlightState& y,
                              const FlightConditions& c, const LocalFrame& frame) {
    const double m = y[StateIndex::mass];
    const Vec3 v = velocity_of(y);
    Vec3 a = frame.acceleration(v);
    if (c.air_speed_m_s > 0.0) {
        const Vec3 along = c.air_velocity_m_s / c.air_speed_m_s;
        a -= (c.drag_N / m) * along;
        // Lift in the vertical plane through the air velocity, rotated about it by the bank:
        // n1 is the up direction less its part along the velocity, n2 = along x n1 points to
        // the right of the flight.
        const double horizontal = std::sqrt(along.x() * along.x() + along.y() * along.y());
        if (c.lift_N != 0.0 && horizontal > 0.0) {
            const double up = along.z();
            const Vec3 n1(-up * along.x() / horizontal, -up * along.y() / horizontal, horizontal);
            const Vec3 n2(along.y() / horizontal, -along.x() / horizontal, 0.0);
            a += (c.lift_N / m) * (stage.bank.cos() * n1 + stage.bank.sin() * n2);
        }
    }
    if (stage.thrust_N > 0.0) {
        if (stage.thrust_against_air) {
            if (c.air_speed_m_s > 0.0)
                a -= (stage.thrust_N / (m * c.air_speed_m_s)) * c.air_velocity_m_s;
        } else {
            const double ground_speed = v.norm();
            if (ground_speed > 0.0)
                a -= (stage.thrust_N / (m * ground_speed)) * v;
        }
    }

    FlightState dy;
    position_rates(model, y, frame.cos_lat, dy);
    dy[StateIndex::east_velocity] = a.x();
    dy[StateIndex::north_velocity] = a.y();
    dy[StateIndex::up_velocity] = a.z();
    dy[StateIndex::mass] =
        stage.thrust_N > 0.0 ? -stage.thrust_N / (stage.specific_impulse_s * standard_gravity_m_s2)
                             : 0.0;
    dy[StateIndex::convective_heat_load] = c.convective_heat_flux_W_m2;
    dy[StateIndex::radiative_heat_load] = c.radiative_heat_flux_W_m2;
    return dy;
}

FlightState flight_derivative(const FlightModel& model, const Stage& stage, const FlightState& y) {
    // The frame first (see local_frame). A stage with neither drag nor heating (a lander
    // coasting or burning) feels no air: its conditions, all zero forces, are not computed.
    const LocalFrame frame = local_frame(model, y);
    if (!feels_air(stage))
        return flight_derivative(model, stage, y, no_conditions, frame);
    return flight_derivative(model, stage, y, flight_conditions(model, stage, y), frame);
}

double unsettled_rate(const FlightModel& model, const Stage& stage, const FlightState& y) {
    return unsettled_rate(model, y, flight_derivative(model, stage, y));
}

double unsettled_rate(const FlightModel& model, const FlightState& y, const FlightState& dy) {
    const Vec3 v = velocity_of(y);
    const Vec3 a = velocity_of(dy);
    const Vec3 along = v / v.norm();
    const double tangential = a.dot(along);
    return std::max(std::abs(tangential), (a - tangential * along).norm()) /
           model.body.gravity_m_s2(y[StateIndex::altitude]);
}

Equilibrium quasi_steady_equilibrium(const FlightModel& model, const Stage& stage,
                                     const FlightState& y) {
    return slow_manifold_equilibrium(model, stage, y, 1);
}

Equilibrium slow_manifold_equilibrium(const FlightModel& model, const Stage& stage,
                                      const FlightState& y, int orders) {
    // Each order's velocities at altitudes a step apart, on a stencil that narrows by a step
    // either side per order: the zeroth at -orders..orders steps, the last at the state alone.
    orders = std::clamp(orders, 0, max_equilibrium_orders);
    const double step = equilibrium_step_m;
    std::array<Vec3, 2 * max_equilibrium_orders + 1> level;
    for (int j = -orders; j <= orders; ++j) {
        level[static_cast<std::size_t>(j + orders)] =
            balance_near(model, stage, y, j * step, Vec3::Zero());
    }
    // In place, left to right: the entry at i + 1 is still the previous order's when the new
    // one at i is made from it and the one at i + 2.
    for (int order = 1; order <= orders; ++order) {
        const int reach = orders - order;
        for (int j = -reach; j <= reach; ++j) {
            const auto i = static_cast<std::size_t>(j + reach);
            level[i] = balance_near(model, stage, y, j * step,
                                    following_term_m_s2(level[i], level[i + 2]));
        }
    }
    return equilibrium_of(level.front());
}

FlightState onto_equilibrium(const FlightModel& model, const Stage& stage, const FlightState& y,
                             int orders) {
    const Equilibrium e = slow_manifold_equilibrium(model, stage, y, orders);
    FlightState out = y;
    out[StateIndex::east_velocity] = e.velocity_enu_m_s.x();
    out[StateIndex::north_velocity] = e.velocity_enu_m_s.y();
    out[StateIndex::up_velocity] = e.velocity_enu_m_s.z();
    return out;
}

FlightState quasi_steady_derivative(const FlightModel& model, const Stage& stage,
                                    const FlightState& y) {
    const double step = equilibrium_step_m;
    const Vec3 zero = Vec3::Zero();
    // The first-order equilibrium a step either side, each with its own following term.
    const Vec3 low = balance_near(model, stage, y, -2.0 * step, zero);
    const Vec3 mid = balance_near(model, stage, y, 0.0, zero);
    const Vec3 high = balance_near(model, stage, y, 2.0 * step, zero);
    const Vec3 below = balance_near(model, stage, y, -step, following_term_m_s2(low, mid));
    const Vec3 above = balance_near(model, stage, y, step, following_term_m_s2(mid, high));

    FlightState dy = FlightState::Zero();
    position_rates(model, y, dy);
    const Vec3 a = (above - below) / (2.0 * step) * dy[StateIndex::altitude];
    dy[StateIndex::east_velocity] = a.x();
    dy[StateIndex::north_velocity] = a.y();
    dy[StateIndex::up_velocity] = a.z();
    if (stage.nose_radius_m > 0.0) {
        const FlightConditions c = flight_conditions(model, stage, y);
        dy[StateIndex::convective_heat_load] = c.convective_heat_flux_W_m2;
        dy[StateIndex::radiative_heat_load] = c.radiative_heat_flux_W_m2;
    }
    return dy;
}

}  // namespace ds
