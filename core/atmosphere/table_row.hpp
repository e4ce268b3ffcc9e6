#pragma once

namespace ds {

/// One row of a tabulated atmosphere: altitude in m, density in kg/m^3, temperature in K.
struct AtmosphereRow {
    double altitude_m = 0.0;
    double density_kg_m3 = 0.0;
    double temperature_K = 0.0;

    bool operator==(const AtmosphereRow&) const = default;
};

}  // namespace ds
