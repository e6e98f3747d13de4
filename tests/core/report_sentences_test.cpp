// The `report` output of every function that has one, checked word for word through the registry
// and the fence, as a cell shows it. Each expected sentence is written out in full; its numbers
// come from tests/reference/generate_reports.py (SciPy 1.10 / statsmodels 0.13, or the published
// formula where no library has the method), which also formats them by the catalogue's rules
// (FUNCTIONS.md, "Outputs") and stores them as "tokens": every test below checks that each token
// of its case appears in the written-out sentence, so no number here is copied from the C++ side.
// The data are invented field scenarios, the same lists as in the generator.
#include <gtest/gtest.h>

#include <set>
#include <string>
#include <variant>

#include "addin/registry.hpp"
#include "core/cells.hpp"
#include "core/report.hpp"
#include "reference.hpp"
#include "cell_calls.hpp"
#include "sheet_cells.hpp"

namespace quadrat::addin {
namespace {

using quadrat::test_support::block;
using quadrat::test_support::num;
using quadrat::test_support::reference_file;
using quadrat::test_support::txt;

using quadrat::test_support::call;
using quadrat::test_support::omitted;
using quadrat::test_support::text_of;
using quadrat::test_support::keyword;
using quadrat::test_support::typed;

// A column of numbers under a text header, as a sheet holds it.
Range numbers_with_header(const std::string& header, const std::vector<double>& xs) {
    std::vector<double> all{0.0};
    all.insert(all.end(), xs.begin(), xs.end());
    Range r = Range::column(all);
    r.cells[0] = Cell::make_text(header);
    return r;
}

// Long format: one value column and one label column, each under a header.
struct LongTable {
    Range values, groups;
};
LongTable long_table(const std::string& value_header, const std::vector<std::pair<std::string, std::vector<double>>>& groups) {
    std::vector<double> values;
    std::vector<std::string> labels{"site"};
    for (const auto& [label, xs] : groups)
        for (double x : xs) {
            values.push_back(x);
            labels.push_back(label);
        }
    return {numbers_with_header(value_header, values), Range::text_column(labels)};
}


// The sentence the cell shows is `expected`, and `expected` holds every number the generator
// formatted for this case.
void expect_sentence(const Table& shown, const std::string& expected, const std::string& family, const std::string& name) {
    EXPECT_EQ(text_of(shown), expected) << family << " / " << name;
    const auto& fixture = reference_file("reports.json");
    ASSERT_TRUE(fixture.contains(family) && fixture[family].contains(name)) << "no reference case " << family << " / " << name;
    for (const auto& [key, token] : fixture[family][name]["tokens"].items())
        EXPECT_NE(expected.find(token.get<std::string>()), std::string::npos)
            << family << " / " << name << ": the reference " << key << " '" << token.get<std::string>()
            << "' is not in the expected sentence";
}

// ---------------------------------------------------------------- the data (generate_reports.py)
// Dissolved oxygen (mg/L) at a riffle and a pool; no ties.
const std::vector<double> riffle = {9.1, 8.7, 9.4, 8.9, 9.6, 9.0, 8.6, 9.3};
const std::vector<double> pool = {8.2, 8.85, 7.8, 9.2, 8.5, 8.0, 8.35};
// Mayfly nymphs per kick sample on gravel and on silt: whole counts, ties, a zero.
const std::vector<double> gravel = {12, 7, 9, 15, 7, 11, 9, 14, 10, 12};
const std::vector<double> silt = {4, 6, 0, 7, 3, 5, 6, 2, 9};
// Nitrate (mg/L) in drains from three land uses.
const std::vector<double> forest = {0.42, 0.61, 0.38, 0.55, 0.47, 0.71, 0.50};
const std::vector<double> pasture = {0.65, 0.98, 0.52, 1.10, 0.58, 0.81, 0.91};
const std::vector<double> cropland = {0.6, 1.9, 0.5, 1.2, 2.2, 0.8, 2.9, 0.45, 1.4};
// Conductivity (µS/cm) above and below a road culvert at ten points.
const std::vector<double> above = {212, 198, 240, 225, 187, 260, 231, 205, 219, 248};
const std::vector<double> below = {232, 204, 251, 229, 215, 263, 258, 203, 238, 270};
// pH of nine farm ponds, against 7.
const std::vector<double> ph = {7.42, 6.91, 7.85, 7.23, 7.61, 7.08, 7.36, 7.96, 7.18};
// Water temperature (°C) at twenty springs, a few warm ones.
const std::vector<double> springs = {9.8,  10.1, 9.6, 10.4, 9.9, 10.0, 11.2, 9.7, 10.2, 11.9,
                                     9.5,  10.3, 10.0, 10.8, 9.9, 10.6, 9.8, 12.4, 10.1, 9.7};
// Stream width (m), canopy cover (%) and bankside willow cover (%) on twelve reaches.
const std::vector<double> width = {2.1, 3.4, 1.6, 4.8, 2.9, 5.5, 3.9, 1.2, 4.3, 2.5, 6.1, 3.0};
const std::vector<double> canopy = {78, 52, 85, 61, 58, 66, 47, 72, 40, 70, 55, 35};
const std::vector<double> willow = {10, 22, 5, 30, 12, 35, 18, 4, 26, 15, 40, 20};
// Traps set and crayfish counted per reach: whole numbers with ties.
const std::vector<double> traps = {2, 2, 3, 3, 4, 4, 5, 5, 6, 6, 7, 8};
const std::vector<double> crayfish = {3, 5, 4, 6, 6, 9, 7, 11, 9, 12, 14, 13};

LongTable oxygen() { return long_table("oxygen", {{"riffle", riffle}, {"pool", pool}}); }
LongTable oxygen_pool_first() { return long_table("oxygen", {{"pool", pool}, {"riffle", riffle}}); }
LongTable nitrate() { return long_table("nitrate", {{"forest", forest}, {"pasture", pasture}, {"cropland", cropland}}); }

Table groups_report(const LongTable& t, const char* method, const char* transform) {
    return call("compareGroups", {t.values, t.groups, keyword(method), keyword("report"), keyword(transform)});
}

// ---------------------------------------------------------------- COMPARE.GROUPS, two groups
// The form of the catalogue's own illustration ("Welch's t-test (two groups): t(37.4) = 3.41, p = 0.002;
// mean difference 0.12 (…), Hedges' g = 0.82"): no n after p, unlike the CHECK and counts sentences.

TEST(ReportSentence, TwoGroupsWelch) {
    expect_sentence(groups_report(oxygen(), "welch", "none"),
                    "Welch's t-test (two groups): t(10.7) = 3.00, p = 0.012; mean difference 0.66 "
                    "(riffle − pool; 95% CI 0.17 to 1.15), Hedges' g = 1.50",
                    "groups", "oxygen welch none");
    expect_sentence(groups_report(oxygen(), "welch", "log"),
                    "Welch's t-test (two groups): t(10.2) = 3.00, p = 0.013; ratio of geometric means 1.08 "
                    "(riffle ÷ pool; 95% CI 1.02 to 1.14), Hedges' g = 1.50",
                    "groups", "oxygen welch log");
}

TEST(ReportSentence, TwoGroupsPooled) {
    expect_sentence(groups_report(oxygen(), "pooled", "none"),
                    "Student's t-test (two groups, pooled variance): t(13) = 3.07, p = 0.009; mean difference 0.66 "
                    "(riffle − pool; 95% CI 0.20 to 1.13), Hedges' g = 1.50",
                    "groups", "oxygen pooled none");
    expect_sentence(groups_report(oxygen(), "pooled", "log"),
                    "Student's t-test (two groups, pooled variance): t(13) = 3.08, p = 0.009; ratio of geometric means 1.08 "
                    "(riffle ÷ pool; 95% CI 1.02 to 1.14), Hedges' g = 1.50",
                    "groups", "oxygen pooled log");
}

TEST(ReportSentence, TwoGroupsRanks) {
    expect_sentence(groups_report(oxygen(), "ranks", "none"),
                    "Wilcoxon–Mann–Whitney rank-sum test (exact p): U = 49, p = 0.014; Hodges–Lehmann shift 0.70 "
                    "(riffle − pool; 95% CI 0.15 to 1.20), rank-biserial r = 0.75",
                    "groups", "oxygen ranks none");
    expect_sentence(groups_report(oxygen(), "ranks", "log"),
                    "Wilcoxon–Mann–Whitney rank-sum test (exact p): U = 49, p = 0.014; Hodges–Lehmann ratio 1.09 "
                    "(riffle ÷ pool; 95% CI 1.02 to 1.15), rank-biserial r = 0.75",
                    "groups", "oxygen ranks log");
    // Ties: the normal approximation.
    const LongTable mayfly = long_table("nymphs", {{"gravel", gravel}, {"silt", silt}});
    expect_sentence(groups_report(mayfly, "ranks", "none"),
                    "Wilcoxon–Mann–Whitney rank-sum test (normal approximation): U = 86, p < 0.001; Hodges–Lehmann shift 6.00 "
                    "(gravel − silt; 95% CI 3.00 to 9.00), rank-biserial r = 0.91",
                    "groups", "mayfly ranks none");
}

// Negative estimates (first group lower) keep the ASCII minus of report.cpp; ratios go below 1.
TEST(ReportSentence, TwoGroupsLowerGroupFirst) {
    expect_sentence(groups_report(oxygen_pool_first(), "welch", "none"),
                    "Welch's t-test (two groups): t(10.7) = -3.00, p = 0.012; mean difference -0.66 "
                    "(pool − riffle; 95% CI -1.15 to -0.17), Hedges' g = -1.50",
                    "groups", "oxygen reversed welch none");
    expect_sentence(groups_report(oxygen_pool_first(), "welch", "log"),
                    "Welch's t-test (two groups): t(10.2) = -3.00, p = 0.013; ratio of geometric means 0.93 "
                    "(pool ÷ riffle; 95% CI 0.88 to 0.98), Hedges' g = -1.50",
                    "groups", "oxygen reversed welch log");
    expect_sentence(groups_report(oxygen_pool_first(), "pooled", "none"),
                    "Student's t-test (two groups, pooled variance): t(13) = -3.07, p = 0.009; mean difference -0.66 "
                    "(pool − riffle; 95% CI -1.13 to -0.20), Hedges' g = -1.50",
                    "groups", "oxygen reversed pooled none");
    expect_sentence(groups_report(oxygen_pool_first(), "pooled", "log"),
                    "Student's t-test (two groups, pooled variance): t(13) = -3.08, p = 0.009; ratio of geometric means 0.93 "
                    "(pool ÷ riffle; 95% CI 0.88 to 0.98), Hedges' g = -1.50",
                    "groups", "oxygen reversed pooled log");
    expect_sentence(groups_report(oxygen_pool_first(), "ranks", "none"),
                    "Wilcoxon–Mann–Whitney rank-sum test (exact p): U = 7, p = 0.014; Hodges–Lehmann shift -0.70 "
                    "(pool − riffle; 95% CI -1.20 to -0.15), rank-biserial r = -0.75",
                    "groups", "oxygen reversed ranks none");
    expect_sentence(groups_report(oxygen_pool_first(), "ranks", "log"),
                    "Wilcoxon–Mann–Whitney rank-sum test (exact p): U = 7, p = 0.014; Hodges–Lehmann ratio 0.92 "
                    "(pool ÷ riffle; 95% CI 0.87 to 0.98), rank-biserial r = -0.75",
                    "groups", "oxygen reversed ranks log");
}

// log(x+1) keeps the difference on the transformed scale and says so.
TEST(ReportSentence, TwoGroupsLog1p) {
    const LongTable mayfly = long_table("nymphs", {{"gravel", gravel}, {"silt", silt}});
    expect_sentence(groups_report(mayfly, "welch", "log(x+1)"),
                    "Welch's t-test (two groups): t(9.7) = 3.50, p = 0.006; mean difference on the log(x+1) scale 0.85 "
                    "(gravel − silt; 95% CI 0.31 to 1.40), Hedges' g = 1.61",
                    "groups", "mayfly welch log(x+1)");
}

// ---------------------------------------------------------------- COMPARE.GROUPS, three groups

// No estimate for 3 or more groups (FUNCTIONS.md, COMPARE.GROUPS: a difference picked by the data
// has no honest interval): the sentence goes from p to the effect.
TEST(ReportSentence, ThreeGroups) {
    expect_sentence(groups_report(nitrate(), "welch", "none"), "Welch's one-way ANOVA: F(2, 11.4) = 7.30, p = 0.009; ω² = 0.23",
                    "groups", "nitrate welch none");
    expect_sentence(groups_report(nitrate(), "welch", "log"), "Welch's one-way ANOVA: F(2, 12.8) = 7.61, p = 0.007; ω² = 0.27",
                    "groups", "nitrate welch log");
    expect_sentence(groups_report(nitrate(), "pooled", "none"), "One-way ANOVA: F(2, 20) = 4.40, p = 0.026; ω² = 0.23",
                    "groups", "nitrate pooled none");
    expect_sentence(groups_report(nitrate(), "pooled", "log"), "One-way ANOVA: F(2, 20) = 5.16, p = 0.016; ω² = 0.27",
                    "groups", "nitrate pooled log");
    expect_sentence(groups_report(nitrate(), "ranks", "none"), "Kruskal–Wallis test: H(2) = 7.26, p = 0.026; ε² = 0.33",
                    "groups", "nitrate ranks none");
    expect_sentence(groups_report(nitrate(), "ranks", "log"), "Kruskal–Wallis test: H(2) = 7.26, p = 0.026; ε² = 0.33",
                    "groups", "nitrate ranks log");
}

// ---------------------------------------------------------------- COMPARE.PAIRED
// In the form of the catalogue's illustration, as COMPARE.GROUPS; the sign test's count of positive
// differences names n itself.

Table paired_report(const Range& first, const Range& second, const char* method, const char* transform) {
    return call("comparePaired", {first, second, keyword(method), keyword("report"), keyword(transform)});
}

TEST(ReportSentence, Paired) {
    const Range first = numbers_with_header("above", above), second = numbers_with_header("below", below);
    expect_sentence(paired_report(first, second, "t", "none"),
                    "Paired t-test: t(9) = -4.06, p = 0.003; mean difference -13.80 (above − below; 95% CI -21.49 to -6.11), "
                    "Cohen's d = -1.28",
                    "paired", "culvert t none");
    expect_sentence(paired_report(first, second, "t", "log"),
                    "Paired t-test: t(9) = -3.93, p = 0.003; ratio of geometric means 0.94 (above ÷ below; 95% CI 0.91 to 0.97), "
                    "Cohen's d = -1.24",
                    "paired", "culvert t log");
    expect_sentence(paired_report(first, second, "signed-rank", "none"),
                    "Wilcoxon signed-rank test (exact p): T⁺ = 1, p = 0.004; Hodges–Lehmann pseudo-median -13.00 "
                    "(above − below; 95% CI -23.00 to -4.50), matched-pairs rank-biserial r = -0.96",
                    "paired", "culvert signed-rank none");
    expect_sentence(paired_report(first, second, "sign", "none"),
                    "Sign test (exact binomial): 1 of 10 differences positive, p = 0.021; median difference -15.00 "
                    "(above − below; 95% CI -27.00 to -3.00), matched-pairs rank-biserial r = -0.96",
                    "paired", "culvert sign none");
}

TEST(ReportSentence, OneSample) {
    const Range ponds = numbers_with_header("pH", ph);
    expect_sentence(paired_report(ponds, typed(7), "t", "none"),
                    "One-sample t-test: t(8) = 3.43, p = 0.009; mean difference 0.40 (pH − 7; 95% CI 0.13 to 0.67), "
                    "Cohen's d = 1.14",
                    "paired", "ph t");
    expect_sentence(paired_report(ponds, typed(7), "signed-rank", "none"),
                    "Wilcoxon one-sample signed-rank test (exact p): T⁺ = 43, p = 0.012; Hodges–Lehmann pseudo-median 0.39 "
                    "(pH − 7; 95% CI 0.13 to 0.69), matched-pairs rank-biserial r = 0.91",
                    "paired", "ph signed-rank");
    expect_sentence(paired_report(ponds, typed(7), "sign", "none"),
                    "One-sample sign test (exact binomial): 8 of 9 differences positive, p = 0.039; median difference 0.36 "
                    "(pH − 7; 95% CI 0.0800 to 0.85), matched-pairs rank-biserial r = 0.91",
                    "paired", "ph sign");
}

// ---------------------------------------------------------------- CHECK.NORMAL

Table normal_report(const Range& values, const Range& groups, const char* method) {
    return call("checkNormal", {values, groups, keyword(method), keyword("report")});
}

TEST(ReportSentence, Normality) {
    const Range temperature = numbers_with_header("temperature", springs);
    expect_sentence(normal_report(temperature, omitted, "shapiro-wilk"),
                    "Shapiro–Wilk normality test: W = 0.82, p = 0.002, n = 20", "normality", "springs shapiro-wilk");
    expect_sentence(normal_report(temperature, omitted, "shapiro-francia"),
                    "Shapiro–Francia normality test: W′ = 0.81, p = 0.002, n = 20", "normality", "springs shapiro-francia");
    // p = 0.00132: the last p shown with three decimals above the "p < 0.001" form.
    expect_sentence(normal_report(temperature, omitted, "anderson-darling"),
                    "Anderson–Darling normality test: A² = 1.34, p = 0.001, n = 20", "normality", "springs anderson-darling");
    expect_sentence(normal_report(temperature, omitted, "lilliefors"),
                    "Lilliefors (Kolmogorov–Smirnov) normality test: D = 0.20, p = 0.034, n = 20", "normality",
                    "springs lilliefors");
    expect_sentence(normal_report(temperature, omitted, "dagostino-pearson"),
                    "D'Agostino–Pearson normality test: K² = 12.34, p = 0.002, n = 20", "normality", "springs dagostino-pearson");
    expect_sentence(normal_report(temperature, omitted, "jarque-bera"),
                    "Jarque–Bera normality test: JB = 9.98, p = 0.007, n = 20", "normality", "springs jarque-bera");
    const LongTable t = oxygen();
    expect_sentence(normal_report(t.values, t.groups, "shapiro-wilk"),
                    "Shapiro–Wilk normality test of the residuals from 2 group means: W = 0.98, p = 0.941, n = 15",
                    "normality", "oxygen residuals shapiro-wilk");
}

// ---------------------------------------------------------------- CHECK.VARIANCE

Table variance_report(const LongTable& t, const char* method) {
    return call("checkVariance", {t.values, t.groups, keyword(method), keyword("report")});
}

TEST(ReportSentence, Variance) {
    expect_sentence(variance_report(nitrate(), "brown-forsythe"),
                    "Brown–Forsythe test (deviations from group medians): F(2, 20) = 8.07, p = 0.003, n = 23; "
                    "largest variance over smallest 56.50",
                    "variance", "nitrate brown-forsythe");
    expect_sentence(variance_report(nitrate(), "levene"),
                    "Levene's test (deviations from group means): F(2, 20) = 10.09, p < 0.001, n = 23; "
                    "largest variance over smallest 56.50",
                    "variance", "nitrate levene");
    expect_sentence(variance_report(nitrate(), "bartlett"),
                    "Bartlett's test: χ²(2) = 22.01, p < 0.001, n = 23; largest variance over smallest 56.50",
                    "variance", "nitrate bartlett");
    expect_sentence(variance_report(nitrate(), "fligner"),
                    "Fligner–Killeen test (median-centred): χ²(2) = 10.40, p = 0.006, n = 23; "
                    "largest variance over smallest 56.50",
                    "variance", "nitrate fligner");
    expect_sentence(variance_report(oxygen(), "f-ratio"),
                    "F-test of two variances (two-sided; first group over second): F(7, 6) = 0.51, p = 0.394, n = 15; "
                    "largest variance over smallest 1.98",
                    "variance", "oxygen f-ratio");
}

// ---------------------------------------------------------------- COMPARE.COUNTS, COMPARE.EXPECTED

// Mayfly found / not found in kick samples, riffle and pool.
Range mayfly_block() {
    return block(3, 3, {txt("mayfly"), txt("riffle"), txt("pool"),  //
                        txt("found"), num(18), num(7),              //
                        txt("not found"), num(5), num(14)});
}
// Heron nests by tree species in two marshes.
Range nests_block() {
    return block(3, 4, {txt("marsh"), txt("alder"), txt("willow"), txt("oak"),  //
                        txt("north"), num(5), num(2), num(1),                    //
                        txt("south"), num(1), num(4), num(6)});
}

Table counts_report(const Range& block, const char* method) {
    return call("compareCounts", {block, omitted, keyword(method), keyword("report")});
}

TEST(ReportSentence, Counts) {
    expect_sentence(counts_report(mayfly_block(), "chi-square"),
                    "Pearson's chi-square test: χ²(1) = 9.03, p = 0.003, n = 44; φ = 0.45", "counts",
                    "mayfly chi-square");
    expect_sentence(counts_report(mayfly_block(), "yates"),
                    "Chi-square test with Yates' continuity correction: χ²(1) = 7.29, p = 0.007, n = 44; φ = 0.45",
                    "counts", "mayfly yates");
    expect_sentence(counts_report(mayfly_block(), "g"),
                    "G-test (likelihood ratio): G(1) = 9.36, p = 0.002, n = 44; φ = 0.45", "counts", "mayfly g");
    expect_sentence(counts_report(mayfly_block(), "fisher"), "Fisher's exact test: p = 0.005, n = 44; φ = 0.45", "counts",
                    "mayfly fisher");
    expect_sentence(counts_report(nests_block(), "chi-square"),
                    "Pearson's chi-square test: χ²(2) = 6.60, p = 0.037, n = 19; Cramér's V = 0.59", "counts",
                    "nests chi-square");
    expect_sentence(counts_report(nests_block(), "fisher"),
                    "Fisher–Freeman–Halton exact test: p = 0.062, n = 19; Cramér's V = 0.59", "counts", "nests fisher");
}

TEST(ReportSentence, Expected) {
    // Newts by sex in pitfall traps, against 1:1 (expected omitted).
    expect_sentence(call("compareExpected", {Range::column({34, 22}), omitted, keyword("report")}),
                    "Chi-square goodness-of-fit test: χ²(1) = 2.57, p = 0.109, n = 56", "counts", "newts");
}

// ---------------------------------------------------------------- RELATE.CORRELATION

Table correlation_report(const std::vector<double>& x, const std::vector<double>& y, const char* method) {
    return call("relateCorrelation", {Range::column(x), Range::column(y), keyword(method), keyword("report")});
}

TEST(ReportSentence, Correlation) {
    expect_sentence(correlation_report(width, canopy, "pearson"),
                    "Pearson's correlation: r = -0.46 (95% CI -0.82 to 0.16), t(10) = -1.63, p = 0.133, n = 12", "correlation",
                    "width pearson");
    expect_sentence(correlation_report(width, canopy, "spearman"),
                    "Spearman's rank correlation: ρ = -0.56, t(10) = -2.13, p = 0.059, n = 12", "correlation", "width spearman");
    expect_sentence(correlation_report(width, canopy, "kendall"), "Kendall's tau-b (exact p): τ = -0.39, p = 0.086, n = 12",
                    "correlation", "width kendall");
    expect_sentence(correlation_report(traps, crayfish, "kendall"), "Kendall's tau-b (normal approximation): τ = 0.82, z = 3.55, p < 0.001, n = 12",
                    "correlation", "crayfish kendall");
}

// ---------------------------------------------------------------- FIT.LINEAR

TEST(ReportSentence, LinearRegression) {
    expect_sentence(call("fitLinear", {numbers_with_header("canopy", canopy), numbers_with_header("width", width), keyword("report")}),
                    "Linear regression (ordinary least squares): R² = 0.21, F(1, 10) = 2.67, p = 0.133, n = 12; slope -4.55 (95% CI -10.74 to 1.65)",
                    "linear", "canopy on width");
    Range xs = block(13, 2, {txt("width"), txt("willow")});
    for (std::size_t i = 0; i < width.size(); ++i) {
        xs.cells.push_back(num(width[i]));
        xs.cells.push_back(num(willow[i]));
    }
    expect_sentence(call("fitLinear", {numbers_with_header("canopy", canopy), xs, keyword("report")}),
                    "Linear regression (ordinary least squares): R² = 0.22, F(2, 9) = 1.27, p = 0.328, n = 12", "linear", "canopy on width and willow");
    // A perfect line (y = 2 + 0.5x, by construction): the sentence says what is and is not defined.
    EXPECT_EQ(text_of(call("fitLinear", {Range::column({2.5, 3, 3.5, 4, 4.5}), Range::column({1, 2, 3, 4, 5}), keyword("report")})),
              "Linear regression (ordinary least squares): perfect fit (R² = 1, residual SD 0): the coefficients are exact; "
              "standard errors are 0, and t, F and p are not defined, n = 5; slope 0.50");
}

// ---------------------------------------------------------------- ADVISE.TEST

TEST(ReportSentence, Advisor) {
    const LongTable t = oxygen();
    expect_sentence(call("adviseTest", {t.values, t.groups, keyword("report")}),
                    "Suggested: COMPARE.GROUPS, method 'welch'. Why: continuous response (n = 15), predictor with 2 groups "
                    "(sizes 7 to 8), so compare two groups; no clear sign of non-normality in the residuals from the group "
                    "means (Shapiro–Wilk p = 0.941), so a test of means can be used; no clear sign of unequal spread "
                    "(Brown–Forsythe p = 0.485), so Welch's t-test, which does not assume equal spreads. A guide, not a verdict: check it "
                    "against the study design.",
                    "advisor", "oxygen");
}

// Two categorical columns: the mayfly samples as rows of labels (18, 7, 5 and 14 of the four
// kinds). Smallest expected count 19·21/44 = 9.068… (by hand), so "9.07"; none below 5.
TEST(ReportSentence, AdvisorCounts) {
    std::vector<std::string> found{"mayfly"}, habitat{"habitat"};
    auto add = [&](int count, const char* f, const char* h) {
        for (int i = 0; i < count; ++i) {
            found.push_back(f);
            habitat.push_back(h);
        }
    };
    add(18, "found", "riffle");
    add(7, "found", "pool");
    add(5, "not found", "riffle");
    add(14, "not found", "pool");
    EXPECT_EQ(text_of(call("adviseTest", {Range::text_column(found), Range::text_column(habitat), keyword("report")})),
              "Suggested: COMPARE.COUNTS, method 'chi-square'. Why: two categorical variables: 2×2 table of 44 observations, "
              "so test of association; smallest expected count 9.07, 0 of 4 cells below 5, so Pearson's chi-square "
              "(Cochran's rule holds). A guide, not a verdict: check it against the study design.");
}

// Three values a side: no 95% interval exists, and the sentence says so where the limits go.
// By hand: every first value beats every second, U = 9, exact p = 2/C(6,3) = 0.100, r = 1;
// the nine differences sorted are 0.3, 0.5, 0.6, 0.8, 0.9, 1.1, 1.2, 1.3, 1.7, median 0.9.
TEST(ReportSentence, TwoGroupsTooFewForAnInterval) {
    const LongTable t = long_table("oxygen", {{"spring", {5.1, 5.4, 5.9}}, {"ditch", {4.2, 4.6, 4.8}}});
    EXPECT_EQ(text_of(groups_report(t, "ranks", "none")),
              "Wilcoxon–Mann–Whitney rank-sum test (exact p): U = 9, p = 0.100; Hodges–Lehmann shift 0.90 "
              "(spring − ditch; too few values for a 95% interval), rank-biserial r = 1.00");
}

// ---------------------------------------------------------------- LIMIT.*, CHECK.OUTLIERS

// The invented ammonia samples (mg/L, 24 weeks) and Rosner's 54 values (NIST/SEMATECH e-Handbook
// §1.3.5.17), as generate_limits.py holds them (limits.json), each under a header.
Range limits_column(const char* name, const char* header) {
    return numbers_with_header(header, reference_file("limits.json")[name]["values"].get<std::vector<double>>());
}

TEST(ReportSentence, Limits) {
    const Range ammonia = limits_column("ammonia", "ammonia");
    expect_sentence(call("limitMean", {ammonia, omitted, keyword("report")}),
                    "Upper 95% confidence limit of the mean (Student's t): 0.93 (mean 0.81, SD 0.33, n = 24)", "limits",
                    "ammonia t");
    expect_sentence(call("limitExceedance", {ammonia, typed(1), keyword("report")}),
                    "Upper 95% confidence limit of the share above the standard (Clopper–Pearson): 0.34 (standard 1, "
                    "4 above it, share 0.17, n = 24)",
                    "limits", "ammonia exceedance 1");
    expect_sentence(call("limitTolerance", {ammonia, typed(0.9), keyword("report")}),
                    "Upper tolerance limit for 90% of the population at 95% confidence: 1.42 (mean 0.81, SD 0.33, "
                    "k = 1.85, n = 24)",
                    "limits", "ammonia tolerance 0.9");
    expect_sentence(call("limitPercentile", {ammonia, typed(0.5), keyword("report")}),
                    "Upper 95% confidence limit of the 50th percentile: 0.83 (50th percentile 0.72, the 8th largest value, "
                    "distribution-free, n = 24)",
                    "limits", "ammonia median");
    expect_sentence(call("limitPrediction", {ammonia, omitted, keyword("report")}),
                    "Upper prediction limit for the next reading at 95% confidence: 1.39 (mean 0.81, SD 0.33, k = 1.75, "
                    "n = 24)",
                    "limits", "ammonia prediction");
}

TEST(ReportSentence, Outliers) {
    const Range rosner = limits_column("rosner", "value");
    expect_sentence(call("checkOutliers", {rosner, omitted, keyword("report")}),
                    "Generalized ESD test (Rosner 1983), up to 5 values at α = 0.05, n = 54: 3 values stand out (6.01, "
                    "5.42, 5.34); the test assumes the other values come from a normal distribution; a flagged value is "
                    "one to check (a transcription slip, a fouled probe), not one to delete.",
                    "outliers", "rosner generalized-esd");
    expect_sentence(call("checkOutliers", {rosner, keyword("grubbs"), keyword("report")}),
                    "Grubbs' test (two-sided), α = 0.05, n = 54: no clear sign of an outlier (G = 3.12 against a "
                    "critical 3.16); the test assumes the other values come from a normal distribution; a flagged value "
                    "is one to check (a transcription slip, a fouled probe), not one to delete.",
                    "outliers", "rosner grubbs");
}

// ---------------------------------------------------------------- TRACK.TREND, COMPARE.BLOCKS, COMPARE.NESTED
// The published examples as their generators store them (trend.json, blocks.json).

Range numbers_of(const nlohmann::json& xs) { return Range::column(xs.get<std::vector<double>>()); }
Range labels_of(const nlohmann::json& xs) { return Range::text_column(xs.get<std::vector<std::string>>()); }

TEST(ReportSentence, OverTimeBlocksNested) {
    // US EPA QA/G-9S (2006), Mann–Kendall example, times 1..11 as plain numbers: per unit of time.
    const auto& epa = reference_file("trend.json")["cases"]["epa"];
    expect_sentence(call("trackTrend", {numbers_of(epa["y"]), numbers_of(epa["t"]), omitted, keyword("report")}),
                    "Mann–Kendall trend test (normal approximation): S = 22, p = 0.092, n = 11; Sen slope per unit of "
                    "time 1.00 (95% CI 0.00 to 2.00), τ = 0.43; change per unit of time as % of the median 6.67",
                    "over time", "epa");
    // Montgomery's hardness example: four tips on four coupons.
    const auto& hard = reference_file("blocks.json")["hardness"];
    const Range v = numbers_of(hard["values"]), g = labels_of(hard["groups"]), b = labels_of(hard["blocks"]);
    expect_sentence(call("compareBlocks", {v, g, b, keyword("pooled"), keyword("report")}),
                    "Randomized complete block ANOVA: F(3, 9) = 14.44, p < 0.001; partial η² = 0.83 (4 groups; 4 blocks "
                    "used)",
                    "over time", "hardness pooled");
    expect_sentence(call("compareBlocks", {v, g, b, keyword("ranks"), keyword("report")}),
                    "Friedman test: χ²(3) = 8.85, p = 0.031; Kendall's W = 0.74 (4 groups; 4 blocks used)", "over time",
                    "hardness ranks");
    // Sokal & Rohlf's rat livers: three treatments, two rats each, six readings per rat.
    const auto& rats = reference_file("blocks.json")["rats"];
    expect_sentence(call("compareNested", {numbers_of(rats["values"]), labels_of(rats["groups"]), labels_of(rats["units"]),
                                           keyword("report")}),
                    "Nested ANOVA: F(2, 3) = 2.93, p = 0.197; variance components: between groups 37%, between units "
                    "34%, within units 28% (groups tested over 6 units; 36 readings)",
                    "over time", "rats");
}

// ---------------------------------------------------------------- coverage and refusals

// ---------------------------------------------------------------- COMPARE.CENSORED

// Dissolved lead (µg/L) upgradient and downgradient of a landfill, "<1" below the lab's limit
// (report_scenarios.py LEAD_UP, LEAD_DOWN), long format under headers.
LongTable lead_wells() {
    const std::vector<std::pair<std::string, std::vector<const char*>>> wells = {
        {"upgradient", {"<1", "0.6", "<0.5", "1.2", "<1", "0.8", "1.5", "<0.5", "0.9", "2.1"}},
        {"downgradient", {"1.4", "<1", "2.6", "1.9", "3.3", "<0.5", "2.2", "1.1", "4.0"}}};
    std::vector<Cell> values{txt("lead")};
    std::vector<std::string> labels{"well"};
    for (const auto& [well, cells] : wells)
        for (const char* c : cells) {
            values.push_back(c[0] == '<' ? txt(c) : num(std::stod(c)));
            labels.push_back(well);
        }
    return {block(values.size(), 1, values, 0, 1), Range::text_column(labels)};
}

TEST(ReportSentence, Censored) {
    const LongTable t = lead_wells();
    expect_sentence(call("compareCensored", {t.values, t.groups, omitted, keyword("report")}),
                    "Peto–Prentice generalized Wilcoxon test: χ²(1) = 4.22, p = 0.040; Kaplan–Meier medians upgradient "
                    "0.80, downgradient 1.90 (2 groups; 6 of 19 values below a detection limit)",
                    "censored", "lead peto-prentice");
    expect_sentence(call("compareCensored", {t.values, t.groups, keyword("gehan"), keyword("report")}),
                    "Gehan's generalized Wilcoxon test: χ²(1) = 4.62, p = 0.032; Kaplan–Meier medians upgradient 0.80, "
                    "downgradient 1.90 (2 groups; 6 of 19 values below a detection limit)",
                    "censored", "lead gehan");
}

// Every function whose wizard text offers `report` is exercised above.
TEST(ReportSentence, EveryFunctionWithReportIsCovered) {
    const std::set<std::string> covered = {"COMPARE.GROUPS", "COMPARE.PAIRED", "CHECK.NORMAL",       "CHECK.VARIANCE",
                                           "COMPARE.COUNTS", "COMPARE.EXPECTED", "RELATE.CORRELATION", "FIT.LINEAR",
                                           "ADVISE.TEST",    "LIMIT.MEAN",       "LIMIT.EXCEEDANCE",   "LIMIT.TOLERANCE",
                                           "LIMIT.PERCENTILE", "LIMIT.PREDICTION", "CHECK.OUTLIERS",
                                           "TRACK.TREND",      "COMPARE.BLOCKS",   "COMPARE.NESTED",   "COMPARE.CENSORED"};
    for (const Function* f : registry()) {
        for (const Argument& a : f->arguments) {
            if (a.keywords && a.name == "output" && a.keywords->contains("report")) {
                EXPECT_TRUE(covered.count(f->display_name)) << f->display_name << " offers report but has no sentence test here";
            }
        }
    }
}

// A refusal is the refusal text, never a sentence around it.
TEST(ReportSentence, RefusalHasNoSentence) {
    const LongTable t = long_table("oxygen", {{"riffle", riffle}, {"pool", {8.2}}});
    EXPECT_EQ(text_of(groups_report(t, "welch", "none")), "group 'pool' has 1 value; each group needs at least 2");
    EXPECT_EQ(text_of(call("fitLogistic", {Range::column({0, 1, 0, 1}), Range::column({1, 2, 3, 4}), keyword("report")})),
              "unknown output 'report'; valid: coefficients, model");
}

}  // namespace
}  // namespace quadrat::addin
