#include "design/reader.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <fstream>
#include <iterator>
#include <span>
#include <sstream>
#include <utility>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

#include "design/atmosphere_csv.hpp"
#include "parachute/canopy.hpp"

namespace ds {

std::string ReadError::text() const {
    return path.empty() ? message : path + ": " + message;
}

namespace {

// Parsed in insertion order so that errors can be listed in the order of the document.
using Json = nlohmann::ordered_json;

/// Where a value sits: its path for messages, and its position (the index of each key or
/// element on the way down) so that errors can be listed in document order.
struct Place {
    std::string path;
    std::vector<std::size_t> position;

    Place key(std::string_view name, std::size_t index) const {
        Place child{path.empty() ? std::string(name) : fmt::format("{}.{}", path, name), position};
        child.position.push_back(index);
        return child;
    }

    Place element(std::size_t index) const {
        Place child{fmt::format("{}[{}]", path, index), position};
        child.position.push_back(index);
        return child;
    }
};

/// Every reason the document cannot be read, collected in one pass.
class Issues {
public:
    void add(const Place& place, std::string message) {
        found_.push_back({place.position, ReadError{place.path, std::move(message)}});
    }

    bool empty() const { return found_.empty(); }
    std::size_t count() const { return found_.size(); }

    /// Sorted by place in the document; errors at one place keep the order they were found in.
    std::vector<ReadError> in_document_order() const {
        auto sorted = found_;
        std::stable_sort(sorted.begin(), sorted.end(),
                         [](const Found& a, const Found& b) { return a.position < b.position; });
        std::vector<ReadError> errors;
        errors.reserve(sorted.size());
        for (auto& found : sorted)
            errors.push_back(std::move(found.error));
        return errors;
    }

private:
    struct Found {
        std::vector<std::size_t> position;
        ReadError error;
    };
    std::vector<Found> found_;
};

/// The admissible values of a number. An absent bound does not apply.
struct Range {
    std::optional<double> above;     ///< exclusive lower bound
    std::optional<double> at_least;  ///< inclusive lower bound
    std::optional<double> below;     ///< exclusive upper bound
    std::optional<double> at_most;   ///< inclusive upper bound

    bool contains(double x) const {
        return (!above || x > *above) && (!at_least || x >= *at_least) && (!below || x < *below) &&
               (!at_most || x <= *at_most);
    }

    std::string requirement() const {
        const bool no_upper = !below && !at_most;
        if (above == 0.0 && !at_least && no_upper)
            return "must be positive";
        if (at_least == 0.0 && !above && no_upper)
            return "must not be negative";
        std::vector<std::string> parts;
        if (above)
            parts.push_back(fmt::format("greater than {}", *above));
        if (at_least)
            parts.push_back(fmt::format("at least {}", *at_least));
        if (below)
            parts.push_back(fmt::format("less than {}", *below));
        if (at_most)
            parts.push_back(fmt::format("at most {}", *at_most));
        return fmt::format("must be {}", fmt::join(parts, " and "));
    }
};

constexpr Range any_finite{};
constexpr Range positive{0.0, {}, {}, {}};
constexpr Range non_negative{{}, 0.0, {}, {}};
constexpr Range greater_than_one{1.0, {}, {}, {}};

std::optional<double> to_number(const Json& value, const Place& place, const Range& range,
                                Issues& issues) {
    if (!value.is_number()) {
        issues.add(place, fmt::format("must be a number, got {}", value.type_name()));
        return std::nullopt;
    }
    const double x = value.get<double>();
    // The parser already refuses NaN and overflow; the rule is kept for any other source.
    if (!std::isfinite(x)) {
        issues.add(place, "must be finite");
        return std::nullopt;
    }
    if (!range.contains(x)) {
        issues.add(place, fmt::format("{}, got {}", range.requirement(), x));
        return std::nullopt;
    }
    return x;
}

enum class Need { required, optional };

/// One JSON object of the document: hands out its keys with their checks, remembers which keys
/// were asked for, and reports the others as unknown. Every section is read through it.
class Fields {
public:
    Fields(const Json& object, Place place, Issues& issues)
        : object_(&object), place_(std::move(place)), issues_(&issues) {}

    const Place& place() const { return place_; }

    /// The place of a key; a missing key sorts after the keys that are there.
    Place place_of(std::string_view key) const {
        std::size_t index = 0;
        for (auto it = object_->begin(); it != object_->end(); ++it, ++index) {
            if (it.key() == key)
                break;
        }
        return place_.key(key, index);
    }

    bool has(std::string_view key) const { return object_->contains(std::string(key)); }

    /// The value of a key, which now counts as known; null when absent ("missing" if required).
    const Json* value(std::string_view key, Need need) {
        read_.emplace_back(key);
        const auto it = object_->find(std::string(key));
        if (it == object_->end()) {
            if (need == Need::required)
                report(key, "missing");
            return nullptr;
        }
        return &*it;
    }

    std::optional<double> number(std::string_view key, const Range& range,
                                 Need need = Need::required) {
        const Json* v = value(key, need);
        return v ? to_number(*v, place_of(key), range, *issues_) : std::nullopt;
    }

    std::optional<double> optional_number(std::string_view key, const Range& range) {
        return number(key, range, Need::optional);
    }

    std::optional<std::int64_t> integer(std::string_view key, const Range& range,
                                        Need need = Need::required) {
        const Json* v = value(key, need);
        if (!v)
            return std::nullopt;
        if (!v->is_number_integer()) {
            report(key, fmt::format("must be an integer, got {}",
                                    v->is_number() ? v->dump() : std::string(v->type_name())));
            return std::nullopt;
        }
        const auto n = v->get<std::int64_t>();
        if (!range.contains(static_cast<double>(n))) {
            report(key, fmt::format("{}, got {}", range.requirement(), n));
            return std::nullopt;
        }
        return n;
    }

    std::optional<std::string> string(std::string_view key, Need need = Need::required) {
        const Json* v = value(key, need);
        if (!v)
            return std::nullopt;
        if (!v->is_string()) {
            report(key, fmt::format("must be a string, got {}", v->type_name()));
            return std::nullopt;
        }
        return v->get<std::string>();
    }

    std::optional<Fields> object(std::string_view key, Need need = Need::required) {
        const Json* v = value(key, need);
        if (!v)
            return std::nullopt;
        if (!v->is_object()) {
            report(key, fmt::format("must be an object, got {}", v->type_name()));
            return std::nullopt;
        }
        return Fields(*v, place_of(key), *issues_);
    }

    void report(std::string_view key, std::string message) {
        issues_->add(place_of(key), std::move(message));
    }

    /// An error about the object as a whole.
    void report_here(std::string message) { issues_->add(place_, std::move(message)); }

    /// Reports every key that no one asked for.
    void report_unknown() {
        std::size_t index = 0;
        for (auto it = object_->begin(); it != object_->end(); ++it, ++index) {
            if (std::find(read_.begin(), read_.end(), it.key()) == read_.end()) {
                issues_->add(place_.key(it.key(), index), "unknown key");
            }
        }
    }

private:
    const Json* object_;
    Place place_;
    Issues* issues_;
    std::vector<std::string> read_;
};

/// The document's names of the enumerators, for messages ("expected one of: ...").
template <typename Enum, std::size_t N>
std::string names_of(const std::array<Enum, N>& values) {
    std::vector<std::string_view> names;
    for (const auto value : values)
        names.push_back(to_string(value));
    return fmt::format("{}", fmt::join(names, ", "));
}

constexpr std::array atmosphere_models{AtmosphereModel::exponential, AtmosphereModel::table,
                                       AtmosphereModel::standard};

constexpr std::array terminal_methods{TerminalMethod::retro, TerminalMethod::airbag,
                                      TerminalMethod::tethered, TerminalMethod::none};

constexpr std::array mass_groups{MassGroup::heat_shield, MassGroup::backshell,
                                 MassGroup::descent_stage, MassGroup::payload};

constexpr std::array maturities{Maturity::estimated, Maturity::layout,   Maturity::pre_release,
                                Maturity::released,  Maturity::existing, Maturity::actual};

/// A key that belongs to one atmosphere model only.
struct ModelKey {
    std::string_view key;
    AtmosphereModel model;
};

constexpr std::array model_keys{
    ModelKey{"surface_density_kg_m3", AtmosphereModel::exponential},
    ModelKey{"scale_height_m", AtmosphereModel::exponential},
    ModelKey{"temperature_K", AtmosphereModel::exponential},
    ModelKey{"rows", AtmosphereModel::table},
    ModelKey{"csv_file", AtmosphereModel::table},
};

struct Trigger {
    std::string_view key;
    TriggerKind kind;
    Range range;
};

/// The deploy triggers of a parachute or a decelerator; a stage takes exactly one.
constexpr std::array deploy_triggers{
    Trigger{"deploy_mach", TriggerKind::mach, positive},
    Trigger{"deploy_dynamic_pressure_Pa", TriggerKind::dynamic_pressure, positive},
    Trigger{"deploy_altitude_m", TriggerKind::altitude, any_finite},
};

/// Reads the one deploy trigger of a parachute or a decelerator into kind and value.
void read_deploy_trigger(Fields& f, TriggerKind& kind, double& value) {
    std::vector<std::string_view> given;
    for (const auto& trigger : deploy_triggers) {
        if (f.has(trigger.key))
            given.push_back(trigger.key);
    }
    for (const auto& trigger : deploy_triggers) {
        if (auto v = f.optional_number(trigger.key, trigger.range); v && given.size() == 1) {
            kind = trigger.kind;
            value = *v;
        }
    }
    if (given.empty()) {
        f.report_here(
            "needs one deploy trigger: deploy_mach, deploy_dynamic_pressure_Pa or "
            "deploy_altitude_m");
    } else if (given.size() > 1) {
        f.report_here(fmt::format("takes one deploy trigger, got {}", fmt::join(given, ", ")));
    }
}

constexpr std::array powered_methods{TerminalMethod::retro, TerminalMethod::airbag,
                                     TerminalMethod::tethered};
constexpr std::array airbag_method{TerminalMethod::airbag};
constexpr std::array tethered_method{TerminalMethod::tethered};

/// A terminal key that belongs to some methods only: required for them or with a default.
struct TerminalKey {
    std::string_view key;
    double TerminalDesign::*member;
    Range range;
    std::span<const TerminalMethod> methods;
    Need need;  ///< for the methods it belongs to
};

constexpr Range fraction_of_one{{}, 0.0, 1.0, {}};  // [0, 1)

// touchdown_velocity_m_s belongs to every method and is read between the two tables, in the
// order the writer gives the keys.
constexpr std::array engine_keys{
    TerminalKey{"isp_s", &TerminalDesign::isp_s, positive, powered_methods, Need::required},
    TerminalKey{"thrust_to_weight", &TerminalDesign::thrust_to_weight, greater_than_one,
                powered_methods, Need::required},
};

constexpr std::array burn_keys{
    TerminalKey{"throttle", &TerminalDesign::throttle, Range{0.0, {}, {}, 1.0}, powered_methods,
                Need::optional},
    TerminalKey{"propellant_reserve_fraction", &TerminalDesign::propellant_reserve_fraction,
                fraction_of_one, powered_methods, Need::optional},
    TerminalKey{"propellant_residual_fraction", &TerminalDesign::propellant_residual_fraction,
                fraction_of_one, powered_methods, Need::optional},
    TerminalKey{"release_height_m", &TerminalDesign::release_height_m, non_negative, airbag_method,
                Need::optional},
    TerminalKey{"tether_length_m", &TerminalDesign::tether_length_m, positive, tethered_method,
                Need::optional},
    TerminalKey{"fly_away_s", &TerminalDesign::fly_away_s, non_negative, tethered_method,
                Need::optional},
};

/// Hardware a design may give instead of deriving it, for the methods that fire engines.
struct GivenHardwareKey {
    std::string_view key;
    std::optional<double> TerminalDesign::*member;
};
constexpr std::array given_hardware_keys{
    GivenHardwareKey{"thrust_N", &TerminalDesign::thrust_N},
    GivenHardwareKey{"propellant_loaded_kg", &TerminalDesign::propellant_loaded_kg},
};

/// "method \"airbag\"" or "methods \"retro\", \"airbag\" and \"tethered\"".
std::string method_names(std::span<const TerminalMethod> methods) {
    std::vector<std::string> quoted;
    for (const auto method : methods)
        quoted.push_back(fmt::format("\"{}\"", to_string(method)));
    if (quoted.size() == 1)
        return "method " + quoted.front();
    const std::string last = quoted.back();
    quoted.pop_back();
    return fmt::format("methods {} and {}", fmt::join(quoted, ", "), last);
}

// Bounds of the numerical settings (our choice): tighter than 1e-14 is below double round-off
// for a trajectory; looser than 1e-3 no longer resolves the peaks the checks look at.
constexpr double relative_tolerance_min = 1e-14;
constexpr double relative_tolerance_max = 1e-3;
// The step budget bounds the work of each flight phase. A million steps, five times the
// default, is our bound: a stiff descent that uses them all takes about 5 s and 450 MB
// (Release); one allowed 2^31 - 1 took 24 s and 2.7 GB.
constexpr double max_steps_max = 1'000'000;

// Lift-to-drag ratios of entry vehicles stay well below this (our bound on a plausible input).
constexpr double lift_to_drag_max = 5.0;

/// Reads the sections of a parsed document into a Design, reporting every problem.
class DesignReader {
public:
    DesignReader(std::filesystem::path base_directory, Issues& issues)
        : base_directory_(std::move(base_directory)), issues_(&issues) {}

    Design read(const Json& document) {
        if (!document.is_object()) {
            issues_->add({}, fmt::format("the document must be a JSON object, got {}",
                                         document.type_name()));
            return design_;
        }
        Fields top(document, {}, *issues_);
        if (!read_header(top))
            return design_;

        if (auto name = top.string("name"))
            design_.name = *name;
        if (const Json* body = top.value("body", Need::required)) {
            read_body(*body, top.place_of("body"));
        }
        atmosphere_ = top.object("atmosphere");
        if (atmosphere_)
            read_atmosphere(*atmosphere_);
        site_ = top.object("site");
        if (site_)
            read_site(*site_);
        entry_ = top.object("entry");
        if (entry_)
            read_entry(*entry_);
        if (auto aeroshell = top.object("aeroshell"))
            read_aeroshell(*aeroshell);
        if (auto mass = top.object("mass"))
            read_mass(*mass);
        if (auto decelerator = top.object("decelerator", Need::optional))
            read_decelerator(*decelerator);
        if (auto parachute = top.object("parachute"))
            read_parachute(*parachute);
        if (auto sequence = top.object("sequence", Need::optional))
            read_sequence(*sequence);
        if (auto terminal = top.object("terminal"))
            read_terminal(*terminal);
        if (auto limits = top.object("limits", Need::optional))
            read_limits(*limits);
        if (auto solver = top.object("solver", Need::optional))
            read_solver(*solver);
        if (const Json* dispersions = top.value("dispersions", Need::optional))
            read_dispersions(*dispersions, top.place_of("dispersions"));
        top.report_unknown();

        check_custom_body_gas();
        check_standard_atmosphere();
        check_interface_above_site();
        check_table_coverage();
        return design_;
    }

private:
    /// Format and version; false when the rest is not ours to read.
    bool read_header(Fields& top) {
        if (auto format = top.string("format"); format && *format != design_format_id) {
            top.report("format", fmt::format("must be \"{}\", got \"{}\": not a design document",
                                             design_format_id, *format));
            return false;
        }
        if (auto version = top.integer("version", Range{{}, 1.0, {}, {}})) {
            if (*version > design_format_version) {
                top.report(
                    "version",
                    fmt::format("written by a newer version ({}); this build reads version {}",
                                *version, design_format_version));
                return false;
            }
            design_.version = static_cast<int>(*version);
        }
        return true;
    }

    void read_body(const Json& value, const Place& place) {
        if (value.is_string()) {
            const auto name = value.get<std::string>();
            if (auto body = body_preset(name)) {
                design_.body.preset = name;
                design_.body.body = *body;
            } else {
                issues_->add(place,
                             fmt::format("unknown body \"{}\"; the presets are {} (or describe "
                                         "the body in an object)",
                                         name, fmt::join(body_preset_names(), ", ")));
            }
            return;
        }
        if (!value.is_object()) {
            issues_->add(place, fmt::format("must be a preset name or an object, got {}",
                                            value.type_name()));
            return;
        }
        custom_body_.emplace(value, place, *issues_);
        Fields& f = *custom_body_;
        Body& body = design_.body.body;
        design_.body.preset.clear();
        if (auto name = f.string("name"))
            body.name = *name;
        if (auto v = f.number("radius_m", positive))
            body.radius_m = *v;
        if (auto v = f.number("mu_m3_s2", positive))
            body.mu_m3_s2 = *v;
        if (auto v = f.optional_number("rotation_rad_s", any_finite))
            body.rotation_rad_s = *v;
        if (auto v = f.optional_number("gas_constant_J_kgK", positive)) {
            body.gas.gas_constant_J_kgK = *v;
        }
        if (auto v = f.optional_number("gamma", greater_than_one))
            body.gas.gamma = *v;
        if (auto v = f.optional_number("sutton_graves_k", positive))
            body.gas.sutton_graves_k = *v;
        f.report_unknown();
    }

    void read_atmosphere(Fields& f) {
        AtmosphereDesign& atmosphere = design_.atmosphere;
        const auto model_name = f.string("model");
        std::optional<AtmosphereModel> model;
        if (model_name) {
            model = atmosphere_model_from(*model_name);
            if (!model) {
                f.report("model", fmt::format("unknown model \"{}\"; expected one of: {}",
                                              *model_name, names_of(atmosphere_models)));
            }
        }
        if (auto v = f.optional_number("gas_constant_J_kgK", positive)) {
            atmosphere.gas_constant_J_kgK = v;
        }
        if (auto v = f.optional_number("gamma", greater_than_one))
            atmosphere.gamma = v;
        if (auto v = f.optional_number("density_scale", positive))
            atmosphere.density_scale = *v;
        // Without a known model the other keys cannot be judged: the model error says enough.
        if (!model)
            return;
        atmosphere.model = *model;

        for (const auto& key : model_keys) {
            if (key.model != *model && f.has(key.key)) {
                f.value(key.key, Need::optional);
                f.report(key.key, fmt::format("unknown key for the \"{}\" model (it belongs to "
                                              "the \"{}\" model)",
                                              *model_name, to_string(key.model)));
            }
        }
        switch (*model) {
            case AtmosphereModel::exponential:
                if (auto v = f.number("surface_density_kg_m3", positive)) {
                    atmosphere.surface_density_kg_m3 = *v;
                }
                if (auto v = f.number("scale_height_m", positive))
                    atmosphere.scale_height_m = *v;
                if (auto v = f.number("temperature_K", positive))
                    atmosphere.temperature_K = *v;
                break;
            case AtmosphereModel::table:
                read_table(f);
                break;
            case AtmosphereModel::standard:
                break;
        }
        f.report_unknown();
    }

    void read_table(Fields& f) {
        const bool has_rows = f.has("rows");
        const bool has_csv = f.has("csv_file");
        if (has_rows && has_csv) {
            f.value("rows", Need::optional);
            f.value("csv_file", Need::optional);
            f.report_here("a table takes rows or csv_file, not both");
            return;
        }
        if (!has_rows && !has_csv) {
            f.report_here("a table needs rows (in the document) or csv_file (beside it)");
            return;
        }
        if (has_rows) {
            table_key_ = "rows";
            read_rows(f);
        } else {
            table_key_ = "csv_file";
            read_csv(f);
        }
    }

    void read_rows(Fields& f) {
        const Json& rows = *f.value("rows", Need::required);
        const Place place = f.place_of("rows");
        if (!rows.is_array()) {
            issues_->add(place, fmt::format("must be an array of rows, got {}", rows.type_name()));
            return;
        }
        const std::size_t issues_before = issues_->count();
        // The last row's altitude, when it was a number to compare with.
        double previous_altitude = 0.0;
        bool have_previous = false;
        for (std::size_t i = 0; i < rows.size(); ++i) {
            const Place row_place = place.element(i);
            if (!rows[i].is_object()) {
                issues_->add(row_place,
                             fmt::format("must be an object, got {}", rows[i].type_name()));
                have_previous = false;
                continue;
            }
            Fields row(rows[i], row_place, *issues_);
            AtmosphereRow values;
            const auto altitude = row.number("altitude_m", any_finite);
            if (altitude && have_previous && *altitude <= previous_altitude) {
                row.report("altitude_m",
                           fmt::format("must be above the previous row's altitude ({} m), got {}",
                                       previous_altitude, *altitude));
            }
            have_previous = altitude.has_value();
            previous_altitude = altitude.value_or(0.0);
            values.altitude_m = altitude.value_or(0.0);
            values.density_kg_m3 = row.number("density_kg_m3", positive).value_or(0.0);
            values.temperature_K = row.number("temperature_K", positive).value_or(0.0);
            row.report_unknown();
            design_.atmosphere.rows.push_back(values);
        }
        if (rows.size() < 2) {
            issues_->add(place, fmt::format("a table needs at least 2 rows, got {}", rows.size()));
        }
        table_ok_ = issues_->count() == issues_before;
    }

    void read_csv(Fields& f) {
        const auto file = f.string("csv_file");
        if (!file)
            return;
        if (file->empty()) {
            f.report("csv_file", "must name a file");
            return;
        }
        design_.atmosphere.csv_file = *file;
        std::filesystem::path path(*file);
        if (path.is_relative() && !base_directory_.empty())
            path = base_directory_ / path;
        const AtmosphereCsv csv = read_atmosphere_csv(path);
        if (!csv.ok()) {
            f.report("csv_file", fmt::format("{}: {}", path.string(), csv.error));
            return;
        }
        const std::size_t issues_before = issues_->count();
        const auto report_row = [&](std::size_t i, std::string message) {
            f.report("csv_file",
                     fmt::format("{}: line {}: {}", path.string(), csv.lines[i], message));
        };
        for (std::size_t i = 0; i < csv.rows.size(); ++i) {
            const AtmosphereRow& row = csv.rows[i];
            if (i > 0 && row.altitude_m <= csv.rows[i - 1].altitude_m) {
                report_row(i, fmt::format("altitude_m must be above the previous row's ({} m), "
                                          "got {}",
                                          csv.rows[i - 1].altitude_m, row.altitude_m));
            }
            if (!positive.contains(row.density_kg_m3)) {
                report_row(
                    i, fmt::format("density_kg_m3 must be positive, got {}", row.density_kg_m3));
            }
            if (!positive.contains(row.temperature_K)) {
                report_row(
                    i, fmt::format("temperature_K must be positive, got {}", row.temperature_K));
            }
        }
        if (csv.rows.size() < 2) {
            f.report("csv_file", fmt::format("{}: a table needs at least 2 rows, got {}",
                                             path.string(), csv.rows.size()));
        }
        design_.atmosphere.rows = csv.rows;
        table_ok_ = issues_->count() == issues_before;
    }

    void read_site(Fields& f) {
        if (auto v = f.number("elevation_m", any_finite)) {
            design_.site.elevation_m = *v;
            site_elevation_ok_ = true;
        }
        f.report_unknown();
    }

    void read_entry(Fields& f) {
        EntryDesign& entry = design_.entry;
        if (auto v = f.number("interface_altitude_m", positive)) {
            entry.interface_altitude_m = *v;
            interface_altitude_ok_ = true;
        }
        if (auto v = f.number("velocity_m_s", positive))
            entry.velocity_m_s = *v;
        if (auto v = f.number("flight_path_angle_deg", Range{-90.0, {}, 90.0, {}})) {
            entry.flight_path_angle_deg = *v;
        }
        if (auto v = f.optional_number("lift_to_drag", Range{{}, 0.0, lift_to_drag_max, {}})) {
            entry.lift_to_drag = *v;
        }
        if (auto v = f.optional_number("bank_angle_deg", Range{{}, -180.0, {}, 180.0})) {
            entry.bank_angle_deg = *v;
        }
        f.report_unknown();
    }

    void read_aeroshell(Fields& f) {
        AeroshellDesign& aeroshell = design_.aeroshell;
        if (const Json* diameter = f.value("diameter_m", Need::required)) {
            const Place place = f.place_of("diameter_m");
            if (diameter->is_object()) {
                Fields request(*diameter, place, *issues_);
                aeroshell.size_for_ballistic_coefficient_kg_m2 =
                    request.number("size_for_ballistic_coefficient_kg_m2", positive);
                request.report_unknown();
            } else if (diameter->is_number()) {
                aeroshell.diameter_m = to_number(*diameter, place, positive, *issues_);
            } else {
                issues_->add(place,
                             fmt::format("must be a number or a sizing request "
                                         "{{\"size_for_ballistic_coefficient_kg_m2\": ...}}, "
                                         "got {}",
                                         diameter->type_name()));
            }
        }
        if (auto v = f.optional_number("half_angle_deg", Range{0.0, {}, 90.0, {}})) {
            aeroshell.half_angle_deg = *v;
        }
        if (auto v = f.number("nose_radius_m", positive)) {
            aeroshell.nose_radius_m = *v;
            if (aeroshell.diameter_m && *v > *aeroshell.diameter_m / 2.0) {
                f.report("nose_radius_m",
                         fmt::format("must be no more than half the diameter ({} m), got {}",
                                     *aeroshell.diameter_m / 2.0, *v));
            }
        }
        aeroshell.drag_coefficient = f.optional_number("drag_coefficient", positive);
        f.report_unknown();
    }

    void read_mass(Fields& f) {
        MassDesign& mass = design_.mass;
        mass.entry_kg = f.optional_number("entry_kg", positive);
        if (auto v = f.optional_number("heat_shield_kg", non_negative)) {
            mass.heat_shield_kg = *v;
            if (mass.entry_kg && *v >= *mass.entry_kg) {
                f.report("heat_shield_kg",
                         fmt::format("must be less than the entry mass ({} kg), got {}",
                                     *mass.entry_kg, *v));
            }
        }
        if (auto v = f.optional_number("backshell_kg", non_negative)) {
            mass.backshell_kg = *v;
            if (mass.entry_kg && *v >= *mass.entry_kg) {
                f.report("backshell_kg",
                         fmt::format("must be less than the entry mass ({} kg), got {}",
                                     *mass.entry_kg, *v));
            }
        }
        const Json* items = f.value("items", Need::optional);
        if (items)
            read_mass_items(*items, f.place_of("items"));
        // Without a fixed entry mass the budget is closed from the items (sizing). Items that
        // are not an array have their own error already.
        if (!f.has("entry_kg") && mass.items.empty() && (!items || items->is_array())) {
            f.report("items", "needed to size the budget when mass.entry_kg is not given");
        }
        f.report_unknown();
    }

    void read_mass_items(const Json& items, const Place& place) {
        if (!items.is_array()) {
            issues_->add(place,
                         fmt::format("must be an array of items, got {}", items.type_name()));
            return;
        }
        for (std::size_t i = 0; i < items.size(); ++i) {
            const Place item_place = place.element(i);
            if (!items[i].is_object()) {
                issues_->add(item_place,
                             fmt::format("must be an object, got {}", items[i].type_name()));
                continue;
            }
            Fields f(items[i], item_place, *issues_);
            MassItemDesign item;
            if (auto name = f.string("name")) {
                if (name->empty())
                    f.report("name", "must not be empty");
                item.name = *name;
            }
            if (auto v = f.number("mass_kg", non_negative))
                item.mass_kg = *v;
            if (auto name = f.string("group")) {
                if (auto group = mass_group_from(*name)) {
                    item.group = *group;
                } else {
                    f.report("group", fmt::format("unknown group \"{}\"; expected one of: {}",
                                                  *name, names_of(mass_groups)));
                }
            }
            if (auto name = f.string("maturity", Need::optional)) {
                if (auto maturity = maturity_from(*name)) {
                    item.maturity = *maturity;
                } else {
                    f.report("maturity", fmt::format("unknown maturity \"{}\"; expected one of: {}",
                                                     *name, names_of(maturities)));
                }
            }
            f.report_unknown();
            design_.mass.items.push_back(std::move(item));
        }
    }

    void read_dispersions(const Json& list, const Place& place) {
        if (!list.is_array()) {
            issues_->add(place, fmt::format("must be an array, got {}", list.type_name()));
            return;
        }
        for (std::size_t i = 0; i < list.size(); ++i) {
            const Place entry_place = place.element(i);
            if (!list[i].is_object()) {
                issues_->add(entry_place,
                             fmt::format("must be an object, got {}", list[i].type_name()));
                continue;
            }
            Fields f(list[i], entry_place, *issues_);
            DispersionDesign d;
            if (auto key = f.string("key")) d.key = *key;
            if (auto kind = f.string("distribution")) {
                if (*kind == "normal") {
                    d.distribution = DistributionKind::normal;
                    if (auto v = f.number("sigma", positive)) d.sigma = *v;
                } else if (*kind == "uniform") {
                    d.distribution = DistributionKind::uniform;
                    const auto low = f.number("min", any_finite);
                    const auto high = f.number("max", any_finite);
                    if (low && high && !(*low < *high)) {
                        f.report("max", fmt::format("must be greater than min ({}), got {}",
                                                    *low, *high));
                    }
                    d.min = low.value_or(0.0);
                    d.max = high.value_or(0.0);
                } else {
                    f.report("distribution", fmt::format("unknown distribution \"{}\"; expected "
                                                         "one of: normal, uniform",
                                                         *kind));
                    // Its parameters are not judged against a distribution we do not know.
                    for (const char* parameter : {"sigma", "min", "max"}) {
                        f.value(parameter, Need::optional);
                    }
                }
            }
            f.report_unknown();
            design_.dispersions.push_back(std::move(d));
        }
    }

    void read_decelerator(Fields& f) {
        DeceleratorDesign& decelerator = design_.decelerator.emplace();
        if (auto v = f.number("diameter_m", positive))
            decelerator.diameter_m = *v;
        if (auto v = f.number("drag_coefficient", positive))
            decelerator.drag_coefficient = *v;
        read_deploy_trigger(f, decelerator.trigger, decelerator.trigger_value);
        decelerator.mass_kg = f.optional_number("mass_kg", positive);
        f.report_unknown();
    }

    void read_parachute(Fields& f) {
        ParachuteDesign& parachute = design_.parachute;
        if (auto type = f.string("type")) {
            if (!canopy_type(*type)) {
                std::vector<std::string_view> names;
                for (const CanopyType& known : canopy_types())
                    names.push_back(known.name);
                f.report("type", fmt::format("unknown type \"{}\"; expected one of: {}", *type,
                                             fmt::join(names, ", ")));
            } else {
                parachute.type = *type;
            }
        }
        if (const Json* diameter = f.value("diameter_m", Need::required)) {
            const Place place = f.place_of("diameter_m");
            if (diameter->is_object()) {
                Fields request(*diameter, place, *issues_);
                parachute.size_for_velocity_m_s = request.number("size_for_velocity_m_s", positive);
                parachute.at_height_above_site_m =
                    request.number("at_height_above_site_m", non_negative);
                request.report_unknown();
            } else if (diameter->is_number()) {
                parachute.diameter_m = to_number(*diameter, place, positive, *issues_);
            } else {
                issues_->add(place, fmt::format("must be a number or a sizing request "
                                                "{{\"size_for_velocity_m_s\": ..., "
                                                "\"at_height_above_site_m\": ...}}, got {}",
                                                diameter->type_name()));
            }
        }
        parachute.drag_coefficient = f.optional_number("drag_coefficient", positive);
        read_deploy_trigger(f, parachute.trigger, parachute.trigger_value);
        parachute.mass_kg = f.optional_number("mass_kg", positive);
        f.report_unknown();
    }

    void read_sequence(Fields& f) {
        SequenceDesign& sequence = design_.sequence;
        sequence.heat_shield_jettison_delay_s =
            f.optional_number("heat_shield_jettison_delay_s", non_negative);
        sequence.heat_shield_jettison_dynamic_pressure_Pa =
            f.optional_number("heat_shield_jettison_dynamic_pressure_Pa", positive);
        if (f.has("heat_shield_jettison_delay_s") &&
            f.has("heat_shield_jettison_dynamic_pressure_Pa")) {
            f.report_here(
                "takes heat_shield_jettison_delay_s or heat_shield_jettison_dynamic_pressure_Pa, "
                "not both");
        }
        if (auto v = f.optional_number("ground_sensing_lock_s", non_negative))
            sequence.ground_sensing_lock_s = *v;
        if (auto v = f.optional_number("separation_coast_s", non_negative))
            sequence.separation_coast_s = *v;
        f.report_unknown();
    }

    void read_terminal(Fields& f) {
        TerminalDesign& terminal = design_.terminal;
        std::optional<TerminalMethod> method;
        if (auto name = f.string("method")) {
            method = terminal_method_from(*name);
            if (method) {
                terminal.method = *method;
            } else {
                f.report("method", fmt::format("unknown method \"{}\"; expected one of: {}", *name,
                                               names_of(terminal_methods)));
            }
        }
        // Without a known method, only the values are judged: the method error says enough.
        const auto read_key = [&](const TerminalKey& key) {
            const bool belongs = !method || std::find(key.methods.begin(), key.methods.end(),
                                                      *method) != key.methods.end();
            if (!belongs && f.has(key.key)) {
                f.value(key.key, Need::optional);
                f.report(key.key, fmt::format("only for {}", method_names(key.methods)));
                return;
            }
            const Need need = belongs && method ? key.need : Need::optional;
            if (auto v = f.number(key.key, key.range, need))
                terminal.*key.member = *v;
        };
        for (const auto& key : engine_keys)
            read_key(key);
        // Every method but "none" flies an engine: it cannot be sized without the speed the
        // burn ends at. Landing on the canopy ("none"), the speed is optional.
        const bool powered = method && *method != TerminalMethod::none;
        const Range touchdown = method == TerminalMethod::none ? non_negative : positive;
        if (auto v = f.number("touchdown_velocity_m_s", touchdown,
                              powered ? Need::required : Need::optional)) {
            terminal.touchdown_velocity_m_s = *v;
        }
        for (const auto& key : burn_keys)
            read_key(key);
        for (const auto& [key, member] : given_hardware_keys) {
            if (method && !powered && f.has(key)) {
                f.value(key, Need::optional);
                f.report(key, fmt::format("only for {}", method_names(powered_methods)));
                continue;
            }
            if (auto v = f.optional_number(key, positive)) terminal.*member = *v;
        }
        f.report_unknown();
    }

    void read_limits(Fields& f) {
        for (const auto& field : limit_fields()) {
            // A marginal band is a fraction of the limit (our bound).
            const Range range = field.key == "marginal_band" ? Range{{}, 0.0, 1.0, {}} : any_finite;
            if (auto v = f.optional_number(field.key, range))
                design_.limits.*field.member = *v;
        }
        f.report_unknown();
    }

    void read_solver(Fields& f) {
        SolverDesign& solver = design_.solver;
        const Range tolerance{{}, relative_tolerance_min, {}, relative_tolerance_max};
        if (auto v = f.optional_number("relative_tolerance", tolerance)) {
            solver.relative_tolerance = *v;
        }
        if (auto v = f.optional_number("max_time_s", positive))
            solver.max_time_s = *v;
        const Range steps{0.0, {}, {}, max_steps_max};
        if (auto v = f.integer("max_steps", steps, Need::optional)) {
            solver.max_steps = static_cast<int>(*v);
        }
        f.report_unknown();
    }

    void check_custom_body_gas() {
        if (!custom_body_)
            return;
        const auto atmosphere_has = [&](std::string_view key) {
            return atmosphere_ && atmosphere_->has(key);
        };
        for (const std::string_view key : {"gas_constant_J_kgK", "gamma"}) {
            if (!custom_body_->has(key) && !atmosphere_has(key)) {
                custom_body_->report(key, fmt::format("missing: a custom body needs its gas "
                                                      "(give {} here or in the atmosphere)",
                                                      key));
            }
        }
        if (!custom_body_->has("sutton_graves_k")) {
            custom_body_->report("sutton_graves_k",
                                 "missing: a custom body needs its Sutton-Graves constant "
                                 "(kg^0.5/m) for the stagnation heating");
        }
    }

    void check_standard_atmosphere() {
        if (!atmosphere_ || design_.atmosphere.model != AtmosphereModel::standard)
            return;
        if (custom_body_) {
            atmosphere_->report("model",
                                fmt::format("the standard model needs a preset body ({}); give a "
                                            "custom body an exponential or table model",
                                            fmt::join(body_preset_names(), ", ")));
        }
    }

    void check_interface_above_site() {
        if (!site_elevation_ok_ || !interface_altitude_ok_)
            return;
        const double site = design_.site.elevation_m;
        const double entry_interface = design_.entry.interface_altitude_m;
        if (entry_interface <= site) {
            entry_->report("interface_altitude_m",
                           fmt::format("must be above the site elevation ({} m), got {}", site,
                                       entry_interface));
        }
    }

    /// A table must span the flight: from the site up to the entry interface.
    void check_table_coverage() {
        if (!table_ok_ || !site_elevation_ok_ || !interface_altitude_ok_)
            return;
        const auto& rows = design_.atmosphere.rows;
        const double low = rows.front().altitude_m;
        const double high = rows.back().altitude_m;
        const double site = design_.site.elevation_m;
        const double entry_interface = design_.entry.interface_altitude_m;
        std::vector<std::string> missing;
        if (low > site)
            missing.push_back(fmt::format("{} m (site elevation) to {} m", site, low));
        if (high < entry_interface) {
            missing.push_back(fmt::format("{} m to {} m (entry interface)", high, entry_interface));
        }
        if (!missing.empty()) {
            atmosphere_->report(table_key_,
                                fmt::format("the table spans {} m to {} m and must cover the "
                                            "flight from the site to the entry interface; "
                                            "missing {}",
                                            low, high, fmt::join(missing, " and ")));
        }
    }

    std::filesystem::path base_directory_;
    Issues* issues_;
    Design design_;

    // Sections kept for the checks that span two of them.
    std::optional<Fields> custom_body_;
    std::optional<Fields> atmosphere_;
    std::optional<Fields> site_;
    std::optional<Fields> entry_;
    bool table_ok_ = false;
    std::string_view table_key_;
    bool site_elevation_ok_ = false;
    bool interface_altitude_ok_ = false;
};

/// Reports keys given twice in one object while parsing: the parsed value keeps only one of
/// them, so the other would be silently ignored.
class DuplicateKeys {
public:
    explicit DuplicateKeys(Issues& issues) : issues_(&issues) {}

    bool on_event(Json::parse_event_t event, const Json& parsed) {
        switch (event) {
            case Json::parse_event_t::object_start:
            case Json::parse_event_t::array_start:
                frames_.push_back(
                    {next_place(), event == Json::parse_event_t::object_start, {}, 0});
                break;
            case Json::parse_event_t::key:
                on_key(parsed.get<std::string>());
                break;
            case Json::parse_event_t::object_end:
            case Json::parse_event_t::array_end:
                frames_.pop_back();
                count_element();
                break;
            case Json::parse_event_t::value:
                count_element();
                break;
        }
        return true;
    }

private:
    struct Frame {
        Place place;
        bool is_object = false;
        std::vector<std::string> keys;  ///< of an object, in order
        std::size_t current = 0;        ///< key index (object) or element index (array)
    };

    Place next_place() const {
        if (frames_.empty())
            return {};
        const Frame& top = frames_.back();
        return top.is_object ? top.place.key(top.keys[top.current], top.current)
                             : top.place.element(top.current);
    }

    void on_key(std::string key) {
        Frame& top = frames_.back();
        const auto found = std::find(top.keys.begin(), top.keys.end(), key);
        if (found != top.keys.end()) {
            top.current = static_cast<std::size_t>(std::distance(top.keys.begin(), found));
            issues_->add(top.place.key(key, top.current),
                         "given more than once (only one value would be used)");
            return;
        }
        top.keys.push_back(std::move(key));
        top.current = top.keys.size() - 1;
    }

    void count_element() {
        if (!frames_.empty() && !frames_.back().is_object)
            ++frames_.back().current;
    }

    Issues* issues_;
    std::vector<Frame> frames_;
};

// A design nests five levels deep (document, mass, items, an item, a value). Far deeper nesting
// is no design, and would cost the duplicate-key check time and memory that grow with the square
// of the depth (each level holds its path), so it is refused before parsing (our bound).
constexpr std::size_t max_nesting_depth = 64;

/// Whether arrays and objects nest deeper than the limit anywhere in the text (strings skipped).
bool nested_deeper_than(std::string_view text, std::size_t limit) {
    std::size_t depth = 0;
    bool in_string = false;
    bool escaped = false;
    for (const char c : text) {
        if (in_string) {
            if (escaped)
                escaped = false;
            else if (c == '\\')
                escaped = true;
            else if (c == '"')
                in_string = false;
        } else if (c == '"') {
            in_string = true;
        } else if (c == '[' || c == '{') {
            if (++depth > limit)
                return true;
        } else if ((c == ']' || c == '}') && depth > 0) {
            --depth;
        }
    }
    return false;
}

/// "line L, column C: what" for a JSON syntax error.
std::string parse_message(const Json::exception& error, std::string_view text) {
    const std::string what = error.what();
    // nlohmann/json: "[json.exception.parse_error.101] parse error at line 3, column 5: ..."
    if (const auto at = what.find(" at line "); at != std::string::npos) {
        return what.substr(at + 4);
    }
    const auto tag_end = what.find("] ");
    std::string message = tag_end == std::string::npos ? what : what.substr(tag_end + 2);
    // A number too large for a double ("number overflow parsing '1e999'") comes without a
    // position: find the number in the text.
    const auto open = message.find('\'');
    const auto close = open == std::string::npos ? open : message.find('\'', open + 1);
    if (close != std::string::npos) {
        const auto literal = std::string_view(message).substr(open + 1, close - open - 1);
        if (const auto offset = text.find(literal); !literal.empty() && offset != text.npos) {
            const auto before = text.substr(0, offset);
            const auto line = std::count(before.begin(), before.end(), '\n') + 1;
            const auto line_start = before.rfind('\n');
            const auto column = line_start == text.npos ? offset + 1 : offset - line_start;
            return fmt::format("line {}, column {}: {} (not a finite number)", line, column,
                               message);
        }
    }
    return message;
}

/// The design of a parsed document, or every issue found in it (with those found before).
DesignReadResult read_parsed(const Json& document, const std::filesystem::path& base_directory,
                             Issues& issues) {
    DesignReader reader(base_directory, issues);
    Design design = reader.read(document);
    if (!issues.empty())
        return {std::nullopt, issues.in_document_order()};
    return {std::move(design), {}};
}

}  // namespace

DesignReadResult read_design(std::string_view json_text,
                             const std::filesystem::path& base_directory) {
    if (nested_deeper_than(json_text, max_nesting_depth)) {
        return {std::nullopt,
                {ReadError{{}, fmt::format("arrays and objects nest more than {} levels deep: "
                                           "not a design document",
                                           max_nesting_depth)}}};
    }
    Issues issues;
    DuplicateKeys duplicates(issues);
    Json document;
    try {
        document = Json::parse(json_text.begin(), json_text.end(),
                               [&duplicates](int, Json::parse_event_t event, Json& parsed) {
                                   return duplicates.on_event(event, parsed);
                               });
    } catch (const Json::exception& error) {
        return {std::nullopt, {ReadError{{}, parse_message(error, json_text)}}};
    }

    return read_parsed(document, base_directory, issues);
}

DesignReadResult read_design_document(const nlohmann::ordered_json& document,
                                      const std::filesystem::path& base_directory) {
    Issues issues;
    return read_parsed(document, base_directory, issues);
}

DesignReadResult read_design_file(const std::filesystem::path& file) {
    std::ifstream in(file, std::ios::binary);
    if (!in)
        return {std::nullopt, {ReadError{{}, fmt::format("cannot open {}", file.string())}}};
    std::ostringstream text;
    text << in.rdbuf();
    return read_design(text.str(), file.parent_path());
}

}  // namespace ds
