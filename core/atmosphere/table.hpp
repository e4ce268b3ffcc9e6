#pragma once

#include <span>
#include <vector>

#include "atmosphere/atmosphere.hpp"
#include "atmosphere/table_row.hpp"

namespace ds {

/// Interpolates rows of altitude, density, temperature: density log-linearly, temperature
/// linearly, the end segments extended outside the rows. The rows must be at least two,
/// strictly increasing in altitude, with positive densities (TableAtmosphere checks this).
/// Altitude in m, density in kg/m^3, temperature in K.
AtmosphereRow interpolate_atmosphere_rows(std::span<const AtmosphereRow> rows, double altitude_m);

/// Tabulated atmosphere: rows of altitude, density, temperature, strictly increasing in
/// altitude. Density is interpolated log-linearly, temperature linearly. Outside the table the
/// end segment is extended (the sizing refuses a table that does not cover the flight).
class TableAtmosphere final : public Atmosphere {
public:
    /// Throws std::invalid_argument (with the row index) for fewer than two rows, altitudes
    /// not strictly increasing or not finite, or a density or temperature that is not
    /// positive and finite. The message starts "row <i>: ", with i counted from 0 as in the
    /// design's rows array.
    TableAtmosphere(std::vector<AtmosphereRow> rows, double gas_constant_J_kgK, double gamma,
                    double density_scale = 1.0);

    double lowest_altitude_m() const { return rows_.front().altitude_m; }
    double highest_altitude_m() const { return rows_.back().altitude_m; }

protected:
    Profile profile(double altitude_m) const override;

private:
    std::vector<AtmosphereRow> rows_;
};

}  // namespace ds
