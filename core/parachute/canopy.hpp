#pragma once

#include <optional>
#include <span>
#include <string_view>

#include "flight/stage.hpp"

namespace ds {

/// A parachute type's data, referred to the nominal area S0 = pi D0^2 / 4.
struct CanopyType {
    std::string_view name;
    double drag_coefficient = 0.0;           ///< subsonic, fully open
    std::span<const MachPoint> mach_factor;  ///< Cd / subsonic Cd against Mach
    double opening_load_factor = 0.0;        ///< peak opening force over q Cd S0 (infinite mass)
    double fill_constant = 0.0;              ///< inflation time = n D0 / V
    double areal_mass_kg_m2 = 0.0;           ///< canopy, lines, riser and bag per m^2 of S0
    std::string_view source;
    /// A supersonic canopy (with its drag against Mach); a subsonic one (ringsail) is held to
    /// a deploy below limits.subsonic_canopy_deploy_mach_max.
    bool supersonic = false;
};

/// The types a design may name.
std::span<const CanopyType> canopy_types();

std::optional<CanopyType> canopy_type(std::string_view name);

/// The drag device of a canopy of nominal diameter D0 and nominal (subsonic) Cd.
DragDevice canopy_device(const CanopyType& type, double diameter_m, double drag_coefficient);

/// Peak opening force: opening load factor x q x Cd(Mach) x S0, N (Knacke, NWC TP 6575).
double opening_load_N(const CanopyType& type, double dynamic_pressure_Pa, double mach,
                      double diameter_m, double drag_coefficient);

/// Inflation time n D0 / V, s (Knacke's fill-constant method, NWC TP 6575).
double inflation_time_s(const CanopyType& type, double diameter_m, double velocity_m_s);

/// Canopy system mass from its areal mass, kg.
double canopy_mass_kg(const CanopyType& type, double diameter_m);

/// The nominal diameter at which the canopy, with what hangs under it, descends at the
/// requested speed: m g = q (Cd S0 + CdA_below), D0 = sqrt(4 S0 / pi). Returns 0 when the
/// suspended body alone already holds the speed.
double canopy_diameter_for_velocity(double suspended_mass_kg, double gravity_m_s2,
                                    double density_kg_m3, double velocity_m_s,
                                    double drag_coefficient, double drag_area_below_m2);

}  // namespace ds
