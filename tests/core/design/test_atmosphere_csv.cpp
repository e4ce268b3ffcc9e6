#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "design/atmosphere_csv.hpp"

namespace {

/// A CSV file in the temporary folder, removed when the test ends.
class CsvFile {
public:
    CsvFile(const std::string& name, const std::string& text)
        : path_(std::filesystem::temp_directory_path() / ("descent_sizer_test_csv_" + name)) {
        std::ofstream(path_, std::ios::binary) << text;
    }
    ~CsvFile() {
        std::error_code ignored;
        std::filesystem::remove(path_, ignored);
    }
    CsvFile(const CsvFile&) = delete;
    CsvFile& operator=(const CsvFile&) = delete;

    const std::filesystem::path& path() const { return path_; }

private:
    std::filesystem::path path_;
};

std::string read_error(const std::string& name, const std::string& text) {
    const CsvFile file(name, text);
    return ds::read_atmosphere_csv(file.path()).error;
}

}  // namespace

TEST_CASE("a CSV table reads with comments, blank lines, spaces and columns in any order") {
    const CsvFile file("good.csv",
                       "\xEF\xBB\xBF# profile for a test\r\n"
                       "temperature_K, altitude_m ,density_kg_m3\r\n"
                       "\r\n"
                       "215, -2000, 0.024\r\n"
                       "# a comment between rows\n"
                       "180,40000,8e-4\n"
                       "   \n"
                       "140,130000,1.5e-8");
    const auto table = ds::read_atmosphere_csv(file.path());
    INFO(table.error);
    REQUIRE(table.ok());
    REQUIRE(table.rows.size() == 3);
    CHECK(table.rows[0].altitude_m == -2000.0);
    CHECK(table.rows[0].density_kg_m3 == 0.024);
    CHECK(table.rows[0].temperature_K == 215.0);
    CHECK(table.rows[1].density_kg_m3 == 8e-4);
    CHECK(table.rows[2].altitude_m == 130000.0);
    CHECK(table.rows[2].density_kg_m3 == 1.5e-8);
    CHECK(table.lines == std::vector<int>{4, 6, 8});
}

TEST_CASE("a CSV header must name exactly the three columns, and a row must give all three") {
    struct BadCsv {
        const char* file;
        const char* text;
        const char* error;
    };
    const BadCsv cases[] = {
        {"unknown.csv", "altitude_m,density_kg_m3,temperature_K,pressure_Pa\n",
         "line 1: unknown column pressure_Pa"},
        {"short_header.csv", "# comment\naltitude_m,density_kg_m3\n0,1,200\n",
         "line 2: missing column temperature_K"},
        {"twice.csv", "altitude_m,altitude_m,temperature_K\n",
         "line 1: column altitude_m given twice"},
        {"empty.csv", "# nothing here\n\n",
         "no header line naming the columns altitude_m, density_kg_m3, temperature_K"},
        {"few.csv", "altitude_m,density_kg_m3,temperature_K\n0,0.02,210\n\n1000,0.018\n",
         "line 4: missing column temperature_K"},
        {"many.csv", "altitude_m,density_kg_m3,temperature_K\n0,0.02,210,5\n",
         "line 2: 4 values for 3 columns"},
        {"blank_value.csv", "altitude_m,density_kg_m3,temperature_K\n0,,210\n",
         "line 2: empty value in column density_kg_m3"},
    };
    for (const BadCsv& bad : cases) {
        CAPTURE(bad.file);
        CHECK(read_error(bad.file, bad.text) == bad.error);
    }
}

TEST_CASE("every CSV value must be a finite number") {
    const std::string header = "altitude_m,density_kg_m3,temperature_K\n";
    CHECK(read_error("word.csv", header + "0,0.02,210\n1000,0.018,205\n# x\n2000,abc,200\n") ==
          "line 5: 'abc' is not a number");
    CHECK(read_error("trailing.csv", header + "0,0.02,210 K\n") ==
          "line 2: '210 K' is not a number");
    CHECK(read_error("nan.csv", header + "0,nan,210\n") == "line 2: 'nan' is not a finite number");
    CHECK(read_error("inf.csv", header + "inf,0.02,210\n") ==
          "line 2: 'inf' is not a finite number");
    CHECK(read_error("overflow.csv", header + "1e999,0.02,210\n") ==
          "line 2: '1e999' is not a number");
}

TEST_CASE("a CSV file that cannot be opened says so") {
    const auto table = ds::read_atmosphere_csv(std::filesystem::temp_directory_path() /
                                               "descent_sizer_no_such_table.csv");
    CHECK_FALSE(table.ok());
    CHECK(table.error == "cannot open the file: no such file");
    CHECK(table.rows.empty());
}
