#pragma once

#include <memory>
#include <string_view>

#include "atmosphere/atmosphere.hpp"

namespace ds {

/// A body's built-in atmosphere ("model": "standard"): the 1976 US Standard Atmosphere for
/// Earth (0-1000 km), the Mars reference profile for Mars, the Venus International Reference
/// Atmosphere for Venus (0-100 km, hydrostatic above) and the Titan nominal engineering profile
/// for Titan (0-500 km, hydrostatic above).
/// Takes the body preset name; returns null for a name without one (a custom body). Earth's
/// model keeps the standard's own gas (air: R*/M0, gamma 1.4) and ignores the gas passed in.
std::unique_ptr<Atmosphere> standard_atmosphere(std::string_view body_preset,
                                                double gas_constant_J_kgK, double gamma,
                                                double density_scale = 1.0);

}  // namespace ds
