#include "atmosphere/table.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <string>
#include <utility>

#include <fmt/format.h>

namespace ds {
namespace {

constexpr std::size_t minimum_rows = 2;  // one segment to interpolate on

[[noreturn]] void reject(std::size_t row, const std::string& what) {
    throw std::invalid_argument(fmt::format("row {}: {}", row, what));
}

bool positive_and_finite(double value) {
    return std::isfinite(value) && value > 0.0;
}

void validate(const std::vector<AtmosphereRow>& rows) {
    if (rows.size() < minimum_rows) {
        reject(rows.size(), fmt::format("missing; an atmosphere table needs at least {} rows, "
                                        "this one has {}",
                                        minimum_rows, rows.size()));
    }
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const AtmosphereRow& row = rows[i];
        if (!std::isfinite(row.altitude_m)) {
            reject(i, fmt::format("altitude must be a finite number, got {}", row.altitude_m));
        }
        if (!positive_and_finite(row.density_kg_m3)) {
            reject(i, fmt::format("density must be positive and finite, got {} kg/m^3",
                                  row.density_kg_m3));
        }
        if (!positive_and_finite(row.temperature_K)) {
            reject(i, fmt::format("temperature must be positive and finite, got {} K",
                                  row.temperature_K));
        }
        if (i > 0 && !(row.altitude_m > rows[i - 1].altitude_m)) {
            reject(i, fmt::format("altitudes must increase strictly ({} m follows {} m)",
                                  row.altitude_m, rows[i - 1].altitude_m));
        }
    }
}

}  // namespace

AtmosphereRow interpolate_atmosphere_rows(std::span<const AtmosphereRow> rows, double altitude_m) {
    // The segment whose lower node is the last one at or below the altitude, clamped to the
    // first and last segments so that they extend outside the rows.
    const auto above =
        std::upper_bound(rows.begin(), rows.end(), altitude_m,
                         [](double h, const AtmosphereRow& row) { return h < row.altitude_m; });
    const auto last_segment = static_cast<std::ptrdiff_t>(rows.size()) - 2;
    const std::ptrdiff_t segment =
        std::clamp<std::ptrdiff_t>((above - rows.begin()) - 1, 0, last_segment);

    const AtmosphereRow& lower = rows[static_cast<std::size_t>(segment)];
    const AtmosphereRow& upper = rows[static_cast<std::size_t>(segment) + 1];
    const double fraction = (altitude_m - lower.altitude_m) / (upper.altitude_m - lower.altitude_m);
    // rho0 (rho1/rho0)^f is exact at the lower node, where f = 0. Densities whose ratio leaves
    // the doubles (rows 1e-200 and 1e200 kg/m^3) are interpolated in logarithms instead.
    const double ratio = upper.density_kg_m3 / lower.density_kg_m3;
    const double density = std::isnormal(ratio)
                               ? lower.density_kg_m3 * std::pow(ratio, fraction)
                               : std::exp(std::lerp(std::log(lower.density_kg_m3),
                                                    std::log(upper.density_kg_m3), fraction));
    // std::lerp is exact at both nodes (T0 + f (T1 - T0) is not at f = 1 when T0 dwarfs T1).
    return {altitude_m, density, std::lerp(lower.temperature_K, upper.temperature_K, fraction)};
}

TableAtmosphere::TableAtmosphere(std::vector<AtmosphereRow> rows, double gas_constant_J_kgK,
                                 double gamma, double density_scale)
    : Atmosphere(gas_constant_J_kgK, gamma, density_scale), rows_(std::move(rows)) {
    validate(rows_);
}

Atmosphere::Profile TableAtmosphere::profile(double altitude_m) const {
    const AtmosphereRow row = interpolate_atmosphere_rows(rows_, altitude_m);
    return {row.density_kg_m3, row.temperature_K};
}

}  // namespace ds
