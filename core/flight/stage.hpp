#pragma once

#include <cmath>
#include <span>
#include <vector>

namespace ds {

/// A drag coefficient's ratio to its nominal value at a Mach number.
struct MachPoint {
    double mach = 0.0;
    double factor = 1.0;
};

/// One thing that makes drag: an aeroshell, a canopy, an inflatable decelerator.
struct DragDevice {
    double area_m2 = 0.0;           ///< reference area A in drag = q Cd A
    double drag_coefficient = 0.0;  ///< nominal Cd
    /// Cd / nominal against Mach, linear between points and held flat outside them; empty for
    /// a constant Cd. The table must outlive the device (the catalogues' tables are static).
    std::span<const MachPoint> mach_factor;
    /// When positive, the ratio of specific heats of a blunt body's Mach law: Cd further
    /// scales with the stagnation-pressure coefficient at the Mach number over its hypersonic
    /// limit (modified Newtonian theory, see stagnation_pressure_ratio_to_limit); 0 for none.
    /// Set with follow_stagnation_pressure, which keeps the limit beside it.
    double stagnation_gamma = 0.0;
    double stagnation_limit = 0.0;  ///< Cp_max at infinite Mach for stagnation_gamma

    void follow_stagnation_pressure(double gamma);

    double drag_coefficient_at(double mach) const;
    double drag_area_m2(double mach) const { return drag_coefficient_at(mach) * area_m2; }
};

/// A bank angle about the air velocity, with its cosine and sine, taken once where it is set
/// rather than in every evaluation of the equations.
class BankAngle {
public:
    BankAngle(double rad = 0.0) : rad_(rad), cos_(std::cos(rad)), sin_(std::sin(rad)) {}
    double rad() const { return rad_; }
    double cos() const { return cos_; }
    double sin() const { return sin_; }

private:
    double rad_;
    double cos_;
    double sin_;
};

/// What is flying during one phase: its drag devices, lift, heating geometry and thrust.
struct Stage {
    std::vector<DragDevice> drag_devices;
    double lift_to_drag = 0.0;   ///< lift over the total drag
    BankAngle bank;              ///< set from radians
    double nose_radius_m = 0.0;  ///< 0: no stagnation heating is computed for this stage
    double thrust_N = 0.0;       ///< along the velocity vector, braking
    double specific_impulse_s = 0.0;
    /// Thrust against the velocity through the air (a gravity turn flown into the flow)
    /// instead of against the velocity over the ground.
    bool thrust_against_air = false;
    /// For the record: the thrust over the engines' full thrust, and the reference area of the
    /// thrust coefficient C_T = T / (q A) (0: none is recorded).
    double throttle = 0.0;
    double thrust_reference_area_m2 = 0.0;

    /// Sum of Cd A over the devices at a Mach number, m^2.
    double drag_area_m2(double mach) const;
};

}  // namespace ds
