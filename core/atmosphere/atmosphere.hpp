#pragma once

namespace ds {

/// What an atmosphere model gives at one altitude.
struct AtmosphereSample {
    double density_kg_m3 = 0.0;  ///< with the density scale applied
    double temperature_K = 0.0;
    double speed_of_sound_m_s = 0.0;
};

/// One interface for every atmosphere model. Altitude is geometric, above the body's
/// reference radius. The density scale (dispersions, what-if trades) and the speed of sound
/// (sqrt(gamma R T) with the free-stream gas) are applied here once for all models.
class Atmosphere {
public:
    Atmosphere(double gas_constant_J_kgK, double gamma, double density_scale = 1.0)
        : gas_constant_(gas_constant_J_kgK), gamma_(gamma), density_scale_(density_scale) {}
    virtual ~Atmosphere() = default;

    AtmosphereSample at(double altitude_m) const;

    /// d(ln rho)/dh in 1/m, by a central difference of the model (the scale cancels).
    double log_density_slope_per_m(double altitude_m) const;

    double gas_constant_J_kgK() const { return gas_constant_; }
    double gamma() const { return gamma_; }
    double density_scale() const { return density_scale_; }

protected:
    /// The unscaled model.
    struct Profile {
        double density_kg_m3 = 0.0;
        double temperature_K = 0.0;
    };
    virtual Profile profile(double altitude_m) const = 0;

private:
    double gas_constant_;
    double gamma_;
    double density_scale_;
};

}  // namespace ds
