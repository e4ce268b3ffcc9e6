#pragma once

// What the doctest suites share: the shipped samples, read as designs or as text. One place, so
// a test does not write its own loader again (tests/core and tests/cli include it as
// "support/samples.hpp").

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include <doctest/doctest.h>

#include "design/design.hpp"
#include "design/reader.hpp"

namespace ds::test {

/// The path of a shipped sample, by its name without ".json".
inline std::filesystem::path sample_path(const std::string& name) {
    return std::filesystem::path(DESCENT_SIZER_SAMPLES_DIR) / (name + ".json");
}

/// A shipped sample read as a design; the test stops, naming the first error, if it does not read.
inline Design sample(const std::string& name) {
    const DesignReadResult read = read_design_file(sample_path(name));
    REQUIRE_MESSAGE(read.ok(), (read.errors.empty() ? "" : read.errors.front().text()));
    return *read.design;
}

/// The whole text of a file (empty when it cannot be opened).
inline std::string file_text(const std::filesystem::path& file) {
    std::ifstream in(file);
    std::stringstream text;
    text << in.rdbuf();
    return text.str();
}

}  // namespace ds::test
