// The data layer against the catalogue's rules (FUNCTIONS.md, "Missing data", "Group order").
// These are rules, not numbers: each expectation is read off the catalogue text.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <unordered_map>

#include "core/counts.hpp"
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

TEST(ReadGroups, WideFormatRefusesTheFirstErrorInReadingOrderBeforeCensoredValues) {
    // Wide format reads row by row: the error in C3 (second column, first value row) comes before
    // the one in B4, and any error before the censored value in B2.
    Range block = test_support::block(4, 2, {txt("reed"), txt("sedge"), txt("<0.5"), num(5), num(2), Cell::make_error("#VALUE!"),
                                             Cell::make_error("#N/A"), num(7)},
                                      0, 1);
    try {
        read_groups(block, Range::omitted_argument());
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "C3 holds an error (#VALUE!)");
    }
    Range censored = test_support::block(3, 2, {txt("reed"), txt("sedge"), num(1), txt("ND"), txt("<0.5"), num(7)}, 0, 1);
    try {
        read_groups(censored, Range::omitted_argument());
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "C2 holds ND: write the detection limit as <0.5");
    }
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

TEST(ReadGroups, OuterSpacesNumbersAndMarkersReadAsLabelsAreRead) {
    // The catalogue: outer spaces ignored; a number label shows as the office shows it (so 2 and
    // the text "2" are one group, 0 and -0 too); a marker counts only as a whole, after trimming.
    Range values = mixed_column({txt("mass"), num(1), num(2), num(3), num(4), num(5), num(6), num(7), num(8), num(9), num(10)});
    Range groups = mixed_column({txt("site"), txt(" upper"), txt("upper  "), num(2), txt("2"), txt(" NA "), txt("\t-"),
                                 num(-0.0), txt("0"), txt("nan"), txt("n/a b")});
    const Groups g = read_groups(values, groups);
    ASSERT_EQ(g.names, (std::vector<std::string>{"upper", "2", "0", "nan", "n/a b"}));
    EXPECT_EQ(g.values[0], (std::vector<double>{1, 2}));
    EXPECT_EQ(g.values[1], (std::vector<double>{3, 4}));
    EXPECT_EQ(g.values[2], (std::vector<double>{7, 8}));
    EXPECT_EQ(g.values[3], (std::vector<double>{9}));
    EXPECT_EQ(g.values[4], (std::vector<double>{10}));
    EXPECT_EQ(g.n_dropped, 2u);  // ' NA ' and '\t-'
    EXPECT_EQ(g.row_group[5], no_group);
    EXPECT_EQ(g.row_group[8], 2u);
}

TEST(ReadGroups, AGroupTakesItsPlaceAtItsFirstUsedRow) {
    // 'lower' first appears on a row whose value is missing: its group comes after 'upper', where
    // it is first used (the catalogue's group order is by first appearance among the rows read).
    Range values = mixed_column({num(1), txt("n/a"), num(3), num(4)});
    Range groups = mixed_column({txt("middle"), txt("lower"), txt("upper"), txt("lower")});
    const Groups g = read_groups(values, groups);
    EXPECT_FALSE(g.has_header);
    EXPECT_EQ(g.names, (std::vector<std::string>{"middle", "upper", "lower"}));
    EXPECT_EQ(g.n_dropped, 1u);
}

// The rules applied cell by cell through is_label, label_of and the header rule, the way the data
// layer read cells before it judged each distinct label once: a reference for the reading below.
Groups grouped_cell_by_cell(const Range& values, const Range& groups) {
    Groups g;
    const bool header = numeric_column_has_header(values, 0);
    std::unordered_map<std::string, std::size_t> index;
    for (std::size_t row = header ? 1 : 0; row < values.rows; ++row) {
        const Cell& v = values.at(row, 0);
        const Cell& l = groups.at(row, 0);
        if (!(v.kind == CellKind::number && std::isfinite(v.number)) || !is_label(l)) {
            if (v.kind != CellKind::empty || l.kind != CellKind::empty) ++g.n_dropped;
            continue;
        }
        const auto [at, added] = index.try_emplace(label_of(l), g.names.size());
        if (added) {
            g.names.push_back(label_of(l));
            g.values.emplace_back();
        }
        g.values[at->second].push_back(v.number);
    }
    return g;
}

TEST(ReadGroups, ManyLabelsOfEveryLengthReadAsCellByCell) {
    // Common practice, no source: random columns of labels (1 to 40 characters, outer spaces,
    // markers, numbers, blanks; up to 300 distinct, past the short list the reading searches one by
    // one) grouped as the cell-by-cell reference groups them. Exact: both only copy values.
    std::mt19937 random(20261205);
    const std::vector<std::string> pieces = {"a", "reed", "upper site", "NA", "-", "", "  ", "x", "station 12 north bank"};
    for (int trial = 0; trial < 40; ++trial) {
        const std::size_t distinct = 1 + random() % 300;
        std::vector<Cell> labels;
        for (std::size_t k = 0; k < distinct; ++k) {
            switch (random() % 5) {
                case 0: labels.push_back(num(static_cast<double>(random() % 50) / 4.0)); break;
                case 1: labels.push_back(txt(pieces[random() % pieces.size()])); break;
                case 2: labels.push_back(txt(" " + pieces[random() % pieces.size()] + std::to_string(k % 7) + " ")); break;
                case 3: labels.push_back(txt(std::string(1 + random() % 40, static_cast<char>('a' + k % 26)) + std::to_string(k))); break;
                default: labels.push_back(Cell{}); break;
            }
        }
        const std::size_t rows = 1 + random() % 2000;
        std::vector<Cell> value_cells, label_cells;
        for (std::size_t row = 0; row < rows; ++row) {
            value_cells.push_back(random() % 10 == 0 ? txt("n/a") : num(static_cast<double>(row)));
            label_cells.push_back(labels[random() % labels.size()]);
        }
        const Range values = mixed_column(value_cells);
        const Range groups = mixed_column(label_cells);
        const Groups expected = grouped_cell_by_cell(values, groups);
        if (expected.names.empty()) continue;
        const Groups g = read_groups(values, groups);
        ASSERT_EQ(g.names, expected.names) << trial;
        ASSERT_EQ(g.values, expected.values) << trial;
        ASSERT_EQ(g.n_dropped, expected.n_dropped) << trial;
        // The same labels through the texts form of read_frame and the contingency table.
        const Frame f = read_frame({{&values, ColumnKind::numeric, "values"}, {&groups, ColumnKind::label, "groups"}});
        for (std::size_t i = 0; i < f.n_used; ++i) ASSERT_EQ(f.labels[1][i], label_of(groups.at(f.used_rows[i], 0))) << trial;
        const ContingencyTable t = cross_tabulate(groups, groups);
        ASSERT_EQ(t.row_names, t.column_names) << trial;
        for (std::size_t i = 0; i < t.row_names.size(); ++i)
            for (std::size_t j = 0; j < t.column_names.size(); ++j)
                if (i != j) {
                    ASSERT_EQ(t.counts[i][j], 0.0) << trial;
                }
    }
}

TEST(ReadFrame, TheFirstErrorOfTheFirstBlockIsRefusedBeforeAnyCensoredValue) {
    // The order of the refusals: errors before censored values, and in block order (values before
    // groups), whichever row comes first.
    Range values = mixed_column({num(1), txt("<0.5"), num(3), Cell::make_error("#N/A")});
    Range groups = mixed_column({txt("a"), Cell::make_error("#REF!"), txt("b"), txt("b")}, 1, 2);
    try {
        read_groups(values, groups);
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_STREQ(r.what(), "B5 holds an error (#N/A)");
    }
    Range clean = mixed_column({num(1), txt("<0.5"), num(3), txt("ND")});
    try {
        read_groups(clean, mixed_column({txt("a"), txt("a"), txt("b"), txt("b")}, 1, 2));
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_EQ(std::string(r.what()).rfind("B3 holds a value below a detection limit (<0.5)", 0), 0u) << r.what();
    }
}

TEST(ReadFrame, ALabelHeaderRepeatedAsANumberOrWithSpacesIsNoHeader) {
    Range a = Range::text_column({"2", "reed", "sedge", "reed"});
    Range b = mixed_column({txt("depth"), txt("1"), txt("3"), num(2)});
    EXPECT_TRUE(read_frame({{&a, ColumnKind::label, "a"}, {&b, ColumnKind::label, "b"}}).has_header);
    Range c = mixed_column({txt("2"), txt("x"), num(2), txt("y")});  // the number 2 shows as "2"
    EXPECT_FALSE(read_frame({{&a, ColumnKind::label, "a"}, {&c, ColumnKind::label, "c"}}).has_header);
    Range d = Range::text_column({"site", "north", " site ", "south"});  // ' site ' is 'site'
    EXPECT_FALSE(read_frame({{&d, ColumnKind::label, "d"}}).has_header);
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
