#include "correlation.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <numeric>
#include <vector>

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include "data.hpp"
#include "exact_scaling.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

constexpr double not_defined = std::numeric_limits<double>::quiet_NaN();

void refuse_unusable(std::span<const double> x, std::span<const double> y) {
    if (x.size() != y.size()) throw Refusal("x and y must have the same number of values");
    if (x.size() < 3) throw Refusal("needs at least 3 rows with both x and y, found " + std::to_string(x.size()));
    const auto constant = [](std::span<const double> v) {
        return std::all_of(v.begin(), v.end(), [&](double a) { return a == v[0]; });
    };
    if (constant(x)) throw Refusal("x is constant (every used row holds " + format_number(x[0]) + "); a correlation needs spread in both");
    if (constant(y)) throw Refusal("y is constant (every used row holds " + format_number(y[0]) + "); a correlation needs spread in both");
}

// r from centred cross-products, with compensated sums, on each variable divided by the power of
// two nearest above its largest magnitude (exact, r is scale free): values near 1e308, whose sums
// overflow, and denormals, whose squares underflow, then keep their r instead of giving p = 0.
double pearson_r(std::span<const double> x_data, std::span<const double> y_data) {
    const std::vector<double> x = scaled(x_data, power_of_two_scale(x_data)), y = scaled(y_data, power_of_two_scale(y_data));
    const double mx = mean(x), my = mean(y);
    Accumulator sxy;
    for (std::size_t i = 0; i < x.size(); ++i) sxy.add((x[i] - mx) * (y[i] - my));
    const double r = sxy.sum() / std::sqrt(sum_of_squares(x, mx) * sum_of_squares(y, my));
    return std::clamp(r, -1.0, 1.0);
}

// t = r √(df/(1 − r²)) and its two-sided p; |r| = 1 gives t infinite and p = 0.
void add_t_test(TestResult& result, double r, double n) {
    const double df = n - 2.0;
    const double one_minus = (1.0 - r) * (1.0 + r);
    const double t = one_minus > 0 ? r * std::sqrt(df / one_minus) : std::copysign(std::numeric_limits<double>::infinity(), r);
    const double p = std::isfinite(t)
                         ? 2.0 * boost::math::cdf(boost::math::complement(boost::math::students_t(df), std::fabs(t)))
                         : 0.0;
    result.add("statistic", t);
    result.add("df", df);
    result.add("p", p);
    result.words.statistic_symbol = "t";
    result.words.statistic_df = true;
}

// Inversions of v (pairs i < j with v[i] > v[j]), counted while merge-sorting v in place.
std::uint64_t count_inversions(std::vector<double>& v, std::vector<double>& buffer, std::size_t lo, std::size_t hi) {
    if (hi - lo < 2) return 0;
    const std::size_t mid = lo + (hi - lo) / 2;
    std::uint64_t swaps = count_inversions(v, buffer, lo, mid) + count_inversions(v, buffer, mid, hi);
    std::size_t i = lo, j = mid, out = lo;
    while (i < mid && j < hi) {
        if (v[j] < v[i]) {
            swaps += mid - i;  // v[j] jumps every remaining element of the left half
            buffer[out++] = v[j++];
        } else {
            buffer[out++] = v[i++];
        }
    }
    while (i < mid) buffer[out++] = v[i++];
    while (j < hi) buffer[out++] = v[j++];
    std::copy(buffer.begin() + static_cast<std::ptrdiff_t>(lo), buffer.begin() + static_cast<std::ptrdiff_t>(hi),
              v.begin() + static_cast<std::ptrdiff_t>(lo));
    return swaps;
}

// Tie sums over runs of equal values in a sorted sequence: Σ t(t−1)/2, Σ t(t−1)(t−2),
// Σ t(t−1)(2t+5).
struct TieSums {
    double pairs = 0, cubic = 0, variance = 0;
};
template <typename Equal>
TieSums tie_sums(std::size_t n, Equal equal) {
    TieSums s;
    std::size_t run = 1;
    for (std::size_t i = 1; i <= n; ++i) {
        if (i < n && equal(i - 1, i)) {
            ++run;
            continue;
        }
        const double t = static_cast<double>(run);
        s.pairs += t * (t - 1) / 2;
        s.cubic += t * (t - 1) * (t - 2);
        s.variance += t * (t - 1) * (2 * t + 5);
        run = 1;
    }
    return s;
}

// P(I ≤ c) for the number of inversions I of a random permutation of n (Mahonian numbers),
// by the recurrence of adding one element at a time, kept as probabilities (each step divides
// by j). O(n c); called only for n < 50, so c < 613.
double inversions_cdf(std::size_t n, std::size_t c) {
    std::vector<double> f(c + 1, 0.0), next(c + 1);
    f[0] = 1.0;
    for (std::size_t j = 2; j <= n; ++j) {
        // next[m] = (f[m] + f[m−1] + … + f[m−j+1]) / j
        double window = 0;
        for (std::size_t m = 0; m <= c; ++m) {
            window += f[m];
            if (m >= j) window -= f[m - j];
            next[m] = window / static_cast<double>(j);
        }
        f.swap(next);
    }
    double total = 0;
    for (double v : f) total += v;
    return total;
}

}  // namespace

TestResult pearson_correlation(std::span<const double> x, std::span<const double> y, double level) {
    refuse_unusable(x, y);
    const double n = static_cast<double>(x.size());
    const double r = pearson_r(x, y);
    TestResult result;
    result.test = "Pearson's correlation";
    add_t_test(result, r, n);
    result.add("estimate", r);
    // Fisher's z: atanh(r) is near normal with SE 1/√(n − 3); needs n ≥ 4.
    double low = not_defined, high = not_defined;
    if (n > 3) {
        const double z = std::atanh(r);
        const double q = boost::math::quantile(boost::math::complement(boost::math::normal(), (1.0 - level) / 2.0));
        const double se = 1.0 / std::sqrt(n - 3.0);
        low = std::tanh(z - q * se);
        high = std::tanh(z + q * se);
    }
    result.add("ci-low", low);
    result.add("ci-high", high);
    result.words.lead_symbol = "r";
    result.words.lead_quantity = "estimate";
    result.words.lead_interval = true;
    result.words.level = level;
    return result;
}

TestResult spearman_correlation(std::span<const double> x, std::span<const double> y) {
    refuse_unusable(x, y);
    const Ranking rx = rank_with_ties(x), ry = rank_with_ties(y);
    const double r = pearson_r(rx.ranks, ry.ranks);
    const double n = static_cast<double>(x.size());
    TestResult result;
    result.test = "Spearman's rank correlation";
    add_t_test(result, r, n);
    result.add("estimate", r);
    result.words.lead_symbol = "ρ";
    result.words.lead_quantity = "estimate";
    return result;
}

KendallScore kendall_score(std::span<const double> x, std::span<const double> y) {
    const std::size_t n = x.size();
    KendallScore score;
    if (n < 2) return score;

    // Knight (1966): sort by x, then y; ties in x and joint ties are runs of the sorted pairs.
    std::vector<std::size_t> order(n);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return x[a] < x[b] || (x[a] == x[b] && y[a] < y[b]);
    });
    const TieSums x_ties = tie_sums(n, [&](std::size_t a, std::size_t b) { return x[order[a]] == x[order[b]]; });
    const TieSums joint_ties = tie_sums(n, [&](std::size_t a, std::size_t b) {
        return x[order[a]] == x[order[b]] && y[order[a]] == y[order[b]];
    });
    // Discordant pairs are the inversions of y in that order (pairs tied in x are already in y order).
    std::vector<double> ys(n), buffer(n);
    for (std::size_t i = 0; i < n; ++i) ys[i] = y[order[i]];
    score.discordant = count_inversions(ys, buffer, 0, n);
    const TieSums y_ties = tie_sums(n, [&](std::size_t a, std::size_t b) { return ys[a] == ys[b]; });

    const double nn = static_cast<double>(n);
    const double total = nn * (nn - 1) / 2;
    score.s = total - x_ties.pairs - y_ties.pairs + joint_ties.pairs - 2 * static_cast<double>(score.discordant);
    score.denominator = std::sqrt((total - x_ties.pairs) * (total - y_ties.pairs));
    score.ties = x_ties.pairs > 0 || y_ties.pairs > 0;
    // Tie-corrected variance of C − D (Kendall 1970, eq. 4.3); the last term needs n ≥ 3.
    const double v0 = nn * (nn - 1) * (2 * nn + 5);
    score.variance = (v0 - x_ties.variance - y_ties.variance) / 18.0 +
                     (2 * x_ties.pairs) * (2 * y_ties.pairs) / (2 * nn * (nn - 1)) +
                     (n > 2 ? x_ties.cubic * y_ties.cubic / (9 * nn * (nn - 1) * (nn - 2)) : 0.0);
    return score;
}

double kendall_exact_p(std::size_t n, std::uint64_t discordant) {
    // Two-sided: twice the smaller tail of the inversion count (the distribution is symmetric).
    const std::uint64_t all = static_cast<std::uint64_t>(n) * (n - 1) / 2;
    const std::uint64_t c = std::min(discordant, all - discordant);
    return 4 * c == static_cast<std::uint64_t>(n) * (n - 1) ? 1.0
                                                            : std::min(1.0, 2.0 * inversions_cdf(n, static_cast<std::size_t>(c)));
}

TestResult kendall_correlation(std::span<const double> x, std::span<const double> y) {
    refuse_unusable(x, y);
    const std::size_t n = x.size();
    const KendallScore score = kendall_score(x, y);
    const double tau = score.s / score.denominator;

    TestResult result;
    const bool exact = !score.ties && n < 50;
    // The name says how p was found, as the rank-sum and signed-rank tests' names do.
    result.test = exact ? "Kendall's tau-b (exact p)" : "Kendall's tau-b (normal approximation)";
    double p;
    if (exact) {
        p = kendall_exact_p(n, score.discordant);
        result.add("statistic", tau);
    } else {
        const double z = score.s / std::sqrt(score.variance);
        p = 2.0 * boost::math::cdf(boost::math::complement(boost::math::normal(), std::fabs(z)));
        result.add("statistic", z);
    }
    result.add("p", p);
    result.add("estimate", tau);
    result.words.lead_symbol = "τ";
    result.words.lead_quantity = "estimate";
    if (exact)
        result.words.statistic_form = ReportWords::Statistic::none;  // the statistic is τ itself
    else
        result.words.statistic_symbol = "z";
    return result;
}

TestResult relate_correlation(const Range& x, const Range& y, const std::string& method) {
    if (x.empty()) throw Refusal("x is empty");
    if (y.empty()) throw Refusal("y is empty");
    if (x.columns != 1) throw Refusal("x must be one column (found " + std::to_string(x.columns) + ")");
    if (y.columns != 1) throw Refusal("y must be one column (found " + std::to_string(y.columns) + ")");
    // An unknown method is a refusal that lists the valid ones, never a silent Pearson.
    const std::string m = correlation_methods().match(method, "method", "pearson");
    const Frame f = read_frame({{&x, ColumnKind::numeric, "x"}, {&y, ColumnKind::numeric, "y"}});
    TestResult r = m == "spearman" ? spearman_correlation(f.numbers[0], f.numbers[1])
                 : m == "kendall"  ? kendall_correlation(f.numbers[0], f.numbers[1])
                                        : pearson_correlation(f.numbers[0], f.numbers[1]);
    r.add("n", static_cast<double>(f.n_used));
    r.add("n dropped", static_cast<double>(f.n_dropped));
    r.words.shown = true;
    r.words.n_after_p = true;
    return r;
}

}  // namespace quadrat
