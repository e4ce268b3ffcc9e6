#pragma once

#include <vector>

#include "atmosphere/atmosphere.hpp"
#include "atmosphere/monotone_cubic.hpp"
#include "atmosphere/table_row.hpp"
#include "body/body.hpp"

namespace ds {

/// A published profile of a body's atmosphere: rows of altitude, density and temperature, and
/// the body whose gravity and gas carry it above its top row.
struct ReferenceProfile {
    std::vector<AtmosphereRow> rows;  ///< strictly increasing altitude, positive values
    Body body;
};

/// A body's built-in atmosphere from a published profile. Between the rows, ln rho follows a
/// monotone cubic through them (MonotoneCubic), so the density is exact at every row, monotone
/// between rows and its slope continuous: no kink for a peak of heating or deceleration to
/// settle on. The temperature is linear between rows. Above the top row the profile continues
/// isothermal and hydrostatic at the top row's temperature, with inverse-square gravity and
/// the body's gas:
///     rho(h) = rho_top exp(-(mu / (R T_top)) (1 / (r0 + h_top) - 1 / (r0 + h))),
/// and the cubic's last slope is that extension's, -g(h_top) / (R T_top), so the slope stays
/// continuous there too. Below the first row ln rho and T continue on their first slopes.
/// The gas passed to the constructor gives the speed of sound (as for every model); the
/// extension keeps the body's own gas, so a profile does not change with that setting.
class ReferenceProfileAtmosphere final : public Atmosphere {
public:
    /// Throws std::invalid_argument for fewer than two rows, altitudes not strictly
    /// increasing, or a density or temperature that is not positive and finite.
    ReferenceProfileAtmosphere(ReferenceProfile profile, double gas_constant_J_kgK, double gamma,
                               double density_scale = 1.0);

    double lowest_row_altitude_m() const { return rows_.front().altitude_m; }
    double top_row_altitude_m() const { return rows_.back().altitude_m; }

protected:
    Profile profile(double altitude_m) const override;

private:
    std::vector<AtmosphereRow> rows_;
    Body body_;
    MonotoneCubic log_density_;
};

}  // namespace ds
