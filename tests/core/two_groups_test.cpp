// Two-group tests (Welch, Student, Wilcoxon–Mann–Whitney) and COMPARE.GROUPS for two groups.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>
#include <random>

#include "core/hodges_lehmann.hpp"
#include "core/oneway.hpp"
#include "core/ranks.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "core/two_groups.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("compare.json"); }

std::vector<double> numbers(const nlohmann::json& j) { return j.get<std::vector<double>>(); }

void expect_matches(const TestResult& r, const nlohmann::json& ref, double tolerance) {
    for (const char* key : {"statistic", "df", "p", "estimate", "ci-low", "ci-high", "effect"})
        if (ref.contains(key)) expect_relative(r.number(key), ref[key].get<double>(), tolerance, key, 1.0);
}

Groups two_groups(const std::vector<double>& a, const std::vector<double>& b, std::size_t dropped = 0) {
    Groups g;
    g.names = {"upstream", "downstream"};
    g.values = {a, b};
    g.n_used = a.size() + b.size();
    g.n_dropped = dropped;
    return g;
}

// Hand calculation from the formulas of Welch (1947) and Student's pooled test, done on paper:
// first {1,2,3}, second {4,5,6,7}: Welch t = −3.5/√(1/3 + 5/12) = −4.041452, df = 0.5625/0.1134259
// = 4.959184; pooled t = −3.5/√(1.4·7/12) = −3.872983 on 5 df; Hedges' g = −3.5/√1.4·(1 − 3/19) = −2.490980.
// Tolerance 1e-6: the hand values are rounded to 7 significant digits.
TEST(TwoGroups, HandCalculation) {
    const std::vector<double> a = {1, 2, 3}, b = {4, 5, 6, 7};
    const TestResult w = welch_t_test(a, b, 0.95);
    EXPECT_NEAR(w.number("statistic"), -4.041452, 1e-6);
    EXPECT_NEAR(w.number("df"), 4.959184, 1e-6);
    EXPECT_NEAR(w.number("estimate"), -3.5, 1e-12);
    EXPECT_NEAR(w.number("effect"), -2.490980, 1e-6);
    EXPECT_EQ(w.number("n"), 7);
    const TestResult s = pooled_t_test(a, b, 0.95);
    EXPECT_NEAR(s.number("statistic"), -3.872983, 1e-6);
    EXPECT_EQ(s.number("df"), 5);
}

// scipy.stats.ttest_ind 1.10 (equal_var False/True) via tests/reference/generate_compare.py; df,
// interval and Hedges' g from the published formulas in the same script. Tolerance 1e-10 relative:
// both sides are closed forms in double precision (Boost and SciPy t quantiles agree to ~1e-14).
TEST(TwoGroups, AgreesWithScipyTTests) {
    for (const char* name : {"nitrate", "tiny"}) {
        const auto& c = reference()["cases"][name];
        const auto a = numbers(c["first"]), b = numbers(c["second"]);
        SCOPED_TRACE(name);
        expect_matches(welch_t_test(a, b, 0.95), c["welch"], 1e-10);
        expect_matches(pooled_t_test(a, b, 0.95), c["pooled"], 1e-10);
    }
}

// Same generator: Welch's test on log, log10 and sqrt values (scipy on transformed data). With log
// the estimate and interval come back as exp(·), a ratio of geometric means first ÷ second.
TEST(TwoGroups, TransformsBackToRatioOrStayOnScale) {
    const auto& c = reference()["cases"]["biomass"];
    const Groups g = two_groups(numbers(c["first"]), numbers(c["second"]));
    const TestResult log = compare_groups(g, "welch", Transform::log);
    const auto& ref = c["welch_log"];
    expect_relative(log.number("statistic"), ref["statistic"].get<double>(), 1e-10, "t", 1.0);
    expect_relative(log.number("estimate"), std::exp(ref["estimate"].get<double>()), 1e-10, "ratio", 1.0);
    expect_relative(log.number("ci-low"), std::exp(ref["ci-low"].get<double>()), 1e-10, "ratio low", 1.0);
    expect_relative(log.number("ci-high"), std::exp(ref["ci-high"].get<double>()), 1e-10, "ratio high", 1.0);
    // The ratio of geometric means is the same whichever log base the test ran on
    // (common practice, no source: log10 differences are natural-log differences over ln 10).
    const TestResult log10 = compare_groups(g, "welch", Transform::log10);
    expect_relative(log10.number("estimate"), log.number("estimate"), 1e-12, "log10 ratio", 1.0);
    expect_relative(log10.number("p"), c["welch_log10"]["p"].get<double>(), 1e-10, "log10 p", 1.0);
    const TestResult sq = compare_groups(g, "welch", Transform::sqrt);
    expect_relative(sq.number("estimate"), c["welch_sqrt"]["estimate"].get<double>(), 1e-10, "sqrt estimate", 1.0);
    ASSERT_NE(sq.find("transform"), nullptr);
    EXPECT_NE(std::get<std::string>(*sq.find("transform")).find("sqrt scale"), std::string::npos);
    EXPECT_NE(render_report(log).find("ratio of geometric means"), std::string::npos) << render_report(log);
}

// Table layout (FUNCTIONS.md "Scalars and tables"): header, test, then the quantities, n dropped
// after n, and per-group n and mean. Common practice, no source.
TEST(TwoGroups, TableAndReport) {
    const auto& c = reference()["cases"]["nitrate"];
    const TestResult r = compare_groups(two_groups(numbers(c["first"]), numbers(c["second"]), 3), "", Transform::none);
    const Table t = r.table();
    const std::vector<std::string> labels = {"quantity", "test", "statistic", "df", "p", "n", "n dropped",
                                             "estimate", "ci-low", "ci-high", "effect", "effect ci-low",
                                             "effect ci-high", "upstream: n",
                                             "upstream: mean", "downstream: n", "downstream: mean"};
    ASSERT_EQ(t.size(), labels.size());
    for (std::size_t i = 0; i < labels.size(); ++i) EXPECT_EQ(std::get<std::string>(t[i][0]), labels[i]);
    EXPECT_EQ(std::get<std::string>(t[1][1]), "Welch's t-test (two groups)");
    EXPECT_EQ(r.number("n dropped"), 3);
    EXPECT_EQ(r.number("upstream: n"), 12);
    // Report in the catalogue's form; values from the scipy reference above, rounded by hand.
    EXPECT_EQ(render_report(r),
              "Welch's t-test (two groups): t(26.4) = 1.85, p = 0.075; mean difference 0.29 (upstream − downstream; "
              "95% CI -0.0319 to 0.62), Hedges' g = 0.62");
}

// Refusals at the top of each method (FUNCTIONS.md "Refusals").
TEST(TwoGroups, Refusals) {
    EXPECT_THROW(welch_t_test(std::vector<double>{1.0}, std::vector<double>{2.0, 3.0}, 0.95), Refusal);
    EXPECT_THROW(pooled_t_test(std::vector<double>{2.0, 2.0}, std::vector<double>{3.0, 3.0}, 0.95), Refusal);
    EXPECT_THROW(rank_sum_test(std::vector<double>{2.0, 2.0}, std::vector<double>{2.0, 2.0}, 0.95), Refusal);
    Groups one;
    one.names = {"values"};
    one.values = {{1.0, 2.0, 3.0}};
    EXPECT_THROW(compare_groups(one, "welch", Transform::none), Refusal);
    // A wide-format column left empty after dropping its missing cells.
    Groups empty = two_groups({1.0, 2.0, 3.0}, {});
    try {
        compare_groups(empty, "welch", Transform::none);
        FAIL();
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "group 'downstream' has 0 values; each group needs at least 2");
    }
    EXPECT_THROW(compare_groups(two_groups({1.0, 2.0}, {0.0, 3.0}), "welch", Transform::log), Refusal);
    EXPECT_THROW(compare_groups(two_groups({1.0, 2.0}, {4.0, 3.0}), "anova", Transform::none), Refusal);
}

// One group without spread is fine for Welch (its variance is 0, the other carries the SE).
// Scale invariance: t, p and g are unchanged when all values are multiplied by 1e200 or 1e-200,
// and the estimate scales with them (common practice, no source). Tolerance 1e-12 relative.
TEST(TwoGroups, ZeroSpreadInOneGroupAndHugeValues) {
    const std::vector<double> a = {5, 5, 5}, b = {1, 2, 4, 3};
    const TestResult r = welch_t_test(a, b, 0.95);
    EXPECT_TRUE(std::isfinite(r.number("p")));
    EXPECT_NEAR(r.number("df"), 3.0, 1e-12);  // all weight on the second group: df = n₂ − 1
    for (double factor : {1e200, 1e-200}) {
        std::vector<double> ha = {1.1, 2.3, 0.7}, hb = {4.2, 3.3, 5.1, 2.8};
        const TestResult plain = welch_t_test(ha, hb, 0.95);
        for (double& x : ha) x *= factor;
        for (double& x : hb) x *= factor;
        const TestResult huge = welch_t_test(ha, hb, 0.95);
        EXPECT_NEAR(huge.number("statistic"), plain.number("statistic"), 1e-12 * std::fabs(plain.number("statistic")));
        EXPECT_NEAR(huge.number("effect"), plain.number("effect"), 1e-12 * std::fabs(plain.number("effect")));
        EXPECT_NEAR(huge.number("estimate") / factor, plain.number("estimate"), 1e-12 * std::fabs(plain.number("estimate")));
        const TestResult pooled = pooled_t_test(ha, hb, 0.95);
        EXPECT_TRUE(std::isfinite(pooled.number("ci-high")));
        const TestResult ranks = rank_sum_test(ha, hb, 0.95);
        EXPECT_TRUE(std::isfinite(ranks.number("estimate")));
    }
}

// Denormal data (multiples of 1e-320) and two values per group: finite answers, the same t as the
// data times 1e320 would give (scale invariance, common practice). Tolerance 1e-3 relative: denormals
// carry only about 4 significant digits.
TEST(TwoGroups, DenormalValuesAndTwoPerGroup) {
    const std::vector<double> a = {1e-320, 3e-320}, b = {4e-320, 7e-320};
    const std::vector<double> a1 = {1, 3}, b1 = {4, 7};
    for (bool pooled : {false, true}) {
        const TestResult tiny = pooled ? pooled_t_test(a, b, 0.95) : welch_t_test(a, b, 0.95);
        const TestResult plain = pooled ? pooled_t_test(a1, b1, 0.95) : welch_t_test(a1, b1, 0.95);
        EXPECT_NEAR(tiny.number("statistic"), plain.number("statistic"), 1e-3 * std::fabs(plain.number("statistic")));
        EXPECT_NEAR(tiny.number("p"), plain.number("p"), 1e-3);
    }
    EXPECT_TRUE(std::isfinite(compare_groups(two_groups(a, b), "ranks", Transform::none).number("p")));
}

// ---------------------------------------------------------------------------------------------
// Wilcoxon–Mann–Whitney

// scipy.stats.mannwhitneyu 1.10 with method='exact' / 'asymptotic' (use_continuity=True) via the
// generator; Hodges–Lehmann shift and its order-statistic interval by brute force in the same
// script (every difference listed and sorted; exact null counted with Python integers).
// Tolerance 1e-10 relative for p (exact sums and normal tails in double precision), 1e-12 for
// order statistics (the same rounded differences on both sides).
TEST(RankSum, AgreesWithScipyAndBruteForce) {
    for (const char* name : {"ranks_exact", "ranks_ties", "ranks_exact_49", "ranks_large"}) {
        SCOPED_TRACE(name);
        const auto& c = reference()["cases"][name];
        const TestResult r = rank_sum_test(numbers(c["first"]), numbers(c["second"]), 0.95);
        const auto& ref = c["ranks"];
        expect_relative(r.number("statistic"), ref["statistic"].get<double>(), 1e-12, "U1", 1.0);
        expect_relative(r.number("p"), ref["p"].get<double>(), 1e-10, "p", 1.0);
        expect_relative(r.number("estimate"), ref["estimate"].get<double>(), 1e-12, "HL", 1.0);
        expect_relative(r.number("effect"), ref["effect"].get<double>(), 1e-12, "r", 1.0);
        ASSERT_TRUE(ref.contains("ci-low"));
        expect_relative(r.number("ci-low"), ref["ci-low"].get<double>(), 1e-12, "ci-low", 1.0);
        expect_relative(r.number("ci-high"), ref["ci-high"].get<double>(), 1e-12, "ci-high", 1.0);
    }
}

// Exact null distribution of U: m = n = 3 has 20 arrangements with frequencies
// 1,1,2,3,3,3,3,2,1,1 (Mann & Whitney 1947, Table I, from memory; easily counted by hand).
TEST(RankSum, ExactNullSmall) {
    const auto p = rank_sum_null_distribution(3, 3);
    const std::vector<int> counts = {1, 1, 2, 3, 3, 3, 3, 2, 1, 1};
    ASSERT_EQ(p.size(), counts.size());
    for (std::size_t u = 0; u < counts.size(); ++u) EXPECT_NEAR(p[u], counts[u] / 20.0, 1e-15);
}

// n = 2 per group: no 95% interval exists (P(U = 0) = 1/6 > 0.025); the cells say so.
TEST(RankSum, TooFewForInterval) {
    const TestResult r = rank_sum_test(std::vector<double>{1.0, 2.0}, std::vector<double>{3.0, 4.5}, 0.95);
    EXPECT_TRUE(std::holds_alternative<std::string>(*r.find("ci-low")));
    // Exact p: U₁ = 0 is the most extreme of 6 arrangements, two-sided p = 2/6 (counted by hand).
    EXPECT_NEAR(r.number("p"), 1.0 / 3.0, 1e-14);
    EXPECT_EQ(r.number("effect"), -1.0);
}

// Brute force for the selection tests (common practice): every rounded difference x_i − y_j, and
// every rounded Walsh average (x_i + x_j)/2 over i ≤ j, listed and sorted.
std::vector<double> sorted_differences(const std::vector<double>& x, const std::vector<double>& y) {
    std::vector<double> all;
    all.reserve(x.size() * y.size());
    for (double a : x)
        for (double b : y) all.push_back(round_significant(a - b));
    std::sort(all.begin(), all.end());
    return all;
}

std::vector<double> sorted_walsh_averages(const std::vector<double>& x) {
    std::vector<double> all;
    for (std::size_t i = 0; i < x.size(); ++i)
        for (std::size_t j = i; j < x.size(); ++j) all.push_back(round_significant(0.5 * x[i] + 0.5 * x[j]));
    std::sort(all.begin(), all.end());
    return all;
}

// Selection of order statistics of pairwise differences against listing them all (brute force,
// common practice): random sizes with ties, every k. Exact equality: the same rounded values. The
// last trials are large enough (up to 400 × 400) for the pivot steps, not only the final listing.
TEST(RankSum, SelectionMatchesBruteForce) {
    std::mt19937 rng(7);
    for (int trial = 0; trial < 36; ++trial) {
        std::uniform_int_distribution<int> size(1, trial < 30 ? 40 : 400), value(0, trial < 33 ? 30 : 3000);
        std::vector<double> x(size(rng)), y(size(rng));
        for (double& v : x) v = value(rng) * 0.1;
        for (double& v : y) v = value(rng) * 0.1 + (trial % 3) * 1e-3;
        std::sort(x.begin(), x.end());
        std::sort(y.begin(), y.end());
        const std::vector<double> all = sorted_differences(x, y);
        for (std::size_t k = 1; k <= all.size(); k += 1 + all.size() / 50)
            ASSERT_EQ(pairwise_difference_order_statistic(x, y, k), all[k - 1]) << trial << " k=" << k;
        // Walsh averages of x.
        const std::vector<double> walsh = sorted_walsh_averages(x);
        for (std::size_t k = 1; k <= walsh.size(); k += 1 + walsh.size() / 50)
            ASSERT_EQ(walsh_average_order_statistic(x, k), walsh[k - 1]) << trial << " k=" << k;
    }
}

// The medians (Hodges–Lehmann shift and pseudo-median) against listing every difference and Walsh
// average (brute force, common practice): odd and even counts, ties, sizes up to 400 × 400 so that
// the median pair comes from the sampled steps, not only from a short list. Exact equality.
TEST(RankSum, MediansMatchBruteForce) {
    std::mt19937 rng(11);
    const auto median_of_sorted = [](const std::vector<double>& v) {
        const std::size_t n = v.size();
        return n % 2 == 1 ? v[n / 2] : 0.5 * v[n / 2 - 1] + 0.5 * v[n / 2];
    };
    for (int trial = 0; trial < 24; ++trial) {
        std::uniform_int_distribution<int> size(1, trial < 12 ? 30 : 400), value(0, trial % 2 ? 20 : 5000);
        std::vector<double> x(size(rng)), y(size(rng));
        for (double& v : x) v = value(rng) * 0.01;
        for (double& v : y) v = value(rng) * 0.01 + 0.003;
        std::sort(x.begin(), x.end());
        std::sort(y.begin(), y.end());
        const std::vector<double> differences = sorted_differences(x, y), walsh = sorted_walsh_averages(x);
        ASSERT_EQ(hodges_lehmann_shift(x, y), median_of_sorted(differences)) << trial;
        ASSERT_EQ(hodges_lehmann_pseudo_median(x), median_of_sorted(walsh)) << trial;
    }
}

// Heavy ties in large groups: a few distinct values, so that the still-possible window ends up
// holding a few tied values of huge multiplicity (a sampled bracket then cannot narrow it; the
// selection must settle on a tied end of the bracket). Readings of 0 to 10 in steps of 0.5, 3000
// and 2500 of them: 7.5·10⁶ differences and 4.5·10⁶ Walsh averages, of 41 distinct values each, counted (brute force by
// counting, common practice) rather than listed. Exact equality.
TEST(RankSum, HeavyTiesInLargeGroupsAreSelected) {
    std::mt19937 rng(5);
    std::binomial_distribution<int> value(20, 0.45);  // 0..20 half-steps, most mass in a few values
    std::vector<double> x(3000), y(2500);
    for (double& v : x) v = value(rng) * 0.5;
    for (double& v : y) v = value(rng) * 0.5;
    std::sort(x.begin(), x.end());
    std::sort(y.begin(), y.end());
    // Differences x − y in half-steps from −20 to 20: counts, then the k-th by cumulative counts.
    std::vector<std::uint64_t> differences(41, 0), walsh(41, 0);
    for (double a : x)
        for (double b : y) ++differences[static_cast<std::size_t>(std::lround(2 * (a - b)) + 20)];
    for (std::size_t i = 0; i < x.size(); ++i)
        for (std::size_t j = i; j < x.size(); ++j) ++walsh[static_cast<std::size_t>(std::lround(2 * (x[i] + x[j])))];
    const auto kth = [](const std::vector<std::uint64_t>& counts, std::uint64_t k, double step, double offset) {
        std::uint64_t seen = 0;
        for (std::size_t v = 0; v < counts.size(); ++v) {
            seen += counts[v];
            if (seen >= k) return static_cast<double>(v) * step + offset;
        }
        return std::nan("");
    };
    const std::uint64_t pairs = x.size() * y.size(), averages = x.size() * (x.size() + 1) / 2;
    for (std::uint64_t k : {std::uint64_t{1}, pairs / 7, pairs / 4, pairs / 2, pairs / 2 + 1, 3 * pairs / 4, pairs})
        ASSERT_EQ(pairwise_difference_order_statistic(x, y, k), kth(differences, k, 0.5, -10.0)) << "k=" << k;
    for (std::uint64_t k : {std::uint64_t{1}, averages / 3, averages / 2, averages / 2 + 1, averages})
        ASSERT_EQ(walsh_average_order_statistic(x, k), kth(walsh, k, 0.25, 0.0)) << "k=" << k;
    const double middle = 0.5 * kth(differences, pairs / 2, 0.5, -10.0) + 0.5 * kth(differences, pairs / 2 + 1, 0.5, -10.0);
    EXPECT_EQ(hodges_lehmann_shift(x, y), middle);
}

// Nearly tied differences: readings to one decimal give differences such as 12.3 − 11.2 and
// 13.3 − 12.2, two doubles a few ulps apart, each value of huge multiplicity. The window then
// holds only such a cluster and a sampled bracket is the cluster's own ends (it once stalled there
// and refused a third of such samples of 500 against 500). Against brute force (all 250,000
// rounded differences sorted; common practice): the median, the ranks around a 95% interval's
// limits, and every 4999th. Exact equality.
TEST(RankSum, NearlyTiedDifferencesAreSelected) {
    for (unsigned seed = 0; seed < 12; ++seed) {
        std::mt19937 rng(seed);
        std::normal_distribution<double> reading(12.0, 1.0);
        std::vector<double> x(500), y(500);
        for (double& v : x) v = std::round(reading(rng) * 10) / 10;
        for (double& v : y) v = std::round((reading(rng) + 0.3) * 10) / 10;
        std::sort(x.begin(), x.end());
        std::sort(y.begin(), y.end());
        const std::vector<double> all = sorted_differences(x, y);
        const std::uint64_t count = all.size();
        ASSERT_EQ(hodges_lehmann_shift(x, y), 0.5 * all[count / 2 - 1] + 0.5 * all[count / 2]) << "seed " << seed;
        std::vector<std::uint64_t> ks;
        const auto limit = static_cast<std::uint64_t>(count / 2.0 - 1.96 * std::sqrt(500.0 * 500.0 * 1001.0 / 12.0));
        for (std::uint64_t d = 0; d < 8; ++d) ks.insert(ks.end(), {limit - 4 + d, count - limit - 3 + d});
        for (std::uint64_t k = 1 + seed; k <= count; k += 4999) ks.push_back(k);
        for (std::uint64_t k : ks)
            ASSERT_EQ(pairwise_difference_order_statistic(x, y, k), all[k - 1]) << "seed " << seed << " k=" << k;
    }
}

// 5·10⁴ values per group: 2.5·10⁹ differences, never listed. Must finish quickly and bounded; the
// shift between two shifted copies of the same grid is the shift itself (by construction).
TEST(RankSum, LargeGroupsAreSelectedNotEnumerated) {
    const std::size_t n = 50000;
    std::vector<double> x(n), y(n);
    for (std::size_t i = 0; i < n; ++i) {
        x[i] = static_cast<double>(i) * 0.001 + 2.5;
        y[i] = static_cast<double>(i) * 0.001;
    }
    const TestResult r = rank_sum_test(x, y, 0.95);
    EXPECT_NEAR(r.number("estimate"), 2.5, 1e-9);
    EXPECT_LT(r.number("ci-low"), 2.5);
    EXPECT_GT(r.number("ci-high"), 2.5);
}

}  // namespace
}  // namespace quadrat
