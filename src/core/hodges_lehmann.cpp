#include "hodges_lehmann.hpp"

#include <algorithm>
#include <utility>
#include <vector>

#include "ranks.hpp"
#include "refusal.hpp"

namespace quadrat {

namespace {

// The weighted median of (value, weight) pairs whose weights sum to `total`: the smallest value
// whose own and smaller values' weights reach half the total. Quickselect on the values with the
// weights carried along: expected O(pairs), where sorting the pairs every step cost O(rows log rows)
// and was most of the time of a selection. Reorders `pairs`.
double weighted_median(std::vector<std::pair<double, std::uint64_t>>& pairs, std::uint64_t total) {
    auto first = pairs.begin(), last = pairs.end();
    std::uint64_t below = 0;  // weight of the pairs known to lie below [first, last)
    auto by_value = [](const auto& a, const auto& b) { return a.first < b.first; };
    while (last - first > 1) {
        const auto middle = first + (last - first) / 2;
        std::nth_element(first, middle, last, by_value);
        std::uint64_t left = below;
        for (auto it = first; it != middle; ++it) left += it->second;
        if (2 * left >= total)
            last = middle;
        else if (2 * (left + middle->second) >= total)
            return middle->first;
        else {
            below = left + middle->second;
            first = middle + 1;
        }
    }
    return first->first;
}

// Selection in a matrix whose entries never decrease along a row nor down a column, restricted to
// row i's columns [start(i), columns). Johnson & Mizoguchi (1978): each step takes the weighted
// median of the row medians of the still-possible entries as a pivot, counts the entries below and
// at it with one staircase sweep (O(rows + columns)), and discards every entry on the wrong side of
// it; at least a quarter of the candidates goes each step, so O(log(rows·columns)) steps.
template <class Entry, class Start>
double select_in_sorted_matrix(std::size_t rows, std::size_t columns, Entry entry, Start start, std::uint64_t k) {
    const std::uint64_t target = k - 1;  // 0-based rank of the wanted entry
    std::vector<std::size_t> lo(rows), hi(rows, columns), less(rows), at_most(rows);
    for (std::size_t i = 0; i < rows; ++i) lo[i] = start(i);
    std::vector<std::pair<double, std::uint64_t>> medians;
    medians.reserve(rows);

    // Candidates few enough: list them and pick directly.
    const std::uint64_t enumerate_below = std::max<std::uint64_t>(1024, 4 * (rows + columns));
    for (int step = 0; step < 400; ++step) {
        std::uint64_t active = 0, discarded_below = 0;
        for (std::size_t i = 0; i < rows; ++i) {
            active += hi[i] - lo[i];
            discarded_below += lo[i] - start(i);
        }
        if (active <= enumerate_below) {
            std::vector<double> candidates;
            candidates.reserve(active);
            for (std::size_t i = 0; i < rows; ++i)
                for (std::size_t j = lo[i]; j < hi[i]; ++j) candidates.push_back(entry(i, j));
            if (candidates.empty() || target < discarded_below || target - discarded_below >= candidates.size())
                throw Refusal("internal inconsistency while selecting an order statistic of differences");
            auto nth = candidates.begin() + static_cast<std::ptrdiff_t>(target - discarded_below);
            std::nth_element(candidates.begin(), nth, candidates.end());
            return *nth;
        }
        medians.clear();
        for (std::size_t i = 0; i < rows; ++i)
            if (hi[i] > lo[i]) medians.emplace_back(entry(i, lo[i] + (hi[i] - lo[i]) / 2), hi[i] - lo[i]);
        const double pivot = weighted_median(medians, active);
        // Staircase sweep: the count of entries below the pivot in a row never grows down the rows.
        std::uint64_t total_less = 0, total_at_most = 0;
        std::size_t j_less = columns, j_at_most = columns;
        for (std::size_t i = 0; i < rows; ++i) {
            while (j_less > 0 && entry(i, j_less - 1) >= pivot) --j_less;
            while (j_at_most > 0 && entry(i, j_at_most - 1) > pivot) --j_at_most;
            less[i] = std::max(start(i), j_less);
            at_most[i] = std::max(start(i), j_at_most);
            total_less += less[i] - start(i);
            total_at_most += at_most[i] - start(i);
        }
        if (target < total_less) {
            for (std::size_t i = 0; i < rows; ++i) hi[i] = std::max(lo[i], std::min(hi[i], less[i]));
        } else if (target >= total_at_most) {
            for (std::size_t i = 0; i < rows; ++i) lo[i] = std::min(hi[i], std::max(lo[i], at_most[i]));
        } else {
            return pivot;
        }
    }
    throw Refusal("could not select an order statistic of differences; please report this data set");
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
    return round_significant(select_in_sorted_matrix(m, n, entry, start, k));
}

double walsh_average_order_statistic(std::span<const double> sorted, std::uint64_t k) {
    const std::size_t n = sorted.size();
    // The full symmetric matrix of (d_i + d_j)/2 is sorted both ways; row i keeps columns j ≥ i.
    // Halving each term first keeps the sum of two huge values finite.
    auto entry = [&](std::size_t i, std::size_t j) { return 0.5 * sorted[i] + 0.5 * sorted[j]; };
    auto start = [](std::size_t i) { return i; };
    return round_significant(select_in_sorted_matrix(n, n, entry, start, k));  // rounded once, as above
}

double hodges_lehmann_shift(std::span<const double> first_sorted, std::span<const double> second_sorted) {
    const std::uint64_t count = static_cast<std::uint64_t>(first_sorted.size()) * second_sorted.size();
    if (count % 2 == 1) return pairwise_difference_order_statistic(first_sorted, second_sorted, count / 2 + 1);
    return 0.5 * pairwise_difference_order_statistic(first_sorted, second_sorted, count / 2) +
           0.5 * pairwise_difference_order_statistic(first_sorted, second_sorted, count / 2 + 1);
}

double hodges_lehmann_pseudo_median(std::span<const double> sorted) {
    const std::uint64_t n = sorted.size();
    const std::uint64_t count = n * (n + 1) / 2;
    if (count % 2 == 1) return walsh_average_order_statistic(sorted, count / 2 + 1);
    return 0.5 * walsh_average_order_statistic(sorted, count / 2) +
           0.5 * walsh_average_order_statistic(sorted, count / 2 + 1);
}

}  // namespace quadrat
