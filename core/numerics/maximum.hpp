#pragma once

#include <functional>
#include <limits>

#include <boost/math/tools/minima.hpp>

namespace ds {

/// The largest value of f on [a, b], f unimodal there: Brent's method (Boost.Math) on -f, to
/// half the digits of a double in the argument (the value is then good to all of them, the
/// maximum being flat). For an independent integration's peaks (the verification cases, the
/// tests), not for the flight's own peak location (which its integrator's events do).
inline double maximum_of(const std::function<double(double)>& f, double a, double b) {
    const auto [at, value] = boost::math::tools::brent_find_minima(
        [&](double t) { return -f(t); }, a, b, std::numeric_limits<double>::digits / 2);
    return -value;
}

}  // namespace ds
