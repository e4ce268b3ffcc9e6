#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <limits>
#include <stdexcept>
#include <vector>

#include "atmosphere/monotone_cubic.hpp"
#include "support/atmosphere_checks.hpp"

namespace {

using ds::test::relative;

bool within(double value, double expected, double absolute_tolerance) {
    return std::abs(value - expected) <= absolute_tolerance;
}

// Made-up points with a steep step in the middle: a natural cubic spline through them dips to
// -0.57 and rises to 5.55 (computed by hand); the monotone cubic must stay within 0-5.2.
const std::vector<double> step_x{0.0, 1.0, 2.0, 3.0, 4.0};
const std::vector<double> step_y{0.0, 0.1, 5.0, 5.1, 5.2};

}  // namespace

TEST_CASE("monotone cubic passes through every point (monotone_cubic.hpp contract)") {
    const ds::MonotoneCubic curve(step_x, step_y);
    for (std::size_t i = 0; i < step_x.size(); ++i) {
        CAPTURE(i);
        // Source: the points themselves; 1e-12 absolute.
        CHECK(within(curve.value(step_x[i]), step_y[i], 1e-12));
    }
}

TEST_CASE("monotone cubic reproduces a straight line exactly (hand values)") {
    // Uneven spacing; every secant is -2, so every slope is -2 and each Hermite piece is the line.
    const ds::MonotoneCubic line({0.0, 0.5, 2.0, 7.0}, {3.0, 2.0, -1.0, -11.0});
    for (double x = -1.0; x <= 8.0; x += 0.25) {
        CAPTURE(x);
        CHECK(within(line.value(x), 3.0 - 2.0 * x, 1e-12));
        CHECK(within(line.slope(x), -2.0, 1e-12));
    }
}

TEST_CASE(
    "monotone cubic's interior slope is the weighted harmonic mean of the secants "
    "(Fritsch and Butland 1984, from memory; hand value)") {
    // Secants 1 (width 1) and 0.5 (width 2): weights 2 x 2 + 1 = 5 and 2 + 2 x 1 = 4,
    // slope = (5 + 4) / (5 / 1 + 4 / 0.5) = 9/13.
    const ds::MonotoneCubic curve({0.0, 1.0, 3.0}, {0.0, 1.0, 2.0});
    CHECK(curve.slope(1.0) == relative(9.0 / 13.0, 1e-12));
}

TEST_CASE(
    "monotone cubic stays between neighbouring points on monotone data: no overshoot "
    "(Fritsch and Carlson 1980 condition)") {
    const ds::MonotoneCubic curve(step_x, step_y);
    double previous = curve.value(step_x.front());
    for (double x = 0.0; x <= 4.0; x += 1e-3) {
        CAPTURE(x);
        const double y = curve.value(x);
        CHECK(y >= previous - 1e-12);
        CHECK(y >= 0.0 - 1e-12);
        CHECK(y <= 5.2 + 1e-12);
        previous = y;
    }
    // Within the step segment the curve stays inside [0.1, 5.0].
    for (double x = 1.0; x <= 2.0; x += 1e-3) {
        CHECK(curve.value(x) >= 0.1 - 1e-12);
        CHECK(curve.value(x) <= 5.0 + 1e-12);
    }
}

TEST_CASE("monotone cubic is flat where the data turn, without overshoot (hand values)") {
    const ds::MonotoneCubic peak({0.0, 1.0, 2.0}, {0.0, 1.0, 0.0});
    CHECK(peak.slope(1.0) == 0.0);
    for (double x = 0.0; x <= 2.0; x += 1e-3) {
        CHECK(peak.value(x) <= 1.0 + 1e-12);
    }
}

TEST_CASE("monotone cubic has a continuous slope at its interior points (C1 construction)") {
    const ds::MonotoneCubic curve(step_x, step_y);
    for (std::size_t i = 1; i + 1 < step_x.size(); ++i) {
        CAPTURE(i);
        const double left = curve.slope(step_x[i] - 1e-9);
        const double right = curve.slope(step_x[i] + 1e-9);
        // Source: continuity by construction; the slope changes by about 1e-8 over 2e-9.
        CHECK(within(right, left, 1e-6));
    }
}

TEST_CASE("monotone cubic takes given end slopes and extends as straight lines beyond its ends") {
    const ds::MonotoneCubic curve({0.0, 1.0, 2.0}, {0.0, 1.0, 3.0}, 0.5, 4.0);
    CHECK(curve.first_slope() == 0.5);
    CHECK(curve.last_slope() == 4.0);
    CHECK(curve.slope(2.0 - 1e-9) == relative(4.0, 1e-6));
    // Source: hand values of the straight extensions.
    CHECK(curve.value(-2.0) == relative(-1.0, 1e-12));
    CHECK(curve.value(3.5) == relative(3.0 + 4.0 * 1.5, 1e-12));
    CHECK(curve.slope(10.0) == 4.0);
}

TEST_CASE("monotone cubic rejects what it cannot interpolate (monotone_cubic.hpp contract)") {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    CHECK_THROWS_AS(ds::MonotoneCubic({0.0}, {1.0}), std::invalid_argument);
    CHECK_THROWS_AS(ds::MonotoneCubic({0.0, 1.0}, {1.0}), std::invalid_argument);
    CHECK_THROWS_AS(ds::MonotoneCubic({0.0, 0.0}, {1.0, 2.0}), std::invalid_argument);
    CHECK_THROWS_AS(ds::MonotoneCubic({1.0, 0.0}, {1.0, 2.0}), std::invalid_argument);
    CHECK_THROWS_AS(ds::MonotoneCubic({0.0, 1.0}, {1.0, nan}), std::invalid_argument);
    // End slopes against the end secant's sign, or above three times it, would overshoot.
    CHECK_THROWS_AS(ds::MonotoneCubic({0.0, 1.0}, {0.0, 1.0}, -0.1), std::invalid_argument);
    CHECK_THROWS_AS(ds::MonotoneCubic({0.0, 1.0}, {0.0, 1.0}, std::nullopt, 3.5),
                    std::invalid_argument);
    CHECK_NOTHROW(ds::MonotoneCubic({0.0, 1.0}, {0.0, 1.0}, 3.0, 0.0));
}
