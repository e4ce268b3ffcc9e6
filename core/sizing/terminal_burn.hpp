#pragma once

#include <optional>
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
    /// Thrust over the engines' full thrust (for the record).
    double throttle = 1.0;
    /// What drags during the coast and the burn: nothing for a lander that left its backshell;
    /// the aeroshell (and decelerator), their drag scaled by the drag kept while the engines
    /// fire, for a powered descent from the entry.
    std::vector<DragDevice> drag_devices;
    double thrust_reference_area_m2 = 0.0;  ///< of C_T in the history; 0: none
    /// A powered descent from the entry: thrust against the air-relative velocity (a gravity
    /// turn into the flow) until the flight is within gravity_turn_end_deg of the vertical,
    /// then against the velocity over the ground to the end (which nulls the drift the wind
    /// leaves). False: against the velocity over the ground throughout.
    bool gravity_turn = false;
};

/// The gravity turn of a powered descent hands over to the terminal descent at this flight-path
/// angle from the vertical (our choice: by then the velocity is nearly vertical and the two
/// thrust directions differ only by the wind's share).
inline constexpr double gravity_turn_end_deg = 10.0;

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
    /// Over the burn: the largest sensed deceleration (thrust and drag, g) and dynamic pressure.
    double peak_sensed_deceleration_g = 0.0;
    double peak_dynamic_pressure_Pa = 0.0;
    double throttle = 1.0;  ///< as flown
    /// The flights the solve took (coast and burn from a separation time), the solved one's
    /// included, and the evaluations of the equations they made (the integrator's).
    std::size_t attempts = 0;
    std::size_t evaluations = 0;
    /// Of a separation solve (solve_terminal_burn): the solved flight's miss less the closed
    /// form's at its separation, which a solve on another descent of the same vehicle may start
    /// from (SeparationGuide::start_from).
    double closed_form_offset_m = 0.0;
};

/// The stage that burns as the request asks: its drag devices, its thrust (at its throttle),
/// specific impulse and C_T's reference area; thrust against the velocity over the ground.
Stage burn_stage(const BurnRequest& request);

/// Flies one separation (or, with no coast, ignition) at t_s from the given state: the coast,
/// then the burn to the request's end velocity or the ground. `reached_velocity` says which.
struct BurnAttempt {
    bool reached_velocity = false;
    BurnSolution burn;
};
BurnAttempt fly_burn(const FlightModel& model, const BurnRequest& request,
                     const IntegratorSettings<flight_state_size>& settings, double t_s,
                     FlightState separation_state,
                     std::vector<TrajectorySample>* history = nullptr);

/// How far above its target a burn ends (negative: below it, or at the ground too fast).
/// Continuous across the two cases: at the ground, the excess speed counts as metres per
/// (m/s) times one second.
double burn_miss(const BurnAttempt& attempt, const BurnRequest& request);

/// What the flights of separation solves on one descent have measured of the closed-form
/// miss's error (the flown miss less the modelled one, along the separation time), for the
/// solves that follow on the same descent with the same lander, burn and end (at another site:
/// the error does not depend on the site). A flight too late measures it only until one stops in
/// time (it ends at the ground, where the miss counts its excess speed instead).
class SeparationGuide {
public:
    void add(double t_s, double offset_m, bool stopped);

    /// Until a flight of its own, the offset a solve on another descent of the same vehicle
    /// measured (a dispersion's nominal flight, BurnSolution::closed_form_offset_m), where the
    /// guide otherwise starts from none.
    void start_from(double offset_m) { prior_ = offset_m; }

    struct Estimate {
        double offset_m = 0.0;
        /// What it is made from: nothing, another descent's solve, one flight, a line through
        /// two flights on the same side of the time, or between two.
        enum From { none, prior, one, beyond, between } from = none;
        double distance_s = 0.0;  ///< to the nearest flight that stopped in time
    };
    Estimate at(double t_s) const;

private:
    struct Point {
        double t_s = 0.0;
        double offset_m = 0.0;
    };
    std::vector<Point> stopped_;  ///< in time order
    std::optional<Point> late_;
    std::optional<double> prior_;
};

/// Finds the latest separation time along the descent under the canopy at which a
/// constant-thrust burn against the velocity, after the coast, ends at the requested velocity
/// at the requested height above the site, to the request's tolerance. Each flight is guided by the
/// closed-form miss (a free-fall coast, then a vertical burn at constant thrust by the rocket
/// equation, without drag) corrected by what the flights measured; the Illinois method on the flown
/// miss where that does not close. With `guide`, the solve starts from what earlier solves on the
/// same descent measured, and adds its own flights to it. With `history`, the solved coast and burn
/// are appended to it.
BurnSolution solve_terminal_burn(const FlightModel& model, const DenseTrajectory& descent,
                                 const BurnRequest& request,
                                 const IntegratorSettings<flight_state_size>& settings,
                                 std::vector<TrajectorySample>* history = nullptr,
                                 SeparationGuide* guide = nullptr);

/// How closely a throttle is solved, and what the solve may start from.
struct ThrottleSolve {
    /// The solved burn ends within this of the time the exact throttle's burn ends: the
    /// timeline margin of a powered descent is the burn's time, and the separation solve's own
    /// tolerance is the same 1e-6 s. A solve ends on a flight that stops in time with a miss below
    /// this times the burn's mean rate of descent (see solve_burn_throttle).
    double end_time_tolerance_s = 1e-6;
    /// A burn solved earlier from the same ignition, with the same vehicle and burn, for another
    /// site: where its flight ended measures the closed form's error, which does not depend on
    /// the site, so the solve starts from it (ignored unless it stopped in time).
    const BurnSolution* earlier = nullptr;
    /// What `earlier` was solved for, when that was another vehicle from another ignition (the
    /// mass closure's previous entry mass): its closed-form error, taken on its own request and
    /// ignition, guides the first flight only, for it changes with the vehicle.
    const BurnRequest* earlier_request = nullptr;
    /// How the closed form's error changes with the throttle (m per unit of throttle), as an
    /// earlier solve measured it (ThrottledBurn::offset_slope_m): until this solve has measured
    /// its error at two throttles, its guide takes the error's change from it, not as constant.
    std::optional<double> offset_slope_m;
};

/// The throttle between min_throttle and the request's at which a drag-free powered descent
/// from `ignition_state` ends at the end speed at the target height, in closed form (the
/// solve's first guess): the vertical burn at constant thrust by the rocket equation (its mass
/// falling), its height scaled by what a gravity turn at the thrust acceleration of ignition
/// takes over a vertical burn from the same speed (the constant-acceleration gravity turn in
/// closed form, Culler and Fried, J. Appl. Phys. 28, 1957, from memory; derived in the source).
/// The nearer end of the range when none ends there.
double closed_form_throttle(const FlightModel& model, const BurnRequest& request,
                            double full_thrust_N, double min_throttle,
                            const FlightState& ignition_state);

/// A powered descent lit at a point of the entry (supersonic retro-propulsion): the throttle
/// between min_throttle and the request's (the most the design flies) that ends the burn at the
/// end velocity at the target height. Each flight is guided by the closed-form end of the burn
/// (closed_form_throttle's) corrected by what the flights measured of its error, aimed just
/// above the target so that it lands on the side that stops in time; the solve ends on a flight
/// that stops within `how`'s tolerance (the Illinois method on the miss where the guide does not
/// close). `too_strong` when even the deepest throttle stops above the target: the ignition must
/// then come later. When even the most throttle does not stop in time, the burn at that
/// throttle, with stops_in_time false.
struct ThrottledBurn {
    BurnSolution burn;
    bool too_strong = false;
    /// The change of the closed form's error with the throttle between the solve's last two
    /// measures of it at different throttles (m per unit of throttle), for a later solve's
    /// guide (ThrottleSolve::offset_slope_m); none when it measured fewer.
    std::optional<double> offset_slope_m;
};
ThrottledBurn solve_burn_throttle(const FlightModel& model, const BurnRequest& request,
                                  double full_thrust_N, double min_throttle,
                                  const IntegratorSettings<flight_state_size>& settings,
                                  double ignition_time_s, const FlightState& ignition_state,
                                  std::vector<TrajectorySample>* history = nullptr,
                                  const ThrottleSolve& how = {});

}  // namespace ds
