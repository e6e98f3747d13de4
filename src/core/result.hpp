// The result of a test: its named numbers, the label/value table they make, and the words of its
// report sentence (rendered by report.hpp from those numbers). The glue picks what a cell shows by
// the `output` keyword without knowing the method.
#pragma once

#include <string>
#include <vector>

#include "cells.hpp"
#include "keywords.hpp"

namespace quadrat {

// One row of a label/value table: `p`, `df`, `high: variance`, …
struct Quantity {
    std::string label;
    CellValue value;
};

// The words of a result's `report` sentence; every number in it is one of the result's named
// quantities, formatted by report.hpp. The form, filled in by report.cpp:
//   <test>: [<lead> = r (CI),] <statistic>(df, df2) = x, p[, n = N][; <estimate> e (<direction>; CI)]
//   [, <effect> = g][; <extra words> v][; <per-group words> group v, …][ (<closing>)]
struct ReportWords {
    bool shown = false;          // false: the function has no sentence
    // A number named before the statistic, with its interval where it has one: `r`, `R²`, `τ`.
    std::string lead_symbol, lead_quantity;
    bool lead_interval = false;
    // How the statistic shows: `t(9.7) = 3.50`; `U = 49` (whole); `8 of 9 differences positive`;
    // nothing (an exact test without a statistic).
    enum class Statistic { none, number, whole, positive_count } statistic_form = Statistic::number;
    std::string statistic_symbol;  // t, F, χ², G, H, W, W′, A², D, K², JB, T⁺, z, U
    bool statistic_df = false;     // t(df), F(df, df2)
    bool n_after_p = false;        // ", n = 20"
    std::string estimate;          // "mean difference", "Hodges–Lehmann shift", "slope"; empty: none
    std::string estimate_quantity = "estimate";  // its quantity, with `ci-low`/`ci-high` beside it
    std::string direction;         // "riffle − pool"; empty: none
    std::string effect;            // "Hedges' g", "ω²", "φ"; empty: none
    std::string extra, extra_quantity;  // "largest variance over smallest", "variance ratio"
    // One value per group after those: "; Kaplan–Meier medians upstream 0.70, pond <0.5", from the
    // quantities labelled "<group>: <per_group_quantity>" in table order; a blank one shows the
    // text of the unlisted quantity "<group>: <per_group_quantity> bound" ("<0.5").
    std::string per_group, per_group_quantity;
    std::string note;              // in place of the statistic part when the numbers are not defined
    std::string closing;           // design words in parentheses at the end: "(4 groups; 4 blocks used)"
    std::string title;             // the sentence's title when it is shorter than the test's name
    double level = 0.95;
};

struct TestResult {
    std::string test;                  // the method's full name: first row under the header
    std::vector<Quantity> quantities;  // in table order
    std::vector<Quantity> unlisted;    // named numbers the sentence uses that the table does not list
    ReportWords words;                 // the report sentence's words

    TestResult& add(std::string label, double value);
    TestResult& add(std::string label, std::string text);
    // The value of a quantity (listed or not), or nullptr when the result has none of that label.
    const CellValue* find(const std::string& label) const;
    double number(const std::string& label) const;  // NaN when absent or not a number

    // header `quantity | value`, `test | <name>`, then one row per quantity.
    Table table() const;
};

// What a cell shows for `output`: a quantity's value, the whole table, or the report. `allowed`
// lists the keywords this function accepts (in the order a refusal lists them); an output that is
// allowed but that this particular result does not have is a refusal that says so.
Table select_output(const TestResult& result, const std::string& output, const KeywordTable& allowed);

// A 1×1 table.
inline Table single(CellValue v) { return Table{{std::move(v)}}; }

}  // namespace quadrat
