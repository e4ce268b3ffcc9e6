#pragma once

#include <string_view>

namespace ds {

/// What every output says about its numbers: the first of the results' notes, the sheet's
/// caution and the window's status bar.
inline constexpr std::string_view conceptual_caution =
    "Conceptual sizing estimates: confirm them by detailed analysis and test under the "
    "mission's own standards and review.";

}  // namespace ds
