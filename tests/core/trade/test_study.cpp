// One entry point for every trade study: run_study gives what the study's own function gives,
// says what it ran, writes its kind's CSV and refuses what it cannot run; the key figures come
// from one table in one order.

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <mutex>
#include <string>

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include "design/reader.hpp"
#include "results/key_figures.hpp"
#include "trade/design_variants.hpp"
#include "trade/study.hpp"
#include "trade/trade_csv.hpp"

namespace {

const std::string station =
    std::string(DESCENT_SIZER_SAMPLES_DIR) + "/small-ballistic-station.json";

nlohmann::ordered_json document() {
    std::ifstream in(station);
    return nlohmann::ordered_json::parse(in);
}

ds::Design design() {
    const ds::DesignReadResult read = ds::read_design_file(station);
    REQUIRE(read.ok());
    return *read.design;
}

/// Counts what the study reports, to see that it reports through the one it was given. Reports
/// come from the study's threads at once (Progress's contract), and in no set order: a case
/// that ends first may report last. Read once the study has returned.
class Counted : public ds::Progress {
public:
    void report(double fraction) override {
        const std::lock_guard<std::mutex> lock(mutex_);
        ++reports;
        highest = std::max(highest, fraction);
    }
    bool cancelled() const override { return false; }
    int reports = 0;
    double highest = 0.0;

private:
    std::mutex mutex_;
};

}  // namespace

TEST_CASE("run_study of a sweep is run_sweep of the document, with the design's own values") {
    ds::StudyRequest request;
    request.kind = ds::StudyKind::sweep;
    request.axes = {{"aeroshell.diameter_m", 2.4, 2.8, 3}};
    Counted progress;
    const ds::StudyOutcome outcome =
        ds::run_study(request, document(), design(),
                      std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR), 2, progress);
    CHECK(outcome.error.empty());
    REQUIRE(outcome.sweep.size() == 3);
    const auto direct = ds::run_sweep(
        ds::DesignVariants(document(), std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR)),
        request.axes, 1);
    for (std::size_t i = 0; i < 3; ++i) {
        REQUIRE(outcome.sweep[i].results);
        REQUIRE(direct[i].results);
        CHECK(outcome.sweep[i].results->entry.peak_deceleration_g ==
              direct[i].results->entry.peak_deceleration_g);
    }
    REQUIRE(outcome.nominal.size() == 1);
    CHECK(outcome.nominal[0] == 2.6);  // the sample's diameter
    CHECK(progress.reports == 3);
    CHECK(progress.highest == 1.0);
    CHECK(outcome.description() == "Sweep of aeroshell.diameter_m from 2.4 to 2.8 (3 values)");
    CHECK(outcome.csv() == ds::sweep_csv(request.axes, outcome.sweep));
}

TEST_CASE("run_study of dispersions flies the requested shard; without dispersions it says so") {
    ds::StudyRequest request;
    request.kind = ds::StudyKind::dispersions;
    request.runs = 6;
    request.seed = 3;
    request.shard_index = 1;
    request.shard_count = 2;
    ds::Unwatched progress;
    const ds::StudyOutcome outcome =
        ds::run_study(request, document(), design(),
                      std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR), 2, progress);
    CHECK(outcome.error.empty());
    REQUIRE(outcome.campaign);
    REQUIRE(outcome.campaign->cases.size() == 3);
    CHECK(outcome.campaign->cases[0].index == 1);
    CHECK(outcome.campaign->cases[2].index == 5);
    CHECK(outcome.summary.runs == 3);
    CHECK(outcome.description() == "Dispersions: 6 cases from seed 3");
    CHECK(outcome.csv() == ds::campaign_csv(*outcome.campaign));

    ds::Design bare = design();
    bare.dispersions.clear();
    const ds::StudyOutcome refused = ds::run_study(
        request, document(), bare, std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR), 2, progress);
    CHECK(refused.error.find("no dispersions") != std::string::npos);
    CHECK_FALSE(refused.campaign);
    CHECK(refused.csv().empty());
}

TEST_CASE("run_study of sensitivities varies the inputs asked for, every number without any") {
    ds::StudyRequest request;
    request.kind = ds::StudyKind::sensitivities;
    request.inputs = {"mass.entry_kg"};
    ds::Unwatched progress;
    const ds::StudyOutcome outcome =
        ds::run_study(request, document(), design(),
                      std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR), 2, progress);
    REQUIRE(outcome.sensitivities);
    CHECK(outcome.sensitivities->inputs == std::vector<std::string>{"mass.entry_kg"});
    // The entry mass is the input itself (exact but for the differences' rounding).
    CHECK(outcome.sensitivities->normalized(0, 0) == doctest::Approx(1.0).epsilon(1e-9));
    CHECK(outcome.description() == "Normalised sensitivities of the key figures");
    CHECK(outcome.csv() == ds::sensitivity_csv(*outcome.sensitivities));
}

TEST_CASE("the key figures: one table, values in its order, ids found by name") {
    ds::Results r;
    r.mass.entry_kg = 560.0;
    r.entry.peak_deceleration_g = 7.5;
    r.capability.max_site_elevation_m = -1200.0;
    const auto values = ds::key_figure_values(r);
    REQUIRE(values.size() == ds::key_figure_table.size());
    CHECK(values[*ds::key_figure_index("entry_mass")] == 560.0);
    CHECK(values[*ds::key_figure_index("peak_deceleration")] == 7.5);
    CHECK(values.back() == -1200.0);
    CHECK_FALSE(values[*ds::key_figure_index("deploy_mach")]);  // no deploy: no figure
    CHECK_FALSE(ds::key_figure_index("no_such_figure"));
    // The ids are unique, and the figures with values are the table's rows.
    for (std::size_t i = 0; i < ds::key_figure_table.size(); ++i) {
        CHECK(ds::key_figure_index(ds::key_figure_table[i].id) == i);
    }
    const auto figures = ds::key_figures(r);
    REQUIRE(figures.size() == ds::key_figure_table.size());
    CHECK(figures[1].id == "landed_mass");
    CHECK(figures[*ds::key_figure_index("peak_deceleration")].value == 7.5);
}
