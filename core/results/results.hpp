#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "checks/check.hpp"
#include "design/design.hpp"
#include "enum_names.hpp"
#include "flight/trajectory_sample.hpp"
#include "mass/item.hpp"

namespace ds {

/// The results document (design-file.md, version 1) as plain values, SI units throughout.
/// An empty optional is a figure this design did not produce (written as null). Enumerations
/// stay enumerations here; `to_string` gives each one's document name, one table per enum (the
/// design's enums keep theirs in design.hpp, the results' own at the end of this file).

/// The document's "format" and "version" keys.
inline constexpr std::string_view results_format_id = "descent-sizer/results";
inline constexpr int results_format_version = 1;

/// Where the entry's drag coefficient comes from.
enum class DragCoefficientSource {
    design,              ///< "design": aeroshell.drag_coefficient
    modified_newtonian,  ///< "modified Newtonian": the sphere-cone's hypersonic Cd
};

/// The entry state's velocity in one frame.
struct EntryVelocity {
    double velocity_m_s = 0.0;
    double flight_path_angle_deg = 0.0;
    double azimuth_deg = 0.0;  ///< clockwise from north
};

/// Where the entry starts and how fast, planet-relative (what is flown) and inertial.
struct EntryInterface {
    double latitude_deg = 0.0;
    double longitude_deg = 0.0;
    /// The body's rotation is flown only when the entry has a direction (entry.azimuth_deg);
    /// without one the two velocities are the same and the azimuth is east, for the ground track.
    bool rotation_flown = false;
    EntryVelocity relative;
    EntryVelocity inertial;
};

/// The hyperbolic arrival the entry starts from (entry.approach), and the interface state it
/// gives in both frames (the same as entry.interface's).
struct ApproachResults {
    double v_infinity_m_s = 0.0;
    double semi_major_axis_m = 0.0;  ///< negative: a hyperbola
    double eccentricity = 0.0;
    double periapsis_altitude_m = 0.0;        ///< in vacuum: the atmosphere cuts the conic short
    double impact_parameter_m = 0.0;          ///< the asymptote's miss distance from the centre
    double turn_angle_deg = 0.0;              ///< between the asymptotes
    double interface_true_anomaly_deg = 0.0;  ///< negative: before periapsis
    EntryVelocity inertial;
    EntryVelocity relative;
};

/// The orbit the entry starts from (entry.orbit), the deorbit burn at its apoapsis, the
/// transfer to the interface, and the interface state in both frames.
struct OrbitResults {
    double periapsis_altitude_m = 0.0;  ///< of the orbit before the burn
    double apoapsis_altitude_m = 0.0;
    double speed_before_burn_m_s = 0.0;  ///< inertial, at apoapsis
    double speed_after_burn_m_s = 0.0;
    double delta_v_m_s = 0.0;  ///< impulsive, tangential
    double isp_s = 0.0;
    double propellant_kg = 0.0;        ///< burned: the rocket equation on the stack
    double stage_kg = 0.0;             ///< the deorbit stage dropped before entry, propellant in
    double mass_before_burn_kg = 0.0;  ///< entry mass plus the stage
    double transfer_periapsis_altitude_m = 0.0;  ///< of the transfer ellipse, in vacuum
    double transfer_eccentricity = 0.0;
    double transfer_angle_deg = 0.0;  ///< about the centre, from the burn to the interface
    double coast_s = 0.0;             ///< from the burn to the interface
    double interface_true_anomaly_deg = 0.0;
    EntryVelocity inertial;
    EntryVelocity relative;
};

/// What the results say of the radiative heating of a body that has no correlation for it.
inline constexpr std::string_view radiative_heating_not_modelled = "not modelled";

struct EntryResults {
    EntryInterface interface;
    double mass_kg = 0.0;
    double diameter_m = 0.0;
    double nose_radius_m = 0.0;
    double drag_coefficient = 0.0;
    DragCoefficientSource drag_coefficient_source = DragCoefficientSource::design;
    double ballistic_coefficient_kg_m2 = 0.0;
    double peak_deceleration_g = 0.0;
    double peak_deceleration_altitude_m = 0.0;
    double peak_heat_flux_W_cm2 = 0.0;  ///< convective, Sutton-Graves
    double peak_heat_flux_altitude_m = 0.0;
    double heat_load_J_cm2 = 0.0;  ///< convective
    /// The radiative-heating correlation flown ("Tauber-Sutton, mars"), or "not modelled"
    /// (then the two figures below are empty and the heat flux and load are convective only).
    std::string radiative_heating{radiative_heating_not_modelled};
    std::optional<double> peak_radiative_heat_flux_W_cm2;
    std::optional<double> radiative_heat_load_J_cm2;
    double peak_dynamic_pressure_Pa = 0.0;
    double peak_dynamic_pressure_altitude_m = 0.0;
    double heat_shield_mass_fraction = 0.0;  ///< TPS mass over entry mass, from the total heat load
    double heat_shield_tps_kg = 0.0;
};

/// Where a drag device (the decelerator, the parachute) deploys, when it does: its figures
/// stay empty when it does not.
struct DeployResults {
    bool deployed = false;
    std::optional<double> deploy_time_s;
    std::optional<double> deploy_altitude_m;
    std::optional<double> deploy_mach;
    std::optional<double> deploy_dynamic_pressure_Pa;
};

struct ParachuteResults : DeployResults {
    std::optional<double> deploy_velocity_m_s;
    std::optional<double> diameter_m;
    std::optional<double> drag_coefficient;  ///< nominal (subsonic), referred to pi D^2 / 4
    std::optional<double> drag_coefficient_at_deploy;  ///< at the deploy Mach
    std::optional<double> opening_load_N;
    /// The opening load over the weight (at g0) of what hangs under the canopy at deploy, g.
    std::optional<double> opening_load_g;
    /// Where the heat shield is jettisoned, when it is.
    std::optional<double> heat_shield_jettison_mach;
    std::optional<double> heat_shield_jettison_dynamic_pressure_Pa;
    std::optional<double> inflation_time_s;
    std::optional<double> mass_kg;
    std::optional<double> heat_shield_jettison_time_s;
    /// Descent rate under the canopy at backshell separation, or at the ground for "none".
    std::optional<double> descent_velocity_m_s;
    std::optional<double> deploy_latitude_deg;
    std::optional<double> deploy_longitude_deg;
    /// Ground distance from deploy to where the canopy is left (backshell separation, or the
    /// touchdown for "none"), at the reference radius, and its direction.
    std::optional<double> drift_m;
    std::optional<double> drift_azimuth_deg;
};

/// The supersonic inflatable decelerator, when the design has one.
struct DeceleratorResults : DeployResults {
    double diameter_m = 0.0;
    double mass_kg = 0.0;
};

/// A powered descent lit during the entry (supersonic_retro): where the engines light, how they
/// fly into the flow, and what the burn puts on the vehicle.
struct PoweredDescentResults {
    double ignition_mach = 0.0;
    double ignition_dynamic_pressure_Pa = 0.0;
    double ignition_flight_path_angle_deg = 0.0;
    /// Full thrust over the vehicle's weight at ignition (local gravity there).
    double thrust_to_weight_at_ignition = 0.0;
    /// C_T = T / (q A) at ignition, on the aeroshell's frontal area, at the throttle flown.
    double thrust_coefficient_at_ignition = 0.0;
    double throttle = 0.0;  ///< solved, over full thrust
    /// Even the deepest throttle stopped above the site at the trigger: the ignition was solved
    /// later along the flight instead, at that throttle.
    bool ignition_delayed = false;
    double drag_preservation = 0.0;         ///< the design's share of aeroshell drag kept
    double peak_deceleration_g = 0.0;       ///< sensed over the burn: thrust and drag
    double peak_dynamic_pressure_Pa = 0.0;  ///< over the burn
    double propellant_fraction = 0.0;       ///< loaded propellant over the entry mass
};

struct TerminalResults {
    TerminalMethod method = TerminalMethod::retro;
    std::optional<double> ignition_altitude_m;
    std::optional<double> ignition_velocity_m_s;
    std::optional<double> delta_v_m_s;
    std::optional<double> gravity_loss_m_s;
    std::optional<double> propellant_kg;  ///< loaded: burned plus reserve and residual
    std::optional<double> burn_time_s;
    std::optional<double> ignition_time_s;
    std::optional<double> thrust_N;
    std::optional<double> burned_propellant_kg;
    std::optional<double> touchdown_velocity_m_s;  ///< at the ground (retro, none)
    std::optional<double> impact_velocity_m_s;     ///< airbag: after the free fall
    std::optional<double> impact_energy_J;         ///< airbag
    std::optional<double> hover_time_s;            ///< tethered: lowering plus fly-away
    /// Planet-relative horizontal speed at touchdown (retro, none), at release (airbag), or of
    /// the hovering stage while the payload touches down (tethered).
    std::optional<double> touchdown_horizontal_velocity_m_s;
    std::optional<PoweredDescentResults> powered_descent;  ///< supersonic_retro
};

/// A place on the ground under the flight: where it is and where it lies on the entry's track.
struct TrackPlace {
    double latitude_deg = 0.0;
    double longitude_deg = 0.0;
    double downrange_m = 0.0;   ///< from the entry point, along the entry's great circle
    double crossrange_m = 0.0;  ///< positive to the right of it
};

/// Where the lander (the payload, for airbag and tethered) comes down, when it does.
struct LandingResults : TrackPlace {
    /// With a target site (site.latitude_deg, site.longitude_deg): the great-circle distance to
    /// it, and the landing's downrange and crossrange less the target's.
    std::optional<double> miss_m;
    std::optional<double> miss_downrange_m;
    std::optional<double> miss_crossrange_m;
};

/// An event of the flight and the place under it.
struct TimelineEvent : TrackPlace {
    std::string name;
    double time_s = 0.0;
    double altitude_m = 0.0;
    double velocity_m_s = 0.0;
};

struct Timeline {
    std::vector<TimelineEvent> events;  ///< in time order
    /// Time between parachute deploy and the terminal burn, less what the sequence needs.
    std::optional<double> margin_s;
    std::optional<double> available_s;
    std::optional<double> needed_s;
};

/// The document's "maturity" of an item: its maturity's name, or "given" or "computed".
std::string_view maturity_name(const MassItem& item);

struct MassClosure {
    bool converged = false;
    int iterations = 0;
    double residual_kg = 0.0;  ///< entry mass in, less entry mass out, at the last iteration
};

/// How the entry mass was found.
enum class MassMode {
    analysis,  ///< fixed by the design
    sizing,    ///< the budget closed by iteration
};

struct MassResults {
    MassMode mode = MassMode::analysis;
    double entry_kg = 0.0;
    std::optional<double> landed_kg;
    /// Analysis mode: the fixed entry mass less everything itemised or estimated (negative when
    /// the budget does not fit in it).
    std::optional<double> unallocated_kg;
    std::vector<MassItem> items;
    std::optional<MassClosure> closure;  ///< sizing mode only
};

/// What stops the search for the highest feasible site.
enum class SiteLimit {
    timeline_margin,       ///< the timeline margin runs out there
    heat_shield_jettison,  ///< the margin lasts up to where the heat shield leaves (a canopy)
    ignition,              ///< the margin lasts up to where the engines light (from the entry)
};

/// What bounds the highest feasible site, in words for a reader ("bounded by the heat-shield
/// jettison altitude").
std::string_view site_limit_text(SiteLimit limit);

/// What the design could still do.
struct Capability {
    /// The highest site elevation at which the timeline margin is still zero or more, up to
    /// the altitude where the heat shield leaves (or the engines light): a site higher than
    /// that is above the event the timeline starts from, and is not looked at.
    std::optional<double> max_site_elevation_m;
    /// Which of those it is: a bound of the search, not of the margin, unless the margin.
    std::optional<SiteLimit> max_site_elevation_limit;
};

struct Results {
    int version = results_format_version;
    bool converged = false;
    std::optional<ApproachResults> approach;  ///< with entry.approach
    std::optional<OrbitResults> orbit;        ///< with entry.orbit
    EntryResults entry;
    std::optional<DeceleratorResults> decelerator;
    /// The drogue, when the design has one: its deploy, opening load and mass (the fields of the
    /// main's descent and jettison stay empty).
    std::optional<ParachuteResults> drogue;
    ParachuteResults parachute;
    TerminalResults terminal;
    Timeline timeline;
    std::optional<LandingResults> landing;
    MassResults mass;
    Capability capability;
    std::vector<Check> checks;  ///< failing first, then marginal, then passing
    std::vector<TrajectorySample> history;
    std::vector<std::string> notes;  ///< what the results do not cover, in words
};

/// The document's names of the results' enumerations (`to_string` of enum_names.hpp).
constexpr Names<DragCoefficientSource, 2> name_table(DragCoefficientSource) {
    return {{{DragCoefficientSource::design, "design"},
             {DragCoefficientSource::modified_newtonian, "modified Newtonian"}}};
}
constexpr Names<GrowthBasis, 3> name_table(GrowthBasis) {
    return {{{GrowthBasis::maturity, "maturity"},
             {GrowthBasis::given, "given"},
             {GrowthBasis::computed, "computed"}}};
}
constexpr Names<MassMode, 2> name_table(MassMode) {
    return {{{MassMode::analysis, "analysis"}, {MassMode::sizing, "sizing"}}};
}
constexpr Names<SiteLimit, 3> name_table(SiteLimit) {
    return {{{SiteLimit::timeline_margin, "timeline_margin"},
             {SiteLimit::heat_shield_jettison, "heat_shield_jettison"},
             {SiteLimit::ignition, "ignition"}}};
}

}  // namespace ds
