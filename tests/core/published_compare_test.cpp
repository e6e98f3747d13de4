// Published worked examples for the group comparisons: COMPARE.GROUPS (classic one-way ANOVA,
// Kruskal–Wallis), COMPARE.PAIRED (t, signed-rank, sign), COMPARE.POSTHOC (Tukey) and ADJUST.P.
// The data are classic public data sets, stored with their sources by
// tests/reference/generate_published_examples.py, which also writes what SciPy/statsmodels give on them.
// Each printed figure is held to its printed digits (half a unit in the last digit) by our value
// and by the library's value alike (published.hpp).
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <optional>
#include <vector>

#include "core/adjust.hpp"
#include "core/data.hpp"
#include "core/oneway.hpp"
#include "core/paired.hpp"
#include "core/posthoc.hpp"
#include "core/studentized_range.hpp"
#include "published.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& published() { return reference_file("published_examples.json"); }

std::vector<std::vector<double>> groups_of(const nlohmann::json& c) {
    return c["values"].get<std::vector<std::vector<double>>>();
}

// Long format, as on a sheet: one value column, one label column, groups in the stored order.
Groups sheet_groups_of(const nlohmann::json& c) {
    std::vector<double> values;
    std::vector<std::string> labels;
    const auto names = c["names"].get<std::vector<std::string>>();
    const auto data = groups_of(c);
    for (std::size_t g = 0; g < names.size(); ++g)
        for (double x : data[g]) {
            values.push_back(x);
            labels.push_back(names[g]);
        }
    return read_groups(Range::column(values), Range::text_column(labels));
}

// ---------------------------------------------------------------------------------------------
// COMPARE.GROUPS, pooled: the classic one-way ANOVA

// Montgomery (2001), Design and Analysis of Experiments, 5th ed., Wiley, Example 3.1, etch rate at
// four RF power settings, worked ANOVA table (Table 3.4; from memory): SS treatments 66,870.55,
// SS error 5,339.20, MS 22,290.18 and 333.70, F₀ = 66.80 on (3, 16) df. Tolerance: half a unit in
// the last printed digit (0.005).
TEST(PublishedCompare, MontgomeryEtchRateAnova) {
    const auto& c = published()["oneway"]["etch"];
    const auto g = groups_of(c);
    const AnovaTable t = one_way_anova_table(g);
    expect_printed(t.ss_between, c["ss_between"].get<double>(), 66870.55, 0.005, "SS treatments");
    expect_printed(t.ss_within, c["ss_within"].get<double>(), 5339.20, 0.005, "SS error");
    expect_printed(t.ms_between, c["ss_between"].get<double>() / 3, 22290.18, 0.005, "MS treatments");
    expect_printed(t.ms_within, c["ms_within"].get<double>(), 333.70, 0.005, "MS error");
    expect_printed(t.f, c["f"].get<double>(), 66.80, 0.005, "F");
    EXPECT_EQ(t.df_between, 3);
    EXPECT_EQ(t.df_within, 16);
    const TestResult r = classic_one_way_anova(g);
    EXPECT_DOUBLE_EQ(r.number("statistic"), t.f);
    // The same through COMPARE.GROUPS as a sheet hands it over (long format, method pooled).
    const TestResult sheet = compare_groups(sheet_groups_of(c), "pooled", Transform::none);
    expect_printed(sheet.number("statistic"), c["f"].get<double>(), 66.80, 0.005, "F, COMPARE.GROUPS");
}

// NIST/SEMATECH e-Handbook of Statistical Methods, §7.4.3, one-way ANOVA worked example (three
// levels, five observations each; from memory): SS treatments 27.897, SS error 17.452, SS total
// 45.349, MS 13.949 and 1.454, F = 9.59 on (2, 12) df. Tolerance: half a unit in the last digit.
TEST(PublishedCompare, NistHandbookOneWayAnova) {
    const auto& c = published()["oneway"]["nist"];
    const AnovaTable t = one_way_anova_table(groups_of(c));
    const double lib_between = c["ss_between"].get<double>(), lib_within = c["ss_within"].get<double>();
    expect_printed(t.ss_between, lib_between, 27.897, 0.0005, "SS treatments");
    expect_printed(t.ss_within, lib_within, 17.452, 0.0005, "SS error");
    expect_printed(t.ss_between + t.ss_within, lib_between + lib_within, 45.349, 0.0005, "SS total");
    expect_printed(t.ms_between, lib_between / 2, 13.949, 0.0005, "MS treatments");
    expect_printed(t.ms_within, c["ms_within"].get<double>(), 1.454, 0.0005, "MS error");
    expect_printed(t.f, c["f"].get<double>(), 9.59, 0.005, "F");
    EXPECT_EQ(t.df_between, 2);
    EXPECT_EQ(t.df_within, 12);
}

// Montgomery & Runger (2003), Applied Statistics and Probability for Engineers, 3rd ed., Wiley,
// Example 13-1, tensile strength of paper at four hardwood concentrations, worked ANOVA table (from
// memory): SS treatments 382.79, SS error 130.17, SS total 512.96, MS 127.60 and 6.51, f₀ = 19.61
// on (3, 20) df. Tolerance: half a unit in the last digit (0.005).
TEST(PublishedCompare, MontgomeryRungerTensileAnova) {
    const auto& c = published()["oneway"]["tensile"];
    const AnovaTable t = one_way_anova_table(groups_of(c));
    const double lib_between = c["ss_between"].get<double>(), lib_within = c["ss_within"].get<double>();
    expect_printed(t.ss_between, lib_between, 382.79, 0.005, "SS treatments");
    expect_printed(t.ss_within, lib_within, 130.17, 0.005, "SS error");
    expect_printed(t.ss_between + t.ss_within, lib_between + lib_within, 512.96, 0.005, "SS total");
    expect_printed(t.ms_between, lib_between / 3, 127.60, 0.005, "MS treatments");
    expect_printed(t.ms_within, c["ms_within"].get<double>(), 6.51, 0.005, "MS error");
    expect_printed(t.f, c["f"].get<double>(), 19.61, 0.005, "F");
}

// ---------------------------------------------------------------------------------------------
// COMPARE.GROUPS, ranks: Kruskal–Wallis

// Montgomery (2001), Design and Analysis of Experiments, 5th ed., ch. 3 (nonparametric methods in
// the analysis of variance), Kruskal–Wallis worked example on the etch-rate data of Example 3.1
// (from memory): H = 16.91 with the tie correction (610 occurs twice), 3 df. Tolerance: half a unit
// in the last digit (0.005).
TEST(PublishedCompare, MontgomeryEtchRateKruskalWallis) {
    const auto& c = published()["oneway"]["etch"];
    const TestResult r = kruskal_wallis_test(groups_of(c));
    expect_printed(r.number("statistic"), c["h"].get<double>(), 16.91, 0.005, "H");
    EXPECT_EQ(r.number("df"), 3);
    // scipy.stats.kruskal 1.10 (tests/reference/generate_published_examples.py): p to 1e-12 relative.
    expect_relative(r.number("p"), c["h_p"].get<double>(), 1e-12, "p");
    const TestResult sheet = compare_groups(sheet_groups_of(c), "ranks", Transform::none);
    expect_printed(sheet.number("statistic"), c["h"].get<double>(), 16.91, 0.005, "H, COMPARE.GROUPS");
}

// ---------------------------------------------------------------------------------------------
// COMPARE.POSTHOC tukey

// Montgomery & Runger (2003), Example 13-1 continued, Tukey's method (from memory):
// q₀.₀₅(4, 20) = 3.96, T₀.₀₅ = 3.96·√(6.51/6) = 4.12, and every pair of concentrations differs
// except 10% and 15%. Our critical q and the half-width of each interval (equal n, so one half-width
// for every pair) against SciPy 1.10's studentized_range.ppf (generator); tolerance half a unit in
// the last printed digit (0.005).
TEST(PublishedCompare, MontgomeryRungerTukey) {
    const auto& c = published()["oneway"]["tensile"];
    expect_printed(studentized_range_quantile(0.95, 4, 20), c["tukey_q"].get<double>(), 3.96, 0.005, "q(0.95; 4, 20)");
    const PosthocResult r = compare_posthoc(sheet_groups_of(c), PosthocMethod::tukey, std::nullopt, Transform::none, 0.95);
    ASSERT_EQ(r.pairs.size(), 6u);
    for (const PairComparison& pair : r.pairs) {
        const double half_width = std::get<double>(pair.ci_high) - pair.estimate;
        expect_printed(half_width, c["tukey_half_width"].get<double>(), 4.12, 0.005, "T");
        const bool ten_and_fifteen = pair.first == 1 && pair.second == 2;
        EXPECT_EQ(pair.significant, !ten_and_fifteen) << pair.first << " vs " << pair.second;
    }
}

// Montgomery (2001), Design and Analysis of Experiments, 5th ed., ch. 3, Tukey's test on the
// etch-rate data (from memory): q₀.₀₅(4, 16) = 4.05 and every pair of power settings differs at 5%.
// (The printed T₀.₀₅ = 33.09 is 4.05 rounded times √(333.70/5); from the unrounded q it is 33.05,
// so T is not checked.) Tolerance on q: half a unit in the last digit.
TEST(PublishedCompare, MontgomeryEtchRateTukey) {
    const auto& c = published()["oneway"]["etch"];
    expect_printed(studentized_range_quantile(0.95, 4, 16), c["tukey_q"].get<double>(), 4.05, 0.005, "q(0.95; 4, 16)");
    const PosthocResult r = compare_posthoc(sheet_groups_of(c), PosthocMethod::tukey, std::nullopt, Transform::none, 0.95);
    ASSERT_EQ(r.pairs.size(), 6u);
    for (const PairComparison& pair : r.pairs) EXPECT_TRUE(pair.significant) << pair.first << " vs " << pair.second;
}

// ---------------------------------------------------------------------------------------------
// COMPARE.PAIRED: Darwin's Zea mays as given by Fisher

// Fisher (1935), The Design of Experiments, ch. III, §§16–17 (from memory): Darwin's 15 pairs of
// crossed and self-fertilised plants, mean difference 20.93 eighths of an inch, t = 2.148 on 14 df.
// Tolerance: half a unit in the last printed digit.
TEST(PublishedCompare, FisherZeaMaysPairedT) {
    const auto& c = published()["zea_mays"];
    const auto d = c["differences"].get<std::vector<double>>();
    const TestResult r = paired_t_test(d, 0.95);
    expect_printed(r.number("estimate"), c["mean"].get<double>(), 20.93, 0.005, "mean difference");
    expect_printed(r.number("statistic"), c["t"].get<double>(), 2.148, 0.0005, "t");
    EXPECT_EQ(r.number("df"), 14);
    // scipy.stats.ttest_1samp 1.10 (generator): p to 1e-10 relative.
    expect_relative(r.number("p"), c["t_p"].get<double>(), 1e-10, "p");
    // The same through COMPARE.PAIRED's one-sample form (the differences against 0).
    PairedReadings one;
    one.first = d;
    one.one_sample = true;
    one.reference_value = 0;
    expect_printed(compare_paired(one, "t", Transform::none).number("statistic"), c["t"].get<double>(), 2.148, 0.0005,
                   "t, COMPARE.PAIRED");
}

// Counted by hand from the definitions (no published p for these two tests on Darwin's data): the
// |differences| have no ties; the two negative ones, 48 and 67, take ranks 10 and 14, so T⁻ = 24 and
// T⁺ = 120 − 24 = 96. Exact two-sided signed-rank p = 2·#{sign patterns with T⁻ ≤ 24}/2¹⁵ = 169/4096,
// counted in exact fractions by the generator and equal to scipy.stats.wilcoxon(method='exact').
// Sign test: 13 of 15 positive, p = 2·(1 + 15 + 105)/2¹⁵ = 121/16384, equal to scipy.stats.binomtest.
// Tolerance 1e-13 relative: exact sums of at most 2¹⁵ terms.
TEST(PublishedCompare, ZeaMaysSignedRankAndSignCountedByHand) {
    const auto& c = published()["zea_mays"];
    const auto d = c["differences"].get<std::vector<double>>();
    const TestResult w = signed_rank_test(d, 0.95);
    EXPECT_EQ(w.number("statistic"), 96);
    EXPECT_EQ(c["t_plus"].get<int>(), 96);
    expect_relative(w.number("p"), 169.0 / 4096.0, 1e-13, "signed-rank p");
    expect_relative(c["scipy_signed_rank_p"].get<double>(), 169.0 / 4096.0, 1e-13, "scipy signed-rank p");
    const TestResult s = sign_test(d, 0.95);
    EXPECT_EQ(s.number("statistic"), 13);
    EXPECT_EQ(s.number("n"), 15);
    expect_relative(s.number("p"), 121.0 / 16384.0, 1e-13, "sign p");
    expect_relative(c["scipy_sign_p"].get<double>(), 121.0 / 16384.0, 1e-13, "scipy sign p");
}

// ---------------------------------------------------------------------------------------------
// ADJUST.P

// Benjamini & Hochberg (1995), JRSS B 57, 289–300, §4, worked example of 15 p-values (from memory):
// at level 0.05 their step-up procedure rejects the four smallest, while the Bonferroni procedure and
// Hochberg's (1988) reject only the three smallest. Counted as adjusted p ≤ 0.05.
TEST(PublishedCompare, BenjaminiHochbergFifteenPValues) {
    const auto& c = published()["bh_1995"];
    const auto p = c["p"].get<std::vector<double>>();
    auto rejected = [&](Adjustment method) {
        int count = 0;
        for (double q : adjust_p(p, method)) count += q <= 0.05;
        return count;
    };
    EXPECT_EQ(rejected(Adjustment::bh), 4);
    EXPECT_EQ(rejected(Adjustment::bonferroni), 3);
    EXPECT_EQ(rejected(Adjustment::hochberg), 3);
    // statsmodels 0.13 multipletests on the same p-values (generator), every method it has:
    // tolerance 1e-12 relative (a few multiplications and running extrema).
    for (const auto& [key, method] : std::vector<std::pair<const char*, Adjustment>>{
             {"bonferroni", Adjustment::bonferroni}, {"holm", Adjustment::holm}, {"hochberg", Adjustment::hochberg},
             {"hommel", Adjustment::hommel}, {"bh", Adjustment::bh}, {"by", Adjustment::by},
             {"sidak", Adjustment::sidak}}) {
        const auto ours = adjust_p(p, method);
        const auto want = c[key].get<std::vector<double>>();
        for (std::size_t i = 0; i < p.size(); ++i) expect_relative(ours[i], want[i], 1e-12, std::string(key) + " " + std::to_string(i));
    }
}

// Not here, for want of a published worked example whose figures could be confirmed: Welch's
// one-way ANOVA, the Hodges–Lehmann shift and pseudo-median, Games–Howell, Dunn, t-pairs,
// rank-pairs, and the Hommel, Benjamini–Yekutieli and Šidák adjustments as printed figures (the
// latter three are held to statsmodels on the Benjamini–Hochberg p-values above). Each is checked
// against a reference library or its published formula in its own test file.

}  // namespace
}  // namespace quadrat
