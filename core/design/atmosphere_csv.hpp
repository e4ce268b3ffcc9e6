#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "design/design.hpp"

namespace ds {

struct AtmosphereCsv {
    std::vector<AtmosphereRow> rows;
    std::string error;  ///< empty when read; else what is wrong, with the line number

    bool ok() const { return error.empty(); }
};

/// Reads an atmosphere table from CSV. The first line names the columns (altitude_m,
/// density_kg_m3, temperature_K, in any order; other columns are an error); '#' starts a
/// comment line. Every value must be a finite number.
AtmosphereCsv read_atmosphere_csv(const std::filesystem::path& file);

}  // namespace ds
