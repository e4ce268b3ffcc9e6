#pragma once

// What every libFuzzer target of tests/fuzz shares: how it fails (a message, then abort, which
// libFuzzer counts as a crash and keeps the input of), and the entry point around its one test
// of an input, which turns anything thrown past it into such a failure.

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string_view>

namespace ds::fuzz {

/// The target's name, for its messages: each target defines it.
extern const char* const target_name;

[[noreturn]] inline void fail(std::string_view what, std::string_view detail = {}) {
    std::fprintf(stderr, "%s: %.*s %.*s\n", target_name, static_cast<int>(what.size()), what.data(),
                 static_cast<int>(detail.size()), detail.data());
    std::abort();
}

/// Runs `test` on the input unless it is longer than `max_bytes` (then -1: libFuzzer does not
/// keep it in the corpus); an exception thrown past `test` fails the target.
template <class Test>
int test_one_input(const std::uint8_t* data, std::size_t size, std::size_t max_bytes, Test&& test) {
    if (size > max_bytes)
        return -1;
    try {
        test(std::string_view(reinterpret_cast<const char*>(data), size));
    } catch (const std::exception& error) {
        fail("exception:", error.what());
    } catch (...) {
        fail("exception of unknown type");
    }
    return 0;
}

}  // namespace ds::fuzz
