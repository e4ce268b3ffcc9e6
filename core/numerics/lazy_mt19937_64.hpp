#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <random>

namespace ds {

/// std::mt19937_64 from a seed, number for number, for a generator that is seeded often and
/// asked for few numbers (a dispersed case draws a handful from its own seed). The standard
/// engine seeds all 312 words of its state and twists them all before its first number; the
/// first 156 numbers need only the seeded words up to 156 past their own and one twist each,
/// made here as the numbers are asked. From the 157th on, the standard engine takes over.
/// Matsumoto and Nishimura, ACM TOMACS 8 (1998); the 64-bit parameters are the C++ standard's
/// ([rand.predef]); the tests check it against std::mt19937_64.
class LazyMt19937_64 {
public:
    using result_type = std::uint64_t;
    static constexpr result_type min() { return 0; }
    static constexpr result_type max() { return ~result_type{0}; }

    explicit LazyMt19937_64(result_type seed) : seed_(seed) { words_[0] = seed; }

    result_type operator()() {
        if (drawn_ >= shift) {
            if (!standard_) {
                standard_.emplace(seed_);
                standard_->discard(shift);
            }
            return (*standard_)();
        }
        // The first half of the standard engine's twist, word i from the seeded words i, i + 1
        // and i + shift (none of them twisted yet), then its tempering.
        const std::size_t i = drawn_++;
        seed_through(i + shift);
        constexpr result_type lower = (result_type{1} << 31) - 1;
        const result_type x = (words_[i] & ~lower) | (words_[i + 1] & lower);
        result_type z = words_[i + shift] ^ (x >> 1) ^ ((x & 1) ? 0xb5026f5aa96619e9ULL : 0);
        z ^= (z >> 29) & 0x5555555555555555ULL;
        z ^= (z << 17) & 0x71d67fffeda60000ULL;
        z ^= (z << 37) & 0xfff7eee000000000ULL;
        return z ^ (z >> 43);
    }

private:
    static constexpr std::size_t size = 312;   ///< n: words of state
    static constexpr std::size_t shift = 156;  ///< m: the twist's offset, and half the state

    /// The seeding recurrence up to word `last`.
    void seed_through(std::size_t last) {
        for (; seeded_ <= last; ++seeded_) {
            const result_type before = words_[seeded_ - 1];
            words_[seeded_] = 6364136223846793005ULL * (before ^ (before >> 62)) + seeded_;
        }
    }

    result_type seed_;
    std::array<result_type, size> words_;  ///< the seeded words, made up to seeded_ - 1
    std::size_t seeded_ = 1;
    std::size_t drawn_ = 0;
    std::optional<std::mt19937_64> standard_;  ///< past the first `shift` numbers
};

}  // namespace ds
