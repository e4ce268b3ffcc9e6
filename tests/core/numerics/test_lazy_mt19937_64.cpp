#include <cstdint>
#include <random>

#include <doctest/doctest.h>

#include "numerics/lazy_mt19937_64.hpp"

TEST_CASE("the lazy engine gives std::mt19937_64's numbers, before and after its hand-over") {
    // The standard library's engine is the reference: every number equal, over the first 156
    // (made lazily) and on past them (the standard engine, advanced), for seeds with the top and
    // low bits set and for 0.
    constexpr std::uint64_t seeds[] = {
        0, 1, 5489, 0x9E3779B97F4A7C15, 0xFFFFFFFFFFFFFFFF, 0x8000000000000001};
    for (const std::uint64_t seed : seeds) {
        CAPTURE(seed);
        std::mt19937_64 standard(seed);
        ds::LazyMt19937_64 lazy(seed);
        for (int i = 0; i < 1000; ++i) {
            CAPTURE(i);
            REQUIRE(lazy() == standard());
        }
    }
}

TEST_CASE("the 10000th number of the lazy engine from the default seed is the standard's") {
    // C++ standard [rand.predef] (from memory): the 10000th consecutive invocation of a
    // default-constructed mt19937_64 (seed 5489) produces 9981545732273789042.
    ds::LazyMt19937_64 lazy(5489);
    for (int i = 1; i < 10000; ++i)
        (void)lazy();
    CHECK(lazy() == 9981545732273789042ULL);
}
