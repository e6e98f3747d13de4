// Predictor columns as the models take them (FIT.LINEAR, FIT.POINTS, CHECK.REGRESSION,
// FIT.PREDICT, FIT.LOGISTIC, FIT.COUNTS): a column of numbers as it is; a column of labels (site,
// zone, treatment) as a factor, one 0/1 indicator column per level against its first level in
// group order (treatment coding), so that `zone and temperature` in xs is an analysis of
// covariance (Searle 1971, Linear Models, §8; Fox 2016, Applied Regression Analysis, §7.1).
#pragma once

#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "cells.hpp"
#include "data.hpp"

namespace quadrat {

// A label column of xs.
struct Factor {
    std::string name;                 // the column's header, else x1, x2, … by its place in xs
    std::vector<std::string> levels;  // in order of first appearance; levels[0] is the reference
    std::size_t first_term = 0;       // index of its first indicator among Predictors::columns
    std::size_t terms() const { return levels.size() - 1; }
};

struct Predictors {
    std::vector<std::vector<double>> columns;  // the design's columns (no intercept), one per term
    std::vector<std::string> names;            // per column: `depth`, or `zone: high` for an indicator
    std::vector<Factor> factors;               // the label columns of xs, in column order
    std::vector<int> factor_of_column;         // per column of xs: its index in `factors`, or −1
};

// A factor's joint test: F over its levels − 1 df (least squares), or the likelihood-ratio χ²
// (logistic and count models).
struct FactorTest {
    std::string name;
    double statistic = 0, df = 0, p = 0;
};

// The likelihood-ratio χ² of each factor, 2(ℓ − ℓ₋), ℓ₋ the model refitted without the factor's
// columns (`log_likelihood_without`, given the columns kept; it may refuse, e.g. a separation the
// smaller model has: that factor's row is then blank), on levels − 1 df (Agresti 2013,
// Categorical Data Analysis, §4.4.3; McCullagh & Nelder 1989, §4.4).
std::vector<FactorTest> likelihood_ratio_tests(const std::vector<Factor>& factors, std::size_t columns, double log_likelihood,
                                               const std::function<double(const std::vector<std::size_t>&)>& log_likelihood_without);

// The model table's rows per factor: `<factor>: <symbol>`, `<factor>: df`, `<factor>: p`; blank
// where a value is not defined.
void append_factor_rows(Table& model_table, const std::vector<FactorTest>& tests, const std::string& symbol);

// The indices of `columns` design columns without the terms of `factor` (for its joint test).
std::vector<std::size_t> columns_without(const Factor& factor, std::size_t columns);

// A column of xs is a factor when, below its first row, it holds at least one label text (not a
// missing marker, not a reading such as `<0.5` or `ND`) and no more numbers than texts; numbers in
// such a column are labels too (zone `2`). A column of numbers with a stray text stays numeric,
// the text read as missing, as in every value column.
bool is_factor_column(const Range& xs, std::size_t column);

// Response (and other per-row) blocks read side by side with xs: the frame holds `before`'s
// columns, then one column per column of xs, then `after`'s. Factor columns are read as labels.
struct ModelFrame {
    Frame frame;
    Predictors predictors;
    std::size_t xs_first = 0;  // index of xs's first column in the frame
};
ModelFrame read_model_frame(const std::vector<FrameBlock>& before, const Range& xs, const std::vector<FrameBlock>& after = {});

// New predictor rows laid out like xs (FIT.PREDICT's `at`), as design rows: nullopt for a row with
// a missing cell (it stays blank). The first row is a header when none of its cells could be a
// predictor value (a text other than a missing marker over a numeric column, a text that is no
// level over a factor). A factor level the data never had is refused by name and cell.
struct NewRows {
    std::vector<std::optional<std::vector<double>>> rows;  // one per row of the range
    bool has_header = false;
};
NewRows read_new_rows(const std::vector<Factor>& factors, const std::vector<int>& factor_of_column, const Range& at);

}  // namespace quadrat
