// Descriptive building blocks shared by every family. Sums are centred first and accumulated
// with Neumaier's compensated summation, so that data such as NIST's NumAcc4 (values near 1e7
// differing in the eighth digit) keep their digits (Neumaier 1974, ZAMM 54, 39–51).
#pragma once

#include <cstddef>
#include <span>
#include <vector>

namespace quadrat {

// Compensated running sum.
class Accumulator {
public:
    void add(double x);
    double sum() const { return sum_ + compensation_; }

private:
    double sum_ = 0.0;
    double compensation_ = 0.0;
};

double sum(std::span<const double> xs);
double mean(std::span<const double> xs);
// Σ(x − x̄)² with x̄ refined by one correction pass (two-pass algorithm with the Björck
// correction term; Chan, Golub & LeVeque 1983, Am. Statistician 37, 242–247).
double sum_of_squares(std::span<const double> xs, double centre);
// Sample variance with denominator n − 1 (NaN for n < 2).
double variance(std::span<const double> xs);
double standard_deviation(std::span<const double> xs);

// (lowest + highest)/2, each halved first so that the sum cannot overflow.
double mid_range(double lowest, double highest);
// The mean as the mid-range plus the compensated mean deviation from it: no sum of large values
// can overflow. `xs` must not be empty.
double mean_from_mid_range(std::span<const double> xs);

// Median and type-7 quantile (linear interpolation between order statistics; Hyndman & Fan 1996,
// Am. Statistician 50, 361–365). `sorted` must be sorted ascending.
double median_of_sorted(std::span<const double> sorted);
double median(std::vector<double> xs);
double quantile_of_sorted(std::span<const double> sorted, double probability);
// The same type-7 quantiles of unsorted values, by selection (Hoare's FIND: linear time instead of a
// sort, and the very numbers quantile_of_sorted gives on the sorted values). `probabilities`
// ascending; `xs` is reordered.
std::vector<double> quantiles_by_selection(std::vector<double>& xs, std::span<const double> probabilities);

}  // namespace quadrat
