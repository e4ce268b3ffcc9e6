// The `size` command as a user runs it: the binary, its exit codes and what it prints.

#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <string>

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include "support/command_line.hpp"
#include "support/special_files.hpp"

namespace fs = std::filesystem;

namespace {

using ds::test::file_text;
using ds::test::Run;

Run run(const std::string& arguments) {
    return ds::test::run_binary(arguments, ds::test::scratch("descent-sizer-cli-test"));
}

std::string sample(const std::string& name) {
    return ds::test::sample_argument(name);
}

/// The small station sample with one change, written to a temporary file.
std::string variant(const std::string& name, const std::function<void(nlohmann::json&)>& edit) {
    return ds::test::variant_argument(
        "small-ballistic-station",
        std::filesystem::temp_directory_path() / ("descent-sizer-" + name + ".json"), edit);
}

}  // namespace

TEST_CASE("size prints a summary with units and the caution, and exits 0") {
    const Run r = run("size " + sample("small-ballistic-station"));
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("Checks (failing first)") != std::string::npos);
    CHECK(r.out.find("kg/m^2") != std::string::npos);
    CHECK(r.out.find("W/cm^2") != std::string::npos);
    CHECK(r.out.find("Conceptual sizing estimates") != std::string::npos);
    CHECK(r.err.empty());
}

TEST_CASE(
    "a highest feasible site that is the search's bound says so; one of the margin does not") {
    const Run titan = run("size " + sample("titan-surface-probe"));
    CHECK(titan.exit_code == 0);
    CHECK(titan.out.find("(bounded by the heat-shield jettison altitude)") != std::string::npos);
    const Run station = run("size " + sample("small-ballistic-station"));
    CHECK(station.out.find("highest feasible site elevation") != std::string::npos);
    CHECK(station.out.find("bounded by") == std::string::npos);
    const Run json = run("size --json " + sample("titan-surface-probe"));
    CHECK(nlohmann::json::parse(json.out)["capability"]["max_site_elevation_limit"] ==
          "heat_shield_jettison");
}

TEST_CASE("size --json prints a results document with the contract's keys") {
    for (const char* name :
         {"small-ballistic-station", "lifting-rover-carrier", "earth-return-capsule"}) {
        CAPTURE(name);
        const Run r = run("size --json " + sample(name));
        REQUIRE(r.exit_code == 0);
        const nlohmann::json doc = nlohmann::json::parse(r.out);
        CHECK(doc["format"] == "descent-sizer/results");
        CHECK(doc["version"] == 1);
        CHECK(doc["converged"] == true);
        for (const char* key :
             {"mass_kg", "diameter_m", "drag_coefficient", "ballistic_coefficient_kg_m2",
              "peak_deceleration_g", "peak_heat_flux_W_cm2", "heat_load_J_cm2",
              "peak_dynamic_pressure_Pa"}) {
            CHECK(doc["entry"].contains(key));
        }
        CHECK(doc["parachute"]["deploy_mach"].is_number());
        CHECK(doc["checks"].is_array());
        CHECK_FALSE(doc.contains("history"));
    }
}

TEST_CASE("size --json --history adds the trajectory samples") {
    const Run r = run("size --json --history " + sample("small-ballistic-station"));
    REQUIRE(r.exit_code == 0);
    const nlohmann::json doc = nlohmann::json::parse(r.out);
    REQUIRE(doc["history"].is_array());
    CHECK(doc["history"].size() > 10);
    CHECK(doc["history"][0]["altitude_m"] == 125000.0);
}

TEST_CASE("a negative entry velocity exits 2 naming the key's path") {
    const Run r = run("size " + variant("negative-velocity", [](nlohmann::json& d) {
                          d["entry"]["velocity_m_s"] = -5600;
                      }));
    CHECK(r.exit_code == 2);
    CHECK(r.err.find("entry.velocity_m_s") != std::string::npos);
    CHECK(r.out.empty());
}

TEST_CASE("an unknown key exits 2 naming it") {
    const Run r = run("size " + variant("unknown-key", [](nlohmann::json& d) {
                          d["aeroshell"]["colour"] = "red";
                      }));
    CHECK(r.exit_code == 2);
    CHECK(r.err.find("aeroshell.colour") != std::string::npos);
}

TEST_CASE("a newer version exits 2 and says so") {
    const Run r = run("size " + variant("newer", [](nlohmann::json& d) { d["version"] = 2; }));
    CHECK(r.exit_code == 2);
    CHECK(r.err.find("version") != std::string::npos);
}

TEST_CASE("text that is not JSON exits 2 with a line number") {
    const fs::path file = fs::temp_directory_path() / "descent-sizer-not-json.json";
    std::ofstream(file) << "{\n  \"format\": \"descent-sizer/design\",\n  oops\n}\n";
    const Run r = run("size '" + file.string() + "'");
    CHECK(r.exit_code == 2);
    CHECK(r.err.find("line 3") != std::string::npos);
}

TEST_CASE(
    "a design that hits the ground before its trigger still sizes (exit 0) and fails a check") {
    const Run r = run("size " + variant("never-deploys", [](nlohmann::json& d) {
                          d["parachute"]["deploy_mach"] = 0.2;
                      }));
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("FAIL") != std::string::npos);
    CHECK(r.out.find("reaches the ground at") != std::string::npos);
}

TEST_CASE(
    "without the window's program beside it, the window and the sheet say how to build them") {
    // descent-sizer does not load Qt: it hands the window and the sheet to descent-sizer-window
    // from its own folder. A copy of the command alone in a folder of its own has none.
    const fs::path alone = ds::test::scratch("descent-sizer-cli-alone") / "descent-sizer";
    fs::copy_file(DESCENT_SIZER_BINARY, alone, fs::copy_options::overwrite_existing);
    const fs::path dir = alone.parent_path();
    for (const std::string& arguments :
         {std::string(), "sheet " + sample("small-ballistic-station") + " -o " +
                             ds::test::quoted(dir / "sheet.html")}) {
        CAPTURE(arguments);
        const std::string command = ds::test::quoted(alone) + " " + arguments + " >" +
                                    ds::test::quoted(dir / "out.txt") + " 2>" +
                                    ds::test::quoted(dir / "err.txt");
        const int status = std::system(command.c_str());
        CHECK(WIFEXITED(status));
        CHECK(WEXITSTATUS(status) == 1);
        const std::string err = ds::test::file_text(dir / "err.txt");
        CHECK(err.find("descent-sizer-window") != std::string::npos);
        CHECK(err.find("-DDESCENT_SIZER_BUILD_GUI=ON") != std::string::npos);
    }
    // The commands themselves need nothing beside them.
    const std::string size = ds::test::quoted(alone) + " size " +
                             sample("small-ballistic-station") + " >" +
                             ds::test::quoted(dir / "out.txt");
    CHECK(std::system(size.c_str()) == 0);
}

TEST_CASE("a figure that overflows prints as not finite and fails finite_figures, never nan") {
    // From a hostile trial, where the text said "delta-v -nan m/s" and "inf kg".
    const Run r = run("size " + variant("overflowing", [](nlohmann::json& d) {
                          d["atmosphere"]["density_scale"] = 1e300;
                      }));
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("FAIL      finite_figures") != std::string::npos);
    CHECK(r.out.find("not finite g") != std::string::npos);
    CHECK(r.out.find("peak deceleration                      not finite g") != std::string::npos);
    CHECK(r.out.find("nan") == std::string::npos);
}

TEST_CASE("verify prints every reference case with its source and exits 0 when all agree") {
    const Run r = run("verify");
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("source    Allen and Eggers, NACA Report 1381 (1958)") != std::string::npos);
    CHECK(r.out.find("MISSED") == std::string::npos);
    const Run json = run("verify --json");
    REQUIRE(json.exit_code == 0);
    const nlohmann::json cases = nlohmann::json::parse(json.out);
    CHECK(cases["missed"] == 0);
    REQUIRE(cases["cases"].size() >= 20);
    CHECK(r.out.find(std::to_string(cases["cases"].size()) + " of " +
                     std::to_string(cases["cases"].size()) + " cases agree") != std::string::npos);
    for (const auto& c : cases["cases"]) {
        CAPTURE(c["id"]);
        CHECK(c["agrees"] == true);
        CHECK(c["difference"].get<double>() <= c["tolerance"].get<double>());
    }
}

TEST_CASE("keys prints the reference of every design key, as resources/design-keys.md holds it") {
    const Run r = run("keys");
    CHECK(r.exit_code == 0);
    CHECK(r.out.rfind("# The keys of a design document\n", 0) == 0);
    CHECK(r.out.find("| `velocity_m_s` | Velocity | m/s | required | positive |") !=
          std::string::npos);
}

TEST_CASE("size refuses /dev/zero and a FIFO at once, as unreadable (exit 2), saying why") {
    // From a hostile trial: both were read without end or blocked forever.
    const std::filesystem::path dir = ds::test::scratch("descent-sizer-cli-test");
    const ds::test::Fifo fifo(dir / "design.fifo");
    REQUIRE(fifo.ok());
    for (const std::string& file : {std::string("/dev/zero"), fifo.path().string()}) {
        CAPTURE(file);
        const Run r = ds::test::run_binary_within("size " + ds::test::quoted(file), dir, 20);
        CHECK(r.exit_code == 2);
        CHECK(r.err.find("not a regular file (a device or a pipe), so not read") !=
              std::string::npos);
    }
}

TEST_CASE("a missing design file is refused with a non-zero exit") {
    const Run r = run("size /nonexistent/design.json");
    CHECK(r.exit_code != 0);
    CHECK_FALSE(r.err.empty());
}

#ifdef DESCENT_SIZER_WITH_GUI
TEST_CASE("sheet writes the sizing sheet as HTML, CSV and PDF by the file's extension") {
    const fs::path dir = fs::temp_directory_path() / "descent-sizer-cli-sheet";
    fs::create_directories(dir);
    for (const char* name : {"sheet.html", "sheet.csv", "sheet.pdf"}) {
        CAPTURE(name);
        const fs::path out = dir / name;
        fs::remove(out);
        const Run r =
            run("sheet " + sample("small-ballistic-station") + " -o '" + out.string() + "'");
        CHECK(r.exit_code == 0);
        REQUIRE(fs::exists(out));
        const std::string text = file_text(out);
        if (out.extension() == ".html") {
            CHECK(text.find("Sizing sheet: Small ballistic science station") != std::string::npos);
            CHECK(text.find("Conceptual sizing estimates") != std::string::npos);
        } else if (out.extension() == ".csv") {
            CHECK(text.rfind("time_s,altitude_m,", 0) == 0);
        } else {
            CHECK(text.rfind("%PDF-", 0) == 0);
        }
    }
}

TEST_CASE("sheet refuses an unknown format and writes nothing") {
    const fs::path out = fs::temp_directory_path() / "descent-sizer-cli-sheet.xyz";
    fs::remove(out);
    const Run r = run("sheet " + sample("small-ballistic-station") + " -o '" + out.string() + "'");
    CHECK(r.exit_code == 1);  // refused before any work
    CHECK(r.err.find("unknown sheet format '.xyz'") != std::string::npos);
    CHECK_FALSE(fs::exists(out));
}

TEST_CASE("a sheet on a full disk exits 4, says so and keeps the old file") {
    // Regression: on a full disk `sheet -o` exited 0 and left the old file replaced by a part
    // (a PDF cut short). The disk is made full past 4 KiB for the command by the shell's
    // file-size limit; the signal a write past it raises is ignored, as a full disk raises none.
    const fs::path dir = fs::temp_directory_path() / "descent-sizer-cli-sheet-full";
    fs::remove_all(dir);
    fs::create_directories(dir);
    for (const char* name : {"sheet.csv", "sheet.pdf", "sheet.html"}) {
        CAPTURE(name);
        const fs::path out = dir / name;
        std::ofstream(out) << "the old sheet\n";
        const Run r = ds::test::run_binary_on_full_disk(
            "sheet " + sample("small-ballistic-station") + " -o " + ds::test::quoted(out), dir, 4);
        CHECK(r.exit_code == 4);
        CHECK(r.err.find("cannot write '" + out.string() + "'") != std::string::npos);
        CHECK(file_text(out) == "the old sheet\n");
    }
    CHECK(std::distance(fs::directory_iterator(dir), fs::directory_iterator()) ==
          5);  // and stdout, stderr
}
#endif

TEST_CASE("a design without an entry azimuth says it flies without rotation, and where it lands") {
    // The capsule sample keeps no entry direction, to show this note.
    const Run r = run("size --json " + sample("earth-return-capsule"));
    REQUIRE(r.exit_code == 0);
    const nlohmann::json doc = nlohmann::json::parse(r.out);
    bool noted = false;
    for (const auto& note : doc["notes"]) {
        noted = noted || note.get<std::string>().find("entry.azimuth_deg") != std::string::npos;
    }
    CHECK(noted);
    CHECK(doc["entry"]["interface"]["rotation_flown"] == false);
    REQUIRE(doc["landing"].is_object());
    // Heading east from (0, 0) without lift: straight along the equator.
    CHECK(doc["landing"]["downrange_m"].get<double>() > 100000.0);
    CHECK(std::abs(doc["landing"]["crossrange_m"].get<double>()) < 1e-6);
    CHECK(std::abs(doc["landing"]["latitude_deg"].get<double>()) < 1e-9);
    CHECK(doc["parachute"]["deploy_longitude_deg"].is_number());
    CHECK(doc["terminal"]["touchdown_horizontal_velocity_m_s"].is_number());
}

TEST_CASE("disperse reports the landing ellipse at the probability asked, larger for more") {
    const std::string design = sample("small-ballistic-station");
    const Run r99 = run("disperse --json --runs 40 --threads 1 " + design);
    const Run r50 =
        run("disperse --json --runs 40 --threads 1 --ellipse-probability 0.5 " + design);
    REQUIRE(r99.exit_code == 0);
    REQUIRE(r50.exit_code == 0);
    const nlohmann::json e99 = nlohmann::json::parse(r99.out)["summary"]["landing_ellipse"];
    const nlohmann::json e50 = nlohmann::json::parse(r50.out)["summary"]["landing_ellipse"];
    REQUIRE(e99.is_object());
    REQUIRE(e50.is_object());
    CHECK(e99["probability"] == 0.99);
    CHECK(e99["count"] == 40);
    // The same points, semi-axes scaled by sqrt(-2 ln 0.01 / -2 ln 0.5) = 2.578.
    CHECK(e99["semi_major_km"].get<double>() / e50["semi_major_km"].get<double>() ==
          doctest::Approx(std::sqrt(std::log(0.01) / std::log(0.5))).epsilon(1e-12));
    const Run bad = run("disperse --runs 4 --ellipse-probability 1.5 " + design);
    CHECK(bad.exit_code != 0);
}
