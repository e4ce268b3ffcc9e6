// The landing ellipse against points drawn from a known bivariate normal: its axes, their
// orientation and its centre agree with the generating ones within the sampling error of the
// draw count, and it holds the stated fraction of the points. The chi-square quantiles for two
// degrees of freedom against the standard tables (9.210 at 99 %, 5.991 at 95 %: any statistics
// handbook's chi-square table; from memory).

#include <cmath>
#include <random>
#include <vector>

#include <doctest/doctest.h>

#include "constants.hpp"
#include "flight/ground_track.hpp"
#include "trade/landing_ellipse.hpp"

namespace {

constexpr double mars_radius_m = 3389.5e3;

/// A standard normal draw by Box-Muller.
double standard_normal(std::mt19937_64& engine) {
    std::uniform_real_distribution<double> uniform(0.0, 1.0);
    const double u1 = 1.0 - uniform(engine);
    const double u2 = uniform(engine);
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * ds::pi * u2);
}

struct Generating {
    double sigma_major_km = 3.0;
    double sigma_minor_km = 1.0;
    double azimuth_deg = 30.0;  ///< of the major axis, clockwise from north
    ds::GroundPoint centre{ds::degrees_to_radians(20.0), ds::degrees_to_radians(40.0)};
};

/// Points east and north of the centre, km, and the same on the sphere.
struct Draw {
    std::vector<ds::EastNorth> local;
    std::vector<ds::GroundPoint> points;
};

Draw draw(const Generating& g, std::size_t n, std::uint64_t seed) {
    std::mt19937_64 engine(seed);
    const double a = ds::degrees_to_radians(g.azimuth_deg);
    Draw d;
    for (std::size_t i = 0; i < n; ++i) {
        const double along = g.sigma_major_km * standard_normal(engine);
        const double across = g.sigma_minor_km * standard_normal(engine);
        // The major axis points to azimuth a: east sin(a), north cos(a); the minor one across.
        const double east = along * std::sin(a) + across * std::cos(a);
        const double north = along * std::cos(a) - across * std::sin(a);
        d.local.push_back({east, north});
        d.points.push_back(ds::destination(g.centre, std::atan2(east, north),
                                           std::hypot(east, north) * 1e3, mars_radius_m));
    }
    return d;
}

}  // namespace

TEST_CASE("the chi-square quantile for 2 dof is -2 ln(1 - p): 9.210 at 99 %, 5.991 at 95 %") {
    CHECK(ds::chi_square_2dof_quantile(0.99) == doctest::Approx(9.2103).epsilon(1e-4));
    CHECK(ds::chi_square_2dof_quantile(0.95) == doctest::Approx(5.9915).epsilon(1e-4));
    CHECK(ds::chi_square_2dof_quantile(0.3935) == doctest::Approx(1.0).epsilon(1e-3));
}

TEST_CASE(
    "from 20,000 draws of a known bivariate normal the 99 % ellipse's axes and orientation "
    "are the generating ones within the sampling error") {
    const Generating g;
    constexpr std::size_t n = 20000;
    const Draw d = draw(g, n, 7);
    const auto ellipse = ds::landing_ellipse(d.points, mars_radius_m, 0.99);
    REQUIRE(ellipse);
    CHECK(ellipse->count == n);
    const double k = std::sqrt(-2.0 * std::log(0.01));
    // A standard deviation's sampling error is sigma / sqrt(2 n), 0.5 %: within four of them.
    const double sigma_tolerance = 4.0 / std::sqrt(2.0 * n);
    CHECK(std::abs(ellipse->axes.semi_major_km / (k * g.sigma_major_km) - 1.0) < sigma_tolerance);
    CHECK(std::abs(ellipse->axes.semi_minor_km / (k * g.sigma_minor_km) - 1.0) < sigma_tolerance);
    // The major axis's direction: its sampling error is sqrt(l1 l2 / (n (l1 - l2)^2)) rad,
    // 0.15 deg here: within four of them.
    const double l1 = g.sigma_major_km * g.sigma_major_km;
    const double l2 = g.sigma_minor_km * g.sigma_minor_km;
    const double angle_tolerance_deg =
        4.0 * ds::radians_to_degrees(std::sqrt(l1 * l2 / (n * (l1 - l2) * (l1 - l2))));
    CHECK(std::abs(ellipse->axes.major_axis_azimuth_deg - g.azimuth_deg) < angle_tolerance_deg);
    // The centre: within four standard errors of the mean (sigma / sqrt(n)) of the generating one.
    const ds::GroundPoint centre{ds::degrees_to_radians(ellipse->centre_latitude_deg),
                                 ds::degrees_to_radians(ellipse->centre_longitude_deg)};
    CHECK(ds::great_circle_distance_m(centre, g.centre, mars_radius_m) * 1e-3 <
          4.0 * g.sigma_major_km / std::sqrt(static_cast<double>(n)));
    // The same ellipse from the points in the plane directly: the projection keeps them.
    const ds::EllipseAxes plane = ds::covariance_ellipse(d.local, 0.99);
    CHECK(ellipse->axes.semi_major_km == doctest::Approx(plane.semi_major_km).epsilon(1e-4));
    CHECK(ellipse->axes.semi_minor_km == doctest::Approx(plane.semi_minor_km).epsilon(1e-4));
}

TEST_CASE("the 99 % ellipse holds 99 % of the points, the 50 % one half of them") {
    const Generating g;
    constexpr std::size_t n = 20000;
    const Draw d = draw(g, n, 11);
    for (const double p : {0.99, 0.5}) {
        CAPTURE(p);
        const ds::EllipseAxes e = ds::covariance_ellipse(d.local, p);
        // Inside when (along / a)^2 + (across / b)^2 <= 1 in the ellipse's own axes.
        const double az = ds::degrees_to_radians(e.major_axis_azimuth_deg);
        std::size_t inside = 0;
        for (const ds::EastNorth& q : d.local) {
            const double along = q.east_km * std::sin(az) + q.north_km * std::cos(az);
            const double across = q.east_km * std::cos(az) - q.north_km * std::sin(az);
            const double r2 =
                std::pow(along / e.semi_major_km, 2) + std::pow(across / e.semi_minor_km, 2);
            inside += r2 <= 1.0 ? 1 : 0;
        }
        // Binomial sampling error sqrt(p (1 - p) / n): within four of it (plus the draw's own
        // covariance error, of the same order).
        const double fraction = static_cast<double>(inside) / n;
        CHECK(std::abs(fraction - p) < 8.0 * std::sqrt(p * (1.0 - p) / n));
    }
}

TEST_CASE("an ellipse whose major axis points north-west has its azimuth in [0, 180)") {
    Generating g;
    g.azimuth_deg = 135.0;  // south-east, the same axis as north-west (315)
    const Draw d = draw(g, 5000, 3);
    const ds::EllipseAxes e = ds::covariance_ellipse(d.local, 0.99);
    CHECK(e.major_axis_azimuth_deg >= 0.0);
    CHECK(e.major_axis_azimuth_deg < 180.0);
    CHECK(std::abs(e.major_axis_azimuth_deg - 135.0) < 1.5);
    CHECK(e.correlation < -0.5);  // east grows as north falls along that axis
}
