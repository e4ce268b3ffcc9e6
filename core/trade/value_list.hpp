#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace ds {

/// A list of values as a user types it: numbers and FROM:TO:N ranges (N values evenly from FROM
/// to TO), separated by commas or spaces ("5000, 5600", "5000:6500:7"). Empty text is an empty
/// list. Returns the values, or nothing with the reason in `error`.
std::optional<std::vector<double>> parse_value_list(std::string_view text, std::string* error);

}  // namespace ds
