#pragma once

#include <optional>
#include <vector>

#include "flight/state.hpp"

namespace ds {

/// A flown phase kept as the integrator's continuous extension, step by step, so that the
/// state at any time of it can be had without flying it again (the terminal-burn solver asks
/// for many separation points along one descent under the canopy).
class DenseTrajectory {
public:
    std::vector<DenseStep<flight_state_size>>& steps() { return steps_; }
    const std::vector<DenseStep<flight_state_size>>& steps() const { return steps_; }

    bool empty() const { return steps_.empty(); }
    double start_time() const { return steps_.front().t0; }
    /// The phase's end, which may lie inside its last step when an event ended it.
    double end_time() const { return end_time_; }
    void set_end_time(double t) { end_time_ = t; }

    /// The state at a time between start_time() and end_time().
    FlightState state_at(double t) const;

    /// The first time the altitude falls through the given value, to within 1e-7 s.
    std::optional<double> time_descending_through(double altitude_m) const;

private:
    std::vector<DenseStep<flight_state_size>> steps_;
    double end_time_ = 0.0;
};

}  // namespace ds
