#pragma once

namespace ds {

/// Frontal area of a circular section of diameter d: pi d^2 / 4, m^2.
double frontal_area_m2(double diameter_m);

/// Ballistic coefficient beta = m / (Cd A), kg/m^2.
double ballistic_coefficient_kg_m2(double mass_kg, double drag_coefficient, double area_m2);

/// Newtonian drag coefficient of a sphere-cone at zero angle of attack, referred to the base
/// area: Cd = (1 - sin^4 d) e^2 + 2 sin^2 d (1 - e^2 cos^2 d), with d the cone half-angle and
/// e = Rn / Rb the bluntness (sharp cone 2 sin^2 d, hemisphere 1).
double newtonian_sphere_cone_drag_coefficient(double half_angle_rad, double bluntness);

/// Stagnation pressure coefficient behind a normal shock (Rayleigh pitot formula) at a Mach
/// number, for a gas of ratio of specific heats gamma.
double stagnation_pressure_coefficient(double gamma, double mach);

/// Its hypersonic limit (Mach to infinity): ((g+1)^2 / (4 g))^(g/(g-1)) * 4 / (g+1).
double stagnation_pressure_coefficient_limit(double gamma);

/// The stagnation pressure coefficient at any Mach number: behind the normal shock (Rayleigh
/// pitot formula) from Mach 1 up, the isentropic compression below it (1 at Mach 0); the two
/// meet at Mach 1.
double stagnation_pressure_coefficient_at(double gamma, double mach);

/// The Mach law of a blunt body's drag in modified Newtonian theory: the pressure on the face
/// scales with the stagnation pressure coefficient, so Cd(M) / Cd(hypersonic) is
/// Cp_max(M) / Cp_max(infinity). It leaves out the base pressure (which adds drag at low
/// supersonic and subsonic speeds), so it is a conceptual estimate, low rather than high there.
double stagnation_pressure_ratio_to_limit(double gamma, double mach);

/// Modified Newtonian drag coefficient of a sphere-cone (hypersonic): the Newtonian value
/// scaled by Cp_max / 2 with the hypersonic-limit Cp_max of the gas.
double modified_newtonian_sphere_cone_drag_coefficient(double half_angle_rad, double bluntness,
                                                       double gamma);

/// The geometry of a sphere-cone aeroshell.
struct SphereCone {
    double diameter_m = 0.0;
    double half_angle_rad = 0.0;
    double nose_radius_m = 0.0;

    double bluntness() const { return nose_radius_m / (0.5 * diameter_m); }
    double frontal_area() const { return frontal_area_m2(diameter_m); }
};

/// The diameter at which a vehicle of the given mass has the target ballistic coefficient,
/// with the drag coefficient a function of diameter (fixed nose radius changes the bluntness).
/// `drag_coefficient_of(diameter)` must be positive. Returns 0 when no diameter between the
/// nose diameter and 100 m meets the target.
template <class DragCoefficientOf>
double diameter_for_ballistic_coefficient(double mass_kg, double target_kg_m2, double smallest_m,
                                          DragCoefficientOf&& drag_coefficient_of);

}  // namespace ds

#include "aeroshell/sphere_cone_sizing.hpp"
