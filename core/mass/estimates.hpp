#pragma once

namespace ds {

/// Mass-estimating relations for what the designer has not itemised. Each is a rule of thumb
/// for conceptual design (common practice; the values are from memory): replace the estimate
/// with the item's own mass as soon as it has one.
struct MassEstimates {
    /// Heat-shield structure (carrier, without TPS) per m^2 of frontal area.
    static constexpr double heat_shield_structure_kg_m2 = 10.0;
    /// Backshell (structure, its TPS, separation hardware) per m^2 of aeroshell frontal area.
    static constexpr double backshell_kg_m2 = 9.0;
    /// Inflatable decelerator (envelope, inflation system) per m^2 of its frontal area.
    static constexpr double inflatable_decelerator_kg_m2 = 2.5;
    /// Propellant tanks and pressurisation over loaded propellant.
    static constexpr double tank_fraction = 0.12;
    /// Engines and feed system per newton of full thrust.
    static constexpr double engine_kg_per_N = 0.003;
    /// Airbag system over the mass it protects.
    static constexpr double airbag_fraction = 0.25;
    /// Subsonic drag coefficient of the vehicle under the canopy (backshell with lander, or
    /// entry vehicle), on the aeroshell's frontal area.
    static constexpr double suspended_body_drag_coefficient = 0.8;
};

/// Where an estimate comes from, for the mass budget's "source" column.
inline constexpr const char* estimate_source = "estimate (common practice, from memory)";

}  // namespace ds
