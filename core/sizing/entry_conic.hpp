#pragma once

#include <optional>

#include "body/body.hpp"
#include "design/design.hpp"
#include "orbit/conic.hpp"

namespace ds {

/// The conic an entry starts from, when the design gives an approach or an orbit: the arrival
/// or the deorbit burn, and the inertial state it gives at the interface.
struct EntryConic {
    std::optional<HyperbolicArrival> arrival;
    std::optional<DeorbitBurn> deorbit;
    double speed_m_s = 0.0;              ///< inertial, at the interface
    double flight_path_angle_rad = 0.0;  ///< inertial, negative
};

/// The design's conic about the body (its GM and radius), or none for a state given at the
/// interface.
std::optional<EntryConic> entry_conic(const Design& design, const Body& body);

/// The propellant a deorbit burn of delta_v burns from a stack that keeps `after_kg` (the entry
/// mass and the deorbit stage's dry mass): the rocket equation, impulsive.
double deorbit_propellant_kg(double after_kg, double delta_v_m_s, double isp_s);

}  // namespace ds
