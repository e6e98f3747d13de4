// DESCRIBE.GROUPS against NumPy and a 40-digit mpmath Student quantile
// (tests/reference/generate_describe.py → describe.json)
// and through the glue (registry, argument reading, fence).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <random>

#include "addin/registry.hpp"
#include "core/describe.hpp"
#include "core/refusal.hpp"
#include "core/summary.hpp"
#include "reference.hpp"

namespace quadrat {
namespace {

using namespace test_support;

double number_at(const Table& t, std::size_t row, std::size_t column) { return std::get<double>(t.at(row).at(column)); }

TEST(DescribeGroups, MatchesNumPyAndMpmath) {
    const auto& reference = reference_file("describe.json");
    for (const auto& c : reference["cases"]) {
        Groups g;
        for (const auto& group : c["groups"]) {
            g.names.push_back(group["name"]);
            g.values.push_back(group["values"].get<std::vector<double>>());
            g.n_used += g.values.back().size();
        }
        const Transform t = parse_transform(c["transform"]);
        const Table table = describe_groups(g, t, c["level"]);
        ASSERT_EQ(table.size(), g.names.size() + 1);
        for (std::size_t i = 0; i < g.names.size(); ++i) {
            const auto& r = c["groups"][i];
            const std::string what = std::string(c["data"]) + "/" + std::string(c["transform"]) + "/" + g.names[i];
            // Closed forms on a few values: agreement to 1e-12 relative (rounding only).
            EXPECT_EQ(number_at(table, i + 1, 1), r["n"].get<double>());
            expect_relative(number_at(table, i + 1, 2), r["centre"], 1e-12, what + " centre");
            // Columns (FUNCTIONS.md): group, n, mean, ci-low, ci-high, SD, SE, CV %, minimum, q1, median, q3, maximum.
            expect_relative(number_at(table, i + 1, 8), r["minimum"], 0, what + " minimum");
            // Quartiles as QUARTILE.INC (numpy.percentile, method "linear"): 1e-12 relative, rounding only.
            expect_relative(number_at(table, i + 1, 9), r["q1"], 1e-12, what + " q1");
            expect_relative(number_at(table, i + 1, 10), r["median"], 1e-12, what + " median");
            expect_relative(number_at(table, i + 1, 11), r["q3"], 1e-12, what + " q3");
            expect_relative(number_at(table, i + 1, 12), r["maximum"], 0, what + " maximum");
            if (r.contains("sd")) {
                expect_relative(number_at(table, i + 1, 5), r["sd"], 1e-12, what + " SD");
                expect_relative(number_at(table, i + 1, 6), r["se"], 1e-12, what + " SE");
                expect_relative(number_at(table, i + 1, 7), r["cv"], 1e-12, what + " CV %");
                // Student t quantile from Boost.Math against mpmath at 40 digits: rounding only, 1e-12.
                expect_relative(number_at(table, i + 1, 3), r["ci_low"], 1e-12, what + " ci-low");
                expect_relative(number_at(table, i + 1, 4), r["ci_high"], 1e-12, what + " ci-high");
            } else {
                // A single value has no SD: the cells are blank, not 0 and not an error.
                for (std::size_t col : {3, 4, 5, 6, 7}) EXPECT_TRUE(std::holds_alternative<std::monostate>(table[i + 1][col])) << what;
            }
        }
    }
}

TEST(DescribeGroups, HeaderFollowsTheCatalogue) {
    Groups g;
    g.names = {"a"};
    g.values = {{1, 2, 4}};
    g.n_used = 3;
    const std::vector<std::string> header = {"group",   "n",  "mean",   "ci-low", "ci-high", "SD",     "SE",
                                             "CV %",    "minimum", "q1", "median", "q3",     "maximum"};
    const Table t = describe_groups(g, Transform::none, 0.95);
    ASSERT_EQ(t[0].size(), header.size());
    for (std::size_t c = 0; c < header.size(); ++c) EXPECT_EQ(std::get<std::string>(t[0][c]), header[c]);
    // QUARTILE.INC by hand: positions 0.5 and 1.5 of (1, 2, 4) → 1.5 and 3.
    EXPECT_DOUBLE_EQ(std::get<double>(t[1][9]), 1.5);
    EXPECT_DOUBLE_EQ(std::get<double>(t[1][11]), 3.0);
}

TEST(DescribeGroups, HeaderNamesTheGeometricMeanUnderLog) {
    Groups g;
    g.names = {"a"};
    g.values = {{1, 10, 100}};
    g.n_used = 3;
    EXPECT_EQ(std::get<std::string>(describe_groups(g, Transform::none, 0.95)[0][2]), "mean");
    const Table t = describe_groups(g, Transform::log10, 0.95);
    EXPECT_EQ(std::get<std::string>(t[0][2]), "geometric mean");
    // Geometric mean of 1, 10, 100 is 10 exactly on paper; 1e-14 for rounding in log10/pow.
    EXPECT_NEAR(std::get<double>(t[1][2]), 10.0, 1e-13);
}

TEST(DescribeGroups, LogOfZeroIsARefusalCountingTheCells) {
    Groups g;
    g.names = {"a", "b"};
    g.values = {{0, 1, 2}, {-1, 3}};
    g.n_used = 5;
    try {
        describe_groups(g, Transform::log, 0.95);
        FAIL();
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "transform 'log' needs values > 0; 2 values are not");
    }
}

// Labels beside text only: the refusal names the dropped rows, as the group tests do (common
// practice, no source: the wording is ours).
TEST(DescribeGroups, LabelsWithoutNumbersSayWhichRowsWereDropped) {
    const Groups g = read_groups(Range::text_column({"n/a", "-", "dry"}), Range::text_column({"reed", "reed", "sedge"}));
    try {
        describe_groups(g, Transform::none, 0.95);
        FAIL();
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "no row has both a number in values and a label in groups (3 rows dropped)");
    }
}

TEST(Quantiles, BySelectionAreTheSortedOnesExactly) {
    // Common practice, no source: selection finds the same order statistics as a sort, so the
    // quartiles and the median equal quantile_of_sorted's bit for bit (ties, 1 to 3 values, even
    // and odd counts, probabilities that share an order statistic).
    std::mt19937 random(5122026);
    const std::vector<double> probabilities = {0.0, 0.25, 0.25, 0.3, 0.5, 0.75, 1.0};
    for (int trial = 0; trial < 200; ++trial) {
        std::vector<double> xs(1 + random() % (trial < 20 ? 3 : 500));
        for (double& x : xs) x = static_cast<double>(random() % (trial % 2 ? 7 : 100000)) / 8.0;
        std::vector<double> sorted = xs;
        std::sort(sorted.begin(), sorted.end());
        const std::vector<double> selected = quantiles_by_selection(xs, probabilities);
        for (std::size_t i = 0; i < probabilities.size(); ++i)
            ASSERT_EQ(selected[i], quantile_of_sorted(sorted, probabilities[i])) << trial << " p " << probabilities[i];
        ASSERT_EQ(median(sorted), median_of_sorted(sorted)) << trial;
    }
}

TEST(DescribeGroupsCell, ReadsLongFormatThroughTheRegistry) {
    const auto* f = addin::find_function("describeGroups");
    ASSERT_NE(f, nullptr);
    Range values = Range::column({1, 2, 3, 10, 20});
    values.cells.insert(values.cells.begin(), Cell::make_text("depth_cm"));
    values.rows = 6;
    Range groups = Range::text_column({"plot", "north", "north", "north", "south", "south"});
    const Table t = addin::call_fenced(*f, {values, groups, Range::omitted_argument(), Range::omitted_argument()});
    ASSERT_EQ(t.size(), 3u);
    EXPECT_EQ(std::get<std::string>(t[1][0]), "north");
    EXPECT_EQ(std::get<double>(t[1][2]), 2.0);
    EXPECT_EQ(std::get<double>(t[2][2]), 15.0);
}

TEST(DescribeGroupsCell, BadLevelAndKeywordAreRefusalTexts) {
    const auto* f = addin::find_function("describeGroups");
    const Range values = Range::column({1, 2, 3});
    const Table bad_level = addin::call_fenced(*f, {values, Range::omitted_argument(), Range::omitted_argument(), Range::scalar(Cell::make_number(120))});
    EXPECT_EQ(std::get<std::string>(bad_level[0][0]), "level must be a fraction such as 0.95 or a percentage from 50 to 99.9");
    const Table bad_transform = addin::call_fenced(*f, {values, Range::omitted_argument(), Range::scalar(Cell::make_text("ln")), Range::omitted_argument()});
    EXPECT_EQ(std::get<std::string>(bad_transform[0][0]), "unknown transform 'ln'; valid: none, log, log10, log(x+1), sqrt");
}

}  // namespace
}  // namespace quadrat
