#include "atmosphere/titan_engineering.hpp"

#include <stdexcept>

namespace ds {

ReferenceProfile titan_engineering_profile() {
    // Titan nominal engineering profile, 0-500 km, as quoted by Justus and Braun, "Atmospheric
    // Environments for Entry, Descent and Landing (EDL)", 2007, from the engineering model of
    // Yelle et al., ESA SP-1177 (1997). One secondary source: neither text was read here; the
    // rows are those listed in the project's references.md. Altitude in m, density in kg/m^3,
    // temperature in K. Each layer agrees with hydrostatics in nitrogen within 2 % below
    // 100 km and within 10 % above (where the rows are 100-200 km apart).
    //
    // Above 500 km: an isothermal hydrostatic extension at the 500 km temperature (173.96 K)
    // in the body's gas (nitrogen), named as such and our choice; the 300-500 km layer of the
    // profile itself falls at that rate within 1 %, so an entry from 1000 km starts on it.
    auto body = body_preset("titan");
    if (!body) {
        throw std::logic_error("the titan body preset is missing");
    }
    return {{
                {0.0, 5.270, 92.89},
                {10000.0, 3.467, 83.29},
                {20000.0, 2.144, 76.44},
                {30000.0, 1.233, 72.20},
                {40000.0, 0.6731, 70.51},
                {50000.0, 0.3575, 71.16},
                {60000.0, 0.1825, 76.62},
                {80000.0, 0.04788, 122.88},
                {100000.0, 0.02219, 140.80},
                {200000.0, 1.393e-3, 173.76},
                {300000.0, 1.673e-4, 181.72},
                {500000.0, 4.114e-6, 173.96},
            },
            *body};
}

}  // namespace ds
