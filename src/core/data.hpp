// The data layer: the catalogue's rules for missing cells, header rows, long and wide format and
// group order, applied once so that every function reads a sheet the same way.
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "cells.hpp"

namespace quadrat {

inline constexpr std::size_t no_group = static_cast<std::size_t>(-1);

// Missing markers of a label column: empty, n/a, na, -, —, ?, missing (any case, outer spaces ignored).
bool is_missing_marker(std::string_view text);

// A number used as a label (zone 2) shows as the office suite shows it: 2, 2.5, 1e-05.
std::string number_label(double x);

// A cell of a label column holds a label (a text other than a missing marker, or a number), and
// the label as a person reads it (a number as the office shows it, outer spaces trimmed).
bool is_label(const Cell& c);
std::string label_of(const Cell& c);

// The header rule (FUNCTIONS.md, "Missing data"), one column of a range at a time: a text that is
// not a missing marker in the first row is a header above a column holding a number below it (a
// value column), or, where every argument is a label column, when it appears nowhere else in its
// column. Every function reads headers by these two, never by a rule of its own.
bool is_header_text(const Cell& c);
bool numeric_column_has_header(const Range& r, std::size_t column);
bool label_column_has_header(const Range& r, std::size_t column);

// Values below a detection limit (FUNCTIONS.md revision 2, "Missing data"): a value cell holding
// `<` and a number (`<0.5`, `< 0.5`, `<0,5`) is censored at that limit; `<` without a number
// (`<DL`, `<RL`), `ND`, `n.d.`, `BDL` (any case) names a non-detect without its limit.
enum class CensoredText { no, censored, without_limit };
CensoredText censored_text(std::string_view text, double* limit = nullptr);

// The refusal for the cell at (row, column) of `r` when it holds a non-detect without its limit,
// or a censored value where `censored_allowed` is false; nothing otherwise.
void refuse_censored_cell(const Range& r, std::size_t row, std::size_t column, const std::string& argument,
                          bool censored_allowed);

// Every function outside *.CENSORED and TRACK.TREND: a refusal naming the first censored or
// non-detect cell of a value column (`B7 holds a value below a detection limit (<0.5); …`).
// `column` limits the scan to one column of the range (npos: all).
void refuse_censored_cells(const Range& r, const std::string& argument, std::size_t column = static_cast<std::size_t>(-1));

// How one argument's columns are read. `censored`: a value column where `<0.5` reads as 0.5 with
// its censored flag (the *.CENSORED functions and TRACK.TREND only); everywhere else a censored
// cell in a `numeric` column is a refusal.
enum class ColumnKind { numeric, label, censored };

// One argument block of a frame: a range whose columns are all read the same way, and the name
// the argument has in the catalogue (for refusal texts).
struct FrameBlock {
    const Range* range;
    ColumnKind kind;
    std::string argument;
};

// Several arguments read side by side, row by row. A row is used when every cell is present
// (a number in a numeric column, a non-missing label in a label column); a row that has
// anything in it but is not used is dropped; a row with nothing at all is neither.
struct Frame {
    std::vector<std::string> names;                  // per column: header text, or "" when none
    std::vector<ColumnKind> kinds;                   // per column
    std::vector<std::vector<double>> numbers;        // per column, n_used values (numeric columns)
    std::vector<std::vector<std::string>> labels;    // per column, n_used labels (label columns, LabelForm::texts)
    std::vector<std::vector<std::string>> levels;    // per column, its distinct labels in order of first use
    std::vector<std::vector<std::uint32_t>> codes;   // per column, n_used indices into levels (LabelForm::codes)
    std::vector<std::vector<bool>> censored;         // per column, n_used flags (censored columns)
    std::vector<std::size_t> used_rows;              // range row of each used observation
    std::size_t rows = 0;                            // rows in each input range, header included
    std::size_t n_used = 0;
    std::size_t n_dropped = 0;
    bool has_header = false;
};

// How read_frame gives back a label column: a text per used row (Frame::labels), or a code per
// used row into the column's distinct labels (Frame::codes), which needs no string per row.
enum class LabelForm { texts, codes };

// Reads the blocks (all with the same number of rows). A cell holding a formula error is a
// refusal naming the cell. The first row is a header per the catalogue's rule.
Frame read_frame(const std::vector<FrameBlock>& blocks, LabelForm form = LabelForm::texts);

// Groups of one numeric variable, in order of first appearance.
struct Groups {
    std::vector<std::string> names;
    std::vector<std::vector<double>> values;   // per group, in row order
    std::size_t n_used = 0;
    std::size_t n_dropped = 0;
    bool wide = false;
    bool labelled = false;  // long format: a groups range gave the labels
    bool has_header = false;
    // Read with read_censored_groups: per group, in row order, whether the value is a detection
    // limit (`<0.5` read as 0.5) rather than a measured value. Empty otherwise.
    std::vector<std::vector<bool>> censored;
    // Long format: for each row of the input range, the group of its used value (no_group when the
    // row is the header, dropped or empty) and the value. Lets row-aligned outputs sit beside the data.
    std::vector<std::size_t> row_group;
    std::vector<double> row_value;

    std::size_t group_count() const { return names.size(); }
};

// `values` with `groups` (long format), or `values` alone: one column is a single group (named by
// its header, else "values"); two or more columns are wide format (one group per column, named by a
// text first row, else "column 1", "column 2", …). Refusals name the arguments `values_name` and
// `groups_name` (ADVISE.TEST calls them response and predictor).
Groups read_groups(const Range& values, const Range& groups, const std::string& values_name = "values",
                   const std::string& groups_name = "groups");

// read_groups for the *.CENSORED functions and TRACK.TREND: `<0.5` is read as 0.5 with its
// censored flag (Groups::censored) instead of being refused; a non-detect without its limit is
// still refused.
Groups read_censored_groups(const Range& values, const Range& groups, const std::string& values_name = "values",
                            const std::string& groups_name = "groups");

// The refusal when a read left no usable row: in wide format (or without groups) the values hold
// no numbers; in long format no row has both a number and a label, whichever of the two is missing.
std::string no_usable_rows(const Groups& groups);

// Models (least squares, likelihood, two-way ANOVA) sum squares of the data: a variable whose
// largest magnitude is above 1e150 (its squares overflow) or below 1e-150 without being zero (they
// underflow) would read as infinite or constant. A refusal that names the variable and says to
// rescale it, instead of a false "is constant".
void refuse_beyond_model_scale(std::span<const double> values, const std::string& name);

// One numeric column (the `values` of a one-variable function).
struct Column {
    std::string name;
    std::vector<double> values;
    std::size_t n_used = 0;
    std::size_t n_dropped = 0;
};
Column read_column(const Range& values, const std::string& argument = "values");

// "B17" style refusal text for an error cell, or "values holds an error in row 3" for an array.
std::string error_cell_message(const Range& range, std::size_t row, std::size_t column,
                               const std::string& argument);

// ADJUST.P's cells: every number of a block of any shape with its position (row-major); blank
// cells and a header row (the header rule, per column) are skipped; text, an error or a number
// outside 0..1 is a refusal naming the cell.
struct Probabilities {
    std::vector<double> values;
    std::vector<std::size_t> positions;  // row * columns + column of each value
};
Probabilities read_probabilities(const Range& cells, const std::string& argument);

}  // namespace quadrat
