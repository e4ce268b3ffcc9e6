// libFuzzer target: arbitrary bytes go to the atmosphere table's CSV reader
// (parse_atmosphere_csv). It aborts (a crash for libFuzzer) when anything throws, when a table
// is refused without a reason, or when one it accepts has a value that is not finite, a row
// without its line, or more rows than the bound. Run it with tests/fuzz/run.sh.

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string_view>

#include "design/atmosphere_csv.hpp"
#include "design/text_file.hpp"
#include "fuzz_target.hpp"

const char* const ds::fuzz::target_name = "fuzz_atmosphere_csv";

namespace {

using ds::fuzz::fail;

constexpr std::size_t max_input_bytes = 64 * 1024;

void read_table(std::string_view text) {
    const ds::AtmosphereCsv table = ds::parse_atmosphere_csv(text);
    if (!table.ok())
        return;
    if (table.rows.size() != table.lines.size())
        fail("a row without its line");
    if (table.rows.size() > ds::most_table_rows)
        fail("more rows than the bound");
    for (const ds::AtmosphereRow& row : table.rows) {
        if (!std::isfinite(row.altitude_m) || !std::isfinite(row.density_kg_m3) ||
            !std::isfinite(row.temperature_K))
            fail("a value that is not finite accepted");
    }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    return ds::fuzz::test_one_input(data, size, max_input_bytes, read_table);
}
