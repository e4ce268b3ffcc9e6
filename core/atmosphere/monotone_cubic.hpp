#pragma once

#include <optional>
#include <vector>

namespace ds {

/// Monotone piecewise-cubic Hermite interpolation through points (x_i, y_i): the interpolant
/// passes through every point, its first derivative is continuous, and between two points it
/// never leaves the interval of their two values, so monotone data give a monotone curve (no
/// overshoot). Interior slopes are the weighted harmonic mean of the neighbouring secants, zero
/// where the data turn (Fritsch and Butland, SIAM J. Sci. Stat. Comput. 5(2), 1984, the form
/// of Fritsch and Carlson's monotone condition, SIAM J. Numer. Anal. 17(2), 1980; both from
/// memory). End slopes are the three-point one-sided estimate limited the same way, unless
/// given. Outside the points the curve continues as a straight line with the end slope.
class MonotoneCubic {
public:
    /// Throws std::invalid_argument for fewer than two points, sizes that differ, x not
    /// strictly increasing or a value that is not finite, or a given end slope outside
    /// Fritsch and Carlson's monotone region (its sign against the end secant's, or more than
    /// three times that secant).
    MonotoneCubic(std::vector<double> x, std::vector<double> y,
                  std::optional<double> first_slope = std::nullopt,
                  std::optional<double> last_slope = std::nullopt);

    double value(double x) const;
    double slope(double x) const;

    double first_x() const { return x_.front(); }
    double last_x() const { return x_.back(); }
    double first_slope() const { return slopes_.front(); }
    double last_slope() const { return slopes_.back(); }

private:
    std::vector<double> x_;
    std::vector<double> y_;
    std::vector<double> slopes_;  ///< dy/dx at each point
};

}  // namespace ds
