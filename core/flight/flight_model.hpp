#pragma once

#include "atmosphere/atmosphere.hpp"
#include "body/body.hpp"
#include "flight/stage.hpp"
#include "flight/state.hpp"

namespace ds {

/// The body and its atmosphere: what a flight happens in. Both outlive the model.
struct FlightModel {
    const Body& body;
    const Atmosphere& atmosphere;
};

/// Everything derived from a state that the equations, the events and the history need,
/// computed in one place.
struct FlightConditions {
    double density_kg_m3 = 0.0;
    double speed_of_sound_m_s = 0.0;
    double mach = 0.0;
    double dynamic_pressure_Pa = 0.0;
    double drag_N = 0.0;
    double lift_N = 0.0;
    double gravity_m_s2 = 0.0;
    double deceleration_g = 0.0;  ///< sqrt(drag^2 + lift^2) / m / g0
    double convective_heat_flux_W_m2 = 0.0;
    double radiative_heat_flux_W_m2 = 0.0;
};

FlightConditions flight_conditions(const FlightModel& model, const Stage& stage,
                                   const FlightState& y);

/// The planar three-degree-of-freedom equations of motion over a spherical body with
/// inverse-square gravity, in the planet-fixed frame; with rotation, the flight lies in the
/// equatorial plane and the Coriolis and centrifugal terms are those of Vinh, Busemann and
/// Culp, Hypersonic and Planetary Entry Flight Mechanics (1980), at zero latitude and heading
/// east (a negative rotation rate is a westward flight). Lift is L/D x drag, its in-plane part
/// scaled by cos(bank). Thrust acts against the velocity.
FlightState flight_derivative(const FlightModel& model, const Stage& stage, const FlightState& y);

}  // namespace ds
