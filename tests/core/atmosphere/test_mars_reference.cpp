#include <doctest/doctest.h>

#include <cmath>

#include "atmosphere/mars_reference.hpp"
#include "support/atmosphere_checks.hpp"

namespace {

using ds::test::relative;

constexpr double mars_gas_constant_J_kgK = 191.8;  // 43.34 g/mol mixture, references.md (derived)
constexpr double mars_gamma = 1.29;                // references.md (from memory)

}  // namespace

TEST_CASE(
    "Mars reference density below the join matches the NASA Glenn curve fit "
    "(references.md, derived check values)") {
    const ds::MarsReferenceAtmosphere atmosphere(mars_gas_constant_J_kgK, mars_gamma);
    // Source: references.md, values derived from the NASA Glenn Research Center fit; 1e-3
    // relative (they are given to four figures).
    CHECK(atmosphere.at(0.0).density_kg_m3 == relative(1.503e-2, 1e-3));
    CHECK(atmosphere.at(10000.0).density_kg_m3 == relative(6.503e-3, 1e-3));
    CHECK(atmosphere.at(20000.0).density_kg_m3 == relative(2.930e-3, 1e-3));
    CHECK(atmosphere.at(40000.0).density_kg_m3 == relative(6.179e-4, 1e-3));
}

TEST_CASE("Mars reference temperature matches the NASA Glenn curve fit (hand values)") {
    const ds::MarsReferenceAtmosphere atmosphere(mars_gas_constant_J_kgK, mars_gamma);
    // Source: the fit's formulas by hand: -31 + 273.1 = 242.1 K at 0 m;
    // -23.4 - 0.00222 x 10000 + 273.1 = 227.5 K at 10 km; -112.2 + 273.1 = 160.9 K at 40 km.
    CHECK(atmosphere.at(0.0).temperature_K == relative(242.1, 1e-9));
    CHECK(atmosphere.at(10000.0).temperature_K == relative(227.5, 1e-9));
    CHECK(atmosphere.at(40000.0).temperature_K == relative(160.9, 1e-9));
    // Below 0 m the fit applies as is: -31 + 0.998 + 273.1 = 243.098 K at -1 km.
    CHECK(atmosphere.at(-1000.0).temperature_K == relative(243.098, 1e-9));
}

TEST_CASE(
    "Mars reference is continuous in density and temperature at the join "
    "(construction of mars_reference.hpp)") {
    const ds::MarsReferenceAtmosphere atmosphere(mars_gas_constant_J_kgK, mars_gamma);
    const double join_m = ds::MarsReferenceAtmosphere::join_altitude_m;
    // A 1e-6 m step each side changes ln rho by about 1e-10, inside the 1e-9 tolerance.
    const double step_m = 1e-6;
    const ds::AtmosphereSample below = atmosphere.at(join_m - step_m);
    const ds::AtmosphereSample above = atmosphere.at(join_m + step_m);
    // Source: continuity by construction; 1e-9 relative.
    CHECK(above.density_kg_m3 == relative(below.density_kg_m3, 1e-9));
    CHECK(above.temperature_K == relative(below.temperature_K, 1e-9));
}

TEST_CASE(
    "Mars reference above the join is isothermal with scale height R T_join / g "
    "(hydrostatics; NASA NSSDC Mars GM and mean radius)") {
    const ds::MarsReferenceAtmosphere atmosphere(mars_gas_constant_J_kgK, mars_gamma);
    // Source: derived. g = 4.2828e13 / (3389.5e3)^2 = 3.72783 m/s^2 (NSSDC, references.md);
    // the fit's R = 192.1 J/(kg K); T_join = 160.9 K; d(ln rho)/dh = -g / (R T_join).
    const double g_m_s2 = 4.2828e13 / (3389.5e3 * 3389.5e3);
    const double expected_per_m = -g_m_s2 / (192.1 * 160.9);
    CHECK(atmosphere.log_density_slope_per_m(80000.0) == relative(expected_per_m, 1e-6));
    CHECK(atmosphere.at(125000.0).temperature_K == relative(160.9, 1e-9));
}

TEST_CASE(
    "Mars reference temperature stays positive and density falls from -5 to 150 km "
    "(the reason for the continuation, references.md)") {
    const ds::MarsReferenceAtmosphere atmosphere(mars_gas_constant_J_kgK, mars_gamma);
    double previous_density = atmosphere.at(-5000.0).density_kg_m3;
    for (double h = -4000.0; h <= 150000.0; h += 1000.0) {
        CAPTURE(h);
        const ds::AtmosphereSample sample = atmosphere.at(h);
        CHECK(sample.temperature_K > 0.0);
        CHECK(std::isfinite(sample.speed_of_sound_m_s));
        CHECK(sample.density_kg_m3 > 0.0);
        CHECK(sample.density_kg_m3 < previous_density);
        previous_density = sample.density_kg_m3;
    }
}
