#include <cmath>

#include <doctest/doctest.h>

#include "body/body.hpp"
#include "constants.hpp"

TEST_CASE("Mars preset: radius 3389.5 km and GM 4.2828e13 m^3/s^2 (NASA NSSDC fact sheet)") {
    const auto mars = ds::body_preset("mars");
    REQUIRE(mars);
    CHECK(mars->radius_m == 3389.5e3);
    CHECK(mars->mu_m3_s2 == 4.2828e13);
    // Surface gravity GM / R^2 = 3.728 m/s^2 (derived).
    CHECK(mars->gravity_m_s2(0.0) == doctest::Approx(3.7278).epsilon(1e-4));
    // Mars mixture gas constant 8314.46 / 43.34 = 191.8 J/(kg K) (references, derived).
    CHECK(mars->gas.gas_constant_J_kgK == doctest::Approx(191.8).epsilon(1e-3));
    CHECK(mars->gas.sutton_graves_k == 1.9027e-4);
}

TEST_CASE("Earth preset: GM 3.986004418e14 and surface gravity near g0 (WGS 84; standard g0)") {
    const auto earth = ds::body_preset("earth");
    REQUIRE(earth);
    CHECK(earth->mu_m3_s2 == 3.986004418e14);
    CHECK(earth->gravity_m_s2(0.0) == doctest::Approx(ds::standard_gravity_m_s2).epsilon(3e-3));
    CHECK(earth->gas.gas_constant_J_kgK == doctest::Approx(287.05).epsilon(1e-4));
    CHECK(earth->gas.sutton_graves_k == 1.7415e-4);
    // One sidereal day: 2 pi / 86164 s (derived).
    CHECK(earth->rotation_rad_s == doctest::Approx(7.2921e-5).epsilon(1e-4));
}

TEST_CASE("Venus and Titan presets carry the fact-sheet radii (NASA NSSDC)") {
    CHECK(ds::body_preset("venus")->radius_m == 6051.8e3);
    CHECK(ds::body_preset("venus")->mu_m3_s2 == 3.2486e14);
    CHECK(ds::body_preset("titan")->radius_m == 2574.7e3);
    CHECK(ds::body_preset("titan")->mu_m3_s2 == 8.9781e12);
}

TEST_CASE("an unknown body name has no preset, and every listed name has one") {
    CHECK_FALSE(ds::body_preset("vulcan"));
    for (const std::string& name : ds::body_preset_names())
        CHECK(ds::body_preset(name));
}
