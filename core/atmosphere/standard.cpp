#include "atmosphere/standard.hpp"

#include "atmosphere/exponential.hpp"
#include "atmosphere/mars_reference.hpp"
#include "atmosphere/us_standard_1976.hpp"

namespace ds {
namespace {

// Venus: surface density, scale height and mean surface temperature of the NASA NSSDC Venus
// fact sheet (from memory: about 65 kg/m^3, 15.9 km, 737 K). One scale height for the whole
// atmosphere is crude: the real profile is far from isothermal.
constexpr ExponentialAtmosphere::Parameters venus_parameters{
    .surface_density_kg_m3 = 65.0, .scale_height_m = 15.9e3, .temperature_K = 737.0};

// Titan: all from memory and crude. Surface density about 5.4 kg/m^3 and surface temperature
// about 94 K; the 20 km scale height is our choice, representative of the lower 100 km only
// (density falling about 150-fold from the surface to 100 km). Above that the real scale
// height grows several-fold, so this preset badly understates the density of the upper
// atmosphere where an entry begins: use a table for entry studies.
constexpr ExponentialAtmosphere::Parameters titan_parameters{
    .surface_density_kg_m3 = 5.4, .scale_height_m = 20.0e3, .temperature_K = 94.0};

}  // namespace

std::unique_ptr<Atmosphere> standard_atmosphere(std::string_view body_preset,
                                                double gas_constant_J_kgK, double gamma,
                                                double density_scale) {
    if (body_preset == "earth") {
        // The 1976 standard fixes its own gas (air, R*/M0 and 1.4), so the gas constant and
        // gamma passed in are not used for Earth.
        return std::make_unique<UsStandardAtmosphere1976>(density_scale);
    }
    if (body_preset == "mars") {
        return std::make_unique<MarsReferenceAtmosphere>(gas_constant_J_kgK, gamma, density_scale);
    }
    if (body_preset == "venus") {
        return std::make_unique<ExponentialAtmosphere>(venus_parameters, gas_constant_J_kgK, gamma,
                                                       density_scale);
    }
    if (body_preset == "titan") {
        return std::make_unique<ExponentialAtmosphere>(titan_parameters, gas_constant_J_kgK, gamma,
                                                       density_scale);
    }
    return nullptr;
}

}  // namespace ds
