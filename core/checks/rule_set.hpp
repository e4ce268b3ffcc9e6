#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "checks/check.hpp"

namespace ds {

/// The rules that judge a figure against a limit. Which figures meet which limits is the
/// sizing's business (sizing/limit_checks.hpp): this layer knows neither designs nor results.

/// What crossing a limit means. Leaving the heritage envelope is "marginal" (it needs new
/// technology, not new physics); crossing a physical limit is "fail", and coming within the
/// marginal band of it is "marginal".
enum class Severity { envelope, physics };

/// What a limit check compares, in words and numbers. The words are views (of literals, or of
/// the caller's strings alive while the check is made): the check copies what it keeps.
struct LimitRule {
    std::string_view id;
    std::string_view what;  ///< "peak deceleration"
    std::string_view unit;
    Severity severity = Severity::physics;
    std::string_view source;
};

/// Checks value <= limit.
Check check_at_most(const LimitRule& rule, double value, double limit, double marginal_band,
                    Wording wording = Wording::words);
/// Checks value >= limit.
Check check_at_least(const LimitRule& rule, double value, double limit, double marginal_band,
                     Wording wording = Wording::words);

/// Orders checks failing first, then marginal, then passing, keeping their order otherwise.
void order_checks(std::vector<Check>& checks);

}  // namespace ds
