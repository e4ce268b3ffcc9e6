#pragma once

namespace ds {

/// Two-body conics about a spherical body of gravitational parameter mu: where an arrival or a
/// deorbit burn meets the entry interface. Vis-viva (v^2 = mu (2/r - 1/a)) gives the speed at a
/// radius, the angular momentum (h = r v cos(gamma), the same at every point) the flight-path
/// angle there. Radii are from the body's centre, m; angles rad, negative below the local
/// horizontal. The state is inertial; the interface is crossed on the way in.

/// A hyperbolic arrival: the conic of an excess speed and a periapsis, and where it crosses the
/// interface radius.
struct HyperbolicArrival {
    double v_infinity_m_s = 0.0;
    double periapsis_radius_m = 0.0;  ///< of the conic in vacuum (the atmosphere cuts it short)
    double semi_major_axis_m = 0.0;   ///< -mu / v_inf^2 (negative: a hyperbola)
    double eccentricity = 0.0;        ///< 1 + r_p v_inf^2 / mu
    double impact_parameter_m = 0.0;  ///< the asymptote's miss distance, h / v_inf
    double turn_angle_rad = 0.0;      ///< between the asymptotes, 2 asin(1 / e)
    double interface_radius_m = 0.0;
    double interface_speed_m_s = 0.0;              ///< vis-viva at the interface
    double interface_flight_path_angle_rad = 0.0;  ///< negative: inbound
    double interface_true_anomaly_rad = 0.0;       ///< negative: before periapsis
};

/// The arrival with a given vacuum periapsis (which must lie below the interface, and at or
/// above the centre).
HyperbolicArrival arrival_through_periapsis(double mu_m3_s2, double v_infinity_m_s,
                                            double periapsis_radius_m, double interface_radius_m);

/// The arrival that crosses the interface at a given (negative) flight-path angle.
HyperbolicArrival arrival_at_angle(double mu_m3_s2, double v_infinity_m_s,
                                   double flight_path_angle_rad, double interface_radius_m);

/// A deorbit burn: from an orbit of periapsis r_p and apoapsis r_a (both at or above the
/// interface), a tangential impulse at apoapsis that lowers the periapsis so that the new
/// ellipse crosses the interface at the flight-path angle wanted.
struct DeorbitBurn {
    double orbit_periapsis_radius_m = 0.0;
    double orbit_apoapsis_radius_m = 0.0;
    double speed_before_m_s = 0.0;             ///< at apoapsis on the orbit
    double speed_after_m_s = 0.0;              ///< at apoapsis on the transfer ellipse
    double delta_v_m_s = 0.0;                  ///< speed_before - speed_after
    double transfer_periapsis_radius_m = 0.0;  ///< in vacuum
    double transfer_semi_major_axis_m = 0.0;
    double transfer_eccentricity = 0.0;
    double interface_radius_m = 0.0;
    double interface_speed_m_s = 0.0;
    double interface_flight_path_angle_rad = 0.0;
    double interface_true_anomaly_rad = 0.0;  ///< negative: before the transfer's periapsis
    /// The angle travelled about the centre from the burn to the interface, rad.
    double transfer_angle_rad = 0.0;
    /// The coast from the burn to the interface, s (Kepler's equation).
    double coast_s = 0.0;
};

DeorbitBurn deorbit_at_apoapsis(double mu_m3_s2, double periapsis_radius_m,
                                double apoapsis_radius_m, double interface_radius_m,
                                double flight_path_angle_rad);

}  // namespace ds
