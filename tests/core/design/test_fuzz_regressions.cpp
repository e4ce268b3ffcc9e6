// Inputs the fuzzer (tests/fuzz) found to crash, hang or exhaust memory, each kept as a case
// here and as a file in tests/fuzz/corpus/. Each case states what the input must give now.

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include <doctest/doctest.h>

#include "atmosphere/table.hpp"
#include "design/atmosphere_csv.hpp"
#include "design/reader.hpp"
#include "flight/stage.hpp"
#include "heating/tauber_sutton.hpp"
#include "parachute/canopy.hpp"
#include "results/writer.hpp"
#include "sizing/size.hpp"

namespace {

constexpr double not_a_number = std::numeric_limits<double>::quiet_NaN();

/// A document nested `depth` arrays deep under "name", the rest of it irrelevant.
std::string nested(std::size_t depth) {
    return "{\"name\": " + std::string(depth, '[') + std::string(depth, ']') + "}";
}

/// A 560 kg capsule entering at Mars, named `name`: the document up to its mass, then `rest`
/// (the parachute, terminal and solver members).
std::string mars_capsule(const std::string& name, const std::string& rest) {
    return R"({
      "format": "descent-sizer/design", "version": 1, "name": ")" +
           name + R"(", "body": "mars",
      "atmosphere": { "model": "exponential", "surface_density_kg_m3": 0.020,
                      "scale_height_m": 11100, "temperature_K": 210 },
      "site": { "elevation_m": -1500 },
      "entry": { "interface_altitude_m": 125000, "velocity_m_s": 5600,
                 "flight_path_angle_deg": -13.0 },
      "aeroshell": { "diameter_m": 2.6, "half_angle_deg": 70, "nose_radius_m": 0.65 },
      "mass": { "entry_kg": 560, "heat_shield_kg": 60 },
)" + rest + "}";
}

}  // namespace

TEST_CASE("a NaN velocity gives a NaN radiative heat flux, not a read past the f(V) table") {
    // Found as corpus/error-tiny-numbers.json: a 1e-300 m scale height makes the density
    // infinite below the reference, the velocity NaN, and the table search ran off its end.
    // The value was NaN before too: the read past the table is what the sanitize preset's
    // AddressSanitizer reports (global-buffer-overflow) without the fix.
    CHECK(std::isnan(ds::tauber_sutton_heat_flux_W_m2("mars", 1e-4, 0.5, not_a_number)));
    CHECK(std::isnan(ds::tauber_sutton_heat_flux_W_m2("earth", 1e-4, 0.5, not_a_number)));
    // Away from NaN nothing changed: zero below the table, positive on it.
    CHECK(ds::tauber_sutton_heat_flux_W_m2("mars", 1e-4, 0.5, 5000.0) == 0.0);
    CHECK(ds::tauber_sutton_heat_flux_W_m2("mars", 1e-4, 0.5, 7000.0) > 0.0);
}

TEST_CASE("a NaN Mach gives a NaN canopy drag coefficient, not a read past the Mach table") {
    // The same search as above, on the canopy's Cd-against-Mach table (found by reading).
    const auto dgb = ds::canopy_type("disk-gap-band");
    REQUIRE(dgb);
    const ds::DragDevice canopy = ds::canopy_device(*dgb, 12.0, 0.55);
    REQUIRE_FALSE(canopy.mach_factor.empty());
    CHECK(std::isnan(canopy.drag_coefficient_at(not_a_number)));
    CHECK(std::isfinite(canopy.drag_coefficient_at(1.5)));
}

TEST_CASE("a document nested more than 64 levels deep is refused with one error, before parsing") {
    // Found as a timeout: the duplicate-key check holds a path per level, so time and memory
    // grew with the square of the depth (8000 levels took 8 s; 64 KiB of '[' would need GBs).
    for (const std::size_t depth : {std::size_t{65}, std::size_t{30000}}) {
        CAPTURE(depth);
        const ds::DesignReadResult read = ds::read_design(nested(depth));
        CHECK_FALSE(read.ok());
        REQUIRE(read.errors.size() == 1);
        CHECK(read.errors.front().path == "");
        CHECK(read.errors.front().text() ==
              "arrays and objects nest more than 64 levels deep: not a design document");
    }
}

TEST_CASE("nesting up to 64 levels, and brackets inside strings, are read as before") {
    // 64 levels: parsed, so the errors are the document's own (the first: "format" missing).
    const ds::DesignReadResult deep = ds::read_design(nested(63));
    REQUIRE_FALSE(deep.errors.empty());
    CHECK(deep.errors.front().text().find("nest more than") == std::string::npos);
    // Brackets in a string are text, not nesting.
    const ds::DesignReadResult text =
        ds::read_design("{\"name\": \"" + std::string(100, '[') + "\\\"" + "\"}");
    REQUIRE_FALSE(text.errors.empty());
    CHECK(text.errors.front().text().find("nest more than") == std::string::npos);
}

TEST_CASE("a lander already slower than its burn's end velocity does not burn, and never climbs") {
    // Found as a slow input (and by the property test): the descent under the canopy runs out
    // of its 250 s budget at 7.7 km, where the lander falls at 76-84 m/s, below the 90 m/s the
    // burn is to end at. The burn's end (the velocity falling through 90 m/s) never came: the
    // engine stopped the lander, lifted it for an hour of thrust and the budget diverged.
    const std::string design = mars_capsule("slow burn", R"(
      "parachute": { "type": "disk-gap-band", "diameter_m": 12.0, "drag_coefficient": 0.55,
                     "deploy_mach": 1.8 },
      "terminal": { "method": "retro", "isp_s": 220, "thrust_to_weight": 2.5,
                    "touchdown_velocity_m_s": 90.0 },
      "solver": { "max_time_s": 250 })");
    const ds::DesignReadResult read = ds::read_design(design);
    REQUIRE(read.ok());
    const ds::Results r = ds::size_design(*read.design);
    REQUIRE(r.terminal.ignition_velocity_m_s);
    CHECK(*r.terminal.ignition_velocity_m_s < 90.0);
    CHECK(r.terminal.burn_time_s == 0.0);
    CHECK(r.terminal.burned_propellant_kg == 0.0);
    CHECK(r.terminal.propellant_kg == 0.0);
    // The burn never reached the ground: no touchdown speed is held against its limit.
    CHECK_FALSE(r.terminal.touchdown_velocity_m_s);
    CHECK(std::none_of(r.checks.begin(), r.checks.end(),
                       [](const ds::Check& c) { return c.id == "touchdown_velocity"; }));
    // The flight that ran out of its budget says so.
    const bool trajectory_fails =
        std::any_of(r.checks.begin(), r.checks.end(), [](const ds::Check& c) {
            return c.id == "trajectory" && c.status == ds::CheckStatus::fail;
        });
    CHECK(trajectory_fails);
}

TEST_CASE("a capsule under a canopy sized for 2 m/s lands at 2 m/s after an hour's descent") {
    // Found as a timeout of the fuzzer (corpus/regression-two-metres-per-second.json): 3400 s
    // under a 20 m canopy give 7800 history samples, and the fuzzer's reading back of their
    // 3 MB of JSON under the sanitizers took over a second. The sizing itself takes 0.15 s
    // (Release); the fuzzer now walks the history in memory.
    const std::string design = R"({
      "format": "descent-sizer/design", "version": 1, "name": "slow canopy", "body": "earth",
      "atmosphere": { "model": "standard" },
      "site": { "elevation_m": 2600 },
      "entry": { "interface_altitude_m": 125000, "velocity_m_s": 11200,
                 "flight_path_angle_deg": -8.5 },
      "aeroshell": { "diameter_m": 0.9, "half_angle_deg": 60, "nose_radius_m": 0.23 },
      "mass": { "entry_kg": 48, "heat_shield_kg": 0 },
      "parachute": { "type": "ringsail",
                     "diameter_m": { "size_for_velocity_m_s": 2.0, "at_height_above_site_m": 0 },
                     "deploy_altitude_m": 10000 },
      "terminal": { "method": "none" }
    })";
    const ds::DesignReadResult read = ds::read_design(design);
    REQUIRE(read.ok());
    const ds::Results r = ds::size_design(*read.design);
    CHECK(r.converged);
    // The canopy is sized for 2 m/s at the site, counting the drag of what hangs under it.
    REQUIRE(r.terminal.touchdown_velocity_m_s);
    CHECK(*r.terminal.touchdown_velocity_m_s == doctest::Approx(2.0).epsilon(0.01));
    REQUIRE(r.parachute.diameter_m);
    CHECK(*r.parachute.diameter_m > 10.0);
}

TEST_CASE("a stiff descent under a 10 km canopy stops at the step budget and says so") {
    // A slow input (corpus/regression-stiff-descent.json): the reader takes any flight-time
    // budget, and under a canopy kilometres wide the descent is stiff, so the step budget is what
    // bounds the work (200000 steps, about 1 s per flight in Release). Kept small here. Once
    // settled the descent now flies quasi-steady and lands in some 120 steps (see
    // sizing/test_quasi_steady_descent.cpp), so the budget is set below the some 105 steps of
    // the canopy's opening transient and above the entry's 44.
    const std::string design = mars_capsule("stiff", R"(
      "parachute": { "type": "disk-gap-band", "diameter_m": 10000.0, "mass_kg": 20,
                     "deploy_mach": 1.8 },
      "terminal": { "method": "none" },
      "solver": { "max_time_s": 1e12, "max_steps": 60 })");
    const ds::DesignReadResult read = ds::read_design(design);
    REQUIRE(read.ok());
    const ds::Results r = ds::size_design(*read.design);
    CHECK(r.parachute.deployed);
    const auto trajectory = std::find_if(r.checks.begin(), r.checks.end(),
                                         [](const ds::Check& c) { return c.id == "trajectory"; });
    REQUIRE(trajectory != r.checks.end());
    CHECK(trajectory->status == ds::CheckStatus::fail);
    CHECK(trajectory->message ==
          "the descent under the canopy stopped: the integration step budget ran out");
}

TEST_CASE("a 10 km canopy that outweighs the vehicle fails drop_mass, with no negative thrust") {
    // In the corpus as corpus/regression-giant-canopy-negative-mass.json: the canopy's estimate
    // is 18500 t on a 2.1 t vehicle, and the lander's mass, thrust (-1.3e8 N) and propellant
    // (-2.1e7 kg) came out negative. Held to the fuzzer's 5000 steps a phase.
    const std::string design = R"({
      "format": "descent-sizer/design", "version": 1, "name": "giant canopy", "body": "mars",
      "atmosphere": { "model": "standard" },
      "site": { "elevation_m": -2500 },
      "entry": { "interface_altitude_m": 125000, "velocity_m_s": 5900,
                 "flight_path_angle_deg": -15.2, "lift_to_drag": 0.22, "bank_angle_deg": 45.0 },
      "aeroshell": { "diameter_m": { "size_for_ballistic_coefficient_kg_m2": 115 },
                     "half_angle_deg": 70, "nose_radius_m": 1.1, "drag_coefficient": 1.68 },
      "mass": { "items": [
        { "name": "rover", "mass_kg": 900, "group": "payload", "maturity": "layout" },
        { "name": "descent stage structure", "mass_kg": 240, "group": "descent stage",
          "maturity": "estimated" } ] },
      "parachute": { "type": "disk-gap-band", "diameter_m": 10000.0, "deploy_mach": 1.9 },
      "terminal": { "method": "tethered", "isp_s": 225, "thrust_to_weight": 2.2,
                    "touchdown_velocity_m_s": 0.75 },
      "solver": { "max_time_s": 1e12, "max_steps": 5000 }
    })";
    const ds::DesignReadResult read = ds::read_design(design);
    REQUIRE(read.ok());
    const ds::Results r = ds::size_design(*read.design);
    const auto drop_mass = std::find_if(r.checks.begin(), r.checks.end(),
                                        [](const ds::Check& c) { return c.id == "drop_mass"; });
    REQUIRE(drop_mass != r.checks.end());
    CHECK(drop_mass->status == ds::CheckStatus::fail);
    CHECK(drop_mass->value > 1000.0 * drop_mass->limit);
    CHECK_FALSE(r.terminal.thrust_N);
    CHECK_FALSE(r.terminal.propellant_kg);
    CHECK_FALSE(r.mass.landed_kg);
    for (const ds::MassItem& item : r.mass.items) {
        CAPTURE(item.name);
        CHECK(item.mass_kg >= 0.0);
    }
}

TEST_CASE("a specific impulse of 1e-300 s and a canopy 1e300 m wide are refused by the reader") {
    // From a hostile trial: the first printed "delta-v -nan m/s", the second "inf kg". Below
    // 10 s no propellant is a rocket's; over 10 km no canopy is a design.
    const ds::DesignReadResult isp = ds::read_design(mars_capsule("isp", R"(
      "parachute": { "type": "disk-gap-band", "diameter_m": 12.0, "deploy_mach": 1.8 },
      "terminal": { "method": "retro", "isp_s": 1e-300, "thrust_to_weight": 2.5,
                    "touchdown_velocity_m_s": 2.0 })"));
    REQUIRE_FALSE(isp.ok());
    CHECK(isp.errors.front().text() == "terminal.isp_s: must be at least 10, got 1e-300");
    const ds::DesignReadResult canopy = ds::read_design(mars_capsule("canopy", R"(
      "parachute": { "type": "disk-gap-band", "diameter_m": 1e300, "deploy_mach": 1.8 },
      "terminal": { "method": "none" })"));
    REQUIRE_FALSE(canopy.ok());
    CHECK(canopy.errors.front().text() ==
          "parachute.diameter_m: must be greater than 0 and at most 10000, got 1e+300");
}

TEST_CASE("a figure that overflows is named by a failing check, never passed off as a number") {
    // The reader's ranges cannot foresee every product: an atmosphere 1e300 times denser gives a
    // deceleration of infinity at the interface. The finite_figures check counts every number
    // of the results that is not finite (the written document has null there), the sizing does
    // not converge, and a trade case (key figures only) names the key figure.
    const std::string dense = R"({
      "format": "descent-sizer/design", "version": 1, "name": "dense", "body": "mars",
      "atmosphere": { "model": "exponential", "surface_density_kg_m3": 0.020,
                      "scale_height_m": 11100, "temperature_K": 210, "density_scale": 1e300 },
      "site": { "elevation_m": -1500 },
      "entry": { "interface_altitude_m": 125000, "velocity_m_s": 5600,
                 "flight_path_angle_deg": -13.0 },
      "aeroshell": { "diameter_m": 2.6, "half_angle_deg": 70, "nose_radius_m": 0.65 },
      "mass": { "entry_kg": 560, "heat_shield_kg": 60 },
      "parachute": { "type": "disk-gap-band", "diameter_m": 12.0, "deploy_mach": 1.8 },
      "terminal": { "method": "none" }
    })";
    const ds::DesignReadResult read = ds::read_design(dense);
    REQUIRE(read.ok());
    const ds::Results r = ds::size_design(*read.design);
    const std::vector<std::string> non_finite = ds::non_finite_figures(r, true);
    REQUIRE_FALSE(non_finite.empty());
    CHECK(non_finite.front() == "entry.peak_deceleration_g");
    CHECK_FALSE(std::isfinite(r.entry.peak_deceleration_g));
    CHECK_FALSE(r.converged);
    const auto check = std::find_if(r.checks.begin(), r.checks.end(),
                                    [](const ds::Check& c) { return c.id == "finite_figures"; });
    REQUIRE(check != r.checks.end());
    CHECK(check->status == ds::CheckStatus::fail);
    CHECK(check->value == static_cast<double>(non_finite.size()));
    CHECK(check->message.find("entry.peak_deceleration_g") != std::string::npos);
    CHECK(ds::results_to_json(r)["entry"]["peak_deceleration_g"].is_null());
    // A sound design has none, and no such check.
    const ds::DesignReadResult sound = ds::read_design(mars_capsule("sound", R"(
      "parachute": { "type": "disk-gap-band", "diameter_m": 12.0, "deploy_mach": 1.8 },
      "terminal": { "method": "none" })"));
    REQUIRE(sound.ok());
    const ds::Results fine = ds::size_design(*sound.design);
    CHECK(ds::non_finite_figures(fine, true).empty());
    CHECK(std::none_of(fine.checks.begin(), fine.checks.end(),
                       [](const ds::Check& c) { return c.id == "finite_figures"; }));

    const ds::Results trade_case = ds::size_design(
        *read.design, {.capability = false, .history = false, .every_figure_checked = false});
    const auto key_check =
        std::find_if(trade_case.checks.begin(), trade_case.checks.end(),
                     [](const ds::Check& c) { return c.id == "finite_figures"; });
    REQUIRE(key_check != trade_case.checks.end());
    CHECK(key_check->message.find("peak_deceleration") != std::string::npos);
    CHECK_FALSE(trade_case.converged);
}

TEST_CASE("a table gives back its rows at their altitudes, however far apart their values") {
    // Found by the CSV reader's fuzz target (corpus-csv/regression-temperature-spanning-
    // 1e30.csv): T0 + f (T1 - T0) from 8.9e29 K down to 260 K gave 0 K at the upper row, not
    // 260. And (found by reading, regression-density-ratio-past-1e308.csv) a density ratio of
    // 1e400 between two rows overflowed to an infinite density above the lower row.
    // Gas constant and gamma: any positive pair (the checks are on density and temperature).
    const ds::TableAtmosphere hot(
        {{0.0, 65.0, 735.0}, {30000.0, 4.5, 8.9e29}, {60000.0, 0.47, 260.0}}, 191.8, 1.29);
    CHECK(hot.at(60000.0).temperature_K == 260.0);
    CHECK(hot.at(30000.0).temperature_K == 8.9e29);
    CHECK(hot.at(0.0).temperature_K == 735.0);

    const ds::TableAtmosphere wide({{0.0, 1e-200, 200.0}, {1000.0, 1e200, 300.0}}, 191.8, 1.29);
    // Log-linear: the geometric mean half way, each row at its altitude (to 1e-12, the
    // rounding of exp(log(x))).
    CHECK(wide.at(500.0).density_kg_m3 == doctest::Approx(1.0).epsilon(1e-12));
    CHECK(wide.at(1000.0).density_kg_m3 == doctest::Approx(1e200).epsilon(1e-12));
    CHECK(wide.at(0.0).density_kg_m3 == doctest::Approx(1e-200).epsilon(1e-12));
    CHECK(wide.at(500.0).temperature_K == 250.0);
}

TEST_CASE("a CSV table's field is quoted in a reason as printable ASCII, at most 40 characters") {
    // Found by the CSV reader's fuzz target (corpus-csv/regression-latin1-column-name.csv): a
    // column name with a byte of another encoding (0xE5) was quoted as it was, and the reason,
    // not UTF-8, could not become a Python str (UnicodeDecodeError instead of DesignError).
    const auto error_of = [](const std::string& text) {
        return ds::parse_atmosphere_csv(text).error;
    };
    CHECK(error_of("altitude_m,density_k\xE5_m3,temperature_K\n0,1,1\n") ==
          "line 1: unknown column density_k\\xE5_m3");
    CHECK(error_of("altitude_m,density_kg_m3,temperature_K\n0,1\t2,1\n") ==
          "line 2: '1\\x092' is not a number");
    // A long field: its first 40 characters, then "...".
    CHECK(error_of("altitude_m,density_kg_m3,temperature_K\n0," + std::string(5000, 'x') +
                   ",1\n") == "line 2: '" + std::string(40, 'x') + "...' is not a number");
}
