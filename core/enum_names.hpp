#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string_view>
#include <type_traits>
#include <utility>
#include <vector>

namespace ds {

/// One name table per enumeration: each enumerator beside the word a document or a message
/// uses for it. `name_of`, `value_of` and `all_names` read any such table, so an enumeration's
/// words are written once.
template <class Enum, std::size_t Count>
using Names = std::array<std::pair<Enum, std::string_view>, Count>;

/// The name of `value`, or an empty view when the table lacks it.
template <class Enum, std::size_t Count>
constexpr std::string_view name_of(const Names<Enum, Count>& names, Enum value) {
    for (const auto& [e, name] : names) {
        if (e == value)
            return name;
    }
    return {};
}

/// The enumerator named `name`, or nothing when no row has that name.
template <class Enum, std::size_t Count>
constexpr std::optional<Enum> value_of(const Names<Enum, Count>& names, std::string_view name) {
    for (const auto& [e, n] : names) {
        if (n == name)
            return e;
    }
    return std::nullopt;
}

/// Every name, in the table's order.
template <class Enum, std::size_t Count>
std::vector<std::string_view> all_names(const Names<Enum, Count>& names) {
    std::vector<std::string_view> all;
    for (const auto& [e, name] : names)
        all.push_back(name);
    return all;
}

/// An enumeration whose table is given by a `name_table(Enum)` beside it (found by
/// argument-dependent lookup): the three functions below then serve it, with no functions of
/// its own.
template <class Enum>
concept NamedEnum = std::is_enum_v<Enum> && requires(Enum e) {
    name_table(e);
};

/// The document's name of `value`.
template <NamedEnum Enum>
constexpr std::string_view to_string(Enum value) {
    return name_of(name_table(value), value);
}

/// The enumerator a document names `name`, or nothing for a name the table lacks.
template <NamedEnum Enum>
constexpr std::optional<Enum> enum_from(std::string_view name) {
    return value_of(name_table(Enum{}), name);
}

/// Every name of the enumeration, in its table's order, for choices and messages.
template <NamedEnum Enum>
std::vector<std::string_view> enum_names() {
    return all_names(name_table(Enum{}));
}

}  // namespace ds
