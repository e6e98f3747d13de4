#include "oneway.hpp"

#include <algorithm>
#include <cmath>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/fisher_f.hpp>

#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "keywords.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "summary.hpp"
#include "two_groups.hpp"

namespace quadrat {

namespace {

// Every group scaled by one power of two (exact), so that squares of huge or tiny values stay
// finite; sums of squares come back multiplied by 1/scale².
struct ScaledGroups {
    std::vector<std::vector<double>> groups;
    double scale = 1;
};

ScaledGroups scale_groups(std::span<const std::vector<double>> groups) {
    std::vector<std::span<const double>> views(groups.begin(), groups.end());
    ScaledGroups s;
    s.scale = power_of_two_scale(views);
    s.groups = scaled(groups, s.scale);
    return s;
}

void require_k_groups(std::span<const std::vector<double>> groups) {
    if (groups.size() < 2) throw Refusal("needs at least 2 groups, found " + std::to_string(groups.size()));
    std::vector<std::string> numbers;  // groups without names are named by their position
    for (std::size_t i = 0; i < groups.size(); ++i) numbers.push_back(std::to_string(i + 1));
    require_two_values_per_group(numbers, {groups.begin(), groups.end()});
    for (const auto& g : groups) require_finite(g);
}

std::vector<double> group_means(std::span<const std::vector<double>> groups) {
    std::vector<double> means;
    for (const auto& g : groups) means.push_back(mean(g));
    return means;
}

std::size_t total_count(std::span<const std::vector<double>> groups) {
    std::size_t n = 0;
    for (const auto& g : groups) n += g.size();
    return n;
}

}  // namespace

AnovaTable one_way_anova_table(std::span<const std::vector<double>> raw_groups) {
    require_k_groups(raw_groups);
    ScaledGroups scaled = scale_groups(raw_groups);
    auto& groups = scaled.groups;
    const std::size_t k = groups.size(), n = total_count(groups);

    // Centre everything on the grand mean first: the deviations carry all the digits that matter.
    std::vector<double> all;
    all.reserve(n);
    for (const auto& g : groups) all.insert(all.end(), g.begin(), g.end());
    const double centre = mean(all);
    for (auto& g : groups)
        for (double& x : g) x -= centre;
    for (double& x : all) x -= centre;
    const double grand = mean(all);  // ≈ 0, the residual error of `centre`

    Accumulator between, within;
    for (const auto& g : groups) {
        const double m = mean(g);
        between.add(static_cast<double>(g.size()) * (m - grand) * (m - grand));
        within.add(sum_of_squares(g, m));
    }
    const double unscale = 1.0 / (scaled.scale * scaled.scale);
    AnovaTable t;
    t.ss_between = between.sum() * unscale;
    t.ss_within = within.sum() * unscale;
    t.df_between = static_cast<double>(k - 1);
    t.df_within = static_cast<double>(n - k);
    if (!(within.sum() > 0))
        throw Refusal("every group has zero spread (all values equal within each group); the F-test needs spread");
    t.ms_between = t.ss_between / t.df_between;
    t.ms_within = t.ss_within / t.df_within;
    // F from the scaled sums, so that it stays finite even where the unscaled SS would not.
    t.f = require_finite_statistic((between.sum() / t.df_between) / (within.sum() / t.df_within), "F");
    const boost::math::fisher_f dist(t.df_between, t.df_within);
    t.p = cdf(complement(dist, t.f));
    return t;
}

double omega_squared(const AnovaTable& t) {
    return (t.ss_between - t.df_between * t.ms_within) / (t.ss_between + t.ss_within + t.ms_within);
}

Interval omega_squared_interval(const AnovaTable& t, double n) {
    const Interval lambda = noncentral_f_interval(t.f, t.df_between, t.df_within, 0.95);
    return {lambda.low / (lambda.low + n), lambda.high / (lambda.high + n)};
}

namespace {

// What both one-way ANOVAs give: F with its two df and p, n, and ω² with its interval from the
// classic table (Welch's test reports the same effect size).
TestResult one_way_result(const char* test, double f, double df1, double df2, double p,
                          std::span<const std::vector<double>> groups, const AnovaTable& classic) {
    TestResult r;
    r.test = test;
    r.add("statistic", f)
        .add("df", df1)
        .add("df2", df2)
        .add("p", p)
        .add("n", static_cast<double>(total_count(groups)))
        .add("effect", omega_squared(classic));
    r.words.statistic_symbol = "F";
    r.words.statistic_df = true;
    r.words.effect = "ω²";
    const Interval omega = omega_squared_interval(classic, r.number("n"));
    r.add("effect ci-low", omega.low).add("effect ci-high", omega.high);
    return r;
}

}  // namespace

TestResult classic_one_way_anova(std::span<const std::vector<double>> groups) {
    const AnovaTable t = one_way_anova_table(groups);
    return one_way_result("One-way ANOVA", t.f, t.df_between, t.df_within, t.p, groups, t);
}

TestResult welch_one_way_anova(std::span<const std::vector<double>> raw_groups) {
    require_k_groups(raw_groups);
    const ScaledGroups scaled = scale_groups(raw_groups);
    const auto& groups = scaled.groups;
    const double k = static_cast<double>(groups.size());

    std::vector<double> means, variances, weights;
    for (std::size_t i = 0; i < groups.size(); ++i) {
        const double m = mean(groups[i]);
        const double var = sum_of_squares(groups[i], m) / static_cast<double>(groups[i].size() - 1);
        if (!(var > 0))
            throw Refusal("group " + std::to_string(i + 1) +
                          " has zero spread; Welch's ANOVA weights each group by n/variance — use method 'pooled' or 'ranks'");
        means.push_back(m);
        variances.push_back(var);
    }
    // Weights n_i/s_i² taken relative to the smallest variance (F and df depend only on their
    // ratios), so that a group with a tiny spread cannot overflow their sum.
    const double smallest_variance = *std::min_element(variances.begin(), variances.end());
    Accumulator weight_total;
    for (std::size_t i = 0; i < groups.size(); ++i) {
        weights.push_back(static_cast<double>(groups[i].size()) * (smallest_variance / variances[i]));
        weight_total.add(weights.back());
    }
    const double w = weight_total.sum();
    // Weighted grand mean, centred on the first group's mean so the sum carries only differences.
    Accumulator weighted;
    for (std::size_t i = 0; i < means.size(); ++i) weighted.add(weights[i] * (means[i] - means[0]));
    const double weighted_mean = means[0] + weighted.sum() / w;
    Accumulator spread, lambda;
    for (std::size_t i = 0; i < means.size(); ++i) {
        const double d = means[i] - weighted_mean;
        spread.add(weights[i] * d * d);
        const double share = 1 - weights[i] / w;
        lambda.add(share * share / static_cast<double>(groups[i].size() - 1));
    }
    const double a = spread.sum() / smallest_variance / (k - 1);
    const double b = 1 + 2 * (k - 2) / (k * k - 1) * lambda.sum();
    const double f = require_finite_statistic(a / b, "F");
    const double df2 = (k * k - 1) / (3 * lambda.sum());
    if (!(df2 > 0 && std::isfinite(df2)))
        throw Refusal("one group's spread is so much smaller than the others' that Welch's df cannot be computed; use method 'pooled' or 'ranks'");
    const boost::math::fisher_f dist(k - 1, df2);

    return one_way_result("Welch's one-way ANOVA", f, k - 1, df2, cdf(complement(dist, f)), raw_groups,
                          one_way_anova_table(raw_groups));
}

TestResult kruskal_wallis_test(std::span<const std::vector<double>> groups) {
    require_k_groups(groups);
    std::vector<double> all;
    for (const auto& g : groups) all.insert(all.end(), g.begin(), g.end());
    const double n = static_cast<double>(all.size());
    const Ranking ranking = rank_with_ties(all);
    const double tie_correction = 1 - ranking.tie_term / (n * n * n - n);
    if (!(tie_correction > 0)) throw Refusal("all values are equal; a rank test needs at least two different values");

    // H = 12/(N(N+1))·Σ n_i (R̄_i − (N+1)/2)², centred on the mean rank, divided by the tie correction.
    Accumulator spread;
    std::size_t offset = 0;
    for (const auto& g : groups) {
        Accumulator rank_sum;
        for (std::size_t j = 0; j < g.size(); ++j) rank_sum.add(ranking.ranks[offset + j]);
        offset += g.size();
        const double size = static_cast<double>(g.size());
        const double d = rank_sum.sum() / size - (n + 1) / 2;
        spread.add(size * d * d);
    }
    const double h = 12 / (n * (n + 1)) * spread.sum() / tie_correction;
    const double df = static_cast<double>(groups.size() - 1);
    const boost::math::chi_squared dist(df);

    TestResult r;
    r.test = "Kruskal–Wallis test";
    r.add("statistic", h)
        .add("df", df)
        .add("p", cdf(complement(dist, h)))
        .add("n", n)
        .add("effect", h / (n - 1));
    r.words.statistic_symbol = "H";
    r.words.statistic_df = true;
    r.words.effect = "ε²";
    return r;
}

namespace {

// Inserts a quantity right after `after` (at the end when absent).
void insert_after(TestResult& r, const std::string& after, Quantity q) {
    auto it = std::find_if(r.quantities.begin(), r.quantities.end(), [&](const Quantity& x) { return x.label == after; });
    r.quantities.insert(it == r.quantities.end() ? it : it + 1, std::move(q));
}

void replace_number(TestResult& r, const std::string& label, double value) {
    for (auto& q : r.quantities)
        if (q.label == label && std::holds_alternative<double>(q.value)) q.value = value;
}

std::string scale_words(Transform t) {
    return t == Transform::log_plus_one ? "the log(x+1) scale" : "the " + transform_keyword(t) + " scale";
}

}  // namespace

TestResult compare_groups(const Groups& g, const std::string& method_given, Transform transform, double level) {
    const std::string method = location_methods().match(method_given, "method", "welch");
    const std::size_t k = g.group_count();
    if (g.n_used == 0) throw Refusal(no_usable_rows(g));
    if (k < 2)
        throw Refusal("needs at least 2 groups, found 1 (" + (k ? g.names[0] : std::string("none")) +
                      "); give group labels in groups, or two or more columns of values");
    require_two_values_per_group(g.names, g.values);
    // The transformed values, or the groups themselves (no copy) without a transform.
    std::vector<std::vector<double>> transformed;
    if (transform != Transform::none) {
        transformed = g.values;
        apply_transform(transform, transformed);
    }
    const std::vector<std::vector<double>>& values = transform != Transform::none ? transformed : g.values;
    const bool ranks = method == "ranks";
    // Zero spread named by group, before the methods' own generic refusals.
    if (method == "welch" && k > 2)
        for (std::size_t i = 0; i < k; ++i)
            if (std::all_of(values[i].begin(), values[i].end(), [&](double x) { return x == values[i][0]; }))
                throw Refusal("group '" + g.names[i] +
                              "' has zero spread; Welch's ANOVA weights each group by n/variance — use method 'pooled' or 'ranks'");

    TestResult r;
    if (k == 2) {
        if (method == "welch") r = welch_t_test(values[0], values[1], level);
        if (method == "pooled") r = pooled_t_test(values[0], values[1], level);
        if (ranks) r = rank_sum_test(values[0], values[1], level);
    } else {
        if (method == "welch") r = welch_one_way_anova(values);
        if (method == "pooled") r = classic_one_way_anova(values);
        if (ranks) r = kruskal_wallis_test(values);
    }
    insert_after(r, "n", {"n dropped", static_cast<double>(g.n_dropped)});
    r.words.shown = true;
    r.words.level = level;

    const bool ratio = is_ratio_scale(transform);
    if (k == 2) {
        // Back to the data's scale: a log difference becomes a ratio; log(x+1) and sqrt differences stay.
        if (ratio)
            for (const char* label : {"estimate", "ci-low", "ci-high"})
                replace_number(r, label, back_transform(transform, r.number(label)));
        r.words.direction = g.names[0] + (ratio ? " ÷ " : " − ") + g.names[1];
        const std::string on_scale = (!ratio && transform != Transform::none) ? " on " + scale_words(transform) : "";
        r.words.estimate = ratio ? (ranks ? "Hodges–Lehmann ratio" : "ratio of geometric means")
                                 : (ranks ? "Hodges–Lehmann shift" : "mean difference") + on_scale;
    } else {
        // FUNCTIONS.md, COMPARE.GROUPS: one difference chosen by the data (largest minus smallest)
        // would be reported without an honest interval; the pairs belong to COMPARE.POSTHOC.
        const std::string refusal = std::to_string(k) + " groups: a single difference picked by the data has no honest "
                                    "interval; COMPARE.POSTHOC gives every pair's difference with its interval";
        for (const char* label : {"estimate", "ci-low", "ci-high"}) r.unlisted.push_back({label, refusal});
    }
    if (transform != Transform::none) {
        std::string note = transform_keyword(transform) + ": the test ran on transformed values";
        if (k == 2)
            note += ratio ? "; the estimate and interval are a ratio (" + r.words.direction + ")" +
                                (ranks ? "" : " of geometric means")
                          : std::string("; the estimate and interval are ") +
                                (ranks ? "the Hodges–Lehmann shift" : "the mean difference") + " on " + scale_words(transform);
        r.add("transform", note);
    }

    // Per-group rows on the data's scale.
    const std::vector<double> locations = ranks ? std::vector<double>() : group_means(values);
    const std::string location_name = ranks                                ? "median"
                                      : ratio                             ? "geometric mean"
                                      : transform == Transform::none      ? "mean"
                                                                          : "mean (back-transformed)";
    // Medians straight from the data (a monotone transform keeps the middle value; for an even
    // count the data's own midpoint is what a person checks against), means back-transformed.
    for (std::size_t i = 0; i < k; ++i) {
        r.add(g.names[i] + ": n", static_cast<double>(g.values[i].size()));
        r.add(g.names[i] + ": " + location_name, ranks ? median(g.values[i]) : back_transform(transform, locations[i]));
    }
    mark_non_finite(r);
    return r;
}

}  // namespace quadrat
