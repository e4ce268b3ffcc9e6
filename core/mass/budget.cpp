#include "mass/budget.hpp"

#include "mass/growth.hpp"

namespace ds {

void MassBudget::add(MassItem item) {
    item.mass_kg = item.basic_kg * (1.0 + item.growth_fraction);
    items_.push_back(std::move(item));
}

void MassBudget::add_item(std::string name, double basic_kg, MassGroup group, Maturity maturity) {
    add({std::move(name), 0.0, basic_kg, growth_allowance(maturity), group, GrowthBasis::maturity,
         maturity, "design"});
}

void MassBudget::add_given(std::string name, double mass_kg, MassGroup group) {
    add({std::move(name), 0.0, mass_kg, 0.0, group, GrowthBasis::given, {}, "design"});
}

void MassBudget::add_estimate(std::string name, double basic_kg, MassGroup group,
                              std::string source) {
    add({std::move(name), 0.0, basic_kg, growth_allowance(Maturity::estimated), group,
         GrowthBasis::maturity, Maturity::estimated, std::move(source)});
}

void MassBudget::add_computed(std::string name, double mass_kg, MassGroup group,
                              std::string source) {
    add({std::move(name), 0.0, mass_kg, 0.0, group, GrowthBasis::computed, {}, std::move(source)});
}

double MassBudget::total_kg() const {
    double sum = 0.0;
    for (const MassItem& item : items_)
        sum += item.mass_kg;
    return sum;
}

double MassBudget::entry_kg() const {
    double sum = 0.0;
    for (const MassItem& item : items_) {
        if (!leaves_before_entry(item.group))
            sum += item.mass_kg;
    }
    return sum;
}

double MassBudget::group_kg(MassGroup group) const {
    double sum = 0.0;
    for (const MassItem& item : items_) {
        if (item.group == group)
            sum += item.mass_kg;
    }
    return sum;
}

}  // namespace ds
