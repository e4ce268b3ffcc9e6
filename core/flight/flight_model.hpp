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

/// How far a flight is from settled, as the larger of |dv/dt| / g and |d gamma/dt| v / g of
/// flight_derivative: near the equilibrium of a vehicle under its canopy these are, to first
/// order, the speed's relative excess over its equilibrium times two and the flight-path
/// angle's offset from its equilibrium in radians.
double unsettled_rate(const FlightModel& model, const Stage& stage, const FlightState& y);

/// Speed and flight-path angle of a stage without thrust or lift in quasi-steady descent.
struct Equilibrium {
    double velocity_m_s = 0.0;
    double flight_path_angle_rad = 0.0;
};

/// The quasi-steady descent of a stage without thrust or lift, such as a vehicle settled under
/// its canopy: the speed and the flight-path angle sit on their equilibrium at the altitude
/// and mass, the one where drag balances gravity less the centrifugal term plus what keeps the
/// speed following its equilibrium as the air thickens (the first-order term of the slow
/// manifold, so the model's error is of the order of the square of the deceleration in g),
/// and where gravity turns the path as fast as the Coriolis term turns it back.
Equilibrium quasi_steady_equilibrium(const FlightModel& model, const Stage& stage,
                                     const FlightState& y);

/// The state with its speed and flight-path angle replaced by the quasi-steady equilibrium.
FlightState onto_equilibrium(const FlightModel& model, const Stage& stage, const FlightState& y);

/// The equations of the quasi-steady descent: altitude, downrange and heat loads as in
/// flight_derivative; speed and flight-path angle change at the slope of their equilibrium in
/// altitude times the sink rate, so a state on the equilibrium stays on it; the mass is held
/// (no thrust). Free of the fast modes, so the integrator takes steps of the descent's own
/// time scale.
FlightState quasi_steady_derivative(const FlightModel& model, const Stage& stage,
                                    const FlightState& y);

}  // namespace ds
