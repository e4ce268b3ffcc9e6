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
    /// A key the design does not use where it stands: unknown, or of another atmosphere model
    /// or terminal method. Removing it loses nothing the design uses (the window offers to).
    bool unused_key = false;

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

/// The text of a design document parsed, with the reader's guard on how deep arrays and
/// objects nest (a deeper document would exhaust the stack of whoever walks it): the one parse
/// that every path opening a document goes through (the window's too). Empty, with the
/// reader's message in `error`, when it is too deep or not JSON.
std::optional<nlohmann::ordered_json> parse_design_text(std::string_view json_text,
                                                        std::string* error);

/// Reads a design file; its folder is the base for relative paths inside it.
DesignReadResult read_design_file(const std::filesystem::path& file);

struct ValueRange;

/// What the reader says of a finite or non-finite number given for a key of this range ("must
/// be positive, got -3"); empty when it accepts it.
std::optional<std::string> number_problem(const ValueRange& range, double x);

/// The reader's rule for the dropped masses a design gives (`mass.heat_shield_kg`,
/// `mass.backshell_kg`): each less than a fixed entry mass. The first one broken, in the
/// document's order.
std::optional<ReadError> dropped_mass_error(const MassDesign& mass);

/// Whether one of the reader's rules between keys, other than the dropped masses', reads the
/// number at this path (the interface above the site, the nose radius against the diameter, a
/// conic's altitudes against the interface and the body). A number no such rule reads is
/// judged by its range alone.
bool read_by_rules_between_keys(std::string_view path);

}  // namespace ds
