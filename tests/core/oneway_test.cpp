// Three or more groups: Welch's one-way ANOVA, the classic one-way ANOVA, Kruskal–Wallis, and
// COMPARE.GROUPS for k ≥ 3.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "core/oneway.hpp"
#include "core/report.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("compare.json"); }

std::vector<std::vector<double>> groups_of(const nlohmann::json& c) {
    return c["groups"].get<std::vector<std::vector<double>>>();
}

void expect_matches(const TestResult& r, const nlohmann::json& ref, double tolerance) {
    for (const char* key : {"statistic", "df", "df2", "p", "estimate", "effect"})
        if (ref.contains(key)) expect_relative(r.number(key), ref[key].get<double>(), tolerance, key, 1.0);
}

Groups named(const std::vector<std::vector<double>>& values) {
    Groups g;
    for (std::size_t i = 0; i < values.size(); ++i) {
        g.names.push_back("zone " + std::string(1, static_cast<char>('A' + i)));
        g.values.push_back(values[i]);
        g.n_used += values[i].size();
    }
    return g;
}

// scipy.stats.f_oneway and scipy.stats.kruskal 1.10, statsmodels 0.13 anova_oneway(use_var='unequal',
// welch_correction=True) for Welch, via tests/reference/generate_compare.py; ω², ε² and the
// estimates from the published formulas in the same script. 3 groups (8, 11, 6 values) and
// 20 groups of 2 to 6. Tolerance 1e-10 relative: closed forms and F/χ² tails in double precision.
TEST(OneWay, AgreesWithScipyAndStatsmodels) {
    for (const char* name : {"zones", "plots20"}) {
        SCOPED_TRACE(name);
        const auto& c = reference()["cases"][name];
        const auto groups = groups_of(c);
        expect_matches(classic_one_way_anova(groups), c["classic"], 1e-10);
        expect_matches(welch_one_way_anova(groups), c["welch"], 1e-10);
        expect_matches(kruskal_wallis_test(groups), c["ranks"], 1e-10);
    }
}

// Welch's F for two groups is the square of Welch's t (Welch 1951, p. 334, with k = 2), and the
// classic F is the square of Student's t: a check of both formulas against the two-group tests.
// Tolerance 1e-12 relative (closed forms).
TEST(OneWay, TwoGroupsReduceToTSquared) {
    const std::vector<std::vector<double>> g = {{1.1, 2.3, 0.7, 1.9}, {4.2, 3.3, 5.1, 2.8, 3.9}};
    Groups two = named(g);
    const double t_welch = compare_groups(two, "welch", Transform::none).number("statistic");
    const double t_pooled = compare_groups(two, "pooled", Transform::none).number("statistic");
    const TestResult w = welch_one_way_anova(g);
    EXPECT_NEAR(w.number("statistic"), t_welch * t_welch, 1e-12 * t_welch * t_welch);
    EXPECT_NEAR(w.number("df2"), compare_groups(two, "welch", Transform::none).number("df"), 1e-10);
    EXPECT_NEAR(classic_one_way_anova(g).number("statistic"), t_pooled * t_pooled, 1e-12 * t_pooled * t_pooled);
}

// COMPARE.GROUPS with 3 groups: df2 row, n dropped, per-group means, report naming the largest and
// smallest group. Layout per FUNCTIONS.md; common practice, no source.
TEST(OneWay, TableAndReport) {
    const auto& c = reference()["cases"]["zones"];
    Groups g = named(groups_of(c));
    g.n_dropped = 2;
    const TestResult r = compare_groups(g, "welch", Transform::none);
    const Table t = r.table();
    // header, test, 6 quantities (no estimate for 3 groups), the effect's interval, n dropped, 2 rows per group
    ASSERT_EQ(t.size(), 2u + 6u + 2u + 1u + 6u);
    EXPECT_EQ(std::get<std::string>(t[1][1]), "Welch's one-way ANOVA");
    EXPECT_EQ(r.number("n dropped"), 2);
    const std::string sentence = render_report(r);
    EXPECT_EQ(sentence.rfind("Welch's one-way ANOVA: F(2, ", 0), 0u) << sentence;
    EXPECT_NE(sentence.find("ω² = "), std::string::npos) << sentence;
    const TestResult k = compare_groups(g, "ranks", Transform::none);
    EXPECT_EQ(render_report(k).rfind("Kruskal–Wallis test: H(2) = ", 0), 0u) << render_report(k);
    EXPECT_NE(k.find("zone A: median"), nullptr);
    // FUNCTIONS.md, COMPARE.GROUPS: with 3 or more groups estimate, ci-low and ci-high are refusals
    // that point to COMPARE.POSTHOC; the table lists none of them.
    for (const char* output : {"estimate", "ci-low", "ci-high"}) {
        const Table cell = select_output(r, output, test_outputs());
        ASSERT_TRUE(std::holds_alternative<std::string>(cell[0][0])) << output;
        EXPECT_NE(std::get<std::string>(cell[0][0]).find("COMPARE.POSTHOC"), std::string::npos) << output;
    }
    for (const auto& row : t) EXPECT_NE(std::get<std::string>(row[0]), "estimate");
    const TestResult log = compare_groups(g, "pooled", Transform::log);
    EXPECT_NE(log.find("zone A: geometric mean"), nullptr);
}

TEST(OneWay, Refusals) {
    // A group without spread: Welch's weights n/s² are infinite.
    Groups g = named({{1, 2, 3}, {5, 5, 5}, {2, 4, 6}});
    try {
        compare_groups(g, "welch", Transform::none);
        FAIL();
    } catch (const Refusal& r) {
        EXPECT_EQ(std::string(r.what()).rfind("group 'zone B' has zero spread", 0), 0u) << r.what();
    }
    EXPECT_NO_THROW(compare_groups(g, "pooled", Transform::none));
    EXPECT_NO_THROW(compare_groups(g, "ranks", Transform::none));
    EXPECT_THROW(compare_groups(named({{1, 1}, {2, 2}, {3, 3}}), "pooled", Transform::none), Refusal);
    EXPECT_THROW(compare_groups(named({{1, 1}, {1, 1}, {1, 1}}), "ranks", Transform::none), Refusal);
    EXPECT_THROW(compare_groups(named({{1, 2}, {3}, {4, 5}}), "ranks", Transform::none), Refusal);
}

// Kruskal–Wallis with ties, by hand from the formula (Kruskal & Wallis 1952, eq. 1.1 and the tie
// correction 1 − Σ(t³−t)/(N³−N)): groups {1,2,2}, {2,3,4}, {4,5,6}; ranks 1, 3, 3 | 3, 5, 6.5 |
// 6.5, 8, 9; rank sums 7, 14.5, 23.5; H₀ = 12/90·(49 + 210.25 + 552.25)/3 − 30 = 6.0667;
// ties: t = 3 and 2 → Σ = 24 + 6 = 30, correction 1 − 30/720 = 0.958333; H = 6.330435.
TEST(OneWay, KruskalWallisTiesByHand) {
    const TestResult r = kruskal_wallis_test(std::vector<std::vector<double>>{{1, 2, 2}, {2, 3, 4}, {4, 5, 6}});
    EXPECT_NEAR(r.number("statistic"), 6.330435, 1e-6);
    EXPECT_NEAR(r.number("effect"), 6.330435 / 8, 1e-6);
}

// Huge values: F is unchanged when every value is multiplied by 1e300 (scale invariance, common
// practice). Tolerance 1e-12 relative.
TEST(OneWay, HugeValues) {
    std::vector<std::vector<double>> g = {{1.1, 2.3, 0.7}, {4.2, 3.3, 5.1}, {2.2, 2.9, 2.4}};
    const double f = classic_one_way_anova(g).number("statistic");
    const double fw = welch_one_way_anova(g).number("statistic");
    for (auto& group : g)
        for (double& x : group) x *= 1e300;
    EXPECT_NEAR(classic_one_way_anova(g).number("statistic"), f, 1e-12 * f);
    EXPECT_NEAR(welch_one_way_anova(g).number("statistic"), fw, 1e-12 * fw);
    EXPECT_TRUE(std::isfinite(classic_one_way_anova(g).number("p")));
}

}  // namespace
}  // namespace quadrat
