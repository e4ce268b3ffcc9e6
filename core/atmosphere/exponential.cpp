#include "atmosphere/exponential.hpp"

#include <cmath>

namespace ds {

Atmosphere::Profile ExponentialAtmosphere::profile(double altitude_m) const {
    return {parameters_.surface_density_kg_m3 * std::exp(-altitude_m / parameters_.scale_height_m),
            parameters_.temperature_K};
}

}  // namespace ds
