#include "flight/ground_track.hpp"

#include <algorithm>
#include <cmath>

#include <Eigen/Geometry>

namespace ds {
namespace {

// Unit vectors in the body-fixed frame: z along the spin axis, x through longitude 0.
Eigen::Vector3d unit(const GroundPoint& p) {
    const double c = std::cos(p.latitude_rad);
    return {c * std::cos(p.longitude_rad), c * std::sin(p.longitude_rad), std::sin(p.latitude_rad)};
}

Eigen::Vector3d east(const GroundPoint& p) {
    return {-std::sin(p.longitude_rad), std::cos(p.longitude_rad), 0.0};
}

Eigen::Vector3d north(const GroundPoint& p) {
    const double s = std::sin(p.latitude_rad);
    return {-s * std::cos(p.longitude_rad), -s * std::sin(p.longitude_rad),
            std::cos(p.latitude_rad)};
}

}  // namespace

TrackAxes::TrackAxes(const TrackReference& track)
    : origin_(unit(track.origin)),
      along_(std::sin(track.azimuth_rad) * east(track.origin) +
             std::cos(track.azimuth_rad) * north(track.origin)),
      left_(origin_.cross(along_)),  // o x t: the pole on the left of the flight
      radius_m_(track.radius_m) {}

TrackPosition TrackAxes::position(const GroundPoint& point) const {
    const Eigen::Vector3d p = unit(point);
    const double across = std::asin(std::clamp(-p.dot(left_), -1.0, 1.0));
    const double along = std::atan2(p.dot(along_), p.dot(origin_));
    return {radius_m_ * along, radius_m_ * across};
}

TrackPosition track_position(const TrackReference& track, const GroundPoint& point) {
    return TrackAxes(track).position(point);
}

double great_circle_distance_m(const GroundPoint& a, const GroundPoint& b, double radius_m) {
    const Eigen::Vector3d u = unit(a);
    const Eigen::Vector3d v = unit(b);
    // atan2 of the cross and dot products: accurate at small and large separations alike.
    return radius_m * std::atan2(u.cross(v).norm(), u.dot(v));
}

double initial_azimuth_rad(const GroundPoint& a, const GroundPoint& b) {
    const Eigen::Vector3d v = unit(b);
    return std::atan2(v.dot(east(a)), v.dot(north(a)));
}

GroundPoint mean_point(const std::vector<GroundPoint>& points) {
    Eigen::Vector3d sum = Eigen::Vector3d::Zero();
    for (const GroundPoint& p : points)
        sum += unit(p);
    return {std::atan2(sum.z(), std::hypot(sum.x(), sum.y())), std::atan2(sum.y(), sum.x())};
}

GroundPoint destination(const GroundPoint& from, double azimuth_rad, double distance_m,
                        double radius_m) {
    const double angle = distance_m / radius_m;
    const Eigen::Vector3d t =
        std::sin(azimuth_rad) * east(from) + std::cos(azimuth_rad) * north(from);
    const Eigen::Vector3d p = std::cos(angle) * unit(from) + std::sin(angle) * t;
    return {std::asin(std::clamp(p.z(), -1.0, 1.0)), std::atan2(p.y(), p.x())};
}

}  // namespace ds
