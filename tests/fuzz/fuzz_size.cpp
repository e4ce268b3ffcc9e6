// libFuzzer target: arbitrary bytes go to the design reader; a design that reads is sized and its
// results written. It aborts (a crash for libFuzzer) when anything throws, when a document that
// does not read comes back without a reason, or when the written results are not JSON whose
// every number is finite or null. Run it with tests/fuzz/run.sh.

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "design/reader.hpp"
#include "fuzz_target.hpp"
#include "results/writer.hpp"
#include "sizing/size.hpp"

const char* const ds::fuzz::target_name = "fuzz_size";

namespace {

using ds::fuzz::fail;

// A design document is a few kilobytes; larger inputs only slow the parser down and say nothing
// new (our bound, with -max_len in run.sh).
constexpr std::size_t max_input_bytes = 64 * 1024;

// The reader accepts step budgets up to 2^31 - 1, and a stiff descent (a canopy kilometres
// wide) uses all of them: 200000 steps (the default) take about 1 s and 115 MB per flight in a
// Release build, ten times that under the fuzzer's instrumentation. The fuzzer looks for
// crashes, undefined behaviour and non-finite figures, not for long flights: it holds every
// phase to 5000 steps (the samples fly in 120 to 1200), so that one input stays well under the
// 1 s timeout (our bound).
constexpr int fuzz_max_steps = 5000;

/// Every number in the document is finite; null stands for a figure that was not produced.
void require_finite_numbers(const nlohmann::ordered_json& value, const std::string& path) {
    if (value.is_number_float() && !std::isfinite(value.get<double>()))
        fail("non-finite number in the results at", path);
    if (value.is_object()) {
        for (auto it = value.begin(); it != value.end(); ++it)
            require_finite_numbers(it.value(), path + "." + it.key());
    } else if (value.is_array()) {
        for (std::size_t i = 0; i < value.size(); ++i)
            require_finite_numbers(value[i], path + "[" + std::to_string(i) + "]");
    }
}

void size_and_write(std::string_view text) {
    const ds::DesignReadResult read = ds::read_design(text);
    if (!read.ok()) {
        if (read.errors.empty())
            fail("a document that does not read came back without a reason");
        return;
    }
    ds::Design design = *read.design;
    design.solver.max_steps = std::min(design.solver.max_steps, fuzz_max_steps);
    const ds::Results results = ds::size_design(design);
    // The numbers themselves, before the writer turns those that are not finite into null: a
    // figure that overflowed is never silent, the finite_figures check counts every one.
    const std::vector<std::string> non_finite = ds::non_finite_figures(results, true);
    if (!non_finite.empty()) {
        const auto check =
            std::find_if(results.checks.begin(), results.checks.end(),
                         [](const ds::Check& c) { return c.id == "finite_figures"; });
        if (check == results.checks.end() || check->status != ds::CheckStatus::fail ||
            check->value != static_cast<double>(non_finite.size()) || results.converged)
            fail("a non-finite figure no failing check names, at", non_finite.front());
    }
    require_finite_numbers(ds::results_to_json(results, {.include_history = true}), "results");
    // The written text parses back (JSON has no NaN or infinity literal). Without the history:
    // the history's numbers were walked above, and parsing thousands of samples back under the
    // sanitizers would cost more than the sizing.
    const std::string written = ds::write_results(results);
    require_finite_numbers(nlohmann::ordered_json::parse(written), "written results");
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    return ds::fuzz::test_one_input(data, size, max_input_bytes, size_and_write);
}
