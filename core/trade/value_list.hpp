#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "trade/sweep.hpp"

namespace ds {

/// A list of values as a user types it: numbers and FROM:TO:N ranges (N values evenly from FROM
/// to TO, N a whole number from 1 to most_sweep_values), separated by commas or spaces ("5000,
/// 5600", "5000:6500:7"). Empty text is an empty list. Returns the values, or nothing with the
/// reason in `error`.
std::optional<std::vector<double>> parse_value_list(std::string_view text, std::string* error);

/// The most values one swept key takes (our bound: a 1000 x 1000 map is a million sizings, some
/// twenty minutes on two cores; each case's results are kept).
inline constexpr int most_sweep_values = 1000;

/// A swept key as a user types it: "KEY=FROM:TO:N" (N a whole number from 1 to
/// most_sweep_values). Returns the axis, or nothing with the reason in `error` ("TEXT: expected
/// KEY=FROM:TO:N ...").
std::optional<SweepAxis> parse_sweep_axis(const std::string& text, std::string* error);

/// A slice of a campaign as a user types it: "I/N" with 0 <= I < N.
struct Shard {
    std::size_t index = 0;
    std::size_t count = 1;
};
std::optional<Shard> parse_shard(const std::string& text);

}  // namespace ds
