#include <doctest/doctest.h>

#include <algorithm>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "body/body.hpp"
#include "design/reader.hpp"
#include "design/schema.hpp"
#include "design/writer.hpp"
#include "support/preset_body.hpp"

namespace {

/// A design as the reader would give it for the contract's example.
ds::Design example_design() {
    ds::Design d;
    d.name = "round trip";
    d.body = ds::test::preset_body("mars");
    d.atmosphere.model = ds::AtmosphereModel::exponential;
    d.atmosphere.surface_density_kg_m3 = 0.020;
    d.atmosphere.scale_height_m = 11100.0;
    d.atmosphere.temperature_K = 210.0;
    d.atmosphere.gas_constant_J_kgK = 188.9;
    d.atmosphere.gamma = 1.29;
    d.site.elevation_m = -1000.0;
    d.entry.interface_altitude_m = 125000.0;
    d.entry.velocity_m_s = 5600.0;
    d.entry.flight_path_angle_deg = -13.0;
    d.aeroshell.diameter_m = 2.6;
    d.aeroshell.half_angle_deg = 70.0;
    d.aeroshell.nose_radius_m = 0.65;
    d.aeroshell.drag_coefficient = 1.65;
    d.mass.entry_kg = 560.0;
    d.mass.heat_shield_kg = 60.0;
    d.parachute.emplace();
    d.parachute->type = "disk-gap-band";
    d.parachute->diameter_m = 12.0;
    d.parachute->drag_coefficient = 0.55;
    d.parachute->trigger = ds::TriggerKind::mach;
    d.parachute->trigger_value = 1.8;
    d.terminal.method = ds::TerminalMethod::retro;
    d.terminal.isp_s = 220.0;
    d.terminal.thrust_to_weight = 2.5;
    d.terminal.touchdown_velocity_m_s = 2.0;
    return d;
}

/// The whole design, compared with the defaulted operator==: every member, the hardware keys
/// and the dispersions included. On a difference, both documents are shown.
void check_same(const ds::Design& a, const ds::Design& b) {
    INFO("read back:\n" << ds::write_design(a) << "written:\n" << ds::write_design(b));
    CHECK(a == b);
}

ds::Design round_trip(const ds::Design& design) {
    const auto result = ds::read_design(ds::write_design(design));
    std::string errors;
    for (const auto& error : result.errors)
        errors += error.text() + "\n";
    INFO(errors);
    REQUIRE(result.ok());
    return *result.design;
}

}  // namespace

TEST_CASE("writing the example design and reading it back gives the same values") {
    const ds::Design design = example_design();
    check_same(round_trip(design), design);
}

TEST_CASE("round trip of a custom body, table rows, sizing requests and changed settings") {
    ds::Design design = example_design();
    design.body.preset.clear();
    design.body.body = ds::Body{"test sphere", 2.0e6, 3.0e12, 1.5e-5, {250.0, 1.35, 1.8e-4, ""}};
    design.atmosphere = {};
    design.atmosphere.model = ds::AtmosphereModel::table;
    design.atmosphere.rows = {
        {-1500.0, 0.03, 220.0}, {60000.0, 1e-4, 170.0}, {126000.0, 2e-9, 150.0}};
    design.atmosphere.density_scale = 1.15;
    design.entry.interface_altitude_m = 125000.0;
    design.entry.velocity_m_s = 6100.5;
    design.entry.flight_path_angle_deg = -11.25;
    design.entry.lift_to_drag = 0.24;
    design.entry.bank_angle_deg = -35.0;
    design.entry.latitude_deg = -22.5;
    design.entry.longitude_deg = 130.25;
    design.entry.azimuth_deg = 75.0;
    design.entry.velocity_frame = ds::VelocityFrame::inertial;
    design.site.latitude_deg = -20.0;
    design.site.longitude_deg = 140.0;
    design.atmosphere.wind = ds::WindDesign{{{0.0, 5.0, -2.0}, {10000.0, 20.0, 3.5}}, std::nullopt};
    design.atmosphere.wind_scale = 0.8;
    design.aeroshell.diameter_m.reset();
    design.aeroshell.size_for_ballistic_coefficient_kg_m2 = 72.5;
    design.aeroshell.drag_coefficient.reset();
    design.aeroshell.half_angle_deg = 60.0;
    design.parachute->type = "ringsail";
    design.parachute->diameter_m.reset();
    design.parachute->size_for_velocity_m_s = 65.0;
    design.parachute->at_height_above_site_m = 1500.0;
    design.parachute->drag_coefficient.reset();
    design.parachute->trigger = ds::TriggerKind::altitude;
    design.parachute->trigger_value = 9000.0;
    design.terminal.method = ds::TerminalMethod::airbag;
    design.terminal.isp_s = 230.0;
    design.terminal.thrust_to_weight = 3.0;
    design.terminal.touchdown_velocity_m_s = 12.0;
    design.limits.peak_deceleration_max_g = 11.5;
    design.limits.marginal_band = 0.2;
    design.solver = {1e-10, 1200.0, 50000};

    check_same(round_trip(design), design);
}

TEST_CASE("round trip of a standard atmosphere with gas overrides and a pressure trigger") {
    ds::Design design = example_design();
    design.body = ds::test::preset_body("earth");
    design.site.elevation_m = 250.0;
    design.atmosphere = {};
    design.atmosphere.model = ds::AtmosphereModel::standard;
    design.atmosphere.gas_constant_J_kgK = 287.0;
    design.atmosphere.gamma = 1.4;
    design.parachute->trigger = ds::TriggerKind::dynamic_pressure;
    design.parachute->trigger_value = 700.0;
    design.terminal.method = ds::TerminalMethod::tethered;
    design.terminal.isp_s = 225.0;
    design.terminal.thrust_to_weight = 1.8;
    design.terminal.touchdown_velocity_m_s = 0.75;
    check_same(round_trip(design), design);
}

TEST_CASE("round trip of a sized mass budget, a decelerator, a sequence and terminal extras") {
    ds::Design design = example_design();
    design.mass.entry_kg.reset();
    design.mass.heat_shield_kg.reset();
    design.mass.items = {
        {"lander structure", 85.5, ds::MassGroup::descent_stage, ds::Maturity::layout},
        {"science package", 40.25, ds::MassGroup::payload, ds::Maturity::estimated},
        {"backshell", 31.0, ds::MassGroup::backshell, ds::Maturity::pre_release},
        {"heat shield", 48.0, ds::MassGroup::heat_shield, ds::Maturity::released},
        {"landing radar", 4.5, ds::MassGroup::descent_stage, ds::Maturity::existing},
        {"camera", 0.0, ds::MassGroup::payload, ds::Maturity::actual},
    };
    design.decelerator = ds::DeceleratorDesign{6.0, 1.3, ds::TriggerKind::altitude, 18000.0, 55.0};
    design.parachute->mass_kg = 14.5;
    design.sequence.heat_shield_jettison_dynamic_pressure_Pa = 320.0;
    design.sequence.ground_sensing_lock_s = 22.0;
    design.sequence.separation_coast_s = 1.25;
    design.terminal.throttle = 0.85;
    design.terminal.propellant_reserve_fraction = 0.2;
    design.terminal.propellant_residual_fraction = 0.0;
    check_same(round_trip(design), design);

    // The other jettison rule, and a decelerator without a stated mass.
    design.sequence.heat_shield_jettison_dynamic_pressure_Pa.reset();
    design.sequence.heat_shield_jettison_delay_s = 12.0;
    design.decelerator->mass_kg.reset();
    design.decelerator->trigger = ds::TriggerKind::mach;
    design.decelerator->trigger_value = 3.2;
    check_same(round_trip(design), design);
}

TEST_CASE("round trip of each method's own terminal keys") {
    ds::Design airbag = example_design();
    airbag.terminal.method = ds::TerminalMethod::airbag;
    airbag.terminal.touchdown_velocity_m_s = 15.0;
    airbag.terminal.release_height_m = 20.0;
    airbag.terminal.throttle = 0.9;
    check_same(round_trip(airbag), airbag);

    ds::Design tethered = example_design();
    tethered.terminal.method = ds::TerminalMethod::tethered;
    tethered.terminal.touchdown_velocity_m_s = 0.75;
    tethered.terminal.tether_length_m = 6.4;
    tethered.terminal.fly_away_s = 0.0;
    check_same(round_trip(tethered), tethered);

    ds::Design none = example_design();
    none.terminal = {};
    none.terminal.method = ds::TerminalMethod::none;
    check_same(round_trip(none), none);
}

TEST_CASE("the terminal is written with the keys of its method only") {
    const auto keys_of = [](ds::TerminalMethod method) {
        ds::Design design = example_design();
        design.terminal.method = method;
        const nlohmann::ordered_json document = ds::design_to_json(design);
        std::vector<std::string> keys;
        for (const auto& item : document["terminal"].items())
            keys.push_back(item.key());
        return keys;
    };
    const std::vector<std::string> powered{"method",
                                           "isp_s",
                                           "thrust_to_weight",
                                           "touchdown_velocity_m_s",
                                           "throttle",
                                           "propellant_reserve_fraction",
                                           "propellant_residual_fraction"};
    CHECK(keys_of(ds::TerminalMethod::retro) == powered);
    std::vector<std::string> airbag = powered;
    airbag.push_back("release_height_m");
    CHECK(keys_of(ds::TerminalMethod::airbag) == airbag);
    std::vector<std::string> tethered = powered;
    tethered.push_back("tether_length_m");
    tethered.push_back("fly_away_s");
    CHECK(keys_of(ds::TerminalMethod::tethered) == tethered);
    CHECK(keys_of(ds::TerminalMethod::none) ==
          std::vector<std::string>{"method", "touchdown_velocity_m_s"});
}

TEST_CASE("the written document follows the contract's key order and object forms") {
    ds::Design design = example_design();
    design.aeroshell.diameter_m.reset();
    design.aeroshell.size_for_ballistic_coefficient_kg_m2 = 60.0;
    design.parachute->diameter_m.reset();
    design.parachute->size_for_velocity_m_s = 70.0;
    design.parachute->at_height_above_site_m = 2000.0;
    const nlohmann::ordered_json document = ds::design_to_json(design);

    std::vector<std::string> keys;
    for (const auto& item : document.items())
        keys.push_back(item.key());
    const std::vector<std::string> expected{
        "format",    "version", "name",      "body",     "atmosphere", "site",   "entry",
        "aeroshell", "mass",    "parachute", "sequence", "terminal",   "limits", "solver"};
    CHECK(keys == expected);
    CHECK(document["format"] == "descent-sizer/design");
    CHECK(document["version"] == 1);
    CHECK(document["body"] == "mars");
    CHECK(document["aeroshell"]["diameter_m"] ==
          nlohmann::ordered_json{{"size_for_ballistic_coefficient_kg_m2", 60.0}});
    CHECK(document["parachute"]["diameter_m"] ==
          nlohmann::ordered_json{{"size_for_velocity_m_s", 70.0},
                                 {"at_height_above_site_m", 2000.0}});
    CHECK(document["parachute"]["deploy_mach"] == 1.8);
    CHECK(document["limits"].size() == ds::keys_of("limits").size());
    CHECK(document["limits"]["peak_heat_flux_max_W_cm2"] == ds::Limits{}.peak_heat_flux_max_W_cm2);
    // Keys with defaults are written; optional ones only when given.
    CHECK(document["mass"]["items"] == nlohmann::ordered_json::array());
    CHECK(document["mass"]["heat_shield_kg"] == 60.0);
    CHECK_FALSE(document["parachute"].contains("mass_kg"));
    CHECK(document["sequence"] ==
          nlohmann::ordered_json{{"ground_sensing_lock_s", 15.0}, {"separation_coast_s", 2.0}});
}

TEST_CASE("a decelerator, item groups and maturities are written under the document's names") {
    ds::Design design = example_design();
    design.mass.heat_shield_kg.reset();
    design.mass.items = {{"mast", 3.5, ds::MassGroup::descent_stage, ds::Maturity::pre_release}};
    design.decelerator =
        ds::DeceleratorDesign{6.0, 1.3, ds::TriggerKind::dynamic_pressure, 2500.0, std::nullopt};
    const nlohmann::ordered_json document = ds::design_to_json(design);

    CHECK_FALSE(document["mass"].contains("heat_shield_kg"));
    CHECK(document["mass"]["items"][0] == nlohmann::ordered_json{{"name", "mast"},
                                                                 {"mass_kg", 3.5},
                                                                 {"group", "descent stage"},
                                                                 {"maturity", "pre-release"}});
    CHECK(document["decelerator"] ==
          nlohmann::ordered_json{{"diameter_m", 6.0},
                                 {"drag_coefficient", 1.3},
                                 {"deploy_dynamic_pressure_Pa", 2500.0}});
    std::vector<std::string> keys;
    for (const auto& item : document.items())
        keys.push_back(item.key());
    const auto mass = std::find(keys.begin(), keys.end(), "mass");
    REQUIRE(mass != keys.end());
    CHECK(*(mass + 1) == "decelerator");
    CHECK(*(mass + 2) == "parachute");
}

TEST_CASE("write_design gives two-space indented JSON ending in a newline") {
    const std::string text = ds::write_design(example_design());
    CHECK(text.starts_with("{\n  \"format\": \"descent-sizer/design\",\n  \"version\": 1,\n"));
    CHECK(text.ends_with("}\n"));
}

TEST_CASE("every shipped sample reads, and reads back the same after writing") {
    int samples = 0;
    for (const auto& entry : std::filesystem::directory_iterator(DESCENT_SIZER_SAMPLES_DIR)) {
        if (entry.path().extension() != ".json")
            continue;
        ++samples;
        CAPTURE(entry.path().string());
        const auto result = ds::read_design_file(entry.path());
        std::string errors;
        for (const auto& error : result.errors)
            errors += error.text() + "\n";
        INFO(errors);
        REQUIRE(result.ok());
        check_same(round_trip(*result.design), *result.design);
    }
    CHECK(samples >= 1);
}
