// A small, fully specified pseudorandom generator for the places where the core draws at random
// (bootstrap resamples, samples that bracket an order statistic): the same seed gives the same
// draws on every platform and library, so a cell never changes on recalculation.
#pragma once

#include <cstdint>

namespace quadrat {

// SplitMix64 (Steele, Lea & Flood 2014, OOPSLA, "Fast splittable pseudorandom number generators"):
// several times faster than std::mt19937_64 for the bootstrap (measured: 2000 resamples of 10⁵
// values, LIMIT.MEAN).
struct SplitMix64 {
    std::uint64_t state;
    std::uint64_t operator()() {
        std::uint64_t z = (state += 0x9e3779b97f4a7c15u);
        z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9u;
        z = (z ^ (z >> 27)) * 0x94d049bb133111ebu;
        return z ^ (z >> 31);
    }
    // Uniform on [0, bound) for bound ≥ 1, by a 128-bit multiply (Lemire 2019, ACM TOMACS 29:3);
    // the bias is below bound / 2⁶⁴, far beneath anything a sample could show.
    std::uint64_t below(std::uint64_t bound) {
        return static_cast<std::uint64_t>((static_cast<unsigned __int128>((*this)()) * bound) >> 64);
    }
};

}  // namespace quadrat
