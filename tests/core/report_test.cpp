// Report number formats: common practice in field reports, no single published source
// (FUNCTIONS.md, "Outputs"): p with three decimals, p < 0.001 below that, two decimals for
// statistics, three significant digits below 0.1, Welch df with one decimal.
#include <gtest/gtest.h>

#include "core/keywords.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "core/result.hpp"

namespace quadrat {
namespace {

TEST(ReportFormat, PValues) {
    EXPECT_EQ(format_p(0.0342), "p = 0.034");
    EXPECT_EQ(format_p(0.0021), "p = 0.002");
    EXPECT_EQ(format_p(0.00099), "p < 0.001");
    EXPECT_EQ(format_p(1.0), "p = 1.000");
}

TEST(ReportFormat, Numbers) {
    EXPECT_EQ(format_number(3.4129), "3.41");
    EXPECT_EQ(format_number(-0.1249), "-0.12");
    EXPECT_EQ(format_number(0.012345), "0.0123");
    EXPECT_EQ(format_number(0.00012345), "0.000123");
    EXPECT_EQ(format_number(0.0), "0.00");
    EXPECT_EQ(format_df(37.43), "37.4");
    EXPECT_EQ(format_df(38.0), "38");
    EXPECT_EQ(format_level(0.95), "95%");
    EXPECT_EQ(format_level(0.999), "99.9%");
}

TEST(Keywords, MatchIgnoringCaseAndDefaultWhenBlank) {
    const KeywordTable& methods = location_methods();
    EXPECT_EQ(methods.match("", "method", "welch"), "welch");
    EXPECT_EQ(methods.match("", "adjust", ""), "");
    EXPECT_EQ(methods.match(" Pooled ", "method", "welch"), "pooled");
    EXPECT_EQ(methods.index("RANKS", "method"), 2u);
    try {
        methods.match("anova", "method", "welch");
        FAIL();
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "unknown method 'anova'; valid: welch, pooled, ranks");
    }
}

TEST(SelectOutput, PicksQuantityTableOrRefuses) {
    TestResult r;
    r.test = "Welch two-sample t-test";
    r.add("statistic", 2.5).add("p", 0.03);
    const KeywordTable& outputs = test_outputs();
    EXPECT_EQ(std::get<double>(select_output(r, "", normality_outputs())[0][0]), 0.03);
    EXPECT_EQ(std::get<double>(select_output(r, "STATISTIC", outputs)[0][0]), 2.5);
    const Table t = select_output(r, "table", outputs);
    ASSERT_EQ(t.size(), 4u);
    EXPECT_EQ(std::get<std::string>(t[1][1]), "Welch two-sample t-test");
    EXPECT_THROW(select_output(r, "effect", outputs), Refusal);
    EXPECT_THROW(select_output(r, "bogus", outputs), Refusal);
}

// Number formats at the edges.
// The catalogue's rules (FUNCTIONS.md, "Outputs"): common practice, no source.

TEST(ReportFormatEdges, PValuesAroundTheThreshold) {
    EXPECT_EQ(format_p(0.001), "p = 0.001");
    EXPECT_EQ(format_p(0.0014999), "p = 0.001");
    EXPECT_EQ(format_p(0.00099999), "p < 0.001");
    EXPECT_EQ(format_p(0.0005), "p < 0.001");
    EXPECT_EQ(format_p(0.0), "p < 0.001");
    EXPECT_EQ(format_p(0.0344999), "p = 0.034");
    EXPECT_EQ(format_p(0.0345001), "p = 0.035");
    EXPECT_EQ(format_p(0.9996), "p = 1.000");
}

TEST(ReportFormatEdges, NumbersAroundTheSignificantDigitsRule) {
    // Just below 0.1, three significant digits would show 0.100: the two-decimal form instead.
    EXPECT_EQ(format_number(0.09999), "0.10");
    EXPECT_EQ(format_number(-0.09999), "-0.10");
    EXPECT_EQ(format_number(0.0999), "0.0999");
    // Rounding up across a power of ten keeps three significant digits.
    EXPECT_EQ(format_number(0.0099996), "0.0100");
    EXPECT_EQ(format_number(0.00099996), "0.00100");
    EXPECT_EQ(format_number(0.000099996), "1.00e-04");
    // Negative numbers carry an ASCII hyphen-minus (report.cpp).
    EXPECT_EQ(format_number(-13.8), "-13.80");
    EXPECT_EQ(format_number(-0.0456), "-0.0456");
    EXPECT_EQ(format_number(-0.0), "0.00");
    EXPECT_EQ(format_df(10.7053), "10.7");
    EXPECT_EQ(format_df(13.0), "13");
}

}  // namespace
}  // namespace quadrat
