#include <doctest/doctest.h>

#include "sizing/landed_mass.hpp"

TEST_CASE("the descent stage lands with a retro or canopy lander and stays behind otherwise") {
    CHECK(ds::descent_stage_lands(ds::TerminalMethod::retro));
    CHECK(ds::descent_stage_lands(ds::TerminalMethod::none));
    CHECK_FALSE(ds::descent_stage_lands(ds::TerminalMethod::airbag));
    CHECK_FALSE(ds::descent_stage_lands(ds::TerminalMethod::tethered));
}

TEST_CASE("landed mass of a 500 kg lander burning 30 kg with a 200 kg descent stage, by hand") {
    // Lands whole: 500 - 30 = 470 kg. Leaves the stage (with its propellant): 500 - 200 = 300 kg.
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::retro, 500.0, 30.0, 200.0) == 470.0);
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::none, 500.0, 0.0, 200.0) == 500.0);
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::airbag, 500.0, 30.0, 200.0) == 300.0);
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::tethered, 500.0, 30.0, 200.0) == 300.0);
}
