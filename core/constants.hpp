#pragma once

namespace ds {

/// Standard gravity, m/s^2 (CGPM 1901; also the g0 of the rocket equation and of "g" loads).
inline constexpr double standard_gravity_m_s2 = 9.80665;

/// Molar gas constant, J/(mol K) (CODATA 2018, exact).
inline constexpr double molar_gas_constant_J_molK = 8.314462618;

inline constexpr double pi = 3.14159265358979323846;

constexpr double degrees_to_radians(double deg) {
    return deg * pi / 180.0;
}
constexpr double radians_to_degrees(double rad) {
    return rad * 180.0 / pi;
}

}  // namespace ds
