#include "mass/budget.hpp"

#include "mass/growth.hpp"

namespace ds {

void MassBudget::add(MassItem item, MassGroup group) {
    item.mass_kg = item.basic_kg * (1.0 + item.growth_fraction);
    item.group = std::string(to_string(group));
    items_.push_back(std::move(item));
    groups_.push_back(group);
}

void MassBudget::add_design_item(const MassItemDesign& item) {
    add({item.name, 0.0, item.mass_kg, growth_allowance(item.maturity), "",
         std::string(to_string(item.maturity)), "design"},
        item.group);
}

void MassBudget::add_given(std::string name, double mass_kg, MassGroup group) {
    add({std::move(name), 0.0, mass_kg, 0.0, "", "given", "design"}, group);
}

void MassBudget::add_estimate(std::string name, double basic_kg, MassGroup group,
                              std::string source) {
    add({std::move(name), 0.0, basic_kg, growth_allowance(Maturity::estimated), "",
         std::string(to_string(Maturity::estimated)), std::move(source)},
        group);
}

void MassBudget::add_computed(std::string name, double mass_kg, MassGroup group,
                              std::string source) {
    add({std::move(name), 0.0, mass_kg, 0.0, "", "computed", std::move(source)}, group);
}

double MassBudget::total_kg() const {
    double sum = 0.0;
    for (const MassItem& item : items_) sum += item.mass_kg;
    return sum;
}

double MassBudget::group_kg(MassGroup group) const {
    double sum = 0.0;
    for (std::size_t i = 0; i < items_.size(); ++i) {
        if (groups_[i] == group) sum += items_[i].mass_kg;
    }
    return sum;
}

}  // namespace ds
