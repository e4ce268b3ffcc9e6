#pragma once

// The ballistic entry of the Allen-Eggers reference case (the worked check of references.md):
// the constants the verification case and the flight tests share, so neither can drift.

namespace ds::allen_eggers_case {

inline constexpr double rho0_kg_m3 = 0.020;        ///< the exponential atmosphere's at 0 m
inline constexpr double scale_height_m = 11100.0;  ///< H
inline constexpr double beta_kg_m2 = 65.0;         ///< the ballistic coefficient
inline constexpr double entry_velocity_m_s = 5500.0;
inline constexpr double entry_angle_deg = -14.0;
inline constexpr double interface_altitude_m = 125000.0;

}  // namespace ds::allen_eggers_case
