#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "results/results.hpp"

namespace ds {

/// One figure of the compact table the window and the sizing sheet show, and of the rows of
/// trade studies.
struct KeyFigure {
    std::string id;     ///< stable name, for baselines and tests ("peak_deceleration")
    std::string label;  ///< "peak deceleration"
    std::optional<double> value;
    std::string unit;   ///< "g", "kg/m^2", "" for none
    int decimals = 1;
};

/// The key figures of a result, in the order they are shown.
std::vector<KeyFigure> key_figures(const Results& results);

/// Where the figure of this id stands among the key figures, if it is one.
std::optional<std::size_t> key_figure_index(std::string_view id);

}  // namespace ds
