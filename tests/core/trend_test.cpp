// TRACK.TREND's core: the Mann–Kendall and seasonal Kendall tests and the Sen slope.
// Reference values: hand counts from the definitions (in the comments), two published examples
// (second-hand, recomputed by hand), and tests/reference/generate_trend.py → trend.json (SciPy 1.10
// kendalltau and theilslopes; brute-force O(n²) seasonal Kendall from Hirsch, Slack & Smith 1982).
// Tolerances: 1e-12 relative for counts, variances, slopes and closed forms; 1e-9 relative for
// p-values (Boost.Math's normal tail against SciPy's and against std::erfc).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <random>

#include <nlohmann/json.hpp>

#include "core/correlation.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "core/trend.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

using nlohmann::json;

const json& reference() { return reference_file("trend.json"); }

TestResult trend(const std::vector<double>& y, const std::vector<double>& t, const std::vector<std::string>& seasons = {},
                 TrendOptions options = {}, const std::vector<unsigned char>& censored = {}) {
    TrendSeries s;
    s.values = y;
    s.times = t;
    s.seasons = seasons;
    s.censored = censored;
    return mann_kendall_trend(s, options);
}

std::vector<double> consecutive(std::size_t n) {
    std::vector<double> t(n);
    std::iota(t.begin(), t.end(), 1.0);
    return t;
}

// Two-sided normal p by the complementary error function (independent of Boost.Math).
double normal_two_sided(double z) { return std::erfc(std::fabs(z) / std::sqrt(2.0)); }

TEST(Trend, HandCountedSmallSeries) {
    // By hand (common practice, no source): 3, 1, 4, 1, 5 at times 1..5. Signs of later minus
    // earlier: from 3: −, +, −, + (0); from 1: +, 0, + (+2); from 4: −, + (0); from 1: + (+1): S = 3.
    // One tie of two (the 1s): Var(S) = [5·4·15 − 2·1·9]/18 = 282/18.
    TestResult r = trend({3, 1, 4, 1, 5}, consecutive(5));
    EXPECT_EQ(r.number("statistic"), 3);
    expect_relative(r.number("variance"), 282.0 / 18.0, 1e-12, "variance");
    // z = (S − 1)/√Var with the continuity correction; ties: the normal approximation.
    expect_relative(r.number("z"), 2.0 / std::sqrt(282.0 / 18.0), 1e-12, "z");
    expect_relative(r.number("p"), normal_two_sided(2.0 / std::sqrt(282.0 / 18.0)), 1e-9, "p");
    EXPECT_EQ(r.test, "Mann–Kendall trend test (normal approximation)");

    // By hand: two readings at time 1 (5 and 7), then 6 at 2 and 8 at 3. The pair at time 1 does
    // not count: (5,6)+ (5,8)+ (7,6)− (7,8)+ (6,8)+ → S = 3. Times tie once (two at time 1):
    // Var(S) = [4·3·13 − 2·1·9]/18 = 138/18; the cross terms vanish with no tie in values.
    r = trend({5, 7, 6, 8}, {1, 1, 2, 3});
    EXPECT_EQ(r.number("statistic"), 3);
    expect_relative(r.number("variance"), 138.0 / 18.0, 1e-12, "variance with a tie in time");
    // Sen slope by hand: slopes (6−5)/1, (8−5)/2, (6−7)/1, (8−7)/2, (8−6)/1 = 1, 1.5, −1, 0.5, 2 → median 1.
    EXPECT_DOUBLE_EQ(r.number("estimate"), 1.0);
    // τ-b = S / √((N − Tt)(N − Ty)) = 3 / √((6 − 1)·6).
    expect_relative(r.number("effect"), 3.0 / std::sqrt(30.0), 1e-12, "tau-b");
}

TEST(Trend, VarianceEqualsTheVarianceOverAllOrders) {
    // generate_trend.py enumerates all 8! orders of tied values against tied times and takes the
    // variance of S over them: 4681/84, which Kendall's tie-corrected formula must give.
    const json& e = reference()["enumerated_variance"];
    const std::vector<double> t = e["t"], y = e["y"];
    expect_relative(trend(y, t).number("variance"), 4681.0 / 84.0, 1e-12, "enumerated variance");
}

TEST(Trend, EpaMannKendallExample) {
    // US EPA QA/G-9S (2006), Mann–Kendall example (second-hand), times: consecutive sampling
    // occasions 1..11. Printed: S = 22, Var(S) = 155.33, z = 1.685, one-sided p = 0.046.
    // Recomputed by hand from the data: later-minus-earlier sign sums by reading
    // +5 +5 +5 +7 +6 −3 −2 −1 +1 −1 → S = 22; ties: four 10s and two 15s →
    // Var(S) = [11·10·27 − 4·3·13 − 2·1·9]/18 = 2796/18 = 155.33; z = 21/√155.33 = 1.685.
    const std::vector<double> y = {10, 10, 10, 5, 10, 20, 18, 17, 15, 24, 15};
    const TestResult r = trend(y, consecutive(11));
    EXPECT_EQ(r.number("statistic"), 22);
    expect_relative(r.number("variance"), 2796.0 / 18.0, 1e-12, "Var(S) by hand");
    EXPECT_NEAR(r.number("variance"), 155.33, 0.005);  // as printed
    EXPECT_NEAR(r.number("z"), 1.685, 0.0005);         // as printed
    // Two-sided: twice the printed one-sided 0.046 (rounding of the print: ±0.001).
    EXPECT_NEAR(r.number("p"), 2 * 0.046, 0.001);
    expect_relative(r.number("p"), normal_two_sided(21.0 / std::sqrt(2796.0 / 18.0)), 1e-9, "p");
}

TEST(Trend, GilbertExample) {
    // Gilbert (1987), Statistical Methods for Environmental Pollution Monitoring, p. 212
    // (second-hand), 22 readings at consecutive sampling occasions. Printed: S = 111,
    // Var(S) = 1226.33, z ≈ 3.14. Recomputed by hand: ties are six 20s and two each of 23, 26, 30:
    // Var(S) = [22·21·49 − 6·5·17 − 3·(2·1·9)]/18 = 22074/18 = 1226.33; z = 110/√1226.33 = 3.141.
    // S by hand, later-minus-earlier sign sums by reading (the first 20: 15 later readings above,
    // one below → 14): 14 14 14 14 17 15 15 −3 1 3 10 −6 5 2 −7 2 3 −2 −1 2 −1 → 111.
    const std::vector<double> y = {20, 20, 20, 20, 15, 20, 20, 30, 27, 26, 23, 35, 25, 28, 70, 26, 24, 34, 32, 23, 50, 30};
    const TestResult r = trend(y, consecutive(22));
    EXPECT_EQ(r.number("statistic"), 111);
    expect_relative(r.number("variance"), 22074.0 / 18.0, 1e-12, "Var(S) by hand");
    EXPECT_NEAR(r.number("z"), 3.14, 0.005);  // as printed
}

TEST(Trend, ExactNullDistributionCountedOverAllPermutations) {
    // Common practice, no source: for n = 4..8 untied readings at times 1..n, every order of the
    // values is equally likely under no trend; the exact two-sided p of an order is
    // min(1, 2·P(S' ≥ |S|)) counted over all n! orders (1 at S = 0). TRACK.TREND and
    // RELATE.CORRELATION's kendall must both give it: the same distribution and the same rule.
    for (int n = 4; n <= 8; ++n) {
        std::vector<double> y(n);
        std::iota(y.begin(), y.end(), 1.0);
        const std::vector<double> t = consecutive(n);
        std::map<int, long> count;
        std::map<int, std::vector<double>> example;
        long total = 0;
        do {
            int s = 0;
            for (int i = 0; i < n; ++i)
                for (int j = i + 1; j < n; ++j) s += (y[j] > y[i]) - (y[j] < y[i]);
            ++count[s];
            ++total;
            if (!example.count(s)) example[s] = y;
        } while (std::next_permutation(y.begin(), y.end()));
        for (const auto& [s, values] : example) {
            long at_least = 0;
            for (const auto& [s2, c] : count)
                if (s2 >= std::abs(s)) at_least += c;
            const double p = s == 0 ? 1.0 : std::min(1.0, 2.0 * static_cast<double>(at_least) / static_cast<double>(total));
            const TestResult r = trend(values, t);
            EXPECT_EQ(r.test, "Mann–Kendall trend test (exact p)");
            EXPECT_EQ(r.number("statistic"), s);
            expect_relative(r.number("p"), p, 1e-12, "n = " + std::to_string(n) + ", S = " + std::to_string(s));
            EXPECT_EQ(kendall_correlation(t, values).number("p"), r.number("p")) << "RELATE.CORRELATION, n = " << n;
        }
    }
}

TEST(Trend, MatchesReferenceCases) {
    for (const auto& [name, c] : reference()["cases"].items()) {
        const std::vector<double> t = c["t"], y = c["y"];
        std::vector<std::string> seasons;
        if (c.contains("seasons")) seasons = c["seasons"].get<std::vector<std::string>>();
        std::vector<unsigned char> censored;
        if (c.contains("censored")) censored = c["censored"].get<std::vector<unsigned char>>();
        TrendOptions options;
        options.times_are_dates = c.value("dates", false);
        for (const std::string level : {"reference", "reference_90"}) {
            options.level = level == "reference" ? 0.95 : 0.90;
            const json& ref = c[level];
            const TestResult r = trend(y, t, seasons, options, censored);
            const std::string what = name + " " + level + " ";
            // generate_trend.py, brute force from the definitions (Hirsch, Slack & Smith 1982 for seasons).
            EXPECT_EQ(r.number("statistic"), ref["S"].get<double>()) << what;
            expect_relative(r.number("variance"), ref["variance"], 1e-12, what + "variance");
            expect_relative(r.number("z"), ref["z"], 1e-12, what + "z");
            expect_relative(r.number("p"), ref["p"], 1e-9, what + "p");
            EXPECT_EQ(r.test.find("exact") != std::string::npos, ref["exact"].get<bool>()) << what;
            expect_relative(r.number("effect"), ref["tau"], 1e-12, what + "tau");
            expect_relative(r.number("estimate"), ref["slope"], 1e-12, what + "slope");
            if (ref.contains("ci_low")) {
                expect_relative(r.number("ci-low"), ref["ci_low"], 1e-12, what + "ci-low");
                expect_relative(r.number("ci-high"), ref["ci_high"], 1e-12, what + "ci-high");
            } else {
                EXPECT_TRUE(std::isnan(r.number("ci-low"))) << what << "no interval expected";
            }
            expect_relative(r.number("intercept"), ref["intercept"], 1e-12, what + "intercept");
            expect_relative(r.number("percent"), ref["percent"], 1e-12, what + "percent");
            expect_relative(r.number("lag-1 correlation"), ref["lag1"], 1e-12, what + "lag-1");
            EXPECT_EQ(r.number("censored"), ref["censored"].get<double>()) << what;
            EXPECT_EQ(r.number("seasons"), ref["seasons"].get<double>()) << what;
            EXPECT_EQ(r.number("n"), ref["n"].get<double>()) << what;
        }
        if (!c.contains("scipy")) continue;
        const json& sp = c["scipy"];
        const TestResult r = trend(y, t);
        // scipy.stats.kendalltau: τ-b against time, and S = τ-b·√((N − Tt)(N − Ty)).
        expect_relative(r.number("effect"), sp["tau_b"], 1e-12, name + " scipy tau-b");
        expect_relative(r.number("statistic"), sp["S_from_tau"], 1e-9, name + " scipy S");
        // scipy.stats.theilslopes(method='separate'): the same median slope.
        expect_relative(r.number("estimate"), sp["theil_slope"], 1e-12, name + " scipy Sen slope");
        // Its interval rounds the ranks to whole numbers and drops Kendall's cross terms from C:
        // close to ours, not equal (within a tenth of the interval's width).
        const double width = r.number("ci-high") - r.number("ci-low");
        EXPECT_NEAR(r.number("ci-low"), sp["theil_low"].get<double>(), 0.1 * width) << name;
        EXPECT_NEAR(r.number("ci-high"), sp["theil_high"].get<double>(), 0.1 * width) << name;
        if (sp.contains("exact_p")) {
            // scipy.stats.kendalltau(method='exact').
            expect_relative(r.number("p"), sp["exact_p"], 1e-9, name + " scipy exact p");
            // RELATE.CORRELATION's kendall on the same data: the same p, bit for bit.
            EXPECT_EQ(kendall_correlation(t, y).number("p"), r.number("p")) << name;
        }
    }
}

TEST(Trend, SlopeSelectionEqualsTheListedSlopes) {
    // Brute force (common practice, no source): every pairwise slope listed and sorted. Series
    // large enough that the selection samples and narrows (more than 2^16 pairs), with heavy ties
    // (values on a grid, repeated times, a censored-like floor), with and without seasons.
    std::mt19937_64 random(14);
    for (int trial = 0; trial < 8; ++trial) {
        const std::size_t n = 700 + 150 * trial;
        std::vector<double> t(n), y(n);
        std::vector<std::uint32_t> seasons;
        for (std::size_t i = 0; i < n; ++i) {
            t[i] = trial % 2 ? static_cast<double>(random() % 200) : static_cast<double>(i) * 0.37;
            const double noise = std::normal_distribution<double>(0, 1)(random);
            y[i] = trial % 3 == 0 ? std::round(noise * 2) / 2 + 0.01 * t[i] : trial % 3 == 1 ? std::max(0.5, noise) : noise + 0.003 * t[i];
        }
        if (trial >= 4) {
            seasons.resize(n);
            for (auto& s : seasons) s = static_cast<std::uint32_t>(random() % 3);
        }
        std::vector<double> all;
        for (std::size_t i = 0; i < n; ++i)
            for (std::size_t j = i + 1; j < n; ++j)
                if (t[i] != t[j] && (seasons.empty() || seasons[i] == seasons[j])) all.push_back((y[j] - y[i]) / (t[j] - t[i]));
        std::sort(all.begin(), all.end());
        const PairwiseSlopes slopes(t, y, seasons);
        ASSERT_EQ(slopes.count(), all.size());
        const std::vector<std::uint64_t> ranks = {1, all.size() / 3, all.size() / 2, all.size() / 2 + 1, all.size() - 7, all.size()};
        for (std::uint64_t k : ranks)
            EXPECT_NEAR(slopes.order_statistic(k), all[k - 1], 1e-12 * std::max(1.0, std::fabs(all[k - 1])))
                << "trial " << trial << " rank " << k;
        // Fractional ranks interpolate between neighbours.
        const double rank = static_cast<double>(all.size() / 4) + 0.25;
        const double want = all[all.size() / 4 - 1] + 0.25 * (all[all.size() / 4] - all[all.size() / 4 - 1]);
        EXPECT_NEAR(slopes.at_ranks({rank})[0], want, 1e-12 * std::max(1.0, std::fabs(want))) << "trial " << trial;
    }
}

TEST(Trend, Units) {
    // Monthly readings as day numbers; the slope per day times 365.25 is the slope per year
    // (FUNCTIONS.md: a year is 365.25 days). By hand: y rises 0.5 every 30 days → per day 1/60.
    const std::vector<double> t = {45000, 45030, 45060, 45090, 45120, 45150};
    const std::vector<double> y = {2.0, 2.5, 3.0, 3.5, 4.0, 4.5};
    TrendOptions dates;
    dates.times_are_dates = true;
    TestResult r = trend(y, t, {}, dates);
    expect_relative(r.number("estimate"), 365.25 / 60, 1e-12, "per year");
    EXPECT_EQ(std::get<std::string>(*r.find("unit")), "per year");
    // With dates the intercept is the line's value at the first sampling date: here the first reading.
    expect_relative(r.number("intercept"), 2.0, 1e-12, "intercept at the first date");
    // Percent: slope per year over the median reading (3.25), as a percentage.
    expect_relative(r.number("percent"), 100 * (365.25 / 60) / 3.25, 1e-12, "percent per year");
    dates.unit = TrendUnit::day;
    expect_relative(trend(y, t, {}, dates).number("estimate"), 1.0 / 60, 1e-12, "per day");
    TrendOptions plain;
    r = trend(y, t, {}, plain);
    expect_relative(r.number("estimate"), 1.0 / 60, 1e-12, "per unit of time");
    // Without dates the intercept is at time zero: 3.25 − (1/60)·45075 (median time 45075).
    expect_relative(r.number("intercept"), 3.25 - 45075.0 / 60, 1e-12, "intercept at time zero");
    plain.unit = TrendUnit::year;  // `unit` overrides: the times are read as day numbers
    expect_relative(trend(y, t, {}, plain).number("estimate"), 365.25 / 60, 1e-12, "unit year");
}

TEST(Trend, OrderOfRowsDoesNotMatter) {
    // Common practice: times need not increase down the sheet; shuffled rows give the same result.
    const std::vector<double> y = {3.1, 2.7, 3.8, 4.0, 3.3, 4.4, 4.1, 5.0, 4.6, 5.2};
    const TestResult sorted = trend(y, consecutive(10));
    std::vector<std::size_t> order = {4, 9, 0, 7, 2, 5, 1, 8, 3, 6};
    std::vector<double> ys, ts;
    for (std::size_t i : order) ys.push_back(y[i]), ts.push_back(static_cast<double>(i + 1));
    const TestResult shuffled = trend(ys, ts);
    for (const std::string q : {"statistic", "variance", "p", "effect", "estimate", "ci-low", "ci-high", "intercept", "lag-1 correlation"})
        EXPECT_DOUBLE_EQ(shuffled.number(q), sorted.number(q)) << q;
}

TEST(Trend, HugeAndTinyValuesKeepTheirResult) {
    // Scaling by a power of two is exact: readings ×2^1000 (near 1e301) or ×2^-1060 (denormal)
    // give the same S and p, and the slope scaled by the same power.
    const std::vector<double> y = {3.1, 2.7, 3.8, 4.0, 3.3, 4.4, 4.1, 5.0, 4.6, 5.2};
    const TestResult plain = trend(y, consecutive(10));
    for (int e : {1000, -1060}) {
        std::vector<double> scaled(y.size());
        for (std::size_t i = 0; i < y.size(); ++i) scaled[i] = std::ldexp(y[i], e);
        const TestResult r = trend(scaled, consecutive(10));
        EXPECT_EQ(r.number("statistic"), plain.number("statistic"));
        EXPECT_EQ(r.number("p"), plain.number("p"));
        if (e > 0) expect_relative(r.number("estimate"), std::ldexp(plain.number("estimate"), e), 1e-12, "huge slope");
    }
    // Readings of ±1e308 with times near 1e308 too: no overflow, no NaN.
    const TestResult extreme = trend({-1e308, 1e308, -1e307, 1e308, 5e307}, {1e308, 1.2e308, 1.4e308, 1.6e308, 1.7e308});
    EXPECT_TRUE(std::isfinite(extreme.number("p")));
    EXPECT_TRUE(std::isfinite(extreme.number("estimate")));
}

TEST(Trend, Seasons) {
    // By hand (Hirsch, Slack & Smith 1982: pairs only within a season): winter 1, 2, 4 at years
    // 1, 2, 3 (S = +3), summer 9, 8 at years 1, 2 (S = −1), spring one reading only (adds nothing).
    // S = 2; Var = 3·2·11/18 + 2·1·9/18 = 66/18 + 18/18 = 84/18.
    const std::vector<double> y = {1, 9, 5, 2, 8, 4};
    const std::vector<double> t = {1, 1, 1, 2, 2, 3};
    const std::vector<std::string> s = {"winter", "summer", "spring", "winter", "summer", "winter"};
    const TestResult r = trend(y, t, s);
    EXPECT_EQ(r.number("statistic"), 2);
    expect_relative(r.number("variance"), 84.0 / 18.0, 1e-12, "seasonal variance");
    EXPECT_EQ(r.number("seasons"), 3);
    EXPECT_EQ(r.test, "Seasonal Kendall trend test (normal approximation)");
    // Within-season slopes: winter 1, 1.5, 2; summer −1 → median of {−1, 1, 1.5, 2} = 1.25.
    EXPECT_DOUBLE_EQ(r.number("estimate"), 1.25);
}

TEST(Trend, CensoredReadings) {
    // By hand (FUNCTIONS.md's one-limit rule): <1, 0.8 (a detected value below the limit), <1, 2, 3
    // at times 1..5: the first three tie, all below 2 and 3. Pairs: the three tied pairs 0; each
    // of the first three against 2 and 3: +6; (2,3): +1 → S = 7. Ties: one group of three:
    // Var = [5·4·15 − 3·2·11]/18 = 234/18.
    const std::vector<double> y = {1, 0.8, 1, 2, 3};
    const std::vector<unsigned char> c = {1, 0, 1, 0, 0};
    const TestResult r = trend(y, consecutive(5), {}, {}, c);
    EXPECT_EQ(r.number("statistic"), 7);
    expect_relative(r.number("variance"), 234.0 / 18.0, 1e-12, "censored variance");
    EXPECT_EQ(r.number("censored"), 2);
    EXPECT_NE(render_report(r).find("2 readings below the detection limit <1"), std::string::npos) << render_report(r);
    // Several limits: a refusal that names them.
    const std::string several = refusal_text([] { trend({1, 0.5, 2, 3}, consecutive(4), {}, {}, {1, 1, 0, 0}); });
    EXPECT_NE(several.find("2 different detection limits (<0.5, <1)"), std::string::npos) << several;
    // All below the limit.
    EXPECT_NE(refusal_text([] { trend({1, 1, 1}, consecutive(3), {}, {}, {1, 1, 1}); }).find("every reading is below the detection limit"),
              std::string::npos);
    // More than half below the limit: no median, so no percent and no intercept.
    const TestResult mostly = trend({1, 1, 1, 2, 3}, consecutive(5), {}, {}, {1, 1, 1, 0, 0});
    EXPECT_TRUE(std::holds_alternative<std::string>(*mostly.find("percent")));
}

TEST(Trend, Refusals) {
    EXPECT_EQ(refusal_text([] { trend({1, 2}, {1, 2}); }), "needs at least 3 readings with a time, found 2");
    EXPECT_NE(refusal_text([] { trend({1, 2, 3}, {5, 5, 5}); }).find("one time only"), std::string::npos);
    EXPECT_NE(refusal_text([] { trend({4, 4, 4, 4}, consecutive(4)); }).find("every reading is the same (4)"), std::string::npos);
    // Every season has one reading: nothing to compare within a season.
    EXPECT_NE(refusal_text([] { trend({1, 2, 3}, {1, 2, 3}, {"a", "b", "c"}); }).find("no season has readings at two different times"),
              std::string::npos);
    // Readings vary, but never within a season at different times.
    EXPECT_NE(refusal_text([] { trend({1, 1, 5, 5}, {1, 2, 1, 2}, {"a", "a", "b", "b"}); }).find("never differ"), std::string::npos);
}

TEST(Trend, ReportSentence) {
    // Numbers by the report rules (report.hpp): the EPA example. τ-b = 22/√(55·48) = 0.43;
    // Sen slope 1 (by hand: the median of the 55 slopes), interval 0 to 2 (generate_trend.py),
    // percent = 1/15 (the median reading: 5 10 10 10 10 [15] 15 17 18 20 24) = 6.67%.
    const TestResult r = trend({10, 10, 10, 5, 10, 20, 18, 17, 15, 24, 15}, consecutive(11));
    EXPECT_EQ(render_report(r),
              "Mann–Kendall trend test (normal approximation): S = 22, p = 0.092, n = 11; Sen slope per unit of time 1.00 "
              "(95% CI 0.00 to 2.00), τ = 0.43; change per unit of time as % of the median 6.67");
    // Seasons and censored readings in the closing words (the hand-counted series of Seasons and
    // CensoredReadings above).
    const TestResult seasonal = trend({1, 9, 5, 2, 8, 4}, {1, 1, 1, 2, 2, 3}, {"winter", "summer", "spring", "winter", "summer", "winter"});
    EXPECT_NE(render_report(seasonal).find("(3 seasons)"), std::string::npos) << render_report(seasonal);
}

// From cells (the data layer's rules): a header row, `<1` read as censored at 1, a text reading
// dropped and counted, month labels as seasons, and date formatting read from Range::dates.
TEST(Trend, FromCells) {
    Range values = Range::text_column({"nitrate", "<1", "0.8", "<1", "2", "n/a", "3"});
    for (std::size_t i : {2u, 4u, 6u}) values.cells[i] = Cell::make_number(std::stod(values.cells[i].text));
    Range times = Range::column({0, 1, 2, 3, 4, 5, 6});
    times.cells[0] = Cell::make_text("day");
    const TestResult r = track_trend(values, times, Range::omitted_argument(), TrendUnit::automatic, 0.95);
    // The same readings as CensoredReadings (by hand: S = 7, Var = 234/18), the n/a row dropped.
    EXPECT_EQ(r.number("statistic"), 7);
    EXPECT_EQ(r.number("n"), 5);
    EXPECT_EQ(r.number("n dropped"), 1);
    EXPECT_EQ(r.number("censored"), 2);
    EXPECT_EQ(std::get<std::string>(*r.find("unit")), "per unit of time");
    // The same day numbers formatted as dates: per year, 365.25 times the slope per day.
    Range dated = times;
    dated.dates = true;
    const TestResult y = track_trend(values, dated, Range::omitted_argument(), TrendUnit::automatic, 0.95);
    EXPECT_EQ(std::get<std::string>(*y.find("unit")), "per year");
    expect_relative(y.number("estimate"), 365.25 * r.number("estimate"), 1e-12, "per year from dates");
    EXPECT_EQ(track_trend(values, dated, Range::omitted_argument(), TrendUnit::none, 0.95).number("estimate"), r.number("estimate"));
    // Seasons as labels (numbers in a label column are labels): the Seasons series by hand, S = 2.
    const Range v = Range::column({1, 9, 5, 2, 8, 4}), t = Range::column({1, 1, 1, 2, 2, 3});
    const TestResult s = track_trend(v, t, Range::column({1, 7, 4, 1, 7, 1}), TrendUnit::automatic, 0.95);
    EXPECT_EQ(s.number("statistic"), 2);
    EXPECT_EQ(s.number("seasons"), 3);
    // A non-detect without its limit is refused everywhere (FUNCTIONS.md, "Missing data").
    EXPECT_NE(refusal_text([&] { track_trend(Range::text_column({"1", "ND", "3"}), Range::column({1, 2, 3}), Range::omitted_argument(),
                                             TrendUnit::automatic, 0.95); })
                  .find("ND"),
              std::string::npos);
    EXPECT_EQ(parse_trend_unit("year"), TrendUnit::year);
    EXPECT_EQ(parse_trend_unit("auto"), TrendUnit::automatic);
}

}  // namespace
}  // namespace quadrat
