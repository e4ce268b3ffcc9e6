#include "atmosphere/mars_reference.hpp"

#include <cmath>

namespace ds {
namespace {

// NASA Glenn Research Center educational Mars atmosphere curve fit (h in m): T in deg C,
// p in kPa, rho = p / (0.1921 (T + 273.1)).
constexpr double fit_branch_altitude_m = 7000.0;  // T switches branch here
constexpr double fit_low_temperature_C = -31.0;   // below 7000 m
constexpr double fit_low_lapse_C_m = 0.000998;    // below 7000 m
constexpr double fit_high_temperature_C = -23.4;  // from 7000 m up
constexpr double fit_high_lapse_C_m = 0.00222;    // from 7000 m up
constexpr double fit_surface_pressure_kPa = 0.699;
constexpr double fit_pressure_decay_per_m = 0.00009;
constexpr double fit_gas_constant_kJ_kgK = 0.1921;  // with p in kPa
constexpr double fit_celsius_to_kelvin = 273.1;     // the fit's own offset (not 273.15)
constexpr double pascals_per_kilopascal = 1000.0;
constexpr double fit_gas_constant_J_kgK = fit_gas_constant_kJ_kgK * pascals_per_kilopascal;

// Surface gravity for the isothermal continuation: mu / r^2 with the NASA NSSDC Mars fact
// sheet's GM and mean radius, 3.728 m/s^2 (the sheet's own "3.71" is, from memory, the
// equatorial value, mu / 3396.2 km^2). Held constant with height: at 125 km it overstates g by 7 %,
// which steepens the continuation a little; acceptable for a reference profile that is our own
// choice anyway.
constexpr double mars_gm_m3_s2 = 4.2828e13;
constexpr double mars_mean_radius_m = 3389.5e3;
constexpr double mars_surface_gravity_m_s2 =
    mars_gm_m3_s2 / (mars_mean_radius_m * mars_mean_radius_m);

struct FitState {
    double density_kg_m3;
    double temperature_K;
};

/// The curve fit as published, at any altitude (also below 0, and above the join where its
/// temperature eventually turns negative).
FitState glenn_fit(double altitude_m) {
    const double temperature_C = altitude_m < fit_branch_altitude_m
                                     ? fit_low_temperature_C - fit_low_lapse_C_m * altitude_m
                                     : fit_high_temperature_C - fit_high_lapse_C_m * altitude_m;
    const double pressure_kPa =
        fit_surface_pressure_kPa * std::exp(-fit_pressure_decay_per_m * altitude_m);
    const double temperature_K = temperature_C + fit_celsius_to_kelvin;
    return {pressure_kPa / (fit_gas_constant_kJ_kgK * temperature_K), temperature_K};
}

}  // namespace

MarsReferenceAtmosphere::MarsReferenceAtmosphere(double gas_constant_J_kgK, double gamma,
                                                 double density_scale)
    : Atmosphere(gas_constant_J_kgK, gamma, density_scale) {}

Atmosphere::Profile MarsReferenceAtmosphere::profile(double altitude_m) const {
    // Isothermal hydrostatic continuation at the join temperature, with the fit's own gas
    // constant: rho = rho_join exp(-(h - h_join) / H), H = R T_join / g (about 8.3 km).
    const FitState join = glenn_fit(join_altitude_m);
    const double scale_height_m =
        fit_gas_constant_J_kgK * join.temperature_K / mars_surface_gravity_m_s2;
    const auto continuation = [&](double h) {
        return FitState{join.density_kg_m3 * std::exp(-(h - join_altitude_m) / scale_height_m),
                        join.temperature_K};
    };
    const double below = join_altitude_m - blend_half_width_m;
    const double above = join_altitude_m + blend_half_width_m;
    if (altitude_m <= below) {
        const FitState fit = glenn_fit(altitude_m);
        return {fit.density_kg_m3, fit.temperature_K};
    }
    if (altitude_m >= above) {
        const FitState iso = continuation(altitude_m);
        return {iso.density_kg_m3, iso.temperature_K};
    }
    // The two agree at the join but their d(ln rho)/dh does not (-7.6e-5 /m against
    // -1.2e-4 /m). A smoothstep blend of ln rho and T across the band keeps the slope
    // continuous, so no peak of heating or deceleration settles on a kink of the model.
    const double x = (altitude_m - below) / (above - below);
    const double w = x * x * (3.0 - 2.0 * x);
    const FitState fit = glenn_fit(altitude_m);
    const FitState iso = continuation(altitude_m);
    return {std::exp((1.0 - w) * std::log(fit.density_kg_m3) + w * std::log(iso.density_kg_m3)),
            (1.0 - w) * fit.temperature_K + w * iso.temperature_K};
}

}  // namespace ds
