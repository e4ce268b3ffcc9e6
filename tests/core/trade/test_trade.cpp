// Sweeps, dispersions and sensitivities: statistics against hand computations and known
// distributions, reproducibility across threads and shards, and closed-form sensitivities.

#include <algorithm>
#include <atomic>
#include <cmath>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

#include <doctest/doctest.h>

#include "design/reader.hpp"
#include "results/key_figures.hpp"
#include "sizing/size.hpp"
#include "support/samples.hpp"
#include "trade/dispersion.hpp"
#include "trade/parallel.hpp"
#include "trade/sensitivity.hpp"
#include "trade/sweep.hpp"

namespace {

using ds::test::sample;

std::size_t figure_index(const std::string& id) {
    const auto index = ds::key_figure_index(id);
    if (!index)
        FAIL("no figure " << id);
    return index.value_or(0);
}

const ds::FigureStatistics& stats(const ds::DispersionSummary& s, const std::string& id) {
    return s.figures[figure_index(id)];
}

ds::DispersionSettings campaign_settings(std::size_t runs, std::uint64_t seed, unsigned threads) {
    ds::DispersionSettings settings;
    settings.runs = runs;
    settings.seed = seed;
    settings.threads = threads;
    return settings;
}

}  // namespace

TEST_CASE("Wilson 95 % interval of 8 successes in 10 is [0.4902, 0.9433] (hand-computed)") {
    // Wilson (1927): centre (p + z^2/2n) / (1 + z^2/n), half-width
    // z / (1 + z^2/n) sqrt(p (1 - p) / n + z^2 / 4n^2), with z = 1.96, computed by hand.
    const auto [low, high] = ds::wilson_interval(8, 10);
    CHECK(low == doctest::Approx(0.4902).epsilon(2e-4));
    CHECK(high == doctest::Approx(0.9433).epsilon(2e-4));
    // All successes: the upper end is 1, the lower end n / (n + z^2).
    const auto [all_low, all_high] = ds::wilson_interval(100, 100);
    CHECK(all_high == doctest::Approx(1.0).epsilon(1e-12));
    CHECK(all_low ==
          doctest::Approx(100.0 / (100.0 + 1.959963984540054 * 1.959963984540054)).epsilon(1e-12));
}

TEST_CASE("quantiles interpolate between order statistics (Hyndman and Fan type 7)") {
    const std::vector<double> v{1.0, 2.0, 3.0, 4.0, 5.0};
    CHECK(ds::quantile(v, 0.5) == 3.0);
    CHECK(ds::quantile(v, 0.01) == doctest::Approx(1.04).epsilon(1e-12));
    CHECK(ds::quantile(v, 0.99) == doctest::Approx(4.96).epsilon(1e-12));
    CHECK(ds::quantile(v, 1.0) == 5.0);
}

TEST_CASE("a figure every case shares has that mean and a standard deviation of exactly zero") {
    // Regression: three cases of 0.1 summed to 0.30000000000000004, so the mean was
    // 0.10000000000000002 and the deviation 1.7e-17, printed as such in the summary.
    ds::DispersionCampaign campaign;
    campaign.runs = 3;
    campaign.figure_ids = {"shared", "spread"};
    campaign.figure_units = {"m", "m"};
    for (const double spread : {1.0, 2.0, 3.0}) {
        ds::DispersedCase c;
        c.figures = {0.1, spread};
        c.success = true;
        campaign.cases.push_back(c);
    }
    const ds::DispersionSummary s = ds::summarize(campaign);
    REQUIRE(s.figures.size() == 2);
    const ds::FigureStatistics& shared = s.figures[0];
    const ds::FigureStatistics& spread = s.figures[1];
    CHECK(shared.mean == 0.1);
    CHECK(shared.standard_deviation == 0.0);
    // Sample standard deviation of 1, 2, 3 (n - 1): 1.
    CHECK(spread.mean == doctest::Approx(2.0).epsilon(1e-15));
    CHECK(spread.standard_deviation == doctest::Approx(1.0).epsilon(1e-15));
}

TEST_CASE("the mean and deviation of figures near the largest double are finite, not infinity") {
    // Regression: the plain sum of 1.7e308 and 1.6e308 overflows, so merge printed infinity.
    // Hand-computed: mean 1.65e308; sample deviation |1.7 - 1.6|e308 / sqrt(2) = 7.0711e306.
    ds::DispersionCampaign campaign;
    campaign.runs = 2;
    campaign.figure_ids = {"huge"};
    campaign.figure_units = {"m"};
    for (const double v : {1.7e308, 1.6e308}) {
        ds::DispersedCase c;
        c.index = campaign.cases.size();
        c.figures = {v};
        c.success = true;
        campaign.cases.push_back(c);
    }
    const ds::FigureStatistics huge = ds::summarize(campaign).figures.at(0);
    CHECK(huge.mean == doctest::Approx(1.65e308).epsilon(1e-14));
    CHECK(huge.standard_deviation == doctest::Approx(0.1e308 / std::sqrt(2.0)).epsilon(1e-12));
}

TEST_CASE("a campaign read case by case: what merge checks, and the same campaign back") {
    const ds::Design d = sample("small-ballistic-station");
    const auto part = ds::run_dispersions(d, {},
                                          [] {
                                              ds::DispersionSettings s = campaign_settings(8, 4, 1);
                                              s.shard_index = 1;
                                              s.shard_count = 2;
                                              return s;
                                          }())
                          .first;
    REQUIRE(part);
    const nlohmann::ordered_json document = ds::campaign_to_json(*part);
    const auto read = [](const nlohmann::ordered_json& j, std::vector<std::size_t>* handed) {
        std::istringstream in(j.dump());
        std::string error;
        const auto campaign = ds::read_campaign(
            in, [handed](const ds::DispersedCase& c) { handed->push_back(c.index); }, &error);
        return std::pair{campaign, error};
    };
    std::vector<std::size_t> handed;
    const auto [whole, none] = read(document, &handed);
    REQUIRE_MESSAGE(whole, none);
    CHECK(whole->cases.empty());  // handed on, not held
    CHECK(handed == std::vector<std::size_t>{1, 3, 5, 7});
    CHECK(whole->cases_digest == document["cases_digest"]);
    CHECK(whole->design_digest == ds::design_digest(ds::freeze_design(d)));

    // A case missing, repeated or of another shard; a row changed; the document cut short.
    nlohmann::ordered_json short_one = document;
    short_one["cases"].erase(2);
    CHECK(read(short_one, &handed).second.find("case 5 is missing") != std::string::npos);
    nlohmann::ordered_json repeated = document;
    repeated["cases"][2] = repeated["cases"][1];
    CHECK(read(repeated, &handed).second.find("case 3 is repeated") != std::string::npos);
    nlohmann::ordered_json foreign = document;
    foreign["cases"][0]["index"] = 2;
    CHECK(read(foreign, &handed).second.find("case 2 is not of shard 1/2") != std::string::npos);
    nlohmann::ordered_json changed = document;
    changed["cases"][3]["draws"][0] = 0.5;
    CHECK(read(changed, &handed).second.find("disagree with their digest") != std::string::npos);
    std::istringstream cut(document.dump().substr(0, 400));
    std::string error;
    CHECK_FALSE(ds::read_campaign(cut, nullptr, &error));
    CHECK(error.find("cut short") != std::string::npos);
    std::istringstream blank("  \n");
    CHECK_FALSE(ds::read_campaign(blank, nullptr, &error));
    CHECK(error.find("empty") == 0);
}

TEST_CASE("the percentiles of a figure linear in a normal draw are those of the normal") {
    // The ballistic coefficient m / (Cd A) is linear in the entry mass: with the mass drawn
    // N(560, 3^2), beta is N(beta0, (3 beta0 / 560)^2) and its 1 % and 99 % points lie
    // 2.3263 sigma from the mean (standard normal table).
    ds::Design d = sample("small-ballistic-station");
    d.dispersions = {{"mass.entry_kg", ds::DistributionKind::normal, 3.0, 0.0, 0.0}};
    ds::DispersionSettings settings;
    settings.runs = 2000;
    settings.seed = 42;
    const auto [campaign, error] = ds::run_dispersions(d, {}, settings);
    REQUIRE(campaign);
    const ds::DispersionSummary s = ds::summarize(*campaign);
    const double beta0 = ds::size_design(d).entry.ballistic_coefficient_kg_m2;
    const double sigma = 3.0 * beta0 / 560.0;
    const ds::FigureStatistics& beta = stats(s, "ballistic_coefficient");
    CHECK(beta.count == 2000);
    // Tolerances: four standard errors of each estimate at n = 2000.
    CHECK(std::abs(beta.mean - beta0) < 4.0 * sigma / std::sqrt(2000.0));
    CHECK(beta.standard_deviation == doctest::Approx(sigma).epsilon(4.0 * std::sqrt(0.5 / 2000.0)));
    CHECK(std::abs(beta.p50 - beta0) < 0.12 * sigma);
    CHECK(std::abs(beta.p01 - (beta0 - 2.3263 * sigma)) < 0.35 * sigma);
    CHECK(std::abs(beta.p99 - (beta0 + 2.3263 * sigma)) < 0.35 * sigma);
}

TEST_CASE("the same seed gives the same numbers to the last digit whatever the thread count") {
    const ds::Design d = sample("small-ballistic-station");
    ds::DispersionSettings settings = campaign_settings(120, 9, 1);
    const auto one = ds::run_dispersions(d, {}, settings).first;
    settings.threads = 2;
    const auto two = ds::run_dispersions(d, {}, settings).first;
    REQUIRE(one);
    REQUIRE(two);
    REQUIRE(one->cases.size() == two->cases.size());
    for (std::size_t i = 0; i < one->cases.size(); ++i) {
        CHECK(one->cases[i].draws == two->cases[i].draws);
        CHECK(one->cases[i].figures == two->cases[i].figures);
    }
    settings.seed = 10;
    const auto other = ds::run_dispersions(d, {}, settings).first;
    CHECK(other->cases[0].draws != one->cases[0].draws);
}

TEST_CASE("a campaign that keeps no cases hands them on in order and sums up to the same summary") {
    const ds::Design d = sample("small-ballistic-station");
    ds::DispersionSettings settings = campaign_settings(60, 5, 2);
    settings.shard_index = 1;
    settings.shard_count = 2;
    const auto kept = ds::run_dispersions(d, {}, settings).first;
    REQUIRE(kept);
    ds::SummaryTally tally(ds::key_figure_table.size());
    std::vector<std::size_t> handed;
    settings.keep_cases = false;
    settings.tally = &tally;
    settings.on_case = [&](const ds::DispersionCampaign& campaign, const ds::DispersedCase& c) {
        CHECK(campaign.cases.empty());
        handed.push_back(c.index);
    };
    const auto streamed = ds::run_dispersions(d, {}, settings).first;
    REQUIRE(streamed);
    CHECK(streamed->cases.empty());
    REQUIRE(handed.size() == kept->cases.size());
    for (std::size_t i = 0; i < handed.size(); ++i)
        CHECK(handed[i] == kept->cases[i].index);  // 1, 3, 5, ...: the shard's, in order
    // Number for number: the tally runs the same sums in the same order.
    CHECK(ds::summary_to_json(tally.summary(*streamed, 0.95)) ==
          ds::summary_to_json(ds::summarize(*kept, 0.95)));
}

TEST_CASE("shards merged give the same campaign and summary as one run") {
    const ds::Design d = sample("small-ballistic-station");
    ds::DispersionSettings settings;
    settings.runs = 90;
    settings.seed = 3;
    const auto whole = ds::run_dispersions(d, {}, settings).first;
    std::vector<ds::DispersionCampaign> parts;
    for (std::size_t i = 0; i < 3; ++i) {
        settings.shard_index = i;
        settings.shard_count = 3;
        // Through JSON, as the merge command reads them.
        std::string error;
        const auto part = ds::run_dispersions(d, {}, settings).first;
        parts.push_back(*ds::campaign_from_json(ds::campaign_to_json(*part), &error));
        CHECK(parts.back().cases.size() == 30);
    }
    const auto [merged, error] = ds::merge_campaigns(parts);
    REQUIRE(merged);
    REQUIRE(merged->cases.size() == whole->cases.size());
    for (std::size_t i = 0; i < merged->cases.size(); ++i) {
        CHECK(merged->cases[i].draws == whole->cases[i].draws);
        CHECK(merged->cases[i].figures == whole->cases[i].figures);
    }
    CHECK(ds::summary_to_json(ds::summarize(*merged)) ==
          ds::summary_to_json(ds::summarize(*whole)));
    // The same landing ellipse, at any probability: every case's landing point went through.
    const auto ellipse_whole = ds::summarize(*whole, 0.95).landing_ellipse;
    const auto ellipse_merged = ds::summarize(*merged, 0.95).landing_ellipse;
    REQUIRE(ellipse_whole);
    REQUIRE(ellipse_merged);
    CHECK(ellipse_merged->count == 90);
    CHECK(ellipse_merged->axes.semi_major_km == ellipse_whole->axes.semi_major_km);
    CHECK(ellipse_merged->axes.semi_minor_km == ellipse_whole->axes.semi_minor_km);
    CHECK(ellipse_merged->axes.major_axis_azimuth_deg ==
          ellipse_whole->axes.major_axis_azimuth_deg);
    CHECK(ellipse_merged->centre_latitude_deg == ellipse_whole->centre_latitude_deg);
    CHECK(ellipse_merged->centre_longitude_deg == ellipse_whole->centre_longitude_deg);
    CHECK(ellipse_whole->axes.semi_major_km > 0.0);
    // A missing shard is refused, saying which case is missing.
    parts.pop_back();
    const auto [incomplete, why] = ds::merge_campaigns(parts);
    CHECK_FALSE(incomplete);
    CHECK(why.find("missing") != std::string::npos);
}

TEST_CASE("a dispersion of a key the design has no number at is refused with the key") {
    ds::Design d = sample("small-ballistic-station");
    d.dispersions = {{"entry.no_such_key", ds::DistributionKind::normal, 1.0, 0.0, 0.0}};
    ds::DispersionSettings settings;
    settings.runs = 5;
    const auto [campaign, error] = ds::run_dispersions(d, {}, settings);
    CHECK_FALSE(campaign);
    CHECK(error.find("entry.no_such_key") != std::string::npos);
}

TEST_CASE("a sized design is frozen into the vehicle it sizes to") {
    const ds::Design d = sample("lifting-rover-carrier");
    const ds::Results sized = ds::size_design(d);
    const ds::Design frozen = ds::freeze_design(d);
    REQUIRE(frozen.mass.entry_kg);
    CHECK(*frozen.mass.entry_kg == doctest::Approx(sized.mass.entry_kg).epsilon(1e-12));
    CHECK(*frozen.aeroshell.diameter_m == doctest::Approx(sized.entry.diameter_m).epsilon(1e-12));
    // The engines and tanks are built too: the nominal flight of the frozen vehicle is the
    // sized one, with the whole budget allocated and the load covering the burn by its reserve.
    REQUIRE(frozen.terminal.thrust_N);
    REQUIRE(frozen.terminal.propellant_loaded_kg);
    CHECK(*frozen.terminal.propellant_loaded_kg ==
          doctest::Approx(*sized.terminal.propellant_kg).epsilon(1e-12));
    const ds::Results again = ds::size_design(frozen);
    CHECK(*again.mass.landed_kg == doctest::Approx(*sized.mass.landed_kg).epsilon(1e-3));
    CHECK(*again.terminal.propellant_kg ==
          doctest::Approx(*sized.terminal.propellant_kg).epsilon(1e-12));
    for (const ds::Check& c : again.checks) {
        CHECK_MESSAGE(c.status != ds::CheckStatus::fail, c.id);
        if (c.id == "propellant_load") {
            // Burned b, loaded b (1 + r) / (1 - s): usable b (1 + r), margin r / (1 + r).
            const double r = d.terminal.propellant_reserve_fraction;
            CHECK(*c.margin == doctest::Approx(r / (1.0 + r)).epsilon(1e-3));
        }
    }
}

TEST_CASE("a dispersed sized vehicle flies its built load: only a burn past it fails") {
    // The rover carrier closes its budget with the propellant its nominal burn needs. Dispersed,
    // each flight burns more or less of that fixed load; none may fail the budget itself.
    const ds::Design d = sample("lifting-rover-carrier");
    ds::DispersionSettings settings;
    settings.runs = 200;
    settings.seed = 5;
    const auto [campaign, error] = ds::run_dispersions(d, DESCENT_SIZER_SAMPLES_DIR, settings);
    REQUIRE(campaign);
    const ds::DispersionSummary s = ds::summarize(*campaign);
    for (const auto& [id, count] : s.failing_checks) {
        CHECK_MESSAGE(id != "mass_allocation", count);
    }
    // The load is one number for every case (built hardware), the burn varies.
    const auto& propellant = s.figures[figure_index("propellant")];
    CHECK(propellant.standard_deviation == doctest::Approx(0.0).scale(1.0).epsilon(1e-9));
}

TEST_CASE("a given thrust and load replace the derived ones; a load short of the burn fails") {
    ds::Design d = sample("small-ballistic-station");
    const ds::Results derived = ds::size_design(d, {false, false});
    REQUIRE(derived.terminal.thrust_N);
    // A fifth more thrust than thrust-to-weight gives, and a 10 kg load.
    d.terminal.thrust_N = 1.2 * *derived.terminal.thrust_N;
    d.terminal.propellant_loaded_kg = 10.0;
    const ds::Results given = ds::size_design(d, {false, false});
    CHECK(*given.terminal.thrust_N ==
          doctest::Approx(1.2 * *derived.terminal.thrust_N).epsilon(1e-12));
    CHECK(*given.terminal.propellant_kg == doctest::Approx(10.0).epsilon(1e-12));
    const ds::Check* load = nullptr;
    for (const ds::Check& c : given.checks) {
        if (c.id == "propellant_load")
            load = &c;
    }
    REQUIRE(load);
    // Usable: 10 kg less the 3 % residual, short of the burn (about 17 kg here).
    CHECK(load->limit == doctest::Approx(9.7).epsilon(1e-12));
    CHECK(load->value > 9.7);
    CHECK(load->status == ds::CheckStatus::fail);
    CHECK(*load->margin == doctest::Approx((9.7 - load->value) / 9.7).epsilon(1e-12));
}

TEST_CASE("a sweep of the aeroshell diameter: beta falls and the deploy altitude rises (trend)") {
    const ds::DesignVariants variants = ds::DesignVariants::of(sample("small-ballistic-station"));
    const auto cases = ds::run_sweep(variants, {{"aeroshell.diameter_m", 2.2, 3.4, 5}});
    REQUIRE(cases.size() == 5);
    for (std::size_t i = 1; i < cases.size(); ++i) {
        REQUIRE(cases[i].results);
        CHECK(cases[i].inputs[0] > cases[i - 1].inputs[0]);
        CHECK(cases[i].results->entry.ballistic_coefficient_kg_m2 <
              cases[i - 1].results->entry.ballistic_coefficient_kg_m2);
        CHECK(*cases[i].results->parachute.deploy_altitude_m >
              *cases[i - 1].results->parachute.deploy_altitude_m);
    }
}

TEST_CASE("a two-key sweep is a grid, the first key varying slowest; a refused case says why") {
    const ds::DesignVariants variants = ds::DesignVariants::of(sample("small-ballistic-station"));
    const auto cases = ds::run_sweep(variants, {{"aeroshell.diameter_m", 2.4, 2.8, 2},
                                                {"entry.flight_path_angle_deg", -14.0, -12.0, 3}});
    REQUIRE(cases.size() == 6);
    CHECK(cases[0].inputs == std::vector<double>{2.4, -14.0});
    CHECK(cases[2].inputs == std::vector<double>{2.4, -12.0});
    CHECK(cases[3].inputs == std::vector<double>{2.8, -14.0});
    const auto refused = ds::run_sweep(variants, {{"aeroshell.diameter_m", -1.0, 1.0, 2}});
    CHECK_FALSE(refused[0].results);
    CHECK(refused[0].error.find("aeroshell.diameter_m") != std::string::npos);
}

TEST_CASE("the sensitivity of beta to the diameter is -2 and to the mass +1, to 1e-6") {
    // beta = m / (Cd pi D^2 / 4) with a given Cd: d ln beta / d ln D = -2, d ln beta / d ln m = 1.
    ds::Design d = sample("small-ballistic-station");
    d.aeroshell.drag_coefficient = 1.65;
    d.dispersions.clear();
    const ds::DesignVariants variants = ds::DesignVariants::of(d);
    const ds::SensitivityTable table =
        ds::sensitivities(variants, {"aeroshell.diameter_m", "mass.entry_kg"});
    const auto beta = static_cast<Eigen::Index>(figure_index("ballistic_coefficient"));
    CHECK(table.normalized(beta, 0) == doctest::Approx(-2.0).epsilon(1e-6));
    CHECK(table.normalized(beta, 1) == doctest::Approx(1.0).epsilon(1e-6));
    const auto ranked = table.ranked(static_cast<std::size_t>(beta));
    REQUIRE(ranked.size() == 2);
    CHECK(ranked.front().first == "aeroshell.diameter_m");
}

TEST_CASE("design variants: key paths, numeric keys and values") {
    CHECK(ds::key_to_pointer("mass.items[2].mass_kg") == "/mass/items/2/mass_kg");
    const ds::DesignVariants variants = ds::DesignVariants::of(sample("small-ballistic-station"));
    CHECK(variants.value("entry.velocity_m_s") == 5600.0);
    CHECK_FALSE(variants.value("entry.nothing"));
    const auto keys = variants.numeric_keys();
    CHECK(std::find(keys.begin(), keys.end(), "aeroshell.diameter_m") != keys.end());
    CHECK(std::none_of(keys.begin(), keys.end(), [](const std::string& k) {
        return k.rfind("limits.", 0) == 0 || k.rfind("solver.", 0) == 0 || k == "version";
    }));
    const ds::DesignReadResult changed = variants.with({{"entry.velocity_m_s", 6000.0}});
    REQUIRE(changed.ok());
    CHECK(changed.design->entry.velocity_m_s == 6000.0);
}

TEST_CASE("a number set in the design itself gives the strict reader's design or first error") {
    // The frozen station has a fixed entry mass and given heat-shield and backshell masses, so
    // the rule between the masses is in play. Each row: the keys and values, the design and
    // the first error through the document and the reader (the reference) and through the
    // design (prepared keys).
    ds::Design frozen = ds::freeze_design(sample("small-ballistic-station"));
    const ds::DesignVariants variants = ds::DesignVariants::of(frozen);
    const double heat_shield = *frozen.mass.heat_shield_kg;
    const std::vector<std::vector<std::pair<std::string, double>>> cases{
        {{"entry.velocity_m_s", 5700.0}, {"mass.entry_kg", 610.0}},
        {{"entry.flight_path_angle_deg", -95.0}},                            // out of range
        {{"atmosphere.density_scale", -1.0}, {"entry.velocity_m_s", -5.0}},  // two: document order
        {{"mass.entry_kg", heat_shield}},                                    // the masses' rule
        {{"mass.entry_kg", -1.0}},                                           // refused: no rule
        {{"mass.heat_shield_kg", 1e6}, {"entry.velocity_m_s", 0.0}},
        {{"entry.velocity_m_s", std::nan("")}},
        {{"site.elevation_m", 2e5}},  // a rule between keys: through the document
        {{"entry.nothing_m", 1.0}},   // not a key: through the document
    };
    for (const auto& values : cases) {
        std::vector<std::string> paths;
        std::vector<double> numbers;
        for (const auto& [key, value] : values) {
            paths.push_back(key);
            numbers.push_back(value);
        }
        const ds::DesignReadResult reference = variants.with_document(values);
        const ds::DesignReadResult direct = variants.with(variants.prepare(paths), numbers);
        CAPTURE(paths.front());
        REQUIRE(direct.ok() == reference.ok());
        if (reference.ok()) {
            CHECK(*direct.design == *reference.design);
        } else {
            REQUIRE_FALSE(direct.errors.empty());
            CHECK(direct.errors.front().text() == reference.errors.front().text());
        }
    }
    // The plain keys are set in the design; a key a rule between keys reads is not.
    CHECK(variants.prepare({"entry.velocity_m_s", "mass.entry_kg"}).rows.size() == 2);
    CHECK(variants.prepare({"entry.velocity_m_s", "site.elevation_m"}).rows.empty());
}

TEST_CASE("the reader takes dispersions and names what is wrong in one") {
    std::ifstream in(std::string(DESCENT_SIZER_SAMPLES_DIR) + "/small-ballistic-station.json");
    nlohmann::ordered_json doc = nlohmann::ordered_json::parse(in);
    const ds::DesignReadResult ok = ds::read_design(doc.dump());
    REQUIRE(ok.ok());
    REQUIRE(ok.design->dispersions.size() == 4);
    CHECK(ok.design->dispersions[2].distribution == ds::DistributionKind::uniform);
    CHECK(ok.design->dispersions[2].max == 1.15);

    doc["dispersions"][0]["distribution"] = "lognormal";
    doc["dispersions"][2]["max"] = 0.5;
    const ds::DesignReadResult bad = ds::read_design(doc.dump());
    REQUIRE_FALSE(bad.ok());
    REQUIRE(bad.errors.size() == 2);
    CHECK(bad.errors[0].path == "dispersions[0].distribution");
    CHECK(bad.errors[1].path == "dispersions[2].max");
}

TEST_CASE("an exception in a case reaches the caller of parallel_for, after every thread ends") {
    std::atomic<int> ran{0};
    const auto throwing = [&](std::size_t i) {
        ++ran;
        if (i == 3)
            throw std::runtime_error("case 3");
    };
    for (const unsigned threads : {1u, 2u, 4u}) {
        CAPTURE(threads);
        ran = 0;
        CHECK_THROWS_WITH(ds::parallel_for(1000, threads, nullptr, throwing), "case 3");
        CHECK(ran < 1000);  // the handing out stopped
    }
    // And without one, every case runs.
    ran = 0;
    CHECK(ds::parallel_for(100, 2, nullptr, [&](std::size_t) { ++ran; }));
    CHECK(ran == 100);
}
