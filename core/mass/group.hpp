#pragma once

namespace ds {

/// When an item leaves the vehicle: what the mass budget groups it by.
enum class MassGroup {
    heat_shield,    ///< dropped at heat-shield jettison
    backshell,      ///< dropped at backshell separation (with the parachute)
    descent_stage,  ///< carries the payload down; lands with it (retro, none) or not
    payload,        ///< what is landed
};

}  // namespace ds
