#include "atmosphere/us_standard_1976.hpp"

#include <array>
#include <cmath>
#include <cstddef>

#include "atmosphere/table.hpp"
#include "constants.hpp"
#include "atmosphere/table_row.hpp"

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

// Above 86 km the standard integrates the diffusion of each species; here its tabulated
// density and kinetic temperature are interpolated (density log-linearly, temperature
// linearly). The values beside the rows are from memory of the standard's tables, not
// re-read. The temperatures agree to 0.01 K with the standard's defining temperature profile
// (isothermal 86-91 km, elliptical 91-110 km, +12 K/km 110-120 km, exponential approach to
// 1000 K above; its constants also from memory) evaluated at each node, which supports them.
// Between nodes the linear temperature departs from that profile by up to about 9 K (near
// 105 km). Above 200 km the last segment is extended: the density keeps its 150-200 km slope
// and the temperature rises past the standard's 1000 K limit (1075 K at 250 km), so the model
// is meant for entries that start at or below 200 km.
constexpr std::size_t upper_row_count = 8;
std::array<AtmosphereRow, upper_row_count> build_upper_rows() {
    // The 86 km row is the layer model itself, so the profile is continuous there. The layer
    // model reports the molecular-scale temperature (186.946 K at 86 km); the standard's
    // kinetic temperature there is 186.87 K (from memory), 0.04 % lower because the molar mass
    // has fallen by the factor 0.999579 between 80 and 86 km (from memory). We keep the
    // molecular-scale temperature below 86 km: with air's constant R it gives the standard's
    // own speed of sound, sqrt(gamma R* T_M / M0), and density and pressure are unaffected.
    const LayerState top = layer_model_state(layer_model_top_m);
    return {{
        {layer_model_top_m, layer_model_density_kg_m3(top), top.temperature_K},
        {90000.0, 3.416e-6, 186.87},    // from memory
        {100000.0, 5.604e-7, 195.08},   // from memory
        {110000.0, 9.708e-8, 240.0},    // from memory
        {120000.0, 2.222e-8, 360.0},    // from memory
        {130000.0, 8.152e-9, 469.27},   // from memory
        {150000.0, 2.076e-9, 634.39},   // from memory
        {200000.0, 2.541e-10, 854.56},  // from memory
    }};
}

const std::array<AtmosphereRow, upper_row_count>& upper_rows() {
    static const std::array<AtmosphereRow, upper_row_count> rows = build_upper_rows();
    return rows;
}

}  // namespace

UsStandardAtmosphere1976::UsStandardAtmosphere1976(double density_scale)
    : Atmosphere(air_gas_constant_J_kgK, air_gamma, density_scale) {}

double UsStandardAtmosphere1976::pressure_Pa(double altitude_m) const {
    if (altitude_m <= layer_model_top_m) {
        return layer_model_state(altitude_m).pressure_Pa;
    }
    // Above 86 km, an approximation: p = rho (R*/M0) T from the table, continuous at 86 km.
    // It ignores the fall of the molar mass above about 90 km (to about 26 kg/kmol at 120 km,
    // from memory), so it understates the pressure by about 10 % at 120 km and more above.
    // Dynamic pressure and heating use density, not this.
    const AtmosphereRow row = interpolate_atmosphere_rows(upper_rows(), altitude_m);
    return row.density_kg_m3 * air_gas_constant_J_kgK * row.temperature_K;
}

Atmosphere::Profile UsStandardAtmosphere1976::profile(double altitude_m) const {
    if (altitude_m <= layer_model_top_m) {
        const LayerState state = layer_model_state(altitude_m);
        return {layer_model_density_kg_m3(state), state.temperature_K};
    }
    const AtmosphereRow row = interpolate_atmosphere_rows(upper_rows(), altitude_m);
    return {row.density_kg_m3, row.temperature_K};
}

}  // namespace ds
