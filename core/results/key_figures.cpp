#include "results/key_figures.hpp"

namespace ds {

std::vector<KeyFigure> key_figures(const Results& r) {
    return {
        {"entry_mass", "entry mass", r.mass.entry_kg, "kg", 1},
        {"landed_mass", "landed mass", r.mass.landed_kg, "kg", 1},
        {"aeroshell_diameter", "aeroshell diameter", r.entry.diameter_m, "m", 2},
        {"ballistic_coefficient", "ballistic coefficient", r.entry.ballistic_coefficient_kg_m2,
         "kg/m^2", 1},
        {"peak_deceleration", "peak deceleration", r.entry.peak_deceleration_g, "g", 2},
        {"peak_heat_flux", "peak heat flux (convective)", r.entry.peak_heat_flux_W_cm2, "W/cm^2",
         1},
        {"heat_load", "heat load (convective)", r.entry.heat_load_J_cm2, "J/cm^2", 0},
        {"deploy_mach", "deploy Mach", r.parachute.deploy_mach, "", 2},
        {"deploy_altitude", "deploy altitude", r.parachute.deploy_altitude_m, "m", 0},
        {"deploy_dynamic_pressure", "deploy dynamic pressure", r.parachute.deploy_dynamic_pressure_Pa,
         "Pa", 0},
        {"parachute_diameter", "parachute diameter", r.parachute.diameter_m, "m", 2},
        {"propellant", "propellant (loaded)", r.terminal.propellant_kg, "kg", 1},
        {"burned_propellant", "propellant burned", r.terminal.burned_propellant_kg, "kg", 1},
        {"timeline_margin", "timeline margin", r.timeline.margin_s, "s", 1},
        {"max_site_elevation", "highest feasible site elevation",
         r.capability.max_site_elevation_m, "m", 0},
    };
}

std::optional<std::size_t> key_figure_index(std::string_view id) {
    const std::vector<KeyFigure> figures = key_figures(Results{});
    for (std::size_t i = 0; i < figures.size(); ++i) {
        if (figures[i].id == id) return i;
    }
    return std::nullopt;
}

}  // namespace ds
