#pragma once

// What the sizing suites share: a design's flight at the entry mass its sizing closes on, and a
// dispersion's cases of a shipped sample, frozen as a dispersion freezes it and flown at a
// precision (tests/core includes it as "support/sized_flights.hpp").

#include <string>

#include <doctest/doctest.h>

#include "sizing/environment.hpp"
#include "sizing/evaluation.hpp"
#include "sizing/size.hpp"
#include "support/samples.hpp"

namespace ds::test {

/// The design's evaluation, without history, at the entry mass its sizing closes on (the
/// sizing without the site search or history), flown in `model` (the design's environment's).
inline Evaluation flight_at_sized_mass(const Design& design, const FlightModel& model) {
    const Results sized = size_design(design, {.capability = false, .history = false});
    return evaluate(design, model, sized.entry.mass_kg, false);
}

/// A shipped sample frozen as a dispersion freezes it (freeze_design), with the nominal flight
/// it was frozen from, which guides the dispersion's cases.
struct FrozenSample {
    Evaluation nominal;
    Design frozen;

    explicit FrozenSample(const std::string& name)
        : frozen(freeze_design(sample(name), &nominal)) {}
};

/// A case of a frozen design (its entry mass fixed), flown without history at `precision`,
/// guided by `guide` when given.
inline Evaluation fly_case(const Design& design, Precision precision,
                           const Evaluation* guide = nullptr) {
    REQUIRE(design.mass.entry_kg);
    const FlightEnvironment environment = make_environment(design);
    return evaluate(design, environment.model(), *design.mass.entry_kg, false, precision, guide);
}

}  // namespace ds::test
