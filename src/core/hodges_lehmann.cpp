#include "hodges_lehmann.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <utility>
#include <vector>

#include "random.hpp"
#include "ranks.hpp"
#include "refusal.hpp"

namespace quadrat {

namespace {

// Selection in a matrix whose entries never decrease along a row nor down a column, restricted to
// row i's columns [start(i), columns). Each row keeps a window [lo, hi) of still-possible entries
// (those left of it lie below the wanted one, those right of it above). A step draws a uniform
// sample of the window's entries, takes two of the sample's order statistics on either side of the
// wanted rank (± 3√r of r draws: the wanted entry lies between them with probability near 1) as a
// bracket, counts the entries below and at most each end with one staircase sweep (O(rows +
// columns)), and narrows every window to the bracket: each step keeps about 6/√r of the window, so
// a few steps bring 10¹² entries down to a list of a few thousand, selected directly (Floyd &
// Rivest 1975, CACM 18, 165–172, applied to sorted matrices as Dillencourt, Mount & Netanyahu 1992,
// IJCGA 2, 1–27, do for slopes). A sample that misses still narrows one side. Deterministic: the
// draws come from a fixed seed, and the answer is the exact order statistic whatever they are.
// The k-th smallest entry, and the (k+1)-th where the last step saw it (NaN otherwise): a median of
// an even count needs both, and they almost always fall in the same final list.
struct Selected {
    double value, next;
};

template <class Entry, class Start>
Selected select_in_sorted_matrix(std::size_t rows, std::size_t columns, Entry entry, Start start, std::uint64_t k) {
    constexpr double unknown = std::numeric_limits<double>::quiet_NaN();
    const std::uint64_t target = k - 1;  // 0-based rank of the wanted entry
    std::vector<std::size_t> lo(rows), hi(rows, columns), below_low(rows), up_to_high(rows), up_to_low(rows), below_high(rows);
    for (std::size_t i = 0; i < rows; ++i) lo[i] = start(i);
    std::vector<std::uint64_t> prefix(rows + 1);
    std::vector<double> sample;
    std::vector<std::uint64_t> draws;
    SplitMix64 random{0x5eed5e1ec7};

    // The number of entries below `value` (strictly, or at most it) per row, by a staircase sweep:
    // a row's count never grows down the rows.
    const auto count = [&](double value, bool at_most, std::vector<std::size_t>& per_row) {
        std::uint64_t total = 0;
        std::size_t j = columns;
        for (std::size_t i = 0; i < rows; ++i) {
            while (j > 0 && (at_most ? entry(i, j - 1) > value : entry(i, j - 1) >= value)) --j;
            per_row[i] = std::max(start(i), j);
            total += per_row[i] - start(i);
        }
        return total;
    };

    const std::uint64_t enumerate_below = std::max<std::uint64_t>(4096, (rows + columns) / 2);
    for (int step = 0; step < 200; ++step) {
        std::uint64_t discarded_below = 0;
        prefix[0] = 0;
        for (std::size_t i = 0; i < rows; ++i) {
            prefix[i + 1] = prefix[i] + (hi[i] - lo[i]);
            discarded_below += lo[i] - start(i);
        }
        const std::uint64_t active = prefix[rows];
        if (active == 0 || target < discarded_below || target - discarded_below >= active)
            throw Refusal("internal inconsistency while selecting an order statistic of differences");
        const std::uint64_t wanted = target - discarded_below;  // rank among the window's entries
        if (active <= enumerate_below) {
            std::vector<double> candidates;
            candidates.reserve(active);
            for (std::size_t i = 0; i < rows; ++i)
                for (std::size_t j = lo[i]; j < hi[i]; ++j) candidates.push_back(entry(i, j));
            auto nth = candidates.begin() + static_cast<std::ptrdiff_t>(wanted);
            std::nth_element(candidates.begin(), nth, candidates.end());
            return {*nth, nth + 1 == candidates.end() ? unknown : *std::min_element(nth + 1, candidates.end())};
        }

        // r uniform draws from the window: positions drawn, sorted, and walked along the rows'
        // prefix counts in one pass (a binary search per draw missed the cache at every level).
        // r ≈ active^(2/3) (Floyd & Rivest's order), between 1024 and 2¹⁶: a sample's sort must not
        // cost more than the window it narrows (a 1000 × 1000 matrix took 12 ms with r = 2¹⁶).
        const double two_thirds = std::pow(static_cast<double>(active), 2.0 / 3.0);
        const std::size_t r = static_cast<std::size_t>(
            std::min<std::uint64_t>(active / 4, static_cast<std::uint64_t>(std::clamp(two_thirds, 1024.0, 65536.0))));
        draws.resize(r);
        for (std::uint64_t& u : draws) u = random.below(active);
        std::sort(draws.begin(), draws.end());
        sample.resize(r);
        for (std::size_t d = 0, i = 0; d < r; ++d) {
            while (prefix[i + 1] <= draws[d]) ++i;
            sample[d] = entry(i, lo[i] + static_cast<std::size_t>(draws[d] - prefix[i]));
        }
        const double position = static_cast<double>(wanted) / static_cast<double>(active) * static_cast<double>(r);
        const double spread = 3 * std::sqrt(static_cast<double>(r));
        const auto at = [&](double p) {
            const std::size_t index = static_cast<std::size_t>(std::clamp(p, 0.0, static_cast<double>(r - 1)));
            std::nth_element(sample.begin(), sample.begin() + static_cast<std::ptrdiff_t>(index), sample.end());
            return sample[index];
        };
        const double low = at(position - spread), high = at(position + spread);

        const std::uint64_t under_low = count(low, false, below_low);
        if (target < under_low) {  // the bracket missed high: everything from `low` up is above
            for (std::size_t i = 0; i < rows; ++i) hi[i] = std::max(lo[i], std::min(hi[i], below_low[i]));
            continue;
        }
        const std::uint64_t through_high = count(high, true, up_to_high);
        if (target >= through_high) {  // the bracket missed low: everything up to `high` is below
            for (std::size_t i = 0; i < rows; ++i) lo[i] = std::min(hi[i], std::max(lo[i], up_to_high[i]));
            continue;
        }
        if (low == high) return {low, target + 1 < through_high ? low : unknown};  // the bracket is one value (ties)
        if (through_high - under_low < active) {  // the bracket narrows the window
            for (std::size_t i = 0; i < rows; ++i) {
                lo[i] = std::min(hi[i], std::max(lo[i], below_low[i]));
                hi[i] = std::max(lo[i], std::min(hi[i], up_to_high[i]));
            }
            continue;
        }
        // Ties at the bracket's ends: when a few values of huge multiplicity fill the window (tied
        // or nearly tied readings: 12.34 − 11.2 and 13.34 − 12.2 are two doubles near 1.14), a
        // sample's bracket is the window's own ends and would narrow nothing. The wanted entry is
        // then one of the ends, or lies strictly between them, and the window drops both ends.
        const std::uint64_t through_low = count(low, true, up_to_low);
        if (target < through_low) return {low, target + 1 < through_low ? low : unknown};
        const std::uint64_t under_high = count(high, false, below_high);
        if (target >= under_high) return {high, target + 1 < through_high ? high : unknown};
        for (std::size_t i = 0; i < rows; ++i) {
            lo[i] = std::min(hi[i], std::max(lo[i], up_to_low[i]));
            hi[i] = std::max(lo[i], std::min(hi[i], below_high[i]));
        }
    }
    throw Refusal("could not select an order statistic of differences; please report this data set");
}

// The median of `count` entries from the ((count + 1) / 2)-th: itself for an odd count, else the
// mean of it and the next (selected again only when the last step did not see it), each rounded.
template <class Next>
double median_of(const Selected& middle, std::uint64_t count, Next next) {
    const double low = round_significant(middle.value);
    if (count % 2 == 1) return low;
    const double high = std::isnan(middle.next) ? next() : round_significant(middle.next);
    return 0.5 * low + 0.5 * high;
}

}  // namespace

double pairwise_difference_order_statistic(std::span<const double> first_sorted,
                                           std::span<const double> second_sorted, std::uint64_t k) {
    const std::size_t m = first_sorted.size(), n = second_sorted.size();
    // Row i: first_sorted[i]; column j: second_sorted taken in descending order, so entries rise
    // along rows and down columns.
    auto entry = [&](std::size_t i, std::size_t j) { return first_sorted[i] - second_sorted[n - 1 - j]; };
    auto start = [](std::size_t) { return std::size_t{0}; };
    // Rounding is monotone, so the k-th smallest rounded difference is the k-th smallest difference
    // rounded: selecting on the raw differences and rounding the one chosen gives the same value,
    // without a logarithm and a power for each of the entries every step looks at.
    return round_significant(select_in_sorted_matrix(m, n, entry, start, k).value);
}

double walsh_average_order_statistic(std::span<const double> sorted, std::uint64_t k) {
    const std::size_t n = sorted.size();
    // The full symmetric matrix of (d_i + d_j)/2 is sorted both ways; row i keeps columns j ≥ i.
    // Halving each term first keeps the sum of two huge values finite.
    auto entry = [&](std::size_t i, std::size_t j) { return 0.5 * sorted[i] + 0.5 * sorted[j]; };
    auto start = [](std::size_t i) { return i; };
    return round_significant(select_in_sorted_matrix(n, n, entry, start, k).value);  // rounded once, as above
}

double hodges_lehmann_shift(std::span<const double> first_sorted, std::span<const double> second_sorted) {
    const std::size_t m = first_sorted.size(), n = second_sorted.size();
    const std::uint64_t count = static_cast<std::uint64_t>(m) * n;
    auto entry = [&](std::size_t i, std::size_t j) { return first_sorted[i] - second_sorted[n - 1 - j]; };
    auto start = [](std::size_t) { return std::size_t{0}; };
    return median_of(select_in_sorted_matrix(m, n, entry, start, (count + 1) / 2), count,
                     [&] { return pairwise_difference_order_statistic(first_sorted, second_sorted, count / 2 + 1); });
}

double hodges_lehmann_pseudo_median(std::span<const double> sorted) {
    const std::size_t n = sorted.size();
    const std::uint64_t count = static_cast<std::uint64_t>(n) * (n + 1) / 2;
    auto entry = [&](std::size_t i, std::size_t j) { return 0.5 * sorted[i] + 0.5 * sorted[j]; };
    auto start = [](std::size_t i) { return i; };
    return median_of(select_in_sorted_matrix(n, n, entry, start, (count + 1) / 2), count,
                     [&] { return walsh_average_order_statistic(sorted, count / 2 + 1); });
}

}  // namespace quadrat
