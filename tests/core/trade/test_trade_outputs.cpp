// What trade studies hand to plots and files: the zero contour of a sampled field, the
// feasibility margin of a result, and the CSV the command line and the window write.

#include <algorithm>
#include <cmath>
#include <sstream>
#include <string>
#include <vector>

#include <doctest/doctest.h>

#include "checks/rule_set.hpp"
#include "constants.hpp"
#include "trade/contour.hpp"
#include "trade/sweep.hpp"
#include "trade/trade_csv.hpp"

namespace {

std::vector<double> grid(double from, double to, int count) {
    std::vector<double> v;
    for (int i = 0; i < count; ++i)
        v.push_back(from + (to - from) * i / (count - 1));
    return v;
}

std::vector<std::string> lines(const std::string& text) {
    std::vector<std::string> out;
    std::istringstream in(text);
    for (std::string line; std::getline(in, line);)
        out.push_back(line);
    return out;
}

}  // namespace

TEST_CASE("the zero contour of a linear field is its exact zero line") {
    // f = 2x - y - 0.3 is linear along every cell edge, so interpolation is exact.
    const auto x = grid(0.0, 1.0, 11);
    const auto y = grid(-1.0, 1.0, 9);
    std::vector<double> f;
    for (const double xi : x) {
        for (const double yj : y)
            f.push_back(2.0 * xi - yj - 0.3);
    }
    const auto segments = ds::zero_contour(x, y, f);
    REQUIRE(!segments.empty());
    for (const auto& s : segments) {
        CHECK(2.0 * s.x0 - s.y0 - 0.3 == doctest::Approx(0.0).epsilon(1e-12).scale(1.0));
        CHECK(2.0 * s.x1 - s.y1 - 0.3 == doctest::Approx(0.0).epsilon(1e-12).scale(1.0));
    }
}

TEST_CASE("the zero contour of a circle lies on it and has its length") {
    // f = r^2 - x^2 - y^2 on a 41 x 41 grid over [-1, 1]^2, r = 0.7: crossings are placed by
    // linear interpolation of a quadratic, so they sit within h^2 / 8 / r of the circle
    // (h = 0.05: 4.5e-4), and the polygon's length is within 0.5 % of 2 pi r.
    const double r = 0.7;
    const auto x = grid(-1.0, 1.0, 41);
    const auto y = grid(-1.0, 1.0, 41);
    std::vector<double> f;
    for (const double xi : x) {
        for (const double yj : y)
            f.push_back(r * r - xi * xi - yj * yj);
    }
    const auto segments = ds::zero_contour(x, y, f);
    double length = 0.0;
    for (const auto& s : segments) {
        CHECK(std::hypot(s.x0, s.y0) == doctest::Approx(r).epsilon(4.5e-4 / r));
        CHECK(std::hypot(s.x1, s.y1) == doctest::Approx(r).epsilon(4.5e-4 / r));
        length += std::hypot(s.x1 - s.x0, s.y1 - s.y0);
    }
    CHECK(length == doctest::Approx(2.0 * ds::pi * r).epsilon(5e-3));
}

TEST_CASE("the zero contour skips cells with a missing sample and splits a saddle by its centre") {
    const std::vector<double> x{0.0, 1.0};
    const std::vector<double> y{0.0, 1.0};
    CHECK(ds::zero_contour(x, y, {1.0, -1.0, NAN, 1.0}).empty());
    // Corners (0,0) = +1, (1,0) = -1, (1,1) = +3, (0,1) = -1 (values[i * 2 + j]): the centre
    // (+0.5) joins the positive corners, so the two segments cut off the negative ones.
    const auto saddle = ds::zero_contour(x, y, {1.0, -1.0, -1.0, 3.0});
    REQUIRE(saddle.size() == 2);
    for (const auto& s : saddle) {
        // Each segment cuts off a negative corner: its midpoint lies nearer (1, 0) or (0, 1)
        // than either positive corner. Joined the other way it would cut off (0, 0), (1, 1).
        const double mx = (s.x0 + s.x1) / 2.0;
        const double my = (s.y0 + s.y1) / 2.0;
        const double to_negative = std::min(std::hypot(mx - 1.0, my), std::hypot(mx, my - 1.0));
        const double to_positive = std::min(std::hypot(mx, my), std::hypot(mx - 1.0, my - 1.0));
        CHECK(to_negative < to_positive);
    }
    CHECK_THROWS(ds::zero_contour(x, y, {1.0, 2.0, 3.0}));
}

TEST_CASE("the feasibility margin is the tightest failing limit, or unknown when a flag failed") {
    const ds::LimitRule physics{"peak_deceleration", "peak deceleration", "g",
                                ds::Severity::physics, "test"};
    const ds::LimitRule envelope{"aeroshell_diameter", "aeroshell diameter", "m",
                                 ds::Severity::envelope, "test"};
    ds::Results r;
    // 12 g against 15 g is 20 % inside; 230 W/cm^2 against 200 is 15 % past; the envelope
    // check has no margin, whatever its value.
    r.checks.push_back(ds::check_at_most(physics, 12.0, 15.0, 0.1));
    r.checks.push_back(ds::check_at_most(
        {"peak_heat_flux", "heat", "W/cm^2", ds::Severity::physics, ""}, 230.0, 200.0, 0.1));
    r.checks.push_back(ds::check_at_most(envelope, 9.0, 4.6, 0.1));
    r.checks.push_back(
        ds::check_at_least({"q_low", "q", "Pa", ds::Severity::physics, ""}, 300.0, 250.0, 0.1));
    CHECK(*r.checks[0].margin == doctest::Approx(0.2).epsilon(1e-12));
    CHECK(*r.checks[3].margin == doctest::Approx(0.2).epsilon(1e-12));
    CHECK(!r.checks[2].margin);
    auto m = ds::feasibility_margin(r);
    REQUIRE(m.margin);
    CHECK(*m.margin == doctest::Approx(-0.15).epsilon(1e-12));
    CHECK(m.id == "peak_heat_flux");

    ds::Check flag;
    flag.id = "parachute_trigger";
    flag.status = ds::CheckStatus::fail;
    r.checks.push_back(flag);
    m = ds::feasibility_margin(r);
    CHECK(!m.margin);
    CHECK(m.id == "parachute_trigger");
}

TEST_CASE("sweep CSV: a header, a row per case, quoted text and empty fields for no number") {
    ds::SweepAxis axis{"aeroshell.diameter_m", 2.0, 3.0, 2};
    ds::Results ok;
    ok.entry.diameter_m = 2.5;
    ok.checks.push_back(ds::check_at_most(
        {"peak_deceleration", "d", "g", ds::Severity::physics, ""}, 12.0, 15.0, 0.1));
    std::vector<ds::SweepCase> cases{{{2.0}, ok, ""}, {{3.0}, std::nullopt, "bad, \"value\""}};
    const auto rows = lines(ds::sweep_csv({axis}, cases));
    REQUIRE(rows.size() == 3);
    CHECK(rows[0].rfind("aeroshell.diameter_m,entry_mass,", 0) == 0);
    CHECK(rows[0].find(",worst_status,worst_check,feasibility_margin,margin_check") !=
          std::string::npos);
    CHECK(rows[1].rfind("2,", 0) == 0);
    CHECK(rows[1].find(",2.5,") != std::string::npos);
    CHECK(rows[1].find("pass,,0.2,peak_deceleration") != std::string::npos);
    CHECK(rows[2].rfind("3,,", 0) == 0);
    CHECK(rows[2].find("fail,design,,design") != std::string::npos);
    // Every row has as many fields as the header (no field here holds a comma).
    const auto fields = [](const std::string& s) {
        return std::count(s.begin(), s.end(), ',') + 1;
    };
    CHECK(fields(rows[1]) == fields(rows[0]));
    CHECK(fields(rows[2]) == fields(rows[0]));
}
