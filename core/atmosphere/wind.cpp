#include "atmosphere/wind.hpp"

#include <algorithm>

namespace ds {

WindProfile::WindProfile(std::vector<WindRow> rows, double scale)
    : rows_(std::move(rows)), scale_(scale) {
    std::sort(rows_.begin(), rows_.end(),
              [](const WindRow& a, const WindRow& b) { return a.altitude_m < b.altitude_m; });
}

WindVelocity WindProfile::at(double altitude_m) const {
    if (rows_.empty())
        return {};
    const auto scaled = [&](const WindRow& r) {
        return WindVelocity{scale_ * r.east_m_s, scale_ * r.north_m_s};
    };
    // NaN compares false with every row: held at the lowest, like any altitude below it.
    if (!(altitude_m > rows_.front().altitude_m))
        return scaled(rows_.front());
    if (altitude_m >= rows_.back().altitude_m)
        return scaled(rows_.back());
    const auto upper =
        std::upper_bound(rows_.begin(), rows_.end(), altitude_m,
                         [](double h, const WindRow& r) { return h < r.altitude_m; });
    const auto lower = upper - 1;
    const double w = (altitude_m - lower->altitude_m) / (upper->altitude_m - lower->altitude_m);
    return {scale_ * (lower->east_m_s + w * (upper->east_m_s - lower->east_m_s)),
            scale_ * (lower->north_m_s + w * (upper->north_m_s - lower->north_m_s))};
}

}  // namespace ds
