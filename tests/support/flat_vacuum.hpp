#pragma once

// A flat, airless, non-rotating body with a uniform 3.7 m/s^2, for suites that check the burns
// against closed forms: a huge radius with mu = g R^2 keeps g within 1e-5 over the few
// kilometres flown, and an exponential air of 1e-15 kg/m^3 is no air at all.

#include "atmosphere/exponential.hpp"
#include "body/body.hpp"
#include "flight/flight_model.hpp"

namespace ds::test {

inline constexpr double flat_radius_m = 1e9;
inline constexpr double flat_gravity_m_s2 = 3.7;

struct FlatVacuum {
    Body body{"flat", flat_radius_m, flat_gravity_m_s2* flat_radius_m* flat_radius_m, 0.0,
              Gas{188.9, 1.29, 1.9e-4, ""}};
    ExponentialAtmosphere air{{1e-15, 11100.0, 210.0}, 188.9, 1.29};
    FlightModel model() const { return {body, air}; }
};

}  // namespace ds::test
