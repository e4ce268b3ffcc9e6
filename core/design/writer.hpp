#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "design/design.hpp"

namespace ds {

/// The design document for a design: read_design(write_design(d)) gives d's values back.
nlohmann::ordered_json design_to_json(const Design& design);
std::string write_design(const Design& design);

}  // namespace ds
