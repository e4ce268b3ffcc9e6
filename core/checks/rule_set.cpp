#include "checks/rule_set.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

namespace ds {
namespace {

constexpr std::string_view heritage_source =
    "heritage envelope for Mars soft landing, Braun and Manning, J. Spacecraft and Rockets "
    "44(2), 2007 (common practice)";
constexpr std::string_view deploy_window_source =
    "heritage supersonic parachute deploy window (common practice)";

std::string number(double value, std::string_view unit) {
    return unit.empty() ? fmt::format("{:.4g}", value) : fmt::format("{:.4g} {}", value, unit);
}

/// `beyond` is how far value lies past the limit as a fraction of it (positive = past it).
Check judge(const LimitRule& rule, double value, double limit, double beyond, double band,
            std::string_view past_word, std::string_view within_word) {
    Check c{rule.id, CheckStatus::pass, value, limit, rule.unit, "", rule.source, {}};
    if (rule.severity == Severity::physics) c.margin = -beyond;
    const std::string v = number(value, rule.unit);
    const std::string l = number(limit, rule.unit);
    if (beyond > 0.0) {
        c.status = rule.severity == Severity::envelope ? CheckStatus::marginal : CheckStatus::fail;
        c.message = rule.severity == Severity::envelope
                        ? fmt::format("{} {} is {} the heritage envelope's {}: beyond today's "
                                      "demonstrated technology",
                                      rule.what, v, past_word, l)
                        : fmt::format("{} {} is {} the limit of {}", rule.what, v, past_word, l);
    } else if (rule.severity == Severity::physics && beyond > -band) {
        c.status = CheckStatus::marginal;
        c.message = fmt::format("{} {} is within {:.0f} % of the limit of {}", rule.what, v,
                                band * 100.0, l);
    } else {
        c.message = fmt::format("{} {} is {} the limit of {}", rule.what, v, within_word, l);
    }
    return c;
}

double relative_excess(double value, double limit) {
    return limit != 0.0 ? (value - limit) / std::abs(limit) : value - limit;
}

Check half_angle_check(double half_angle_deg, double heritage_deg, const std::string& source) {
    constexpr double same_angle_deg = 0.5;  // a heritage shape to within half a degree
    Check c{"aeroshell_half_angle", CheckStatus::pass, half_angle_deg, heritage_deg, "deg", "",
            source, {}};
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
        c.message = fmt::format("timeline margin {:.1f} s is below the {:.4g} s wanted", margin_s,
                                limit_s);
    } else {
        c.message = fmt::format("timeline margin {:.1f} s after the {:.1f} s the sequence needs",
                                margin_s, needed_s);
    }
    return c;
}

}  // namespace

Check check_at_most(const LimitRule& rule, double value, double limit, double marginal_band) {
    return judge(rule, value, limit, relative_excess(value, limit), marginal_band, "above",
                 "within");
}

Check check_at_least(const LimitRule& rule, double value, double limit, double marginal_band) {
    return judge(rule, value, limit, -relative_excess(value, limit), marginal_band, "below",
                 "above");
}

namespace {

/// The horizontal speed at touchdown against the limit of the terminal method.
Check touchdown_horizontal_check(const TerminalResults& terminal, const Limits& lim,
                                 double band) {
    const auto rule = [](std::string words, std::string source) {
        return LimitRule{"touchdown_horizontal_velocity", std::move(words), "m/s",
                         Severity::physics, std::move(source)};
    };
    const double v = *terminal.touchdown_horizontal_velocity_m_s;
    if (terminal.method == "airbag") {
        return check_at_most(rule("horizontal speed at airbag release",
                                  "the airbags' qualified horizontal speed (default 20 m/s: from "
                                  "memory, common practice, set your own)"),
                             v, lim.airbag_release_horizontal_velocity_max_m_s, band);
    }
    if (terminal.method == "tethered") {
        return check_at_most(rule("horizontal speed of the hovering stage at payload touchdown",
                                  "the payload's qualified horizontal speed on the tether "
                                  "(default 0.5 m/s: common practice, set your own)"),
                             v, lim.tethered_horizontal_velocity_max_m_s, band);
    }
    if (terminal.method == "none") {
        return check_at_most(rule("horizontal speed at touchdown under the canopy",
                                  "the vehicle's qualified horizontal touchdown speed (default "
                                  "15 m/s: common practice, set your own)"),
                             v, lim.canopy_touchdown_horizontal_velocity_max_m_s, band);
    }
    return check_at_most(rule("horizontal speed at touchdown",
                              "the landing legs' qualified horizontal speed (default 1 m/s: "
                              "common practice, set your own)"),
                         v, lim.touchdown_horizontal_velocity_max_m_s, band);
}

}  // namespace

std::vector<Check> limit_checks(const Design& design, const Results& results) {
    const Limits& lim = design.limits;
    const double band = lim.marginal_band;
    const std::string heritage{heritage_source};
    std::vector<Check> checks;

    // The launcher fairing bounds every aeroshell; the rest of the heritage envelope is that
    // of Mars soft landing, so it applies to Mars only.
    checks.push_back(check_at_most({"aeroshell_diameter", "aeroshell diameter", "m",
                                    Severity::envelope,
                                    "launcher fairing about 4.5-4.6 m, " + heritage},
                                   results.entry.diameter_m, lim.aeroshell_diameter_max_m, band));
    const bool mars = design.body.preset == "mars";
    if (mars) {
        checks.push_back(check_at_most({"ballistic_coefficient", "entry ballistic coefficient",
                                        "kg/m^2", Severity::envelope, heritage},
                                       results.entry.ballistic_coefficient_kg_m2,
                                       lim.ballistic_coefficient_max_kg_m2, band));
        checks.push_back(half_angle_check(design.aeroshell.half_angle_deg,
                                          lim.heritage_half_angle_deg, heritage));
        if (results.parachute.diameter_m) {
            checks.push_back(check_at_most({"parachute_diameter", "parachute diameter", "m",
                                            Severity::envelope, heritage},
                                           *results.parachute.diameter_m,
                                           lim.parachute_diameter_max_m, band));
        }
        checks.push_back(check_at_most({"site_elevation", "landing site elevation", "m",
                                        Severity::envelope, heritage},
                                       design.site.elevation_m, lim.site_elevation_max_m, band));
        if (results.mass.landed_kg) {
            Check landed = check_at_most({"landed_mass", "landed mass", "kg", Severity::envelope,
                                          heritage},
                                         *results.mass.landed_kg, lim.landed_mass_max_kg, band);
            if (landed.status != CheckStatus::pass) {
                landed.message += "; a heavier lander needs supersonic retro-propulsion, larger "
                                  "decelerators and an entry from orbit";
            }
            checks.push_back(landed);
        }
    }
    if (results.parachute.deployed) {
        const std::string window{deploy_window_source};
        checks.push_back(check_at_most({"deploy_mach", "Mach number at parachute deploy", "",
                                        Severity::physics, window},
                                       *results.parachute.deploy_mach, lim.deploy_mach_max, band));
        checks.push_back(check_at_most({"deploy_dynamic_pressure_high",
                                        "dynamic pressure at parachute deploy", "Pa",
                                        Severity::physics, window},
                                       *results.parachute.deploy_dynamic_pressure_Pa,
                                       lim.deploy_dynamic_pressure_max_Pa, band));
        checks.push_back(check_at_least({"deploy_dynamic_pressure_low",
                                         "dynamic pressure at parachute deploy", "Pa",
                                         Severity::physics, window},
                                        *results.parachute.deploy_dynamic_pressure_Pa,
                                        lim.deploy_dynamic_pressure_min_Pa, band));
    }
    checks.push_back(check_at_most(
        {"peak_deceleration", "peak deceleration", "g", Severity::physics,
         "the payload's qualified load (default 15 g: common practice, set your own)"},
        results.entry.peak_deceleration_g, lim.peak_deceleration_max_g, band));
    const double peak_total_flux = results.entry.peak_heat_flux_W_cm2 +
                                   results.entry.peak_radiative_heat_flux_W_cm2.value_or(0.0);
    checks.push_back(check_at_most(
        {"peak_heat_flux", "peak stagnation heat flux (convective plus radiative peaks)",
         "W/cm^2", Severity::physics,
         "the heat-shield material's qualified heat flux (default 200 W/cm^2: common practice, "
         "set your material's)"},
        peak_total_flux, lim.peak_heat_flux_max_W_cm2, band));
    const TerminalResults& terminal = results.terminal;
    if (terminal.touchdown_velocity_m_s && terminal.method != "tethered") {
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
    if (terminal.touchdown_horizontal_velocity_m_s) {
        checks.push_back(touchdown_horizontal_check(terminal, lim, band));
    }
    if (results.timeline.margin_s) {
        checks.push_back(timeline_check(*results.timeline.margin_s, lim.timeline_margin_min_s,
                                        results.timeline.needed_s.value_or(0.0)));
    }
    return checks;
}

void order_checks(std::vector<Check>& checks) {
    const auto rank = [](CheckStatus s) {
        switch (s) {
            case CheckStatus::fail: return 0;
            case CheckStatus::marginal: return 1;
            case CheckStatus::pass: return 2;
        }
        return 2;
    };
    std::stable_sort(checks.begin(), checks.end(), [&](const Check& a, const Check& b) {
        return rank(a.status) < rank(b.status);
    });
}

}  // namespace ds
