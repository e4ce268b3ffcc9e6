#include <cmath>

#include <doctest/doctest.h>

#include "parachute/canopy.hpp"

TEST_CASE("terminal-velocity balance by hand: the sized canopy's drag equals the weight") {
    // 400 kg on Mars (3.71 m/s^2) at rho 0.012 kg/m^3, 70 m/s, Cd 0.55, 4 m^2 of body drag area.
    const double d = ds::canopy_diameter_for_velocity(400.0, 3.71, 0.012, 70.0, 0.55, 4.0);
    const double drag = 0.5 * 0.012 * 70.0 * 70.0 * (0.55 * M_PI * d * d / 4.0 + 4.0);
    CHECK(drag == doctest::Approx(400.0 * 3.71).epsilon(1e-12));
    // Without the body's drag the canopy must be larger.
    CHECK(ds::canopy_diameter_for_velocity(400.0, 3.71, 0.012, 70.0, 0.55, 0.0) > d);
}

TEST_CASE("no canopy is needed when the body alone holds the speed") {
    CHECK(ds::canopy_diameter_for_velocity(1.0, 3.71, 0.012, 70.0, 0.55, 100.0) == 0.0);
}

TEST_CASE("disk-gap-band Cd stays in the published bands across Mach (AGARD-AG-319; Lingard)") {
    const auto dgb = *ds::canopy_type("disk-gap-band");
    const ds::DragDevice canopy = ds::canopy_device(dgb, 12.0, dgb.drag_coefficient);
    // Subsonic 0.53-0.58 (AGARD-AG-319); supersonic 0.3-0.5 (Lingard).
    CHECK(canopy.drag_coefficient_at(0.5) >= 0.53);
    CHECK(canopy.drag_coefficient_at(0.5) <= 0.58);
    for (const double mach : {1.4, 1.8, 2.0, 2.3}) {
        CAPTURE(mach);
        CHECK(canopy.drag_coefficient_at(mach) >= 0.30);
        CHECK(canopy.drag_coefficient_at(mach) <= 0.50);
    }
    // Interpolated linearly between table points: Mach 1.8 is halfway from 0.84 to 0.78.
    CHECK(canopy.drag_coefficient_at(1.8) == doctest::Approx(0.55 * 0.81).epsilon(1e-12));
}

TEST_CASE("opening load is the opening-load factor times q Cd(Mach) S0 (Knacke, NWC TP 6575)") {
    const auto dgb = *ds::canopy_type("disk-gap-band");
    const double s0 = M_PI * 12.0 * 12.0 / 4.0;
    CHECK(ds::opening_load_N(dgb, 500.0, 0.5, 12.0, 0.55) ==
          doctest::Approx(1.3 * 500.0 * 0.55 * s0).epsilon(1e-12));
    CHECK(ds::opening_load_N(dgb, 500.0, 2.0, 12.0, 0.55) ==
          doctest::Approx(1.3 * 500.0 * 0.55 * 0.78 * s0).epsilon(1e-12));
}

TEST_CASE("inflation time n D / V and canopy mass by area") {
    const auto ringsail = *ds::canopy_type("ringsail");
    CHECK(ds::inflation_time_s(ringsail, 20.0, 100.0) == doctest::Approx(7.0 * 0.2).epsilon(1e-12));
    CHECK(ds::canopy_mass_kg(ringsail, 20.0) ==
          doctest::Approx(0.15 * M_PI * 100.0).epsilon(1e-12));
    CHECK_FALSE(ds::canopy_type("umbrella"));
}
