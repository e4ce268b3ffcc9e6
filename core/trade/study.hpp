#pragma once

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "design/design.hpp"
#include "progress.hpp"
#include "trade/corridor.hpp"
#include "trade/dispersion.hpp"
#include "trade/optimise.hpp"
#include "trade/sensitivity.hpp"
#include "trade/sweep.hpp"

namespace ds {

/// The trade studies. A new kind is one more entry here, its settings in StudyRequest, its
/// results in StudyOutcome and one row of the kinds' table in study.cpp (how it runs, how it
/// is described, its CSV).
enum class StudyKind { sweep, dispersions, sensitivities, corridor, optimisation };

/// A trade study as the window or the command line asks for it: a sweep of one or two keys,
/// the design's dispersions, the sensitivities of the key figures to numeric inputs, or the
/// entry corridor.
struct StudyRequest {
    StudyKind kind = StudyKind::sweep;
    std::vector<SweepAxis> axes;  ///< sweep: one (a line) or two (a grid)
    std::size_t runs = 1000;      ///< dispersions; corridor: at each bound and the centre
    std::uint64_t seed = 1;       ///< dispersions, corridor
    std::size_t shard_index = 0;  ///< dispersions: the slice of the cases this run flies
    std::size_t shard_count = 1;
    std::vector<std::string> inputs;  ///< sensitivities: the keys varied, empty for every number
    /// Dispersions: the probability the landing ellipse holds.
    double ellipse_probability = default_ellipse_probability;
    /// Dispersions: keep every case in the outcome's campaign (the summary never needs them),
    /// and hand each, in the order of its index, to `on_case` as it is done.
    bool keep_cases = true;
    std::function<void(const DispersionCampaign&, const DispersedCase&)> on_case;
    /// Corridor: values of the speed key (entry speed, or arrival excess speed); empty for the
    /// design's own.
    std::vector<double> speeds;
    /// Optimisation: the keys varied with their bounds, the figure, the budget of sizings, the
    /// tolerance and the starts (its seed is `seed`).
    std::vector<OptimisedKey> bounds;
    OptimiseObjective objective;
    std::size_t budget = 800;
    double tolerance = 1e-4;
    std::size_t starts = 4;
};

/// A finished study: what was asked, of which design, and what it gave.
struct StudyOutcome {
    StudyRequest request;
    Design design;  ///< the nominal design the study started from
    std::vector<SweepCase> sweep;
    /// Sweep: the design's own value of each varied key, to mark where the design sits.
    std::vector<std::optional<double>> nominal;
    std::optional<DispersionCampaign> campaign;
    DispersionSummary summary;
    std::optional<SensitivityTable> sensitivities;
    std::optional<EntryCorridor> corridor;
    std::optional<Optimisation> optimisation;
    std::string error;  ///< why the study could not run; empty when it ran
    double seconds = 0.0;

    /// "Sweep of aeroshell.diameter_m from 3 to 5 (21 values)", for titles and the sheet.
    std::string description() const;
    /// The study as CSV (trade/trade_csv.hpp): sweep rows, dispersed cases or the
    /// sensitivity matrix.
    std::string csv() const;
    /// The study as the JSON document the command line's --json prints (trade/trade_json.hpp).
    nlohmann::ordered_json json() const;
};

/// Runs a study of a design: `document` is its JSON (sweeps and sensitivities vary its keys
/// through the strict reader), `design` the same read, `base_directory` where its relative
/// paths start; `threads` 0 for one per core. The one entry point of the window and the
/// command line.
StudyOutcome run_study(const StudyRequest& request, const nlohmann::ordered_json& document,
                       const Design& design, const std::filesystem::path& base_directory,
                       unsigned threads, Progress& progress);

}  // namespace ds
