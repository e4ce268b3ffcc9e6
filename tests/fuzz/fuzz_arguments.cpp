// libFuzzer target: arbitrary bytes, split into arguments at line ends and NUL bytes, go to the
// command line's parser (CommandLine::parse: every command, option and check, without running
// a command) and to the parsers of what the options hold (parse_sweep_axis, parse_shard,
// parse_value_list). It aborts (a crash for libFuzzer) when anything throws past them, when a
// refused argument does not exit 1, or when a parsed value breaks its own rule (a shard outside
// its count, a sweep of no values or more than the most). Run it with tests/fuzz/run.sh.

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include "commands.hpp"
#include "fuzz_target.hpp"
#include "trade/value_list.hpp"

const char* const ds::fuzz::target_name = "fuzz_arguments";

namespace {

using ds::fuzz::fail;

// A command line of a few dozen short arguments is all a user types; more is not kept.
constexpr std::size_t max_input_bytes = 4096;
constexpr std::size_t max_arguments = 64;

void parse_values(const std::string& text) {
    std::string error;
    if (const auto axis = ds::parse_sweep_axis(text, &error)) {
        if (axis->count < 1 || axis->count > ds::most_sweep_values)
            fail("a sweep axis of no values or too many:", text);
        if (!std::isfinite(axis->from) || !std::isfinite(axis->to) || axis->key.empty())
            fail("a sweep axis with no key or an end that is not finite:", text);
    } else if (error.empty()) {
        fail("a sweep axis refused without a reason:", text);
    }
    if (const auto shard = ds::parse_shard(text); shard && shard->index >= shard->count)
        fail("a shard outside its count:", text);
    error.clear();
    if (const auto values = ds::parse_value_list(text, &error)) {
        for (const double v : *values) {
            if (!std::isfinite(v))
                fail("a value list with a value that is not finite:", text);
        }
    } else if (error.empty()) {
        fail("a value list refused without a reason:", text);
    }
}

void parse_arguments(std::string_view bytes) {
    std::vector<std::string> arguments{"descent-sizer"};
    std::string current;
    for (const char c : bytes) {
        if (c == '\n' || c == '\0') {
            arguments.push_back(current);
            current.clear();
            if (arguments.size() > max_arguments)
                return;
        } else {
            current += c;
        }
    }
    arguments.push_back(current);
    for (std::size_t i = 1; i < arguments.size(); ++i)
        parse_values(arguments[i]);

    std::vector<const char*> argv;
    for (const std::string& argument : arguments)
        argv.push_back(argument.c_str());
    ds::CommandLine commandLine;
    // Help and the version are 0, a refused argument 1 (what they say is not kept); a parsed
    // command is not run (it would read files and fly designs: the design fuzzer's work).
    std::ostringstream said;
    if (const std::optional<int> code =
            commandLine.parse(static_cast<int>(argv.size()), argv.data(), said, said);
        code && *code != 0 && *code != 1)
        fail("the parser ended with an exit code other than 0 or 1");
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    return ds::fuzz::test_one_input(data, size, max_input_bytes, parse_arguments);
}
