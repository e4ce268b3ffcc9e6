#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string_view>
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

}  // namespace ds
