#include <doctest/doctest.h>

#include <cmath>
#include <initializer_list>
#include <stdexcept>
#include <vector>

#include "atmosphere/table.hpp"
#include "support/atmosphere_checks.hpp"

namespace {

using ds::test::relative;

constexpr double gas_constant_J_kgK = 188.9;  // CO2, references.md (derived)
constexpr double gamma_co2 = 1.29;            // references.md (from memory)

// A made-up three-row table; the expected values follow from the interpolation rule stated in
// table.hpp (log-linear density, linear temperature), computed by hand.
std::vector<ds::AtmosphereRow> three_rows() {
    return {{0.0, 0.020, 210.0}, {10000.0, 0.008, 200.0}, {30000.0, 0.001, 180.0}};
}

}  // namespace

TEST_CASE("table returns its rows exactly at the nodes (table.hpp interpolation rule)") {
    const ds::TableAtmosphere table(three_rows(), gas_constant_J_kgK, gamma_co2);
    for (const ds::AtmosphereRow& row : three_rows()) {
        CAPTURE(row.altitude_m);
        // Source: the rows themselves; 1e-12 relative for rounding at the last node.
        CHECK(table.at(row.altitude_m).density_kg_m3 == relative(row.density_kg_m3, 1e-12));
        CHECK(table.at(row.altitude_m).temperature_K == relative(row.temperature_K, 1e-12));
    }
    CHECK(table.lowest_altitude_m() == 0.0);
    CHECK(table.highest_altitude_m() == 30000.0);
}

TEST_CASE(
    "table density at a segment midpoint is the geometric mean, temperature the "
    "arithmetic mean (log-linear rule, hand values)") {
    const ds::TableAtmosphere table(three_rows(), gas_constant_J_kgK, gamma_co2);
    // Source: hand values sqrt(0.020 x 0.008) and sqrt(0.008 x 0.001); (210 + 200)/2 etc.
    CHECK(table.at(5000.0).density_kg_m3 == relative(std::sqrt(0.020 * 0.008), 1e-12));
    CHECK(table.at(5000.0).temperature_K == relative(205.0, 1e-12));
    CHECK(table.at(20000.0).density_kg_m3 == relative(std::sqrt(0.008 * 0.001), 1e-12));
    CHECK(table.at(20000.0).temperature_K == relative(190.0, 1e-12));
}

TEST_CASE(
    "table of an exponential profile reproduces it between nodes (log-linear is exact "
    "for rho0 exp(-h/H))") {
    const double rho0 = 0.020;
    const double scale_height_m = 11100.0;
    std::vector<ds::AtmosphereRow> rows;
    for (double h = 0.0; h <= 120000.0; h += 20000.0) {
        rows.push_back({h, rho0 * std::exp(-h / scale_height_m), 210.0});
    }
    const ds::TableAtmosphere table(rows, gas_constant_J_kgK, gamma_co2);
    // Source: the exponential's definition; 1e-12 relative for rounding.
    for (const double h : {3700.0, 51234.5, 119999.0}) {
        CAPTURE(h);
        CHECK(table.at(h).density_kg_m3 == relative(rho0 * std::exp(-h / scale_height_m), 1e-12));
    }
    // Source: d(ln rho)/dh = -1/H within a segment; 1e-6 relative.
    CHECK(table.log_density_slope_per_m(45000.0) == relative(-1.0 / scale_height_m, 1e-6));
}

TEST_CASE("table extends its end segments below and above the rows (table.hpp, hand values)") {
    const ds::TableAtmosphere table(three_rows(), gas_constant_J_kgK, gamma_co2);
    // Source: hand values. Below: first segment, f = -0.5: 0.020 (0.4)^-0.5, 210 + 0.5 x 10.
    CHECK(table.at(-5000.0).density_kg_m3 == relative(0.020 / std::sqrt(0.4), 1e-12));
    CHECK(table.at(-5000.0).temperature_K == relative(215.0, 1e-12));
    // Above: last segment, f = 1.5: 0.008 (0.125)^1.5, 200 - 1.5 x 20.
    CHECK(table.at(40000.0).density_kg_m3 == relative(0.008 * std::pow(0.125, 1.5), 1e-12));
    CHECK(table.at(40000.0).temperature_K == relative(170.0, 1e-12));
}

TEST_CASE(
    "table rejects altitudes that do not increase strictly, naming the row "
    "(table.hpp contract)") {
    std::vector<ds::AtmosphereRow> decreasing = three_rows();
    decreasing.push_back({25000.0, 0.0005, 170.0});
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(decreasing, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("row 3: altitudes must increase strictly"),
                         std::invalid_argument);

    std::vector<ds::AtmosphereRow> repeated = three_rows();
    repeated[1].altitude_m = 0.0;
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(repeated, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("row 1: altitudes must increase strictly"),
                         std::invalid_argument);
}

TEST_CASE("table rejects fewer than two rows (table.hpp contract)") {
    const std::vector<ds::AtmosphereRow> single{{0.0, 0.020, 210.0}};
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(single, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("at least 2 rows"), std::invalid_argument);
    CHECK_THROWS_AS(ds::TableAtmosphere({}, gas_constant_J_kgK, gamma_co2), std::invalid_argument);
}

TEST_CASE(
    "table rejects a density or temperature that is not positive and finite, naming the "
    "row (table.hpp contract)") {
    std::vector<ds::AtmosphereRow> zero_density = three_rows();
    zero_density[2].density_kg_m3 = 0.0;
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(zero_density, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("row 2: density"), std::invalid_argument);

    std::vector<ds::AtmosphereRow> negative_density = three_rows();
    negative_density[0].density_kg_m3 = -0.01;
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(negative_density, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("row 0: density"), std::invalid_argument);

    std::vector<ds::AtmosphereRow> nan_temperature = three_rows();
    nan_temperature[1].temperature_K = std::nan("");
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(nan_temperature, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("row 1: temperature"), std::invalid_argument);

    std::vector<ds::AtmosphereRow> zero_temperature = three_rows();
    zero_temperature[2].temperature_K = 0.0;
    CHECK_THROWS_WITH_AS(ds::TableAtmosphere(zero_temperature, gas_constant_J_kgK, gamma_co2),
                         doctest::Contains("row 2: temperature"), std::invalid_argument);
}
