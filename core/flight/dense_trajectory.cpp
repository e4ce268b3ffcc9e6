#include "flight/dense_trajectory.hpp"

#include <algorithm>
#include <cstdint>

#include <boost/math/tools/toms748_solve.hpp>

namespace ds {

FlightState DenseTrajectory::state_at(double t) const {
    const auto after = std::upper_bound(
        steps_.begin(), steps_.end(), t,
        [](double time, const DenseStep<flight_state_size>& step) { return time < step.t0; });
    const auto& step = after == steps_.begin() ? steps_.front() : *(after - 1);
    return step(std::min(t, step.t0 + step.h));
}

std::optional<double> DenseTrajectory::time_descending_through(double altitude_m) const {
    constexpr double time_tolerance_s = 1e-7;
    for (std::size_t i = 0; i < steps_.size(); ++i) {
        const auto& step = steps_[i];
        // A step that an event cut short ends where the next one starts.
        const double next = i + 1 < steps_.size() ? steps_[i + 1].t0 : end_time_;
        const double t_end = std::min({step.t0 + step.h, next, end_time_});
        const double above = step(step.t0)[StateIndex::altitude] - altitude_m;
        const double below = step(t_end)[StateIndex::altitude] - altitude_m;
        if (!(above > 0.0 && below <= 0.0)) {
            if (t_end >= end_time_)
                break;
            continue;
        }
        const auto g = [&](double t) { return step(t)[StateIndex::altitude] - altitude_m; };
        std::uintmax_t iterations = 100;
        const auto close = [&](double a, double b) { return b - a <= time_tolerance_s; };
        return boost::math::tools::toms748_solve(g, step.t0, t_end, above, below, close, iterations)
            .second;
    }
    return std::nullopt;
}

}  // namespace ds
