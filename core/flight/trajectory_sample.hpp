#pragma once

namespace ds {

/// One point of the flown trajectory, for plots and the sheet. Velocity, flight-path angle
/// and azimuth are planet-relative; Mach and dynamic pressure are of the air-relative speed.
struct TrajectorySample {
    double time_s = 0.0;
    double altitude_m = 0.0;
    double downrange_m = 0.0;  ///< along the entry's great circle, at the reference radius
    double velocity_m_s = 0.0;
    double flight_path_angle_deg = 0.0;
    double mach = 0.0;
    double dynamic_pressure_Pa = 0.0;
    double deceleration_g = 0.0;
    double heat_flux_W_cm2 = 0.0;  ///< convective
    double radiative_heat_flux_W_cm2 = 0.0;
    double latitude_deg = 0.0;
    double longitude_deg = 0.0;
    double azimuth_deg = 0.0;   ///< clockwise from north
    double crossrange_m = 0.0;  ///< across the entry's great circle, positive to the right
    double throttle = 0.0;      ///< thrust over full thrust; 0 with the engines off
    /// T / (q A) on the aeroshell's frontal area, during a burn into the flow; 0 otherwise.
    double thrust_coefficient = 0.0;
    /// What the vehicle feels: drag, lift and thrust over its weight (g0); `deceleration_g`
    /// with the thrust added during a burn, the same without one.
    double sensed_deceleration_g = 0.0;
};

}  // namespace ds
