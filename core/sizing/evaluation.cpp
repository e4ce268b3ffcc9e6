#include "sizing/evaluation.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <optional>

#include <boost/math/tools/roots.hpp>

#include <fmt/format.h>

#include "aeroshell/sphere_cone.hpp"
#include "constants.hpp"
#include "heating/heat_shield_mass.hpp"
#include "mass/estimates.hpp"
#include "mass/growth.hpp"
#include "sizing/environment.hpp"
#include "sizing/landed_mass.hpp"

namespace ds {
namespace {

constexpr double per_cm2 = 1e-4;  // J/m^2 to J/cm^2

/// Loaded propellant from burned: the reserve rides unburned, the residual is trapped.
double loaded_propellant(const TerminalDesign& t, double burned_kg) {
    return burned_kg * (1.0 + t.propellant_reserve_fraction) /
           (1.0 - t.propellant_residual_fraction);
}

/// Propellant for hovering t seconds at thrust = weight: m0 (1 - exp(-g t / (Isp g0))),
/// the rocket equation with delta-v = g t.
double hover_propellant_kg(double mass_kg, double gravity_m_s2, double seconds, double isp_s) {
    return mass_kg * (1.0 - std::exp(-gravity_m_s2 * seconds / (isp_s * standard_gravity_m_s2)));
}

void add_drop_masses(const Design& design, Evaluation& e, double aeroshell_area_m2) {
    // A lump the design gives replaces its estimate; items of the design in the same group
    // are equipment carried besides it.
    MassBudget& b = e.budget;
    const auto lump = [&](const auto& add) {
        const double before = b.total_kg();
        add();
        return b.total_kg() - before;
    };
    e.heat_shield_kg = lump([&] {
        if (design.mass.heat_shield_kg) {
            b.add_given("heat shield", *design.mass.heat_shield_kg, MassGroup::heat_shield);
            return;
        }
        b.add_estimate("heat-shield TPS",
                       heat_shield_mass_fraction(e.total_heat_load_J_cm2) * e.entry_kg,
                       MassGroup::heat_shield,
                       "mass fraction of the heat load, Laub and Venkatapathy 2003 (from memory)");
        b.add_estimate("heat-shield structure",
                       MassEstimates::heat_shield_structure_kg_m2 * aeroshell_area_m2,
                       MassGroup::heat_shield, estimate_source);
    });
    if (design.decelerator) {
        const DeceleratorDesign& d = *design.decelerator;
        e.decelerator_kg = lump([&] {
            if (d.mass_kg) {
                b.add_given("inflatable decelerator", *d.mass_kg, MassGroup::heat_shield);
            } else {
                b.add_estimate(
                    "inflatable decelerator",
                    MassEstimates::inflatable_decelerator_kg_m2 * frontal_area_m2(d.diameter_m),
                    MassGroup::heat_shield, estimate_source);
            }
        });
    }
    e.backshell_kg = lump([&] {
        if (design.mass.backshell_kg) {
            b.add_given("backshell", *design.mass.backshell_kg, MassGroup::backshell);
        } else {
            b.add_estimate("backshell", MassEstimates::backshell_kg_m2 * aeroshell_area_m2,
                           MassGroup::backshell, estimate_source);
        }
    });
}

/// The deorbit burn's propellant, into the deorbit stage: burned from the stack of the entry
/// vehicle and the stage's own items (the design's, in that group), which the burn pushes too.
void add_deorbit_propellant(const Design& design, Evaluation& e) {
    const OrbitDesign& orbit = *design.entry.orbit;
    const double delta_v = e.conic->deorbit->delta_v_m_s;
    const double stage_dry = e.budget.group_kg(MassGroup::deorbit_stage);
    e.deorbit_propellant_kg = deorbit_propellant_kg(e.entry_kg + stage_dry, delta_v, orbit.isp_s);
    e.budget.add_computed("deorbit propellant", e.deorbit_propellant_kg, MassGroup::deorbit_stage,
                          fmt::format("rocket equation: {:.2f} m/s at apoapsis, Isp {:.0f} s, "
                                      "impulsive, no reserve",
                                      delta_v, orbit.isp_s));
}

/// Orders of the slow manifold a canopy is sized on: within 1e-5 of the flown speed under a
/// canopy on Mars, where the first order is 0.3 % off.
constexpr int sizing_equilibrium_orders = 4;

/// The nominal diameter at which the vehicle under the canopy, heat shield gone, passes the
/// requested height at the requested speed through the air, on the flown (quasi-steady)
/// descent: the equilibrium speed there, with the term that keeps it following the thickening
/// air (the vehicle still slows as it falls, so it needs more drag than the balance m g = q CdA
/// at that height). Starts from that balance and brackets the root outward from it. The
/// position is the deploy point's (or the entry interface's), at the requested height.
/// Returns 0 when the vehicle alone already descends slower, and the balance itself when the
/// equilibrium cannot be bracketed (a degenerate design: the checks report it).

double canopy_diameter_for_flown_speed(const FlightModel& model, const DragDevice& canopy_shape,
                                       double body_drag_area_m2, double suspended_kg,
                                       FlightState where, double target_m_s) {
    const double balance = canopy_diameter_for_velocity(
        suspended_kg, model.body.gravity_m_s2(where[StateIndex::altitude]),
        model.atmosphere.at(where[StateIndex::altitude]).density_kg_m3, target_m_s,
        canopy_shape.drag_coefficient, body_drag_area_m2);
    if (balance <= 0.0)
        return 0.0;
    where[StateIndex::mass] = suspended_kg;
    where[StateIndex::east_velocity] = 0.0;
    where[StateIndex::north_velocity] = 0.0;
    where[StateIndex::up_velocity] = -target_m_s;
    Stage stage;
    stage.drag_devices = {canopy_shape, {body_drag_area_m2, 1.0, {}}};
    const auto excess_speed = [&](double diameter_m) {
        stage.drag_devices.front().area_m2 = frontal_area_m2(diameter_m);
        const FlightState settled =
            onto_equilibrium(model, stage, where, sizing_equilibrium_orders);
        return flight_conditions(model, stage, settled).air_speed_m_s - target_m_s;
    };
    // The speed falls as the canopy grows; 1e-10 of the diameter is far inside the 0.1 % the
    // request is held to.
    constexpr double growth = 1.05;
    const auto close = [](double a, double b) { return std::abs(b - a) <= 1e-10 * a; };
    std::uintmax_t iterations = 100;
    try {
        const auto [low, high] = boost::math::tools::bracket_and_solve_root(
            excess_speed, balance, growth, false, close, iterations);
        const double diameter = 0.5 * (low + high);
        return std::isfinite(diameter) ? diameter : balance;
    } catch (const boost::math::evaluation_error&) {
        return balance;
    }
}

/// A canopy's mass in the backshell group: given, or estimated from its nominal area. Returns it
/// with its growth allowance.
double add_canopy_mass(const std::string& name, const CanopyType& type, double diameter_m,
                       const std::optional<double>& given_kg, MassBudget& budget) {
    const double before = budget.total_kg();
    if (given_kg) {
        budget.add_given(name, *given_kg, MassGroup::backshell);
    } else {
        budget.add_estimate(name, canopy_mass_kg(type, diameter_m), MassGroup::backshell,
                            fmt::format("{:.2f} kg/m^2 of nominal area (common practice, from "
                                        "memory)",
                                        type.areal_mass_kg_m2));
    }
    return budget.total_kg() - before;
}

void size_canopy(const Design& design, const FlightModel& model, Evaluation& e,
                 double body_drag_area_m2) {
    const ParachuteDesign& p = *design.parachute;
    e.canopy = *canopy_type(p.type);
    e.canopy_drag_coefficient = p.drag_coefficient.value_or(e.canopy.drag_coefficient);
    if (p.diameter_m) {
        e.canopy_diameter_m = *p.diameter_m;
    } else {
        FlightState where = e.entry.end == EntryEnd::deployed ? e.entry.end_state : e.entry.start;
        where[StateIndex::altitude] = design.site.elevation_m + *p.at_height_above_site_m;
        e.canopy_diameter_m = canopy_diameter_for_flown_speed(
            model, canopy_device(e.canopy, 1.0, e.canopy_drag_coefficient), body_drag_area_m2,
            e.entry_kg - e.budget.group_kg(MassGroup::heat_shield), where,
            *p.size_for_velocity_m_s);
    }
    e.parachute_kg = add_canopy_mass(fmt::format("parachute ({})", p.type), e.canopy,
                                     e.canopy_diameter_m, p.mass_kg, e.budget);
}

/// The drogue's mass, with the backshell's (it rides down with it).
void add_drogue_mass(const Design& design, Evaluation& e) {
    if (!design.drogue)
        return;
    const DrogueDesign& d = *design.drogue;
    e.drogue_kg = add_canopy_mass(fmt::format("drogue ({})", d.type), *canopy_type(d.type),
                                  d.diameter_m, d.mass_kg, e.budget);
}

/// The burn the lander flies: full thrust as given, or thrust-to-weight at the site times the
/// lander's weight there (sets the evaluation's full thrust).
BurnRequest burn_request(const Design& design, double g_site, Evaluation& e) {
    const TerminalDesign& t = design.terminal;
    e.full_thrust_N = t.thrust_N.value_or(t.thrust_to_weight * e.lander_kg * g_site);
    BurnRequest request;
    request.site_elevation_m = design.site.elevation_m;
    request.end_height_above_site_m = t.method == TerminalMethod::airbag     ? t.release_height_m
                                      : t.method == TerminalMethod::tethered ? t.tether_length_m
                                                                             : 0.0;
    request.end_velocity_m_s = t.touchdown_velocity_m_s;
    request.lander_mass_kg = e.lander_kg;
    request.thrust_N = t.throttle * e.full_thrust_N;
    request.specific_impulse_s = t.isp_s;
    request.coast_s = design.sequence.separation_coast_s;
    return request;
}

/// The history: the descent under the canopy up to separation, then the lander.
void record_burn_history(const BurnSolution& burn,
                         const std::vector<TrajectorySample>& burn_samples, Evaluation& e) {
    for (const TrajectorySample& s : e.descent->samples) {
        if (s.time_s < burn.separation_time_s)
            e.history.push_back(s);
    }
    e.history.insert(e.history.end(), burn_samples.begin(), burn_samples.end());
}

/// Tethered: hover while the payload is lowered at the end velocity, cut, fly away. The stage
/// that flies away (its items, tanks, engines and unburned propellant) depends on the
/// propellant loaded, so a few passes settle it. Returns the propellant the hover and the
/// fly-away burn; sets the hover time and the payload's touchdown.
double hover_and_fly_away(const TerminalDesign& t, const BurnSolution& burn, double g_site,
                          double end_height, double end_velocity, double descent_items,
                          double engines, Evaluation& e) {
    const double lowering_s = end_height / end_velocity;
    const double after_burn = burn.end_state[StateIndex::mass];
    const double hover_burned = hover_propellant_kg(after_burn, g_site, lowering_s, t.isp_s);
    double fly_away_burned = 0.0;
    constexpr int passes = 4;
    for (int i = 0; i < passes; ++i) {
        const double loaded = t.propellant_loaded_kg.value_or(
            loaded_propellant(t, burn.burned_kg + hover_burned + fly_away_burned));
        const double tanks = MassEstimates::tank_fraction * loaded;
        const double stage = descent_items +
                             (tanks + engines) * (1.0 + growth_allowance(Maturity::estimated)) +
                             (loaded - burn.burned_kg - hover_burned);
        fly_away_burned = hover_propellant_kg(stage, g_site, t.fly_away_s, t.isp_s);
    }
    e.hover_time_s = lowering_s + t.fly_away_s;
    e.touchdown_time_s = burn.end_time_s + lowering_s;
    e.touchdown_velocity_m_s = end_velocity;
    return hover_burned + fly_away_burned;
}

/// What follows the burn's end, by method: touchdown (retro), the airbag's free fall, or the
/// tethered hover. Returns the propellant burned in all.
double finish_terminal_descent(const TerminalDesign& t, const BurnSolution& burn, double site,
                               double g_site, double engines, double radius_m, Evaluation& e) {
    const double end_height = burn.end_state[StateIndex::altitude] - site;
    const double end_velocity = speed(burn.end_state);
    // The payload comes down from the burn's end, carried on by its horizontal speed while it
    // falls (airbag) or is lowered (tethered).
    const GroundPoint end_point{burn.end_state[StateIndex::latitude],
                                burn.end_state[StateIndex::longitude]};
    const double end_horizontal = horizontal_speed(burn.end_state);
    const auto carried_for = [&](double seconds) {
        return destination(end_point, azimuth_rad(burn.end_state), end_horizontal * seconds,
                           radius_m);
    };
    e.touchdown_horizontal_velocity_m_s = end_horizontal;
    double burned = burn.burned_kg;
    switch (t.method) {
        case TerminalMethod::retro:
        case TerminalMethod::supersonic_retro:
            e.touchdown_time_s = burn.end_time_s;
            e.touchdown_velocity_m_s = end_velocity;
            e.landing_point = end_point;
            break;
        case TerminalMethod::airbag: {
            // Cut free at the end of the burn: free fall to the ground.
            const double v = std::sqrt(end_velocity * end_velocity + 2.0 * g_site * end_height);
            e.impact_velocity_m_s = v;
            e.touchdown_time_s = burn.end_time_s + (v - end_velocity) / g_site;
            e.landing_point = carried_for((v - end_velocity) / g_site);
            break;
        }
        case TerminalMethod::tethered:
            burned += hover_and_fly_away(t, burn, g_site, end_height, end_velocity,
                                         e.budget.group_kg(MassGroup::descent_stage), engines, e);
            e.landing_point = carried_for(end_height / end_velocity);
            break;
        case TerminalMethod::none:
            break;
    }
    return burned;
}

/// The propellant loaded, its tanks and the engines, into the budget's descent stage.
void add_propulsion(const TerminalDesign& t, double burned, double engines, Evaluation& e) {
    e.burned_kg = burned;
    e.loaded_propellant_kg = t.propellant_loaded_kg.value_or(loaded_propellant(t, burned));
    const double tanks = MassEstimates::tank_fraction * e.loaded_propellant_kg;
    e.budget.add_computed(
        "propellant (loaded)", e.loaded_propellant_kg, MassGroup::descent_stage,
        t.propellant_loaded_kg
            ? fmt::format("given by the design; {:.1f} kg burned", burned)
            : fmt::format("rocket equation: {:.1f} kg burned, {:.0f} % reserve, {:.0f} % residual",
                          burned, 100.0 * t.propellant_reserve_fraction,
                          100.0 * t.propellant_residual_fraction));
    e.budget.add_estimate("propellant tanks", tanks, MassGroup::descent_stage,
                          fmt::format("{:.0f} % of loaded propellant; {}",
                                      100.0 * MassEstimates::tank_fraction, estimate_source));
    e.budget.add_estimate(
        "engines and feed system", engines, MassGroup::descent_stage,
        fmt::format("{} kg per N of {} full thrust; {}", MassEstimates::engine_kg_per_N,
                    t.thrust_N ? "the given" : "the", estimate_source));
}

/// The burn, hover and fly-away of the methods that fire engines; fills the propellant and
/// the propulsion estimates into the budget.
void fly_terminal_burn(const Design& design, const FlightModel& model, Evaluation& e, bool history,
                       const Evaluation* previous) {
    const double site = design.site.elevation_m;
    const double g_site = model.body.gravity_m_s2(site);
    BurnRequest request = burn_request(design, g_site, e);
    if (e.precision == Precision::dispersed)
        request.separation_time_tolerance_s = dispersed_separation_tolerance_s;
    const auto settings = design_integrator_settings(design);
    // A dispersion's case starts from what the nominal vehicle's solve measured of the closed
    // form's error: the rover carrier's cases' own lie within some 5 mm of it (standard
    // deviation), about what a case's tolerance lets the first flight stop above the target, so
    // about half its first flights close the solve (the station's, within 0.2 mm: all).
    SeparationGuide guide;
    if (e.precision == Precision::dispersed && previous && previous->burn &&
        previous->burn->stops_in_time && !previous->ignition_delayed)
        guide.start_from(previous->burn->closed_form_offset_m);
    std::vector<TrajectorySample> burn_samples;
    const BurnSolution burn = solve_terminal_burn(model, e.descent->record, request, settings,
                                                  history ? &burn_samples : nullptr, &guide);
    e.burn_request = request;
    e.burn = burn;
    if (history)
        record_burn_history(burn, burn_samples, e);

    e.canopy_exit_state = burn.separation_state;
    const double engines = MassEstimates::engine_kg_per_N * e.full_thrust_N;
    const double burned = finish_terminal_descent(design.terminal, burn, site, g_site, engines,
                                                  model.body.radius_m, e);
    add_propulsion(design.terminal, burned, engines, e);
}

/// The entry's last stage: the aeroshell with its lift, and the decelerator once it has
/// deployed.
Stage last_entry_stage(const Design& design, const Evaluation& e) {
    Stage stage = entry_stage(design, e.aeroshell);
    if (design.decelerator && e.entry.decelerator) {
        stage.drag_devices.push_back(decelerator_device(design));
    }
    return stage;
}

/// The last stage's drag devices, their drag scaled by the share kept while the engines fire
/// into the flow.
std::vector<DragDevice> devices_under_thrust(const Design& design, const Evaluation& e) {
    std::vector<DragDevice> devices = last_entry_stage(design, e).drag_devices;
    for (DragDevice& device : devices)
        device.drag_coefficient *= design.terminal.drag_preservation;
    return devices;
}

/// The unpowered flight on from the ignition trigger down to the site, on the entry's last
/// stage, kept dense: where a later ignition is looked for when even the deepest throttle would
/// stop the vehicle above the site.
DenseTrajectory coast_after_trigger(const Design& design, const FlightModel& model,
                                    const Evaluation& e,
                                    const IntegratorSettings<flight_state_size>& settings,
                                    std::vector<TrajectorySample>* samples) {
    Phase coast;
    coast.name = "coast to ignition";
    coast.stage = last_entry_stage(design, e);
    coast.ends = {
        {"ground", FlightQuantity::altitude, design.site.elevation_m, EventDirection::falling}};
    DenseTrajectory record;
    fly_phase(model, coast, e.entry.end_time_s, e.entry.end_state, design.solver.max_time_s,
              settings, {samples, &record});
    return record;
}

/// Supersonic retro-propulsion: the engines light at the ignition trigger of the entry and fly
/// a gravity turn into the flow, then the terminal descent, to the end speed at the site. The
/// throttle is solved for it; when even the deepest throttle stops above the site, the ignition
/// comes later at that throttle (solved on the unpowered flight after the trigger). Nothing
/// separates: the whole entry vehicle lands, less the propellant burned.
void fly_powered_descent(const Design& design, const FlightModel& model, Evaluation& e,
                         bool history, const Evaluation* previous) {
    const TerminalDesign& t = design.terminal;
    const double site = design.site.elevation_m;
    const double g_site = model.body.gravity_m_s2(site);
    e.full_thrust_N = t.thrust_N.value_or(t.thrust_to_weight * e.lander_kg * g_site);
    BurnRequest request;
    request.site_elevation_m = site;
    request.end_velocity_m_s = t.touchdown_velocity_m_s;
    request.lander_mass_kg = e.entry.end_state[StateIndex::mass];
    request.thrust_N = t.throttle * e.full_thrust_N;
    request.throttle = t.throttle;
    request.specific_impulse_s = t.isp_s;
    request.drag_devices = devices_under_thrust(design, e);
    request.thrust_reference_area_m2 = frontal_area_m2(e.aeroshell.diameter_m);
    request.gravity_turn = true;
    if (e.precision == Precision::dispersed)  // for a delayed ignition's separation solve
        request.separation_time_tolerance_s = dispersed_separation_tolerance_s;
    const auto settings = design_integrator_settings(design);
    std::vector<TrajectorySample> burn_samples;
    std::vector<TrajectorySample>* record = history ? &burn_samples : nullptr;
    ThrottleSolve how;
    if (e.precision == Precision::aiming) {
        const double flow_kg_s = request.thrust_N / (t.isp_s * standard_gravity_m_s2);
        how.end_time_tolerance_s =
            std::max(how.end_time_tolerance_s, aiming_propellant_tolerance_kg / flow_kg_s);
    }
    if (e.precision == Precision::first_guess)
        how.end_time_tolerance_s = first_guess_end_time_tolerance_s;
    if (e.precision == Precision::dispersed)
        how.end_time_tolerance_s = dispersed_end_time_tolerance_s;
    if (previous && previous->burn && previous->burn_request && !previous->ignition_delayed) {
        how.earlier = &*previous->burn;
        how.earlier_request = &*previous->burn_request;
        how.offset_slope_m = previous->throttle_offset_slope_m;
    }
    ThrottledBurn solved =
        solve_burn_throttle(model, request, e.full_thrust_N, t.min_throttle, settings,
                            e.entry.end_time_s, e.entry.end_state, record, how);
    if (solved.too_strong) {
        std::vector<TrajectorySample> coast_samples;
        const DenseTrajectory coast =
            coast_after_trigger(design, model, e, settings, history ? &coast_samples : nullptr);
        request.throttle = t.min_throttle;
        request.thrust_N = t.min_throttle * e.full_thrust_N;
        burn_samples.clear();
        if (!coast.empty()) {
            solved.burn = solve_terminal_burn(model, coast, request, settings, record);
            solved.burn.throttle = t.min_throttle;
        }
        for (const TrajectorySample& s : coast_samples) {
            if (s.time_s < solved.burn.ignition_time_s)
                e.history.push_back(s);
        }
    }
    request.throttle = solved.burn.throttle;
    request.thrust_N = solved.burn.throttle * e.full_thrust_N;
    e.ignition_delayed = solved.too_strong;
    e.throttle_offset_slope_m = solved.offset_slope_m;
    e.burn_request = request;
    e.burn = solved.burn;
    e.history.insert(e.history.end(), burn_samples.begin(), burn_samples.end());

    const double engines = MassEstimates::engine_kg_per_N * e.full_thrust_N;
    const double burned =
        finish_terminal_descent(t, *e.burn, site, g_site, engines, model.body.radius_m, e);
    add_propulsion(t, burned, engines, e);
}

/// The descent under the canopy to the ground, with no burn: the method "none" touches down
/// on its canopy; a design with no lander (drop_mass) only keeps the descent's history.
void descend_on_canopy(const Design& design, Evaluation& e) {
    const auto t = e.descent->record.time_descending_through(design.site.elevation_m);
    for (const TrajectorySample& s : e.descent->samples) {
        if (!t || s.time_s <= *t)
            e.history.push_back(s);
    }
    if (t && design.terminal.method == TerminalMethod::none) {
        const FlightState y = e.descent->record.state_at(*t);
        e.touchdown_time_s = *t;
        e.touchdown_velocity_m_s = speed(y);
        e.touchdown_horizontal_velocity_m_s = horizontal_speed(y);
        e.landing_point = GroundPoint{y[StateIndex::latitude], y[StateIndex::longitude]};
        e.canopy_exit_state = y;
    }
}

}  // namespace

Evaluation evaluate(const Design& given, const FlightModel& model, double entry_kg, bool history,
                    Precision precision, const Evaluation* previous) {
    // Aiming (or at the first guess), the design is flown at the looser of its tolerance and
    // the aiming one (the first guess's).
    const double loosest = precision == Precision::aiming        ? aiming_relative_tolerance
                           : precision == Precision::first_guess ? first_guess_relative_tolerance
                                                                 : 0.0;
    std::optional<Design> loosened;
    if (given.solver.relative_tolerance < loosest) {
        loosened = given;
        loosened->solver.relative_tolerance = loosest;
    }
    const Design& design = loosened ? *loosened : given;
    Evaluation e;
    e.precision = precision;
    e.entry_kg = entry_kg;
    e.aeroshell = resolve_aeroshell(design, entry_kg);
    for (const MassItemDesign& item : design.mass.items)
        e.budget.add_item(item.name, item.mass_kg, item.group, item.maturity);
    e.entry.interface = interface_state(design, model.body);  // reported even when not flown
    e.conic = entry_conic(design, model.body);
    if (e.conic && e.conic->deorbit)
        add_deorbit_propellant(design, e);
    if (e.aeroshell.diameter_m <= 0.0)
        return e;

    e.entry = fly_entry(design, model, e.aeroshell, entry_kg, history ? &e.history : nullptr);
    if (e.entry.end == EntryEnd::ground) {  // it comes down before the parachute: there
        e.landing_point = GroundPoint{e.entry.end_state[StateIndex::latitude],
                                      e.entry.end_state[StateIndex::longitude]};
        if (!entry_end_trigger(design)) {  // a ballistic impact, by design: how hard
            e.touchdown_velocity_m_s = speed(e.entry.end_state);
            e.touchdown_horizontal_velocity_m_s = horizontal_speed(e.entry.end_state);
        }
    }
    e.total_heat_load_J_cm2 = (e.entry.end_state[StateIndex::convective_heat_load] +
                               e.entry.end_state[StateIndex::radiative_heat_load]) *
                              per_cm2;
    const double area = frontal_area_m2(e.aeroshell.diameter_m);
    const double body_drag_area = MassEstimates::suspended_body_drag_coefficient * area;
    add_drop_masses(design, e, area);
    add_drogue_mass(design, e);
    if (design.parachute)
        size_canopy(design, model, e, body_drag_area);
    const bool powered_from_entry = design.terminal.method == TerminalMethod::supersonic_retro;
    e.lander_kg = powered_from_entry ? entry_kg
                                     : entry_kg - e.budget.group_kg(MassGroup::heat_shield) -
                                           e.budget.group_kg(MassGroup::backshell);
    e.landing_kg = e.lander_kg + (backshell_separates(design.terminal.method) || powered_from_entry
                                      ? 0.0
                                      : e.budget.group_kg(MassGroup::backshell));
    // Parts that weigh as much as the vehicle leave nothing to land: no thrust, propellant or
    // landed mass is made from a lander of zero mass or less (the drop_mass check says why).
    // The vehicle still hangs under its canopy, unless the heat shield alone outweighs it.
    const bool has_lander = e.landing_kg > 0.0;
    const bool under_canopy = entry_kg > e.budget.group_kg(MassGroup::heat_shield);

    const bool fires_engines = design.terminal.method != TerminalMethod::none;
    if (powered_from_entry) {
        if (e.entry.end == EntryEnd::deployed && has_lander)
            fly_powered_descent(design, model, e, history, previous);
    } else if (e.entry.end == EntryEnd::deployed && e.canopy_diameter_m > 0.0 && under_canopy) {
        DescentPlan plan;
        plan.canopy = canopy_device(e.canopy, e.canopy_diameter_m, e.canopy_drag_coefficient);
        plan.entry_vehicle = aeroshell_device(design, e.aeroshell);
        plan.body_drag_area_m2 = body_drag_area;
        plan.jettison_mass_kg = e.budget.group_kg(MassGroup::heat_shield);
        plan.floor_altitude_m = design.site.elevation_m;
        plan.record_samples = history;
        e.descent = fly_descent(design, model, plan, e.entry.end_time_s, e.entry.end_state);
        if (fires_engines && has_lander) {
            if (!e.descent->record.empty())
                fly_terminal_burn(design, model, e, history, previous);
        } else {
            descend_on_canopy(design, e);
        }
    }

    // What reaches the ground (airbags, estimated below from it, included).
    // (A powered descent from the entry lands the whole vehicle, less what it burned.)
    if (powered_from_entry) {
        e.landed_kg = e.lander_kg - e.burned_kg;
    } else {
        e.landed_kg = has_lander ? landed_mass_kg(design.terminal.method, e.lander_kg, e.burned_kg,
                                                  e.budget.group_kg(MassGroup::descent_stage),
                                                  e.budget.group_kg(MassGroup::backshell))
                                 : 0.0;
    }
    if (design.terminal.method == TerminalMethod::airbag) {
        e.budget.add_estimate("airbags", MassEstimates::airbag_fraction * e.landed_kg,
                              MassGroup::payload,
                              fmt::format("{:.0f} % of the landed mass; {}",
                                          100.0 * MassEstimates::airbag_fraction, estimate_source));
        if (e.impact_velocity_m_s) {
            e.impact_energy_J = 0.5 * e.landed_kg * *e.impact_velocity_m_s * *e.impact_velocity_m_s;
        }
    }
    if (design.mass.entry_kg) {
        e.unallocated_kg = entry_kg - e.budget.entry_kg();
        e.budget.add_computed("unallocated (entry mass less the budget)", *e.unallocated_kg,
                              MassGroup::payload, "entry mass fixed by the design");
    }
    return e;
}

namespace {

// At another site than the design's the burn is solved again, for the highest feasible site,
// found to half a metre: to a millisecond of separation or of the burn's time, which moves the
// margin by a millisecond, and with flights at a relative tolerance of 1e-5 where the design's
// is tighter, which moves where a burn ends by centimetres (our choice).
constexpr double trade_tolerance_s = 1e-3;
constexpr double trade_relative_tolerance = 1e-5;

IntegratorSettings<flight_state_size> trade_settings(const Design& design) {
    return flight_integrator_settings(
        std::max(design.solver.relative_tolerance, trade_relative_tolerance),
        static_cast<std::size_t>(design.solver.max_steps));
}

/// The powered descent from the entry at another site: lit at the trigger, at the design's
/// throttle until solved.
BurnRequest powered_request_at(const Design& design, const Evaluation& e, double site_m) {
    BurnRequest request = *e.burn_request;
    request.site_elevation_m = site_m;
    request.throttle = design.terminal.throttle;
    request.thrust_N = design.terminal.throttle * e.full_thrust_N;
    return request;
}

/// The timeline margin of a powered descent from the entry: the time from ignition to the
/// burn's end, less the ground-sensing lock the terminal descent needs.
TimelineMargin powered_margin(const Design& design, const BurnSolution& burn) {
    TimelineMargin m;
    m.available_s = burn.end_time_s - burn.ignition_time_s;
    m.needed_s = design.sequence.ground_sensing_lock_s;
    m.margin_s = m.available_s - m.needed_s;
    return m;
}

}  // namespace

std::optional<PoweredReach> powered_reach(const Design& design, const FlightModel& model,
                                          const Evaluation& e, double lowest_site_m) {
    if (design.terminal.method != TerminalMethod::supersonic_retro || !e.burn || !e.burn_request)
        return std::nullopt;
    const BurnAttempt full =
        fly_burn(model, powered_request_at(design, e, lowest_site_m), trade_settings(design),
                 e.entry.end_time_s, e.entry.end_state, nullptr);
    if (!full.reached_velocity)
        return std::nullopt;
    return PoweredReach{
        full.burn.end_state[StateIndex::altitude] - e.burn_request->end_height_above_site_m,
        powered_margin(design, full.burn).margin_s};
}

std::optional<TimelineMargin> timeline_margin(const Design& design, const FlightModel& model,
                                              const Evaluation& e, double site_elevation_m,
                                              SeparationGuide* guide) {
    if (design.terminal.method == TerminalMethod::supersonic_retro) {
        if (!e.burn)
            return std::nullopt;
        BurnSolution burn = *e.burn;
        if (site_elevation_m != e.burn_request->site_elevation_m) {
            // The powered descent lit at the trigger, its throttle solved for that site, from
            // the design site's solve when that was lit there too.
            ThrottleSolve how;
            how.end_time_tolerance_s = trade_tolerance_s;
            how.earlier = e.ignition_delayed ? nullptr : &*e.burn;
            how.offset_slope_m = e.throttle_offset_slope_m;
            burn = solve_burn_throttle(model, powered_request_at(design, e, site_elevation_m),
                                       e.full_thrust_N, design.terminal.min_throttle,
                                       trade_settings(design), e.entry.end_time_s,
                                       e.entry.end_state, nullptr, how)
                       .burn;
        }
        TimelineMargin m = powered_margin(design, burn);
        if (!burn.stops_in_time) {
            // As under a canopy: the excess speed counts against it, so the margin keeps
            // falling as the site rises.
            constexpr double seconds_per_m_s = 1.0;
            m.margin_s =
                std::min(m.margin_s, 0.0) -
                seconds_per_m_s * (speed(burn.end_state) - e.burn_request->end_velocity_m_s);
        }
        return m;
    }
    if (!e.descent || !e.descent->jettisoned)
        return std::nullopt;
    const bool fires_engines = design.terminal.method != TerminalMethod::none;
    // No burn to time against: no lander (drop_mass), or no descent record to burn on.
    if (fires_engines && !e.burn_request)
        return std::nullopt;
    const DescentFlight& d = *e.descent;
    TimelineMargin m;
    const double jettison_after_deploy = d.jettison_time_s - d.deploy_time_s;
    if (!e.burn_request) {
        const auto t = d.record.time_descending_through(site_elevation_m);
        if (!t)
            return std::nullopt;
        m.available_s = *t - d.deploy_time_s;
        m.needed_s = jettison_after_deploy;
        m.margin_s = m.available_s - m.needed_s;
        return m;
    }
    m.needed_s = jettison_after_deploy + design.sequence.ground_sensing_lock_s +
                 design.sequence.separation_coast_s;
    BurnSolution burn = *e.burn;
    if (site_elevation_m != e.burn_request->site_elevation_m) {
        BurnRequest request = *e.burn_request;
        request.site_elevation_m = site_elevation_m;
        request.separation_time_tolerance_s = trade_tolerance_s;
        burn =
            solve_terminal_burn(model, d.record, request, trade_settings(design), nullptr, guide);
    }
    m.available_s = burn.ignition_time_s - d.deploy_time_s;
    m.margin_s = m.available_s - m.needed_s;
    if (!burn.stops_in_time) {
        // It cannot land there at all: count the excess speed against it, so the margin keeps
        // falling as the site rises and a root-finder sees one crossing.
        constexpr double seconds_per_m_s = 1.0;
        m.margin_s = std::min(m.margin_s, 0.0) -
                     seconds_per_m_s * (speed(burn.end_state) - e.burn_request->end_velocity_m_s);
    }
    return m;
}

}  // namespace ds
