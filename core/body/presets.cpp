#include "body/body.hpp"

#include "constants.hpp"

namespace ds {
namespace {

// Sutton-Graves constants, NASA TR R-376 (1971), as quoted in the design contract.
constexpr double sutton_graves_co2 = 1.9027e-4;
constexpr double sutton_graves_air = 1.7415e-4;

// Specific gas constants from molar masses: CO2 44.01 g/mol; the Mars mixture 43.34 g/mol
// (NASA NSSDC Mars fact sheet); dry air 28.9644 g/mol (US Standard Atmosphere 1976);
// N2 28.0134 g/mol.
constexpr double gas_constant(double molar_mass_g_mol) {
    return molar_gas_constant_J_molK / (molar_mass_g_mol * 1e-3);
}

Body mars() {
    // Mean radius and GM: NASA NSSDC Mars fact sheet. Sidereal rotation 24.6229 h (same sheet).
    // gamma 1.29 for the CO2 free stream is from memory (1.29-1.33 quoted).
    return {"mars", 3389.5e3, 4.2828e13, 2.0 * pi / (24.6229 * 3600.0),
            Gas{gas_constant(43.34), 1.29, sutton_graves_co2, "mars"}};
}

Body earth() {
    // Mean radius and GM: NASA NSSDC Earth fact sheet / WGS 84 GM. Sidereal day 23.9345 h.
    return {"earth", 6371.0e3, 3.986004418e14, 2.0 * pi / (23.9345 * 3600.0),
            Gas{gas_constant(28.9644), 1.4, sutton_graves_air, "earth"}};
}

Body venus() {
    // NASA NSSDC Venus fact sheet; retrograde rotation of 243 days (negligible for entry).
    // No radiative correlation is carried for Venus: report convective heating only.
    return {"venus", 6051.8e3, 3.2486e14, -2.0 * pi / (5832.6 * 3600.0),
            Gas{gas_constant(43.45), 1.29, sutton_graves_co2, ""}};
}

Body titan() {
    // Radius and GM: NASA NSSDC Saturnian satellite fact sheet (memory-grade). Nitrogen
    // atmosphere: the air Sutton-Graves constant is used as an approximation (our choice).
    return {"titan", 2574.7e3, 8.9781e12, 2.0 * pi / (15.945 * 86400.0),
            Gas{gas_constant(28.0134), 1.4, sutton_graves_air, ""}};
}

}  // namespace

std::optional<Body> body_preset(std::string_view name) {
    if (name == "mars")
        return mars();
    if (name == "earth")
        return earth();
    if (name == "venus")
        return venus();
    if (name == "titan")
        return titan();
    return std::nullopt;
}

std::vector<std::string> body_preset_names() {
    return {"mars", "earth", "venus", "titan"};
}

}  // namespace ds
