#pragma once

#include <cmath>
#include <optional>
#include <utility>

#include <nlohmann/json.hpp>

namespace ds::json {

/// What the design and results writers and the trade outputs share: how a number goes into a
/// document, and a list of objects.

using Json = nlohmann::ordered_json;

/// A number, or null when it is not finite: JSON has no NaN or infinity, and a figure that
/// could not be computed must not pass for one.
inline Json number(double value) {
    return std::isfinite(value) ? Json(value) : Json(nullptr);
}

/// An absent figure is null: the key is always there, so readers need not guess.
inline Json number(const std::optional<double>& value) {
    return value ? number(*value) : Json(nullptr);
}

/// An empty object with room for `keys` members, so that filling it in order does not move
/// the members already in it (an ordered object keeps them in a vector).
inline Json object_with_room(std::size_t keys) {
    Json out = Json::object();
    out.get_ref<Json::object_t&>().reserve(keys);
    return out;
}

/// An array of one JSON value per element, in order.
template <class Range, class ToJson>
Json array_of(const Range& elements, ToJson&& to_json) {
    Json out = Json::array();
    for (const auto& element : elements)
        out.push_back(to_json(element));
    return out;
}

}  // namespace ds::json
