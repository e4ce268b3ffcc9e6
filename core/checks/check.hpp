#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "enum_names.hpp"

namespace ds {

enum class CheckStatus { pass, marginal, fail };

/// The document's names of the statuses.
constexpr Names<CheckStatus, 3> name_table(CheckStatus) {
    return {{{CheckStatus::pass, "pass"},
             {CheckStatus::marginal, "marginal"},
             {CheckStatus::fail, "fail"}}};
}

/// Whether a check is written out in words (its message and its source) or only judged (status,
/// value, limit and margin): a case of a dispersion campaign keeps which checks fail and
/// nothing they say.
enum class Wording { words, judged_only };

/// The outcome of one named check: the value, the limit it was held against, and why.
struct Check {
    std::string id;
    CheckStatus status = CheckStatus::pass;
    double value = 0.0;
    double limit = 0.0;
    std::string unit;
    std::string message;  ///< in words a person understands, with the numbers (empty when
                          ///< judged only)
    std::string source;   ///< where the limit comes from
    /// How far the value lies inside the limit whose crossing fails the check, as a fraction
    /// of that limit: positive inside, negative past it, zero on it. Only checks that fail past
    /// a limit have one (not the heritage envelope, not a trigger that was never reached).
    std::optional<double> margin;
};

}  // namespace ds
