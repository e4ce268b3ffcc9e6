#include "checks/limits.hpp"

#include <array>

namespace ds {

std::span<const LimitField> limit_fields() {
    static constexpr std::array fields{
        LimitField{"ballistic_coefficient_max_kg_m2", &Limits::ballistic_coefficient_max_kg_m2, "kg/m^2"},
        LimitField{"aeroshell_diameter_max_m", &Limits::aeroshell_diameter_max_m, "m"},
        LimitField{"heritage_half_angle_deg", &Limits::heritage_half_angle_deg, "deg"},
        LimitField{"parachute_diameter_max_m", &Limits::parachute_diameter_max_m, "m"},
        LimitField{"deploy_mach_max", &Limits::deploy_mach_max, ""},
        LimitField{"deploy_dynamic_pressure_min_Pa", &Limits::deploy_dynamic_pressure_min_Pa, "Pa"},
        LimitField{"deploy_dynamic_pressure_max_Pa", &Limits::deploy_dynamic_pressure_max_Pa, "Pa"},
        LimitField{"peak_deceleration_max_g", &Limits::peak_deceleration_max_g, "g"},
        LimitField{"peak_heat_flux_max_W_cm2", &Limits::peak_heat_flux_max_W_cm2, "W/cm^2"},
        LimitField{"site_elevation_max_m", &Limits::site_elevation_max_m, "m"},
        LimitField{"landed_mass_max_kg", &Limits::landed_mass_max_kg, "kg"},
        LimitField{"touchdown_velocity_max_m_s", &Limits::touchdown_velocity_max_m_s, "m/s"},
        LimitField{"airbag_impact_velocity_max_m_s", &Limits::airbag_impact_velocity_max_m_s, "m/s"},
        LimitField{"touchdown_horizontal_velocity_max_m_s",
                   &Limits::touchdown_horizontal_velocity_max_m_s, "m/s"},
        LimitField{"airbag_release_horizontal_velocity_max_m_s",
                   &Limits::airbag_release_horizontal_velocity_max_m_s, "m/s"},
        LimitField{"tethered_horizontal_velocity_max_m_s",
                   &Limits::tethered_horizontal_velocity_max_m_s, "m/s"},
        LimitField{"canopy_touchdown_horizontal_velocity_max_m_s",
                   &Limits::canopy_touchdown_horizontal_velocity_max_m_s, "m/s"},
        LimitField{"timeline_margin_min_s", &Limits::timeline_margin_min_s, "s"},
        LimitField{"marginal_band", &Limits::marginal_band, ""},
    };
    return fields;
}

}  // namespace ds
