#pragma once

#include <optional>
#include <string>
#include <vector>

#include "flight/dense_trajectory.hpp"
#include "flight/flight_model.hpp"
#include "results/results.hpp"

namespace ds {

/// A scalar of the flight that triggers and peaks refer to.
enum class FlightQuantity {
    altitude,          ///< m
    velocity,          ///< m/s
    mach,
    dynamic_pressure,  ///< Pa
    deceleration,      ///< g
    heat_flux,         ///< W/m^2, convective
    radiative_heat_flux,  ///< W/m^2
};

double flight_quantity(FlightQuantity quantity, const FlightConditions& conditions,
                       const FlightState& y);

/// Ends a phase when a quantity crosses a value in the given direction (and, when asked, only
/// while the flight descends).
struct Trigger {
    std::string name;
    FlightQuantity quantity = FlightQuantity::altitude;
    double value = 0.0;
    EventDirection direction = EventDirection::falling;
    bool descending_only = false;  ///< a crossing counts only at a negative flight-path angle
};

/// A quantity whose local maxima are located during a phase.
struct Peak {
    std::string name;
    FlightQuantity quantity = FlightQuantity::dynamic_pressure;
};

/// One flight phase as data: what flies, and what ends it.
struct Phase {
    std::string name;
    Stage stage;
    std::vector<Trigger> ends;
    std::vector<Peak> peaks;
};

struct PeakHit {
    std::size_t peak = 0;  ///< into Phase::peaks
    double time_s = 0.0;
    double value = 0.0;
    FlightState y;
};

struct PhaseOutcome {
    StopReason reason = StopReason::reached_end;
    std::optional<std::size_t> ended_by;  ///< into Phase::ends, when a trigger ended it
    double time_s = 0.0;
    FlightState y;
    std::vector<PeakHit> peaks;  ///< every local maximum, in time order
    std::size_t steps = 0;
    std::size_t evaluations = 0;
};

/// What a flight keeps besides its outcome, when asked.
struct PhaseRecording {
    std::vector<TrajectorySample>* history = nullptr;  ///< a sample per accepted step
    DenseTrajectory* dense = nullptr;                  ///< the continuous extension
};

/// Flies one phase from (t0, y0) until a trigger, or until t_max or the step budget runs out.
PhaseOutcome fly_phase(const FlightModel& model, const Phase& phase, double t0,
                       const FlightState& y0, double t_max,
                       const IntegratorSettings<flight_state_size>& settings,
                       PhaseRecording recording = {});

/// The tolerances we fly with: relative as given, absolute scaled to each state's magnitude.
IntegratorSettings<flight_state_size> flight_integrator_settings(double relative_tolerance,
                                                                 std::size_t max_steps);

TrajectorySample trajectory_sample(double time_s, const FlightConditions& conditions,
                                   const FlightState& y);

}  // namespace ds
