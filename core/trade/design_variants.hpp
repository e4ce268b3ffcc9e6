#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "design/key_path.hpp"
#include "design/reader.hpp"

namespace ds {

struct KeyRow;

/// A design as its document, whose numeric keys can be set by their path
/// ("aeroshell.diameter_m", "mass.items[0].mass_kg"): the one way sweeps, dispersions and
/// sensitivities make their cases. Each case is exactly the design a user would have written,
/// and a value the reader refuses is that case's error: a key the document already holds as a
/// plain number of the schema, which no rule between keys reads but its own range (and the
/// dropped masses' against the entry mass, checked as the reader does), is set in the design
/// the document reads to, with the reader's judgement of its range; any other goes through
/// the strict reader again.
class DesignVariants {
public:
    DesignVariants(nlohmann::ordered_json document, std::filesystem::path base_directory);

    /// Keys resolved once for the many cases that set them.
    struct Keys {
        std::vector<std::string> paths;
        /// Their rows, when every key can be set in the design itself; empty otherwise.
        std::vector<const KeyRow*> rows;
    };
    Keys prepare(std::vector<std::string> paths) const;

    /// The design with the prepared keys set to the values (one per key, in order).
    DesignReadResult with(const Keys& keys, const std::vector<double>& values) const;

    /// The document of a design (as the writer gives it back).
    static DesignVariants of(const Design& design, std::filesystem::path base_directory = {});

    const nlohmann::ordered_json& document() const { return document_; }

    /// The number at a key, or empty when the key is absent or not a number.
    std::optional<double> value(std::string_view key) const;

    /// The design with the keys set to the values (absent keys are added).
    DesignReadResult with(const std::vector<std::pair<std::string, double>>& values) const;

    /// The same through the document and the strict reader, whatever the keys.
    DesignReadResult with_document(const std::vector<std::pair<std::string, double>>& values) const;

    /// Every numeric key of the document, in document order, less the format's own
    /// (version), the limits and the solver settings: the inputs of a sensitivity study.
    std::vector<std::string> numeric_keys() const;

    /// Whether a study can set the key: a number the document holds, or a number key of the
    /// schema the document leaves out (it is then added). A misspelt key is neither.
    bool settable(std::string_view key) const;

private:
    nlohmann::ordered_json document_;
    std::filesystem::path base_directory_;
    std::optional<Design> design_;  ///< the document read, when it reads
};

}  // namespace ds
