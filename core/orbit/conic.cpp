#include "orbit/conic.hpp"

#include <algorithm>
#include <cmath>

#include "constants.hpp"

namespace ds {
namespace {

/// acos clamped to [-1, 1]: round-off must not make a grazing crossing undefined.
double clamped_acos(double x) {
    return std::acos(std::clamp(x, -1.0, 1.0));
}

/// Vis-viva: the speed at radius r on a conic of semi-major axis a (negative: a hyperbola),
/// written with the energy 2 epsilon = -mu / a so that a parabola is no special case.
double vis_viva_m_s(double mu, double twice_energy, double r) {
    return std::sqrt(twice_energy + 2.0 * mu / r);
}

/// The figures of a hyperbola of excess speed v_inf and angular momentum h, and its crossing of
/// the interface radius on the way in.
HyperbolicArrival arrival_of(double mu, double v_infinity, double h, double interface_radius) {
    HyperbolicArrival out;
    out.v_infinity_m_s = v_infinity;
    out.interface_radius_m = interface_radius;
    // e^2 = 1 + 2 epsilon h^2 / mu^2 with epsilon = v_inf^2 / 2; r_p = h^2 / (mu (1 + e)),
    // which stays exact as v_inf goes to zero (where -mu / v_inf^2 does not).
    out.eccentricity = std::sqrt(1.0 + v_infinity * v_infinity * h * h / (mu * mu));
    out.periapsis_radius_m = h * h / (mu * (1.0 + out.eccentricity));
    out.semi_major_axis_m = -mu / (v_infinity * v_infinity);
    out.impact_parameter_m = h / v_infinity;
    out.turn_angle_rad = 2.0 * std::asin(1.0 / out.eccentricity);
    out.interface_speed_m_s = vis_viva_m_s(mu, v_infinity * v_infinity, interface_radius);
    out.interface_flight_path_angle_rad =
        -clamped_acos(h / (interface_radius * out.interface_speed_m_s));
    const double semi_latus_rectum = h * h / mu;
    out.interface_true_anomaly_rad =
        -clamped_acos((semi_latus_rectum / interface_radius - 1.0) / out.eccentricity);
    return out;
}

}  // namespace

HyperbolicArrival arrival_through_periapsis(double mu_m3_s2, double v_infinity_m_s,
                                            double periapsis_radius_m, double interface_radius_m) {
    // h = r_p v_p with v_p^2 = v_inf^2 + 2 mu / r_p, written so that r_p = 0 (a fall straight
    // at the centre) gives h = 0.
    const double h =
        std::sqrt(periapsis_radius_m *
                  (periapsis_radius_m * v_infinity_m_s * v_infinity_m_s + 2.0 * mu_m3_s2));
    return arrival_of(mu_m3_s2, v_infinity_m_s, h, interface_radius_m);
}

HyperbolicArrival arrival_at_angle(double mu_m3_s2, double v_infinity_m_s,
                                   double flight_path_angle_rad, double interface_radius_m) {
    const double v = vis_viva_m_s(mu_m3_s2, v_infinity_m_s * v_infinity_m_s, interface_radius_m);
    const double h = interface_radius_m * v * std::cos(flight_path_angle_rad);
    HyperbolicArrival out = arrival_of(mu_m3_s2, v_infinity_m_s, h, interface_radius_m);
    out.interface_flight_path_angle_rad = flight_path_angle_rad;  // as asked, not via acos
    return out;
}

DeorbitBurn deorbit_at_apoapsis(double mu_m3_s2, double periapsis_radius_m,
                                double apoapsis_radius_m, double interface_radius_m,
                                double flight_path_angle_rad) {
    const double mu = mu_m3_s2;
    const double ra = apoapsis_radius_m;
    const double re = interface_radius_m;
    DeorbitBurn out;
    out.orbit_periapsis_radius_m = periapsis_radius_m;
    out.orbit_apoapsis_radius_m = ra;
    out.interface_radius_m = re;
    // Vis-viva at apoapsis of the orbit: v^2 = mu (2 / r_a - 2 / (r_a + r_p)).
    out.speed_before_m_s =
        std::sqrt(2.0 * mu * periapsis_radius_m / (ra * (ra + periapsis_radius_m)));
    // The transfer keeps r_a as its apoapsis. Its angular momentum r_a v is that of the
    // interface crossing, r_e v_e cos(gamma), and its energy gives v_e^2 = v^2 + 2 mu (1/r_e -
    // 1/r_a): eliminating v_e, v^2 (r_a^2 - r_e^2 cos^2) = 2 mu r_e cos^2 (r_a - r_e) / r_a.
    const double c2 = std::cos(flight_path_angle_rad) * std::cos(flight_path_angle_rad);
    const double v2 = 2.0 * mu * re * c2 * (ra - re) / (ra * (ra * ra - re * re * c2));
    out.speed_after_m_s = std::sqrt(v2);
    out.delta_v_m_s = out.speed_before_m_s - out.speed_after_m_s;
    // Periapsis from apoapsis: r_p = r_a^2 v_a^2 / (2 mu - r_a v_a^2).
    const double rp = ra * ra * v2 / (2.0 * mu - ra * v2);
    out.transfer_periapsis_radius_m = rp;
    const double a = 0.5 * (ra + rp);
    const double e = (ra - rp) / (ra + rp);
    out.transfer_semi_major_axis_m = a;
    out.transfer_eccentricity = e;
    out.interface_speed_m_s = vis_viva_m_s(mu, -mu / a, re);
    out.interface_flight_path_angle_rad =
        -clamped_acos(ra * out.speed_after_m_s / (re * out.interface_speed_m_s));
    const double semi_latus_rectum = a * (1.0 - e * e);
    out.interface_true_anomaly_rad = -clamped_acos((semi_latus_rectum / re - 1.0) / e);
    // From apoapsis (true anomaly -pi) on to the interface.
    out.transfer_angle_rad = pi + out.interface_true_anomaly_rad;
    // Kepler's equation: the eccentric anomaly E (negative inbound), M = E - e sin E, and the
    // mean motion n = sqrt(mu / a^3); apoapsis is at M = -pi.
    const double eccentric = -clamped_acos((1.0 - re / a) / e);
    const double mean = eccentric - e * std::sin(eccentric);
    out.coast_s = (mean + pi) / std::sqrt(mu / (a * a * a));
    return out;
}

}  // namespace ds
