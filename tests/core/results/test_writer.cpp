#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "results/writer.hpp"
#include "support/history_columns.hpp"

namespace {

using Json = nlohmann::ordered_json;

/// Results with one of each list entry and a distinct value in every field.
ds::Results sample_results() {
    ds::Results r;
    r.converged = true;
    r.entry.mass_kg = 560.0;
    r.entry.diameter_m = 2.6;
    r.entry.nose_radius_m = 0.65;
    r.entry.drag_coefficient = 1.65;
    r.entry.drag_coefficient_source = ds::DragCoefficientSource::design;
    r.entry.ballistic_coefficient_kg_m2 = 64.1;
    r.entry.peak_deceleration_g = 9.5;
    r.entry.peak_deceleration_altitude_m = 31000.0;
    r.entry.peak_heat_flux_W_cm2 = 45.0;
    r.entry.peak_heat_flux_altitude_m = 42000.0;
    r.entry.heat_load_J_cm2 = 2900.0;
    r.entry.peak_radiative_heat_flux_W_cm2 = 0.4;
    r.entry.radiative_heat_load_J_cm2 = 12.0;
    r.entry.peak_dynamic_pressure_Pa = 8100.0;
    r.entry.peak_dynamic_pressure_altitude_m = 29000.0;
    r.entry.heat_shield_mass_fraction = 0.09;
    r.entry.heat_shield_tps_kg = 50.4;
    r.parachute.deployed = true;
    r.parachute.deploy_time_s = 250.0;
    r.parachute.deploy_altitude_m = 9000.0;
    r.parachute.deploy_mach = 1.8;
    r.parachute.deploy_dynamic_pressure_Pa = 520.0;
    r.parachute.deploy_velocity_m_s = 410.0;
    r.parachute.diameter_m = 12.0;
    r.parachute.drag_coefficient = 0.55;
    r.parachute.opening_load_N = 41000.0;
    r.parachute.drag_coefficient_at_deploy = 0.62;
    r.parachute.inflation_time_s = 0.9;
    r.parachute.mass_kg = 14.5;
    r.parachute.heat_shield_jettison_time_s = 270.0;
    r.parachute.descent_velocity_m_s = 62.0;
    r.decelerator = ds::DeceleratorResults{{true, 180.0, 21000.0, 3.4, 2100.0}, 6.0, 55.0};
    r.terminal.method = ds::TerminalMethod::retro;
    r.terminal.ignition_altitude_m = 1500.0;
    r.terminal.ignition_velocity_m_s = 80.0;
    r.terminal.delta_v_m_s = 110.0;
    r.terminal.gravity_loss_m_s = 28.0;
    r.terminal.propellant_kg = 30.0;
    r.terminal.burn_time_s = 22.0;
    r.terminal.ignition_time_s = 380.0;
    r.terminal.thrust_N = 5200.0;
    r.terminal.burned_propellant_kg = 26.5;
    r.terminal.touchdown_velocity_m_s = 2.0;
    r.terminal.impact_velocity_m_s = 16.5;
    r.terminal.impact_energy_J = 51000.0;
    r.terminal.hover_time_s = 14.0;
    r.timeline.events = {{{}, "parachute deploy", 250.0, 9000.0, 410.0}};
    r.timeline.margin_s = 95.0;
    r.timeline.available_s = 130.0;
    r.timeline.needed_s = 35.0;
    r.mass.mode = ds::MassMode::sizing;
    r.mass.entry_kg = 560.0;
    r.mass.landed_kg = 380.0;
    r.mass.items = {{"heat shield", 60.0, 52.0, 0.15, ds::MassGroup::heat_shield,
                     ds::GrowthBasis::maturity, ds::Maturity::layout, "design"}};
    r.mass.closure = ds::MassClosure{true, 7, 0.004};
    r.capability.max_site_elevation_m = 1250.0;
    r.checks = {{"peak_deceleration", ds::CheckStatus::marginal, 14.0, 15.0, "g",
                 "peak deceleration 14 g is within 10% of the 15 g limit", "limits", std::nullopt}};
    r.history = {{1.0, 120000.0, 2000.0, 5590.0, -13.1, 28.0, 0.5, 0.01, 0.2, 0.0}};
    r.notes = {"no winds"};
    return r;
}

}  // namespace

TEST_CASE("the results document has every key of design-file.md's results contract") {
    const Json document = ds::results_to_json(sample_results());
    const std::vector<std::string> contract_keys{"/format",
                                                 "/version",
                                                 "/converged",
                                                 "/entry/mass_kg",
                                                 "/entry/diameter_m",
                                                 "/entry/drag_coefficient",
                                                 "/entry/ballistic_coefficient_kg_m2",
                                                 "/entry/peak_deceleration_g",
                                                 "/entry/peak_deceleration_altitude_m",
                                                 "/entry/peak_heat_flux_W_cm2",
                                                 "/entry/peak_heat_flux_altitude_m",
                                                 "/entry/heat_load_J_cm2",
                                                 "/entry/peak_dynamic_pressure_Pa",
                                                 "/parachute/deploy_time_s",
                                                 "/parachute/deploy_altitude_m",
                                                 "/parachute/deploy_mach",
                                                 "/parachute/deploy_dynamic_pressure_Pa",
                                                 "/parachute/deploy_velocity_m_s",
                                                 "/parachute/diameter_m",
                                                 "/parachute/opening_load_N",
                                                 "/terminal/method",
                                                 "/terminal/ignition_altitude_m",
                                                 "/terminal/ignition_velocity_m_s",
                                                 "/terminal/delta_v_m_s",
                                                 "/terminal/gravity_loss_m_s",
                                                 "/terminal/propellant_kg",
                                                 "/terminal/burn_time_s",
                                                 "/timeline/events/0/name",
                                                 "/timeline/events/0/time_s",
                                                 "/timeline/events/0/altitude_m",
                                                 "/timeline/events/0/velocity_m_s",
                                                 "/timeline/margin_s",
                                                 "/mass/entry_kg",
                                                 "/mass/landed_kg",
                                                 "/mass/items/0/name",
                                                 "/mass/items/0/mass_kg",
                                                 "/checks/0/id",
                                                 "/checks/0/status",
                                                 "/checks/0/value",
                                                 "/checks/0/limit",
                                                 "/checks/0/message"};
    for (const auto& key : contract_keys) {
        CAPTURE(key);
        CHECK(document.contains(Json::json_pointer(key)));
    }
    CHECK(document["format"] == "descent-sizer/results");
    CHECK(document["version"] == 1);
    CHECK(document["converged"] == true);
}

TEST_CASE("the results document writes each field's value under its own key") {
    const Json document = ds::results_to_json(sample_results());
    CHECK(document["entry"]["ballistic_coefficient_kg_m2"] == 64.1);
    CHECK(document["entry"]["drag_coefficient_source"] == "design");
    CHECK(document["entry"]["peak_radiative_heat_flux_W_cm2"] == 0.4);
    CHECK(document["entry"]["heat_shield_tps_kg"] == 50.4);
    CHECK(document["parachute"]["deployed"] == true);
    CHECK(document["parachute"]["opening_load_N"] == 41000.0);
    CHECK(document["terminal"]["method"] == "retro");
    CHECK(document["terminal"]["propellant_kg"] == 30.0);
    CHECK(document["timeline"]["events"][0]["name"] == "parachute deploy");
    CHECK(document["timeline"]["margin_s"] == 95.0);
    CHECK(document["mass"]["landed_kg"] == 380.0);
    CHECK(document["mass"]["items"][0]["mass_kg"] == 60.0);
    const Json& check = document["checks"][0];
    CHECK(check["id"] == "peak_deceleration");
    CHECK(check["status"] == "marginal");
    CHECK(check["value"] == 14.0);
    CHECK(check["limit"] == 15.0);
    CHECK(check["unit"] == "g");
    CHECK(check["source"] == "limits");
    CHECK(document["notes"] == Json::array({"no winds"}));
}

TEST_CASE("the decelerator, the chain's new figures and the capability are written by value") {
    const Json document = ds::results_to_json(sample_results());
    CHECK(document["decelerator"] == Json{{"deployed", true},
                                          {"deploy_time_s", 180.0},
                                          {"deploy_altitude_m", 21000.0},
                                          {"deploy_mach", 3.4},
                                          {"deploy_dynamic_pressure_Pa", 2100.0},
                                          {"diameter_m", 6.0},
                                          {"mass_kg", 55.0}});
    const Json& parachute = document["parachute"];
    CHECK(parachute["drag_coefficient_at_deploy"] == 0.62);
    CHECK(parachute["inflation_time_s"] == 0.9);
    CHECK(parachute["mass_kg"] == 14.5);
    CHECK(parachute["heat_shield_jettison_time_s"] == 270.0);
    CHECK(parachute["descent_velocity_m_s"] == 62.0);
    const Json& terminal = document["terminal"];
    CHECK(terminal["ignition_time_s"] == 380.0);
    CHECK(terminal["thrust_N"] == 5200.0);
    CHECK(terminal["burned_propellant_kg"] == 26.5);
    CHECK(terminal["touchdown_velocity_m_s"] == 2.0);
    CHECK(terminal["impact_velocity_m_s"] == 16.5);
    CHECK(terminal["impact_energy_J"] == 51000.0);
    CHECK(terminal["hover_time_s"] == 14.0);
    CHECK(document["timeline"]["available_s"] == 130.0);
    CHECK(document["timeline"]["needed_s"] == 35.0);
    CHECK(document["capability"] ==
          Json{{"max_site_elevation_m", 1250.0}, {"max_site_elevation_limit", nullptr}});
}

TEST_CASE("the approach and the orbit are written by value, with both frames") {
    ds::Results r = sample_results();
    const ds::EntryVelocity inertial{5776.9, -11.2, 95.0};
    const ds::EntryVelocity relative{5539.0, -11.69, 95.22};
    r.approach = ds::ApproachResults{3000.0, -4758.7e3, 1.716,    19904.0, 6638.7e3,
                                     71.27,  -17.7,     inertial, relative};
    r.orbit = ds::OrbitResults{250e3, 400e3,   3327.7, 2806.3, 521.4, 225.0,  167.2,    234.4,
                               794.4, -1363e3, 0.303,  34.9,   781.9, -145.1, inertial, relative};
    const Json document = ds::results_to_json(r);
    const Json frames{
        {"velocity_m_s", 5776.9}, {"flight_path_angle_deg", -11.2}, {"azimuth_deg", 95.0}};
    CHECK(document["approach"] == Json{{"v_infinity_m_s", 3000.0},
                                       {"semi_major_axis_m", -4758.7e3},
                                       {"eccentricity", 1.716},
                                       {"periapsis_altitude_m", 19904.0},
                                       {"impact_parameter_m", 6638.7e3},
                                       {"turn_angle_deg", 71.27},
                                       {"interface_true_anomaly_deg", -17.7},
                                       {"inertial", frames},
                                       {"relative",
                                        {{"velocity_m_s", 5539.0},
                                         {"flight_path_angle_deg", -11.69},
                                         {"azimuth_deg", 95.22}}}});
    const Json& orbit = document["orbit"];
    CHECK(orbit["periapsis_altitude_m"] == 250e3);
    CHECK(orbit["apoapsis_altitude_m"] == 400e3);
    CHECK(orbit["speed_before_burn_m_s"] == 3327.7);
    CHECK(orbit["speed_after_burn_m_s"] == 2806.3);
    CHECK(orbit["delta_v_m_s"] == 521.4);
    CHECK(orbit["isp_s"] == 225.0);
    CHECK(orbit["propellant_kg"] == 167.2);
    CHECK(orbit["stage_kg"] == 234.4);
    CHECK(orbit["mass_before_burn_kg"] == 794.4);
    CHECK(orbit["transfer_periapsis_altitude_m"] == -1363e3);
    CHECK(orbit["transfer_eccentricity"] == 0.303);
    CHECK(orbit["transfer_angle_deg"] == 34.9);
    CHECK(orbit["coast_s"] == 781.9);
    CHECK(orbit["interface_true_anomaly_deg"] == -145.1);
    CHECK(orbit["inertial"] == frames);
    CHECK(orbit["relative"]["velocity_m_s"] == 5539.0);
}

TEST_CASE("the mass budget is written with its mode, item details and closure") {
    const Json document = ds::results_to_json(sample_results());
    const Json& mass = document["mass"];
    CHECK(mass["mode"] == "sizing");
    CHECK(mass["items"][0] == Json{{"name", "heat shield"},
                                   {"mass_kg", 60.0},
                                   {"basic_kg", 52.0},
                                   {"growth_fraction", 0.15},
                                   {"group", "heat shield"},
                                   {"maturity", "layout"},
                                   {"source", "design"}});
    CHECK(mass["closure"] == Json{{"converged", true}, {"iterations", 7}, {"residual_kg", 0.004}});

    ds::Results analysis = sample_results();
    analysis.mass.mode = ds::MassMode::analysis;
    analysis.mass.closure.reset();
    const Json fixed = ds::results_to_json(analysis)["mass"];
    CHECK(fixed["mode"] == "analysis");
    REQUIRE(fixed.contains("closure"));
    CHECK(fixed["closure"].is_null());
}

TEST_CASE("the results sections come in the order of the flight") {
    const Json document = ds::results_to_json(sample_results());
    std::vector<std::string> keys;
    for (const auto& item : document.items())
        keys.push_back(item.key());
    const std::vector<std::string> expected{"format",    "version",    "converged",   "approach",
                                            "orbit",     "entry",      "decelerator", "drogue",
                                            "parachute", "terminal",   "timeline",    "landing",
                                            "mass",      "capability", "checks",      "notes"};
    CHECK(keys == expected);
}

TEST_CASE("absent figures and non-finite numbers are written as null") {
    ds::Results results;  // nothing computed: every optional empty
    results.entry.peak_heat_flux_W_cm2 = std::numeric_limits<double>::quiet_NaN();
    results.entry.heat_load_J_cm2 = std::numeric_limits<double>::infinity();
    results.checks = {
        {"closure", ds::CheckStatus::fail, std::nan(""), 1.0, "", "", "", std::nullopt}};
    const Json document = ds::results_to_json(results);

    for (const char* key : {"/parachute/deploy_time_s",
                            "/parachute/deploy_altitude_m",
                            "/parachute/deploy_mach",
                            "/parachute/deploy_dynamic_pressure_Pa",
                            "/parachute/deploy_velocity_m_s",
                            "/parachute/diameter_m",
                            "/parachute/drag_coefficient",
                            "/parachute/opening_load_N",
                            "/terminal/ignition_altitude_m",
                            "/terminal/delta_v_m_s",
                            "/terminal/propellant_kg",
                            "/terminal/burn_time_s",
                            "/timeline/margin_s",
                            "/mass/landed_kg",
                            "/parachute/drag_coefficient_at_deploy",
                            "/parachute/inflation_time_s",
                            "/parachute/mass_kg",
                            "/parachute/heat_shield_jettison_time_s",
                            "/parachute/descent_velocity_m_s",
                            "/terminal/ignition_time_s",
                            "/terminal/thrust_N",
                            "/terminal/burned_propellant_kg",
                            "/terminal/touchdown_velocity_m_s",
                            "/terminal/impact_velocity_m_s",
                            "/terminal/impact_energy_J",
                            "/terminal/hover_time_s",
                            "/timeline/available_s",
                            "/timeline/needed_s",
                            "/decelerator",
                            "/approach",
                            "/orbit",
                            "/mass/closure",
                            "/capability/max_site_elevation_m",
                            "/entry/peak_radiative_heat_flux_W_cm2",
                            "/entry/radiative_heat_load_J_cm2",
                            "/entry/peak_heat_flux_W_cm2",
                            "/entry/heat_load_J_cm2",
                            "/checks/0/value"}) {
        CAPTURE(key);
        REQUIRE(document.contains(Json::json_pointer(key)));
        CHECK(document[Json::json_pointer(key)].is_null());
    }
    CHECK(document["checks"][0]["limit"] == 1.0);
    CHECK(document["checks"][0]["status"] == "fail");
    CHECK(document["converged"] == false);
    CHECK(document["timeline"]["events"] == Json::array());
    CHECK(document["mass"]["items"] == Json::array());
    CHECK(ds::write_results(results).find("NaN") == std::string::npos);
}

TEST_CASE("the figures that are not finite are named by their paths in the document") {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    ds::Results results = sample_results();
    results.entry.interface.relative.velocity_m_s = nan;  // an object in an object
    results.mass.items.at(0).basic_kg = std::numeric_limits<double>::infinity();  // in an array
    results.checks.push_back({"second", ds::CheckStatus::fail, nan, 1.0, "", "", "", nan});
    results.history.at(0).mach = nan;
    const std::vector<std::string> expected{"entry.interface.relative.velocity_m_s",
                                            "mass.items[0].basic_kg", "checks[1].value",
                                            "checks[1].margin"};
    CHECK(ds::non_finite_figures(results, false) == expected);
    std::vector<std::string> with_history = expected;
    with_history.push_back("history[0].mach");
    CHECK(ds::non_finite_figures(results, true) == with_history);
    CHECK(ds::non_finite_figures(sample_results(), true).empty());

    // Written as null.
    const Json document = ds::results_to_json(results, {.include_history = true});
    for (const char* key : {"/entry/interface/relative/velocity_m_s", "/mass/items/0/basic_kg",
                            "/checks/1/value", "/checks/1/margin", "/history/0/mach"}) {
        CAPTURE(key);
        REQUIRE(document.contains(Json::json_pointer(key)));
        CHECK(document[Json::json_pointer(key)].is_null());
    }
}

TEST_CASE("check statuses are named pass, marginal and fail") {
    CHECK(ds::to_string(ds::CheckStatus::pass) == "pass");
    CHECK(ds::to_string(ds::CheckStatus::marginal) == "marginal");
    CHECK(ds::to_string(ds::CheckStatus::fail) == "fail");
}

TEST_CASE("the trajectory history is written only when asked for") {
    const ds::Results results = sample_results();
    CHECK_FALSE(ds::results_to_json(results).contains("history"));

    const Json document = ds::results_to_json(results, {.include_history = true});
    REQUIRE(document["history"].size() == 1);
    const Json& sample = document["history"][0];
    std::vector<std::string> keys;
    for (const auto& item : sample.items())
        keys.push_back(item.key());
    const std::vector<std::string> expected(ds::test::history_columns.begin(),
                                            ds::test::history_columns.end());
    CHECK(keys == expected);
    CHECK(sample["altitude_m"] == 120000.0);
    CHECK(sample["flight_path_angle_deg"] == -13.1);

    const std::string text = ds::write_results(results, {.include_history = true});
    CHECK(text.ends_with("}\n"));
    CHECK(Json::parse(text) == document);
}
