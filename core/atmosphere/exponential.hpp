#pragma once

#include "atmosphere/atmosphere.hpp"

namespace ds {

/// Isothermal exponential atmosphere: rho(h) = rho0 exp(-h / H), constant temperature.
class ExponentialAtmosphere final : public Atmosphere {
public:
    struct Parameters {
        double surface_density_kg_m3 = 0.0;  ///< density at altitude 0 of the reference
        double scale_height_m = 0.0;
        double temperature_K = 0.0;
    };

    ExponentialAtmosphere(Parameters parameters, double gas_constant_J_kgK, double gamma,
                          double density_scale = 1.0)
        : Atmosphere(gas_constant_J_kgK, gamma, density_scale), parameters_(parameters) {}

    const Parameters& parameters() const { return parameters_; }

protected:
    Profile profile(double altitude_m) const override;

private:
    Parameters parameters_;
};

}  // namespace ds
