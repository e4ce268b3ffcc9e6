#include <doctest/doctest.h>

#include <cmath>
#include <initializer_list>

#include "atmosphere/standard.hpp"
#include "support/atmosphere_checks.hpp"

namespace {

using ds::test::relative;

// Any gas: the presets other than Earth must pass it through to the speed of sound.
constexpr double test_gas_constant_J_kgK = 191.8;
constexpr double test_gamma = 1.29;

}  // namespace

TEST_CASE(
    "standard atmosphere for earth is the US Standard Atmosphere 1976 with its own gas "
    "(NOAA/NASA/USAF 1976, references.md)") {
    const auto atmosphere = ds::standard_atmosphere("earth", test_gas_constant_J_kgK, test_gamma);
    REQUIRE(atmosphere != nullptr);
    // Source: references.md, rho(10 km) = 0.41351 kg/m^3; 1e-4 relative.
    CHECK(atmosphere->at(10000.0).density_kg_m3 == relative(0.41351, 1e-4));
    // Source: derived from the standard's constants, 340.294 m/s at sea level: air's gas, not
    // the one passed in.
    CHECK(atmosphere->at(0.0).speed_of_sound_m_s == relative(340.294, 1e-6));
}

TEST_CASE(
    "standard atmosphere for mars is the Mars reference profile (NASA Glenn fit, "
    "references.md)") {
    const auto atmosphere = ds::standard_atmosphere("mars", test_gas_constant_J_kgK, test_gamma);
    REQUIRE(atmosphere != nullptr);
    // Source: references.md, rho(20 km) = 2.930e-3 kg/m^3 (derived); 1e-3 relative.
    CHECK(atmosphere->at(20000.0).density_kg_m3 == relative(2.930e-3, 1e-3));
    // Source: hand value sqrt(1.29 x 191.8 x 242.1) = 244.84 m/s, with the gas passed in.
    CHECK(atmosphere->at(0.0).speed_of_sound_m_s ==
          relative(std::sqrt(test_gamma * test_gas_constant_J_kgK * 242.1), 1e-9));
}

TEST_CASE(
    "standard atmospheres for venus and titan are their published profiles (VIRA, Seiff et "
    "al. 1985; Titan engineering profile, Justus and Braun 2007; both secondary, "
    "references.md)") {
    const auto venus = ds::standard_atmosphere("venus", test_gas_constant_J_kgK, test_gamma);
    REQUIRE(venus != nullptr);
    // Source: VIRA rows at 0 and 50 km, to their printed figures.
    CHECK(venus->at(0.0).density_kg_m3 == relative(64.79, 1e-4));
    CHECK(venus->at(50000.0).density_kg_m3 == relative(1.594, 5e-4));
    CHECK(venus->at(50000.0).temperature_K == relative(350.5, 1e-4));
    // The speed of sound uses the gas passed in: sqrt(1.29 x 191.8 x 350.5).
    CHECK(venus->at(50000.0).speed_of_sound_m_s ==
          relative(std::sqrt(test_gamma * test_gas_constant_J_kgK * 350.5), 1e-9));

    const auto titan = ds::standard_atmosphere("titan", test_gas_constant_J_kgK, test_gamma);
    REQUIRE(titan != nullptr);
    // Source: the Titan rows at 0 and 200 km, to their printed figures.
    CHECK(titan->at(0.0).density_kg_m3 == relative(5.270, 1e-4));
    CHECK(titan->at(200000.0).density_kg_m3 == relative(1.393e-3, 5e-4));
    CHECK(titan->at(200000.0).temperature_K == relative(173.76, 1e-4));
}

TEST_CASE("standard atmosphere passes the density scale to every preset (design-file.md)") {
    for (const char* name : {"earth", "mars", "venus", "titan"}) {
        CAPTURE(name);
        const auto nominal = ds::standard_atmosphere(name, test_gas_constant_J_kgK, test_gamma);
        const auto scaled = ds::standard_atmosphere(name, test_gas_constant_J_kgK, test_gamma, 1.2);
        REQUIRE(nominal != nullptr);
        REQUIRE(scaled != nullptr);
        // Source: design-file.md, density_scale multiplies the density of any model.
        CHECK(scaled->at(30000.0).density_kg_m3 ==
              relative(1.2 * nominal->at(30000.0).density_kg_m3, 1e-12));
    }
}

TEST_CASE("standard atmosphere is null for a name without a preset (standard.hpp contract)") {
    CHECK(ds::standard_atmosphere("jupiter", test_gas_constant_J_kgK, test_gamma) == nullptr);
    CHECK(ds::standard_atmosphere("", test_gas_constant_J_kgK, test_gamma) == nullptr);
    CHECK(ds::standard_atmosphere("Mars", test_gas_constant_J_kgK, test_gamma) == nullptr);
}
