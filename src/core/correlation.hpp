// Correlation between two variables paired by row (RELATE.CORRELATION): Pearson, Spearman and
// Kendall's τ-b.
#pragma once

#include <cstddef>
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

// RELATE.CORRELATION: reads x and y (a row is used when both hold numbers), runs `method`
// (pearson, spearman, kendall; already matched) and adds n and n dropped.
TestResult relate_correlation(const Range& x, const Range& y, const std::string& method);

}  // namespace quadrat
