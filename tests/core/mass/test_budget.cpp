#include <doctest/doctest.h>

#include "mass/budget.hpp"
#include "mass/growth.hpp"
#include "results/results.hpp"

TEST_CASE("growth allowances by maturity (AIAA S-120; from memory)") {
    CHECK(ds::growth_allowance(ds::Maturity::estimated) == 0.18);
    CHECK(ds::growth_allowance(ds::Maturity::layout) == 0.12);
    CHECK(ds::growth_allowance(ds::Maturity::pre_release) == 0.08);
    CHECK(ds::growth_allowance(ds::Maturity::released) == 0.04);
    CHECK(ds::growth_allowance(ds::Maturity::existing) == 0.02);
    CHECK(ds::growth_allowance(ds::Maturity::actual) == 0.0);
}

TEST_CASE("a budget adds items with their growth and totals them by group, by hand") {
    ds::MassBudget b;
    b.add_item("rover", 100.0, ds::MassGroup::payload, ds::Maturity::estimated);
    b.add_item("structure", 50.0, ds::MassGroup::descent_stage, ds::Maturity::layout);
    b.add_given("heat shield", 30.0, ds::MassGroup::heat_shield);
    b.add_estimate("backshell", 40.0, ds::MassGroup::backshell, "test");
    b.add_computed("propellant", 20.0, ds::MassGroup::descent_stage, "test");
    CHECK(b.items().size() == 5);
    CHECK(b.items()[0].mass_kg == doctest::Approx(118.0).epsilon(1e-12));
    CHECK(b.group_kg(ds::MassGroup::descent_stage) == doctest::Approx(56.0 + 20.0).epsilon(1e-12));
    CHECK(b.total_kg() == doctest::Approx(118.0 + 56.0 + 30.0 + 47.2 + 20.0).epsilon(1e-12));
    CHECK(b.items()[2].basis == ds::GrowthBasis::given);
    CHECK(ds::maturity_name(b.items()[2]) == "given");
    CHECK(ds::maturity_name(b.items()[1]) == "layout");
    CHECK(b.items()[1].group == ds::MassGroup::descent_stage);
    CHECK(b.items()[4].growth_fraction == 0.0);
}
