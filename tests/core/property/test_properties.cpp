// Properties every design that reads must keep, checked over thousands of designs drawn at
// random (from a fixed seed, so a failure comes back on every run) around the small ballistic
// station sample: no exception, finite figures, mass that only leaves the vehicle, a timeline in
// order, and mechanical energy that only falls until the engines light.

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <map>
#include <numbers>
#include <optional>
#include <random>
#include <string>
#include <string_view>
#include <vector>

#include <doctest/doctest.h>
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "body/body.hpp"
#include "design/reader.hpp"
#include "design/writer.hpp"
#include "results/writer.hpp"
#include "sizing/size.hpp"
#include "support/preset_body.hpp"
#include "support/results_lookup.hpp"
#include "support/samples.hpp"

namespace {

using ds::test::find_event;
using Json = nlohmann::ordered_json;

// The run: 2000 designs take about 4 s in a Release build, 20 s allowed (our choice).
constexpr std::uint64_t seed = 0x5eed'0001;
constexpr int design_count = 2000;

// A closed budget adds up to its entry mass within the closure tolerance, 0.1 kg
// (core/sizing/size.cpp); a fixed entry mass is met exactly by its "unallocated" item.
constexpr double budget_tolerance_kg = 0.1;
// Specific mechanical energy may rise between two samples by integration error only. The
// integrator holds each step to a relative error of 1e-8 (solver.relative_tolerance); 1e-7 of
// mu / R (about 1.3 J/kg at Mars, 6 J/kg at Earth) is ten times that on the largest term, and
// far below what any force doing work would add in one step (our bound).
constexpr double energy_rise_tolerance_fraction = 1e-7;
// Events are located to 1e-7 s (the integrator's event tolerance); two events that are one
// instant (a burn that ends at the ground, and the impact) may differ by that much, and 1 mm of
// altitude is far above what it moves (our bounds).
constexpr double event_time_tolerance_s = 1e-6;
constexpr double altitude_tolerance_m = 1e-3;
// A touchdown is at the site: the burn's end is solved to 1e-6 s of separation time, a few
// hundredths of a millimetre at descent speeds; 1 cm is our bound.
constexpr double touchdown_altitude_tolerance_m = 0.01;
// The generator must produce real descents, not only vehicles that hit the ground (our bound).
constexpr double min_deployed_fraction = 0.5;

/// Uniform draws from one engine. The mapping from the engine's integers is written out here:
/// the standard distributions may differ between standard libraries, and the designs must not.
class Draw {
public:
    explicit Draw(std::uint64_t s) : engine_(s) {}

    /// In [low, high), from the top 53 bits of one draw.
    double uniform(double low, double high) {
        const double unit = static_cast<double>(engine_() >> 11) * 0x1.0p-53;
        return low + (high - low) * unit;
    }
    bool chance(double p) { return uniform(0.0, 1.0) < p; }
    template <typename T, std::size_t N>
    const T& pick(const std::array<T, N>& values) {
        return values[engine_() % N];
    }

private:
    std::mt19937_64 engine_;
};

/// A body preset with its standard atmosphere, and where an entry into it starts and lands.
struct BodyCase {
    std::string_view preset;
    double interface_altitude_m;
    double site_low_m;
    double site_high_m;
};

// Interfaces where the standard density is of order 1e-8 to 1e-5 kg/m^3 (our choice); Venus
// and Titan's standard models are exponential (core/atmosphere/standard.cpp). Under a canopy
// in Venus's dense lower atmosphere a descent takes hours: most Venus designs run out of the
// default 4000 s budget there, which exercises the budget's path. (A 30000 s budget lands them
// but makes the run 25 times longer.) At 3 km/s and more, above Titan's escape speed, shallow
// Titan entries fly by.
constexpr std::array body_cases{
    BodyCase{"mars", 125e3, -4000.0, 1000.0}, BodyCase{"mars", 125e3, -4000.0, 1000.0},
    BodyCase{"earth", 120e3, 0.0, 2000.0},    BodyCase{"venus", 250e3, 0.0, 2000.0},
    BodyCase{"titan", 500e3, 0.0, 1000.0},
};

constexpr std::array terminal_methods{ds::TerminalMethod::retro, ds::TerminalMethod::airbag,
                                      ds::TerminalMethod::tethered, ds::TerminalMethod::none};
constexpr std::array canopy_types{std::string_view("disk-gap-band"), std::string_view("ringsail")};
constexpr std::array triggers{ds::TriggerKind::mach, ds::TriggerKind::mach,
                              ds::TriggerKind::dynamic_pressure, ds::TriggerKind::altitude};

ds::Design base_design() {
    return ds::test::sample("small-ballistic-station");
}

/// The base design with its inputs drawn within plausible ranges (our choice of ranges), on a
/// body that does not rotate, so that energy is the planet-relative energy.
ds::Design random_design(const ds::Design& base, Draw& draw) {
    ds::Design d = base;
    d.name = "random design";

    const BodyCase& body = draw.pick(body_cases);
    d.body = ds::test::preset_body(std::string(body.preset));
    d.body.body.rotation_rad_s = 0.0;
    d.atmosphere = {};
    d.atmosphere.model = ds::AtmosphereModel::standard;
    d.atmosphere.density_scale = draw.uniform(0.8, 1.2);
    d.site.elevation_m = draw.uniform(body.site_low_m, body.site_high_m);
    const double g_site = d.body.body.gravity_m_s2(d.site.elevation_m);

    d.entry.interface_altitude_m = body.interface_altitude_m;
    d.entry.velocity_m_s = draw.uniform(3000.0, 7500.0);
    d.entry.flight_path_angle_deg = draw.uniform(-25.0, -8.0);
    d.entry.lift_to_drag = draw.chance(0.5) ? 0.0 : draw.uniform(0.0, 0.3);
    d.entry.bank_angle_deg = draw.uniform(0.0, 90.0);

    // The entry mass follows from a ballistic coefficient, as a designer would pick it.
    const double diameter = draw.uniform(1.0, 5.0);
    const double ballistic_coefficient = draw.uniform(25.0, 150.0);
    // About the hypersonic Cd of a 60-70 deg sphere-cone (modified Newtonian theory).
    const double nominal_drag_coefficient = 1.6;
    const double entry_kg = ballistic_coefficient * nominal_drag_coefficient * std::numbers::pi *
                            diameter * diameter / 4.0;
    d.aeroshell.diameter_m = diameter;
    d.aeroshell.size_for_ballistic_coefficient_kg_m2.reset();
    d.aeroshell.half_angle_deg = draw.uniform(45.0, 70.0);
    d.aeroshell.nose_radius_m = diameter * draw.uniform(0.1, 0.5);
    d.aeroshell.drag_coefficient.reset();
    if (draw.chance(0.5))
        d.aeroshell.drag_coefficient = draw.uniform(1.4, 1.7);

    d.mass = {};
    const bool sizing = draw.chance(0.3);
    if (sizing) {
        // Sizing mode: the budget closes from items of about half the entry mass.
        d.mass.items = {
            {"payload", entry_kg * draw.uniform(0.2, 0.4), ds::MassGroup::payload,
             ds::Maturity::layout},
            {"descent stage structure", entry_kg * draw.uniform(0.05, 0.15),
             ds::MassGroup::descent_stage, ds::Maturity::estimated},
        };
    } else {
        d.mass.entry_kg = entry_kg;
        if (draw.chance(0.5))
            d.mass.heat_shield_kg = entry_kg * draw.uniform(0.05, 0.15);
    }

    ds::ParachuteDesign& p = d.parachute.emplace();
    p.type = std::string(draw.pick(canopy_types));
    if (draw.chance(0.8)) {
        p.diameter_m = diameter * draw.uniform(3.0, 6.0);
    } else {
        p.size_for_velocity_m_s = draw.uniform(40.0, 90.0);
        p.at_height_above_site_m = draw.uniform(1000.0, 3000.0);
    }
    p.trigger = draw.pick(triggers);
    switch (p.trigger) {
        case ds::TriggerKind::mach:
            p.trigger_value = draw.uniform(1.2, 2.1);
            break;
        case ds::TriggerKind::dynamic_pressure:
            // Above the dynamic pressure of the vehicle's own terminal descent, m g / (Cd A).
            p.trigger_value = ballistic_coefficient * g_site * draw.uniform(1.5, 4.0);
            break;
        case ds::TriggerKind::altitude:
            p.trigger_value = d.site.elevation_m + draw.uniform(5e3, 12e3);
            break;
    }
    d.decelerator.reset();
    if (draw.chance(0.1)) {
        ds::DeceleratorDesign& decelerator = d.decelerator.emplace();
        decelerator.diameter_m = diameter * draw.uniform(1.3, 2.0);
        decelerator.drag_coefficient = draw.uniform(1.0, 1.4);
        decelerator.trigger = ds::TriggerKind::mach;
        decelerator.trigger_value = draw.uniform(2.5, 3.5);
    }

    ds::TerminalDesign& t = d.terminal;
    t = {};
    t.method = draw.pick(terminal_methods);
    if (t.method != ds::TerminalMethod::none) {
        t.isp_s = draw.uniform(200.0, 230.0);
        t.thrust_to_weight = draw.uniform(1.8, 3.5);
        t.throttle = draw.uniform(0.6, 1.0);
        t.touchdown_velocity_m_s = t.method == ds::TerminalMethod::airbag ? draw.uniform(5.0, 15.0)
                                                                          : draw.uniform(0.75, 3.0);
    }
    d.dispersions.clear();
    return d;
}

/// Results keys whose value is a plain number in the results struct: never null, since the
/// writer writes null only for an absent or non-finite figure.
bool always_a_number(const std::string& section, const std::string& key) {
    static const std::map<std::string, std::vector<std::string>> plain{
        {"entry",
         {"mass_kg", "diameter_m", "nose_radius_m", "drag_coefficient",
          "ballistic_coefficient_kg_m2", "peak_deceleration_g", "peak_deceleration_altitude_m",
          "peak_heat_flux_W_cm2", "peak_heat_flux_altitude_m", "heat_load_J_cm2",
          "peak_dynamic_pressure_Pa", "peak_dynamic_pressure_altitude_m",
          "heat_shield_mass_fraction", "heat_shield_tps_kg"}},
        {"events", {"time_s", "altitude_m", "velocity_m_s"}},
        {"items", {"mass_kg", "basic_kg", "growth_fraction"}},
        {"checks", {"value", "limit"}},
        {"history",
         {"time_s", "altitude_m", "downrange_m", "velocity_m_s", "flight_path_angle_deg", "mach",
          "dynamic_pressure_Pa", "deceleration_g", "heat_flux_W_cm2", "radiative_heat_flux_W_cm2"}},
    };
    const auto it = plain.find(section);
    return it != plain.end() &&
           std::find(it->second.begin(), it->second.end(), key) != it->second.end();
}

/// Walks the results document: every number finite, and no plain figure written as null (which
/// is how the writer hides a NaN). Returns the path of the first offence, empty when none.
std::string first_non_finite(const Json& value, const std::string& section,
                             const std::string& path) {
    if (value.is_object()) {
        for (auto it = value.begin(); it != value.end(); ++it) {
            const std::string child = path + "." + it.key();
            if (it.value().is_null() && always_a_number(section, it.key()))
                return child;
            const std::string inner = it.value().is_structured() ? it.key() : section;
            if (auto found = first_non_finite(it.value(), inner, child); !found.empty())
                return found;
        }
    } else if (value.is_array()) {
        for (std::size_t i = 0; i < value.size(); ++i) {
            if (auto found = first_non_finite(value[i], section, fmt::format("{}[{}]", path, i));
                !found.empty())
                return found;
        }
    } else if (value.is_number() && !std::isfinite(value.get<double>())) {
        return path;
    }
    return {};
}

/// Every optional figure the sizing produced is finite.
std::string first_non_finite_optional(const ds::Results& r) {
    const std::vector<std::pair<const char*, const std::optional<double>*>> figures{
        {"entry.peak_radiative_heat_flux_W_cm2", &r.entry.peak_radiative_heat_flux_W_cm2},
        {"entry.radiative_heat_load_J_cm2", &r.entry.radiative_heat_load_J_cm2},
        {"parachute.deploy_time_s", &r.parachute.deploy_time_s},
        {"parachute.deploy_altitude_m", &r.parachute.deploy_altitude_m},
        {"parachute.deploy_mach", &r.parachute.deploy_mach},
        {"parachute.deploy_dynamic_pressure_Pa", &r.parachute.deploy_dynamic_pressure_Pa},
        {"parachute.deploy_velocity_m_s", &r.parachute.deploy_velocity_m_s},
        {"parachute.diameter_m", &r.parachute.diameter_m},
        {"parachute.drag_coefficient", &r.parachute.drag_coefficient},
        {"parachute.drag_coefficient_at_deploy", &r.parachute.drag_coefficient_at_deploy},
        {"parachute.opening_load_N", &r.parachute.opening_load_N},
        {"parachute.opening_load_g", &r.parachute.opening_load_g},
        {"parachute.heat_shield_jettison_mach", &r.parachute.heat_shield_jettison_mach},
        {"parachute.heat_shield_jettison_dynamic_pressure_Pa",
         &r.parachute.heat_shield_jettison_dynamic_pressure_Pa},
        {"parachute.inflation_time_s", &r.parachute.inflation_time_s},
        {"parachute.mass_kg", &r.parachute.mass_kg},
        {"parachute.heat_shield_jettison_time_s", &r.parachute.heat_shield_jettison_time_s},
        {"parachute.descent_velocity_m_s", &r.parachute.descent_velocity_m_s},
        {"terminal.ignition_altitude_m", &r.terminal.ignition_altitude_m},
        {"terminal.ignition_velocity_m_s", &r.terminal.ignition_velocity_m_s},
        {"terminal.delta_v_m_s", &r.terminal.delta_v_m_s},
        {"terminal.gravity_loss_m_s", &r.terminal.gravity_loss_m_s},
        {"terminal.propellant_kg", &r.terminal.propellant_kg},
        {"terminal.burn_time_s", &r.terminal.burn_time_s},
        {"terminal.ignition_time_s", &r.terminal.ignition_time_s},
        {"terminal.thrust_N", &r.terminal.thrust_N},
        {"terminal.burned_propellant_kg", &r.terminal.burned_propellant_kg},
        {"terminal.touchdown_velocity_m_s", &r.terminal.touchdown_velocity_m_s},
        {"terminal.impact_velocity_m_s", &r.terminal.impact_velocity_m_s},
        {"terminal.impact_energy_J", &r.terminal.impact_energy_J},
        {"terminal.hover_time_s", &r.terminal.hover_time_s},
        {"timeline.margin_s", &r.timeline.margin_s},
        {"timeline.available_s", &r.timeline.available_s},
        {"timeline.needed_s", &r.timeline.needed_s},
        {"mass.landed_kg", &r.mass.landed_kg},
        {"capability.max_site_elevation_m", &r.capability.max_site_elevation_m},
    };
    for (const auto& [name, figure] : figures) {
        if (*figure && !std::isfinite(**figure))
            return name;
    }
    return {};
}

bool failed(const ds::Results& r, std::string_view check) {
    return std::any_of(r.checks.begin(), r.checks.end(), [&](const ds::Check& c) {
        return c.id == check && c.status == ds::CheckStatus::fail;
    });
}

/// The largest rise of specific mechanical energy, v^2/2 - mu/(R + h), between two samples of
/// the history before the engines light (J/kg; zero or less when it never rises).
double largest_energy_rise(const ds::Results& r, const ds::Body& body) {
    const double ignition = r.terminal.ignition_time_s.value_or(INFINITY);
    const auto energy = [&](const ds::TrajectorySample& s) {
        return 0.5 * s.velocity_m_s * s.velocity_m_s -
               body.mu_m3_s2 / (body.radius_m + s.altitude_m);
    };
    double largest = -INFINITY;
    for (std::size_t i = 1; i < r.history.size() && r.history[i].time_s < ignition; ++i) {
        largest = std::max(largest, energy(r.history[i]) - energy(r.history[i - 1]));
    }
    return largest;
}

struct Tally {
    int sized = 0;  // reported only: every pass sizes one design or stops at a REQUIRE
    int converged = 0;
    int deployed = 0;
    int jettisoned = 0;
    int burns = 0;
    int landed = 0;
    int closures = 0;
    int closed = 0;
    int out_of_budget = 0;  // a failing "trajectory" check: a time or step budget ran out
    std::map<std::string, int> entry_ends;               // the timeline event that ends the entry
    std::map<ds::TerminalMethod, int> landed_by_method;  // a landed mass and a touchdown event
    std::map<std::string, int> orders_compared;          // event pairs found both in one timeline
};

/// The timeline event that puts the payload on the ground, by terminal method.
std::string_view landing_event(ds::TerminalMethod method) {
    switch (method) {
        case ds::TerminalMethod::retro:
        case ds::TerminalMethod::none:
        case ds::TerminalMethod::supersonic_retro:
            return "touchdown";
        case ds::TerminalMethod::airbag:
            return "airbag impact";
        case ds::TerminalMethod::tethered:
            return "payload touchdown";
    }
    return "touchdown";
}

}  // namespace

TEST_CASE("2000 random designs around the small station keep the sizing's invariants") {
    const ds::Design base = base_design();
    Draw draw(seed);
    Tally tally;
    double largest_rise_seen = -INFINITY;

    for (int n = 0; n < design_count; ++n) {
        const ds::Design d = random_design(base, draw);
        CAPTURE(n);
        INFO(ds::write_design(d));  // written only when a check fails

        // The drawn design is valid: the reader takes back what the writer gives.
        const ds::DesignReadResult reread = ds::read_design(ds::write_design(d));
        REQUIRE_MESSAGE(reread.ok(), (reread.errors.empty() ? "" : reread.errors.front().text()));

        ds::Results r;
        REQUIRE_NOTHROW(r = ds::size_design(d));
        Json document;
        REQUIRE_NOTHROW(document = ds::results_to_json(r, {.include_history = true}));
        ++tally.sized;
        tally.converged += r.converged;
        tally.deployed += r.parachute.deployed;
        tally.jettisoned += r.parachute.heat_shield_jettison_time_s.has_value();
        tally.burns += r.terminal.ignition_time_s.has_value();
        tally.landed += r.mass.landed_kg.has_value();
        if (r.mass.landed_kg && find_event(r, landing_event(d.terminal.method)))
            ++tally.landed_by_method[d.terminal.method];
        tally.out_of_budget += failed(r, "trajectory");
        if (r.mass.closure) {
            ++tally.closures;
            tally.closed += r.mass.closure->converged;
        }

        // Finite figures.
        CHECK(first_non_finite(document, "", "results") == "");
        CHECK(first_non_finite_optional(r) == "");

        // Mass only leaves the vehicle; a converged budget adds up to the entry mass.
        if (r.mass.landed_kg) {
            CHECK(*r.mass.landed_kg <= r.mass.entry_kg);
        }
        // No mass, thrust or propellant below zero: only what a fixed entry mass leaves over may
        // be negative, and the landed mass of a budget that does not fit (its check fails).
        for (const ds::MassItem& item : r.mass.items) {
            CAPTURE(item.name);
            if (item.name.find("unallocated") == std::string::npos)
                CHECK(item.mass_kg >= 0.0);
        }
        if (r.mass.landed_kg.value_or(0.0) < 0.0) {
            CHECK((failed(r, "mass_allocation") || failed(r, "mass_closure")));
        }
        CHECK(r.terminal.thrust_N.value_or(0.0) >= 0.0);
        CHECK(r.terminal.propellant_kg.value_or(0.0) >= 0.0);
        if (r.converged) {
            double sum = 0.0;
            for (const ds::MassItem& item : r.mass.items)
                sum += item.mass_kg;
            CHECK(std::abs(sum - r.mass.entry_kg) < budget_tolerance_kg);
        }

        // The timeline in time order, from the interface; events in their physical order; and
        // from the parachute on, the vehicle only goes down.
        const auto& events = r.timeline.events;
        REQUIRE_FALSE(events.empty());
        CHECK(events.front().name == "entry interface");
        CHECK(std::is_sorted(events.begin(), events.end(),
                             [](const auto& a, const auto& b) { return a.time_s < b.time_s; }));
        // An event that needs an earlier one: when `later` happens, `earlier` happened before
        // it. Two events either of which may be missing: in order when both happen. Every pair
        // counts how often it was found in one timeline, so a run that never compares one (an
        // event renamed or never produced) fails below instead of passing by default.
        const auto at = [&](std::string_view first, std::string_view second) {
            const ds::TimelineEvent* a = find_event(r, first);
            const ds::TimelineEvent* b = find_event(r, second);
            if (a && b)
                ++tally.orders_compared[fmt::format("{} < {}", first, second)];
            return std::pair{a, b};
        };
        const auto needs = [&](std::string_view earlier, std::string_view later) {
            const auto [a, b] = at(earlier, later);
            return !b || (a && a->time_s <= b->time_s + event_time_tolerance_s);
        };
        const auto in_order_when_both = [&](std::string_view first, std::string_view second) {
            const auto [a, b] = at(first, second);
            return !a || !b || a->time_s <= b->time_s + event_time_tolerance_s;
        };
        CHECK(in_order_when_both("decelerator deploy", "parachute deploy"));
        CHECK(needs("parachute deploy", "heat-shield jettison"));
        CHECK(needs("parachute deploy", "backshell separation"));
        CHECK(in_order_when_both("heat-shield jettison", "backshell separation"));
        CHECK(needs("backshell separation", "ignition"));
        CHECK(in_order_when_both("ignition", "touchdown"));
        CHECK(needs("ignition", "release"));
        CHECK(needs("release", "airbag impact"));
        CHECK(needs("hover and lowering", "payload touchdown"));
        // From backshell separation on, the lander only goes down: it coasts, burns against
        // its velocity until the burn's end velocity, and falls or is lowered to the ground. (Not
        // from parachute deploy: a deploy on a lofted path still climbs under the canopy; nor
        // in a flight whose "trajectory" check fails: one that ran out of its time budget under
        // the canopy may still be climbing, on a path that leaves the body.)
        const ds::TimelineEvent* separation = find_event(r, "backshell separation");
        if (separation && !failed(r, "trajectory")) {
            double previous = separation->altitude_m;
            for (const std::string_view name : {"ignition", "touchdown", "release", "airbag impact",
                                                "hover and lowering", "payload touchdown"}) {
                const ds::TimelineEvent* e = find_event(r, name);
                if (!e)
                    continue;
                CAPTURE(name);
                CHECK(e->altitude_m <= previous + altitude_tolerance_m);
                previous = e->altitude_m;
            }
        }
        // A touchdown is at the site; a descent that stopped above it has none.
        if (const ds::TimelineEvent* touchdown = find_event(r, "touchdown")) {
            CHECK(std::abs(touchdown->altitude_m - d.site.elevation_m) <
                  touchdown_altitude_tolerance_m);
        }
        for (const ds::TimelineEvent& e : events) {
            if (e.name == "parachute deploy" || e.name == "ground impact" ||
                e.name == "atmospheric exit" || e.name == "integration stopped") {
                ++tally.entry_ends[e.name];
            }
        }

        // The history in time order; energy falls until the engines light.
        CHECK(std::is_sorted(r.history.begin(), r.history.end(),
                             [](const auto& a, const auto& b) { return a.time_s < b.time_s; }));
        const double rise = largest_energy_rise(r, d.body.body);
        largest_rise_seen =
            std::max(largest_rise_seen, rise / (d.body.body.mu_m3_s2 / d.body.body.radius_m));
        CHECK(rise <= energy_rise_tolerance_fraction * d.body.body.mu_m3_s2 / d.body.body.radius_m);
    }

    std::string ends;
    for (const auto& [name, count] : tally.entry_ends)
        ends += fmt::format(", {} {}", name, count);
    MESSAGE(fmt::format(
        "{} designs sized: {} converged, {} deployed the parachute, {} jettisoned "
        "the heat shield, {} fired a terminal burn, {} landed, {} ran out of a solver "
        "budget; {} of {} budgets closed; entries ended by{}; largest energy rise "
        "{:.2e} mu/R",
        tally.sized, tally.converged, tally.deployed, tally.jettisoned, tally.burns, tally.landed,
        tally.out_of_budget, tally.closed, tally.closures, ends, largest_rise_seen));
    for (const ds::TerminalMethod method : terminal_methods) {
        const std::string_view name = ds::to_string(method);
        CAPTURE(name);
        CHECK(tally.landed_by_method[method] > 0);
    }
    for (const std::string_view pair :
         {"decelerator deploy < parachute deploy", "parachute deploy < heat-shield jettison",
          "parachute deploy < backshell separation", "heat-shield jettison < backshell separation",
          "backshell separation < ignition", "ignition < touchdown", "ignition < release",
          "release < airbag impact", "hover and lowering < payload touchdown"}) {
        CAPTURE(pair);
        CHECK(tally.orders_compared[std::string(pair)] > 0);
    }
    CHECK(tally.deployed > min_deployed_fraction * design_count);
    CHECK(tally.burns > 0);
    CHECK(tally.closed > 0);
}
