#include "results/results.hpp"

namespace ds {

std::string_view maturity_name(const MassItem& item) {
    return item.basis == GrowthBasis::maturity ? to_string(item.maturity) : to_string(item.basis);
}

}  // namespace ds
