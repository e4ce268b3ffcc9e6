#include "parachute/canopy.hpp"

#include <algorithm>
#include <array>

namespace ds {

std::span<const CanopyType> canopy_types() {
    static constexpr std::array types{
        // Cd 0.53-0.58 subsonic (Maydew, Peterson and Orlik-Rueckemann, AGARD-AG-319, 1991);
        // opening load factor about 1.3 (Knacke, NWC TP 6575; from memory).
        CanopyType{"disk-gap-band", 0.55, 1.3,
                   "AGARD-AG-319 (1991) drag; Knacke NWC TP 6575 opening load (from memory)"},
        // Cd 0.75-0.90 and an opening load factor about 1.1 (Knacke, NWC TP 6575; from memory).
        CanopyType{"ringsail", 0.80, 1.1, "Knacke NWC TP 6575 (from memory)"},
    };
    return types;
}

std::optional<CanopyType> canopy_type(std::string_view name) {
    const auto types = canopy_types();
    const auto it = std::find_if(types.begin(), types.end(),
                                 [&](const CanopyType& t) { return t.name == name; });
    if (it == types.end()) return std::nullopt;
    return *it;
}

}  // namespace ds
