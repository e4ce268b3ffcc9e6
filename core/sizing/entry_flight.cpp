#include "sizing/entry_flight.hpp"

#include <cmath>

#include <fmt/format.h>

#include "aeroshell/sphere_cone.hpp"
#include "constants.hpp"
#include "parachute/canopy.hpp"
#include "sizing/entry_conic.hpp"
#include "sizing/environment.hpp"

namespace ds {
namespace {

// The peaks every entry-like phase locates, in this order.
enum PeakIndex : std::size_t {
    dynamic_pressure_peak,
    deceleration_peak,
    heat_flux_peak,
    radiative_peak
};

std::vector<Peak> entry_peaks() {
    return {{"peak dynamic pressure", FlightQuantity::dynamic_pressure},
            {"peak deceleration", FlightQuantity::deceleration},
            {"peak heat flux", FlightQuantity::heat_flux},
            {"peak radiative heat flux", FlightQuantity::radiative_heat_flux}};
}

/// Raises `best` to the phase's located maxima and its two ends (a quantity may still be
/// rising when the phase ends), given the flight conditions at the ends.
void raise_peak(PeakValue& best, const Phase& phase, std::size_t peak, double t0,
                const FlightState& y0, const FlightConditions& at_start, const PhaseOutcome& flown,
                const FlightConditions& at_end) {
    const FlightQuantity q = phase.peaks[peak].quantity;
    const auto consider = [&](double value, double t, const FlightState& y) {
        if (value > best.value)
            best = {value, t, y};
    };
    consider(flight_quantity(q, at_start, y0), t0, y0);
    consider(flight_quantity(q, at_end, flown.y), flown.time_s, flown.y);
    for (const PeakHit& hit : flown.peaks) {
        if (hit.peak == peak)
            consider(hit.value, hit.time_s, hit.y);
    }
}

/// A velocity from its east, north and up components.
SpeedAndAngles speed_and_angles(double east, double north, double up) {
    const double horizontal = std::hypot(east, north);
    return {std::hypot(horizontal, up), std::atan2(up, horizontal), std::atan2(east, north)};
}

}  // namespace

InterfaceState interface_state(const Design& design, const Body& flown_body) {
    const EntryDesign& e = design.entry;
    InterfaceState out;
    out.point = {degrees_to_radians(e.latitude_deg.value_or(0.0)),
                 degrees_to_radians(e.longitude_deg.value_or(0.0))};
    out.altitude_m = e.interface_altitude_m;
    out.rotation_flown = e.azimuth_deg.has_value() && flown_body.rotation_rad_s != 0.0;
    // The state given, or the inertial one of the approach's or the orbit's conic.
    double v = e.velocity_m_s;
    double gamma = degrees_to_radians(e.flight_path_angle_deg);
    bool inertial = e.velocity_frame == VelocityFrame::inertial;
    if (const auto conic = entry_conic(design, flown_body)) {
        v = conic->speed_m_s;
        gamma = conic->flight_path_angle_rad;
        inertial = true;
    }
    const double azimuth = degrees_to_radians(e.azimuth_deg.value_or(default_entry_azimuth_deg));
    const double east = v * std::cos(gamma) * std::sin(azimuth);
    const double north = v * std::cos(gamma) * std::cos(azimuth);
    const double up = v * std::sin(gamma);
    // w x r at the entry point: the body's surface speed there, to the east.
    const double carried = flown_body.rotation_rad_s * (flown_body.radius_m + out.altitude_m) *
                           std::cos(out.point.latitude_rad);
    const SpeedAndAngles given = speed_and_angles(east, north, up);
    if (inertial) {
        out.inertial = given;
        out.relative = speed_and_angles(east - carried, north, up);
    } else {
        out.relative = given;
        out.inertial = speed_and_angles(east + carried, north, up);
    }
    return out;
}

TrackReference entry_track(const InterfaceState& entry, const Body& body) {
    return {entry.point, entry.relative.azimuth_rad, body.radius_m};
}

ResolvedAeroshell resolve_aeroshell(const Design& design, double entry_mass_kg) {
    const AeroshellDesign& a = design.aeroshell;
    const double half_angle = degrees_to_radians(a.half_angle_deg);
    const double gamma = design_gamma(design);
    const auto drag_coefficient_of = [&](double diameter_m) {
        if (a.drag_coefficient)
            return *a.drag_coefficient;
        return modified_newtonian_sphere_cone_drag_coefficient(
            half_angle, a.nose_radius_m / (0.5 * diameter_m), gamma);
    };
    ResolvedAeroshell out;
    out.drag_coefficient_source = a.drag_coefficient ? DragCoefficientSource::design
                                                     : DragCoefficientSource::modified_newtonian;
    out.diameter_m = a.diameter_m ? *a.diameter_m
                                  : diameter_for_ballistic_coefficient(
                                        entry_mass_kg, *a.size_for_ballistic_coefficient_kg_m2,
                                        2.0 * a.nose_radius_m, drag_coefficient_of);
    if (out.diameter_m > 0.0)
        out.drag_coefficient = drag_coefficient_of(out.diameter_m);
    return out;
}

Trigger deploy_trigger(std::string_view name, TriggerKind kind, double value) {
    switch (kind) {
        case TriggerKind::mach:
            return {name, FlightQuantity::mach, value, EventDirection::falling};
        case TriggerKind::dynamic_pressure:
            // The dynamic pressure also falls on a climb (a skip, a lofted path), at any speed:
            // only its fall in descending flight is the slowing down a deploy waits for. (A Mach
            // number falls only as the vehicle slows, and an altitude only in descent.)
            return {name, FlightQuantity::dynamic_pressure, value, EventDirection::falling, true};
        case TriggerKind::altitude:
            return {name, FlightQuantity::altitude, value, EventDirection::falling};
    }
    return {};
}

std::optional<Trigger> entry_end_trigger(const Design& design) {
    if (design.terminal.method == TerminalMethod::supersonic_retro) {
        return deploy_trigger("engine ignition", design.terminal.trigger,
                              design.terminal.trigger_value);
    }
    if (design.parachute) {
        return deploy_trigger("parachute deploy", design.parachute->trigger,
                              design.parachute->trigger_value);
    }
    return std::nullopt;
}

std::string describe_trigger(TriggerKind kind, double value) {
    switch (kind) {
        case TriggerKind::mach:
            return fmt::format("Mach {:.3g}", value);
        case TriggerKind::dynamic_pressure:
            return fmt::format("dynamic pressure {:.4g} Pa", value);
        case TriggerKind::altitude:
            return fmt::format("altitude {:.6g} m", value);
    }
    return {};
}

DragDevice aeroshell_device(const Design& design, const ResolvedAeroshell& aeroshell) {
    DragDevice device{frontal_area_m2(aeroshell.diameter_m), aeroshell.drag_coefficient, {}};
    if (design.aeroshell.drag_against_mach == DragMachLaw::modified_newtonian)
        device.follow_stagnation_pressure(design_gamma(design));
    return device;
}

DragDevice decelerator_device(const Design& design) {
    const DeceleratorDesign& d = *design.decelerator;
    return {frontal_area_m2(d.diameter_m), d.drag_coefficient, {}};
}

DragDevice drogue_device(const Design& design) {
    const DrogueDesign& d = *design.drogue;
    const CanopyType type = *canopy_type(d.type);
    return canopy_device(type, d.diameter_m, d.drag_coefficient.value_or(type.drag_coefficient));
}

Stage entry_stage(const Design& design, const ResolvedAeroshell& aeroshell) {
    Stage stage;
    stage.drag_devices = {aeroshell_device(design, aeroshell)};
    stage.lift_to_drag = design.entry.lift_to_drag;
    stage.bank = degrees_to_radians(design.entry.bank_angle_deg);
    stage.nose_radius_m = design.aeroshell.nose_radius_m;
    return stage;
}

EntryFlight fly_entry(const Design& design, const FlightModel& model,
                      const ResolvedAeroshell& aeroshell, double entry_mass_kg,
                      std::vector<TrajectorySample>* history) {
    EntryFlight out;
    out.aeroshell = aeroshell;
    out.interface = interface_state(design, model.body);
    const InterfaceState& at = out.interface;
    out.start = make_flight_state(at.altitude_m, at.point.latitude_rad, at.point.longitude_rad,
                                  at.relative.speed_m_s, at.relative.flight_path_angle_rad,
                                  at.relative.azimuth_rad, entry_mass_kg);
    const auto settings = design_integrator_settings(design);

    Phase phase;
    phase.name = "entry";
    phase.stage = entry_stage(design, aeroshell);
    phase.peaks = entry_peaks();
    const Trigger ground{"ground impact", FlightQuantity::altitude, design.site.elevation_m,
                         EventDirection::falling};
    const Trigger exit{"atmospheric exit", FlightQuantity::altitude,
                       design.entry.interface_altitude_m, EventDirection::rising};
    const std::optional<Trigger> last = entry_end_trigger(design);

    // With a decelerator, the entry ends at its trigger and a phase with its drag added flies
    // on; with a drogue, a phase under the drogue (without lift) flies on to the parachute's
    // trigger. Each phase but the last ends at the next one's deploy, recorded in `deployed`.
    std::vector<Phase> phases;
    std::vector<std::optional<Deployment>*> deployed;
    if (design.decelerator) {
        const DeceleratorDesign& d = *design.decelerator;
        phase.ends = {deploy_trigger("decelerator deploy", d.trigger, d.trigger_value), ground,
                      exit};
        phases.push_back(phase);
        deployed.push_back(&out.decelerator);
        phase.name = "decelerator";
        phase.stage.drag_devices.push_back(decelerator_device(design));
    }
    if (design.drogue) {
        const DrogueDesign& d = *design.drogue;
        phase.ends = {deploy_trigger("drogue deploy", d.trigger, d.trigger_value), ground, exit};
        phases.push_back(phase);
        deployed.push_back(&out.drogue);
        phase.name = "drogue";
        phase.stage.drag_devices.push_back(drogue_device(design));
        phase.stage.lift_to_drag = 0.0;
    }
    phase.ends = {ground, exit};
    if (last)
        phase.ends.insert(phase.ends.begin(), *last);
    phases.push_back(phase);

    double t = 0.0;
    FlightState y = out.start;
    for (std::size_t i = 0; i < phases.size(); ++i) {
        const Phase& p = phases[i];
        const FlightConditions at_start = flight_conditions(model, p.stage, y);
        const PhaseOutcome flown =
            fly_phase(model, p, t, y, design.solver.max_time_s, settings, {history, nullptr});
        out.end_conditions = flight_conditions(model, p.stage, flown.y);
        const FlightConditions& at_end = out.end_conditions;
        raise_peak(out.dynamic_pressure, p, dynamic_pressure_peak, t, y, at_start, flown, at_end);
        raise_peak(out.deceleration, p, deceleration_peak, t, y, at_start, flown, at_end);
        raise_peak(out.heat_flux, p, heat_flux_peak, t, y, at_start, flown, at_end);
        raise_peak(out.radiative_heat_flux, p, radiative_peak, t, y, at_start, flown, at_end);
        out.steps += flown.steps;
        out.evaluations += flown.evaluations;
        out.end_time_s = flown.time_s;
        out.end_state = flown.y;
        if (flown.reason != StopReason::terminal_event) {
            out.end = EntryEnd::stopped;
            out.stop_reason = flown.reason;
            return out;
        }
        const std::string_view ended_by = p.ends[*flown.ended_by].name;
        if (ended_by == ground.name) {
            out.end = EntryEnd::ground;
            return out;
        }
        if (ended_by == exit.name) {
            out.end = EntryEnd::skip_out;
            return out;
        }
        if (i < deployed.size())
            *deployed[i] = Deployment{flown.time_s, flown.y, out.end_conditions};
        t = flown.time_s;
        y = flown.y;
    }
    out.end = EntryEnd::deployed;
    return out;
}

}  // namespace ds
