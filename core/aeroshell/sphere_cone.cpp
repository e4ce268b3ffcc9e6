#include "aeroshell/sphere_cone.hpp"

#include <cmath>

#include "constants.hpp"

namespace ds {

double frontal_area_m2(double diameter_m) {
    return pi * diameter_m * diameter_m / 4.0;
}

double ballistic_coefficient_kg_m2(double mass_kg, double drag_coefficient, double area_m2) {
    return mass_kg / (drag_coefficient * area_m2);
}

double newtonian_sphere_cone_drag_coefficient(double half_angle_rad, double bluntness) {
    const double s2 = std::sin(half_angle_rad) * std::sin(half_angle_rad);
    const double c2 = 1.0 - s2;
    const double e2 = bluntness * bluntness;
    return (1.0 - s2 * s2) * e2 + 2.0 * s2 * (1.0 - e2 * c2);
}

double stagnation_pressure_coefficient(double gamma, double mach) {
    const double m2 = mach * mach;
    const double pitot_ratio =
        std::pow((gamma + 1.0) * (gamma + 1.0) * m2 / (4.0 * gamma * m2 - 2.0 * (gamma - 1.0)),
                 gamma / (gamma - 1.0)) *
        (1.0 - gamma + 2.0 * gamma * m2) / (gamma + 1.0);
    return (pitot_ratio - 1.0) / (0.5 * gamma * m2);
}

double stagnation_pressure_coefficient_limit(double gamma) {
    return std::pow((gamma + 1.0) * (gamma + 1.0) / (4.0 * gamma), gamma / (gamma - 1.0)) * 4.0 /
           (gamma + 1.0);
}

double stagnation_pressure_coefficient_at(double gamma, double mach) {
    if (mach >= 1.0)
        return stagnation_pressure_coefficient(gamma, mach);
    const double m2 = mach * mach;
    // (p0/p - 1) / (g M^2 / 2) = 1 + M^2/4 + ...: the series where the difference cancels.
    constexpr double series_below = 1e-3;
    if (std::abs(mach) < series_below)
        return 1.0 + 0.25 * m2;
    const double isentropic_ratio = std::pow(1.0 + 0.5 * (gamma - 1.0) * m2, gamma / (gamma - 1.0));
    return (isentropic_ratio - 1.0) / (0.5 * gamma * m2);
}

double stagnation_pressure_ratio_to_limit(double gamma, double mach) {
    return stagnation_pressure_coefficient_at(gamma, mach) /
           stagnation_pressure_coefficient_limit(gamma);
}

double modified_newtonian_sphere_cone_drag_coefficient(double half_angle_rad, double bluntness,
                                                       double gamma) {
    return newtonian_sphere_cone_drag_coefficient(half_angle_rad, bluntness) *
           stagnation_pressure_coefficient_limit(gamma) / 2.0;
}

}  // namespace ds
