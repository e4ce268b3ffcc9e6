#pragma once

#include <string>

#include "mass/group.hpp"
#include "mass/maturity.hpp"

namespace ds {

/// What set a mass item's growth allowance: its maturity, or nothing for a lump the design gives
/// ("given") and a quantity computed with its own margins ("computed", the propellant).
enum class GrowthBasis { maturity, given, computed };

/// One item of a mass budget, as the results list it.
struct MassItem {
    std::string name;
    double mass_kg = 0.0;  ///< with growth allowance: what flies
    double basic_kg = 0.0;
    double growth_fraction = 0.0;
    MassGroup group = MassGroup::payload;  ///< when it leaves
    GrowthBasis basis = GrowthBasis::maturity;
    Maturity maturity = Maturity::estimated;  ///< when the basis is the maturity
    std::string source;                       ///< "design", or the relation it was estimated from
};

}  // namespace ds
