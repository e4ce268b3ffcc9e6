#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "body/body.hpp"
#include "checks/limits.hpp"

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
};

struct AtmosphereRow {
    double altitude_m = 0.0;
    double density_kg_m3 = 0.0;
    double temperature_K = 0.0;
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
};

struct SiteDesign {
    double elevation_m = 0.0;
};

struct EntryDesign {
    double interface_altitude_m = 0.0;
    double velocity_m_s = 0.0;  ///< planet-relative
    double flight_path_angle_deg = 0.0;  ///< negative below the local horizontal
    double lift_to_drag = 0.0;
    double bank_angle_deg = 0.0;
};

struct AeroshellDesign {
    std::optional<double> diameter_m;  ///< empty when sized for a ballistic coefficient
    std::optional<double> size_for_ballistic_coefficient_kg_m2;
    double half_angle_deg = 70.0;
    double nose_radius_m = 0.0;
    std::optional<double> drag_coefficient;  ///< empty: modified Newtonian theory
};

struct MassDesign {
    std::optional<double> entry_kg;  ///< fixes the entry mass (analysis)
    double heat_shield_kg = 0.0;     ///< dropped at heat-shield jettison
};

enum class TriggerKind { mach, dynamic_pressure, altitude };

struct ParachuteDesign {
    std::string type = "disk-gap-band";
    std::optional<double> diameter_m;  ///< empty when sized for a velocity
    std::optional<double> size_for_velocity_m_s;
    std::optional<double> at_height_above_site_m;
    std::optional<double> drag_coefficient;  ///< empty: the type's nominal value
    TriggerKind trigger = TriggerKind::mach;
    double trigger_value = 0.0;  ///< Mach, Pa or m, by trigger
};

enum class TerminalMethod { retro, airbag, tethered, none };

struct TerminalDesign {
    TerminalMethod method = TerminalMethod::retro;
    double isp_s = 0.0;
    double thrust_to_weight = 0.0;
    double touchdown_velocity_m_s = 0.0;
};

/// Numerical settings of the trajectory integration.
struct SolverDesign {
    double relative_tolerance = 1e-8;
    double max_time_s = 4000.0;  ///< flight-time budget
    int max_steps = 200000;      ///< step budget
};

/// The document's names for the enumerations, one table each for reading and writing.
std::string_view to_string(AtmosphereModel model);
std::string_view to_string(TerminalMethod method);
std::optional<AtmosphereModel> atmosphere_model_from(std::string_view name);
std::optional<TerminalMethod> terminal_method_from(std::string_view name);

struct Design {
    int version = design_format_version;
    std::string name;
    BodyDesign body;
    AtmosphereDesign atmosphere;
    SiteDesign site;
    EntryDesign entry;
    AeroshellDesign aeroshell;
    MassDesign mass;
    ParachuteDesign parachute;
    TerminalDesign terminal;
    Limits limits;
    SolverDesign solver;
};

}  // namespace ds
