#include "parachute/canopy.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include "constants.hpp"

namespace ds {
namespace {

// Disk-gap-band Cd against Mach, as a ratio to the subsonic value. Shape from memory of
// published wind-tunnel and flight trends: flat to Mach 0.8, about 0.78 of subsonic by Mach 2;
// with Cd0 0.55 it stays inside the published transonic 0.2-0.5 and supersonic 0.3-0.5 bands
// (Lingard; Maydew, Peterson and Orlik-Rueckemann, AGARD-AG-319).
constexpr std::array disk_gap_band_mach{MachPoint{0.0, 1.0},  MachPoint{0.8, 1.0},
                                        MachPoint{1.2, 0.91}, MachPoint{1.6, 0.84},
                                        MachPoint{2.0, 0.78}, MachPoint{2.5, 0.72}};

}  // namespace

std::span<const CanopyType> canopy_types() {
    static constexpr std::array types{
        // Cd 0.53-0.58 subsonic (AGARD-AG-319, 1991); opening load factor about 1.3 (Knacke,
        // NWC TP 6575; from memory); fill constant 8 and 0.20 kg/m^2 from memory (common
        // practice for a supersonic canopy with its lines, riser and bag).
        CanopyType{"disk-gap-band", 0.55, disk_gap_band_mach, 1.3, 8.0, 0.20,
                   "AGARD-AG-319 (1991) drag; Knacke NWC TP 6575 opening load (from memory)", true},
        // Cd 0.75-0.90, opening load factor about 1.1, fill constant about 7 (Knacke, NWC TP
        // 6575; from memory); subsonic only, so no Mach table; 0.15 kg/m^2 (common practice).
        CanopyType{"ringsail", 0.80, {}, 1.1, 7.0, 0.15, "Knacke NWC TP 6575 (from memory)", false},
    };
    return types;
}

std::optional<CanopyType> canopy_type(std::string_view name) {
    const auto types = canopy_types();
    const auto it = std::find_if(types.begin(), types.end(),
                                 [&](const CanopyType& t) { return t.name == name; });
    if (it == types.end())
        return std::nullopt;
    return *it;
}

DragDevice canopy_device(const CanopyType& type, double diameter_m, double drag_coefficient) {
    return {pi * diameter_m * diameter_m / 4.0, drag_coefficient, type.mach_factor};
}

double opening_load_N(const CanopyType& type, double dynamic_pressure_Pa, double mach,
                      double diameter_m, double drag_coefficient) {
    return type.opening_load_factor * dynamic_pressure_Pa *
           canopy_device(type, diameter_m, drag_coefficient).drag_area_m2(mach);
}

double inflation_time_s(const CanopyType& type, double diameter_m, double velocity_m_s) {
    return type.fill_constant * diameter_m / velocity_m_s;
}

double canopy_mass_kg(const CanopyType& type, double diameter_m) {
    return type.areal_mass_kg_m2 * pi * diameter_m * diameter_m / 4.0;
}

double canopy_diameter_for_velocity(double suspended_mass_kg, double gravity_m_s2,
                                    double density_kg_m3, double velocity_m_s,
                                    double drag_coefficient, double drag_area_below_m2) {
    const double needed_drag_area =
        2.0 * suspended_mass_kg * gravity_m_s2 / (density_kg_m3 * velocity_m_s * velocity_m_s);
    const double canopy_area = (needed_drag_area - drag_area_below_m2) / drag_coefficient;
    if (canopy_area <= 0.0)
        return 0.0;
    return std::sqrt(4.0 * canopy_area / pi);
}

}  // namespace ds
