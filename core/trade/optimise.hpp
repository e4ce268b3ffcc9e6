#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "progress.hpp"
#include "results/results.hpp"
#include "trade/design_variants.hpp"

namespace ds {

/// The optimiser: the design that minimises (or maximises) a figure over a few of its numeric
/// keys, each within its bounds, with every check passing.
///
/// The method is COBYLA (Powell's constrained optimisation by linear approximations, through
/// NLopt): derivative-free, bound-constrained, with the feasibility as one inequality
/// constraint, the tightest check's margin non-negative (trade/sweep.hpp's feasibility margin;
/// a failing check without a margin counts as -1). Each sizing is a whole `size` of the design
/// read again with the keys set, so the figure and the checks are exactly those of the written
/// design. A start that fails a check first climbs the margin (COBYLA on the margin alone)
/// until it passes; then the figure is optimised from there. Several starts (the design's own
/// values, then points drawn uniformly in the bounds from the seed) guard against a local
/// optimum; the best passing sizing of all is the optimum. The starts run in parallel, each
/// with its share of the budget, so the result is the same for any thread count.

/// A key the optimiser varies, within [low, high].
struct OptimisedKey {
    std::string key;
    double low = 0.0;
    double high = 0.0;
};

/// What is optimised: a key figure's id (results/key_figures.hpp): "entry_mass" in sizing mode,
/// "landed_mass" or "unallocated_mass" (the fixed entry mass less the budget) in analysis mode.
struct OptimiseObjective {
    std::string figure = "entry_mass";
    bool maximise = false;
};

/// The figure an objective names in a result, or empty when the result has none.
std::optional<double> objective_value(const OptimiseObjective& objective, const Results& results);
/// Whether a figure can be optimised (a key figure's id).
bool is_objective_figure(std::string_view figure);

struct OptimiseSettings {
    std::vector<OptimisedKey> keys;
    OptimiseObjective objective;
    std::size_t max_sizings = 800;  ///< the budget over every start
    double tolerance = 1e-4;        ///< relative, on the keys (over their bounds) and the figure
    std::size_t starts = 4;         ///< the design's own values, then random points
    std::uint64_t seed = 1;
};

/// What a point of the search gave: the figure to minimise (the objective's sign applied;
/// empty when the sizing has none) and the tightest check's margin.
struct SearchPoint {
    std::optional<double> objective;
    double margin = 0.0;
};

/// One sizing of the search, in the order each start made them.
struct OptimiseStep {
    std::size_t start = 0;
    std::vector<double> inputs;
    std::optional<double> objective;  ///< the figure itself (its own sign)
    double margin = 0.0;
    bool feasible = false;
};

/// The generic search: `evaluate` gives the objective to minimise and the margin at inputs
/// within the bounds. Returns every step and the index of the best feasible one.
struct SearchOutcome {
    std::vector<OptimiseStep> history;
    std::optional<std::size_t> best;              ///< into history: the lowest feasible objective
    std::optional<std::size_t> least_infeasible;  ///< the largest margin, when none is feasible
    bool cancelled = false;
};
SearchOutcome constrained_search(
    const std::function<SearchPoint(const std::vector<double>&)>& evaluate,
    const std::vector<double>& low, const std::vector<double>& high,
    const std::vector<double>& start, std::size_t max_evaluations, double tolerance,
    std::size_t starts, std::uint64_t seed, unsigned threads, Progress* progress);

/// A check at the optimum, with its margin.
struct BindingCheck {
    std::string id;
    double margin = 0.0;
    std::string message;
};

/// Checks within this margin at the optimum bind it (our choice: 2 % of their limits).
inline constexpr double binding_margin = 0.02;
/// A key within this share of its range from a bound is held by that bound.
inline constexpr double bound_share = 1e-3;

struct Optimisation {
    OptimiseSettings settings;
    std::vector<double> start_inputs;  ///< the design's own values (clamped to the bounds)
    std::optional<double> start_objective;
    bool start_feasible = false;
    bool feasible = false;  ///< a passing design was found
    std::vector<double> best_inputs;
    std::optional<double> best_objective;
    /// The checks within binding_margin at the optimum, tightest first; the keys held at one of
    /// their bounds ("aeroshell.diameter_m at its upper bound").
    std::vector<BindingCheck> binding;
    std::vector<std::string> keys_at_bounds;
    /// When no passing design was found: the checks that failed at the least failing one.
    std::vector<BindingCheck> violated;
    /// d ln(figure) / d ln(key) at the optimum, by central differences of 1e-3 of each value.
    std::vector<std::optional<double>> sensitivities;
    std::vector<OptimiseStep> history;
    nlohmann::ordered_json optimum_document;  ///< the optimum as a design document
    std::size_t sizings = 0;
    bool cancelled = false;
};

/// What binds at the optimum, in words, tightest first ("deploy_dynamic_pressure_high (margin
/// 0.04 %); aeroshell.diameter_m at its upper bound"), or "nothing within 2 %": for the window
/// and the sheet alike.
std::string binding_words(const Optimisation& optimisation);

/// The checks still failing at the least failing design, when nothing passed ("a, b").
std::string violated_words(const Optimisation& optimisation);

/// Optimises a design (as its document) under the settings. Sizes without the highest
/// feasible site unless the objective is that figure, and without the history.
Optimisation optimise(const DesignVariants& design, const OptimiseSettings& settings,
                      unsigned threads, Progress* progress);

}  // namespace ds
