#include "results/results.hpp"

#include "enum_names.hpp"

namespace ds {
namespace {

constexpr Names<DragCoefficientSource, 2> drag_coefficient_sources{
    {{DragCoefficientSource::design, "design"},
     {DragCoefficientSource::modified_newtonian, "modified Newtonian"}}};
constexpr Names<GrowthBasis, 3> growth_bases{{{GrowthBasis::maturity, "maturity"},
                                              {GrowthBasis::given, "given"},
                                              {GrowthBasis::computed, "computed"}}};
constexpr Names<MassMode, 2> mass_modes{
    {{MassMode::analysis, "analysis"}, {MassMode::sizing, "sizing"}}};

}  // namespace

std::string_view to_string(DragCoefficientSource source) {
    return name_of(drag_coefficient_sources, source);
}
std::string_view to_string(GrowthBasis basis) {
    return name_of(growth_bases, basis);
}
std::string_view to_string(MassMode mode) {
    return name_of(mass_modes, mode);
}

std::string_view maturity_name(const MassItem& item) {
    return item.basis == GrowthBasis::maturity ? to_string(item.maturity) : to_string(item.basis);
}

}  // namespace ds
