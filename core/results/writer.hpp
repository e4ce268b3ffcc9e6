#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "results/results.hpp"

namespace ds {

struct ResultsWriteOptions {
    bool include_history = false;  ///< the trajectory samples, for plots
};

/// The results document (design-file.md, version 1). Absent figures are written as null.
nlohmann::ordered_json results_to_json(const Results& results, ResultsWriteOptions options = {});
std::string write_results(const Results& results, ResultsWriteOptions options = {});

}  // namespace ds
