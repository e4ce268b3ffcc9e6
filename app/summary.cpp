#include "summary.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <optional>
#include <string_view>
#include <utility>

#include <fmt/format.h>

#include "enum_names.hpp"

namespace ds {
namespace {

constexpr int label_width = 36;

void heading(std::string& out, std::string_view title) {
    fmt::format_to(std::back_inserter(out), "\n{}\n{:-<{}}\n", title, "", title.size());
}

void row(std::string& out, std::string_view label, double value, std::string_view unit,
         int decimals) {
    // A figure that overflowed is said to be one (the finite_figures check names it), and one
    // too large for its column is written with an exponent, not three hundred digits.
    if (!std::isfinite(value)) {
        fmt::format_to(std::back_inserter(out), "  {:<{}} {:>12} {}\n", label, label_width,
                       "not finite", unit);
    } else if (std::abs(value) >= 1e9) {
        fmt::format_to(std::back_inserter(out), "  {:<{}} {:>12.4e} {}\n", label, label_width,
                       value, unit);
    } else {
        fmt::format_to(std::back_inserter(out), "  {:<{}} {:>12.{}f} {}\n", label, label_width,
                       value, decimals, unit);
    }
}

void row(std::string& out, std::string_view label, const std::optional<double>& value,
         std::string_view unit, int decimals) {
    if (value) {
        row(out, label, *value, unit, decimals);
    } else {
        fmt::format_to(std::back_inserter(out), "  {:<{}} {:>12} {}\n", label, label_width, "-",
                       unit);
    }
}

void text_row(std::string& out, std::string_view label, std::string_view text) {
    fmt::format_to(std::back_inserter(out), "  {:<{}} {:>12}\n", label, label_width, text);
}

constexpr Names<CheckStatus, 3> status_tags{{{CheckStatus::fail, "FAIL"},
                                             {CheckStatus::marginal, "MARGINAL"},
                                             {CheckStatus::pass, "pass"}}};

std::string_view status_tag(CheckStatus status) {
    return name_of(status_tags, status);
}

void write_header(std::string& out, const Design& design, const Results& results) {
    auto it = std::back_inserter(out);
    fmt::format_to(it, "Descent Sizer: {}\n",
                   design.name.empty() ? "(unnamed design)" : design.name);
    // The entry state as the design gives it, or as its conic gives it (inertial).
    const EntryDesign& entry = design.entry;
    const EntryVelocity& conic = results.entry.interface.inertial;
    fmt::format_to(it,
                   "body {}, site elevation {:.0f} m, entry {:.0f} m/s at {:.2f} deg{} from "
                   "{:.0f} m\n",
                   design.body.body.name, design.site.elevation_m,
                   entry.from_conic() ? conic.velocity_m_s : entry.velocity_m_s,
                   entry.from_conic() ? conic.flight_path_angle_deg : entry.flight_path_angle_deg,
                   entry.approach ? " (inertial, from the approach)"
                   : entry.orbit  ? " (inertial, from orbit)"
                                  : "",
                   entry.interface_altitude_m);
    const std::size_t failing = static_cast<std::size_t>(
        std::count_if(results.checks.begin(), results.checks.end(),
                      [](const Check& c) { return c.status == CheckStatus::fail; }));
    const std::size_t marginal = static_cast<std::size_t>(
        std::count_if(results.checks.begin(), results.checks.end(),
                      [](const Check& c) { return c.status == CheckStatus::marginal; }));
    fmt::format_to(it, "{}: {} failing, {} marginal, {} checks\n",
                   results.converged ? "sized" : "NOT SIZED", failing, marginal,
                   results.checks.size());
}

void write_checks(std::string& out, const std::vector<Check>& checks) {
    heading(out, "Checks (failing first)");
    for (const Check& c : checks) {
        fmt::format_to(std::back_inserter(out), "  {:<9} {:<30} {}\n", status_tag(c.status), c.id,
                       c.message);
    }
}

void write_frames(std::string& out, const EntryVelocity& relative, const EntryVelocity& inertial) {
    for (const auto& [frame, v] :
         {std::pair<std::string_view, const EntryVelocity&>{"planet-relative", relative},
          std::pair<std::string_view, const EntryVelocity&>{"inertial", inertial}}) {
        fmt::format_to(std::back_inserter(out),
                       "  {:<{}} {:>12.1f} m/s at {:.3f} deg, azimuth {:.3f} deg\n",
                       fmt::format("entry state, {}", frame), label_width, v.velocity_m_s,
                       v.flight_path_angle_deg, v.azimuth_deg);
    }
}

void write_approach(std::string& out, const ApproachResults& a) {
    heading(out, "Approach (hyperbolic arrival)");
    row(out, "excess speed (v infinity)", a.v_infinity_m_s, "m/s", 1);
    row(out, "semi-major axis", a.semi_major_axis_m * 1e-3, "km", 1);
    row(out, "eccentricity", a.eccentricity, "", 5);
    row(out, "periapsis altitude (in vacuum)", a.periapsis_altitude_m, "m", 0);
    row(out, "impact parameter", a.impact_parameter_m * 1e-3, "km", 1);
    row(out, "turn angle", a.turn_angle_deg, "deg", 2);
    row(out, "true anomaly at the interface", a.interface_true_anomaly_deg, "deg", 3);
    write_frames(out, a.relative, a.inertial);
}

void write_orbit(std::string& out, const OrbitResults& o) {
    heading(out, "Deorbit burn");
    row(out, "orbit periapsis altitude", o.periapsis_altitude_m, "m", 0);
    row(out, "orbit apoapsis altitude", o.apoapsis_altitude_m, "m", 0);
    row(out, "speed at apoapsis before the burn", o.speed_before_burn_m_s, "m/s", 2);
    row(out, "speed at apoapsis after the burn", o.speed_after_burn_m_s, "m/s", 2);
    row(out, "delta-v (impulsive)", o.delta_v_m_s, "m/s", 2);
    row(out, "specific impulse", o.isp_s, "s", 0);
    row(out, "propellant", o.propellant_kg, "kg", 1);
    row(out, "deorbit stage (dropped before entry)", o.stage_kg, "kg", 1);
    row(out, "mass before the burn", o.mass_before_burn_kg, "kg", 1);
    row(out, "transfer periapsis (in vacuum)", o.transfer_periapsis_altitude_m, "m", 0);
    row(out, "transfer eccentricity", o.transfer_eccentricity, "", 5);
    row(out, "angle from the burn to the interface", o.transfer_angle_deg, "deg", 2);
    row(out, "coast from the burn to the interface", o.coast_s, "s", 1);
    write_frames(out, o.relative, o.inertial);
}

void write_entry(std::string& out, const EntryResults& e) {
    heading(out, "Entry");
    auto it = std::back_inserter(out);
    const EntryInterface& in = e.interface;
    fmt::format_to(it, "  {:<{}} {:>12.4f} {:>12.4f} deg{}\n", "interface latitude, longitude",
                   label_width, in.latitude_deg, in.longitude_deg,
                   in.rotation_flown ? "" : " (body flown without rotation)");
    write_frames(out, in.relative, in.inertial);
    row(out, "entry mass", e.mass_kg, "kg", 1);
    row(out, "aeroshell diameter", e.diameter_m, "m", 3);
    row(out, "nose radius", e.nose_radius_m, "m", 3);
    fmt::format_to(std::back_inserter(out), "  {:<{}} {:>12.4f} ({})\n", "drag coefficient",
                   label_width, e.drag_coefficient, to_string(e.drag_coefficient_source));
    row(out, "ballistic coefficient", e.ballistic_coefficient_kg_m2, "kg/m^2", 1);
    row(out, "peak deceleration", e.peak_deceleration_g, "g", 2);
    row(out, "  at altitude", e.peak_deceleration_altitude_m, "m", 0);
    row(out, "peak convective heat flux", e.peak_heat_flux_W_cm2, "W/cm^2", 2);
    row(out, "  at altitude", e.peak_heat_flux_altitude_m, "m", 0);
    row(out, "convective heat load", e.heat_load_J_cm2, "J/cm^2", 0);
    if (e.radiative_heating == radiative_heating_not_modelled) {
        text_row(out, "radiative heating", radiative_heating_not_modelled);
    } else {
        row(out, "peak radiative heat flux", e.peak_radiative_heat_flux_W_cm2, "W/cm^2", 2);
        row(out, "radiative heat load", e.radiative_heat_load_J_cm2, "J/cm^2", 0);
    }
    row(out, "peak dynamic pressure", e.peak_dynamic_pressure_Pa, "Pa", 0);
    row(out, "  at altitude", e.peak_dynamic_pressure_altitude_m, "m", 0);
    row(out, "heat-shield TPS mass fraction", e.heat_shield_mass_fraction * 100.0, "%", 2);
    row(out, "heat-shield TPS mass estimate", e.heat_shield_tps_kg, "kg", 1);
}

void write_decelerator(std::string& out, const DeceleratorResults& d) {
    heading(out, "Inflatable decelerator");
    text_row(out, "deployed", d.deployed ? "yes" : "no");
    row(out, "diameter", d.diameter_m, "m", 2);
    row(out, "mass", d.mass_kg, "kg", 1);
    row(out, "deploy altitude", d.deploy_altitude_m, "m", 0);
    row(out, "deploy Mach", d.deploy_mach, "", 2);
    row(out, "deploy dynamic pressure", d.deploy_dynamic_pressure_Pa, "Pa", 0);
}

/// A canopy: the main parachute, or the drogue (which has no descent, jettison or drift of its
/// own: the rows of those are the main's).
void write_parachute(std::string& out, std::string_view title, const ParachuteResults& p,
                     bool main) {
    heading(out, title);
    text_row(out, "deployed", p.deployed ? "yes" : "no");
    row(out, "diameter", p.diameter_m, "m", 2);
    row(out, "drag coefficient (subsonic)", p.drag_coefficient, "", 3);
    row(out, "drag coefficient at deploy", p.drag_coefficient_at_deploy, "", 3);
    row(out, "mass", p.mass_kg, "kg", 1);
    row(out, "deploy time", p.deploy_time_s, "s", 2);
    row(out, "deploy altitude", p.deploy_altitude_m, "m", 0);
    row(out, "deploy Mach", p.deploy_mach, "", 3);
    row(out, "deploy dynamic pressure", p.deploy_dynamic_pressure_Pa, "Pa", 1);
    row(out, "deploy velocity", p.deploy_velocity_m_s, "m/s", 1);
    row(out, "opening load", p.opening_load_N, "N", 0);
    row(out, "  on what hangs under it", p.opening_load_g, "g", 2);
    row(out, "inflation time", p.inflation_time_s, "s", 2);
    if (main) {
        row(out, "heat-shield jettison time", p.heat_shield_jettison_time_s, "s", 1);
        row(out, "descent velocity under canopy", p.descent_velocity_m_s, "m/s", 1);
    }
    row(out, "deploy latitude", p.deploy_latitude_deg, "deg", 4);
    row(out, "deploy longitude", p.deploy_longitude_deg, "deg", 4);
    if (main) {
        row(out, "drift under the canopy", p.drift_m, "m", 0);
        row(out, "  towards azimuth", p.drift_azimuth_deg, "deg", 1);
    }
}

void write_terminal(std::string& out, const TerminalResults& t) {
    heading(out, "Terminal descent");
    text_row(out, "method", to_string(t.method));
    row(out, "ignition altitude", t.ignition_altitude_m, "m", 0);
    row(out, "ignition velocity", t.ignition_velocity_m_s, "m/s", 1);
    row(out, "thrust", t.thrust_N, "N", 0);
    row(out, "burn time", t.burn_time_s, "s", 1);
    row(out, "delta-v (ideal)", t.delta_v_m_s, "m/s", 1);
    row(out, "gravity loss", t.gravity_loss_m_s, "m/s", 1);
    row(out, "propellant burned", t.burned_propellant_kg, "kg", 1);
    row(out, "propellant loaded", t.propellant_kg, "kg", 1);
    row(out, "touchdown velocity", t.touchdown_velocity_m_s, "m/s", 2);
    row(out,
        t.method == TerminalMethod::airbag ? "horizontal speed at release"
                                           : "horizontal speed at touchdown",
        t.touchdown_horizontal_velocity_m_s, "m/s", 2);
    if (t.impact_velocity_m_s) {
        row(out, "airbag impact velocity", t.impact_velocity_m_s, "m/s", 1);
        row(out, "airbag impact energy", t.impact_energy_J, "J", 0);
    }
    if (t.hover_time_s)
        row(out, "hover time (lowering, fly-away)", t.hover_time_s, "s", 1);
    if (const auto& p = t.powered_descent) {
        text_row(out, "ignition",
                 p->ignition_delayed ? "after the trigger (the deepest throttle stops too high)"
                                     : "at the trigger");
        row(out, "ignition Mach", p->ignition_mach, "", 2);
        row(out, "ignition dynamic pressure", p->ignition_dynamic_pressure_Pa, "Pa", 0);
        row(out, "ignition flight-path angle", p->ignition_flight_path_angle_deg, "deg", 2);
        row(out, "thrust-to-weight at ignition (full)", p->thrust_to_weight_at_ignition, "", 3);
        row(out, "throttle (solved)", p->throttle, "", 4);
        row(out, "thrust coefficient C_T at ignition", p->thrust_coefficient_at_ignition, "", 3);
        row(out, "aeroshell drag kept under thrust", p->drag_preservation, "", 2);
        row(out, "peak deceleration of the burn", p->peak_deceleration_g, "g", 3);
        row(out, "peak dynamic pressure of the burn", p->peak_dynamic_pressure_Pa, "Pa", 0);
        row(out, "propellant over entry mass", p->propellant_fraction * 100.0, "%", 2);
    }
}

/// Metres in km, with a rounding-level negative (-0.000) shown as zero.
double kilometres(double metres) {
    const double km = metres * 1e-3;
    return std::abs(km) < 5e-4 ? 0.0 : km;
}

void write_timeline(std::string& out, const Results& results) {
    heading(out, "Timeline");
    fmt::format_to(std::back_inserter(out),
                   "  {:>11}  {:<28} {:>12} {:>13} {:>9} {:>9} {:>10} {:>10}\n", "time", "event",
                   "altitude", "velocity", "lat deg", "lon deg", "down km", "cross km");
    for (const TimelineEvent& ev : results.timeline.events) {
        fmt::format_to(std::back_inserter(out),
                       "  {:>9.2f} s  {:<28} {:>10.0f} m {:>9.1f} m/s {:>9.4f} {:>9.4f} {:>10.3f} "
                       "{:>10.3f}\n",
                       ev.time_s, ev.name, ev.altitude_m, ev.velocity_m_s, ev.latitude_deg,
                       ev.longitude_deg, kilometres(ev.downrange_m), kilometres(ev.crossrange_m));
    }
    const TerminalMethod method = results.terminal.method;
    row(out,
        method == TerminalMethod::supersonic_retro ? "time from ignition to touchdown"
        : method == TerminalMethod::none           ? "time from deploy to touchdown"
                                                   : "time from deploy to the burn",
        results.timeline.available_s, "s", 1);
    row(out, "time the sequence needs", results.timeline.needed_s, "s", 1);
    row(out, "timeline margin", results.timeline.margin_s, "s", 1);
    row(out, "highest feasible site elevation", results.capability.max_site_elevation_m, "m", 0);
    // A bound of the search, not of the margin, is said to be one.
    if (const auto limit = results.capability.max_site_elevation_limit;
        limit && *limit != SiteLimit::timeline_margin) {
        fmt::format_to(std::back_inserter(out), "  {:<{}} ({})\n", "", label_width,
                       site_limit_text(*limit));
    }
}

void write_landing(std::string& out, const std::optional<LandingResults>& landing) {
    heading(out, "Landing");
    if (!landing) {
        text_row(out, "landing point", "-");
        return;
    }
    const LandingResults& l = *landing;
    row(out, "latitude", l.latitude_deg, "deg", 4);
    row(out, "longitude", l.longitude_deg, "deg", 4);
    row(out, "downrange from the entry point", l.downrange_m * 1e-3, "km", 3);
    row(out, "crossrange (right positive)", l.crossrange_m * 1e-3, "km", 3);
    if (l.miss_m) {
        row(out, "miss distance from the target", *l.miss_m * 1e-3, "km", 3);
        row(out, "  downrange part", l.miss_downrange_m.value_or(0.0) * 1e-3, "km", 3);
        row(out, "  crossrange part", l.miss_crossrange_m.value_or(0.0) * 1e-3, "km", 3);
    }
}

void write_mass(std::string& out, const MassResults& mass) {
    auto it = std::back_inserter(out);
    heading(out, fmt::format("Mass budget ({})", to_string(mass.mode)));
    fmt::format_to(it, "  {:<40} {:<14} {:>10} {:>7} {:>10}\n", "item", "group", "basic kg",
                   "growth", "kg");
    for (const MassItem& item : mass.items) {
        fmt::format_to(it, "  {:<40} {:<14} {:>10.1f} {:>6.0f}% {:>10.1f}\n", item.name,
                       to_string(item.group), item.basic_kg, item.growth_fraction * 100.0,
                       item.mass_kg);
    }
    row(out, "entry mass", mass.entry_kg, "kg", 1);
    row(out, "landed mass", mass.landed_kg, "kg", 1);
    if (mass.closure) {
        const MassClosure& c = *mass.closure;
        fmt::format_to(it, "  closure: {} in {} iterations, residual {:.3f} kg\n",
                       c.converged ? "converged" : "NOT converged", c.iterations, c.residual_kg);
    }
}

}  // namespace

std::string format_summary(const Design& design, const Results& results) {
    std::string out;
    write_header(out, design, results);
    write_checks(out, results.checks);
    if (results.approach)
        write_approach(out, *results.approach);
    if (results.orbit)
        write_orbit(out, *results.orbit);
    write_entry(out, results.entry);
    if (results.decelerator)
        write_decelerator(out, *results.decelerator);
    if (results.drogue)
        write_parachute(out, "Drogue", *results.drogue, false);
    if (design.parachute) {
        write_parachute(out, "Parachute", results.parachute, true);
    } else {
        heading(out, "Parachute");
        text_row(out, "parachute", "none");
    }
    write_terminal(out, results.terminal);
    write_timeline(out, results);
    write_landing(out, results.landing);
    write_mass(out, results.mass);
    out += "\n";
    for (const std::string& note : results.notes)
        fmt::format_to(std::back_inserter(out), "Note: {}\n", note);
    return out;
}

}  // namespace ds
