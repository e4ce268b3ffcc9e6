#pragma once

#include <array>
#include <string_view>

#include "flight/trajectory_sample.hpp"

namespace ds {

/// One figure of a trajectory sample as the documents name it: the key of the results' history
/// and the column of the sheet's CSV (the unit is in the name, as in every document key).
struct HistoryColumn {
    std::string_view key;
    double TrajectorySample::*value;
};

/// The history's figures in the order both documents write them.
inline constexpr std::array<HistoryColumn, 17> history_columns{{
    {"time_s", &TrajectorySample::time_s},
    {"altitude_m", &TrajectorySample::altitude_m},
    {"downrange_m", &TrajectorySample::downrange_m},
    {"velocity_m_s", &TrajectorySample::velocity_m_s},
    {"flight_path_angle_deg", &TrajectorySample::flight_path_angle_deg},
    {"mach", &TrajectorySample::mach},
    {"dynamic_pressure_Pa", &TrajectorySample::dynamic_pressure_Pa},
    {"deceleration_g", &TrajectorySample::deceleration_g},
    {"heat_flux_W_cm2", &TrajectorySample::heat_flux_W_cm2},
    {"radiative_heat_flux_W_cm2", &TrajectorySample::radiative_heat_flux_W_cm2},
    {"latitude_deg", &TrajectorySample::latitude_deg},
    {"longitude_deg", &TrajectorySample::longitude_deg},
    {"azimuth_deg", &TrajectorySample::azimuth_deg},
    {"crossrange_m", &TrajectorySample::crossrange_m},
    {"throttle", &TrajectorySample::throttle},
    {"thrust_coefficient", &TrajectorySample::thrust_coefficient},
    {"sensed_deceleration_g", &TrajectorySample::sensed_deceleration_g},
}};

}  // namespace ds
