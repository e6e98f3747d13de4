// The data layer against the catalogue's rules (FUNCTIONS.md, "Missing data", "Group order").
// These are rules, not numbers: each expectation is read off the catalogue text.
#include <gtest/gtest.h>

#include "core/data.hpp"
#include "core/refusal.hpp"
#include "sheet_cells.hpp"

namespace quadrat {
namespace {

using test_support::num;
using test_support::txt;

Range mixed_column(const std::vector<Cell>& cells, std::size_t first_row = 1, std::size_t first_column = 1) {
    Range r;
    r.rows = cells.size();
    r.columns = 1;
    r.cells = cells;
    r.is_reference = true;
    r.first_row = first_row;
    r.first_column = first_column;
    return r;
}

TEST(MissingMarkers, AreRecognisedInAnyCaseAndWithSpaces) {
    for (const char* m : {"", "n/a", "N/A", "na", "NA", "-", "\xE2\x80\x94", "?", "missing", "Missing", " n/a "})
        EXPECT_TRUE(is_missing_marker(m)) << m;
    for (const char* m : {"high", "0", "nan", "none"}) EXPECT_FALSE(is_missing_marker(m)) << m;
}

TEST(NumberLabels, ShowAsTheOfficeSuiteShowsThem) {
    EXPECT_EQ(number_label(2), "2");
    EXPECT_EQ(number_label(2.5), "2.5");
    EXPECT_EQ(number_label(-0.0), "0");
}

TEST(ReadGroups, LongFormatKeepsFirstAppearanceOrderAndCountsDrops) {
    // Header row, a text value (n/a), a missing label (-), an entirely empty row, a number label.
    Range values = mixed_column({txt("mass_g"), num(1), num(2), txt("n/a"), num(4), Cell{}, num(6), num(7)});
    Range groups = mixed_column({txt("site"), txt("upper"), txt("lower"), txt("upper"), txt("-"), Cell{}, num(2), txt("upper")});
    const Groups g = read_groups(values, groups);
    EXPECT_TRUE(g.has_header);
    ASSERT_EQ(g.names, (std::vector<std::string>{"upper", "lower", "2"}));
    EXPECT_EQ(g.values[0], (std::vector<double>{1, 7}));
    EXPECT_EQ(g.values[1], (std::vector<double>{2}));
    EXPECT_EQ(g.values[2], (std::vector<double>{6}));
    EXPECT_EQ(g.n_used, 4u);
    EXPECT_EQ(g.n_dropped, 2u);  // the n/a value and the '-' label; the empty row is not counted
    EXPECT_EQ(g.row_group[0], no_group);
    EXPECT_EQ(g.row_group[7], 0u);
}

TEST(ReadGroups, WideFormatNamesColumnsFromTextFirstRow) {
    Range block;
    block.rows = 4;
    block.columns = 2;
    block.is_reference = true;
    block.cells = {txt("reed"), txt("sedge"), num(1), num(5), num(2), Cell{}, txt("n/a"), num(7)};
    const Groups g = read_groups(block, Range::omitted_argument());
    EXPECT_TRUE(g.wide);
    ASSERT_EQ(g.names, (std::vector<std::string>{"reed", "sedge"}));
    EXPECT_EQ(g.values[0], (std::vector<double>{1, 2}));
    EXPECT_EQ(g.values[1], (std::vector<double>{5, 7}));
    EXPECT_EQ(g.n_dropped, 1u);
}

TEST(ReadGroups, WideFormatWithoutHeaderUsesColumnNumbers) {
    Range block;
    block.rows = 2;
    block.columns = 2;
    block.cells = {num(1), num(5), num(2), num(6)};
    const Groups g = read_groups(block, Range::omitted_argument());
    EXPECT_EQ(g.names, (std::vector<std::string>{"column 1", "column 2"}));
}

TEST(ReadGroups, ErrorCellIsARefusalNamingTheCell) {
    // Range starts at B2 (row 1, column 1, zero-based); the error is its fourth cell: B5.
    Range values = mixed_column({num(1), num(2), num(3), Cell::make_error("#DIV/0!")});
    Range groups = mixed_column({txt("a"), txt("a"), txt("b"), txt("b")});
    try {
        read_groups(values, groups);
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "B5 holds an error (#DIV/0!)");
    }
}

TEST(ReadGroups, ShapeMismatchIsARefusal) {
    EXPECT_THROW(read_groups(Range::column({1, 2, 3}), Range::text_column({"a", "b"})), Refusal);
}

TEST(ReadFrame, AllLabelHeaderNeedsUniqueFirstTexts) {
    Range a = Range::text_column({"habitat", "reed", "sedge", "reed"});
    Range b = Range::text_column({"present", "yes", "no", "present"});  // 'present' repeats below: not a header
    const Frame f = read_frame({{&a, ColumnKind::label, "a"}, {&b, ColumnKind::label, "b"}});
    EXPECT_FALSE(f.has_header);
    EXPECT_EQ(f.n_used, 4u);
    Range c = Range::text_column({"occupied", "yes", "no", "yes"});
    const Frame g = read_frame({{&a, ColumnKind::label, "a"}, {&c, ColumnKind::label, "c"}});
    EXPECT_TRUE(g.has_header);
    EXPECT_EQ(g.n_used, 3u);
}

TEST(CellAddress, UsesBijectiveColumnLetters) {
    Range r;
    r.first_column = 27;  // AB
    r.first_row = 9;
    EXPECT_EQ(cell_address(r, 0, 0), "AB10");
    r.first_column = 25;
    EXPECT_EQ(cell_address(r, 2, 0), "Z12");
}

}  // namespace
}  // namespace quadrat
