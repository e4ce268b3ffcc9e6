#include "trade/sensitivity.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

#include "results/key_figures.hpp"
#include "sizing/size.hpp"
#include "trade/parallel.hpp"

namespace ds {
namespace {

constexpr double undefined = std::numeric_limits<double>::quiet_NaN();

std::vector<std::optional<double>> figures_of(
    const DesignVariants& design, const std::vector<std::pair<std::string, double>>& values) {
    const DesignReadResult read = design.with(values);
    if (!read.ok())
        return {};
    return key_figure_values(size_design(
        *read.design, {.capability = true, .history = false, .every_figure_checked = false}));
}

}  // namespace

std::vector<std::pair<std::string, double>> SensitivityTable::ranked(std::size_t figure) const {
    std::vector<std::pair<std::string, double>> out;
    for (std::size_t i = 0; i < inputs.size(); ++i) {
        const double s =
            normalized(static_cast<Eigen::Index>(figure), static_cast<Eigen::Index>(i));
        if (std::isfinite(s))
            out.emplace_back(inputs[i], s);
    }
    std::stable_sort(out.begin(), out.end(), [](const auto& a, const auto& b) {
        return std::abs(a.second) > std::abs(b.second);
    });
    return out;
}

SensitivityTable sensitivities(const DesignVariants& design, std::vector<std::string> inputs,
                               unsigned threads, Progress* progress) {
    SensitivityTable table;
    table.inputs = inputs.empty() ? design.numeric_keys() : std::move(inputs);
    for (const KeyFigureDefinition& f : key_figure_table)
        table.figures.emplace_back(f.id);
    const auto nominal = figures_of(design, {});
    const auto n_in = static_cast<Eigen::Index>(table.inputs.size());
    const auto n_out = static_cast<Eigen::Index>(table.figures.size());
    table.normalized = Eigen::MatrixXd::Constant(n_out, n_in, undefined);
    for (const std::string& key : table.inputs) {
        table.input_values.push_back(design.value(key).value_or(undefined));
    }

    parallel_for(table.inputs.size(), threads, progress, [&](std::size_t i) {
        const double x = table.input_values[i];
        if (!std::isfinite(x) || x == 0.0)
            return;
        const double h = sensitivity_relative_step;
        std::array<std::vector<std::optional<double>>, 4>
            at;  // x(1 - 2h), x(1 - h), x(1 + h), x(1 + 2h)
        const std::array<double, 4> offsets{-2.0 * h, -h, h, 2.0 * h};
        for (std::size_t k = 0; k < at.size(); ++k) {
            at[k] = figures_of(design, {{table.inputs[i], x * (1.0 + offsets[k])}});
            if (at[k].empty())
                return;
        }
        if (nominal.empty())
            return;
        for (Eigen::Index f = 0; f < n_out; ++f) {
            const auto k = static_cast<std::size_t>(f);
            if (!nominal[k] || *nominal[k] == 0.0)
                continue;
            if (!at[0][k] || !at[1][k] || !at[2][k] || !at[3][k])
                continue;
            // Five-point central difference in the relative step, error O(h^4).
            const double derivative =
                (*at[0][k] - 8.0 * *at[1][k] + 8.0 * *at[2][k] - *at[3][k]) / (12.0 * h);
            table.normalized(f, static_cast<Eigen::Index>(i)) = derivative / *nominal[k];
        }
    });
    return table;
}

}  // namespace ds
