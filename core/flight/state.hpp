#pragma once

#include <cmath>

#include "numerics/dormand_prince.hpp"

namespace ds {

/// The integrated state of a three-dimensional point-mass flight over a spherical, rotating
/// body: position as altitude, latitude and longitude; the planet-relative velocity as its
/// east, north and up components in the local horizon frame (a velocity, not a speed and two
/// angles, so that steep and vertical flight, under a canopy or at the end of a burn, has no
/// singular heading); the mass and the stagnation heat loads.
inline constexpr int flight_state_size = 9;
using FlightState = Vector<flight_state_size>;

/// Where each quantity sits in a FlightState (SI units).
struct StateIndex {
    static constexpr int altitude = 0;              ///< m above the reference radius
    static constexpr int latitude = 1;              ///< rad, geocentric
    static constexpr int longitude = 2;             ///< rad, east positive, body-fixed
    static constexpr int east_velocity = 3;         ///< m/s, planet-relative
    static constexpr int north_velocity = 4;        ///< m/s, planet-relative
    static constexpr int up_velocity = 5;           ///< m/s, planet-relative
    static constexpr int mass = 6;                  ///< kg
    static constexpr int convective_heat_load = 7;  ///< J/m^2 at the stagnation point
    static constexpr int radiative_heat_load = 8;   ///< J/m^2 at the stagnation point
};

/// Planet-relative speed, m/s.
inline double speed(const FlightState& y) {
    return std::sqrt(y[StateIndex::east_velocity] * y[StateIndex::east_velocity] +
                     y[StateIndex::north_velocity] * y[StateIndex::north_velocity] +
                     y[StateIndex::up_velocity] * y[StateIndex::up_velocity]);
}

/// Planet-relative horizontal speed, m/s.
inline double horizontal_speed(const FlightState& y) {
    return std::sqrt(y[StateIndex::east_velocity] * y[StateIndex::east_velocity] +
                     y[StateIndex::north_velocity] * y[StateIndex::north_velocity]);
}

/// Planet-relative flight-path angle, rad, negative below the local horizontal.
inline double flight_path_angle_rad(const FlightState& y) {
    return std::atan2(y[StateIndex::up_velocity], horizontal_speed(y));
}

/// Planet-relative azimuth of the velocity, rad, clockwise from north (0 for vertical flight).
inline double azimuth_rad(const FlightState& y) {
    return std::atan2(y[StateIndex::east_velocity], y[StateIndex::north_velocity]);
}

/// A state from a speed, a flight-path angle and an azimuth (clockwise from north), rad; the
/// heat loads start at zero.
inline FlightState make_flight_state(double altitude_m, double latitude_rad, double longitude_rad,
                                     double speed_m_s, double flight_path_angle, double azimuth,
                                     double mass_kg) {
    FlightState y = FlightState::Zero();
    y[StateIndex::altitude] = altitude_m;
    y[StateIndex::latitude] = latitude_rad;
    y[StateIndex::longitude] = longitude_rad;
    const double horizontal = speed_m_s * std::cos(flight_path_angle);
    y[StateIndex::east_velocity] = horizontal * std::sin(azimuth);
    y[StateIndex::north_velocity] = horizontal * std::cos(azimuth);
    y[StateIndex::up_velocity] = speed_m_s * std::sin(flight_path_angle);
    y[StateIndex::mass] = mass_kg;
    return y;
}

/// The same state with its velocity rescaled to a speed, the direction kept.
inline FlightState with_speed(FlightState y, double speed_m_s) {
    const double v = speed(y);
    for (const int i :
         {StateIndex::east_velocity, StateIndex::north_velocity, StateIndex::up_velocity}) {
        y[i] *= speed_m_s / v;
    }
    return y;
}

}  // namespace ds
