#pragma once

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "design/design.hpp"
#include "progress.hpp"
#include "trade/design_variants.hpp"

namespace ds {

/// The entry corridor: for an entry speed, the shallowest and the steepest interface flight-path
/// angles at which every check still passes, each root-found on the feasibility margin
/// (trade/sweep.hpp) with TOMS 748, and the check that binds on each side.
///
/// The angle is the design's own key: the interface angle given (in the design's frame), or the
/// approach's or the orbit's inertial one. The corridor is the interval of passing angles
/// around the design's angle (or, when the design's angle fails, around the passing angle
/// nearest to it, looked for a degree at a time), bracketed a degree at a time outward and each
/// end root-found to `corridor_angle_tolerance_deg`. A case whose check fails without a margin (a
/// skip-out, a trigger never reached, a flight that stopped) counts as failing by
/// `corridor_margin_without_limit`.

/// Each bound is found to this, deg: the reported bound passes, and the boundary lies within
/// this of it, towards the failing side.
inline constexpr double corridor_angle_tolerance_deg = 0.01;
/// How a failing check without a margin counts in the root-finding (a margin of -100 %): far
/// enough below zero that the boundary it makes is where the root-finding stops.
inline constexpr double corridor_margin_without_limit = -1.0;
/// The range of angles searched, deg: from just above the vertical to the horizontal.
inline constexpr double corridor_steepest_searched_deg = -89.9;
inline constexpr double corridor_shallowest_searched_deg = -0.001;
/// The step of the outward search for a bracket (and for a passing angle), deg.
inline constexpr double corridor_search_step_deg = 1.0;

/// One side of the corridor.
struct CorridorBound {
    /// Whether a failing angle was found on this side; false: every angle passes up to the end
    /// of the range searched, and `angle_deg` is that end.
    bool closed = false;
    double angle_deg = 0.0;  ///< the last passing angle found, in the design's key
    /// The interface angle there in both frames (the results' entry.interface).
    double relative_angle_deg = 0.0;
    double inertial_angle_deg = 0.0;
    double margin = 0.0;        ///< the feasibility margin there
    double failing_deg = 0.0;   ///< the first failing angle: the other end of the last bracket
    std::string binding_check;  ///< the check that fails there (closed only)
    std::string binding_message;
};

/// A nominal angle flown with the design's dispersions.
struct DispersedAngle {
    double angle_deg = 0.0;
    std::size_t runs = 0;
    std::size_t successes = 0;
    double success_probability = 0.0;
    double wilson_low = 0.0, wilson_high = 0.0;  ///< 95 %
};

/// The corridor at one speed.
struct CorridorSpeed {
    double speed = 0.0;  ///< the speed key's value (entry speed, or arrival excess speed)
    /// The interface speed in both frames at the corridor's centre (for an arrival, what its
    /// excess speed gives).
    double relative_speed_m_s = 0.0;
    double inertial_speed_m_s = 0.0;
    std::optional<CorridorBound> shallow;  ///< empty with `error`
    std::optional<CorridorBound> steep;
    std::string error;  ///< why there is no corridor at this speed
    std::size_t sizings = 0;
    /// With the design's dispersions: the success probability at the shallow bound, the centre
    /// and the steep bound.
    std::optional<DispersedAngle> dispersed_shallow, dispersed_centre, dispersed_steep;

    double width_deg() const {
        return shallow && steep ? shallow->angle_deg - steep->angle_deg : 0.0;
    }
    double centre_deg() const {
        return shallow && steep ? 0.5 * (shallow->angle_deg + steep->angle_deg) : 0.0;
    }
};

struct EntryCorridor {
    std::string
        angle_key;  ///< "entry.flight_path_angle_deg", "entry.approach.flight_path_angle_deg"...
    std::string speed_key;  ///< empty for an entry from orbit, whose orbit sets its speed
    std::string frame;      ///< of the angle: "planet-relative" or "inertial"
    double nominal_speed = 0.0;
    double nominal_angle_deg = 0.0;
    std::vector<CorridorSpeed> speeds;
    /// Why the dispersions could not be flown (a dispersed key the corridor's document lacks,
    /// such as an approach's periapsis once the corridor aims it at its angle); empty when they
    /// were, or were not asked for.
    std::string dispersion_error;
};

struct CorridorSettings {
    /// Values of the speed key; empty: the design's own speed.
    std::vector<double> speeds;
    /// Dispersed cases at each of the three angles of each speed; 0, or a design without
    /// dispersions: none.
    std::size_t runs = 0;
    std::uint64_t seed = 1;
    unsigned threads = 0;  ///< 0: one per core
    Progress* progress = nullptr;
};

/// The corridor of a design (its document as `variants`, the same read as `design`), or why it
/// cannot be found (a list of speeds for an entry from orbit).
std::pair<std::optional<EntryCorridor>, std::string> find_corridor(
    const DesignVariants& variants, const Design& design,
    const std::filesystem::path& base_directory, const CorridorSettings& settings);

}  // namespace ds
