#include "results/writer.hpp"

#include <cmath>
#include <iterator>

#include <fmt/format.h>

#include "json_values.hpp"
#include "results/history_columns.hpp"

namespace ds {
namespace {

using json::array_of;
using json::Json;
using json::object_or_null;

/// An object of the results, with room for the keys most of them hold, so that filling it
/// does not move the keys already in it.
Json results_object() {
    constexpr std::size_t keys = 16;
    return json::object_with_room(keys);
}

// Numbers go in as they are; results_to_json turns those that are not finite into null at the
// end unless asked to keep them, so that one walk can name them (non_finite_figures).
Json number(double value) {
    return Json(value);
}

Json number(const std::optional<double>& value) {
    return value ? Json(*value) : Json(nullptr);
}

void null_non_finite(Json& value) {
    if (value.is_number_float() && !std::isfinite(value.get<double>())) {
        value = nullptr;
    } else if (value.is_structured()) {
        for (Json& element : value)
            null_non_finite(element);
    }
}

/// Whether a document holds a number that is not finite: the walk without the paths, for the
/// common case where it holds none.
bool holds_non_finite(const Json& value) {
    if (value.is_number_float())
        return !std::isfinite(value.get<double>());
    if (value.is_structured()) {
        for (const Json& element : value) {
            if (holds_non_finite(element))
                return true;
        }
    }
    return false;
}

/// The paths of the numbers in `value` that are not finite. `path` grows and shrinks as the
/// walk goes down and back up, so a path is written out only for a number it names.
void collect_non_finite(const Json& value, std::string& path, std::vector<std::string>& paths) {
    const std::size_t length = path.size();
    if (value.is_number_float() && !std::isfinite(value.get<double>())) {
        paths.push_back(path);
    } else if (value.is_object()) {
        for (auto it = value.begin(); it != value.end(); ++it) {
            if (length > 0)
                path += '.';
            path += it.key();
            collect_non_finite(it.value(), path, paths);
            path.resize(length);
        }
    } else if (value.is_array()) {
        for (std::size_t i = 0; i < value.size(); ++i) {
            fmt::format_to(std::back_inserter(path), "[{}]", i);
            collect_non_finite(value[i], path, paths);
            path.resize(length);
        }
    }
}

/// The deploy figures a drag device's object starts with.
void put_deploy(Json& out, const DeployResults& deploy) {
    out["deployed"] = deploy.deployed;
    out["deploy_time_s"] = number(deploy.deploy_time_s);
    out["deploy_altitude_m"] = number(deploy.deploy_altitude_m);
    out["deploy_mach"] = number(deploy.deploy_mach);
    out["deploy_dynamic_pressure_Pa"] = number(deploy.deploy_dynamic_pressure_Pa);
}

void put_place(Json& out, const TrackPlace& place) {
    out["latitude_deg"] = number(place.latitude_deg);
    out["longitude_deg"] = number(place.longitude_deg);
    out["downrange_m"] = number(place.downrange_m);
    out["crossrange_m"] = number(place.crossrange_m);
}

Json entry_velocity_to_json(const EntryVelocity& v) {
    Json out = results_object();
    out["velocity_m_s"] = number(v.velocity_m_s);
    out["flight_path_angle_deg"] = number(v.flight_path_angle_deg);
    out["azimuth_deg"] = number(v.azimuth_deg);
    return out;
}

Json interface_to_json(const EntryInterface& i) {
    Json out = results_object();
    out["latitude_deg"] = number(i.latitude_deg);
    out["longitude_deg"] = number(i.longitude_deg);
    out["rotation_flown"] = i.rotation_flown;
    out["relative"] = entry_velocity_to_json(i.relative);
    out["inertial"] = entry_velocity_to_json(i.inertial);
    return out;
}

/// The arrival, or null for a design without one.
Json approach_to_json(const std::optional<ApproachResults>& approach) {
    if (!approach)
        return nullptr;
    Json out = results_object();
    out["v_infinity_m_s"] = number(approach->v_infinity_m_s);
    out["semi_major_axis_m"] = number(approach->semi_major_axis_m);
    out["eccentricity"] = number(approach->eccentricity);
    out["periapsis_altitude_m"] = number(approach->periapsis_altitude_m);
    out["impact_parameter_m"] = number(approach->impact_parameter_m);
    out["turn_angle_deg"] = number(approach->turn_angle_deg);
    out["interface_true_anomaly_deg"] = number(approach->interface_true_anomaly_deg);
    out["inertial"] = entry_velocity_to_json(approach->inertial);
    out["relative"] = entry_velocity_to_json(approach->relative);
    return out;
}

/// The orbit and its deorbit burn, or null for a design without one.
Json orbit_to_json(const std::optional<OrbitResults>& orbit) {
    if (!orbit)
        return nullptr;
    Json out = results_object();
    out["periapsis_altitude_m"] = number(orbit->periapsis_altitude_m);
    out["apoapsis_altitude_m"] = number(orbit->apoapsis_altitude_m);
    out["speed_before_burn_m_s"] = number(orbit->speed_before_burn_m_s);
    out["speed_after_burn_m_s"] = number(orbit->speed_after_burn_m_s);
    out["delta_v_m_s"] = number(orbit->delta_v_m_s);
    out["isp_s"] = number(orbit->isp_s);
    out["propellant_kg"] = number(orbit->propellant_kg);
    out["stage_kg"] = number(orbit->stage_kg);
    out["mass_before_burn_kg"] = number(orbit->mass_before_burn_kg);
    out["transfer_periapsis_altitude_m"] = number(orbit->transfer_periapsis_altitude_m);
    out["transfer_eccentricity"] = number(orbit->transfer_eccentricity);
    out["transfer_angle_deg"] = number(orbit->transfer_angle_deg);
    out["coast_s"] = number(orbit->coast_s);
    out["interface_true_anomaly_deg"] = number(orbit->interface_true_anomaly_deg);
    out["inertial"] = entry_velocity_to_json(orbit->inertial);
    out["relative"] = entry_velocity_to_json(orbit->relative);
    return out;
}

Json entry_to_json(const EntryResults& entry) {
    Json out = results_object();
    out["mass_kg"] = number(entry.mass_kg);
    out["diameter_m"] = number(entry.diameter_m);
    out["nose_radius_m"] = number(entry.nose_radius_m);
    out["drag_coefficient"] = number(entry.drag_coefficient);
    out["drag_coefficient_source"] = to_string(entry.drag_coefficient_source);
    out["ballistic_coefficient_kg_m2"] = number(entry.ballistic_coefficient_kg_m2);
    out["peak_deceleration_g"] = number(entry.peak_deceleration_g);
    out["peak_deceleration_altitude_m"] = number(entry.peak_deceleration_altitude_m);
    out["peak_heat_flux_W_cm2"] = number(entry.peak_heat_flux_W_cm2);
    out["peak_heat_flux_altitude_m"] = number(entry.peak_heat_flux_altitude_m);
    out["heat_load_J_cm2"] = number(entry.heat_load_J_cm2);
    out["radiative_heating"] = entry.radiative_heating;
    out["peak_radiative_heat_flux_W_cm2"] = number(entry.peak_radiative_heat_flux_W_cm2);
    out["radiative_heat_load_J_cm2"] = number(entry.radiative_heat_load_J_cm2);
    out["peak_dynamic_pressure_Pa"] = number(entry.peak_dynamic_pressure_Pa);
    out["peak_dynamic_pressure_altitude_m"] = number(entry.peak_dynamic_pressure_altitude_m);
    out["heat_shield_mass_fraction"] = number(entry.heat_shield_mass_fraction);
    out["heat_shield_tps_kg"] = number(entry.heat_shield_tps_kg);
    out["interface"] = interface_to_json(entry.interface);
    return out;
}

Json parachute_to_json(const ParachuteResults& parachute) {
    Json out = results_object();
    put_deploy(out, parachute);
    out["deploy_velocity_m_s"] = number(parachute.deploy_velocity_m_s);
    out["diameter_m"] = number(parachute.diameter_m);
    out["drag_coefficient"] = number(parachute.drag_coefficient);
    out["drag_coefficient_at_deploy"] = number(parachute.drag_coefficient_at_deploy);
    out["opening_load_N"] = number(parachute.opening_load_N);
    out["opening_load_g"] = number(parachute.opening_load_g);
    out["heat_shield_jettison_mach"] = number(parachute.heat_shield_jettison_mach);
    out["heat_shield_jettison_dynamic_pressure_Pa"] =
        number(parachute.heat_shield_jettison_dynamic_pressure_Pa);
    out["inflation_time_s"] = number(parachute.inflation_time_s);
    out["mass_kg"] = number(parachute.mass_kg);
    out["heat_shield_jettison_time_s"] = number(parachute.heat_shield_jettison_time_s);
    out["descent_velocity_m_s"] = number(parachute.descent_velocity_m_s);
    out["deploy_latitude_deg"] = number(parachute.deploy_latitude_deg);
    out["deploy_longitude_deg"] = number(parachute.deploy_longitude_deg);
    out["drift_m"] = number(parachute.drift_m);
    out["drift_azimuth_deg"] = number(parachute.drift_azimuth_deg);
    return out;
}

Json decelerator_to_json(const DeceleratorResults& decelerator) {
    Json out = results_object();
    put_deploy(out, decelerator);
    out["diameter_m"] = number(decelerator.diameter_m);
    out["mass_kg"] = number(decelerator.mass_kg);
    return out;
}

Json powered_descent_to_json(const PoweredDescentResults& p) {
    Json out = results_object();
    out["ignition_mach"] = number(p.ignition_mach);
    out["ignition_dynamic_pressure_Pa"] = number(p.ignition_dynamic_pressure_Pa);
    out["ignition_flight_path_angle_deg"] = number(p.ignition_flight_path_angle_deg);
    out["thrust_to_weight_at_ignition"] = number(p.thrust_to_weight_at_ignition);
    out["thrust_coefficient_at_ignition"] = number(p.thrust_coefficient_at_ignition);
    out["throttle"] = number(p.throttle);
    out["ignition_delayed"] = p.ignition_delayed;
    out["drag_preservation"] = number(p.drag_preservation);
    out["peak_deceleration_g"] = number(p.peak_deceleration_g);
    out["peak_dynamic_pressure_Pa"] = number(p.peak_dynamic_pressure_Pa);
    out["propellant_fraction"] = number(p.propellant_fraction);
    return out;
}

Json terminal_to_json(const TerminalResults& terminal) {
    Json out = results_object();
    out["method"] = to_string(terminal.method);
    out["ignition_altitude_m"] = number(terminal.ignition_altitude_m);
    out["ignition_velocity_m_s"] = number(terminal.ignition_velocity_m_s);
    out["delta_v_m_s"] = number(terminal.delta_v_m_s);
    out["gravity_loss_m_s"] = number(terminal.gravity_loss_m_s);
    out["propellant_kg"] = number(terminal.propellant_kg);
    out["burn_time_s"] = number(terminal.burn_time_s);
    out["ignition_time_s"] = number(terminal.ignition_time_s);
    out["thrust_N"] = number(terminal.thrust_N);
    out["burned_propellant_kg"] = number(terminal.burned_propellant_kg);
    out["touchdown_velocity_m_s"] = number(terminal.touchdown_velocity_m_s);
    out["impact_velocity_m_s"] = number(terminal.impact_velocity_m_s);
    out["impact_energy_J"] = number(terminal.impact_energy_J);
    out["hover_time_s"] = number(terminal.hover_time_s);
    out["touchdown_horizontal_velocity_m_s"] = number(terminal.touchdown_horizontal_velocity_m_s);
    out["powered_descent"] = object_or_null(terminal.powered_descent, powered_descent_to_json);
    return out;
}

Json landing_to_json(const LandingResults& landing) {
    Json out = results_object();
    put_place(out, landing);
    out["miss_m"] = number(landing.miss_m);
    out["miss_downrange_m"] = number(landing.miss_downrange_m);
    out["miss_crossrange_m"] = number(landing.miss_crossrange_m);
    return out;
}

Json event_to_json(const TimelineEvent& event) {
    Json out = results_object();
    out["name"] = event.name;
    out["time_s"] = number(event.time_s);
    out["altitude_m"] = number(event.altitude_m);
    out["velocity_m_s"] = number(event.velocity_m_s);
    put_place(out, event);
    return out;
}

Json timeline_to_json(const Timeline& timeline) {
    Json out = results_object();
    out["events"] = array_of(timeline.events, event_to_json);
    out["margin_s"] = number(timeline.margin_s);
    out["available_s"] = number(timeline.available_s);
    out["needed_s"] = number(timeline.needed_s);
    return out;
}

Json closure_to_json(const MassClosure& closure) {
    Json out = results_object();
    out["converged"] = closure.converged;
    out["iterations"] = closure.iterations;
    out["residual_kg"] = number(closure.residual_kg);
    return out;
}

Json item_to_json(const MassItem& item) {
    Json out = results_object();
    out["name"] = item.name;
    out["mass_kg"] = number(item.mass_kg);
    out["basic_kg"] = number(item.basic_kg);
    out["growth_fraction"] = number(item.growth_fraction);
    out["group"] = to_string(item.group);
    out["maturity"] = maturity_name(item);
    out["source"] = item.source;
    return out;
}

Json mass_to_json(const MassResults& mass) {
    Json out = results_object();
    out["mode"] = to_string(mass.mode);
    out["entry_kg"] = number(mass.entry_kg);
    out["landed_kg"] = number(mass.landed_kg);
    out["unallocated_kg"] = number(mass.unallocated_kg);
    out["items"] = array_of(mass.items, item_to_json);
    // The closure of a sized budget; null for a fixed entry mass.
    out["closure"] = object_or_null(mass.closure, closure_to_json);
    return out;
}

Json capability_to_json(const Capability& capability) {
    Json out = results_object();
    out["max_site_elevation_m"] = number(capability.max_site_elevation_m);
    out["max_site_elevation_limit"] =
        capability.max_site_elevation_limit
            ? Json(std::string(to_string(*capability.max_site_elevation_limit)))
            : Json();
    return out;
}

Json check_to_json(const Check& check) {
    Json out = results_object();
    out["id"] = check.id;
    out["status"] = to_string(check.status);
    out["value"] = number(check.value);
    out["limit"] = number(check.limit);
    out["unit"] = check.unit;
    out["message"] = check.message;
    out["source"] = check.source;
    if (check.margin)
        out["margin"] = number(*check.margin);
    return out;
}

Json sample_to_json(const TrajectorySample& sample) {
    Json out = results_object();
    for (const HistoryColumn& column : history_columns)
        out[column.key] = number(sample.*column.value);
    return out;
}

}  // namespace

nlohmann::ordered_json results_to_json(const Results& results, ResultsWriteOptions options) {
    Json out = results_object();
    out["format"] = results_format_id;
    out["version"] = results_format_version;
    out["converged"] = results.converged;
    out["approach"] = approach_to_json(results.approach);
    out["orbit"] = orbit_to_json(results.orbit);
    out["entry"] = entry_to_json(results.entry);
    // The decelerator and the drogue: null without one.
    out["decelerator"] = object_or_null(results.decelerator, decelerator_to_json);
    out["drogue"] = object_or_null(results.drogue, parachute_to_json);
    out["parachute"] = parachute_to_json(results.parachute);
    out["terminal"] = terminal_to_json(results.terminal);
    out["timeline"] = timeline_to_json(results.timeline);
    out["landing"] = object_or_null(results.landing, landing_to_json);
    out["mass"] = mass_to_json(results.mass);
    out["capability"] = capability_to_json(results.capability);
    out["checks"] = array_of(results.checks, check_to_json);
    out["notes"] = results.notes;
    if (options.include_history)
        out["history"] = array_of(results.history, sample_to_json);
    if (!options.keep_non_finite)
        null_non_finite(out);
    return out;
}

std::vector<std::string> non_finite_figures(const Results& results, bool include_history) {
    std::vector<std::string> paths;
    std::string path;
    const Json document =
        results_to_json(results, {.include_history = false, .keep_non_finite = true});
    if (holds_non_finite(document))
        collect_non_finite(document, path, paths);
    // The history's samples read directly, column by column (the history_columns the writer
    // writes), not built into a document: they are most of the results.
    if (include_history) {
        for (std::size_t i = 0; i < results.history.size(); ++i) {
            for (const HistoryColumn& column : history_columns) {
                if (!std::isfinite(results.history[i].*column.value))
                    paths.push_back(fmt::format("history[{}].{}", i, column.key));
            }
        }
    }
    return paths;
}

std::string write_results(const Results& results, ResultsWriteOptions options) {
    return results_to_json(results, options).dump(2) + "\n";
}

}  // namespace ds
