#pragma once

#include <memory>
#include <optional>

#include "atmosphere/atmosphere.hpp"
#include "atmosphere/wind.hpp"
#include "design/design.hpp"
#include "flight/flight_model.hpp"
#include "flight/phase.hpp"

namespace ds {

/// The gas of the design's atmosphere: its own gas constant and gamma where the design gives
/// them, else the body's.
double design_gas_constant(const Design& design);
double design_gamma(const Design& design);

/// The atmosphere a design flies in. A design read by read_design always gives one; throws
/// std::invalid_argument for a design that was not (e.g. a "standard" model on a custom body).
std::unique_ptr<Atmosphere> make_atmosphere(const Design& design);

/// The body as flown: the design's, rotating only when the entry has a direction
/// (entry.azimuth_deg); without one it is flown without rotation (design-file.md).
Body flown_body(const Design& design);

/// The design's wind times its wind scale, when it has one.
std::optional<WindProfile> make_wind(const Design& design);

/// Everything a design flies in, owned: the flown body, the atmosphere and the wind. Not
/// to be moved once model() has been taken (the model refers to its members).
struct FlightEnvironment {
    Body body;
    std::unique_ptr<Atmosphere> atmosphere;
    std::optional<WindProfile> wind;

    FlightModel model() const { return {body, *atmosphere, wind ? &*wind : nullptr}; }
};

/// Throws as make_atmosphere does.
FlightEnvironment make_environment(const Design& design);

/// How the design's own flights are integrated: its solver's relative tolerance and step budget.
IntegratorSettings<flight_state_size> design_integrator_settings(const Design& design);

}  // namespace ds
