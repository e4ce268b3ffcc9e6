#pragma once

#include <Eigen/Core>

#include <vector>

namespace ds {

/// A point on the body's surface, rad (latitude north positive, longitude east positive).
struct GroundPoint {
    double latitude_rad = 0.0;
    double longitude_rad = 0.0;
};

/// Downrange and crossrange are measured from this: the entry point and the entry's initial
/// planet-relative azimuth (clockwise from north), on the reference sphere of this radius.
struct TrackReference {
    GroundPoint origin;
    double azimuth_rad = 0.0;
    double radius_m = 0.0;
};

/// Where a point lies against the reference track, m at the reference radius: along the great
/// circle through the origin on its azimuth, and across it (positive to the right of the
/// direction of flight).
struct TrackPosition {
    double downrange_m = 0.0;
    double crossrange_m = 0.0;
};

TrackPosition track_position(const TrackReference& track, const GroundPoint& point);

/// The reference track's axes, taken once for the many points placed against it (a history's
/// samples): position() is track_position, to the bit.
class TrackAxes {
public:
    explicit TrackAxes(const TrackReference& track);
    TrackPosition position(const GroundPoint& point) const;

private:
    Eigen::Vector3d origin_;  ///< unit vector to the origin
    Eigen::Vector3d along_;   ///< unit vector along the track at the origin
    Eigen::Vector3d left_;    ///< the pole of the track's great circle, on the left
    double radius_m_;
};

/// Great-circle distance between two points on a sphere of the given radius, m.
double great_circle_distance_m(const GroundPoint& a, const GroundPoint& b, double radius_m);

/// Initial azimuth of the great circle from a to b, rad clockwise from north, in (-pi, pi].
double initial_azimuth_rad(const GroundPoint& a, const GroundPoint& b);

/// The normalised mean of points' unit vectors: their centre on the sphere.
GroundPoint mean_point(const std::vector<GroundPoint>& points);

/// The point a given distance from `from` along the great circle leaving it on an azimuth.
GroundPoint destination(const GroundPoint& from, double azimuth_rad, double distance_m,
                        double radius_m);

}  // namespace ds
