#include "paired.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include "data.hpp"
#include "effect_interval.hpp"
#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "hodges_lehmann.hpp"
#include "keywords.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

constexpr double not_available = std::numeric_limits<double>::quiet_NaN();

// The differences the rank methods use: rounded to 10 significant digits (so that differences equal
// on paper tie), zeros dropped, sorted ascending.
struct NonZeroDifferences {
    std::vector<double> sorted;
    std::size_t zeros = 0;
};

NonZeroDifferences non_zero_differences(std::span<const double> differences) {
    NonZeroDifferences d;
    for (double x : differences) {
        const double rounded = round_significant(x);
        if (rounded == 0)
            ++d.zeros;
        else
            d.sorted.push_back(rounded);
    }
    std::sort(d.sorted.begin(), d.sorted.end());
    if (d.sorted.size() < 2)
        throw Refusal("needs at least 2 non-zero differences, found " + std::to_string(d.sorted.size()) + " (" +
                      std::to_string(d.zeros) + " pairs differ by zero)");
    return d;
}

// T⁺ and the ranking of |d|.
struct SignedRanks {
    double t_plus = 0;
    Ranking ranking;
};

SignedRanks signed_ranks(const std::vector<double>& sorted) {
    std::vector<double> magnitude(sorted.size());
    for (std::size_t i = 0; i < sorted.size(); ++i) magnitude[i] = std::fabs(sorted[i]);
    SignedRanks s;
    s.ranking = rank_with_ties(magnitude);
    Accumulator plus;
    for (std::size_t i = 0; i < sorted.size(); ++i)
        if (sorted[i] > 0) plus.add(s.ranking.ranks[i]);
    s.t_plus = plus.sum();
    return s;
}

// (T⁺ − T⁻)/(T⁺ + T⁻) with T⁺ + T⁻ = n(n+1)/2.
double matched_pairs_rank_biserial(double t_plus, double n) { return 4 * t_plus / (n * (n + 1)) - 1; }

void add_interval(TestResult& r, double low, double high, double level) {
    if (std::isfinite(low)) {
        r.add("ci-low", low).add("ci-high", high);
    } else {
        const std::string text = "too few values for a " + format_level(level) + " interval";
        r.add("ci-low", text).add("ci-high", text);
    }
}

}  // namespace

std::vector<double> signed_rank_null_distribution(std::size_t n) {
    // Subset sums of {1, …, n}: each rank joins T⁺ or not with probability ½ (Wilcoxon 1945).
    std::vector<double> counts(n * (n + 1) / 2 + 1, 0.0);
    counts[0] = 1;
    std::size_t top = 0;
    for (std::size_t rank = 1; rank <= n; ++rank) {
        top += rank;
        for (std::size_t t = top; t >= rank; --t) counts[t] += counts[t - rank];
    }
    const double total = std::ldexp(1.0, static_cast<int>(n));
    for (double& c : counts) c /= total;
    return counts;
}

TestResult paired_t_test(std::span<const double> differences_raw, double level, bool one_sample) {
    if (differences_raw.size() < 2)
        throw Refusal("needs at least 2 pairs, found " + std::to_string(differences_raw.size()));
    const double scale = power_of_two_scale(differences_raw);
    const std::vector<double> d = scaled(differences_raw, scale);
    const double n = static_cast<double>(d.size());
    const double m = mean(d);
    const double sd = std::sqrt(sum_of_squares(d, m) / (n - 1));
    if (!(sd > 0)) throw Refusal("all differences are equal (no spread); a t-test needs spread in the differences");
    const double se = sd / std::sqrt(n);
    const double t = require_finite_statistic(m / se, "t");
    const boost::math::students_t dist(n - 1);
    const double margin = quantile(complement(dist, (1 - level) / 2)) * se;
    // Cohen's d of the differences, d = t/√n: its interval from the noncentral t (Steiger & Fouladi 1997).
    const Interval delta = noncentral_t_interval(t, n - 1, level);

    TestResult r;
    r.test = one_sample ? "One-sample t-test" : "Paired t-test";
    r.add("statistic", t)
        .add("df", n - 1)
        .add("p", std::min(1.0, 2 * cdf(complement(dist, std::fabs(t)))))
        .add("n", n)
        .add("estimate", m / scale)
        .add("ci-low", (m - margin) / scale)
        .add("ci-high", (m + margin) / scale)
        .add("effect", m / sd)
        .add("effect ci-low", delta.low / std::sqrt(n))
        .add("effect ci-high", delta.high / std::sqrt(n));
    r.words.statistic_symbol = "t";
    r.words.statistic_df = true;
    r.words.estimate = "mean difference";
    r.words.effect = "Cohen's d";
    return r;
}

TestResult signed_rank_test(std::span<const double> differences, double level, bool one_sample) {
    const NonZeroDifferences d = non_zero_differences(differences);
    const std::size_t count = d.sorted.size();
    const double n = static_cast<double>(count);
    const SignedRanks s = signed_ranks(d.sorted);
    const double walsh_count = n * (n + 1) / 2;
    const double alpha_half = (1 - level) / 2;
    const bool exact = !s.ranking.has_ties() && count < 50;

    double p = 1;
    std::uint64_t k = 0;  // interval: the k-th smallest and k-th largest Walsh average
    if (exact) {
        const ExactRankInference e = exact_rank_inference(signed_rank_null_distribution(count), s.t_plus, level);
        p = e.p;
        k = e.interval_position;
    } else {
        // Var(T⁺) = n(n+1)(2n+1)/24 − Σ(t³ − t)/48; continuity correction ½ for the p-value only.
        const double sd = std::sqrt(n * (n + 1) * (2 * n + 1) / 24 - s.ranking.tie_term / 48);
        const boost::math::normal standard;
        const double z = std::max(0.0, std::fabs(s.t_plus - walsh_count / 2) - 0.5) / sd;
        p = std::min(1.0, 2 * cdf(complement(standard, z)));
        const double position = std::floor(walsh_count / 2 - quantile(complement(standard, alpha_half)) * sd);
        k = position >= 1 ? static_cast<std::uint64_t>(position) : 0;
    }

    const auto total = static_cast<std::uint64_t>(count) * (count + 1) / 2;
    double low = not_available, high = not_available;
    if (k >= 1 && k <= total / 2 + 1) {
        low = walsh_average_order_statistic(d.sorted, k);
        high = walsh_average_order_statistic(d.sorted, total + 1 - k);
    }
    TestResult r;
    r.test = std::string(one_sample ? "Wilcoxon one-sample signed-rank test" : "Wilcoxon signed-rank test") +
             (exact ? " (exact p)" : " (normal approximation)");
    r.add("statistic", s.t_plus).add("p", p).add("n", n).add("zero differences", static_cast<double>(d.zeros));
    r.add("estimate", hodges_lehmann_pseudo_median(d.sorted));
    add_interval(r, low, high, level);
    r.add("effect", matched_pairs_rank_biserial(s.t_plus, n));
    r.words.statistic_form = ReportWords::Statistic::whole;
    r.words.statistic_symbol = "T⁺";
    r.words.estimate = "Hodges–Lehmann pseudo-median";
    r.words.effect = "matched-pairs rank-biserial r";
    return r;
}

TestResult sign_test(std::span<const double> differences, double level, bool one_sample) {
    const NonZeroDifferences d = non_zero_differences(differences);
    const std::size_t count = d.sorted.size();
    const double n = static_cast<double>(count);
    const auto positive = static_cast<double>(std::count_if(d.sorted.begin(), d.sorted.end(), [](double x) { return x > 0; }));
    const boost::math::binomial dist(n, 0.5);
    const double lower = cdf(dist, positive);
    const double upper = positive >= 1 ? cdf(complement(dist, positive - 1)) : 1.0;
    const double p = std::min(1.0, 2 * std::min(lower, upper));

    // Interval from the order statistics: largest k with P(X ≤ k − 1) ≤ α/2, X ~ Bin(n, ½),
    // found by bisection on the monotone cdf (O(log n) evaluations).
    const double alpha_half = (1 - level) / 2;
    std::size_t k = 0;
    if (cdf(dist, 0.0) <= alpha_half) {
        std::size_t good = 0, bad = count;  // cdf(good) ≤ α/2 < cdf(bad)
        while (bad - good > 1) {
            const std::size_t middle = good + (bad - good) / 2;
            (cdf(dist, static_cast<double>(middle)) <= alpha_half ? good : bad) = middle;
        }
        k = good + 1;
    }
    double low = not_available, high = not_available;
    if (k >= 1 && k <= (count + 1) / 2) {
        low = d.sorted[k - 1];
        high = d.sorted[count - k];
    }
    TestResult r;
    r.test = one_sample ? "One-sample sign test (exact binomial)" : "Sign test (exact binomial)";
    r.add("statistic", positive).add("p", p).add("n", n).add("zero differences", static_cast<double>(d.zeros));
    r.add("estimate", median_of_sorted(d.sorted));
    add_interval(r, low, high, level);
    r.add("effect", matched_pairs_rank_biserial(signed_ranks(d.sorted).t_plus, n));
    r.unlisted.push_back({"differences used", n});  // "4 of 12 differences positive", whatever `n` counts later
    r.words.statistic_form = ReportWords::Statistic::positive_count;
    r.words.estimate = "median difference";
    r.words.effect = "matched-pairs rank-biserial r";
    return r;
}

namespace {

void replace_number(TestResult& r, const std::string& label, double value) {
    for (auto& q : r.quantities)
        if (q.label == label && std::holds_alternative<double>(q.value)) q.value = value;
}

}  // namespace

TestResult compare_paired(const PairedReadings& readings, const std::string& method_given, Transform transform,
                          double level) {
    const std::string method = paired_methods().match(method_given, "method", "t");
    std::vector<double> first = readings.first, second = readings.second;
    double reference = readings.reference_value;
    if (!readings.one_sample && first.size() != second.size())
        throw Refusal("first and second must have the same number of rows");
    apply_transform(transform, first);
    if (readings.one_sample) {
        std::vector<double> value{reference};
        try {
            apply_transform(transform, value);
        } catch (const Refusal&) {
            throw Refusal("transform '" + transform_keyword(transform) + "' cannot take the reference value " +
                          number_label(reference));
        }
        reference = value[0];
    } else {
        apply_transform(transform, second);
    }
    require_finite(first);
    require_finite(second);
    if (!std::isfinite(reference)) throw Refusal("the reference value in second must be a finite number");
    std::vector<double> differences(first.size());
    for (std::size_t i = 0; i < first.size(); ++i) {
        differences[i] = first[i] - (readings.one_sample ? reference : second[i]);
        if (!std::isfinite(differences[i]))
            throw Refusal("a difference first − second is beyond the range of numbers (about 1.8e308); rescale the data");
    }

    TestResult r;
    if (method == "t") r = paired_t_test(differences, level, readings.one_sample);
    if (method == "signed-rank") r = signed_rank_test(differences, level, readings.one_sample);
    if (method == "sign") r = sign_test(differences, level, readings.one_sample);
    // n dropped follows n (rows with a missing reading).
    auto n_at = std::find_if(r.quantities.begin(), r.quantities.end(), [](const Quantity& q) { return q.label == "n"; });
    r.quantities.insert(n_at + 1, Quantity{"n dropped", static_cast<double>(readings.n_dropped)});

    const bool ratio = is_ratio_scale(transform);
    const std::string second_name = readings.one_sample ? number_label(readings.reference_value) : readings.second_name;
    const std::string direction = readings.first_name + (ratio ? " ÷ " : " − ") + second_name;
    if (ratio)
        for (const char* label : {"estimate", "ci-low", "ci-high"}) replace_number(r, label, back_transform(transform, r.number(label)));
    const std::string scale = transform == Transform::log_plus_one ? "the log(x+1) scale" : "the " + transform_keyword(transform) + " scale";
    if (transform != Transform::none)
        r.add("transform", transform_keyword(transform) + ": the test ran on transformed values; the estimate and interval are " +
                               (ratio ? "a ratio (" + direction + ")" : "the " + r.words.estimate + " on " + scale));
    r.words.shown = true;
    r.words.level = level;
    r.words.direction = direction;
    if (ratio)
        r.words.estimate = method == "t" ? "ratio of geometric means" : method == "signed-rank" ? "Hodges–Lehmann ratio" : "median ratio";
    else if (transform != Transform::none)
        r.words.estimate += " on " + scale;

    // Each side's location on the data's scale.
    const bool ranks = method != "t";
    const std::string location = ranks ? "median" : ratio ? "geometric mean" : transform == Transform::none ? "mean" : "mean (back-transformed)";
    r.add(readings.first_name + ": " + location, ranks ? median(readings.first) : back_transform(transform, mean(first)));
    if (readings.one_sample)
        r.add("reference value", readings.reference_value);
    else
        r.add(readings.second_name + ": " + location, ranks ? median(readings.second) : back_transform(transform, mean(second)));

    mark_non_finite(r);
    return r;
}

PairedReadings read_paired(const Range& first, const Range& second) {
    if (second.empty() || (second.cells.size() == 1 && (second.cells.front().kind == CellKind::empty ||
                                                        (second.cells.front().kind == CellKind::text &&
                                                         second.cells.front().text.empty()))))
        throw Refusal("second is missing: give the second reading of each pair, or a number for a one-sample test");
    PairedReadings readings;
    if (second.cells.size() == 1) {
        const Cell& c = second.cells.front();
        if (c.kind != CellKind::number) throw Refusal("second must be a range of readings or a single number");
        const Column column = read_column(first, "first");
        readings.one_sample = true;
        readings.reference_value = c.number;
        readings.first = column.values;
        readings.n_dropped = column.n_dropped;
        if (!column.name.empty()) readings.first_name = column.name;
        return readings;
    }
    if (first.columns != 1 || second.columns != 1)
        throw Refusal("first and second must each be one column (found " + std::to_string(first.columns) + " and " +
                      std::to_string(second.columns) + ")");
    Frame f = read_frame({{&first, ColumnKind::numeric, "first"}, {&second, ColumnKind::numeric, "second"}});
    readings.first = std::move(f.numbers[0]);
    readings.second = std::move(f.numbers[1]);
    readings.n_dropped = f.n_dropped;
    if (!f.names[0].empty()) readings.first_name = f.names[0];
    if (!f.names[1].empty()) readings.second_name = f.names[1];
    return readings;
}

}  // namespace quadrat
