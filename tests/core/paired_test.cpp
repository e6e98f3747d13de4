// Paired readings and one sample against a number: paired t, Wilcoxon signed-rank, sign test, and
// COMPARE.PAIRED.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "core/paired.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("compare.json"); }

void expect_matches(const TestResult& r, const nlohmann::json& ref, double tolerance) {
    for (const char* key : {"statistic", "df", "p", "n", "estimate", "ci-low", "ci-high", "effect"})
        if (ref.contains(key)) expect_relative(r.number(key), ref[key].get<double>(), tolerance, key, 1.0);
}

PairedReadings readings_of(const nlohmann::json& c) {
    PairedReadings r;
    r.first = c["first"].get<std::vector<double>>();
    if (c["second"].is_number()) {
        r.one_sample = true;
        r.reference_value = c["second"].get<double>();
    } else {
        r.second = c["second"].get<std::vector<double>>();
    }
    return r;
}

// Student (1908), Biometrika 6, 1–25, Illustration I: additional hours of sleep under two
// hypnotics in 10 patients (Cushny & Peebles' data as printed there). Printed: mean difference
// +1.58, S.D. of the differences 1.17 (denominator n), z = 1.58/1.17; t = z·√(n − 1) = 4.06
// (from memory). Tolerances: half a unit in the last printed digit.
TEST(Paired, StudentIllustrationOne) {
    PairedReadings s;
    s.first = {1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4};
    s.second = {0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0};
    const TestResult r = compare_paired(s, "t", Transform::none);
    EXPECT_NEAR(r.number("estimate"), 1.58, 1e-12);
    const double sd_n = r.number("estimate") / r.number("effect") * std::sqrt(9.0 / 10.0);
    EXPECT_NEAR(sd_n, 1.17, 0.005);
    EXPECT_NEAR(r.number("statistic"), 4.06, 0.005);
    EXPECT_EQ(r.number("df"), 9);
}

// scipy.stats.ttest_rel / ttest_1samp, scipy.stats.wilcoxon (zero_method='wilcox', method='exact'
// without ties, method='approx' with correction=True with ties and zeros) and scipy.stats.binomtest
// 1.10 via tests/reference/generate_compare.py; Hodges–Lehmann pseudo-median and the order-statistic
// intervals by brute force in the same script. Tolerance 1e-10 relative (closed forms, exact sums).
TEST(Paired, AgreesWithScipy) {
    for (const char* name : {"oxygen", "passes", "ph"}) {
        const auto& c = reference()["cases"][name];
        for (const char* method : {"t", "signed-rank", "sign"}) {
            SCOPED_TRACE(std::string(name) + " " + method);
            const TestResult r = compare_paired(readings_of(c), method, Transform::none);
            expect_matches(r, c[method], 1e-10);
        }
    }
    // The exact path is taken where the reference is exact, the normal one with ties.
    EXPECT_EQ(compare_paired(readings_of(reference()["cases"]["oxygen"]), "signed-rank", Transform::none).test,
              "Wilcoxon signed-rank test (exact p)");
    EXPECT_EQ(compare_paired(readings_of(reference()["cases"]["passes"]), "signed-rank", Transform::none).test,
              "Wilcoxon signed-rank test (normal approximation)");
}

// Exact null of T⁺ for n = 3: subset sums of {1,2,3}: 0,1,2,3,3,4,5,6 → frequencies
// 1,1,1,2,1,1,1 over 8 (counted by hand).
TEST(Paired, SignedRankNullSmall) {
    const auto p = signed_rank_null_distribution(3);
    const std::vector<double> counts = {1, 1, 1, 2, 1, 1, 1};
    ASSERT_EQ(p.size(), counts.size());
    for (std::size_t t = 0; t < counts.size(); ++t) EXPECT_EQ(p[t], counts[t] / 8);
}

// Differences equal on paper tie after rounding to 10 significant digits (FUNCTIONS.md "Ties and
// precision"): 1.09 − 1 and 1 − 0.91 have the same |d|, so the test goes to the normal
// approximation and both get rank 1.5 (by hand: all positive, T⁺ = 1.5 + 1.5 + 3 = 6; with the
// second difference negative, T⁺ = 1.5 + 3 = 4.5).
TEST(Paired, RoundingMakesPaperTies) {
    PairedReadings s;
    s.first = {1.09, 1.0, 2.5};
    s.second = {1.0, 0.91, 2.0};
    const TestResult r = compare_paired(s, "signed-rank", Transform::none);
    EXPECT_EQ(r.test, "Wilcoxon signed-rank test (normal approximation)");
    EXPECT_EQ(r.number("statistic"), 6.0);
    s.first[1] = 0.91;
    s.second[1] = 1.0;
    EXPECT_EQ(compare_paired(s, "signed-rank", Transform::none).number("statistic"), 4.5);
}

// Zeros dropped first and counted; n is what remains; the table says both (common practice).
TEST(Paired, ZerosDroppedAndTable) {
    PairedReadings s;
    s.first = {5, 6, 7, 8, 9, 10, 11};
    s.second = {5, 6, 6, 6, 6, 6, 6};
    s.first_name = "before";
    s.second_name = "after";
    s.n_dropped = 2;
    const TestResult r = compare_paired(s, "signed-rank", Transform::none);
    EXPECT_EQ(r.number("n"), 5);
    EXPECT_EQ(r.number("zero differences"), 2);
    EXPECT_EQ(r.number("n dropped"), 2);
    ASSERT_NE(r.find("before: median"), nullptr);
    EXPECT_EQ(render_report(r).rfind("Wilcoxon signed-rank test (", 0), 0u) << render_report(r);
    EXPECT_NE(render_report(r).find("(before − after; "), std::string::npos) << render_report(r);
    const TestResult t = compare_paired(s, "t", Transform::none);
    EXPECT_EQ(render_report(t).rfind("Paired t-test: t(6) = ", 0), 0u) << render_report(t);
    EXPECT_NE(render_report(t).find("Cohen's d = "), std::string::npos) << render_report(t);
    const TestResult sign = compare_paired(s, "sign", Transform::none);
    // 5 of 5 positive: exact two-sided p = 2·(1/2)⁵ = 0.0625 (by hand).
    EXPECT_NEAR(sign.number("p"), 0.0625, 1e-15);
    EXPECT_NE(render_report(sign).find("5 of 5 differences positive"), std::string::npos) << render_report(sign);
}

// One sample against a number, with log: the estimate is the geometric mean over the number
// (exp of the mean log difference; by hand: values 2, 8 → geometric mean 4, over 2 → ratio 2).
TEST(Paired, OneSampleAndLog) {
    PairedReadings s;
    s.first = {2, 8, 4, 4};
    s.one_sample = true;
    s.reference_value = 2;
    const TestResult r = compare_paired(s, "t", Transform::log);
    EXPECT_NEAR(r.number("estimate"), 2.0, 1e-12);
    EXPECT_EQ(r.test, "One-sample t-test");
    EXPECT_NE(render_report(r).find("ratio of geometric means 2.00 (first ÷ 2; "), std::string::npos) << render_report(r);
    s.reference_value = 0;
    EXPECT_THROW(compare_paired(s, "t", Transform::log), Refusal);
}

TEST(Paired, Refusals) {
    PairedReadings s;
    s.first = {1, 2, 3};
    s.second = {0, 1, 2};  // all differences 1
    EXPECT_THROW(compare_paired(s, "t", Transform::none), Refusal);
    EXPECT_NO_THROW(compare_paired(s, "sign", Transform::none));
    s.second = s.first;  // all zero
    EXPECT_THROW(compare_paired(s, "signed-rank", Transform::none), Refusal);
    EXPECT_THROW(compare_paired(s, "sign", Transform::none), Refusal);
    EXPECT_THROW(compare_paired(s, "wilcoxon", Transform::none), Refusal);
    PairedReadings one;
    one.first = {1};
    one.second = {2};
    EXPECT_THROW(compare_paired(one, "t", Transform::none), Refusal);
}

// Walsh averages of 5·10⁴ differences (1.25·10⁹ averages) are selected, never listed: the
// pseudo-median of a symmetric grid is its centre (by construction). Bounded time.
TEST(Paired, LargeSampleSelection) {
    PairedReadings s;
    s.one_sample = true;
    for (int i = 0; i < 50000; ++i) s.first.push_back(1.0 + (i % 2 ? 1 : -1) * (0.5 + i * 1e-5));
    s.reference_value = 0;
    const TestResult r = compare_paired(s, "signed-rank", Transform::none);
    EXPECT_TRUE(std::isfinite(r.number("ci-low")));
    EXPECT_NEAR(r.number("estimate"), 1.0, 0.01);
}

}  // namespace
}  // namespace quadrat
