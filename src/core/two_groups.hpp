// Two independent groups: Welch's and Student's t-tests and the Wilcoxon–Mann–Whitney rank-sum
// test. Each returns the catalogue's quantities under the output keywords — statistic, df, p, n,
// estimate, ci-low, ci-high, effect — with the estimate as first minus second.
#pragma once

#include <span>
#include <vector>

#include "result.hpp"

namespace quadrat {

// Welch's t-test (unequal variances) with the Welch–Satterthwaite df.
// Welch, B. L. (1947) Biometrika 34, 28–35; Satterthwaite, F. E. (1946) Biometrics Bull. 2, 110–114.
// estimate: mean difference with its t interval; effect: Hedges' g (pooled SD, small-sample factor).
TestResult welch_t_test(std::span<const double> first, std::span<const double> second, double level);

// Student's two-sample t-test with the pooled variance, df = n₁ + n₂ − 2.
TestResult pooled_t_test(std::span<const double> first, std::span<const double> second, double level);

// Wilcoxon–Mann–Whitney rank-sum test (Mann & Whitney 1947, Ann. Math. Statist. 18, 50–60).
// statistic U₁ = R₁ − n₁(n₁+1)/2; exact p when there are no ties and both groups have fewer than
// 50 values, else the normal approximation with tie and continuity corrections. estimate: the
// Hodges–Lehmann shift with its interval from the order statistics of the pairwise differences at
// the critical values of U; effect: rank-biserial r = 2U₁/(n₁n₂) − 1.
TestResult rank_sum_test(std::span<const double> first, std::span<const double> second, double level);

// Hedges' g: (x̄₁ − x̄₂)/s_pooled × (1 − 3/(4(n₁+n₂) − 9)) (Hedges 1981, J. Educ. Stat. 6, 107–128),
// with its interval: the noncentrality interval of the pooled t = d·√(n₁n₂/(n₁+n₂)) on n₁+n₂−2 df
// (effect_interval.hpp), carried back to d and multiplied by the same small-sample factor.
struct EffectWithInterval {
    double value, low, high;
};
EffectWithInterval hedges_g(std::span<const double> first, std::span<const double> second, double level);

// Exact null distribution of U for group sizes m and n without ties: P(U = u), u = 0..mn.
// Bounded: only called for m, n < 50 (at most 2401 + 1 values, about 1.5 million additions).
std::vector<double> rank_sum_null_distribution(std::size_t m, std::size_t n);

}  // namespace quadrat
