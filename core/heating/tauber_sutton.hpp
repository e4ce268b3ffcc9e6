#pragma once

#include <string_view>

namespace ds {

/// Stagnation-point radiative heat flux from the Tauber-Sutton correlation, J. Spacecraft and
/// Rockets 28(1), 1991: q_r = C Rn^a rho^b f(V), with the constants and the tabulated f(V) of
/// the named correlation ("mars" for CO2/N2, "earth" for air); 0 for any other name and below
/// the table. Density in kg/m^3, nose radius in m, velocity in m/s. Returns W/m^2.
/// The constants and tables are from memory (see the .cpp): confirm against the paper.
double tauber_sutton_heat_flux_W_m2(std::string_view correlation, double density_kg_m3,
                                    double nose_radius_m, double velocity_m_s);

}  // namespace ds
