#include <doctest/doctest.h>

#include "sizing/landed_mass.hpp"

TEST_CASE("the descent stage lands with a retro or canopy lander and stays behind otherwise") {
    CHECK(ds::descent_stage_lands(ds::TerminalMethod::retro));
    CHECK(ds::descent_stage_lands(ds::TerminalMethod::none));
    CHECK_FALSE(ds::descent_stage_lands(ds::TerminalMethod::airbag));
    CHECK_FALSE(ds::descent_stage_lands(ds::TerminalMethod::tethered));
}

TEST_CASE("only a lander that lands on its canopy keeps the backshell and the parachute") {
    CHECK(ds::backshell_separates(ds::TerminalMethod::retro));
    CHECK(ds::backshell_separates(ds::TerminalMethod::airbag));
    CHECK(ds::backshell_separates(ds::TerminalMethod::tethered));
    CHECK_FALSE(ds::backshell_separates(ds::TerminalMethod::none));
}

TEST_CASE("landed mass of a 500 kg lander burning 30 kg with a 200 kg descent stage, by hand") {
    // Lands whole: 500 - 30 = 470 kg. Leaves the stage (with its propellant): 500 - 200 = 300 kg.
    // The 80 kg backshell (with the parachute) separates before a burn and is not landed.
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::retro, 500.0, 30.0, 200.0, 80.0) == 470.0);
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::airbag, 500.0, 30.0, 200.0, 80.0) == 300.0);
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::tethered, 500.0, 30.0, 200.0, 80.0) == 300.0);
    // Guards the canopy landing: nothing separates, so 500 + 80 = 580 kg lands (it was 500).
    CHECK(ds::landed_mass_kg(ds::TerminalMethod::none, 500.0, 0.0, 200.0, 80.0) == 580.0);
}
