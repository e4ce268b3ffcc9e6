#pragma once

// What the sizing suites share to look into a results struct: a check or a timeline event by
// name, and the usual assertion on a check.

#include <algorithm>
#include <string>
#include <string_view>

#include <doctest/doctest.h>

#include "results/results.hpp"

namespace ds::test {

/// The check `id`, or null when the results have none.
inline const Check* find_check(const Results& r, std::string_view id) {
    const auto it =
        std::find_if(r.checks.begin(), r.checks.end(), [&](const Check& c) { return c.id == id; });
    return it == r.checks.end() ? nullptr : &*it;
}

/// The timeline event `name`, or null when the timeline has none.
inline const TimelineEvent* find_event(const Results& r, std::string_view name) {
    const auto it = std::find_if(r.timeline.events.begin(), r.timeline.events.end(),
                                 [&](const TimelineEvent& e) { return e.name == name; });
    return it == r.timeline.events.end() ? nullptr : &*it;
}

/// The check `id`, which must be there, checked to have `status`.
inline const Check& require_check(const Results& r, std::string_view id, CheckStatus status) {
    CAPTURE(id);
    const Check* c = find_check(r, id);
    REQUIRE(c);
    CHECK(c->status == status);
    return *c;
}

/// The check `id` is there with `status`, and its message says `words`.
inline void check_says(const Results& r, std::string_view id, CheckStatus status,
                       std::string_view words) {
    const Check& c = require_check(r, id, status);
    CHECK(c.message.find(words) != std::string::npos);
}

}  // namespace ds::test
