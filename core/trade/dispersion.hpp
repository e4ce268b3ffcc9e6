#pragma once

#include <cstdint>
#include <filesystem>
#include <functional>
#include <istream>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "design/design.hpp"
#include "progress.hpp"
#include "trade/landing_ellipse.hpp"

namespace ds {

struct DispersedCase;
struct DispersionCampaign;
class SummaryTally;

/// The most cases a campaign flies (the command line's --runs) or a campaign's document may
/// hold.
constexpr std::size_t most_dispersed_runs = 100'000'000;

/// How a dispersion campaign runs: how many cases, from which seed, which slice of them, and
/// what it keeps of them.
struct DispersionSettings {
    std::size_t runs = 0;
    std::uint64_t seed = 0;
    std::size_t shard_index = 0;  ///< this run flies cases i with i % shard_count == shard_index
    std::size_t shard_count = 1;
    unsigned threads = 0;  ///< 0: one per core
    Progress* progress = nullptr;
    /// Keep every case in the campaign; without, the campaign comes back without its cases
    /// and what is wanted of them goes to `tally` and `on_case`.
    bool keep_cases = true;
    /// Each case is added to it, in the order of its index, as it is done.
    SummaryTally* tally = nullptr;
    /// Each case, in the order of its index, as it is done, with the campaign (its cases
    /// left out) it belongs to: for writing the cases as they come.
    std::function<void(const DispersionCampaign&, const DispersedCase&)> on_case;
};

/// Where a dispersed case came down (results.landing).
struct CaseLanding {
    double latitude_deg = 0.0;
    double longitude_deg = 0.0;
    double downrange_m = 0.0;
    double crossrange_m = 0.0;
};

/// One dispersed case: its draws and what it gave.
struct DispersedCase {
    std::size_t index = 0;
    std::vector<double> draws;                   ///< one per dispersion, in the design's order
    std::vector<std::optional<double>> figures;  ///< one per key figure of the campaign
    bool success = false;                        ///< read, and no check failed
    std::vector<std::string> failed_checks;
    std::string error;                   ///< the reader's, when the drawn design could not be read
    std::optional<CaseLanding> landing;  ///< empty when it did not come down
};

/// A campaign, or a shard of one: enough to merge shards and to summarise.
struct DispersionCampaign {
    std::uint64_t seed = 0;
    std::size_t runs = 0;
    std::size_t shard_index = 0;
    std::size_t shard_count = 1;
    std::vector<DispersionDesign> dispersions;
    std::vector<std::string> figure_ids;
    std::vector<std::string> figure_units;
    double body_radius_m = 0.0;  ///< of the flown body: the landing points' sphere
    /// The digest of the frozen design flown (design_digest): shards of one campaign share it.
    std::string design_digest;
    /// Read with a campaign's document: the digest it gives of its case rows (CaseDigest).
    std::string cases_digest;
    std::vector<DispersedCase> cases;  ///< by index
};

/// A digest of text: 64-bit FNV-1a (Fowler, Noll and Vo), as 16 hexadecimal digits. It tells
/// a part of one campaign from a part of another, and a row changed by hand from the row
/// written; it is no defence against someone who recomputes it.
class TextDigest {
public:
    void add(std::string_view text);
    std::string hex() const;

private:
    std::uint64_t state_ = 0xcbf29ce484222325ULL;
};

/// The digest of a design: of its document (design_to_json) as the reader would read it.
std::string design_digest(const Design& design);

/// The digest of a campaign's case rows, added in the order they are written: of each row's
/// JSON text (case_to_json(...).dump()) and a line end.
class CaseDigest {
public:
    void add(const DispersedCase& c);
    std::string hex() const { return digest_.hex(); }

private:
    TextDigest digest_;
};

/// Flies the design's dispersions: the nominal vehicle is frozen (freeze_design) and flown
/// `runs` times with its dispersed keys drawn from a generator seeded per case from the seed and
/// the case's index, so the same seed gives the same numbers whatever the threads or shards.
/// Returns the campaign, or, when a dispersion names a key the design has no number at, that
/// error.
std::pair<std::optional<DispersionCampaign>, std::string> run_dispersions(
    const Design& design, const std::filesystem::path& base_directory,
    const DispersionSettings& settings);

/// The shards of one campaign put back together: the same seed, runs and dispersions, every
/// case once. Returns the campaign or why the parts do not belong together.
std::pair<std::optional<DispersionCampaign>, std::string> merge_campaigns(
    const std::vector<DispersionCampaign>& parts);

/// Why these parts' heads (their cases not looked at) are not shards of one campaign, each
/// once, with every shard there: the same seed, runs, dispersions, figures, body and frozen
/// design, each of N shards once. Empty when they are.
std::string shards_problem(const std::vector<DispersionCampaign>& heads);

/// The cases of one shard as they are read, in any order: each must belong to the shard, once.
class ShardCases {
public:
    explicit ShardCases(const DispersionCampaign& head);

    /// Why this case cannot be the shard's next one read (not of the shard, given already, not
    /// one draw per dispersion and one value per figure); empty when it is taken.
    std::string add(const DispersedCase& c);
    /// Why the cases read are not the whole shard (how many of its cases it holds); empty
    /// when they are.
    std::string missing() const;

private:
    std::size_t runs_;
    std::size_t shard_index_;
    std::size_t shard_count_;
    std::size_t draws_;
    std::size_t figures_;
    std::vector<bool> seen_;  ///< by the case's place in the shard
    std::size_t count_ = 0;
};

/// How many cases a shard of the campaign flies.
std::size_t shard_size(const DispersionCampaign& head);

struct FigureStatistics {
    std::string id;
    std::string unit;
    std::size_t count = 0;  ///< cases that produced the figure
    double mean = 0.0;
    double standard_deviation = 0.0;  ///< sample (n - 1)
    double p01 = 0.0, p50 = 0.0, p99 = 0.0;
};

struct DispersionSummary {
    std::size_t runs = 0;
    std::size_t successes = 0;
    double success_probability = 0.0;
    double wilson_low = 0.0, wilson_high = 0.0;  ///< 95 % interval
    std::vector<FigureStatistics> figures;
    std::vector<std::pair<std::string, std::size_t>> failing_checks;  ///< most frequent first
    /// Of the cases that came down (successful or not), when two or more did.
    std::optional<LandingEllipse> landing_ellipse;
};

/// What the summary needs of the cases of a campaign, added one by one: the counts, each key
/// figure's values and the landing points (some 160 bytes a case for the 18 key figures,
/// against some 850 for a whole case), so the summary of a campaign that keeps no cases is the
/// same, number for number, as that of its cases.
class SummaryTally {
public:
    explicit SummaryTally(std::size_t figures = 0) : values_(figures) {}

    /// Room for this many cases, so the values are not copied as they grow.
    void reserve(std::size_t cases);

    /// Cases may come in any order: the summary is the same, number for number.
    void add(const DispersedCase& c);

    /// The statistics of the cases added, with the campaign's figures and body and the landing
    /// ellipse of the given probability.
    DispersionSummary summary(const DispersionCampaign& campaign, double ellipse_probability) const;

private:
    std::size_t runs_ = 0;
    std::size_t successes_ = 0;
    std::map<std::string, std::size_t> failures_;
    std::vector<std::vector<double>> values_;  ///< per figure, of the cases that gave it
    std::vector<std::pair<std::size_t, GroundPoint>> landings_;  ///< with the case's index
};

/// The statistics of a campaign, with the landing ellipse of the given probability.
DispersionSummary summarize(const DispersionCampaign& campaign,
                            double ellipse_probability = default_ellipse_probability);

/// Wilson score interval of a proportion (Wilson, J. American Statistical Association 22,
/// 1927): 95 % with the default z.
std::pair<double, double> wilson_interval(std::size_t successes, std::size_t trials,
                                          double z = 1.959963984540054);

/// The q-quantile of sorted values, linear between order statistics (Hyndman and Fan's
/// type 7, the common default).
double quantile(const std::vector<double>& sorted, double q);

nlohmann::ordered_json campaign_to_json(const DispersionCampaign& campaign);
/// The campaign's document without its "cases", and one case's entry of them: the parts of
/// campaign_to_json, for writing the cases as they come.
nlohmann::ordered_json campaign_head_to_json(const DispersionCampaign& campaign);
nlohmann::ordered_json case_to_json(const DispersedCase& dispersed);
std::optional<DispersionCampaign> campaign_from_json(const nlohmann::ordered_json& json,
                                                     std::string* error);
/// Why a part's digests do not vouch for it: none written (a part written before they were
/// kept), or its rows as read (their CaseDigest, `rows_digest`) disagree with the digest written.
/// Empty when they agree. For merge's readers of a part, in memory and streamed.
std::string part_digest_problem(const DispersionCampaign& head, const std::string& rows_digest);
/// A campaign's head read from its document ("cases" not read), or why it is not one.
std::optional<DispersionCampaign> campaign_head_from_json(const nlohmann::ordered_json& json,
                                                          std::string* error);
/// One case read from its entry of a campaign's "cases", or why it is not one.
std::optional<DispersedCase> case_from_json(const nlohmann::ordered_json& json, std::string* error);

/// Reads a campaign's document (what `disperse --json` writes, or the campaign alone) from a
/// stream without holding its cases: each is read, checked in its place in the shard
/// (case_place_problem) and handed to `on_case` (when given) as soon as it is whole; at the end
/// the rows' digest is checked against the document's. Returns the campaign without its cases
/// (its cases_digest that of the rows read), or why the document is not a whole campaign: empty,
/// cut short, a row changed, a case missing. Memory does not grow with the cases.
std::optional<DispersionCampaign> read_campaign(
    std::istream& in, const std::function<void(const DispersedCase&)>& on_case, std::string* error);
/// The same from a file, which must be a regular file (a pipe or a device is refused before it
/// is opened, saying so).
std::optional<DispersionCampaign> read_campaign_file(
    const std::filesystem::path& file, const std::function<void(const DispersedCase&)>& on_case,
    std::string* error);
nlohmann::ordered_json summary_to_json(const DispersionSummary& summary);

}  // namespace ds
