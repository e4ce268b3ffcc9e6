#pragma once

#include <cmath>

#include <Eigen/Core>

#include "atmosphere/atmosphere.hpp"
#include "atmosphere/wind.hpp"
#include "body/body.hpp"
#include "flight/stage.hpp"
#include "flight/state.hpp"

namespace ds {

/// The body, its atmosphere and winds: what a flight happens in. All outlive the model. The
/// body's rotation_rad_s is flown as given (about its north pole; 0 for none).
struct FlightModel {
    const Body& body;
    const Atmosphere& atmosphere;
    const WindProfile* wind = nullptr;  ///< none: the air turns with the body, still
};

/// Everything derived from a state that the equations, the events and the history need,
/// computed in one place.
struct FlightConditions {
    /// The velocity relative to the air (planet-relative less the wind), east, north, up, m/s.
    Eigen::Vector3d air_velocity_m_s = Eigen::Vector3d::Zero();
    double air_speed_m_s = 0.0;
    double density_kg_m3 = 0.0;
    double speed_of_sound_m_s = 0.0;
    double mach = 0.0;                 ///< of the air-relative speed
    double dynamic_pressure_Pa = 0.0;  ///< of the air-relative speed
    double drag_N = 0.0;
    double lift_N = 0.0;
    double gravity_m_s2 = 0.0;
    double deceleration_g = 0.0;  ///< sqrt(drag^2 + lift^2) / m / g0
    double convective_heat_flux_W_m2 = 0.0;
    double radiative_heat_flux_W_m2 = 0.0;
    double thrust_N = 0.0;
    double throttle = 0.0;            ///< thrust over full thrust (Stage::throttle)
    double thrust_coefficient = 0.0;  ///< T / (q A) with the stage's reference area; 0: none
    /// What the vehicle feels: sqrt((drag + thrust)^2 + lift^2) / m / g0, the thrust taken
    /// along the drag (exact for a burn against the air velocity).
    double sensed_deceleration_g = 0.0;
};

/// Which of the conditions beyond the air's (its velocity, density, speed of sound, Mach
/// number, dynamic pressure) and gravity are computed: the forces (drag, lift, thrust and the
/// decelerations), the heating (the convective and radiative fluxes), or both. Each part is the
/// same number computed alone as with the others; the parts left out stay zero.
enum class ConditionParts { air, forces, heating, all };

FlightConditions flight_conditions(const FlightModel& model, const Stage& stage,
                                   const FlightState& y);
FlightConditions flight_conditions(const FlightModel& model, const Stage& stage,
                                   const FlightState& y, ConditionParts parts);

/// All zero: the conditions of a stage that feels no air, and what a quantity read off the
/// state alone is handed. Made once, so the hot paths that hand them make none.
extern const FlightConditions no_conditions;

/// The three-degree-of-freedom equations of motion of a point mass over a spherical body
/// rotating about its north pole, with inverse-square gravity, in the body-fixed frame: the
/// equations of Vinh, Busemann and Culp, Hypersonic and Planetary Entry Flight Mechanics
/// (1980), written for the velocity's east, north and up components in the local horizon frame
/// (which turns as the vehicle moves over the sphere: the transport-rate terms of inertial
/// navigation), with the Coriolis term -2 w x v and the centripetal term -w x (w x r).
/// Drag acts against the velocity relative to the air (the body's rotation plus the wind);
/// lift is L/D x drag, perpendicular to that velocity in the vertical plane, rotated about it
/// by the bank angle (a positive bank turns it to the right of the flight); with the air
/// velocity vertical there is no vertical plane and no lift. Thrust acts against the
/// planet-relative velocity, or against the air-relative one (Stage::thrust_against_air).
/// Singular at the poles (latitude +-90 deg).
FlightState flight_derivative(const FlightModel& model, const Stage& stage, const FlightState& y);

/// The local frame at a point: what the frame's acceleration needs of the position (the
/// latitude's sine and cosine among it). See local_frame.
struct LocalFrame {
    double r = 0.0;      ///< m from the centre
    double omega = 0.0;  ///< rad/s
    double sin_lat = 0.0;
    double cos_lat = 1.0;
    double gravity = 0.0;  ///< mu / r^2

    LocalFrame(const Body& body, double altitude_m, double latitude_rad)
        : r(body.radius_m + altitude_m),
          omega(body.rotation_rad_s),
          sin_lat(std::sin(latitude_rad)),
          cos_lat(std::cos(latitude_rad)),
          gravity(body.mu_m3_s2 / (r * r)) {}

    /// What acts per unit mass on a vehicle moving at the planet-relative velocity v (east,
    /// north, up) besides its own forces: gravity, the Coriolis term -2 w x v, the centripetal
    /// term -w x (w x r) with w = omega (0, cos(lat), sin(lat)) in the local frame, and the
    /// transport-rate term -rho x v of the local frame turning as the vehicle moves over the
    /// sphere, rho = (-v_n, v_e, v_e tan(lat)) / r.
    Eigen::Vector3d acceleration(const Eigen::Vector3d& v) const {
        const double s = sin_lat;
        const double c = cos_lat;
        const double t = s / c;
        const double w = omega;
        const double ve = v.x();
        const double vn = v.y();
        const double vu = v.z();
        return {-2.0 * w * (c * vu - s * vn) + (ve * vn * t - ve * vu) / r,
                -2.0 * w * s * ve - w * w * r * s * c - (ve * ve * t + vn * vu) / r,
                -gravity + 2.0 * w * c * ve + w * w * r * c * c + (ve * ve + vn * vn) / r};
    }
};

/// The state's local frame. flight_derivative makes it before the state's conditions: the two
/// need nothing of each other, and a processor then works on both at once (its sine and cosine
/// alongside the conditions' chain of functions), where one after the other it waits for each.
LocalFrame local_frame(const FlightModel& model, const FlightState& y);

/// The same from the state's flight conditions and local frame, when the caller has them
/// (flight_conditions of the same model, stage and state, a stage without drag or heating does
/// not read them; local_frame, made first).
FlightState flight_derivative(const FlightModel& model, const Stage& stage, const FlightState& y,
                              const FlightConditions& conditions, const LocalFrame& frame);

/// Whether a stage's equations read the air: it has drag or heating, or thrusts against the
/// air or records its thrust coefficient.
bool feels_air(const Stage& stage);

/// How far a flight is from settled, as the larger of |dV/dt| / g and |a_perp| / g, the
/// acceleration of flight_derivative along the velocity and across it (V times the rate at
/// which the velocity turns): near the equilibrium of a vehicle under its canopy these are,
/// to first order, the speed's relative excess over its equilibrium times two and the
/// direction's offset from its equilibrium in radians.
double unsettled_rate(const FlightModel& model, const Stage& stage, const FlightState& y);

/// The same from the state's derivative (flight_derivative), when the caller has it.
double unsettled_rate(const FlightModel& model, const FlightState& y, const FlightState& dy);

/// The planet-relative velocity of a stage without thrust or lift in quasi-steady descent.
struct Equilibrium {
    double velocity_m_s = 0.0;  ///< speed
    double flight_path_angle_rad = 0.0;
    double azimuth_rad = 0.0;
    Eigen::Vector3d velocity_enu_m_s = Eigen::Vector3d::Zero();  ///< east, north, up
};

/// The quasi-steady descent of a stage without thrust or lift, such as a vehicle settled under
/// its canopy: the velocity sits on its equilibrium at the altitude, latitude and mass, the
/// one where the drag (against the air: the wind carries the vehicle) balances gravity, the
/// centrifugal, Coriolis and transport terms, plus what keeps the velocity following its
/// equilibrium as the air thickens and the wind changes with altitude (the first-order term of
/// the slow manifold, so the model's error is of the order of the square of the deceleration
/// in g).
Equilibrium quasi_steady_equilibrium(const FlightModel& model, const Stage& stage,
                                     const FlightState& y);

/// The equilibrium to a higher order: the following term made again from the previous order's
/// equilibria a step either side, `orders` times (1 is quasi_steady_equilibrium). Each order
/// gains a factor of the deceleration in g: where the air thickens fast against the speed (a
/// canopy on Mars, some 0.05 g of it at 65 m/s), the first order is some 0.3 % off the flown
/// descent and the fourth within 1e-5.
Equilibrium slow_manifold_equilibrium(const FlightModel& model, const Stage& stage,
                                      const FlightState& y, int orders);

/// The state with its velocity replaced by the equilibrium (of the slow manifold's first order,
/// the quasi-steady one, unless more are asked for).
FlightState onto_equilibrium(const FlightModel& model, const Stage& stage, const FlightState& y,
                             int orders = 1);

/// The equations of the quasi-steady descent: position and heat loads as in flight_derivative;
/// the velocity changes at the slope of its equilibrium in altitude times the sink rate, so a
/// state on the equilibrium stays on it; the mass is held (no thrust). Free of the fast modes, so
/// the integrator takes steps of the descent's own time scale.
FlightState quasi_steady_derivative(const FlightModel& model, const Stage& stage,
                                    const FlightState& y);

}  // namespace ds
