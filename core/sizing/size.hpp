#pragma once

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// What a sizing computes besides the sizing itself; trade studies that fly thousands of
/// cases turn off what they do not read.
struct SizingOptions {
    bool capability = true;  ///< the highest feasible site elevation (a root-finding)
    bool history = true;     ///< the trajectory samples
    /// Every number of the results checked finite (the `finite_figures` check; a walk of the
    /// results document without its history and the history sample by sample, some 50 us a sizing);
    /// off, the key figures alone: for trade cases, which keep the key figures and nothing else.
    bool every_figure_checked = true;
    /// Judged only, the limit checks carry no messages: for trade cases that keep which checks
    /// fail and nothing they say (a dispersion's).
    Wording check_wording = Wording::words;
};

/// Sizes a design read by read_design: flies it, estimates what it can, and checks it.
/// Never throws for a design that was read: a design that cannot be flown comes back with
/// `converged` false or failing checks that say why, with numbers.
Results size_design(const Design& design, SizingOptions options = {});

/// The design as the vehicle it sizes to: the entry mass, the heat-shield, backshell,
/// parachute and decelerator masses and every sized diameter fixed at their sized values, so
/// that flying it again under other conditions (a dispersion) flies the same vehicle.
Design freeze_design(const Design& design);

}  // namespace ds
