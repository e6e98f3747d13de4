// COMPARE.COUNTS and COMPARE.EXPECTED in the core: contingency tables, exact tests, goodness of fit.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "core/counts.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"
#include "sheet_cells.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("categorical.json"); }

ContingencyTable table_of(const nlohmann::json& rows) {
    ContingencyTable t;
    for (std::size_t i = 0; i < rows.size(); ++i) {
        t.row_names.push_back("r" + std::to_string(i + 1));
        std::vector<double> line;
        for (const auto& x : rows[i]) line.push_back(x.get<double>());
        t.counts.push_back(line);
    }
    for (std::size_t j = 0; j < rows[0].size(); ++j) t.column_names.push_back("c" + std::to_string(j + 1));
    return t;
}

// The blocks of these tests start at B2, so refusals name cells from there.
Range block_from_b2(std::size_t rows, std::size_t columns, std::vector<Cell> cells) {
    return block(rows, columns, std::move(cells), 1, 1);
}

// scipy.stats.chi2_contingency 1.10 (correction=False; correction=True; lambda_="log-likelihood",
// correction=False), scipy.stats.fisher_exact (two-sided), scipy.stats.contingency.association
// (Cramér) and, for r×c exact p, Freeman & Halton (1951) in exact fractions, all run by
// tests/reference/generate_categorical.py. Tolerance 1e-10 relative for the χ² statistics (closed
// forms in double precision) and 1e-9 for p-values (Boost's χ² and hypergeometric tails against
// SciPy's own; both near full precision); p below 1e-300 (SciPy underflows) within 1e-300.
TEST(CompareCounts, AgreesWithReferenceLibraries) {
    for (const auto& [name, entry] : reference()["counts"].items()) {
        const ContingencyTable t = table_of(entry["table"]);
        for (const char* method : {"chi-square", "yates", "g", "fisher"}) {
            if (!entry.contains(method)) continue;
            SCOPED_TRACE(name + " " + method);
            const TestResult r = compare_counts(t, method);
            const auto& want = entry[method];
            const double p_want = want["p"].get<double>();
            if (p_want < 1e-300)
                EXPECT_LT(r.number("p"), 1e-300);
            else
                EXPECT_LT(relative_error(r.number("p"), p_want), 1e-9) << r.number("p") << " vs " << p_want;
            if (want.contains("statistic")) {
                EXPECT_LT(relative_error(r.number("statistic"), want["statistic"].get<double>()), 1e-10);
                EXPECT_EQ(r.number("df"), want["df"].get<double>());
            }
            EXPECT_LT(relative_error(r.number("effect"), entry["effect"].get<double>()), 1e-10);
            EXPECT_EQ(r.number("n"), entry["n"].get<double>());
            EXPECT_LT(relative_error(r.number("smallest expected count"), entry["smallest expected count"].get<double>()), 1e-12);
            EXPECT_EQ(r.number("cells expected below 5"), entry["cells expected below 5"].get<double>());
        }
    }
}

// Agresti (2002), Categorical Data Analysis, 2nd ed., §3.5.1, tea-tasting worked example
// (from memory): 3 of 4 cups of each kind named correctly, two-sided Fisher p = 0.486.
// The closed form is (1 + 16 + 16 + 1)/70 = 34/70; tolerance 1e-12 (exact rational value).
TEST(CompareCounts, TeaTastingFisher) {
    EXPECT_NEAR(fisher_exact_2x2(3, 1, 1, 3), 34.0 / 70.0, 1e-12);
    // A perfect guess: only the observed table and its mirror are as extreme, 2/70.
    EXPECT_NEAR(fisher_exact_2x2(4, 0, 0, 4), 2.0 / 70.0, 1e-12);
    // The most probable table has p = 1 (common practice, no source: it is the definition).
    EXPECT_DOUBLE_EQ(fisher_exact_2x2(2, 2, 2, 2), 1.0);
}

// The r×c enumeration agrees with the 2×2 hypergeometric route on 2×2 tables (same definition,
// two algorithms; tolerance 1e-12 relative).
TEST(CompareCounts, FreemanHaltonReducesToFisherOn2x2) {
    for (auto t : std::vector<std::array<double, 4>>{{3, 1, 1, 3}, {0, 7, 5, 4}, {11, 9, 12, 15}, {18, 1, 10, 16}})
        EXPECT_LT(relative_error(fisher_exact_rxc({{t[0], t[1]}, {t[2], t[3]}}), fisher_exact_2x2(t[0], t[1], t[2], t[3])), 1e-12);
}

TEST(CompareCounts, LargeExactTableIsRefusedNotEnumeratedForever) {
    std::vector<std::vector<double>> big(6, std::vector<double>(6, 40.0));
    EXPECT_THROW(fisher_exact_rxc(big), Refusal);
    ContingencyTable t;
    t.row_names = {"a", "b", "c", "d", "e", "f"};
    t.column_names = t.row_names;
    t.counts = big;
    try {
        compare_counts(t, "fisher");
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_NE(std::string(r.what()).find("too large for Fisher's exact test"), std::string::npos) << r.what();
    }
}

TEST(CompareCounts, HugeCountsDoNotOverflow) {
    ContingencyTable t = table_of(reference()["counts"]["huge_2x2"]["table"]);
    const TestResult r = compare_counts(t, "chi-square");
    // scipy.stats.chi2_contingency 1.10 via the generator; tolerance 1e-10 relative.
    EXPECT_LT(relative_error(r.number("statistic"), reference()["counts"]["huge_2x2"]["chi-square"]["statistic"].get<double>()), 1e-10);
    EXPECT_EQ(r.number("p"), 0.0);
    EXPECT_EQ(r.number("n"), 4.2e9);
    // Above 2^30 observations the exact test is refused (Boost's margins are 32-bit).
    EXPECT_THROW(compare_counts(t, "fisher"), Refusal);
}

TEST(CompareCounts, ReadsABlockWithNamesAndRefusesBadCounts) {
    // Header row and first column of names; a trailing blank row (whole-column reference).
    Range b = block_from_b2(4, 3, {txt(""), txt("present"), txt("absent"),
                           txt("riffle"), num(23), num(9),
                           txt("pool"), num(12), num(21),
                           Cell{}, Cell{}, Cell{}});
    const ContingencyTable t = read_count_block(b);
    EXPECT_EQ(t.row_names, (std::vector<std::string>{"riffle", "pool"}));
    EXPECT_EQ(t.column_names, (std::vector<std::string>{"present", "absent"}));
    EXPECT_EQ(t.counts, (std::vector<std::vector<double>>{{23, 9}, {12, 21}}));

    auto refusal_of = [](const Range& r) {
        try {
            read_count_block(r);
        } catch (const Refusal& e) {
            return std::string(e.what());
        }
        return std::string("no refusal");
    };
    EXPECT_EQ(refusal_of(block_from_b2(2, 2, {num(3), num(-1), num(2), num(4)})),
              "C2 holds a negative count (-1); counts must be 0 or more");
    EXPECT_EQ(refusal_of(block_from_b2(2, 2, {num(3), num(1.5), num(2), num(4)})),
              "C2 holds 1.5; counts must be whole numbers (use the raw counts, not percentages)");
    EXPECT_EQ(refusal_of(block_from_b2(2, 2, {num(3), num(1), Cell{}, num(4)})), "B3 is empty; a count of none is entered as 0");
    EXPECT_EQ(refusal_of(block_from_b2(2, 2, {num(3), num(1), Cell::make_error("#DIV/0!"), num(4)})), "B3 holds an error (#DIV/0!)");
}

TEST(CompareCounts, RefusesTablesWithoutTwoCategoriesEachWay) {
    ContingencyTable one_row;
    one_row.row_names = {"all"};
    one_row.column_names = {"a", "b", "c"};
    one_row.counts = {{4, 5, 6}};
    EXPECT_THROW(compare_counts(one_row, ""), Refusal);

    ContingencyTable zero_column;
    zero_column.row_names = {"a", "b"};
    zero_column.column_names = {"x", "y", "z"};
    zero_column.counts = {{4, 0, 6}, {3, 0, 2}};
    try {
        compare_counts(zero_column, "");
        FAIL();
    } catch (const Refusal& r) {
        EXPECT_EQ(std::string(r.what()), "column 'y' has no observations (total 0); remove that category");
    }
    ContingencyTable three = zero_column;
    three.counts = {{4, 1, 6}, {3, 1, 2}};
    EXPECT_THROW(compare_counts(three, "yates"), Refusal);
    EXPECT_THROW(compare_counts(three, "loglinear"), Refusal);
}

TEST(CompareCounts, CrossTabulatesLabelsInOrderOfFirstAppearance) {
    Range zone = Range::text_column({"zone", "low", "high", "low", "n/a", "high", "low", ""});
    Range bird = Range::text_column({"species", "wren", "wren", "reed warbler", "wren", "reed warbler", "wren", ""});
    const ContingencyTable t = cross_tabulate(zone, bird);
    EXPECT_EQ(t.row_names, (std::vector<std::string>{"low", "high"}));
    EXPECT_EQ(t.column_names, (std::vector<std::string>{"wren", "reed warbler"}));
    EXPECT_EQ(t.counts, (std::vector<std::vector<double>>{{2, 1}, {1, 1}}));
    EXPECT_EQ(t.n_dropped, 1u);

    // A single category in the second column is a refusal.
    Range one = Range::text_column({"wren", "wren", "wren", "wren"});
    Range two = Range::text_column({"low", "high", "low", "high"});
    EXPECT_THROW(compare_counts(cross_tabulate(two, one), ""), Refusal);
}

// scipy.stats.chisquare 1.10 with the expected rescaled to the observed total, via the generator;
// tolerance 1e-12 relative for the statistic (closed form), 1e-10 for p.
TEST(CompareExpected, AgreesWithSciPy) {
    for (const auto& [name, entry] : reference()["expected"].items()) {
        SCOPED_TRACE(name);
        std::vector<double> observed = entry["observed"].get<std::vector<double>>(), expected;
        if (!entry["expected"].is_null()) expected = entry["expected"].get<std::vector<double>>();
        const TestResult r = compare_expected(observed, expected, 0);
        EXPECT_LT(relative_error(r.number("statistic"), entry["statistic"].get<double>()), 1e-12);
        EXPECT_LT(relative_error(r.number("p"), entry["p"].get<double>()), 1e-10);
        EXPECT_EQ(r.number("df"), entry["df"].get<double>());
        EXPECT_EQ(r.number("n"), entry["n"].get<double>());
        EXPECT_LT(relative_error(r.number("smallest expected count"), entry["smallest expected count"].get<double>()), 1e-12);
    }
}

// Counts near the largest double: their total overflows, and the χ² with it. A refusal, never an
// infinite statistic handed to the χ² distribution (found by the fuzzer; FUNCTIONS.md refusal rule).
TEST(CompareExpected, OverflowingCountsAreRefused) {
    EXPECT_THROW(compare_expected({1e308, 1e308, 5}, {}, 0), Refusal);
    EXPECT_THROW(compare_expected({1e308, 3}, {1e-308, 1e308}, 0), Refusal);
}

TEST(CompareExpected, ReadsHeaderAndDropsMissingCategories) {
    Range observed = block_from_b2(5, 1, {txt("voles"), num(58), num(42), Cell{}, Cell{}});
    Range ratio = Range::omitted_argument();
    const ExpectedInput in = read_expected_input(observed, ratio);
    EXPECT_EQ(in.observed, (std::vector<double>{58, 42}));
    EXPECT_TRUE(in.expected.empty());

    Range obs2 = block_from_b2(3, 1, {num(10), txt("n/a"), num(12)});
    Range exp2 = block_from_b2(1, 3, {num(1), num(1), num(2)});
    const ExpectedInput in2 = read_expected_input(obs2, exp2);
    EXPECT_EQ(in2.observed, (std::vector<double>{10, 12}));
    EXPECT_EQ(in2.expected, (std::vector<double>{1, 2}));
    EXPECT_EQ(in2.n_dropped, 1u);

    EXPECT_THROW(read_expected_input(block_from_b2(2, 1, {num(3), num(-2)}), ratio), Refusal);
    EXPECT_THROW(read_expected_input(obs2, block_from_b2(1, 2, {num(1), num(1)})), Refusal);
    EXPECT_THROW(read_expected_input(block_from_b2(2, 1, {num(3), num(2)}), block_from_b2(2, 1, {num(1), num(0)})), Refusal);
    EXPECT_THROW(compare_expected({7}, {}, 0), Refusal);
    EXPECT_THROW(compare_expected({0, 0}, {}, 0), Refusal);
}

}  // namespace
}  // namespace quadrat
