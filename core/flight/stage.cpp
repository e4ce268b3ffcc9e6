#include "flight/stage.hpp"

#include <algorithm>
#include <cmath>

#include "aeroshell/sphere_cone.hpp"

namespace ds {

namespace {

/// The table's factor at a Mach number: linear between points, flat outside them.
double table_factor(std::span<const MachPoint> mach_factor, double mach) {
    if (mach_factor.empty())
        return 1.0;
    // NaN compares false with every entry: without this the search below runs off the table.
    if (std::isnan(mach))
        return mach;
    if (mach <= mach_factor.front().mach)
        return mach_factor.front().factor;
    if (mach >= mach_factor.back().mach)
        return mach_factor.back().factor;
    const auto upper = std::upper_bound(mach_factor.begin(), mach_factor.end(), mach,
                                        [](double m, const MachPoint& p) { return m < p.mach; });
    const auto lower = upper - 1;
    const double w = (mach - lower->mach) / (upper->mach - lower->mach);
    return lower->factor + w * (upper->factor - lower->factor);
}

}  // namespace

void DragDevice::follow_stagnation_pressure(double gamma) {
    stagnation_gamma = gamma;
    stagnation_limit = stagnation_pressure_coefficient_limit(gamma);
}

double DragDevice::drag_coefficient_at(double mach) const {
    // A device whose drag is not kept (a powered descent's aeroshell, drag_preservation 0)
    // skips its Mach law; a Mach number that is not finite still reaches it.
    if (drag_coefficient == 0.0 && std::isfinite(mach))
        return 0.0;
    double cd = drag_coefficient * table_factor(mach_factor, mach);
    if (stagnation_gamma > 0.0)
        cd *= stagnation_pressure_coefficient_at(stagnation_gamma, mach) / stagnation_limit;
    return cd;
}

double Stage::drag_area_m2(double mach) const {
    double sum = 0.0;
    for (const DragDevice& device : drag_devices)
        sum += device.drag_area_m2(mach);
    return sum;
}

}  // namespace ds
