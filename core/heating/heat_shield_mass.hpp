#pragma once

#include <cmath>

namespace ds {

/// Heat-shield (TPS) mass as a fraction of the entry mass from the total stagnation heat
/// load, MF[%] = 0.091 Q^0.51575 with Q in J/cm^2 (Laub and Venkatapathy, planetary probe
/// workshop, 2003; constants from memory). Returns a fraction (0.1 = 10 %).
inline double heat_shield_mass_fraction(double heat_load_J_cm2) {
    constexpr double coefficient_percent = 0.091;
    constexpr double exponent = 0.51575;
    if (heat_load_J_cm2 <= 0.0)
        return 0.0;
    return coefficient_percent * std::pow(heat_load_J_cm2, exponent) / 100.0;
}

}  // namespace ds
