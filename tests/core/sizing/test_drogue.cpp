// Two-stage canopies: a drogue deployed on its own trigger, then the main parachute deployed
// under it on the main's trigger (the staging trigger).

#include <cmath>
#include <optional>

#include <doctest/doctest.h>

#include "aeroshell/sphere_cone.hpp"
#include "constants.hpp"
#include "parachute/canopy.hpp"
#include "sizing/environment.hpp"
#include "sizing/evaluation.hpp"
#include "sizing/size.hpp"
#include "support/results_lookup.hpp"
#include "support/samples.hpp"

namespace {

using ds::test::find_check;
using ds::test::find_event;
using ds::test::sample;

/// The Mars station with a 4 m disk-gap-band drogue at Mach 2.0 and its main parachute staged
/// at Mach 0.8.
ds::Design station_with_drogue() {
    ds::Design d = sample("small-ballistic-station");
    d.drogue = ds::DrogueDesign{};
    d.drogue->diameter_m = 4.0;
    d.drogue->trigger = ds::TriggerKind::mach;
    d.drogue->trigger_value = 2.0;
    d.parachute->trigger_value = 0.8;
    return d;
}

}  // namespace

TEST_CASE("the drogue deploys on its trigger and the main on its own, under the drogue") {
    const ds::Design d = station_with_drogue();
    const ds::Results r = ds::size_design(d);
    REQUIRE(r.drogue);
    REQUIRE(r.drogue->deployed);
    REQUIRE(r.parachute.deployed);
    CHECK(*r.drogue->deploy_mach == doctest::Approx(2.0).epsilon(1e-6));
    CHECK(*r.parachute.deploy_mach == doctest::Approx(0.8).epsilon(1e-6));
    const ds::TimelineEvent* drogue = find_event(r, "drogue deploy");
    const ds::TimelineEvent* main = find_event(r, "parachute deploy");
    REQUIRE(drogue);
    REQUIRE(main);
    CHECK(drogue->time_s < main->time_s);
    CHECK(drogue->time_s == doctest::Approx(*r.drogue->deploy_time_s));
}

TEST_CASE("under the drogue the drag is the aeroshell's and the drogue's, each at its Mach") {
    // Between the two deploys, drag / m = deceleration: q (Cd_shell(M) A + Cd_drogue(M) S).
    const ds::Design d = station_with_drogue();
    const ds::FlightEnvironment environment = ds::make_environment(d);
    const ds::Evaluation e = ds::evaluate(d, environment.model(), *d.mass.entry_kg);
    REQUIRE(e.entry.drogue);
    const double area = ds::frontal_area_m2(e.aeroshell.diameter_m);
    const ds::DragDevice shell = ds::aeroshell_device(d, e.aeroshell);
    const ds::DragDevice drogue = ds::drogue_device(d);
    CHECK(drogue.area_m2 == doctest::Approx(ds::frontal_area_m2(4.0)));
    int seen = 0;
    for (const ds::TrajectorySample& s : e.history) {
        if (s.time_s <= e.entry.drogue->time_s + 1.0 || s.time_s >= e.entry.end_time_s)
            continue;
        const double drag_N = s.deceleration_g * ds::standard_gravity_m_s2 * *d.mass.entry_kg;
        const double expected_N =
            s.dynamic_pressure_Pa * (shell.drag_coefficient_at(s.mach) * area +
                                     drogue.drag_coefficient_at(s.mach) * drogue.area_m2);
        CHECK(drag_N == doctest::Approx(expected_N).epsilon(1e-9));
        ++seen;
    }
    CHECK(seen > 5);
}

TEST_CASE("each canopy has its opening load by Knacke's load factor, and the drogue its mass") {
    // Opening load = 1.3 q Cd(M) S0 for a disk-gap-band (Knacke, NWC TP 6575; from memory); the
    // drogue's mass 0.20 kg/m^2 of its nominal area (our estimate), with the backshell.
    const ds::Design d = station_with_drogue();
    const ds::Results r = ds::size_design(d);
    REQUIRE(r.drogue);
    const ds::CanopyType dgb = *ds::canopy_type("disk-gap-band");
    const double cd_at_deploy =
        ds::canopy_device(dgb, 4.0, dgb.drag_coefficient).drag_coefficient_at(2.0);
    CHECK(*r.drogue->drag_coefficient_at_deploy == doctest::Approx(cd_at_deploy).epsilon(1e-6));
    CHECK(*r.drogue->opening_load_N == doctest::Approx(1.3 * *r.drogue->deploy_dynamic_pressure_Pa *
                                                       cd_at_deploy * ds::frontal_area_m2(4.0))
                                           .epsilon(1e-6));
    CHECK(*r.drogue->opening_load_g ==
          doctest::Approx(*r.drogue->opening_load_N / (560.0 * ds::standard_gravity_m_s2))
              .epsilon(1e-12));
    CHECK(*r.drogue->mass_kg > 0.2 * ds::frontal_area_m2(4.0));  // with its growth allowance
    CHECK(*r.drogue->mass_kg < 1.3 * 0.2 * ds::frontal_area_m2(4.0));
    // The drogue's checks have their own ids; the Mars deploy window is the drogue's.
    CHECK(find_check(r, "drogue_opening_load"));
    CHECK(find_check(r, "drogue_deploy_mach"));
    CHECK(find_check(r, "opening_load"));
    CHECK_FALSE(find_check(r, "deploy_mach"));
    // A frozen design keeps the drogue's mass.
    const ds::Design frozen = ds::freeze_design(d);
    REQUIRE(frozen.drogue);
    CHECK(frozen.drogue->mass_kg == doctest::Approx(*r.drogue->mass_kg).epsilon(1e-12));
}

TEST_CASE("the capsule's drogue lowers the main's opening load and lands with the capsule") {
    // The sample flies a drogue from Mach 1.4 and its main from 5 km: the main opens at the
    // drogue's descent speed, not at the capsule's own terminal speed. Without the drogue (and
    // the same main trigger) the main opens at a higher dynamic pressure.
    const ds::Design d = sample("earth-return-capsule");
    REQUIRE(d.drogue);
    const ds::Results with = ds::size_design(d);
    ds::Design alone = d;
    alone.drogue.reset();
    const ds::Results without = ds::size_design(alone);
    REQUIRE(with.parachute.opening_load_g);
    REQUIRE(without.parachute.opening_load_g);
    CHECK(*with.parachute.opening_load_g < 0.6 * *without.parachute.opening_load_g);
    // Nothing separates from a capsule on its canopy: the whole 48 kg lands, drogue included.
    REQUIRE(with.mass.landed_kg);
    CHECK(*with.mass.landed_kg == doctest::Approx(48.0).epsilon(1e-12));
}
