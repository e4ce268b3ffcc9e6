#pragma once

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

struct Evaluation;

/// What a sizing computes besides the sizing itself; trade studies that fly thousands of
/// cases turn off what they do not read.
struct SizingOptions {
    bool capability = true;  ///< the highest feasible site elevation (a root-finding)
    bool history = true;     ///< the trajectory samples
    /// Every number of the results checked finite (the `finite_figures` check; a walk of the
    /// results document without its history and the history sample by sample, some 50 us a sizing);
    /// off, the key figures alone: for trade cases, which keep the key figures and nothing else.
    bool every_figure_checked = true;
    /// Judged only, the checks carry no messages (the limits' and the flight's own): for trade
    /// cases that keep which checks fail and nothing they say (a dispersion's).
    Wording check_wording = Wording::words;
    /// The results' notes and the timeline's events (each placed on the ground track): off for
    /// trade cases that keep the key figures, the landing point and which checks fail, and
    /// nothing a reader reads there (a dispersion's). The timeline's margin is kept.
    bool notes_and_timeline = true;
    /// An evaluation of the vehicle this design disperses (its entry mass fixed), whose solves
    /// guide this sizing's: a powered descent's throttle solve starts from what the nominal's
    /// measured of its closed form's error (evaluate's `previous`). For a dispersion's cases.
    const Evaluation* guide = nullptr;
    /// A dispersion's case, its entry mass fixed: the terminal burn is solved as a case's
    /// (Precision::dispersed), to looser tolerances than the design's 1e-6 s.
    bool dispersed_case = false;
};

/// Sizes a design read by read_design: flies it, estimates what it can, and checks it.
/// Never throws for a design that was read: a design that cannot be flown comes back with
/// `converged` false or failing checks that say why, with numbers.
Results size_design(const Design& design, SizingOptions options = {});

/// The design as the vehicle it sizes to: the entry mass, the heat-shield, backshell,
/// parachute and decelerator masses and every sized diameter fixed at their sized values, so
/// that flying it again under other conditions (a dispersion) flies the same vehicle. With
/// `sized`, the evaluation it froze is kept there: the nominal flight that guides the dispersed
/// cases' sizings (SizingOptions::guide).
Design freeze_design(const Design& design, Evaluation* sized = nullptr);

}  // namespace ds
