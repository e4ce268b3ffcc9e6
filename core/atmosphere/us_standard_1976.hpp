#pragma once

#include "atmosphere/atmosphere.hpp"

namespace ds {

/// US Standard Atmosphere, 1976 (NOAA/NASA/USAF): the seven geopotential layers from 0 to
/// 86 km geometric altitude, from the standard's defining constants; above 86 km a
/// log-linear table of the standard's tabulated density and temperature (see the .cpp for the
/// values and how sure we are of them). Below 0 km the first layer is extended.
class UsStandardAtmosphere1976 final : public Atmosphere {
public:
    explicit UsStandardAtmosphere1976(double density_scale = 1.0);

    /// Pressure in Pa at a geometric altitude: from the defining constants up to 86 km (and
    /// below 0); above 86 km approximated as rho R T with the sea-level molar mass, which
    /// understates it increasingly with height (about 10 % at 120 km).
    double pressure_Pa(double altitude_m) const;

protected:
    Profile profile(double altitude_m) const override;
};

}  // namespace ds
