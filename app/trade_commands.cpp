#include "trade_commands.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "design/file_output.hpp"
#include "design/reader.hpp"
#include "design/schema.hpp"
#include "exit_codes.hpp"
#include "results/key_figures.hpp"
#include "trade/study.hpp"
#include "trade/success_probability.hpp"
#include "trade/trade_csv.hpp"
#include "trade/trade_json.hpp"
#include "trade/value_list.hpp"

namespace ds {
namespace {

using Json = nlohmann::ordered_json;

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

/// A readable table of the figures a trade is usually about.
void printSweepTable(const StudyOutcome& outcome) {
    const std::vector<std::string_view> shown{
        "ballistic_coefficient", "peak_deceleration", "peak_heat_flux",  "deploy_mach",
        "deploy_altitude",       "propellant",        "timeline_margin", "landed_mass"};
    const auto isShown = [&](const KeyFigureDefinition& f) {
        return std::find(shown.begin(), shown.end(), f.id) != shown.end();
    };
    // Each column as wide as its whole name (at least 10), the units on a second line.
    std::string head;
    std::string units;
    const auto addColumn = [&](std::string_view name, std::string_view unit) {
        const std::size_t width = std::max<std::size_t>(name.size(), 10);
        head += fmt::format("{:>{}} ", name, width);
        units += fmt::format("{:>{}} ", fmt::format("[{}]", unit.empty() ? "-" : unit), width);
        return width;
    };
    std::vector<std::size_t> inputWidths;
    for (const SweepAxis& a : outcome.request.axes)
        inputWidths.push_back(addColumn(a.key, unit_of_path(a.key)));
    std::vector<std::size_t> figureWidths(key_figure_table.size(), 0);  // 0: not shown
    for (std::size_t i = 0; i < key_figure_table.size(); ++i) {
        if (isShown(key_figure_table[i]))
            figureWidths[i] = addColumn(key_figure_table[i].id, key_figure_table[i].unit);
    }
    fmt::print("{}  worst\n{}\n", head, units);
    for (const SweepCase& c : outcome.sweep) {
        std::string line;
        for (std::size_t k = 0; k < c.inputs.size(); ++k)
            line += fmt::format("{:>{}.6g} ", c.inputs[k], inputWidths.at(k));
        if (!c.results) {
            fmt::print("{}  cannot be read: {}\n", line, c.error);
            continue;
        }
        const std::vector<std::optional<double>> values = key_figure_values(*c.results);
        for (std::size_t i = 0; i < key_figure_table.size(); ++i) {
            if (figureWidths[i] > 0) {
                line += fmt::format("{:>{}} ", valueText(values[i], key_figure_table[i].decimals),
                                    figureWidths[i]);
            }
        }
        const WorstCheck w = worst_check(*c.results);
        fmt::print("{}  {} {}\n", line, statusName(w.status), w.id);
    }
}

/// Prints a study in the format asked for: its JSON, its CSV (the study's own, as the window
/// exports it) or its text.
template <class PrintText>
void printStudy(const StudyOutcome& outcome, Format format, PrintText text) {
    switch (format) {
        case Format::json:
            fmt::print("{}\n", outcome.json().dump(2));
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
            digest_.add(dispersed);
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
                fmt::print("{}  ],\n  \"cases_digest\": \"{}\"\n }},\n \"summary\": {}\n}}\n",
                           cases_ == 0 ? "" : "\n", digest_.hex(), indented);
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
    CaseDigest digest_;  ///< of the rows written, for merge to check them against
};

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
        // An input that moves the figure by less than the last digit shown is not among the
        // largest: it does not move it at all, as far as the differences can tell.
        std::size_t listed = 0;
        for (; listed < std::min<std::size_t>(5, ranked.size()); ++listed) {
            if (std::abs(ranked[listed].second) < 0.5e-4)
                break;
            fmt::print("  {:>+9.4f}  {}\n", ranked[listed].second, ranked[listed].first);
        }
        if (listed < std::min<std::size_t>(5, ranked.size()))
            fmt::print("  {}\n", listed == 0 ? "(no input moves it by 0.0001 or more)"
                                             : "(no other input moves it by 0.0001 or more)");
    }
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
    std::string minimise;
    std::string maximise;
    std::size_t budget = 800;
    std::size_t starts = 4;
    double tolerance = 1e-4;
    std::string write;
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

/// Refuses, before any case runs, keys that a study cannot set: neither a number of the
/// design nor a number key of the design format (a misspelling).
std::optional<int> refuseUnknownKeys(const StudyDesign& file, const std::vector<std::string>& keys,
                                     std::string_view option) {
    const DesignVariants variants(file.document, std::filesystem::path(file.path).parent_path());
    for (const std::string& key : keys) {
        if (!variants.settable(key)) {
            fmt::print(stderr,
                       "{} {}: not a number of the design or a number key of the design format "
                       "(keys are paths such as aeroshell.diameter_m or mass.items[0].mass_kg)\n",
                       option, key);
            return exit_usage;
        }
    }
    return std::nullopt;
}

int sweepCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::sweep;
    for (const std::string& text : o.vary) {
        std::string error;
        const auto axis = parse_sweep_axis(text, &error);
        if (!axis) {
            fmt::print(stderr, "--vary {}\n", error);
            return exit_usage;
        }
        request.axes.push_back(*axis);
    }
    return runStudyCommand(
        o, request,
        [&](const StudyOutcome& outcome) {
            printStudy(outcome, formatOf(o.json, o.csv), [&] { printSweepTable(outcome); });
        },
        [&](const StudyDesign& file, StudyRequest& r) -> std::optional<int> {
            std::vector<std::string> keys;
            for (const SweepAxis& axis : r.axes)
                keys.push_back(axis.key);
            return refuseUnknownKeys(file, keys, "--vary");
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
        const std::optional<Shard> shard = parse_shard(o.shard);
        if (!shard) {
            fmt::print(stderr, "--shard {}: expected I/N with 0 <= I < N\n", o.shard);
            return exit_usage;
        }
        r.shard_index = shard->index;
        r.shard_count = shard->count;
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

/// Reads a part of a campaign case by case (read_campaign_file), handing each case to `on_case`.
/// Returns its head, or prints why it cannot be read.
std::optional<DispersionCampaign> readPart(
    const std::string& path, const std::function<void(const DispersedCase&)>& on_case) {
    std::string error;
    std::optional<DispersionCampaign> part = read_campaign_file(path, on_case, &error);
    if (!part)
        fmt::print(stderr, "{}: {}\n", path, error);
    return part;
}

/// Merges the parts part by part, holding one case at a time and what the summary needs of
/// each (its key figures and landing point): a first reading checks every part whole (its
/// rows against its digest) and that the parts are the shards of one campaign; a second hands
/// their cases to the summary and the output. The merged cases are written shard by shard.
int mergeCommand(const Options& o) {
    std::vector<DispersionCampaign> heads;
    for (const std::string& path : o.parts) {
        auto head = readPart(path, nullptr);
        if (!head)
            return exit_unreadable;
        heads.push_back(std::move(*head));
    }
    if (const std::string problem = shards_problem(heads); !problem.empty()) {
        fmt::print(stderr, "{}\n", problem);
        return exit_unreadable;
    }
    DispersionCampaign merged = heads.front();
    merged.shard_index = 0;
    merged.shard_count = 1;
    std::vector<std::size_t> order(o.parts.size());
    for (std::size_t i = 0; i < order.size(); ++i)
        order[i] = i;
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return heads[a].shard_index < heads[b].shard_index;
    });
    SummaryTally tally(merged.figure_ids.size());
    CampaignWriter writer(formatOf(o.json, o.csv));
    for (const std::size_t i : order) {
        const auto part = readPart(o.parts[i], [&](const DispersedCase& c) {
            tally.add(c);
            writer.add(merged, c);
        });
        if (!part || part->cases_digest != heads[i].cases_digest) {
            fmt::print(stderr, "{}: changed while it was merged\n", o.parts[i]);
            return exit_unreadable;
        }
    }
    writer.finish(merged, tally.summary(merged, o.ellipse_probability));
    return 0;
}

int sensitivityCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::sensitivities;
    request.inputs = o.inputs;
    return runStudyCommand(
        o, request,
        [&](const StudyOutcome& outcome) {
            printStudy(outcome, formatOf(o.json, o.csv),
                       [&] { printSensitivityRanking(*outcome.sensitivities); });
        },
        [&](const StudyDesign& file, StudyRequest& r) {
            return refuseUnknownKeys(file, r.inputs, "--inputs");
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
        printStudy(outcome, formatOf(o.json, o.csv),
                   [&] { printCorridorTable(*outcome.corridor); });
    });
}

/// "KEY=LOW:HIGH".
std::optional<OptimisedKey> parseBounds(const std::string& text, std::string* error) {
    const auto equals = text.find('=');
    const auto colon = text.find(':', equals == std::string::npos ? 0 : equals);
    OptimisedKey k;
    if (equals != std::string::npos && colon != std::string::npos) {
        k.key = text.substr(0, equals);
        std::string low_error;
        std::string high_error;
        const auto low = parse_value_list(text.substr(equals + 1, colon - equals - 1), &low_error);
        const auto high = parse_value_list(text.substr(colon + 1), &high_error);
        if (low && high && low->size() == 1 && high->size() == 1 && low->front() < high->front()) {
            k.low = low->front();
            k.high = high->front();
            return k;
        }
    }
    *error = fmt::format("--vary {}: expected KEY=LOW:HIGH with LOW below HIGH", text);
    return std::nullopt;
}

/// The unit of an objective's figure ("kg"), for the text.
std::string figureUnit(const std::string& figure) {
    const auto index = key_figure_index(figure);
    return index ? std::string(key_figure_table[*index].unit) : std::string();
}

void printOptimisation(const StudyOutcome& outcome) {
    const Optimisation& o = *outcome.optimisation;
    const std::string& figure = o.settings.objective.figure;
    const std::string unit = figureUnit(figure);
    fmt::print("{}: {} sizings in {} starts, {:.2f} s.\n\n", outcome.description(), o.sizings,
               o.settings.starts, outcome.seconds);
    std::size_t width = 24;  // the keys' column, as wide as the longest key
    for (const OptimisedKey& k : o.settings.keys)
        width = std::max(width, k.key.size());
    fmt::print("{:<{}} {:>12} {:>12} {:>12} {:>12}\n", "key", width, "low", "high", "design",
               "optimum");
    for (std::size_t i = 0; i < o.settings.keys.size(); ++i) {
        const OptimisedKey& k = o.settings.keys[i];
        fmt::print("{:<{}} {:>12.6g} {:>12.6g} {:>12.6g} {:>12}\n", k.key, width, k.low, k.high,
                   o.start_inputs[i], o.feasible ? fmt::format("{:.6g}", o.best_inputs[i]) : "-");
    }
    fmt::print("\n{}: the design {} {} ({}), ", figure, valueText(o.start_objective, 2), unit,
               o.start_feasible ? "passes every check" : "fails a check");
    if (!o.feasible) {
        fmt::print("no design passing every check was found.\n");
        fmt::print("Still failing at the least failing design found:\n");
        for (const BindingCheck& c : o.violated)
            fmt::print("  {:<32} margin {:>8.2f} %  {}\n", c.id, 100.0 * c.margin, c.message);
        return;
    }
    const double change = o.start_objective && *o.start_objective != 0.0
                              ? 100.0 * (*o.best_objective / *o.start_objective - 1.0)
                              : 0.0;
    fmt::print("the optimum {} {} (passes every check), {:+.2f} %.\n",
               valueText(o.best_objective, 2), unit, change);
    fmt::print("\nWhat binds at the optimum (checks within {:g} % of their limits):\n",
               100.0 * binding_margin);
    if (o.binding.empty())
        fmt::print("  no check\n");
    for (const BindingCheck& c : o.binding)
        fmt::print("  {:<32} margin {:>8.2f} %  {}\n", c.id, 100.0 * c.margin, c.message);
    for (const std::string& k : o.keys_at_bounds)
        fmt::print("  {}\n", k);
    fmt::print("\nNormalised sensitivity of {} at the optimum, d ln {} / d ln key:\n", figure,
               figure);
    for (std::size_t i = 0; i < o.settings.keys.size(); ++i)
        fmt::print("  {:<{}} {:>+10.4f}\n", o.settings.keys[i].key, width,
                   o.sensitivities[i].value_or(std::nan("")));
}

int optimiseCommand(const Options& o) {
    StudyRequest request;
    request.kind = StudyKind::optimisation;
    for (const std::string& text : o.vary) {
        std::string error;
        const auto bounds = parseBounds(text, &error);
        if (!bounds) {
            fmt::print(stderr, "{}\n", error);
            return exit_usage;
        }
        request.bounds.push_back(*bounds);
    }
    if (!o.minimise.empty() && !o.maximise.empty()) {
        fmt::print(stderr, "--minimise and --maximise: give one\n");
        return exit_usage;
    }
    request.objective.maximise = !o.maximise.empty();
    request.objective.figure =
        !o.maximise.empty() ? o.maximise : (o.minimise.empty() ? "entry_mass" : o.minimise);
    if (!is_objective_figure(request.objective.figure)) {
        std::vector<std::string> names;
        for (const KeyFigureDefinition& f : key_figure_table)
            names.emplace_back(f.id);
        fmt::print(stderr, "unknown figure \"{}\"; the figures are {}\n", request.objective.figure,
                   fmt::join(names, ", "));
        return exit_usage;
    }
    request.budget = o.budget;
    request.starts = o.starts;
    request.tolerance = o.tolerance;
    request.seed = o.seed;
    bool writeFailed = false;
    const int code = runStudyCommand(o, request, [&](const StudyOutcome& outcome) {
        const Optimisation& result = *outcome.optimisation;
        printStudy(outcome, formatOf(o.json, o.csv), [&] { printOptimisation(outcome); });
        if (!o.write.empty() && result.feasible) {
            std::string error;
            if (!write_file_atomically(o.write, result.optimum_document.dump(2) + "\n", &error)) {
                fmt::print(stderr, "{}\n", error);
                writeFailed = true;
                return;
            }
            if (!o.json && !o.csv)
                fmt::print("\nThe optimum design is written to {}.\n", o.write);
        }
    });
    return writeFailed ? exit_write_failed : code;
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
    sweep->add_option("--threads", o->threads, "Threads, at most 256 (default: one per core)")
        ->check(CLI::Range(0u, 256u));

    CLI::App* disperse = app.add_subcommand(
        "disperse", "Fly the design's dispersions (Monte Carlo) and summarise them");
    disperse->add_option("design", o->design, "Design document with \"dispersions\"")
        ->required()
        ->check(CLI::ExistingFile);
    disperse->add_option("--runs", o->runs, "Number of dispersed cases")
        ->default_val(1000)
        ->check(CLI::Range(std::size_t{1}, most_dispersed_runs));
    disperse->add_option("--seed", o->seed, "Seed: the same seed gives the same numbers")
        ->default_val(1);
    disperse->add_option("--shard", o->shard,
                         "I/N: run slice I of N, I from 0 to N-1 (for a batch array)");
    disperse->add_option("--threads", o->threads, "Threads, at most 256 (default: one per core)")
        ->check(CLI::Range(0u, 256u));
    disperse->add_flag("--json", o->json, "The summary and every case as JSON (what merge reads)");
    disperse->add_flag(
        "--csv", o->csv,
        "Every case as CSV: its draws, key figures, landing point and failed checks");
    disperse
        ->add_option("--ellipse-probability", o->ellipse_probability,
                     "Probability held by the landing ellipse (0 to 1)")
        ->default_val(default_ellipse_probability)
        ->check(CLI::Range(lowest_ellipse_probability, highest_ellipse_probability));

    CLI::App* merge = app.add_subcommand("merge", "Combine the --json outputs of disperse shards");
    merge->add_option("parts", o->parts, "Shard outputs")->required()->check(CLI::ExistingFile);
    merge->add_flag("--json", o->json, "The merged summary and cases as JSON");
    merge->add_flag("--csv", o->csv, "The merged cases as CSV");
    merge
        ->add_option("--ellipse-probability", o->ellipse_probability,
                     "Probability held by the landing ellipse (0 to 1)")
        ->default_val(default_ellipse_probability)
        ->check(CLI::Range(lowest_ellipse_probability, highest_ellipse_probability));

    CLI::App* sensitivity = app.add_subcommand(
        "sensitivity", "Normalised sensitivity of each key figure to each numeric input");
    sensitivity->add_option("design", o->design, "Design document")
        ->required()
        ->check(CLI::ExistingFile);
    sensitivity->add_option("--inputs", o->inputs, "Keys to vary (default: every number)")
        ->delimiter(',');
    sensitivity->add_flag("--json", o->json, "The matrix as JSON");
    sensitivity->add_flag("--csv", o->csv, "The matrix as CSV, a row per figure");
    sensitivity->add_option("--threads", o->threads, "Threads, at most 256 (default: one per core)")
        ->check(CLI::Range(0u, 256u));

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
    corridor->add_option("--threads", o->threads, "Threads, at most 256 (default: one per core)")
        ->check(CLI::Range(0u, 256u));
    corridor->add_flag("--json", o->json, "The corridor as JSON");
    corridor->add_flag("--csv", o->csv, "A row per speed as CSV");

    CLI::App* optimiseApp = app.add_subcommand(
        "optimise",
        "The design that minimises (or maximises) a figure over a few keys with every check "
        "passing, and what binds there");
    optimiseApp->add_option("design", o->design, "Design document")
        ->required()
        ->check(CLI::ExistingFile);
    optimiseApp->add_option("--vary", o->vary, "KEY=LOW:HIGH, once per key varied")->required();
    optimiseApp->add_option("--minimise", o->minimise,
                            "Key figure to minimise (default: entry_mass)");
    optimiseApp->add_option("--maximise", o->maximise,
                            "Key figure to maximise (landed_mass, unallocated_mass, ...)");
    optimiseApp->add_option("--budget", o->budget, "Most sizings, over every start")
        ->default_val(800)
        ->check(CLI::Range(10, 1000000));
    optimiseApp->add_option("--starts", o->starts, "Starts: the design's values, then random")
        ->default_val(4)
        ->check(CLI::Range(1, 64));
    optimiseApp->add_option("--tolerance", o->tolerance, "Relative tolerance on keys and figure")
        ->default_val(1e-4)
        ->check(CLI::Range(1e-10, 0.1));
    optimiseApp->add_option("--seed", o->seed, "Seed of the random starts")->default_val(1);
    optimiseApp->add_option("--threads", o->threads, "Threads, at most 256 (default: one per core)")
        ->check(CLI::Range(0u, 256u));
    optimiseApp->add_option("--write", o->write, "Write the optimum as a design file");
    optimiseApp->add_flag("--json", o->json, "The optimisation as JSON");
    optimiseApp->add_flag("--csv", o->csv, "Every sizing of the search as CSV");

    return [=]() -> int {
        if (*optimiseApp)
            return optimiseCommand(*o);
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
