#include "units/quantity.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <numbers>
#include <system_error>

// Plain C++ on purpose: the parsing and the factors are tested without a window. Numbers are
// read and written with <charconv>, which ignores the C locale (Qt sets it from the user's
// environment, where the decimal separator may be a comma).

namespace ds {
namespace {

// Exact definitions the factors are built from.
constexpr double foot_m = 0.3048;           // international foot (1959 yard and pound agreement)
constexpr double inch_m = foot_m / 12.0;    // 0.0254 m
constexpr double mile_m = 5280.0 * foot_m;  // international (statute) mile, 1609.344 m
constexpr double nautical_mile_m = 1852.0;  // international nautical mile (1929 IHC)
constexpr double pound_kg = 0.45359237;     // avoirdupois pound (1959 yard and pound agreement)
constexpr double standard_gravity_m_s2 = 9.80665;                   // 3rd CGPM (1901)
constexpr double pound_force_N = pound_kg * standard_gravity_m_s2;  // lbf = lbm * g0
constexpr double slug_kg = pound_force_N / foot_m;                  // lbf * s^2 / ft
constexpr double standard_atmosphere_Pa = 101325.0;                 // 10th CGPM (1954)
constexpr double btu_J = 1055.05585262;  // International Table BTU (1956 steam tables conference)
constexpr double hour_s = 3600.0;
constexpr double degree_rad = std::numbers::pi / 180.0;
constexpr double celsius_zero_K = 273.15;     // ITS-90: 0 degC = 273.15 K
constexpr double rankine_K = 5.0 / 9.0;       // a Fahrenheit degree is 5/9 K
constexpr double fahrenheit_zero_R = 459.67;  // 0 degF = 459.67 degR
constexpr double fahrenheit_zero_K = fahrenheit_zero_R * rankine_K;

constexpr std::array length_units{
    Unit{"m", 1.0},     Unit{"km", 1000.0}, Unit{"cm", 0.01},
    Unit{"mm", 0.001},  Unit{"ft", foot_m}, Unit{"kft", 1000.0 * foot_m},
    Unit{"in", inch_m}, Unit{"mi", mile_m}, Unit{"nmi", nautical_mile_m},
};
constexpr std::array mass_units{
    Unit{"kg", 1.0},       Unit{"g", 0.001},     Unit{"t", 1000.0},
    Unit{"lbm", pound_kg}, Unit{"lb", pound_kg},
};
constexpr std::array velocity_units{
    Unit{"m/s", 1.0},
    Unit{"km/s", 1000.0},
    Unit{"km/h", 1000.0 / hour_s},
    Unit{"ft/s", foot_m},
    Unit{"kn", nautical_mile_m / hour_s},
    Unit{"mph", mile_m / hour_s},
};
constexpr std::array angle_units{Unit{"deg", 1.0}, Unit{"rad", 1.0 / degree_rad}};
constexpr std::array pressure_units{
    Unit{"Pa", 1.0},
    Unit{"kPa", 1e3},
    Unit{"hPa", 1e2},
    Unit{"bar", 1e5},
    Unit{"mbar", 1e2},
    Unit{"psf", pound_force_N / (foot_m * foot_m)},
    Unit{"psi", pound_force_N / (inch_m * inch_m)},
    Unit{"atm", standard_atmosphere_Pa},
};
constexpr std::array density_units{
    Unit{"kg/m^3", 1.0},
    Unit{"g/cm^3", 1000.0},
    Unit{"slug/ft^3", slug_kg / (foot_m * foot_m * foot_m)},
};
constexpr std::array temperature_units{
    Unit{"K", 1.0},
    Unit{"C", 1.0, celsius_zero_K},
    Unit{"F", rankine_K, fahrenheit_zero_K},
};
constexpr std::array time_units{
    Unit{"s", 1.0},
    Unit{"ms", 0.001},
    Unit{"min", 60.0},
    Unit{"h", hour_s},
};
constexpr std::array area_density_units{
    Unit{"kg/m^2", 1.0},
    Unit{"lbm/ft^2", pound_kg / (foot_m * foot_m)},
};
// The document's heat flux is in W/cm^2, so the factors are to W/cm^2 (1 W/m^2 = 1e-4 W/cm^2).
constexpr std::array heat_flux_units{
    Unit{"W/cm^2", 1.0},
    Unit{"W/m^2", 1e-4},
    Unit{"kW/m^2", 1e-1},
    Unit{"MW/m^2", 1e2},
    Unit{"BTU/ft^2/s", btu_J / (foot_m * foot_m) * 1e-4},
};
// The document's accelerations are in standard gravities, as the limits are.
constexpr std::array acceleration_units{
    Unit{"g", 1.0},
    Unit{"m/s^2", 1.0 / standard_gravity_m_s2},
    Unit{"ft/s^2", foot_m / standard_gravity_m_s2},
};
constexpr std::array angular_rate_units{
    Unit{"rad/s", 1.0},
    Unit{"deg/s", degree_rad},
    Unit{"rpm", 2.0 * std::numbers::pi / 60.0},
};
constexpr std::array force_units{
    Unit{"N", 1.0},
    Unit{"kN", 1e3},
    Unit{"lbf", pound_force_N},
};
constexpr std::array dimensionless_units{Unit{"", 1.0}};

/// Other spellings users type, mapped to a symbol of the tables above.
struct Alias {
    std::string_view typed;
    std::string_view symbol;
};
constexpr std::array aliases{
    Alias{"\u00b0", "deg"}, Alias{"\u00b0/s", "deg/s"}, Alias{"\u00b0C", "C"}, Alias{"degC", "C"},
    Alias{"\u00b0F", "F"},  Alias{"degF", "F"},         Alias{"kt", "kn"},
};

/// Every dimension, in the order the messages list them: its units (the SI one first) and how
/// the messages name it ("a length").
struct DimensionRow {
    Dimension dimension;
    std::span<const Unit> units;
    std::string_view description;
};

constexpr std::array<DimensionRow, 14> dimensions{{
    {Dimension::dimensionless, dimensionless_units, "a bare number"},
    {Dimension::length, length_units, "a length"},
    {Dimension::mass, mass_units, "a mass"},
    {Dimension::velocity, velocity_units, "a velocity"},
    {Dimension::angle, angle_units, "an angle"},
    {Dimension::pressure, pressure_units, "a pressure"},
    {Dimension::density, density_units, "a density"},
    {Dimension::temperature, temperature_units, "a temperature"},
    {Dimension::time, time_units, "a time"},
    {Dimension::area_density, area_density_units, "a mass per area"},
    {Dimension::heat_flux, heat_flux_units, "a heat flux"},
    {Dimension::acceleration, acceleration_units, "an acceleration"},
    {Dimension::angular_rate, angular_rate_units, "an angular rate"},
    {Dimension::force, force_units, "a force"},
}};

const DimensionRow& rowOf(Dimension dimension) {
    const auto found =
        std::find_if(dimensions.begin(), dimensions.end(),
                     [dimension](const DimensionRow& row) { return row.dimension == dimension; });
    return found == dimensions.end() ? dimensions.front() : *found;
}

/// "a length", as the messages name a dimension.
std::string_view describe(Dimension dimension) {
    return rowOf(dimension).description;
}

const Unit* findUnit(std::string_view symbol, Dimension dimension) {
    for (const auto& alias : aliases) {
        if (alias.typed == symbol) {
            symbol = alias.symbol;
            break;
        }
    }
    const auto units = unitsOf(dimension);
    const auto found = std::find_if(units.begin(), units.end(),
                                    [symbol](const Unit& unit) { return unit.symbol == symbol; });
    return found == units.end() ? nullptr : &*found;
}

std::string_view trim(std::string_view text) {
    constexpr std::string_view spaces = " \t\r\n";
    const auto first = text.find_first_not_of(spaces);
    if (first == std::string_view::npos) {
        return {};
    }
    return text.substr(first, text.find_last_not_of(spaces) - first + 1);
}

ParsedQuantity refuse(std::string error) {
    return {std::nullopt, std::move(error)};
}

/// Why `symbol` is not a unit of `dimension`: it measures something else, or nothing known.
std::string unitError(std::string_view symbol, Dimension dimension) {
    // Built with append: operator+ on temporaries trips a false -Wrestrict in GCC 12 at -O3.
    std::string message = "'";
    message.append(symbol).append("'");
    if (dimension == Dimension::dimensionless) {
        return message.append(" is not expected: type a bare number");
    }
    std::string others;
    for (const auto& row : dimensions) {
        const Dimension other = row.dimension;
        if (other != dimension && other != Dimension::dimensionless && findUnit(symbol, other)) {
            others.append(others.empty() ? "" : " or ").append(row.description);
        }
    }
    if (!others.empty()) {
        return message.append(" is ").append(others).append(", not ").append(describe(dimension));
    }
    message.insert(0, "unknown unit ");
    message.append(" for ").append(describe(dimension)).append(": use ");
    const auto units = unitsOf(dimension);
    for (std::size_t i = 0; i < units.size(); ++i) {
        message.append(i == 0 ? "" : ", ").append(units[i].symbol);
    }
    return message;
}

/// Removes trailing zeros of a fraction ("2.500" -> "2.5", "3.000" -> "3"), keeping an exponent.
std::string trimZeros(std::string text) {
    const auto exponent = text.find('e');
    const std::string tail = exponent == std::string::npos ? "" : text.substr(exponent);
    std::string mantissa = text.substr(0, exponent);
    if (mantissa.find('.') != std::string::npos) {
        mantissa.erase(mantissa.find_last_not_of('0') + 1);
        if (mantissa.back() == '.') {
            mantissa.pop_back();
        }
    }
    return mantissa + tail;
}

}  // namespace

std::span<const Unit> unitsOf(Dimension dimension) {
    return rowOf(dimension).units;
}

std::string_view siUnit(Dimension dimension) {
    return unitsOf(dimension).front().symbol;
}

ParsedQuantity parseQuantity(std::string_view text, Dimension dimension) {
    text = trim(text);
    // from_chars takes no leading '+'; a typed one is harmless.
    if (text.size() > 1 && text.front() == '+' && text[1] != '-') {
        text.remove_prefix(1);
    }
    double number = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), number);
    if (error == std::errc::invalid_argument) {
        return refuse("not a number");
    }
    if (error == std::errc::result_out_of_range) {
        return refuse("out of range");
    }
    if (!std::isfinite(number)) {
        return refuse("must be finite");  // from_chars reads "nan" and "inf"
    }
    const std::string_view rest = text.substr(static_cast<std::size_t>(end - text.data()));
    if (rest.size() > 1 && rest.front() == ',' &&
        std::isdigit(static_cast<unsigned char>(rest[1]))) {
        return refuse("not a number: use a point as the decimal separator");
    }
    const std::string_view symbol = trim(rest);
    const Unit* unit = symbol.empty() ? &unitsOf(dimension).front() : findUnit(symbol, dimension);
    if (!unit) {
        return refuse(unitError(symbol, dimension));
    }
    const double value = number * unit->to_si + unit->offset;
    if (!std::isfinite(value)) {
        return refuse("must be finite");
    }
    return {value, {}};
}

std::string formatQuantity(double value, int significant) {
    significant = std::clamp(significant, 1, 17);
    if (value == 0.0) {
        return "0";  // also for -0
    }
    std::array<char, 64> buffer{};
    const auto write = [&buffer](auto... format) {
        const auto result = std::to_chars(buffer.data(), buffer.data() + buffer.size(), format...);
        return std::string(buffer.data(), result.ptr);
    };
    const std::string scientific = write(value, std::chars_format::scientific, significant - 1);
    const double magnitude = std::abs(value);
    if (!std::isfinite(value) || magnitude < 1e-4 || magnitude >= 1e7) {
        return trimZeros(scientific);
    }
    // Round to the significant digits first, then write that value without an exponent.
    const auto exponentAt = scientific.find('e') + 1;
    const bool plus = scientific[exponentAt] == '+';  // from_chars takes no '+'
    int exponent = 0;
    std::from_chars(scientific.data() + exponentAt + (plus ? 1 : 0),
                    scientific.data() + scientific.size(), exponent);
    double rounded = value;
    std::from_chars(scientific.data(), scientific.data() + scientific.size(), rounded);
    const int decimals = std::max(0, significant - 1 - exponent);
    return trimZeros(write(rounded, std::chars_format::fixed, decimals));
}

}  // namespace ds
