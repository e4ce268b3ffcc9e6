#pragma once

#include <cmath>

namespace ds {

/// Sutton-Graves convective stagnation-point heat flux, NASA TR R-376 (1971):
/// q = k sqrt(rho / Rn) V^3. k in kg^0.5/m (1.9027e-4 CO2, 1.7415e-4 air), rho in kg/m^3,
/// nose radius in m, velocity in m/s. Returns W/m^2.
inline double sutton_graves_heat_flux_W_m2(double k, double density_kg_m3, double nose_radius_m,
                                           double velocity_m_s) {
    return k * std::sqrt(density_kg_m3 / nose_radius_m) * velocity_m_s * velocity_m_s *
           velocity_m_s;
}

}  // namespace ds
