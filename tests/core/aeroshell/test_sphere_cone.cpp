#include <cmath>

#include <doctest/doctest.h>

#include "aeroshell/sphere_cone.hpp"
#include "constants.hpp"

using ds::degrees_to_radians;

TEST_CASE("Newtonian Cd of a 70 deg sphere-cone with bluntness 0.5 is 1.7695 (closed form)") {
    // Closed form Cd = (1 - sin^4 d) e^2 + 2 sin^2 d (1 - e^2 cos^2 d), evaluated by hand.
    CHECK(ds::newtonian_sphere_cone_drag_coefficient(degrees_to_radians(70.0), 0.5) ==
          doctest::Approx(1.7695).epsilon(5e-5));
}

TEST_CASE("Newtonian Cd limits: a sharp cone gives 2 sin^2 d, a hemisphere 1 (Newtonian theory)") {
    const double d = degrees_to_radians(45.0);
    CHECK(ds::newtonian_sphere_cone_drag_coefficient(d, 0.0) ==
          doctest::Approx(2.0 * std::sin(d) * std::sin(d)).epsilon(1e-14));
    CHECK(ds::newtonian_sphere_cone_drag_coefficient(0.0, 1.0) ==
          doctest::Approx(1.0).epsilon(1e-14));
    // A flat disk (d = 90 deg) has Newtonian Cd 2 whatever its small bluntness.
    CHECK(ds::newtonian_sphere_cone_drag_coefficient(degrees_to_radians(90.0), 0.0) ==
          doctest::Approx(2.0).epsilon(1e-14));
}

TEST_CASE("Cp_max at Mach infinity: 1.839 for gamma 1.4 and 1.877 for gamma 1.29 (derived)") {
    // Derived from the Rayleigh pitot formula's hypersonic limit (references: 1.838, 1.876).
    CHECK(ds::stagnation_pressure_coefficient_limit(1.4) == doctest::Approx(1.8394).epsilon(1e-4));
    CHECK(ds::stagnation_pressure_coefficient_limit(1.29) == doctest::Approx(1.8770).epsilon(1e-4));
}

TEST_CASE("Cp_max at Mach 2 in air is 1.656 and tends to its limit at high Mach (NACA 1135)") {
    // p02/p1 = 5.640 at M = 2, gamma = 1.4 (NACA Report 1135 normal-shock table, from memory):
    // Cp = (5.640 - 1) / (0.7 * 4) = 1.657.
    CHECK(ds::stagnation_pressure_coefficient(1.4, 2.0) == doctest::Approx(1.657).epsilon(2e-3));
    CHECK(ds::stagnation_pressure_coefficient(1.4, 1e4) ==
          doctest::Approx(ds::stagnation_pressure_coefficient_limit(1.4)).epsilon(1e-6));
}

TEST_CASE("Cp_max below Mach 1 is the isentropic compression: 1.064 at Mach 0.5 (NACA 1135)") {
    // p/p0 = 0.8430 at M = 0.5, gamma = 1.4 (NACA Report 1135 isentropic table, from memory):
    // Cp = (1 / 0.8430 - 1) / (0.7 * 0.25) = 1.0641.
    CHECK(ds::stagnation_pressure_coefficient_at(1.4, 0.5) ==
          doctest::Approx(1.0641).epsilon(5e-4));
    // Incompressible limit: the stagnation pressure is the dynamic pressure (Bernoulli).
    CHECK(ds::stagnation_pressure_coefficient_at(1.4, 0.0) == doctest::Approx(1.0).epsilon(1e-15));
    CHECK(ds::stagnation_pressure_coefficient_at(1.29, 1e-2) ==
          doctest::Approx(1.0 + 0.25e-4).epsilon(1e-7));
    // The normal shock vanishes at Mach 1: the two branches meet there.
    CHECK(ds::stagnation_pressure_coefficient_at(1.29, 1.0 - 1e-9) ==
          doctest::Approx(ds::stagnation_pressure_coefficient(1.29, 1.0)).epsilon(1e-8));
    // Above Mach 1 it is the Rayleigh pitot formula.
    CHECK(ds::stagnation_pressure_coefficient_at(1.4, 2.0) ==
          ds::stagnation_pressure_coefficient(1.4, 2.0));
    CHECK(std::isnan(ds::stagnation_pressure_coefficient_at(1.4, std::nan(""))));
}

TEST_CASE("the blunt body's Mach law: Cd(M) / Cd(hypersonic) = Cp_max(M) / Cp_max(infinity)") {
    // 1.657 / 1.839 at Mach 2 in air (the two values above); 1 at high Mach; rising with Mach.
    CHECK(ds::stagnation_pressure_ratio_to_limit(1.4, 2.0) ==
          doctest::Approx(1.657 / 1.8394).epsilon(2e-3));
    CHECK(ds::stagnation_pressure_ratio_to_limit(1.29, 30.0) == doctest::Approx(1.0).epsilon(2e-3));
    double previous = 0.0;
    for (double mach = 0.1; mach < 10.0; mach += 0.1) {
        const double ratio = ds::stagnation_pressure_ratio_to_limit(1.29, mach);
        CHECK(ratio > previous);
        CHECK(ratio < 1.0);
        previous = ratio;
    }
}

TEST_CASE("modified Newtonian Cd of a 70 deg, e = 0.5 cone lies in the published 1.63-1.69 band") {
    // references.md: modified Newtonian 1.63-1.69 for 70 deg, e = 0.5 (derived); published
    // hypersonic Cd of 70 deg sphere-cones in CO2 about 1.65-1.70 (from memory).
    const double cd_co2 =
        ds::modified_newtonian_sphere_cone_drag_coefficient(degrees_to_radians(70.0), 0.5, 1.29);
    const double cd_air =
        ds::modified_newtonian_sphere_cone_drag_coefficient(degrees_to_radians(70.0), 0.5, 1.4);
    CHECK(cd_co2 == doctest::Approx(1.7695 * 1.8770 / 2.0).epsilon(1e-4));
    CHECK(cd_co2 > 1.63);
    CHECK(cd_co2 < 1.69);
    // CO2 above air by about 2 % (Sammonds and Kruse 1975 measured about 3 %).
    CHECK(cd_co2 / cd_air == doctest::Approx(1.0204).epsilon(1e-3));
}

TEST_CASE("ballistic coefficient and frontal area by hand") {
    CHECK(ds::frontal_area_m2(2.0) == doctest::Approx(M_PI).epsilon(1e-15));
    // 560 kg, Cd 1.65, 2.6 m: 560 / (1.65 * 5.3093) = 63.92 kg/m^2.
    CHECK(ds::ballistic_coefficient_kg_m2(560.0, 1.65, ds::frontal_area_m2(2.6)) ==
          doctest::Approx(63.924).epsilon(1e-4));
}

TEST_CASE("sizing for a ballistic coefficient: constant Cd gives D = sqrt(4 m / (pi Cd beta))") {
    const double d =
        ds::diameter_for_ballistic_coefficient(560.0, 60.0, 0.1, [](double) { return 1.65; });
    CHECK(d == doctest::Approx(std::sqrt(4.0 * 560.0 / (M_PI * 1.65 * 60.0))).epsilon(1e-9));
}

TEST_CASE("sizing for a ballistic coefficient with a fixed nose radius meets the target") {
    const double half = degrees_to_radians(70.0);
    const double nose = 0.65;
    const auto cd_of = [&](double d) {
        return ds::modified_newtonian_sphere_cone_drag_coefficient(half, nose / (0.5 * d), 1.29);
    };
    const double d = ds::diameter_for_ballistic_coefficient(900.0, 80.0, 2.0 * nose, cd_of);
    REQUIRE(d > 2.0 * nose);
    CHECK(ds::ballistic_coefficient_kg_m2(900.0, cd_of(d), ds::frontal_area_m2(d)) ==
          doctest::Approx(80.0).epsilon(1e-8));
}

TEST_CASE("sizing for an unreachable ballistic coefficient returns 0") {
    // 1 kg cannot reach 100 kg/m^2 with a diameter of at least 1 m.
    CHECK(ds::diameter_for_ballistic_coefficient(1.0, 100.0, 1.0, [](double) { return 1.0; }) ==
          0.0);
}

TEST_CASE("the SphereCone bluntness is the nose radius over the base radius") {
    const ds::SphereCone shell{2.6, degrees_to_radians(70.0), 0.65};
    CHECK(shell.bluntness() == doctest::Approx(0.5).epsilon(1e-15));
}

TEST_CASE(
    "the SphereCone frontal area is pi D^2 / 4: 5.3093 m^2 at 2.6 m, 0.7854 m^2 at 1 m (by hand)") {
    // pi * 2.6^2 / 4 = pi * 1.69 = 5.30929 m^2; pi / 4 = 0.785398 m^2.
    CHECK(ds::SphereCone{2.6, degrees_to_radians(70.0), 0.65}.frontal_area() ==
          doctest::Approx(5.30929).epsilon(1e-5));
    CHECK(ds::SphereCone{1.0, degrees_to_radians(45.0), 0.1}.frontal_area() ==
          doctest::Approx(0.785398).epsilon(1e-5));
}
