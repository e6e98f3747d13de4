#include "two_groups.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include "effect_interval.hpp"
#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "hodges_lehmann.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

constexpr double not_available = std::numeric_limits<double>::quiet_NaN();

// What the two t-tests share about one group, computed on values scaled by a power of two.
struct GroupSummary {
    double n = 0, mean = 0, sum_of_squares = 0, variance = 0;
};

GroupSummary summarize(std::span<const double> xs) {
    GroupSummary s;
    s.n = static_cast<double>(xs.size());
    s.mean = quadrat::mean(xs);
    s.sum_of_squares = quadrat::sum_of_squares(xs, s.mean);
    s.variance = s.sum_of_squares / (s.n - 1);
    return s;
}

void require_two_values(std::span<const double> first, std::span<const double> second) {
    if (first.size() < 2 || second.size() < 2)
        throw Refusal("each group needs at least 2 values, found " + std::to_string(first.size()) + " and " +
                      std::to_string(second.size()));
    require_finite(first);
    require_finite(second);
}

// Hedges' g and its interval from the two groups' summaries (on values scaled alike).
EffectWithInterval hedges_g_of(const GroupSummary& a, const GroupSummary& b, double level) {
    const double pooled_sd = std::sqrt((a.sum_of_squares + b.sum_of_squares) / (a.n + b.n - 2));
    if (!(pooled_sd > 0)) return {not_available, not_available, not_available};
    const double correction = 1 - 3 / (4 * (a.n + b.n) - 9);
    const double d = (a.mean - b.mean) / pooled_sd;
    const double root_pairs = std::sqrt(a.n * b.n / (a.n + b.n));  // t = d · √(n₁n₂/(n₁+n₂))
    const Interval delta = noncentral_t_interval(d * root_pairs, a.n + b.n - 2, level);
    return {d * correction, delta.low / root_pairs * correction, delta.high / root_pairs * correction};
}

double two_sided_t_p(double t, double df) {
    const boost::math::students_t dist(df);
    return std::min(1.0, 2.0 * cdf(complement(dist, std::fabs(t))));
}

double t_critical(double df, double level) {
    const boost::math::students_t dist(df);
    return quantile(complement(dist, (1.0 - level) / 2.0));
}

// The two t-tests differ only in the standard error and its df.
TestResult t_test(std::span<const double> first_raw, std::span<const double> second_raw, double level, bool pooled) {
    require_two_values(first_raw, second_raw);
    const std::span<const double> both[] = {first_raw, second_raw};
    const double scale = power_of_two_scale(both);
    const std::vector<double> first = scaled(first_raw, scale), second = scaled(second_raw, scale);
    const GroupSummary a = summarize(first), b = summarize(second);
    if (a.sum_of_squares == 0 && b.sum_of_squares == 0)
        throw Refusal("both groups have zero spread (all values equal within each group); a t-test needs spread");

    const double difference = a.mean - b.mean;
    double standard_error = 0, df = 0;
    if (pooled) {
        df = a.n + b.n - 2;
        const double pooled_variance = (a.sum_of_squares + b.sum_of_squares) / df;
        standard_error = std::sqrt(pooled_variance * (1 / a.n + 1 / b.n));
    } else {
        // Welch–Satterthwaite: df = (v₁ + v₂)² / (v₁²/(n₁−1) + v₂²/(n₂−1)), v = s²/n.
        const double v1 = a.variance / a.n, v2 = b.variance / b.n;
        standard_error = std::sqrt(v1 + v2);
        df = (v1 + v2) * (v1 + v2) / (v1 * v1 / (a.n - 1) + v2 * v2 / (b.n - 1));
    }
    const double t = require_finite_statistic(difference / standard_error, "t");
    if (!(df > 0 && std::isfinite(df))) throw Refusal("the degrees of freedom cannot be computed for these data");
    const double margin = t_critical(df, level) * standard_error;
    const EffectWithInterval g = hedges_g_of(a, b, level);

    TestResult r;
    r.test = pooled ? "Student's t-test (two groups, pooled variance)" : "Welch's t-test (two groups)";
    r.add("statistic", t)
        .add("df", df)
        .add("p", two_sided_t_p(t, df))
        .add("n", a.n + b.n)
        .add("estimate", difference / scale)
        .add("ci-low", (difference - margin) / scale)
        .add("ci-high", (difference + margin) / scale)
        .add("effect", g.value)
        .add("effect ci-low", g.low)
        .add("effect ci-high", g.high);
    r.words.statistic_symbol = "t";
    r.words.statistic_df = true;
    r.words.estimate = "mean difference";
    r.words.effect = "Hedges' g";
    return r;
}

}  // namespace

EffectWithInterval hedges_g(std::span<const double> first_raw, std::span<const double> second_raw, double level) {
    const std::span<const double> both[] = {first_raw, second_raw};
    const double scale = power_of_two_scale(both);
    const std::vector<double> first = scaled(first_raw, scale), second = scaled(second_raw, scale);
    return hedges_g_of(summarize(first), summarize(second), level);
}

TestResult welch_t_test(std::span<const double> first, std::span<const double> second, double level) {
    return t_test(first, second, level, false);
}

TestResult pooled_t_test(std::span<const double> first, std::span<const double> second, double level) {
    return t_test(first, second, level, true);
}

std::vector<double> rank_sum_null_distribution(std::size_t m, std::size_t n) {
    // Recursion on the largest observation (Mann & Whitney 1947): it is from the first group with
    // probability m'/(m'+n') and then beats all n' values of the second group, so
    // P(U = u | m', n') = m'/(m'+n')·P(U = u − n' | m'−1, n') + n'/(m'+n')·P(U = u | m', n'−1).
    // Probabilities rather than counts: all terms are positive, so the tails keep their digits.
    std::vector<std::vector<double>> previous(n + 1, std::vector<double>{1.0}), current(n + 1);
    for (std::size_t i = 1; i <= m; ++i) {
        current[0].assign(1, 1.0);
        for (std::size_t j = 1; j <= n; ++j) {
            std::vector<double>& out = current[j];
            out.assign(i * j + 1, 0.0);
            const double from_first = static_cast<double>(i) / static_cast<double>(i + j);
            const double from_second = 1.0 - from_first;
            const std::vector<double>& shifted = previous[j];  // m' − 1 = i − 1, n' = j
            for (std::size_t u = 0; u < shifted.size(); ++u) out[u + j] += from_first * shifted[u];
            const std::vector<double>& same = current[j - 1];  // m' = i, n' = j − 1
            for (std::size_t u = 0; u < same.size(); ++u) out[u] += from_second * same[u];
        }
        std::swap(previous, current);
    }
    return previous[n];
}

TestResult rank_sum_test(std::span<const double> first, std::span<const double> second, double level) {
    require_two_values(first, second);
    const std::size_t m = first.size(), n = second.size();
    std::vector<double> pooled(first.begin(), first.end());
    pooled.insert(pooled.end(), second.begin(), second.end());
    const Ranking ranking = rank_with_ties(pooled);
    const double total = static_cast<double>(m + n);
    if (ranking.tie_term == total * total * total - total)
        throw Refusal("all values are equal; a rank test needs at least two different values");

    double rank_sum_first = 0;
    for (std::size_t i = 0; i < m; ++i) rank_sum_first += ranking.ranks[i];
    const double dm = static_cast<double>(m), dn = static_cast<double>(n), pairs = dm * dn;
    const double u1 = rank_sum_first - dm * (dm + 1) / 2;
    const double alpha_half = (1.0 - level) / 2.0;
    const bool exact = !ranking.has_ties() && m < 50 && n < 50;

    double p = 1.0;
    std::uint64_t k = 0;  // confidence limits: the k-th smallest and k-th largest pairwise difference
    if (exact) {
        const ExactRankInference e = exact_rank_inference(rank_sum_null_distribution(m, n), u1, level);
        p = e.p;
        k = e.interval_position;
    } else {
        // Normal approximation: Var(U) = mn/12·((N+1) − Σ(t³−t)/(N(N−1))), continuity correction 1/2.
        const double sd = std::sqrt(pairs / 12.0 * ((total + 1) - ranking.tie_term / (total * (total - 1))));
        const double z = std::max(0.0, std::fabs(u1 - pairs / 2) - 0.5) / sd;
        const boost::math::normal standard;
        p = std::min(1.0, 2.0 * cdf(complement(standard, z)));
        // Interval without continuity correction: k = ⌊mn/2 − z₁₋α/₂·sd⌋.
        const double critical = quantile(complement(standard, alpha_half));
        const double position = std::floor(pairs / 2 - critical * sd);
        k = position >= 1 ? static_cast<std::uint64_t>(position) : 0;
    }

    std::vector<double> x(first.begin(), first.end()), y(second.begin(), second.end());
    std::sort(x.begin(), x.end());
    std::sort(y.begin(), y.end());
    const double shift = hodges_lehmann_shift(x, y);
    const std::uint64_t count = static_cast<std::uint64_t>(m) * n;
    double low = not_available, high = not_available;
    if (k >= 1 && k <= count / 2 + 1) {
        low = pairwise_difference_order_statistic(x, y, k);
        high = pairwise_difference_order_statistic(x, y, count + 1 - k);
    }

    TestResult r;
    r.test = exact ? "Wilcoxon–Mann–Whitney rank-sum test (exact p)"
                   : "Wilcoxon–Mann–Whitney rank-sum test (normal approximation)";
    r.add("statistic", u1).add("p", p).add("n", total).add("estimate", shift);
    // Too few values for the level: no finite interval exists; the cell says so instead of a number.
    if (std::isfinite(low)) {
        r.add("ci-low", low).add("ci-high", high);
    } else {
        const std::string text = "too few values for a " + format_level(level) + " interval";
        r.add("ci-low", text).add("ci-high", text);
    }
    r.add("effect", 2 * u1 / pairs - 1);
    r.words.statistic_form = ReportWords::Statistic::whole;
    r.words.statistic_symbol = "U";
    r.words.estimate = "Hodges–Lehmann shift";
    r.words.effect = "rank-biserial r";
    return r;
}

}  // namespace quadrat
