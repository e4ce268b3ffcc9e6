#pragma once

#include <memory>

#include "atmosphere/atmosphere.hpp"
#include "design/design.hpp"

namespace ds {

/// The gas of the design's atmosphere: its own gas constant and gamma where the design gives
/// them, else the body's.
double design_gas_constant(const Design& design);
double design_gamma(const Design& design);

/// The atmosphere a design flies in. A design read by read_design always gives one; throws
/// std::invalid_argument for a design that was not (e.g. a "standard" model on a custom body).
std::unique_ptr<Atmosphere> make_atmosphere(const Design& design);

}  // namespace ds
