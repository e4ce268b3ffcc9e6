#include "atmosphere/monotone_cubic.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <utility>

#include <fmt/format.h>

namespace ds {
namespace {

// Fritsch and Carlson's monotone region: on a segment with secant d, end slopes m with
// 0 <= m/d <= 3 keep the cubic monotone (the box inside their region; from memory).
constexpr double monotone_slope_ratio_max = 3.0;

bool same_sign(double a, double b) {
    return (a > 0.0 && b > 0.0) || (a < 0.0 && b < 0.0);
}

/// Three-point one-sided slope at an end (h0, d0: the end segment; h1, d1: its neighbour),
/// limited so that the end segment stays monotone.
double end_slope(double h0, double h1, double d0, double d1) {
    const double slope = ((2.0 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
    if (!same_sign(slope, d0)) {
        return 0.0;
    }
    if (!same_sign(d0, d1) && std::abs(slope) > monotone_slope_ratio_max * std::abs(d0)) {
        return monotone_slope_ratio_max * d0;
    }
    return slope;
}

void check_given_slope(const char* which, double slope, double secant) {
    if (!std::isfinite(slope)) {
        throw std::invalid_argument(fmt::format("{} slope must be finite, got {}", which, slope));
    }
    const bool inside = secant == 0.0
                            ? slope == 0.0
                            : slope / secant >= 0.0 && slope / secant <= monotone_slope_ratio_max;
    if (!inside) {
        throw std::invalid_argument(
            fmt::format("{} slope {} is outside the monotone region of its segment (secant {})",
                        which, slope, secant));
    }
}

}  // namespace

MonotoneCubic::MonotoneCubic(std::vector<double> x, std::vector<double> y,
                             std::optional<double> first_slope, std::optional<double> last_slope)
    : x_(std::move(x)), y_(std::move(y)) {
    const std::size_t n = x_.size();
    if (n < 2 || y_.size() != n) {
        throw std::invalid_argument(fmt::format(
            "a monotone cubic needs at least two points and as many values ({} x, {} y)", n,
            y_.size()));
    }
    for (std::size_t i = 0; i < n; ++i) {
        if (!std::isfinite(x_[i]) || !std::isfinite(y_[i])) {
            throw std::invalid_argument(fmt::format("point {} is not finite", i));
        }
        if (i > 0 && !(x_[i] > x_[i - 1])) {
            throw std::invalid_argument(fmt::format("x must increase strictly at point {}", i));
        }
    }
    std::vector<double> widths(n - 1);
    std::vector<double> secants(n - 1);
    for (std::size_t i = 0; i + 1 < n; ++i) {
        widths[i] = x_[i + 1] - x_[i];
        secants[i] = (y_[i + 1] - y_[i]) / widths[i];
    }

    slopes_.assign(n, secants.front());
    if (n > 2) {
        for (std::size_t i = 1; i + 1 < n; ++i) {
            const double before = secants[i - 1];
            const double after = secants[i];
            if (!same_sign(before, after)) {
                slopes_[i] = 0.0;  // the data turn (or are flat): no overshoot
                continue;
            }
            const double w_before = 2.0 * widths[i] + widths[i - 1];
            const double w_after = widths[i] + 2.0 * widths[i - 1];
            slopes_[i] = (w_before + w_after) / (w_before / before + w_after / after);
        }
        slopes_.front() = end_slope(widths[0], widths[1], secants[0], secants[1]);
        slopes_.back() = end_slope(widths[n - 2], widths[n - 3], secants[n - 2], secants[n - 3]);
    }
    if (first_slope) {
        check_given_slope("first", *first_slope, secants.front());
        slopes_.front() = *first_slope;
    }
    if (last_slope) {
        check_given_slope("last", *last_slope, secants.back());
        slopes_.back() = *last_slope;
    }
}

namespace {

/// The segment holding x: the last point at or below it, clamped to the first and last
/// segments.
std::size_t segment_of(const std::vector<double>& xs, double x) {
    const auto above = std::upper_bound(xs.begin(), xs.end(), x);
    const auto index = static_cast<std::ptrdiff_t>(above - xs.begin()) - 1;
    return static_cast<std::size_t>(
        std::clamp<std::ptrdiff_t>(index, 0, static_cast<std::ptrdiff_t>(xs.size()) - 2));
}

}  // namespace

double MonotoneCubic::value(double x) const {
    if (x <= x_.front()) {
        return y_.front() + slopes_.front() * (x - x_.front());
    }
    if (x >= x_.back()) {
        return y_.back() + slopes_.back() * (x - x_.back());
    }
    const std::size_t k = segment_of(x_, x);
    const double h = x_[k + 1] - x_[k];
    const double t = (x - x_[k]) / h;
    const double u = 1.0 - t;
    // Cubic Hermite basis on [0, 1].
    return (1.0 + 2.0 * t) * u * u * y_[k] + t * u * u * h * slopes_[k] +
           t * t * (3.0 - 2.0 * t) * y_[k + 1] + t * t * (t - 1.0) * h * slopes_[k + 1];
}

double MonotoneCubic::slope(double x) const {
    if (x <= x_.front()) {
        return slopes_.front();
    }
    if (x >= x_.back()) {
        return slopes_.back();
    }
    const std::size_t k = segment_of(x_, x);
    const double h = x_[k + 1] - x_[k];
    const double t = (x - x_[k]) / h;
    return 6.0 * t * (1.0 - t) * (y_[k + 1] - y_[k]) / h +
           (3.0 * t * t - 4.0 * t + 1.0) * slopes_[k] + (3.0 * t * t - 2.0 * t) * slopes_[k + 1];
}

}  // namespace ds
