#include <doctest/doctest.h>

#include <cmath>

#include "atmosphere/us_standard_1976.hpp"

namespace {

doctest::Approx relative(double expected, double tolerance) {
    return doctest::Approx(expected).epsilon(tolerance).scale(0.0);
}

// US Standard Atmosphere, 1976 (NOAA/NASA/USAF) at geometric altitudes, as listed in
// references.md ("derived from its constants").
struct StandardPoint {
    double altitude_m;
    double temperature_K;
    double pressure_Pa;
    double density_kg_m3;
};
constexpr StandardPoint standard_points[] = {
    {0.0, 288.150, 101325.0, 1.2250},      {10000.0, 223.252, 26499.9, 0.41351},
    {20000.0, 216.650, 5529.31, 0.088910}, {30000.0, 226.509, 1197.03, 0.018410},
    {50000.0, 270.650, 79.779, 1.0269e-3}, {70000.0, 219.585, 5.2209, 8.2829e-5},
};

constexpr double temperature_tolerance_K = 0.01;
constexpr double pressure_density_relative_tolerance = 1e-4;

}  // namespace

TEST_CASE(
    "temperature matches the US Standard Atmosphere 1976 at 0-70 km "
    "(NOAA/NASA/USAF 1976, references.md)") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    for (const StandardPoint& point : standard_points) {
        CAPTURE(point.altitude_m);
        const double temperature_K = atmosphere.at(point.altitude_m).temperature_K;
        CAPTURE(temperature_K);
        CHECK(std::abs(temperature_K - point.temperature_K) <= temperature_tolerance_K);
    }
}

TEST_CASE(
    "pressure matches the US Standard Atmosphere 1976 at 0-70 km "
    "(NOAA/NASA/USAF 1976, references.md)") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    for (const StandardPoint& point : standard_points) {
        CAPTURE(point.altitude_m);
        CHECK(atmosphere.pressure_Pa(point.altitude_m) ==
              relative(point.pressure_Pa, pressure_density_relative_tolerance));
    }
}

TEST_CASE(
    "density matches the US Standard Atmosphere 1976 at 0-70 km "
    "(NOAA/NASA/USAF 1976, references.md)") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    for (const StandardPoint& point : standard_points) {
        CAPTURE(point.altitude_m);
        CHECK(atmosphere.at(point.altitude_m).density_kg_m3 ==
              relative(point.density_kg_m3, pressure_density_relative_tolerance));
    }
}

TEST_CASE(
    "speed of sound at sea level matches sqrt(gamma R* T0 / M0) of the 1976 standard's "
    "constants") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    // Source: derived from the standard's constants, sqrt(1.4 x 8314.32 / 28.9644 x 288.15)
    // = 340.294 m/s (the standard tabulates 340.294, from memory).
    CHECK(atmosphere.at(0.0).speed_of_sound_m_s == relative(340.294, 1e-6));
    CHECK(atmosphere.gamma() == 1.4);
    // Source: R*/M0 = 8314.32 / 28.9644 J/(kg K), the standard's constants.
    CHECK(atmosphere.gas_constant_J_kgK() == relative(8314.32 / 28.9644, 1e-12));
}

TEST_CASE(
    "below 0 km the first layer of the 1976 standard is extended "
    "(derived from its constants)") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    // Source: derived. Geopotential of -1 km geometric is -1000.157 m', so
    // T = 288.15 + 6.5e-3 x 1000.157 = 294.651 K (the standard tabulates to -5 km).
    CHECK(std::abs(atmosphere.at(-1000.0).temperature_K - 294.651) <= temperature_tolerance_K);
    CHECK(atmosphere.at(-1000.0).density_kg_m3 > atmosphere.at(0.0).density_kg_m3);
    CHECK(atmosphere.pressure_Pa(-1000.0) > 101325.0);
}

TEST_CASE(
    "the 1976 profile is continuous at 86 km where the layer model meets the upper "
    "table (construction of us_standard_1976.cpp)") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    const double top_m = 86000.0;
    const double step_m = 1e-6;
    const ds::AtmosphereSample below = atmosphere.at(top_m);
    const ds::AtmosphereSample above = atmosphere.at(top_m + step_m);
    // Source: continuity by construction; 1e-9 relative leaves room for the 1e-6 m step.
    CHECK(above.density_kg_m3 == relative(below.density_kg_m3, 1e-9));
    CHECK(above.temperature_K == relative(below.temperature_K, 1e-9));
    CHECK(atmosphere.pressure_Pa(top_m + step_m) == relative(atmosphere.pressure_Pa(top_m), 1e-9));
    // Source: the standard's density at 86 km, 6.958e-6 kg/m^3 (from memory, 0.1 %), and its
    // molecular-scale temperature there, 214.65 - 2.0 x (84.852 - 71) = 186.946 K (derived).
    CHECK(below.density_kg_m3 == relative(6.958e-6, 1e-3));
    CHECK(std::abs(below.temperature_K - 186.946) <= temperature_tolerance_K);
}

TEST_CASE(
    "above 86 km density and temperature follow the 1976 standard's tables "
    "(NOAA/NASA/USAF 1976, from memory)") {
    const ds::UsStandardAtmosphere1976 atmosphere;
    // Source: the standard's Table 1, from memory: 2 % on density, 1 % on temperature.
    CHECK(atmosphere.at(100000.0).density_kg_m3 == relative(5.604e-7, 2e-2));
    CHECK(atmosphere.at(120000.0).density_kg_m3 == relative(2.222e-8, 2e-2));
    CHECK(atmosphere.at(150000.0).density_kg_m3 == relative(2.076e-9, 2e-2));
    CHECK(atmosphere.at(120000.0).temperature_K == relative(360.0, 1e-2));
    CHECK(atmosphere.at(150000.0).temperature_K == relative(634.39, 1e-2));
    // Between 86 and 300 km the density falls and the temperature stays positive.
    double previous_density = atmosphere.at(86000.0).density_kg_m3;
    for (double h = 87000.0; h <= 300000.0; h += 1000.0) {
        CAPTURE(h);
        const ds::AtmosphereSample sample = atmosphere.at(h);
        CHECK(sample.density_kg_m3 < previous_density);
        CHECK(sample.temperature_K > 0.0);
        previous_density = sample.density_kg_m3;
    }
}
