#pragma once

#include <string>
#include <vector>

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// A mass budget being built: items with their growth allowance, grouped by when they leave
/// the vehicle.
class MassBudget {
public:
    /// An item of the design: its maturity sets its growth allowance.
    void add_design_item(const MassItemDesign& item);
    /// A mass the design fixes as a lump (heat_shield_kg, parachute.mass_kg): no growth.
    void add_given(std::string name, double mass_kg, MassGroup group);
    /// An estimate from a relation: grows as an "estimated" item.
    void add_estimate(std::string name, double basic_kg, MassGroup group, std::string source);
    /// A computed quantity that carries its own margins (propellant): no growth.
    void add_computed(std::string name, double mass_kg, MassGroup group, std::string source);

    double total_kg() const;
    double group_kg(MassGroup group) const;

    const std::vector<MassItem>& items() const { return items_; }

private:
    void add(MassItem item, MassGroup group);

    std::vector<MassItem> items_;
    std::vector<MassGroup> groups_;
};

}  // namespace ds
