#pragma once

namespace ds {

/// When an item leaves the vehicle: what the mass budget groups it by.
enum class MassGroup {
    deorbit_stage,  ///< the deorbit burn's stage and its propellant, dropped before entry
    heat_shield,    ///< dropped at heat-shield jettison
    backshell,      ///< dropped at backshell separation (with the parachute)
    descent_stage,  ///< carries the payload down; lands with it (retro, none) or not
    payload,        ///< what is landed
};

/// Whether a group leaves the vehicle before the entry interface: it is not part of the entry
/// mass.
constexpr bool leaves_before_entry(MassGroup group) {
    return group == MassGroup::deorbit_stage;
}

}  // namespace ds
