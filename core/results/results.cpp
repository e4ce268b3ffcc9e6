#include "results/results.hpp"

namespace ds {

std::string_view to_string(DragCoefficientSource source) {
    switch (source) {
        case DragCoefficientSource::design:
            return "design";
        case DragCoefficientSource::modified_newtonian:
            return "modified Newtonian";
    }
    return {};
}

std::string_view to_string(GrowthBasis basis) {
    switch (basis) {
        case GrowthBasis::maturity:
            return "maturity";
        case GrowthBasis::given:
            return "given";
        case GrowthBasis::computed:
            return "computed";
    }
    return {};
}

std::string_view to_string(MassMode mode) {
    switch (mode) {
        case MassMode::analysis:
            return "analysis";
        case MassMode::sizing:
            return "sizing";
    }
    return {};
}

std::string_view maturity_name(const MassItem& item) {
    return item.basis == GrowthBasis::maturity ? to_string(item.maturity) : to_string(item.basis);
}

}  // namespace ds
