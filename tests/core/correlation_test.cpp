// RELATE.CORRELATION's core against SciPy 1.10 (pearsonr with confidence_interval, spearmanr,
// kendalltau with method='exact' and method='asymptotic' explicitly) on invented field data.
// Reference values: tests/reference/generate_linear.py → linear.json.
// Tolerance 1e-12 relative for the coefficients (closed forms); 1e-9 relative for p-values and
// limits (Boost.Math against SciPy's distribution code).
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>

#include <nlohmann/json.hpp>

#include "core/correlation.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

using nlohmann::json;

const json& reference() { return reference_file("linear.json"); }


TEST(Correlation, MatchesScipyOnSoilCoresAndFish) {
    for (const std::string name : {"cores", "fish"}) {
        const std::vector<double> x = reference()[name]["x"], y = reference()[name]["y"];
        const json& ref = reference()[name]["reference"];

        const TestResult p = pearson_correlation(x, y);
        // scipy.stats.pearsonr and .confidence_interval(0.95) (Fisher's z).
        expect_relative(p.number("estimate"), ref["pearson"]["r"], 1e-12, name + " r");
        expect_relative(p.number("p"), ref["pearson"]["p"], 1e-9, name + " pearson p");
        expect_relative(p.number("ci-low"), ref["pearson"]["ci_low"], 1e-9, name + " ci-low");
        expect_relative(p.number("ci-high"), ref["pearson"]["ci_high"], 1e-9, name + " ci-high");
        // t = r √((n − 2)/(1 − r²)) from SciPy's r (generator).
        expect_relative(p.number("statistic"), ref["pearson"]["t"], 1e-10, name + " t");
        EXPECT_EQ(p.number("df"), static_cast<double>(x.size() - 2));

        const TestResult s = spearman_correlation(x, y);
        // scipy.stats.spearmanr.
        expect_relative(s.number("estimate"), ref["spearman"]["rho"], 1e-12, name + " rho");
        expect_relative(s.number("p"), ref["spearman"]["p"], 1e-9, name + " spearman p");

        const TestResult k = kendall_correlation(x, y);
        // scipy.stats.kendalltau(method='exact' for the untied cores, 'asymptotic' for the tied fish).
        expect_relative(k.number("estimate"), ref["kendall"]["tau"], 1e-12, name + " tau");
        expect_relative(k.number("p"), ref["kendall"]["p"], 1e-9, name + " kendall p");
        if (ref["kendall"]["method"] == "exact")
            EXPECT_EQ(k.number("statistic"), k.number("estimate"));  // τ is the statistic when exact
        else
            EXPECT_NE(k.number("statistic"), k.number("estimate"));  // z otherwise
    }
}

TEST(Correlation, KendallExactSmallCases) {
    // Exact distribution by hand (common practice, no source): n = 4 in reverse order has 6
    // inversions of 6, P(I ≥ 6) = 1/24, two-sided p = 2/24.
    const TestResult k = kendall_correlation(std::vector<double>{1, 2, 3, 4}, std::vector<double>{4, 3, 2, 1});
    EXPECT_DOUBLE_EQ(k.number("estimate"), -1.0);
    EXPECT_NEAR(k.number("p"), 2.0 / 24.0, 1e-15);
    // n = 4, one inversion: P(I ≤ 1) = (1 + 3)/24, two-sided 8/24.
    const TestResult one = kendall_correlation(std::vector<double>{1, 2, 3, 4}, std::vector<double>{2, 1, 3, 4});
    EXPECT_NEAR(one.number("p"), 8.0 / 24.0, 1e-15);
}

TEST(Correlation, RefusesTooFewOrConstant) {
    EXPECT_THROW(pearson_correlation(std::vector<double>{1, 2}, std::vector<double>{3, 4}), Refusal);
    EXPECT_THROW(spearman_correlation(std::vector<double>{1, 2, 3}, std::vector<double>{5, 5, 5}), Refusal);
    EXPECT_THROW(kendall_correlation(std::vector<double>{2, 2, 2}, std::vector<double>{1, 2, 3}), Refusal);
}

TEST(Correlation, KendallIsLinearithmicOnLargeInput) {
    // Common practice, no source: y = x exactly, 200000 rows: τ = 1, done by merge sort in well
    // under a second (an O(n²) count would take minutes).
    std::vector<double> x(200000);
    for (std::size_t i = 0; i < x.size(); ++i) x[i] = static_cast<double>((i * 7919) % x.size());
    const TestResult k = kendall_correlation(x, x);
    EXPECT_DOUBLE_EQ(k.number("estimate"), 1.0);
}

// Pearson's r is scale free: values near the largest double (their sums overflow) and denormals
// (their squares underflow) give the r and p of the same numbers at ordinary scale (common practice,
// no source). Tolerance 1e-9 relative: denormals keep about 13 significant digits.
TEST(Correlation, PearsonAtTheEdgesOfTheDoubleRange) {
    const std::vector<double> depth = {12.1, 14.3, 11.8, 13.5, 12.9, 15.0, 16.2, 17.8, 15.5, 18.1, 16.9, 17.0};
    const std::vector<double> distance = {3, 5, 2, 4, 6, 7, 9, 11, 8, 12, 10, 10.5};
    const TestResult plain = pearson_correlation(depth, distance);
    for (double factor : {9e306, 1e-311}) {
        std::vector<double> scaled = depth;
        for (double& v : scaled) v *= factor;
        const TestResult r = pearson_correlation(scaled, distance);
        EXPECT_NEAR(r.number("estimate"), plain.number("estimate"), 1e-9) << factor;
        EXPECT_NEAR(r.number("p"), plain.number("p"), 1e-9 * plain.number("p")) << factor;
    }
}

}  // namespace
}  // namespace quadrat
