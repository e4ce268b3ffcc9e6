#pragma once

// The columns of a trajectory history sample, in the order the results file and the sheet's CSV
// write them: what the results and sheet suites both hold the written history to.

#include <array>

namespace ds::test {

inline constexpr std::array<const char*, 17> history_columns{"time_s",
                                                             "altitude_m",
                                                             "downrange_m",
                                                             "velocity_m_s",
                                                             "flight_path_angle_deg",
                                                             "mach",
                                                             "dynamic_pressure_Pa",
                                                             "deceleration_g",
                                                             "heat_flux_W_cm2",
                                                             "radiative_heat_flux_W_cm2",
                                                             "latitude_deg",
                                                             "longitude_deg",
                                                             "azimuth_deg",
                                                             "crossrange_m",
                                                             "throttle",
                                                             "thrust_coefficient",
                                                             "sensed_deceleration_g"};

}  // namespace ds::test
