#include "sizing/limit_checks.hpp"

#include <array>
#include <cmath>
#include <string>
#include <string_view>

#include <fmt/format.h>

#include "checks/rule_set.hpp"
#include "parachute/canopy.hpp"

namespace ds {
namespace {

constexpr std::string_view heritage_source =
    "heritage envelope for Mars soft landing, Braun and Manning, J. Spacecraft and Rockets "
    "44(2), 2007 (common practice)";
constexpr std::string_view deploy_window_source =
    "heritage supersonic parachute deploy window (common practice)";

/// Judges figures against the design's limits, in words or not (Wording).
struct Judge {
    const Limits& limits;
    Wording wording = Wording::words;

    bool worded() const { return wording == Wording::words; }
    Check at_most(const LimitRule& rule, double value, double limit) const {
        return check_at_most(rule, value, limit, limits.marginal_band, wording);
    }
    Check at_least(const LimitRule& rule, double value, double limit) const {
        return check_at_least(rule, value, limit, limits.marginal_band, wording);
    }
};

Check half_angle_check(double half_angle_deg, double heritage_deg, std::string_view source,
                       const Judge& judge) {
    constexpr double same_angle_deg = 0.5;  // a heritage shape to within half a degree
    Check c{"aeroshell_half_angle",
            CheckStatus::pass,
            half_angle_deg,
            heritage_deg,
            "deg",
            "",
            judge.worded() ? std::string(source) : std::string(),
            {}};
    if (std::abs(half_angle_deg - heritage_deg) > same_angle_deg) {
        c.status = CheckStatus::marginal;
        if (!judge.worded())
            return c;
        c.message = fmt::format(
            "a {:.4g} deg sphere-cone is not the heritage {:.4g} deg shape: its aerodynamics "
            "and stability need their own data",
            half_angle_deg, heritage_deg);
    } else if (judge.worded()) {
        c.message = fmt::format("{:.4g} deg sphere-cone, the heritage shape", half_angle_deg);
    }
    return c;
}

/// Negative margin fails (the sequence cannot complete); under the limit is marginal. The
/// sequence is the one after parachute deploy, or a powered descent's from ignition to
/// touchdown (`powered`).
Check timeline_check(double margin_s, double limit_s, double needed_s, bool powered,
                     Wording wording) {
    Check c{"timeline_margin", CheckStatus::pass, margin_s, limit_s, "s", "",
            wording == Wording::words
                ? "sequence times of the design; marginal below the limit (common practice)"
                : "",
            // A sequence fails at zero margin: measured against the margin wanted.
            margin_s / (limit_s > 0.0 ? limit_s : 1.0)};
    if (margin_s < 0.0)
        c.status = CheckStatus::fail;
    else if (margin_s < limit_s)
        c.status = CheckStatus::marginal;
    if (wording == Wording::judged_only)
        return c;
    if (margin_s < 0.0) {
        c.message = powered ? fmt::format(
                                  "the terminal descent needs {:.1f} s of ground sensing before "
                                  "touchdown but the powered descent leaves {:.1f} s less than "
                                  "that: ignite earlier or throttle deeper",
                                  needed_s, -margin_s)
                            : fmt::format(
                                  "the sequence after parachute deploy needs {:.1f} s but the "
                                  "descent leaves {:.1f} s less than that: deploy higher, "
                                  "jettison sooner or land lower",
                                  needed_s, -margin_s);
    } else if (margin_s < limit_s) {
        c.message =
            fmt::format("timeline margin {:.1f} s is below the {:.4g} s wanted", margin_s, limit_s);
    } else {
        c.message =
            fmt::format("timeline margin {:.1f} s after the {:.1f} s the {} needs", margin_s,
                        needed_s, powered ? "terminal descent's ground sensing" : "sequence");
    }
    return c;
}

/// The launcher fairing bounds every aeroshell.
void fairing_check(const Results& results, const Judge& judge, std::string_view heritage,
                   std::vector<Check>& checks) {
    checks.push_back(
        judge.at_most({"aeroshell_diameter", "aeroshell diameter", "m", Severity::envelope,
                       fmt::format("launcher fairing about 4.5-4.6 m, {}", heritage)},
                      results.entry.diameter_m, judge.limits.aeroshell_diameter_max_m));
}

/// The rest of the heritage envelope is that of Mars soft landing: for Mars designs only.
void mars_envelope_checks(const Design& design, const Results& results, const Judge& judge,
                          std::string_view heritage, std::vector<Check>& checks) {
    const Limits& lim = judge.limits;
    checks.push_back(judge.at_most({"ballistic_coefficient", "entry ballistic coefficient",
                                    "kg/m^2", Severity::envelope, heritage},
                                   results.entry.ballistic_coefficient_kg_m2,
                                   lim.ballistic_coefficient_max_kg_m2));
    checks.push_back(half_angle_check(design.aeroshell.half_angle_deg, lim.heritage_half_angle_deg,
                                      heritage, judge));
    if (results.parachute.diameter_m) {
        checks.push_back(judge.at_most(
            {"parachute_diameter", "parachute diameter", "m", Severity::envelope, heritage},
            *results.parachute.diameter_m, lim.parachute_diameter_max_m));
    }
    checks.push_back(judge.at_most(
        {"site_elevation", "landing site elevation", "m", Severity::envelope, heritage},
        design.site.elevation_m, lim.site_elevation_max_m));
    if (results.mass.landed_kg) {
        Check landed =
            judge.at_most({"landed_mass", "landed mass", "kg", Severity::envelope, heritage},
                          *results.mass.landed_kg, lim.landed_mass_max_kg);
        if (landed.status != CheckStatus::pass && judge.worded()) {
            landed.message +=
                design.terminal.method == TerminalMethod::supersonic_retro
                    ? "; sized here with supersonic retro-propulsion (terminal.method "
                      "\"supersonic-retro\"), as a lander this heavy needs"
                    : "; a heavier lander needs supersonic retro-propulsion (terminal.method "
                      "\"supersonic-retro\"), larger decelerators and an entry from orbit";
        }
        checks.push_back(landed);
    }
}

/// Which canopy a check is of: the ids of a drogue's checks start "drogue_", and its words say
/// "drogue" where the main's say "parachute".
struct CanopyChecked {
    std::string_view id_prefix;  ///< "" or "drogue_"
    std::string_view name;       ///< "parachute" or "drogue"
    std::string_view type;       ///< the design's canopy type
    const ParachuteResults& results;

    std::string id(std::string_view check) const { return fmt::format("{}{}", id_prefix, check); }
    std::string words(std::string_view format) const {
        return fmt::format(fmt::runtime(format), name);
    }
};

/// The first canopy's deploy window: Mach and dynamic pressure at deploy. The window is that of
/// supersonic parachutes at Mars: it holds on Mars, and elsewhere only for the bounds the design
/// sets itself (a value other than the Mars default). A body with no bound of its own gets one
/// check that says the window is not checked, with the deploy conditions.
void deploy_checks(const Design& design, const CanopyChecked& canopy, const Judge& judge,
                   std::vector<Check>& checks) {
    const ParachuteResults& parachute = canopy.results;
    const DeployWindow w = deploy_window(design);
    const std::string_view window =
        design.body.preset == "mars" ? deploy_window_source : "the design's own limit";
    const std::string mach_words = canopy.words("Mach number at {} deploy");
    const std::string pressure_words = canopy.words("dynamic pressure at {} deploy");
    if (w.mach_max) {
        checks.push_back(
            judge.at_most({canopy.id("deploy_mach"), mach_words, "", Severity::physics, window},
                          *parachute.deploy_mach, *w.mach_max));
    }
    if (w.dynamic_pressure_max_Pa) {
        checks.push_back(judge.at_most({canopy.id("deploy_dynamic_pressure_high"), pressure_words,
                                        "Pa", Severity::physics, window},
                                       *parachute.deploy_dynamic_pressure_Pa,
                                       *w.dynamic_pressure_max_Pa));
    }
    if (w.dynamic_pressure_min_Pa) {
        checks.push_back(judge.at_least({canopy.id("deploy_dynamic_pressure_low"), pressure_words,
                                         "Pa", Severity::physics, window},
                                        *parachute.deploy_dynamic_pressure_Pa,
                                        *w.dynamic_pressure_min_Pa));
    }
    if (!w.any()) {
        Check c{canopy.id("deploy_window"),
                CheckStatus::pass,
                *parachute.deploy_mach,
                0.0,
                "",
                "",
                judge.worded() ? "no source for this body" : "",
                {}};
        if (judge.worded()) {
            const Limits mars;
            c.message = fmt::format(
                "not checked: no deploy window is known for {} (the Mars supersonic window, Mach "
                "up to {:.4g} and {:.4g}-{:.4g} Pa, applies to Mars only); {} deploy at Mach "
                "{:.2f} and {:.0f} Pa: set deploy_mach_max and the deploy dynamic pressures in "
                "\"limits\" to check them",
                design.body.preset.empty() ? "a custom body" : design.body.preset,
                mars.deploy_mach_max, mars.deploy_dynamic_pressure_min_Pa,
                mars.deploy_dynamic_pressure_max_Pa, canopy.name, *parachute.deploy_mach,
                *parachute.deploy_dynamic_pressure_Pa);
        }
        checks.push_back(std::move(c));
    }
}

/// What a canopy asks of the vehicle: the opening load on what hangs under it, and a subsonic
/// canopy kept subsonic. Common practice, on every body.
void canopy_load_checks(const CanopyChecked& canopy, const Judge& judge,
                        std::vector<Check>& checks) {
    const ParachuteResults& parachute = canopy.results;
    const Limits& lim = judge.limits;
    if (parachute.opening_load_g) {
        checks.push_back(judge.at_most(
            {canopy.id("opening_load"), canopy.words("{} opening load on what hangs under it"), "g",
             Severity::physics,
             "the payload's qualified load (peak_deceleration_max_g; the opening force by "
             "Knacke's load factor, NWC TP 6575, from memory)"},
            *parachute.opening_load_g, lim.peak_deceleration_max_g));
    }
    const auto type = canopy_type(canopy.type);
    if (type && !type->supersonic && parachute.deploy_mach) {
        Check c = judge.at_most(
            {canopy.id("subsonic_canopy_mach"),
             canopy.words("Mach number at {} deploy of a subsonic canopy"), "", Severity::physics,
             "a subsonic canopy type has no supersonic qualification (common practice)"},
            *parachute.deploy_mach, lim.subsonic_canopy_deploy_mach_max);
        if (c.status == CheckStatus::fail && judge.worded()) {
            c.message += fmt::format(
                "; a {} is a subsonic canopy: deploy it lower or slower, "
                "or use a supersonic type (disk-gap-band)",
                type->name);
        }
        checks.push_back(c);
    }
}

/// A clean heat-shield jettison: subsonic, at low dynamic pressure. Common practice.
void jettison_checks(const ParachuteResults& parachute, const Judge& judge,
                     std::vector<Check>& checks) {
    if (!parachute.heat_shield_jettison_mach)
        return;
    const Limits& lim = judge.limits;
    constexpr std::string_view source =
        "a clean separation of the heat shield, subsonic at low dynamic pressure (common "
        "practice: set the design's own)";
    checks.push_back(judge.at_most(
        {"jettison_mach", "Mach number at heat-shield jettison", "", Severity::physics, source},
        *parachute.heat_shield_jettison_mach, lim.jettison_mach_max));
    checks.push_back(judge.at_most(
        {"jettison_dynamic_pressure", "dynamic pressure at heat-shield jettison", "Pa",
         Severity::physics, source},
        *parachute.heat_shield_jettison_dynamic_pressure_Pa, lim.jettison_dynamic_pressure_max_Pa));
}

/// The canopies' checks: the deploy window of the first one out (the drogue when there is one:
/// the main then deploys under it, below the window's speeds), and each one's loads.
void parachute_checks(const Design& design, const Results& results, const Judge& judge,
                      std::vector<Check>& checks) {
    if (!design.parachute)
        return;
    const CanopyChecked main{"", "parachute", design.parachute->type, results.parachute};
    if (results.drogue && design.drogue) {
        const CanopyChecked drogue{"drogue_", "drogue", design.drogue->type, *results.drogue};
        if (results.drogue->deployed) {
            deploy_checks(design, drogue, judge, checks);
            canopy_load_checks(drogue, judge, checks);
        }
    } else if (results.parachute.deployed) {
        deploy_checks(design, main, judge, checks);
    }
    if (results.parachute.deployed) {
        canopy_load_checks(main, judge, checks);
        jettison_checks(results.parachute, judge, checks);
    }
}

/// A powered descent lit during the entry: its ignition against the envelope, its thrust
/// against the weight, the load the burn puts on the vehicle and the propellant it costs.
void powered_descent_checks(const Results& results, const Judge& judge,
                            std::vector<Check>& checks) {
    if (!results.terminal.powered_descent)
        return;
    const PoweredDescentResults& p = *results.terminal.powered_descent;
    const Limits& lim = judge.limits;
    constexpr std::string_view envelope =
        "retro-propulsion ignition envelope (wind-tunnel tests into a supersonic flow span about "
        "Mach 2 to 4.6, from memory; 15 kPa is our default; common practice: set the vehicle's "
        "own)";
    checks.push_back(
        judge.at_most({"ignition_mach", "Mach number at ignition", "", Severity::physics, envelope},
                      p.ignition_mach, lim.ignition_mach_max));
    checks.push_back(judge.at_most({"ignition_dynamic_pressure", "dynamic pressure at ignition",
                                    "Pa", Severity::physics, envelope},
                                   p.ignition_dynamic_pressure_Pa,
                                   lim.ignition_dynamic_pressure_max_Pa));
    checks.push_back(judge.at_least(
        {"thrust_to_weight", "full thrust over the weight at ignition", "", Severity::physics,
         "margin over hovering to steer and to absorb the gravity losses (common practice)"},
        p.thrust_to_weight_at_ignition, lim.thrust_to_weight_min));
    checks.push_back(judge.at_most(
        {"burn_deceleration", "peak deceleration of the powered descent (thrust and drag)", "g",
         Severity::physics, "the payload's qualified load (peak_deceleration_max_g)"},
        p.peak_deceleration_g, lim.peak_deceleration_max_g));
    checks.push_back(judge.at_most(
        {"propellant_fraction", "loaded propellant over the entry mass", "", Severity::physics,
         "a budget that grows faster than what it lands (common practice)"},
        p.propellant_fraction, lim.propellant_fraction_max));
}

/// What the entry puts on the payload and the heat shield.
void entry_load_checks(const EntryResults& entry, const Judge& judge, std::vector<Check>& checks) {
    const Limits& lim = judge.limits;
    checks.push_back(judge.at_most(
        {"peak_deceleration", "peak deceleration", "g", Severity::physics,
         "the payload's qualified load (default 15 g: common practice, set your own)"},
        entry.peak_deceleration_g, lim.peak_deceleration_max_g));
    const double peak_total_flux =
        entry.peak_heat_flux_W_cm2 + entry.peak_radiative_heat_flux_W_cm2.value_or(0.0);
    checks.push_back(judge.at_most(
        {"peak_heat_flux", "peak stagnation heat flux (convective plus radiative peaks)", "W/cm^2",
         Severity::physics,
         "the heat-shield material's qualified heat flux (default 200 W/cm^2: common practice, "
         "set your material's)"},
        peak_total_flux, lim.peak_heat_flux_max_W_cm2));
}

/// The horizontal speed at touchdown of each terminal method: what is measured, its limit and
/// where the limit's default comes from.
struct HorizontalSpeedRule {
    TerminalMethod method;
    std::string_view what;
    double Limits::*limit;
    std::string_view source;
};

constexpr std::array<HorizontalSpeedRule, 4> horizontal_speed_rules{{
    {TerminalMethod::retro, "horizontal speed at touchdown",
     &Limits::touchdown_horizontal_velocity_max_m_s,
     "the landing legs' qualified horizontal speed (default 1 m/s: common practice, set your "
     "own)"},
    {TerminalMethod::airbag, "horizontal speed at airbag release",
     &Limits::airbag_release_horizontal_velocity_max_m_s,
     "the airbags' qualified horizontal speed (default 20 m/s: from memory, common practice, "
     "set your own)"},
    {TerminalMethod::tethered, "horizontal speed of the hovering stage at payload touchdown",
     &Limits::tethered_horizontal_velocity_max_m_s,
     "the payload's qualified horizontal speed on the tether (default 0.5 m/s: common "
     "practice, set your own)"},
    {TerminalMethod::none, "horizontal speed at touchdown under the canopy",
     &Limits::canopy_touchdown_horizontal_velocity_max_m_s,
     "the vehicle's qualified horizontal touchdown speed (default 15 m/s: common practice, set "
     "your own)"},
}};

/// The horizontal speed at touchdown against the limit of the terminal method.
Check touchdown_horizontal_check(const TerminalResults& terminal, const Judge& judge) {
    const HorizontalSpeedRule* rule = &horizontal_speed_rules.front();
    for (const HorizontalSpeedRule& r : horizontal_speed_rules) {
        if (r.method == terminal.method)
            rule = &r;
    }
    return judge.at_most(
        {"touchdown_horizontal_velocity", rule->what, "m/s", Severity::physics, rule->source},
        *terminal.touchdown_horizontal_velocity_m_s, judge.limits.*(rule->limit));
}

/// How the payload meets the ground: its touchdown speed (a tethered payload's is the
/// lowering speed, not an impact), or the airbags' impact.
void landing_checks(const TerminalResults& terminal, const Judge& judge,
                    std::vector<Check>& checks) {
    const Limits& lim = judge.limits;
    if (terminal.touchdown_velocity_m_s && terminal.method != TerminalMethod::tethered) {
        checks.push_back(judge.at_most(
            {"touchdown_velocity", "touchdown velocity", "m/s", Severity::physics,
             "the lander's qualified touchdown speed (default 3 m/s: common practice, set your "
             "own)"},
            *terminal.touchdown_velocity_m_s, lim.touchdown_velocity_max_m_s));
    }
    if (terminal.impact_velocity_m_s) {
        checks.push_back(judge.at_most(
            {"airbag_impact_velocity", "airbag impact velocity", "m/s", Severity::physics,
             "the airbags' qualified impact speed (default 25 m/s: from memory, common "
             "practice, set your own)"},
            *terminal.impact_velocity_m_s, lim.airbag_impact_velocity_max_m_s));
    }
    if (terminal.touchdown_horizontal_velocity_m_s)
        checks.push_back(touchdown_horizontal_check(terminal, judge));
}

}  // namespace

DeployWindow deploy_window(const Design& design) {
    const Limits& lim = design.limits;
    const Limits mars;
    const bool on_mars = design.body.preset == "mars";
    const auto bound = [on_mars](double value, double mars_value) -> std::optional<double> {
        if (on_mars || value != mars_value)
            return value;
        return std::nullopt;
    };
    return {bound(lim.deploy_mach_max, mars.deploy_mach_max),
            bound(lim.deploy_dynamic_pressure_min_Pa, mars.deploy_dynamic_pressure_min_Pa),
            bound(lim.deploy_dynamic_pressure_max_Pa, mars.deploy_dynamic_pressure_max_Pa)};
}

std::vector<Check> limit_checks(const Design& design, const Results& results, Wording wording) {
    const Judge judge{design.limits, wording};
    std::vector<Check> checks;
    constexpr std::size_t most_checks = 32;  // a sizing makes some 20: room without regrowth
    checks.reserve(most_checks);
    fairing_check(results, judge, heritage_source, checks);
    if (design.body.preset == "mars")
        mars_envelope_checks(design, results, judge, heritage_source, checks);
    parachute_checks(design, results, judge, checks);
    entry_load_checks(results.entry, judge, checks);
    landing_checks(results.terminal, judge, checks);
    powered_descent_checks(results, judge, checks);
    if (results.timeline.margin_s) {
        checks.push_back(timeline_check(*results.timeline.margin_s,
                                        design.limits.timeline_margin_min_s,
                                        results.timeline.needed_s.value_or(0.0),
                                        results.terminal.powered_descent.has_value(), wording));
    }
    return checks;
}

}  // namespace ds
