#pragma once

namespace ds {

/// The limits the checks compare against. Defaults are the heritage envelope for a soft
/// landing on Mars with today's technology (Braun and Manning, J. Spacecraft and Rockets
/// 44(2), 2007, and common practice); every one can be overridden in a design's "limits".
/// The envelope limits other than the fairing's are checked for Mars designs only.
struct Limits {
    /// Above this the design leaves the heritage envelope (common practice).
    double ballistic_coefficient_max_kg_m2 = 150.0;
    /// Launcher fairing allows about 4.5-4.6 m (Braun and Manning 2007; common practice).
    double aeroshell_diameter_max_m = 4.6;
    /// Heritage aeroshells are 70 deg sphere-cones (Braun and Manning 2007).
    double heritage_half_angle_deg = 70.0;
    /// Heritage supersonic parachutes stay below about 30 m (Braun and Manning 2007).
    double parachute_diameter_max_m = 30.0;
    /// Heritage deploy window: Mach up to about 2.1, 250-850 Pa (common practice).
    double deploy_mach_max = 2.1;
    double deploy_dynamic_pressure_min_Pa = 250.0;
    double deploy_dynamic_pressure_max_Pa = 850.0;
    /// The payload's qualified load; 15 g is our default for a science payload (common
    /// practice: set it to the payload's own qualification level).
    double peak_deceleration_max_g = 15.0;
    /// The heat-shield material's qualified stagnation heat flux; 200 W/cm^2 is our default
    /// for a low-density ablator (common practice: set it to the material's test data).
    double peak_heat_flux_max_W_cm2 = 200.0;
    /// Heritage landing sites lie below about -1 km on the reference (Braun and Manning 2007).
    double site_elevation_max_m = -1000.0;
    /// Heritage landed mass for Mars soft landing about 0.6 t (Braun and Manning 2007).
    double landed_mass_max_kg = 600.0;
    /// Legged touchdown (retro) or canopy touchdown (none): 3 m/s is our default for landing
    /// legs (common practice: set it to the lander's qualified value).
    double touchdown_velocity_max_m_s = 3.0;
    /// Airbag impact velocity the bags are qualified for; 25 m/s is our default (from memory,
    /// common practice: set it to the bag's test data).
    double airbag_impact_velocity_max_m_s = 25.0;
    /// Horizontal speed at touchdown, by terminal method (the touchdown_horizontal_velocity
    /// check): legs (retro) 1 m/s; at airbag release 20 m/s (from memory); the hovering stage
    /// while the payload is lowered (tethered) 0.5 m/s; a touchdown on the canopy (none) 15 m/s.
    /// Our defaults (common practice: set each to the vehicle's qualified value).
    double touchdown_horizontal_velocity_max_m_s = 1.0;
    double airbag_release_horizontal_velocity_max_m_s = 20.0;
    double tethered_horizontal_velocity_max_m_s = 0.5;
    double canopy_touchdown_horizontal_velocity_max_m_s = 15.0;
    /// The heat shield is jettisoned subsonic and at low dynamic pressure, so that it falls
    /// away cleanly behind the vehicle (common practice: our defaults, Mach 0.9 and 200 Pa;
    /// set them to the separation analysis of the design). Checked on every body.
    double jettison_mach_max = 0.9;
    double jettison_dynamic_pressure_max_Pa = 200.0;
    /// A subsonic canopy type (ringsail) is deployed below this Mach number (common practice:
    /// our default; such canopies have no supersonic qualification). Checked on every body.
    double subsonic_canopy_deploy_mach_max = 1.0;
    /// Timeline margin below this is marginal; below zero fails (common practice).
    double timeline_margin_min_s = 10.0;
    /// A powered descent lit during the entry (supersonic retro-propulsion). Its ignition
    /// envelope: wind-tunnel tests of retro-propulsion into a supersonic flow span about Mach
    /// 2 to 4.6 (from memory), so Mach 4 is our bound; 15 kPa of dynamic pressure at ignition is
    /// our default for the engines' start and the loads on the aeroshell (common practice: set
    /// both to the vehicle's own analysis and test).
    double ignition_mach_max = 4.0;
    double ignition_dynamic_pressure_max_Pa = 15000.0;
    /// Full thrust over the weight at ignition: margin over hovering to steer and to absorb the
    /// gravity losses (common practice).
    double thrust_to_weight_min = 1.5;
    /// Loaded propellant over the entry mass: above about a third the budget grows faster than
    /// what it lands (common practice).
    double propellant_fraction_max = 0.35;
    /// A physics check within this fraction of its limit is "marginal" (common practice).
    double marginal_band = 0.10;

    bool operator==(const Limits&) const = default;
};

}  // namespace ds
