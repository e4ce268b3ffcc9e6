#include "flight/stage.hpp"

#include <algorithm>
#include <cmath>

namespace ds {

double DragDevice::drag_coefficient_at(double mach) const {
    if (mach_factor.empty())
        return drag_coefficient;
    // NaN compares false with every entry: without this the search below runs off the table.
    if (std::isnan(mach))
        return mach;
    if (mach <= mach_factor.front().mach)
        return drag_coefficient * mach_factor.front().factor;
    if (mach >= mach_factor.back().mach)
        return drag_coefficient * mach_factor.back().factor;
    const auto upper = std::upper_bound(mach_factor.begin(), mach_factor.end(), mach,
                                        [](double m, const MachPoint& p) { return m < p.mach; });
    const auto lower = upper - 1;
    const double w = (mach - lower->mach) / (upper->mach - lower->mach);
    return drag_coefficient * (lower->factor + w * (upper->factor - lower->factor));
}

double Stage::drag_area_m2(double mach) const {
    double sum = 0.0;
    for (const DragDevice& device : drag_devices)
        sum += device.drag_area_m2(mach);
    return sum;
}

}  // namespace ds
