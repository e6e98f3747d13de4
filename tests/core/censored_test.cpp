// DESCRIBE.CENSORED and COMPARE.CENSORED (src/core/censored.cpp): Kaplan–Meier on a printed
// right-censored example and its flipped copy, ROS worked by hand, the generalized Wilcoxon tests
// in exact fractions and against statsmodels 0.13 (tests/reference/generate_censored.py →
// censored.json), the catalogue's thresholds and bad input.
#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

#include "core/censored.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "reference.hpp"

namespace quadrat {
namespace {

using test_support::expect_relative;
using test_support::reference_file;
using test_support::refusal_text;

std::vector<CensoredValue> from_json(const nlohmann::json& cells) {
    std::vector<CensoredValue> out;
    for (const auto& c : cells) out.push_back({c[0].get<double>(), c[1].get<bool>()});
    return out;
}

CensoredGroups groups_from_json(const nlohmann::json& groups) {
    CensoredGroups g;
    // A list of [name, cells] pairs: JSON objects would not keep the group order.
    for (const auto& pair : groups) {
        g.names.push_back(pair[0]);
        g.values.push_back(from_json(pair[1]));
    }
    return g;
}

// "<0.5" → censored at 0.5; a number → detected.
CensoredValue lt(double limit) { return {limit, true}; }
CensoredValue at(double value) { return {value, false}; }

bool blank(const CellValue& v) { return std::holds_alternative<std::monostate>(v); }
double number(const CellValue& v) { return std::get<double>(v); }
std::string text(const CellValue& v) { return std::get<std::string>(v); }

// Column positions of DESCRIBE.CENSORED's table.
enum Column { group, n, censored, censored_share, lowest_limit, highest_limit, mean_col, se, ci_low, ci_high, q1, median, q3, maximum, method_col };

// ---------------------------------------------------------------------------------------------
// Kaplan–Meier

// Freireich et al. (1963), Blood 21, 699–716: remission times in weeks of the 21 patients on
// 6-mercaptopurine, + censored, as printed in survival texts (e.g. Klein & Moeschberger 2003,
// Survival Analysis, Table 4.1A). From memory: 6 6 6 6+ 7 9+ 10 10+ 11+ 13 16 17+ 19+ 20+ 22 23
// 25+ 32+ 32+ 34+ 35+. Printed estimates Ŝ(t) at the relapse times 6, 7, 10, 13, 16, 22, 23:
// 0.857, 0.807, 0.753, 0.690, 0.627, 0.538, 0.448 (from memory, recomputed by hand below).
// The core estimates left-censored values, so the remission times go in flipped about 40
// (x = 40 − t, a censored time becoming a value below its limit): this is the flip check.
TEST(CensoredKaplanMeier, SixMercaptopurineFlipped) {
    const std::vector<std::pair<double, bool>> remission = {
        {6, false}, {6, false}, {6, false}, {6, true},  {7, false},  {9, true},  {10, false},
        {10, true}, {11, true}, {13, false}, {16, false}, {17, true}, {19, true}, {20, true},
        {22, false}, {23, false}, {25, true}, {32, true}, {32, true}, {34, true}, {35, true}};
    std::vector<CensoredValue> flipped;
    for (const auto& [t, plus] : remission) flipped.push_back({40.0 - t, plus});
    const KaplanMeierCurve curve = kaplan_meier_left(flipped);

    // By hand: at risk n_j and relapses d_j at 6, 7, 10, 13, 16, 22, 23 are 21/3, 17/1, 15/1,
    // 12/1, 11/1, 7/1, 6/1 (the patient censored at 6 is still at risk at 6, as the printed
    // table has it); Ŝ is the running product of (n_j − d_j)/n_j.
    const std::vector<double> times = {6, 7, 10, 13, 16, 22, 23};
    const std::vector<double> risk = {21, 17, 15, 12, 11, 7, 6};
    const std::vector<double> relapses = {3, 1, 1, 1, 1, 1, 1};
    const std::vector<double> printed = {0.857, 0.807, 0.753, 0.690, 0.627, 0.538, 0.448};
    ASSERT_EQ(curve.detected_values.size(), times.size());
    double s = 1;
    for (std::size_t j = 0; j < times.size(); ++j) {
        s *= (risk[j] - relapses[j]) / risk[j];
        EXPECT_EQ(curve.detected_values[j], 40.0 - times[j]);
        EXPECT_EQ(curve.at_risk[j], risk[j]) << "at risk at t = " << times[j];
        EXPECT_EQ(curve.detections[j], relapses[j]);
        // Products of a few fractions: rounding only, 1e-14.
        EXPECT_NEAR(curve.below[j], s, 1e-14) << "t = " << times[j];
        // The printed three decimals: within half a unit of the last digit.
        EXPECT_NEAR(curve.below[j], printed[j], 5e-4) << "printed Ŝ(" << times[j] << ")";
    }
    // Median remission 23 weeks (the first time with Ŝ ≤ 0.5; printed in the same texts): 40 − 23.
    EXPECT_EQ(kaplan_meier_quantile(curve, 0.5).value(), 17.0);
    // The longest time (35+) is censored: the mean is restricted there, so is the flipped one.
    EXPECT_TRUE(curve.lowest_censored);
    EXPECT_EQ(curve.lowest, 5.0);

    // Restricted mean by hand: area under Ŝ from 0 to 35 = 6·1 + Σ Ŝ(t_j)·(t_{j+1} − t_j),
    // t_8 = 35 (23.287 weeks); flipped, the mean is 40 minus that area. Its SE by the Greenwood-type
    // formula (Klein & Moeschberger 2003, eq. 4.5.2): Σ A_j² d_j / (n_j (n_j − d_j)), A_j the area
    // from t_j to 35.
    std::vector<double> surv(times.size());
    s = 1;
    for (std::size_t j = 0; j < times.size(); ++j) surv[j] = s *= (risk[j] - relapses[j]) / risk[j];
    std::vector<double> ends = times;
    ends.push_back(35);
    double area = 6;
    for (std::size_t j = 0; j < times.size(); ++j) area += surv[j] * (ends[j + 1] - ends[j]);
    double variance = 0;
    for (std::size_t j = 0; j < times.size(); ++j) {
        double a = 0;
        for (std::size_t i = j; i < times.size(); ++i) a += surv[i] * (ends[i + 1] - ends[i]);
        variance += a * a * relapses[j] / (risk[j] * (risk[j] - relapses[j]));
    }
    // Hand sum in the test against the core's compensated sweep: 1e-12 relative.
    EXPECT_NEAR(area, 23.287, 5e-4);
    expect_relative(curve.mean, 40.0 - area, 1e-12, "6-MP restricted mean, flipped");
    expect_relative(curve.mean_se, std::sqrt(variance), 1e-12, "6-MP SE of the restricted mean");
}

// statsmodels 0.13 SurvfuncRight on the values flipped about 100 (generate_censored.py): the
// estimate at every detect, and from that curve the restricted mean, its SE and the quantiles by
// the core's rule. Flipping about 100 costs about 1e-14 absolute in the generator, so 1e-11
// relative (the smallest values are about 0.1).
TEST(CensoredKaplanMeier, MatchesStatsmodelsOnFlippedValues) {
    const auto& cases = reference_file("censored.json")["kaplan_meier"];
    for (const auto& [name, c] : cases.items()) {
        const KaplanMeierCurve curve = kaplan_meier_left(from_json(c["values"]));
        const auto& values = c["detected_values"];
        ASSERT_EQ(curve.detected_values.size(), values.size()) << name;
        for (std::size_t j = 0; j < values.size(); ++j) {
            expect_relative(curve.detected_values[j], values[j], 1e-11, name + " value");
            EXPECT_EQ(curve.at_risk[j], c["at_risk"][j].get<double>()) << name;
            EXPECT_EQ(curve.detections[j], c["detections"][j].get<double>()) << name;
            EXPECT_NEAR(curve.below[j], c["below"][j].get<double>(), 1e-14) << name;
        }
        expect_relative(curve.mean, c["mean"], 1e-11, name + " mean");
        expect_relative(curve.mean_se, c["mean_se"], 1e-11, name + " SE");
        for (const auto& [p, q] : c["quantiles"].items()) {
            const auto got = kaplan_meier_quantile(curve, std::stod(p));
            if (q.is_null())
                EXPECT_FALSE(got.has_value()) << name << " quantile " << p;
            else
                expect_relative(got.value(), q, 1e-11, name + " quantile " + p);
        }
    }
}

// Where statsmodels' own quantile (strict inequality on the flipped curve) and the core's rule
// differ, it is only at a flat stretch at exactly p: complete_even's quartiles 2, 4, 6 against the
// midpoints 2.5, 4.5, 6.5 (the usual median of 8 values is 4.5). Elsewhere they agree.
TEST(CensoredKaplanMeier, QuantileRuleDiffersFromStatsmodelsOnlyAtFlats) {
    const auto& c = reference_file("censored.json")["kaplan_meier"]["copper_well_b"];
    for (const auto& [p, q] : c["statsmodels_quantiles"].items())
        expect_relative(q.get<double>(), c["quantiles"][p].get<double>(), 1e-12, "copper quantile " + p);
    const auto& even = reference_file("censored.json")["kaplan_meier"]["complete_even"];
    EXPECT_NEAR(even["statsmodels_quantiles"]["0.5"].get<double>(), 4.0, 1e-12);
    EXPECT_NEAR(even["quantiles"]["0.5"].get<double>(), 4.5, 1e-12);
}

// Tie rule by hand: a detect at the limit is above a non-detect there. {<1, 1, 2}: at 2 three at
// risk (P̂(X < 2) = 2/3); at 1 two at risk, the non-detect <1 among them (P̂(X < 1) = 2/3 · 1/2 =
// 1/3); the lowest value is the censored one, so the mean is restricted at 1:
// 2·(1/3) + 1·(1/3) + 1·(1/3) = 4/3.
TEST(CensoredKaplanMeier, DetectAtTheLimitIsAboveTheNonDetect) {
    const std::vector<CensoredValue> v = {lt(1), at(1), at(2)};
    const KaplanMeierCurve curve = kaplan_meier_left(v);
    ASSERT_EQ(curve.below.size(), 2u);
    EXPECT_NEAR(curve.below[0], 2.0 / 3, 1e-15);
    EXPECT_NEAR(curve.below[1], 1.0 / 3, 1e-15);
    EXPECT_TRUE(curve.lowest_censored);
    EXPECT_NEAR(curve.mean, 4.0 / 3, 1e-15);
}

// ---------------------------------------------------------------------------------------------
// ROS

// Helsel & Cohn (1988) worked by hand on 8 invented values with two limits:
// <1, 1.5, <2, 2.5, 3, <1, 4, 6. Limits DL1 = 1, DL2 = 2. Detects in [1, 2): A1 = 1 (1.5);
// in [2, ∞): A2 = 4; below 1 none. Below DL1: B1 = 2 (the two <1); below DL2: B2 = 4 (1.5 and
// the three non-detects). pe3 = 0; pe2 = 0 + 4/(4+4)·1 = 1/2; pe1 = 1/2 + 1/(1+2)·(1/2) = 2/3.
// Detects: 1.5 at (1 − 2/3) + (2/3 − 1/2)·1/2 = 5/12; 2.5, 3, 4, 6 at 1/2 + 1/2·r/5 = 0.6, 0.7,
// 0.8, 0.9. Non-detects: <1 at (1 − 2/3)·r/3 = 1/9, 2/9; <2 at (1 − 1/2)·1/2 = 1/4.
// generate_censored.py repeats these fractions and fits the line in 30-digit mpmath.
TEST(CensoredRos, HelselCohnTwoLimitsByHand) {
    const auto& ref = reference_file("censored.json")["ros"];
    const std::vector<CensoredValue> v = from_json(ref["values"]);
    const RosFit fit = robust_ros(v);
    const std::vector<double> positions = {1.0 / 9, 5.0 / 12, 1.0 / 4, 0.6, 0.7, 2.0 / 9, 0.8, 0.9};
    for (std::size_t i = 0; i < v.size(); ++i)
        EXPECT_NEAR(fit.plotting_positions[i], positions[i], 1e-15) << "position of observation " << i;
    // mpmath at 30 digits against Boost's normal quantile and a double least-squares fit: 1e-12.
    expect_relative(fit.intercept, ref["intercept"], 1e-12, "ROS intercept");
    expect_relative(fit.slope, ref["slope"], 1e-12, "ROS slope");
    // Imputed in the order <1 (1/9), <1 (2/9), <2 (1/4).
    expect_relative(fit.filled[0], ref["imputed"][0], 1e-12, "ROS <1 first");
    expect_relative(fit.filled[5], ref["imputed"][1], 1e-12, "ROS <1 second");
    expect_relative(fit.filled[2], ref["imputed"][2], 1e-12, "ROS <2");

    CensoredGroups g{{"well"}, {v}, 0};
    const Table t = describe_censored(g, "ros", 0.95);
    expect_relative(number(t[1][mean_col]), ref["mean"], 1e-12, "ROS mean");
    expect_relative(number(t[1][se]), ref["sd"].get<double>() / std::sqrt(8.0), 1e-12, "ROS SE");
    // Student t(7) at 0.975 = 2.364624251592785 (Boost; tables print 2.365): mean ± t·SE.
    expect_relative(number(t[1][ci_high]) - number(t[1][mean_col]), 2.364624251592785 * number(t[1][se]), 1e-9, "ROS interval");
    EXPECT_EQ(text(t[1][method_col]), "ROS, lognormal");
}

// ---------------------------------------------------------------------------------------------
// COMPARE.CENSORED

// Worked in exact fractions from the definition (generate_censored.py, exact_statistics): the
// two-group set a = {1, <2, 3, 5}, b = {<1, 2, 2, 4, <4}. Gehan by hand, largest value first, as
// (a at risk, all at risk, detects in a, all detects): 5: (4, 9, 1, 1) → U += 9(1 − 4/9) = 5;
// 4: (3, 8, 0, 1) → 8(0 − 3/8) = −3; 3: (3, 6, 1, 1) → 6(1 − 3/6) = 3; 2: (2, 5, 0, 2) →
// 5(0 − 4/5) = −4; 1: (1, 2, 1, 1) → 2(1 − 1/2) = 1; U = 2 (the fixture's u). V = Σ w²·m(b − m)/(b − 1)
// ·(b_a/b)(1 − b_a/b) = 20 + 15 + 9 + 9 + 1 = 54, so χ² = 4/54 = 2/27.
// The statistic is 1e-12 from the exact fraction (rounding only); statsmodels' survdiff on the
// flipped values agrees with the same fractions (the generator refuses to write otherwise).
TEST(CensoredCompare, ExactFractionsByHand) {
    const auto& cases = reference_file("censored.json")["exact"];
    for (const auto& [name, c] : cases.items()) {
        const CensoredGroups g = groups_from_json(c["groups"]);
        for (const std::string method : {"gehan", "peto-prentice"}) {
            const TestResult r = compare_censored(g, method);
            expect_relative(r.number("statistic"), c[method]["chi2_float"], 1e-12, name + " " + method);
            EXPECT_EQ(r.number("df"), static_cast<double>(g.names.size() - 1));
        }
    }
    EXPECT_EQ(cases["tiny_two"]["gehan"]["chi2"], "2/27");
}

// statsmodels 0.13 survdiff on the values flipped about 100, weight_type "gb" (Gehan–Breslow)
// and "fh" with fh_p = 1 (the pooled Kaplan–Meier Ŝ(t−) at the previous event time, first
// weight 1): the same weighted log-rank score and hypergeometric variance as the core, so the
// statistic agrees to rounding (1e-10: the flip about 100 shifts no tie, statsmodels sums in a
// different order). Definitions not followed here: Prentice (1978) weighted by his modified
// estimate Π (n_j + 1 − d_j)/(n_j + 1) and took a permutation variance; Peto & Peto (1972) by
// Ŝ(t) rather than Ŝ(t−). The Ŝ(t−) form with the log-rank variance is Harrington & Fleming's
// (1982) G^1 statement of the test, which statsmodels also uses.
TEST(CensoredCompare, MatchesStatsmodelsSurvdiff) {
    const auto& cases = reference_file("censored.json")["survdiff"];
    for (const auto& [name, c] : cases.items()) {
        const CensoredGroups g = groups_from_json(c["groups"]);
        for (const std::string method : {"gehan", "peto-prentice"}) {
            const TestResult r = compare_censored(g, method);
            expect_relative(r.number("statistic"), c[method][0], 1e-10, name + " " + method + " χ²");
            // statsmodels takes p as 1 − cdf: its absolute error is about 1e-16, so 1e-10 relative here.
            expect_relative(r.number("p"), c[method][1], 1e-10, name + " " + method + " p");
        }
    }
}

TEST(CensoredCompare, TableAndReport) {
    const auto& c = reference_file("censored.json")["survdiff"]["three_wells"];
    CensoredGroups g = groups_from_json(c["groups"]);
    g.n_dropped = 2;
    const TestResult r = compare_censored(g, "");
    EXPECT_EQ(r.test, "Peto–Prentice generalized Wilcoxon test");
    EXPECT_EQ(r.number("n"), 30.0);
    EXPECT_EQ(r.number("n dropped"), 2.0);
    EXPECT_EQ(r.number("upstream: n"), 10.0);
    EXPECT_EQ(r.number("upstream: censored"), 4.0);
    // upstream: <0.5 ×3, <1, 0.6, 0.7, 0.9, 1.1, 1.4, 2.2. By hand from the top: P̂(X < v) after
    // 2.2, 1.4, 1.1 is 9/10, 8/10, 7/10; the <1 leaves; at 0.9 six at risk: 7/10 · 5/6 = 7/12; at
    // 0.7 five at risk: 7/12 · 4/5 = 7/15 < 0.5, so the median is 0.7.
    EXPECT_EQ(r.number("upstream: median"), 0.7);
    // pond by the same sweep: 4.1, 3.4, 2.9, 2.6, 2.0 leave 6/11 > 0.5, 1.8 gives 5/11: median 1.8.
    EXPECT_EQ(r.number("pond: median"), 1.8);
    // The sentence through the renderer: the catalogue's report form, numbers by its rules.
    const std::string report = render_report(r);
    EXPECT_EQ(report, "Peto–Prentice generalized Wilcoxon test: χ²(2) = " + format_number(r.number("statistic")) + ", " +
                          format_p(r.number("p")) +
                          "; Kaplan–Meier medians upstream 0.70, pond 1.80, outfall " +
                          format_number(r.number("outfall: median")) +
                          " (3 groups; 8 of 30 values below a detection limit)");
}

// A blank median in the table, and what the sentence says it lies below (worked by hand):
// A {<1 ×3, <2, 0.6, 1.5, 3}: the Kaplan–Meier median 0.6 is below the lowest limit 1 (see
// MoreThanHalfCensoredBlanksTheMean): "<1". B {<0.5, <0.8 ×2, 0.9, 2}: from the top, P̂(X < 2) =
// 4/5, P̂(X < 0.9) = 4/5 · 3/4 = 3/5 > 1/2, and the rest of the mass lies below the smallest detect
// 0.9, on the values <0.5, <0.8, <0.8: the median is below 0.8, the highest limit at or below 0.9.
// C {<1, <2}: no detect, every value is below 2.
TEST(CensoredCompare, BlankMediansAndTheirBounds) {
    const CensoredGroups g{{"A", "B", "C"},
                           {{lt(1), lt(1), lt(1), lt(2), at(0.6), at(1.5), at(3)},
                            {lt(0.5), lt(0.8), lt(0.8), at(0.9), at(2)},
                            {lt(1), lt(2)}},
                           0};
    const TestResult r = compare_censored(g, "gehan");
    for (const char* median : {"A: median", "B: median", "C: median"}) EXPECT_TRUE(blank(*r.find(median))) << median;
    const std::string report = render_report(r);
    EXPECT_EQ(report.rfind("Gehan's generalized Wilcoxon test: χ²(2) = ", 0), 0u) << report;
    EXPECT_NE(report.find("; Kaplan–Meier medians A <1, B <0.8, C <2 (3 groups; 9 of 14 values below a detection limit)"),
              std::string::npos)
        << report;
    // The table lists the blank medians, not their bounds.
    for (const auto& row : r.table()) EXPECT_EQ(std::get<std::string>(row[0]).find("bound"), std::string::npos);
}

// ---------------------------------------------------------------------------------------------
// DESCRIBE.CENSORED: the table and the catalogue's thresholds

TEST(CensoredDescribe, KaplanMeierTableMatchesTheCurve) {
    const auto& c = reference_file("censored.json")["kaplan_meier"]["zinc_well_a"];
    const CensoredGroups g{{"well A"}, {from_json(c["values"])}, 0};
    const Table t = describe_censored(g, "kaplan-meier", 0.95);
    ASSERT_EQ(t.size(), 2u);
    ASSERT_EQ(t[0].size(), 15u);
    EXPECT_EQ(text(t[0][censored_share]), "censored %");
    EXPECT_EQ(text(t[1][group]), "well A");
    EXPECT_EQ(number(t[1][n]), 12.0);
    EXPECT_EQ(number(t[1][censored]), 3.0);
    EXPECT_EQ(number(t[1][censored_share]), 25.0);
    EXPECT_EQ(number(t[1][lowest_limit]), 0.5);
    EXPECT_EQ(number(t[1][highest_limit]), 0.5);
    // statsmodels' curve, as in MatchesStatsmodelsOnFlippedValues.
    expect_relative(number(t[1][mean_col]), c["mean"], 1e-11, "mean");
    expect_relative(number(t[1][se]), c["mean_se"], 1e-11, "SE");
    // Normal quantile 1.959963984540054 (Boost; tables print 1.960): mean ± z·SE.
    expect_relative(number(t[1][ci_low]), c["mean"].get<double>() - 1.959963984540054 * c["mean_se"].get<double>(), 1e-11, "ci-low");
    // q1 falls in the undetermined mass below 0.5 (P̂(X < 0.5) = 1/4 exactly): blank.
    EXPECT_TRUE(blank(t[1][q1]));
    expect_relative(number(t[1][median]), 0.75, 1e-12, "median (flat at 0.5 between 0.7 and 0.8)");
    EXPECT_EQ(number(t[1][maximum]), 3.1);
    EXPECT_EQ(text(t[1][method_col]), "Kaplan–Meier; mean restricted at the lowest value <0.5 (biased upward)");
}

// Common practice, no source beyond the catalogue: more than half censored blanks the mean, its SE
// and interval; percentiles below the lowest limit are blank; those above it and the maximum stay.
TEST(CensoredDescribe, MoreThanHalfCensoredBlanksTheMean) {
    // 4 of 7 censored (57%): <1 ×3, <2, detects 0.6, 1.5, 3.
    const CensoredGroups g{{"pond"}, {{lt(1), lt(1), lt(1), lt(2), at(0.6), at(1.5), at(3)}}, 0};
    const Table t = describe_censored(g, "kaplan-meier", 0.95);
    for (Column c : {mean_col, se, ci_low, ci_high}) EXPECT_TRUE(blank(t[1][c])) << c;
    // By hand, from the top: at 3 seven at risk, P̂(X < 3) = 6/7; <2 leaves; at 1.5 five at risk,
    // P̂(X < 1.5) = 6/7 · 4/5 = 24/35; the three <1 leave; at 0.6 one at risk, P̂(X < 0.6) = 0.
    // P̂(X ≤ 1.5) = 6/7 ≥ 0.75 > P̂(X < 1.5): q3 = 1.5. The median and q1 fall on 0.6, below the
    // lowest limit 1: blank.
    EXPECT_TRUE(blank(t[1][q1]));
    EXPECT_TRUE(blank(t[1][median]));
    EXPECT_EQ(number(t[1][q3]), 1.5);
    EXPECT_EQ(number(t[1][maximum]), 3.0);
    EXPECT_EQ(text(t[1][method_col]), "Kaplan–Meier");
}

TEST(CensoredDescribe, MoreThanEightyPercentCensoredIsARefusal) {
    // 5 of 6 censored (83%).
    const CensoredGroups g{{"north", "south"},
                           {{lt(1), lt(1), lt(1), lt(0.5), lt(0.5), at(2)}, {at(1), at(2), at(3)}}, 0};
    EXPECT_EQ(refusal_text([&] { describe_censored(g, "", 0.95); }),
              "north has 5 of 6 values below a detection limit (83%); above 80% no method estimates a mean or "
              "quartiles: report how many were detected, or describe the other groups without it");
    // Exactly 80% (4 of 5) is allowed: the mean is blank; P̂(X < 2) = 4/5 leaves even q3 in the
    // undetermined mass below 2 (blank); the maximum remains.
    const CensoredGroups edge{{"north"}, {{lt(1), lt(1), lt(1), lt(1), at(2)}}, 0};
    const Table t = describe_censored(edge, "", 0.95);
    for (Column c : {mean_col, se, q1, median, q3}) EXPECT_TRUE(blank(t[1][c])) << c;
    EXPECT_EQ(number(t[1][maximum]), 2.0);
}

TEST(CensoredDescribe, LimitAboveEveryDetectLeavesTheMaximumUnknown) {
    const auto& c = reference_file("censored.json")["kaplan_meier"]["limit_above_detects"];
    const CensoredGroups g{{"well C"}, {from_json(c["values"])}, 0};
    const Table t = describe_censored(g, "", 0.95);
    EXPECT_TRUE(blank(t[1][maximum]));
    EXPECT_EQ(number(t[1][highest_limit]), 2.0);
    EXPECT_EQ(text(t[1][method_col]), "Kaplan–Meier; maximum unknown: the limit <2 is above every detected value");
    // The lowest value 0.4 is a detect: no restriction. statsmodels' curve (generator).
    expect_relative(number(t[1][mean_col]), c["mean"], 1e-11, "mean");
}

TEST(CensoredDescribe, CompleteDataAndEmptyGroups) {
    // No censored value: limits blank, KM mean = the ordinary mean (4.5 for 1…8); KM percentiles
    // of a step function: midpoints at flats, 2.5 / 4.5 / 6.5 (Calc's QUARTILE would give 2.75 and 6.25).
    const CensoredGroups g{{"clean", "empty"}, {{at(4), at(1), at(3), at(2), at(6), at(5), at(8), at(7)}, {}}, 0};
    const Table t = describe_censored(g, "kaplan-meier", 0.95);
    EXPECT_TRUE(blank(t[1][lowest_limit]));
    EXPECT_NEAR(number(t[1][mean_col]), 4.5, 1e-14);
    EXPECT_NEAR(number(t[1][q1]), 2.5, 1e-14);
    EXPECT_NEAR(number(t[1][median]), 4.5, 1e-14);
    EXPECT_NEAR(number(t[1][q3]), 6.5, 1e-14);
    EXPECT_EQ(text(t[2][group]), "empty");
    EXPECT_EQ(number(t[2][n]), 0.0);
    EXPECT_TRUE(blank(t[2][mean_col]));
    // ROS without censored values: the ordinary summaries (type-7 quartiles 2.75, 4.5, 6.25).
    const Table r = describe_censored(g, "ros", 0.95);
    EXPECT_NEAR(number(r[1][q1]), 2.75, 1e-14);
    EXPECT_NEAR(number(r[1][q3]), 6.25, 1e-14);
    EXPECT_EQ(text(r[1][method_col]), "ROS, lognormal (no censored values: ordinary summaries)");
}

// ---------------------------------------------------------------------------------------------
// Bad input

TEST(CensoredBadInput, Refusals) {
    const CensoredGroups all_censored{{"a", "b"}, {{lt(1), lt(0.5)}, {lt(1), lt(2)}}, 0};
    EXPECT_NE(refusal_text([&] { describe_censored(all_censored, "", 0.95); }).find("a has 2 of 2 values below"), std::string::npos);
    EXPECT_EQ(refusal_text([&] { compare_censored(all_censored, ""); }),
              "every value is below a detection limit; the groups can only be compared on detected values");
    EXPECT_EQ(refusal_text([&] { describe_censored(CensoredGroups{{"a"}, {{}}, 3}, "", 0.95); }),
              "values holds no numbers and no values below a detection limit (<0.5)");
    EXPECT_NE(refusal_text([&] { describe_censored(all_censored, "mle", 0.95); }).find("kaplan-meier, ros"), std::string::npos);
    EXPECT_NE(refusal_text([&] { compare_censored(all_censored, "logrank"); }).find("peto-prentice, gehan"), std::string::npos);
    EXPECT_EQ(refusal_text([&] { compare_censored(CensoredGroups{{"a"}, {{at(1), at(2)}}, 0}, ""); }),
              "groups has 1 label; COMPARE.CENSORED compares two or more groups");

    CensoredGroups many;
    for (int g = 0; g < 101; ++g) {
        many.names.push_back("well " + std::to_string(g));
        many.values.push_back({at(g + 1.0), lt(0.5)});
    }
    EXPECT_EQ(refusal_text([&] { compare_censored(many, ""); }), "groups has 101 labels; COMPARE.CENSORED compares up to 100 groups");
    // One detect among censored values in one group, detects elsewhere: the test still runs.
    const CensoredGroups one_detect{{"a", "b"}, {{lt(1), lt(1), at(1.5)}, {at(0.8), at(2), at(3)}}, 0};
    EXPECT_TRUE(std::isfinite(compare_censored(one_detect, "").number("p")));
    // ROS needs two different detects.
    EXPECT_NE(refusal_text([&] { describe_censored(CensoredGroups{{"a"}, {{lt(1), at(2), at(2)}}, 0}, "ros", 0.95); })
                  .find("a: ROS fits a line"),
              std::string::npos);
    // ROS is lognormal: a zero is a refusal pointing to Kaplan–Meier.
    EXPECT_NE(refusal_text([&] { describe_censored(CensoredGroups{{"a"}, {{lt(1), at(0), at(2), at(3)}}, 0}, "ros", 0.95); })
                  .find("use method 'kaplan-meier'"),
              std::string::npos);
    // A group whose values are all censored above every detect carries nothing to compare.
    const CensoredGroups above{{"a", "b"}, {{at(0.5), at(0.8), at(1.2)}, {lt(5), lt(5)}}, 0};
    EXPECT_NE(refusal_text([&] { compare_censored(above, ""); }).find("b holds only values below limits above every detected value (<5 and up)"), std::string::npos);
    // Extremes: the scale refusal, never an infinite or NaN cell.
    const CensoredGroups huge{{"a", "b"}, {{at(1e308), lt(-1e308), at(3)}, {at(1), at(2), at(-1e300)}}, 0};
    EXPECT_NE(refusal_text([&] { describe_censored(huge, "", 0.95); }).find("too large"), std::string::npos);
    EXPECT_NE(refusal_text([&] { compare_censored(huge, ""); }).find("too large"), std::string::npos);
    EXPECT_NE(refusal_text([&] { describe_censored(one_detect, "", 1.5); }).find("level"), std::string::npos);
    const CensoredGroups not_a_number{{"a", "b"}, {{at(std::nan("")), at(1)}, {at(2), lt(1)}}, 0};
    EXPECT_NE(refusal_text([&] { compare_censored(not_a_number, ""); }).find("NaN"), std::string::npos);
}

// Several limits mixed within and across groups, and tiny values: numbers stay finite.
TEST(CensoredBadInput, MixedLimitsAndTinyNumbers) {
    const CensoredGroups mixed{{"a", "b"},
                               {{lt(0.2), at(0.3), lt(0.5), at(0.6), lt(1), at(1.1), at(0.1)},
                                {lt(1e-300), at(4e-300), at(5e-324), at(2e-300)}},
                               0};
    const Table t = describe_censored(mixed, "", 0.95);
    for (std::size_t row = 1; row < t.size(); ++row)
        for (const auto& cell : t[row])
            if (std::holds_alternative<double>(cell)) EXPECT_TRUE(std::isfinite(number(cell)));
    EXPECT_EQ(number(t[1][lowest_limit]), 0.2);
    EXPECT_EQ(number(t[1][highest_limit]), 1.0);
    const TestResult r = compare_censored(mixed, "gehan");
    EXPECT_TRUE(std::isfinite(r.number("statistic")));
}

}  // namespace
}  // namespace quadrat
