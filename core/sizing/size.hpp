#pragma once

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// Sizes a design read by read_design: flies it, estimates what it can, and checks it.
/// Never throws for a design that was read: a design that cannot be flown comes back with
/// `converged` false or failing checks that say why, with numbers.
Results size_design(const Design& design);

}  // namespace ds
