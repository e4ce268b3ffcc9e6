// The three-dimensional flight over a rotating sphere against checks from outside the project:
// - with rotation zero, the planar equations of motion over a sphere (Vinh, Busemann and Culp,
//   Hypersonic and Planetary Entry Flight Mechanics, 1980, in the plane of the great circle)
//   integrated by Boost.Odeint: any latitude and azimuth give the planar figures to 1e-6;
// - the same equations written in Cartesian body-fixed coordinates, r'' = a - mu r / |r|^3
//   - 2 w x v - w x (w x r) (Newton's second law in a rotating frame), integrated by
//   Boost.Odeint, for a lifting, banked entry over rotating Mars in a wind: peaks, the deploy
//   state and the deploy point to 1e-5;
// - with drag off, the Jacobi integral of the rotating frame and the inertial angular momentum
//   about the spin axis are conserved to 1e-9 over a coast (both are integrals of the motion
//   in a frame turning at a constant rate about a fixed axis, with a central force);
// - the inertial-to-relative conversion at the interface against hand values;
// - under a settled canopy in a constant wind, the horizontal ground speed becomes the wind's.

#include <array>
#include <cmath>
#include <functional>
#include <vector>

#include <doctest/doctest.h>
#include <Eigen/Geometry>
#include <boost/numeric/odeint.hpp>

#include "atmosphere/exponential.hpp"
#include "body/body.hpp"
#include "constants.hpp"
#include "design/reader.hpp"
#include "flight/ground_track.hpp"
#include "flight/phase.hpp"
#include "heating/sutton_graves.hpp"
#include "numerics/maximum.hpp"
#include "sizing/entry_flight.hpp"
#include "sizing/environment.hpp"
#include "support/project_flight.hpp"
#include "support/samples.hpp"

namespace odeint = boost::numeric::odeint;

namespace {

using Vec3 = Eigen::Vector3d;

constexpr double deploy_mach = 1.8;

ds::ExponentialAtmosphere mars_air() {
    return {{0.020, 11100.0, 210.0}, 188.9, 1.29};
}

ds::Body still_mars() {
    ds::Body b = *ds::body_preset("mars");
    b.rotation_rad_s = 0.0;
    return b;
}

ds::Stage entry_stage(double lift_to_drag, double bank_deg) {
    ds::Stage s;
    s.drag_devices = {{ds::pi * 4.5 * 4.5 / 4.0, 1.68, {}}};
    s.lift_to_drag = lift_to_drag;
    s.bank = ds::degrees_to_radians(bank_deg);
    s.nose_radius_m = 1.1;
    return s;
}

using ds::maximum_of;

/// What a reference integration reports: the deploy (Mach falling through 1.8) and the peaks.
template <class State>
struct Reference {
    double deploy_time = 0.0;
    State deploy{};
    double peak_deceleration_g = 0.0;
    double peak_heat_flux = 0.0;
};

/// Integrates `system` with Odeint's Dormand-Prince pair with dense output at 1e-12, and finds
/// the deploy by bisection and the peaks by golden-section search on the dense output.
template <class State, class System, class Mach, class Deceleration, class HeatFlux>
Reference<State> odeint_flight(const System& system, State x, const Mach& mach,
                               const Deceleration& deceleration, const HeatFlux& heat_flux) {
    auto stepper = odeint::make_dense_output(1e-12, 1e-12, odeint::runge_kutta_dopri5<State>());
    stepper.initialize(x, 0.0, 0.05);
    State probe;
    const auto at = [&](double t) {
        stepper.calc_state(t, probe);
        return probe;
    };
    Reference<State> ref;
    double previous_decel = 0.0;
    double previous_heat = 0.0;
    for (;;) {
        const auto [t0, t1] = stepper.do_step(system);
        const double decel = deceleration(at(t1));
        const double heat = heat_flux(at(t1));
        const double lo = std::max(0.0, t0 - (t1 - t0));
        if (decel < previous_decel && ref.peak_deceleration_g == 0.0) {
            ref.peak_deceleration_g =
                maximum_of([&](double t) { return deceleration(at(t)); }, lo, t1);
        }
        if (heat < previous_heat && ref.peak_heat_flux == 0.0) {
            ref.peak_heat_flux = maximum_of([&](double t) { return heat_flux(at(t)); }, lo, t1);
        }
        previous_decel = decel;
        previous_heat = heat;
        if (mach(stepper.current_state()) <= deploy_mach) {
            double a = t0;
            double b = t1;
            while (b - a > 1e-9) {
                const double m = 0.5 * (a + b);
                (mach(at(m)) > deploy_mach ? a : b) = m;
            }
            ref.deploy_time = b;
            ref.deploy = at(b);
            return ref;
        }
    }
}

/// The project's flight from the same start: the deploy and its peaks.
ds::test::ProjectFlight project_flight(const ds::FlightModel& model, const ds::Stage& stage,
                                       const ds::FlightState& y0) {
    return ds::test::project_flight(model, stage, y0, deploy_mach, 1e-10, 200000);
}

// ---- the planar reference --------------------------------------------------------------

/// h, downrange s at the reference radius, V, gamma, m, convective heat load.
using PlanarState = std::array<double, 6>;

struct Planar {
    ds::Body body = still_mars();
    ds::ExponentialAtmosphere air = mars_air();
    ds::Stage stage = entry_stage(0.18, 0.0);

    /// Drag, lift and the heat flux at a state.
    struct Forces {
        double drag = 0.0, lift = 0.0, mach = 0.0, heat = 0.0;
    };
    Forces forces(const PlanarState& x) const {
        const ds::AtmosphereSample a = air.at(x[0]);
        Forces f;
        f.mach = x[2] / a.speed_of_sound_m_s;
        f.drag = 0.5 * a.density_kg_m3 * x[2] * x[2] * stage.drag_area_m2(f.mach);
        f.lift = stage.lift_to_drag * f.drag;
        f.heat = ds::sutton_graves_heat_flux_W_m2(body.gas.sutton_graves_k, a.density_kg_m3,
                                                  stage.nose_radius_m, x[2]);
        return f;
    }
    /// The planar equations over a non-rotating sphere (Vinh, Busemann and Culp 1980).
    void operator()(const PlanarState& x, PlanarState& d, double) const {
        const Forces f = forces(x);
        const double r = body.radius_m + x[0];
        const double g = body.mu_m3_s2 / (r * r);
        d[0] = x[2] * std::sin(x[3]);
        d[1] = x[2] * std::cos(x[3]) * body.radius_m / r;
        d[2] = -f.drag / x[4] - g * std::sin(x[3]);
        d[3] = f.lift / (x[4] * x[2]) - (g / x[2] - x[2] / r) * std::cos(x[3]);
        d[4] = 0.0;
        d[5] = f.heat;
    }
};

// ---- the Cartesian body-fixed reference ------------------------------------------------

/// Position and velocity in the body-fixed frame (z along the spin axis), mass, heat load.
using CartesianState = std::array<double, 8>;

struct Cartesian {
    ds::Body body = *ds::body_preset("mars");
    ds::ExponentialAtmosphere air = mars_air();
    ds::WindProfile wind{{{0.0, 10.0, 5.0}, {20000.0, 40.0, -10.0}, {60000.0, 80.0, 20.0}}};
    ds::Stage stage = entry_stage(0.24, 50.0);

    static Vec3 position(const CartesianState& x) { return {x[0], x[1], x[2]}; }
    static Vec3 velocity(const CartesianState& x) { return {x[3], x[4], x[5]}; }

    /// The local east, north and up unit vectors at a position.
    static std::array<Vec3, 3> local(const Vec3& r) {
        const Vec3 up = r.normalized();
        const Vec3 east = Vec3(0.0, 0.0, 1.0).cross(up).normalized();
        return {east, up.cross(east), up};
    }

    struct Forces {
        Vec3 aero = Vec3::Zero();
        double mach = 0.0, deceleration_g = 0.0, heat = 0.0;
    };
    Forces forces(const CartesianState& x) const {
        const Vec3 r = position(x);
        const auto [east, north, up] = local(r);
        const double h = r.norm() - body.radius_m;
        const ds::AtmosphereSample a = air.at(h);
        const ds::WindVelocity w = wind.at(h);
        const Vec3 va = velocity(x) - (w.east_m_s * east + w.north_m_s * north);
        const double speed = va.norm();
        Forces f;
        f.mach = speed / a.speed_of_sound_m_s;
        const double drag = 0.5 * a.density_kg_m3 * speed * speed * stage.drag_area_m2(f.mach);
        const double lift = stage.lift_to_drag * drag;
        const Vec3 along = va / speed;
        // In the vertical plane through the air velocity, perpendicular to it; banked about it,
        // a positive bank towards along x n1, the right of the flight.
        const Vec3 n1 = (up - up.dot(along) * along).normalized();
        const Vec3 n2 = along.cross(n1);
        f.aero = (-drag * along +
                  lift * (std::cos(stage.bank.rad()) * n1 + std::sin(stage.bank.rad()) * n2)) /
                 x[6];
        f.deceleration_g = std::hypot(drag, lift) / x[6] / ds::standard_gravity_m_s2;
        f.heat = ds::sutton_graves_heat_flux_W_m2(body.gas.sutton_graves_k, a.density_kg_m3,
                                                  stage.nose_radius_m, speed);
        return f;
    }
    void operator()(const CartesianState& x, CartesianState& d, double) const {
        const Vec3 r = position(x);
        const Vec3 v = velocity(x);
        const Vec3 w(0.0, 0.0, body.rotation_rad_s);
        const Forces f = forces(x);
        const Vec3 acc = f.aero - body.mu_m3_s2 * r / std::pow(r.norm(), 3) - 2.0 * w.cross(v) -
                         w.cross(w.cross(r));
        for (int i = 0; i < 3; ++i) {
            d[static_cast<std::size_t>(i)] = v[i];
            d[static_cast<std::size_t>(i + 3)] = acc[i];
        }
        d[6] = 0.0;
        d[7] = f.heat;
    }

    /// The state at a point, from a speed, flight-path angle and azimuth.
    CartesianState start(double h, double lat, double lon, double speed, double gamma,
                         double azimuth, double mass) const {
        const double c = std::cos(lat);
        const Vec3 r =
            (body.radius_m + h) * Vec3(c * std::cos(lon), c * std::sin(lon), std::sin(lat));
        const auto [east, north, up] = local(r);
        const Vec3 v =
            speed * (std::cos(gamma) * (std::sin(azimuth) * east + std::cos(azimuth) * north) +
                     std::sin(gamma) * up);
        return {r.x(), r.y(), r.z(), v.x(), v.y(), v.z(), mass, 0.0};
    }
};

}  // namespace

TEST_CASE(
    "without rotation any latitude and azimuth give the planar flight to 1e-6 (Vinh, "
    "Busemann and Culp 1980, integrated by Boost.Odeint)") {
    const Planar planar;
    const double h0 = 125000.0, v0 = 5800.0, gamma0 = ds::degrees_to_radians(-14.0), m0 = 2000.0;
    const Reference<PlanarState> ref = odeint_flight(
        planar, PlanarState{h0, 0.0, v0, gamma0, m0, 0.0},
        [&](const PlanarState& x) { return planar.forces(x).mach; },
        [&](const PlanarState& x) {
            const auto f = planar.forces(x);
            return std::hypot(f.drag, f.lift) / x[4] / ds::standard_gravity_m_s2;
        },
        [&](const PlanarState& x) { return planar.forces(x).heat; });
    REQUIRE(ref.deploy_time > 0.0);

    const ds::FlightModel model{planar.body, planar.air};
    for (const auto& [lat_deg, azimuth_deg] : std::vector<std::pair<double, double>>{
             {0.0, 90.0}, {35.0, 20.0}, {-60.0, 250.0}, {75.0, 135.0}, {10.0, 0.0}}) {
        CAPTURE(lat_deg);
        CAPTURE(azimuth_deg);
        const double lat = ds::degrees_to_radians(lat_deg);
        const double lon = ds::degrees_to_radians(-40.0);
        const double azimuth = ds::degrees_to_radians(azimuth_deg);
        const ds::test::ProjectFlight f = project_flight(
            model, planar.stage, ds::make_flight_state(h0, lat, lon, v0, gamma0, azimuth, m0));
        REQUIRE(f.outcome.reason == ds::StopReason::terminal_event);
        const ds::FlightState& y = f.outcome.y;
        CHECK(f.outcome.time_s == doctest::Approx(ref.deploy_time).epsilon(1e-6));
        CHECK(y[ds::StateIndex::altitude] == doctest::Approx(ref.deploy[0]).epsilon(1e-6));
        CHECK(ds::speed(y) == doctest::Approx(ref.deploy[2]).epsilon(1e-6));
        CHECK(ds::flight_path_angle_rad(y) == doctest::Approx(ref.deploy[3]).epsilon(1e-6));
        CHECK(y[ds::StateIndex::convective_heat_load] ==
              doctest::Approx(ref.deploy[5]).epsilon(1e-6));
        CHECK(f.peak_deceleration_g == doctest::Approx(ref.peak_deceleration_g).epsilon(1e-6));
        CHECK(f.peak_heat_flux == doctest::Approx(ref.peak_heat_flux).epsilon(1e-6));
        const ds::TrackPosition p =
            ds::track_position({{lat, lon}, azimuth, planar.body.radius_m},
                               {y[ds::StateIndex::latitude], y[ds::StateIndex::longitude]});
        CHECK(p.downrange_m == doctest::Approx(ref.deploy[1]).epsilon(1e-6));
        CHECK(std::abs(p.crossrange_m) < 1e-6 * ref.deploy[1]);
    }
}

TEST_CASE(
    "a lifting, banked entry over rotating Mars in a wind agrees with a Cartesian "
    "body-fixed integration by Boost.Odeint to 1e-5") {
    const Cartesian cartesian;
    const double h0 = 125000.0, v0 = 5900.0, m0 = 2000.0;
    const double lat0 = ds::degrees_to_radians(15.0), lon0 = ds::degrees_to_radians(30.0);
    const double gamma0 = ds::degrees_to_radians(-14.0), azimuth0 = ds::degrees_to_radians(70.0);
    const Reference<CartesianState> ref = odeint_flight(
        cartesian, cartesian.start(h0, lat0, lon0, v0, gamma0, azimuth0, m0),
        [&](const CartesianState& x) { return cartesian.forces(x).mach; },
        [&](const CartesianState& x) { return cartesian.forces(x).deceleration_g; },
        [&](const CartesianState& x) { return cartesian.forces(x).heat; });
    REQUIRE(ref.deploy_time > 0.0);

    const ds::FlightModel model{cartesian.body, cartesian.air, &cartesian.wind};
    const ds::test::ProjectFlight f = project_flight(
        model, cartesian.stage, ds::make_flight_state(h0, lat0, lon0, v0, gamma0, azimuth0, m0));
    REQUIRE(f.outcome.reason == ds::StopReason::terminal_event);
    const ds::FlightState& y = f.outcome.y;

    const Vec3 r = Cartesian::position(ref.deploy);
    const Vec3 v = Cartesian::velocity(ref.deploy);
    const auto [east, north, up] = Cartesian::local(r);
    CHECK(f.outcome.time_s == doctest::Approx(ref.deploy_time).epsilon(1e-5));
    CHECK(y[ds::StateIndex::altitude] ==
          doctest::Approx(r.norm() - cartesian.body.radius_m).epsilon(1e-5));
    CHECK(y[ds::StateIndex::latitude] ==
          doctest::Approx(std::asin(r.z() / r.norm())).epsilon(1e-5));
    CHECK(y[ds::StateIndex::longitude] == doctest::Approx(std::atan2(r.y(), r.x())).epsilon(1e-5));
    CHECK(ds::speed(y) == doctest::Approx(v.norm()).epsilon(1e-5));
    CHECK(ds::flight_path_angle_rad(y) ==
          doctest::Approx(std::asin(v.dot(up) / v.norm())).epsilon(1e-5));
    CHECK(ds::azimuth_rad(y) ==
          doctest::Approx(std::atan2(v.dot(east), v.dot(north))).epsilon(1e-5));
    CHECK(y[ds::StateIndex::convective_heat_load] == doctest::Approx(ref.deploy[7]).epsilon(1e-5));
    CHECK(f.peak_deceleration_g == doctest::Approx(ref.peak_deceleration_g).epsilon(1e-5));
    CHECK(f.peak_heat_flux == doctest::Approx(ref.peak_heat_flux).epsilon(1e-5));
    // The bank turned the flight to the right of its track: south of an east-north-east one.
    const ds::TrackPosition p =
        ds::track_position({{lat0, lon0}, azimuth0, cartesian.body.radius_m},
                           {y[ds::StateIndex::latitude], y[ds::StateIndex::longitude]});
    CHECK(p.crossrange_m > 1000.0);
}

TEST_CASE(
    "with drag off, the Jacobi integral and the angular momentum about the spin axis are "
    "conserved to 1e-9 over a coast") {
    const ds::Body mars = *ds::body_preset("mars");
    const ds::ExponentialAtmosphere air = mars_air();
    const ds::FlightModel model{mars, air};
    ds::Phase coast;  // no drag devices, no lift, no thrust, no heating
    coast.ends = {{"ground", ds::FlightQuantity::altitude, 1000.0, ds::EventDirection::falling}};
    const ds::FlightState y0 =
        ds::make_flight_state(300000.0, ds::degrees_to_radians(20.0), 0.0, 3300.0,
                              ds::degrees_to_radians(2.0), ds::degrees_to_radians(45.0), 1000.0);
    ds::DenseTrajectory record;
    const ds::PhaseOutcome out =
        ds::fly_phase(model, coast, 0.0, y0, 3000.0, ds::flight_integrator_settings(1e-13, 1000000),
                      {nullptr, &record});
    REQUIRE(out.reason == ds::StopReason::reached_end);

    const double w = mars.rotation_rad_s;
    // Jacobi integral: V^2 / 2 - mu / r - (w r cos(lat))^2 / 2, with V planet-relative.
    const auto jacobi = [&](const ds::FlightState& y) {
        const double r = mars.radius_m + y[ds::StateIndex::altitude];
        const double axis = r * std::cos(y[ds::StateIndex::latitude]);
        return 0.5 * ds::speed(y) * ds::speed(y) - mars.mu_m3_s2 / r - 0.5 * w * w * axis * axis;
    };
    // Inertial angular momentum about the axis: distance from it times the inertial east speed.
    const auto momentum = [&](const ds::FlightState& y) {
        const double axis =
            (mars.radius_m + y[ds::StateIndex::altitude]) * std::cos(y[ds::StateIndex::latitude]);
        return axis * (y[ds::StateIndex::east_velocity] + w * axis);
    };
    const double j0 = jacobi(y0);
    const double h0 = momentum(y0);
    double worst_j = 0.0;
    double worst_h = 0.0;
    for (const auto& step : record.steps()) {
        worst_j = std::max(worst_j, std::abs(jacobi(step.r1) / j0 - 1.0));
        worst_h = std::max(worst_h, std::abs(momentum(step.r1) / h0 - 1.0));
    }
    worst_j = std::max(worst_j, std::abs(jacobi(out.y) / j0 - 1.0));
    worst_h = std::max(worst_h, std::abs(momentum(out.y) / h0 - 1.0));
    CHECK(record.steps().size() > 100);
    CHECK(worst_j < 1e-9);
    CHECK(worst_h < 1e-9);
    // The coast went a long way round: the test is not a short one.
    CHECK(std::abs(out.y[ds::StateIndex::longitude]) > ds::degrees_to_radians(60.0));
}

TEST_CASE(
    "an inertial entry state is turned planet-relative by v_rel = v_in - w x r (hand "
    "values)") {
    ds::Design d = ds::test::sample("small-ballistic-station");
    d.entry.latitude_deg = 0.0;
    d.entry.longitude_deg = 0.0;
    d.entry.velocity_frame = ds::VelocityFrame::inertial;
    // Hand values, Mars: w = 2 pi / (24.6229 h) = 7.08824e-5 rad/s, r = 3389.5 + 125 km, so
    // w r = 249.116 m/s to the east at the equator.
    SUBCASE("level, eastbound on the equator: the speed drops by w r") {
        d.entry.flight_path_angle_deg = 0.0;
        d.entry.azimuth_deg = 90.0;
        const ds::InterfaceState s = ds::interface_state(d, ds::flown_body(d));
        CHECK(s.rotation_flown);
        CHECK(s.relative.speed_m_s == doctest::Approx(5600.0 - 249.116).epsilon(1e-6));
        CHECK(ds::radians_to_degrees(s.relative.azimuth_rad) ==
              doctest::Approx(90.0).epsilon(1e-12));
        CHECK(std::abs(s.relative.flight_path_angle_rad) < 1e-15);
    }
    SUBCASE("descending at 13 deg, eastbound: 5357.56 m/s at -13.5993 deg") {
        d.entry.azimuth_deg = 90.0;
        const ds::InterfaceState s = ds::interface_state(d, ds::flown_body(d));
        CHECK(s.relative.speed_m_s == doctest::Approx(5357.5619).epsilon(1e-7));
        CHECK(ds::radians_to_degrees(s.relative.flight_path_angle_rad) ==
              doctest::Approx(-13.599312).epsilon(1e-7));
    }
    SUBCASE(
        "descending at 13 deg, northbound (polar): 5605.54 m/s at -12.9869 deg, azimuth "
        "-2.6140 deg") {
        d.entry.azimuth_deg = 0.0;
        const ds::InterfaceState s = ds::interface_state(d, ds::flown_body(d));
        CHECK(s.relative.speed_m_s == doctest::Approx(5605.5382).epsilon(1e-7));
        CHECK(ds::radians_to_degrees(s.relative.flight_path_angle_rad) ==
              doctest::Approx(-12.986931).epsilon(1e-7));
        CHECK(ds::radians_to_degrees(s.relative.azimuth_rad) ==
              doctest::Approx(-2.614032).epsilon(1e-6));
        // And back: the inertial state is the one given.
        CHECK(s.inertial.speed_m_s == doctest::Approx(5600.0).epsilon(1e-12));
    }
    SUBCASE("without an azimuth the body does not turn and the two frames coincide") {
        d.entry.azimuth_deg.reset();
        const ds::InterfaceState s = ds::interface_state(d, ds::flown_body(d));
        CHECK_FALSE(s.rotation_flown);
        CHECK(s.relative.speed_m_s == doctest::Approx(5600.0).epsilon(1e-15));
    }
}

TEST_CASE(
    "under a settled canopy in a constant wind the horizontal ground speed becomes the "
    "wind's") {
    const ds::Body mars = still_mars();
    const ds::ExponentialAtmosphere air = mars_air();
    const ds::WindProfile wind{{{0.0, 8.0, -6.0}}};
    const ds::FlightModel model{mars, air, &wind};
    ds::Phase canopy;
    canopy.stage.drag_devices = {{300.0, 1.0, {}}};
    canopy.ends = {{"2 km", ds::FlightQuantity::altitude, 2000.0, ds::EventDirection::falling}};
    // From 8 km heading north at 60 m/s, 60 deg below the horizontal: nothing like the wind.
    const ds::FlightState y0 =
        ds::make_flight_state(8000.0, 0.3, 1.0, 60.0, ds::degrees_to_radians(-60.0), 0.0, 500.0);
    const ds::PhaseOutcome out = ds::fly_phase(model, canopy, 0.0, y0, 4000.0,
                                               ds::flight_integrator_settings(1e-10, 100000));
    REQUIRE(out.ended_by == std::size_t{0});
    // Drag acts on the air-relative velocity only, so the vehicle sinks straight down through
    // the air and moves with it, but for the transport terms of the sphere (v_n v_u / r, some
    // 5e-5 m/s^2) that its drag must balance: some 5e-4 m/s of horizontal lag here.
    CHECK(std::abs(out.y[ds::StateIndex::east_velocity] - 8.0) < 1e-3);
    CHECK(std::abs(out.y[ds::StateIndex::north_velocity] + 6.0) < 1e-3);
    CHECK(std::abs(ds::horizontal_speed(out.y) - 10.0) < 1e-3);
    // From 30 m/s the wrong way to the wind's 10 m/s: it did move.
    CHECK(std::abs(ds::horizontal_speed(y0) - 10.0) > 10.0);
}

TEST_CASE("each part of the flight conditions is the same number alone as with the others") {
    // A stage that has every part: drag with a Mach law, lift, thrust against the air with a
    // reference area, and heating. What a part leaves out stays zero.
    const ds::Body mars = *ds::body_preset("mars");
    const ds::ExponentialAtmosphere air = mars_air();
    const ds::FlightModel model{mars, air};
    ds::Stage stage = entry_stage(0.24, 30.0);
    stage.drag_devices.front().follow_stagnation_pressure(1.29);
    stage.thrust_N = 20000.0;
    stage.thrust_reference_area_m2 = 15.9;
    const ds::FlightState y =
        ds::make_flight_state(30000.0, ds::degrees_to_radians(10.0), 0.0, 2500.0,
                              ds::degrees_to_radians(-12.0), ds::degrees_to_radians(80.0), 900.0);
    const ds::FlightConditions all = ds::flight_conditions(model, stage, y);
    REQUIRE(all.drag_N > 0.0);
    REQUIRE(all.convective_heat_flux_W_m2 > 0.0);
    REQUIRE(all.thrust_coefficient > 0.0);
    using Parts = ds::ConditionParts;
    for (const Parts parts : {Parts::air, Parts::forces, Parts::heating, Parts::all}) {
        CAPTURE(static_cast<int>(parts));
        const ds::FlightConditions c = ds::flight_conditions(model, stage, y, parts);
        CHECK(c.air_velocity_m_s == all.air_velocity_m_s);
        CHECK(c.mach == all.mach);
        CHECK(c.dynamic_pressure_Pa == all.dynamic_pressure_Pa);
        CHECK(c.density_kg_m3 == all.density_kg_m3);
        CHECK(c.gravity_m_s2 == all.gravity_m_s2);
        const bool forces = parts == Parts::forces || parts == Parts::all;
        const bool heating = parts == Parts::heating || parts == Parts::all;
        CHECK(c.drag_N == (forces ? all.drag_N : 0.0));
        CHECK(c.lift_N == (forces ? all.lift_N : 0.0));
        CHECK(c.deceleration_g == (forces ? all.deceleration_g : 0.0));
        CHECK(c.sensed_deceleration_g == (forces ? all.sensed_deceleration_g : 0.0));
        CHECK(c.thrust_coefficient == (forces ? all.thrust_coefficient : 0.0));
        CHECK(c.convective_heat_flux_W_m2 == (heating ? all.convective_heat_flux_W_m2 : 0.0));
        CHECK(c.radiative_heat_flux_W_m2 == (heating ? all.radiative_heat_flux_W_m2 : 0.0));
    }
}
