#pragma once

#include "atmosphere/atmosphere.hpp"

namespace ds {

/// US Standard Atmosphere, 1976 (NOAA/NASA/USAF), 0-1000 km geometric altitude: the seven
/// geopotential layers up to 86 km from the standard's defining constants; above 86 km its
/// defining kinetic-temperature profile (isothermal, elliptical, linear, then the exponential
/// approach to 1000 K) and its tabulated pressure and molar mass, the density between its
/// tabulated altitudes on a monotone cubic in ln rho (see the .cpp for the values and how sure
/// we are of them). The temperature is the kinetic one the standard tabulates. Below 0 km the
/// first layer is extended; above 1000 km density and pressure continue on their last slope.
class UsStandardAtmosphere1976 final : public Atmosphere {
public:
    explicit UsStandardAtmosphere1976(double density_scale = 1.0);

    /// Pressure in Pa at a geometric altitude: from the defining constants up to 86 km (and
    /// below 0); above 86 km the standard's tabulated pressure, ln p on a monotone cubic
    /// between its altitudes.
    double pressure_Pa(double altitude_m) const;

protected:
    Profile profile(double altitude_m) const override;
};

}  // namespace ds
