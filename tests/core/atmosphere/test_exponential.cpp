#include <doctest/doctest.h>

#include <cmath>

#include "atmosphere/exponential.hpp"
#include "support/atmosphere_checks.hpp"

namespace {

// Approx with a purely relative tolerance (doctest's default scale of 1 would make it absolute
// for small densities).
using ds::test::relative;

// A Mars-like exponential profile, the example of the design contract (design-file.md).
constexpr ds::ExponentialAtmosphere::Parameters mars_like{
    .surface_density_kg_m3 = 0.020, .scale_height_m = 11100.0, .temperature_K = 210.0};
constexpr double co2_gas_constant_J_kgK = 188.9;  // 8314.46 / 44.01 (references.md, derived)
constexpr double co2_gamma = 1.29;                // references.md (from memory)

}  // namespace

TEST_CASE(
    "exponential density is rho0 at 0 and rho0/e one scale height up (definition of the "
    "model)") {
    const ds::ExponentialAtmosphere atmosphere(mars_like, co2_gas_constant_J_kgK, co2_gamma);
    // Source: the definition rho(h) = rho0 exp(-h/H); 1e-12 relative for rounding.
    CHECK(atmosphere.at(0.0).density_kg_m3 == relative(0.020, 1e-12));
    CHECK(atmosphere.at(mars_like.scale_height_m).density_kg_m3 ==
          relative(0.020 / std::exp(1.0), 1e-12));
    CHECK(atmosphere.at(2.0 * mars_like.scale_height_m).density_kg_m3 ==
          relative(0.020 / std::exp(2.0), 1e-12));
}

TEST_CASE(
    "exponential density scale multiplies density only, not temperature or sound speed "
    "(design-file.md, density_scale)") {
    const ds::ExponentialAtmosphere nominal(mars_like, co2_gas_constant_J_kgK, co2_gamma);
    const ds::ExponentialAtmosphere scaled(mars_like, co2_gas_constant_J_kgK, co2_gamma, 1.3);
    const double altitude_m = 25000.0;
    const ds::AtmosphereSample a = nominal.at(altitude_m);
    const ds::AtmosphereSample b = scaled.at(altitude_m);
    // Source: design-file.md, "density_scale multiplies the density of any model".
    CHECK(b.density_kg_m3 == relative(1.3 * a.density_kg_m3, 1e-15));
    CHECK(b.temperature_K == a.temperature_K);
    CHECK(b.speed_of_sound_m_s == a.speed_of_sound_m_s);
    CHECK(scaled.density_scale() == 1.3);
}

TEST_CASE("exponential speed of sound is sqrt(gamma R T) against a hand value") {
    const ds::ExponentialAtmosphere atmosphere(mars_like, co2_gas_constant_J_kgK, co2_gamma);
    // Source: hand computation sqrt(1.29 x 188.9 J/(kg K) x 210 K) = 226.2145 m/s.
    const double hand_value_m_s = 226.2145;
    CHECK(atmosphere.at(40000.0).speed_of_sound_m_s == relative(hand_value_m_s, 1e-6));
    CHECK(atmosphere.at(40000.0).temperature_K == 210.0);
}

TEST_CASE("exponential log-density slope is -1/H (definition of the model)") {
    const ds::ExponentialAtmosphere atmosphere(mars_like, co2_gas_constant_J_kgK, co2_gamma);
    // Source: d(ln rho)/dh = -1/H by the definition; 1e-6 relative covers the central
    // difference's rounding.
    const double expected_per_m = -1.0 / mars_like.scale_height_m;
    CHECK(atmosphere.log_density_slope_per_m(0.0) == relative(expected_per_m, 1e-6));
    CHECK(atmosphere.log_density_slope_per_m(60000.0) == relative(expected_per_m, 1e-6));
    // The density scale cancels in the slope (atmosphere.hpp).
    const ds::ExponentialAtmosphere scaled(mars_like, co2_gas_constant_J_kgK, co2_gamma, 0.7);
    CHECK(scaled.log_density_slope_per_m(60000.0) == relative(expected_per_m, 1e-6));
}
