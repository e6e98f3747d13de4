// The result of a test: its named numbers, the label/value table they make, and its report
// sentence. The glue picks what a cell shows by the `output` keyword without knowing the method.
#pragma once

#include <string>
#include <vector>

#include "cells.hpp"

namespace quadrat {

// One row of a label/value table: `p`, `df`, `high: variance`, …
struct Quantity {
    std::string label;
    CellValue value;
};

struct TestResult {
    std::string test;                  // the method's full name: first row under the header
    std::vector<Quantity> quantities;  // in table order
    std::string report;                // one sentence, empty when the function has none

    TestResult& add(std::string label, double value);
    TestResult& add(std::string label, std::string text);
    // The value of a quantity, or nullptr when the result has none of that label.
    const CellValue* find(const std::string& label) const;
    double number(const std::string& label) const;  // NaN when absent or not a number

    // header `quantity | value`, `test | <name>`, then one row per quantity.
    Table table() const;
};

// The output keywords shared by every test function (FUNCTIONS.md, "Outputs").
inline const std::vector<std::string>& standard_outputs() {
    static const std::vector<std::string> keys = {"p",       "statistic", "df",     "df2",   "n",     "estimate",
                                                  "ci-low", "ci-high",   "effect", "table", "report"};
    return keys;
}

// What a cell shows for `output`: a quantity's value, the whole table, or the report. `allowed`
// lists the keywords this function accepts (in the order a refusal lists them); an output that is
// allowed but that this particular result does not have is a refusal that says so.
Table select_output(const TestResult& result, const std::string& output, const std::vector<std::string>& allowed);

// A 1×1 table.
inline Table single(CellValue v) { return Table{{std::move(v)}}; }

}  // namespace quadrat
