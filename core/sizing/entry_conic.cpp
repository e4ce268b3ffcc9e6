#include "sizing/entry_conic.hpp"

#include <cmath>

#include "constants.hpp"

namespace ds {

std::optional<EntryConic> entry_conic(const Design& design, const Body& body) {
    const EntryDesign& e = design.entry;
    const double interface_radius = body.radius_m + e.interface_altitude_m;
    EntryConic out;
    if (e.approach) {
        const ApproachDesign& a = *e.approach;
        out.arrival =
            a.periapsis_altitude_m
                ? arrival_through_periapsis(body.mu_m3_s2, a.v_infinity_m_s,
                                            body.radius_m + *a.periapsis_altitude_m,
                                            interface_radius)
                : arrival_at_angle(body.mu_m3_s2, a.v_infinity_m_s,
                                   degrees_to_radians(a.flight_path_angle_deg.value_or(0.0)),
                                   interface_radius);
        out.speed_m_s = out.arrival->interface_speed_m_s;
        out.flight_path_angle_rad = out.arrival->interface_flight_path_angle_rad;
        return out;
    }
    if (e.orbit) {
        const OrbitDesign& o = *e.orbit;
        out.deorbit = deorbit_at_apoapsis(body.mu_m3_s2, body.radius_m + o.periapsis_altitude_m,
                                          body.radius_m + o.apoapsis_altitude_m, interface_radius,
                                          degrees_to_radians(o.flight_path_angle_deg));
        out.speed_m_s = out.deorbit->interface_speed_m_s;
        // The angle asked for, which the transfer's own (through an arccosine) meets to
        // round-off.
        out.flight_path_angle_rad = degrees_to_radians(o.flight_path_angle_deg);
        return out;
    }
    return std::nullopt;
}

double deorbit_propellant_kg(double after_kg, double delta_v_m_s, double isp_s) {
    return after_kg * std::expm1(delta_v_m_s / (isp_s * standard_gravity_m_s2));
}

}  // namespace ds
