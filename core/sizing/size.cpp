#include "sizing/size.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <iterator>
#include <memory>
#include <optional>

#include <fmt/format.h>
#include <boost/math/tools/toms748_solve.hpp>

#include "aeroshell/sphere_cone.hpp"
#include "checks/rule_set.hpp"
#include "constants.hpp"
#include "heating/heat_shield_mass.hpp"
#include "numerics/illinois.hpp"
#include "results/caution.hpp"
#include "results/key_figures.hpp"
#include "results/writer.hpp"
#include "sizing/environment.hpp"
#include "sizing/evaluation.hpp"
#include "sizing/landed_mass.hpp"
#include "sizing/limit_checks.hpp"

namespace ds {
namespace {

constexpr double per_cm2 = 1e-4;  // W/m^2 to W/cm^2, J/m^2 to J/cm^2

// Mass closure: to 0.1 kg, within 50 iterations, and a mass beyond 1000 t has diverged.
constexpr double closure_tolerance_kg = 0.1;
constexpr int closure_max_iterations = 50;
constexpr double closure_diverged_kg = 1e6;
// First guess of the entry mass: the itemised masses over a typical itemised share of it.
constexpr double first_guess_itemised_share = 0.6;
// A closure evaluation the secant reaches by a step larger than this (a hundred times the
// closure's tolerance) only aims it: the one after it is seldom the last (our choice).
constexpr double closure_aiming_step_kg = 100.0 * closure_tolerance_kg;
// The highest feasible site elevation is found to half a metre.
constexpr double capability_tolerance_m = 0.5;

struct Closure {
    Evaluation evaluation;
    MassClosure report;
};

/// Closes the budget: finds the entry mass m with m = budget(m), by the secant method on
/// r(m) = budget(m) - m, started with one fixed-point step.
/// The evaluations that only steer the secant fly to looser tolerances, which moves their
/// residuals by grams: the first, at the first guess (tens of percent off), to the first
/// guess's (Precision::first_guess); the second (its fixed-point step) and any the secant
/// reaches by a step of more than closure_aiming_step_kg to the aiming ones
/// (Precision::aiming). The closure ends on an evaluation flown to the design's own tolerance:
/// one that already meets the closure's tolerance at a looser one is flown again to it.
Closure close_budget(const Design& design, const FlightModel& model, bool history) {
    double itemised = 0.0;
    for (const MassItemDesign& item : design.mass.items) {
        if (!leaves_before_entry(item.group))
            itemised += item.mass_kg;
    }
    constexpr int aiming_evaluations = 2;  // the first guess's, then one aiming
    int flown = 0;
    Closure c;
    // Each evaluation after the first is guided by the one before it (c.evaluation until the
    // new one replaces it).
    const auto evaluate_at = [&](double mass_kg, double step_kg) {
        if (++flown == 1)
            return evaluate(design, model, mass_kg, false, Precision::first_guess);
        const bool aiming =
            flown <= aiming_evaluations || std::abs(step_kg) > closure_aiming_step_kg;
        return evaluate(design, model, mass_kg, history && !aiming,
                        aiming ? Precision::aiming : Precision::design, &c.evaluation);
    };
    const auto design_precision_at = [&](double mass_kg) {
        return evaluate(design, model, mass_kg, history, Precision::design, &c.evaluation);
    };
    double m0 = itemised / first_guess_itemised_share;
    c.evaluation = evaluate_at(m0, 0.0);
    double r0 = c.evaluation.budget_kg() - m0;
    double m1 = c.evaluation.budget_kg();
    for (int iteration = 1; iteration <= closure_max_iterations; ++iteration) {
        c.report.iterations = iteration;
        if (!std::isfinite(m1) || m1 <= 0.0 || m1 > closure_diverged_kg)
            break;
        c.evaluation = evaluate_at(m1, m1 - m0);
        double r1 = c.evaluation.budget_kg() - m1;
        if (std::abs(r1) < closure_tolerance_kg && c.evaluation.precision != Precision::design) {
            c.evaluation = design_precision_at(m1);
            r1 = c.evaluation.budget_kg() - m1;
        }
        c.report.residual_kg = r1;
        if (std::abs(r1) < closure_tolerance_kg) {
            c.report.converged = true;
            break;
        }
        const double slope = (r1 - r0) / (m1 - m0);
        const double next = slope != 0.0 && std::isfinite(slope) ? m1 - r1 / slope : m1 + r1;
        m0 = m1;
        r0 = r1;
        m1 = next;
    }
    if (c.evaluation.precision != Precision::design)  // diverged from a looser evaluation
        c.evaluation = design_precision_at(c.evaluation.entry_kg);
    return c;
}

/// The highest site elevation with a timeline margin of zero or more, on the evaluation's own
/// descent (the masses held at their closed values). The descent reaches the design's site;
/// only when the design cannot land there is it flown further down to look below.
/// Where the timeline margin runs out, by the nominal burn: the site at which separating
/// `needed` after deploy (less the coast) leaves the nominal separation height above it, and the
/// descent's speed there (the margin's slope against the site is about -1/v).
struct CapabilityGuess {
    double site_m = 0.0;
    double descent_speed_m_s = 0.0;
};

std::optional<CapabilityGuess> capability_guess(const Design& design, const FlightModel& model,
                                                const Evaluation& e) {
    if (!e.burn || !e.burn->stops_in_time || !e.descent)
        return std::nullopt;
    const auto nominal = timeline_margin(design, model, e, design.site.elevation_m);
    if (!nominal)
        return std::nullopt;
    const DescentFlight& d = *e.descent;
    const double t_separation =
        d.deploy_time_s + nominal->needed_s - design.sequence.separation_coast_s;
    if (!(t_separation > d.record.start_time() && t_separation < d.record.end_time()))
        return std::nullopt;
    const double separation_height =
        e.burn->separation_state[StateIndex::altitude] - design.site.elevation_m;
    const FlightState at = d.record.state_at(t_separation);
    return CapabilityGuess{at[StateIndex::altitude] - separation_height, speed(at)};
}

/// The highest site the search looks at: a little under where the heat shield leaves (under a
/// canopy) or where the engines light (from the entry), the event the timeline starts from.
double site_search_ceiling(const Design& design, const Evaluation& evaluation) {
    const bool powered = design.terminal.method == TerminalMethod::supersonic_retro;
    return (powered ? evaluation.entry.end_state[StateIndex::altitude]
                    : evaluation.descent->jettison_state[StateIndex::altitude]) -
           capability_tolerance_m;
}

std::optional<double> max_site_elevation(const Design& design, const FlightModel& model,
                                         const Evaluation& evaluation) {
    const bool powered = design.terminal.method == TerminalMethod::supersonic_retro;
    if (powered ? !evaluation.burn
                : !evaluation.descent || !evaluation.descent->jettisoned ||
                      !evaluation.descent->reached_floor) {
        return std::nullopt;
    }
    const Evaluation* e = &evaluation;
    // The burn solves of the search share what their flights measure of the closed-form miss's
    // error along the descent.
    SeparationGuide guide;
    const auto margin_at = [&](double site) {
        const auto m = timeline_margin(design, model, *e, site, &guide);
        return m ? m->margin_s : -std::numeric_limits<double>::infinity();
    };
    double low = design.site.elevation_m;
    double margin_low = margin_at(low);
    Evaluation deeper;
    if (!(margin_low >= 0.0)) {
        low = design.site.elevation_m - capability_depth_below_site_m;
        if (!powered) {  // the descent under the canopy is flown on down to look there
            deeper = evaluation;
            extend_descent(design, model, *deeper.descent, low);
            if (!deeper.descent->reached_floor)
                return std::nullopt;
            e = &deeper;  // the same descent, flown on: the guide holds on it
        }
        margin_low = margin_at(low);
        if (!(margin_low >= 0.0))
            return std::nullopt;
    }
    const double high = site_search_ceiling(design, evaluation);
    if (!(high > low))
        return std::nullopt;

    // Two guided points first: the margin runs out where the separation comes `needed` after
    // deploy, and the nominal burn separates at about the same height above any site (it needs
    // the same distance to stop); then the margin falls by about 1/v a metre the site rises.
    double stops = low;  // the highest site known to close the timeline, and its margin
    double stops_margin = margin_low;
    std::optional<double> fails;  // the lowest known not to, and its margin
    double fails_margin = 0.0;
    const auto try_site = [&](double site) {
        const double m = margin_at(site);
        if (m >= 0.0 && site > stops) {
            stops = site;
            stops_margin = m;
        } else if (m < 0.0 && (!fails || site < *fails)) {
            fails = site;
            fails_margin = m;
        }
        return m;
    };
    // A powered descent from the entry: where its burn at the most throttle slows to its end
    // speed bounds the search in one flight. Up to there the margin is smooth in the site (the
    // throttle rises, the burn shortens); above it the burn cannot stop, a jump in the margin a
    // root-finder would only close in on by halves. Where the margin holds up to that edge, the
    // site half the search's tolerance inside it: the edge flown at the search's tolerance is
    // centimetres from the edge flown at the design's.
    if (powered) {
        if (const auto reach = powered_reach(design, model, evaluation, low);
            reach && reach->site_m > stops && reach->site_m < high) {
            if (reach->margin_s >= 0.0)
                return std::max(stops, reach->site_m - 0.5 * capability_tolerance_m);
            fails = reach->site_m;
            fails_margin = reach->margin_s;
        }
    }
    if (const auto guess = capability_guess(design, model, *e)) {
        const double inside = capability_tolerance_m;
        const double first = std::clamp(guess->site_m, low + inside, high - inside);
        const double m = try_site(first);
        const double second =
            std::clamp(first + m * guess->descent_speed_m_s, low + inside, high - inside);
        if (std::abs(second - first) > inside)
            try_site(second);
    }
    if (!fails) {
        const double margin_high = margin_at(high);
        if (margin_high >= 0.0)
            return high;
        fails = high;
        fails_margin = margin_high;
    }
    return illinois_last_nonnegative(margin_at, stops, stops_margin, *fails, fails_margin,
                                     capability_tolerance_m);
}

/// Makes the checks that come from the flight and the closure themselves: the message, a
/// function that writes it, and the source are written only when the checks are worded (a
/// dispersion's cases are judged only, Wording).
struct FlightChecks {
    Wording wording = Wording::words;

    template <class Message>
    Check operator()(std::string id, CheckStatus status, double value, double limit,
                     std::string unit, Message&& message, std::string_view source) const {
        return {std::move(id),
                status,
                value,
                limit,
                std::move(unit),
                wording == Wording::words ? std::string(message()) : std::string(),
                wording == Wording::words ? std::string(source) : std::string(),
                std::nullopt};
    }
};

constexpr Names<StopReason, 5> stop_reason_texts{
    {{StopReason::reached_end, "the flight-time budget ran out"},
     {StopReason::step_budget, "the integration step budget ran out"},
     {StopReason::step_collapse,
      "the integration step collapsed (the equations are stiff or singular here)"},
     {StopReason::not_finite, "the equations gave a non-finite value"},
     {StopReason::terminal_event, "a terminal event"}}};

std::string_view stop_reason_text(StopReason reason) {
    return name_of(stop_reason_texts, reason);
}

TimelineEvent event_at(std::string name, double t, const FlightState& y) {
    TimelineEvent event{{}, std::move(name), t, y[StateIndex::altitude], speed(y)};
    event.latitude_deg = radians_to_degrees(y[StateIndex::latitude]);
    event.longitude_deg = radians_to_degrees(y[StateIndex::longitude]);
    return event;
}

/// An event with no state of its own, at a point of the ground.
TimelineEvent event_on_ground(std::string name, double t, double altitude_m, double velocity_m_s,
                              const std::optional<GroundPoint>& point) {
    TimelineEvent event{{}, std::move(name), t, altitude_m, velocity_m_s};
    if (point) {
        event.latitude_deg = radians_to_degrees(point->latitude_rad);
        event.longitude_deg = radians_to_degrees(point->longitude_rad);
    }
    return event;
}

GroundPoint point_of_degrees(double latitude_deg, double longitude_deg) {
    return {degrees_to_radians(latitude_deg), degrees_to_radians(longitude_deg)};
}

/// The descent under the canopy stopped short of the ground: a time or step budget ran out,
/// or the integration failed (what the "trajectory" check reports).
bool descent_stopped(const Evaluation& e) {
    return e.descent && !e.descent->reached_floor &&
           e.descent->stop_reason != StopReason::terminal_event;
}

/// The terminal burn ends where the descent stopped, not at its target: the lander separated
/// at the end of the stopped descent because the descent goes no further, so where the burn
/// ends is no touchdown (nor release, nor hover).
bool terminal_cut_short(const Evaluation& e) {
    return descent_stopped(e) && e.burn &&
           e.burn->separation_time_s >= e.descent->record.end_time();
}

/// The flight ends in the air, where the descent under the canopy stopped: with no burn, or
/// with a burn that separated only at the end of the stopped descent (the "descent stopped"
/// event). Nothing reaches the ground.
bool stopped_in_air(const Evaluation& e) {
    return descent_stopped(e) && (!e.burn || terminal_cut_short(e));
}

/// The heat shield leaves before the lander does: jettisoned no later than the backshell
/// separation (or the touchdown, without one). A jettison that would come later is not
/// reached: the lander has gone with the heat shield still on.
bool jettison_reached(const Evaluation& e) {
    if (!e.descent || !e.descent->jettisoned)
        return false;
    const double lander_leaves = e.burn ? e.burn->separation_time_s
                                        : e.touchdown_time_s.value_or(e.descent->jettison_time_s);
    return e.descent->jettison_time_s <= lander_leaves;
}

void fill_entry(const Evaluation& e, const Design& design, EntryResults& entry) {
    const EntryFlight& f = e.entry;
    entry.mass_kg = e.entry_kg;
    entry.diameter_m = e.aeroshell.diameter_m;
    entry.nose_radius_m = design.aeroshell.nose_radius_m;
    entry.drag_coefficient = e.aeroshell.drag_coefficient;
    entry.drag_coefficient_source = e.aeroshell.drag_coefficient_source;
    const InterfaceState& i = e.entry.interface;
    entry.interface.latitude_deg = radians_to_degrees(i.point.latitude_rad);
    entry.interface.longitude_deg = radians_to_degrees(i.point.longitude_rad);
    entry.interface.rotation_flown = i.rotation_flown;
    const auto velocity = [](const SpeedAndAngles& v) {
        return EntryVelocity{v.speed_m_s, radians_to_degrees(v.flight_path_angle_rad),
                             radians_to_degrees(v.azimuth_rad)};
    };
    entry.interface.relative = velocity(i.relative);
    entry.interface.inertial = velocity(i.inertial);
    if (e.aeroshell.diameter_m <= 0.0)
        return;
    entry.ballistic_coefficient_kg_m2 = ballistic_coefficient_kg_m2(
        e.entry_kg, e.aeroshell.drag_coefficient, frontal_area_m2(e.aeroshell.diameter_m));
    const auto altitude = [](const PeakValue& p) { return p.y[StateIndex::altitude]; };
    entry.peak_dynamic_pressure_Pa = f.dynamic_pressure.value;
    entry.peak_dynamic_pressure_altitude_m = altitude(f.dynamic_pressure);
    entry.peak_deceleration_g = f.deceleration.value;
    entry.peak_deceleration_altitude_m = altitude(f.deceleration);
    entry.peak_heat_flux_W_cm2 = f.heat_flux.value * per_cm2;
    entry.peak_heat_flux_altitude_m = altitude(f.heat_flux);
    entry.heat_load_J_cm2 = f.end_state[StateIndex::convective_heat_load] * per_cm2;
    if (!design.body.body.gas.radiative_correlation.empty()) {
        entry.radiative_heating =
            fmt::format("Tauber-Sutton, {}", design.body.body.gas.radiative_correlation);
        entry.peak_radiative_heat_flux_W_cm2 = f.radiative_heat_flux.value * per_cm2;
        entry.radiative_heat_load_J_cm2 = f.end_state[StateIndex::radiative_heat_load] * per_cm2;
    }
    entry.heat_shield_mass_fraction = heat_shield_mass_fraction(e.total_heat_load_J_cm2);
    entry.heat_shield_tps_kg = entry.heat_shield_mass_fraction * e.entry_kg;
}

/// A drag device deployed: where, when, and in what air.
void set_deployed(DeployResults& d, const Deployment& at) {
    d.deployed = true;
    d.deploy_time_s = at.time_s;
    d.deploy_altitude_m = at.state[StateIndex::altitude];
    d.deploy_mach = at.conditions.mach;
    d.deploy_dynamic_pressure_Pa = at.conditions.dynamic_pressure_Pa;
}

/// A canopy's deploy: where and how fast, its drag coefficient there, its opening load (on what
/// hangs under it: the whole vehicle at that moment) and its inflation time.
void fill_canopy_deploy(const CanopyType& type, double diameter_m, double drag_coefficient,
                        const Deployment& at, ParachuteResults& p) {
    const FlightConditions& c = at.conditions;
    set_deployed(p, at);
    p.deploy_velocity_m_s = speed(at.state);
    p.drag_coefficient_at_deploy =
        canopy_device(type, diameter_m, drag_coefficient).drag_coefficient_at(c.mach);
    p.opening_load_N =
        opening_load_N(type, c.dynamic_pressure_Pa, c.mach, diameter_m, drag_coefficient);
    const double hanging_kg = at.state[StateIndex::mass];
    if (hanging_kg > 0.0)
        p.opening_load_g = *p.opening_load_N / (hanging_kg * standard_gravity_m_s2);
    p.inflation_time_s = inflation_time_s(type, diameter_m, c.air_speed_m_s);
    p.deploy_latitude_deg = radians_to_degrees(at.state[StateIndex::latitude]);
    p.deploy_longitude_deg = radians_to_degrees(at.state[StateIndex::longitude]);
}

/// The drogue: its deploy, and its release at the main parachute's (when that deployed).
ParachuteResults drogue_results(const Evaluation& e, const Design& design) {
    ParachuteResults p;
    const DrogueDesign& drogue = *design.drogue;
    const double drag_coefficient = drogue_device(design).drag_coefficient;
    p.diameter_m = drogue.diameter_m;
    p.drag_coefficient = drag_coefficient;
    p.mass_kg = e.drogue_kg;
    if (e.entry.drogue) {
        fill_canopy_deploy(*canopy_type(drogue.type), drogue.diameter_m, drag_coefficient,
                           *e.entry.drogue, p);
    }
    return p;
}

void fill_parachute(const Evaluation& e, const FlightModel& model, ParachuteResults& p) {
    const double radius_m = model.body.radius_m;
    p.drag_coefficient = e.canopy_drag_coefficient;
    p.diameter_m = e.canopy_diameter_m;
    p.mass_kg = e.parachute_kg;
    if (e.entry.end != EntryEnd::deployed)
        return;
    fill_canopy_deploy(e.canopy, e.canopy_diameter_m, e.canopy_drag_coefficient,
                       {e.entry.end_time_s, e.entry.end_state, e.entry.end_conditions}, p);
    if (e.canopy_exit_state && !terminal_cut_short(e)) {
        const GroundPoint deploy{e.entry.end_state[StateIndex::latitude],
                                 e.entry.end_state[StateIndex::longitude]};
        const GroundPoint exit{(*e.canopy_exit_state)[StateIndex::latitude],
                               (*e.canopy_exit_state)[StateIndex::longitude]};
        p.drift_m = great_circle_distance_m(deploy, exit, radius_m);
        p.drift_azimuth_deg = radians_to_degrees(initial_azimuth_rad(deploy, exit));
    }
    if (jettison_reached(e)) {
        p.heat_shield_jettison_time_s = e.descent->jettison_time_s;
        // The air at the jettison: the drag devices do not change the Mach number or the
        // dynamic pressure, so no stage is needed.
        const FlightConditions at = flight_conditions(model, Stage{}, e.descent->jettison_state);
        p.heat_shield_jettison_mach = at.mach;
        p.heat_shield_jettison_dynamic_pressure_Pa = at.dynamic_pressure_Pa;
    }
    if (e.burn) {
        p.descent_velocity_m_s = speed(e.burn->separation_state);
    } else if (e.touchdown_velocity_m_s) {
        p.descent_velocity_m_s = e.touchdown_velocity_m_s;
    }
}

/// The powered descent's ignition and burn: the air at ignition, the thrust against the weight
/// and the flow there, and what the burn puts on the vehicle.
PoweredDescentResults powered_descent_results(const Evaluation& e, const Design& design,
                                              const FlightModel& model) {
    const BurnSolution& b = *e.burn;
    const FlightConditions at =
        flight_conditions(model, burn_stage(*e.burn_request), b.ignition_state);
    PoweredDescentResults p;
    p.ignition_mach = at.mach;
    p.ignition_dynamic_pressure_Pa = at.dynamic_pressure_Pa;
    p.ignition_flight_path_angle_deg = radians_to_degrees(flight_path_angle_rad(b.ignition_state));
    p.thrust_to_weight_at_ignition =
        e.full_thrust_N / (b.ignition_state[StateIndex::mass] * at.gravity_m_s2);
    p.thrust_coefficient_at_ignition = at.thrust_coefficient;
    p.throttle = b.throttle;
    p.ignition_delayed = e.ignition_delayed;
    p.drag_preservation = design.terminal.drag_preservation;
    p.peak_deceleration_g = b.peak_sensed_deceleration_g;
    p.peak_dynamic_pressure_Pa = b.peak_dynamic_pressure_Pa;
    p.propellant_fraction = e.loaded_propellant_kg / e.entry_kg;
    return p;
}

void fill_terminal(const Evaluation& e, const Design& design, const FlightModel& model,
                   TerminalResults& t) {
    t.method = design.terminal.method;
    // A burn the descent's budget cut short never reached its end: no touchdown, impact or
    // hover figures to hold against their limits (the trajectory check says why).
    if (!terminal_cut_short(e)) {
        t.touchdown_velocity_m_s = e.touchdown_velocity_m_s;
        t.impact_velocity_m_s = e.impact_velocity_m_s;
        t.impact_energy_J = e.impact_energy_J;
        t.hover_time_s = e.hover_time_s;
        t.touchdown_horizontal_velocity_m_s = e.touchdown_horizontal_velocity_m_s;
    }
    if (!e.burn)
        return;
    const BurnSolution& b = *e.burn;
    t.ignition_time_s = b.ignition_time_s;
    t.ignition_altitude_m = b.ignition_state[StateIndex::altitude];
    t.ignition_velocity_m_s = speed(b.ignition_state);
    t.delta_v_m_s = b.ideal_delta_v_m_s;
    t.gravity_loss_m_s = b.gravity_loss_m_s;
    t.burn_time_s = b.burn_time_s;
    t.thrust_N = e.burn_request->thrust_N;
    t.burned_propellant_kg = e.burned_kg;
    t.propellant_kg = e.loaded_propellant_kg;
    if (design.terminal.method == TerminalMethod::supersonic_retro)
        t.powered_descent = powered_descent_results(e, design, model);
}

/// The events that end a terminal burn, by method: at its target, or at the ground.
void push_terminal_events(const Evaluation& e, const Design& design,
                          std::vector<TimelineEvent>& events) {
    const BurnSolution& b = *e.burn;
    const auto at_site = [&](std::string name, double t, double v) {
        return event_on_ground(std::move(name), t, design.site.elevation_m, v, e.landing_point);
    };
    switch (design.terminal.method) {
        case TerminalMethod::retro:
            events.push_back(event_at("touchdown", b.end_time_s, b.end_state));
            break;
        case TerminalMethod::airbag:
            events.push_back(event_at("release", b.end_time_s, b.end_state));
            if (e.touchdown_time_s && e.impact_velocity_m_s) {
                events.push_back(
                    at_site("airbag impact", *e.touchdown_time_s, *e.impact_velocity_m_s));
            }
            break;
        case TerminalMethod::tethered:
            events.push_back(event_at("hover and lowering", b.end_time_s, b.end_state));
            if (e.touchdown_time_s) {
                events.push_back(at_site("payload touchdown", *e.touchdown_time_s, 0.0));
            }
            break;
        case TerminalMethod::supersonic_retro:
            events.push_back(event_at("touchdown", b.end_time_s, b.end_state));
            break;
        case TerminalMethod::none:
            break;
    }
}

/// The timeline event that ends the entry flight.
constexpr Names<EntryEnd, 4> entry_end_events{{{EntryEnd::deployed, "parachute deploy"},
                                               {EntryEnd::ground, "ground impact"},
                                               {EntryEnd::skip_out, "atmospheric exit"},
                                               {EntryEnd::stopped, "integration stopped"}}};

/// The deorbit burn, a coast before the interface: at the orbit's apoapsis, the transfer angle
/// back along the inertial great circle through the entry point, where the body stood then
/// (it turns under the orbit during the coast). Its speed is the planet-relative one after the
/// burn, as every event's.
TimelineEvent deorbit_event(const Evaluation& e, const Body& body) {
    const DeorbitBurn& burn = *e.conic->deorbit;
    const InterfaceState& entry = e.entry.interface;
    const GroundPoint at_burn = destination(entry.point, entry.inertial.azimuth_rad + pi,
                                            burn.transfer_angle_rad * body.radius_m, body.radius_m);
    const double heading = initial_azimuth_rad(at_burn, entry.point);
    const double carried =
        body.rotation_rad_s * burn.orbit_apoapsis_radius_m * std::cos(at_burn.latitude_rad);
    const double v = burn.speed_after_m_s;
    TimelineEvent event{{},
                        "deorbit burn",
                        -burn.coast_s,
                        burn.orbit_apoapsis_radius_m - body.radius_m,
                        std::hypot(v * std::sin(heading) - carried, v * std::cos(heading))};
    event.latitude_deg = radians_to_degrees(at_burn.latitude_rad);
    event.longitude_deg =
        radians_to_degrees(at_burn.longitude_rad + body.rotation_rad_s * burn.coast_s);
    return event;
}

void fill_timeline(const Evaluation& e, const Design& design, const Body& body,
                   Timeline& timeline) {
    std::vector<TimelineEvent>& events = timeline.events;
    const EntryFlight& f = e.entry;
    if (e.conic && e.conic->deorbit)
        events.push_back(deorbit_event(e, body));
    events.push_back(event_at("entry interface", 0.0, f.start));
    if (e.aeroshell.diameter_m <= 0.0)
        return;
    if (f.decelerator)
        events.push_back(
            event_at("decelerator deploy", f.decelerator->time_s, f.decelerator->state));
    events.push_back(event_at("peak heat flux", f.heat_flux.time_s, f.heat_flux.y));
    events.push_back(event_at("peak deceleration", f.deceleration.time_s, f.deceleration.y));
    events.push_back(
        event_at("peak dynamic pressure", f.dynamic_pressure.time_s, f.dynamic_pressure.y));
    if (f.drogue)
        events.push_back(event_at("drogue deploy", f.drogue->time_s, f.drogue->state));
    // A powered descent lit at its trigger has the ignition as its event; one lit later keeps
    // the trigger's moment too.
    const bool powered = design.terminal.method == TerminalMethod::supersonic_retro;
    if (powered && f.end == EntryEnd::deployed) {
        if (e.ignition_delayed)
            events.push_back(event_at("ignition trigger", f.end_time_s, f.end_state));
    } else {
        events.push_back(
            event_at(std::string(name_of(entry_end_events, f.end)), f.end_time_s, f.end_state));
    }
    if (jettison_reached(e)) {
        events.push_back(event_at("heat-shield jettison", e.descent->jettison_time_s,
                                  e.descent->jettison_state));
    }
    if (e.burn) {
        const BurnSolution& b = *e.burn;
        if (backshell_separates(design.terminal.method)) {
            events.push_back(
                event_at("backshell separation", b.separation_time_s, b.separation_state));
        }
        events.push_back(event_at("ignition", b.ignition_time_s, b.ignition_state));
        if (terminal_cut_short(e)) {
            events.push_back(event_at("descent stopped", b.end_time_s, b.end_state));
        } else {
            push_terminal_events(e, design, events);
        }
    } else if (e.touchdown_time_s && e.touchdown_velocity_m_s) {
        events.push_back(event_on_ground("touchdown", *e.touchdown_time_s, design.site.elevation_m,
                                         *e.touchdown_velocity_m_s, e.landing_point));
    } else if (descent_stopped(e) && !e.descent->record.empty()) {
        const double t = e.descent->record.end_time();
        events.push_back(event_at("descent stopped", t, e.descent->record.state_at(t)));
    }
    std::stable_sort(
        events.begin(), events.end(),
        [](const TimelineEvent& a, const TimelineEvent& b) { return a.time_s < b.time_s; });
}

/// The approach's or the orbit's figures, with the interface state in both frames (the
/// entry's, filled before).
void fill_conic(const Evaluation& e, const Design& design, const Body& body, Results& results) {
    if (!e.conic)
        return;
    const EntryInterface& at = results.entry.interface;
    const double radius = body.radius_m;
    if (const auto& a = e.conic->arrival) {
        ApproachResults r;
        r.v_infinity_m_s = a->v_infinity_m_s;
        r.semi_major_axis_m = a->semi_major_axis_m;
        r.eccentricity = a->eccentricity;
        r.periapsis_altitude_m = a->periapsis_radius_m - radius;
        r.impact_parameter_m = a->impact_parameter_m;
        r.turn_angle_deg = radians_to_degrees(a->turn_angle_rad);
        r.interface_true_anomaly_deg = radians_to_degrees(a->interface_true_anomaly_rad);
        r.inertial = at.inertial;
        r.relative = at.relative;
        results.approach = r;
    }
    if (const auto& b = e.conic->deorbit) {
        OrbitResults r;
        r.periapsis_altitude_m = b->orbit_periapsis_radius_m - radius;
        r.apoapsis_altitude_m = b->orbit_apoapsis_radius_m - radius;
        r.speed_before_burn_m_s = b->speed_before_m_s;
        r.speed_after_burn_m_s = b->speed_after_m_s;
        r.delta_v_m_s = b->delta_v_m_s;
        r.isp_s = design.entry.orbit->isp_s;
        r.propellant_kg = e.deorbit_propellant_kg;
        r.stage_kg = e.budget.group_kg(MassGroup::deorbit_stage);
        r.mass_before_burn_kg = e.entry_kg + r.stage_kg;
        r.transfer_periapsis_altitude_m = b->transfer_periapsis_radius_m - radius;
        r.transfer_eccentricity = b->transfer_eccentricity;
        r.transfer_angle_deg = radians_to_degrees(b->transfer_angle_rad);
        r.coast_s = b->coast_s;
        r.interface_true_anomaly_deg = radians_to_degrees(b->interface_true_anomaly_rad);
        r.inertial = at.inertial;
        r.relative = at.relative;
        results.orbit = r;
    }
}

/// The heat shield's jettison, when it does not come before the lander leaves: never in the
/// descent flown, or only after the backshell separation.
Check jettison_check(const Evaluation& e, const FlightChecks& check) {
    const DescentFlight& d = *e.descent;
    constexpr std::string_view advice = "shorten the jettison delay or raise its dynamic pressure";
    if (!d.jettisoned) {
        return check(
            "heat_shield_jettison", CheckStatus::fail, 0.0, 0.0, "",
            [&] {
                return fmt::format(
                    "the heat shield is never jettisoned before {}: {}",
                    descent_stopped(e) ? "the descent under the canopy stops" : "the ground",
                    advice);
            },
            "design sequence");
    }
    // Jettisoned but not reached: only a backshell separation comes before it.
    const double jettison = d.jettison_time_s - d.deploy_time_s;
    const double separation = e.burn->separation_time_s - d.deploy_time_s;
    return check(
        "heat_shield_jettison", CheckStatus::fail, jettison, separation, "s",
        [&] {
            return fmt::format(
                "the heat shield would be jettisoned {:.1f} s after parachute deploy, but the "
                "lander separates from the backshell at {:.1f} s: the jettison is not reached, "
                "and the lander would leave with the heat shield still on while its mass and "
                "burn assume it gone; {}",
                jettison, separation, advice);
        },
        "design sequence");
}

/// Parts dropped before landing that weigh as much as the vehicle leave nothing to land.
Check drop_mass_check(const Evaluation& e, const Design& design, const FlightChecks& check) {
    const double dropped = e.entry_kg - e.landing_kg;
    return check(
        "drop_mass", CheckStatus::fail, dropped, e.entry_kg, "kg",
        [&] {
            return fmt::format(
                "the masses dropped before landing ({:.1f} kg: heat shield{}{}) {} the entry "
                "mass ({:.1f} kg): nothing is left to land, and no landed mass, thrust or "
                "propellant is computed",
                dropped, e.decelerator_kg > 0.0 ? ", decelerator" : "",
                backshell_separates(design.terminal.method) ? ", backshell, parachute" : "",
                dropped > e.entry_kg ? "exceed" : "equal", e.entry_kg);
        },
        "mass budget");
}

/// A load the design gives must cover the burn: what can burn is the load less its trapped
/// residual (the reserve is there to be burned when a flight needs it).
Check propellant_load_check(const TerminalDesign& t, double burned_kg, const FlightChecks& check) {
    const double usable = *t.propellant_loaded_kg * (1.0 - t.propellant_residual_fraction);
    Check c = check(
        "propellant_load", burned_kg > usable ? CheckStatus::fail : CheckStatus::pass, burned_kg,
        usable, "kg",
        [&] {
            return burned_kg > usable
                       ? fmt::format(
                             "the flight burns {:.1f} kg but the {:.1f} kg loaded leave "
                             "{:.1f} kg above the trapped residual: the tanks run dry",
                             burned_kg, *t.propellant_loaded_kg, usable)
                       : fmt::format(
                             "the flight burns {:.1f} kg of the {:.1f} kg usable ({:.1f} "
                             "kg loaded)",
                             burned_kg, usable, *t.propellant_loaded_kg);
        },
        "the design's loaded propellant less its trapped residual");
    c.margin = (usable - burned_kg) / usable;
    return c;
}

/// The sizing requests of the design: an aeroshell sized for a ballistic coefficient, a canopy
/// sized for a descent speed. Returns false when the aeroshell has no solution (nothing flew).
bool sizing_request_checks(const Evaluation& e, const Design& design, const FlightChecks& check,
                           std::vector<Check>& checks) {
    if (design.aeroshell.size_for_ballistic_coefficient_kg_m2) {
        const double target = *design.aeroshell.size_for_ballistic_coefficient_kg_m2;
        if (e.aeroshell.diameter_m > 0.0) {
            checks.push_back(check(
                "aeroshell_sizing", CheckStatus::pass, target, target, "kg/m^2",
                [&] {
                    return fmt::format(
                        "aeroshell sized to {:.4g} m for a ballistic coefficient of {:.4g} kg/m^2",
                        e.aeroshell.diameter_m, target);
                },
                "sizing request"));
        } else {
            checks.push_back(check(
                "aeroshell_sizing", CheckStatus::fail, 0.0, target, "kg/m^2",
                [&] {
                    return fmt::format(
                        "no aeroshell diameter between the nose diameter and 100 m gives a "
                        "ballistic coefficient of {:.4g} kg/m^2 at {:.4g} kg",
                        target, e.entry_kg);
                },
                "sizing request"));
            return false;
        }
    }
    if (design.parachute && !design.parachute->diameter_m && e.canopy_diameter_m <= 0.0) {
        checks.push_back(check(
            "parachute_sizing", CheckStatus::fail, 0.0, *design.parachute->size_for_velocity_m_s,
            "m/s",
            [] {
                return "the vehicle under the canopy already descends slower than the requested "
                       "speed: no canopy is needed, or the request is wrong";
            },
            "sizing request"));
    }
    return true;
}

/// How the entry ended: at its last trigger (the parachute's deploy, or a powered descent's
/// ignition), or short of it (ground, skip-out, stopped). Without either, the entry flies to
/// the ground, as a ballistic impact.
Check entry_end_check(const Evaluation& e, const Design& design, const FlightChecks& check) {
    const EntryFlight& f = e.entry;
    const bool powered = design.terminal.method == TerminalMethod::supersonic_retro;
    const char* id = powered ? "ignition_trigger" : "parachute_trigger";
    const std::string_view what = powered ? "ignition trigger" : "parachute trigger";
    const std::optional<Trigger> last = entry_end_trigger(design);
    const auto trigger = [&] {
        return powered ? describe_trigger(design.terminal.trigger, design.terminal.trigger_value)
               : design.parachute
                   ? describe_trigger(design.parachute->trigger, design.parachute->trigger_value)
                   : std::string();
    };
    const double v_end = speed(f.end_state);
    const double h_end = f.end_state[StateIndex::altitude];
    if (!last && f.end == EntryEnd::ground) {
        return check(
            "ballistic_impact", CheckStatus::pass, v_end, 0.0, "m/s",
            [&] {
                return fmt::format(
                    "no parachute: the vehicle flies its entry to the ground and "
                    "strikes it at {:.1f} m/s, {:.1f} s after entry",
                    v_end, f.end_time_s);
            },
            "design sequence");
    }
    switch (f.end) {
        case EntryEnd::deployed:
            return check(
                id, CheckStatus::pass, h_end - design.site.elevation_m, 0.0, "m",
                [&] {
                    return fmt::format(
                        "{} ({}) reached {:.0f} m above the site, {:.1f} s after "
                        "entry",
                        what, trigger(), h_end - design.site.elevation_m, f.end_time_s);
                },
                "design trigger");
        case EntryEnd::ground:
            return check(
                id, CheckStatus::fail, 0.0, 0.0, "m",
                [&] {
                    return fmt::format(
                        "the vehicle reaches the ground at {:.1f} m/s (Mach "
                        "{:.2f}), {:.1f} s after entry, before the {} ({})",
                        v_end, f.end_conditions.mach, f.end_time_s, what, trigger());
                },
                "design trigger");
        case EntryEnd::skip_out:
            return check(
                id, CheckStatus::fail, h_end - design.site.elevation_m, 0.0, "m",
                [&] {
                    return fmt::format(
                        "the vehicle skips out of the atmosphere at {:.0f} m/s, {:.1f} s after "
                        "entry, before the {}{}: steepen the entry or reduce the lift",
                        v_end, f.end_time_s, last ? what : "ground",
                        last ? fmt::format(" ({})", trigger()) : std::string());
                },
                "design trigger");
        case EntryEnd::stopped:
            break;
    }
    return check(
        "trajectory", CheckStatus::fail, f.end_time_s, design.solver.max_time_s, "s",
        [&] {
            return fmt::format("the flight stopped at {:.1f} s, {:.0f} m, {:.1f} m/s: {}",
                               f.end_time_s, h_end, v_end, stop_reason_text(f.stop_reason));
        },
        "solver settings");
}

/// What went wrong under the canopy and in the terminal burn: a descent that stopped, a
/// jettison not reached, a burn that cannot stop in time, a load the burn exceeds.
void descent_checks(const Evaluation& e, const Design& design, const FlightChecks& check,
                    std::vector<Check>& checks) {
    if (e.descent && !e.descent->reached_floor &&
        e.descent->stop_reason != StopReason::terminal_event) {
        checks.push_back(check(
            "trajectory", CheckStatus::fail, 0.0, design.solver.max_time_s, "s",
            [&] {
                return fmt::format("the descent under the canopy stopped: {}",
                                   stop_reason_text(e.descent->stop_reason));
            },
            "solver settings"));
    }
    if (e.descent && !jettison_reached(e))
        checks.push_back(jettison_check(e, check));
    if (e.burn && !e.burn->stops_in_time) {
        const bool powered = design.terminal.method == TerminalMethod::supersonic_retro;
        const double reached = speed(e.burn->end_state);
        const double wanted = design.terminal.touchdown_velocity_m_s;
        checks.push_back(check(
            "terminal_burn", CheckStatus::fail, reached, wanted, "m/s",
            [&] {
                return powered ? fmt::format(
                                     "even at full throttle from its ignition, the powered "
                                     "descent cannot bring the vehicle to {:.2g} m/s in time: "
                                     "it reaches the ground at {:.1f} m/s; more thrust, more "
                                     "drag kept under thrust, or an ignition with more "
                                     "height for its speed is needed",
                                     wanted, reached)
                               : fmt::format(
                                     "even separating at parachute deploy, the burn cannot "
                                     "bring the lander to {:.2g} m/s in time: it reaches the "
                                     "ground at {:.1f} m/s; more thrust or an earlier, higher "
                                     "deploy is needed",
                                     wanted, reached);
            },
            "terminal descent"));
    }
    if (design.terminal.propellant_loaded_kg && e.burned_kg > 0.0) {
        checks.push_back(propellant_load_check(design.terminal, e.burned_kg, check));
    }
}

/// The budget against the entry mass: closed by iteration (sizing), or within the fixed entry
/// mass (analysis).
std::optional<Check> budget_check(const Evaluation& e, const std::optional<MassClosure>& closure,
                                  const FlightChecks& check) {
    const double mass = e.entry_kg;
    if (closure) {
        if (closure->converged) {
            return check(
                "mass_closure", CheckStatus::pass, closure->residual_kg, closure_tolerance_kg, "kg",
                [&] {
                    return fmt::format("mass budget closed at {:.1f} kg in {} iterations", mass,
                                       closure->iterations);
                },
                "closure to 0.1 kg");
        }
        return check(
            "mass_closure", CheckStatus::fail, closure->residual_kg, closure_tolerance_kg, "kg",
            [&] {
                return fmt::format(
                    "the mass budget does not close: after {} iterations the entry mass is "
                    "{:.4g} kg and the budget adds up to {:.4g} kg (propellant or estimates "
                    "growing faster than the mass they serve)",
                    closure->iterations, mass, e.budget_kg());
            },
            "closure to 0.1 kg");
    }
    if (!e.unallocated_kg)
        return std::nullopt;
    const double unallocated = *e.unallocated_kg;
    // Within the closure's tolerance is allocated: a frozen sized design (a dispersion's
    // vehicle) carries its closure's last 0.1 kg as a rounding, not as an excess.
    const bool over = unallocated < -closure_tolerance_kg;
    return check(
        "mass_allocation", over ? CheckStatus::fail : CheckStatus::pass, unallocated, 0.0, "kg",
        [&] {
            return over ? fmt::format(
                              "the items and estimates add up to {:.1f} kg more than the "
                              "fixed entry mass of {:.1f} kg",
                              -unallocated, mass)
                        : fmt::format(
                              "{:.1f} kg of the fixed entry mass of {:.1f} kg is not "
                              "itemised or estimated",
                              unallocated, mass);
        },
        "entry mass fixed by the design");
}

/// Checks that come from the flight and the closure themselves, not from a limit.
std::vector<Check> flight_checks(const Evaluation& e, const Design& design,
                                 const std::optional<MassClosure>& closure, Wording wording) {
    const FlightChecks check{wording};
    std::vector<Check> checks;
    if (!sizing_request_checks(e, design, check, checks))
        return checks;
    if (e.landing_kg <= 0.0)
        checks.push_back(drop_mass_check(e, design, check));
    checks.push_back(entry_end_check(e, design, check));
    descent_checks(e, design, check, checks);
    if (std::optional<Check> budget = budget_check(e, closure, check))
        checks.push_back(std::move(*budget));
    return checks;
}

/// Places the events and the history along and across the entry's track, and fills where it
/// lands (with the miss, given a target).
void place_on_track(const Evaluation& e, const Design& design, const TrackReference& track,
                    Results& results) {
    const TrackAxes axes(track);
    for (TimelineEvent& event : results.timeline.events) {
        const TrackPosition p =
            axes.position(point_of_degrees(event.latitude_deg, event.longitude_deg));
        event.downrange_m = p.downrange_m;
        event.crossrange_m = p.crossrange_m;
    }
    for (TrajectorySample& sample : results.history) {
        const TrackPosition p =
            axes.position(point_of_degrees(sample.latitude_deg, sample.longitude_deg));
        sample.downrange_m = p.downrange_m;
        sample.crossrange_m = p.crossrange_m;
    }
    if (!e.landing_point || terminal_cut_short(e))
        return;
    LandingResults landing;
    landing.latitude_deg = radians_to_degrees(e.landing_point->latitude_rad);
    landing.longitude_deg = radians_to_degrees(e.landing_point->longitude_rad);
    const TrackPosition at = axes.position(*e.landing_point);
    landing.downrange_m = at.downrange_m;
    landing.crossrange_m = at.crossrange_m;
    if (design.site.latitude_deg && design.site.longitude_deg) {
        const GroundPoint target =
            point_of_degrees(*design.site.latitude_deg, *design.site.longitude_deg);
        const TrackPosition aim = axes.position(target);
        landing.miss_m = great_circle_distance_m(*e.landing_point, target, track.radius_m);
        landing.miss_downrange_m = at.downrange_m - aim.downrange_m;
        landing.miss_crossrange_m = at.crossrange_m - aim.crossrange_m;
    }
    results.landing = landing;
}

/// What the results say about the frame of the flight.
void add_frame_notes(const Design& design, const InterfaceState& entry, Results& results) {
    if (!design.entry.azimuth_deg) {
        results.notes.push_back(fmt::format(
            "The entry gives no direction, so the body is flown without rotation (as if it did "
            "not turn), heading {:.0f} deg for the ground track and the winds: add "
            "entry.azimuth_deg (clockwise from north, 90 = east), with entry.latitude_deg and "
            "entry.longitude_deg, to fly the body's rotation.",
            default_entry_azimuth_deg));
        if (design.entry.velocity_frame == VelocityFrame::inertial) {
            results.notes.push_back(
                "Without rotation the inertial entry state given is also the planet-relative "
                "one.");
        }
    } else if (entry.rotation_flown) {
        results.notes.push_back(fmt::format(
            "The body's rotation is flown: the entry state is {:.1f} m/s at {:.2f} deg, azimuth "
            "{:.2f} deg planet-relative, {:.1f} m/s at {:.2f} deg, azimuth {:.2f} deg inertial "
            "({}).",
            entry.relative.speed_m_s, radians_to_degrees(entry.relative.flight_path_angle_rad),
            radians_to_degrees(entry.relative.azimuth_rad), entry.inertial.speed_m_s,
            radians_to_degrees(entry.inertial.flight_path_angle_rad),
            radians_to_degrees(entry.inertial.azimuth_rad),
            design.entry.approach ? "the approach's conic gives the inertial one"
            : design.entry.orbit
                ? "the deorbit burn's conic gives the inertial one"
                : fmt::format("{} given", to_string(design.entry.velocity_frame))));
    }
    if (design.entry.orbit) {
        results.notes.push_back(
            "The deorbit burn is impulsive and tangential at the orbit's apoapsis; its stage "
            "(the design's \"deorbit stage\" items and the burn's propellant) leaves before the "
            "interface and is not part of the entry mass.");
    }
}

/// The results' notes: the cautions, the frame of the flight, and what is not modelled.
void add_notes(const Design& design, const Evaluation& e, Results& results) {
    results.notes.emplace_back(conceptual_caution);
    results.notes.push_back(
        "Mass estimates marked \"estimate\" are rules of thumb: replace them with itemised "
        "masses as the design matures.");
    add_frame_notes(design, e.entry.interface, results);
    if (results.entry.radiative_heating == radiative_heating_not_modelled) {
        results.notes.push_back(
            "Radiative heating is not modelled for this body (no published correlation is "
            "carried for its gas): the heat flux, the heat load and the heat-shield mass are "
            "convective only. At high entry speeds, and in some gases, the shock layer's "
            "radiation can be a large part of the heating: confirm it by analysis.");
    }
}

/// The evaluation at the design's entry mass: the fixed one (at `fixed`'s precision), or the
/// closed one (with its history when asked).
Closure sized_evaluation(const Design& design, const FlightModel& model, bool history,
                         const Evaluation* guide = nullptr, Precision fixed = Precision::design) {
    if (design.mass.entry_kg)
        return {evaluate(design, model, *design.mass.entry_kg, history, fixed, guide), {}};
    return close_budget(design, model, history);
}

}  // namespace

Design freeze_design(const Design& design, Evaluation* sized) {
    const FlightEnvironment environment = make_environment(design);
    const FlightModel model = environment.model();
    Evaluation kept;
    Evaluation& e = sized ? *sized : kept;
    e = sized_evaluation(design, model, false).evaluation;
    Design frozen = design;
    frozen.mass.entry_kg = e.entry_kg;
    frozen.mass.heat_shield_kg = e.heat_shield_kg;
    frozen.mass.backshell_kg = e.backshell_kg;
    if (frozen.parachute)
        frozen.parachute->mass_kg = e.parachute_kg;
    if (frozen.decelerator)
        frozen.decelerator->mass_kg = e.decelerator_kg;
    if (frozen.drogue)
        frozen.drogue->mass_kg = e.drogue_kg;
    if (e.aeroshell.diameter_m > 0.0) {
        frozen.aeroshell.diameter_m = e.aeroshell.diameter_m;
        frozen.aeroshell.size_for_ballistic_coefficient_kg_m2.reset();
    }
    // The engines and tanks are built: a dispersed flight has this thrust and this load.
    if (e.full_thrust_N > 0.0)
        frozen.terminal.thrust_N = e.full_thrust_N;
    if (e.loaded_propellant_kg > 0.0)
        frozen.terminal.propellant_loaded_kg = e.loaded_propellant_kg;
    if (frozen.parachute && e.canopy_diameter_m > 0.0) {
        frozen.parachute->diameter_m = e.canopy_diameter_m;
        frozen.parachute->size_for_velocity_m_s.reset();
        frozen.parachute->at_height_above_site_m.reset();
    }
    return frozen;
}

namespace {

/// A figure that is not a finite number never passes for one: the check names the first few.
/// An input far outside what the models were built for (a specific impulse of 1e-300 s, a
/// canopy 1e300 m wide) can overflow a figure; the reader's ranges keep most such inputs out.
std::optional<Check> finite_figures_check(const Results& results, const SizingOptions& options) {
    std::vector<std::string> paths;
    if (options.every_figure_checked) {
        paths = non_finite_figures(results, options.history);
    } else {
        const std::vector<std::optional<double>> values = key_figure_values(results);
        for (std::size_t i = 0; i < values.size(); ++i) {
            if (values[i] && !std::isfinite(*values[i]))
                paths.emplace_back(key_figure_table[i].id);
        }
    }
    if (paths.empty())
        return std::nullopt;
    constexpr std::size_t named = 4;
    std::string listed;
    for (std::size_t i = 0; i < std::min(named, paths.size()); ++i)
        listed += fmt::format("{}{}", i == 0 ? "" : ", ", paths[i]);
    if (paths.size() > named)
        listed += fmt::format(" and {} more", paths.size() - named);
    return FlightChecks{options.check_wording}(
        "finite_figures", CheckStatus::fail, static_cast<double>(paths.size()), 0.0, "figures",
        [&] {
            return fmt::format(
                "{} figure{} of the sizing {} not a finite number ({}): an input lies outside "
                "what the models cover; look for one far from its typical range",
                paths.size(), paths.size() == 1 ? "" : "s", paths.size() == 1 ? "is" : "are",
                listed);
        },
        "the models' domain");
}

}  // namespace

Results size_design(const Design& design, SizingOptions options) {
    const FlightEnvironment environment = make_environment(design);
    const FlightModel model = environment.model();

    Results results;
    Closure sized =
        sized_evaluation(design, model, options.history, options.guide,
                         options.dispersed_case ? Precision::dispersed : Precision::design);
    Evaluation& e = sized.evaluation;
    const std::optional<MassClosure> closure =
        design.mass.entry_kg ? std::nullopt : std::optional<MassClosure>(sized.report);
    results.mass.mode = closure ? MassMode::sizing : MassMode::analysis;
    results.mass.closure = closure;

    fill_entry(e, design, results.entry);
    if (design.decelerator) {
        DeceleratorResults d;
        d.diameter_m = design.decelerator->diameter_m;
        d.mass_kg = e.decelerator_kg;
        if (const auto& at = e.entry.decelerator)
            set_deployed(d, *at);
        results.decelerator = d;
    }
    if (design.drogue)
        results.drogue = drogue_results(e, design);
    if (design.parachute)
        fill_parachute(e, model, results.parachute);
    fill_terminal(e, design, model, results.terminal);
    fill_conic(e, design, model.body, results);
    if (options.notes_and_timeline)
        fill_timeline(e, design, model.body, results.timeline);
    if (const auto margin = timeline_margin(design, model, e, design.site.elevation_m)) {
        results.timeline.margin_s = margin->margin_s;
        results.timeline.available_s = margin->available_s;
        results.timeline.needed_s = margin->needed_s;
    }
    results.mass.entry_kg = e.entry_kg;
    results.mass.items = e.budget.items();
    results.mass.unallocated_kg = e.unallocated_kg;
    // Nothing lands from a descent that stopped in the air (the "descent stopped" event).
    const bool powered_landing = e.burn && e.burn->stops_in_time &&
                                 design.terminal.method == TerminalMethod::supersonic_retro;
    if ((e.descent || powered_landing) && e.landing_kg > 0.0 && !stopped_in_air(e))
        results.mass.landed_kg = e.landed_kg;
    if (options.capability) {
        const std::optional<double> highest = max_site_elevation(design, model, e);
        results.capability.max_site_elevation_m = highest;
        if (highest) {
            const bool bound = *highest == site_search_ceiling(design, e);
            results.capability.max_site_elevation_limit =
                !bound ? SiteLimit::timeline_margin
                : design.terminal.method == TerminalMethod::supersonic_retro
                    ? SiteLimit::ignition
                    : SiteLimit::heat_shield_jettison;
        }
    }
    if (options.history)
        results.history = std::move(e.history);
    place_on_track(e, design, entry_track(e.entry.interface, model.body), results);

    if (options.notes_and_timeline)
        add_notes(design, e, results);

    std::vector<Check> checks = flight_checks(e, design, closure, options.check_wording);
    if (e.aeroshell.diameter_m > 0.0) {
        std::vector<Check> limits = limit_checks(design, results, options.check_wording);
        checks.insert(checks.end(), std::make_move_iterator(limits.begin()),
                      std::make_move_iterator(limits.end()));
    }
    const bool flown = e.aeroshell.diameter_m > 0.0 && e.entry.end != EntryEnd::stopped;
    results.converged = flown && (!closure || closure->converged);
    results.checks = std::move(checks);
    if (std::optional<Check> finite = finite_figures_check(results, options)) {
        results.checks.push_back(std::move(*finite));
        results.converged = false;
    }
    order_checks(results.checks);
    return results;
}

}  // namespace ds
