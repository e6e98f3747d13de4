// The glue of the categorical family: arguments in, what the cell shows out, through the fence.
#include <gtest/gtest.h>

#include <cmath>
#include <variant>

#include "addin/registry.hpp"
#include "cell_calls.hpp"
#include "sheet_cells.hpp"

namespace quadrat::addin {
namespace {

using namespace quadrat::test_support;
// The cell helpers, not the declaration helpers of the same names (declare.hpp).
using quadrat::test_support::keyword;

// The blocks of these tests start at B2, so refusals name cells from there.
Range block_from_b2(std::size_t rows, std::size_t columns, std::vector<Cell> cells) {
    return block(rows, columns, std::move(cells), 1, 1);
}



// Agresti (2002), Categorical Data Analysis, §3.5.1, tea tasting (from memory): Fisher p = 0.486
// = 34/70 exactly; tolerance 1e-12.
TEST(CompareCountsFunction, BlockWithNamesAndMethod) {
    Range tea = block_from_b2(3, 3, {txt("guess"), txt("milk first"), txt("tea first"),
                             txt("milk first"), num(3), num(1),
                             txt("tea first"), num(1), num(3)});
    EXPECT_NEAR(number_of(call("compareCounts", {tea, omitted, keyword("Fisher"), omitted})), 34.0 / 70.0, 1e-12);
    // Common practice, no source: φ of this table is (9 − 1)/√(4·4·4·4) = 0.5; tolerance 1e-12.
    EXPECT_NEAR(number_of(call("compareCounts", {tea, omitted, keyword("fisher"), keyword("effect")})), 0.5, 1e-12);
    EXPECT_EQ(text_of(call("compareCounts", {tea, omitted, keyword("fisher"), keyword("statistic")})),
              "output 'statistic' is not available for Fisher's exact test");
    const Table table = call("compareCounts", {tea, omitted, omitted, keyword("table")});
    ASSERT_EQ(table.size(), 10u);
    EXPECT_EQ(std::get<std::string>(table[1][1]), "Pearson's chi-square test");
    EXPECT_EQ(std::get<std::string>(table[8][0]), "smallest expected count");
    EXPECT_EQ(std::get<double>(table[9][1]), 4.0);  // all four expected counts are 2
    EXPECT_EQ(text_of(call("compareCounts", {tea, omitted, omitted, keyword("report")})),
              "Pearson's chi-square test: χ²(1) = 2.00, p = 0.157, n = 8; φ = 0.50");
    EXPECT_EQ(text_of(call("compareCounts", {tea, omitted, keyword("exact"), omitted})),
              "unknown method 'exact'; valid: chi-square, yates, g, fisher");
}

TEST(CompareCountsFunction, TwoLabelColumns) {
    Range zone = Range::text_column({"zone", "low", "low", "high", "high", "low", "high", "-"});
    Range found = Range::text_column({"snail", "yes", "yes", "no", "no", "yes", "yes", "no"});
    // 2×2 [[3, 0], [1, 2]]: n = 6, one row dropped for the missing zone.
    EXPECT_EQ(number_of(call("compareCounts", {zone, found, omitted, keyword("n")})), 6.0);
    const Table t = call("compareCounts", {zone, found, omitted, keyword("table")});
    EXPECT_EQ(std::get<std::string>(t[6][0]), "n dropped");
    EXPECT_EQ(std::get<double>(t[6][1]), 1.0);
}

TEST(CompareExpectedFunction, SexRatioAndRefusals) {
    Range voles = block_from_b2(3, 1, {txt("voles"), num(58), num(42)});
    // scipy.stats.chisquare([58, 42]) 1.10 via tests/reference/generate_categorical.py: χ² = 2.56
    // exactly ((8² + 8²)/50); tolerance 1e-12.
    EXPECT_NEAR(number_of(call("compareExpected", {voles, omitted, keyword("statistic")})), 2.56, 1e-12);
    Range ratio = block_from_b2(1, 2, {num(1), num(1)});
    ratio.is_reference = false;  // an inline array {1, 1}
    EXPECT_NEAR(number_of(call("compareExpected", {voles, ratio, keyword("statistic")})), 2.56, 1e-12);
    EXPECT_EQ(text_of(call("compareExpected", {voles, omitted, keyword("effect")})),
              "unknown output 'effect'; valid: p, statistic, df, n, table, report");
    Range bad = block_from_b2(2, 1, {num(5), num(2.5)});
    EXPECT_EQ(text_of(call("compareExpected", {bad, omitted, omitted})),
              "B3 holds 2.5; counts must be whole numbers (use the raw counts, not percentages)");
}

TEST(FitLogisticFunction, CoefficientsModelAndRefusals) {
    // Invented: mussel present (1) at 12 sites against depth (m), outcomes overlapping.
    Range y = block_from_b2(13, 1, {txt("mussel"), num(0), num(0), num(1), num(0), num(0), num(1), num(0), num(1), num(1), num(0), num(1), num(1)});
    Range depth = block_from_b2(13, 1, {txt("depth"), num(0.3), num(0.5), num(0.6), num(0.9), num(1.1), num(1.2), num(1.6), num(1.8),
                                num(2.0), num(2.3), num(2.6), num(2.9)});
    const Table coefficients = call("fitLogistic", {y, depth, omitted, omitted});
    ASSERT_EQ(coefficients.size(), 3u);
    ASSERT_EQ(coefficients[0].size(), 8u);
    // FUNCTIONS.md, FIT.LOGISTIC: variable, coefficient, SE, z, p, odds ratio, ci-low, ci-high.
    const std::vector<std::string> header = {"variable", "coefficient", "SE", "z", "p", "odds ratio", "ci-low", "ci-high"};
    for (std::size_t c = 0; c < header.size(); ++c) EXPECT_EQ(std::get<std::string>(coefficients[0][c]), header[c]);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(coefficients[1][5]));  // no intercept odds ratio
    EXPECT_EQ(std::get<std::string>(coefficients[1][0]), "intercept");
    EXPECT_EQ(std::get<std::string>(coefficients[2][0]), "depth");
    // Common practice, no source: the odds ratio is e^estimate; tolerance 1e-12 relative.
    EXPECT_NEAR(std::get<double>(coefficients[2][5]), std::exp(std::get<double>(coefficients[2][1])),
                1e-12 * std::get<double>(coefficients[2][5]));
    const Table model = call("fitLogistic", {y, depth, keyword("MODEL"), omitted});
    ASSERT_EQ(model.size(), 13u);
    EXPECT_EQ(std::get<std::string>(model[2][0]), "event");
    EXPECT_EQ(std::get<std::string>(model[2][1]), "1");
    EXPECT_EQ(text_of(call("fitLogistic", {y, depth, keyword("r-squared"), omitted})),
              "unknown output 'r-squared'; valid: coefficients, model");
}

TEST(FitFactorialFunction, OutputsAndSums) {
    // Invented: shoot length (cm) by shade (open, shaded) and soil (clay, sand), 3 plants each,
    // with one more in one cell so that the design is unbalanced.
    Range length = block_from_b2(14, 1, {txt("length"), num(12), num(14), num(13), num(9), num(10), num(8), num(15), num(17),
                                 num(16), num(18), num(9), num(11), num(10)});
    Range shade = block_from_b2(14, 1, {txt("shade"), txt("open"), txt("open"), txt("open"), txt("shaded"), txt("shaded"), txt("shaded"),
                                txt("open"), txt("open"), txt("open"), txt("open"), txt("shaded"), txt("shaded"), txt("shaded")});
    Range soil = block_from_b2(14, 1, {txt("soil"), txt("clay"), txt("clay"), txt("clay"), txt("clay"), txt("clay"), txt("clay"),
                               txt("sand"), txt("sand"), txt("sand"), txt("sand"), txt("sand"), txt("sand"), txt("sand")});
    const Table t = call("fitFactorial", {length, shade, soil, omitted, omitted});
    ASSERT_EQ(t.size(), 5u);
    EXPECT_EQ(std::get<std::string>(t[1][0]), "shade");
    EXPECT_EQ(std::get<std::string>(t[3][0]), "shade × soil");
    const double p_interaction = number_of(call("fitFactorial", {length, shade, soil, keyword("p-interaction"), omitted}));
    EXPECT_EQ(p_interaction, std::get<double>(t[3][5]));
    // The interaction is adjusted for both main effects under either type: the same p (common
    // practice, no source: both compare the full model with the additive one); tolerance 1e-12.
    EXPECT_NEAR(number_of(call("fitFactorial", {length, shade, soil, keyword("p-interaction"), keyword("Type-3")})),
                p_interaction, 1e-12);
    EXPECT_EQ(number_of(call("fitFactorial", {length, shade, soil, keyword("p-factor1"), omitted})), std::get<double>(t[1][5]));
    EXPECT_EQ(number_of(call("fitFactorial", {length, shade, soil, keyword("p-factor2"), omitted})), std::get<double>(t[2][5]));
    EXPECT_EQ(text_of(call("fitFactorial", {length, shade, soil, omitted, keyword("3")})),
              "unknown sums '3'; valid: type-2, type-3");
    EXPECT_EQ(text_of(call("fitFactorial", {length, shade, soil, omitted, Range::scalar(num(3))})),
              "sums must be a keyword in quotes (a text, not a number)");
    EXPECT_EQ(text_of(call("fitFactorial", {length, shade, soil, keyword("p"), omitted})),
              "unknown output 'p'; valid: table, p-factor1, p-factor2, p-interaction");
}

}  // namespace
}  // namespace quadrat::addin
