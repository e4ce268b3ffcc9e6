#include "design/reader.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <fstream>
#include <iterator>
#include <span>
#include <sstream>
#include <unordered_map>
#include <utility>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

#include "design/atmosphere_csv.hpp"
#include "design/schema.hpp"
#include "design/text_file.hpp"
#include "parachute/canopy.hpp"

namespace ds {

std::string ReadError::text() const {
    return path.empty() ? message : path + ": " + message;
}

std::optional<std::string> number_problem(const ValueRange& range, double x) {
    // The parser already refuses NaN and overflow; the rule is kept for any other source.
    if (!std::isfinite(x))
        return "must be finite";
    if (!range.contains(x))
        return fmt::format("{}, got {}", range.requirement(), x);
    return std::nullopt;
}

bool read_by_rules_between_keys(std::string_view path) {
    // The keys check_interface_above_site, check_table_coverage, check_nose_radius and
    // check_conic_entry read (keep this list with them).
    constexpr std::array<std::string_view, 7> keys{"site.elevation_m",
                                                   "entry.interface_altitude_m",
                                                   "aeroshell.nose_radius_m",
                                                   "aeroshell.diameter_m",
                                                   "entry.approach.periapsis_altitude_m",
                                                   "entry.orbit.periapsis_altitude_m",
                                                   "entry.orbit.apoapsis_altitude_m"};
    return std::find(keys.begin(), keys.end(), path) != keys.end();
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
    void add(const Place& place, std::string message, bool unused_key = false) {
        found_.push_back({place.position, ReadError{place.path, std::move(message), unused_key}});
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

/// The admissible values of a number: the schema's ranges (core/design/schema.hpp).
using Range = ValueRange;

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
    if (std::optional<std::string> problem = number_problem(range, x)) {
        issues.add(place, std::move(*problem));
        return std::nullopt;
    }
    return x;
}

std::string too_many_rows_message(std::size_t rows) {
    return fmt::format("{} rows: a table may have at most {}", rows, most_table_rows);
}

/// The dropped masses the rule between them and the entry mass reads, in the document's order.
constexpr std::array dropped_masses{
    std::pair{"heat_shield_kg", &MassDesign::heat_shield_kg},
    std::pair{"backshell_kg", &MassDesign::backshell_kg},
};

std::string dropped_mass_message(double entry_kg, double value) {
    return fmt::format("must be less than the entry mass ({} kg), got {}", entry_kg, value);
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

    /// A key's value without asking for it (null when absent).
    const Json* peek(std::string_view key) const {
        const auto it = object_->find(std::string(key));
        return it == object_->end() ? nullptr : &*it;
    }

    /// Whether a key was asked for already.
    bool asked(std::string_view key) const {
        return std::find(read_.begin(), read_.end(), key) != read_.end();
    }

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

    /// A key that is there but not used here (another model's or method's).
    void report_unused(std::string_view key, std::string message) {
        issues_->add(place_of(key), std::move(message), true);
    }

    /// An error about the object as a whole.
    void report_here(std::string message) { issues_->add(place_, std::move(message)); }

    /// Reports every key that no one asked for.
    void report_unknown() {
        std::size_t index = 0;
        for (auto it = object_->begin(); it != object_->end(); ++it, ++index) {
            if (std::find(read_.begin(), read_.end(), it.key()) == read_.end()) {
                issues_->add(place_.key(it.key(), index), "unknown key", true);
            }
        }
    }

private:
    const Json* object_;
    Place place_;
    Issues* issues_;
    std::vector<std::string> read_;
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

/// Reads the sections of a parsed document into a Design, reporting every problem. Simple keys
/// are read by walking the schema's rows of a section (core/design/schema.hpp); what spans
/// keys or sections is read by hand.
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

        read_keys(top, {}, {});
        for (const SectionRow& section : design_sections())
            read_section(top, section);
        top.report_unknown();

        check_custom_body_gas();
        check_standard_atmosphere();
        check_interface_above_site();
        check_conic_entry();
        check_table_coverage();
        check_terminal_sequence();
        return design_;
    }

private:
    /// The shape a section's document has chosen, as far as it is known: which atmosphere
    /// model, which terminal method. Keys of another model or method are refused.
    struct Selection {
        std::optional<AtmosphereModel> model;
        std::optional<TerminalMethod> method;
        /// The terminal method is missing or unknown: every terminal key is judged as optional.
        bool method_unknown = false;
    };

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

    void read_section(Fields& top, const SectionRow& section) {
        const Need need = section.need == KeyNeed::required ? Need::required : Need::optional;
        if (section.by_hand) {
            if (const Json* value = top.value(section.name, need)) {
                const Place place = top.place_of(section.name);
                if (section.name == "body")
                    read_body(*value, place);
                else if (section.name == "dispersions")
                    read_dispersions(*value, place);
            }
            return;
        }
        auto f = top.object(section.name, need);
        if (!f)
            return;
        if (section.name == "parachute") {
            parachute_ = f;
            if (says_no_parachute(*f))
                return;
        }
        if (section.name == "drogue")
            drogue_ = f;
        if (section.name == "terminal")
            terminal_ = f;
        if (section.add)
            section.add(design_);
        if (section.name == "atmosphere") {
            atmosphere_ = f;
            read_atmosphere(*atmosphere_);
        } else if (section.name == "terminal") {
            read_terminal(*f);
        } else {
            read_keys(*f, section.name, {});
            if (section.name == "aeroshell")
                check_nose_radius(*f);
            if (section.name == "mass")
                read_mass(*f);
            if (section.name == "site")
                site_ = f;
            if (section.name == "entry")
                entry_ = f;
            f->report_unknown();
        }
    }

    /// Reads the schema's keys of a section (or of an object of it, `parent`) that are not read
    /// yet, in the schema's order. Keys an object given stands in place of are refused.
    void read_keys(Fields& f, std::string_view section, const Selection& selection,
                   std::string_view parent = {}) {
        std::vector<const KeyGroup*> groups_read;
        for (const KeyRow* row : keys_of(section)) {
            if (row->parent != parent || f.asked(row->key))
                continue;
            if (refuse_replaced(f, *row))
                continue;
            if (row->group) {
                if (std::find(groups_read.begin(), groups_read.end(), row->group) ==
                    groups_read.end()) {
                    groups_read.push_back(row->group);
                    read_group(f, section, *row->group, selection);
                }
                continue;
            }
            read_key(f, *row, selection);
        }
    }

    /// A key given alongside an object that stands in place of it (the interface speed with an
    /// approach), or an object given with another that stands in place of the same keys, is
    /// refused; a key an object stands in place of is not missing. Returns whether the key is
    /// settled so.
    bool refuse_replaced(Fields& f, const KeyRow& row) {
        for (const KeyRow* object : replacements_of(row)) {
            if (!f.has(object->key))
                continue;
            if (f.has(row.key)) {
                f.value(row.key, Need::optional);
                f.report(row.key, fmt::format("not with {}: it gives the {}", object->key,
                                              fmt::join(object->replaces, " and ")));
            }
            return true;
        }
        if (row.kind != KeyKind::object || row.replaces.empty())
            return false;
        for (const KeyRow* other :
             replacements_of(*find_key(fmt::format("{}.{}", row.section, row.replaces.front())))) {
            if (other == &row)
                break;
            if (f.has(other->key) && f.has(row.key)) {
                f.value(row.key, Need::optional);
                f.report(row.key,
                         fmt::format("not with {}: the entry starts from one of them", other->key));
                return true;
            }
        }
        return false;
    }

    /// Reads the alternatives of a group: their values, then whether one (or at most one)
    /// was given.
    void read_group(Fields& f, std::string_view section, const KeyGroup& group,
                    const Selection& selection) {
        std::vector<std::string_view> members;
        std::vector<std::string_view> given;
        const KeyRow* first = nullptr;
        for (const KeyRow* row : keys_of(section)) {
            if (row->group != &group)
                continue;
            if (!first)
                first = row;
            members.push_back(row->key);
            if (f.has(row->key))
                given.push_back(row->key);
        }
        for (const KeyRow* row : keys_of(section)) {
            if (row->group == &group)
                read_key(f, *row, selection);
        }
        // A group of another method's keys (an ignition trigger for a canopy method) is not
        // needed; its keys, if given, have been refused.
        const bool group_belongs =
            first->methods.empty() ||
            (selection.method && std::find(first->methods.begin(), first->methods.end(),
                                           *selection.method) != first->methods.end());
        if (group.required && given.empty() && group_belongs) {
            f.report_here(fmt::format("needs one {}: {}", group.name, alternatives(members)));
        } else if (given.size() > 1) {
            f.report_here(
                group.required
                    ? fmt::format("takes one {}, got {}", group.name, fmt::join(given, ", "))
                    : fmt::format("takes {}, not both", alternatives(members)));
        }
    }

    /// "a, b or c".
    static std::string alternatives(const std::vector<std::string_view>& keys) {
        if (keys.size() < 2)
            return fmt::format("{}", fmt::join(keys, ""));
        return fmt::format("{} or {}", fmt::join(keys.begin(), keys.end() - 1, ", "), keys.back());
    }

    /// Reads one key by its row: refused if it belongs to another model or method, else
    /// judged by its kind, need and range, and set in the design.
    void read_key(Fields& f, const KeyRow& row, const Selection& selection) {
        const std::string_view key = row.key;
        if (row.model) {
            // Without a known model the key cannot be judged: the model's error says enough.
            if (!selection.model)
                return;
            if (*row.model != *selection.model) {
                if (f.has(key)) {
                    f.value(key, Need::optional);
                    f.report_unused(
                        key, fmt::format("unknown key for the \"{}\" model (it belongs to "
                                         "the \"{}\" model)",
                                         to_string(*selection.model), to_string(*row.model)));
                }
                return;
            }
        }
        const bool belongs =
            row.methods.empty() || selection.method_unknown ||
            (selection.method && std::find(row.methods.begin(), row.methods.end(),
                                           *selection.method) != row.methods.end());
        if (!belongs) {
            if (f.has(key)) {
                f.value(key, Need::optional);
                f.report_unused(key, fmt::format("only for {}", method_names(row.methods)));
            }
            return;
        }
        KeyNeed need = row.need;
        Range range = row.range;
        if (row.on_canopy && selection.method == TerminalMethod::none) {
            need = row.on_canopy->need;
            range = row.on_canopy->range;
        }
        if (selection.method_unknown)
            need = KeyNeed::optional;
        const Need asked = need == KeyNeed::required ? Need::required : Need::optional;

        switch (row.kind) {
            case KeyKind::number:
                if (auto v = f.number(key, range, asked))
                    set_number(row, *v);
                break;
            case KeyKind::integer:
                if (auto v = f.integer(key, range, asked))
                    set_number(row, static_cast<double>(*v));
                break;
            case KeyKind::text:
                if (auto v = f.string(key, asked)) {
                    row.text.set(design_, *v);
                    read_ok_.push_back(&row);
                }
                break;
            case KeyKind::choice:
                if (auto v = f.string(key, asked)) {
                    if (row.text.set(design_, *v)) {
                        read_ok_.push_back(&row);
                    } else {
                        f.report(key, fmt::format("unknown {} \"{}\"; expected one of: {}", key, *v,
                                                  fmt::join(row.choices(), ", ")));
                    }
                }
                break;
            case KeyKind::number_or_request:
                read_number_or_request(f, row, range, asked);
                break;
            case KeyKind::object:
                if (auto object = f.object(key, asked)) {
                    row.part.add(design_);
                    read_keys(*object, row.section, selection, row.key);
                    object->report_unknown();
                    read_ok_.push_back(&row);
                }
                break;
            case KeyKind::by_hand:
                break;
        }
    }

    void set_number(const KeyRow& row, double value) {
        row.number.set(design_, value);
        read_ok_.push_back(&row);
    }

    /// A number, or an object holding the sizing request's keys.
    void read_number_or_request(Fields& f, const KeyRow& row, const Range& range, Need need) {
        const Json* value = f.value(row.key, need);
        if (!value)
            return;
        const Place place = f.place_of(row.key);
        if (value->is_object()) {
            Fields fields(*value, place, *issues_);
            read_keys(fields, row.section, {}, row.key);
            fields.report_unknown();
        } else if (value->is_number()) {
            if (auto v = to_number(*value, place, range, *issues_))
                set_number(row, *v);
        } else {
            std::vector<std::string> keys;
            for (const KeyRow* key : keys_of(row.section)) {
                if (key->parent == row.key)
                    keys.push_back(fmt::format("\"{}\": ...", key->key));
            }
            issues_->add(place, fmt::format("must be a number or a sizing request {{{}}}, got {}",
                                            fmt::join(keys, ", "), value->type_name()));
        }
    }

    /// Whether a key was read and set (its path, "site.elevation_m").
    bool read_ok(std::string_view path) const {
        return std::any_of(read_ok_.begin(), read_ok_.end(),
                           [&](const KeyRow* row) { return row->path() == path; });
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
        const KeyRow& model = *find_key("atmosphere.model");
        read_key(f, model, {});
        Selection selection;
        if (read_ok(model.path()))
            selection.model = design_.atmosphere.model;
        read_keys(f, "atmosphere", selection);
        read_wind(f);
        // Without a known model the other keys cannot be judged: the model error says enough.
        if (!selection.model)
            return;
        if (*selection.model == AtmosphereModel::table)
            read_table(f);
        f.report_unknown();
    }

    /// The wind: rows by increasing altitude, or one constant wind.
    void read_wind(Fields& f) {
        const Json* wind = f.value("wind", Need::optional);
        if (!wind)
            return;
        const Place place = f.place_of("wind");
        WindDesign& out = design_.atmosphere.wind.emplace();
        if (wind->is_object()) {
            Fields constant(*wind, place, *issues_);
            WindVelocity v;
            v.east_m_s = constant.number("east_m_s", any_finite).value_or(0.0);
            v.north_m_s = constant.number("north_m_s", any_finite).value_or(0.0);
            constant.report_unknown();
            out.constant = v;
            return;
        }
        if (wind->is_array() && wind->size() > most_table_rows) {
            issues_->add(place, too_many_rows_message(wind->size()));
            return;
        }
        if (!wind->is_array() || wind->empty()) {
            issues_->add(place, fmt::format("must be rows [{{\"altitude_m\", \"east_m_s\", "
                                            "\"north_m_s\"}}, ...] or one wind {{\"east_m_s\", "
                                            "\"north_m_s\"}}, got {}",
                                            wind->is_array() ? "no rows" : wind->type_name()));
            return;
        }
        for (std::size_t i = 0; i < wind->size(); ++i) {
            const Place row_place = place.element(i);
            const Json& item = (*wind)[i];
            WindRow values;
            std::optional<double> altitude;
            if (item.is_array()) {
                // The compact row [altitude_m, east_m_s, north_m_s] of the design contract.
                if (item.size() != 3) {
                    issues_->add(row_place, fmt::format("must be [altitude_m, east_m_s, "
                                                        "north_m_s], got {} values",
                                                        item.size()));
                    continue;
                }
                altitude = to_number(item[0], row_place.element(0), any_finite, *issues_);
                values.east_m_s =
                    to_number(item[1], row_place.element(1), any_finite, *issues_).value_or(0.0);
                values.north_m_s =
                    to_number(item[2], row_place.element(2), any_finite, *issues_).value_or(0.0);
            } else if (item.is_object()) {
                Fields row(item, row_place, *issues_);
                altitude = row.number("altitude_m", any_finite);
                values.east_m_s = row.number("east_m_s", any_finite).value_or(0.0);
                values.north_m_s = row.number("north_m_s", any_finite).value_or(0.0);
                row.report_unknown();
            } else {
                issues_->add(row_place, fmt::format("must be an object or [altitude_m, east_m_s, "
                                                    "north_m_s], got {}",
                                                    item.type_name()));
                continue;
            }
            if (altitude && !out.rows.empty() && *altitude <= out.rows.back().altitude_m) {
                issues_->add(row_place,
                             fmt::format("altitude_m must be above the previous row's altitude "
                                         "({} m), got {}",
                                         out.rows.back().altitude_m, *altitude));
            }
            values.altitude_m = altitude.value_or(0.0);
            out.rows.push_back(values);
        }
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
        if (rows.size() > most_table_rows) {
            issues_->add(place, too_many_rows_message(rows.size()));
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

    void read_terminal(Fields& f) {
        const KeyRow& method = *find_key("terminal.method");
        read_key(f, method, {});
        Selection selection;
        // Without a known method, only the values are judged: the method error says enough.
        if (read_ok(method.path()))
            selection.method = design_.terminal.method;
        selection.method_unknown = !selection.method;
        read_keys(f, "terminal", selection);
        f.report_unknown();
    }

    /// `"parachute": {"type": "none"}` says what leaving the section out says: no parachute.
    /// Any other key beside it is refused.
    static bool says_no_parachute(Fields& f) {
        const Json* type = f.peek("type");
        if (!type || !type->is_string() || type->get<std::string>() != "none")
            return false;
        f.value("type", Need::required);
        f.report_unknown();
        return true;
    }

    /// The parachute against the terminal method: a method that begins under a canopy needs
    /// one, a powered descent from the entry flies without one (and without a drogue), and a
    /// drogue needs a main parachute to hand over to. A powered descent's deepest throttle is
    /// no more than its throttle.
    void check_terminal_sequence() {
        if (drogue_ && design_.drogue && !design_.parachute) {
            drogue_->report_here(
                "a drogue needs a main parachute to hand over to: add a "
                "parachute section, or remove the drogue");
        }
        if (!terminal_ || !read_ok("terminal.method"))
            return;
        const TerminalMethod method = design_.terminal.method;
        const std::string name(to_string(method));
        if (method == TerminalMethod::supersonic_retro) {
            if (parachute_ && design_.parachute) {
                parachute_->report_here(
                    "not with terminal.method \"supersonic-retro\": a powered descent from the "
                    "entry flies without a parachute (remove the section, or give \"type\": "
                    "\"none\")");
            }
            if (drogue_ && design_.drogue) {
                drogue_->report_here(
                    "not with terminal.method \"supersonic-retro\": a powered "
                    "descent from the entry flies without a drogue");
            }
            const TerminalDesign& t = design_.terminal;
            if (t.min_throttle > t.throttle) {
                if (read_ok("terminal.min_throttle")) {
                    terminal_->report("min_throttle",
                                      fmt::format("must be no more than the throttle ({}), got {}",
                                                  t.throttle, t.min_throttle));
                } else {
                    terminal_->report("throttle",
                                      fmt::format("must be at least the deepest throttle ({}, its "
                                                  "default), got {}",
                                                  t.min_throttle, t.throttle));
                }
            }
        } else if (method != TerminalMethod::none && !design_.parachute) {
            terminal_->report(
                "method",
                fmt::format("\"{}\" begins under a parachute: add a parachute section, or use "
                            "\"supersonic-retro\" for a powered descent from the entry",
                            name));
        }
    }

    void check_nose_radius(Fields& f) {
        const AeroshellDesign& aeroshell = design_.aeroshell;
        if (!read_ok("aeroshell.nose_radius_m") || !aeroshell.diameter_m)
            return;
        if (aeroshell.nose_radius_m > *aeroshell.diameter_m / 2.0) {
            f.report("nose_radius_m",
                     fmt::format("must be no more than half the diameter ({} m), got {}",
                                 *aeroshell.diameter_m / 2.0, aeroshell.nose_radius_m));
        }
    }

    /// The dropped masses against the entry mass, and the items.
    void read_mass(Fields& f) {
        MassDesign& mass = design_.mass;
        for (const auto& [key, member] : dropped_masses) {
            const std::optional<double>& value = mass.*member;
            if (read_ok(fmt::format("mass.{}", key)) && mass.entry_kg && *value >= *mass.entry_kg)
                f.report(key, dropped_mass_message(*mass.entry_kg, *value));
        }
        const Json* items = f.value("items", Need::optional);
        if (items)
            read_mass_items(*items, f.place_of("items"));
        // Without a fixed entry mass the budget is closed from the items (sizing). Items that
        // are not an array have their own error already.
        if (!f.has("entry_kg") && mass.items.empty() && (!items || items->is_array())) {
            f.report("items", "needed to size the budget when mass.entry_kg is not given");
        }
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
                if (auto group = enum_from<MassGroup>(*name)) {
                    item.group = *group;
                    if (leaves_before_entry(*group) && !design_.entry.orbit) {
                        f.report("group", fmt::format("\"{}\" needs entry.orbit: it is the "
                                                      "stage the deorbit burn drops before entry",
                                                      *name));
                    }
                } else {
                    f.report("group", fmt::format("unknown group \"{}\"; expected one of: {}",
                                                  *name, fmt::join(enum_names<MassGroup>(), ", ")));
                }
            }
            if (auto name = f.string("maturity", Need::optional)) {
                if (auto maturity = enum_from<Maturity>(*name)) {
                    item.maturity = *maturity;
                } else {
                    f.report("maturity",
                             fmt::format("unknown maturity \"{}\"; expected one of: {}", *name,
                                         fmt::join(enum_names<Maturity>(), ", ")));
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
            if (auto key = f.string("key")) {
                d.key = *key;
                // One draw per key: a second would be flown while the first is recorded.
                for (std::size_t j = 0; j < design_.dispersions.size(); ++j) {
                    if (design_.dispersions[j].key == d.key) {
                        f.report("key",
                                 fmt::format("\"{}\" is dispersed already (dispersions[{}]): "
                                             "one dispersion per key",
                                             d.key, j));
                    }
                }
            }
            if (auto kind = f.string("distribution")) {
                if (*kind == "normal") {
                    d.distribution = DistributionKind::normal;
                    if (auto v = f.number("sigma", positive))
                        d.sigma = *v;
                } else if (*kind == "uniform") {
                    d.distribution = DistributionKind::uniform;
                    const auto low = f.number("min", any_finite);
                    const auto high = f.number("max", any_finite);
                    if (low && high && !(*low < *high)) {
                        f.report("max",
                                 fmt::format("must be greater than min ({}), got {}", *low, *high));
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
        if (!read_ok("site.elevation_m") || !read_ok("entry.interface_altitude_m"))
            return;
        const double site = design_.site.elevation_m;
        const double entry_interface = design_.entry.interface_altitude_m;
        if (entry_interface <= site) {
            entry_->report("interface_altitude_m",
                           fmt::format("must be above the site elevation ({} m), got {}", site,
                                       entry_interface));
        }
    }

    /// An approach's or an orbit's altitudes against the body and the interface, and its frame.
    void check_conic_entry() {
        EntryDesign& entry = design_.entry;
        if (!entry.from_conic())
            return;
        const char* object = entry.approach ? "approach" : "orbit";
        if (entry_->has("velocity_frame") && read_ok("entry.velocity_frame") &&
            entry.velocity_frame != VelocityFrame::inertial) {
            entry_->report("velocity_frame",
                           fmt::format("must be \"inertial\" with entry.{}: its conic gives the "
                                       "inertial state (leave the key out)",
                                       object));
        }
        entry.velocity_frame = VelocityFrame::inertial;
        if (!read_ok("entry.interface_altitude_m"))
            return;
        const double interface = entry.interface_altitude_m;
        const auto report = [&](std::string_view key, std::string message) {
            issues_->add(entry_->place_of(object).key(key, 0), std::move(message));
        };
        if (entry.approach && read_ok("entry.approach.periapsis_altitude_m")) {
            const double periapsis = *entry.approach->periapsis_altitude_m;
            const double radius = design_.body.body.radius_m;
            if (periapsis >= interface) {
                report("periapsis_altitude_m",
                       fmt::format("must be below the interface altitude ({} m): the arrival "
                                   "would miss the atmosphere, got {}",
                                   interface, periapsis));
            } else if (radius > 0.0 && periapsis < -radius) {
                report("periapsis_altitude_m",
                       fmt::format("must be at least minus the body's radius ({} m), got {}",
                                   -radius, periapsis));
            }
        }
        if (entry.orbit && read_ok("entry.orbit.periapsis_altitude_m")) {
            const OrbitDesign& orbit = *entry.orbit;
            if (orbit.periapsis_altitude_m <= interface) {
                report("periapsis_altitude_m",
                       fmt::format("must be above the interface altitude ({} m): the orbit must "
                                   "stay out of the atmosphere, got {}",
                                   interface, orbit.periapsis_altitude_m));
            }
            if (read_ok("entry.orbit.apoapsis_altitude_m") &&
                orbit.apoapsis_altitude_m < orbit.periapsis_altitude_m) {
                report("apoapsis_altitude_m",
                       fmt::format("must be at least the periapsis altitude ({} m), got {}",
                                   orbit.periapsis_altitude_m, orbit.apoapsis_altitude_m));
            }
        }
    }

    /// A table must span the flight: from the site up to the entry interface.
    void check_table_coverage() {
        if (!table_ok_ || !read_ok("site.elevation_m") || !read_ok("entry.interface_altitude_m"))
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
    std::optional<Fields> parachute_;
    std::optional<Fields> drogue_;
    std::optional<Fields> terminal_;
    bool table_ok_ = false;
    std::string_view table_key_;
    /// The keys read and set, for the checks that span two of them.
    std::vector<const KeyRow*> read_ok_;
};

/// Builds the document as a SAX handler of the parser, reporting keys given twice in one
/// object: the parsed value keeps only one of them, so the other would be silently ignored.
/// Each open object keeps its keys in a hash set, so the check is linear in the document (the
/// callback parser's was quadratic in an array of objects: 400 s for a table of 1e6 rows).
class CheckedDocumentBuilder {
public:
    CheckedDocumentBuilder(Json& document, Issues& issues)
        : builder_(document, /*allow_exceptions=*/true), issues_(&issues) {}

    bool null() {
        count_element();
        return builder_.null();
    }
    bool boolean(bool value) {
        count_element();
        return builder_.boolean(value);
    }
    bool number_integer(Json::number_integer_t value) {
        count_element();
        return builder_.number_integer(value);
    }
    bool number_unsigned(Json::number_unsigned_t value) {
        count_element();
        return builder_.number_unsigned(value);
    }
    bool number_float(Json::number_float_t value, const Json::string_t& text) {
        count_element();
        return builder_.number_float(value, text);
    }
    bool string(Json::string_t& value) {
        count_element();
        return builder_.string(value);
    }
    bool binary(Json::binary_t& value) {
        count_element();
        return builder_.binary(value);
    }
    bool start_object(std::size_t size) {
        frames_.push_back({next_place(), true, {}, {}, 0});
        return builder_.start_object(size);
    }
    bool start_array(std::size_t size) {
        frames_.push_back({next_place(), false, {}, {}, 0});
        return builder_.start_array(size);
    }
    bool key(Json::string_t& name) {
        on_key(name);
        return builder_.key(name);
    }
    bool end_object() {
        close();
        return builder_.end_object();
    }
    bool end_array() {
        close();
        return builder_.end_array();
    }
    bool parse_error(std::size_t position, const std::string& token,
                     const nlohmann::detail::exception& error) {
        return builder_.parse_error(position, token, error);  // throws it
    }

private:
    using Builder = nlohmann::detail::json_sax_dom_parser<Json>;

    struct Frame {
        Place place;
        bool is_object = false;
        std::vector<std::string> keys;                       ///< of an object, in order
        std::unordered_map<std::string, std::size_t> index;  ///< each key's place in `keys`
        std::size_t current = 0;  ///< key index (object) or element index (array)
    };

    Place next_place() const {
        if (frames_.empty())
            return {};
        const Frame& top = frames_.back();
        return top.is_object ? top.place.key(top.keys[top.current], top.current)
                             : top.place.element(top.current);
    }

    void on_key(const std::string& name) {
        Frame& top = frames_.back();
        const auto [found, added] = top.index.try_emplace(name, top.keys.size());
        if (!added) {
            top.current = found->second;
            issues_->add(top.place.key(name, top.current),
                         "given more than once (only one value would be used)");
            return;
        }
        top.keys.push_back(name);
        top.current = top.keys.size() - 1;
    }

    void close() {
        frames_.pop_back();
        count_element();
    }

    void count_element() {
        if (!frames_.empty() && !frames_.back().is_object)
            ++frames_.back().current;
    }

    Builder builder_;
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

std::string too_deep_message() {
    return fmt::format("arrays and objects nest more than {} levels deep: not a design document",
                       max_nesting_depth);
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

std::optional<nlohmann::ordered_json> parse_design_text(std::string_view json_text,
                                                        std::string* error) {
    if (nested_deeper_than(json_text, max_nesting_depth)) {
        *error = too_deep_message();
        return std::nullopt;
    }
    try {
        return Json::parse(json_text.begin(), json_text.end());
    } catch (const Json::exception& e) {
        *error = parse_message(e, json_text);
        return std::nullopt;
    }
}

DesignReadResult read_design(std::string_view json_text,
                             const std::filesystem::path& base_directory) {
    if (nested_deeper_than(json_text, max_nesting_depth))
        return {std::nullopt, {ReadError{{}, too_deep_message()}}};
    Issues issues;
    Json document;
    try {
        CheckedDocumentBuilder builder(document, issues);
        Json::sax_parse(json_text.begin(), json_text.end(), &builder);
    } catch (const Json::exception& error) {
        return {std::nullopt, {ReadError{{}, parse_message(error, json_text)}}};
    }

    return read_parsed(document, base_directory, issues);
}

std::optional<ReadError> dropped_mass_error(const MassDesign& mass) {
    if (!mass.entry_kg)
        return std::nullopt;
    for (const auto& [key, member] : dropped_masses) {
        const std::optional<double>& value = mass.*member;
        if (value && *value >= *mass.entry_kg)
            return ReadError{fmt::format("mass.{}", key),
                             dropped_mass_message(*mass.entry_kg, *value)};
    }
    return std::nullopt;
}

DesignReadResult read_design_document(const nlohmann::ordered_json& document,
                                      const std::filesystem::path& base_directory) {
    Issues issues;
    return read_parsed(document, base_directory, issues);
}

DesignReadResult read_design_file(const std::filesystem::path& file) {
    std::string error;
    const std::optional<std::string> text =
        read_text_file(file, most_design_bytes, "a design", &error);
    if (!text) {
        return {std::nullopt,
                {ReadError{{}, fmt::format("cannot open {}: {}", file.string(), error)}}};
    }
    return read_design(*text, file.parent_path());
}

}  // namespace ds
