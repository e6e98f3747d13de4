// Groups within blocks and subsamples within units: COMPARE.BLOCKS (randomized block ANOVA,
// Friedman, the two-group paired tests matched by block, the pairs) and COMPARE.NESTED.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "core/blocks.hpp"
#include "core/nested.hpp"
#include "core/paired.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("blocks.json"); }

// Three columns that own their cells, viewed as the core's readings.
struct Sheet {
    std::vector<double> values;
    std::vector<std::string> groups, blocks;
    std::size_t n_dropped = 0;
    BlockReadings readings() const { return {values, groups, blocks, n_dropped}; }
    NestedReadings nested() const { return {values, groups, blocks, n_dropped}; }
};

Sheet sheet_of(const nlohmann::json& c, const char* labels = "blocks") {
    return {c["values"].get<std::vector<double>>(), c["groups"].get<std::vector<std::string>>(),
            c[labels].get<std::vector<std::string>>()};
}

// The same rows in another order (fixed seed).
Sheet shuffled(Sheet s, unsigned seed) {
    std::vector<std::size_t> order(s.values.size());
    for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
    std::mt19937 rng(seed);
    std::shuffle(order.begin(), order.end(), rng);
    Sheet out;
    for (std::size_t i : order) {
        out.values.push_back(s.values[i]);
        out.groups.push_back(s.groups[i]);
        out.blocks.push_back(s.blocks[i]);
    }
    return out;
}

void expect_quantities(const TestResult& r, const nlohmann::json& ref, const std::vector<std::string>& keys,
                       double tolerance) {
    for (const auto& key : keys) expect_relative(r.number(key), ref[key].get<double>(), tolerance, key);
}

void expect_pairs(const PosthocResult& got, const nlohmann::json& ref, double tolerance) {
    ASSERT_EQ(got.pairs.size(), ref.size());
    for (std::size_t i = 0; i < ref.size(); ++i) {
        SCOPED_TRACE("pair " + std::to_string(i));
        const auto& c = got.pairs[i];
        EXPECT_NEAR(c.estimate, ref[i]["estimate"].get<double>(), tolerance * std::max(1.0, std::fabs(c.estimate)));
        EXPECT_NEAR(std::get<double>(c.ci_low), ref[i]["ci-low"].get<double>(), tolerance * 10);
        EXPECT_NEAR(std::get<double>(c.ci_high), ref[i]["ci-high"].get<double>(), tolerance * 10);
        expect_relative(c.statistic, ref[i]["statistic"].get<double>(), tolerance, "statistic");
        expect_relative(c.p, ref[i]["p"].get<double>(), tolerance, "p");
        expect_relative(c.adjusted_p, ref[i]["adjusted p"].get<double>(), tolerance, "adjusted p");
    }
}

// ---------------------------------------------------------------- published examples

// Montgomery, Design and Analysis of Experiments (5th ed., Table 4-3), hardness testing: four tips
// on four coupons (blocks). Data as reprinted on a course page (second-hand, stored in
// generate_blocks.py); printed: SS tips 0.385, SS coupons 0.825, SS error 0.080, F = 14.44,
// p = 0.0009. Recomputed by hand from the data: tip means 9.575, 9.600, 9.450, 9.875 about 9.625,
// SS tips = 4·(0.05² + 0.025² + 0.175² + 0.25²) = 0.385, MSE = 0.080/9, F = 0.12833/0.008889 = 14.4375.
// Tolerances: half a unit in the last printed digit.
TEST(Blocks, MontgomeryHardnessTesting) {
    const Sheet s = sheet_of(reference()["hardness"]);
    const TestResult r = compare_blocks(s.readings(), "");
    EXPECT_EQ(r.test, "Randomized complete block ANOVA");
    EXPECT_NEAR(r.number("sum of squares (groups)"), 0.385, 0.0005);
    EXPECT_NEAR(r.number("sum of squares (blocks)"), 0.825, 0.0005);
    EXPECT_NEAR(r.number("sum of squares (residual)"), 0.080, 0.0005);
    EXPECT_NEAR(r.number("statistic"), 14.44, 0.005);
    EXPECT_NEAR(r.number("statistic"), 14.4375, 1e-12);
    EXPECT_NEAR(r.number("p"), 0.0009, 0.00005);
    EXPECT_EQ(r.number("df"), 3);
    EXPECT_EQ(r.number("df2"), 9);
    // statsmodels 0.13 OLS value ~ C(group) + C(block), anova_lm typ=2, and AnovaRM, via
    // generate_blocks.py. Tolerance 1e-10 relative (closed forms; the library's QR rounding).
    const auto& ref = reference()["hardness"]["pooled"];
    expect_quantities(r, ref, {"statistic", "p", "effect", "sum of squares (groups)", "sum of squares (blocks)",
                               "sum of squares (residual)"}, 1e-10);
    expect_relative(r.number("statistic"), ref["anovarm F"].get<double>(), 1e-10, "AnovaRM F");
    expect_relative(r.number("p"), ref["anovarm p"].get<double>(), 1e-10, "AnovaRM p");
    // Partial η² by hand: 0.385/(0.385 + 0.080) = 0.82796.
    EXPECT_NEAR(r.number("effect"), 0.385 / 0.465, 1e-12);
    EXPECT_NEAR(r.number("tip 4: mean"), 9.875, 1e-12);
    EXPECT_EQ(render_report(r), "Randomized complete block ANOVA: F(3, 9) = 14.44, p < 0.001; partial η² = 0.83 (4 groups; 4 blocks used)");
}

// Conover, Practical Nonparametric Statistics (3rd ed., 1999), section 5.8: twelve homeowners rank
// four grass mixtures (from memory): rank sums 38, 23.5, 24.5, 34; T1 = 8.097; T2 = 3.19. Worked in
// exact fractions by generate_blocks.py: A1 = 356.5, C1 = 300, T1 = 3·(7² + 7.5² + 6.5² + 4²)/56.5
// = 8.0973, T2 = 11·T1/(36 − T1) = 3.1922. Tolerances: the printed digits, then 1e-12.
TEST(Blocks, ConoverGrassFriedman) {
    const auto& c = reference()["grass"];
    const TestResult r = compare_blocks(sheet_of(c).readings(), "ranks");
    EXPECT_NEAR(r.number("statistic"), 8.097, 0.0005);
    EXPECT_NEAR(r.number("Iman–Davenport F"), 3.19, 0.005);
    EXPECT_NEAR(r.number("statistic"), c["exact"]["T1"].get<double>(), 1e-12);
    EXPECT_NEAR(r.number("Iman–Davenport F"), c["exact"]["T2"].get<double>(), 1e-12);
    const std::vector<double> sums = {38, 23.5, 24.5, 34};
    for (std::size_t g = 0; g < 4; ++g)
        EXPECT_EQ(r.number(std::string(1, static_cast<char>('A' + g)) + ": rank sum"), sums[g]);
    EXPECT_EQ(r.number("df"), 3);
    EXPECT_EQ(r.number("Iman–Davenport df2"), 33);
    // scipy.stats.friedmanchisquare 1.10 (tie-corrected) and scipy.stats.f for the Iman–Davenport p
    // (generate_blocks.py); W = χ²/(b(k − 1)). Tolerance 1e-12 relative.
    expect_quantities(r, c["ranks"], {"statistic", "p", "effect", "Iman–Davenport F", "Iman–Davenport p"}, 1e-12);
    EXPECT_EQ(render_report(r), "Friedman test: χ²(3) = 8.10, p = 0.044; Kendall's W = 0.22 (4 groups; 12 blocks used)");
}

// Conover (1999), section 5.8, eq. 8, computed in generate_blocks.py from the formula (ranks from
// scipy.stats.rankdata, p from scipy.stats.t, Holm from statsmodels multipletests). Tolerance 1e-10.
TEST(Blocks, ConoverPairsAfterFriedman) {
    const auto& c = reference()["grass"];
    const PosthocResult r = compare_blocks_pairs(sheet_of(c).readings(), "ranks", std::nullopt);
    EXPECT_EQ(r.test, "Conover's pairwise comparisons of rank sums after the Friedman test, Holm-adjusted");
    expect_pairs(r, c["pairs ranks"], 1e-10);
    // By hand: ΣR² = 38² + 23.5² + 24.5² + 34² = 3752.5, bA1 − ΣR² = 12·356.5 − 3752.5 = 525.5,
    // SE = √(2·525.5/33) = 5.6436; A − B: t = 14.5/5.6436 = 2.5694 on 33 df.
    EXPECT_NEAR(r.pairs[0].statistic, 14.5 / std::sqrt(2 * 525.5 / 33), 1e-12);
    EXPECT_EQ(r.table().size(), 7u);
    EXPECT_EQ(r.table()[0].size(), 9u);
}

// ---------------------------------------------------------------- field layout

// Invented marsh scenario (generate_blocks.py, seed 20261204): 5 zones × 12 transects, some cells
// with two quadrats (averaged), transect T07 missing a zone (dropped), rows shuffled. statsmodels
// OLS/AnovaRM on the cell means and scipy.stats.friedmanchisquare; counts by plain Python in the
// same script. Tolerances 1e-10 relative.
TEST(Blocks, FieldLayoutAgreesWithLibraries) {
    const auto& c = reference()["field"];
    Sheet s = sheet_of(c);
    s.n_dropped = 2;
    const TestResult pooled = compare_blocks(s.readings(), "pooled");
    expect_quantities(pooled, c["pooled"], {"statistic", "df", "df2", "p", "effect", "sum of squares (residual)"}, 1e-10);
    expect_relative(pooled.number("statistic"), c["pooled"]["anovarm F"].get<double>(), 1e-10, "AnovaRM F");
    for (const char* key : {"n", "blocks used", "blocks dropped", "readings averaged"})
        EXPECT_EQ(pooled.number(key), c["counts"][key].get<double>()) << key;
    EXPECT_EQ(pooled.number("n dropped"), 2);
    const TestResult ranks = compare_blocks(s.readings(), "ranks");
    expect_quantities(ranks, c["ranks"], {"statistic", "p", "effect", "Iman–Davenport F", "Iman–Davenport p"}, 1e-10);
    EXPECT_EQ(ranks.number("blocks dropped"), 1);
    // Group order is the order of first appearance in the (shuffled) rows.
    const auto order = c["groups in order"].get<std::vector<std::string>>();
    const PosthocResult t_pairs = compare_blocks_pairs(s.readings(), "pooled", std::nullopt);
    EXPECT_EQ(t_pairs.groups, order);
    EXPECT_EQ(t_pairs.test, "paired t-tests, pairs matched by block, Holm-adjusted");
    // scipy.stats.ttest_rel per pair on the complete blocks' cell means, Holm by statsmodels.
    expect_pairs(t_pairs, c["pairs pooled"], 1e-10);
    expect_pairs(compare_blocks_pairs(s.readings(), "ranks", std::nullopt), c["pairs ranks"], 1e-10);
}

// Labels in any row order give the same numbers (common practice, no source: the layout is by label).
TEST(Blocks, RowOrderDoesNotMatter) {
    const Sheet s = sheet_of(reference()["field"]);
    for (const char* method : {"pooled", "ranks"}) {
        const TestResult a = compare_blocks(s.readings(), method);
        const Sheet t = shuffled(s, 7);
        const TestResult b = compare_blocks(t.readings(), method);
        // The group order may change with the rows; the test statistic does not (1e-12: sums in another order).
        EXPECT_NEAR(a.number("statistic"), b.number("statistic"), 1e-12 * a.number("statistic")) << method;
        EXPECT_NEAR(a.number("p"), b.number("p"), 1e-12) << method;
        EXPECT_EQ(a.number("readings averaged"), b.number("readings averaged"));
    }
}

// Subsamples averaged (common practice, no source): a cell holding 2 readings 10 and 12 is the
// same as a cell holding 11; the readings count in n and in `readings averaged`.
TEST(Blocks, SubsamplesAreAveraged) {
    Sheet one{{11, 20, 31, 13, 21, 35, 12, 25, 33}, {"a", "b", "c", "a", "b", "c", "a", "b", "c"},
              {"x", "x", "x", "y", "y", "y", "z", "z", "z"}};
    Sheet two = one;
    two.values[0] = 10;
    two.values.push_back(12);
    two.groups.push_back("a");
    two.blocks.push_back("x");
    const TestResult a = compare_blocks(one.readings(), ""), b = compare_blocks(two.readings(), "");
    EXPECT_NEAR(a.number("statistic"), b.number("statistic"), 1e-12 * a.number("statistic"));
    EXPECT_EQ(b.number("n"), 10);
    EXPECT_EQ(b.number("readings averaged"), 2);
    EXPECT_NE(render_report(b).find("2 readings averaged within their cells"), std::string::npos);
    // A block missing a group is dropped whole (and only counted): adding block w without c changes nothing.
    Sheet three = one;
    for (auto [v, g] : {std::pair{14.0, "a"}, std::pair{22.0, "b"}}) {
        three.values.push_back(v);
        three.groups.push_back(g);
        three.blocks.push_back("w");
    }
    const TestResult c = compare_blocks(three.readings(), "");
    EXPECT_EQ(c.number("statistic"), a.number("statistic"));
    EXPECT_EQ(c.number("blocks dropped"), 1);
    EXPECT_EQ(c.number("n"), 9);
}

// ---------------------------------------------------------------- two groups

// Two groups: COMPARE.PAIRED on the matched cell means, whatever the row order. scipy.stats.ttest_rel,
// wilcoxon (zero_method='wilcox', approx with continuity correction: the differences tie) and
// binomtest 1.10 on the matched pairs (generate_blocks.py). Tolerance 1e-10 relative.
TEST(Blocks, TwoGroupsAreCompareBlocksOfPairs) {
    const auto& c = reference()["two groups"];
    const Sheet s = sheet_of(c);
    PairedReadings matched;
    matched.first = c["first"].get<std::vector<double>>();
    matched.second = c["second"].get<std::vector<double>>();
    const auto order = c["groups in order"].get<std::vector<std::string>>();
    matched.first_name = order[0];
    matched.second_name = order[1];
    for (auto [method, paired] : {std::pair{"pooled", "t"}, std::pair{"ranks", "signed-rank"}, std::pair{"sign", "sign"}}) {
        SCOPED_TRACE(method);
        const TestResult r = compare_blocks(s.readings(), method);
        const TestResult p = compare_paired(matched, paired, Transform::none);
        for (const char* key : {"statistic", "p", "estimate", "effect"}) EXPECT_EQ(r.number(key), p.number(key)) << key;
        for (const char* key : {"ci-low", "ci-high"}) EXPECT_EQ(*r.find(key), *p.find(key)) << key;
        expect_quantities(r, c[paired], {"statistic", "p"}, 1e-10);
        EXPECT_EQ(r.number("n"), c["counts"]["n"].get<double>());
        EXPECT_EQ(r.number("blocks used"), 13);
        EXPECT_EQ(r.number("blocks dropped"), 1);
        EXPECT_EQ(r.number("readings averaged"), 3);
        EXPECT_EQ(r.test, p.test + ", pairs matched by block");
        EXPECT_EQ(render_report(r), render_report(p) + " (pairs matched by block: 13 blocks used, 1 dropped for a missing group, 3 readings averaged within their cells)");
        // The one pair is the same test.
        const PosthocResult pairs = compare_blocks_pairs(s.readings(), method, std::nullopt);
        ASSERT_EQ(pairs.pairs.size(), 1u);
        EXPECT_EQ(pairs.pairs[0].p, p.number("p"));
        EXPECT_EQ(pairs.pairs[0].adjusted_p, p.number("p"));
    }
    EXPECT_EQ(compare_blocks(s.readings(), "pooled").number("df"), c["t"]["df"].get<double>());
    expect_relative(compare_blocks(s.readings(), "pooled").number("estimate"), c["t"]["estimate"].get<double>(), 1e-12, "estimate");
}

// ---------------------------------------------------------------- refusals and extremes

TEST(Blocks, Refusals) {
    const auto refusal = [](Sheet s, const std::string& method = "") {
        return refusal_text([&] { compare_blocks(s.readings(), method); });
    };
    EXPECT_EQ(refusal({{1, 2, 3}, {"a", "b", "c"}, {"x", "x", "x"}}),
              "all readings are in one block (x); a block design compares groups within at least 2 blocks — with "
              "independent groups use COMPARE.GROUPS");
    EXPECT_EQ(refusal({{1, 2, 3, 4}, {"a", "a", "a", "a"}, {"x", "y", "z", "w"}}),
              "needs at least 2 groups, found 1 (a); groups holds the label of each reading's group");
    EXPECT_EQ(refusal({{1, 2, 3, 4, 5}, {"a", "b", "a", "b", "c"}, {"x", "x", "y", "y", "y"}}),
              "group 'c' is read in block 'y' only; each group must be read in at least 2 blocks (a block missing a "
              "group is dropped whole)");
    EXPECT_EQ(refusal({{1, 2, 3, 4, 5, 6}, {"a", "b", "b", "c", "c", "a"}, {"x", "x", "y", "y", "z", "z"}}),
              "no block holds every group (3 groups, 3 blocks); a block missing a group is dropped whole — check the "
              "group and block labels");
    EXPECT_EQ(refusal({{1, 2, 3, 4, 5, 6, 7}, {"a", "b", "c", "a", "b", "a", "c"}, {"x", "x", "x", "y", "y", "z", "z"}}),
              "only block 'x' holds every group (2 dropped for a missing group); a block comparison needs at least 2 "
              "complete blocks");
    const Sheet three{{1, 2, 4, 2, 3, 7}, {"a", "b", "c", "a", "b", "c"}, {"x", "x", "x", "y", "y", "y"}};
    EXPECT_EQ(refusal(three, "sign"),
              "method 'sign' compares exactly 2 groups, found 3; use 'pooled' (block ANOVA) or 'ranks' (Friedman test)");
    EXPECT_EQ(refusal(three, "tukey"), "unknown method 'tukey'; valid: pooled, ranks, sign");
    // Group + block fits exactly: 0.1-steps that are not exact in binary still count as no residual.
    EXPECT_EQ(refusal({{0.1, 0.3, 0.7, 0.2, 0.4, 0.8}, {"a", "b", "c", "a", "b", "c"}, {"x", "x", "x", "y", "y", "y"}}),
              "the readings are fitted exactly by group and block (no residual spread); the block ANOVA needs "
              "variation beyond group and block effects");
    EXPECT_EQ(refusal({{5, 5, 5, 2, 2, 2}, {"a", "b", "c", "a", "b", "c"}, {"x", "x", "x", "y", "y", "y"}}, "ranks"),
              "every block has all its groups tied; the Friedman test needs at least one block where the groups differ");
    EXPECT_EQ(refusal({{}, {}, {}}),
              "no row has a value with both a group and a block label; values needs numbers, groups and blocks labels in the same rows");
    // Two groups with the same difference in every block: COMPARE.PAIRED's refusal.
    EXPECT_EQ(refusal({{1, 2, 5, 6}, {"a", "b", "a", "b"}, {"x", "x", "y", "y"}}),
              "all differences are equal (no spread); a t-test needs spread in the differences");
    EXPECT_EQ(refusal_text([&] { compare_blocks_pairs(Sheet{{1, 2, 4, 2, 3, 5, 3, 4, 6}, {"a", "b", "c", "a", "b", "c", "a", "b", "c"},
                                                          {"x", "x", "x", "y", "y", "y", "z", "z", "z"}}.readings(), "ranks", std::nullopt); }),
              "every block ranks the groups alike; Conover's comparisons need some disagreement between blocks (the "
              "Friedman test itself is in output 'p')");
}

// Every block ranking the groups alike (counted by hand): rank sums b, 2b, 3b, T₁ = 2·(b² + b²)/(b·2)
// = 2b, W = 1; the Iman–Davenport F is unbounded and the table says so instead of a number.
TEST(Blocks, PerfectAgreementBetweenBlocks) {
    const Sheet s{{1, 2, 4, 2, 3, 5, 3, 4, 6}, {"a", "b", "c", "a", "b", "c", "a", "b", "c"},
                  {"x", "x", "x", "y", "y", "y", "z", "z", "z"}};
    const TestResult r = compare_blocks(s.readings(), "ranks");
    EXPECT_NEAR(r.number("statistic"), 6, 1e-12);
    EXPECT_NEAR(r.number("effect"), 1, 1e-12);
    EXPECT_EQ(std::get<std::string>(*r.find("Iman–Davenport F")), "unbounded: every block ranks the groups alike");
}

// Scale (common practice, no source): F, p and W do not change when every reading is multiplied by
// 1e300 or 1e-300 (exact powers of two inside; 1e-12 relative for the decimal factor's rounding).
TEST(Blocks, HugeAndTinyReadings) {
    const Sheet base = sheet_of(reference()["hardness"]);
    for (double factor : {1e300, 1e-300}) {
        Sheet s = base;
        for (double& x : s.values) x *= factor;
        for (const char* method : {"pooled", "ranks"}) {
            const TestResult a = compare_blocks(s.readings(), method);
            const TestResult b = compare_blocks(base.readings(), method);
            expect_relative(a.number("statistic"), b.number("statistic"), 1e-9, method);
            expect_relative(a.number("p"), b.number("p"), 1e-9, method);
        }
        EXPECT_NO_THROW(compare_blocks_pairs(s.readings(), "pooled", std::nullopt));
    }
    // ±1e308 with both signs: no overflow in the cell means (scaled sums).
    Sheet edge{{1e308, -1e308, 1e308, 1e308, -1e308, 1e307, -1e308, 1e308, -1e307},
               {"a", "b", "c", "a", "b", "c", "a", "b", "c"}, {"x", "x", "x", "y", "y", "y", "z", "z", "z"}};
    const TestResult e = compare_blocks(edge.readings(), "");
    EXPECT_TRUE(std::isfinite(e.number("statistic")));
    EXPECT_TRUE(std::isfinite(e.number("p")));
}

// ---------------------------------------------------------------- nested

// Sokal & Rohlf, Biometry, Box 10.1 (from memory): glycogen in rat livers, 3 treatments × 2 rats ×
// 6 readings (preparations and their readings pooled as subsamples of a rat). Printed SS treatments
// 1557.56 and rats within treatments 797.67 (from memory); by hand F = (1557.56/2)/(797.67/3) = 2.929
// on (2, 3) df. Tolerances: half a unit in the last printed digit. The exact sums of squares and the
// variance components by the classical expected mean squares in exact fractions, and
// scipy.stats.f_oneway on the rat means (generate_blocks.py): 1e-12 relative.
TEST(Nested, SokalRohlfRatLivers) {
    const auto& c = reference()["rats"];
    const TestResult r = compare_nested(sheet_of(c, "units").nested());
    EXPECT_NEAR(r.number("sum of squares (groups)"), 1557.56, 0.005);
    EXPECT_NEAR(r.number("sum of squares (units within groups)"), 797.67, 0.005);
    EXPECT_NEAR(r.number("statistic"), 2.929, 0.0005);
    EXPECT_EQ(r.number("df"), 2);
    EXPECT_EQ(r.number("df2"), 3);
    expect_quantities(r, c, {"statistic", "p", "variance between groups", "variance between units",
                             "variance within units", "share between groups", "share between units",
                             "share within units"}, 1e-12);
    expect_relative(r.number("sum of squares (within units)"), c["exact SS"]["within"].get<double>(), 1e-12, "SS within");
    // statsmodels 0.13 OLS residuals of value ~ C(group) and value ~ C(unit): 1e-10 relative.
    expect_relative(r.number("sum of squares (units within groups)"), c["statsmodels SS"]["units"].get<double>(), 1e-10, "SS units");
    // By hand: MS within = 975/30 = 32.5; σ²_u = (797.667/3 − 32.5)/6 = 38.898.
    EXPECT_NEAR(r.number("variance within units"), 32.5, 1e-12);
    EXPECT_NEAR(r.number("variance between units"), (797.0 + 2.0 / 3) / 3 / 6 - 32.5 / 6, 1e-11);
    EXPECT_EQ(r.number("subsamples per unit"), 6);
    EXPECT_EQ(r.find("test on"), nullptr);
    EXPECT_EQ(r.number("units"), 6);
    EXPECT_EQ(render_report(r),
              "Nested ANOVA: F(2, 3) = 2.93, p = 0.197; variance components: between groups 37%, between units 34%, "
              "within units 28% (groups tested over 6 units; 36 readings)");
}

// Invented wells (generate_blocks.py, seed 20261204): 1–4 samples per well, so the test runs on the
// well means (scipy.stats.f_oneway on them) and the table says so; components by the n₀ coefficients
// in exact fractions. Tolerance 1e-12 relative.
TEST(Nested, UnequalSubsamples) {
    const auto& c = reference()["wells"];
    const TestResult r = compare_nested(sheet_of(c, "units").nested());
    expect_quantities(r, c, {"statistic", "df", "df2", "p", "n", "variance between groups", "variance between units",
                             "variance within units", "share between groups", "share between units"}, 1e-12);
    EXPECT_EQ(std::get<std::string>(*r.find("test on")), "unit means: subsample counts differ, so each unit counts once");
    EXPECT_EQ(std::get<std::string>(*r.find("subsamples per unit")), "1 to 4");
    EXPECT_NE(render_report(r).find("on the unit means: subsample counts differ"), std::string::npos);
    const auto means = c["group means"].get<std::vector<double>>();
    EXPECT_NEAR(r.number("forest: mean"), means[0], 1e-12 * means[0]);
    // Row order does not matter (common practice, no source).
    const Sheet t = shuffled(sheet_of(c, "units"), 3);
    EXPECT_NEAR(compare_nested(t.nested()).number("p"), r.number("p"), 1e-13);
}

// A negative between-units estimate (hand-made: the unit means lie closer than their subsamples'
// spread implies): σ²_u = (0.06833 − 2.53417)/3 = −0.8194… by the exact fractions of
// generate_blocks.py, set to 0 and named in the table.
TEST(Nested, NegativeComponentSetToZero) {
    const auto& c = reference()["negative"];
    const TestResult r = compare_nested(sheet_of(c, "units").nested());
    EXPECT_EQ(r.number("variance between units"), 0);
    EXPECT_EQ(r.number("share between units"), 0);
    expect_quantities(r, c, {"statistic", "p", "variance between groups", "share between groups", "share within units"}, 1e-12);
    const std::string note = std::get<std::string>(*r.find("variance components"));
    EXPECT_EQ(note, "classical expected mean squares (Sokal & Rohlf, Biometry); a negative estimate is set to 0: "
                    "between units " + format_number(c["raw between units"].get<double>()));
}

TEST(Nested, Refusals) {
    const auto refusal = [](Sheet s) { return refusal_text([&] { compare_nested(s.nested()); }); };
    EXPECT_EQ(refusal({{1, 2, 3, 4, 5, 6}, {"a", "a", "b", "b", "b", "b"}, {"p1", "p1", "p2", "p2", "p1", "p1"}}),
              "unit 'p1' appears in groups 'a' and 'b'; in a nested design each unit belongs to one group — give units "
              "in different groups different labels");
    EXPECT_EQ(refusal({{1, 2, 3, 4, 5, 6}, {"a", "a", "b", "b", "b", "b"}, {"p1", "p1", "p2", "p2", "p3", "p3"}}),
              "group 'a' has 1 unit (p1); the test of groups over units needs at least 2 units in each group");
    EXPECT_EQ(refusal({{1, 2, 3, 4}, {"a", "a", "b", "b"}, {"p1", "p2", "p3", "p4"}}),
              "every unit has a single reading, so there are no subsamples to nest; compare the groups with COMPARE.GROUPS");
    EXPECT_EQ(refusal({{1, 2, 3, 4}, {"a", "a", "a", "a"}, {"p1", "p1", "p2", "p2"}}),
              "needs at least 2 groups, found 1 (a); groups holds the label of each reading's group");
    EXPECT_EQ(refusal({{1, 3, 1, 3, 5, 7, 5, 7}, {"a", "a", "a", "a", "b", "b", "b", "b"}, {"p1", "p1", "p2", "p2", "p3", "p3", "p4", "p4"}}),
              "the unit means do not vary within any group; the test of groups over units needs variation between units");
    EXPECT_EQ(refusal({{1}, {"a", "b"}, {"p"}}), "values, groups and units must have the same number of rows");
}


// Robustness (common practice, no source): small random sheets from a few labels, with readings
// from ±1e308 to denormals, ties and repeats. Every call either answers with finite numbers in every
// numeric cell of its table or refuses; nothing else escapes (the fuzzer's rule for cell functions).
TEST(BlocksAndNested, RandomSheetsAnswerOrRefuse) {
    std::mt19937 rng(20261204);
    const std::vector<double> pool = {0, 1, -1, 2.5, 1e308, -1e308, 4.9e-324, 1e-310, 3, 3, 7, 1e-300, 12.25};
    std::size_t answered = 0, refused = 0;
    const auto finite_table = [](const Table& t) {
        for (const auto& row : t)
            for (const auto& cell : row)
                if (const double* x = std::get_if<double>(&cell); x && !std::isfinite(*x)) return false;
        return true;
    };
    for (int trial = 0; trial < 800; ++trial) {
        Sheet s;
        const std::size_t rows = 1 + rng() % 24, groups = 1 + rng() % 4, blocks = 1 + rng() % 5;
        for (std::size_t i = 0; i < rows; ++i) {
            s.values.push_back(rng() % 3 == 0 ? pool[rng() % pool.size()] : static_cast<double>(rng() % 9));
            s.groups.push_back(std::string(1, static_cast<char>('a' + rng() % groups)));
            s.blocks.push_back("b" + std::to_string(rng() % blocks));
        }
        for (const char* method : {"pooled", "ranks", "sign"}) {
            try {
                EXPECT_TRUE(finite_table(compare_blocks(s.readings(), method).table())) << trial << method;
                EXPECT_TRUE(finite_table(compare_blocks_pairs(s.readings(), method, std::nullopt).table())) << trial << method;
                ++answered;
            } catch (const Refusal&) {
                ++refused;
            }
        }
        try {
            EXPECT_TRUE(finite_table(compare_nested(s.nested()).table())) << trial;
            ++answered;
        } catch (const Refusal&) {
            ++refused;
        }
    }
    // Both paths are taken many times.
    EXPECT_GT(answered, 300u);
    EXPECT_GT(refused, 300u);
}

// Infinite or NaN readings never reach the core from a sheet; a direct caller gets a refusal.
TEST(BlocksAndNested, NonFiniteReadingsRefused) {
    const Sheet s{{1, std::nan(""), 3, 4}, {"a", "b", "a", "b"}, {"x", "x", "y", "y"}};
    EXPECT_THROW(compare_blocks(s.readings(), ""), Refusal);
    EXPECT_THROW(compare_nested(s.nested()), Refusal);
}

}  // namespace
}  // namespace quadrat
