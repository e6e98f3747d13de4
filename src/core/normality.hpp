// CHECK.NORMAL and CHECK.QQ: is a sample (or the residuals from the group means) normal?
// Every test is location and scale invariant, so values are first centred on the mid-range and
// divided by the range: a 1e300 among ordinary readings cannot overflow a sum of squares, nor can
// values a few denormals apart underflow to zero spread.
#pragma once

#include <span>
#include <string>
#include <vector>

#include "data.hpp"
#include "result.hpp"

namespace quadrat {

// Shapiro–Wilk W and its p-value for 3 <= n <= 5000 (quantities: statistic, p, n).
// Royston, P. (1995) Remark AS R94, Applied Statistics 44(4), 547–551; n = 3 has an exact p.
// 1 − W is accumulated directly as a residual sum of squares: W close to 1 loses digits otherwise.
TestResult shapiro_wilk(std::span<const double> values);

// Shapiro–Francia W′ for 5 <= n <= 5000, p by Royston, P. (1993) Statistics in Medicine 12, 181–184.
TestResult shapiro_francia(std::span<const double> values);

// Anderson–Darling A² with mean and SD estimated (n >= 8); p from A*² = A²(1 + 0.75/n + 2.25/n²)
// by D'Agostino & Stephens (1986) Goodness-of-Fit Techniques, Table 4.9.
TestResult anderson_darling(std::span<const double> values);

// Lilliefors D (Kolmogorov–Smirnov with mean and SD estimated, n >= 5); p by Dallal & Wilkinson
// (1986) American Statistician 40, 294–296, extended above p = 0.1 (see normality.cpp).
TestResult lilliefors(std::span<const double> values);

// D'Agostino's K² omnibus of skewness and kurtosis (n >= 8): D'Agostino, Belanger & D'Agostino
// (1990) American Statistician 44, 316–321; kurtosis by Anscombe & Glynn (1983) Biometrika 70, 227–234.
TestResult dagostino_pearson(std::span<const double> values);

// Jarque–Bera JB = n/6 (S² + (K − 3)²/4), χ² with 2 df (n >= 8); Jarque & Bera (1987)
// International Statistical Review 55, 163–172.
TestResult jarque_bera(std::span<const double> values);

// CHECK.NORMAL's methods in catalogue order (the first is the default).
// One method by its catalogue keyword.
TestResult normality_test(std::span<const double> values, const std::string& method);

// Values minus their group mean, in group order (one group: the values minus their mean).
std::vector<double> residuals_from_group_means(const Groups& groups);

// CHECK.NORMAL: one group is tested as it is; two or more (long or wide format) through the
// residuals from the group means, and the table adds `<group>: statistic` and `<group>: p` for
// each group's own test (a refusal text when a group is too small for the method).
TestResult check_normal(const Groups& groups, const std::string& method);

// A normal Q-Q point: the normal quantile at the Blom position (i − 3/8)/(n + 1/4)
// (Blom 1958, Statistical Estimates and Transformed Beta-Variables) and the i-th sorted value.
struct QQPoint {
    double normal_quantile;
    double sorted_value;
};
std::vector<QQPoint> normal_qq(std::span<const double> values);

// CHECK.QQ: `rows` rows (the input range's) of 2 columns, no header — normal quantile and sorted
// value (with two or more groups, the sorted residuals from the group means); blank beyond n.
// Wide format is refused: its points would not fit beside a range of `rows` rows.
Table check_qq(const Groups& groups, std::size_t rows);

}  // namespace quadrat
