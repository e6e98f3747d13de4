// Values below a detection limit, the data layer's rule (FUNCTIONS.md revision 2, "Missing data"):
// `<0.5` is censored; every function outside *.CENSORED and TRACK.TREND refuses it naming the
// cell; a non-detect without its limit is refused everywhere; a label column is unaffected; the
// censored reader gives the limit as the value with its flag. Behaviour checks, no numbers from a
// source.
#include <gtest/gtest.h>

#include "cell_calls.hpp"
#include "core/data.hpp"
#include "core/refusal.hpp"
#include "sheet_cells.hpp"

namespace quadrat {
namespace {

using namespace quadrat::test_support;

std::string refusal_of(const std::function<void()>& f) {
    try {
        f();
    } catch (const Refusal& r) {
        return r.what();
    }
    return "(no refusal)";
}

TEST(CensoredCells, TextsAreReadAsTheCatalogueSays) {
    double limit = 0;
    EXPECT_EQ(censored_text("<0.5", &limit), CensoredText::censored);
    EXPECT_EQ(limit, 0.5);
    EXPECT_EQ(censored_text(" < 0.5 ", &limit), CensoredText::censored);
    EXPECT_EQ(limit, 0.5);
    EXPECT_EQ(censored_text("<0,5", &limit), CensoredText::censored);  // a comma-decimal locale
    EXPECT_EQ(limit, 0.5);
    EXPECT_EQ(censored_text("<12", &limit), CensoredText::censored);
    EXPECT_EQ(limit, 12.0);
    for (const char* without : {"<DL", "<RL", "<", "ND", "nd", "n.d.", "N.D.", "BDL", "bdl"})
        EXPECT_EQ(censored_text(without), CensoredText::without_limit) << without;
    for (const char* other : {"n/a", "", "missing", "high", "0.5", "5<6", "NDVI"})
        EXPECT_EQ(censored_text(other), CensoredText::no) << other;
}

// Long format with a header, the censored value in B7 (sheet rows from B2).
Range nitrate_with(const std::string& text) {
    std::vector<Cell> cells = {txt("nitrate"), num(1.2), num(0.9), num(1.4), num(1.1), txt(text), num(0.8), num(1.3)};
    return block(8, 1, cells, 1, 1);
}
Range sites() {
    return block(8, 1, {txt("site"), txt("a"), txt("a"), txt("a"), txt("b"), txt("b"), txt("b"), txt("b")}, 1, 0);
}

TEST(CensoredCells, EveryOtherFunctionRefusesNamingTheCell) {
    EXPECT_EQ(refusal_of([] { read_groups(nitrate_with("<0.5"), sites()); }),
              "B7 holds a value below a detection limit (<0.5); leaving it out would bias the result upward: use "
              "DESCRIBE.CENSORED or COMPARE.CENSORED");
    EXPECT_EQ(refusal_of([] { read_groups(nitrate_with("ND"), sites()); }), "B7 holds ND: write the detection limit as <0.5");
    EXPECT_EQ(refusal_of([] { read_column(nitrate_with("<DL")); }), "B7 holds <DL: write the detection limit as <0.5");
    // Through a cell function: the same text in the cell.
    EXPECT_EQ(text_of(call("compareGroups", {nitrate_with("< 0,5"), sites()})),
              "B7 holds a value below a detection limit (< 0,5); leaving it out would bias the result upward: use "
              "DESCRIBE.CENSORED or COMPARE.CENSORED");
    EXPECT_EQ(text_of(call("checkNormal", {nitrate_with("n.d.")})), "B7 holds n.d.: write the detection limit as <0.5");
    // Wide format too.
    const Range wide = block(3, 2, {txt("a"), txt("b"), num(1), num(2), txt("<1"), num(3)}, 1, 1);
    EXPECT_EQ(refusal_of([&] { read_groups(wide, Range::omitted_argument()); }),
              "B4 holds a value below a detection limit (<1); leaving it out would bias the result upward: use "
              "DESCRIBE.CENSORED or COMPARE.CENSORED");
}

TEST(CensoredCells, LabelColumnsAreUnaffected) {
    const Range values = block(5, 1, {txt("depth"), num(1), num(2), num(3), num(4)}, 1, 1);
    const Range labels = block(5, 1, {txt("class"), txt("<0.5"), txt("<0.5"), txt("ND"), txt("ND")}, 1, 0);
    const Groups g = read_groups(values, labels);
    EXPECT_EQ(g.names, (std::vector<std::string>{"<0.5", "ND"}));
    EXPECT_EQ(g.n_used, 4u);
}

TEST(CensoredCells, TheCensoredReaderGivesTheLimitAndItsFlag) {
    const Groups g = read_censored_groups(nitrate_with("<0.5"), sites());
    ASSERT_EQ(g.group_count(), 2u);
    EXPECT_EQ(g.values[1], (std::vector<double>{1.1, 0.5, 0.8, 1.3}));
    ASSERT_EQ(g.censored.size(), 2u);
    EXPECT_EQ(g.censored[0], (std::vector<bool>{false, false, false}));
    EXPECT_EQ(g.censored[1], (std::vector<bool>{false, true, false, false}));
    EXPECT_TRUE(g.has_header);
    // A non-detect without its limit is refused by the censored reader too.
    EXPECT_EQ(refusal_of([] { read_censored_groups(nitrate_with("BDL"), sites()); }),
              "B7 holds BDL: write the detection limit as <0.5");
    // Wide format: one group per column, flags beside the values.
    const Range wide = block(3, 2, {txt("up"), txt("down"), txt("<1"), num(2), num(1.5), txt("<0,2")}, 1, 1);
    const Groups w = read_censored_groups(wide, Range::omitted_argument());
    EXPECT_EQ(w.names, (std::vector<std::string>{"up", "down"}));
    EXPECT_EQ(w.values[1], (std::vector<double>{2, 0.2}));
    EXPECT_EQ(w.censored[0], (std::vector<bool>{true, false}));
    EXPECT_EQ(w.censored[1], (std::vector<bool>{false, true}));
}

TEST(CensoredCells, AFrameAlignsCensoredValuesWithOtherColumns) {
    const Range times = block(5, 1, {txt("year"), num(2019), num(2020), num(2021), num(2022)}, 1, 0);
    const Range conc = block(5, 1, {txt("lead"), num(3.1), txt("<2"), txt("n/a"), num(2.4)}, 1, 1);
    const Frame f = read_frame({{&conc, ColumnKind::censored, "values"}, {&times, ColumnKind::numeric, "times"}});
    EXPECT_EQ(f.n_used, 3u);
    EXPECT_EQ(f.n_dropped, 1u);
    EXPECT_EQ(f.numbers[0], (std::vector<double>{3.1, 2, 2.4}));
    EXPECT_EQ(f.censored[0], (std::vector<bool>{false, true, false}));
    EXPECT_EQ(f.numbers[1], (std::vector<double>{2019, 2020, 2022}));
    EXPECT_EQ(f.names[0], "lead");
}

// The header rule, once for every function: `n/a` in the first row is a missing marker, not a
// header (FUNCTIONS.md, "Missing data"), in ADJUST.P as everywhere.
TEST(HeaderRule, MissingMarkerInTheFirstRowIsNotAHeader) {
    const Range with_title = block(3, 1, {txt("p-value"), num(0.01), num(0.04)}, 0, 0);
    EXPECT_TRUE(numeric_column_has_header(with_title, 0));
    const Range with_marker = block(3, 1, {txt("n/a"), num(0.01), num(0.04)}, 0, 0);
    EXPECT_FALSE(numeric_column_has_header(with_marker, 0));
    EXPECT_EQ(text_of(call("adjustP", {with_marker, omitted})), "A1 holds text ('n/a'); pvalues takes p-values from 0 to 1 or blank cells");
    const Table titled = call("adjustP", {with_title, omitted});
    ASSERT_EQ(titled.size(), 3u);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(titled[0][0]));
}

}  // namespace
}  // namespace quadrat
