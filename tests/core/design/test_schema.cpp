#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <map>
#include <set>
#include <span>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "body/body.hpp"
#include "design/key_path.hpp"
#include "design/reader.hpp"
#include "design/schema.hpp"
#include "design/writer.hpp"
#include "parachute/canopy.hpp"
#include "support/preset_body.hpp"

namespace {

using Json = nlohmann::ordered_json;

/// A value the range admits, different for each salt (so that two keys rarely share one).
double value_in(const ds::ValueRange& range, std::size_t salt) {
    const double step = 0.125 * static_cast<double>(1 + salt % 7);
    const std::optional<double> low = range.above ? range.above : range.at_least;
    const std::optional<double> high = range.below ? range.below : range.at_most;
    if (low && high)
        return *low + (*high - *low) * (0.25 + 0.0625 * static_cast<double>(salt % 8));
    if (low)
        return *low + step;
    if (high)
        return *high - step;
    return -3.0 * step;
}

/// The shape of a design: the name of each choice, the one key given of each group, whether
/// each number-or-request key is a request, which objects (an approach, an orbit) it has,
/// whether the decelerator is there.
struct Shape {
    std::map<std::string, std::string> choice;
    std::map<std::string, std::string> member;  ///< "section/group name" -> key
    std::map<std::string, bool> request;
    std::map<std::string, bool> object;
    bool decelerator = true;
};

/// "entry.approach" for a key of the approach.
std::string parent_path(const ds::KeyRow& row) {
    return std::string(row.section) + "." + std::string(row.parent);
}

bool is_object(const std::string& path) {
    const ds::KeyRow* row = ds::find_key(path);
    return row && row->kind == ds::KeyKind::object;
}

std::string group_id(const ds::KeyRow& row) {
    return std::string(row.section) + "/" + std::string(row.group->name);
}

/// The first shape: every choice's first name, every group's first key, numbers, a decelerator.
Shape first_shape() {
    Shape shape;
    for (const ds::KeyRow& row : ds::design_keys()) {
        if (row.kind == ds::KeyKind::choice)
            shape.choice.emplace(row.path(), std::string(row.choices().front()));
        if (row.group)
            shape.member.emplace(group_id(row), std::string(row.key));
        if (row.kind == ds::KeyKind::number_or_request)
            shape.request.emplace(row.path(), false);
        if (row.kind == ds::KeyKind::object)
            shape.object.emplace(row.path(), false);
    }
    return shape;
}

/// Every shape that differs from the first in one respect: each name of each choice, each key
/// of each group, each request, no decelerator.
std::vector<Shape> every_shape() {
    std::vector<Shape> shapes{first_shape()};
    for (const ds::KeyRow& row : ds::design_keys()) {
        if (row.kind == ds::KeyKind::choice) {
            for (const std::string_view name : row.choices()) {
                Shape shape = first_shape();
                shape.choice[row.path()] = std::string(name);
                shapes.push_back(shape);
            }
        }
        if (row.group) {
            Shape shape = first_shape();
            shape.member[group_id(row)] = std::string(row.key);
            // A group of one method's keys (the ignition trigger) in a design of that method.
            if (!row.methods.empty())
                shape.choice["terminal.method"] = std::string(ds::to_string(row.methods.front()));
            if (!row.parent.empty() && is_object(parent_path(row)))
                shape.object[parent_path(row)] = true;
            shapes.push_back(shape);
        }
        if (row.kind == ds::KeyKind::object) {
            Shape shape = first_shape();
            shape.object[row.path()] = true;
            shapes.push_back(shape);
        }
        if (row.kind == ds::KeyKind::number_or_request) {
            Shape shape = first_shape();
            shape.request[row.path()] = true;
            shapes.push_back(shape);
        }
    }
    Shape without = first_shape();
    without.decelerator = false;
    shapes.push_back(without);
    return shapes;
}

/// A design of the shape with every key of the schema it can take set to a value of the key's
/// range, set through the schema's own access: a new key is exercised without a new line here.
ds::Design design_of(const Shape& shape) {
    ds::Design d;
    d.name = "every key";
    d.body = ds::test::preset_body("mars");
    d.mass.items = {{"lander", 120.5, ds::MassGroup::descent_stage, ds::Maturity::layout}};
    d.dispersions = {{"entry.flight_path_angle_deg", ds::DistributionKind::normal, 0.25, 0, 0},
                     {"atmosphere.density_scale", ds::DistributionKind::uniform, 0, 0.85, 1.15}};
    if (shape.decelerator)
        d.decelerator.emplace();
    std::size_t salt = 0;
    for (const ds::KeyRow& row : ds::design_keys()) {
        ++salt;
        if (row.kind == ds::KeyKind::by_hand || row.kind == ds::KeyKind::text)
            continue;
        if (row.section == "decelerator" && !shape.decelerator)
            continue;
        if (row.kind == ds::KeyKind::choice) {
            REQUIRE(row.text.set(d, shape.choice.at(row.path())));
            continue;
        }
        if (row.model && *row.model != d.atmosphere.model)
            continue;
        if (!row.methods.empty() && std::find(row.methods.begin(), row.methods.end(),
                                              d.terminal.method) == row.methods.end())
            continue;
        if (row.group && shape.member.at(group_id(row)) != row.key)
            continue;
        if (row.kind == ds::KeyKind::number_or_request && shape.request.at(row.path()))
            continue;
        if (row.kind == ds::KeyKind::object) {
            if (shape.object.at(row.path()))
                row.part.add(d);
            continue;
        }
        if (!row.parent.empty()) {
            const std::string parent = parent_path(row);
            if (is_object(parent) ? !shape.object.at(parent) : !shape.request.at(parent))
                continue;
        }
        const auto replacements = ds::replacements_of(row);
        if (std::any_of(replacements.begin(), replacements.end(),
                        [&](const ds::KeyRow* object) { return shape.object.at(object->path()); }))
            continue;
        const bool canopy = row.on_canopy && d.terminal.method == ds::TerminalMethod::none;
        double value = value_in(canopy ? row.on_canopy->range : row.range, salt);
        if (row.kind == ds::KeyKind::integer)
            value = std::ceil(value);
        row.number.set(d, value);
    }
    // A powered descent from the entry flies without canopies, and throttles no deeper than
    // its deepest throttle.
    if (d.terminal.method == ds::TerminalMethod::supersonic_retro) {
        d.parachute.reset();
        d.drogue.reset();
        d.terminal.min_throttle = std::min(d.terminal.min_throttle, d.terminal.throttle);
    }
    // What spans keys: a nose within the diameter, drops below the entry mass, the interface
    // above the site, a table that covers the flight.
    if (d.aeroshell.diameter_m)
        d.aeroshell.nose_radius_m = *d.aeroshell.diameter_m / 4.0;
    d.mass.entry_kg = 2500.0;
    d.entry.interface_altitude_m = 125000.0;
    // An entry from a conic is inertial; an orbit lies above the interface and drops its stage.
    if (d.entry.from_conic())
        d.entry.velocity_frame = ds::VelocityFrame::inertial;
    if (d.entry.orbit) {
        d.entry.orbit->periapsis_altitude_m = 250000.0;
        d.entry.orbit->apoapsis_altitude_m = 420000.0;
        d.mass.items.push_back(
            {"cruise structure", 80.0, ds::MassGroup::deorbit_stage, ds::Maturity::estimated});
    }
    if (d.atmosphere.model == ds::AtmosphereModel::table)
        d.atmosphere.rows = {
            {-8000.0, 0.03, 220.0}, {60000.0, 1e-4, 170.0}, {130000.0, 2e-9, 150.0}};
    // The wind in both of its forms: a table under one model, a constant under another.
    if (d.atmosphere.model == ds::AtmosphereModel::exponential)
        d.atmosphere.wind = ds::WindDesign{{{0.0, 4.5, -1.25}, {12000.0, 18.0, 6.0}}, std::nullopt};
    if (d.atmosphere.model == ds::AtmosphereModel::standard)
        d.atmosphere.wind = ds::WindDesign{{}, ds::WindVelocity{-3.0, 7.5}};
    return d;
}

ds::DesignReadResult read_back(const ds::Design& design) {
    return ds::read_design(ds::write_design(design));
}

std::string errors_of(const ds::DesignReadResult& result) {
    std::string text;
    for (const auto& error : result.errors)
        text += error.text() + "\n";
    return text;
}

}  // namespace

TEST_CASE("a design of every key of the schema, in every shape, reads back equal") {
    std::set<std::string> written;
    const std::vector<Shape> shapes = every_shape();
    CHECK(shapes.size() > 20);
    for (std::size_t i = 0; i < shapes.size(); ++i) {
        CAPTURE(i);
        const ds::Design design = design_of(shapes[i]);
        const std::string text = ds::write_design(design);
        INFO(text);
        const ds::DesignReadResult result = read_back(design);
        INFO(errors_of(result));
        REQUIRE(result.ok());
        CHECK(*result.design == design);
        // Writing what was read gives the same text.
        CHECK(ds::write_design(*result.design) == text);
        const Json document = Json::parse(text);
        for (const ds::KeyRow& row : ds::design_keys()) {
            if (document.contains(Json::json_pointer(ds::key_to_pointer(row.path()))))
                written.insert(row.path());
        }
    }
    // The writer gives every key of the schema in some shape: a key it dropped would be lost
    // on every save, and by a dispersion's frozen design.
    for (const ds::KeyRow& row : ds::design_keys()) {
        CAPTURE(row.path());
        if (row.path() == "atmosphere.csv_file")
            continue;  // a file beside the document: the reader test reads one
        CHECK(written.count(row.path()) == 1);
    }
}

TEST_CASE("the built vehicle's hardware and the dispersions survive writing") {
    ds::Design design = design_of(first_shape());
    design.terminal.method = ds::TerminalMethod::retro;
    design.terminal.thrust_N = 6100.0;
    design.terminal.propellant_loaded_kg = 88.5;
    const ds::DesignReadResult result = read_back(design);
    INFO(errors_of(result));
    REQUIRE(result.ok());
    CHECK(result.design->terminal.thrust_N == 6100.0);
    CHECK(result.design->terminal.propellant_loaded_kg == 88.5);
    CHECK(result.design->mass.backshell_kg == design.mass.backshell_kg);
    CHECK(result.design->dispersions == design.dispersions);
    // And a design that differs in one of them is not equal: the comparison sees them.
    ds::Design other = *result.design;
    other.terminal.thrust_N = 6000.0;
    CHECK_FALSE(other == design);
    other = *result.design;
    other.dispersions.pop_back();
    CHECK_FALSE(other == design);
}

TEST_CASE("schema rows: unique paths, access for every number, defaults and suggestions in range") {
    std::set<std::string> paths;
    const ds::Design defaults;
    for (const ds::KeyRow& row : ds::design_keys()) {
        CAPTURE(row.path());
        CHECK(paths.insert(row.path()).second);
        const bool numeric = row.kind == ds::KeyKind::number || row.kind == ds::KeyKind::integer ||
                             row.kind == ds::KeyKind::number_or_request;
        CHECK(numeric == (row.number.get != nullptr && row.number.set != nullptr));
        if (row.kind == ds::KeyKind::choice) {
            REQUIRE(static_cast<bool>(row.choices));
            CHECK_FALSE(row.choices().empty());
            for (const ds::ChoiceText& text : row.choice_texts) {
                const auto names = row.choices();
                CHECK(std::find(names.begin(), names.end(), text.name) != names.end());
            }
        }
        if (row.fallback) {
            CHECK(row.range.contains(*row.fallback));
        }
        if (row.typical) {
            CHECK(row.typical->first <= row.typical->second);
        }
        if (row.need == ds::KeyNeed::defaulted && numeric && row.section != "decelerator") {
            // A default the reader would refuse could never be written back.
            const auto value = row.number.get(defaults);
            REQUIRE(value);
            const bool admitted = row.range.contains(*value) ||
                                  (row.on_canopy && row.on_canopy->range.contains(*value));
            CHECK(admitted);
        }
        if (row.default_value) {
            CHECK(row.range.contains(*row.default_value));
        }
        CHECK((row.section.empty() || ds::find_section(row.section) != nullptr));
        CHECK(ds::find_key(row.path()) == &row);
    }
    // With the jettison's Mach and dynamic pressure and the subsonic canopy's Mach (issue 12).
    CHECK(ds::keys_of("limits").size() == 26);
}

TEST_CASE("the schema's choices come from the one name table of each enumeration") {
    const auto names = [](std::string_view path) { return ds::find_key(path)->choices(); };
    CHECK(names("atmosphere.model") ==
          std::vector<std::string_view>{"exponential", "table", "standard"});
    CHECK(names("terminal.method") ==
          std::vector<std::string_view>{"retro", "airbag", "tethered", "none", "supersonic-retro"});
    std::vector<std::string_view> canopies;
    for (const ds::CanopyType& type : ds::canopy_types())
        canopies.push_back(type.name);
    CHECK(names("parachute.type") == canopies);
}

TEST_CASE("a new optional number key is one row: reader and writer take it from the schema") {
    // Every optional number key (no default): absent, it stays absent through a round trip;
    // present, it is written and read back. No reader or writer code names these keys.
    const ds::Design base = design_of(first_shape());
    for (const ds::KeyRow& row : ds::design_keys()) {
        if (row.kind != ds::KeyKind::number || row.need != ds::KeyNeed::optional || row.group)
            continue;
        if (!row.number.get(base))
            continue;  // not in this shape
        CAPTURE(row.path());
        const Json document = ds::design_to_json(base);
        const Json::json_pointer pointer(ds::key_to_pointer(row.path()));
        REQUIRE(document.contains(pointer));
        Json without = document;
        without[pointer.parent_pointer()].erase(pointer.back());
        const ds::DesignReadResult result = ds::read_design_document(without);
        INFO(errors_of(result));
        REQUIRE(result.ok());
        CHECK_FALSE(row.number.get(*result.design));
        CHECK_FALSE(ds::design_to_json(*result.design).contains(pointer));
    }
}

TEST_CASE("the fuzz dictionary holds every key, section and name of the schema") {
    std::ifstream in(std::string(DESCENT_SIZER_SAMPLES_DIR) + "/../tests/fuzz/design.dict");
    REQUIRE(in);
    std::stringstream text;
    text << in.rdbuf();
    const std::string dictionary = text.str();
    const auto has_key = [&](std::string_view key) {
        return dictionary.find("\"\\\"" + std::string(key) + "\\\":\"") != std::string::npos;
    };
    const auto has_name = [&](std::string_view name) {
        return dictionary.find("\"\\\"" + std::string(name) + "\\\"\"") != std::string::npos;
    };
    for (const ds::SectionRow& section : ds::design_sections()) {
        CAPTURE(section.name);
        CHECK(has_key(section.name));
        for (const ds::ElementKey& element : section.elements) {
            CAPTURE(element.key);
            CHECK(has_key(element.key));
        }
    }
    for (const ds::KeyRow& row : ds::design_keys()) {
        CAPTURE(row.path());
        CHECK(has_key(row.key));
        for (const ds::ElementKey& element : row.elements) {
            CAPTURE(element.key);
            CHECK(has_key(element.key));
        }
        if (row.kind == ds::KeyKind::choice) {
            for (const std::string_view name : row.choices()) {
                CAPTURE(name);
                CHECK(has_name(name));
            }
        }
    }
    for (const std::string& name : ds::body_preset_names()) {
        CAPTURE(name);
        CHECK(has_name(name));
    }
    for (const auto& names : {ds::enum_names<ds::MassGroup>(), ds::enum_names<ds::Maturity>()}) {
        for (const std::string_view name : names) {
            CAPTURE(name);
            CHECK(has_name(name));
        }
    }
}

namespace {

/// Every key of the schema with a unit, the by-hand parts' own keys included: path and unit.
std::vector<std::pair<std::string, std::string_view>> keys_and_units() {
    std::vector<std::pair<std::string, std::string_view>> all;
    for (const ds::SectionRow& section : ds::design_sections()) {
        for (const ds::ElementKey& element : section.elements)
            all.emplace_back(std::string(section.name) + "." + std::string(element.key),
                             element.unit);
    }
    for (const ds::KeyRow& row : ds::design_keys()) {
        if (row.kind != ds::KeyKind::by_hand)
            all.emplace_back(row.path(), row.unit);
        for (const ds::ElementKey& element : row.elements)
            all.emplace_back(row.path() + "." + std::string(element.key), element.unit);
    }
    return all;
}

}  // namespace

TEST_CASE("every key's name spells its schema unit, and a key without one spells none") {
    std::set<std::string> spellings;
    for (const auto& [path, unit] : keys_and_units()) {
        if (!unit.empty())
            spellings.insert("_" + ds::unit_in_key_name(unit));
    }
    // design-file.md: the unit is the end of the key's name.
    for (const auto& [path, unit] : keys_and_units()) {
        CAPTURE(path);
        CAPTURE(unit);
        if (!unit.empty()) {
            CHECK(path.ends_with("_" + ds::unit_in_key_name(unit)));
            continue;
        }
        for (const std::string& spelled : spellings) {
            CAPTURE(spelled);
            CHECK_FALSE(path.ends_with(spelled));
        }
    }
    CHECK(ds::unit_in_key_name("m/s") == "m_s");
    CHECK(ds::unit_in_key_name("kg/m^3") == "kg_m3");
    CHECK(ds::unit_in_key_name("J/(kg K)") == "J_kgK");
    CHECK(ds::unit_in_key_name("m^3/s^2") == "m3_s2");
}

TEST_CASE("the unit of any key of a written document comes from the schema") {
    // Paths as the sheet flattens a written document; an empty unit: none.
    const std::pair<std::string_view, std::string_view> cases[] = {
        {"entry.velocity_m_s", "m/s"},
        {"parachute.diameter_m", "m"},
        {"parachute.diameter_m.size_for_velocity_m_s", "m/s"},
        {"atmosphere.gas_constant_J_kgK", "J/(kg K)"},
        {"atmosphere.wind[12].east_m_s", "m/s"},
        {"atmosphere.wind.north_m_s", "m/s"},  // the constant wind
        {"atmosphere.rows[0].density_kg_m3", "kg/m^3"},
        {"mass.items[3].mass_kg", "kg"},
        {"body.mu_m3_s2", "m^3/s^2"},
        {"limits.peak_deceleration_max_g", "g"},
        {"entry.lift_to_drag", ""},
        {"mass.items[0].name", ""},
        {"dispersions[0].sigma", ""},
        {"body", ""},
        {"no_such.key_m", ""},
    };
    for (const auto& [path, unit] : cases) {
        CAPTURE(path);
        CHECK(ds::unit_of_path(path) == unit);
    }

    // Every key inside the parts written by hand is one of the schema's element keys.
    ds::Design design;
    design.body.body = ds::Body{"test sphere", 2.0e6, 3.0e12, 1.5e-5, {250.0, 1.35, 1.8e-4, ""}};
    design.atmosphere.model = ds::AtmosphereModel::table;
    design.atmosphere.rows = {{0.0, 0.02, 210.0}, {50000.0, 1e-4, 170.0}};
    design.atmosphere.wind = ds::WindDesign{{{0.0, 5.0, -2.0}, {9000.0, 20.0, 3.5}}, std::nullopt};
    design.mass.items = {{"lander", 120.5, ds::MassGroup::descent_stage, ds::Maturity::layout}};
    const Json document = ds::design_to_json(design);
    const auto check_listed = [](const std::string& owner, const Json& object,
                                 std::span<const ds::ElementKey> elements) {
        REQUIRE(object.is_object());
        for (const auto& item : object.items()) {
            CAPTURE(owner);
            CAPTURE(item.key());
            CHECK(std::any_of(elements.begin(), elements.end(),
                              [&](const ds::ElementKey& e) { return e.key == item.key(); }));
        }
    };
    check_listed("body", document["body"], ds::find_section("body")->elements);
    check_listed("atmosphere.rows", document["atmosphere"]["rows"][0],
                 ds::find_key("atmosphere.rows")->elements);
    check_listed("atmosphere.wind", document["atmosphere"]["wind"][0],
                 ds::find_key("atmosphere.wind")->elements);
    check_listed("mass.items", document["mass"]["items"][0], ds::find_key("mass.items")->elements);
}

TEST_CASE("every number the form shows has a label of its own, the limits included") {
    // Regression: the limits were labelled from their keys ("ballistic coefficient max kg m2").
    for (const ds::KeyRow& row : ds::design_keys()) {
        if (row.kind != ds::KeyKind::number && row.kind != ds::KeyKind::number_or_request)
            continue;
        CAPTURE(row.section);
        CAPTURE(row.key);
        CHECK_FALSE(row.label.empty());
    }
    const ds::KeyRow* beta = ds::find_key("limits.ballistic_coefficient_max_kg_m2");
    REQUIRE(beta != nullptr);
    CHECK(ds::label_of(*beta) == "Ballistic coefficient, at most");
    CHECK(beta->unit == "kg/m^2");
}

TEST_CASE("every check points at a key of the schema") {
    for (const ds::CheckField& field : ds::check_fields()) {
        CAPTURE(field.check);
        CHECK(ds::find_key(field.key) != nullptr);
        CHECK(ds::key_of_check(field.check) == field.key);
    }
    CHECK(ds::key_of_check("peak_deceleration") == "entry.flight_path_angle_deg");
    CHECK(ds::key_of_check("no_such_check").empty());
}

TEST_CASE("key paths and JSON pointers are each other's inverse") {
    CHECK(ds::key_to_pointer("mass.items[2].mass_kg") == "/mass/items/2/mass_kg");
    CHECK(ds::pointer_to_key("/mass/items/2/mass_kg") == "mass.items[2].mass_kg");
    CHECK(ds::key_to_pointer("entry.velocity_m_s") == "/entry/velocity_m_s");
    CHECK(ds::pointer_to_key("/entry/velocity_m_s") == "entry.velocity_m_s");
    CHECK(ds::pointer_to_key("/atmosphere/rows/0/altitude_m") == "atmosphere.rows[0].altitude_m");
    CHECK(ds::pointer_to_key("/dispersions/1") == "dispersions[1]");
    for (const ds::KeyRow& row : ds::design_keys()) {
        CAPTURE(row.path());
        CHECK(ds::pointer_to_key(ds::key_to_pointer(row.path())) == row.path());
    }
}
