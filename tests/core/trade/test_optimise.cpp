// The optimiser against problems whose optimum is known outside it:
// - a quadratic bowl cut by a linear constraint, whose constrained minimum is the projection of
//   the bowl's centre onto the constraint's line (by hand: (2.5, 1.5), f = 0.5);
// - the rover carrier's entry mass against its aeroshell's ballistic coefficient, which falls
//   until the deploy dynamic pressure reaches its limit: the optimum is where the feasibility
//   margin crosses zero, root-found in the test by Boost's TOMS 748 on sizings of its own;
// - the four-key optimum of the rover carrier: lighter than the design, passing every check
//   when read again from its written document, and no step of a key that lowers the mass
//   keeps it passing (the optimality that the binding limits make).

#include <cmath>
#include <cstdint>
#include <limits>

#include <doctest/doctest.h>
#include <boost/math/tools/toms748_solve.hpp>

#include "design/reader.hpp"
#include "design/writer.hpp"
#include "sizing/size.hpp"
#include "support/samples.hpp"
#include "trade/optimise.hpp"
#include "trade/sweep.hpp"

namespace {

constexpr const char* beta_key = "aeroshell.diameter_m.size_for_ballistic_coefficient_kg_m2";

ds::DesignVariants rover() {
    return ds::DesignVariants::of(ds::test::sample("lifting-rover-carrier"));
}

double margin_of(const ds::Results& r) {
    const ds::FeasibilityMargin m = ds::feasibility_margin(r);
    return m.margin ? *m.margin : -1.0;
}

ds::Results size_with(const ds::DesignVariants& design,
                      const std::vector<std::pair<std::string, double>>& values) {
    const ds::DesignReadResult read = design.with(values);
    REQUIRE(read.ok());
    ds::SizingOptions options;
    options.history = false;
    options.capability = false;
    return ds::size_design(*read.design, options);
}

}  // namespace

TEST_CASE("a bowl cut by a line: the constrained minimum is the centre's projection (by hand)") {
    // f = (x - 3)^2 + (y - 2)^2 subject to x + y <= 4, in [0, 5]^2: the minimum lies on the line
    // at the foot of the perpendicular from (3, 2), (2.5, 1.5), where f = 0.5.
    const auto evaluate = [](const std::vector<double>& x) {
        const double f = (x[0] - 3.0) * (x[0] - 3.0) + (x[1] - 2.0) * (x[1] - 2.0);
        return ds::SearchPoint{f, (4.0 - x[0] - x[1]) / 4.0};
    };
    for (const std::vector<double>& start : {std::vector<double>{0.5, 0.5}, {5.0, 5.0}}) {
        CAPTURE(start[0]);
        const ds::SearchOutcome out = ds::constrained_search(evaluate, {0.0, 0.0}, {5.0, 5.0},
                                                             start, 400, 1e-8, 3, 7, 1, nullptr);
        REQUIRE(out.best);
        const ds::OptimiseStep& best = out.history[*out.best];
        CHECK(best.inputs[0] == doctest::Approx(2.5).epsilon(1e-4));
        CHECK(best.inputs[1] == doctest::Approx(1.5).epsilon(1e-4));
        CHECK(*best.objective == doctest::Approx(0.5).epsilon(1e-4));
        CHECK(best.margin >= 0.0);
        CHECK(out.history.size() <= 400);
    }
}

TEST_CASE("a problem that no point satisfies says so, with the least failing point") {
    const auto evaluate = [](const std::vector<double>& x) {
        return ds::SearchPoint{x[0], -1.0 - x[0]};  // best margin -1 at x = 0
    };
    const ds::SearchOutcome out =
        ds::constrained_search(evaluate, {0.0}, {1.0}, {0.5}, 100, 1e-6, 2, 1, 1, nullptr);
    CHECK_FALSE(out.best);
    REQUIRE(out.least_infeasible);
    CHECK(out.history[*out.least_infeasible].inputs[0] < 0.01);
}

TEST_CASE("the same seed gives the same search, whatever the threads") {
    const auto evaluate = [](const std::vector<double>& x) {
        return ds::SearchPoint{std::sin(3.0 * x[0]) + x[1] * x[1], 1.0 - x[0] * x[1]};
    };
    const auto run = [&](unsigned threads) {
        return ds::constrained_search(evaluate, {-2.0, -2.0}, {2.0, 2.0}, {1.0, 1.0}, 300, 1e-6, 4,
                                      11, threads, nullptr);
    };
    const ds::SearchOutcome one = run(1);
    const ds::SearchOutcome two = run(2);
    REQUIRE(one.history.size() == two.history.size());
    for (std::size_t i = 0; i < one.history.size(); ++i)
        CHECK(one.history[i].inputs == two.history[i].inputs);
}

TEST_CASE("the rover's lightest aeroshell request is where the deploy pressure reaches its limit") {
    const ds::DesignVariants design = rover();
    ds::OptimiseSettings settings;
    settings.keys = {{beta_key, 80.0, 300.0}};
    settings.tolerance = 1e-6;
    const ds::Optimisation o = ds::optimise(design, settings, 0, nullptr);
    REQUIRE(o.feasible);

    // The reference: the feasibility margin's zero between the design's 115 kg/m^2 (passing)
    // and 300 (failing), root-found on sizings of the test's own.
    const auto margin_at = [&](double beta) {
        return margin_of(size_with(design, {{beta_key, beta}}));
    };
    std::uintmax_t iterations = 60;
    const auto close = [](double a, double b) { return b - a < 1e-6; };
    const auto [low, high] =
        boost::math::tools::toms748_solve(margin_at, 115.0, 300.0, close, iterations);
    const double root = margin_at(low) >= 0.0 ? low : high;
    CHECK(o.best_inputs[0] == doctest::Approx(root).epsilon(1e-3));
    REQUIRE_FALSE(o.binding.empty());
    CHECK(o.binding.front().id == "deploy_dynamic_pressure_high");
    // Lighter than the design, and the figure there is the figure of the written optimum.
    REQUIRE(o.start_objective);
    CHECK(*o.best_objective < *o.start_objective);
    const ds::Results at_root = size_with(design, {{beta_key, root}});
    CHECK(*o.best_objective == doctest::Approx(at_root.mass.entry_kg).epsilon(1e-4));
}

TEST_CASE("four keys of the rover: a lighter passing design, and no lighter step passes") {
    const ds::DesignVariants design = rover();
    ds::OptimiseSettings settings;
    settings.keys = {{beta_key, 80.0, 150.0},
                     {"parachute.diameter_m", 15.0, 30.0},
                     {"parachute.deploy_mach", 1.4, 2.1},
                     {"terminal.thrust_to_weight", 1.5, 3.5}};
    const ds::Optimisation o = ds::optimise(design, settings, 0, nullptr);
    REQUIRE(o.feasible);
    REQUIRE(o.start_feasible);
    CHECK(*o.best_objective < *o.start_objective);
    const bool binds = !o.binding.empty() || !o.keys_at_bounds.empty();
    CHECK(binds);

    // Written and read again, the optimum passes every check and has the optimum's mass.
    const ds::DesignReadResult read = ds::read_design(o.optimum_document.dump());
    REQUIRE(read.ok());
    const ds::Results again = ds::size_design(*read.design);
    for (const ds::Check& c : again.checks) {
        CAPTURE(c.id);
        CHECK(c.status != ds::CheckStatus::fail);
    }
    CHECK(again.mass.entry_kg == doctest::Approx(*o.best_objective).epsilon(1e-9));

    // A step of 1 % of its range along any key, either way, within the bounds: lighter and
    // passing would mean the optimum was not one (to the optimiser's tolerance of the mass).
    const ds::DesignVariants optimum(o.optimum_document, {});
    for (std::size_t i = 0; i < settings.keys.size(); ++i) {
        const ds::OptimisedKey& k = settings.keys[i];
        for (const double direction : {-1.0, 1.0}) {
            const double x = o.best_inputs[i] + direction * 0.01 * (k.high - k.low);
            if (x < k.low || x > k.high)
                continue;
            CAPTURE(k.key);
            CAPTURE(x);
            const ds::Results r = size_with(optimum, {{k.key, x}});
            const bool passes = margin_of(r) >= 0.0;
            const bool lighter = r.mass.entry_kg < *o.best_objective * (1.0 - 1e-4);
            const bool better = passes && lighter;
            CHECK_FALSE(better);
        }
    }
}
