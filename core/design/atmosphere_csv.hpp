#pragma once

#include <filesystem>
#include <string>
#include <string_view>
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
/// file: no such file". Whether the rows make a usable table (order, signs) is the design
/// reader's business. Only a regular file of at most `most_table_file_bytes`, of at most
/// `most_table_rows` rows, is read (design/text_file.hpp).
AtmosphereCsv read_atmosphere_csv(const std::filesystem::path& file);

/// The same, from the file's text.
AtmosphereCsv parse_atmosphere_csv(std::string_view csv);

}  // namespace ds
