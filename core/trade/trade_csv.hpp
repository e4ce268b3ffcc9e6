#pragma once

#include <string>
#include <vector>

#include "trade/corridor.hpp"
#include "trade/dispersion.hpp"
#include "trade/optimise.hpp"
#include "trade/sensitivity.hpp"
#include "trade/sweep.hpp"

namespace ds {

/// Trade results as CSV (RFC 4180: a header row, commas, text quoted when it needs it, "."
/// decimals, numbers to 9 significant digits, an empty field where there is no number). The
/// command line and the window write the same files.

/// One row per case: the varied keys, the key figures, the worst check's status and id, the
/// feasibility margin and the check that sets it.
std::string sweep_csv(const std::vector<SweepAxis>& axes, const std::vector<SweepCase>& cases);

/// One row per dispersed case: its index, the drawn value of each dispersed key, the key
/// figures, whether it succeeded and the checks that failed (separated by ";").
std::string campaign_csv(const DispersionCampaign& campaign);
/// Its header line, and one case's line: the parts of campaign_csv, for writing the cases as
/// they come.
std::string campaign_csv_head(const DispersionCampaign& campaign);
std::string case_csv_row(const DispersionCampaign& campaign, const DispersedCase& dispersed);

/// The names of campaign_csv's columns: "case", each dispersed key, each key figure,
/// "landing_latitude_deg", "landing_longitude_deg", "landing_downrange_m",
/// "landing_crossrange_m", "success" and "failed_checks" (the Python module's columns too).
std::vector<std::string> campaign_column_names(const DispersionCampaign& campaign);

/// One row per key figure: count, mean, standard deviation and the 1st, 50th, 99th percentiles.
std::string summary_csv(const DispersionSummary& summary);

/// One row per key figure, one column per input: d ln F / d ln x.
std::string sensitivity_csv(const SensitivityTable& table);

/// One row per speed of an entry corridor: the speed key's value and the interface speed in
/// both frames, each bound (in the design's key and in both frames, the check that binds it and
/// whether it closed), the width, and with dispersions the success probability at the shallow
/// bound, the centre and the steep bound.
std::string corridor_csv(const EntryCorridor& corridor);

/// One row per sizing of an optimisation, in each start's order: the start, the value of each
/// varied key, the figure, the feasibility margin and whether it passed.
std::string optimisation_csv(const Optimisation& optimisation);

}  // namespace ds
