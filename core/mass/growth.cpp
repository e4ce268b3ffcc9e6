#include "mass/growth.hpp"

#include <array>
#include <utility>

namespace ds {
namespace {

/// Each maturity's allowance, in the order of growth.hpp's list.
constexpr std::array<std::pair<Maturity, double>, 6> allowances{{{Maturity::estimated, 0.18},
                                                                 {Maturity::layout, 0.12},
                                                                 {Maturity::pre_release, 0.08},
                                                                 {Maturity::released, 0.04},
                                                                 {Maturity::existing, 0.02},
                                                                 {Maturity::actual, 0.0}}};

}  // namespace

double growth_allowance(Maturity maturity) {
    for (const auto& [m, allowance] : allowances) {
        if (m == maturity)
            return allowance;
    }
    return allowances.front().second;  // not reached: every maturity has a row
}

}  // namespace ds
