#include "atmosphere/us_standard_1976.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>
#include <utility>
#include <vector>

#include "atmosphere/monotone_cubic.hpp"
#include "constants.hpp"

namespace ds {
namespace {

// Defining constants of the US Standard Atmosphere, 1976 (NOAA/NASA/USAF), Part 1.
constexpr double effective_earth_radius_m = 6356766.0;    // r0, for geopotential altitude
constexpr double g0_m_s2 = standard_gravity_m_s2;         // the standard's g0 = 9.80665
constexpr double gas_constant_star_J_kmolK = 8314.32;     // R*, the standard's value
constexpr double sea_level_molar_mass_kg_kmol = 28.9644;  // M0
constexpr double sea_level_pressure_Pa = 101325.0;
constexpr double sea_level_temperature_K = 288.15;

// Air's specific gas constant R*/M0 = 287.053 J/(kg K) (the "287.05" usually quoted) and its
// ratio of specific heats, 1.4, as the standard uses for the speed of sound.
constexpr double air_gas_constant_J_kgK = gas_constant_star_J_kmolK / sea_level_molar_mass_kg_kmol;
constexpr double air_gamma = 1.4;

// g0 M0 / R*, in K/m: the hydrostatic exponent of every layer.
constexpr double hydrostatic_constant_K_m =
    g0_m_s2 * sea_level_molar_mass_kg_kmol / gas_constant_star_J_kmolK;

// Top of the layer model: 86 km geometric (84.852 km geopotential).
constexpr double layer_model_top_m = 86000.0;

// The seven layers: base geopotential altitude (m') and molecular-scale temperature gradient
// (K/m'), from the standard's Table 4. Base temperatures and pressures follow from these and
// the sea-level values, so they are derived below rather than typed in.
struct LayerDefinition {
    double base_geopotential_m;
    double lapse_rate_K_m;
};
constexpr std::size_t layer_count = 7;
constexpr std::array<LayerDefinition, layer_count> layer_definitions{{
    {0.0, -6.5e-3},
    {11000.0, 0.0},
    {20000.0, 1.0e-3},
    {32000.0, 2.8e-3},
    {47000.0, 0.0},
    {51000.0, -2.8e-3},
    {71000.0, -2.0e-3},
}};

struct Layer {
    double base_geopotential_m;
    double lapse_rate_K_m;
    double base_temperature_K;  // molecular-scale temperature
    double base_pressure_Pa;
};

/// Molecular-scale temperature and pressure at a geopotential height within (or, for the first
/// and last layers, beyond) one layer.
struct LayerState {
    double temperature_K;
    double pressure_Pa;
};

LayerState state_in_layer(const Layer& layer, double geopotential_m) {
    const double rise_m = geopotential_m - layer.base_geopotential_m;
    if (layer.lapse_rate_K_m == 0.0) {
        return {layer.base_temperature_K,
                layer.base_pressure_Pa *
                    std::exp(-hydrostatic_constant_K_m * rise_m / layer.base_temperature_K)};
    }
    const double temperature_K = layer.base_temperature_K + layer.lapse_rate_K_m * rise_m;
    return {temperature_K,
            layer.base_pressure_Pa * std::pow(layer.base_temperature_K / temperature_K,
                                              hydrostatic_constant_K_m / layer.lapse_rate_K_m)};
}

std::array<Layer, layer_count> build_layers() {
    std::array<Layer, layer_count> layers{};
    Layer below{0.0, layer_definitions[0].lapse_rate_K_m, sea_level_temperature_K,
                sea_level_pressure_Pa};
    for (std::size_t i = 0; i < layer_count; ++i) {
        const LayerDefinition& definition = layer_definitions[i];
        const LayerState base = state_in_layer(below, definition.base_geopotential_m);
        layers[i] = {definition.base_geopotential_m, definition.lapse_rate_K_m, base.temperature_K,
                     base.pressure_Pa};
        below = layers[i];
    }
    return layers;
}

const std::array<Layer, layer_count>& layers() {
    static const std::array<Layer, layer_count> table = build_layers();
    return table;
}

double geopotential_altitude_m(double geometric_m) {
    return effective_earth_radius_m * geometric_m / (effective_earth_radius_m + geometric_m);
}

/// The layer model at a geometric altitude up to 86 km (the first layer extended below 0).
LayerState layer_model_state(double geometric_m) {
    const double geopotential_m = geopotential_altitude_m(geometric_m);
    const auto& all = layers();
    std::size_t i = layer_count - 1;
    while (i > 0 && geopotential_m < all[i].base_geopotential_m) {
        --i;
    }
    return state_in_layer(all[i], geopotential_m);
}

/// rho = p M0 / (R* T_M): exact in the layer model, since the standard defines the
/// molecular-scale temperature T_M = T M0 / M for this purpose.
double layer_model_density_kg_m3(const LayerState& state) {
    return state.pressure_Pa * sea_level_molar_mass_kg_kmol /
           (gas_constant_star_J_kmolK * state.temperature_K);
}

// Between 80 and 86 km the standard's kinetic temperature departs from the molecular-scale
// one as the molar mass begins to fall: T = T_M M / M0, with M / M0 tabulated every 0.5 km
// (the standard's table of the ratio; values as transcribed in the open-source COESA.jl
// package, the standard itself not re-read), linear between the points (our choice).
constexpr double molar_mass_ratio_start_m = 80000.0;
constexpr double molar_mass_ratio_step_m = 500.0;
constexpr std::array<double, 13> molar_mass_ratio{{1.0, 0.999996, 0.999989, 0.999971, 0.999941,
                                                   0.999909, 0.999870, 0.999829, 0.999786, 0.999741,
                                                   0.999694, 0.999641, 0.999579}};

double molar_mass_ratio_at(double geometric_m) {
    if (geometric_m <= molar_mass_ratio_start_m) {
        return molar_mass_ratio.front();
    }
    const double position = (geometric_m - molar_mass_ratio_start_m) / molar_mass_ratio_step_m;
    const auto last = molar_mass_ratio.size() - 1;
    const auto i = std::min(static_cast<std::size_t>(position), last - 1);
    const double fraction = std::min(position - static_cast<double>(i), 1.0);
    return molar_mass_ratio[i] + fraction * (molar_mass_ratio[i + 1] - molar_mass_ratio[i]);
}

// Above 86 km: the standard's defining kinetic-temperature profile in geometric altitude
// (its Part 1, equations for 86-1000 km; the constants as transcribed in COESA.jl, which
// agree with the standard's tabulated 195.08 K at 100 km and 854.56 K at 200 km):
// isothermal 86-91 km; an ellipse T = Tc + A sqrt(1 - ((Z - 91 km) / a)^2) over 91-110 km;
// +12 K/km over 110-120 km; above, T = Tinf - (Tinf - T10) exp(-lambda xi) with
// xi = (Z - 120 km)(r0 + 120 km) / (r0 + Z).
constexpr double isothermal_top_m = 91000.0;
constexpr double isothermal_temperature_K = 186.8673;
constexpr double ellipse_centre_temperature_K = 263.1905;  // Tc
constexpr double ellipse_amplitude_K = -76.3232;           // A
constexpr double ellipse_semi_axis_m = -19942.9;           // a
constexpr double linear_base_m = 110000.0;
constexpr double linear_base_temperature_K = 240.0;
constexpr double linear_gradient_K_m = 12.0e-3;
constexpr double exponential_base_m = 120000.0;
constexpr double exponential_base_temperature_K = 360.0;  // T10
constexpr double exospheric_temperature_K = 1000.0;       // Tinf
constexpr double exponential_rate_per_m = 0.01875e-3;     // lambda

double upper_temperature_K(double geometric_m) {
    if (geometric_m <= isothermal_top_m) {
        return isothermal_temperature_K;
    }
    if (geometric_m <= linear_base_m) {
        const double x = (geometric_m - isothermal_top_m) / ellipse_semi_axis_m;
        return ellipse_centre_temperature_K + ellipse_amplitude_K * std::sqrt(1.0 - x * x);
    }
    if (geometric_m <= exponential_base_m) {
        return linear_base_temperature_K + linear_gradient_K_m * (geometric_m - linear_base_m);
    }
    const double xi = (geometric_m - exponential_base_m) *
                      (effective_earth_radius_m + exponential_base_m) /
                      (effective_earth_radius_m + geometric_m);
    return exospheric_temperature_K - (exospheric_temperature_K - exponential_base_temperature_K) *
                                          std::exp(-exponential_rate_per_m * xi);
}

// The standard's tabulated pressure and mean molar mass at its own altitudes from 86 to
// 1000 km (the standard's tables in geometric altitude; values as transcribed in the
// open-source COESA.jl package, the standard itself not re-read; with the temperature below
// they give the standard's printed densities at its altitudes within the rounding of the
// printed molar mass, e.g. 2.541e-10 kg/m^3 at 200 km and 3.561e-15 at 1000 km, and between
// them within 0.2 %, e.g. 5.604e-7 at 100 km: see the tests). The standard obtains them by
// integrating the diffusion of each species; here the density at each altitude is
// p M / (R* T) with the defining temperature above, and ln rho and ln p follow monotone
// cubics through those points (MonotoneCubic): exact at the standard's altitudes, with a
// continuous slope. Above 1000 km (where the standard stops) both continue on their last
// slope and the temperature on its law.
struct UpperLevel {
    double altitude_km;
    double pressure_Pa;
    double molar_mass_kg_kmol;
};
constexpr double metres_per_kilometre = 1000.0;
constexpr std::size_t upper_level_count = 87;
constexpr std::array<UpperLevel, upper_level_count> upper_levels{{
    {86, 3.7338e-1, 28.95},  {87, 3.1259e-1, 28.95},  {88, 2.6173e-1, 28.94},
    {89, 2.1919e-1, 28.93},  {90, 1.8359e-1, 28.91},  {91, 1.5381e-1, 28.89},
    {93, 1.0801e-1, 28.82},  {95, 7.5966e-2, 28.73},  {97, 5.3571e-2, 28.62},
    {99, 3.7948e-2, 28.48},  {101, 2.7192e-2, 28.30}, {103, 1.9742e-2, 28.10},
    {105, 1.4477e-2, 27.88}, {107, 1.0751e-2, 27.64}, {109, 8.1142e-3, 27.39},
    {110, 7.1042e-3, 27.27}, {111, 6.2614e-3, 27.14}, {112, 5.5547e-3, 27.02},
    {113, 4.9570e-3, 26.90}, {114, 4.4473e-3, 26.79}, {115, 4.0096e-3, 26.68},
    {116, 3.6312e-3, 26.58}, {117, 3.3022e-3, 26.48}, {118, 3.0144e-3, 26.38},
    {119, 2.7615e-3, 26.29}, {120, 2.5382e-3, 26.20}, {125, 1.7354e-3, 25.80},
    {130, 1.2505e-3, 25.44}, {135, 9.3568e-4, 25.09}, {140, 7.2028e-4, 24.75},
    {145, 5.6691e-4, 24.42}, {150, 4.5422e-4, 24.10}, {160, 3.0395e-4, 23.49},
    {170, 2.1210e-4, 22.90}, {180, 1.5271e-4, 22.34}, {190, 1.1266e-4, 21.81},
    {200, 8.4736e-5, 21.30}, {210, 6.4756e-5, 20.83}, {220, 5.0149e-5, 20.37},
    {230, 3.9276e-5, 19.95}, {240, 3.1059e-5, 19.56}, {250, 2.4767e-5, 19.19},
    {260, 1.9894e-5, 18.85}, {270, 1.6083e-5, 18.53}, {280, 1.3076e-5, 18.24},
    {290, 1.0683e-5, 17.97}, {300, 8.7704e-6, 17.73}, {310, 7.2285e-6, 17.50},
    {320, 5.9796e-6, 17.29}, {330, 4.9630e-6, 17.09}, {340, 4.1320e-6, 16.91},
    {350, 3.4498e-6, 16.74}, {360, 2.8878e-6, 16.57}, {370, 2.4234e-6, 16.42},
    {380, 2.0384e-6, 16.27}, {390, 1.7184e-6, 16.13}, {400, 1.4518e-6, 15.98},
    {410, 1.2291e-6, 15.84}, {420, 1.0427e-6, 15.70}, {430, 8.8645e-7, 15.55},
    {440, 7.5517e-7, 15.40}, {450, 6.4468e-7, 15.25}, {460, 5.5155e-7, 15.08},
    {470, 4.7292e-7, 14.91}, {480, 4.0642e-7, 14.73}, {490, 3.5011e-7, 14.54},
    {500, 3.0236e-7, 14.33}, {525, 2.1200e-7, 13.76}, {550, 1.5137e-7, 13.09},
    {575, 1.1028e-7, 12.34}, {600, 8.2130e-8, 11.51}, {625, 6.2601e-8, 10.62},
    {650, 4.8865e-8, 9.72},  {675, 3.9048e-8, 8.83},  {700, 3.1908e-8, 8.00},
    {725, 2.6611e-8, 7.24},  {750, 2.2599e-8, 6.58},  {775, 1.9493e-8, 6.01},
    {800, 1.7036e-8, 5.54},  {825, 1.5051e-8, 5.16},  {850, 1.3415e-8, 4.85},
    {875, 1.2043e-8, 4.60},  {900, 1.0873e-8, 4.40},  {925, 9.8635e-9, 4.25},
    {950, 8.9816e-9, 4.12},  {975, 8.2043e-9, 4.02},  {1000, 7.5138e-9, 3.94},
}};

/// ln rho and ln p above 86 km. At 86 km the points are the layer model's own density and
/// pressure, so both are continuous there (the table's 86 km pressure, 0.37338 Pa, is the
/// layer model's to its five figures). The pressure's first slope is the layer model's,
/// -g M / (R* T), which is continuous since the temperature is. The density's slope is not,
/// in the standard itself: its temperature gradient changes at 86 km from -2 K/km' to 0, so
/// d(ln rho)/dZ steps from -1.675e-4 to -1.776e-4 per m (6 %); the density's first slope is
/// the cubic's own end estimate, which follows the standard's isothermal layer.
struct UpperProfile {
    MonotoneCubic log_density;
    MonotoneCubic log_pressure;
};

UpperProfile build_upper_profile() {
    std::vector<double> altitudes_m;
    std::vector<double> log_densities;
    std::vector<double> log_pressures;
    for (const UpperLevel& level : upper_levels) {
        const double altitude_m = level.altitude_km * metres_per_kilometre;
        altitudes_m.push_back(altitude_m);
        log_pressures.push_back(std::log(level.pressure_Pa));
        log_densities.push_back(
            std::log(level.pressure_Pa * level.molar_mass_kg_kmol /
                     (gas_constant_star_J_kmolK * upper_temperature_K(altitude_m))));
    }
    // The layer model at 86 km: d ln p / dZ = -(g0 M0 / (R* T_M)) dH/dZ, with
    // dH/dZ = (r0 / (r0 + Z))^2.
    const LayerState top = layer_model_state(layer_model_top_m);
    const double ratio = effective_earth_radius_m / (effective_earth_radius_m + layer_model_top_m);
    const double log_pressure_slope = -hydrostatic_constant_K_m / top.temperature_K * ratio * ratio;
    log_pressures.front() = std::log(top.pressure_Pa);
    log_densities.front() = std::log(layer_model_density_kg_m3(top));
    return {MonotoneCubic(altitudes_m, log_densities),
            MonotoneCubic(std::move(altitudes_m), std::move(log_pressures), log_pressure_slope)};
}

const UpperProfile& upper_profile() {
    static const UpperProfile profile = build_upper_profile();
    return profile;
}

}  // namespace

UsStandardAtmosphere1976::UsStandardAtmosphere1976(double density_scale)
    : Atmosphere(air_gas_constant_J_kgK, air_gamma, density_scale) {}

double UsStandardAtmosphere1976::pressure_Pa(double altitude_m) const {
    if (altitude_m <= layer_model_top_m) {
        return layer_model_state(altitude_m).pressure_Pa;
    }
    return std::exp(upper_profile().log_pressure.value(altitude_m));
}

Atmosphere::Profile UsStandardAtmosphere1976::profile(double altitude_m) const {
    if (altitude_m <= layer_model_top_m) {
        // Density from the molecular-scale temperature (exact in the layer model); the kinetic
        // temperature reported, as the standard tabulates it.
        const LayerState state = layer_model_state(altitude_m);
        return {layer_model_density_kg_m3(state),
                state.temperature_K * molar_mass_ratio_at(altitude_m)};
    }
    return {std::exp(upper_profile().log_density.value(altitude_m)),
            upper_temperature_K(altitude_m)};
}

}  // namespace ds
