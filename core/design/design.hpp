#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "atmosphere/table_row.hpp"
#include "atmosphere/wind.hpp"
#include "body/body.hpp"
#include "checks/limits.hpp"
#include "enum_names.hpp"
#include "mass/group.hpp"
#include "mass/maturity.hpp"

namespace ds {

/// The design document (design-file.md, version 1) as plain values, SI units throughout.
/// Optional members are the keys a design may leave out; the reader fills nothing in that the
/// document did not say, so the writer can give the same document back.

/// The document's "format" and "version" keys.
inline constexpr std::string_view design_format_id = "descent-sizer/design";
inline constexpr int design_format_version = 1;

struct BodyDesign {
    std::string preset;  ///< "mars", "earth", ...; empty for a custom body
    Body body;           ///< the preset's values, or the custom body

    bool operator==(const BodyDesign&) const = default;
};

/// The design's wind: a table, or a constant (written back in the form it was read).
struct WindDesign {
    std::vector<WindRow> rows;  ///< by increasing altitude; empty with `constant`
    std::optional<WindVelocity> constant;

    bool operator==(const WindDesign&) const = default;
};

enum class AtmosphereModel { exponential, table, standard };

struct AtmosphereDesign {
    AtmosphereModel model = AtmosphereModel::exponential;
    // exponential
    double surface_density_kg_m3 = 0.0;
    double scale_height_m = 0.0;
    double temperature_K = 0.0;
    // table: rows from the document, or from csv_file (a path relative to the design file)
    std::vector<AtmosphereRow> rows;
    std::string csv_file;
    // any model
    std::optional<double> gas_constant_J_kgK;  ///< default: the body's gas
    std::optional<double> gamma;               ///< default: the body's gas
    double density_scale = 1.0;
    /// "wind": rows [altitude_m, east_m_s, north_m_s], linear in altitude and held constant
    /// outside them, or one wind { "east_m_s", "north_m_s" } at every altitude. Any model.
    std::optional<WindDesign> wind;
    double wind_scale = 1.0;  ///< multiplies the wind: the knob dispersions turn

    bool operator==(const AtmosphereDesign&) const = default;
};

struct SiteDesign {
    double elevation_m = 0.0;
    /// The target: with both, the results give the miss distance.
    std::optional<double> latitude_deg;
    std::optional<double> longitude_deg;

    bool operator==(const SiteDesign&) const = default;
};

/// The frame of the entry state's speed, flight-path angle and azimuth.
enum class VelocityFrame { relative, inertial };

/// An arrival on a hyperbola: its excess speed, and one of its vacuum periapsis altitude or the
/// flight-path angle at which it crosses the interface (inertial).
struct ApproachDesign {
    double v_infinity_m_s = 0.0;
    std::optional<double> periapsis_altitude_m;
    std::optional<double> flight_path_angle_deg;

    bool operator==(const ApproachDesign&) const = default;
};

/// An entry from orbit: a tangential burn at the orbit's apoapsis lowers its periapsis so that
/// the vehicle crosses the interface at the flight-path angle wanted (inertial). The burn's
/// stage ("deorbit stage" items) and propellant leave before the interface.
struct OrbitDesign {
    double periapsis_altitude_m = 0.0;
    double apoapsis_altitude_m = 0.0;
    double flight_path_angle_deg = 0.0;
    double isp_s = 0.0;

    bool operator==(const OrbitDesign&) const = default;
};

struct EntryDesign {
    double interface_altitude_m = 0.0;
    /// The entry state at the interface, in velocity_frame; a design with an approach or an
    /// orbit gives neither (both stay 0): its conic gives the inertial state.
    double velocity_m_s = 0.0;
    double flight_path_angle_deg = 0.0;  ///< negative below the local horizontal
    std::optional<ApproachDesign> approach;
    std::optional<OrbitDesign> orbit;
    double lift_to_drag = 0.0;
    double bank_angle_deg = 0.0;          ///< positive turns the lift to the right of the flight
    std::optional<double> latitude_deg;   ///< of the entry point; default 0
    std::optional<double> longitude_deg;  ///< of the entry point; default 0
    /// Clockwise from north (90 = east). Without it the entry has no direction: the body is
    /// flown without rotation, heading east for the ground track and the winds.
    std::optional<double> azimuth_deg;
    /// "relative" (planet-relative, default) or "inertial" (turned into the planet-relative
    /// state at the interface, v_rel = v_in - w x r). Always inertial with an approach or an
    /// orbit.
    VelocityFrame velocity_frame = VelocityFrame::relative;

    /// Whether the interface state comes from a conic (an approach or an orbit).
    bool from_conic() const { return approach.has_value() || orbit.has_value(); }

    bool operator==(const EntryDesign&) const = default;
};

/// How the aeroshell's drag coefficient varies with Mach below its hypersonic value.
enum class DragMachLaw {
    modified_newtonian,  ///< scaled by the stagnation-pressure coefficient at the Mach number
    constant,            ///< held at the hypersonic value
};

struct AeroshellDesign {
    std::optional<double> diameter_m;  ///< empty when sized for a ballistic coefficient
    std::optional<double> size_for_ballistic_coefficient_kg_m2;
    double half_angle_deg = 70.0;
    double nose_radius_m = 0.0;
    std::optional<double> drag_coefficient;  ///< hypersonic; empty: modified Newtonian theory
    DragMachLaw drag_against_mach = DragMachLaw::modified_newtonian;

    bool operator==(const AeroshellDesign&) const = default;
};

struct MassItemDesign {
    std::string name;
    double mass_kg = 0.0;  ///< basic mass, without growth allowance
    MassGroup group = MassGroup::payload;
    Maturity maturity = Maturity::estimated;

    bool operator==(const MassItemDesign&) const = default;
};

struct MassDesign {
    /// Fixes the entry mass (analysis). Without it the budget is closed by iteration from the
    /// items and the estimates (sizing).
    std::optional<double> entry_kg;
    /// Dropped at heat-shield jettison; estimated (TPS from the heat load plus structure) when
    /// absent.
    std::optional<double> heat_shield_kg;
    /// Backshell structure, its TPS and separation hardware, dropped at separation with the
    /// parachute; estimated from the aeroshell's size when absent.
    std::optional<double> backshell_kg;
    std::vector<MassItemDesign> items;

    bool operator==(const MassDesign&) const = default;
};

enum class TriggerKind { mach, dynamic_pressure, altitude };

struct ParachuteDesign {
    std::string type = "disk-gap-band";
    std::optional<double> diameter_m;  ///< empty when sized for a velocity
    std::optional<double> size_for_velocity_m_s;
    std::optional<double> at_height_above_site_m;
    std::optional<double> drag_coefficient;  ///< empty: the type's nominal value
    TriggerKind trigger = TriggerKind::mach;
    double trigger_value = 0.0;     ///< Mach, Pa or m, by trigger
    std::optional<double> mass_kg;  ///< canopy, lines, riser and mortar; estimated when absent

    bool operator==(const ParachuteDesign&) const = default;
};

/// An optional supersonic inflatable decelerator, flown between the entry and the parachute.
struct DeceleratorDesign {
    double diameter_m = 0.0;
    double drag_coefficient = 0.0;
    TriggerKind trigger = TriggerKind::mach;  ///< when it inflates, crossed downward
    double trigger_value = 0.0;
    std::optional<double> mass_kg;  ///< estimated when absent

    bool operator==(const DeceleratorDesign&) const = default;
};

/// An optional drogue: a first canopy, deployed on its own trigger, that slows and steadies the
/// vehicle until the main parachute deploys on the main's trigger (the staging trigger). At the
/// main's deploy the drogue stops dragging (it is released, or extracts the main); its mass
/// stays with the backshell.
struct DrogueDesign {
    std::string type = "disk-gap-band";
    double diameter_m = 0.0;
    std::optional<double> drag_coefficient;  ///< empty: the type's nominal value
    TriggerKind trigger = TriggerKind::mach;
    double trigger_value = 0.0;
    std::optional<double> mass_kg;  ///< estimated when absent

    bool operator==(const DrogueDesign&) const = default;
};

/// The events between parachute deploy and the terminal burn, and the time each needs.
struct SequenceDesign {
    /// The heat-shield jettison delay after parachute deploy when the design gives neither a
    /// delay nor a dynamic pressure (common practice: some 20 s, once the canopy has slowed the
    /// vehicle to subsonic speed).
    static constexpr double default_jettison_delay_s = 20.0;

    /// Heat-shield jettison after deploy: a delay, or the dynamic pressure falling below a value.
    /// Neither given: the delay's default.
    std::optional<double> heat_shield_jettison_delay_s;
    std::optional<double> heat_shield_jettison_dynamic_pressure_Pa;
    double ground_sensing_lock_s = 15.0;  ///< after jettison, before separation may happen
    double separation_coast_s = 2.0;      ///< free fall from backshell separation to ignition

    bool operator==(const SequenceDesign&) const = default;
};

/// How the lander comes down at the end. All but `supersonic_retro` begin under the parachute;
/// `supersonic_retro` lights its engines during the entry (or the decelerator's phase) and flies
/// a powered descent to touchdown without a parachute.
enum class TerminalMethod { retro, airbag, tethered, none, supersonic_retro };

struct TerminalDesign {
    TerminalMethod method = TerminalMethod::retro;
    double isp_s = 0.0;
    double thrust_to_weight = 0.0;  ///< full thrust over the stage's weight at ignition
    /// Velocity at the end of the burn: touchdown (retro), release (airbag), lowering (tethered).
    double touchdown_velocity_m_s = 0.0;
    double throttle = 1.0;                       ///< fraction of full thrust flown during the burn
    double propellant_reserve_fraction = 0.10;   ///< unburned reserve over burned propellant
    double propellant_residual_fraction = 0.03;  ///< trapped residual over loaded propellant
    double release_height_m = 12.0;              ///< airbag: the burn ends here above the site
    double tether_length_m = 7.5;  ///< tethered: hover height above the site while lowering
    double fly_away_s = 10.0;      ///< tethered: seconds of hover thrust after the cut
    /// A built vehicle's hardware, given instead of derived: the full thrust (instead of the
    /// thrust-to-weight times the weight) and the propellant loaded (instead of the burn's
    /// need with its reserve and residual). A dispersion flies the nominal vehicle with both.
    std::optional<double> thrust_N;
    std::optional<double> propellant_loaded_kg;
    /// supersonic_retro: the engines light when this trigger is crossed (Mach, Pa or m), and
    /// the throttle is solved between min_throttle and `throttle` so that the burn ends at the
    /// end-of-burn speed at the site.
    TriggerKind trigger = TriggerKind::mach;
    double trigger_value = 0.0;
    double min_throttle = 0.3;
    /// supersonic_retro: the share of the aeroshell's (and decelerator's) drag kept while the
    /// engines fire into the flow, 0 to 1. The default 0 is the conservative case (common
    /// practice; see DEVELOPERS.md for the published trend).
    double drag_preservation = 0.0;

    bool operator==(const TerminalDesign&) const = default;
};

/// Numerical settings of the trajectory integration.
struct SolverDesign {
    double relative_tolerance = 1e-8;
    double max_time_s = 4000.0;  ///< flight-time budget
    int max_steps = 200000;      ///< step budget

    bool operator==(const SolverDesign&) const = default;
};

/// The document's names for the enumerations, one table each for reading and writing
/// (`to_string`, `enum_from` and `enum_names` of enum_names.hpp read them).
constexpr Names<AtmosphereModel, 3> name_table(AtmosphereModel) {
    return {{{AtmosphereModel::exponential, "exponential"},
             {AtmosphereModel::table, "table"},
             {AtmosphereModel::standard, "standard"}}};
}
constexpr Names<TerminalMethod, 5> name_table(TerminalMethod) {
    return {{{TerminalMethod::retro, "retro"},
             {TerminalMethod::airbag, "airbag"},
             {TerminalMethod::tethered, "tethered"},
             {TerminalMethod::none, "none"},
             {TerminalMethod::supersonic_retro, "supersonic-retro"}}};
}
constexpr Names<MassGroup, 5> name_table(MassGroup) {
    return {{{MassGroup::deorbit_stage, "deorbit stage"},
             {MassGroup::heat_shield, "heat shield"},
             {MassGroup::backshell, "backshell"},
             {MassGroup::descent_stage, "descent stage"},
             {MassGroup::payload, "payload"}}};
}
constexpr Names<Maturity, 6> name_table(Maturity) {
    return {{{Maturity::estimated, "estimated"},
             {Maturity::layout, "layout"},
             {Maturity::pre_release, "pre-release"},
             {Maturity::released, "released"},
             {Maturity::existing, "existing"},
             {Maturity::actual, "actual"}}};
}
constexpr Names<VelocityFrame, 2> name_table(VelocityFrame) {
    return {{{VelocityFrame::relative, "relative"}, {VelocityFrame::inertial, "inertial"}}};
}
constexpr Names<DragMachLaw, 2> name_table(DragMachLaw) {
    return {{{DragMachLaw::modified_newtonian, "modified_newtonian"},
             {DragMachLaw::constant, "constant"}}};
}

enum class DistributionKind { normal, uniform };

/// A key of the design drawn at random in a dispersion campaign: normal about the design's own
/// value with a standard deviation, or uniform between two values.
struct DispersionDesign {
    std::string key;  ///< a numeric key's path, "entry.flight_path_angle_deg"
    DistributionKind distribution = DistributionKind::normal;
    double sigma = 0.0;  ///< normal
    double min = 0.0;    ///< uniform
    double max = 0.0;    ///< uniform

    bool operator==(const DispersionDesign&) const = default;
};

struct Design {
    int version = design_format_version;
    std::string name;
    BodyDesign body;
    AtmosphereDesign atmosphere;
    SiteDesign site;
    EntryDesign entry;
    AeroshellDesign aeroshell;
    MassDesign mass;
    std::optional<DeceleratorDesign> decelerator;
    std::optional<DrogueDesign> drogue;
    /// None: no parachute (a supersonic retro-propulsive descent, or a ballistic impact).
    std::optional<ParachuteDesign> parachute;
    SequenceDesign sequence;
    TerminalDesign terminal;
    Limits limits;
    SolverDesign solver;
    std::vector<DispersionDesign> dispersions;

    bool operator==(const Design&) const = default;
};

}  // namespace ds
