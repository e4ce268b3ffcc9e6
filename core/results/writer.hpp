#pragma once

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "results/results.hpp"

namespace ds {

struct ResultsWriteOptions {
    bool include_history = false;  ///< the trajectory samples, for plots
};

/// The results document (design-file.md, version 1). Absent figures are written as null, and
/// so are figures that are not finite.
nlohmann::ordered_json results_to_json(const Results& results, ResultsWriteOptions options = {});
std::string write_results(const Results& results, ResultsWriteOptions options = {});

/// The paths (as "entry.peak_heat_flux_W_cm2", "history[3].mach") of the numbers of the results
/// document that are not finite, in the document's order: none for a sound sizing. Walks the
/// results as the writer does, without building the document.
std::vector<std::string> non_finite_figures(const Results& results, bool include_history);

}  // namespace ds
