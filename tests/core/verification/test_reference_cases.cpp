// The reference cases that `descent-sizer verify` prints and the sizing sheet's appendix shows:
// each must agree with its source, and the expected values the closed forms give are held to
// the worked numbers published beside them, so a case cannot quietly compare a model with
// itself.

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <set>
#include <string>

#include <doctest/doctest.h>

#include "verification/reference_cases.hpp"

namespace {

const std::vector<ds::ReferenceCase>& cases() {
    static const std::vector<ds::ReferenceCase> all = ds::run_reference_cases();
    return all;
}

const ds::ReferenceCase& find(const std::string& id) {
    const auto it = std::find_if(cases().begin(), cases().end(),
                                 [&](const ds::ReferenceCase& c) { return c.id == id; });
    REQUIRE_MESSAGE(it != cases().end(), id);
    return *it;
}

}  // namespace

TEST_CASE("every reference case agrees with its source within its tolerance") {
    REQUIRE(cases().size() >= 20);
    std::set<std::string> ids;
    for (const ds::ReferenceCase& c : cases()) {
        CAPTURE(c.id);
        CAPTURE(c.expected);
        CAPTURE(c.computed);
        CHECK(ids.insert(c.id).second);
        CHECK_FALSE(c.source.empty());
        CHECK(c.tolerance > 0.0);
        CHECK(std::isfinite(c.expected));
        CHECK(c.agrees());
    }
}

TEST_CASE("the closed forms' expected values are the worked numbers published beside them") {
    // references.md's worked Allen-Eggers check: 121.3 m/s^2 at 29.39 km, peak heating at
    // 41.58 km (NACA Report 1381).
    CHECK(find("allen_eggers_peak_deceleration").expected == doctest::Approx(121.3).epsilon(1e-3));
    CHECK(find("allen_eggers_peak_deceleration_altitude").expected ==
          doctest::Approx(29390.0).epsilon(1e-3));
    CHECK(find("allen_eggers_peak_heating_altitude").expected ==
          doctest::Approx(41580.0).epsilon(1e-3));
    // Vis-viva by hand with the fact sheet's GM: 5776.87 m/s; the Hohmann impulse 83.303 m/s.
    CHECK(find("vis_viva_arrival_speed").expected == doctest::Approx(5776.87).epsilon(2e-6));
    CHECK(find("hohmann_deorbit_burn").expected == doctest::Approx(83.303).epsilon(1e-4));
    // The independent integration found the peaks and the deploy (not NaN, not zero).
    CHECK(find("odeint_deploy_time").expected > 100.0);
    CHECK(find("odeint_peak_deceleration").expected > 1.0);
}

TEST_CASE("a case agrees only within its tolerance, relative or absolute, and never on NaN") {
    ds::ReferenceCase c{"x", "x", "x", "m", 100.0, 100.05, 1e-3, false};
    CHECK(c.difference() == doctest::Approx(5e-4).epsilon(1e-9));
    CHECK(c.agrees());
    c.computed = 100.2;
    CHECK_FALSE(c.agrees());
    c.absolute = true;
    c.tolerance = 0.25;
    CHECK(c.difference() == doctest::Approx(0.2).epsilon(1e-9));
    CHECK(c.agrees());
    c.computed = std::numeric_limits<double>::quiet_NaN();
    CHECK_FALSE(c.agrees());
}
