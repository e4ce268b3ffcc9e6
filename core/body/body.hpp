#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace ds {

/// The free-stream gas of a body's atmosphere, as the models need it.
struct Gas {
    double gas_constant_J_kgK = 0.0;  ///< specific gas constant R
    double gamma = 0.0;               ///< ratio of specific heats
    /// Sutton-Graves constant k in q = k sqrt(rho/Rn) V^3, kg^0.5/m (NASA TR R-376, 1971).
    double sutton_graves_k = 0.0;
    /// Which radiative-heating correlation applies, if any ("mars", "earth" or empty).
    std::string radiative_correlation;

    bool operator==(const Gas&) const = default;
};

/// A spherical, optionally rotating body. Gravity is inverse-square: g = mu / r^2.
struct Body {
    std::string name;
    double radius_m = 0.0;
    double mu_m3_s2 = 0.0;
    double rotation_rad_s = 0.0;  ///< in-plane (equatorial) rotation; 0 = not rotating
    Gas gas;

    double gravity_m_s2(double altitude_m) const {
        const double r = radius_m + altitude_m;
        return mu_m3_s2 / (r * r);
    }

    bool operator==(const Body&) const = default;
};

/// The built-in bodies: "mars", "earth", "venus", "titan". Empty when the name is unknown.
std::optional<Body> body_preset(std::string_view name);

/// Names accepted by body_preset, for messages and the window's lists.
std::vector<std::string> body_preset_names();

}  // namespace ds
