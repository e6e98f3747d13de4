// Two or more groups: COMPARE.GROUPS. Three or more groups go to Welch's one-way ANOVA, the classic
// one-way ANOVA or Kruskal–Wallis; two groups to the tests of two_groups.hpp.
#pragma once

#include "effect_interval.hpp"

#include <span>
#include <string>
#include <vector>

#include "data.hpp"
#include "result.hpp"
#include "transform.hpp"

namespace quadrat {

// The classic one-way analysis of variance table. Data are centred on the grand mean before any
// sum, each group's SS taken about its own mean and the between SS from the centred group means,
// all with compensated sums (summary.hpp): NIST StRD SmLs07–09 (values 1e12 + small) keep their digits.
struct AnovaTable {
    double ss_between = 0, ss_within = 0, df_between = 0, df_within = 0;
    double ms_between = 0, ms_within = 0, f = 0, p = 1;
};
AnovaTable one_way_anova_table(std::span<const std::vector<double>> groups);

// ω² = (SS_between − (k−1)·MS_within)/(SS_total + MS_within) (Hays 1963; Olejnik & Algina 2003,
// Psychol. Methods 8, 434–447). Can be slightly negative when F < 1; given as computed.
double omega_squared(const AnovaTable& table);

// The interval of ω² at 95%: the noncentrality interval of the classic F (effect_interval.hpp)
// carried to ω² = λ/(λ + N) (Steiger 2004, Psychological Methods 9, 164–182). Both methods of
// COMPARE.GROUPS report it, as they report the same ω².
Interval omega_squared_interval(const AnovaTable& table, double n);

// Classic one-way ANOVA: F = MS_between/MS_within on (k−1, N−k) df. estimate: largest minus
// smallest group mean; effect: ω².
TestResult classic_one_way_anova(std::span<const std::vector<double>> groups);

// Welch's one-way ANOVA for unequal variances (Welch, B. L. 1951, Biometrika 38, 330–336):
// weights w_i = n_i/s_i², F = [Σw_i(x̄_i − x̄_w)²/(k−1)] / [1 + 2(k−2)/(k²−1)·Λ],
// Λ = Σ(1 − w_i/W)²/(n_i − 1), df = (k−1, (k²−1)/(3Λ)). estimate and effect as the classic one.
TestResult welch_one_way_anova(std::span<const std::vector<double>> groups);

// Kruskal–Wallis H with the tie correction, χ² on k−1 df (Kruskal & Wallis 1952, JASA 47,
// 583–621). estimate: largest minus smallest group median; effect ε² = H/(N − 1)
// (Tomczak & Tomczak 2014, Trends Sport Sci. 21, 19–25).
TestResult kruskal_wallis_test(std::span<const std::vector<double>> groups);

// COMPARE.GROUPS: method welch, pooled or ranks; the transform applied first; the result with
// `n dropped`, the per-group n and means (medians for ranks) on the data's scale, the transform's
// note and the report sentence.
TestResult compare_groups(const Groups& groups, const std::string& method, Transform transform, double level = 0.95);

}  // namespace quadrat
