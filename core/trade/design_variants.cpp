#include "trade/design_variants.hpp"

#include <algorithm>
#include <array>

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

/// The masses the reader's rule between them reads.
constexpr std::array masses_in_rule{
    std::pair{std::string_view("mass.entry_kg"), &MassDesign::entry_kg},
    std::pair{std::string_view("mass.heat_shield_kg"), &MassDesign::heat_shield_kg},
    std::pair{std::string_view("mass.backshell_kg"), &MassDesign::backshell_kg},
};

bool every_key(std::string_view) {
    return true;
}

/// The key paths of a document's numbers, in the document's order, under the top-level keys
/// that `enters` admits.
std::vector<std::string> number_paths(const nlohmann::ordered_json& document,
                                      bool (*enters)(std::string_view) = every_key) {
    std::vector<std::string> paths;
    const auto walk = [&](const auto& self, const nlohmann::ordered_json& node,
                          const std::string& path) -> void {
        if (node.is_number()) {
            paths.push_back(path);
        } else if (node.is_object()) {
            for (auto it = node.begin(); it != node.end(); ++it) {
                if (path.empty() && !enters(it.key()))
                    continue;
                self(self, it.value(), path.empty() ? it.key() : path + "." + it.key());
            }
        } else if (node.is_array()) {
            for (std::size_t i = 0; i < node.size(); ++i)
                self(self, node[i], path + "[" + std::to_string(i) + "]");
        }
    };
    walk(walk, document, "");
    return paths;
}

}  // namespace

DesignVariants::DesignVariants(nlohmann::ordered_json document,
                               std::filesystem::path base_directory)
    : document_(std::move(document)),
      base_directory_(std::move(base_directory)),
      design_(read_design_document(document_, base_directory_).design) {}

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

DesignVariants::Keys DesignVariants::prepare(std::vector<std::string> paths) const {
    Keys keys{std::move(paths), {}};
    if (!design_)
        return keys;
    std::vector<const KeyRow*> rows;
    for (const std::string& path : keys.paths) {
        const KeyRow* row = find_key(path);
        const bool plain = row && row->kind == KeyKind::number && row->number.set &&
                           !read_by_rules_between_keys(path) && value(path).has_value();
        if (!plain)
            return keys;
        rows.push_back(row);
    }
    keys.rows = std::move(rows);
    return keys;
}

DesignReadResult DesignVariants::with(const Keys& keys, const std::vector<double>& values) const {
    if (keys.rows.empty() || keys.rows.size() != values.size()) {
        std::vector<std::pair<std::string, double>> pairs;
        for (std::size_t i = 0; i < keys.paths.size() && i < values.size(); ++i)
            pairs.emplace_back(keys.paths[i], values[i]);
        return with_document(pairs);
    }
    DesignReadResult out{*design_, {}};
    std::vector<ReadError> errors;
    const bool on_canopy = design_->terminal.method == TerminalMethod::none;
    for (std::size_t i = 0; i < values.size(); ++i) {
        const KeyRow& row = *keys.rows[i];
        const ValueRange& range = on_canopy && row.on_canopy ? row.on_canopy->range : row.range;
        if (std::optional<std::string> problem = number_problem(range, values[i]))
            errors.push_back(ReadError{keys.paths[i], std::move(*problem)});
        else
            row.number.set(*out.design, values[i]);
    }
    // The rule between the masses sees those the reader accepted, and no refused one.
    MassDesign accepted = out.design->mass;
    for (const ReadError& error : errors) {
        for (const auto& [path, member] : masses_in_rule) {
            if (error.path == path)
                (accepted.*member).reset();
        }
    }
    if (std::optional<ReadError> error = dropped_mass_error(accepted))
        errors.push_back(std::move(*error));
    if (!errors.empty()) {
        // The reader lists its errors in the document's order.
        const std::vector<std::string> order = number_paths(document_);
        const auto position = [&](const ReadError& e) {
            return std::find(order.begin(), order.end(), e.path) - order.begin();
        };
        std::stable_sort(errors.begin(), errors.end(), [&](const ReadError& a, const ReadError& b) {
            return position(a) < position(b);
        });
        out.design.reset();
        out.errors = std::move(errors);
    }
    return out;
}

DesignReadResult DesignVariants::with(
    const std::vector<std::pair<std::string, double>>& values) const {
    std::vector<std::string> paths;
    std::vector<double> numbers;
    for (const auto& [key, number] : values) {
        paths.push_back(key);
        numbers.push_back(number);
    }
    return with(prepare(std::move(paths)), numbers);
}

DesignReadResult DesignVariants::with_document(
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
    return number_paths(document_, trade_inputs_under);
}

bool DesignVariants::settable(std::string_view key) const {
    try {
        if (value(key))
            return true;
    } catch (const nlohmann::json::exception&) {
        return false;  // not a path at all ("aeroshell.diam~eter_m")
    }
    const KeyRow* row = find_key(key);
    return row && row->number.set &&
           (row->kind == KeyKind::number || row->kind == KeyKind::integer ||
            row->kind == KeyKind::number_or_request);
}

}  // namespace ds
