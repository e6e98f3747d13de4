// Counts: association between two categorical variables (contingency tables) and goodness of fit
// of one row of counts against expected proportions.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "cells.hpp"
#include "result.hpp"

namespace quadrat {

// A contingency table: counts[row][column], categories named and in sheet order.
struct ContingencyTable {
    std::vector<std::string> row_names;
    std::vector<std::string> column_names;
    std::vector<std::vector<double>> counts;
    std::size_t n_dropped = 0;  // label rows dropped for a missing label (cross-tabulation only)
};

// A block of counts. A text first row names the columns and a text first column names the rows
// (else `row 1`, `column 1`, …). Every count must be a non-negative whole number; anything else is
// a refusal naming the cell. Rows and columns with nothing in them (a whole-column reference) are
// skipped; an empty cell inside the table is a refusal (a zero must be entered as 0).
ContingencyTable read_count_block(const Range& block);

// Two label columns cross-tabulated (read with the catalogue's missing-data and header rules);
// categories in order of first appearance.
ContingencyTable cross_tabulate(const Range& labels1, const Range& labels2);

// The methods of COMPARE.COUNTS, default first.
// The outputs COMPARE.COUNTS and COMPARE.EXPECTED accept.

// Test of association on an r×c table by `method`: chi-square, yates, g, fisher.
TestResult compare_counts(const ContingencyTable& table, const std::string& method);

// Observed counts against expected proportions or counts (empty `expected`: equal shares), the
// expected rescaled to the observed total. `n_dropped` is carried into the table.
TestResult compare_expected(const std::vector<double>& observed, const std::vector<double>& expected,
                            std::size_t n_dropped);

// Reads COMPARE.EXPECTED's arguments: one row or one column each, an optional text header cell,
// trailing empty cells ignored; a category whose observed or expected cell is missing is dropped
// and counted. Observed counts must be non-negative whole numbers and expected values positive,
// else a refusal naming the cell. `expected` may be omitted (equal shares).
struct ExpectedInput {
    std::vector<double> observed;
    std::vector<double> expected;  // empty when omitted
    std::size_t n_dropped = 0;
};
ExpectedInput read_expected_input(const Range& observed, const Range& expected);

// Exact tests, exposed for their own tests.
// Two-sided p of Fisher's exact test on a 2×2 table [[a, b], [c, d]]: the sum of the
// hypergeometric probabilities no larger than the observed one (relative tolerance 1e-7).
double fisher_exact_2x2(double a, double b, double c, double d);
// Freeman–Halton extension to r×c by enumeration of all tables with the observed margins;
// a refusal when that would take more than `max_steps` steps (about a second).
double fisher_exact_rxc(const std::vector<std::vector<double>>& counts, double max_steps = 5e6);

}  // namespace quadrat
