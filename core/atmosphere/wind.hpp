#pragma once

#include <vector>

namespace ds {

/// A horizontal wind, m/s: east and north components.
struct WindVelocity {
    double east_m_s = 0.0;
    double north_m_s = 0.0;

    bool operator==(const WindVelocity&) const = default;
};

/// One row of a wind table.
struct WindRow {
    double altitude_m = 0.0;
    double east_m_s = 0.0;
    double north_m_s = 0.0;

    bool operator==(const WindRow&) const = default;
};

/// The wind of an atmosphere: rows linear in altitude and held constant outside them (one row:
/// the same wind everywhere), times a scale (the knob dispersions turn). The air turns with
/// the body; this is what moves it besides. Rows by increasing altitude.
class WindProfile {
public:
    WindProfile(std::vector<WindRow> rows, double scale = 1.0);

    WindVelocity at(double altitude_m) const;

private:
    std::vector<WindRow> rows_;
    double scale_;
};

}  // namespace ds
