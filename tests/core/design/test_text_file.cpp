// What the readers of designs and tables refuse before they read: anything but a regular file
// (a pipe that would block them, a device that would be read without end, a folder), a file
// past its size bound, and a table past its row bound; and the duplicate-key check's linear
// cost on a table of the most rows allowed. From a hostile trial: `size /dev/zero` and a design
// whose csv_file was a FIFO read without end or blocked forever.

#include <filesystem>
#include <fstream>
#include <string>

#include <doctest/doctest.h>
#include <nlohmann/json.hpp>

#include "design/atmosphere_csv.hpp"
#include "design/reader.hpp"
#include "design/text_file.hpp"
#include "support/samples.hpp"
#include "support/special_files.hpp"

namespace fs = std::filesystem;

namespace {

fs::path scratch() {
    const fs::path folder = fs::temp_directory_path() / "descent-sizer-text-file-test";
    fs::create_directories(folder);
    return folder;
}

void write(const fs::path& file, const std::string& text) {
    std::ofstream(file, std::ios::binary) << text;
}

/// The small station sample with a table atmosphere of `rows` rows, in the document or (with
/// `csv_file`) naming that file.
nlohmann::ordered_json station_with_table(std::size_t rows, const std::string& csv_file = {}) {
    nlohmann::ordered_json design = nlohmann::ordered_json::parse(
        ds::test::file_text(ds::test::sample_path("small-ballistic-station")));
    nlohmann::ordered_json atmosphere{{"model", "table"}};
    if (csv_file.empty()) {
        nlohmann::ordered_json table = nlohmann::ordered_json::array();
        for (std::size_t i = 0; i < rows; ++i) {
            const double h =
                -5000.0 + 150000.0 * static_cast<double>(i) / static_cast<double>(rows - 1);
            table.push_back({{"altitude_m", h},
                             {"density_kg_m3", 0.02 * std::exp(-h / 11100.0)},
                             {"temperature_K", 210.0}});
        }
        atmosphere["rows"] = table;
    } else {
        atmosphere["csv_file"] = csv_file;
    }
    design["atmosphere"] = atmosphere;
    return design;
}

}  // namespace

TEST_CASE("a regular file is read whole; anything else is refused before it is opened") {
    const fs::path file = scratch() / "plain.txt";
    write(file, "some text\n");
    std::string error;
    CHECK(ds::read_text_file(file, 100, "a test file", &error) == "some text\n");
    CHECK_FALSE(ds::read_text_file(scratch(), 100, "a test file", &error));
    CHECK(error == "a folder, not a file");
    CHECK_FALSE(ds::read_text_file("/dev/zero", 100, "a test file", &error));
    CHECK(error == "not a regular file (a device or a pipe), so not read");
    CHECK_FALSE(ds::read_text_file(file, 5, "a test file", &error));
    CHECK(error == "larger than 5 bytes, the most a test file may be");
}

TEST_CASE("a design that is /dev/zero, a FIFO or past 32 MiB is refused at once, saying why") {
    const ds::DesignReadResult zero = ds::read_design_file("/dev/zero");
    REQUIRE(zero.errors.size() == 1);
    CHECK(zero.errors[0].message ==
          "cannot open /dev/zero: not a regular file (a device or a pipe), so not read");

    const ds::test::Fifo fifo(scratch() / "design.fifo");
    REQUIRE(fifo.ok());
    ds::DesignReadResult piped;
    CHECK(ds::test::returns_within([&] { piped = ds::read_design_file(fifo.path()); }, fifo));
    REQUIRE(piped.errors.size() == 1);
    CHECK(piped.errors[0].message.find("not a regular file") != std::string::npos);

    // A sparse file one byte past the bound: refused by its size, not read.
    const fs::path large = scratch() / "large.json";
    write(large, "{}");
    fs::resize_file(large, ds::most_design_bytes + 1);
    const ds::DesignReadResult big = ds::read_design_file(large);
    REQUIRE(big.errors.size() == 1);
    CHECK(big.errors[0].message ==
          "cannot open " + large.string() + ": larger than 32 MiB, the most a design may be");
    fs::remove(large);
}

TEST_CASE("an atmosphere csv_file that is /dev/zero or a FIFO is refused at its key") {
    const fs::path folder = scratch();
    const ds::test::Fifo fifo(folder / "table.fifo");
    REQUIRE(fifo.ok());
    for (const std::string& csv : {std::string("/dev/zero"), fifo.path().string()}) {
        CAPTURE(csv);
        ds::DesignReadResult read;
        CHECK(ds::test::returns_within(
            [&] { read = ds::read_design(station_with_table(0, csv).dump(), folder); }, fifo));
        REQUIRE_FALSE(read.ok());
        CHECK(read.errors[0].path == "atmosphere.csv_file");
        CHECK(read.errors[0].message.find("not a regular file (a device or a pipe)") !=
              std::string::npos);
    }
}

TEST_CASE("a table of the most rows allowed reads; one row more is refused with the bound") {
    // In the design: 100,000 rows read (the duplicate-key check is linear: 0.5 s in a Release
    // build where the callback parser took 2.4 s for these rows, and 3.6 s for ten times as
    // many where it took 400 s, measured by hand), 100,001 are refused.
    const ds::DesignReadResult most =
        ds::read_design(station_with_table(ds::most_table_rows).dump(), scratch());
    REQUIRE_MESSAGE(most.ok(), (most.errors.empty() ? "" : most.errors[0].text()));
    CHECK(most.design->atmosphere.rows.size() == ds::most_table_rows);
    const ds::DesignReadResult over =
        ds::read_design(station_with_table(ds::most_table_rows + 1).dump(), scratch());
    REQUIRE_FALSE(over.ok());
    CHECK(over.errors[0].text() == "atmosphere.rows: 100001 rows: a table may have at most 100000");

    // In a CSV file, the same bound.
    std::string csv = "altitude_m,density_kg_m3,temperature_K\n";
    for (std::size_t i = 0; i <= ds::most_table_rows; ++i)
        csv += std::to_string(i) + ",0.01,200\n";
    const ds::AtmosphereCsv table = ds::parse_atmosphere_csv(csv);
    CHECK(table.error == "line 100002: more than 100000 rows, the most a table may have");
}
