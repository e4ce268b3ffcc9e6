// The reference of the design's keys: made from the schema, every key in it, and the copy in
// resources/design-keys.md equal to what the program makes (regenerate it with
// `./build/descent-sizer keys > resources/design-keys.md`).

#include <fstream>
#include <sstream>
#include <string>

#include <doctest/doctest.h>

#include "design/key_reference.hpp"
#include "design/schema.hpp"

TEST_CASE("the key reference names every key of the schema with its unit and default") {
    const std::string page = ds::design_key_reference();
    for (const ds::KeyRow& row : ds::design_keys()) {
        if (row.section.empty())
            continue;  // format, version and name: in the page's opening
        const std::string path = row.path();
        const std::string key = path.substr(row.section.size() + 1);
        CAPTURE(path);
        CHECK(page.find("| `" + key + "` |") != std::string::npos);
    }
    for (const ds::SectionRow& section : ds::design_sections()) {
        CAPTURE(section.name);
        CHECK(page.find("## `" + std::string(section.name) + "`") != std::string::npos);
    }
    // A limit's default comes from the core's limits (Braun and Manning 2007 for this one: the
    // heritage envelope's ballistic coefficient), a defaulted input's from the design.
    CHECK(page.find("| `ballistic_coefficient_max_kg_m2` | Ballistic coefficient, at most | "
                    "kg/m^2 | default 150 | any number | all |  |") != std::string::npos);
    CHECK(page.find("| `throttle` | Throttle |  | default 1 | greater than 0 and at most 1 |") !=
          std::string::npos);
    CHECK(page.find("| `isp_s` | Specific impulse | s | required | at least 10 |") !=
          std::string::npos);
}

TEST_CASE("resources/design-keys.md is the program's key reference, word for word") {
    std::ifstream file(DESCENT_SIZER_SOURCE_DIR "/resources/design-keys.md", std::ios::binary);
    REQUIRE(file);
    std::ostringstream text;
    text << file.rdbuf();
    // When this fails, the schema changed: regenerate the copy (see the top of this file).
    CHECK(text.str() == ds::design_key_reference());
}
