#pragma once

// A design's body as the reader gives it for a preset's name ("body": "venus"): the name and
// the preset's values, in one step, for suites that build designs by hand.

#include <optional>
#include <string>

#include <doctest/doctest.h>

#include "body/body.hpp"
#include "design/design.hpp"

namespace ds::test {

/// The preset's body; the test stops if there is no such preset.
inline BodyDesign preset_body(const std::string& name) {
    const std::optional<Body> body = body_preset(name);
    REQUIRE_MESSAGE(body.has_value(), "no body preset " << name);
    return BodyDesign{name, *body};
}

}  // namespace ds::test
