#include "trade/dispersion.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <mutex>
#include <numeric>
#include <tuple>

#include <fmt/format.h>

#include "constants.hpp"
#include "design/writer.hpp"
#include "json_values.hpp"
#include "numerics/lazy_mt19937_64.hpp"
#include "results/key_figures.hpp"
#include "sizing/evaluation.hpp"
#include "sizing/size.hpp"
#include "trade/design_variants.hpp"
#include "trade/parallel.hpp"

namespace ds {
namespace {

/// SplitMix64 (Steele, Lea and Flood, OOPSLA 2014): spreads (seed, index) into a well-mixed
/// 64-bit seed for the case's own generator.
std::uint64_t split_mix(std::uint64_t x) {
    x += 0x9E3779B97F4A7C15ULL;
    x = (x ^ (x >> 30)) * 0xBF58476D1CE4E5B9ULL;
    x = (x ^ (x >> 27)) * 0x94D049BB133111EBULL;
    return x ^ (x >> 31);
}

/// A uniform draw in (0, 1) from a 64-bit generator, its top 53 bits.
double unit_uniform(LazyMt19937_64& engine) {
    return (static_cast<double>(engine() >> 11) + 0.5) * (1.0 / 9007199254740992.0);
}

/// A standard normal draw by Box-Muller, written here so the numbers do not depend on the
/// standard library's distribution implementation.
double standard_normal(LazyMt19937_64& engine) {
    const double u1 = unit_uniform(engine);
    const double u2 = unit_uniform(engine);
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * pi * u2);
}

bool same_dispersions(const std::vector<DispersionDesign>& a,
                      const std::vector<DispersionDesign>& b) {
    if (a.size() != b.size())
        return false;
    for (std::size_t i = 0; i < a.size(); ++i) {
        if (a[i].key != b[i].key || a[i].distribution != b[i].distribution ||
            a[i].sigma != b[i].sigma || a[i].min != b[i].min || a[i].max != b[i].max) {
            return false;
        }
    }
    return true;
}

/// The mean and sample standard deviation of sorted finite values, summed in their sorted
/// order. Figures near the largest double (a sum of two of 1.7e308 is infinite) are summed
/// scaled by the largest magnitude instead, so a mean of finite values is finite.
std::pair<double, double> mean_and_deviation(const std::vector<double>& sorted) {
    const double n = static_cast<double>(sorted.size());
    // A figure every case shares (a frozen diameter) has that mean and no spread, not the
    // rounding of a sum of equal values.
    if (sorted.front() == sorted.back())
        return {sorted.front(), 0.0};
    const auto spread = [&](double scale) {
        double sum = 0.0;
        for (const double v : sorted)
            sum += v / scale;
        const double mean = sum / n;
        double squares = 0.0;
        for (const double v : sorted)
            squares += (v / scale - mean) * (v / scale - mean);
        return std::pair{mean * scale,
                         sorted.size() > 1 ? std::sqrt(squares / (n - 1.0)) * scale : 0.0};
    };
    const auto plain = spread(1.0);
    if (std::isfinite(plain.first) && std::isfinite(plain.second))
        return plain;
    return spread(std::max(std::abs(sorted.front()), std::abs(sorted.back())));
}

}  // namespace

void TextDigest::add(std::string_view text) {
    for (const char c : text) {
        state_ ^= static_cast<unsigned char>(c);
        state_ *= 0x100000001b3ULL;
    }
}

std::string TextDigest::hex() const {
    return fmt::format("{:016x}", state_);
}

std::string design_digest(const Design& design) {
    TextDigest digest;
    digest.add(design_to_json(design).dump());
    return digest.hex();
}

void CaseDigest::add(const DispersedCase& c) {
    digest_.add(case_to_json(c).dump());
    digest_.add("\n");
}

std::pair<std::optional<DispersionCampaign>, std::string> run_dispersions(
    const Design& design, const std::filesystem::path& base_directory,
    const DispersionSettings& settings) {
    // The nominal vehicle's flight guides each case's solves (a case is a small change of it).
    Evaluation nominal_flight;
    const Design frozen = freeze_design(design, &nominal_flight);
    const DesignVariants variants = DesignVariants::of(frozen, base_directory);
    std::vector<double> nominal;
    std::vector<std::string> keys;
    for (const DispersionDesign& d : design.dispersions) {
        keys.push_back(d.key);
        const auto value = variants.value(d.key);
        if (!value)
            return {std::nullopt,
                    fmt::format("dispersions: {} is not a number of the design", d.key)};
        nominal.push_back(*value);
    }
    const DesignVariants::Keys drawn = variants.prepare(std::move(keys));

    DispersionCampaign campaign;
    campaign.seed = settings.seed;
    campaign.runs = settings.runs;
    campaign.shard_index = settings.shard_index;
    campaign.shard_count = std::max<std::size_t>(settings.shard_count, 1);
    campaign.dispersions = design.dispersions;
    campaign.body_radius_m = design.body.body.radius_m;
    campaign.design_digest = design_digest(frozen);
    for (const KeyFigureDefinition& f : key_figure_table) {
        campaign.figure_ids.emplace_back(f.id);
        campaign.figure_units.emplace_back(f.unit);
    }
    std::vector<std::size_t> indices;
    for (std::size_t i = campaign.shard_index; i < settings.runs; i += campaign.shard_count) {
        indices.push_back(i);
    }
    const auto fly_case = [&](DispersedCase& c) {
        LazyMt19937_64 engine(split_mix(settings.seed ^ split_mix(c.index)));
        for (std::size_t j = 0; j < design.dispersions.size(); ++j) {
            const DispersionDesign& d = design.dispersions[j];
            const double draw = d.distribution == DistributionKind::normal
                                    ? nominal[j] + d.sigma * standard_normal(engine)
                                    : d.min + (d.max - d.min) * unit_uniform(engine);
            c.draws.push_back(draw);
        }
        const DesignReadResult read = variants.with(drawn, c.draws);
        if (!read.ok()) {
            c.error = read.errors.front().text();
            return;
        }
        const Results r = size_design(*read.design, {.capability = false,
                                                     .history = false,
                                                     .every_figure_checked = false,
                                                     .check_wording = Wording::judged_only,
                                                     .notes_and_timeline = false,
                                                     .guide = &nominal_flight,
                                                     .dispersed_case = true});
        c.figures = key_figure_values(r);
        if (r.landing) {
            c.landing = CaseLanding{r.landing->latitude_deg, r.landing->longitude_deg,
                                    r.landing->downrange_m, r.landing->crossrange_m};
        }
        for (const Check& check : r.checks) {
            if (check.status == CheckStatus::fail)
                c.failed_checks.push_back(check.id);
        }
        c.success = c.failed_checks.empty();
    };

    // Cases finish out of order on the pool: each waits in `done` until those before it are
    // handed on, so the tally and the writer see them in the order of their index.
    std::mutex handing;
    std::map<std::size_t, DispersedCase> done;
    std::size_t next_to_hand = 0;
    const auto hand_on = [&](std::size_t k, DispersedCase c) {
        const std::lock_guard lock(handing);
        done.emplace(k, std::move(c));
        for (auto it = done.begin(); it != done.end() && it->first == next_to_hand;
             it = done.erase(it), ++next_to_hand) {
            if (settings.tally)
                settings.tally->add(it->second);
            if (settings.on_case)
                settings.on_case(campaign, it->second);
            if (settings.keep_cases)
                campaign.cases.push_back(std::move(it->second));
        }
    };

    parallel_for(indices.size(), settings.threads, settings.progress, [&](std::size_t k) {
        DispersedCase c;
        c.index = indices[k];
        fly_case(c);
        hand_on(k, std::move(c));
    });
    return {std::move(campaign), {}};
}

std::size_t shard_size(const DispersionCampaign& head) {
    const std::size_t count = std::max<std::size_t>(head.shard_count, 1);
    return head.shard_index >= head.runs ? 0 : (head.runs - head.shard_index + count - 1) / count;
}

ShardCases::ShardCases(const DispersionCampaign& head)
    : runs_(head.runs),
      shard_index_(head.shard_index),
      shard_count_(std::max<std::size_t>(head.shard_count, 1)),
      draws_(head.dispersions.size()),
      figures_(head.figure_ids.size()),
      seen_(shard_size(head), false) {}

std::string ShardCases::add(const DispersedCase& c) {
    if (c.index >= runs_ || c.index % shard_count_ != shard_index_) {
        return fmt::format("case {} is not of shard {}/{} of {} runs", c.index, shard_index_,
                           shard_count_, runs_);
    }
    if (seen_[c.index / shard_count_])
        return fmt::format("case {} is repeated", c.index);
    if (c.draws.size() != draws_ || c.figures.size() != figures_) {
        return fmt::format("case {} has not one draw per dispersion and one value per figure",
                           c.index);
    }
    seen_[c.index / shard_count_] = true;
    ++count_;
    return {};
}

std::string ShardCases::missing() const {
    if (count_ == seen_.size())
        return {};
    for (std::size_t k = 0; k < seen_.size(); ++k) {
        if (!seen_[k]) {
            return fmt::format("case {} is missing: shard {}/{} holds {} of its {} cases",
                               shard_index_ + k * shard_count_, shard_index_, shard_count_, count_,
                               seen_.size());
        }
    }
    return {};
}

std::string shards_problem(const std::vector<DispersionCampaign>& heads) {
    if (heads.empty())
        return "nothing to merge";
    const DispersionCampaign& first = heads.front();
    std::vector<bool> present(first.shard_count, false);
    for (const DispersionCampaign& part : heads) {
        if (part.design_digest.empty() || part.cases_digest.empty())
            return "a part has " + part_digest_problem(part, {});
        if (part.seed != first.seed || part.runs != first.runs ||
            !same_dispersions(part.dispersions, first.dispersions) ||
            part.figure_ids != first.figure_ids || part.body_radius_m != first.body_radius_m ||
            part.shard_count != first.shard_count) {
            return "the parts are not shards of one campaign (seed, runs, dispersions, figures or "
                   "shard count differ)";
        }
        if (part.design_digest != first.design_digest) {
            return "the parts are not shards of one campaign: they fly different designs (their "
                   "design digests differ)";
        }
        if (part.shard_index >= part.shard_count)
            return fmt::format("shard {}/{} is no shard", part.shard_index, part.shard_count);
        if (present[part.shard_index]) {
            return fmt::format("shard {}/{} is given twice", part.shard_index, part.shard_count);
        }
        present[part.shard_index] = true;
    }
    for (std::size_t i = 0; i < present.size(); ++i) {
        if (!present[i] && i < first.runs) {
            return fmt::format("case {} is missing: shard {}/{} is not among the parts", i, i,
                               first.shard_count);
        }
    }
    return {};
}

std::pair<std::optional<DispersionCampaign>, std::string> merge_campaigns(
    const std::vector<DispersionCampaign>& parts) {
    if (std::string problem = shards_problem(parts); !problem.empty())
        return {std::nullopt, std::move(problem)};
    for (const DispersionCampaign& part : parts) {
        ShardCases shard(part);
        for (const DispersedCase& c : part.cases) {
            if (std::string problem = shard.add(c); !problem.empty())
                return {std::nullopt, std::move(problem)};
        }
        if (std::string problem = shard.missing(); !problem.empty())
            return {std::nullopt, std::move(problem)};
    }
    DispersionCampaign merged = parts.front();
    merged.shard_index = 0;
    merged.shard_count = 1;
    merged.cases.clear();
    for (const DispersionCampaign& part : parts)
        merged.cases.insert(merged.cases.end(), part.cases.begin(), part.cases.end());
    std::sort(merged.cases.begin(), merged.cases.end(),
              [](const DispersedCase& a, const DispersedCase& b) { return a.index < b.index; });
    CaseDigest digest;
    for (const DispersedCase& c : merged.cases)
        digest.add(c);
    merged.cases_digest = digest.hex();
    return {std::move(merged), {}};
}

std::pair<double, double> wilson_interval(std::size_t successes, std::size_t trials, double z) {
    if (trials == 0)
        return {0.0, 1.0};
    const double n = static_cast<double>(trials);
    const double p = static_cast<double>(successes) / n;
    const double z2 = z * z;
    const double centre = (p + z2 / (2.0 * n)) / (1.0 + z2 / n);
    const double half = z / (1.0 + z2 / n) * std::sqrt(p * (1.0 - p) / n + z2 / (4.0 * n * n));
    return {centre - half, centre + half};
}

double quantile(const std::vector<double>& sorted, double q) {
    if (sorted.empty())
        return 0.0;
    const double h = (static_cast<double>(sorted.size()) - 1.0) * q;
    const auto lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
    return sorted[lo] + (h - static_cast<double>(lo)) * (sorted[hi] - sorted[lo]);
}

void SummaryTally::reserve(std::size_t cases) {
    for (std::vector<double>& values : values_)
        values.reserve(cases);
    landings_.reserve(cases);
}

void SummaryTally::add(const DispersedCase& c) {
    ++runs_;
    successes_ += c.success ? 1 : 0;
    for (const std::string& id : c.failed_checks)
        ++failures_[id];
    if (!c.error.empty())
        ++failures_["design_unreadable"];
    for (std::size_t f = 0; f < values_.size(); ++f) {
        if (f < c.figures.size() && c.figures[f])
            values_[f].push_back(*c.figures[f]);
    }
    if (c.landing) {
        landings_.push_back({c.index,
                             {degrees_to_radians(c.landing->latitude_deg),
                              degrees_to_radians(c.landing->longitude_deg)}});
    }
}

DispersionSummary SummaryTally::summary(const DispersionCampaign& campaign,
                                        double ellipse_probability) const {
    DispersionSummary s;
    s.runs = runs_;
    s.successes = successes_;
    s.success_probability =
        s.runs ? static_cast<double>(s.successes) / static_cast<double>(s.runs) : 0.0;
    std::tie(s.wilson_low, s.wilson_high) = wilson_interval(s.successes, s.runs);
    for (std::size_t f = 0; f < campaign.figure_ids.size(); ++f) {
        std::vector<double> values = f < values_.size() ? values_[f] : std::vector<double>{};
        FigureStatistics st{campaign.figure_ids[f], campaign.figure_units[f], values.size()};
        if (!values.empty()) {
            std::sort(values.begin(), values.end());
            std::tie(st.mean, st.standard_deviation) = mean_and_deviation(values);
            st.p01 = quantile(values, 0.01);
            st.p50 = quantile(values, 0.50);
            st.p99 = quantile(values, 0.99);
        }
        s.figures.push_back(st);
    }
    // The ellipse's sums run in the order of the cases' index, whatever order they came in (a
    // merge reads its parts one after the other).
    std::vector<std::pair<std::size_t, GroundPoint>> by_index = landings_;
    std::sort(by_index.begin(), by_index.end(),
              [](const auto& a, const auto& b) { return a.first < b.first; });
    std::vector<GroundPoint> landings;
    landings.reserve(by_index.size());
    for (const auto& [index, point] : by_index)
        landings.push_back(point);
    s.landing_ellipse = landing_ellipse(landings, campaign.body_radius_m, ellipse_probability);
    s.failing_checks.assign(failures_.begin(), failures_.end());
    std::stable_sort(s.failing_checks.begin(), s.failing_checks.end(),
                     [](const auto& a, const auto& b) { return a.second > b.second; });
    return s;
}

DispersionSummary summarize(const DispersionCampaign& campaign, double ellipse_probability) {
    SummaryTally tally(campaign.figure_ids.size());
    for (const DispersedCase& c : campaign.cases)
        tally.add(c);
    return tally.summary(campaign, ellipse_probability);
}

nlohmann::ordered_json campaign_head_to_json(const DispersionCampaign& c) {
    nlohmann::ordered_json out;
    out["format"] = "descent-sizer/dispersions";
    out["version"] = 1;
    out["seed"] = c.seed;
    out["runs"] = c.runs;
    out["shard"] = {{"index", c.shard_index}, {"count", c.shard_count}};
    nlohmann::ordered_json dispersions = nlohmann::ordered_json::array();
    for (const DispersionDesign& d : c.dispersions) {
        dispersions.push_back(
            {{"key", d.key},
             {"distribution", d.distribution == DistributionKind::normal ? "normal" : "uniform"},
             {"sigma", d.sigma},
             {"min", d.min},
             {"max", d.max}});
    }
    out["dispersions"] = dispersions;
    out["figures"] = c.figure_ids;
    out["units"] = c.figure_units;
    out["body_radius_m"] = c.body_radius_m;
    out["design_digest"] = c.design_digest;
    return out;
}

nlohmann::ordered_json case_to_json(const DispersedCase& k) {
    return {
        {"index", k.index},
        {"draws", k.draws},
        {"figures",
         json::array_of(k.figures, [](const std::optional<double>& f) { return json::number(f); })},
        {"success", k.success},
        {"failed_checks", k.failed_checks},
        {"error", k.error},
        {"landing", k.landing
                        ? nlohmann::ordered_json{k.landing->latitude_deg, k.landing->longitude_deg,
                                                 k.landing->downrange_m, k.landing->crossrange_m}
                        : nlohmann::ordered_json()}};
}

nlohmann::ordered_json campaign_to_json(const DispersionCampaign& c) {
    nlohmann::ordered_json out = campaign_head_to_json(c);
    nlohmann::ordered_json cases = nlohmann::ordered_json::array();
    CaseDigest digest;
    for (const DispersedCase& k : c.cases) {
        cases.push_back(case_to_json(k));
        digest.add(k);
    }
    out["cases"] = cases;
    out["cases_digest"] = digest.hex();
    return out;
}

std::optional<DispersionCampaign> campaign_head_from_json(const nlohmann::ordered_json& j,
                                                          std::string* error) {
    try {
        if (!j.is_object() || !j.contains("format") ||
            j.at("format") != "descent-sizer/dispersions") {
            *error = "not a dispersion campaign (format)";
            return std::nullopt;
        }
        DispersionCampaign c;
        c.seed = j.at("seed").get<std::uint64_t>();
        c.runs = j.at("runs").get<std::size_t>();
        c.shard_index = j.at("shard").at("index").get<std::size_t>();
        c.shard_count = j.at("shard").at("count").get<std::size_t>();
        if (c.runs > most_dispersed_runs) {
            *error =
                fmt::format("not a dispersion campaign: more than {} runs", most_dispersed_runs);
            return std::nullopt;
        }
        if (c.shard_count == 0 || c.shard_index >= c.shard_count ||
            c.shard_count > most_dispersed_runs) {
            *error =
                fmt::format("not a dispersion campaign: shard {}/{}", c.shard_index, c.shard_count);
            return std::nullopt;
        }
        for (const auto& d : j.at("dispersions")) {
            c.dispersions.push_back({d.at("key").get<std::string>(),
                                     d.at("distribution") == "normal" ? DistributionKind::normal
                                                                      : DistributionKind::uniform,
                                     d.at("sigma").get<double>(), d.at("min").get<double>(),
                                     d.at("max").get<double>()});
        }
        c.figure_ids = j.at("figures").get<std::vector<std::string>>();
        c.figure_units = j.at("units").get<std::vector<std::string>>();
        if (c.figure_units.size() != c.figure_ids.size()) {
            *error = "not a dispersion campaign: not one unit per figure";
            return std::nullopt;
        }
        c.body_radius_m = j.value("body_radius_m", 0.0);
        c.design_digest = j.value("design_digest", std::string());
        c.cases_digest = j.value("cases_digest", std::string());
        return c;
    } catch (const nlohmann::ordered_json::exception& e) {
        *error = fmt::format("not a dispersion campaign: {}", e.what());
        return std::nullopt;
    }
}

std::optional<DispersedCase> case_from_json(const nlohmann::ordered_json& k, std::string* error) {
    try {
        DispersedCase dc;
        dc.index = k.at("index").get<std::size_t>();
        dc.draws = k.at("draws").get<std::vector<double>>();
        for (const auto& f : k.at("figures")) {
            dc.figures.push_back(f.is_number() ? std::optional<double>(f.get<double>())
                                               : std::nullopt);
        }
        dc.success = k.at("success").get<bool>();
        dc.failed_checks = k.at("failed_checks").get<std::vector<std::string>>();
        dc.error = k.at("error").get<std::string>();
        if (k.contains("landing") && k.at("landing").is_array()) {
            const auto l = k.at("landing").get<std::vector<double>>();
            if (l.size() == 4)
                dc.landing = CaseLanding{l[0], l[1], l[2], l[3]};
        }
        // A case is a success exactly when it was read and no check failed: a flag that
        // disagrees was changed by hand.
        if (dc.success != (dc.error.empty() && dc.failed_checks.empty())) {
            *error = fmt::format("case {}: its success disagrees with its failed checks", dc.index);
            return std::nullopt;
        }
        return dc;
    } catch (const nlohmann::ordered_json::exception& e) {
        *error = fmt::format("not a dispersion campaign: a case: {}", e.what());
        return std::nullopt;
    }
}

std::string part_digest_problem(const DispersionCampaign& head, const std::string& rows_digest) {
    if (head.cases_digest.empty() || head.design_digest.empty()) {
        return "no digests of its design and cases (written before they were kept): run its "
               "shard again";
    }
    if (head.cases_digest != rows_digest) {
        return fmt::format(
            "shard {}/{}: its cases disagree with their digest (changed since written)",
            head.shard_index, head.shard_count);
    }
    return {};
}

std::optional<DispersionCampaign> campaign_from_json(const nlohmann::ordered_json& j,
                                                     std::string* error) {
    std::optional<DispersionCampaign> c = campaign_head_from_json(j, error);
    if (!c)
        return std::nullopt;
    try {
        CaseDigest digest;
        for (const auto& k : j.at("cases")) {
            std::optional<DispersedCase> dc = case_from_json(k, error);
            if (!dc)
                return std::nullopt;
            digest.add(*dc);
            c->cases.push_back(std::move(*dc));
        }
        if (std::string problem = part_digest_problem(*c, digest.hex()); !problem.empty()) {
            *error = std::move(problem);
            return std::nullopt;
        }
        return c;
    } catch (const nlohmann::ordered_json::exception& e) {
        *error = fmt::format("not a dispersion campaign: {}", e.what());
        return std::nullopt;
    }
}

nlohmann::ordered_json summary_to_json(const DispersionSummary& s) {
    nlohmann::ordered_json out;
    out["runs"] = s.runs;
    out["successes"] = s.successes;
    out["success_probability"] = s.success_probability;
    out["success_interval_95"] = {s.wilson_low, s.wilson_high};
    nlohmann::ordered_json figures = nlohmann::ordered_json::object();
    for (const FigureStatistics& f : s.figures) {
        figures[f.id] = {{"unit", f.unit}, {"count", f.count},
                         {"mean", f.mean}, {"standard_deviation", f.standard_deviation},
                         {"p01", f.p01},   {"p50", f.p50},
                         {"p99", f.p99}};
    }
    out["figures"] = figures;
    nlohmann::ordered_json failing = nlohmann::ordered_json::array();
    for (const auto& [id, count] : s.failing_checks)
        failing.push_back({{"id", id}, {"count", count}});
    out["failing_checks"] = failing;
    if (s.landing_ellipse) {
        const LandingEllipse& e = *s.landing_ellipse;
        out["landing_ellipse"] = {{"probability", e.probability},
                                  {"count", e.count},
                                  {"centre_latitude_deg", e.centre_latitude_deg},
                                  {"centre_longitude_deg", e.centre_longitude_deg},
                                  {"semi_major_km", e.axes.semi_major_km},
                                  {"semi_minor_km", e.axes.semi_minor_km},
                                  {"major_axis_azimuth_deg", e.axes.major_axis_azimuth_deg},
                                  {"east_sigma_km", e.axes.east_sigma_km},
                                  {"north_sigma_km", e.axes.north_sigma_km},
                                  {"correlation", e.axes.correlation}};
    } else {
        out["landing_ellipse"] = nullptr;
    }
    return out;
}

}  // namespace ds
