#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "results/results.hpp"

namespace ds {

/// One figure of the compact table the window and the sizing sheet show, and of the rows,
/// campaigns and sensitivities of trade studies: what it is, and where a result holds it.
struct KeyFigureDefinition {
    std::string_view id;     ///< stable name, for baselines and tests ("peak_deceleration")
    std::string_view label;  ///< "peak deceleration"
    std::string_view unit;   ///< "g", "kg/m^2", "" for none
    int decimals = 1;
    std::optional<double> (*value)(const Results&) = nullptr;
};

/// The key figures, in the order they are shown: the one list of them. A figure added here is
/// in the window's table, the sheet, the trade rows, the dispersion statistics and the trade
/// tab's figure list at once.
inline constexpr std::array<KeyFigureDefinition, 20> key_figure_table{{
    {"entry_mass", "entry mass", "kg", 1,
     [](const Results& r) -> std::optional<double> { return r.mass.entry_kg; }},
    {"landed_mass", "landed mass", "kg", 1, [](const Results& r) { return r.mass.landed_kg; }},
    {"unallocated_mass", "unallocated mass (fixed entry mass)", "kg", 1,
     [](const Results& r) { return r.mass.unallocated_kg; }},
    {"aeroshell_diameter", "aeroshell diameter", "m", 2,
     [](const Results& r) -> std::optional<double> { return r.entry.diameter_m; }},
    {"ballistic_coefficient", "ballistic coefficient", "kg/m^2", 1,
     [](const Results& r) -> std::optional<double> { return r.entry.ballistic_coefficient_kg_m2; }},
    {"peak_deceleration", "peak deceleration", "g", 2,
     [](const Results& r) -> std::optional<double> { return r.entry.peak_deceleration_g; }},
    {"peak_heat_flux", "peak heat flux (convective)", "W/cm^2", 1,
     [](const Results& r) -> std::optional<double> { return r.entry.peak_heat_flux_W_cm2; }},
    {"heat_load", "heat load (convective)", "J/cm^2", 0,
     [](const Results& r) -> std::optional<double> { return r.entry.heat_load_J_cm2; }},
    {"deploy_mach", "deploy Mach", "", 2, [](const Results& r) { return r.parachute.deploy_mach; }},
    {"deploy_altitude", "deploy altitude", "m", 0,
     [](const Results& r) { return r.parachute.deploy_altitude_m; }},
    {"deploy_dynamic_pressure", "deploy dynamic pressure", "Pa", 0,
     [](const Results& r) { return r.parachute.deploy_dynamic_pressure_Pa; }},
    {"parachute_diameter", "parachute diameter", "m", 2,
     [](const Results& r) { return r.parachute.diameter_m; }},
    {"opening_load", "parachute opening load", "kN", 1,
     [](const Results& r) -> std::optional<double> {
         if (!r.parachute.opening_load_N)
             return std::nullopt;
         return *r.parachute.opening_load_N / 1e3;
     }},
    {"ignition_altitude", "terminal burn ignition altitude", "m", 0,
     [](const Results& r) { return r.terminal.ignition_altitude_m; }},
    {"propellant", "propellant (loaded)", "kg", 1,
     [](const Results& r) { return r.terminal.propellant_kg; }},
    {"burned_propellant", "propellant burned", "kg", 1,
     [](const Results& r) { return r.terminal.burned_propellant_kg; }},
    // What meets the ground: the lander at touchdown, or the airbags at impact.
    {"touchdown_speed", "touchdown speed", "m/s", 2,
     [](const Results& r) {
         return r.terminal.touchdown_velocity_m_s ? r.terminal.touchdown_velocity_m_s
                                                  : r.terminal.impact_velocity_m_s;
     }},
    {"landing_downrange", "landing downrange from entry", "km", 2,
     [](const Results& r) -> std::optional<double> {
         if (!r.landing)
             return std::nullopt;
         return r.landing->downrange_m / 1e3;
     }},
    {"timeline_margin", "timeline margin", "s", 1,
     [](const Results& r) { return r.timeline.margin_s; }},
    {"max_site_elevation", "highest feasible site elevation", "m", 0,
     [](const Results& r) { return r.capability.max_site_elevation_m; }},
}};

/// The values of a result's key figures, in the table's order (empty where it has none).
std::vector<std::optional<double>> key_figure_values(const Results& results);

/// Where the figure of this id stands in the table, if it is one.
std::optional<std::size_t> key_figure_index(std::string_view id);

/// A key figure with its value, for a table that shows one result.
struct KeyFigure {
    std::string id;
    std::string label;
    std::optional<double> value;
    std::string unit;
    int decimals = 1;
};

/// The key figures of a result with their values, in the table's order.
std::vector<KeyFigure> key_figures(const Results& results);

}  // namespace ds
