// An entry from an arrival or from orbit: the interface state the conic gives, turned
// planet-relative by the same machinery as an inertial state given at the interface; the
// deorbit burn's propellant in a stage dropped before entry; the burn in the timeline.

#include <cmath>

#include <doctest/doctest.h>

#include "constants.hpp"
#include "sizing/size.hpp"
#include "support/results_lookup.hpp"
#include "support/samples.hpp"

namespace {

// NASA NSSDC Mars fact sheet: GM and mean radius (as the preset carries them).
constexpr double mars_mu = 4.2828e13;
constexpr double mars_radius = 3389.5e3;

/// The station sample (12 N, heading 95 deg over rotating Mars) entering from an approach.
ds::Design station_from_approach(ds::ApproachDesign approach) {
    ds::Design d = ds::test::sample("small-ballistic-station");
    d.entry.velocity_m_s = 0.0;
    d.entry.flight_path_angle_deg = 0.0;
    d.entry.approach = approach;
    d.entry.velocity_frame = ds::VelocityFrame::inertial;
    return d;
}

/// The same design with the state the conic gives written at the interface, inertial.
ds::Design given_at_interface(ds::Design d, double speed_m_s, double flight_path_angle_deg) {
    d.entry.approach.reset();
    d.entry.orbit.reset();
    d.entry.velocity_m_s = speed_m_s;
    d.entry.flight_path_angle_deg = flight_path_angle_deg;
    d.entry.velocity_frame = ds::VelocityFrame::inertial;
    std::erase_if(d.mass.items, [](const ds::MassItemDesign& item) {
        return item.group == ds::MassGroup::deorbit_stage;
    });
    return d;
}

}  // namespace

TEST_CASE("a 3 km/s arrival enters at the vis-viva speed, turned planet-relative by hand") {
    const ds::Results r = ds::size_design(station_from_approach({3000.0, std::nullopt, -11.2}));
    REQUIRE(r.approach);
    CHECK_FALSE(r.orbit);
    // Vis-viva from the fact-sheet GM: v^2 = 3000^2 + 2 mu / (3389.5 + 125 km), 5776.87 m/s.
    const ds::EntryVelocity& inertial = r.entry.interface.inertial;
    CHECK(inertial.velocity_m_s == doctest::Approx(5776.87).epsilon(2e-6));
    CHECK(inertial.flight_path_angle_deg == doctest::Approx(-11.2).epsilon(1e-12));
    CHECK(inertial.azimuth_deg == doctest::Approx(95.0).epsilon(1e-12));
    // Planet-relative: less the surface speed omega r cos(latitude) to the east.
    const double omega = ds::body_preset("mars")->rotation_rad_s;
    const double carried = omega * (mars_radius + 125e3) * std::cos(ds::degrees_to_radians(12.0));
    const double g = ds::degrees_to_radians(-11.2);
    const double a = ds::degrees_to_radians(95.0);
    const double east = 5776.8653 * std::cos(g) * std::sin(a) - carried;
    const double north = 5776.8653 * std::cos(g) * std::cos(a);
    const double up = 5776.8653 * std::sin(g);
    const ds::EntryVelocity& relative = r.entry.interface.relative;
    CHECK(relative.velocity_m_s ==
          doctest::Approx(std::sqrt(east * east + north * north + up * up)).epsilon(1e-7));
    CHECK(relative.flight_path_angle_deg ==
          doctest::Approx(ds::radians_to_degrees(std::atan2(up, std::hypot(east, north))))
              .epsilon(1e-6));
    // The approach section gives the same state in both frames, and the conic's figures.
    CHECK(r.approach->inertial.velocity_m_s == inertial.velocity_m_s);
    CHECK(r.approach->relative.flight_path_angle_deg == relative.flight_path_angle_deg);
    CHECK(r.approach->periapsis_altitude_m == doctest::Approx(19903.9).epsilon(2e-5));
    CHECK(r.approach->semi_major_axis_m == doctest::Approx(-mars_mu / 9e6).epsilon(1e-12));
}

TEST_CASE("an arrival flies exactly as the inertial state it gives, written at the interface") {
    for (const ds::ApproachDesign approach :
         {ds::ApproachDesign{3000.0, std::nullopt, -12.0}, ds::ApproachDesign{2400.0, 15e3, {}}}) {
        const ds::Design from_conic = station_from_approach(approach);
        const ds::Results r = ds::size_design(from_conic);
        const ds::Results given =
            ds::size_design(given_at_interface(from_conic, r.entry.interface.inertial.velocity_m_s,
                                               r.entry.interface.inertial.flight_path_angle_deg));
        CHECK(r.entry.peak_deceleration_g ==
              doctest::Approx(given.entry.peak_deceleration_g).epsilon(1e-9));
        CHECK(r.parachute.deploy_altitude_m.value() ==
              doctest::Approx(*given.parachute.deploy_altitude_m).epsilon(1e-9));
        CHECK(r.landing->downrange_m == doctest::Approx(given.landing->downrange_m).epsilon(1e-9));
        CHECK(r.checks.size() == given.checks.size());
        CHECK_FALSE(ds::test::find_event(r, "deorbit burn"));
    }
}

TEST_CASE(
    "the deorbit burn from a circular orbit is the Hohmann impulse, its propellant Tsiolkovsky's") {
    // The station from a 300 km circular orbit, with an 80 kg deorbit stage of its own.
    ds::Design d = ds::test::sample("small-ballistic-station");
    d.entry.orbit = ds::OrbitDesign{300e3, 300e3, -14.0, 230.0};
    d.entry.velocity_frame = ds::VelocityFrame::inertial;
    d.mass.items.push_back(
        {"cruise structure", 80.0, ds::MassGroup::deorbit_stage, ds::Maturity::actual});
    const ds::Results r = ds::size_design(d);
    REQUIRE(r.orbit);
    CHECK_FALSE(r.approach);
    // Hohmann's first impulse down to the transfer's periapsis r_p:
    // dv = sqrt(mu / r_a) (1 - sqrt(2 r_p / (r_a + r_p))).
    const double ra = mars_radius + 300e3;
    const double rp = mars_radius + r.orbit->transfer_periapsis_altitude_m;
    CHECK(r.orbit->delta_v_m_s ==
          doctest::Approx(std::sqrt(mars_mu / ra) * (1.0 - std::sqrt(2.0 * rp / (ra + rp))))
              .epsilon(1e-9));
    // That ellipse crosses 125 km at -14 deg: cos(gamma) = h / (r_E v_E) with h and v_E from
    // its apoapsis and periapsis.
    const double re = mars_radius + 125e3;
    const double a = 0.5 * (ra + rp);
    const double h = std::sqrt(mars_mu * a * (1.0 - std::pow((ra - rp) / (ra + rp), 2)));
    const double ve = std::sqrt(mars_mu * (2.0 / re - 1.0 / a));
    CHECK(r.entry.interface.inertial.velocity_m_s == doctest::Approx(ve).epsilon(1e-12));
    CHECK(-ds::radians_to_degrees(std::acos(h / (re * ve))) ==
          doctest::Approx(-14.0).epsilon(1e-9));
    // The rocket equation on the stack it pushes: the 560 kg entry vehicle and the stage's 80 kg
    // (actual: no growth), m_p = m (exp(dv / (Isp g0)) - 1).
    const double expected =
        640.0 * (std::exp(r.orbit->delta_v_m_s / (230.0 * ds::standard_gravity_m_s2)) - 1.0);
    CHECK(r.orbit->propellant_kg == doctest::Approx(expected).epsilon(1e-12));
    CHECK(r.orbit->stage_kg == doctest::Approx(80.0 + expected).epsilon(1e-12));
    CHECK(r.orbit->mass_before_burn_kg == doctest::Approx(640.0 + expected).epsilon(1e-12));
    // The stage is in the budget but not in the entry mass: the fixed entry mass has the same
    // unallocated share as without the orbit.
    CHECK(r.mass.entry_kg == 560.0);
    const ds::Results direct =
        ds::size_design(given_at_interface(d, r.entry.interface.inertial.velocity_m_s,
                                           r.entry.interface.inertial.flight_path_angle_deg));
    ds::test::check_says(r, "mass_allocation", ds::CheckStatus::pass,
                         ds::test::find_check(direct, "mass_allocation")->message);
    CHECK(r.entry.peak_heat_flux_W_cm2 ==
          doctest::Approx(direct.entry.peak_heat_flux_W_cm2).epsilon(1e-9));
}

TEST_CASE("entry from orbit is in the timeline a coast before the interface") {
    ds::Design d = ds::test::sample("small-ballistic-station");
    d.entry.orbit = ds::OrbitDesign{250e3, 400e3, -13.0, 225.0};
    d.entry.velocity_frame = ds::VelocityFrame::inertial;
    const ds::Results r = ds::size_design(d);
    REQUIRE(r.orbit);
    REQUIRE(r.timeline.events.size() > 2);
    const ds::TimelineEvent& burn = r.timeline.events[0];
    CHECK(burn.name == "deorbit burn");
    CHECK(burn.time_s == doctest::Approx(-r.orbit->coast_s).epsilon(1e-12));
    CHECK(burn.time_s < -60.0);
    CHECK(burn.altitude_m == doctest::Approx(400e3).epsilon(1e-9));
    CHECK(r.timeline.events[1].name == "entry interface");
    // Behind the entry point along its track: the transfer angle at the reference radius, less
    // what the body turned under the orbit in the coast (it heads east, with the turning).
    CHECK(burn.downrange_m < 0.0);
    const double arc = ds::degrees_to_radians(r.orbit->transfer_angle_deg) * mars_radius;
    CHECK(-burn.downrange_m < arc);
    CHECK(-burn.downrange_m > 0.8 * arc);
}

TEST_CASE("a sized budget closes on the entry mass, the deorbit stage left out of it") {
    // The rover carrier closes its budget from its items; entering from orbit adds a stage
    // before the interface, which must not change the entry vehicle it closes on.
    ds::Design d = ds::test::sample("lifting-rover-carrier");
    REQUIRE_FALSE(d.mass.entry_kg);
    d.entry.velocity_m_s = 0.0;
    d.entry.flight_path_angle_deg = 0.0;
    d.entry.orbit = ds::OrbitDesign{280e3, 350e3, -12.5, 230.0};
    d.entry.velocity_frame = ds::VelocityFrame::inertial;
    d.mass.items.push_back(
        {"cruise structure", 150.0, ds::MassGroup::deorbit_stage, ds::Maturity::layout});
    const ds::Results r = ds::size_design(d);
    REQUIRE(r.mass.closure);
    CHECK(r.mass.closure->converged);
    const ds::Results direct =
        ds::size_design(given_at_interface(d, r.entry.interface.inertial.velocity_m_s,
                                           r.entry.interface.inertial.flight_path_angle_deg));
    CHECK(r.mass.entry_kg == doctest::Approx(direct.mass.entry_kg).epsilon(1e-9));
    REQUIRE(r.orbit);
    CHECK(r.orbit->mass_before_burn_kg ==
          doctest::Approx(r.mass.entry_kg + r.orbit->stage_kg).epsilon(1e-12));
}
