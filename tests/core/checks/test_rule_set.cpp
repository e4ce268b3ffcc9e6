#include <doctest/doctest.h>

#include "checks/rule_set.hpp"

using ds::CheckStatus;
using ds::LimitRule;
using ds::Severity;

namespace {

const LimitRule physics{"peak_deceleration", "peak deceleration", "g", Severity::physics, "test"};
const LimitRule envelope{"aeroshell_diameter", "aeroshell diameter", "m", Severity::envelope,
                         "test"};

}  // namespace

TEST_CASE("a physics limit passes below its marginal band, is marginal inside it, fails past it") {
    CHECK(ds::check_at_most(physics, 10.0, 15.0, 0.1).status == CheckStatus::pass);
    CHECK(ds::check_at_most(physics, 14.0, 15.0, 0.1).status == CheckStatus::marginal);
    CHECK(ds::check_at_most(physics, 15.0, 15.0, 0.1).status == CheckStatus::marginal);
    CHECK(ds::check_at_most(physics, 15.1, 15.0, 0.1).status == CheckStatus::fail);
}

TEST_CASE("an envelope limit is marginal past it and never fails") {
    CHECK(ds::check_at_most(envelope, 4.0, 4.6, 0.1).status == CheckStatus::pass);
    CHECK(ds::check_at_most(envelope, 4.5, 4.6, 0.1).status == CheckStatus::pass);
    CHECK(ds::check_at_most(envelope, 9.0, 4.6, 0.1).status == CheckStatus::marginal);
}

TEST_CASE("a lower limit mirrors the upper one") {
    const LimitRule low{"deploy_q_low", "deploy dynamic pressure", "Pa", Severity::physics, "t"};
    CHECK(ds::check_at_least(low, 400.0, 250.0, 0.1).status == CheckStatus::pass);
    CHECK(ds::check_at_least(low, 260.0, 250.0, 0.1).status == CheckStatus::marginal);
    CHECK(ds::check_at_least(low, 200.0, 250.0, 0.1).status == CheckStatus::fail);
}

TEST_CASE("a negative limit is judged on its magnitude (site elevation below -1 km)") {
    const LimitRule site{"site_elevation", "site elevation", "m", Severity::envelope, "t"};
    CHECK(ds::check_at_most(site, -2000.0, -1000.0, 0.1).status == CheckStatus::pass);
    CHECK(ds::check_at_most(site, -500.0, -1000.0, 0.1).status == CheckStatus::marginal);
}

TEST_CASE("a check carries its value, limit, unit, source and a message with the numbers") {
    const ds::Check c = ds::check_at_most(physics, 16.25, 15.0, 0.1);
    CHECK(c.id == "peak_deceleration");
    CHECK(c.value == 16.25);
    CHECK(c.limit == 15.0);
    CHECK(c.unit == "g");
    CHECK(c.source == "test");
    CHECK(c.message == "peak deceleration 16.25 g is above the limit of 15 g");
}

TEST_CASE("checks are ordered failing first, then marginal, keeping their order otherwise") {
    std::vector<ds::Check> checks{
        ds::check_at_most({"a", "a", "", Severity::physics, ""}, 1.0, 10.0, 0.1),
        ds::check_at_most({"b", "b", "", Severity::physics, ""}, 9.5, 10.0, 0.1),
        ds::check_at_most({"c", "c", "", Severity::physics, ""}, 11.0, 10.0, 0.1),
        ds::check_at_most({"d", "d", "", Severity::physics, ""}, 2.0, 10.0, 0.1),
        ds::check_at_most({"e", "e", "", Severity::physics, ""}, 12.0, 10.0, 0.1)};
    ds::order_checks(checks);
    std::string order;
    for (const ds::Check& c : checks)
        order += c.id;
    CHECK(order == "cebad");
}

TEST_CASE("a check's numbers read in four digits without an exponent (a heavy lander's masses)") {
    const LimitRule mass{"landed_mass", "landed mass", "kg", Severity::envelope, "test"};
    CHECK(ds::check_at_most(mass, 17730.4, 600.0, 0.1).message ==
          "landed mass 17730 kg is above the heritage envelope's 600 kg: beyond today's "
          "demonstrated technology");
    const LimitRule pressure{"q", "dynamic pressure", "Pa", Severity::physics, "test"};
    CHECK(ds::check_at_most(pressure, 1288.27, 15000.0, 0.1).message ==
          "dynamic pressure 1288 Pa is within the limit of 15000 Pa");
    CHECK(ds::check_at_most(physics, 0.94238, 15.0, 0.1).message ==
          "peak deceleration 0.9424 g is within the limit of 15 g");
    CHECK(ds::check_at_most(physics, 2.5e-5, 4.6, 0.1).message.find("2.5e-05 g") !=
          std::string::npos);
}

TEST_CASE(
    "a check judged only has the worded check's status, value, limit and margin, no words and "
    "no source") {
    const LimitRule low{"deploy_q_low", "deploy dynamic pressure", "Pa", Severity::physics, "t"};
    for (const double value : {10.0, 14.0, 15.0, 15.1, 9.0, 4.5, 250.0, 200.0, 400.0}) {
        CAPTURE(value);
        for (const LimitRule* rule : {&physics, &envelope, &low}) {
            const bool lower = rule == &low;
            const double limit = lower ? 250.0 : 15.0;
            const ds::Check worded = lower ? ds::check_at_least(*rule, value, limit, 0.1)
                                           : ds::check_at_most(*rule, value, limit, 0.1);
            const ds::Check judged =
                lower ? ds::check_at_least(*rule, value, limit, 0.1, ds::Wording::judged_only)
                      : ds::check_at_most(*rule, value, limit, 0.1, ds::Wording::judged_only);
            CHECK(judged.id == worded.id);
            CHECK(judged.status == worded.status);
            CHECK(judged.value == worded.value);
            CHECK(judged.limit == worded.limit);
            CHECK(judged.margin == worded.margin);
            CHECK_FALSE(worded.message.empty());
            CHECK(judged.message.empty());
            CHECK(judged.source.empty());
            CHECK(worded.source == rule->source);
        }
    }
}
