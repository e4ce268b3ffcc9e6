#include <cmath>

#include <doctest/doctest.h>

#include "heating/heat_shield_mass.hpp"
#include "heating/sutton_graves.hpp"
#include "heating/tauber_sutton.hpp"

TEST_CASE(
    "Sutton-Graves by hand: CO2, rho 1e-4, Rn 0.65 m, 5 km/s gives 29.50 W/cm^2 (NASA TR R-376)") {
    // k = 1.9027e-4; sqrt(1e-4 / 0.65) = 1.24035e-2; V^3 = 1.25e11: 2.9502e5 W/m^2.
    const double q = ds::sutton_graves_heat_flux_W_m2(1.9027e-4, 1e-4, 0.65, 5000.0);
    CHECK(q == doctest::Approx(1.9027e-4 * std::sqrt(1e-4 / 0.65) * 1.25e11).epsilon(1e-14));
    CHECK(q * 1e-4 == doctest::Approx(29.50).epsilon(1e-3));
}

TEST_CASE("Sutton-Graves scales as V^3, sqrt(rho) and 1/sqrt(Rn) (NASA TR R-376 form)") {
    const double base = ds::sutton_graves_heat_flux_W_m2(1.7415e-4, 1e-3, 1.0, 7000.0);
    CHECK(ds::sutton_graves_heat_flux_W_m2(1.7415e-4, 1e-3, 1.0, 14000.0) / base ==
          doctest::Approx(8.0).epsilon(1e-14));
    CHECK(ds::sutton_graves_heat_flux_W_m2(1.7415e-4, 4e-3, 1.0, 7000.0) / base ==
          doctest::Approx(2.0).epsilon(1e-14));
    CHECK(ds::sutton_graves_heat_flux_W_m2(1.7415e-4, 1e-3, 4.0, 7000.0) / base ==
          doctest::Approx(0.5).epsilon(1e-14));
}

TEST_CASE("Tauber-Sutton radiative heating is zero below its table and for other bodies") {
    CHECK(ds::tauber_sutton_heat_flux_W_m2("mars", 1e-3, 1.0, 5500.0) == 0.0);
    CHECK(ds::tauber_sutton_heat_flux_W_m2("earth", 1e-3, 1.0, 8000.0) == 0.0);
    CHECK(ds::tauber_sutton_heat_flux_W_m2("", 1e-3, 1.0, 12000.0) == 0.0);
}

TEST_CASE("Tauber-Sutton Mars by hand at a table node: 7000 m/s, rho 1e-4, Rn 1 m (from memory)") {
    // q_r = 2.35e4 * 1^0.526 * (1e-4)^1.19 * f(7000) = 8.1 -> 3.30 W/cm^2 (constants from memory).
    const double q = ds::tauber_sutton_heat_flux_W_m2("mars", 1e-4, 1.0, 7000.0);
    CHECK(q * 1e-4 == doctest::Approx(2.35e4 * std::pow(1e-4, 1.19) * 8.1).epsilon(1e-12));
}

TEST_CASE("Tauber-Sutton grows with velocity and density") {
    const double slow = ds::tauber_sutton_heat_flux_W_m2("earth", 3e-4, 1.0, 10000.0);
    const double fast = ds::tauber_sutton_heat_flux_W_m2("earth", 3e-4, 1.0, 12000.0);
    const double dense = ds::tauber_sutton_heat_flux_W_m2("earth", 6e-4, 1.0, 10000.0);
    CHECK(slow > 0.0);
    CHECK(fast > 5.0 * slow);  // f(12000) / f(10000) = 359 / 35 (from memory)
    CHECK(dense > slow);
}

TEST_CASE("heat-shield mass fraction by hand: 0.091 Q^0.51575 % at 1000 J/cm^2 is 3.21 %") {
    // Laub and Venkatapathy (2003), constants from memory: 0.091 * 1000^0.51575 = 3.2084 %.
    CHECK(ds::heat_shield_mass_fraction(1000.0) == doctest::Approx(0.032084).epsilon(1e-4));
    CHECK(ds::heat_shield_mass_fraction(0.0) == 0.0);
    CHECK(ds::heat_shield_mass_fraction(4000.0) > ds::heat_shield_mass_fraction(1000.0));
}
