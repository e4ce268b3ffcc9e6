#pragma once

namespace ds {

/// What is flying during one phase: its aerodynamics, heating geometry and thrust.
struct Stage {
    double reference_area_m2 = 0.0;  ///< A in drag = 0.5 rho V^2 Cd A
    double drag_coefficient = 0.0;
    double lift_to_drag = 0.0;
    double bank_angle_rad = 0.0;
    double nose_radius_m = 0.0;  ///< 0: no stagnation heating is computed for this stage
    double thrust_N = 0.0;       ///< along the velocity vector, braking
    double specific_impulse_s = 0.0;
};

}  // namespace ds
