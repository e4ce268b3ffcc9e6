#include "trade_commands.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <functional>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "design/reader.hpp"
#include "json_values.hpp"
#include "results/key_figures.hpp"
#include "results/writer.hpp"
#include "trade/study.hpp"
#include "trade/success_probability.hpp"
#include "trade/trade_csv.hpp"
#include "trade/value_list.hpp"

namespace ds {
namespace {

constexpr int exit_unreadable = 2;
constexpr int exit_usage = 1;

using Json = nlohmann::ordered_json;

/// "KEY=FROM:TO:N".
std::optional<SweepAxis> parseAxis(const std::string& text, std::string* error) {
    const auto equals = text.find('=');
    SweepAxis axis;
    if (equals == std::string::npos) {
        *error = fmt::format("--vary {}: expected KEY=FROM:TO:N", text);
        return std::nullopt;
    }
    axis.key = text.substr(0, equals);
    std::istringstream rest(text.substr(equals + 1));
    char colon1 = 0;
    char colon2 = 0;
    rest >> axis.from >> colon1 >> axis.to >> colon2 >> axis.count;
    if (!rest || colon1 != ':' || colon2 != ':' || axis.count < 1 || !std::isfinite(axis.from) ||
        !std::isfinite(axis.to)) {
        *error = fmt::format("--vary {}: expected KEY=FROM:TO:N with N at least 1", text);
        return std::nullopt;
    }
    return axis;
}

std::optional<Design> readDesign(const std::string& path) {
    const DesignReadResult read = read_design_file(path);
    if (!read.ok()) {
        for (const ReadError& e : read.errors)
            fmt::print(stderr, "{}: {}\n", path, e.text());
        return std::nullopt;
    }
    return read.design;
}

/// A design file a study runs on: its document key for key, and the design read from it.
struct StudyDesign {
    std::string path;
    Json document;
    Design design;
};

std::optional<StudyDesign> readStudyDesign(const std::string& path) {
    auto design = readDesign(path);
    if (!design)
        return std::nullopt;
    std::ifstream in(path);
    return StudyDesign{path, Json::parse(in), std::move(*design)};
}

/// Runs a study of the design file; prints why when it cannot run.
std::optional<StudyOutcome> runStudyOn(const StudyDesign& file, const StudyRequest& request,
                                       unsigned threads) {
    Unwatched progress;
    StudyOutcome outcome =
        run_study(request, file.document, file.design,
                  std::filesystem::path(file.path).parent_path(), threads, progress);
    if (!outcome.error.empty()) {
        fmt::print(stderr, "{}: {}\n", file.path, outcome.error);
        return std::nullopt;
    }
    return outcome;
}

/// How a command prints its study: --json wins over --csv, text without either.
enum class Format { text, json, csv };

Format formatOf(bool json, bool csv) {
    return json ? Format::json : csv ? Format::csv : Format::text;
}

std::string valueText(const std::optional<double>& v, int decimals) {
    return v ? fmt::format("{:.{}f}", *v, decimals) : std::string("-");
}

std::string_view statusName(CheckStatus s) {
    return to_string(s);
}

Json sweepJson(const StudyOutcome& outcome) {
    const std::vector<SweepAxis>& axes = outcome.request.axes;
    Json rows = Json::array();
    for (const SweepCase& c : outcome.sweep) {
        Json row;
        Json inputs;
        for (std::size_t a = 0; a < axes.size(); ++a)
            inputs[axes[a].key] = c.inputs[a];
        row["inputs"] = inputs;
        if (!c.results) {
            row["error"] = c.error;
            row["worst_status"] = "fail";
            row["worst_check"] = "design";
            row["feasibility_margin"] = nullptr;
            row["margin_check"] = "design";
        } else {
            const Json r = results_to_json(*c.results);
            for (const char* section : {"entry", "parachute", "terminal", "mass", "capability"}) {
                row[section] = r[section];
            }
            row["mass"].erase("items");
            const WorstCheck worst = worst_check(*c.results);
            row["worst_status"] = statusName(worst.status);
            row["worst_check"] = worst.id;
            const FeasibilityMargin margin = feasibility_margin(*c.results);
            row["feasibility_margin"] = margin.margin ? Json(*margin.margin) : Json();
            row["margin_check"] = margin.id;
        }
        rows.push_back(row);
    }
    return Json{{"rows", rows}};
}

/// A readable table of the figures a trade is usually about.
void printSweepTable(const StudyOutcome& outcome) {
    const std::vector<std::string_view> shown{
        "ballistic_coefficient", "peak_deceleration", "peak_heat_flux",  "deploy_mach",
        "deploy_altitude",       "propellant",        "timeline_margin", "landed_mass"};
    const auto isShown = [&](const KeyFigureDefinition& f) {
        return std::find(shown.begin(), shown.end(), f.id) != shown.end();
    };
    std::string head;
    for (const SweepAxis& a : outcome.request.axes)
        head += fmt::format("{:>26} ", a.key);
    for (const KeyFigureDefinition& f : key_figure_table) {
        if (isShown(f))
            head += fmt::format("{:>14} ", f.id.substr(0, 14));
    }
    fmt::print("{}  worst\n", head);
    for (const SweepCase& c : outcome.sweep) {
        std::string line;
        for (const double v : c.inputs)
            line += fmt::format("{:>26.6g} ", v);
        if (!c.results) {
            fmt::print("{}  cannot be read: {}\n", line, c.error);
            continue;
        }
        const std::vector<std::optional<double>> values = key_figure_values(*c.results);
        for (std::size_t i = 0; i < key_figure_table.size(); ++i) {
            if (isShown(key_figure_table[i])) {
                line += fmt::format("{:>14} ", valueText(values[i], key_figure_table[i].decimals));
            }
        }
        const WorstCheck w = worst_check(*c.results);
        fmt::print("{}  {} {}\n", line, statusName(w.status), w.id);
    }
}

/// Prints a study in the format asked for: its JSON, its CSV (the study's own, as the window
/// exports it) or its text.
template <class JsonOf, class PrintText>
void printStudy(const StudyOutcome& outcome, Format format, JsonOf json, PrintText text) {
    switch (format) {
        case Format::json:
            fmt::print("{}\n", json().dump(2));
            break;
        case Format::csv:
            fmt::print("{}", outcome.csv());
            break;
        case Format::text:
            text();
            break;
    }
}

void printSummary(const DispersionSummary& s) {
    fmt::print("{}\n\n", success_probability_sentence(s));
    fmt::print("{:<26} {:>8} {:>12} {:>12} {:>12} {:>12} {:>12}\n", "figure", "unit", "mean",
               "std dev", "p01", "p50", "p99");
    for (const FigureStatistics& f : s.figures) {
        if (f.count == 0)
            continue;
        fmt::print("{:<26} {:>8} {:>12.5g} {:>12.5g} {:>12.5g} {:>12.5g} {:>12.5g}\n", f.id, f.unit,
                   f.mean, f.standard_deviation, f.p01, f.p50, f.p99);
    }
    if (s.landing_ellipse) {
        const LandingEllipse& e = *s.landing_ellipse;
        fmt::print(
            "\nlanding ellipse ({:.4g} %, {} landing points): centre {:.5f} deg, {:.5f} deg; "
            "semi-major {:.3f} km, semi-minor {:.3f} km, major axis at azimuth {:.1f} deg\n",
            100.0 * e.probability, e.count, e.centre_latitude_deg, e.centre_longitude_deg,
            e.axes.semi_major_km, e.axes.semi_minor_km, e.axes.major_axis_azimuth_deg);
    }
    if (!s.failing_checks.empty()) {
        fmt::print("\nfailing checks, most frequent first:\n");
        for (const auto& [id, count] : s.failing_checks) {
            fmt::print("  {:<32} {:>8} runs ({:.2f} %)\n", id, count,
                       100.0 * static_cast<double>(count) / static_cast<double>(s.runs));
        }
    }
}

/// A campaign (a dispersion run, a shard of one or merged shards) and its summary.
/// Writes a campaign case by case as its cases come, then its summary: --json (the campaign
/// with one case a line, then the summary: what merge reads), --csv (the cases), or the text
/// summary. Nothing of a case is kept once written.
class CampaignWriter {
public:
    explicit CampaignWriter(Format format) : format_(format) {}

    void add(const DispersionCampaign& campaign, const DispersedCase& dispersed) {
        start(campaign);
        if (format_ == Format::json) {
            fmt::print("{}\n   {}", cases_ == 0 ? "" : ",", case_to_json(dispersed).dump());
        } else if (format_ == Format::csv) {
            fmt::print("{}", case_csv_row(campaign, dispersed));
        }
        ++cases_;
        std::fflush(stdout);
    }

    void finish(const DispersionCampaign& campaign, const DispersionSummary& summary) {
        start(campaign);
        switch (format_) {
            case Format::json: {
                std::string text = summary_to_json(summary).dump(1);
                std::string indented;
                for (const char c : text) {
                    indented += c;
                    if (c == '\n')
                        indented += ' ';
                }
                fmt::print("{}  ]\n }},\n \"summary\": {}\n}}\n", cases_ == 0 ? "" : "\n",
                           indented);
                break;
            }
            case Format::csv:
                break;
            case Format::text:
                if (campaign.shard_count > 1) {
                    fmt::print(
                        "shard {}/{} of the campaign (merge the --json outputs for the "
                        "whole)\n",
                        campaign.shard_index, campaign.shard_count);
                }
                printSummary(summary);
                break;
        }
    }

private:
    void start(const DispersionCampaign& campaign) {
        if (started_)
            return;
        started_ = true;
        if (format_ == Format::json) {
            fmt::print("{{\n \"campaign\": {{\n");
            const Json head = campaign_head_to_json(campaign);
            for (auto it = head.begin(); it != head.end(); ++it)
                fmt::print("  {}: {},\n", Json(it.key()).dump(), it.value().dump());
            fmt::print("  \"cases\": [");
        } else if (format_ == Format::csv) {
            fmt::print("{}", campaign_csv_head(campaign));
        }
    }

    Format format_;
    bool started_ = false;
    std::size_t cases_ = 0;
};

void printCampaign(const DispersionCampaign& campaign, const DispersionSummary& summary,
                   Format format) {
    CampaignWriter writer(format);
    for (const DispersedCase& dispersed : campaign.cases)
        writer.add(campaign, dispersed);
    writer.finish(campaign, summary);
}

Json sensitivityJson(const SensitivityTable& table) {
    Json matrix = Json::array();
    for (Eigen::Index f = 0; f < table.normalized.rows(); ++f) {
        Json row = Json::array();
        for (Eigen::Index i = 0; i < table.normalized.cols(); ++i) {
            const double s = table.normalized(f, i);
            row.push_back(json::number(s));
        }
        matrix.push_back(row);
    }
    return Json{{"relative_step", sensitivity_relative_step},
                {"inputs", table.inputs},
                {"figures", table.figures},
                {"normalized", matrix}};
}

void printSensitivityRanking(const SensitivityTable& table) {
    fmt::print(
        "Normalised sensitivities d(ln figure)/d(ln input), central differences "
        "of {} relative; the five largest per figure.\n",
        sensitivity_relative_step);
    for (std::size_t f = 0; f < table.figures.size(); ++f) {
        const auto ranked = table.ranked(f);
        if (ranked.empty())
            continue;
        fmt::print("\n{}\n", table.figures[f]);
        for (std::size_t k = 0; k < std::min<std::size_t>(5, ranked.size()); ++k) {
            fmt::print("  {:>+9.4f}  {}\n", ranked[k].second, ranked[k].first);
        }
    }
}

Json boundJson(const std::optional<CorridorBound>& bound) {
    if (!bound)
        return nullptr;
    return Json{{"angle_deg", bound->angle_deg},
                {"relative_angle_deg", bound->relative_angle_deg},
                {"inertial_angle_deg", bound->inertial_angle_deg},
                {"closed", bound->closed},
                {"feasibility_margin", bound->margin},
                {"failing_angle_deg", bound->closed ? Json(bound->failing_deg) : Json()},
                {"binding_check", bound->binding_check},
                {"binding_message", bound->binding_message}};
}

Json dispersedJson(const std::optional<DispersedAngle>& d) {
    if (!d)
        return nullptr;
    return Json{{"angle_deg", d->angle_deg},
                {"runs", d->runs},
                {"successes", d->successes},
                {"success_probability", d->success_probability},
                {"success_interval_95", {d->wilson_low, d->wilson_high}}};
}

Json corridorJson(const EntryCorridor& c) {
    Json rows = Json::array();
    for (const CorridorSpeed& row : c.speeds) {
        const bool found = row.shallow && row.steep;
        rows.push_back(Json{{"speed", row.speed},
                            {"relative_speed_m_s", row.relative_speed_m_s},
                            {"inertial_speed_m_s", row.inertial_speed_m_s},
                            {"shallow", boundJson(row.shallow)},
                            {"steep", boundJson(row.steep)},
                            {"width_deg", found ? Json(row.width_deg()) : Json()},
                            {"centre_deg", found ? Json(row.centre_deg()) : Json()},
                            {"dispersed",
                             {{"shallow", dispersedJson(row.dispersed_shallow)},
                              {"centre", dispersedJson(row.dispersed_centre)},
                              {"steep", dispersedJson(row.dispersed_steep)}}},
                            {"sizings", row.sizings},
                            {"error", row.error}});
    }
    return Json{
        {"angle_key", c.angle_key},
        {"speed_key", c.speed_key.empty() ? Json() : Json(c.speed_key)},
        {"frame", c.frame},
        {"angle_tolerance_deg", corridor_angle_tolerance_deg},
        {"nominal_speed", c.nominal_speed},
        {"nominal_angle_deg", c.nominal_angle_deg},
        {"dispersion_error", c.dispersion_error.empty() ? Json() : Json(c.dispersion_error)},
        {"speeds", rows}};
}

std::string dispersedText(const std::optional<DispersedAngle>& d) {
    return d ? fmt::format("{:.1f} % ({:.1f} to {:.1f})", 100.0 * d->success_probability,
                           100.0 * d->wilson_low, 100.0 * d->wilson_high)
             : std::string("-");
}

void printCorridorTable(const EntryCorridor& c) {
    const std::string speedName = c.speed_key.empty() ? "speed (inertial)" : c.speed_key;
    fmt::print("Entry corridor in {} ({}); the design at {:g} and {:.2f} deg.\n", c.angle_key,
               c.frame, c.nominal_speed, c.nominal_angle_deg);
    fmt::print("Each bound root-found to {} deg on the feasibility margin.\n\n",
               corridor_angle_tolerance_deg);
    fmt::print("{:>20} {:>11}  {:<28} {:>11}  {:<28} {:>9}\n", speedName, "shallow deg", "binds",
               "steep deg", "binds", "width deg");
    const auto side = [](const std::optional<CorridorBound>& b) {
        return b->closed ? b->binding_check : std::string("(open: passes to the range's end)");
    };
    for (const CorridorSpeed& row : c.speeds) {
        if (!row.shallow || !row.steep) {
            fmt::print("{:>20.6g} no corridor: {}\n", row.speed, row.error);
            continue;
        }
        fmt::print("{:>20.6g} {:>11.3f}  {:<28} {:>11.3f}  {:<28} {:>9.3f}\n", row.speed,
                   row.shallow->angle_deg, side(row.shallow), row.steep->angle_deg, side(row.steep),
                   row.width_deg());
    }
    if (!c.dispersion_error.empty())
        fmt::print("\nthe dispersions could not be flown: {}\n", c.dispersion_error);
    for (const CorridorSpeed& row : c.speeds) {
        if (!row.shallow || !row.steep)
            continue;
        fmt::print("\nat {:g} (interface {:.1f} m/s planet-relative, {:.1f} m/s inertial):\n",
                   row.speed, row.relative_speed_m_s, row.inertial_speed_m_s);
        for (const auto& [name, bound] :
             {std::pair{"shallow", row.shallow}, std::pair{"steep", row.steep}}) {
            fmt::print("  {:<8} {:.3f} deg ({:.3f} planet-relative, {:.3f} inertial)\n", name,
                       bound->angle_deg, bound->relative_angle_deg, bound->inertial_angle_deg);
            fmt::print("           {}\n", bound->closed ? "past it: " + bound->binding_message
                                                        : "open: passes to the range's end");
        }
        if (row.dispersed_centre) {
            fmt::print(
                "  success with the dispersions ({} cases each; 95 % Wilson interval):\n"
                "           shallow bound {}, centre {}, steep bound {}\n",
                row.dispersed_centre->runs, dispersedText(row.dispersed_shallow),
                dispersedText(row.dispersed_centre), dispersedText(row.dispersed_steep));
        }
    }
}

struct Options {
    std::string design;
    std::vector<std::string> vary;
    bool json = false;
    bool csv = false;
    unsigned threads = 0;
    std::size_t runs = 1000;
    std::uint64_t seed = 1;
    std::string shard = "0/1";
    std::vector<std::string> parts;
    std::vector<std::string> inputs;
    double ellipse_probability = default_ellipse_probability;
    std::string speeds;
};

/// Completes a request once the design is read, or refuses it with an exit code.
using PrepareStudy = std::function<std::optional<int>(const StudyDesign&, StudyRequest&)>;

/// What a study command does once its options are read: read the study's design, let
/// `prepare` complete the request or refuse it, run the request on the design and print the
/// outcome. Returns the command's exit code.
int runStudyCommand(const Options& o, StudyRequest request,
                    const std::function<void(const StudyOutcome&)>& print,
                    const PrepareStudy& prepare = nullptr) {
    const auto file = readStudyDesign(o.design);
    if (!file)
        return exit_unreadable;
    if (prepare) {
        if (const std::optional<int> code = prepare(*file, request))
            return *code;
    }
    const auto outcome = runStudyOn(*file, request, o.threads);
    if (!outcome)
        return exit_unreadable;
    print(*outcome);
    return 0;
}

int sweepCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::sweep;
    for (const std::string& text : o.vary) {
        std::string error;
        const auto axis = parseAxis(text, &error);
        if (!axis) {
            fmt::print(stderr, "{}\n", error);
            return exit_usage;
        }
        request.axes.push_back(*axis);
    }
    return runStudyCommand(o, request, [&](const StudyOutcome& outcome) {
        printStudy(
            outcome, formatOf(o.json, o.csv), [&] { return sweepJson(outcome); },
            [&] { printSweepTable(outcome); });
    });
}

int disperseCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::dispersions;
    request.runs = o.runs;
    request.seed = o.seed;
    request.ellipse_probability = o.ellipse_probability;
    // The cases are written as they come and not kept: the summary needs only its tally.
    const Format format = formatOf(o.json, o.csv);
    CampaignWriter writer(format);
    request.keep_cases = false;
    request.on_case = [&](const DispersionCampaign& campaign, const DispersedCase& dispersed) {
        writer.add(campaign, dispersed);
    };
    // Checked once the design has been read: an unreadable design is reported first.
    const auto prepare = [&](const StudyDesign& file, StudyRequest& r) -> std::optional<int> {
        if (std::sscanf(o.shard.c_str(), "%zu/%zu", &r.shard_index, &r.shard_count) != 2 ||
            r.shard_count == 0 || r.shard_index >= r.shard_count) {
            fmt::print(stderr, "--shard {}: expected I/N with 0 <= I < N\n", o.shard);
            return exit_usage;
        }
        if (file.design.dispersions.empty()) {
            fmt::print(stderr, "{}: the design has no \"dispersions\"\n", o.design);
            return exit_usage;
        }
        return std::nullopt;
    };
    return runStudyCommand(
        o, request,
        [&](const StudyOutcome& outcome) { writer.finish(*outcome.campaign, outcome.summary); },
        prepare);
}

int mergeCommand(const Options& o) {
    std::vector<DispersionCampaign> parts;
    for (const std::string& path : o.parts) {
        std::ifstream in(path);
        std::string error;
        std::optional<DispersionCampaign> part;
        try {
            const Json j = Json::parse(in);
            part = campaign_from_json(j.contains("campaign") ? j.at("campaign") : j, &error);
        } catch (const Json::exception& e) {
            error = e.what();
        }
        if (!part) {
            fmt::print(stderr, "{}: {}\n", path, error);
            return exit_unreadable;
        }
        parts.push_back(std::move(*part));
    }
    auto [merged, error] = merge_campaigns(parts);
    if (!merged) {
        fmt::print(stderr, "{}\n", error);
        return exit_unreadable;
    }
    printCampaign(*merged, summarize(*merged, o.ellipse_probability), formatOf(o.json, o.csv));
    return 0;
}

int sensitivityCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::sensitivities;
    request.inputs = o.inputs;
    return runStudyCommand(o, request, [&](const StudyOutcome& outcome) {
        printStudy(
            outcome, formatOf(o.json, o.csv),
            [&] { return sensitivityJson(*outcome.sensitivities); },
            [&] { printSensitivityRanking(*outcome.sensitivities); });
    });
}

int corridorCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::corridor;
    std::string error;
    const auto speeds = parse_value_list(o.speeds, &error);
    if (!speeds) {
        fmt::print(stderr, "--speeds: {}\n", error);
        return exit_usage;
    }
    request.speeds = *speeds;
    request.runs = o.runs;
    request.seed = o.seed;
    return runStudyCommand(o, request, [&](const StudyOutcome& outcome) {
        printStudy(
            outcome, formatOf(o.json, o.csv), [&] { return corridorJson(*outcome.corridor); },
            [&] { printCorridorTable(*outcome.corridor); });
    });
}

}  // namespace

std::function<int()> addTradeCommands(CLI::App& app) {
    auto o = std::make_shared<Options>();

    CLI::App* sweep = app.add_subcommand("sweep", "Size a design over one or two varied keys");
    sweep->add_option("design", o->design, "Design document")->required()->check(CLI::ExistingFile);
    sweep->add_option("--vary", o->vary, "KEY=FROM:TO:N (once for a line, twice for a grid)")
        ->required()
        ->expected(1, 2);
    sweep->add_flag("--json", o->json, "Rows as JSON");
    sweep->add_flag("--csv", o->csv, "Rows as CSV");
    sweep->add_option("--threads", o->threads, "Threads (default: one per core)");

    CLI::App* disperse = app.add_subcommand(
        "disperse", "Fly the design's dispersions (Monte Carlo) and summarise them");
    disperse->add_option("design", o->design, "Design document with \"dispersions\"")
        ->required()
        ->check(CLI::ExistingFile);
    disperse->add_option("--runs", o->runs, "Number of dispersed cases")->default_val(1000);
    disperse->add_option("--seed", o->seed, "Seed: the same seed gives the same numbers")
        ->default_val(1);
    disperse->add_option("--shard", o->shard, "I/N: run the I-th of N slices (for a batch array)");
    disperse->add_option("--threads", o->threads, "Threads (default: one per core)");
    disperse->add_flag("--json", o->json, "The summary and every case as JSON (what merge reads)");
    disperse->add_flag(
        "--csv", o->csv,
        "Every case as CSV: its draws, key figures, landing point and failed checks");
    disperse
        ->add_option("--ellipse-probability", o->ellipse_probability,
                     "Probability held by the landing ellipse (0 to 1)")
        ->default_val(default_ellipse_probability)
        ->check(CLI::Range(1e-6, 1.0 - 1e-9));

    CLI::App* merge = app.add_subcommand("merge", "Combine the --json outputs of disperse shards");
    merge->add_option("parts", o->parts, "Shard outputs")->required()->check(CLI::ExistingFile);
    merge->add_flag("--json", o->json, "The merged summary and cases as JSON");
    merge->add_flag("--csv", o->csv, "The merged cases as CSV");
    merge
        ->add_option("--ellipse-probability", o->ellipse_probability,
                     "Probability held by the landing ellipse (0 to 1)")
        ->default_val(default_ellipse_probability)
        ->check(CLI::Range(1e-6, 1.0 - 1e-9));

    CLI::App* sensitivity = app.add_subcommand(
        "sensitivity", "Normalised sensitivity of each key figure to each numeric input");
    sensitivity->add_option("design", o->design, "Design document")
        ->required()
        ->check(CLI::ExistingFile);
    sensitivity->add_option("--inputs", o->inputs, "Keys to vary (default: every number)")
        ->delimiter(',');
    sensitivity->add_flag("--json", o->json, "The matrix as JSON");
    sensitivity->add_flag("--csv", o->csv, "The matrix as CSV, a row per figure");
    sensitivity->add_option("--threads", o->threads, "Threads (default: one per core)");

    CLI::App* corridor = app.add_subcommand(
        "corridor",
        "The entry corridor: the shallowest and steepest flight-path angles at which every check "
        "passes, and what binds each side");
    corridor->add_option("design", o->design, "Design document")
        ->required()
        ->check(CLI::ExistingFile);
    corridor->add_option(
        "--speeds", o->speeds,
        "Entry speeds (arrival excess speeds for an approach): values separated by "
        "commas, or FROM:TO:N (default: the design's own)");
    corridor
        ->add_option("--runs", o->runs,
                     "Dispersed cases at each bound and at the centre, with the design's "
                     "dispersions (0: none)")
        ->default_val(500);
    corridor->add_option("--seed", o->seed, "Seed of the dispersed cases")->default_val(1);
    corridor->add_option("--threads", o->threads, "Threads (default: one per core)");
    corridor->add_flag("--json", o->json, "The corridor as JSON");
    corridor->add_flag("--csv", o->csv, "A row per speed as CSV");

    return [=]() -> int {
        if (*sweep)
            return sweepCommand(*o);
        if (*disperse)
            return disperseCommand(*o);
        if (*merge)
            return mergeCommand(*o);
        if (*sensitivity)
            return sensitivityCommand(*o);
        if (*corridor)
            return corridorCommand(*o);
        return -1;
    };
}

}  // namespace ds
