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

/// A line (one axis) or a grid (two axes, the first varying slowest) of sizings.
std::vector<SweepCase> run_sweep(const DesignVariants& design, const std::vector<SweepAxis>& axes,
                                 unsigned threads = 0, Progress* progress = nullptr);

}  // namespace ds
