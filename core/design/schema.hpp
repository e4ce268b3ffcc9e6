#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "design/design.hpp"

namespace ds {

/// The schema of the design document: one row per key, saying where it lives in a `Design`,
/// what it admits and how the window shows it. The reader, the writer, the form, the trade key
/// list, the fuzz dictionary and the check-to-field map all derive from these rows, so a new
/// optional number key is one row (plus its physics). Keys that span several keys or sections
/// (a custom body, table rows, mass items, dispersions, cross-section checks) keep hand-written
/// code in the reader and the writer; their rows say only where they sit.

/// The admissible values of a number (the reader's bounds). An absent bound does not apply.
struct ValueRange {
    std::optional<double> above;     ///< exclusive lower bound
    std::optional<double> at_least;  ///< inclusive lower bound
    std::optional<double> below;     ///< exclusive upper bound
    std::optional<double> at_most;   ///< inclusive upper bound

    bool contains(double x) const;
    /// The reader's wording: "must be positive", "must be greater than -90 and less than 90".
    std::string requirement() const;
};

/// What a key holds.
enum class KeyKind {
    number,             ///< a number
    integer,            ///< a whole number
    choice,             ///< one of the names of a table ("retro", "disk-gap-band")
    text,               ///< free text
    number_or_request,  ///< a number, or a sizing request: an object of the rows whose parent it is
    object,   ///< an object of the rows whose parent it is, which the design may lack (an approach)
    by_hand,  ///< read and written by hand (table rows, mass items); the row gives its place
};

/// Whether a document must give a key.
enum class KeyNeed {
    required,   ///< must be given
    defaulted,  ///< may be left out: the design keeps its default, and the writer writes it
    optional,   ///< may be left out: the design has none, and the writer leaves it out
};

/// Where a number key lives in a `Design`: read it (empty when the design has none) and set it.
/// Captureless functions, made from member pointers in schema.cpp.
struct NumberAccess {
    std::optional<double> (*get)(const Design&) = nullptr;
    void (*set)(Design&, double) = nullptr;
};

/// Where a choice or text key lives: read it, and set it (false for a name the choice lacks).
struct TextAccess {
    std::string_view (*get)(const Design&) = nullptr;
    bool (*set)(Design&, std::string_view) = nullptr;
};

/// Where an object key lives (entry.approach): whether the design has it, and adding it.
struct PartAccess {
    bool (*present)(const Design&) = nullptr;
    void (*add)(Design&) = nullptr;
};

/// Keys of which a document gives one (a deploy trigger: exactly one) or at most one (the
/// heat-shield jettison rule: when none is given the first applies with its default).
struct KeyGroup {
    std::string_view name;   ///< for messages: "deploy trigger"
    bool required = true;    ///< exactly one; otherwise at most one
    std::string_view label;  ///< the form's title of the choice: "Deploy when"
};

/// A terminal key's need and range where no engine fires (method "none").
struct CanopyRule {
    KeyNeed need = KeyNeed::optional;
    ValueRange range;
    std::optional<double> fallback;
};

/// The display text of a choice's value, where the name alone says too little.
struct ChoiceText {
    std::string_view name;
    std::string_view text;
};

/// A key of the objects that a part read by hand holds (a wind row, a mass item, a custom
/// body), with its unit: for what shows the document (the sizing sheet).
struct ElementKey {
    std::string_view key;   ///< "east_m_s"
    std::string_view unit;  ///< "m/s"; empty: none
};

/// One key of the design document.
struct KeyRow {
    std::string_view section;  ///< "entry"; empty at the document's top level
    std::string_view key;      ///< "flight_path_angle_deg"
    /// A sizing request's key: the key whose object holds it ("diameter_m"); empty otherwise.
    std::string_view parent;
    KeyKind kind = KeyKind::number;
    KeyNeed need = KeyNeed::required;
    ValueRange range;
    /// The SI unit the key's name carries ("m/s"), as it is shown; empty: none. The name
    /// spells it with `unit_in_key_name` ("velocity_m_s").
    std::string_view unit;
    /// The value a defaulted key takes when left out (a limit's default, a throttle of 1).
    std::optional<double> default_value;
    NumberAccess number;  ///< number, integer and number_or_request keys
    TextAccess text;      ///< choice and text keys
    PartAccess part;      ///< object keys
    /// The keys of its object that an object key stands in place of (the interface speed and
    /// angle, for an approach): given with it they are refused, and without them they are not
    /// missing. Two objects that stand in place of the same keys exclude each other.
    std::span<const std::string_view> replaces;
    /// A choice's names, from the one name table of its enumeration.
    std::vector<std::string_view> (*choices)() = nullptr;
    /// The atmosphere model the key belongs to; empty: every model.
    std::optional<AtmosphereModel> model;
    /// The terminal methods the key belongs to; empty: every method.
    std::span<const TerminalMethod> methods;
    /// Its need and range when the terminal method is "none", where they differ.
    std::optional<CanopyRule> on_canopy;
    /// The group of alternative keys it is one of; null for none.
    const KeyGroup* group = nullptr;
    /// Whether its numbers are inputs of trade and sensitivity studies.
    bool trade_input = true;

    // How the window shows it.
    std::string_view label;  ///< the form's label; empty: the key with spaces
    std::optional<std::pair<double, double>> typical;  ///< the typical range, low and high
    /// The value it takes when the user switches to a shape that needs it (a trigger, a
    /// model, a method, a sizing request).
    std::optional<double> fallback;
    /// What leaving out an optional key means ("estimated"); empty: its default, if any.
    std::string_view placeholder;
    /// Its entry in a choice between shapes ("Mach falls to", "sized for a descent speed").
    std::string_view shape_text;
    /// Display texts of a choice's values; a name without one is shown as it is.
    std::span<const ChoiceText> choice_texts;
    /// A by-hand key's own keys, in each of its rows or in its object (a wind row).
    std::span<const ElementKey> elements;

    /// "parachute.diameter_m.size_for_velocity_m_s": the reader's path of the key.
    std::string path() const;
};

/// One object of the document, in the order the writer gives them.
struct SectionRow {
    std::string_view name;  ///< "entry"
    KeyNeed need = KeyNeed::required;
    /// A part read and written by hand (the body, the dispersions); no rows of its own.
    bool by_hand = false;
    /// Whether its numbers are inputs of trade and sensitivity studies.
    bool trade_inputs = true;
    /// For a part the design may lack (the decelerator): whether it has it, and adding it.
    bool (*present)(const Design&) = nullptr;
    void (*add)(Design&) = nullptr;
    // How the window offers a part the design may lack.
    std::string_view label;         ///< "Inflatable decelerator"
    std::string_view absent_text;   ///< "none"
    std::string_view present_text;  ///< "before the parachute"
    /// A part read by hand: its own keys (the custom body's).
    std::span<const ElementKey> elements;
};

/// The document's objects, in the writer's order.
std::span<const SectionRow> design_sections();
const SectionRow* find_section(std::string_view name);

/// Every key, grouped by section in the writer's order; a sizing request's keys follow their
/// parent.
std::span<const KeyRow> design_keys();
/// The keys of one section (empty name: the top level), in order, sizing requests included.
std::vector<const KeyRow*> keys_of(std::string_view section);
/// The row of a key path ("entry.velocity_m_s"), or null.
const KeyRow* find_key(std::string_view path);

/// The object keys given in place of a key of the same object ("velocity_m_s" for
/// "entry.approach" and "entry.orbit"), in order.
std::vector<const KeyRow*> replacements_of(const KeyRow& row);

/// The label the form shows for a key: its label, or its key with spaces.
std::string label_of(const KeyRow& row);

/// Whether a key belongs to the design's atmosphere model and terminal method: each carries
/// the keys it flies with, and only those (the reader refuses the others).
bool belongs_to_design(const KeyRow& row, const Design& design);

/// The number a key takes when the document leaves it out: its row's default, or for a
/// defaulted key the default design's value; none for a key without one.
std::optional<double> default_of(const KeyRow& row);

/// A key's typical range on a body: the body's own where the key's typical values depend on it
/// (the entry speed and altitude, an exponential atmosphere's constants), else the row's. For
/// the form's suggestions, not limits. `body` is a preset's name, or empty for a custom body.
std::optional<std::pair<double, double>> typical_range(const KeyRow& row, std::string_view body);

/// The unit of any key of the document by its path, array indices included
/// ("atmosphere.wind[2].east_m_s": "m/s"); empty for a key without one.
std::string_view unit_of_path(std::string_view path);

/// How a key's name spells a unit (design-file.md: units are in the key names): "m/s" is
/// "m_s", "kg/m^3" "kg_m3", "J/(kg K)" "J_kgK".
std::string unit_in_key_name(std::string_view unit);

/// The key a check points at, for the window to take the user there (a check's id, a key path).
struct CheckField {
    std::string_view check;
    std::string_view key;
};
std::span<const CheckField> check_fields();
/// The key path a check points at, or empty.
std::string_view key_of_check(std::string_view check_id);

}  // namespace ds
