#pragma once

#include <optional>
#include <span>
#include <string_view>

namespace ds {

/// A parachute type's nominal data, referred to the nominal area pi D0^2 / 4.
struct CanopyType {
    std::string_view name;
    double drag_coefficient = 0.0;    ///< subsonic, fully open
    double opening_load_factor = 0.0;  ///< peak opening force over q Cd A (infinite mass)
    std::string_view source;
};

/// The types a design may name.
std::span<const CanopyType> canopy_types();

std::optional<CanopyType> canopy_type(std::string_view name);

}  // namespace ds
