// The dense record of a flight flown in two phases, against the free fall it records: a phase
// that an event ended inside a step leaves that step's far part to the next phase.

#include <cmath>
#include <numbers>

#include <doctest/doctest.h>

#include "atmosphere/exponential.hpp"
#include "flight/phase.hpp"

namespace {

// A flat, airless, non-rotating body with a uniform 3.7 m/s^2 (as in the terminal-burn tests):
// a huge radius with mu = g R^2 keeps g within 1e-5 over the few kilometres flown.
constexpr double radius = 1e9;
constexpr double g = 3.7;

}  // namespace

TEST_CASE("a crossing after a phase's end event is found in the next phase, t = t1 + dh / v") {
    const ds::Body body{"flat", radius, g * radius * radius, 0.0, ds::Gas{188.9, 1.29, 1.9e-4, ""}};
    const ds::ExponentialAtmosphere vacuum{{1e-15, 11100.0, 210.0}, 188.9, 1.29};
    const ds::FlightModel model{body, vacuum};
    const auto settings = ds::flight_integrator_settings(1e-10, 100000);
    ds::DenseTrajectory record;

    // Straight down at 60 m/s from 6 km until 5 km: the step that holds the event reaches far
    // below it (steps grow tenfold in free fall).
    ds::Phase fall;
    fall.ends = {{"5 km", ds::FlightQuantity::altitude, 5000.0, ds::EventDirection::falling}};
    const ds::FlightState y0 =
        ds::make_flight_state(6000.0, 0.0, 0.0, 60.0, -std::numbers::pi / 2.0, 0.0, 500.0);
    const ds::PhaseOutcome first =
        ds::fly_phase(model, fall, 0.0, y0, 1000.0, settings, {nullptr, &record});
    REQUIRE(first.ended_by == std::size_t{0});
    REQUIRE(record.steps().back().t0 + record.steps().back().h > first.time_s + 10.0);

    // Then from there at 10 m/s, as if braked at once, down to 4 km.
    const ds::FlightState y1 = ds::with_speed(first.y, 10.0);
    fall.ends = {{"4 km", ds::FlightQuantity::altitude, 4000.0, ds::EventDirection::falling}};
    ds::fly_phase(model, fall, first.time_s, y1, 1000.0, settings, {nullptr, &record});

    // 500 m below the braking at 10 m/s and 3.7 m/s^2: 0.5 g t^2 + 10 t = 500, to the 1e-5
    // by which g varies over the drop.
    const double t_hand = (-10.0 + std::sqrt(100.0 + 2.0 * g * 500.0)) / g;
    const auto t = record.time_descending_through(4500.0);
    REQUIRE(t);
    CHECK(*t - first.time_s == doctest::Approx(t_hand).epsilon(1e-4));
    CHECK(record.state_at(*t)[ds::StateIndex::altitude] == doctest::Approx(4500.0).epsilon(1e-9));
}
