// Exact rescaling by powers of two. Multiplying a binary64 number by 2^k changes its exponent and
// no digit (as long as it stays a normal number), so a scale-free method can work on values near 1
// instead of near 1e308, whose sums overflow, or among denormals, whose squares underflow.
#pragma once

#include <span>
#include <vector>

namespace quadrat {

// The power of two that brings the largest |x| of the groups into [0.5, 1); 1 when every value is 0
// or one is not finite. Its exponent is clamped to ±1000, so that the scale and the reciprocal of
// its square stay normal numbers (denormal data).
double power_of_two_scale(std::span<const std::span<const double>> groups);
double power_of_two_scale(std::span<const double> values);

// The values times `scale` (a power of two: exact), one group or several.
std::vector<double> scaled(std::span<const double> values, double scale);
std::vector<std::vector<double>> scaled(std::span<const std::vector<double>> groups, double scale);

// 2^k ≤ x < 2^(k+1), for x > 0: the power of two at or just below x.
double power_of_two_below(double x);

// The exponent e that brings the range into [1, 2): (highest − lowest)·2^−e, also where
// highest − lowest itself overflows.
int range_exponent(double lowest, double highest);

}  // namespace quadrat
