#pragma once

#include <algorithm>
#include <cmath>

namespace ds {

/// A root of a function that falls through zero between a, where it is f_a >= 0, and b > a,
/// where it is f_b < 0, by the Illinois method (regula falsi that halves the value kept on one
/// side twice running; Dowell and Jarratt, BIT 11, 1971): superlinear on a nearly linear
/// function, and never leaving the bracket. Each new point is kept a quarter of the tolerance
/// inside it. Returns the end of the final bracket where the function is still >= 0, once the
/// bracket is within `tolerance` or that end's value is below what `tolerance` of x moves the
/// function by (the root then lies within the tolerance of it).
template <class F>
double illinois_last_nonnegative(F&& f, double a, double f_a, double b, double f_b,
                                 double tolerance, int most_evaluations = 60) {
    double weight_a = f_a;  // the values the interpolation uses (halved by Illinois)
    double weight_b = f_b;
    int kept = 0;  // +1: the last two points were >= 0; -1: both were < 0
    for (int i = 0; i < most_evaluations && b - a > tolerance; ++i) {
        const double slope = (f_a - f_b) / (b - a);
        if (f_a <= slope * tolerance)
            break;
        double x = (a * weight_b - b * weight_a) / (weight_b - weight_a);
        if (!(x > a && x < b))
            x = 0.5 * (a + b);
        x = std::clamp(x, a + 0.25 * tolerance, b - 0.25 * tolerance);
        const double fx = f(x);
        if (fx >= 0.0) {
            a = x;
            f_a = weight_a = fx;
            if (kept == 1)
                weight_b *= 0.5;
            kept = 1;
        } else {
            b = x;
            f_b = weight_b = fx;
            if (kept == -1)
                weight_a *= 0.5;
            kept = -1;
        }
    }
    return a;
}

}  // namespace ds
