#pragma once

#include <vector>

namespace ds {

/// One straight piece of a contour line.
struct ContourSegment {
    double x0 = 0.0, y0 = 0.0;
    double x1 = 0.0, y1 = 0.0;
};

/// The line where a field sampled on a grid crosses zero, by marching squares: each cell's
/// crossings are placed by linear interpolation along its edges, and a saddle cell (opposite
/// corners of the same sign) is split by the sign of the mean of its corners. `values` holds
/// x.size() * y.size() samples, x varying slowest (values[i * y.size() + j] at x[i], y[j]),
/// as a two-key sweep orders its cases. A cell with a NaN corner gives no segment. A corner
/// exactly at zero counts as positive, so a line through grid points is drawn once.
std::vector<ContourSegment> zero_contour(const std::vector<double>& x, const std::vector<double>& y,
                                         const std::vector<double>& values);

}  // namespace ds
