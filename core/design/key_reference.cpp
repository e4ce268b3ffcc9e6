#include "design/key_reference.hpp"

#include <array>
#include <iterator>
#include <span>
#include <string_view>
#include <vector>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "body/body.hpp"
#include "design/design.hpp"
#include "design/schema.hpp"
#include "results/caution.hpp"

namespace ds {
namespace {

/// A number as the document would hold it (the shortest text that reads back the same).
std::string plain(double x) {
    return fmt::format("{}", x);
}

std::string quoted_names(const std::vector<std::string_view>& names) {
    std::vector<std::string> quoted;
    for (const std::string_view name : names)
        quoted.push_back(fmt::format("`{}`", name));
    return fmt::format("{}", fmt::join(quoted, ", "));
}

/// The reader's requirement of a number, as a table says it.
std::string range_text(const ValueRange& range) {
    const std::string requirement = range.requirement();
    if (requirement == "must not be negative")
        return "0 or more";
    constexpr std::string_view must_be = "must be ";
    std::string text =
        requirement.rfind(must_be, 0) == 0 ? requirement.substr(must_be.size()) : requirement;
    return text.empty() ? std::string("any number") : text;
}

std::string element_list(std::span<const ElementKey> elements) {
    std::vector<std::string> keys;
    for (const ElementKey& e : elements) {
        keys.push_back(e.unit.empty() ? fmt::format("`{}`", e.key)
                                      : fmt::format("`{}` ({})", e.key, e.unit));
    }
    return fmt::format("{}", fmt::join(keys, ", "));
}

/// What the schema's rows of the keys read by hand do not say: whether one is given, and the
/// shape of its values beyond the list of its keys (reader.cpp reads them).
struct ByHand {
    std::string_view path;
    std::string_view need;
    std::string_view allowed;  ///< appended to the list of its keys, or in its place
};

const ByHand* by_hand_note(const KeyRow& row) {
    static const std::array<ByHand, 4> notes{{
        {"atmosphere.rows", "one of `rows` and `csv_file`",
         ", by rising altitude (or each row the array `[altitude_m, density_kg_m3, "
         "temperature_K]`)"},
        {"atmosphere.csv_file", "one of `rows` and `csv_file`",
         "the path of a CSV file, relative to the design's folder, whose header names "
         "`altitude_m`, `density_kg_m3` and `temperature_K`"},
        {"atmosphere.wind", "optional (no wind)",
         " by altitude (or each row `[altitude_m, east_m_s, north_m_s]`), or one object of "
         "`east_m_s` and `north_m_s` for a wind at every altitude"},
        {"mass.items", "optional (none)", ""},
    }};
    const std::string path = row.path();
    for (const ByHand& note : notes) {
        if (note.path == path)
            return &note;
    }
    return nullptr;
}

/// Whether the key must be given, and what leaving it out means.
std::string need_text(const KeyRow& row, const Design& defaults) {
    if (row.kind == KeyKind::by_hand) {
        const ByHand* note = by_hand_note(row);
        return note ? std::string(note->need) : std::string("see the contract");
    }
    std::string text;
    switch (row.need) {
        case KeyNeed::required:
            text = "required";
            break;
        case KeyNeed::defaulted: {
            if (const std::optional<double> value = default_of(row))
                text = fmt::format("default {}", plain(*value));
            else if (row.text.get && !row.text.get(defaults).empty())
                text = fmt::format("default `{}`", row.text.get(defaults));
            else
                text = "defaulted";
            break;
        }
        case KeyNeed::optional:
            text = row.placeholder.empty() ? "optional"
                                           : fmt::format("optional ({})", row.placeholder);
            break;
    }
    if (row.group) {
        text += fmt::format("; {} of the {}", row.group->required ? "exactly one" : "at most one",
                            row.group->name);
    }
    if (row.on_canopy) {
        text += fmt::format("; with the method `none`: {}",
                            row.on_canopy->need == KeyNeed::required ? "required" : "optional");
    }
    return text;
}

/// What the reader accepts.
std::string allowed_text(const KeyRow& row) {
    switch (row.kind) {
        case KeyKind::number:
        case KeyKind::number_or_request: {
            std::string text = range_text(row.range);
            if (row.kind == KeyKind::number_or_request)
                text += ", or an object of one sizing request below";
            return text;
        }
        case KeyKind::integer:
            return fmt::format("a whole number, {}", range_text(row.range));
        case KeyKind::choice:
            return row.choices ? fmt::format("one of {}", quoted_names(row.choices())) : "a name";
        case KeyKind::text:
            return "text";
        case KeyKind::object:
            return "an object of the keys below";
        case KeyKind::by_hand: {
            const ByHand* note = by_hand_note(row);
            std::string text = fmt::format("a list of objects of {}", element_list(row.elements));
            if (note && !note->allowed.empty())
                text = row.elements.empty() ? std::string(note->allowed)
                                            : fmt::format("{}{}", text, note->allowed);
            return text;
        }
    }
    return {};
}

/// What the key belongs to: an atmosphere model, terminal methods.
std::string applies_text(const KeyRow& row) {
    std::vector<std::string> parts;
    if (row.model)
        parts.push_back(fmt::format("atmosphere `{}`", to_string(*row.model)));
    if (!row.methods.empty()) {
        std::vector<std::string_view> names;
        for (const TerminalMethod m : row.methods)
            names.push_back(to_string(m));
        parts.push_back(fmt::format("method {}", quoted_names(names)));
    }
    return parts.empty() ? std::string("all") : fmt::format("{}", fmt::join(parts, "; "));
}

std::string typical_text(const KeyRow& row) {
    if (!row.typical)
        return {};
    return fmt::format("{} to {}", plain(row.typical->first), plain(row.typical->second));
}

std::string trimmed(std::string text) {
    const std::size_t first = text.find_first_not_of(' ');
    return first == std::string::npos ? std::string() : text.substr(first);
}

/// A table cell: no bar or line end of its own.
std::string cell(std::string text) {
    std::string out;
    for (const char c : text) {
        if (c == '|')
            out += "\\|";
        else if (c != '\n')
            out += c;
    }
    return out;
}

}  // namespace

std::string design_key_reference() {
    const Design defaults;
    std::string out;
    auto put = [&out](std::string_view text) { out += text; };
    put("# The keys of a design document\n\n");
    put("Made from the program's schema (the rows its reader, writer and form read) by "
        "`descent-sizer keys`; a test keeps this copy equal to it. Units are in the key names "
        "(`velocity_m_s`); a key left out that is \"required\" is an error, one \"defaulted\" "
        "takes its default, one \"optional\" is absent or estimated as said. Typical values are "
        "the form's suggestions, not limits: the allowed range is the only bound.\n\n");
    put(fmt::format("{}\n\n", conceptual_caution));
    put(
        fmt::format("The top level: `format` (`\"descent-sizer/design\"`), `version` (1), "
                    "`name` (text), then the sections below in this order.\n"));
    for (const SectionRow& section : design_sections()) {
        put(fmt::format("\n## `{}`{}\n\n", section.name,
                        section.need == KeyNeed::optional ? " (optional)" : ""));
        if (section.name == "body") {
            std::vector<std::string_view> presets;
            const std::vector<std::string> names = body_preset_names();
            for (const std::string& name : names)
                presets.push_back(name);
            std::vector<std::string> keys;
            for (const ElementKey& e : section.elements) {
                keys.push_back(e.unit.empty() ? fmt::format("`{}`", e.key)
                                              : fmt::format("`{}` ({})", e.key, e.unit));
            }
            put(fmt::format("A preset's name, one of {}; or an object of its own with {}.\n",
                            quoted_names(presets), fmt::join(keys, ", ")));
            continue;
        }
        if (section.name == "dispersions") {
            put("A list of objects, one per dispersed key: `key` (a number key's path, as "
                "`entry.velocity_m_s`; each key once), `distribution` (`normal` with `sigma`, or "
                "`uniform` with `min` and `max`), in the key's own unit.\n");
            continue;
        }
        if (!section.label.empty())
            put(fmt::format("{}: present or absent as a whole.\n\n", section.label));
        put("| key | label | unit | given | allowed | applies to | typical |\n");
        put("|---|---|---|---|---|---|---|\n");
        for (const KeyRow* row : keys_of(section.name)) {
            std::string path = row->path();
            const std::string key =
                path.substr(section.name.size() + (section.name.empty() ? 0 : 1));
            put(fmt::format("| `{}` | {} | {} | {} | {} | {} | {} |\n", key,
                            cell(row->label.empty() ? std::string() : trimmed(label_of(*row))),
                            cell(std::string(row->unit)), cell(need_text(*row, defaults)),
                            cell(allowed_text(*row)), cell(applies_text(*row)),
                            cell(typical_text(*row))));
        }
        if (section.name == "mass") {
            put(fmt::format(
                "\nA mass item's `group` (when it leaves) is one of {}; its "
                "`maturity` (its growth allowance), optional, one of {}.\n",
                quoted_names(enum_names<MassGroup>()), quoted_names(enum_names<Maturity>())));
        }
    }
    return out;
}

}  // namespace ds
