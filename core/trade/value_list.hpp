#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "trade/sweep.hpp"

namespace ds {

/// A list of values as a user types it: numbers and FROM:TO:N ranges (N values evenly from FROM
/// to TO), separated by commas or spaces ("5000, 5600", "5000:6500:7"). Empty text is an empty
/// list. Returns the values, or nothing with the reason in `error`.
std::optional<std::vector<double>> parse_value_list(std::string_view text, std::string* error);

/// A swept key as a user types it: "KEY=FROM:TO:N" (N at least 1). Returns the axis, or nothing
/// with the reason in `error` ("TEXT: expected KEY=FROM:TO:N").
std::optional<SweepAxis> parse_sweep_axis(const std::string& text, std::string* error);

/// A slice of a campaign as a user types it: "I/N" with 0 <= I < N.
struct Shard {
    std::size_t index = 0;
    std::size_t count = 1;
};
std::optional<Shard> parse_shard(const std::string& text);

}  // namespace ds
