#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "design/design.hpp"

namespace ds {

/// Why a document could not be read, at the path of the key that is wrong
/// ("entry.velocity_m_s", "atmosphere.rows[3].density_kg_m3"; empty for the whole document).
struct ReadError {
    std::string path;
    std::string message;

    /// "path: message", or the message alone when there is no path.
    std::string text() const;
};

/// A design, or every reason it could not be read.
struct DesignReadResult {
    std::optional<Design> design;
    std::vector<ReadError> errors;

    bool ok() const { return design.has_value(); }
};

/// Reads a design document (design-file.md). Strict: unknown keys, missing keys, wrong types,
/// NaN or infinite numbers, out-of-range values and a newer version are errors naming the key.
/// A table atmosphere's "csv_file" is resolved against base_directory.
DesignReadResult read_design(std::string_view json_text,
                             const std::filesystem::path& base_directory = {});

/// Reads a design from a document already parsed (a trade study's variant of a design): the
/// same checks, without the text's own (syntax, duplicate keys).
DesignReadResult read_design_document(const nlohmann::ordered_json& document,
                                      const std::filesystem::path& base_directory = {});

/// Reads a design file; its folder is the base for relative paths inside it.
DesignReadResult read_design_file(const std::filesystem::path& file);

}  // namespace ds
