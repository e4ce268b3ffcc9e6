#include "atmosphere/standard.hpp"

#include "atmosphere/mars_reference.hpp"
#include "atmosphere/reference_profile.hpp"
#include "atmosphere/titan_engineering.hpp"
#include "atmosphere/us_standard_1976.hpp"
#include "atmosphere/venus_reference.hpp"

namespace ds {

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
        return std::make_unique<ReferenceProfileAtmosphere>(
            venus_reference_profile(), gas_constant_J_kgK, gamma, density_scale);
    }
    if (body_preset == "titan") {
        return std::make_unique<ReferenceProfileAtmosphere>(
            titan_engineering_profile(), gas_constant_J_kgK, gamma, density_scale);
    }
    return nullptr;
}

}  // namespace ds
