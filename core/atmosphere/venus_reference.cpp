#include "atmosphere/venus_reference.hpp"

#include <stdexcept>

namespace ds {

ReferenceProfile venus_reference_profile() {
    // Venus International Reference Atmosphere, 0-100 km: Seiff et al., "Models of the
    // structure of the atmosphere of Venus from the surface to 100 kilometers altitude",
    // Adv. Space Res. 5(11), 1985. Secondary: the rows below are as quoted (identically) by
    // several secondary sources, listed in the project's references.md; the paper's own table
    // was not read. Altitude in m, density in kg/m^3, temperature in K. The paper's pressures
    // (92.10 bar at 0 km to 2.660e-5 bar at 100 km) agree with rho R T at 43.45 g/mol (96.5 %
    // CO2, 3.5 % N2) within 1.1 %, and each 10 km layer with hydrostatics within 4 %.
    //
    // Above 100 km: an isothermal hydrostatic extension at the 100 km temperature (175.4 K)
    // with the same gas, our choice. VIRA's upper atmosphere (Keating et al., Adv. Space Res.
    // 5(11), 1985) tabulates 100-250 km by solar zenith angle, day and night; only its
    // abstract was at hand, so none of its values are used here. The real thermosphere is
    // warmer by day and colder by night (the exospheric temperature of about 275 K measured by
    // the morning-side entry probe bus, von Zahn et al., J. Geophys. Res. 85(A13), 1980,
    // abstract) and its molar mass falls above about 135 km, so this extension is a middle
    // estimate: 2.2 times below the morning-side density at 150 km summed from that
    // abstract's number densities (the tests). An entry's loads peak far below 100 km, where
    // the table holds.
    auto body = body_preset("venus");
    if (!body) {
        throw std::logic_error("the venus body preset is missing");
    }
    return {{
                {0.0, 64.79, 735.3},
                {10000.0, 37.72, 658.2},
                {20000.0, 20.39, 580.7},
                {30000.0, 10.15, 496.9},
                {40000.0, 4.404, 417.6},
                {50000.0, 1.594, 350.5},
                {60000.0, 0.4694, 262.8},
                {70000.0, 0.08393, 229.8},
                {80000.0, 0.01186, 197.1},
                {90000.0, 0.001151, 169.4},
                {100000.0, 7.890e-5, 175.4},
            },
            *body};
}

}  // namespace ds
