#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "body/body.hpp"
#include "design/reader.hpp"
#include "design/writer.hpp"

namespace {

using Json = nlohmann::ordered_json;

// The design example of design-file.md, word for word.
constexpr std::string_view contract_example = R"({
  "format": "descent-sizer/design",
  "version": 1,
  "name": "free text",
  "body": "mars",
  "atmosphere": { "model": "exponential",
                  "surface_density_kg_m3": 0.020, "scale_height_m": 11100,
                  "temperature_K": 210, "gas_constant_J_kgK": 188.9, "gamma": 1.29 },
  "site":  { "elevation_m": -1000 },
  "entry": { "interface_altitude_m": 125000, "velocity_m_s": 5600,
             "flight_path_angle_deg": -13.0, "lift_to_drag": 0.0, "bank_angle_deg": 0.0 },
  "aeroshell": { "diameter_m": 2.6, "half_angle_deg": 70, "nose_radius_m": 0.65,
                 "drag_coefficient": 1.65 },
  "mass": { "entry_kg": 560, "heat_shield_kg": 60 },
  "parachute": { "type": "disk-gap-band", "diameter_m": 12.0, "drag_coefficient": 0.55,
                 "deploy_mach": 1.8 },
  "terminal": { "method": "retro", "isp_s": 220, "thrust_to_weight": 2.5,
                "touchdown_velocity_m_s": 2.0 }
})";

Json baseline() {
    return Json::parse(contract_example);
}

/// The baseline with one key set (added or replaced), by JSON pointer.
Json with(Json document, const std::string& pointer, Json value) {
    document[Json::json_pointer(pointer)] = std::move(value);
    return document;
}

/// The baseline with one key taken out, by JSON pointer.
Json without(Json document, const std::string& pointer) {
    const Json::json_pointer key(pointer);
    document[key.parent_pointer()].erase(key.back());
    return document;
}

ds::DesignReadResult read(const Json& document, const std::filesystem::path& base = {}) {
    return ds::read_design(document.dump(), base);
}

std::string error_list(const ds::DesignReadResult& result) {
    std::string text;
    for (const auto& error : result.errors)
        text += error.text() + "\n";
    return text;
}

/// True when an error sits at exactly this path and its message holds the fragment.
bool has_error(const ds::DesignReadResult& result, std::string_view path,
               std::string_view fragment) {
    for (const auto& error : result.errors) {
        if (error.path == path && error.message.find(fragment) != std::string::npos)
            return true;
    }
    return false;
}

/// The reading failed with exactly one error, at `path`, whose message contains `fragment`.
bool only_error(const ds::DesignReadResult& result, std::string_view path,
                std::string_view fragment) {
    return result.errors.size() == 1 && has_error(result, path, fragment);
}

/// A scratch folder for files a test writes, removed when the test ends.
class ScratchFolder {
public:
    explicit ScratchFolder(std::string_view name)
        : path_(std::filesystem::temp_directory_path() /
                ("descent_sizer_test_reader_" + std::string(name))) {
        std::filesystem::remove_all(path_);
        std::filesystem::create_directories(path_);
    }
    ~ScratchFolder() {
        std::error_code ignored;
        std::filesystem::remove_all(path_, ignored);
    }
    ScratchFolder(const ScratchFolder&) = delete;
    ScratchFolder& operator=(const ScratchFolder&) = delete;

    std::filesystem::path write(const std::string& relative, const std::string& text) const {
        const auto file = path_ / relative;
        std::filesystem::create_directories(file.parent_path());
        std::ofstream(file) << text;
        return file;
    }

private:
    std::filesystem::path path_;
};

/// A table atmosphere around Mars-like values, from -2 km to 130 km.
Json table_rows() {
    return Json::array({
        {{"altitude_m", -2000}, {"density_kg_m3", 0.024}, {"temperature_K", 215}},
        {{"altitude_m", 40000}, {"density_kg_m3", 0.0008}, {"temperature_K", 180}},
        {{"altitude_m", 130000}, {"density_kg_m3", 1e-8}, {"temperature_K", 140}},
    });
}

Json table_atmosphere(Json rows) {
    return {{"model", "table"}, {"rows", std::move(rows)}};
}

}  // namespace

TEST_CASE("the design example of design-file.md reads with the values it states") {
    const auto result = ds::read_design(contract_example);
    INFO(error_list(result));
    REQUIRE(result.ok());
    REQUIRE(result.errors.empty());
    const ds::Design& d = *result.design;
    CHECK(d.version == 1);
    CHECK(d.name == "free text");
    CHECK(d.body.preset == "mars");
    CHECK(d.body.body.radius_m == ds::body_preset("mars")->radius_m);
    CHECK(d.atmosphere.model == ds::AtmosphereModel::exponential);
    CHECK(d.atmosphere.surface_density_kg_m3 == 0.020);
    CHECK(d.atmosphere.scale_height_m == 11100.0);
    CHECK(d.atmosphere.temperature_K == 210.0);
    CHECK(d.atmosphere.gas_constant_J_kgK == 188.9);
    CHECK(d.atmosphere.gamma == 1.29);
    CHECK(d.atmosphere.density_scale == 1.0);
    CHECK(d.site.elevation_m == -1000.0);
    CHECK(d.entry.interface_altitude_m == 125000.0);
    CHECK(d.entry.velocity_m_s == 5600.0);
    CHECK(d.entry.flight_path_angle_deg == -13.0);
    CHECK(d.aeroshell.diameter_m == 2.6);
    CHECK_FALSE(d.aeroshell.size_for_ballistic_coefficient_kg_m2.has_value());
    CHECK(d.aeroshell.half_angle_deg == 70.0);
    CHECK(d.aeroshell.nose_radius_m == 0.65);
    CHECK(d.aeroshell.drag_coefficient == 1.65);
    CHECK(d.mass.entry_kg == 560.0);
    CHECK(d.mass.heat_shield_kg == 60.0);
    CHECK(d.parachute->type == "disk-gap-band");
    CHECK(d.parachute->diameter_m == 12.0);
    CHECK(d.parachute->drag_coefficient == 0.55);
    CHECK(d.parachute->trigger == ds::TriggerKind::mach);
    CHECK(d.parachute->trigger_value == 1.8);
    CHECK(d.terminal.method == ds::TerminalMethod::retro);
    CHECK(d.terminal.isp_s == 220.0);
    CHECK(d.terminal.thrust_to_weight == 2.5);
    CHECK(d.terminal.touchdown_velocity_m_s == 2.0);
    // Absent sections and keys keep their defaults.
    CHECK(d.mass.items.empty());
    CHECK_FALSE(d.parachute->mass_kg.has_value());
    CHECK_FALSE(d.decelerator.has_value());
    CHECK_FALSE(d.sequence.heat_shield_jettison_delay_s.has_value());
    CHECK_FALSE(d.sequence.heat_shield_jettison_dynamic_pressure_Pa.has_value());
    CHECK(d.sequence.ground_sensing_lock_s == ds::SequenceDesign{}.ground_sensing_lock_s);
    CHECK(d.sequence.separation_coast_s == ds::SequenceDesign{}.separation_coast_s);
    CHECK(d.terminal.throttle == ds::TerminalDesign{}.throttle);
    CHECK(d.terminal.propellant_reserve_fraction ==
          ds::TerminalDesign{}.propellant_reserve_fraction);
    CHECK(d.terminal.propellant_residual_fraction ==
          ds::TerminalDesign{}.propellant_residual_fraction);
    CHECK(d.limits.peak_deceleration_max_g == ds::Limits{}.peak_deceleration_max_g);
    CHECK(d.solver.max_steps == ds::SolverDesign{}.max_steps);
}

TEST_CASE("optional keys left out take the defaults of the design structs") {
    Json document = without(baseline(), "/entry/lift_to_drag");
    document = without(document, "/entry/bank_angle_deg");
    document = without(document, "/aeroshell/half_angle_deg");
    document = without(document, "/aeroshell/drag_coefficient");
    document = without(document, "/mass/heat_shield_kg");
    document = without(document, "/parachute/drag_coefficient");
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.ok());
    CHECK(result.design->entry.lift_to_drag == 0.0);
    CHECK(result.design->entry.bank_angle_deg == 0.0);
    CHECK(result.design->aeroshell.half_angle_deg == 70.0);
    CHECK_FALSE(result.design->aeroshell.drag_coefficient.has_value());
    CHECK_FALSE(result.design->mass.heat_shield_kg.has_value());
    CHECK_FALSE(result.design->parachute->drag_coefficient.has_value());
}

TEST_CASE("a missing key is reported at its path as missing") {
    const auto result = read(without(baseline(), "/entry/velocity_m_s"));
    REQUIRE_FALSE(result.ok());
    REQUIRE(result.errors.size() == 1);
    CHECK(result.errors[0].path == "entry.velocity_m_s");
    CHECK(result.errors[0].message == "missing");
    CHECK(result.errors[0].text() == "entry.velocity_m_s: missing");
}

TEST_CASE("a value of the wrong type names the type it got") {
    const auto number = read(with(baseline(), "/entry/velocity_m_s", "fast"));
    INFO(error_list(number));
    CHECK(has_error(number, "entry.velocity_m_s", "must be a number, got string"));
    CHECK(number.errors[0].text() == "entry.velocity_m_s: must be a number, got string");

    const auto string = read(with(baseline(), "/name", 42));
    CHECK(has_error(string, "name", "must be a string, got number"));

    const auto object = read(with(baseline(), "/entry", Json::array()));
    CHECK(has_error(object, "entry", "must be an object, got array"));

    const auto integer = read(with(baseline(), "/solver", {{"max_steps", 1.5}}));
    CHECK(has_error(integer, "solver.max_steps", "must be an integer, got 1.5"));
}

TEST_CASE("numbers outside their range name the rule and the value") {
    struct Case {
        std::string pointer;
        Json value;
        std::string path;
        std::string message;
    };
    const std::vector<Case> cases{
        {"/entry/velocity_m_s", -5, "entry.velocity_m_s", "must be positive, got -5"},
        {"/entry/flight_path_angle_deg", -95, "entry.flight_path_angle_deg",
         "must be greater than -90 and less than 90, got -95"},
        {"/entry/lift_to_drag", 5, "entry.lift_to_drag", "must be at least 0 and less than 5"},
        {"/entry/bank_angle_deg", 200, "entry.bank_angle_deg", "at most 180, got 200"},
        {"/aeroshell/half_angle_deg", 90, "aeroshell.half_angle_deg", "less than 90, got 90"},
        {"/aeroshell/drag_coefficient", 0, "aeroshell.drag_coefficient", "must be positive"},
        {"/mass/heat_shield_kg", -1, "mass.heat_shield_kg", "must not be negative, got -1"},
        {"/mass/entry_kg", 0, "mass.entry_kg", "must be positive, got 0"},
        {"/atmosphere/density_scale", 0, "atmosphere.density_scale", "must be positive"},
        {"/atmosphere/gamma", 1.0, "atmosphere.gamma", "must be greater than 1, got 1"},
        {"/terminal/isp_s", 0, "terminal.isp_s", "must be at least 10"},
        {"/terminal/thrust_to_weight", 1.0, "terminal.thrust_to_weight", "greater than 1"},
        {"/terminal/touchdown_velocity_m_s", 0, "terminal.touchdown_velocity_m_s",
         "must be positive"},
        {"/terminal/throttle", 0, "terminal.throttle",
         "must be greater than 0 and at most 1, got 0"},
        {"/terminal/throttle", 1.1, "terminal.throttle", "at most 1, got 1.1"},
        {"/terminal/propellant_reserve_fraction", 1, "terminal.propellant_reserve_fraction",
         "must be at least 0 and less than 1, got 1"},
        {"/terminal/propellant_residual_fraction", -0.01, "terminal.propellant_residual_fraction",
         "must be at least 0 and less than 1, got -0.01"},
        {"/parachute/mass_kg", 0, "parachute.mass_kg", "must be positive, got 0"},
        {"/sequence/heat_shield_jettison_delay_s", -1, "sequence.heat_shield_jettison_delay_s",
         "must not be negative, got -1"},
        {"/sequence/heat_shield_jettison_dynamic_pressure_Pa", 0,
         "sequence.heat_shield_jettison_dynamic_pressure_Pa", "must be positive, got 0"},
        {"/sequence/ground_sensing_lock_s", -2, "sequence.ground_sensing_lock_s",
         "must not be negative, got -2"},
        {"/sequence/separation_coast_s", -0.5, "sequence.separation_coast_s",
         "must not be negative, got -0.5"},
        {"/version", 0, "version", "must be at least 1, got 0"},
        {"/solver/relative_tolerance", 1e-2, "solver.relative_tolerance",
         "must be at least 1e-14 and at most 0.001, got 0.01"},
        {"/solver/max_time_s", -1, "solver.max_time_s", "must be positive"},
        {"/solver/max_steps", 0, "solver.max_steps",
         "must be greater than 0 and at most 1000000, got 0"},
        {"/solver/max_steps", 1000001, "solver.max_steps",
         "must be greater than 0 and at most 1000000, got 1000001"},
        {"/limits/marginal_band", 1.5, "limits.marginal_band", "less than 1"},
    };
    for (const auto& c : cases) {
        CAPTURE(c.pointer);
        const auto result = read(with(baseline(), c.pointer, c.value));
        INFO(error_list(result));
        CHECK_FALSE(result.ok());
        CHECK(has_error(result, c.path, c.message));
    }
}

TEST_CASE("an unknown key is reported at its path") {
    Json document = with(baseline(), "/aeroshell/colour", "red");
    document = with(document, "/speed_m_s", 3);
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.errors.size() == 2);
    CHECK(has_error(result, "aeroshell.colour", "unknown key"));
    CHECK(result.errors[0].text() == "aeroshell.colour: unknown key");
    CHECK(has_error(result, "speed_m_s", "unknown key"));
    // Both are keys the design does not use, which the window offers to drop.
    CHECK(result.errors[0].unused_key);
    CHECK(result.errors[1].unused_key);
}

TEST_CASE(
    "a key is unused where it is unknown or of another model or method, not where it is wrong") {
    const auto rows = read(with(baseline(), "/atmosphere/rows", table_rows()));
    REQUIRE(rows.errors.size() == 1);
    CHECK(rows.errors[0].unused_key);  // another model's key

    const auto wrong = read(with(baseline(), "/aeroshell/diameter_m", -2.0));
    REQUIRE_FALSE(wrong.errors.empty());
    CHECK_FALSE(wrong.errors[0].unused_key);  // a key the design uses, with a bad value
    const auto missing = read(without(baseline(), "/aeroshell/diameter_m"));
    REQUIRE_FALSE(missing.errors.empty());
    CHECK_FALSE(missing.errors[0].unused_key);
}

TEST_CASE("a key given twice in one object is an error, not a silent choice") {
    std::string text(contract_example);
    const std::string site = R"("site":  { "elevation_m": -1000 })";
    text.replace(text.find(site), site.size(),
                 R"("site":  { "elevation_m": -1000, "elevation_m": -3000 })");
    const auto result = ds::read_design(text);
    INFO(error_list(result));
    CHECK(only_error(result, "site.elevation_m", "given more than once"));
}

TEST_CASE("every error of a document is reported, in the order of the document") {
    Json document = with(baseline(), "/site/elevation_m", "low");
    document = with(document, "/entry/velocity_m_s", -1);
    document = with(document, "/aeroshell/colour", "red");
    document = without(document, "/terminal/isp_s");
    document = with(document, "/terminal/skids", true);
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.errors.size() == 5);
    CHECK(result.errors[0].path == "site.elevation_m");
    CHECK(result.errors[1].path == "entry.velocity_m_s");
    CHECK(result.errors[2].path == "aeroshell.colour");
    // Within one object, keys that are there come before keys that are missing.
    CHECK(result.errors[3].path == "terminal.skids");
    CHECK(result.errors[4].path == "terminal.isp_s");
}

TEST_CASE("JSON syntax errors give the line and column, with an empty path") {
    const auto nan =
        ds::read_design("{\n  \"format\": \"descent-sizer/design\",\n  \"version\": NaN\n}");
    REQUIRE(nan.errors.size() == 1);
    CHECK(nan.errors[0].path.empty());
    CHECK(nan.errors[0].message.starts_with("line 3, column 14: "));
    CHECK(nan.errors[0].text() == nan.errors[0].message);

    const auto overflow = ds::read_design("{\n  \"version\": 1,\n  \"name\": 1e999\n}");
    REQUIRE(overflow.errors.size() == 1);
    CHECK(overflow.errors[0].path.empty());
    CHECK(overflow.errors[0].message.starts_with("line 3, column 11: "));
    CHECK(overflow.errors[0].message.find("not a finite number") != std::string::npos);

    const auto truncated = ds::read_design(R"({"format": "descent-sizer/design",)");
    REQUIRE(truncated.errors.size() == 1);
    CHECK(truncated.errors[0].message.starts_with("line 1, column "));

    const auto not_object = ds::read_design("[1, 2]");
    REQUIRE(not_object.errors.size() == 1);
    CHECK(not_object.errors[0].text() == "the document must be a JSON object, got array");
}

TEST_CASE("a document from a newer version is refused with that version named") {
    Json document = with(baseline(), "/version", 2);
    document = with(document, "/warp_drive", true);  // a newer key: not reported as unknown
    const auto result = read(document);
    REQUIRE(result.errors.size() == 1);
    CHECK(result.errors[0].text() ==
          "version: written by a newer version (2); this build reads version 1");
}

TEST_CASE("a document of another format is refused, and so is one without a version") {
    const auto results = read(with(baseline(), "/format", "descent-sizer/results"));
    CHECK(only_error(results, "format", "must be \"descent-sizer/design\""));

    const auto unversioned = read(without(baseline(), "/version"));
    CHECK(has_error(unversioned, "version", "missing"));
}

TEST_CASE("a body is a preset name or an object; unknown presets list the names") {
    const auto venus = read(with(baseline(), "/body", "venus"));
    REQUIRE(venus.ok());
    CHECK(venus.design->body.preset == "venus");
    CHECK(venus.design->body.body.mu_m3_s2 == ds::body_preset("venus")->mu_m3_s2);

    const auto unknown = read(with(baseline(), "/body", "vulcan"));
    CHECK(has_error(unknown, "body", "unknown body \"vulcan\""));
    CHECK(has_error(unknown, "body", "mars, earth, venus, titan"));

    const auto number = read(with(baseline(), "/body", 3));
    CHECK(has_error(number, "body", "must be a preset name or an object, got number"));

    const Json custom{{"name", "test sphere"},       {"radius_m", 1.0e6},
                      {"mu_m3_s2", 1.0e12},          {"rotation_rad_s", 1e-5},
                      {"gas_constant_J_kgK", 290.0}, {"gamma", 1.4},
                      {"sutton_graves_k", 1.8e-4}};
    const auto read_custom = read(with(baseline(), "/body", custom));
    INFO(error_list(read_custom));
    REQUIRE(read_custom.ok());
    const ds::BodyDesign& body = read_custom.design->body;
    CHECK(body.preset.empty());
    CHECK(body.body.name == "test sphere");
    CHECK(body.body.radius_m == 1.0e6);
    CHECK(body.body.mu_m3_s2 == 1.0e12);
    CHECK(body.body.rotation_rad_s == 1e-5);
    CHECK(body.body.gas.gas_constant_J_kgK == 290.0);
    CHECK(body.body.gas.gamma == 1.4);
    CHECK(body.body.gas.sutton_graves_k == 1.8e-4);
}

TEST_CASE("a custom body without its gas names each missing gas key") {
    const Json custom{{"name", "bare"}, {"radius_m", 1.0e6}, {"mu_m3_s2", 1.0e12}};
    Json document = with(baseline(), "/body", custom);
    document = without(document, "/atmosphere/gas_constant_J_kgK");
    document = without(document, "/atmosphere/gamma");
    const auto bare = read(document);
    INFO(error_list(bare));
    CHECK(bare.errors.size() == 3);
    CHECK(has_error(bare, "body.gas_constant_J_kgK", "missing"));
    CHECK(has_error(bare, "body.gamma", "missing"));
    CHECK(has_error(bare, "body.sutton_graves_k", "missing"));

    // The atmosphere may carry the gas constant and gamma; the heating constant stays the body's.
    const auto with_gas = read(with(baseline(), "/body", custom));
    CHECK(only_error(with_gas, "body.sutton_graves_k", "missing"));
}

TEST_CASE("the standard atmosphere needs a preset body") {
    const Json standard{{"model", "standard"}};
    const auto earth = read(with(with(baseline(), "/atmosphere", standard), "/body", "earth"));
    INFO(error_list(earth));
    REQUIRE(earth.ok());
    CHECK(earth.design->atmosphere.model == ds::AtmosphereModel::standard);
    CHECK_FALSE(earth.design->atmosphere.gamma.has_value());

    const Json custom{{"name", "c"},        {"radius_m", 1.0e6},
                      {"mu_m3_s2", 1.0e12}, {"gas_constant_J_kgK", 290.0},
                      {"gamma", 1.4},       {"sutton_graves_k", 1.8e-4}};
    const auto result = read(with(with(baseline(), "/atmosphere", standard), "/body", custom));
    CHECK(only_error(result, "atmosphere.model", "needs a preset body"));
}

TEST_CASE("atmosphere keys of another model are unknown for this one; unknown models are listed") {
    const auto rows = read(with(baseline(), "/atmosphere/rows", table_rows()));
    CHECK(only_error(rows, "atmosphere.rows", "unknown key for the \"exponential\" model"));

    Json table = table_atmosphere(table_rows());
    table["scale_height_m"] = 11100;
    const auto scale = read(with(baseline(), "/atmosphere", table));
    CHECK(only_error(scale, "atmosphere.scale_height_m", "unknown key for the \"table\" model"));

    const auto model = read(with(baseline(), "/atmosphere/model", "isothermal"));
    CHECK(
        only_error(model, "atmosphere.model",
                   "unknown model \"isothermal\"; expected one of: exponential, table, standard"));
}

TEST_CASE("a table atmosphere reads its rows from the document") {
    const auto result = read(with(baseline(), "/atmosphere", table_atmosphere(table_rows())));
    INFO(error_list(result));
    REQUIRE(result.ok());
    const auto& atmosphere = result.design->atmosphere;
    CHECK(atmosphere.model == ds::AtmosphereModel::table);
    REQUIRE(atmosphere.rows.size() == 3);
    CHECK(atmosphere.rows[1].altitude_m == 40000.0);
    CHECK(atmosphere.rows[1].density_kg_m3 == 0.0008);
    CHECK(atmosphere.rows[1].temperature_K == 180.0);
    CHECK(atmosphere.csv_file.empty());
}

TEST_CASE("table rows must rise in altitude, be at least two, and come one way only") {
    Json unordered = table_rows();
    unordered[2]["altitude_m"] = 30000;
    const auto order = read(with(baseline(), "/atmosphere", table_atmosphere(unordered)));
    CHECK(only_error(order, "atmosphere.rows[2].altitude_m",
                     "must be above the previous row's altitude (40000 m), got 30000"));

    Json one = Json::array({table_rows()[0]});
    const auto single = read(with(baseline(), "/atmosphere", table_atmosphere(one)));
    CHECK(has_error(single, "atmosphere.rows", "at least 2 rows, got 1"));

    Json bad_row = table_rows();
    bad_row[1]["density_kg_m3"] = -1;
    bad_row[1]["pressure_Pa"] = 100;
    const auto row = read(with(baseline(), "/atmosphere", table_atmosphere(bad_row)));
    CHECK(has_error(row, "atmosphere.rows[1].density_kg_m3", "must be positive"));
    CHECK(has_error(row, "atmosphere.rows[1].pressure_Pa", "unknown key"));

    Json both = table_atmosphere(table_rows());
    both["csv_file"] = "table.csv";
    CHECK(has_error(read(with(baseline(), "/atmosphere", both)), "atmosphere", "not both"));
    const auto neither = read(with(baseline(), "/atmosphere", {{"model", "table"}}));
    CHECK(has_error(neither, "atmosphere", "needs rows"));
}

TEST_CASE("a table must cover the flight from the site to the entry interface") {
    Json rows = table_rows();
    rows[0]["altitude_m"] = 0;       // above the site at -1000 m
    rows[2]["altitude_m"] = 100000;  // below the interface at 125000 m
    const auto result = read(with(baseline(), "/atmosphere", table_atmosphere(rows)));
    INFO(error_list(result));
    CHECK(only_error(result, "atmosphere.rows", "-1000 m (site elevation) to 0 m"));
    CHECK(has_error(result, "atmosphere.rows", "100000 m to 125000 m (entry interface)"));

    // Exactly covering both ends is enough.
    rows[0]["altitude_m"] = -1000;
    rows[2]["altitude_m"] = 125000;
    CHECK(read(with(baseline(), "/atmosphere", table_atmosphere(rows))).ok());
}

TEST_CASE("a table read from a CSV file beside the design file") {
    const ScratchFolder folder("csv");
    folder.write("tables/profile.csv",
                 "# test profile\n"
                 "altitude_m,density_kg_m3,temperature_K\n"
                 "-2000,0.024,215\n"
                 "40000,0.0008,180\n"
                 "130000,1e-8,140\n");
    const Json atmosphere{{"model", "table"}, {"csv_file", "tables/profile.csv"}};
    const auto design_file =
        folder.write("design.json", with(baseline(), "/atmosphere", atmosphere).dump());
    const auto result = ds::read_design_file(design_file);
    INFO(error_list(result));
    REQUIRE(result.ok());
    CHECK(result.design->atmosphere.csv_file == "tables/profile.csv");
    REQUIRE(result.design->atmosphere.rows.size() == 3);
    CHECK(result.design->atmosphere.rows[2].altitude_m == 130000.0);
    CHECK(result.design->atmosphere.rows[0].density_kg_m3 == 0.024);

    const Json missing{{"model", "table"}, {"csv_file", "tables/absent.csv"}};
    const auto absent = read(with(baseline(), "/atmosphere", missing), design_file.parent_path());
    CHECK(has_error(absent, "atmosphere.csv_file", "cannot open the file"));

    folder.write("tables/falling.csv",
                 "altitude_m,density_kg_m3,temperature_K\n"
                 "-2000,0.024,215\n"
                 "130000,1e-8,140\n"
                 "40000,0.0008,180\n");
    const Json falling{{"model", "table"}, {"csv_file", "tables/falling.csv"}};
    const auto order = read(with(baseline(), "/atmosphere", falling), design_file.parent_path());
    INFO(error_list(order));
    CHECK(has_error(order, "atmosphere.csv_file", "line 4: altitude_m must be above"));
}

TEST_CASE("diameters may be sizing requests in their object form") {
    Json document =
        with(baseline(), "/aeroshell/diameter_m", {{"size_for_ballistic_coefficient_kg_m2", 60}});
    document = with(document, "/parachute/diameter_m",
                    {{"size_for_velocity_m_s", 70}, {"at_height_above_site_m", 2000}});
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.ok());
    const ds::Design& d = *result.design;
    CHECK_FALSE(d.aeroshell.diameter_m.has_value());
    CHECK(d.aeroshell.size_for_ballistic_coefficient_kg_m2 == 60.0);
    CHECK_FALSE(d.parachute->diameter_m.has_value());
    CHECK(d.parachute->size_for_velocity_m_s == 70.0);
    CHECK(d.parachute->at_height_above_site_m == 2000.0);

    const auto incomplete =
        read(with(baseline(), "/parachute/diameter_m", {{"size_for_velocity_m_s", 70}, {"x", 1}}));
    CHECK(has_error(incomplete, "parachute.diameter_m.at_height_above_site_m", "missing"));
    CHECK(has_error(incomplete, "parachute.diameter_m.x", "unknown key"));

    const auto text = read(with(baseline(), "/aeroshell/diameter_m", "big"));
    CHECK(has_error(text, "aeroshell.diameter_m", "must be a number or a sizing request"));
}

TEST_CASE("the nose radius is at most half the aeroshell diameter") {
    const auto result = read(with(baseline(), "/aeroshell/nose_radius_m", 1.4));
    CHECK(only_error(result, "aeroshell.nose_radius_m",
                     "must be no more than half the diameter (1.3 m), got 1.4"));
    CHECK(read(with(baseline(), "/aeroshell/nose_radius_m", 1.3)).ok());
}

TEST_CASE("the heat shield is lighter than a given entry mass, and may be left out") {
    const auto heavy = read(with(baseline(), "/mass/heat_shield_kg", 560));
    CHECK(only_error(heavy, "mass.heat_shield_kg",
                     "must be less than the entry mass (560 kg), got 560"));

    const auto absent = read(without(baseline(), "/mass/heat_shield_kg"));
    REQUIRE(absent.ok());
    CHECK_FALSE(absent.design->mass.heat_shield_kg.has_value());
}

TEST_CASE("without an entry mass the budget needs items to size from") {
    const auto bare = read(without(baseline(), "/mass/entry_kg"));
    REQUIRE(bare.errors.size() == 1);
    CHECK(bare.errors[0].text() ==
          "mass.items: needed to size the budget when mass.entry_kg is not given");

    const auto empty =
        read(with(without(baseline(), "/mass/entry_kg"), "/mass/items", Json::array()));
    CHECK(only_error(empty, "mass.items", "needed to size the budget"));

    // With a fixed entry mass, items are optional.
    const auto fixed = read(with(baseline(), "/mass/items", Json::array()));
    CHECK(fixed.ok());
}

TEST_CASE("mass items read their name, basic mass, group and maturity") {
    const Json items = Json::array({
        {{"name", "lander structure"},
         {"mass_kg", 85.5},
         {"group", "descent stage"},
         {"maturity", "layout"}},
        {{"name", "science package"}, {"mass_kg", 40}, {"group", "payload"}},
        {{"name", "backshell"},
         {"mass_kg", 0},
         {"group", "backshell"},
         {"maturity", "pre-release"}},
    });
    Json document = without(baseline(), "/mass/entry_kg");
    document = with(document, "/mass/items", items);
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.ok());
    const ds::MassDesign& mass = result.design->mass;
    CHECK_FALSE(mass.entry_kg.has_value());
    CHECK(mass.heat_shield_kg == 60.0);  // no entry mass to compare it with
    REQUIRE(mass.items.size() == 3);
    CHECK(mass.items[0].name == "lander structure");
    CHECK(mass.items[0].mass_kg == 85.5);
    CHECK(mass.items[0].group == ds::MassGroup::descent_stage);
    CHECK(mass.items[0].maturity == ds::Maturity::layout);
    CHECK(mass.items[1].group == ds::MassGroup::payload);
    CHECK(mass.items[1].maturity == ds::Maturity::estimated);  // the default
    CHECK(mass.items[2].mass_kg == 0.0);
    CHECK(mass.items[2].group == ds::MassGroup::backshell);
    CHECK(mass.items[2].maturity == ds::Maturity::pre_release);
}

TEST_CASE("mass item errors name the item's index and list the accepted names") {
    const Json items = Json::array({
        {{"name", "ok"}, {"mass_kg", 10}, {"group", "payload"}},
        {{"name", ""}, {"mass_kg", -3}, {"group", "payload"}},
        {{"name", "mast"}, {"mass_kg", 5}, {"group", "cruise stage"}, {"maturity", "guessed"}},
        {{"name", "bolts"}, {"mass_kg", 1}, {"colour", "grey"}},
        "wheel",
    });
    const auto result = read(with(baseline(), "/mass/items", items));
    INFO(error_list(result));
    REQUIRE(result.errors.size() == 7);
    CHECK(has_error(result, "mass.items[1].name", "must not be empty"));
    CHECK(has_error(result, "mass.items[1].mass_kg", "must not be negative, got -3"));
    CHECK(has_error(result, "mass.items[2].group",
                    "unknown group \"cruise stage\"; expected one of: deorbit stage, heat shield, "
                    "backshell, "
                    "descent stage, payload"));
    CHECK(has_error(result, "mass.items[2].maturity",
                    "unknown maturity \"guessed\"; expected one of: estimated, layout, "
                    "pre-release, released, existing, actual"));
    CHECK(has_error(result, "mass.items[3].colour", "unknown key"));
    CHECK(has_error(result, "mass.items[3].group", "missing"));
    CHECK(has_error(result, "mass.items[4]", "must be an object, got string"));

    const auto object = read(with(baseline(), "/mass/items", {{"name", "x"}}));
    CHECK(only_error(object, "mass.items", "must be an array of items, got object"));
}

TEST_CASE("a parachute may state its own mass") {
    const auto result = read(with(baseline(), "/parachute/mass_kg", 14.5));
    INFO(error_list(result));
    REQUIRE(result.ok());
    CHECK(result.design->parachute->mass_kg == 14.5);
}

TEST_CASE("the parachute takes exactly one deploy trigger, and a known type") {
    const auto none = read(without(baseline(), "/parachute/deploy_mach"));
    CHECK(only_error(none, "parachute", "needs one deploy trigger"));

    const auto two = read(with(baseline(), "/parachute/deploy_altitude_m", 10000));
    CHECK(only_error(two, "parachute", "one deploy trigger, got deploy_mach, deploy_altitude_m"));

    const auto pressure = read(with(without(baseline(), "/parachute/deploy_mach"),
                                    "/parachute/deploy_dynamic_pressure_Pa", 600));
    REQUIRE(pressure.ok());
    CHECK(pressure.design->parachute->trigger == ds::TriggerKind::dynamic_pressure);
    CHECK(pressure.design->parachute->trigger_value == 600.0);

    const auto altitude = read(
        with(without(baseline(), "/parachute/deploy_mach"), "/parachute/deploy_altitude_m", -500));
    REQUIRE(altitude.ok());
    CHECK(altitude.design->parachute->trigger == ds::TriggerKind::altitude);
    CHECK(altitude.design->parachute->trigger_value == -500.0);

    const auto type = read(with(baseline(), "/parachute/type", "cross"));
    CHECK(has_error(type, "parachute.type",
                    "unknown type \"cross\"; expected one of: disk-gap-band, ringsail"));
}

TEST_CASE("retro, airbag and tethered terminals need their engine and end speed; none does not") {
    for (const char* method : {"retro", "airbag", "tethered"}) {
        CAPTURE(method);
        Json document = with(baseline(), "/terminal", {{"method", method}});
        const auto result = read(document);
        INFO(error_list(result));
        REQUIRE(result.errors.size() == 3);
        CHECK(result.errors[0].text() == "terminal.isp_s: missing");
        CHECK(result.errors[1].text() == "terminal.thrust_to_weight: missing");
        CHECK(result.errors[2].text() == "terminal.touchdown_velocity_m_s: missing");
    }

    const auto none = read(with(baseline(), "/terminal", {{"method", "none"}}));
    INFO(error_list(none));
    REQUIRE(none.ok());
    CHECK(none.design->terminal.method == ds::TerminalMethod::none);
    CHECK(none.design->terminal.isp_s == 0.0);
    CHECK(none.design->terminal.touchdown_velocity_m_s == 0.0);

    const auto stopped = read(with(with(baseline(), "/terminal/method", "tethered"),
                                   "/terminal/touchdown_velocity_m_s", 0));
    CHECK(has_error(stopped, "terminal.touchdown_velocity_m_s", "must be positive, got 0"));

    const auto unknown = read(with(baseline(), "/terminal/method", "legs"));
    CHECK(only_error(unknown, "terminal.method",
                     "unknown method \"legs\"; expected one of: retro, airbag, tethered, none, "
                     "supersonic-retro"));
}

TEST_CASE("a powered terminal reads its throttle and propellant allowances") {
    Json document = with(baseline(), "/terminal/throttle", 0.8);
    document = with(document, "/terminal/propellant_reserve_fraction", 0.15);
    document = with(document, "/terminal/propellant_residual_fraction", 0.0);
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.ok());
    const ds::TerminalDesign& terminal = result.design->terminal;
    CHECK(terminal.throttle == 0.8);
    CHECK(terminal.propellant_reserve_fraction == 0.15);
    CHECK(terminal.propellant_residual_fraction == 0.0);
    // Keys of the other methods keep their defaults.
    CHECK(terminal.release_height_m == ds::TerminalDesign{}.release_height_m);
    CHECK(terminal.tether_length_m == ds::TerminalDesign{}.tether_length_m);

    CHECK(read(with(baseline(), "/terminal/throttle", 1.0)).ok());
}

TEST_CASE("an airbag reads its release height; a tethered stage its tether and fly-away") {
    Json airbag = with(baseline(), "/terminal/method", "airbag");
    airbag = with(airbag, "/terminal/release_height_m", 20);
    const auto bag = read(airbag);
    INFO(error_list(bag));
    REQUIRE(bag.ok());
    CHECK(bag.design->terminal.method == ds::TerminalMethod::airbag);
    CHECK(bag.design->terminal.release_height_m == 20.0);
    CHECK(bag.design->terminal.isp_s == 220.0);

    Json tethered = with(baseline(), "/terminal/method", "tethered");
    tethered = with(tethered, "/terminal/tether_length_m", 6.4);
    tethered = with(tethered, "/terminal/fly_away_s", 0);
    const auto tether = read(tethered);
    INFO(error_list(tether));
    REQUIRE(tether.ok());
    CHECK(tether.design->terminal.tether_length_m == 6.4);
    CHECK(tether.design->terminal.fly_away_s == 0.0);

    CHECK(has_error(read(with(tethered, "/terminal/tether_length_m", 0)),
                    "terminal.tether_length_m", "must be positive, got 0"));
    CHECK(has_error(read(with(airbag, "/terminal/release_height_m", -1)),
                    "terminal.release_height_m", "must not be negative, got -1"));
}

TEST_CASE("terminal keys of another method are errors naming the methods they belong to") {
    const auto tether = read(with(baseline(), "/terminal/tether_length_m", 7));
    REQUIRE(tether.errors.size() == 1);
    CHECK(tether.errors[0].text() == "terminal.tether_length_m: only for method \"tethered\"");

    Json tethered = with(baseline(), "/terminal/method", "tethered");
    const auto release = read(with(tethered, "/terminal/release_height_m", 10));
    REQUIRE(release.errors.size() == 1);
    CHECK(release.errors[0].text() == "terminal.release_height_m: only for method \"airbag\"");

    Json none =
        with(baseline(), "/terminal", {{"method", "none"}, {"isp_s", 220}, {"throttle", 1}});
    const auto engine = read(none);
    REQUIRE(engine.errors.size() == 2);
    CHECK(has_error(engine, "terminal.isp_s",
                    "only for methods \"retro\", \"airbag\", \"tethered\" and "
                    "\"supersonic-retro\""));
    CHECK(has_error(engine, "terminal.throttle",
                    "only for methods \"retro\", \"airbag\", \"tethered\" and "
                    "\"supersonic-retro\""));
}

TEST_CASE("a decelerator reads its size, drag, trigger and mass") {
    const Json decelerator{
        {"diameter_m", 6.0}, {"drag_coefficient", 1.3}, {"deploy_mach", 3.5}, {"mass_kg", 55}};
    const auto result = read(with(baseline(), "/decelerator", decelerator));
    INFO(error_list(result));
    REQUIRE(result.ok());
    REQUIRE(result.design->decelerator.has_value());
    const ds::DeceleratorDesign& d = *result.design->decelerator;
    CHECK(d.diameter_m == 6.0);
    CHECK(d.drag_coefficient == 1.3);
    CHECK(d.trigger == ds::TriggerKind::mach);
    CHECK(d.trigger_value == 3.5);
    CHECK(d.mass_kg == 55.0);

    const auto pressure = read(with(
        baseline(), "/decelerator",
        {{"diameter_m", 6.0}, {"drag_coefficient", 1.3}, {"deploy_dynamic_pressure_Pa", 2500}}));
    REQUIRE(pressure.ok());
    CHECK(pressure.design->decelerator->trigger == ds::TriggerKind::dynamic_pressure);
    CHECK(pressure.design->decelerator->trigger_value == 2500.0);
    CHECK_FALSE(pressure.design->decelerator->mass_kg.has_value());
}

TEST_CASE("a decelerator takes one deploy trigger by the parachute's rule, and its keys") {
    const auto none =
        read(with(baseline(), "/decelerator", {{"diameter_m", 6.0}, {"drag_coefficient", 1.3}}));
    REQUIRE(none.errors.size() == 1);
    CHECK(none.errors[0].text() ==
          "decelerator: needs one deploy trigger: deploy_mach, deploy_dynamic_pressure_Pa or "
          "deploy_altitude_m");

    const auto two = read(with(baseline(), "/decelerator",
                               {{"diameter_m", 6.0},
                                {"drag_coefficient", 1.3},
                                {"deploy_mach", 3.0},
                                {"deploy_altitude_m", 15000}}));
    CHECK(only_error(two, "decelerator",
                     "takes one deploy trigger, got deploy_mach, deploy_altitude_m"));

    const auto bare =
        read(with(baseline(), "/decelerator", {{"deploy_mach", 3.0}, {"mass_kg", 0}}));
    INFO(error_list(bare));
    REQUIRE(bare.errors.size() == 3);
    CHECK(has_error(bare, "decelerator.mass_kg", "must be positive, got 0"));
    CHECK(has_error(bare, "decelerator.diameter_m", "missing"));
    CHECK(has_error(bare, "decelerator.drag_coefficient", "missing"));
}

TEST_CASE("the sequence reads its timings, and one heat-shield jettison rule at most") {
    const Json sequence{{"heat_shield_jettison_dynamic_pressure_Pa", 300},
                        {"ground_sensing_lock_s", 20},
                        {"separation_coast_s", 1.5}};
    const auto result = read(with(baseline(), "/sequence", sequence));
    INFO(error_list(result));
    REQUIRE(result.ok());
    const ds::SequenceDesign& s = result.design->sequence;
    CHECK_FALSE(s.heat_shield_jettison_delay_s.has_value());
    CHECK(s.heat_shield_jettison_dynamic_pressure_Pa == 300.0);
    CHECK(s.ground_sensing_lock_s == 20.0);
    CHECK(s.separation_coast_s == 1.5);

    const auto delay = read(with(baseline(), "/sequence", {{"heat_shield_jettison_delay_s", 0}}));
    REQUIRE(delay.ok());
    CHECK(delay.design->sequence.heat_shield_jettison_delay_s == 0.0);
    CHECK(delay.design->sequence.ground_sensing_lock_s ==
          ds::SequenceDesign{}.ground_sensing_lock_s);

    const auto both = read(with(
        baseline(), "/sequence",
        {{"heat_shield_jettison_delay_s", 20}, {"heat_shield_jettison_dynamic_pressure_Pa", 300}}));
    REQUIRE(both.errors.size() == 1);
    CHECK(both.errors[0].text() ==
          "sequence: takes heat_shield_jettison_delay_s or "
          "heat_shield_jettison_dynamic_pressure_Pa, not both");

    const auto unknown = read(with(baseline(), "/sequence", {{"backshell_delay_s", 3}}));
    CHECK(has_error(unknown, "sequence.backshell_delay_s", "unknown key"));
}

TEST_CASE("the entry interface must be above the landing site") {
    const auto result = read(with(baseline(), "/site/elevation_m", 130000));
    CHECK(only_error(result, "entry.interface_altitude_m",
                     "must be above the site elevation (130000 m), got 125000"));
}

TEST_CASE("the step budget is capped at a million steps a phase") {
    // Regression: up to 2^31 - 1 steps were taken, and a stiff design took 24 s and 2.7 GB.
    const auto cap = read(with(baseline(), "/solver", {{"max_steps", 1000000}}));
    INFO(error_list(cap));
    REQUIRE(cap.ok());
    CHECK(cap.design->solver.max_steps == 1000000);
    const auto int_max = read(with(baseline(), "/solver", {{"max_steps", 2147483647}}));
    CHECK_FALSE(int_max.ok());
    CHECK(has_error(int_max, "solver.max_steps",
                    "must be greater than 0 and at most 1000000, got 2147483647"));
}

TEST_CASE("limits and solver settings override the defaults key by key") {
    Json document = with(baseline(), "/limits",
                         {{"peak_deceleration_max_g", 12}, {"site_elevation_max_m", 500}});
    document = with(document, "/solver",
                    {{"relative_tolerance", 1e-10}, {"max_time_s", 900}, {"max_steps", 5000}});
    const auto result = read(document);
    INFO(error_list(result));
    REQUIRE(result.ok());
    const ds::Design& d = *result.design;
    CHECK(d.limits.peak_deceleration_max_g == 12.0);
    CHECK(d.limits.site_elevation_max_m == 500.0);
    CHECK(d.limits.deploy_mach_max == ds::Limits{}.deploy_mach_max);
    CHECK(d.solver.relative_tolerance == 1e-10);
    CHECK(d.solver.max_time_s == 900.0);
    CHECK(d.solver.max_steps == 5000);

    const auto unknown = read(with(baseline(), "/limits", {{"peak_g", 12}}));
    CHECK(has_error(unknown, "limits.peak_g", "unknown key"));
}

TEST_CASE("read_design_file names a file it cannot open, with an empty path") {
    const auto missing = std::filesystem::temp_directory_path() / "descent_sizer_no_such.json";
    const auto result = ds::read_design_file(missing);
    REQUIRE(result.errors.size() == 1);
    CHECK(result.errors[0].path.empty());
    CHECK(result.errors[0].message == "cannot open " + missing.string() + ": no such file");
}

TEST_CASE("a wind reads as rows (objects or [altitude, east, north]) or as one constant wind") {
    // The design contract (design-file.md) writes a wind row as [altitude_m, east_m_s,
    // north_m_s]; the writer gives the named form, as the atmosphere table does. Both read.
    const Json rows =
        Json::array({Json::array({-1000.0, 4.0, -2.0}),
                     {{"altitude_m", 8000.0}, {"east_m_s", 15.5}, {"north_m_s", 3.0}}});
    const auto table = read(with(baseline(), "/atmosphere/wind", rows));
    INFO(error_list(table));
    REQUIRE(table.ok());
    REQUIRE(table.design->atmosphere.wind);
    const std::vector<ds::WindRow> expected{{-1000.0, 4.0, -2.0}, {8000.0, 15.5, 3.0}};
    CHECK(table.design->atmosphere.wind->rows == expected);
    CHECK_FALSE(table.design->atmosphere.wind->constant);

    const auto constant =
        read(with(baseline(), "/atmosphere/wind", {{"east_m_s", -6.0}, {"north_m_s", 2.5}}));
    REQUIRE(constant.ok());
    CHECK(constant.design->atmosphere.wind->constant == ds::WindVelocity{-6.0, 2.5});

    const auto descending =
        read(with(baseline(), "/atmosphere/wind",
                  Json::array({Json::array({5000.0, 1.0, 1.0}), Json::array({5000.0, 2.0, 2.0})})));
    INFO(error_list(descending));
    CHECK(has_error(descending, "atmosphere.wind[1]",
                    "altitude_m must be above the previous row's altitude (5000 m), got 5000"));
    const auto short_row =
        read(with(baseline(), "/atmosphere/wind", Json::array({Json::array({0.0, 1.0})})));
    CHECK(has_error(short_row, "atmosphere.wind[0]",
                    "must be [altitude_m, east_m_s, north_m_s], got 2 values"));
    const auto unknown =
        read(with(baseline(), "/atmosphere/wind", {{"east_m_s", 1.0}, {"up_m_s", 2.0}}));
    CHECK(has_error(unknown, "atmosphere.wind.up_m_s", "unknown key"));
    CHECK(has_error(unknown, "atmosphere.wind.north_m_s", "missing"));
}

namespace {

/// The baseline entering from an arrival (or an orbit) instead of a given interface state.
Json conic_entry(const std::string& object, Json value) {
    Json document =
        without(without(baseline(), "/entry/velocity_m_s"), "/entry/flight_path_angle_deg");
    return with(document, "/entry/" + object, std::move(value));
}

}  // namespace

TEST_CASE("an approach or an orbit stands in place of the interface speed and angle") {
    SUBCASE("an approach aimed at a periapsis, read as inertial") {
        const auto result = read(
            conic_entry("approach", {{"v_infinity_m_s", 3000}, {"periapsis_altitude_m", 2e4}}));
        INFO(error_list(result));
        REQUIRE(result.ok());
        const ds::EntryDesign& entry = result.design->entry;
        REQUIRE(entry.approach);
        CHECK(entry.approach->v_infinity_m_s == 3000.0);
        CHECK(entry.approach->periapsis_altitude_m == 2e4);
        CHECK_FALSE(entry.approach->flight_path_angle_deg);
        CHECK_FALSE(entry.orbit);
        CHECK(entry.velocity_frame == ds::VelocityFrame::inertial);
    }
    SUBCASE("an orbit") {
        const auto result = read(conic_entry("orbit", {{"periapsis_altitude_m", 3e5},
                                                       {"apoapsis_altitude_m", 5e5},
                                                       {"flight_path_angle_deg", -12.5},
                                                       {"isp_s", 230}}));
        INFO(error_list(result));
        REQUIRE(result.ok());
        REQUIRE(result.design->entry.orbit);
        CHECK(*result.design->entry.orbit == ds::OrbitDesign{3e5, 5e5, -12.5, 230.0});
    }
    SUBCASE("the speed given beside an approach is refused") {
        const auto result = read(with(baseline(), "/entry/approach",
                                      {{"v_infinity_m_s", 3000}, {"flight_path_angle_deg", -12}}));
        CHECK(has_error(result, "entry.velocity_m_s", "not with approach"));
        CHECK(has_error(result, "entry.flight_path_angle_deg", "not with approach"));
        CHECK(result.errors.size() == 2);
    }
    SUBCASE("an approach and an orbit together") {
        Json document =
            conic_entry("approach", {{"v_infinity_m_s", 3000}, {"flight_path_angle_deg", -12}});
        document["entry"]["orbit"] = {{"periapsis_altitude_m", 3e5},
                                      {"apoapsis_altitude_m", 3e5},
                                      {"flight_path_angle_deg", -12},
                                      {"isp_s", 220}};
        CHECK(only_error(read(document), "entry.orbit", "not with approach"));
    }
    SUBCASE("an approach aims at one of a periapsis or an angle") {
        CHECK(only_error(read(conic_entry("approach", {{"v_infinity_m_s", 3000}})),
                         "entry.approach",
                         "needs one approach aim: periapsis_altitude_m or flight_path_angle_deg"));
        CHECK(only_error(read(conic_entry("approach", {{"v_infinity_m_s", 3000},
                                                       {"periapsis_altitude_m", 1e4},
                                                       {"flight_path_angle_deg", -12}})),
                         "entry.approach", "takes one approach aim"));
    }
    SUBCASE("its keys are judged where they sit") {
        CHECK(only_error(
            read(conic_entry("approach", {{"v_infinity_m_s", -1}, {"flight_path_angle_deg", -12}})),
            "entry.approach.v_infinity_m_s", "must be positive"));
        CHECK(only_error(
            read(conic_entry("approach", {{"v_infinity_m_s", 3000}, {"flight_path_angle_deg", 5}})),
            "entry.approach.flight_path_angle_deg", "less than 0"));
        CHECK(only_error(read(conic_entry("approach", {{"v_infinity_m_s", 3000},
                                                       {"flight_path_angle_deg", -12},
                                                       {"colour", 1}})),
                         "entry.approach.colour", "unknown key"));
        CHECK(only_error(read(conic_entry("orbit", {{"periapsis_altitude_m", 3e5},
                                                    {"apoapsis_altitude_m", 3e5},
                                                    {"flight_path_angle_deg", -12}})),
                         "entry.orbit.isp_s", "missing"));
    }
    SUBCASE("a periapsis above the interface misses the atmosphere; below the centre is none") {
        CHECK(only_error(read(conic_entry("approach", {{"v_infinity_m_s", 3000},
                                                       {"periapsis_altitude_m", 130000}})),
                         "entry.approach.periapsis_altitude_m",
                         "must be below the interface altitude (125000 m)"));
        CHECK(only_error(
            read(conic_entry("approach",
                             {{"v_infinity_m_s", 3000}, {"periapsis_altitude_m", -4e6}})),
            "entry.approach.periapsis_altitude_m", "must be at least minus the body's radius"));
    }
    SUBCASE("an orbit stays above the interface, its apoapsis at its periapsis or higher") {
        CHECK(only_error(read(conic_entry("orbit", {{"periapsis_altitude_m", 1e5},
                                                    {"apoapsis_altitude_m", 3e5},
                                                    {"flight_path_angle_deg", -12},
                                                    {"isp_s", 220}})),
                         "entry.orbit.periapsis_altitude_m",
                         "must be above the interface altitude (125000 m)"));
        CHECK(only_error(read(conic_entry("orbit", {{"periapsis_altitude_m", 4e5},
                                                    {"apoapsis_altitude_m", 3e5},
                                                    {"flight_path_angle_deg", -12},
                                                    {"isp_s", 220}})),
                         "entry.orbit.apoapsis_altitude_m",
                         "must be at least the periapsis altitude (400000 m)"));
    }
    SUBCASE("a conic gives the inertial state: a relative frame is refused") {
        Json document =
            conic_entry("approach", {{"v_infinity_m_s", 3000}, {"flight_path_angle_deg", -12}});
        document["entry"]["velocity_frame"] = "relative";
        CHECK(only_error(read(document), "entry.velocity_frame", "must be \"inertial\""));
        document["entry"]["velocity_frame"] = "inertial";
        CHECK(read(document).ok());
    }
    SUBCASE("a deorbit stage needs an orbit to leave from") {
        Json document = with(
            baseline(), "/mass/items",
            Json::array(
                {{{"name", "cruise structure"}, {"mass_kg", 40}, {"group", "deorbit stage"}}}));
        CHECK(only_error(read(document), "mass.items[0].group",
                         "\"deorbit stage\" needs entry.orbit"));
    }
}

TEST_CASE("a powered descent from the entry flies without a parachute; canopy methods need one") {
    // The contract example with a supersonic retro-propulsive descent in place of its canopy.
    Json powered = without(baseline(), "/parachute");
    powered = with(powered, "/terminal/method", "supersonic-retro");
    powered = with(powered, "/terminal/ignition_mach", 2.8);
    powered = with(powered, "/terminal/min_throttle", 0.35);
    powered = with(powered, "/terminal/drag_preservation", 0.25);
    const auto read_powered = read(powered);
    INFO(error_list(read_powered));
    REQUIRE(read_powered.ok());
    const ds::Design& d = *read_powered.design;
    CHECK_FALSE(d.parachute.has_value());
    CHECK(d.terminal.method == ds::TerminalMethod::supersonic_retro);
    CHECK(d.terminal.trigger == ds::TriggerKind::mach);
    CHECK(d.terminal.trigger_value == 2.8);
    CHECK(d.terminal.min_throttle == 0.35);
    CHECK(d.terminal.drag_preservation == 0.25);
    // Written back, it reads the same.
    CHECK(*ds::read_design(ds::write_design(d)).design == d);

    // "type": "none" says what leaving the section out says; other keys beside it are refused.
    const auto none = read(with(powered, "/parachute", {{"type", "none"}}));
    INFO(error_list(none));
    REQUIRE(none.ok());
    CHECK_FALSE(none.design->parachute.has_value());
    CHECK(has_error(read(with(powered, "/parachute", {{"type", "none"}, {"diameter_m", 12}})),
                    "parachute.diameter_m", "unknown key"));

    // One ignition trigger, and only for this method.
    CHECK(only_error(read(without(powered, "/terminal/ignition_mach")), "terminal",
                     "needs one ignition trigger"));
    CHECK(has_error(read(with(baseline(), "/terminal/ignition_mach", 2.5)),
                    "terminal.ignition_mach", "only for method \"supersonic-retro\""));
    // The deepest throttle is no more than the throttle; the drag kept is a share.
    CHECK(only_error(read(with(powered, "/terminal/throttle", 0.3)), "terminal.min_throttle",
                     "must be no more than the throttle (0.3), got 0.35"));
    CHECK(has_error(read(with(powered, "/terminal/drag_preservation", 1.5)),
                    "terminal.drag_preservation", "must be at least 0 and at most 1, got 1.5"));

    // A parachute or a drogue with a powered descent from the entry is refused.
    CHECK(only_error(read(with(powered, "/parachute", baseline()["parachute"])), "parachute",
                     "a powered descent from the entry flies without a parachute"));
    // A canopy method without a parachute says what to do.
    CHECK(only_error(read(without(baseline(), "/parachute")), "terminal.method",
                     "\"retro\" begins under a parachute"));
    // Landing on the canopy without one is a ballistic impact: read, and judged by the checks.
    Json ballistic = without(baseline(), "/parachute");
    ballistic["terminal"] = {{"method", "none"}};
    const auto impact = read(ballistic);
    INFO(error_list(impact));
    CHECK(impact.ok());
}

TEST_CASE("a key dispersed twice is refused, naming the first") {
    Json document = baseline();
    document["dispersions"] = Json::array(
        {{{"key", "entry.flight_path_angle_deg"}, {"distribution", "normal"}, {"sigma", 0.2}},
         {{"key", "entry.flight_path_angle_deg"}, {"distribution", "normal"}, {"sigma", 0.5}}});
    const auto result = read(document);
    CHECK(only_error(result, "dispersions[1].key", "is dispersed already (dispersions[0])"));
}
