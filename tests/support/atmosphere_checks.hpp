#pragma once

// What the atmosphere suites share: a relative tolerance, the tolerance of a printed figure, a
// layer's weight by Simpson's rule, the check of a published row, and the smoothness and
// hydrostatic checks every tabulated profile passes.

#include <cmath>

#include <doctest/doctest.h>

#include "atmosphere/atmosphere.hpp"
#include "body/body.hpp"

namespace ds::test {

/// `expected` within a relative `tolerance` (no absolute floor).
inline doctest::Approx relative(double expected, double tolerance) {
    return doctest::Approx(expected).epsilon(tolerance).scale(0.0);
}

/// Half a unit in the last printed figure, relative to the value.
inline double printed_half_unit(double value, int figures) {
    return 0.5 * std::pow(10.0, std::floor(std::log10(value)) - (figures - 1)) / value;
}

/// Simpson's rule of rho g over [h0, h1] on the model: the weight of the layer per m^2.
inline double layer_weight_Pa(const Atmosphere& atmosphere, const Body& body, double h0,
                              double h1) {
    constexpr int intervals = 2000;  // even
    const double step = (h1 - h0) / intervals;
    double sum = 0.0;
    for (int k = 0; k <= intervals; ++k) {
        const double h = h0 + k * step;
        const double weight = (k == 0 || k == intervals) ? 1.0 : (k % 2 == 1 ? 4.0 : 2.0);
        sum += weight * atmosphere.at(h).density_kg_m3 * body.gravity_m_s2(h);
    }
    return sum * step / 3.0;
}

/// The density falls at every `step_m` from `from_m` up to `to_m`.
inline void check_density_falls(const Atmosphere& atmosphere, double from_m, double to_m,
                                double step_m) {
    double previous = atmosphere.at(from_m).density_kg_m3;
    for (double h = from_m + step_m; h <= to_m; h += step_m) {
        CAPTURE(h);
        const double rho = atmosphere.at(h).density_kg_m3;
        CHECK(rho < previous);
        previous = rho;
    }
}

/// The density and the temperature are continuous at `altitude_m`. Source: continuity by
/// construction; 1e-9 relative across a 2e-6 m step.
inline void check_continuous_at(const Atmosphere& atmosphere, double altitude_m) {
    const AtmosphereSample below = atmosphere.at(altitude_m - 1e-6);
    const AtmosphereSample above = atmosphere.at(altitude_m + 1e-6);
    CHECK(above.density_kg_m3 == relative(below.density_kg_m3, 1e-9));
    CHECK(above.temperature_K == relative(below.temperature_K, 1e-9));
}

/// The density's slope has no kink at `altitude_m`: 20 m either side it changes by the
/// interpolating cubic's curvature only, within 0.5 % (a log-linear table would step by the
/// layers' different mean slopes, tens of percent).
inline void check_no_slope_kink_at(const Atmosphere& atmosphere, double altitude_m) {
    CHECK(atmosphere.log_density_slope_per_m(altitude_m + 20.0) ==
          relative(atmosphere.log_density_slope_per_m(altitude_m - 20.0), 5e-3));
}

/// A row of a published table as a model must give it back: the temperature within an
/// absolute tolerance, the density within a relative one (each from how the table prints it).
struct PublishedRow {
    double altitude_m;
    double temperature_K;
    double temperature_tolerance_K;
    double density_kg_m3;
    double density_tolerance;
};

/// The model gives the row's temperature and density at its altitude.
inline void check_published_row(const Atmosphere& atmosphere, const PublishedRow& row) {
    CAPTURE(row.altitude_m);
    const AtmosphereSample sample = atmosphere.at(row.altitude_m);
    CHECK(std::abs(sample.temperature_K - row.temperature_K) <= row.temperature_tolerance_K);
    CHECK(sample.density_kg_m3 == relative(row.density_kg_m3, row.density_tolerance));
}

/// Above `from_m` up to `to_m` (every `step_m`) the model is isothermal at `temperature_K` and
/// hydrostatic in a gas of `gas_constant_J_kgK` under the body's inverse-square gravity:
/// dp/dh = -rho g with p = rho R T gives d(ln rho)/dh = -g / (R T); 1e-6 relative (the model's
/// slope is a 1 m central difference).
inline void check_isothermal_hydrostatic(const Atmosphere& atmosphere, const Body& body,
                                         double gas_constant_J_kgK, double temperature_K,
                                         double from_m, double to_m, double step_m) {
    for (double h = from_m; h <= to_m; h += step_m) {
        CAPTURE(h);
        CHECK(atmosphere.at(h).temperature_K == temperature_K);
        CHECK(atmosphere.log_density_slope_per_m(h) ==
              relative(-body.gravity_m_s2(h) / (gas_constant_J_kgK * temperature_K), 1e-6));
    }
}

}  // namespace ds::test
