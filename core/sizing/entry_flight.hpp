#pragma once

#include <optional>
#include <string>
#include <vector>

#include "design/design.hpp"
#include "flight/ground_track.hpp"
#include "flight/phase.hpp"
#include "results/results.hpp"

namespace ds {

/// The aeroshell as flown: its diameter (given, or sized for a ballistic coefficient) and Cd.
struct ResolvedAeroshell {
    double diameter_m = 0.0;  ///< 0 when a sizing request has no solution
    double drag_coefficient = 0.0;
    DragCoefficientSource drag_coefficient_source = DragCoefficientSource::design;
};

ResolvedAeroshell resolve_aeroshell(const Design& design, double entry_mass_kg);

/// The azimuth flown when the entry gives none: east, for the ground track and the winds (our
/// choice; the body is then flown without rotation, so no direction is favoured by it).
inline constexpr double default_entry_azimuth_deg = 90.0;

/// A velocity as speed, flight-path angle and azimuth (clockwise from north), m/s and rad.
struct SpeedAndAngles {
    double speed_m_s = 0.0;
    double flight_path_angle_rad = 0.0;
    double azimuth_rad = 0.0;
};

/// The entry state at the interface, planet-relative (what is flown) and inertial: the one the
/// design gives, and the other from v_rel = v_in - w x r, w x r being omega r cos(latitude)
/// to the east.
struct InterfaceState {
    GroundPoint point;
    double altitude_m = 0.0;
    bool rotation_flown = false;  ///< the entry has a direction and the body turns
    SpeedAndAngles relative;
    SpeedAndAngles inertial;
};

/// The design's entry state over the flown body (flown_body: without an azimuth it does not
/// rotate, and the two frames coincide).
InterfaceState interface_state(const Design& design, const Body& flown_body);

/// Downrange and crossrange are measured along and across the entry's great circle.
TrackReference entry_track(const InterfaceState& entry, const Body& body);

/// The largest value of a quantity over a flight, where it happened.
struct PeakValue {
    double value = 0.0;
    double time_s = 0.0;
    FlightState y;
};

/// How the flight from the interface to its last trigger went: the parachute's deploy, or the
/// ignition of a powered descent from the entry (`deployed` for both); without either, the
/// entry flies to the ground.
enum class EntryEnd { deployed, ground, skip_out, stopped };

/// Where a device deployed on the way to the parachute (the decelerator, the drogue): the state
/// and the conditions at its trigger.
struct Deployment {
    double time_s = 0.0;
    FlightState state;
    FlightConditions conditions;
};

/// The entry, and the inflatable decelerator's and the drogue's phases when the design has
/// them.
struct EntryFlight {
    ResolvedAeroshell aeroshell;
    InterfaceState interface;
    FlightState start;
    EntryEnd end = EntryEnd::stopped;
    StopReason stop_reason = StopReason::reached_end;  ///< why, when `stopped`
    std::size_t steps = 0;
    std::size_t evaluations = 0;  ///< of the equations by the integrator, rejected steps included
    double end_time_s = 0.0;
    FlightState end_state;  ///< at the parachute trigger when deployed
    FlightConditions end_conditions;
    PeakValue dynamic_pressure, deceleration, heat_flux, radiative_heat_flux;
    std::optional<Deployment> decelerator;  ///< when it deployed
    std::optional<Deployment> drogue;       ///< when it deployed
};

/// The stage of the entry vehicle: the aeroshell, with its lift and nose.
/// The aeroshell as a drag device: its hypersonic Cd on its frontal area, with the design's law
/// of Cd against Mach.
DragDevice aeroshell_device(const Design& design, const ResolvedAeroshell& aeroshell);

/// The drogue as a drag device, with its type's drag against Mach (the design must have one).
DragDevice drogue_device(const Design& design);

/// The inflatable decelerator as a drag device (the design must have one).
DragDevice decelerator_device(const Design& design);

Stage entry_stage(const Design& design, const ResolvedAeroshell& aeroshell);

/// Flies from the entry interface to the parachute trigger (through the decelerator phase when
/// the design has one). Needs a resolved aeroshell with a diameter.
EntryFlight fly_entry(const Design& design, const FlightModel& model,
                      const ResolvedAeroshell& aeroshell, double entry_mass_kg,
                      std::vector<TrajectorySample>* history);

/// The design's trigger as a phase end, and in words ("Mach 1.8").
Trigger deploy_trigger(std::string_view name, TriggerKind kind, double value);

/// What ends the entry: the ignition of a supersonic retro-propulsive descent, else the
/// parachute's deploy; none for a design with neither (it flies to the ground).
std::optional<Trigger> entry_end_trigger(const Design& design);
std::string describe_trigger(TriggerKind kind, double value);

}  // namespace ds
