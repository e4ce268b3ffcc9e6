#include "atmosphere/atmosphere.hpp"

#include <cmath>

namespace ds {

AtmosphereSample Atmosphere::at(double altitude_m) const {
    const Profile p = profile(altitude_m);
    return {p.density_kg_m3 * density_scale_, p.temperature_K,
            std::sqrt(gamma_ * gas_constant_ * p.temperature_K)};
}

double Atmosphere::log_density_slope_per_m(double altitude_m) const {
    // 1 m is small against every scale height and large against rounding of rho.
    constexpr double step_m = 1.0;
    const double above = profile(altitude_m + step_m).density_kg_m3;
    const double below = profile(altitude_m - step_m).density_kg_m3;
    return std::log(above / below) / (2.0 * step_m);
}

}  // namespace ds
