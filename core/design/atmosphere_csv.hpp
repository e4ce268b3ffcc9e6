#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "design/design.hpp"

namespace ds {

struct AtmosphereCsv {
    std::vector<AtmosphereRow> rows;
    std::vector<int> lines;  ///< the file line of each row, for messages about a row
    std::string error;       ///< empty when read; else what is wrong, with the line number

    bool ok() const { return error.empty(); }
};

/// Reads an atmosphere table from CSV. The first line names the columns (altitude_m,
/// density_kg_m3, temperature_K, in any order; other columns are an error); '#' starts a
/// comment line; blank lines are skipped. Every value must be a finite number. Errors leave
/// the file's name to the caller: "line 4: missing column temperature_K", "cannot open the
/// file". Whether the rows make a usable table (order, signs) is the design reader's business.
AtmosphereCsv read_atmosphere_csv(const std::filesystem::path& file);

}  // namespace ds
