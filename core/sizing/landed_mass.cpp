#include "sizing/landed_mass.hpp"

namespace ds {

bool descent_stage_lands(TerminalMethod method) {
    switch (method) {
        case TerminalMethod::retro:
        case TerminalMethod::none:
        case TerminalMethod::supersonic_retro:
            return true;
        case TerminalMethod::airbag:
        case TerminalMethod::tethered:
            return false;
    }
    return true;
}

bool backshell_separates(TerminalMethod method) {
    return method != TerminalMethod::none && method != TerminalMethod::supersonic_retro;
}

double landed_mass_kg(TerminalMethod method, double lander_kg, double burned_kg,
                      double descent_stage_kg, double backshell_kg) {
    const double kept = backshell_separates(method) ? 0.0 : backshell_kg;
    return (descent_stage_lands(method) ? lander_kg - burned_kg : lander_kg - descent_stage_kg) +
           kept;
}

}  // namespace ds
