// The trade commands as a user runs them: sweep, disperse, merge, sensitivity and corridor through
// the binary, their numbers checked against the size command and against each other, and their
// error exits.

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <sstream>
#include <string>
#include <vector>

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include "support/command_line.hpp"
#include "support/special_files.hpp"

namespace fs = std::filesystem;
using Json = nlohmann::json;

namespace {

using ds::test::file_text;
using ds::test::quoted;
using ds::test::Run;

fs::path scratch() {
    return ds::test::scratch("descent-sizer-trade-cli-test");
}

Run run(const std::string& arguments) {
    return ds::test::run_binary(arguments, scratch());
}

/// Runs a command that must succeed and returns what it printed.
std::string output(const std::string& arguments) {
    const Run r = run(arguments);
    INFO(arguments << "\n" << r.err);
    REQUIRE(r.exit_code == 0);
    return r.out;
}

std::string sample(const std::string& name) {
    return ds::test::sample_argument(name);
}

/// A sample with one change, written to a scratch file.
std::string variant(const std::string& base, const std::string& name,
                    const std::function<void(Json&)>& edit) {
    return ds::test::variant_argument(base, scratch() / (name + ".json"), edit);
}

/// The text written to a scratch file, quoted for the command line.
std::string saved(const std::string& name, const std::string& text) {
    const fs::path file = scratch() / name;
    std::ofstream(file) << text;
    return quoted(file);
}

// Numbers that went through the same sizing print the same digits; the tolerance only
// absorbs the JSON's shortest round-trip representation.
constexpr double same = 1e-12;

void checkSame(const Json& a, const Json& b, const char* what) {
    CAPTURE(what);
    REQUIRE(a.is_number());
    REQUIRE(b.is_number());
    CHECK(a.get<double>() == doctest::Approx(b.get<double>()).epsilon(same));
}

}  // namespace

TEST_CASE(
    "sweep: each case of a line is the size command's result for the design with that value") {
    const Json rows = Json::parse(
        output("sweep " + sample("small-ballistic-station") +
               " --vary entry.flight_path_angle_deg=-15:-11:3 --json --threads 2"))["rows"];
    REQUIRE(rows.size() == 3);
    const double angles[] = {-15.0, -13.0, -11.0};
    for (std::size_t i = 0; i < 3; ++i) {
        CAPTURE(angles[i]);
        CHECK(rows[i]["inputs"]["entry.flight_path_angle_deg"].get<double>() == angles[i]);
        const Json sized = Json::parse(
            output("size --json " +
                   variant("small-ballistic-station", "angle" + std::to_string(i),
                           [&](Json& d) { d["entry"]["flight_path_angle_deg"] = angles[i]; })));
        checkSame(rows[i]["entry"]["peak_deceleration_g"], sized["entry"]["peak_deceleration_g"],
                  "peak deceleration");
        checkSame(rows[i]["entry"]["peak_heat_flux_W_cm2"], sized["entry"]["peak_heat_flux_W_cm2"],
                  "peak heat flux");
        checkSame(rows[i]["parachute"]["deploy_altitude_m"],
                  sized["parachute"]["deploy_altitude_m"], "deploy altitude");
        checkSame(rows[i]["mass"]["landed_kg"], sized["mass"]["landed_kg"], "landed mass");
        checkSame(rows[i]["capability"]["max_site_elevation_m"],
                  sized["capability"]["max_site_elevation_m"], "highest site");
    }
    // A steeper entry decelerates harder (Allen and Eggers, NACA Report 1381: the peak goes
    // as sin|gamma|).
    CHECK(rows[0]["entry"]["peak_deceleration_g"].get<double>() >
          rows[1]["entry"]["peak_deceleration_g"].get<double>());
    CHECK(rows[1]["entry"]["peak_deceleration_g"].get<double>() >
          rows[2]["entry"]["peak_deceleration_g"].get<double>());
}

TEST_CASE("sweep: the table's columns carry whole figure names and their units") {
    // Regression: the headers were cut to 14 characters ("ballistic_coef") with no units.
    std::istringstream text(output("sweep " + sample("small-ballistic-station") +
                                   " --vary aeroshell.diameter_m=2.2:3.4:2 --threads 2"));
    std::string head;
    std::string units;
    std::getline(text, head);
    std::getline(text, units);
    CHECK(head.find("aeroshell.diameter_m ") != std::string::npos);
    CHECK(head.find(" ballistic_coefficient ") != std::string::npos);
    CHECK(head.find(" peak_deceleration ") != std::string::npos);
    CHECK(units.find("[m]") != std::string::npos);
    CHECK(units.find("[kg/m^2]") != std::string::npos);
    CHECK(units.find("[W/cm^2]") != std::string::npos);
    // Each unit stands under its name: both end in the same column.
    CHECK(head.find(" ballistic_coefficient ") + std::string(" ballistic_coefficient").size() ==
          units.find("[kg/m^2]") + std::string("[kg/m^2]").size());
}

TEST_CASE(
    "sweep: two --vary make a grid, the first key slowest, in the table, the JSON and the CSV") {
    const std::string args = "sweep " + sample("earth-return-capsule") +
                             " --vary entry.velocity_m_s=11000:12000:2"
                             " --vary entry.flight_path_angle_deg=-9:-7:3 --threads 2";
    const Json rows = Json::parse(output(args + " --json"))["rows"];
    REQUIRE(rows.size() == 6);
    for (std::size_t i = 0; i < rows.size(); ++i) {
        CAPTURE(i);
        CHECK(rows[i]["inputs"]["entry.velocity_m_s"].get<double>() == (i < 3 ? 11000.0 : 12000.0));
        CHECK(rows[i]["inputs"]["entry.flight_path_angle_deg"].get<double>() ==
              doctest::Approx(-9.0 + static_cast<double>(i % 3)).epsilon(1e-15));
    }
    // Faster at the same angle heats more (Sutton-Graves: q ~ V^3).
    CHECK(rows[3]["entry"]["peak_heat_flux_W_cm2"].get<double>() >
          rows[0]["entry"]["peak_heat_flux_W_cm2"].get<double>());

    std::istringstream csv(output(args + " --csv"));
    std::string line;
    std::getline(csv, line);
    CHECK(line.rfind("entry.velocity_m_s,entry.flight_path_angle_deg,entry_mass,", 0) == 0);
    int lines = 0;
    while (std::getline(csv, line)) {
        ++lines;
        if (lines == 4)
            CHECK(line.rfind("12000,-9,", 0) == 0);
    }
    CHECK(lines == 6);

    std::istringstream table(output(args));
    std::getline(table, line);
    CHECK(line.find("peak_deceleration") != std::string::npos);
    std::getline(table, line);  // the units
    lines = 0;
    while (std::getline(table, line))
        ++lines;
    CHECK(lines == 6);
}

TEST_CASE(
    "disperse: the same seed gives the same numbers whatever the threads; another seed does not") {
    const std::string args = "disperse " + sample("earth-return-capsule") + " --runs 40 --json";
    const Json one = Json::parse(output(args + " --seed 7 --threads 1"));
    const Json two = Json::parse(output(args + " --seed 7 --threads 2"));
    const Json other = Json::parse(output(args + " --seed 8 --threads 2"));
    REQUIRE(one["campaign"]["cases"].size() == 40);
    CHECK(one["campaign"]["cases"] == two["campaign"]["cases"]);
    CHECK(one["summary"] == two["summary"]);
    CHECK(one["campaign"]["cases"][0]["draws"] != other["campaign"]["cases"][0]["draws"]);

    // The capsule's dispersed entry mass has the design's 0.5 kg sigma about its nominal:
    // 40 draws put the sample mean within 4 standard errors, 4 * 0.5 / sqrt(40) = 0.32 kg.
    const Json& mass = one["summary"]["figures"]["entry_mass"];
    CHECK(mass["count"] == 40);
    const Json design = Json::parse(file_text(ds::test::sample_path("earth-return-capsule")));
    CHECK(std::abs(mass["mean"].get<double>() - design["mass"]["entry_kg"].get<double>()) < 0.32);
    const double p = one["summary"]["success_probability"].get<double>();
    CHECK(p >= 0.0);
    CHECK(p <= 1.0);
}

TEST_CASE("disperse --shard and merge: the shards merged are the one run, case for case") {
    const std::string args =
        "disperse " + sample("small-ballistic-station") + " --runs 30 --seed 7 --threads 2";
    const Json whole = Json::parse(output(args + " --json"));
    const std::string first = saved("shard0.json", output(args + " --shard 0/2 --json"));
    const std::string second = saved("shard1.json", output(args + " --shard 1/2 --json"));
    const Json merged = Json::parse(output("merge --json " + second + " " + first));
    // The merged cases come shard by shard (merge reads one part after the other): in the
    // order of their index, they are the whole run's.
    Json cases = merged["campaign"]["cases"];
    CHECK(cases[0]["index"] == 0);
    CHECK(cases[1]["index"] == 2);
    std::sort(cases.begin(), cases.end(),
              [](const Json& a, const Json& b) { return a["index"] < b["index"]; });
    CHECK(cases == whole["campaign"]["cases"]);
    CHECK(merged["summary"] == whole["summary"]);
    // The text summaries agree, and the CSVs row for row.
    CHECK(output("merge " + first + " " + second) == output(args));
    const auto sorted_lines = [](const std::string& text) {
        std::vector<std::string> lines;
        std::istringstream in(text);
        for (std::string line; std::getline(in, line);)
            lines.push_back(line);
        std::sort(lines.begin(), lines.end());
        return lines;
    };
    CHECK(sorted_lines(output("merge --csv " + first + " " + second)) ==
          sorted_lines(output(args + " --csv")));
    // A shard's own summary says it is one.
    CHECK(output(args + " --shard 1/2").rfind("shard 1/2 of the campaign", 0) == 0);
}

TEST_CASE("disperse --csv: a row per case with its draws and key figures") {
    std::istringstream csv(
        output("disperse " + sample("lifting-rover-carrier") + " --runs 12 --seed 3 --csv"));
    std::string line;
    std::getline(csv, line);
    CHECK(line.rfind("case,entry.flight_path_angle_deg,entry.velocity_m_s,", 0) == 0);
    CHECK(line.find(",peak_deceleration,") != std::string::npos);
    CHECK(line.find(",success,failed_checks") != std::string::npos);
    int rows = 0;
    while (std::getline(csv, line)) {
        CHECK(line.rfind(std::to_string(rows) + ",", 0) == 0);
        ++rows;
    }
    CHECK(rows == 12);
}

TEST_CASE("sensitivity: signs and sizes of known dependences") {
    const Json table = Json::parse(
        output("sensitivity " + sample("small-ballistic-station") +
               " --inputs entry.flight_path_angle_deg,mass.entry_kg,aeroshell.diameter_m --json "
               "--threads 2"));
    const auto at = [&](const std::string& figure, const std::string& input) {
        const auto& figures = table["figures"];
        const auto& inputs = table["inputs"];
        const auto f = std::find(figures.begin(), figures.end(), figure) - figures.begin();
        const auto i = std::find(inputs.begin(), inputs.end(), input) - inputs.begin();
        REQUIRE(f < static_cast<long>(figures.size()));
        REQUIRE(i < static_cast<long>(inputs.size()));
        return table["normalized"][static_cast<std::size_t>(f)][static_cast<std::size_t>(i)]
            .get<double>();
    };
    CHECK(table["relative_step"] == 1e-3);
    // The entry mass is the input itself: d ln m / d ln m = 1 (exact, to the differences' 1e-6).
    CHECK(at("entry_mass", "mass.entry_kg") == doctest::Approx(1.0).epsilon(1e-6));
    CHECK(at("aeroshell_diameter", "aeroshell.diameter_m") == doctest::Approx(1.0).epsilon(1e-6));
    // beta = m / (Cd pi D^2 / 4): +1 in the mass exactly; about -2 in the diameter, less the
    // drag coefficient's own change with the nose radius over the diameter.
    CHECK(at("ballistic_coefficient", "mass.entry_kg") == doctest::Approx(1.0).epsilon(1e-6));
    CHECK(at("ballistic_coefficient", "aeroshell.diameter_m") ==
          doctest::Approx(-2.0).epsilon(0.01));
    // A steeper entry (a more negative angle) raises the peak deceleration: d ln a / d ln gamma
    // is positive, gamma being negative (Allen and Eggers, NACA Report 1381: a ~ sin|gamma|).
    CHECK(at("peak_deceleration", "entry.flight_path_angle_deg") > 0.5);
    // The angle does not change the vehicle: no dependence of the entry mass on it.
    CHECK(std::abs(at("entry_mass", "entry.flight_path_angle_deg")) < 1e-9);
}

TEST_CASE("sensitivity: the text ranks the inputs per figure and the CSV has a row per figure") {
    const std::string args = "sensitivity " + sample("small-ballistic-station") +
                             " --inputs mass.entry_kg,aeroshell.diameter_m --threads 2";
    const std::string text = output(args);
    // An input that does not move a figure is not listed among its largest (it printed as
    // +0.0000 before): the diameter does not change the entry mass.
    CHECK(text.find("\nentry_mass\n    +1.0000  mass.entry_kg\n"
                    "  (no other input moves it by 0.0001 or more)\n") != std::string::npos);
    CHECK(text.find("0.0000") == std::string::npos);
    CHECK(text.find("\nballistic_coefficient\n    -1.99") != std::string::npos);
    std::istringstream csv(output(args + " --csv"));
    std::string line;
    std::getline(csv, line);
    CHECK(line == "figure,mass.entry_kg,aeroshell.diameter_m");
    std::getline(csv, line);
    CHECK(line.rfind("entry_mass,1,", 0) == 0);
    int rows = 1;
    while (std::getline(csv, line))
        ++rows;
    CHECK(rows == 20);  // the key figures
}

TEST_CASE("trade commands: a bad range or shard exits 1 and says what was expected") {
    const Run noCount =
        run("sweep " + sample("small-ballistic-station") + " --vary entry.velocity_m_s=1:2");
    CHECK(noCount.exit_code == 1);
    CHECK(noCount.err.find("expected KEY=FROM:TO:N") != std::string::npos);
    CHECK(noCount.out.empty());
    const Run zero =
        run("sweep " + sample("small-ballistic-station") + " --vary entry.velocity_m_s=1:2:0");
    CHECK(zero.exit_code == 1);
    CHECK(zero.err.find("N a whole number from 1 to 1000") != std::string::npos);
    // No key before '=' (found by the argument parser's fuzzer): refused at once.
    const Run keyless = run("sweep " + sample("small-ballistic-station") + " --vary =2.2:3.4:7");
    CHECK(keyless.exit_code == 1);
    CHECK(keyless.err.find("=2.2:3.4:7: expected KEY=FROM:TO:N (no key before '=')") !=
          std::string::npos);
    // Counts are whole numbers within their bounds, read whole: not "1e6" read as 1, nor a
    // negative shard wrapped round, nor two thousand threads.
    const std::string station = sample("small-ballistic-station");
    for (const std::string& refused :
         {"sweep " + station + " --vary aeroshell.diameter_m=2.2:3.4:1e6",
          "sweep " + station + " --vary aeroshell.diameter_m=2.2:3.4:1001",
          "sweep " + station + " --vary aeroshell.diameter_m=2.2:3.4:3 --threads 2000",
          "disperse " + station + " --runs -5", "disperse " + station + " --shard -1/3",
          "disperse " + station + " --shard 1/3x"}) {
        CAPTURE(refused);
        const Run r = run(refused);
        CHECK(r.exit_code == 1);
        CHECK(r.out.empty());
    }
    const Run noKey = run("sweep " + sample("small-ballistic-station") + " --vary 5600");
    CHECK(noKey.exit_code == 1);
    const Run three = run("sweep " + sample("small-ballistic-station") +
                          " --vary a=1:2:2 --vary b=1:2:2 --vary c=1:2:2");
    CHECK(three.exit_code != 0);
    CHECK(three.out.empty());
    const Run shard = run("disperse " + sample("small-ballistic-station") + " --shard 2/2");
    CHECK(shard.exit_code == 1);
    CHECK(shard.err.find("--shard 2/2") != std::string::npos);
}

TEST_CASE("trade commands: a bad key is named, by the refused cases or with exit 2") {
    // A sweep of a key the design format does not have (a misspelling), or sensitivities to
    // one, is refused before any case runs, with exit 1.
    const Run misspelt = run("sweep " + sample("small-ballistic-station") +
                             " --vary entry.no_such_key=1:2:2 --json");
    CHECK(misspelt.exit_code == 1);
    CHECK(misspelt.out.empty());
    CHECK(misspelt.err.find("--vary entry.no_such_key: not a number") != std::string::npos);
    // An element far past the end of a list is refused, not padded with a hundred million nulls.
    const Run padded = run("sweep " + sample("small-ballistic-station") +
                           " --vary \"mass.items[100000000].mass_kg=1:2:4\"");
    CHECK(padded.exit_code == 1);
    CHECK(padded.err.find("not a number of the design") != std::string::npos);
    // Not a key path at all (a JSON pointer's bad escape): refused the same way, not a crash.
    const Run escape = run("sweep " + sample("small-ballistic-station") +
                           " --vary \"aeroshell.diam~eter_m=2.2:3.4:3\"");
    CHECK(escape.exit_code == 1);
    CHECK(escape.err.find("not a number of the design") != std::string::npos);
    const Run nonsense =
        run("sensitivity " + sample("small-ballistic-station") + " --inputs nonsense");
    CHECK(nonsense.exit_code == 1);
    CHECK(nonsense.out.empty());
    CHECK(nonsense.err.find("--inputs nonsense: not a number") != std::string::npos);
    // A number key of the format that the design leaves out can be swept: it is added.
    const Json added = Json::parse(output("sweep " + sample("small-ballistic-station") +
                                          " --vary parachute.mass_kg=20:30:2 --json"))["rows"];
    REQUIRE(added.size() == 2);
    CHECK(added[0]["worst_status"] != "fail");
    // No cases, or an option the parser refuses, is a usage error (1), as the documented codes
    // say, not the parser library's own code.
    const Run none = run("disperse " + sample("small-ballistic-station") + " --runs 0");
    CHECK(none.exit_code == 1);
    CHECK(none.err.find("--runs") != std::string::npos);
    CHECK(run("sweep " + sample("small-ballistic-station") + " --no-such-option").exit_code == 1);
    // A dispersion of a key that is not a number of the design stops the campaign.
    const Run dispersed = run(
        "disperse " +
        variant("small-ballistic-station", "bad-dispersion",
                [](Json& d) {
                    d["dispersions"] = Json::array(
                        {{{"key", "entry.colour"}, {"distribution", "normal"}, {"sigma", 1.0}}});
                }) +
        " --runs 5");
    CHECK(dispersed.exit_code == 2);
    CHECK(dispersed.err.find("entry.colour is not a number of the design") != std::string::npos);
    // A design the reader refuses is refused by every study, naming the key.
    const std::string refused = variant("small-ballistic-station", "refused",
                                        [](Json& d) { d["entry"]["velocity_m_s"] = -5600; });
    for (const std::string& command :
         {"sweep " + refused + " --vary entry.flight_path_angle_deg=-14:-12:2",
          "disperse " + refused, "sensitivity " + refused}) {
        CAPTURE(command);
        const Run r = run(command);
        CHECK(r.exit_code == 2);
        CHECK(r.err.find("entry.velocity_m_s") != std::string::npos);
        CHECK(r.out.empty());
    }
    const Run undeclared = run("disperse " + variant("small-ballistic-station", "no-dispersions",
                                                     [](Json& d) { d.erase("dispersions"); }));
    CHECK(undeclared.exit_code == 1);
    CHECK(undeclared.err.find("the design has no \"dispersions\"") != std::string::npos);
}

TEST_CASE("merge: parts that are not shards of one campaign exit 2 and say why") {
    const std::string args = "disperse " + sample("earth-return-capsule") + " --runs 10 --json";
    const std::string first = saved("seed1.json", output(args + " --seed 1 --shard 0/2"));
    const std::string other = saved("seed2.json", output(args + " --seed 2 --shard 1/2"));
    const Run mixed = run("merge " + first + " " + other);
    CHECK(mixed.exit_code == 2);
    CHECK(mixed.err.find("not shards of one campaign") != std::string::npos);
    const Run half = run("merge " + first);
    CHECK(half.exit_code == 2);
    CHECK(half.err.find("case 1 is missing") != std::string::npos);
    // What a failed or cut-short shard leaves: an empty file, or the start of its output.
    const Run empty = run("merge " + saved("empty.json", ""));
    CHECK(empty.exit_code == 2);
    CHECK(empty.err.find("empty: not a disperse --json output") != std::string::npos);
    const Run cut =
        run("merge " + saved("cut.json", output(args + " --seed 1 --shard 0/2").substr(0, 300)));
    CHECK(cut.exit_code == 2);
    CHECK(cut.err.find("not a whole disperse --json output") != std::string::npos);
    // A device or a pipe is refused before it is opened (it would feed or block the merge).
    const ds::test::Fifo fifo(scratch() / "part.fifo");
    REQUIRE(fifo.ok());
    for (const std::string& device : {std::string("/dev/zero"), fifo.path().string()}) {
        const Run refused = ds::test::run_binary_within(
            "merge " + ds::test::quoted(std::filesystem::path(device)), scratch(), 20);
        CHECK(refused.exit_code == 2);
        CHECK(refused.err.find("not a regular file (a device or a pipe)") != std::string::npos);
    }
    const Run design = run("merge " + sample("earth-return-capsule"));
    CHECK(design.exit_code == 2);
    CHECK(design.err.find("not a dispersion campaign") != std::string::npos);
}

TEST_CASE("merge: parts of another design, or changed by hand, are refused with why (exit 2)") {
    const std::string args = " --runs 6 --seed 5 --json";
    const std::string station = sample("small-ballistic-station");
    const std::string first =
        saved("station0.json", output("disperse " + station + args + " --shard 0/2"));
    const std::string second_text = output("disperse " + station + args + " --shard 1/2");
    const std::string second = saved("station1.json", second_text);
    REQUIRE(run("merge " + first + " " + second).exit_code == 0);

    // The same seed, runs and dispersions on a design with another entry azimuth: the heads
    // agree in all but the design's digest.
    const std::string turned = variant("small-ballistic-station", "turned",
                                       [](Json& d) { d["entry"]["azimuth_deg"] = 96.0; });
    const std::string other =
        saved("turned1.json", output("disperse " + turned + args + " --shard 1/2"));
    const Run mixed = run("merge " + first + " " + other);
    CHECK(mixed.exit_code == 2);
    CHECK(mixed.err.find("they fly different designs") != std::string::npos);

    // A success flag flipped by hand disagrees with the case's failed checks.
    Json flipped = Json::parse(second_text);
    Json& row = flipped["campaign"]["cases"][0];
    row["success"] = !row["success"].get<bool>();
    const Run flag = run("merge " + first + " " + saved("flipped.json", flipped.dump()));
    CHECK(flag.exit_code == 2);
    CHECK(flag.err.find("case 1: its success disagrees with its failed checks") !=
          std::string::npos);

    // A figure changed by hand: the rows disagree with their digest.
    Json edited = Json::parse(second_text);
    edited["campaign"]["cases"][1]["figures"][0] = 1.0;
    const Run figure = run("merge " + first + " " + saved("edited.json", edited.dump()));
    CHECK(figure.exit_code == 2);
    CHECK(figure.err.find("its cases disagree with their digest") != std::string::npos);

    // A part written before the digests were kept, and a shard given twice.
    Json old = Json::parse(second_text);
    old["campaign"].erase("cases_digest");
    old["campaign"].erase("design_digest");
    const Run undigested = run("merge " + first + " " + saved("old.json", old.dump()));
    CHECK(undigested.exit_code == 2);
    CHECK(undigested.err.find("no digests of its design and cases") != std::string::npos);
    const Run twice = run("merge " + first + " " + first + " " + second);
    CHECK(twice.exit_code == 2);
    CHECK(twice.err.find("shard 0/2 is given twice") != std::string::npos);
}

TEST_CASE("merge: a part whose keys were reordered (sorted by a tool) still merges") {
    const std::string args =
        "disperse " + sample("small-ballistic-station") + " --runs 6 --seed 5 --json";
    const std::string first = saved("plain0.json", output(args + " --shard 0/2"));
    const std::string second = output(args + " --shard 1/2");
    // nlohmann::json (not ordered) writes its keys sorted: "cases" before "runs" and "seed".
    const std::string sorted = saved("sorted1.json", Json::parse(second).dump(1));
    CHECK(output("merge --json " + first + " " + sorted) ==
          output("merge --json " + first + " " + saved("plain1.json", second)));
}

TEST_CASE("corridor: each bound passes through the size command and fails just past it") {
    const Json corridor = Json::parse(
        output("corridor " + sample("small-ballistic-station") + " --runs 0 --json --threads 2"));
    CHECK(corridor["angle_key"] == "entry.flight_path_angle_deg");
    CHECK(corridor["speed_key"] == "entry.velocity_m_s");
    CHECK(corridor["frame"] == "planet-relative");
    CHECK(corridor["angle_tolerance_deg"].get<double>() == 0.01);
    REQUIRE(corridor["speeds"].size() == 1);
    const Json& row = corridor["speeds"][0];
    CHECK(row["speed"].get<double>() == 5600.0);
    CHECK(row["dispersed"]["centre"].is_null());
    const auto failing_at = [&](double angle) {
        const std::string file = variant("small-ballistic-station", "corridor-angle", [&](Json& d) {
            d["entry"]["flight_path_angle_deg"] = angle;
        });
        const Json results = Json::parse(output("size " + file + " --json"));
        std::vector<std::string> ids;
        for (const Json& c : results["checks"]) {
            if (c["status"] == "fail")
                ids.push_back(c["id"].get<std::string>());
        }
        return ids;
    };
    for (const char* side : {"shallow", "steep"}) {
        CAPTURE(side);
        const Json& bound = row[side];
        CHECK(bound["closed"] == true);
        CHECK(failing_at(bound["angle_deg"].get<double>()).empty());
        const auto past = failing_at(bound["failing_angle_deg"].get<double>());
        CHECK(std::find(past.begin(), past.end(), bound["binding_check"].get<std::string>()) !=
              past.end());
        CHECK(std::abs(bound["failing_angle_deg"].get<double>() -
                       bound["angle_deg"].get<double>()) <= 0.01);
    }
    CHECK(row["shallow"]["binding_check"] == "parachute_trigger");
    CHECK(row["steep"]["binding_check"] == "peak_deceleration");
    checkSame(
        row["width_deg"],
        Json(row["shallow"]["angle_deg"].get<double>() - row["steep"]["angle_deg"].get<double>()),
        "width");
}

TEST_CASE("corridor: a list of speeds as CSV, the text table, and the dispersed success") {
    const std::string csv = output("corridor " + sample("small-ballistic-station") +
                                   " --speeds 5200,5800 --runs 0 --csv");
    CHECK(csv.rfind("entry.velocity_m_s,relative_speed_m_s,inertial_speed_m_s,shallow_deg,", 0) ==
          0);
    CHECK(std::count(csv.begin(), csv.end(), '\n') == 3);
    CHECK(csv.find("\n5200,") != std::string::npos);
    CHECK(csv.find("\n5800,") != std::string::npos);

    const std::string text =
        output("corridor " + sample("small-ballistic-station") + " --runs 60 --seed 3");
    CHECK(text.find("Entry corridor in entry.flight_path_angle_deg (planet-relative)") !=
          std::string::npos);
    CHECK(text.find("peak_deceleration") != std::string::npos);
    CHECK(text.find("success with the dispersions (60 cases each") != std::string::npos);
}

TEST_CASE("corridor: bad speeds, and a list of speeds for an entry from orbit, are refused") {
    const Run bad = run("corridor " + sample("small-ballistic-station") + " --speeds 5000:x");
    CHECK(bad.exit_code == 1);
    CHECK(bad.err.find("--speeds") != std::string::npos);
    const std::string orbiting = variant("small-ballistic-station", "corridor-orbit", [](Json& d) {
        d["entry"].erase("velocity_m_s");
        d["entry"].erase("flight_path_angle_deg");
        d["entry"]["orbit"] = {{"periapsis_altitude_m", 250000},
                               {"apoapsis_altitude_m", 400000},
                               {"flight_path_angle_deg", -13.0},
                               {"isp_s", 225}};
    });
    const Run listed = run("corridor " + orbiting + " --speeds 3000 --runs 0");
    CHECK(listed.exit_code == 2);
    CHECK(listed.err.find("takes its speed from its orbit") != std::string::npos);
    const Json own = Json::parse(output("corridor " + orbiting + " --runs 0 --json"));
    CHECK(own["angle_key"] == "entry.orbit.flight_path_angle_deg");
    CHECK(own["speed_key"].is_null());
    CHECK(own["frame"] == "inertial");
}

TEST_CASE("output that cannot be written (a full device) exits 4 and says so") {
    // Regression: summaries sent to a full device exited 0 with nothing written.
    for (const std::string& command :
         {"disperse " + sample("small-ballistic-station") + " --runs 5",
          "sensitivity " + sample("small-ballistic-station") + " --inputs aeroshell.diameter_m",
          "size " + sample("small-ballistic-station")}) {
        CAPTURE(command);
        const fs::path err = scratch() / "full-stderr.txt";
        const int status = std::system(
            (quoted(DESCENT_SIZER_BINARY) + " " + command + " >/dev/full 2>" + quoted(err))
                .c_str());
        REQUIRE(WIFEXITED(status));
        CHECK(WEXITSTATUS(status) == 4);
        CHECK(file_text(err).find("cannot write the output") != std::string::npos);
    }
}

TEST_CASE("optimise: the optimum is written as a design that sizes, and --json is its document") {
    const fs::path written = scratch() / "optimum.json";
    fs::remove(written);
    const std::string args = "optimise " + sample("small-ballistic-station") +
                             " --vary aeroshell.diameter_m=1.8:3.5 --maximise unallocated_mass";
    const Run r = run(args + " --write " + quoted(written));
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("deploy_dynamic_pressure_high") != std::string::npos);  // what binds
    REQUIRE(fs::exists(written));
    const Json optimum = Json::parse(output(args + " --json"));
    CHECK(optimum["feasible"] == true);
    const Json sized = Json::parse(output("size " + quoted(written) + " --json"));
    CHECK(sized["mass"]["unallocated_kg"].get<double>() ==
          doctest::Approx(optimum["optimum_objective"].get<double>()).epsilon(1e-12));
    // A file that cannot be written: exit 4, nothing left behind.
    const Run unwritable = run(args + " --write /nonexistent-folder/optimum.json");
    CHECK(unwritable.exit_code == 4);
    CHECK(unwritable.err.find("cannot write") != std::string::npos);
    // On a full disk (past 2 KiB): exit 4, the old file whole, nothing left beside it.
    std::ofstream(written) << "the old design\n";
    const Run full =
        ds::test::run_binary_on_full_disk(args + " --write " + quoted(written), scratch(), 2);
    CHECK(full.exit_code == 4);
    CHECK(full.err.find("cannot write '" + written.string() + "'") != std::string::npos);
    CHECK(file_text(written) == "the old design\n");
    for (const auto& entry : fs::directory_iterator(written.parent_path()))
        CHECK(entry.path().extension() != ".part");
    // An unknown figure is refused before any work.
    const Run figure = run("optimise " + sample("small-ballistic-station") +
                           " --vary aeroshell.diameter_m=1.8:3.5 --minimise lightness");
    CHECK(figure.exit_code == 1);
    CHECK(figure.err.find("unknown figure \"lightness\"") != std::string::npos);
}
