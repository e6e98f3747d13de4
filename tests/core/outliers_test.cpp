// CHECK.OUTLIERS: generalized ESD, Grubbs, Tukey's fences.
#include <gtest/gtest.h>

#include <cmath>
#include <numeric>
#include <random>
#include <vector>

#include "cell_calls.hpp"
#include "core/outliers.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "core/summary.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& rosner() { return reference_file("limits.json")["rosner"]; }

// NIST/SEMATECH e-Handbook §1.3.5.17, generalized ESD on Rosner's (1983) 54 values, up to 10
// outliers at α = 0.05: R1..R10 and λ1..λ10 as printed in the handbook's R listing for the section
// (values and digits stored in tests/reference/generate_limits.py, which recomputes them first), three
// outliers (6.01, 5.42, 5.34). Tolerance 5e-7: half a unit in the sixth printed decimal.
TEST(Outliers, RosnerExampleFromNist) {
    const std::vector<double> x = rosner()["values"].get<std::vector<double>>();
    const OutlierCheck c = check_outliers(x, "generalized-esd", 10, 0.95);
    ASSERT_EQ(c.suspects.size(), 10u);
    for (std::size_t i = 0; i < 10; ++i) {
        EXPECT_NEAR(c.suspects[i].statistic, rosner()["printed_R"][i].get<double>(), 5e-7) << "R" << i + 1;
        EXPECT_NEAR(c.suspects[i].critical, rosner()["printed_lambda"][i].get<double>(), 5e-7) << "lambda" << i + 1;
    }
    EXPECT_EQ(c.count, 3u);
    EXPECT_EQ(c.suspects[0].value, 6.01);
    EXPECT_EQ(c.suspects[1].value, 5.42);
    EXPECT_EQ(c.suspects[2].value, 5.34);
    EXPECT_TRUE(c.suspects[2].outlier);
    EXPECT_FALSE(c.suspects[3].outlier);
    // Default `most`: 10% of 54 rounded down = 5; the same three stand out.
    const OutlierCheck d = check_outliers(x, "", 0, 0.95);
    EXPECT_EQ(d.suspects.size(), 5u);
    EXPECT_EQ(d.count, 3u);
}

// Grubbs' two-sided statistic is the first ESD step and its critical value λ1 (same formula at i = 1):
// on Rosner's data G = 3.118906 against 3.158794 (the handbook's R1 and λ1, as above), so the single
// most extreme value, 6.01, does not stand out at α = 0.05 — masking by the next two, which is what
// the generalized test was made for. Tolerance 5e-7 as above.
TEST(Outliers, GrubbsOnRosnerData) {
    const std::vector<double> x = rosner()["values"].get<std::vector<double>>();
    const OutlierCheck c = check_outliers(x, "grubbs", 0, 0.95);
    ASSERT_EQ(c.suspects.size(), 1u);
    EXPECT_NEAR(c.suspects[0].statistic, 3.118906, 5e-7);
    EXPECT_NEAR(c.suspects[0].critical, 3.158794, 5e-7);
    EXPECT_EQ(c.suspects[0].value, 6.01);
    EXPECT_EQ(c.count, 0u);
    const std::string report = render_outlier_report(c);
    EXPECT_NE(report.find("no clear sign of an outlier (G = 3.12 against a critical 3.16)"), std::string::npos);
    EXPECT_NE(report.find("assumes the other values come from a normal distribution"), std::string::npos);
}

// Worked by hand: 1, 2, …, 10, 30 (n = 11). QUARTILE.INC positions (n − 1)·p: Q1 between the 3rd and
// 4th values = 3.5, Q3 between the 8th and 9th = 8.5, IQR 5, fences −4 and 16; 30 lies
// (30 − 8.5)/5 = 4.3 IQRs beyond Q3. Tolerance 1e-12 (exact arithmetic in binary).
TEST(Outliers, FencesByHand) {
    std::vector<double> x = {30, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10};
    const OutlierCheck c = check_outliers(x, "fences", 0, 0.95);
    ASSERT_EQ(c.count, 1u);
    EXPECT_EQ(c.suspects[0].index, 0u);
    EXPECT_NEAR(c.suspects[0].statistic, 4.3, 1e-12);
    EXPECT_EQ(c.suspects[0].critical, 1.5);
    EXPECT_NE(render_outlier_note(c).find("fences at -4.00 and 16.00"), std::string::npos);
    EXPECT_EQ(render_outlier_report(c),
              "Tukey's fences (1.5 × IQR), n = 11: 1 value beyond the fences (30.00); fences at -4.00 and 16.00 (quartiles ∓ 1.5 × "
              "IQR); a flagged value is one to check (a transcription slip, a fouled probe), not one to delete.");
}

// Flags sit beside the raw rows: values from rows 0, 2, 3 of a 5-row range (rows 1 and 4 empty);
// the flagged value in row 0 is marked and every other row is blank (common practice, no source).
TEST(Outliers, FlagsAlignWithRawRows) {
    std::vector<double> x = {30, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10};
    std::vector<std::size_t> rows(x.size());
    std::iota(rows.begin(), rows.end(), std::size_t{0});
    for (std::size_t i = 1; i < rows.size(); ++i) rows[i] += 1;  // one empty row after the first
    const OutlierCheck c = check_outliers(x, "fences", 0, 0.95);
    const Table flags = outlier_flags(c, rows, 13);
    ASSERT_EQ(flags.size(), 13u);
    EXPECT_EQ(std::get<std::string>(flags[0][0]), "outlier");
    for (std::size_t r = 1; r < 13; ++r) EXPECT_TRUE(std::holds_alternative<std::monostate>(flags[r][0])) << r;
    std::vector<std::string> cells;
    for (std::size_t r : rows) cells.push_back("B" + std::to_string(r + 2));
    const Table t = outlier_table(c, cells);
    // The catalogue's columns: cell, statistic, critical value, verdict; then the note row.
    ASSERT_EQ(t.size(), 3u);
    ASSERT_EQ(t[0].size(), 4u);
    EXPECT_EQ(std::get<std::string>(t[0][0]), "cell");
    EXPECT_EQ(std::get<std::string>(t[0][1]), "statistic");
    EXPECT_EQ(std::get<std::string>(t[0][2]), "critical value");
    EXPECT_EQ(std::get<std::string>(t[0][3]), "verdict");
    EXPECT_EQ(std::get<std::string>(t[1][0]), "B2");
    EXPECT_EQ(std::get<std::string>(t[1][3]), "outlier");
    EXPECT_EQ(std::get<std::string>(t[2][0]), "note");
}

// One value a million SDs out among 200 normal values: the downdated sums must still give each later
// step's R as a plain two-pass recomputation on the values left does (the refresh after the huge
// value leaves). Brute force in the test itself; tolerance 1e-10 relative.
TEST(Outliers, DowndateMatchesRecomputation) {
    std::mt19937_64 generator(7);
    std::normal_distribution<double> normal(50, 3);
    std::vector<double> x(200);
    for (double& v : x) v = normal(generator);
    x[17] = 3e9;
    x[80] = 80;
    const OutlierCheck c = check_outliers(x, "generalized-esd", 8, 0.95);
    std::vector<double> left = x;
    for (const Suspect& s : c.suspects) {
        const double m = mean(left);
        const double sd = std::sqrt(sum_of_squares(left, m) / static_cast<double>(left.size() - 1));
        std::size_t far = 0;
        for (std::size_t i = 1; i < left.size(); ++i)
            if (std::fabs(left[i] - m) > std::fabs(left[far] - m)) far = i;
        expect_relative(s.statistic, std::fabs(left[far] - m) / sd, 1e-10, "R");
        EXPECT_EQ(s.value, left[far]);
        left.erase(left.begin() + static_cast<std::ptrdiff_t>(far));
    }
    EXPECT_GE(c.count, 2u);
    EXPECT_TRUE(c.suspects[0].outlier);
}

// Refusals (the catalogue's limits: n ≥ 25 for the generalized ESD as Rosner advises, n ≥ 3 for
// Grubbs; our reading: at least 4 values and a nonzero IQR for fences, `most` a whole number up to
// half the values, and only with generalized-esd).
TEST(Outliers, Refusals) {
    const std::vector<double> x = rosner()["values"].get<std::vector<double>>();
    const std::vector<double> few(x.begin(), x.begin() + 24), equal(30, 1.5);
    EXPECT_NE(refusal_text([&] { check_outliers(few, "", 0, 0.95); }).find("at least 25 values (Rosner 1983), found 24"),
              std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(std::vector<double>{1, 2}, "grubbs", 0, 0.95); }).find("at least 3 values, found 2"), std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(equal, "", 0, 0.95); }).find("all values are equal"), std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(equal, "grubbs", 0, 0.95); }).find("all values are equal"), std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(equal, "fences", 0, 0.95); }).find("IQR = 0"), std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(x, "", 2.5, 0.95); }).find("most must be a whole number from 1 to 27"),
              std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(x, "", 28, 0.95); }).find("most must be"), std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(x, "grubbs", 3, 0.95); }).find("generalized-esd only"), std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(x, "dixon", 0, 0.95); }).find("valid: generalized-esd, grubbs, fences"),
              std::string::npos);
    EXPECT_NE(refusal_text([&] { check_outliers(x, "", 0, 2); }).find("level must be"), std::string::npos);
}

// Extreme cells: a number or a refusal, never a NaN statistic (what the fuzzer throws).
TEST(Outliers, ExtremeValues) {
    std::vector<double> x(30, 1e308);
    x[3] = -1e308;
    x[9] = 4.9e-324;
    for (const char* method : {"generalized-esd", "grubbs", "fences"}) {
        try {
            const OutlierCheck c = check_outliers(x, method, 0, 0.95);
            for (const Suspect& s : c.suspects) EXPECT_TRUE(std::isfinite(s.statistic) && std::isfinite(s.critical)) << method;
        } catch (const Refusal&) {
        }
    }
}

}  // namespace
}  // namespace quadrat

namespace quadrat {
namespace {

using test_support::call;
using test_support::keyword;
using test_support::text_of;

// Through the registry, as a cell: a header row, an `n/a` row and the fence-breaking 30 in a
// 14-row column. `flags` has exactly the input's 14 rows, `outlier` beside the 30 (row 4 of the
// range) and blank elsewhere, header and n/a rows included; the table names the cell B5 (the range
// starts at B2). Worked by hand as in FencesByHand (the same 11 values); common practice, no source.
TEST(Outliers, FlagsThroughTheRegistrySitBesideTheRawRows) {
    Range r = Range::column({0, 1, 2, 30, 3, 0, 4, 5, 6, 7, 8, 9, 10, 0});
    r.cells[0] = Cell::make_text("reading");
    r.cells[5] = Cell::make_text("n/a");
    r.cells[13] = Cell{};  // an empty row at the end: neither used nor dropped
    r.is_reference = true;
    r.first_row = 1;
    r.first_column = 1;
    const Table flags = call("checkOutliers", {r, keyword("fences")});
    ASSERT_EQ(flags.size(), 14u);
    for (std::size_t row = 0; row < 14; ++row) {
        if (row == 3) EXPECT_EQ(std::get<std::string>(flags[row][0]), "outlier");
        else EXPECT_TRUE(std::holds_alternative<std::monostate>(flags[row][0])) << row;
    }
    EXPECT_EQ(test_support::number_of(call("checkOutliers", {r, keyword("fences"), keyword("count")})), 1);
    const Table table = call("checkOutliers", {r, keyword("fences"), keyword("table")});
    ASSERT_EQ(table.size(), 3u);
    EXPECT_EQ(std::get<std::string>(table[1][0]), "B5");
    EXPECT_EQ(text_of(call("checkOutliers", {r})),
              "method generalized-esd needs at least 25 values (Rosner 1983), found 11; method grubbs tests the one most "
              "extreme value from 3 values");
}

}  // namespace
}  // namespace quadrat
