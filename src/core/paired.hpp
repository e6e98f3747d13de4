// Readings paired by row (before/after, upstream/downstream), or one sample against a number:
// COMPARE.PAIRED. Every test works on the differences first − second.
#pragma once

#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "cells.hpp"
#include "result.hpp"
#include "transform.hpp"

namespace quadrat {

// Paired t-test (Student 1908, Biometrika 6, 1–25) on the differences: t = d̄/(s_d/√n) on n − 1 df.
// estimate: mean difference with its t interval; effect: Cohen's d of the differences, d̄/s_d.
TestResult paired_t_test(std::span<const double> differences, double level, bool one_sample = false);

// Wilcoxon signed-rank test (Wilcoxon 1945, Biometrics Bull. 1, 80–83). Differences are rounded to
// 10 significant digits and zeros dropped first; n is what remains. statistic T⁺, the sum of the
// ranks of the positive differences; exact p when there are no ties and n < 50, else the normal
// approximation with tie and continuity corrections. estimate: Hodges–Lehmann pseudo-median (median
// of the Walsh averages) with its interval from their order statistics at the critical values of
// T⁺; effect: matched-pairs rank-biserial r = (T⁺ − T⁻)/(T⁺ + T⁻) (Kerby 2014, Compr. Psychol. 3, 11.IT.3.1).
TestResult signed_rank_test(std::span<const double> differences, double level, bool one_sample = false);

// Sign test: exact binomial (n, ½) on the number of positive differences, zeros dropped first.
// estimate: median difference with its interval from the order statistics of the differences at the
// binomial critical values; effect: matched-pairs rank-biserial r as for the signed-rank test.
TestResult sign_test(std::span<const double> differences, double level, bool one_sample = false);

// Exact null distribution of T⁺ without ties: P(T⁺ = t), t = 0..n(n+1)/2. Bounded: called for n < 50
// (1226 values, about 30 000 additions); the counts are below 2⁴⁹ and exact in a double.
std::vector<double> signed_rank_null_distribution(std::size_t n);

// The readings of COMPARE.PAIRED as read from the sheet.
struct PairedReadings {
    std::vector<double> first, second;  // same length; `second` unused for one sample
    bool one_sample = false;
    double reference_value = 0;         // the number `second` held, for one sample
    std::string first_name = "first", second_name = "second";
    std::size_t n_dropped = 0;
};

// COMPARE.PAIRED: method t, signed-rank or sign; the transform applied to both readings (and to the
// reference value) first; the result with n dropped, the zero differences dropped by the rank
// methods, the two sides' means (medians for rank methods) and the report sentence.
TestResult compare_paired(const PairedReadings& readings, const std::string& method, Transform transform,
                          double level = 0.95);

// COMPARE.PAIRED's cells: `second` a column of readings beside `first`, or a single number that
// makes it a one-sample test against that value.
PairedReadings read_paired(const Range& first, const Range& second);

}  // namespace quadrat
