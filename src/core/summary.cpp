#include "summary.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace quadrat {

void Accumulator::add(double x) {
    // Neumaier's variant of Kahan summation: also exact when |x| exceeds the running sum.
    const double t = sum_ + x;
    if (std::fabs(sum_) >= std::fabs(x))
        compensation_ += (sum_ - t) + x;
    else
        compensation_ += (x - t) + sum_;
    sum_ = t;
}

double sum(std::span<const double> xs) {
    Accumulator acc;
    for (double x : xs) acc.add(x);
    return acc.sum();
}

namespace {

// The mean of the values times 2^−e (exact for e ≥ 0 unless a value falls below the normal range,
// which cannot matter next to values whose sum overflows), refined by one pass: the mean of the
// residuals from the first estimate.
double mean_scaled_down(std::span<const double> xs, int e) {
    const double n = static_cast<double>(xs.size());
    Accumulator total;
    for (double x : xs) total.add(e == 0 ? x : std::ldexp(x, -e));
    const double first = total.sum() / n;
    Accumulator residual;
    for (double x : xs) residual.add((e == 0 ? x : std::ldexp(x, -e)) - first);
    return first + residual.sum() / n;
}

}  // namespace

double mean(std::span<const double> xs) {
    if (xs.empty()) return std::numeric_limits<double>::quiet_NaN();
    const double m = mean_scaled_down(xs, 0);
    if (std::isfinite(m) || !std::all_of(xs.begin(), xs.end(), [](double x) { return std::isfinite(x); })) return m;
    // Finite values whose sum overflows (a column of readings near 1e308): the same mean of the
    // values scaled down by a power of two at least n, so that no partial sum can overflow.
    const int e = std::ilogb(static_cast<double>(xs.size())) + 2;
    return std::ldexp(mean_scaled_down(xs, e), e);
}

double mid_range(double lowest, double highest) { return lowest / 2 + highest / 2; }

double mean_from_mid_range(std::span<const double> xs) {
    const auto [lowest, highest] = std::minmax_element(xs.begin(), xs.end());
    const double mid = mid_range(*lowest, *highest);
    Accumulator deviation;
    for (double x : xs) deviation.add(x - mid);
    return mid + deviation.sum() / static_cast<double>(xs.size());
}

double sum_of_squares(std::span<const double> xs, double centre) {
    Accumulator squares, deviations;
    for (double x : xs) {
        const double d = x - centre;
        squares.add(d * d);
        deviations.add(d);
    }
    // Correction term of the two-pass algorithm: removes the error left in `centre`.
    const double n = static_cast<double>(xs.size());
    const double s = deviations.sum();
    return std::max(0.0, squares.sum() - s * s / n);
}

double variance(std::span<const double> xs) {
    if (xs.size() < 2) return std::numeric_limits<double>::quiet_NaN();
    return sum_of_squares(xs, mean(xs)) / static_cast<double>(xs.size() - 1);
}

double standard_deviation(std::span<const double> xs) { return std::sqrt(variance(xs)); }

double median_of_sorted(std::span<const double> sorted) {
    return quantile_of_sorted(sorted, 0.5);
}

double median(std::vector<double> xs) {
    const double half[] = {0.5};
    return quantiles_by_selection(xs, half).front();
}

double quantile_of_sorted(std::span<const double> sorted, double probability) {
    if (sorted.empty()) return std::numeric_limits<double>::quiet_NaN();
    const double h = (static_cast<double>(sorted.size()) - 1.0) * probability;
    const auto lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
    return sorted[lo] + (h - static_cast<double>(lo)) * (sorted[hi] - sorted[lo]);
}

std::vector<double> quantiles_by_selection(std::vector<double>& xs, std::span<const double> probabilities) {
    std::vector<double> out;
    out.reserve(probabilities.size());
    const std::size_t n = xs.size();
    // Nothing from xs[placed] on is smaller than what lies before it, and the order statistics
    // placed so far hold their sorted places (with ascending probabilities, a position below
    // `placed` asked again is one of the last two placed).
    std::size_t placed = 0;
    auto place = [&](std::size_t i) {
        if (i < placed) return;
        if (i == placed)  // the smallest of the rest
            std::iter_swap(xs.begin() + static_cast<std::ptrdiff_t>(i),
                           std::min_element(xs.begin() + static_cast<std::ptrdiff_t>(i), xs.end()));
        else
            std::nth_element(xs.begin() + static_cast<std::ptrdiff_t>(placed), xs.begin() + static_cast<std::ptrdiff_t>(i),
                             xs.end());
        placed = i + 1;
    };
    for (double probability : probabilities) {
        if (n == 0) {
            out.push_back(std::numeric_limits<double>::quiet_NaN());
            continue;
        }
        // As quantile_of_sorted, on the order statistics lo and hi.
        const double h = (static_cast<double>(n) - 1.0) * probability;
        const auto lo = static_cast<std::size_t>(std::floor(h));
        const std::size_t hi = std::min(lo + 1, n - 1);
        place(lo);
        place(hi);
        out.push_back(xs[lo] + (h - static_cast<double>(lo)) * (xs[hi] - xs[lo]));
    }
    return out;
}

}  // namespace quadrat
