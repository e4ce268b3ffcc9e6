#include "atmosphere/reference_profile.hpp"

#include <cmath>
#include <stdexcept>
#include <utility>

#include "atmosphere/table.hpp"

namespace ds {
namespace {

std::vector<AtmosphereRow> validated(std::vector<AtmosphereRow> rows) {
    // The same rules as a design's table, with the same messages.
    const TableAtmosphere check(rows, 1.0, 1.0);
    return rows;
}

Body validated(Body body) {
    if (!(body.mu_m3_s2 > 0.0 && body.radius_m > 0.0 && body.gas.gas_constant_J_kgK > 0.0)) {
        throw std::invalid_argument("a reference profile needs the body's gravity and gas");
    }
    return body;
}

std::vector<double> altitudes(const std::vector<AtmosphereRow>& rows) {
    std::vector<double> out;
    out.reserve(rows.size());
    for (const AtmosphereRow& row : rows)
        out.push_back(row.altitude_m);
    return out;
}

std::vector<double> log_densities(const std::vector<AtmosphereRow>& rows) {
    std::vector<double> out;
    out.reserve(rows.size());
    for (const AtmosphereRow& row : rows)
        out.push_back(std::log(row.density_kg_m3));
    return out;
}

/// d(ln rho)/dh of the isothermal hydrostatic extension at its base.
double extension_slope_per_m(const AtmosphereRow& top, const Body& body) {
    return -body.gravity_m_s2(top.altitude_m) / (body.gas.gas_constant_J_kgK * top.temperature_K);
}

}  // namespace

ReferenceProfileAtmosphere::ReferenceProfileAtmosphere(ReferenceProfile profile,
                                                       double gas_constant_J_kgK, double gamma,
                                                       double density_scale)
    : Atmosphere(gas_constant_J_kgK, gamma, density_scale),
      rows_(validated(std::move(profile.rows))),
      body_(validated(std::move(profile.body))),
      log_density_(altitudes(rows_), log_densities(rows_), std::nullopt,
                   extension_slope_per_m(rows_.back(), body_)) {}

Atmosphere::Profile ReferenceProfileAtmosphere::profile(double altitude_m) const {
    const AtmosphereRow& top = rows_.back();
    if (altitude_m > top.altitude_m) {
        // Hydrostatic, isothermal, inverse-square gravity: ln(rho/rho_top) = -(1/(R T)) times
        // the integral of g from the top row, mu (1/(r0 + h_top) - 1/(r0 + h)).
        const double potential_drop = body_.mu_m3_s2 * (1.0 / (body_.radius_m + top.altitude_m) -
                                                        1.0 / (body_.radius_m + altitude_m));
        return {top.density_kg_m3 *
                    std::exp(-potential_drop / (body_.gas.gas_constant_J_kgK * top.temperature_K)),
                top.temperature_K};
    }
    return {std::exp(log_density_.value(altitude_m)),
            interpolate_atmosphere_rows(rows_, altitude_m).temperature_K};
}

}  // namespace ds
