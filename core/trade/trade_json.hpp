#pragma once

#include <vector>

#include <nlohmann/json.hpp>

#include "trade/corridor.hpp"
#include "trade/dispersion.hpp"
#include "trade/optimise.hpp"
#include "trade/sensitivity.hpp"
#include "trade/sweep.hpp"

namespace ds {

/// Trade results as JSON documents: what the command line's --json prints and the Python
/// module returns, built once here. (A dispersion campaign's own document, which merge
/// reads, is campaign_to_json in trade/dispersion.hpp.)

/// {"rows": [...]}: per case its inputs by key, the results' entry, parachute, terminal, mass
/// (without its items) and capability sections, the worst check and the feasibility margin; a
/// case the reader refused carries its error instead.
nlohmann::ordered_json sweep_to_json(const std::vector<SweepAxis>& axes,
                                     const std::vector<SweepCase>& cases);

/// {"summary": ..., "campaign": ...}: a campaign (a run, a shard or merged shards) with its
/// statistics.
nlohmann::ordered_json campaign_document(const DispersionCampaign& campaign,
                                         const DispersionSummary& summary);

/// The relative step, the inputs, the figures and the matrix d(ln figure)/d(ln input) (a row
/// per figure, null where it could not be computed).
nlohmann::ordered_json sensitivity_to_json(const SensitivityTable& table);

/// The corridor's keys and frame, and a row per speed with both bounds, what binds them and,
/// with dispersions, the success at each bound and at the centre.
nlohmann::ordered_json corridor_to_json(const EntryCorridor& corridor);

/// The objective, each key's bounds, design value, optimum and sensitivity there, whether a
/// passing design was found, the figure at the design and at the optimum, what binds, the keys
/// held at a bound, what still failed (when nothing passed), the sizings, and the optimum's
/// design document.
nlohmann::ordered_json optimisation_to_json(const Optimisation& optimisation);

}  // namespace ds
