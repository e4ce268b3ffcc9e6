#include "checks/rule_set.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

namespace ds {
namespace {

/// Four significant digits, as {:.4g} gives them, but without an exponent from a thousandth up
/// to a billion: "17730 kg", not "1.773e+04 kg" (a heavy lander's masses, a dynamic pressure in
/// Pa); trailing zeros dropped ("15", "4.6").
std::string four_digits(double value) {
    if (value == 0.0 || !std::isfinite(value))
        return fmt::format("{:.4g}", value);
    const int exponent = static_cast<int>(std::floor(std::log10(std::abs(value))));
    if (exponent < -3 || exponent >= 9)
        return fmt::format("{:.4g}", value);
    const int decimals = std::max(0, 3 - exponent);
    const double scale = std::pow(10.0, exponent - 3);
    std::string text = fmt::format("{:.{}f}", std::round(value / scale) * scale, decimals);
    if (text.find('.') != std::string::npos) {
        text.erase(text.find_last_not_of('0') + 1);
        if (text.back() == '.')
            text.pop_back();
    }
    return text;
}

std::string number(double value, std::string_view unit) {
    return unit.empty() ? four_digits(value) : fmt::format("{} {}", four_digits(value), unit);
}

/// `beyond` is how far value lies past the limit as a fraction of it (positive = past it).
Check judge(const LimitRule& rule, double value, double limit, double beyond, double band,
            std::string_view past_word, std::string_view within_word, Wording wording) {
    Check c{std::string(rule.id),
            CheckStatus::pass,
            value,
            limit,
            std::string(rule.unit),
            "",
            wording == Wording::words ? std::string(rule.source) : std::string(),
            {}};
    if (rule.severity == Severity::physics)
        c.margin = -beyond;
    const bool past = beyond > 0.0;
    const bool near = !past && rule.severity == Severity::physics && beyond > -band;
    if (past)
        c.status = rule.severity == Severity::envelope ? CheckStatus::marginal : CheckStatus::fail;
    else if (near)
        c.status = CheckStatus::marginal;
    if (wording == Wording::judged_only)
        return c;
    const std::string v = number(value, rule.unit);
    const std::string l = number(limit, rule.unit);
    if (past) {
        c.message = rule.severity == Severity::envelope
                        ? fmt::format(
                              "{} {} is {} the heritage envelope's {}: beyond today's "
                              "demonstrated technology",
                              rule.what, v, past_word, l)
                        : fmt::format("{} {} is {} the limit of {}", rule.what, v, past_word, l);
    } else if (near) {
        c.message = fmt::format("{} {} is within {:.0f} % of the limit of {}", rule.what, v,
                                band * 100.0, l);
    } else {
        c.message = fmt::format("{} {} is {} the limit of {}", rule.what, v, within_word, l);
    }
    return c;
}

double relative_excess(double value, double limit) {
    return limit != 0.0 ? (value - limit) / std::abs(limit) : value - limit;
}

}  // namespace

Check check_at_most(const LimitRule& rule, double value, double limit, double marginal_band,
                    Wording wording) {
    return judge(rule, value, limit, relative_excess(value, limit), marginal_band, "above",
                 "within", wording);
}

Check check_at_least(const LimitRule& rule, double value, double limit, double marginal_band,
                     Wording wording) {
    return judge(rule, value, limit, -relative_excess(value, limit), marginal_band, "below",
                 "above", wording);
}

void order_checks(std::vector<Check>& checks) {
    // Three statuses: a pass over the checks for each, in order, keeps the order within each
    // (a stable sort would move each check some log n times and take a buffer).
    std::vector<Check> ordered;
    ordered.reserve(checks.size());
    for (const CheckStatus status : {CheckStatus::fail, CheckStatus::marginal, CheckStatus::pass}) {
        for (Check& check : checks) {
            if (check.status == status)
                ordered.push_back(std::move(check));
        }
    }
    checks = std::move(ordered);
}

}  // namespace ds
