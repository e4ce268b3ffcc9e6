#include "trade/sweep.hpp"

#include <stdexcept>

#include "sizing/size.hpp"
#include "trade/parallel.hpp"

namespace ds {

double SweepAxis::value(int index) const {
    if (count <= 1)
        return from;
    return from + (to - from) * static_cast<double>(index) / static_cast<double>(count - 1);
}

WorstCheck worst_check(const Results& results) {
    WorstCheck worst;
    for (const Check& c : results.checks) {
        if (c.status == CheckStatus::fail)
            return {CheckStatus::fail, c.id};
        if (c.status == CheckStatus::marginal && worst.status == CheckStatus::pass) {
            worst = {CheckStatus::marginal, c.id};
        }
    }
    return worst;
}

FeasibilityMargin feasibility_margin(const Results& results) {
    FeasibilityMargin tightest;
    for (const Check& c : results.checks) {
        if (!c.margin) {
            if (c.status == CheckStatus::fail)
                return {std::nullopt, c.id};
            continue;
        }
        if (!tightest.margin || *c.margin < *tightest.margin)
            tightest = {c.margin, c.id};
    }
    return tightest;
}

std::vector<SweepCase> run_sweep(const DesignVariants& design, const std::vector<SweepAxis>& axes,
                                 unsigned threads, Progress* progress) {
    if (axes.empty() || axes.size() > 2)
        throw std::invalid_argument("a sweep varies one or two keys");
    std::size_t total = 1;
    for (const SweepAxis& axis : axes)
        total *= static_cast<std::size_t>(std::max(axis.count, 1));
    std::vector<SweepCase> cases(total);
    const int inner = axes.size() == 2 ? std::max(axes[1].count, 1) : 1;
    parallel_for(total, threads, progress, [&](std::size_t i) {
        SweepCase& c = cases[i];
        std::vector<std::pair<std::string, double>> values;
        const int index = static_cast<int>(i);
        const int outer_index = index / inner;
        values.emplace_back(axes[0].key, axes[0].value(outer_index));
        if (axes.size() == 2)
            values.emplace_back(axes[1].key, axes[1].value(index % inner));
        for (const auto& v : values)
            c.inputs.push_back(v.second);
        const DesignReadResult read = design.with(values);
        if (!read.ok()) {
            c.error = read.errors.front().text();
            return;
        }
        c.results = size_design(
            *read.design, {.capability = true, .history = false, .every_figure_checked = false});
    });
    return cases;
}

}  // namespace ds
