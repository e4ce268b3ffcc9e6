#include "sizing/limit_checks.hpp"

#include <cmath>
#include <string>
#include <string_view>

#include <fmt/format.h>

#include "checks/rule_set.hpp"

namespace ds {
namespace {

constexpr std::string_view heritage_source =
    "heritage envelope for Mars soft landing, Braun and Manning, J. Spacecraft and Rockets "
    "44(2), 2007 (common practice)";
constexpr std::string_view deploy_window_source =
    "heritage supersonic parachute deploy window (common practice)";

Check half_angle_check(double half_angle_deg, double heritage_deg, const std::string& source) {
    constexpr double same_angle_deg = 0.5;  // a heritage shape to within half a degree
    Check c{"aeroshell_half_angle",
            CheckStatus::pass,
            half_angle_deg,
            heritage_deg,
            "deg",
            "",
            source,
            {}};
    if (std::abs(half_angle_deg - heritage_deg) > same_angle_deg) {
        c.status = CheckStatus::marginal;
        c.message = fmt::format(
            "a {:.4g} deg sphere-cone is not the heritage {:.4g} deg shape: its aerodynamics "
            "and stability need their own data",
            half_angle_deg, heritage_deg);
    } else {
        c.message = fmt::format("{:.4g} deg sphere-cone, the heritage shape", half_angle_deg);
    }
    return c;
}

/// Negative margin fails (the sequence cannot complete); under the limit is marginal.
Check timeline_check(double margin_s, double limit_s, double needed_s) {
    Check c{"timeline_margin", CheckStatus::pass, margin_s, limit_s, "s", "",
            "sequence times of the design; marginal below the limit (common practice)",
            // A sequence fails at zero margin: measured against the margin wanted.
            margin_s / (limit_s > 0.0 ? limit_s : 1.0)};
    if (margin_s < 0.0) {
        c.status = CheckStatus::fail;
        c.message = fmt::format(
            "the sequence after parachute deploy needs {:.1f} s but the descent leaves {:.1f} s "
            "less than that: deploy higher, jettison sooner or land lower",
            needed_s, -margin_s);
    } else if (margin_s < limit_s) {
        c.status = CheckStatus::marginal;
        c.message =
            fmt::format("timeline margin {:.1f} s is below the {:.4g} s wanted", margin_s, limit_s);
    } else {
        c.message = fmt::format("timeline margin {:.1f} s after the {:.1f} s the sequence needs",
                                margin_s, needed_s);
    }
    return c;
}

/// The launcher fairing bounds every aeroshell.
void fairing_check(const Results& results, const Limits& lim, const std::string& heritage,
                   std::vector<Check>& checks) {
    checks.push_back(
        check_at_most({"aeroshell_diameter", "aeroshell diameter", "m", Severity::envelope,
                       "launcher fairing about 4.5-4.6 m, " + heritage},
                      results.entry.diameter_m, lim.aeroshell_diameter_max_m, lim.marginal_band));
}

/// The rest of the heritage envelope is that of Mars soft landing: for Mars designs only.
void mars_envelope_checks(const Design& design, const Results& results, const Limits& lim,
                          const std::string& heritage, std::vector<Check>& checks) {
    const double band = lim.marginal_band;
    checks.push_back(check_at_most({"ballistic_coefficient", "entry ballistic coefficient",
                                    "kg/m^2", Severity::envelope, heritage},
                                   results.entry.ballistic_coefficient_kg_m2,
                                   lim.ballistic_coefficient_max_kg_m2, band));
    checks.push_back(
        half_angle_check(design.aeroshell.half_angle_deg, lim.heritage_half_angle_deg, heritage));
    if (results.parachute.diameter_m) {
        checks.push_back(check_at_most(
            {"parachute_diameter", "parachute diameter", "m", Severity::envelope, heritage},
            *results.parachute.diameter_m, lim.parachute_diameter_max_m, band));
    }
    checks.push_back(check_at_most(
        {"site_elevation", "landing site elevation", "m", Severity::envelope, heritage},
        design.site.elevation_m, lim.site_elevation_max_m, band));
    if (results.mass.landed_kg) {
        Check landed =
            check_at_most({"landed_mass", "landed mass", "kg", Severity::envelope, heritage},
                          *results.mass.landed_kg, lim.landed_mass_max_kg, band);
        if (landed.status != CheckStatus::pass) {
            landed.message +=
                "; a heavier lander needs supersonic retro-propulsion, larger "
                "decelerators and an entry from orbit";
        }
        checks.push_back(landed);
    }
}

/// The parachute's deploy window: Mach and dynamic pressure at deploy.
void deploy_checks(const ParachuteResults& parachute, const Limits& lim,
                   std::vector<Check>& checks) {
    const double band = lim.marginal_band;
    const std::string window{deploy_window_source};
    checks.push_back(check_at_most(
        {"deploy_mach", "Mach number at parachute deploy", "", Severity::physics, window},
        *parachute.deploy_mach, lim.deploy_mach_max, band));
    checks.push_back(check_at_most(
        {"deploy_dynamic_pressure_high", "dynamic pressure at parachute deploy", "Pa",
         Severity::physics, window},
        *parachute.deploy_dynamic_pressure_Pa, lim.deploy_dynamic_pressure_max_Pa, band));
    checks.push_back(check_at_least(
        {"deploy_dynamic_pressure_low", "dynamic pressure at parachute deploy", "Pa",
         Severity::physics, window},
        *parachute.deploy_dynamic_pressure_Pa, lim.deploy_dynamic_pressure_min_Pa, band));
}

/// What the entry puts on the payload and the heat shield.
void entry_load_checks(const EntryResults& entry, const Limits& lim, std::vector<Check>& checks) {
    const double band = lim.marginal_band;
    checks.push_back(check_at_most(
        {"peak_deceleration", "peak deceleration", "g", Severity::physics,
         "the payload's qualified load (default 15 g: common practice, set your own)"},
        entry.peak_deceleration_g, lim.peak_deceleration_max_g, band));
    const double peak_total_flux =
        entry.peak_heat_flux_W_cm2 + entry.peak_radiative_heat_flux_W_cm2.value_or(0.0);
    checks.push_back(check_at_most(
        {"peak_heat_flux", "peak stagnation heat flux (convective plus radiative peaks)", "W/cm^2",
         Severity::physics,
         "the heat-shield material's qualified heat flux (default 200 W/cm^2: common practice, "
         "set your material's)"},
        peak_total_flux, lim.peak_heat_flux_max_W_cm2, band));
}

/// How the payload meets the ground: its touchdown speed (a tethered payload's is the
/// lowering speed, not an impact), or the airbags' impact.
/// The horizontal speed at touchdown against the limit of the terminal method.
Check touchdown_horizontal_check(const TerminalResults& terminal, const Limits& lim, double band) {
    const auto rule = [](std::string words, std::string source) {
        return LimitRule{"touchdown_horizontal_velocity", std::move(words), "m/s",
                         Severity::physics, std::move(source)};
    };
    const double v = *terminal.touchdown_horizontal_velocity_m_s;
    switch (terminal.method) {
        case TerminalMethod::airbag:
            return check_at_most(rule("horizontal speed at airbag release",
                                      "the airbags' qualified horizontal speed (default 20 m/s: "
                                      "from memory, common practice, set your own)"),
                                 v, lim.airbag_release_horizontal_velocity_max_m_s, band);
        case TerminalMethod::tethered:
            return check_at_most(rule("horizontal speed of the hovering stage at payload touchdown",
                                      "the payload's qualified horizontal speed on the tether "
                                      "(default 0.5 m/s: common practice, set your own)"),
                                 v, lim.tethered_horizontal_velocity_max_m_s, band);
        case TerminalMethod::none:
            return check_at_most(rule("horizontal speed at touchdown under the canopy",
                                      "the vehicle's qualified horizontal touchdown speed (default "
                                      "15 m/s: common practice, set your own)"),
                                 v, lim.canopy_touchdown_horizontal_velocity_max_m_s, band);
        case TerminalMethod::retro:
            break;
    }
    return check_at_most(rule("horizontal speed at touchdown",
                              "the landing legs' qualified horizontal speed (default 1 m/s: "
                              "common practice, set your own)"),
                         v, lim.touchdown_horizontal_velocity_max_m_s, band);
}

void landing_checks(const TerminalResults& terminal, const Limits& lim,
                    std::vector<Check>& checks) {
    const double band = lim.marginal_band;
    if (terminal.touchdown_velocity_m_s && terminal.method != TerminalMethod::tethered) {
        checks.push_back(check_at_most(
            {"touchdown_velocity", "touchdown velocity", "m/s", Severity::physics,
             "the lander's qualified touchdown speed (default 3 m/s: common practice, set your "
             "own)"},
            *terminal.touchdown_velocity_m_s, lim.touchdown_velocity_max_m_s, band));
    }
    if (terminal.impact_velocity_m_s) {
        checks.push_back(check_at_most(
            {"airbag_impact_velocity", "airbag impact velocity", "m/s", Severity::physics,
             "the airbags' qualified impact speed (default 25 m/s: from memory, common "
             "practice, set your own)"},
            *terminal.impact_velocity_m_s, lim.airbag_impact_velocity_max_m_s, band));
    }
    if (terminal.touchdown_horizontal_velocity_m_s)
        checks.push_back(touchdown_horizontal_check(terminal, lim, band));
}

}  // namespace

std::vector<Check> limit_checks(const Design& design, const Results& results) {
    const Limits& lim = design.limits;
    const std::string heritage{heritage_source};
    std::vector<Check> checks;
    fairing_check(results, lim, heritage, checks);
    if (design.body.preset == "mars")
        mars_envelope_checks(design, results, lim, heritage, checks);
    if (results.parachute.deployed)
        deploy_checks(results.parachute, lim, checks);
    entry_load_checks(results.entry, lim, checks);
    landing_checks(results.terminal, lim, checks);
    if (results.timeline.margin_s) {
        checks.push_back(timeline_check(*results.timeline.margin_s, lim.timeline_margin_min_s,
                                        results.timeline.needed_s.value_or(0.0)));
    }
    return checks;
}

}  // namespace ds
