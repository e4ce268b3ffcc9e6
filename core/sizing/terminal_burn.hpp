#pragma once

#include <vector>

#include "flight/phase.hpp"

namespace ds {

/// The terminal burn to solve: where it must end, and what burns.
struct BurnRequest {
    double site_elevation_m = 0.0;
    double end_height_above_site_m = 0.0;  ///< 0 for a touchdown
    double end_velocity_m_s = 0.0;
    double lander_mass_kg = 0.0;  ///< at separation from the backshell
    double thrust_N = 0.0;
    double specific_impulse_s = 0.0;
    double coast_s = 0.0;                       ///< free fall from separation to ignition
    double separation_time_tolerance_s = 1e-6;  ///< how closely the separation is solved
};

/// The solved burn. When no separation time along the descent lets the lander stop in time,
/// `stops_in_time` is false and the figures are those of separating at parachute deploy,
/// ending at the ground.
struct BurnSolution {
    bool stops_in_time = false;
    double separation_time_s = 0.0;
    FlightState separation_state;
    double ignition_time_s = 0.0;
    FlightState ignition_state;
    double end_time_s = 0.0;
    FlightState end_state;
    double burn_time_s = 0.0;
    double burned_kg = 0.0;
    double ideal_delta_v_m_s = 0.0;  ///< Isp g0 ln(m_ignition / m_end)
    /// Ideal delta-v less the speed it took off: the part spent holding against gravity (what
    /// the vehicle's own drag gives back is netted in; the lander flies without drag here).
    double gravity_loss_m_s = 0.0;
    /// The flights the solve took (coast and burn from a separation time), the solved one's
    /// included, and the evaluations of the equations they made (the integrator's).
    std::size_t attempts = 0;
    std::size_t evaluations = 0;
};

/// Finds the latest separation time along the descent under the canopy at which a
/// constant-thrust burn against the velocity, after the coast, ends at the requested velocity
/// at the requested height above the site (TOMS 748 on the separation time). With `history`, the
/// solved coast and burn are appended to it.
BurnSolution solve_terminal_burn(const FlightModel& model, const DenseTrajectory& descent,
                                 const BurnRequest& request,
                                 const IntegratorSettings<flight_state_size>& settings,
                                 std::vector<TrajectorySample>* history = nullptr);

}  // namespace ds
