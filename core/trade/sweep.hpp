#pragma once

#include <optional>
#include <string>
#include <vector>

#include "progress.hpp"
#include "results/results.hpp"
#include "trade/design_variants.hpp"

namespace ds {

/// One varied key: count values evenly from `from` to `to`.
struct SweepAxis {
    std::string key;
    double from = 0.0;
    double to = 0.0;
    int count = 0;

    double value(int index) const;
};

/// One case of a sweep: its inputs, and its results or why it could not be read.
struct SweepCase {
    std::vector<double> inputs;  ///< one per axis
    std::optional<Results> results;
    std::string error;
};

/// The worst status among a result's checks, and the check that set it (the first failing,
/// else the first marginal; empty when all pass).
struct WorstCheck {
    CheckStatus status = CheckStatus::pass;
    std::string id;
};
WorstCheck worst_check(const Results& results);

/// How far a result lies inside the limits that fail it: the smallest margin (Check::margin)
/// and the check that has it. A failed check without a margin (a trigger never reached, a
/// flight that stopped) leaves the margin empty and names that check: infeasible, by an
/// amount nobody can say. This is what a feasibility map colours, its zero the boundary.
struct FeasibilityMargin {
    std::optional<double> margin;
    std::string id;
};
FeasibilityMargin feasibility_margin(const Results& results);

/// A line (one axis) or a grid (two axes, the first varying slowest) of sizings.
std::vector<SweepCase> run_sweep(const DesignVariants& design, const std::vector<SweepAxis>& axes,
                                 unsigned threads = 0, Progress* progress = nullptr);

}  // namespace ds
