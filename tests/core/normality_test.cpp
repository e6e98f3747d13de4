// CHECK.NORMAL and CHECK.QQ in the core: published examples, the reference fixture
// (tests/reference/generate_normality.py → normality.json) and the edge cases.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <limits>
#include <random>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/data.hpp"
#include "core/normality.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& fixture() { return reference_file("normality.json"); }

std::vector<double> values_of(const nlohmann::json& c) { return c.at("values").get<std::vector<double>>(); }


// Shapiro & Wilk (1965), Biometrika 52, 591–611, worked example (weights of 11 men, lb; data and
// W = 0.79 quoted from memory): the printed W has two decimals, so agreement to 0.005. The
// paper's W uses the exact coefficients; Royston's approximation gives 0.7888.
TEST(ShapiroWilk, PublishedWorkedExample) {
    const std::vector<double> weights = {148, 154, 158, 160, 161, 162, 166, 170, 182, 195, 236};
    const TestResult r = shapiro_wilk(weights);
    EXPECT_NEAR(r.number("statistic"), 0.79, 0.005);
    // The paper calls this significant at the 1% level (from memory).
    EXPECT_LT(r.number("p"), 0.01);
    EXPECT_EQ(r.number("n"), 11);
}

// Royston's AS R94 in 50-digit mpmath (generate_normality.py, royston_shapiro_wilk): the same
// algorithm without rounding, so W and p must agree to 1e-6 relative (the acceptance criterion;
// measured agreement is printed on failure). scipy.stats.shapiro 1.10 runs in single precision
// (LIBRARY-NOTES.md), so it is held to 2e-6 in W and 1e-3 relative in p (its float32 W moves p by
// up to 3e-4 relative at n = 500, where 1 − W is only 3e-3 and W carries 7 digits).
TEST(ShapiroWilk, MatchesDoublePrecisionRoystonAndScipy) {
    double worst_w = 0, worst_p = 0;
    for (const auto& c : fixture().at("normality")) {
        if (!c.contains("shapiro_wilk")) continue;
        const TestResult r = shapiro_wilk(values_of(c));
        const double w = c["shapiro_wilk"]["W"], p = c["shapiro_wilk"]["p"];
        worst_w = std::max(worst_w, relative_error(r.number("statistic"), w));
        worst_p = std::max(worst_p, relative_error(r.number("p"), p));
        EXPECT_LT(relative_error(r.number("statistic"), w), 1e-6) << c["name"];
        EXPECT_LT(relative_error(r.number("p"), p), 1e-6) << c["name"];
        if (c.contains("scipy_shapiro")) {
            EXPECT_NEAR(r.number("statistic"), c["scipy_shapiro"]["W"].get<double>(), 2e-6) << c["name"];
            EXPECT_LT(relative_error(r.number("p"), c["scipy_shapiro"]["p"]), 1e-3) << c["name"];
        }
    }
    std::cout << "Shapiro–Wilk against 50-digit Royston: worst relative error W " << worst_w << ", p " << worst_p << "\n";
}

// Royston (1993) formulas in mpmath (generate_normality.py): same formulas, so 1e-6 relative.
TEST(ShapiroFrancia, MatchesRoyston1993Formulas) {
    for (const auto& c : fixture().at("normality")) {
        if (!c.contains("shapiro_francia")) continue;
        const TestResult r = shapiro_francia(values_of(c));
        EXPECT_LT(relative_error(r.number("statistic"), c["shapiro_francia"]["W"]), 1e-6) << c["name"];
        EXPECT_LT(relative_error(r.number("p"), c["shapiro_francia"]["p"]), 1e-6) << c["name"];
    }
}

// statsmodels 0.13 normal_ad and scipy 1.10 anderson (generate_normality.py): A² is a closed form,
// 1e-9 relative; p is the same D'Agostino–Stephens formula, 1e-9 relative (statsmodels prints 0
// for very large A², which is skipped).
TEST(AndersonDarling, MatchesStatsmodelsAndScipy) {
    for (const auto& c : fixture().at("normality")) {
        if (!c.contains("anderson_darling")) continue;
        const TestResult r = anderson_darling(values_of(c));
        EXPECT_LT(relative_error(r.number("statistic"), c["anderson_darling"]["A2"]), 1e-9) << c["name"];
        EXPECT_LT(relative_error(r.number("statistic"), c["anderson_darling"]["scipy_A2"]), 1e-9) << c["name"];
        const double p = c["anderson_darling"]["p"];
        if (p > 0) {
            EXPECT_LT(relative_error(r.number("p"), p), 1e-9) << c["name"];
        }
    }
}

// statsmodels 0.13 lilliefors (generate_normality.py): D to 1e-9 relative (closed form). Where
// Dallal–Wilkinson applies (p < 0.1), p to 1e-9 relative (pvalmethod 'approx', the same formula).
// Above 0.1 the fitted extension against a fresh simulation in the generator (50 000 samples, its
// own seed): 0.02 absolute for 8 <= n <= 1000 (fit error 0.013 plus three simulation SEs, 0.007),
// 0.045 for n < 8 (fit error 0.036 at n = 5), 0.035 above 1000 (fit error 0.024 at n = 5000).
TEST(Lilliefors, MatchesStatsmodelsAndSimulation) {
    for (const auto& c : fixture().at("normality")) {
        if (!c.contains("lilliefors")) continue;
        const TestResult r = lilliefors(values_of(c));
        const auto& ref = c["lilliefors"];
        EXPECT_LT(relative_error(r.number("statistic"), ref["D"]), 1e-9) << c["name"];
        if (ref.contains("p_simulated")) {
            EXPECT_NEAR(r.number("p"), ref["p_simulated"].get<double>(), c["n"] < 8 ? 0.045 : c["n"] > 1000 ? 0.035 : 0.02) << c["name"];
        } else {
            EXPECT_LT(relative_error(r.number("p"), ref["p_approx"]), 1e-9) << c["name"];
        }
    }
}

// p never rises as D grows, across the join with Dallal–Wilkinson at 0.1 (common practice, no
// source: a p-value is monotone in its statistic). Samples with a stretched top value give a
// spread of D; sorted by D, p must not increase.
TEST(Lilliefors, PValueNeverRisesWithD) {
    for (std::size_t n : {5u, 20u, 100u, 1000u}) {
        std::vector<std::pair<double, double>> d_and_p;
        std::vector<double> x(n);
        for (int step = 0; step <= 200; ++step) {
            for (std::size_t i = 0; i < n; ++i) x[i] = std::sqrt(static_cast<double>(i));
            x[n - 1] += 0.02 * std::sqrt(static_cast<double>(n)) * step;
            const TestResult r = lilliefors(x);
            d_and_p.emplace_back(r.number("statistic"), r.number("p"));
        }
        std::sort(d_and_p.begin(), d_and_p.end());
        for (std::size_t i = 1; i < d_and_p.size(); ++i)
            EXPECT_LE(d_and_p[i].second, d_and_p[i - 1].second + 1e-12) << "n = " << n << ", D = " << d_and_p[i].first;
    }
}

// scipy 1.10 normaltest and jarque_bera (generate_normality.py): the same closed forms, 1e-9 relative.
TEST(MomentTests, MatchScipy) {
    for (const auto& c : fixture().at("normality")) {
        if (c.contains("dagostino-pearson")) {
            const TestResult r = dagostino_pearson(values_of(c));
            EXPECT_LT(relative_error(r.number("statistic"), c["dagostino-pearson"]["K2"]), 1e-9) << c["name"];
            EXPECT_LT(relative_error(r.number("p"), c["dagostino-pearson"]["p"]), 1e-9) << c["name"];
            EXPECT_EQ(r.number("df"), 2);
        }
        if (c.contains("jarque_bera")) {
            const TestResult r = jarque_bera(values_of(c));
            EXPECT_LT(relative_error(r.number("statistic"), c["jarque_bera"]["JB"]), 1e-9) << c["name"];
            EXPECT_LT(relative_error(r.number("p"), c["jarque_bera"]["p"]), 1e-9) << c["name"];
        }
    }
}

// The catalogue's refusal texts (FUNCTIONS.md, "Refusals") and each method's n limits.
TEST(NormalityRefusals, CountsAtEachMethodsLimits) {
    EXPECT_EQ(refusal_text([] { shapiro_wilk(std::vector<double>{1, 2}); }), "needs 3 to 5000 values, found 2");
    EXPECT_EQ(refusal_text([] { shapiro_wilk(std::vector<double>(5001, 1.0)); }), "needs 3 to 5000 values, found 5001");
    EXPECT_EQ(refusal_text([] { shapiro_francia(std::vector<double>{1, 2, 3, 4}); }), "needs 5 to 5000 values, found 4");
    EXPECT_EQ(refusal_text([] { anderson_darling(std::vector<double>{1, 2, 3, 4, 5, 6, 7}); }),
              "needs at least 8 values, found 7");
    EXPECT_EQ(refusal_text([] { lilliefors(std::vector<double>{1, 2, 3, 4}); }), "needs at least 5 values, found 4");
    EXPECT_EQ(refusal_text([] { dagostino_pearson(std::vector<double>{1, 2, 3, 4, 5, 6, 7}); }), "needs at least 8 values, found 7");
    EXPECT_EQ(refusal_text([] { jarque_bera(std::vector<double>{1, 2, 3, 4, 5, 6, 7}); }), "needs at least 8 values, found 7");
    // At the limits every method answers with a p in [0, 1].
    const std::vector<double> three = {2.1, 2.6, 2.2}, five = {2.1, 2.6, 2.2, 3.0, 2.4}, eight = {2.1, 2.6, 2.2, 3.0, 2.4, 1.9, 2.3, 2.8};
    for (const auto& [method, sample] : std::vector<std::pair<std::string, std::vector<double>>>{
             {"shapiro-wilk", three}, {"shapiro-francia", five}, {"lilliefors", five},
             {"anderson-darling", eight}, {"dagostino-pearson", eight}, {"jarque-bera", eight}}) {
        const double p = normality_test(sample, method).number("p");
        EXPECT_GE(p, 0.0) << method;
        EXPECT_LE(p, 1.0) << method;
    }
}

TEST(NormalityRefusals, AllEqualValues) {
    for (const std::string& method : normality_methods().list())
        EXPECT_EQ(refusal_text([&] { normality_test(std::vector<double>(12, 4.2), method); }),
                  "all 12 values are equal: a normality test needs values that vary")
            << method;
}

// Common practice, no source: for n = 3 the exact p is 1 at equal spacing (W = 1) and 0 at the
// most extreme configuration (W = 3/4, two equal values).
TEST(ShapiroWilk, ExactPAtNThree) {
    EXPECT_NEAR(shapiro_wilk(std::vector<double>{1, 2, 3}).number("p"), 1.0, 1e-12);
    EXPECT_NEAR(shapiro_wilk(std::vector<double>{1, 1, 2}).number("statistic"), 0.75, 1e-12);
    EXPECT_NEAR(shapiro_wilk(std::vector<double>{1, 1, 2}).number("p"), 0.0, 1e-7);
}

// A 1e300 among ordinary readings must give numbers, not NaN or infinity (common practice, no
// source); W and W′ against the 50-digit evaluation at 1e-6 relative, as above.
TEST(NormalityEdgeCases, HugeOutlierDoesNotOverflow) {
    for (const auto& c : fixture().at("normality")) {
        if (c["name"] != "outlier 1e300") continue;
        const std::vector<double> x = values_of(c);
        EXPECT_LT(relative_error(shapiro_wilk(x).number("p"), c["shapiro_wilk"]["p"]), 1e-6);
        EXPECT_LT(relative_error(shapiro_francia(x).number("p"), c["shapiro_francia"]["p"]), 1e-6);
        for (const std::string& method : normality_methods().list()) {
            const TestResult r = normality_test(x, method);
            EXPECT_TRUE(std::isfinite(r.number("statistic"))) << method;
            EXPECT_TRUE(std::isfinite(r.number("p"))) << method;
            EXPECT_LT(r.number("p"), 0.01) << method;
        }
    }
    // Two values at the ends of the double range: the range itself would overflow.
    std::vector<double> extreme = {-1.7e308, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0, 1.7e308};
    for (const std::string& method : normality_methods().list()) {
        const TestResult r = normality_test(extreme, method);
        EXPECT_TRUE(std::isfinite(r.number("p"))) << method;
    }
}

// Values a few denormals apart still have spread; NaN and infinity are refused (common practice,
// no source: the fence must never see a NaN travel on).
TEST(NormalityEdgeCases, DenormalsAndNonFinite) {
    const double tiny = std::numeric_limits<double>::denorm_min();
    const std::vector<double> denormals = {0, tiny, 2 * tiny, 3 * tiny, 5 * tiny, 8 * tiny, 9 * tiny, 13 * tiny, 21 * tiny, 34 * tiny};
    const std::vector<double> ordinary = {0, 1, 2, 3, 5, 8, 9, 13, 21, 34};
    for (const std::string& method : normality_methods().list())
        EXPECT_NEAR(normality_test(denormals, method).number("p"), normality_test(ordinary, method).number("p"), 1e-12) << method;
    std::vector<double> with_nan = ordinary;
    with_nan[3] = std::numeric_limits<double>::quiet_NaN();
    std::vector<double> with_inf = ordinary;
    with_inf[3] = std::numeric_limits<double>::infinity();
    for (const std::string& method : normality_methods().list()) {
        EXPECT_EQ(refusal_text([&] { normality_test(with_nan, method); }), "values must be finite numbers") << method;
        EXPECT_EQ(refusal_text([&] { normality_test(with_inf, method); }), "values must be finite numbers") << method;
    }
}

// 1 − W accumulated directly: Blom scores themselves are an almost perfect fit (1 − W about
// 1e-5 at n = 5000); 1 − W must stay positive, and shifting and scaling the data (an invariance of
// W) must leave it unchanged to 1e-9 relative (common practice, no source: W is location–scale
// invariant, W <= 1 by Cauchy–Schwarz).
TEST(ShapiroWilk, NearPerfectFitKeepsDigits) {
    std::vector<double> blank(5000, 0.0);
    for (std::size_t i = 0; i < blank.size(); ++i) blank[i] = static_cast<double>(i);
    std::vector<double> scores, shifted;
    for (const QQPoint& q : normal_qq(blank)) {
        scores.push_back(q.normal_quantile);
        shifted.push_back(1000.0 + 0.01 * q.normal_quantile);
    }
    const double w = shapiro_wilk(scores).number("statistic");
    EXPECT_LT(w, 1.0);
    EXPECT_GT(w, 0.999);
    EXPECT_LT(relative_error(1.0 - shapiro_wilk(shifted).number("statistic"), 1.0 - w), 1e-6);
    EXPECT_TRUE(std::isfinite(shapiro_wilk(scores).number("p")));
}

TEST(CheckNormal, ResidualsFromGroupMeansAndPerGroupRows) {
    Groups g;
    g.names = {"upper", "lower", "tiny"};
    g.values = {{8.1, 7.9, 8.4, 8.8, 7.6, 8.2}, {6.2, 5.9, 6.8, 7.1, 6.4}, {3.0, 3.5}};
    g.n_used = 13;
    g.n_dropped = 2;
    const TestResult r = check_normal(g, "");
    // The pooled test equals shapiro_wilk on the residuals (same computation, 1e-12).
    const std::vector<double> residuals = residuals_from_group_means(g);
    ASSERT_EQ(residuals.size(), 13u);
    EXPECT_NEAR(r.number("p"), shapiro_wilk(residuals).number("p"), 1e-12);
    EXPECT_EQ(r.number("n"), 13);
    EXPECT_EQ(r.number("n dropped"), 2);
    EXPECT_NEAR(r.number("upper: p"), shapiro_wilk(g.values[0]).number("p"), 1e-12);
    const CellValue* tiny = r.find("tiny: p");
    ASSERT_NE(tiny, nullptr);
    EXPECT_EQ(std::get<std::string>(*tiny), "needs 3 to 5000 values, found 2");
    EXPECT_NE(r.test.find("residuals from 3 group means"), std::string::npos);
}

TEST(CheckNormal, ConstantWithinEveryGroupIsRefused) {
    Groups g;
    g.names = {"a", "b"};
    g.values = {{1, 1, 1}, {2, 2, 2}};
    g.n_used = 6;
    EXPECT_EQ(refusal_text([&] { check_normal(g, "shapiro-wilk"); }), "the values are equal within every group: no spread to test");
}

// Blom positions through scipy.special.ndtri (generate_normality.py): 1e-12 relative.
TEST(NormalQQ, BlomQuantilesAndSortedValues) {
    for (const auto& c : fixture().at("normality")) {
        if (!c.contains("qq_quantiles") || c["qq_quantiles"].is_null()) continue;
        const std::vector<double> x = values_of(c);
        const std::vector<QQPoint> points = normal_qq(x);
        const std::vector<double> want = c["qq_quantiles"].get<std::vector<double>>();
        ASSERT_EQ(points.size(), want.size());
        std::vector<double> sorted = x;
        std::sort(sorted.begin(), sorted.end());
        for (std::size_t i = 0; i < points.size(); ++i) {
            EXPECT_NEAR(points[i].normal_quantile, want[i], 1e-12 * std::max(1.0, std::fabs(want[i]))) << c["name"];
            EXPECT_EQ(points[i].sorted_value, sorted[i]);
        }
    }
}

// 5000 values: every method answers quickly (O(n log n)); a normal sample is not rejected at 1e-3
// (common practice, no source; fixed seed).
TEST(NormalityEdgeCases, FiveThousandValues) {
    std::mt19937_64 rng(5000);
    std::normal_distribution<double> normal(12.0, 3.0);
    std::vector<double> x(5000);
    for (double& v : x) v = normal(rng);
    for (const std::string& method : normality_methods().list()) EXPECT_GT(normality_test(x, method).number("p"), 1e-3) << method;
}

}  // namespace
}  // namespace quadrat
