#pragma once

#include <string>
#include <vector>

#include "mass/group.hpp"
#include "mass/item.hpp"
#include "mass/maturity.hpp"

namespace ds {

/// A mass budget being built: items with their growth allowance, grouped by when they leave
/// the vehicle.
class MassBudget {
public:
    /// An item of the design: its maturity sets its growth allowance.
    void add_item(std::string name, double basic_kg, MassGroup group, Maturity maturity);
    /// A mass the design fixes as a lump (heat_shield_kg, parachute.mass_kg): no growth.
    void add_given(std::string name, double mass_kg, MassGroup group);
    /// An estimate from a relation: grows as an "estimated" item.
    void add_estimate(std::string name, double basic_kg, MassGroup group, std::string source);
    /// A computed quantity that carries its own margins (propellant): no growth.
    void add_computed(std::string name, double mass_kg, MassGroup group, std::string source);

    double total_kg() const;
    /// What is still on the vehicle at the entry interface: the total less the groups that
    /// leave before it (the deorbit stage).
    double entry_kg() const;
    double group_kg(MassGroup group) const;

    const std::vector<MassItem>& items() const { return items_; }

private:
    void add(MassItem item);

    std::vector<MassItem> items_;
};

}  // namespace ds
