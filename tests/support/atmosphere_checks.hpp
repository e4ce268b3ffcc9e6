#pragma once

// What the atmosphere suites share: a relative tolerance, the tolerance of a printed figure, a
// layer's weight by Simpson's rule, and the smoothness checks every tabulated profile passes.

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

/// The density is continuous at `altitude_m`. Source: continuity by construction; 1e-9
/// relative across a 2e-6 m step.
inline void check_density_continuous_at(const Atmosphere& atmosphere, double altitude_m) {
    CHECK(atmosphere.at(altitude_m + 1e-6).density_kg_m3 ==
          relative(atmosphere.at(altitude_m - 1e-6).density_kg_m3, 1e-9));
}

/// The density's slope has no kink at `altitude_m`: 20 m either side it changes by the
/// interpolating cubic's curvature only, within 0.5 % (a log-linear table would step by the
/// layers' different mean slopes, tens of percent).
inline void check_no_slope_kink_at(const Atmosphere& atmosphere, double altitude_m) {
    CHECK(atmosphere.log_density_slope_per_m(altitude_m + 20.0) ==
          relative(atmosphere.log_density_slope_per_m(altitude_m - 20.0), 5e-3));
}

}  // namespace ds::test
