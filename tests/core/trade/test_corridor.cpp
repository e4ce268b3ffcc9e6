// The entry corridor against a fine sweep of the flight-path angle bisected here, by "does any
// check fail" (not by the feasibility margin the corridor root-finds on); its shallow bound
// against the skip-out of a lifting entry bisected on the entry flight alone.

#include <cmath>
#include <functional>
#include <string>

#include <doctest/doctest.h>

#include "design/writer.hpp"
#include "sizing/entry_flight.hpp"
#include "sizing/environment.hpp"
#include "sizing/size.hpp"
#include "support/samples.hpp"
#include "trade/corridor.hpp"
#include "trade/study.hpp"
#include "trade/value_list.hpp"

namespace {

/// The design flown at an interface flight-path angle.
ds::Design at_angle(ds::Design d, double angle_deg) {
    d.entry.flight_path_angle_deg = angle_deg;
    return d;
}

bool passes(const ds::Design& d) {
    const ds::Results r = ds::size_design(d, {false, false});
    return std::none_of(r.checks.begin(), r.checks.end(),
                        [](const ds::Check& c) { return c.status == ds::CheckStatus::fail; });
}

/// The ids of the failing checks.
std::vector<std::string> failing(const ds::Design& d) {
    std::vector<std::string> ids;
    for (const ds::Check& c : ds::size_design(d, {false, false}).checks) {
        if (c.status == ds::CheckStatus::fail)
            ids.push_back(c.id);
    }
    return ids;
}

/// Bisects a predicate that changes between a and b to `tolerance`; returns the end where it
/// holds as `holds(a)` does.
double bisect(const std::function<bool(double)>& holds, double a, double b, double tolerance) {
    const bool at_a = holds(a);
    REQUIRE(holds(b) != at_a);
    while (std::abs(b - a) > tolerance) {
        const double m = 0.5 * (a + b);
        (holds(m) == at_a ? a : b) = m;
    }
    return a;
}

ds::EntryCorridor corridor_of(const ds::Design& design, ds::CorridorSettings settings = {}) {
    auto [corridor, error] =
        ds::find_corridor(ds::DesignVariants::of(design), design, {}, settings);
    INFO(error);
    REQUIRE(corridor);
    return *corridor;
}

}  // namespace

TEST_CASE("the corridor's bounds agree with a fine sweep bisected by hand, to 0.01 deg") {
    const ds::Design station = ds::test::sample("small-ballistic-station");
    const ds::EntryCorridor corridor = corridor_of(station);
    CHECK(corridor.angle_key == "entry.flight_path_angle_deg");
    CHECK(corridor.speed_key == "entry.velocity_m_s");
    CHECK(corridor.frame == "planet-relative");
    REQUIRE(corridor.speeds.size() == 1);
    const ds::CorridorSpeed& row = corridor.speeds.front();
    CHECK(row.speed == 5600.0);
    REQUIRE(row.shallow);
    REQUIRE(row.steep);
    CHECK(row.shallow->closed);
    CHECK(row.steep->closed);

    // The sweep: every 0.25 deg from -24 to -6 deg, the design's -13 deg among them; the
    // passing run around -13 deg and its two ends.
    const auto passes_at = [&](double angle) { return passes(at_angle(station, angle)); };
    constexpr double step = 0.25;
    double low = -13.0;
    while (passes_at(low - step))
        low -= step;
    double high = -13.0;
    while (passes_at(high + step))
        high += step;
    REQUIRE(low > -24.0);
    REQUIRE(high < -6.0);
    // Each boundary bisected to 1e-4 deg between the last passing and the first failing value.
    const double steep_boundary = bisect(passes_at, low, low - step, 1e-4);
    const double shallow_boundary = bisect(passes_at, high, high + step, 1e-4);
    MESSAGE("corridor ", row.steep->angle_deg, " to ", row.shallow->angle_deg, " deg; bisected ",
            steep_boundary, " to ", shallow_boundary);
    // Each bound passes and lies within the root tolerance of the boundary, on its passing side.
    const double tolerance = ds::corridor_angle_tolerance_deg + 1e-4;
    CHECK(row.shallow->angle_deg <= shallow_boundary + 1e-4);
    CHECK(row.shallow->angle_deg >= shallow_boundary - tolerance);
    CHECK(row.steep->angle_deg >= steep_boundary - 1e-4);
    CHECK(row.steep->angle_deg <= steep_boundary + tolerance);
    CHECK(passes_at(row.shallow->angle_deg));
    CHECK(passes_at(row.steep->angle_deg));
    CHECK_FALSE(passes_at(row.shallow->failing_deg));
    CHECK_FALSE(passes_at(row.steep->failing_deg));
    CHECK(row.width_deg() == doctest::Approx(shallow_boundary - steep_boundary).epsilon(0.01));
    // What binds: the check that fails just past each boundary.
    const auto past_shallow = failing(at_angle(station, shallow_boundary + 1e-3));
    const auto past_steep = failing(at_angle(station, steep_boundary - 1e-3));
    CHECK(std::find(past_shallow.begin(), past_shallow.end(), row.shallow->binding_check) !=
          past_shallow.end());
    CHECK(std::find(past_steep.begin(), past_steep.end(), row.steep->binding_check) !=
          past_steep.end());
    CHECK(row.steep->binding_check == "peak_deceleration");
    // Root-found, not swept: a few dozen sizings for both sides.
    CHECK(row.sizings < 60);
}

TEST_CASE("a lifting entry's shallow bound is where it skips out, bisected on the entry alone") {
    // The station flown with its lift up (L/D 0.25, no bank).
    ds::Design lifting = ds::test::sample("small-ballistic-station");
    lifting.entry.lift_to_drag = 0.25;
    lifting.entry.bank_angle_deg = 0.0;
    const ds::EntryCorridor corridor = corridor_of(lifting);
    const ds::CorridorSpeed& row = corridor.speeds.front();
    REQUIRE(row.shallow);
    CHECK(row.shallow->binding_check == "parachute_trigger");
    CHECK(row.shallow->binding_message.find("skips out") != std::string::npos);

    // The skip-out angle: the entry flight alone (interface to the parachute trigger) ends in an
    // atmospheric exit above it and not below.
    const ds::FlightEnvironment environment = ds::make_environment(lifting);
    const ds::FlightModel model = environment.model();
    const double mass = *lifting.mass.entry_kg;
    const auto skips = [&](double angle) {
        const ds::Design d = at_angle(lifting, angle);
        const ds::EntryFlight f =
            ds::fly_entry(d, model, ds::resolve_aeroshell(d, mass), mass, nullptr);
        return f.end == ds::EntryEnd::skip_out;
    };
    const double skip_boundary = bisect(skips, -16.0, -6.0, 1e-4);
    MESSAGE("shallow bound ", row.shallow->angle_deg, " deg, skip-out below ", skip_boundary);
    CHECK(row.shallow->angle_deg <= skip_boundary + 1e-4);
    CHECK(row.shallow->angle_deg >= skip_boundary - ds::corridor_angle_tolerance_deg - 1e-4);
    CHECK(skips(row.shallow->failing_deg));
    CHECK_FALSE(skips(row.shallow->angle_deg));
}

TEST_CASE("over a list of speeds the steep bound shallows as the entry speeds up") {
    const ds::Design station = ds::test::sample("small-ballistic-station");
    ds::CorridorSettings settings;
    settings.speeds = {5000.0, 5600.0, 6200.0};
    const ds::EntryCorridor corridor = corridor_of(station, settings);
    REQUIRE(corridor.speeds.size() == 3);
    for (std::size_t i = 0; i < 3; ++i) {
        CAPTURE(i);
        const ds::CorridorSpeed& row = corridor.speeds[i];
        CHECK(row.speed == settings.speeds[i]);
        REQUIRE(row.steep);
        REQUIRE(row.shallow);
        CHECK(row.relative_speed_m_s == doctest::Approx(row.speed).epsilon(1e-9));
    }
    MESSAGE("steep bounds ", corridor.speeds[0].steep->angle_deg, " (",
            corridor.speeds[0].steep->binding_check, "), ", corridor.speeds[1].steep->angle_deg,
            ", ", corridor.speeds[2].steep->angle_deg);
    // Slower, the parachute deploys lower and denser: at 5000 m/s the deploy's dynamic pressure
    // binds the steep side before the deceleration does.
    CHECK(corridor.speeds[0].steep->binding_check == "deploy_dynamic_pressure_high");
    // Peak deceleration grows as V^2 sin|gamma| (Allen and Eggers, NACA Report 1381): the same
    // limit is met at a shallower angle at a higher speed.
    CHECK(corridor.speeds[1].steep->binding_check == "peak_deceleration");
    CHECK(corridor.speeds[2].steep->binding_check == "peak_deceleration");
    CHECK(corridor.speeds[2].steep->angle_deg > corridor.speeds[1].steep->angle_deg);
    // The design's own speed gives the corridor found without a list.
    const ds::CorridorSpeed own = corridor_of(station).speeds.front();
    CHECK(corridor.speeds[1].steep->angle_deg == own.steep->angle_deg);
    CHECK(corridor.speeds[1].shallow->angle_deg == own.shallow->angle_deg);
}

TEST_CASE("an arrival's corridor is in its inertial angle, a periapsis aim turned into one") {
    ds::Design arrival = ds::test::sample("small-ballistic-station");
    arrival.entry.velocity_frame = ds::VelocityFrame::inertial;
    arrival.entry.approach = ds::ApproachDesign{3000.0, 15e3, std::nullopt};
    const ds::EntryCorridor corridor = corridor_of(arrival);
    CHECK(corridor.angle_key == "entry.approach.flight_path_angle_deg");
    CHECK(corridor.speed_key == "entry.approach.v_infinity_m_s");
    CHECK(corridor.frame == "inertial");
    CHECK(corridor.nominal_speed == 3000.0);
    // The periapsis of 15 km gives the angle the search starts from.
    const ds::Results nominal = ds::size_design(arrival);
    CHECK(corridor.nominal_angle_deg ==
          doctest::Approx(nominal.entry.interface.inertial.flight_path_angle_deg).epsilon(1e-12));
    const ds::CorridorSpeed& row = corridor.speeds.front();
    REQUIRE(row.shallow);
    REQUIRE(row.steep);
    CHECK(row.steep->angle_deg < corridor.nominal_angle_deg);
    CHECK(row.shallow->angle_deg > corridor.nominal_angle_deg);
    // The bound in the key's frame is the inertial one; the planet-relative one is steeper
    // heading east over the turning body.
    CHECK(row.shallow->inertial_angle_deg ==
          doctest::Approx(row.shallow->angle_deg).epsilon(1e-12));
    CHECK(row.shallow->relative_angle_deg < row.shallow->inertial_angle_deg);
    CHECK(row.inertial_speed_m_s > row.relative_speed_m_s);

    // A dispersion of the periapsis the corridor no longer aims at cannot be flown: said, not
    // left out in silence.
    arrival.dispersions = {
        {"entry.approach.periapsis_altitude_m", ds::DistributionKind::normal, 500.0, 0.0, 0.0}};
    ds::CorridorSettings dispersed;
    dispersed.runs = 20;
    const ds::EntryCorridor without = corridor_of(arrival, dispersed);
    CHECK_FALSE(without.speeds.front().dispersed_centre);
    CHECK(without.dispersion_error.find("entry.approach.periapsis_altitude_m") !=
          std::string::npos);
}

TEST_CASE("with dispersions, the success at the corridor's centre and at its bounds") {
    const ds::Design station = ds::test::sample("small-ballistic-station");
    REQUIRE_FALSE(station.dispersions.empty());
    ds::CorridorSettings settings;
    settings.runs = 400;
    settings.seed = 11;
    const ds::CorridorSpeed row = corridor_of(station, settings).speeds.front();
    REQUIRE(row.dispersed_centre);
    REQUIRE(row.dispersed_shallow);
    REQUIRE(row.dispersed_steep);
    CHECK(row.dispersed_centre->angle_deg == doctest::Approx(row.centre_deg()).epsilon(1e-12));
    CHECK(row.dispersed_shallow->angle_deg == row.shallow->angle_deg);
    CHECK(row.dispersed_centre->runs == 400);
    MESSAGE("success at the shallow bound ", row.dispersed_shallow->success_probability,
            ", centre ", row.dispersed_centre->success_probability, ", steep bound ",
            row.dispersed_steep->success_probability);
    // On a bound the nominal is on the edge: the dispersions fail a large share of its cases
    // either way of it; at the centre, nearly none.
    CHECK(row.dispersed_centre->success_probability > 0.95);
    CHECK(row.dispersed_shallow->success_probability < 0.8);
    CHECK(row.dispersed_steep->success_probability < 0.8);
    CHECK(row.dispersed_centre->wilson_low < row.dispersed_centre->success_probability);
    // Without runs, none.
    CHECK_FALSE(corridor_of(station).speeds.front().dispersed_centre);
}

TEST_CASE("an entry from orbit has its corridor at its own speed only") {
    ds::Design orbiting = ds::test::sample("small-ballistic-station");
    orbiting.entry.velocity_frame = ds::VelocityFrame::inertial;
    orbiting.entry.orbit = ds::OrbitDesign{250e3, 400e3, -13.0, 225.0};
    const ds::EntryCorridor corridor = corridor_of(orbiting);
    CHECK(corridor.angle_key == "entry.orbit.flight_path_angle_deg");
    CHECK(corridor.speed_key.empty());
    REQUIRE(corridor.speeds.front().steep);
    CHECK(corridor.speeds.front().steep->angle_deg < -13.0);
    ds::CorridorSettings settings;
    settings.speeds = {3000.0};
    const auto [none, error] =
        ds::find_corridor(ds::DesignVariants::of(orbiting), orbiting, {}, settings);
    CHECK_FALSE(none);
    CHECK(error.find("takes its speed from its orbit") != std::string::npos);
}

TEST_CASE("the corridor is a study: run_study fills it, and its CSV has a row per speed") {
    const ds::Design station = ds::test::sample("small-ballistic-station");
    ds::StudyRequest request;
    request.kind = ds::StudyKind::corridor;
    request.speeds = {5200.0, 5800.0};
    request.runs = 0;
    ds::Unwatched progress;
    const ds::StudyOutcome outcome =
        ds::run_study(request, ds::design_to_json(station), station, {}, 0, progress);
    CHECK(outcome.error.empty());
    REQUIRE(outcome.corridor);
    CHECK(outcome.corridor->speeds.size() == 2);
    CHECK(outcome.description() == "Entry corridor over 2 speeds from 5200 to 5800");
    const std::string csv = outcome.csv();
    CHECK(csv.rfind("entry.velocity_m_s,relative_speed_m_s,inertial_speed_m_s,shallow_deg,", 0) ==
          0);
    CHECK(std::count(csv.begin(), csv.end(), '\n') == 3);
}

TEST_CASE("a list of speeds as typed: values and FROM:TO:N ranges") {
    std::string error;
    const auto values = ds::parse_value_list("5000, 5600 6000:6600:3", &error);
    REQUIRE(values);
    CHECK(*values == std::vector<double>{5000.0, 5600.0, 6000.0, 6300.0, 6600.0});
    CHECK(ds::parse_value_list("", &error)->empty());
    CHECK(*ds::parse_value_list("7:7:1", &error) == std::vector<double>{7.0});
    for (const char* bad : {"5000,abc", "5000:6000", "5000:6000:0", "1:2:2.5", "1e999"}) {
        CAPTURE(bad);
        error.clear();
        CHECK_FALSE(ds::parse_value_list(bad, &error));
        CHECK_FALSE(error.empty());
    }
    // A count past the most a sweep takes (a thousand) is refused, not cast to int (undefined
    // for 1e300) nor allocated (a billion values).
    CHECK(ds::parse_value_list("1:2:1000", &error)->size() == 1000);
    for (const char* huge : {"1:2:1001", "1:2:1e9", "1:2:1e300"}) {
        CAPTURE(huge);
        CHECK_FALSE(ds::parse_value_list(huge, &error));
        CHECK(error.find("N a whole number from 1 to 1000") != std::string::npos);
    }
}
