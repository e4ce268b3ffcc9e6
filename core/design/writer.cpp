#include "design/writer.hpp"

#include <cmath>
#include <optional>
#include <string_view>

namespace ds {
namespace {

using Json = nlohmann::ordered_json;

std::string_view key_of(TriggerKind trigger) {
    switch (trigger) {
        case TriggerKind::mach:
            return "deploy_mach";
        case TriggerKind::dynamic_pressure:
            return "deploy_dynamic_pressure_Pa";
        case TriggerKind::altitude:
            return "deploy_altitude_m";
    }
    return {};
}

/// A number, or null when it is not finite: JSON has no NaN or infinity.
Json number(double value) {
    return std::isfinite(value) ? Json(value) : Json(nullptr);
}

/// An optional key: written only when the design has it.
void put_if(Json& object, std::string_view key, const std::optional<double>& value) {
    if (value)
        object[std::string(key)] = number(*value);
}

// A custom body's gas values of zero are the ones the document left to the atmosphere.
void put_if_set(Json& object, std::string_view key, double value) {
    if (value != 0.0)
        object[std::string(key)] = number(value);
}

Json body_to_json(const BodyDesign& design) {
    if (!design.preset.empty())
        return design.preset;
    const Body& body = design.body;
    Json out;
    out["name"] = body.name;
    out["radius_m"] = number(body.radius_m);
    out["mu_m3_s2"] = number(body.mu_m3_s2);
    out["rotation_rad_s"] = number(body.rotation_rad_s);
    put_if_set(out, "gas_constant_J_kgK", body.gas.gas_constant_J_kgK);
    put_if_set(out, "gamma", body.gas.gamma);
    put_if_set(out, "sutton_graves_k", body.gas.sutton_graves_k);
    return out;
}

Json atmosphere_to_json(const AtmosphereDesign& atmosphere) {
    Json out;
    out["model"] = to_string(atmosphere.model);
    switch (atmosphere.model) {
        case AtmosphereModel::exponential:
            out["surface_density_kg_m3"] = number(atmosphere.surface_density_kg_m3);
            out["scale_height_m"] = number(atmosphere.scale_height_m);
            out["temperature_K"] = number(atmosphere.temperature_K);
            break;
        case AtmosphereModel::table:
            // The file stays the source of a table read from one.
            if (!atmosphere.csv_file.empty()) {
                out["csv_file"] = atmosphere.csv_file;
            } else {
                Json rows = Json::array();
                for (const auto& row : atmosphere.rows) {
                    Json item;
                    item["altitude_m"] = number(row.altitude_m);
                    item["density_kg_m3"] = number(row.density_kg_m3);
                    item["temperature_K"] = number(row.temperature_K);
                    rows.push_back(std::move(item));
                }
                out["rows"] = std::move(rows);
            }
            break;
        case AtmosphereModel::standard:
            break;
    }
    put_if(out, "gas_constant_J_kgK", atmosphere.gas_constant_J_kgK);
    put_if(out, "gamma", atmosphere.gamma);
    out["density_scale"] = number(atmosphere.density_scale);
    return out;
}

Json entry_to_json(const EntryDesign& entry) {
    Json out;
    out["interface_altitude_m"] = number(entry.interface_altitude_m);
    out["velocity_m_s"] = number(entry.velocity_m_s);
    out["flight_path_angle_deg"] = number(entry.flight_path_angle_deg);
    out["lift_to_drag"] = number(entry.lift_to_drag);
    out["bank_angle_deg"] = number(entry.bank_angle_deg);
    return out;
}

Json aeroshell_to_json(const AeroshellDesign& aeroshell) {
    Json out;
    // A sizing request is the design's intent and wins over a diameter it may have produced.
    if (aeroshell.size_for_ballistic_coefficient_kg_m2) {
        Json request;
        request["size_for_ballistic_coefficient_kg_m2"] =
            number(*aeroshell.size_for_ballistic_coefficient_kg_m2);
        out["diameter_m"] = std::move(request);
    } else {
        out["diameter_m"] = aeroshell.diameter_m ? number(*aeroshell.diameter_m) : Json(nullptr);
    }
    out["half_angle_deg"] = number(aeroshell.half_angle_deg);
    out["nose_radius_m"] = number(aeroshell.nose_radius_m);
    put_if(out, "drag_coefficient", aeroshell.drag_coefficient);
    return out;
}

Json mass_to_json(const MassDesign& mass) {
    Json out;
    put_if(out, "entry_kg", mass.entry_kg);
    put_if(out, "heat_shield_kg", mass.heat_shield_kg);
    put_if(out, "backshell_kg", mass.backshell_kg);
    Json items = Json::array();
    for (const auto& item : mass.items) {
        Json entry;
        entry["name"] = item.name;
        entry["mass_kg"] = number(item.mass_kg);
        entry["group"] = to_string(item.group);
        entry["maturity"] = to_string(item.maturity);
        items.push_back(std::move(entry));
    }
    out["items"] = std::move(items);
    return out;
}

Json decelerator_to_json(const DeceleratorDesign& decelerator) {
    Json out;
    out["diameter_m"] = number(decelerator.diameter_m);
    out["drag_coefficient"] = number(decelerator.drag_coefficient);
    out[std::string(key_of(decelerator.trigger))] = number(decelerator.trigger_value);
    put_if(out, "mass_kg", decelerator.mass_kg);
    return out;
}

Json parachute_to_json(const ParachuteDesign& parachute) {
    Json out;
    out["type"] = parachute.type;
    if (parachute.size_for_velocity_m_s) {
        Json request;
        request["size_for_velocity_m_s"] = number(*parachute.size_for_velocity_m_s);
        put_if(request, "at_height_above_site_m", parachute.at_height_above_site_m);
        out["diameter_m"] = std::move(request);
    } else {
        out["diameter_m"] = parachute.diameter_m ? number(*parachute.diameter_m) : Json(nullptr);
    }
    put_if(out, "drag_coefficient", parachute.drag_coefficient);
    out[std::string(key_of(parachute.trigger))] = number(parachute.trigger_value);
    put_if(out, "mass_kg", parachute.mass_kg);
    return out;
}

Json sequence_to_json(const SequenceDesign& sequence) {
    Json out;
    put_if(out, "heat_shield_jettison_delay_s", sequence.heat_shield_jettison_delay_s);
    put_if(out, "heat_shield_jettison_dynamic_pressure_Pa",
           sequence.heat_shield_jettison_dynamic_pressure_Pa);
    out["ground_sensing_lock_s"] = number(sequence.ground_sensing_lock_s);
    out["separation_coast_s"] = number(sequence.separation_coast_s);
    return out;
}

Json terminal_to_json(const TerminalDesign& terminal) {
    Json out;
    out["method"] = to_string(terminal.method);
    // Each method carries the keys it flies with, and only those: the reader refuses the others.
    const TerminalMethod method = terminal.method;
    const bool powered = method != TerminalMethod::none;
    if (powered) {
        out["isp_s"] = number(terminal.isp_s);
        out["thrust_to_weight"] = number(terminal.thrust_to_weight);
    }
    out["touchdown_velocity_m_s"] = number(terminal.touchdown_velocity_m_s);
    if (powered) {
        out["throttle"] = number(terminal.throttle);
        out["propellant_reserve_fraction"] = number(terminal.propellant_reserve_fraction);
        out["propellant_residual_fraction"] = number(terminal.propellant_residual_fraction);
    }
    if (method == TerminalMethod::airbag)
        out["release_height_m"] = number(terminal.release_height_m);
    if (method == TerminalMethod::tethered) {
        out["tether_length_m"] = number(terminal.tether_length_m);
        out["fly_away_s"] = number(terminal.fly_away_s);
    }
    if (powered && terminal.thrust_N) out["thrust_N"] = number(*terminal.thrust_N);
    if (powered && terminal.propellant_loaded_kg)
        out["propellant_loaded_kg"] = number(*terminal.propellant_loaded_kg);
    return out;
}

Json limits_to_json(const Limits& limits) {
    Json out = Json::object();
    for (const auto& field : limit_fields()) {
        out[std::string(field.key)] = number(limits.*field.member);
    }
    return out;
}

Json solver_to_json(const SolverDesign& solver) {
    Json out;
    out["relative_tolerance"] = number(solver.relative_tolerance);
    out["max_time_s"] = number(solver.max_time_s);
    out["max_steps"] = solver.max_steps;
    return out;
}

}  // namespace

nlohmann::ordered_json design_to_json(const Design& design) {
    Json out;
    out["format"] = design_format_id;
    out["version"] = design_format_version;
    out["name"] = design.name;
    out["body"] = body_to_json(design.body);
    out["atmosphere"] = atmosphere_to_json(design.atmosphere);
    out["site"] = Json{{"elevation_m", number(design.site.elevation_m)}};
    out["entry"] = entry_to_json(design.entry);
    out["aeroshell"] = aeroshell_to_json(design.aeroshell);
    out["mass"] = mass_to_json(design.mass);
    if (design.decelerator)
        out["decelerator"] = decelerator_to_json(*design.decelerator);
    out["parachute"] = parachute_to_json(design.parachute);
    out["sequence"] = sequence_to_json(design.sequence);
    out["terminal"] = terminal_to_json(design.terminal);
    out["limits"] = limits_to_json(design.limits);
    out["solver"] = solver_to_json(design.solver);
    if (!design.dispersions.empty()) {
        Json list = Json::array();
        for (const DispersionDesign& d : design.dispersions) {
            Json entry;
            entry["key"] = d.key;
            if (d.distribution == DistributionKind::normal) {
                entry["distribution"] = "normal";
                entry["sigma"] = number(d.sigma);
            } else {
                entry["distribution"] = "uniform";
                entry["min"] = number(d.min);
                entry["max"] = number(d.max);
            }
            list.push_back(entry);
        }
        out["dispersions"] = list;
    }
    return out;
}

std::string write_design(const Design& design) {
    return design_to_json(design).dump(2) + "\n";
}

}  // namespace ds
