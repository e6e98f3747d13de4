// Glue tests of COMPARE.GROUPS and COMPARE.PAIRED: cells in through the registry and the fence,
// what the cell shows out. Numbers are checked in the core tests; here the wiring and refusals.
#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "addin/registry.hpp"
#include "cell_calls.hpp"
#include "core/cells.hpp"

namespace quadrat::addin {
namespace {

using namespace quadrat::test_support;
// The cell helpers, not the declaration helpers of the same names (declare.hpp).
using quadrat::test_support::keyword;


// Long format with a header row, a dropped row (n/a) and an empty row: the catalogue's data rules.
Range nitrate_values() {
    Range r = Range::column({0, 1.2, 1.4, 0, 1.1, 1.6, 0.8, 0.7, 0.9, 1.0});
    r.cells[0] = Cell::make_text("nitrate");
    r.cells[3] = Cell::make_text("n/a");
    return r;
}
Range nitrate_groups() {
    return Range::text_column({"site", "up", "up", "up", "up", "up", "down", "down", "down", "down"});
}

TEST(CompareGroupsCell, DefaultIsWelchP) {
    const Table p = call("compareGroups", {nitrate_values(), nitrate_groups()});
    const double value = number_of(p);
    EXPECT_GT(value, 0.0);
    EXPECT_LT(value, 1.0);
    // n counts used rows (8), n dropped the n/a row (1): FUNCTIONS.md "Missing data".
    EXPECT_EQ(number_of(call("compareGroups", {nitrate_values(), nitrate_groups(), omitted, keyword("n")})), 8);
    const Table t = call("compareGroups", {nitrate_values(), nitrate_groups(), keyword("Pooled"), keyword("table")});
    ASSERT_GE(t.size(), 8u);
    EXPECT_EQ(std::get<std::string>(t[0][0]), "quantity");
    EXPECT_EQ(std::get<std::string>(t[1][1]), "Student's t-test (two groups, pooled variance)");
    EXPECT_EQ(std::get<std::string>(t[6][0]), "n dropped");
    EXPECT_EQ(std::get<double>(t[6][1]), 1.0);
    const std::string report = text_of(call("compareGroups", {nitrate_values(), nitrate_groups(), omitted, keyword("report")}));
    EXPECT_EQ(report.rfind("Welch's t-test (two groups): t(", 0), 0u) << report;
    EXPECT_NE(report.find("(up − down; 95% CI"), std::string::npos) << report;
}

TEST(CompareGroupsCell, RanksAndTransform) {
    const double u = number_of(call("compareGroups", {nitrate_values(), nitrate_groups(), keyword("ranks"), keyword("statistic")}));
    // U₁ of {1.2,1.4,1.1,1.6} against {0.8,0.7,0.9,1.0}: every "up" value beats every "down" one, U₁ = 16 (by hand).
    EXPECT_EQ(u, 16.0);
    const double ratio = number_of(call("compareGroups", {nitrate_values(), nitrate_groups(), omitted, keyword("estimate"), keyword("log")}));
    EXPECT_GT(ratio, 1.0);
}

TEST(CompareGroupsCell, Refusals) {
    EXPECT_EQ(text_of(call("compareGroups", {nitrate_values(), nitrate_groups(), keyword("anova")})),
              "unknown method 'anova'; valid: welch, pooled, ranks");
    EXPECT_EQ(text_of(call("compareGroups", {nitrate_values(), nitrate_groups(), omitted, keyword("slope")})).rfind("unknown output", 0), 0u);
    Range one = Range::text_column({"site", "up", "up", "up", "up", "up", "up", "up", "up", "up"});
    EXPECT_EQ(text_of(call("compareGroups", {nitrate_values(), one})).rfind("needs at least 2 groups", 0), 0u);
    // A refusal, never a number, when the transform cannot take a value.
    Range with_zero = nitrate_values();
    with_zero.cells[1] = Cell::make_number(0.0);
    EXPECT_EQ(text_of(call("compareGroups", {with_zero, nitrate_groups(), omitted, omitted, keyword("log")})).rfind("transform 'log'", 0), 0u);
    // Fewer arguments than the function has: the missing ones are omitted, not out of range.
    EXPECT_GT(number_of(call("compareGroups", {nitrate_values(), nitrate_groups()})), 0.0);
}

// Paired readings with header texts naming the two sides, a missing reading (dropped) and the
// one-sample form with a typed number in `second`.
Range before() {
    Range r = Range::column({0, 8.1, 7.9, 8.4, 0, 8.8, 7.6});
    r.cells[0] = Cell::make_text("above");
    r.cells[4] = Cell::make_text("-");
    return r;
}
Range after() {
    Range r = Range::column({0, 7.5, 7.7, 7.6, 7.0, 8.1, 7.5});
    r.cells[0] = Cell::make_text("below");
    return r;
}

TEST(ComparePairedCell, PairsAndOneSample) {
    const double p = number_of(call("comparePaired", {before(), after()}));
    EXPECT_GT(p, 0.0);
    EXPECT_LT(p, 1.0);
    EXPECT_EQ(number_of(call("comparePaired", {before(), after(), omitted, keyword("n")})), 5);
    // Mean of the 5 differences 0.6, 0.2, 0.8, 0.7, 0.1 = 0.48 (by hand). Tolerance 1e-12.
    EXPECT_NEAR(number_of(call("comparePaired", {before(), after(), keyword("t"), keyword("estimate")})), 0.48, 1e-12);
    const std::string report = text_of(call("comparePaired", {before(), after(), omitted, keyword("report")}));
    EXPECT_NE(report.find("(above − below; 95% CI"), std::string::npos) << report;
    // Sign test: 5 of 5 positive.
    EXPECT_EQ(number_of(call("comparePaired", {before(), after(), keyword("SIGN"), keyword("statistic")})), 5);
    // One sample: 5 used values of `above` against 8 (mean 8.16, by hand).
    EXPECT_NEAR(number_of(call("comparePaired", {before(), typed(8), omitted, keyword("estimate")})), 0.16, 1e-12);
    const Table t = call("comparePaired", {before(), typed(8), keyword("signed-rank"), keyword("table")});
    ASSERT_GE(t.size(), 3u);
    EXPECT_EQ(std::get<std::string>(t[1][1]).rfind("Wilcoxon one-sample signed-rank test", 0), 0u);
}

TEST(ComparePairedCell, Refusals) {
    EXPECT_EQ(text_of(call("comparePaired", {before(), omitted})).rfind("second is missing", 0), 0u);
    EXPECT_EQ(text_of(call("comparePaired", {before(), after(), keyword("wilcoxon")})),
              "unknown method 'wilcoxon'; valid: t, signed-rank, sign");
    EXPECT_EQ(text_of(call("comparePaired", {before(), keyword("seven")})).rfind("second must be", 0), 0u);
    Range short_after = Range::column({1, 2, 3});
    EXPECT_EQ(text_of(call("comparePaired", {before(), short_after})).find("same number of rows") != std::string::npos, true);
}

// Random sheets through the fence (common practice, no source): sizes 0 to 60, 1 to 25 groups,
// ties, missing cells, zeros, huge and denormal values, every method, transform and output. The
// answer is a number, a table or a refusal text, never an "internal error" (an escaped exception),
// and never a non-finite number, in a single cell or in a table.
TEST(CompareCellsRandom, NeverAnInternalErrorNorANonFiniteNumber) {
    std::mt19937 rng(20261202);
    const std::vector<double> specials = {0.0, 1.0, -1.0, 1e308, -1e308, 4.9e-324, 1e-300, 2.5, 2.5, 1e15 + 0.3};
    const std::vector<std::string> outputs = {"p", "statistic", "df", "df2", "n", "estimate", "ci-low", "ci-high",
                                              "effect", "table", "report"};
    auto check = [](const Table& t, const std::string& what) {
        for (const auto& row : t)
            for (const auto& cell : row) {
                if (const auto* x = std::get_if<double>(&cell)) {
                    EXPECT_TRUE(std::isfinite(*x)) << what;
                }
                if (const auto* s = std::get_if<std::string>(&cell)) {
                    EXPECT_EQ(s->find("internal error"), std::string::npos) << what << ": " << *s;
                }
            }
    };
    for (int trial = 0; trial < 2000; ++trial) {
        const std::size_t rows = std::uniform_int_distribution<std::size_t>(0, 60)(rng);
        const int k = std::uniform_int_distribution<int>(1, 25)(rng);
        std::vector<double> xs(rows), ys(rows);
        std::vector<std::string> labels(rows);
        for (std::size_t i = 0; i < rows; ++i) {
            const int kind = std::uniform_int_distribution<int>(0, 9)(rng);
            xs[i] = kind == 0 ? specials[rng() % specials.size()] : std::round(std::normal_distribution<double>(5, 2)(rng) * 10) / 10;
            ys[i] = kind == 1 ? specials[rng() % specials.size()] : xs[i] - std::round(std::normal_distribution<double>(0.3, 1)(rng) * 4) / 4;
            labels[i] = "g" + std::to_string(rng() % k);
        }
        Range values = Range::column(xs), second = Range::column(ys), groups = Range::text_column(labels);
        for (std::size_t i = 0; i < rows; ++i)
            if (rng() % 15 == 0) values.cells[i] = Cell::make_text("n/a");
        const std::string method = std::vector<std::string>{"welch", "pooled", "ranks"}[rng() % 3];
        const std::string paired = std::vector<std::string>{"t", "signed-rank", "sign"}[rng() % 3];
        const std::string transform = std::vector<std::string>{"none", "log", "log10", "log(x+1)", "sqrt"}[rng() % 5];
        const std::string output = outputs[rng() % outputs.size()];
        const std::string what = std::to_string(trial) + " " + method + "/" + paired + " " + transform + " " + output;
        check(call("compareGroups", {values, groups, keyword(method), keyword(output), keyword(transform)}), what);
        check(call("comparePaired", {values, second, keyword(paired), keyword(output), keyword(transform)}), what);
        check(call("comparePaired", {values, typed(xs.empty() ? 1.0 : xs[0]), keyword(paired), keyword(output), keyword(transform)}), what);
    }
}

// A caller that hands over fewer arguments than the registry lists (the office never does; a
// script or a test might) gets a refusal, never a read past the end (ASan watches this one).
TEST(FenceGlue, EveryFunctionWithTooFewArgumentsRefuses) {
    for (const Function* function : registry()) {
        const Function& f = *function;
        for (std::size_t given = 0; given < f.arguments.size(); ++given) {
            Arguments a;
            for (std::size_t i = 0; i < given; ++i) a.push_back(i == 0 ? Range::column({1, 2, 3, 4}) : omitted);
            const Table t = call_fenced(f, a);
            ASSERT_FALSE(t.empty()) << f.display_name;
            ASSERT_FALSE(t[0].empty()) << f.display_name;
            if (const auto* s = std::get_if<std::string>(&t[0][0]))
                EXPECT_EQ(s->rfind("internal error", 0), std::string::npos) << f.display_name << ": " << *s;
        }
    }
}

// ADJUST.P over a column under a title: the catalogue's header rule leaves the title's cell blank.
// Holm (1979) by hand on (0.01, 0.04, 0.03): sorted 0.01, 0.03, 0.04 → 3·0.01, 2·0.03, max(1·0.04,
// 0.06) = 0.03, 0.06, 0.06, in the cells' order 0.03, 0.06, 0.06. Tolerance 1e-15.
TEST(AdjustGlue, HeaderRowIsSkipped) {
    Range column = Range::column({0, 0.01, 0.04, 0.03});
    column.cells[0] = Cell::make_text("p");
    const Table t = call("adjustP", {column, omitted});
    ASSERT_EQ(t.size(), 4u);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[0][0]));
    EXPECT_NEAR(std::get<double>(t[1][0]), 0.03, 1e-15);
    EXPECT_NEAR(std::get<double>(t[2][0]), 0.06, 1e-15);
    EXPECT_NEAR(std::get<double>(t[3][0]), 0.06, 1e-15);
    // A text below the first row is no header: the refusal names it.
    column.cells[2] = Cell::make_text("n.s.");
    const Table refused = call("adjustP", {column, omitted});
    ASSERT_TRUE(std::holds_alternative<std::string>(refused[0][0]));
}

// Long format where no row keeps both a number and a label: the refusal says so (not "found 1 group
// (none)"), for the group tests and the pairs alike. FUNCTIONS.md refusal rule; text exact.
TEST(FenceGlue, NoUsableRowIsNamedAsSuch) {
    const Range values = Range::text_column({"n/a", "dry", "-"}), labels = Range::text_column({"a", "b", "a"});
    const std::string expected = "no row has both a number in values and a label in groups (3 rows dropped)";
    for (const char* f : {"compareGroups", "checkVariance", "comparePosthoc", "compareLetters", "checkNormal"}) {
        const Table t = call(f, {values, labels});
        ASSERT_TRUE(std::holds_alternative<std::string>(t[0][0])) << f;
        EXPECT_EQ(std::get<std::string>(t[0][0]), expected) << f;
    }
    // Wide format with a column of text only (found by the fuzzer: Dunn's z was undefined).
    Range wide = Range::column({10, -0.43});
    wide.columns = 2;
    wide.rows = 2;
    wide.cells = {Cell::make_number(10), Cell::make_text("n/a"), Cell::make_number(-0.43), Cell::make_text("dry")};
    EXPECT_EQ(std::get<std::string>(call("comparePosthoc", {wide, omitted, keyword("dunn")})[0][0]),
              "group 'column 2' has no values; every group needs at least 1");
    // Without groups the values themselves are what is empty.
    EXPECT_EQ(std::get<std::string>(call("checkNormal", {values})[0][0]), "values holds no numbers");
    // One value per group leaves no residual to test.
    EXPECT_EQ(std::get<std::string>(call("checkNormal", {Range::column({1.5, 2.5}), Range::text_column({"a", "b"})})[0][0]),
              "every group has a single value: residuals from group means need groups of 2 or more values");
}

}  // namespace
}  // namespace quadrat::addin
