#pragma once

#include "design/design.hpp"

namespace ds {

/// Whether the descent stage reaches the ground with the payload: it does for `retro` and
/// `none` and `supersonic_retro` (the lander touches down whole); `airbag` drops the payload from
/// it and `tethered` lowers the payload and flies it away.
bool descent_stage_lands(TerminalMethod method);

/// Whether the lander separates from the backshell (which keeps the parachute): it does before
/// every terminal burn; with `none` nothing separates and the vehicle lands on its canopy, the
/// backshell and the parachute with it; nor with `supersonic_retro`, where the whole entry
/// vehicle flies its powered descent and lands.
bool backshell_separates(TerminalMethod method);

/// What reaches the ground: the lander less the propellant it burned when its descent stage
/// lands with it, or less the whole descent stage (items, tanks, engines and loaded propellant,
/// airbags excepted) when it does not; with the backshell and the parachute (`backshell_kg`,
/// the backshell group) when the lander never separates from them.
double landed_mass_kg(TerminalMethod method, double lander_kg, double burned_kg,
                      double descent_stage_kg, double backshell_kg);

}  // namespace ds
