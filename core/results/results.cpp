#include "results/results.hpp"

namespace ds {

std::string_view maturity_name(const MassItem& item) {
    return item.basis == GrowthBasis::maturity ? to_string(item.maturity) : to_string(item.basis);
}

std::string_view site_limit_text(SiteLimit limit) {
    switch (limit) {
        case SiteLimit::timeline_margin:
            return "where the timeline margin runs out";
        case SiteLimit::heat_shield_jettison:
            return "bounded by the heat-shield jettison altitude";
        case SiteLimit::ignition:
            return "bounded by the ignition altitude";
    }
    return {};
}

}  // namespace ds
