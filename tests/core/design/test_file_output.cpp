// The one atomic writer (write_file_atomically): a file is written whole or not at all.

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>

#include "design/file_output.hpp"
#include "support/full_disk.hpp"

namespace fs = std::filesystem;

namespace {

fs::path scratch_folder(const std::string& name) {
    const fs::path folder = fs::temp_directory_path() / ("descent-sizer-file-output-" + name);
    fs::remove_all(folder);
    fs::create_directories(folder);
    return folder;
}

std::string contents(const fs::path& file) {
    std::ifstream in(file, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

std::size_t files_in(const fs::path& folder) {
    return static_cast<std::size_t>(
        std::distance(fs::directory_iterator(folder), fs::directory_iterator()));
}

}  // namespace

TEST_CASE("a file is written whole, and keeps its permissions") {
    const fs::path folder = scratch_folder("whole");
    const fs::path file = folder / "design.json";
    REQUIRE(ds::write_file_atomically(file, "old"));
    fs::permissions(file, fs::perms::owner_read | fs::perms::owner_write);
    const std::string text(100000, 'x');
    std::string error;
    CHECK(ds::write_file_atomically(file, text, &error));
    CHECK(error.empty());
    CHECK(contents(file) == text);
    CHECK(fs::status(file).permissions() == (fs::perms::owner_read | fs::perms::owner_write));
    CHECK(files_in(folder) == 1);  // nothing left beside it
}

TEST_CASE("on a full disk the old file survives whole and the failure is told") {
    // Regression: a write that failed in the final flush of a buffer was not seen, and the
    // file cut short (or empty) replaced the old one.
    const fs::path folder = scratch_folder("full");
    const fs::path file = folder / "design.json";
    REQUIRE(ds::write_file_atomically(file, "the old design\n"));
    for (const std::size_t size : {std::size_t{100}, std::size_t{5000}, std::size_t{100000}}) {
        CAPTURE(size);
        std::string error;
        bool written = true;
        {
            const ds::test::FullDiskAfter full(64);
            written = ds::write_file_atomically(file, std::string(size, 'y'), &error);
        }
        CHECK_FALSE(written);
        CHECK(error.find("cannot write '" + file.string() + "'") == 0);
        CHECK(contents(file) == "the old design\n");
        CHECK(files_in(folder) == 1);
    }
}

TEST_CASE("a folder that does not exist is told, and nothing is written") {
    const fs::path folder = scratch_folder("missing");
    const fs::path file = folder / "no-such-folder" / "design.json";
    std::string error;
    CHECK_FALSE(ds::write_file_atomically(file, "text", &error));
    CHECK(error.find("No such file or directory") != std::string::npos);
    CHECK(files_in(folder) == 0);
}
