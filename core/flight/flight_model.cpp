#include "flight/flight_model.hpp"

#include <cmath>

#include "constants.hpp"
#include "heating/sutton_graves.hpp"
#include "heating/tauber_sutton.hpp"

namespace ds {

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

}  // namespace ds
