// Correlation between two variables paired by row (RELATE.CORRELATION): Pearson, Spearman and
// Kendall's τ-b.
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>
#include <string>

#include "cells.hpp"
#include "result.hpp"

namespace quadrat {

// Pearson's r; t = r √((n − 2)/(1 − r²)) with n − 2 df; confidence limits by Fisher's z
// transformation (Fisher 1921, Metron 1, 3–32), at `level`.
TestResult pearson_correlation(std::span<const double> x, std::span<const double> y, double level = 0.95);

// Spearman's ρ: Pearson's r of the mid-ranks; p from the same t approximation.
TestResult spearman_correlation(std::span<const double> x, std::span<const double> y);

// Kendall's τ-b, counted in O(n log n) by Knight's merge sort (Knight 1966, JASA 61, 436–439).
// With no ties and n < 50 the p-value is exact, from the distribution of the number of inversions
// of a random permutation, and the statistic is τ; otherwise the normal approximation with the
// tie-corrected variance (Kendall 1970, Rank Correlation Methods, 4th ed., ch. 4), statistic z.
TestResult kendall_correlation(std::span<const double> x, std::span<const double> y);

// Kendall's score of y against x, shared by RELATE.CORRELATION's `kendall` and TRACK.TREND (the
// Mann–Kendall S is this score of the values against time). Pairs tied in x or in y count 0.
struct KendallScore {
    double s = 0;                   // concordant minus discordant pairs
    double variance = 0;            // of S with no association, corrected for ties in x and in y
                                    // (Kendall 1970, Rank Correlation Methods, 4th ed., eq. 4.3)
    double denominator = 0;         // √((N − Tx)(N − Ty)) over the N = n(n−1)/2 pairs: τ-b = s / denominator
    std::uint64_t discordant = 0;   // inversions of y in x order
    bool ties = false;              // some values tie in x or in y
};
// O(n log n) by Knight's merge sort (Knight 1966, JASA 61, 436–439). Any n, even 0 or 1.
KendallScore kendall_score(std::span<const double> x, std::span<const double> y);

// The two-sided exact p of Kendall's statistic for n < 50 untied pairs with `discordant`
// inversions: twice the smaller tail of the number of inversions of a random permutation
// (Mahonian numbers), 1 at the centre.
double kendall_exact_p(std::size_t n, std::uint64_t discordant);

// RELATE.CORRELATION: reads x and y (a row is used when both hold numbers), runs `method`
// (pearson, spearman, kendall; already matched) and adds n and n dropped.
TestResult relate_correlation(const Range& x, const Range& y, const std::string& method);

}  // namespace quadrat
