#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "flight/dense_trajectory.hpp"
#include "flight/flight_model.hpp"
#include "flight/trajectory_sample.hpp"

namespace ds {

/// A scalar of the flight that triggers and peaks refer to.
enum class FlightQuantity {
    altitude,  ///< m
    velocity,  ///< m/s
    mach,
    dynamic_pressure,     ///< Pa
    deceleration,         ///< g
    heat_flux,            ///< W/m^2, convective
    radiative_heat_flux,  ///< W/m^2
    flight_path_angle,    ///< deg, planet-relative
    sensed_deceleration,  ///< g, thrust included (FlightConditions::sensed_deceleration_g)
};

double flight_quantity(FlightQuantity quantity, const FlightConditions& conditions,
                       const FlightState& y);

/// Ends a phase when a quantity crosses a value in the given direction (and, when asked, only
/// while the flight descends).
struct Trigger {
    std::string_view name;  ///< a literal: the names of triggers, peaks and phases are the code's
    FlightQuantity quantity = FlightQuantity::altitude;
    double value = 0.0;
    EventDirection direction = EventDirection::falling;
    bool descending_only = false;  ///< a crossing counts only at a negative flight-path angle
};

/// A quantity whose local maxima are located during a phase.
struct Peak {
    std::string_view name;
    FlightQuantity quantity = FlightQuantity::dynamic_pressure;
};

/// One flight phase as data: what flies, and what ends it.
struct Phase {
    std::string_view name;
    Stage stage;
    std::vector<Trigger> ends;
    std::vector<Peak> peaks;
    /// Once the flight has settled onto its equilibrium, fly on the quasi-steady equations
    /// (quasi_steady_derivative) until it unsettles; for a stage without thrust or lift only,
    /// ignored otherwise. See fly_phase.
    bool quasi_steady_when_settled = false;
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
    std::size_t quasi_steady_steps = 0;  ///< of `steps`, on the quasi-steady equations
    std::size_t evaluations = 0;
};

/// What a flight keeps besides its outcome, when asked.
struct PhaseRecording {
    std::vector<TrajectorySample>* history = nullptr;  ///< a sample per accepted step
    DenseTrajectory* dense = nullptr;                  ///< the continuous extension
};

/// Flies one phase from (t0, y0) until a trigger, or until t_max or the step budget runs out.
/// A phase that may fly quasi-steady does so from where it has settled: where its fast rates
/// (unsettled_rate) and the quasi-steady deceleration have both fallen below 1e-3 g; it goes
/// back to the full equations where that deceleration rises past 2e-3 g. At the change to the
/// quasi-steady equations the state is moved onto the equilibrium; a trigger that the move
/// carries it across ends the phase there. The recording and the outcome cover the whole
/// phase whatever equations flew it.
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
