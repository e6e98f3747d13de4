#include "variance.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <limits>
#include <span>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/fisher_f.hpp>
#include <boost/math/distributions/normal.hpp>

#include "exact_scaling.hpp"
#include "keywords.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

double upper_f(double f, double df1, double df2) {
    return boost::math::cdf(boost::math::complement(boost::math::fisher_f(df1, df2), f));
}
double upper_chi_squared(double x, double df) {
    return boost::math::cdf(boost::math::complement(boost::math::chi_squared(df), x));
}

// ln s² of one group (denominator n − 1), computed on the group shifted to its own mid-range and
// divided by its own range, so that neither 1e300 nor 1e-300 over- or underflows; −∞ when the
// group has no spread. Each group keeps its own digits, whatever the other groups hold.
double log_variance(const std::vector<double>& g) {
    const auto [lo, hi] = std::minmax_element(g.begin(), g.end());
    if (*lo == *hi) return -HUGE_VAL;
    // The range, or half of it when the range itself would overflow; never zero for distinct values.
    const bool near_overflow = !std::isfinite(*hi - *lo);
    const double scale = near_overflow ? *hi / 2 - *lo / 2 : *hi - *lo;
    const double mid = mid_range(*lo, *hi);
    std::vector<double> y(g);
    for (double& x : y) x = near_overflow ? x / scale - mid / scale : (x - mid) / scale;
    return std::log(variance(y)) + 2 * std::log(scale);
}

// The groups multiplied by a power of two that brings the overall range into [1, 2): exact for
// every value (no rounding, so ties stay ties), and afterwards neither squares of 1e300 nor
// differences of denormals leave the range of ordinary numbers. Every method here is scale free.
std::vector<std::vector<double>> rescaled_groups(const Groups& groups) {
    double lowest = HUGE_VAL, highest = -HUGE_VAL;
    for (const auto& g : groups.values)
        for (double x : g) {
            lowest = std::min(lowest, x);
            highest = std::max(highest, x);
        }
    std::vector<std::vector<double>> y(groups.values);
    if (highest == lowest) return y;  // no spread at all: refused by the caller
    const int exponent = range_exponent(lowest, highest);
    // A product with a normal power of two is x·2^−e rounded once, as ldexp gives it, without a
    // call per value; beyond the normal powers, ldexp.
    if (exponent >= -1000 && exponent <= 1000) {
        const double factor = std::ldexp(1.0, -exponent);
        for (auto& g : y)
            for (double& x : g) x *= factor;
        return y;
    }
    for (auto& g : y)
        for (double& x : g) x = std::ldexp(x, -exponent);
    return y;
}

// |x − group centre| for each group (of the rescaled groups, so exact multiples of the data's own
// deviations: ties as stored numbers, as the rank method needs).
std::vector<std::vector<double>> absolute_deviations(const std::vector<std::vector<double>>& groups, bool from_median) {
    std::vector<std::vector<double>> z(groups.size());
    for (std::size_t i = 0; i < z.size(); ++i) {
        const std::vector<double>& g = groups[i];
        const double centre = from_median ? median(g) : mean_from_mid_range(g);
        z[i].reserve(g.size());
        for (double x : g) z[i].push_back(std::fabs(x - centre));
    }
    return z;
}

// One-way ANOVA F of the absolute deviations from each group's centre (median or mean).
struct AnovaF {
    double f, df1, df2;
};
AnovaF deviation_anova(const std::vector<std::vector<double>>& groups, bool from_median, const std::string& method) {
    const std::vector<std::vector<double>> z = absolute_deviations(groups, from_median);
    std::vector<double> all;
    std::size_t total = 0;
    for (const auto& zi : z) total += zi.size();
    all.reserve(total);
    for (const auto& zi : z) all.insert(all.end(), zi.begin(), zi.end());
    const double grand = mean(all);
    Accumulator between, within;
    for (const auto& zi : z) {
        const double zbar = mean(zi);
        between.add(static_cast<double>(zi.size()) * (zbar - grand) * (zbar - grand));
        within.add(sum_of_squares(zi, zbar));
    }
    // Edge case: every value as far from its group's centre as the others in its group (groups of
    // two, for instance): the F ratio divides by zero. Each deviation carries a rounding error of a
    // few ulps of the largest value (|x − centre|), so a within-group sum of squares no larger than
    // that noise is zero too (two values per group otherwise gave p ≈ 1e-28).
    double largest = 0.0;
    for (const auto& g : groups)
        for (double x : g) largest = std::max(largest, std::fabs(x));
    const double ulp_noise = 8.0 * std::numeric_limits<double>::epsilon() * largest;
    if (!(within.sum() > static_cast<double>(all.size()) * ulp_noise * ulp_noise))
        throw Refusal("in every group the values lie equally far from the group " + std::string(from_median ? "median" : "mean") +
                      " (groups of 2?), so " + method + " is undefined; try bartlett or fligner");
    const double k = static_cast<double>(z.size());
    const double n = static_cast<double>(all.size());
    return {(between.sum() / (k - 1)) / (within.sum() / (n - k)), k - 1, n - k};
}

// ln Σ exp(tᵢ), shifted by the largest term.
double log_sum_exp(const std::vector<double>& terms) {
    const double top = *std::max_element(terms.begin(), terms.end());
    Accumulator sum;
    for (double t : terms) sum.add(std::exp(t - top));
    return top + std::log(sum.sum());
}

}  // namespace

TestResult check_variance(const Groups& groups, const std::string& method) {
    const std::string m = variance_methods().match(method, "method", "brown-forsythe");
    const std::size_t k = groups.group_count();
    const std::string labels_are = groups.wide ? "values has " + std::to_string(k) + " columns (" + join(groups.names) + ")"
                                               : "groups has " + std::to_string(k) + (k == 1 ? " label (" : " labels (") +
                                                     join(groups.names) + ")";
    // Edge cases first, each with its reason.
    if (groups.n_used == 0) throw Refusal(no_usable_rows(groups));
    if (k < 2) throw Refusal(labels_are + "; comparing spreads needs 2 or more groups");
    if (m == "f-ratio" && k != 2) throw Refusal(labels_are + "; method 'f-ratio' compares exactly 2");
    require_two_values_per_group(groups.names, groups.values);
    for (std::size_t i = 0; i < k; ++i)
        for (double x : groups.values[i])
            if (!std::isfinite(x)) throw Refusal("values must be finite numbers");
    std::vector<double> log_variances(k);
    for (std::size_t i = 0; i < k; ++i) log_variances[i] = log_variance(groups.values[i]);
    if (std::all_of(log_variances.begin(), log_variances.end(), [](double v) { return v == -HUGE_VAL; }))
        throw Refusal("the values are equal within every group: no spread to compare");
    auto zero_spread = [&](const std::string& why) {
        for (std::size_t i = 0; i < k; ++i)
            if (log_variances[i] == -HUGE_VAL)
                throw Refusal("group " + in_quotes(groups.names[i]) + " has zero spread (all values equal), so " + why);
    };

    TestResult r;
    std::string symbol;
    double statistic = 0, p = 0;
    if (m == "brown-forsythe" || m == "levene") {
        const bool from_median = m == "brown-forsythe";
        const AnovaF a = deviation_anova(rescaled_groups(groups), from_median, m);
        r.test = from_median ? "Brown–Forsythe test (deviations from group medians)"
                             : "Levene's test (deviations from group means)";
        statistic = a.f;
        p = upper_f(a.f, a.df1, a.df2);
        r.add("statistic", statistic).add("df", a.df1).add("df2", a.df2);
        symbol = "F";
    } else if (m == "bartlett") {
        zero_spread("bartlett (which takes logarithms of the variances) is undefined; try brown-forsythe");
        // Bartlett (1937): T = [(N − k) ln s²p − Σ(nᵢ − 1) ln s²ᵢ] / C, C = 1 + (Σ 1/(nᵢ − 1) − 1/(N − k)) / (3(k − 1)),
        // in logarithms throughout: s²p = Σ(nᵢ − 1)s²ᵢ/(N − k) by a log-sum-exp.
        double n = 0;
        Accumulator log_terms, reciprocals;
        std::vector<double> weighted(k);
        for (std::size_t i = 0; i < k; ++i) {
            const double dof = static_cast<double>(groups.values[i].size()) - 1;
            n += dof + 1;
            weighted[i] = std::log(dof) + log_variances[i];
            log_terms.add(dof * log_variances[i]);
            reciprocals.add(1 / dof);
        }
        const double kk = static_cast<double>(k);
        const double log_pooled = log_sum_exp(weighted) - std::log(n - kk);
        const double c = 1 + (reciprocals.sum() - 1 / (n - kk)) / (3 * (kk - 1));
        statistic = std::max(0.0, ((n - kk) * log_pooled - log_terms.sum()) / c);
        p = upper_chi_squared(statistic, kk - 1);
        r.test = "Bartlett's test";
        r.add("statistic", statistic).add("df", kk - 1);
        symbol = "χ²";
    } else if (m == "fligner") {
        // Conover, Johnson & Johnson (1981): scores aᵢⱼ = Φ⁻¹(1/2 + rᵢⱼ/(2(N + 1))) of the mid-ranks of
        // |x − group median| over all N values; X² = Σ nᵢ(āᵢ − ā)² / V², V² the variance of all scores.
        std::vector<double> deviations;
        for (const auto& zi : absolute_deviations(rescaled_groups(groups), true))
            deviations.insert(deviations.end(), zi.begin(), zi.end());
        const Ranking ranking = rank_with_ties(deviations);
        const double n = static_cast<double>(deviations.size());
        const boost::math::normal standard_normal(0.0, 1.0);
        std::vector<double> scores(deviations.size());
        for (std::size_t j = 0; j < scores.size(); ++j)
            scores[j] = boost::math::quantile(standard_normal, 0.5 + ranking.ranks[j] / (2 * (n + 1)));
        const double grand = mean(scores);
        const double score_variance = sum_of_squares(scores, grand) / (n - 1);
        if (!(score_variance > 0))
            throw Refusal("every value lies equally far from its group median, so fligner is undefined; try bartlett");
        Accumulator between;
        std::size_t start = 0;
        for (const auto& g : groups.values) {
            const std::span<const double> own(scores.data() + start, g.size());
            const double abar = mean(own);
            between.add(static_cast<double>(g.size()) * (abar - grand) * (abar - grand));
            start += g.size();
        }
        const double kk = static_cast<double>(k);
        statistic = between.sum() / score_variance;
        p = upper_chi_squared(statistic, kk - 1);
        r.test = "Fligner–Killeen test (median-centred)";
        r.add("statistic", statistic).add("df", kk - 1);
        symbol = "χ²";
    } else {  // f-ratio
        zero_spread("the variance ratio is undefined");
        const double df1 = static_cast<double>(groups.values[0].size()) - 1;
        const double df2 = static_cast<double>(groups.values[1].size()) - 1;
        statistic = std::exp(log_variances[0] - log_variances[1]);
        if (!std::isfinite(statistic) || statistic == 0)
            throw Refusal("the variance ratio is beyond the range of numbers (one spread is more than 1e300 times the other)");
        const boost::math::fisher_f f(df1, df2);
        // Two-sided: twice the smaller tail, at most 1.
        p = std::min(1.0, 2 * std::min(boost::math::cdf(f, statistic), boost::math::cdf(boost::math::complement(f, statistic))));
        r.test = "F-test of two variances (two-sided; first group over second)";
        r.add("statistic", statistic).add("df", df1).add("df2", df2);
        symbol = "F";
    }
    r.add("p", p);
    r.add("n", static_cast<double>(groups.n_used));
    r.add("n dropped", static_cast<double>(groups.n_dropped));
    for (std::size_t i = 0; i < k; ++i) {
        r.add(groups.names[i] + ": n", static_cast<double>(groups.values[i].size()));
        const double v = std::exp(log_variances[i]);
        if (std::isfinite(v))
            r.add(groups.names[i] + ": variance", v);
        else
            r.add(groups.names[i] + ": variance", std::string("too large to show (beyond the largest number)"));
    }
    const auto [smallest, largest] = std::minmax_element(log_variances.begin(), log_variances.end());
    const double ratio = std::exp(*largest - *smallest);
    if (*smallest > -HUGE_VAL && std::isfinite(ratio))
        r.add("variance ratio", ratio);
    else if (*smallest > -HUGE_VAL)
        r.add("variance ratio", std::string("too large to show (beyond the largest number)"));
    else
        r.add("variance ratio", std::string("undefined: group " + in_quotes(groups.names[smallest - log_variances.begin()]) +
                                            " has zero variance"));
    // n after p, as in CHECK.NORMAL's sentence: χ² df (Bartlett, Fligner) do not show it.
    r.words.shown = true;
    r.words.statistic_symbol = symbol;
    r.words.statistic_df = true;
    r.words.n_after_p = true;
    r.words.extra = "largest variance over smallest";
    r.words.extra_quantity = "variance ratio";
    return r;
}

}  // namespace quadrat
