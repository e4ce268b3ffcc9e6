#pragma once

#include <optional>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "progress.hpp"
#include "trade/design_variants.hpp"

namespace ds {

/// Normalised sensitivities (d ln F / d ln x) of each key figure F to each numeric input x.
struct SensitivityTable {
    std::vector<std::string> inputs;
    std::vector<double> input_values;
    std::vector<std::string> figures;
    /// figures x inputs; NaN where undefined (an input or a figure at zero, a figure missing,
    /// a stepped design the reader refuses).
    Eigen::MatrixXd normalized;

    /// The inputs that drive a figure most, largest |S| first (undefined ones left out).
    std::vector<std::pair<std::string, double>> ranked(std::size_t figure) const;
};

/// Relative step of the differences: 1e-3 of the input's value (common practice: large
/// against the sizing's own numerical noise, small against its curvature).
inline constexpr double sensitivity_relative_step = 1e-3;

/// Five-point central differences in x(1 + k h), k = -2..2, divided by F(x): error O(h^4).
/// `inputs` empty: every numeric key of the design. Figures are the key figures.
SensitivityTable sensitivities(const DesignVariants& design, std::vector<std::string> inputs = {},
                               unsigned threads = 0, Progress* progress = nullptr);

}  // namespace ds
