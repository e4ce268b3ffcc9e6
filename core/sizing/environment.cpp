#include "sizing/environment.hpp"

#include <stdexcept>

#include "atmosphere/exponential.hpp"
#include "atmosphere/standard.hpp"
#include "atmosphere/table.hpp"

namespace ds {

double design_gas_constant(const Design& design) {
    return design.atmosphere.gas_constant_J_kgK.value_or(design.body.body.gas.gas_constant_J_kgK);
}

double design_gamma(const Design& design) {
    return design.atmosphere.gamma.value_or(design.body.body.gas.gamma);
}

std::unique_ptr<Atmosphere> make_atmosphere(const Design& design) {
    const AtmosphereDesign& a = design.atmosphere;
    const double r = design_gas_constant(design);
    const double gamma = design_gamma(design);
    switch (a.model) {
        case AtmosphereModel::exponential:
            return std::make_unique<ExponentialAtmosphere>(
                ExponentialAtmosphere::Parameters{a.surface_density_kg_m3, a.scale_height_m,
                                                  a.temperature_K},
                r, gamma, a.density_scale);
        case AtmosphereModel::table:
            return std::make_unique<TableAtmosphere>(a.rows, r, gamma, a.density_scale);
        case AtmosphereModel::standard:
            if (auto model = standard_atmosphere(design.body.preset, r, gamma, a.density_scale)) {
                return model;
            }
            throw std::invalid_argument("atmosphere.model: the body has no standard atmosphere");
    }
    throw std::invalid_argument("atmosphere.model: unknown model");
}

Body flown_body(const Design& design) {
    Body body = design.body.body;
    if (!design.entry.azimuth_deg)
        body.rotation_rad_s = 0.0;
    return body;
}

std::optional<WindProfile> make_wind(const Design& design) {
    const AtmosphereDesign& a = design.atmosphere;
    if (!a.wind)
        return std::nullopt;
    if (a.wind->constant) {
        return WindProfile({{0.0, a.wind->constant->east_m_s, a.wind->constant->north_m_s}},
                           a.wind_scale);
    }
    return WindProfile(a.wind->rows, a.wind_scale);
}

FlightEnvironment make_environment(const Design& design) {
    return {flown_body(design), make_atmosphere(design), make_wind(design)};
}

IntegratorSettings<flight_state_size> design_integrator_settings(const Design& design) {
    return flight_integrator_settings(design.solver.relative_tolerance,
                                      static_cast<std::size_t>(design.solver.max_steps));
}

}  // namespace ds
