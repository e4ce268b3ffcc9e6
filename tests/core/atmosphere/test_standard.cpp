#include <doctest/doctest.h>

#include <cmath>
#include <initializer_list>
#include <memory>

#include "atmosphere/standard.hpp"
#include "support/atmosphere_checks.hpp"

namespace {

using ds::test::relative;

// Any gas: the presets other than Earth must pass it through to the speed of sound.
constexpr double test_gas_constant_J_kgK = 191.8;
constexpr double test_gamma = 1.29;

/// The standard atmosphere of a preset, with the test's gas; the test stops if there is none.
std::unique_ptr<ds::Atmosphere> preset(const char* name, double density_scale = 1.0) {
    auto atmosphere =
        ds::standard_atmosphere(name, test_gas_constant_J_kgK, test_gamma, density_scale);
    REQUIRE(atmosphere != nullptr);
    return atmosphere;
}

}  // namespace

TEST_CASE(
    "standard atmosphere for earth is the US Standard Atmosphere 1976 with its own gas "
    "(NOAA/NASA/USAF 1976, references.md)") {
    const auto atmosphere = preset("earth");
    // Source: references.md, rho(10 km) = 0.41351 kg/m^3; 1e-4 relative.
    CHECK(atmosphere->at(10000.0).density_kg_m3 == relative(0.41351, 1e-4));
    // Source: derived from the standard's constants, 340.294 m/s at sea level: air's gas, not
    // the one passed in.
    CHECK(atmosphere->at(0.0).speed_of_sound_m_s == relative(340.294, 1e-6));
}

TEST_CASE(
    "standard atmosphere for mars is the Mars reference profile (NASA Glenn fit, "
    "references.md)") {
    const auto atmosphere = preset("mars");
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
    const auto venus = preset("venus");
    // Source: VIRA rows at 0 and 50 km, to their printed figures (four, and 0.1 K).
    CHECK(venus->at(0.0).density_kg_m3 == relative(64.79, 1e-4));
    ds::test::check_published_row(*venus, {50000.0, 350.5, 0.05, 1.594, 5e-4});
    // The speed of sound uses the gas passed in: sqrt(1.29 x 191.8 x 350.5).
    CHECK(venus->at(50000.0).speed_of_sound_m_s ==
          relative(std::sqrt(test_gamma * test_gas_constant_J_kgK * 350.5), 1e-9));

    const auto titan = preset("titan");
    // Source: the Titan rows at 0 and 200 km, to their printed figures (four, and 0.01 K).
    CHECK(titan->at(0.0).density_kg_m3 == relative(5.270, 1e-4));
    ds::test::check_published_row(*titan, {200000.0, 173.76, 0.005, 1.393e-3, 5e-4});
}

TEST_CASE("standard atmosphere passes the density scale to every preset (design-file.md)") {
    for (const char* name : {"earth", "mars", "venus", "titan"}) {
        CAPTURE(name);
        const auto nominal = preset(name);
        const auto scaled = preset(name, 1.2);
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
