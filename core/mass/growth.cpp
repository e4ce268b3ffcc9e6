#include "mass/growth.hpp"

namespace ds {

double growth_allowance(Maturity maturity) {
    switch (maturity) {
        case Maturity::estimated:
            return 0.18;
        case Maturity::layout:
            return 0.12;
        case Maturity::pre_release:
            return 0.08;
        case Maturity::released:
            return 0.04;
        case Maturity::existing:
            return 0.02;
        case Maturity::actual:
            return 0.0;
    }
    return 0.18;
}

}  // namespace ds
