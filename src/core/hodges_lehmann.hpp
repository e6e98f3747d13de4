// Hodges–Lehmann estimates: the median of the pairwise differences between two groups (the
// location shift) and the median of the Walsh averages of one sample (the pseudo-median), with
// confidence limits taken as order statistics of the same sets (Hodges & Lehmann 1963, Ann. Math.
// Statist. 34, 598–611; Bauer 1972, JASA 67, 687–690).
//
// n₁·n₂ pairwise differences (or n(n+1)/2 Walsh averages) can be 10¹⁰ and more, so they are never
// enumerated for large samples: an order statistic is selected from the implicitly sorted matrix by
// sampled brackets, O(n) per step and a few steps (Floyd & Rivest 1975, CACM 18, 165–172; the
// matrix setting as in Johnson & Mizoguchi 1978, SIAM J. Comput. 7, 147–153, and Monahan 1984,
// ACM TOMS 10, 265–270; hodges_lehmann.cpp says how ties are settled). Every difference or average is rounded
// to 10 significant digits (FUNCTIONS.md, "Ties and precision"); rounding is monotone, so the
// selection runs on the raw values and only the chosen one is rounded (the same value, far cheaper).
#pragma once

#include <cstdint>
#include <span>

namespace quadrat {

// The k-th smallest (1-based, 1 ≤ k ≤ n₁n₂) of round(x_i − y_j) over all pairs.
// Both spans must be sorted ascending.
double pairwise_difference_order_statistic(std::span<const double> first_sorted,
                                           std::span<const double> second_sorted, std::uint64_t k);

// The k-th smallest (1-based, 1 ≤ k ≤ n(n+1)/2) of round((d_i + d_j)/2) over i ≤ j.
// The span must be sorted ascending.
double walsh_average_order_statistic(std::span<const double> sorted, std::uint64_t k);

// Median of the pairwise differences first − second (the Hodges–Lehmann shift). Sorted input.
double hodges_lehmann_shift(std::span<const double> first_sorted, std::span<const double> second_sorted);

// Median of the Walsh averages (the Hodges–Lehmann pseudo-median). Sorted input.
double hodges_lehmann_pseudo_median(std::span<const double> sorted);

}  // namespace quadrat
