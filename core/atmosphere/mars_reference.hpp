#pragma once

#include "atmosphere/atmosphere.hpp"

namespace ds {

/// Default Mars profile. Below the join altitude: the NASA Glenn Research Center educational
/// Mars curve fit (T in deg C, p in kPa: T = -31 - 0.000998 h below 7000 m, -23.4 - 0.00222 h
/// above; p = 0.699 exp(-0.00009 h); rho = p / (0.1921 (T + 273.1))). That fit's temperature
/// turns negative near 110 km, so above the join the profile continues isothermal and
/// hydrostatic at the fit's join temperature (our choice), so it serves an entry from 125 km.
/// Across a band of +-5 km about the join the two are blended (smoothstep in ln rho and T), so
/// density, temperature and the density's slope are continuous.
class MarsReferenceAtmosphere final : public Atmosphere {
public:
    static constexpr double join_altitude_m = 40000.0;
    static constexpr double blend_half_width_m = 5000.0;

    MarsReferenceAtmosphere(double gas_constant_J_kgK, double gamma, double density_scale = 1.0);

protected:
    Profile profile(double altitude_m) const override;
};

}  // namespace ds
