#pragma once

#include <memory>

#include "atmosphere/atmosphere.hpp"
#include <string_view>

namespace ds {

/// A body's built-in atmosphere ("model": "standard"): the 1976 US Standard Atmosphere for
/// Earth, the Mars reference profile for Mars, and exponential presets for Venus and Titan.
/// Takes the body preset name; returns null for a name without one (a custom body).
std::unique_ptr<Atmosphere> standard_atmosphere(std::string_view body_preset,
                                                double gas_constant_J_kgK, double gamma,
                                                double density_scale = 1.0);

}  // namespace ds
