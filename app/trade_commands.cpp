#include "trade_commands.hpp"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <memory>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "design/reader.hpp"
#include "results/key_figures.hpp"
#include "results/writer.hpp"
#include "trade/dispersion.hpp"
#include "trade/sensitivity.hpp"
#include "trade/sweep.hpp"
#include "trade/trade_csv.hpp"

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
        for (const ReadError& e : read.errors) fmt::print(stderr, "{}: {}\n", path, e.text());
        return std::nullopt;
    }
    return read.design;
}

/// The design file's own document, key for key, for its variants.
DesignVariants variantsOf(const std::string& path) {
    std::ifstream in(path);
    return {Json::parse(in), std::filesystem::path(path).parent_path()};
}

std::string valueText(const std::optional<double>& v, int decimals) {
    return v ? fmt::format("{:.{}f}", *v, decimals) : std::string("-");
}

std::string_view statusName(CheckStatus s) { return to_string(s); }

int printSweep(const std::vector<SweepAxis>& axes, const std::vector<SweepCase>& cases,
               bool json, bool csv) {
    if (json) {
        Json rows = Json::array();
        for (const SweepCase& c : cases) {
            Json row;
            Json inputs;
            for (std::size_t a = 0; a < axes.size(); ++a) inputs[axes[a].key] = c.inputs[a];
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
        fmt::print("{}\n", Json{{"rows", rows}}.dump(2));
        return 0;
    }
    if (csv) {
        fmt::print("{}", sweep_csv(axes, cases));
        return 0;
    }
    const std::vector<KeyFigure> header = key_figures(Results{});
    // A readable table of the figures a trade is usually about.
    const std::vector<std::string> shown{"ballistic_coefficient", "peak_deceleration",
                                         "peak_heat_flux",        "deploy_mach",
                                         "deploy_altitude",       "propellant",
                                         "timeline_margin",       "landed_mass"};
    std::string head;
    for (const SweepAxis& a : axes) head += fmt::format("{:>26} ", a.key);
    for (const KeyFigure& f : header) {
        if (std::find(shown.begin(), shown.end(), f.id) != shown.end()) {
            head += fmt::format("{:>14} ", f.id.substr(0, 14));
        }
    }
    fmt::print("{}  worst\n", head);
    for (const SweepCase& c : cases) {
        std::string line;
        for (const double v : c.inputs) line += fmt::format("{:>26.6g} ", v);
        if (!c.results) {
            fmt::print("{}  cannot be read: {}\n", line, c.error);
            continue;
        }
        for (const KeyFigure& f : key_figures(*c.results)) {
            if (std::find(shown.begin(), shown.end(), f.id) != shown.end()) {
                line += fmt::format("{:>14} ", valueText(f.value, f.decimals));
            }
        }
        const WorstCheck w = worst_check(*c.results);
        fmt::print("{}  {} {}\n", line, statusName(w.status), w.id);
    }
    return 0;
}

void printSummary(const DispersionSummary& s) {
    fmt::print("{} runs, {} succeeded (no failing check): probability {:.4f}, 95 % interval "
               "[{:.4f}, {:.4f}] (Wilson)\n\n",
               s.runs, s.successes, s.success_probability, s.wilson_low, s.wilson_high);
    fmt::print("{:<26} {:>8} {:>12} {:>12} {:>12} {:>12} {:>12}\n", "figure", "unit", "mean",
               "std dev", "p01", "p50", "p99");
    for (const FigureStatistics& f : s.figures) {
        if (f.count == 0) continue;
        fmt::print("{:<26} {:>8} {:>12.5g} {:>12.5g} {:>12.5g} {:>12.5g} {:>12.5g}\n", f.id,
                   f.unit, f.mean, f.standard_deviation, f.p01, f.p50, f.p99);
    }
    if (s.landing_ellipse) {
        const LandingEllipse& e = *s.landing_ellipse;
        fmt::print("\nlanding ellipse ({:.4g} %, {} landing points): centre {:.5f} deg, {:.5f} deg; "
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

}  // namespace

std::function<int()> addTradeCommands(CLI::App& app) {
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
    };
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
    disperse->add_option("--seed", o->seed, "Seed: the same seed gives the same numbers")->default_val(1);
    disperse->add_option("--shard", o->shard, "I/N: run the I-th of N slices (for a batch array)");
    disperse->add_option("--threads", o->threads, "Threads (default: one per core)");
    disperse->add_flag("--json", o->json, "The summary and every case as JSON (what merge reads)");
    disperse->add_flag("--csv", o->csv, "Every case as CSV: its draws, key figures, landing point and failed checks");
    disperse->add_option("--ellipse-probability", o->ellipse_probability,
                         "Probability held by the landing ellipse (0 to 1)")
        ->default_val(default_ellipse_probability)
        ->check(CLI::Range(1e-6, 1.0 - 1e-9));

    CLI::App* merge = app.add_subcommand("merge", "Combine the --json outputs of disperse shards");
    merge->add_option("parts", o->parts, "Shard outputs")->required()->check(CLI::ExistingFile);
    merge->add_flag("--json", o->json, "The merged summary and cases as JSON");
    merge->add_flag("--csv", o->csv, "The merged cases as CSV");
    merge->add_option("--ellipse-probability", o->ellipse_probability,
                      "Probability held by the landing ellipse (0 to 1)")
        ->default_val(default_ellipse_probability)
        ->check(CLI::Range(1e-6, 1.0 - 1e-9));

    CLI::App* sensitivity = app.add_subcommand(
        "sensitivity", "Normalised sensitivity of each key figure to each numeric input");
    sensitivity->add_option("design", o->design, "Design document")->required()->check(CLI::ExistingFile);
    sensitivity->add_option("--inputs", o->inputs, "Keys to vary (default: every number)")->delimiter(',');
    sensitivity->add_flag("--json", o->json, "The matrix as JSON");
    sensitivity->add_flag("--csv", o->csv, "The matrix as CSV, a row per figure");
    sensitivity->add_option("--threads", o->threads, "Threads (default: one per core)");

    return [=]() -> int {
        if (*sweep) {
            std::vector<SweepAxis> axes;
            for (const std::string& text : o->vary) {
                std::string error;
                const auto axis = parseAxis(text, &error);
                if (!axis) {
                    fmt::print(stderr, "{}\n", error);
                    return exit_usage;
                }
                axes.push_back(*axis);
            }
            const auto design = readDesign(o->design);
            if (!design) return exit_unreadable;
            return printSweep(axes, run_sweep(variantsOf(o->design), axes, o->threads), o->json,
                              o->csv);
        }
        if (*disperse) {
            const auto design = readDesign(o->design);
            if (!design) return exit_unreadable;
            DispersionSettings settings;
            settings.runs = o->runs;
            settings.seed = o->seed;
            settings.threads = o->threads;
            if (std::sscanf(o->shard.c_str(), "%zu/%zu", &settings.shard_index, &settings.shard_count) != 2 ||
                settings.shard_count == 0 || settings.shard_index >= settings.shard_count) {
                fmt::print(stderr, "--shard {}: expected I/N with 0 <= I < N\n", o->shard);
                return exit_usage;
            }
            if (design->dispersions.empty()) {
                fmt::print(stderr, "{}: the design has no \"dispersions\"\n", o->design);
                return exit_usage;
            }
            auto [campaign, error] = run_dispersions(*design, std::filesystem::path(o->design).parent_path(), settings);
            if (!campaign) {
                fmt::print(stderr, "{}: {}\n", o->design, error);
                return exit_unreadable;
            }
            const DispersionSummary summary = summarize(*campaign, o->ellipse_probability);
            if (o->json) {
                fmt::print("{}\n", Json{{"summary", summary_to_json(summary)},
                                        {"campaign", campaign_to_json(*campaign)}}.dump(1));
            } else if (o->csv) {
                fmt::print("{}", campaign_csv(*campaign));
            } else {
                if (settings.shard_count > 1) {
                    fmt::print("shard {}/{} of the campaign (merge the --json outputs for the "
                               "whole)\n", settings.shard_index, settings.shard_count);
                }
                printSummary(summary);
            }
            return 0;
        }
        if (*merge) {
            std::vector<DispersionCampaign> parts;
            for (const std::string& path : o->parts) {
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
            const DispersionSummary summary = summarize(*merged, o->ellipse_probability);
            if (o->json) {
                fmt::print("{}\n", Json{{"summary", summary_to_json(summary)},
                                        {"campaign", campaign_to_json(*merged)}}.dump(1));
            } else if (o->csv) {
                fmt::print("{}", campaign_csv(*merged));
            } else {
                printSummary(summary);
            }
            return 0;
        }
        if (*sensitivity) {
            if (!readDesign(o->design)) return exit_unreadable;
            const SensitivityTable table = sensitivities(variantsOf(o->design), o->inputs, o->threads);
            if (o->json) {
                Json matrix = Json::array();
                for (Eigen::Index f = 0; f < table.normalized.rows(); ++f) {
                    Json row = Json::array();
                    for (Eigen::Index i = 0; i < table.normalized.cols(); ++i) {
                        const double s = table.normalized(f, i);
                        row.push_back(std::isfinite(s) ? Json(s) : Json());
                    }
                    matrix.push_back(row);
                }
                fmt::print("{}\n", Json{{"relative_step", sensitivity_relative_step},
                                        {"inputs", table.inputs},
                                        {"figures", table.figures},
                                        {"normalized", matrix}}.dump(2));
                return 0;
            }
            if (o->csv) {
                fmt::print("{}", sensitivity_csv(table));
                return 0;
            }
            fmt::print("Normalised sensitivities d(ln figure)/d(ln input), central differences "
                       "of {} relative; the five largest per figure.\n",
                       sensitivity_relative_step);
            for (std::size_t f = 0; f < table.figures.size(); ++f) {
                const auto ranked = table.ranked(f);
                if (ranked.empty()) continue;
                fmt::print("\n{}\n", table.figures[f]);
                for (std::size_t k = 0; k < std::min<std::size_t>(5, ranked.size()); ++k) {
                    fmt::print("  {:>+9.4f}  {}\n", ranked[k].second, ranked[k].first);
                }
            }
            return 0;
        }
        return -1;
    };
}

}  // namespace ds
