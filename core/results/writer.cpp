#include "results/writer.hpp"

#include <cmath>
#include <iterator>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <fmt/format.h>

#include "json_values.hpp"
#include "results/history_columns.hpp"

namespace ds {
namespace {

using json::Json;

/// An object of the results, with room for the keys most of them hold, so that filling it
/// does not move the keys already in it.
Json results_object() {
    constexpr std::size_t keys = 16;
    return json::object_with_room(keys);
}

// The document is one walk over the results (write_results_document below), handed a sink:
// DocumentWriter builds the document, NonFiniteFinder names the figures that are not finite
// without building anything. Each sink takes out.number(key, figure), out.text, out.flag,
// out.integer, out.null, out.object(key, fill) and out.array(key, elements, fill).

/// Builds the results document, one object per writer. A figure that is not finite is written
/// as null (JSON has no NaN or infinity).
class DocumentWriter {
public:
    explicit DocumentWriter(Json& node) : node_(node) {}

    void number(std::string_view key, double value) { at(key) = json::number(value); }
    void number(std::string_view key, const std::optional<double>& value) {
        at(key) = json::number(value);
    }
    void integer(std::string_view key, int value) { at(key) = value; }
    void flag(std::string_view key, bool value) { at(key) = value; }
    void text(std::string_view key, std::string_view value) { at(key) = std::string(value); }
    void texts(std::string_view key, const std::vector<std::string>& values) { at(key) = values; }
    void null(std::string_view key) { at(key) = nullptr; }

    /// The object under `key`, filled by fill(writer).
    template <class Fill>
    void object(std::string_view key, Fill&& fill) {
        Json child = results_object();
        DocumentWriter writer(child);
        fill(writer);
        at(key) = std::move(child);
    }
    /// An array of one object per element, each filled by fill(writer, element).
    template <class Range, class Fill>
    void array(std::string_view key, const Range& elements, Fill&& fill) {
        Json list = Json::array();
        for (const auto& element : elements) {
            Json child = results_object();
            DocumentWriter writer(child);
            fill(writer, element);
            list.push_back(std::move(child));
        }
        at(key) = std::move(list);
    }

private:
    Json& at(std::string_view key) { return node_[std::string(key)]; }

    Json& node_;
};

/// Names the figures that are not finite by their paths in the document
/// ("entry.peak_heat_flux_W_cm2", "history[3].mach"), in the document's order. The walk keeps
/// the keys and indices it is under and writes a path out only for a figure it names.
class NonFiniteFinder {
public:
    explicit NonFiniteFinder(std::vector<std::string>& paths) : paths_(paths) {}

    void number(std::string_view key, double value) {
        if (!std::isfinite(value))
            paths_.push_back(path_to(key));
    }
    void number(std::string_view key, const std::optional<double>& value) {
        if (value)
            number(key, *value);
    }
    void integer(std::string_view, int) {}
    void flag(std::string_view, bool) {}
    void text(std::string_view, std::string_view) {}
    void texts(std::string_view, const std::vector<std::string>&) {}
    void null(std::string_view) {}

    template <class Fill>
    void object(std::string_view key, Fill&& fill) {
        under_.push_back({key, std::nullopt});
        fill(*this);
        under_.pop_back();
    }
    template <class Range, class Fill>
    void array(std::string_view key, const Range& elements, Fill&& fill) {
        std::size_t i = 0;
        for (const auto& element : elements) {
            under_.push_back({key, i++});
            fill(*this, element);
            under_.pop_back();
        }
    }

private:
    struct Place {
        std::string_view key;
        std::optional<std::size_t> index;  ///< of an array's element
    };

    std::string path_to(std::string_view key) const {
        std::string path;
        for (const Place& place : under_) {
            fmt::format_to(std::back_inserter(path), "{}{}", path.empty() ? "" : ".", place.key);
            if (place.index)
                fmt::format_to(std::back_inserter(path), "[{}]", *place.index);
        }
        fmt::format_to(std::back_inserter(path), "{}{}", path.empty() ? "" : ".", key);
        return path;
    }

    std::vector<std::string>& paths_;
    std::vector<Place> under_;
};

/// The object of a part the document may lack, or null without it.
template <class Out, class Part, class Write>
void object_or_null(Out& out, std::string_view key, const std::optional<Part>& part,
                    Write&& write) {
    if (part)
        out.object(key, [&](Out& o) { write(o, *part); });
    else
        out.null(key);
}

/// The deploy figures a drag device's object starts with.
template <class Out>
void put_deploy(Out& out, const DeployResults& deploy) {
    out.flag("deployed", deploy.deployed);
    out.number("deploy_time_s", deploy.deploy_time_s);
    out.number("deploy_altitude_m", deploy.deploy_altitude_m);
    out.number("deploy_mach", deploy.deploy_mach);
    out.number("deploy_dynamic_pressure_Pa", deploy.deploy_dynamic_pressure_Pa);
}

template <class Out>
void put_place(Out& out, const TrackPlace& place) {
    out.number("latitude_deg", place.latitude_deg);
    out.number("longitude_deg", place.longitude_deg);
    out.number("downrange_m", place.downrange_m);
    out.number("crossrange_m", place.crossrange_m);
}

template <class Out>
void write_entry_velocity(Out& out, const EntryVelocity& v) {
    out.number("velocity_m_s", v.velocity_m_s);
    out.number("flight_path_angle_deg", v.flight_path_angle_deg);
    out.number("azimuth_deg", v.azimuth_deg);
}

template <class Out>
void write_interface(Out& out, const EntryInterface& i) {
    out.number("latitude_deg", i.latitude_deg);
    out.number("longitude_deg", i.longitude_deg);
    out.flag("rotation_flown", i.rotation_flown);
    out.object("relative", [&](Out& o) { write_entry_velocity(o, i.relative); });
    out.object("inertial", [&](Out& o) { write_entry_velocity(o, i.inertial); });
}

/// The arrival (a design without one writes null: write_results_document).
template <class Out>
void write_approach(Out& out, const ApproachResults& approach) {
    out.number("v_infinity_m_s", approach.v_infinity_m_s);
    out.number("semi_major_axis_m", approach.semi_major_axis_m);
    out.number("eccentricity", approach.eccentricity);
    out.number("periapsis_altitude_m", approach.periapsis_altitude_m);
    out.number("impact_parameter_m", approach.impact_parameter_m);
    out.number("turn_angle_deg", approach.turn_angle_deg);
    out.number("interface_true_anomaly_deg", approach.interface_true_anomaly_deg);
    out.object("inertial", [&](Out& o) { write_entry_velocity(o, approach.inertial); });
    out.object("relative", [&](Out& o) { write_entry_velocity(o, approach.relative); });
}

/// The orbit and its deorbit burn (a design without one writes null).
template <class Out>
void write_orbit(Out& out, const OrbitResults& orbit) {
    out.number("periapsis_altitude_m", orbit.periapsis_altitude_m);
    out.number("apoapsis_altitude_m", orbit.apoapsis_altitude_m);
    out.number("speed_before_burn_m_s", orbit.speed_before_burn_m_s);
    out.number("speed_after_burn_m_s", orbit.speed_after_burn_m_s);
    out.number("delta_v_m_s", orbit.delta_v_m_s);
    out.number("isp_s", orbit.isp_s);
    out.number("propellant_kg", orbit.propellant_kg);
    out.number("stage_kg", orbit.stage_kg);
    out.number("mass_before_burn_kg", orbit.mass_before_burn_kg);
    out.number("transfer_periapsis_altitude_m", orbit.transfer_periapsis_altitude_m);
    out.number("transfer_eccentricity", orbit.transfer_eccentricity);
    out.number("transfer_angle_deg", orbit.transfer_angle_deg);
    out.number("coast_s", orbit.coast_s);
    out.number("interface_true_anomaly_deg", orbit.interface_true_anomaly_deg);
    out.object("inertial", [&](Out& o) { write_entry_velocity(o, orbit.inertial); });
    out.object("relative", [&](Out& o) { write_entry_velocity(o, orbit.relative); });
}

template <class Out>
void write_entry(Out& out, const EntryResults& entry) {
    out.number("mass_kg", entry.mass_kg);
    out.number("diameter_m", entry.diameter_m);
    out.number("nose_radius_m", entry.nose_radius_m);
    out.number("drag_coefficient", entry.drag_coefficient);
    out.text("drag_coefficient_source", to_string(entry.drag_coefficient_source));
    out.number("ballistic_coefficient_kg_m2", entry.ballistic_coefficient_kg_m2);
    out.number("peak_deceleration_g", entry.peak_deceleration_g);
    out.number("peak_deceleration_altitude_m", entry.peak_deceleration_altitude_m);
    out.number("peak_heat_flux_W_cm2", entry.peak_heat_flux_W_cm2);
    out.number("peak_heat_flux_altitude_m", entry.peak_heat_flux_altitude_m);
    out.number("heat_load_J_cm2", entry.heat_load_J_cm2);
    out.text("radiative_heating", entry.radiative_heating);
    out.number("peak_radiative_heat_flux_W_cm2", entry.peak_radiative_heat_flux_W_cm2);
    out.number("radiative_heat_load_J_cm2", entry.radiative_heat_load_J_cm2);
    out.number("peak_dynamic_pressure_Pa", entry.peak_dynamic_pressure_Pa);
    out.number("peak_dynamic_pressure_altitude_m", entry.peak_dynamic_pressure_altitude_m);
    out.number("heat_shield_mass_fraction", entry.heat_shield_mass_fraction);
    out.number("heat_shield_tps_kg", entry.heat_shield_tps_kg);
    out.object("interface", [&](Out& o) { write_interface(o, entry.interface); });
}

template <class Out>
void write_parachute(Out& out, const ParachuteResults& parachute) {
    put_deploy(out, parachute);
    out.number("deploy_velocity_m_s", parachute.deploy_velocity_m_s);
    out.number("diameter_m", parachute.diameter_m);
    out.number("drag_coefficient", parachute.drag_coefficient);
    out.number("drag_coefficient_at_deploy", parachute.drag_coefficient_at_deploy);
    out.number("opening_load_N", parachute.opening_load_N);
    out.number("opening_load_g", parachute.opening_load_g);
    out.number("heat_shield_jettison_mach", parachute.heat_shield_jettison_mach);
    out.number("heat_shield_jettison_dynamic_pressure_Pa",
               parachute.heat_shield_jettison_dynamic_pressure_Pa);
    out.number("inflation_time_s", parachute.inflation_time_s);
    out.number("mass_kg", parachute.mass_kg);
    out.number("heat_shield_jettison_time_s", parachute.heat_shield_jettison_time_s);
    out.number("descent_velocity_m_s", parachute.descent_velocity_m_s);
    out.number("deploy_latitude_deg", parachute.deploy_latitude_deg);
    out.number("deploy_longitude_deg", parachute.deploy_longitude_deg);
    out.number("drift_m", parachute.drift_m);
    out.number("drift_azimuth_deg", parachute.drift_azimuth_deg);
}

template <class Out>
void write_decelerator(Out& out, const DeceleratorResults& decelerator) {
    put_deploy(out, decelerator);
    out.number("diameter_m", decelerator.diameter_m);
    out.number("mass_kg", decelerator.mass_kg);
}

template <class Out>
void write_powered_descent(Out& out, const PoweredDescentResults& p) {
    out.number("ignition_mach", p.ignition_mach);
    out.number("ignition_dynamic_pressure_Pa", p.ignition_dynamic_pressure_Pa);
    out.number("ignition_flight_path_angle_deg", p.ignition_flight_path_angle_deg);
    out.number("thrust_to_weight_at_ignition", p.thrust_to_weight_at_ignition);
    out.number("thrust_coefficient_at_ignition", p.thrust_coefficient_at_ignition);
    out.number("throttle", p.throttle);
    out.flag("ignition_delayed", p.ignition_delayed);
    out.number("drag_preservation", p.drag_preservation);
    out.number("peak_deceleration_g", p.peak_deceleration_g);
    out.number("peak_dynamic_pressure_Pa", p.peak_dynamic_pressure_Pa);
    out.number("propellant_fraction", p.propellant_fraction);
}

template <class Out>
void write_terminal(Out& out, const TerminalResults& terminal) {
    out.text("method", to_string(terminal.method));
    out.number("ignition_altitude_m", terminal.ignition_altitude_m);
    out.number("ignition_velocity_m_s", terminal.ignition_velocity_m_s);
    out.number("delta_v_m_s", terminal.delta_v_m_s);
    out.number("gravity_loss_m_s", terminal.gravity_loss_m_s);
    out.number("propellant_kg", terminal.propellant_kg);
    out.number("burn_time_s", terminal.burn_time_s);
    out.number("ignition_time_s", terminal.ignition_time_s);
    out.number("thrust_N", terminal.thrust_N);
    out.number("burned_propellant_kg", terminal.burned_propellant_kg);
    out.number("touchdown_velocity_m_s", terminal.touchdown_velocity_m_s);
    out.number("impact_velocity_m_s", terminal.impact_velocity_m_s);
    out.number("impact_energy_J", terminal.impact_energy_J);
    out.number("hover_time_s", terminal.hover_time_s);
    out.number("touchdown_horizontal_velocity_m_s", terminal.touchdown_horizontal_velocity_m_s);
    object_or_null(out, "powered_descent", terminal.powered_descent,
                   [](Out& o, const PoweredDescentResults& p) { write_powered_descent(o, p); });
}

template <class Out>
void write_landing(Out& out, const LandingResults& landing) {
    put_place(out, landing);
    out.number("miss_m", landing.miss_m);
    out.number("miss_downrange_m", landing.miss_downrange_m);
    out.number("miss_crossrange_m", landing.miss_crossrange_m);
}

template <class Out>
void write_event(Out& out, const TimelineEvent& event) {
    out.text("name", event.name);
    out.number("time_s", event.time_s);
    out.number("altitude_m", event.altitude_m);
    out.number("velocity_m_s", event.velocity_m_s);
    put_place(out, event);
}

template <class Out>
void write_timeline(Out& out, const Timeline& timeline) {
    out.array("events", timeline.events, [](Out& o, const TimelineEvent& e) { write_event(o, e); });
    out.number("margin_s", timeline.margin_s);
    out.number("available_s", timeline.available_s);
    out.number("needed_s", timeline.needed_s);
}

template <class Out>
void write_closure(Out& out, const MassClosure& closure) {
    out.flag("converged", closure.converged);
    out.integer("iterations", closure.iterations);
    out.number("residual_kg", closure.residual_kg);
}

template <class Out>
void write_item(Out& out, const MassItem& item) {
    out.text("name", item.name);
    out.number("mass_kg", item.mass_kg);
    out.number("basic_kg", item.basic_kg);
    out.number("growth_fraction", item.growth_fraction);
    out.text("group", to_string(item.group));
    out.text("maturity", maturity_name(item));
    out.text("source", item.source);
}

template <class Out>
void write_mass(Out& out, const MassResults& mass) {
    out.text("mode", to_string(mass.mode));
    out.number("entry_kg", mass.entry_kg);
    out.number("landed_kg", mass.landed_kg);
    out.number("unallocated_kg", mass.unallocated_kg);
    out.array("items", mass.items, [](Out& o, const MassItem& item) { write_item(o, item); });
    // The closure of a sized budget; null for a fixed entry mass.
    object_or_null(out, "closure", mass.closure,
                   [](Out& o, const MassClosure& c) { write_closure(o, c); });
}

template <class Out>
void write_capability(Out& out, const Capability& capability) {
    out.number("max_site_elevation_m", capability.max_site_elevation_m);
    if (capability.max_site_elevation_limit)
        out.text("max_site_elevation_limit", to_string(*capability.max_site_elevation_limit));
    else
        out.null("max_site_elevation_limit");
}

template <class Out>
void write_check(Out& out, const Check& check) {
    out.text("id", check.id);
    out.text("status", to_string(check.status));
    out.number("value", check.value);
    out.number("limit", check.limit);
    out.text("unit", check.unit);
    out.text("message", check.message);
    out.text("source", check.source);
    if (check.margin)
        out.number("margin", *check.margin);
}

template <class Out>
void write_sample(Out& out, const TrajectorySample& sample) {
    for (const HistoryColumn& column : history_columns)
        out.number(column.key, sample.*column.value);
}

/// The whole document, in its order.
template <class Out>
void write_results_document(Out& out, const Results& results, bool include_history) {
    out.text("format", results_format_id);
    out.integer("version", results_format_version);
    out.flag("converged", results.converged);
    object_or_null(out, "approach", results.approach,
                   [](Out& o, const ApproachResults& a) { write_approach(o, a); });
    object_or_null(out, "orbit", results.orbit,
                   [](Out& o, const OrbitResults& orbit) { write_orbit(o, orbit); });
    out.object("entry", [&](Out& o) { write_entry(o, results.entry); });
    // The decelerator and the drogue: null without one.
    object_or_null(out, "decelerator", results.decelerator,
                   [](Out& o, const DeceleratorResults& d) { write_decelerator(o, d); });
    object_or_null(out, "drogue", results.drogue,
                   [](Out& o, const ParachuteResults& p) { write_parachute(o, p); });
    out.object("parachute", [&](Out& o) { write_parachute(o, results.parachute); });
    out.object("terminal", [&](Out& o) { write_terminal(o, results.terminal); });
    out.object("timeline", [&](Out& o) { write_timeline(o, results.timeline); });
    object_or_null(out, "landing", results.landing,
                   [](Out& o, const LandingResults& l) { write_landing(o, l); });
    out.object("mass", [&](Out& o) { write_mass(o, results.mass); });
    out.object("capability", [&](Out& o) { write_capability(o, results.capability); });
    out.array("checks", results.checks, [](Out& o, const Check& c) { write_check(o, c); });
    out.texts("notes", results.notes);
    if (include_history) {
        out.array("history", results.history,
                  [](Out& o, const TrajectorySample& s) { write_sample(o, s); });
    }
}

}  // namespace

nlohmann::ordered_json results_to_json(const Results& results, ResultsWriteOptions options) {
    Json document = results_object();
    DocumentWriter writer(document);
    write_results_document(writer, results, options.include_history);
    return document;
}

std::vector<std::string> non_finite_figures(const Results& results, bool include_history) {
    std::vector<std::string> paths;
    NonFiniteFinder finder(paths);
    write_results_document(finder, results, include_history);
    return paths;
}

std::string write_results(const Results& results, ResultsWriteOptions options) {
    return results_to_json(results, options).dump(2) + "\n";
}

}  // namespace ds
