#include "sizing/size.hpp"

#include <algorithm>
#include <cmath>
#include <memory>
#include <stdexcept>

#include <fmt/format.h>

#include "aeroshell/sphere_cone.hpp"
#include "checks/rule_set.hpp"
#include "constants.hpp"
#include "flight/phase.hpp"
#include "heating/heat_shield_mass.hpp"
#include "parachute/canopy.hpp"
#include "sizing/environment.hpp"

namespace ds {
namespace {

constexpr double per_cm2 = 1e-4;  // W/m^2 to W/cm^2, J/m^2 to J/cm^2

struct ResolvedAeroshell {
    double diameter_m = 0.0;  ///< 0 when a sizing request has no solution
    double drag_coefficient = 0.0;
    std::string drag_coefficient_source;
};

ResolvedAeroshell resolve_aeroshell(const Design& design, double mass_kg) {
    const AeroshellDesign& a = design.aeroshell;
    const double half_angle = degrees_to_radians(a.half_angle_deg);
    const double gamma = design_gamma(design);
    const auto drag_coefficient_of = [&](double diameter_m) {
        if (a.drag_coefficient) return *a.drag_coefficient;
        return modified_newtonian_sphere_cone_drag_coefficient(
            half_angle, a.nose_radius_m / (0.5 * diameter_m), gamma);
    };
    ResolvedAeroshell out;
    out.drag_coefficient_source = a.drag_coefficient ? "design" : "modified Newtonian";
    out.diameter_m = a.diameter_m ? *a.diameter_m
                                  : diameter_for_ballistic_coefficient(
                                        mass_kg, *a.size_for_ballistic_coefficient_kg_m2,
                                        2.0 * a.nose_radius_m, drag_coefficient_of);
    if (out.diameter_m > 0.0) out.drag_coefficient = drag_coefficient_of(out.diameter_m);
    return out;
}

Trigger parachute_trigger(const ParachuteDesign& p) {
    switch (p.trigger) {
        case TriggerKind::mach:
            return {"parachute deploy", FlightQuantity::mach, p.trigger_value,
                    EventDirection::falling};
        case TriggerKind::dynamic_pressure:
            return {"parachute deploy", FlightQuantity::dynamic_pressure, p.trigger_value,
                    EventDirection::falling};
        case TriggerKind::altitude:
            return {"parachute deploy", FlightQuantity::altitude, p.trigger_value,
                    EventDirection::falling};
    }
    throw std::invalid_argument("parachute: unknown trigger");
}

std::string describe_trigger(const ParachuteDesign& p) {
    switch (p.trigger) {
        case TriggerKind::mach: return fmt::format("Mach {:.3g}", p.trigger_value);
        case TriggerKind::dynamic_pressure:
            return fmt::format("dynamic pressure {:.4g} Pa", p.trigger_value);
        case TriggerKind::altitude: return fmt::format("altitude {:.6g} m", p.trigger_value);
    }
    return {};
}

// Indices of the entry phase's ends and peaks, in the order entry_phase lists them.
enum EntryEnd : std::size_t { deploy_end, ground_end, exit_end };
enum EntryPeak : std::size_t {
    dynamic_pressure_peak, deceleration_peak, heat_flux_peak, radiative_peak
};

Phase entry_phase(const Design& design, const ResolvedAeroshell& aeroshell) {
    Phase phase;
    phase.name = "entry";
    phase.stage.reference_area_m2 = frontal_area_m2(aeroshell.diameter_m);
    phase.stage.drag_coefficient = aeroshell.drag_coefficient;
    phase.stage.lift_to_drag = design.entry.lift_to_drag;
    phase.stage.bank_angle_rad = degrees_to_radians(design.entry.bank_angle_deg);
    phase.stage.nose_radius_m = design.aeroshell.nose_radius_m;
    phase.ends = {parachute_trigger(design.parachute),
                  {"ground impact", FlightQuantity::altitude, design.site.elevation_m,
                   EventDirection::falling},
                  {"atmospheric exit", FlightQuantity::altitude,
                   design.entry.interface_altitude_m, EventDirection::rising}};
    phase.peaks = {{"peak dynamic pressure", FlightQuantity::dynamic_pressure},
                   {"peak deceleration", FlightQuantity::deceleration},
                   {"peak heat flux", FlightQuantity::heat_flux},
                   {"peak radiative heat flux", FlightQuantity::radiative_heat_flux}};
    return phase;
}

/// The highest value of a peak's quantity over the phase: its located local maxima, and the
/// phase's two ends (a quantity may still be rising when the phase ends).
struct Highest {
    double value = 0.0;
    double time_s = 0.0;
    FlightState y;
};

Highest highest(const FlightModel& model, const Phase& phase, std::size_t peak,
                const PhaseOutcome& flown, double t0, const FlightState& y0) {
    const FlightQuantity q = phase.peaks[peak].quantity;
    const auto value_at = [&](const FlightState& y) {
        return flight_quantity(q, flight_conditions(model, phase.stage, y), y);
    };
    Highest best{value_at(y0), t0, y0};
    const double at_end = value_at(flown.y);
    if (at_end > best.value) best = {at_end, flown.time_s, flown.y};
    for (const PeakHit& hit : flown.peaks) {
        if (hit.peak == peak && hit.value > best.value) best = {hit.value, hit.time_s, hit.y};
    }
    return best;
}

std::string_view stop_reason_text(StopReason reason) {
    switch (reason) {
        case StopReason::reached_end: return "the flight-time budget ran out";
        case StopReason::step_budget: return "the integration step budget ran out";
        case StopReason::step_collapse:
            return "the integration step collapsed (the equations are stiff or singular here)";
        case StopReason::not_finite: return "the equations gave a non-finite value";
        case StopReason::terminal_event: return "a terminal event";
    }
    return "";
}

Check flight_check(std::string id, CheckStatus status, double value, double limit,
                   std::string unit, std::string message, std::string source) {
    return {std::move(id), status, value, limit, std::move(unit), std::move(message),
            std::move(source)};
}

}  // namespace

Results size_design(const Design& design) {
    Results results;
    const double mass = *design.mass.entry_kg;
    const std::unique_ptr<Atmosphere> atmosphere = make_atmosphere(design);
    const FlightModel model{design.body.body, *atmosphere};
    std::vector<Check> flight_checks;

    const ResolvedAeroshell aeroshell = resolve_aeroshell(design, mass);
    EntryResults& entry = results.entry;
    entry.mass_kg = mass;
    entry.nose_radius_m = design.aeroshell.nose_radius_m;
    entry.drag_coefficient_source = aeroshell.drag_coefficient_source;
    results.terminal.method = std::string(to_string(design.terminal.method));
    results.mass.entry_kg = mass;
    results.mass.items = {{"heat shield", design.mass.heat_shield_kg},
                          {"rest of the entry vehicle", mass - design.mass.heat_shield_kg}};

    if (design.aeroshell.size_for_ballistic_coefficient_kg_m2) {
        const double target = *design.aeroshell.size_for_ballistic_coefficient_kg_m2;
        if (aeroshell.diameter_m <= 0.0) {
            flight_checks.push_back(flight_check(
                "aeroshell_sizing", CheckStatus::fail, 0.0, target, "kg/m^2",
                fmt::format("no aeroshell diameter between the nose diameter and 100 m gives a "
                            "ballistic coefficient of {:.4g} kg/m^2 at {:.4g} kg",
                            target, mass),
                "sizing request"));
            order_checks(flight_checks);
            results.checks = std::move(flight_checks);
            results.converged = false;
            return results;
        }
        flight_checks.push_back(flight_check(
            "aeroshell_sizing", CheckStatus::pass, target, target, "kg/m^2",
            fmt::format("aeroshell sized to {:.4g} m for a ballistic coefficient of {:.4g} kg/m^2",
                        aeroshell.diameter_m, target),
            "sizing request"));
    }
    entry.diameter_m = aeroshell.diameter_m;
    entry.drag_coefficient = aeroshell.drag_coefficient;
    entry.ballistic_coefficient_kg_m2 = ballistic_coefficient_kg_m2(
        mass, aeroshell.drag_coefficient, frontal_area_m2(aeroshell.diameter_m));

    // Fly the entry phase from the interface to the parachute trigger.
    const Phase phase = entry_phase(design, aeroshell);
    FlightState y0;
    y0 << design.entry.interface_altitude_m, 0.0, design.entry.velocity_m_s,
        degrees_to_radians(design.entry.flight_path_angle_deg), mass, 0.0, 0.0;
    const auto settings = flight_integrator_settings(
        design.solver.relative_tolerance, static_cast<std::size_t>(design.solver.max_steps));
    const PhaseOutcome flown =
        fly_phase(model, phase, 0.0, y0, design.solver.max_time_s, settings, &results.history);

    const auto altitude_of = [](const Highest& h) { return h.y[StateIndex::altitude]; };
    const Highest q_max = highest(model, phase, dynamic_pressure_peak, flown, 0.0, y0);
    const Highest a_max = highest(model, phase, deceleration_peak, flown, 0.0, y0);
    const Highest heat_max = highest(model, phase, heat_flux_peak, flown, 0.0, y0);
    entry.peak_dynamic_pressure_Pa = q_max.value;
    entry.peak_dynamic_pressure_altitude_m = altitude_of(q_max);
    entry.peak_deceleration_g = a_max.value;
    entry.peak_deceleration_altitude_m = altitude_of(a_max);
    entry.peak_heat_flux_W_cm2 = heat_max.value * per_cm2;
    entry.peak_heat_flux_altitude_m = altitude_of(heat_max);
    entry.heat_load_J_cm2 = flown.y[StateIndex::convective_heat_load] * per_cm2;
    double total_heat_load_J_cm2 = entry.heat_load_J_cm2;
    if (!design.body.body.gas.radiative_correlation.empty()) {
        const Highest rad_max = highest(model, phase, radiative_peak, flown, 0.0, y0);
        entry.peak_radiative_heat_flux_W_cm2 = rad_max.value * per_cm2;
        entry.radiative_heat_load_J_cm2 = flown.y[StateIndex::radiative_heat_load] * per_cm2;
        total_heat_load_J_cm2 += *entry.radiative_heat_load_J_cm2;
    }
    entry.heat_shield_mass_fraction = heat_shield_mass_fraction(total_heat_load_J_cm2);
    entry.heat_shield_tps_kg = entry.heat_shield_mass_fraction * mass;

    // Timeline: the interface, the peaks, and how the phase ended.
    std::vector<TimelineEvent>& events = results.timeline.events;
    const auto event_at = [](std::string name, double t, const FlightState& y) {
        return TimelineEvent{std::move(name), t, y[StateIndex::altitude], y[StateIndex::velocity]};
    };
    events.push_back(event_at("entry interface", 0.0, y0));
    events.push_back(event_at("peak heat flux", heat_max.time_s, heat_max.y));
    events.push_back(event_at("peak deceleration", a_max.time_s, a_max.y));
    events.push_back(event_at("peak dynamic pressure", q_max.time_s, q_max.y));

    const FlightConditions at_end = flight_conditions(model, phase.stage, flown.y);
    const double end_altitude = flown.y[StateIndex::altitude];
    const double end_velocity = flown.y[StateIndex::velocity];
    const bool completed = flown.reason == StopReason::terminal_event;
    if (completed) {
        events.push_back(event_at(phase.ends[*flown.ended_by].name, flown.time_s, flown.y));
        flight_checks.push_back(flight_check(
            "trajectory", CheckStatus::pass, static_cast<double>(flown.steps),
            static_cast<double>(design.solver.max_steps), "steps",
            fmt::format("entry flown in {} steps to {}", flown.steps,
                        phase.ends[*flown.ended_by].name),
            "solver settings"));
    } else {
        events.push_back(event_at("integration stopped", flown.time_s, flown.y));
        flight_checks.push_back(flight_check(
            "trajectory", CheckStatus::fail, flown.time_s, design.solver.max_time_s, "s",
            fmt::format("the flight stopped at {:.1f} s, {:.0f} m, {:.1f} m/s: {}", flown.time_s,
                        end_altitude, end_velocity, stop_reason_text(flown.reason)),
            "solver settings"));
    }
    std::stable_sort(events.begin(), events.end(),
                     [](const TimelineEvent& a, const TimelineEvent& b) { return a.time_s < b.time_s; });

    // The parachute: deploy conditions, size and opening load.
    ParachuteResults& chute = results.parachute;
    const CanopyType canopy = *canopy_type(design.parachute.type);
    const double chute_cd = design.parachute.drag_coefficient.value_or(canopy.drag_coefficient);
    chute.drag_coefficient = chute_cd;
    const std::string trigger_text = describe_trigger(design.parachute);
    const double height_above_site = end_altitude - design.site.elevation_m;
    chute.deployed = completed && flown.ended_by == deploy_end;
    if (design.parachute.diameter_m) {
        chute.diameter_m = *design.parachute.diameter_m;
    } else {
        // Terminal-velocity balance under the canopy alone at the requested height, with the
        // heat shield gone: m g = 0.5 rho V^2 Cd pi D^2 / 4.
        const double h = design.site.elevation_m + *design.parachute.at_height_above_site_m;
        const double v = *design.parachute.size_for_velocity_m_s;
        const double suspended = mass - design.mass.heat_shield_kg;
        const double rho = atmosphere->at(h).density_kg_m3;
        chute.diameter_m = std::sqrt(8.0 * suspended * design.body.body.gravity_m_s2(h) /
                                     (pi * rho * chute_cd * v * v));
    }
    if (chute.deployed) {
        chute.deploy_time_s = flown.time_s;
        chute.deploy_altitude_m = end_altitude;
        chute.deploy_mach = at_end.mach;
        chute.deploy_dynamic_pressure_Pa = at_end.dynamic_pressure_Pa;
        chute.deploy_velocity_m_s = end_velocity;
        // Peak opening force = opening load factor x q x Cd x A (Knacke, NWC TP 6575).
        chute.opening_load_N = canopy.opening_load_factor * at_end.dynamic_pressure_Pa * chute_cd *
                               frontal_area_m2(*chute.diameter_m);
        flight_checks.push_back(flight_check(
            "parachute_trigger", CheckStatus::pass, height_above_site, 0.0, "m",
            fmt::format("parachute trigger ({}) reached {:.0f} m above the site, {:.1f} s after "
                        "entry",
                        trigger_text, height_above_site, flown.time_s),
            "design trigger"));
    } else if (completed && flown.ended_by == ground_end) {
        flight_checks.push_back(flight_check(
            "parachute_trigger", CheckStatus::fail, 0.0, 0.0, "m",
            fmt::format("the vehicle reaches the ground at {:.1f} m/s (Mach {:.2f}), {:.1f} s "
                        "after entry, before the parachute trigger ({})",
                        end_velocity, at_end.mach, flown.time_s, trigger_text),
            "design trigger"));
    } else if (completed && flown.ended_by == exit_end) {
        flight_checks.push_back(flight_check(
            "parachute_trigger", CheckStatus::fail, height_above_site, 0.0, "m",
            fmt::format("the vehicle skips out of the atmosphere at {:.0f} m/s, {:.1f} s after "
                        "entry, before the parachute trigger ({}): steepen the entry or reduce "
                        "the lift",
                        end_velocity, flown.time_s, trigger_text),
            "design trigger"));
    }

    results.notes.push_back(
        "This version flies the entry phase to the parachute trigger. Descent under the "
        "parachute, terminal descent, the timeline margin and mass closure are not modelled yet.");
    results.notes.push_back(
        "Conceptual sizing estimates: confirm them by detailed analysis and test under the "
        "mission's own standards and review.");

    std::vector<Check> checks = limit_checks(design, results);
    checks.insert(checks.begin(), flight_checks.begin(), flight_checks.end());
    order_checks(checks);
    results.checks = std::move(checks);
    results.converged = completed;
    return results;
}

}  // namespace ds
