#pragma once

#include <optional>
#include <vector>

#include "mass/budget.hpp"
#include "parachute/canopy.hpp"
#include "sizing/descent_flight.hpp"
#include "sizing/entry_conic.hpp"
#include "sizing/entry_flight.hpp"
#include "sizing/terminal_burn.hpp"

namespace ds {

/// How closely the evaluations are flown that only aim a search (the mass closure's that only
/// aim its secant, far from the closed mass): at this relative tolerance where the design's is
/// tighter, which moves a budget by grams where the secant is still kilograms off (our choice).
inline constexpr double aiming_relative_tolerance = 1e-6;
/// And a powered descent's throttle is solved so that its burn ends within the time the engines
/// take to burn this much propellant at full throttle of the time the exact throttle's ends
/// (where the design's is solved to 1e-6 s): a tenth of the mass closure's tolerance, which the
/// secant then sees (our choice; 1.9e-4 s on the heavy cargo sample; the separation solve under
/// a canopy gains no flight from a looser tolerance and keeps 1e-6 s).
inline constexpr double aiming_propellant_tolerance_kg = 0.01;

/// The mass closure's first evaluation, at its first guess (tens of percent off), gives the
/// secant no more than its first residual: at this relative tolerance where the design's is
/// tighter, its powered descent's throttle solved to this of the burn's time (our choice; it
/// moves a closed budget by grams, through the secant's path).
inline constexpr double first_guess_relative_tolerance = 1e-5;
inline constexpr double first_guess_end_time_tolerance_s = 1e-3;

/// A dispersion's case solves its separation under a canopy to this of time, where the
/// design's own is solved to 1e-6 s: it moves where the burn ends by a tenth of a millisecond's
/// descent (5 to 6 mm on the samples), and a tethered lander's propellant by up to some 14 g
/// through the hover that lowers its payload from there, far inside what the dispersions move
/// them by; the closed form's first flight then closes most solves (our choice).
inline constexpr double dispersed_separation_tolerance_s = 1e-4;
/// And a powered descent's throttle, so that its burn ends within this of the time the exact
/// throttle's ends (1e-6 s for the design's own): a millisecond, which moves the heavy cargo
/// lander's propellant by up to 10 g (our choice).
inline constexpr double dispersed_end_time_tolerance_s = 1e-3;

/// Whether an evaluation flies to the design's tolerances, to the aiming ones, to the first
/// guess's, or to the design's with its burn solved as a dispersion's case
/// (dispersed_separation_tolerance_s, dispersed_end_time_tolerance_s).
enum class Precision { design, aiming, first_guess, dispersed };

/// One flight of the whole design at one entry mass, with the mass budget it implies: the
/// step the closure iterates, and what the results are made from.
struct Evaluation {
    double entry_kg = 0.0;
    ResolvedAeroshell aeroshell;  ///< diameter 0: the sizing request has no solution
    EntryFlight entry;
    double total_heat_load_J_cm2 = 0.0;  ///< convective plus radiative

    CanopyType canopy;
    double canopy_drag_coefficient = 0.0;
    double canopy_diameter_m = 0.0;  ///< 0: the sizing request has no solution

    /// The approach's or the orbit's conic, when the entry starts from one.
    std::optional<EntryConic> conic;
    double deorbit_propellant_kg = 0.0;  ///< with an orbit

    MassBudget budget;
    // The lumps of the budget as flown (given, or estimated with growth), besides the design's
    // own items in the same groups: what freezing the vehicle fixes.
    double heat_shield_kg = 0.0;
    double decelerator_kg = 0.0;
    double backshell_kg = 0.0;
    double parachute_kg = 0.0;
    double drogue_kg = 0.0;
    double lander_kg = 0.0;  ///< what separates from the backshell (for a burn)
    /// What comes down to the ground before any burn: the lander, and for "none" the backshell
    /// and the parachute it never leaves; 0 or less: nothing is left to land.
    double landing_kg = 0.0;
    double landed_kg = 0.0;
    /// Analysis mode: the fixed entry mass less everything itemised or estimated (negative
    /// when the budget does not fit in it).
    std::optional<double> unallocated_kg;

    std::optional<DescentFlight> descent;  ///< when the parachute deployed
    double full_thrust_N = 0.0;
    std::optional<BurnRequest> burn_request;
    std::optional<BurnSolution> burn;
    /// supersonic_retro: even the deepest throttle stopped above the site at the trigger, so
    /// the ignition was solved later along the flight (at that throttle).
    bool ignition_delayed = false;
    /// supersonic_retro: how the throttle solve's closed-form error changes with the throttle,
    /// for the next closure evaluation's solve (ThrottledBurn::offset_slope_m).
    std::optional<double> throttle_offset_slope_m;
    double burned_kg = 0.0;  ///< every burn, hover and fly-away included
    double loaded_propellant_kg = 0.0;
    std::optional<double> hover_time_s;      ///< tethered
    std::optional<double> touchdown_time_s;  ///< at the ground (none), or the payload's
    std::optional<double> touchdown_velocity_m_s;
    std::optional<double> impact_velocity_m_s;  ///< airbag
    std::optional<double> impact_energy_J;      ///< airbag
    /// Where the lander (the payload, for airbag and tethered) comes down, and its
    /// planet-relative horizontal speed at touchdown (retro, none), release (airbag), or that
    /// of the hovering stage (tethered).
    std::optional<GroundPoint> landing_point;
    std::optional<double> touchdown_horizontal_velocity_m_s;
    /// Where the canopy is left: backshell separation, or the touchdown for "none".
    std::optional<FlightState> canopy_exit_state;

    std::vector<TrajectorySample> history;

    /// The tolerances it was flown to.
    Precision precision = Precision::design;

    /// The entry mass the budget adds up to (without the deorbit stage, which leaves before
    /// the interface): what the closure drives to entry_kg.
    double budget_kg() const { return budget.entry_kg(); }
};

/// When the design cannot land at its own site, the highest feasible site is looked for down
/// to this far below it (our choice).
inline constexpr double capability_depth_below_site_m = 5000.0;

/// Flies the design at an entry mass and builds its budget. In analysis mode (the design fixes
/// the entry mass), what the budget leaves over is added as "unallocated". Without `history`
/// the evaluation's history stays empty (and the flights record no samples). `previous`, an
/// evaluation of the same design at another entry mass (the closure's last) or of the nominal
/// vehicle a dispersed case varies, guides the solve of a powered descent's throttle.
Evaluation evaluate(const Design& design, const FlightModel& model, double entry_kg,
                    bool history = true, Precision precision = Precision::design,
                    const Evaluation* previous = nullptr);

/// The timeline margin of an evaluation at a site elevation: time from parachute deploy to the
/// start of the terminal burn (the touchdown for "none"), less the time the sequence needs.
/// Negative also when the lander cannot stop in time there. Uses the evaluation's own descent;
/// at another site than the design's, the burn is solved again, guided by `guide` when given
/// (what the solves before it on this evaluation's descent measured; it gains this one's).
/// For a powered descent from the entry (supersonic_retro, design's site only): the time from
/// ignition to touchdown, less the ground-sensing lock the terminal descent needs.
struct TimelineMargin {
    double available_s = 0.0;
    double needed_s = 0.0;
    double margin_s = 0.0;
};
std::optional<TimelineMargin> timeline_margin(const Design& design, const FlightModel& model,
                                              const Evaluation& evaluation, double site_elevation_m,
                                              SeparationGuide* guide = nullptr);

/// How high a powered descent from the entry can land: its burn lit at the trigger at the
/// design's throttle (the most), flown on until it slows to its end speed over no ground. The
/// site it ends its end height above is the highest it stops in time for (a burn at less
/// throttle ends lower; above it the margin counts the excess speed, a jump), and `margin_s` is
/// the timeline margin there. Flown as timeline_margin flies other sites. Nothing when the
/// evaluation has no powered descent from the entry, or the burn has not slowed to its end
/// speed `lowest_site_m` above the lowest site searched.
struct PoweredReach {
    double site_m = 0.0;
    double margin_s = 0.0;
};
std::optional<PoweredReach> powered_reach(const Design& design, const FlightModel& model,
                                          const Evaluation& evaluation, double lowest_site_m);

}  // namespace ds
