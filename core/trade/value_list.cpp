#include "trade/value_list.hpp"
#include <algorithm>

#include <charconv>
#include <cmath>
#include <cstdio>
#include <sstream>

#include <fmt/format.h>

namespace ds {
namespace {

std::optional<double> number(std::string_view text) {
    double v = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(v))
        return std::nullopt;
    return v;
}

}  // namespace

std::optional<std::vector<double>> parse_value_list(std::string_view text, std::string* error) {
    std::vector<double> values;
    std::size_t at = 0;
    while (at < text.size()) {
        const std::size_t end = text.find_first_of(", \t", at);
        const std::string_view item =
            text.substr(at, end == std::string_view::npos ? std::string_view::npos : end - at);
        at = end == std::string_view::npos ? text.size() : end + 1;
        if (item.empty())
            continue;
        const std::size_t first = item.find(':');
        if (first == std::string_view::npos) {
            const auto v = number(item);
            if (!v) {
                *error = fmt::format("\"{}\" is not a number", item);
                return std::nullopt;
            }
            values.push_back(*v);
            continue;
        }
        const std::size_t second = item.find(':', first + 1);
        const auto from = number(item.substr(0, first));
        const auto to = second == std::string_view::npos
                            ? std::nullopt
                            : number(item.substr(first + 1, second - first - 1));
        // N read as a number, 0 (refused below) when it is missing or not one.
        const double count =
            second == std::string_view::npos ? 0.0 : number(item.substr(second + 1)).value_or(0.0);
        if (!from || !to || count < 1.0 || count != std::floor(count) ||
            count > most_sweep_values) {
            *error = fmt::format("\"{}\": expected FROM:TO:N with N a whole number from 1 to {}",
                                 item, most_sweep_values);
            return std::nullopt;
        }
        const SweepAxis range{{}, *from, *to, static_cast<int>(count)};
        for (int i = 0; i < range.count; ++i)
            values.push_back(range.value(i));
    }
    return values;
}

std::optional<SweepAxis> parse_sweep_axis(const std::string& text, std::string* error) {
    const auto equals = text.find('=');
    SweepAxis axis;
    if (equals == std::string::npos || equals == 0) {
        *error = fmt::format("{}: expected KEY=FROM:TO:N{}", text,
                             equals == 0 ? " (no key before '=')" : "");
        return std::nullopt;
    }
    axis.key = text.substr(0, equals);
    std::istringstream rest(text.substr(equals + 1));
    char colon1 = 0;
    char colon2 = 0;
    rest >> axis.from >> colon1 >> axis.to >> colon2 >> axis.count;
    // N is a whole number, all of it: "1e6" or "3.5" are not read as their first digits.
    const bool whole = rest && (rest >> std::ws).eof();
    if (!whole || colon1 != ':' || colon2 != ':' || axis.count < 1 ||
        axis.count > most_sweep_values || !std::isfinite(axis.from) || !std::isfinite(axis.to)) {
        *error = fmt::format("{}: expected KEY=FROM:TO:N with N a whole number from 1 to {}", text,
                             most_sweep_values);
        return std::nullopt;
    }
    return axis;
}

std::optional<Shard> parse_shard(const std::string& text) {
    // Two whole numbers and the slash, nothing else ("-1/3" would wrap round, "1/3x" be cut).
    const auto slash = text.find('/');
    const auto digits = [](std::string_view part) {
        return !part.empty() && part.size() <= 9 &&
               std::all_of(part.begin(), part.end(), [](char c) { return c >= '0' && c <= '9'; });
    };
    if (slash == std::string::npos || !digits(std::string_view(text).substr(0, slash)) ||
        !digits(std::string_view(text).substr(slash + 1)))
        return std::nullopt;
    Shard shard;
    shard.index = std::stoul(text.substr(0, slash));
    shard.count = std::stoul(text.substr(slash + 1));
    if (shard.count == 0 || shard.index >= shard.count)
        return std::nullopt;
    return shard;
}

}  // namespace ds
