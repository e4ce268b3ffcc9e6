#include "trade/landing_ellipse.hpp"

#include <cmath>

#include "constants.hpp"

namespace ds {

double chi_square_2dof_quantile(double probability) {
    return -2.0 * std::log1p(-probability);
}

EllipseAxes covariance_ellipse(const std::vector<EastNorth>& points, double probability) {
    const double n = static_cast<double>(points.size());
    double mean_e = 0.0;
    double mean_n = 0.0;
    for (const EastNorth& p : points) {
        mean_e += p.east_km / n;
        mean_n += p.north_km / n;
    }
    double see = 0.0;
    double snn = 0.0;
    double sen = 0.0;
    for (const EastNorth& p : points) {
        const double de = p.east_km - mean_e;
        const double dn = p.north_km - mean_n;
        see += de * de;
        snn += dn * dn;
        sen += de * dn;
    }
    const double a = see / (n - 1.0);
    const double c = snn / (n - 1.0);
    const double b = sen / (n - 1.0);
    // Eigenvalues of [[a, b], [b, c]] and the major axis's angle from east, counter-clockwise.
    const double half_sum = 0.5 * (a + c);
    const double radius = std::hypot(0.5 * (a - c), b);
    const double major = half_sum + radius;
    const double minor = std::max(0.0, half_sum - radius);
    const double angle_from_east = 0.5 * std::atan2(2.0 * b, a - c);
    double azimuth = 90.0 - radians_to_degrees(angle_from_east);
    azimuth = std::fmod(std::fmod(azimuth, 180.0) + 180.0, 180.0);
    const double k = std::sqrt(chi_square_2dof_quantile(probability));
    EllipseAxes out;
    out.semi_major_km = k * std::sqrt(major);
    out.semi_minor_km = k * std::sqrt(minor);
    out.major_axis_azimuth_deg = azimuth;
    out.east_sigma_km = std::sqrt(a);
    out.north_sigma_km = std::sqrt(c);
    out.correlation = a > 0.0 && c > 0.0 ? b / std::sqrt(a * c) : 0.0;
    return out;
}

std::optional<LandingEllipse> landing_ellipse(const std::vector<GroundPoint>& points,
                                              double radius_m, double probability) {
    if (points.size() < 2 || !(radius_m > 0.0))
        return std::nullopt;
    LandingEllipse out;
    out.probability = probability;
    out.count = points.size();
    const GroundPoint centre = mean_point(points);
    out.centre_latitude_deg = radians_to_degrees(centre.latitude_rad);
    out.centre_longitude_deg = radians_to_degrees(centre.longitude_rad);
    constexpr double km = 1e-3;
    std::vector<EastNorth> local;
    local.reserve(points.size());
    for (const GroundPoint& p : points) {
        const double d = great_circle_distance_m(centre, p, radius_m) * km;
        const double azimuth = initial_azimuth_rad(centre, p);
        local.push_back({d * std::sin(azimuth), d * std::cos(azimuth)});
    }
    out.axes = covariance_ellipse(local, probability);
    return out;
}

}  // namespace ds
