#include "trade/design_variants.hpp"

#include "design/schema.hpp"
#include "design/writer.hpp"

namespace ds {
namespace {

/// Whether the numbers under a top-level key are trade inputs: the schema says so for its
/// sections (limits, solver and dispersions are not) and its top-level keys (version is not).
bool trade_inputs_under(std::string_view top_key) {
    if (const SectionRow* section = find_section(top_key))
        return section->trade_inputs;
    if (const KeyRow* row = find_key(top_key))
        return row->trade_input;
    return true;
}

}  // namespace

DesignVariants::DesignVariants(nlohmann::ordered_json document,
                               std::filesystem::path base_directory)
    : document_(std::move(document)), base_directory_(std::move(base_directory)) {}

DesignVariants DesignVariants::of(const Design& design, std::filesystem::path base_directory) {
    return {design_to_json(design), std::move(base_directory)};
}

std::optional<double> DesignVariants::value(std::string_view key) const {
    const nlohmann::ordered_json::json_pointer pointer(key_to_pointer(key));
    if (!document_.contains(pointer))
        return std::nullopt;
    const auto& v = document_.at(pointer);
    if (!v.is_number())
        return std::nullopt;
    return v.get<double>();
}

DesignReadResult DesignVariants::with(
    const std::vector<std::pair<std::string, double>>& values) const {
    nlohmann::ordered_json variant = document_;
    for (const auto& [key, value] : values) {
        const nlohmann::ordered_json::json_pointer pointer(key_to_pointer(key));
        try {
            variant[pointer] = value;
        } catch (const nlohmann::ordered_json::exception&) {
            return {std::nullopt, {ReadError{key, "is not a number of the design"}}};
        }
    }
    return read_design_document(variant, base_directory_);
}

std::vector<std::string> DesignVariants::numeric_keys() const {
    std::vector<std::string> keys;
    const auto walk = [&](const auto& self, const nlohmann::ordered_json& node,
                          const std::string& path) -> void {
        if (node.is_number()) {
            keys.push_back(path);
        } else if (node.is_object()) {
            for (auto it = node.begin(); it != node.end(); ++it) {
                if (path.empty() && !trade_inputs_under(it.key()))
                    continue;
                self(self, it.value(), path.empty() ? it.key() : path + "." + it.key());
            }
        } else if (node.is_array()) {
            for (std::size_t i = 0; i < node.size(); ++i) {
                self(self, node[i], path + "[" + std::to_string(i) + "]");
            }
        }
    };
    walk(walk, document_, "");
    return keys;
}

}  // namespace ds
