#pragma once

#include <optional>
#include <vector>

#include "flight/ground_track.hpp"

namespace ds {

/// The default probability of a landing ellipse (common practice for site selection).
inline constexpr double default_ellipse_probability = 0.99;
/// The probabilities a landing ellipse may be asked for (the command line's and the Python
/// module's range): above 0 and below 1, where its quantile is finite.
inline constexpr double lowest_ellipse_probability = 1e-6;
inline constexpr double highest_ellipse_probability = 1.0 - 1e-9;

/// The chi-square quantile with two degrees of freedom: the squared Mahalanobis radius k^2
/// inside which a bivariate normal holds a fraction p of its draws, k^2 = -2 ln(1 - p)
/// (the chi-square distribution with 2 dof is exponential with mean 2). 9.21 for 99 %.
double chi_square_2dof_quantile(double probability);

/// A point in a local frame, km east and north of a centre.
struct EastNorth {
    double east_km = 0.0;
    double north_km = 0.0;
};

/// The ellipse of a sample's covariance holding a probability: semi-axes k sqrt(lambda) of the
/// covariance's eigenvalues, k^2 = chi_square_2dof_quantile(p); the major axis's azimuth,
/// clockwise from north, in [0, 180).
struct EllipseAxes {
    double semi_major_km = 0.0;
    double semi_minor_km = 0.0;
    double major_axis_azimuth_deg = 0.0;
    double east_sigma_km = 0.0;  ///< sample standard deviations (n - 1) and correlation
    double north_sigma_km = 0.0;
    double correlation = 0.0;
};

/// The covariance ellipse of points about their own mean. Needs two points or more.
EllipseAxes covariance_ellipse(const std::vector<EastNorth>& points, double probability);

/// The landing ellipse of a campaign: the mean landing point (the normalised mean of the
/// points' unit vectors), and the covariance ellipse of the points in the azimuthal
/// equidistant projection about it (km east and north: distances and azimuths from the centre
/// kept exactly).
struct LandingEllipse {
    double probability = default_ellipse_probability;
    std::size_t count = 0;  ///< landing points used
    double centre_latitude_deg = 0.0;
    double centre_longitude_deg = 0.0;
    EllipseAxes axes;
};

/// Empty with fewer than two points.
std::optional<LandingEllipse> landing_ellipse(const std::vector<GroundPoint>& points,
                                              double radius_m, double probability);

}  // namespace ds
