// CHECK.NORMAL, CHECK.VARIANCE and CHECK.QQ through the fence, as a cell calls them: ranges in,
// what the cell shows out. Numbers are checked against the core (same computation, exact), the
// layouts and refusal texts against FUNCTIONS.md.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <string>
#include <vector>

#include "addin/registry.hpp"
#include "cell_calls.hpp"
#include "core/cells.hpp"
#include "core/normality.hpp"

namespace quadrat::addin {
namespace {

using namespace quadrat::test_support;
// The cell helpers, not the declaration helpers of the same names (declare.hpp).
using quadrat::test_support::keyword;


// Invented: conductivity (µS/cm) at two springs, with a header row and one missing reading.
Range conductivity() {
    Range r = Range::column({0, 412, 398, 420, 405, 431, 415, 388, 402, 377, 395, 366, 380});
    r.cells[0] = Cell::make_text("conductivity");
    r.cells[5] = Cell::make_text("n/a");
    return r;
}
Range springs() {
    return Range::text_column({"spring", "east", "east", "east", "east", "east", "east", "west", "west", "west", "west",
                               "west", "west"});
}

TEST(CheckNormalCell, DefaultIsShapiroWilkP) {
    const Table t = call("checkNormal", {conductivity(), omitted, omitted, omitted});
    const std::vector<double> used = {412, 398, 420, 405, 415, 388, 402, 377, 395, 366, 380};
    // Same computation as the core (tests/core/normality_test.cpp checks the core's numbers).
    EXPECT_DOUBLE_EQ(number_of(t), shapiro_wilk(used).number("p"));
}

TEST(CheckNormalCell, TableWithGroupsHasPerGroupRows) {
    const Table t = call("checkNormal", {conductivity(), springs(), keyword("Shapiro-Wilk"), keyword("table")});
    ASSERT_EQ(t.size(), 2u + 4u + 4u);  // header, test, statistic, p, n, n dropped, 2 × (statistic, p)
    EXPECT_EQ(std::get<std::string>(t[0][0]), "quantity");
    EXPECT_EQ(std::get<std::string>(t[1][0]), "test");
    EXPECT_EQ(std::get<std::string>(t[2][0]), "statistic");
    EXPECT_EQ(std::get<std::string>(t[3][0]), "p");
    EXPECT_EQ(std::get<std::string>(t[4][0]), "n");
    EXPECT_EQ(std::get<double>(t[4][1]), 11);
    EXPECT_EQ(std::get<std::string>(t[5][0]), "n dropped");
    EXPECT_EQ(std::get<double>(t[5][1]), 1);
    EXPECT_EQ(std::get<std::string>(t[6][0]), "east: statistic");
    EXPECT_EQ(std::get<std::string>(t[7][0]), "east: p");
    EXPECT_EQ(std::get<std::string>(t[9][0]), "west: p");
    EXPECT_DOUBLE_EQ(std::get<double>(t[9][1]), shapiro_wilk(std::vector<double>{388, 402, 377, 395, 366, 380}).number("p"));
}

TEST(CheckNormalCell, EveryMethodAndOutput) {
    for (const char* method : {"shapiro-wilk", "shapiro-francia", "anderson-darling", "lilliefors", "dagostino-pearson", "jarque-bera"}) {
        for (const char* output : {"p", "statistic", "n"}) {
            const double x = number_of(call("checkNormal", {conductivity(), omitted, keyword(method), keyword(output)}));
            EXPECT_TRUE(std::isfinite(x)) << method << " " << output;
        }
        const std::string report = text_of(call("checkNormal", {conductivity(), omitted, keyword(method), keyword("report")}));
        EXPECT_NE(report.find("p = "), std::string::npos) << report;
    }
    EXPECT_EQ(number_of(call("checkNormal", {conductivity(), omitted, keyword("dagostino-pearson"), keyword("df")})), 2);
    EXPECT_EQ(text_of(call("checkNormal", {conductivity(), omitted, omitted, keyword("df")})),
              "output 'df' is not available for Shapiro–Wilk normality test");
}

TEST(CheckNormalCell, Refusals) {
    EXPECT_EQ(text_of(call("checkNormal", {Range::column({1, 2}), omitted, omitted, omitted})),
              "needs 3 to 5000 values, found 2");
    EXPECT_EQ(text_of(call("checkNormal", {Range::column({5, 5, 5, 5}), omitted, omitted, omitted})),
              "all 4 values are equal: a normality test needs values that vary");
    const std::string unknown = text_of(call("checkNormal", {conductivity(), omitted, keyword("kolmogorov"), omitted}));
    EXPECT_NE(unknown.find("shapiro-wilk"), std::string::npos) << unknown;
}

TEST(CheckNormalCell, WideFormatTestsResidualsFromColumnMeans) {
    Range wide;
    wide.rows = 5;
    wide.columns = 2;
    for (double x : {1.0, 10.0, 2.0, 12.0, 4.0, 11.0, 3.0, 15.0, 7.0, 13.0}) wide.cells.push_back(Cell::make_number(x));
    const Table t = call("checkNormal", {wide, omitted, omitted, keyword("n")});
    EXPECT_EQ(number_of(t), 10);
}

TEST(CheckVarianceCell, DefaultIsBrownForsytheP) {
    const Table p = call("checkVariance", {conductivity(), springs(), omitted, omitted});
    const Table f = call("checkVariance", {conductivity(), springs(), keyword("brown-forsythe"), keyword("p")});
    EXPECT_TRUE(std::isfinite(number_of(p)));
    EXPECT_EQ(number_of(p), number_of(f));
    EXPECT_EQ(number_of(call("checkVariance", {conductivity(), springs(), omitted, keyword("df2")})), 9);
    const Table t = call("checkVariance", {conductivity(), springs(), keyword("F-RATIO"), keyword("table")});
    ASSERT_EQ(t.size(), 2u + 6u + 4u + 1u);  // header, test, statistic, df, df2, p, n, n dropped, 2 × (n, variance), ratio
    EXPECT_EQ(std::get<std::string>(t[8][0]), "east: n");
    EXPECT_EQ(std::get<double>(t[8][1]), 5);
    EXPECT_EQ(std::get<std::string>(t[12][0]), "variance ratio");
    const std::string report = text_of(call("checkVariance", {conductivity(), springs(), keyword("bartlett"), keyword("report")}));
    EXPECT_NE(report.find("Bartlett"), std::string::npos) << report;
}

TEST(CheckVarianceCell, ThreeLabelsForFRatio) {
    const Range values = Range::column({1, 2, 3, 4, 5, 7, 2, 9, 4});
    const Range labels = Range::text_column({"high", "high", "high", "low", "low", "low", "mid", "mid", "mid"});
    EXPECT_EQ(text_of(call("checkVariance", {values, labels, keyword("f-ratio"), omitted})),
              "groups has 3 labels (high, low, mid); method 'f-ratio' compares exactly 2");
}

TEST(CheckQQCell, RowAlignedTwoColumnsBlankBeyondN) {
    const Table t = call("checkQq", {conductivity(), omitted});
    ASSERT_EQ(t.size(), 13u);  // as many rows as the input range, header and missing row included
    for (const auto& row : t) ASSERT_EQ(row.size(), 2u);
    // Φ⁻¹ at the Blom position (1 − 3/8)/(11 + 1/4): scipy.special.ndtri in generate_normality.py
    // (normality.json, case "normal n=11", first qq quantile), 1e-12 relative.
    std::ifstream in(std::string(QUADRAT_REFERENCE_DIR) + "/normality.json");
    const nlohmann::json fixture = nlohmann::json::parse(in);
    double smallest = NAN;
    for (const auto& c : fixture.at("normality"))
        if (c["name"] == "normal n=11") smallest = c["qq_quantiles"][0];
    EXPECT_NEAR(std::get<double>(t[0][0]), smallest, 1e-12 * std::fabs(smallest));
    EXPECT_EQ(std::get<double>(t[0][1]), 366);
    EXPECT_EQ(std::get<double>(t[10][1]), 420);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[11][0]));
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[12][1]));
}

TEST(CheckQQCell, WideFormatIsRefused) {
    Range wide;
    wide.rows = 3;
    wide.columns = 2;
    for (double x : {1.0, 10.0, 2.0, 12.0, 4.0, 11.0}) wide.cells.push_back(Cell::make_number(x));
    EXPECT_NE(text_of(call("checkQq", {wide, omitted})).find("one column"), std::string::npos);
}

TEST(CheckQQCell, WithGroupsPlotsResiduals) {
    const Table t = call("checkQq", {conductivity(), springs()});
    ASSERT_EQ(t.size(), 13u);
    double total = 0;
    for (std::size_t i = 0; i < 11; ++i) total += std::get<double>(t[i][1]);
    EXPECT_NEAR(total, 0.0, 1e-9);  // residuals from group means sum to zero (common practice, no source)
}

}  // namespace
}  // namespace quadrat::addin
