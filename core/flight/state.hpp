#pragma once

#include "numerics/dormand_prince.hpp"

namespace ds {

/// The integrated state of a planar point-mass flight over a spherical body.
inline constexpr int flight_state_size = 7;
using FlightState = Vector<flight_state_size>;

/// Where each quantity sits in a FlightState (SI units).
struct StateIndex {
    static constexpr int altitude = 0;           ///< m above the reference radius
    static constexpr int downrange = 1;          ///< m along the surface at the reference radius
    static constexpr int velocity = 2;           ///< m/s, planet-relative
    static constexpr int flight_path_angle = 3;  ///< rad, negative below the horizontal
    static constexpr int mass = 4;               ///< kg
    static constexpr int convective_heat_load = 5;  ///< J/m^2 at the stagnation point
    static constexpr int radiative_heat_load = 6;   ///< J/m^2 at the stagnation point
};

}  // namespace ds
