// The quasi-steady descent under a canopy against the hand balance of drag and gravity in an
// exponential atmosphere, and against the full equations of motion flown through the same
// descent: where it settles, where its triggers fire, and how many steps it takes.

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

#include <doctest/doctest.h>

#include "atmosphere/exponential.hpp"
#include "atmosphere/table.hpp"
#include "body/body.hpp"
#include "flight/phase.hpp"

namespace {

// An exponential atmosphere of Mars-like numbers (those of the small-station sample) and the
// rotating Mars preset, so the centrifugal and Coriolis terms are in play. The flight starts on
// the equator heading east, where it stays in the equatorial plane and the hand balance below
// (a planar one) holds for the three-dimensional equations.
constexpr double surface_density = 0.020;
constexpr double scale_height = 11100.0;
constexpr double temperature = 210.0;
constexpr double gas_constant = 188.9;
constexpr double gas_gamma = 1.29;

// A 500 kg vehicle on 6000 m^2 of drag area (Cd 0.55 on a 118 m canopy): some 7 m/s near the
// surface, slow enough to settle (deceleration about 6e-4 g at 5 km).
constexpr double mass = 500.0;
constexpr double drag_area = 6000.0;

ds::ExponentialAtmosphere exponential_air() {
    return {{surface_density, scale_height, temperature}, gas_constant, gas_gamma};
}

const ds::Body& mars() {
    static const ds::Body body = *ds::body_preset("mars");
    return body;
}

ds::Stage canopy() {
    ds::Stage stage;
    stage.drag_devices = {{drag_area, 1.0, {}}};
    return stage;
}

/// Falling steeply from 8 km at twice the equilibrium speed, so it has to settle first.
ds::FlightState start() {
    return ds::make_flight_state(8000.0, 0.0, 0.0, 20.0, -89.9 * std::numbers::pi / 180.0,
                                 std::numbers::pi / 2.0, mass);
}

ds::IntegratorSettings<ds::flight_state_size> settings() {
    return ds::flight_integrator_settings(1e-10, 100000);
}

struct Descent {
    ds::PhaseOutcome outcome;
    ds::DenseTrajectory record;
};

/// Flies the canopy stage from start() until a trigger, on either equations.
Descent fly(const ds::Atmosphere& atmosphere, std::vector<ds::Trigger> ends, bool quasi_steady) {
    ds::Phase phase;
    phase.stage = canopy();
    phase.ends = std::move(ends);
    phase.quasi_steady_when_settled = quasi_steady;
    Descent d;
    d.outcome = ds::fly_phase({mars(), atmosphere}, phase, 0.0, start(), 4000.0, settings(),
                              {nullptr, &d.record});
    return d;
}

struct Hand {
    double zeroth_m_s = 0.0;  ///< drag balances G = g - omega^2 r
    double first_m_s = 0.0;   ///< ... plus V0 dV0/dh
    double flight_path_angle_rad = 0.0;
};

/// The equilibrium by hand: in an exponential atmosphere with a constant drag area,
/// V0^2 = 2 m G sin|gamma| / (rho CdA), so d(V0^2)/dh = V0^2 (1/H + G'/G) with
/// G' = -2 mu / r^3 - omega^2; V1^2 = 2 m sin|gamma| (G + d(V0^2)/dh / 2) / (rho CdA); and the
/// path turns no more where cos(gamma) = 2 omega V / (G - V^2 / r), plus the tilt that keeps
/// the eastward drift following its equilibrium.
Hand hand_equilibrium(double h) {
    const ds::Body& b = mars();
    const double r = b.radius_m + h;
    const double w = b.rotation_rad_s;
    const double g_eff = b.mu_m3_s2 / (r * r) - w * w * r;
    const double g_slope = -2.0 * b.mu_m3_s2 / (r * r * r) - w * w;
    const double rho = surface_density * std::exp(-h / scale_height);
    const auto cos_gamma = [&](double v) { return 2.0 * w * v / (g_eff - v * v / r); };
    const auto sink = [&](double v) { return std::sqrt(1.0 - std::pow(cos_gamma(v), 2)); };
    double v0 = std::sqrt(2.0 * mass * g_eff / (rho * drag_area));
    v0 *= std::sqrt(sink(v0));
    const double v0_squared_slope = v0 * v0 * (1.0 / scale_height + g_slope / g_eff);
    double v1 = std::sqrt(2.0 * mass * (g_eff + 0.5 * v0_squared_slope) / (rho * drag_area));
    v1 *= std::sqrt(sink(v1));
    // The eastward part of the velocity, V cos(gamma) = 2 omega V^2 / G to first order, also
    // follows its equilibrium as the vehicle sinks: the drag's horizontal part must supply
    // d(V cos gamma)/dh times the sink rate, 4 omega V^2 V' / G, while its vertical part
    // grows by V V'; the drag, along the path, then leans by 2 omega V^2 V' / G^2 more.
    const double v_slope = 0.5 * v0_squared_slope / v0;
    const double following_tilt = 2.0 * w * v1 * v1 * v_slope / (g_eff * g_eff);
    return {v0, v1, -std::acos(cos_gamma(v1) + following_tilt)};
}

}  // namespace

TEST_CASE("the quasi-steady equilibrium is the hand balance m (G + V0 dV0/dh) = rho V^2 CdA / 2") {
    const ds::ExponentialAtmosphere air = exponential_air();
    const ds::FlightModel model{mars(), air};
    for (const double h : {0.0, 5000.0, 10000.0}) {
        CAPTURE(h);
        ds::FlightState y = start();
        y[ds::StateIndex::altitude] = h;
        const ds::Equilibrium e = ds::quasi_steady_equilibrium(model, canopy(), y);
        const Hand hand = hand_equilibrium(h);
        // The central differences of the model are 1 m wide: their truncation, (1 m / H)^2 of
        // a correction of 1e-3, is far below the 1e-10 asked.
        CHECK(std::abs(e.velocity_m_s / hand.first_m_s - 1.0) < 1e-10);
        // The hand tilt of the path is first order in V V' / G (6e-4): what it leaves out, its
        // square and the gravity gradient in V', is some 1e-3 of the 2e-7 rad it is worth.
        CHECK(std::abs(e.flight_path_angle_rad - hand.flight_path_angle_rad) < 5e-9);
        // The first-order term matters: it is V0 dV0/dh / (2 G), some 3e-4 of the speed here.
        CHECK(hand.first_m_s / hand.zeroth_m_s - 1.0 > 1e-4);
    }
}

TEST_CASE("a flight settled on the full equations sits on the first-order equilibrium to 2e-6") {
    // Its error is of the order of the square of the deceleration in g (6e-4 here), where the
    // zeroth-order balance is off by half that deceleration.
    const ds::ExponentialAtmosphere air = exponential_air();
    const ds::FlightModel model{mars(), air};
    const Descent full =
        fly(air, {{"at 5 km", ds::FlightQuantity::altitude, 5000.0, ds::EventDirection::falling}},
            false);
    REQUIRE(full.outcome.ended_by == std::size_t{0});
    const ds::FlightState& y = full.outcome.y;
    const ds::Equilibrium e = ds::quasi_steady_equilibrium(model, canopy(), y);
    const double v = ds::speed(y);
    CHECK(std::abs(v / e.velocity_m_s - 1.0) < 2e-6);
    CHECK(std::abs(ds::flight_path_angle_rad(y) - e.flight_path_angle_rad) < 1e-6);
    CHECK(v / hand_equilibrium(5000.0).zeroth_m_s - 1.0 > 2e-4);
}

TEST_CASE("quasi-steady and full descents agree on trigger times to 5 ms in a fifth of the steps") {
    const ds::ExponentialAtmosphere air = exponential_air();
    const std::vector<ds::Trigger> ends{
        {"slow", ds::FlightQuantity::velocity, 6.5, ds::EventDirection::falling},
        {"floor", ds::FlightQuantity::altitude, 0.0, ds::EventDirection::falling}};
    const Descent full = fly(air, ends, false);
    const Descent quasi = fly(air, ends, true);
    REQUIRE(full.outcome.ended_by == std::size_t{0});
    REQUIRE(quasi.outcome.ended_by == std::size_t{0});
    // On the speed trigger: the speed falls at 6e-4 g, 2e-3 m/s^2, so a 1e-6 difference in
    // speed moves the crossing by 4 ms.
    CHECK(std::abs(quasi.outcome.time_s - full.outcome.time_s) < 5e-3);
    CHECK(std::abs(quasi.outcome.y[ds::StateIndex::altitude] -
                   full.outcome.y[ds::StateIndex::altitude]) < 0.05);
    CHECK(quasi.outcome.quasi_steady_steps > 0);
    CHECK(quasi.outcome.steps * 5 < full.outcome.steps);

    // On down to the floor, the dense records agree along the way.
    const std::vector<ds::Trigger> floor{ends[1]};
    const Descent full_floor = fly(air, floor, false);
    const Descent quasi_floor = fly(air, floor, true);
    REQUIRE(full_floor.outcome.ended_by == std::size_t{0});
    REQUIRE(quasi_floor.outcome.ended_by == std::size_t{0});
    CHECK(std::abs(quasi_floor.outcome.time_s - full_floor.outcome.time_s) < 5e-3);
    CHECK(ds::speed(quasi_floor.outcome.y) ==
          doctest::Approx(ds::speed(full_floor.outcome.y)).epsilon(1e-6));
    for (const double t : {100.0, 400.0, 800.0}) {
        CAPTURE(t);
        const ds::FlightState a = quasi_floor.record.state_at(t);
        const ds::FlightState b = full_floor.record.state_at(t);
        CHECK(std::abs(a[ds::StateIndex::altitude] - b[ds::StateIndex::altitude]) < 0.05);
        CHECK(ds::speed(a) == doctest::Approx(ds::speed(b)).epsilon(2e-6));
        CHECK(std::abs(a[ds::StateIndex::longitude] - b[ds::StateIndex::longitude]) *
                  mars().radius_m <
              0.01);
        CHECK(std::abs(a[ds::StateIndex::latitude]) < 1e-15);
    }
    const auto t_quasi = quasi_floor.record.time_descending_through(2000.0);
    const auto t_full = full_floor.record.time_descending_through(2000.0);
    REQUIRE(t_quasi);
    REQUIRE(t_full);
    CHECK(std::abs(*t_quasi - *t_full) < 5e-3);
}

TEST_CASE("a quasi-steady descent goes back to the full equations where the air thickens fast") {
    // Below 3 km the density's scale height drops to 1.1 km: the deceleration on the
    // equilibrium jumps past 2e-3 g there, and the full equations fly until it has fallen
    // below 1e-3 g again. The floor is reached at the same time either way.
    const std::vector<ds::AtmosphereRow> rows{
        {0.0, 0.3, temperature}, {3000.0, 0.020, temperature}, {12000.0, 0.0090, temperature}};
    const ds::TableAtmosphere air{rows, gas_constant, gas_gamma};
    const std::vector<ds::Trigger> floor{
        {"floor", ds::FlightQuantity::altitude, 0.0, ds::EventDirection::falling}};
    const Descent full = fly(air, floor, false);
    const Descent quasi = fly(air, floor, true);
    REQUIRE(full.outcome.ended_by == std::size_t{0});
    REQUIRE(quasi.outcome.ended_by == std::size_t{0});
    CHECK(quasi.outcome.quasi_steady_steps > 0);
    CHECK(quasi.outcome.quasi_steady_steps < quasi.outcome.steps);
    CHECK(std::abs(quasi.outcome.time_s - full.outcome.time_s) < 5e-3);
    CHECK(ds::speed(quasi.outcome.y) == doctest::Approx(ds::speed(full.outcome.y)).epsilon(1e-6));
}

TEST_CASE("a stage with lift or thrust flies the full equations even when asked to settle") {
    const ds::ExponentialAtmosphere air = exponential_air();
    ds::Phase phase;
    phase.stage = canopy();
    phase.stage.lift_to_drag = 0.05;
    phase.ends = {{"floor", ds::FlightQuantity::altitude, 0.0, ds::EventDirection::falling}};
    phase.quasi_steady_when_settled = true;
    const ds::PhaseOutcome lifting =
        ds::fly_phase({mars(), air}, phase, 0.0, start(), 4000.0, settings());
    CHECK(lifting.ended_by == std::size_t{0});
    CHECK(lifting.quasi_steady_steps == 0);
}

TEST_CASE("a trigger that the move onto the equilibrium skips ends the phase where it settles") {
    // The move skips the tail of the transient, in which the full equations would have crossed
    // a dynamic pressure between the one before the move and the one after it: the quasi-steady
    // phase ends at the move, the full one within the tail's time constant, v / 2 g, of it.
    const ds::ExponentialAtmosphere air = exponential_air();
    const ds::Trigger floor{"floor", ds::FlightQuantity::altitude, 0.0,
                            ds::EventDirection::falling};
    ds::Phase phase;
    phase.stage = canopy();
    phase.ends = {floor};
    phase.quasi_steady_when_settled = true;
    std::vector<ds::TrajectorySample> history;
    ds::fly_phase({mars(), air}, phase, 0.0, start(), 4000.0, settings(), {&history});
    // The move is where two samples share a time: before it, then after it.
    const auto move =
        std::adjacent_find(history.begin(), history.end(),
                           [](const ds::TrajectorySample& a, const ds::TrajectorySample& b) {
                               return a.time_s == b.time_s;
                           });
    REQUIRE(move != history.end());
    const double q_before = move->dynamic_pressure_Pa;
    const double q_after = (move + 1)->dynamic_pressure_Pa;
    REQUIRE(q_after < q_before);

    const std::vector<ds::Trigger> ends{{"q", ds::FlightQuantity::dynamic_pressure,
                                         0.5 * (q_before + q_after), ds::EventDirection::falling},
                                        floor};
    const Descent quasi = fly(air, ends, true);
    const Descent full = fly(air, ends, false);
    CHECK(quasi.outcome.ended_by == std::size_t{0});
    CHECK(full.outcome.ended_by == std::size_t{0});
    CHECK(quasi.outcome.time_s == move->time_s);
    const double v = move->velocity_m_s;
    const double g = mars().gravity_m_s2(move->altitude_m);
    CHECK(std::abs(full.outcome.time_s - quasi.outcome.time_s) < v / (2.0 * g));
}
