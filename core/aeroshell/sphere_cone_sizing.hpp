#pragma once

#include <cstdint>

#include <boost/math/tools/toms748_solve.hpp>

namespace ds {

template <class DragCoefficientOf>
double diameter_for_ballistic_coefficient(double mass_kg, double target_kg_m2, double smallest_m,
                                          DragCoefficientOf&& drag_coefficient_of) {
    constexpr double largest_m = 100.0;
    constexpr double tolerance_m = 1e-9;
    const auto excess = [&](double d) {
        return ballistic_coefficient_kg_m2(mass_kg, drag_coefficient_of(d), frontal_area_m2(d)) -
               target_kg_m2;
    };
    const double at_small = excess(smallest_m);
    const double at_large = excess(largest_m);
    if (!(at_small > 0.0 && at_large < 0.0))
        return 0.0;
    std::uintmax_t iterations = 200;
    const auto close = [](double a, double b) { return b - a <= tolerance_m; };
    const auto [lo, hi] = boost::math::tools::toms748_solve(excess, smallest_m, largest_m, at_small,
                                                            at_large, close, iterations);
    return 0.5 * (lo + hi);
}

}  // namespace ds
