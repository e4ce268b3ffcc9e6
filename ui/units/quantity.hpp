#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>

namespace ds {

/// What a number in a design measures; sets its SI unit and the units a user may type.
enum class Dimension {
    dimensionless,
    length,        ///< m
    mass,          ///< kg
    velocity,      ///< m/s
    angle,         ///< deg (the design's angles are in degrees)
    pressure,      ///< Pa
    density,       ///< kg/m^3
    temperature,   ///< K
    time,          ///< s
    area_density,  ///< kg/m^2 (ballistic coefficient)
    heat_flux,     ///< W/cm^2
    acceleration,  ///< g (standard gravities), as the limits use it
    angular_rate,  ///< rad/s
    force,         ///< N
};

/// A unit a user may type after a number, with its factor to the dimension's SI unit.
struct Unit {
    std::string_view symbol;  ///< as typed: "ft", "km/s", "lbm"
    double to_si = 1.0;       ///< SI value = typed value * to_si (+ offset)
    double offset = 0.0;      ///< for temperature scales
};

/// The units accepted for a dimension; the first is the SI unit of the design document.
std::span<const Unit> unitsOf(Dimension dimension);

/// The unit the design document uses for a dimension ("m", "kg", "" for dimensionless).
std::string_view siUnit(Dimension dimension);

/// A number as typed, converted to the document's unit, or why it cannot be.
struct ParsedQuantity {
    std::optional<double> value;
    std::string error;  ///< empty when value is set
};

/// Parses "4.5", "4.5 m", "15 ft", "300 lbm", "12 kft", "5.6 km/s". A bare number is in the
/// document's unit. Refuses an unknown or mismatched unit ("kg" for a length), text that is not
/// a number, NaN and infinities, naming what was expected.
ParsedQuantity parseQuantity(std::string_view text, Dimension dimension);

/// A value in the document's unit, as the field shows it: up to `significant` digits, no
/// trailing zeros.
std::string formatQuantity(double value, int significant = 6);

}  // namespace ds
