#pragma once

#include <string>
#include <vector>

namespace ds {

/// One published or independent reference the program is held to: what the source gives
/// (a closed form evaluated, a standard's table, an independent integration) beside what the
/// program's own models compute for the same case.
struct ReferenceCase {
    std::string id;      ///< "allen_eggers_peak_deceleration"
    std::string title;   ///< what is compared, in words
    std::string source;  ///< where the expected value comes from, and how sure it is
    std::string unit;    ///< of both values; empty for none
    double expected = 0.0;
    double computed = 0.0;
    /// The agreement asked for: a fraction of the expected value, or (absolute) in the unit.
    double tolerance = 0.0;
    bool absolute = false;

    /// How far apart the two are: relative to the expected value, or in the unit.
    double difference() const;
    /// Whether they agree within the tolerance (a value that is not a number never does).
    bool agrees() const;
    /// The difference against the tolerance, as the command line and the sheet show it:
    /// "1.2e-06 relative (within 1e-05)", "6.6e-06 m (within 0.01)".
    std::string agreement() const;
};

/// Runs every reference case through the program's models, in a fixed order: the closed-form
/// ballistic entry of Allen and Eggers, the 1976 standard atmosphere, the Newtonian
/// sphere-cone, the stagnation pressure behind a normal shock, Sutton-Graves, the heat-shield
/// mass correlation, vis-viva and the Hohmann transfer (the entry from the approach and from
/// orbit), the closed-form braking burn, the rocket equation, and an independent
/// integration of the same equations by Boost.Odeint. `descent-sizer verify` prints them, the
/// sizing sheet's appendix shows them and the tests assert them: one list, so none can drift.
std::vector<ReferenceCase> run_reference_cases();

}  // namespace ds
