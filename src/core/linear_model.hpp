// The linear model by ordinary least squares (FIT.LINEAR) and the per-row quantities that its
// diagnostics are built from (leverage, residuals).
//
// Solved by Householder QR with column pivoting (Businger & Golub 1965, Numerische Mathematik 7,
// 269–276) on centred columns scaled by powers of two, with one step of iterative refinement of
// the residuals in extended precision (Björck 1967, BIT 7, 257–278): orthogonal methods keep the
// digits that the normal equations lose on badly scaled data (NIST StRD Longley, Filip, Wampler).
#pragma once

#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "cells.hpp"
#include "predictors.hpp"
#include "result.hpp"

namespace quadrat {

// A fitted linear model. Vectors over terms run intercept first (when fitted), then predictors in
// column order; vectors over rows follow the observations handed in.
struct LinearModel {
    bool intercept = true;
    std::vector<std::string> terms;      // "intercept", then the predictor names
    std::vector<double> estimate;
    std::vector<double> std_error;
    std::vector<double> t;               // NaN for a perfect fit (standard errors 0)
    std::vector<double> p;               // NaN for a perfect fit
    std::vector<double> vif;             // variance inflation factor; NaN for the intercept

    std::size_t n = 0;                   // observations used
    std::size_t parameters = 0;          // terms, the intercept included
    double df_model = 0;                 // predictors (F's first df)
    double df_residual = 0;              // n − parameters (F's second df)
    double rss = 0;                      // residual sum of squares
    double tss = 0;                      // total sum of squares: centred with an intercept, Σy² without
    double r_squared = 0;
    double r_squared_adjusted = 0;
    double f_statistic = 0;              // NaN for a perfect fit
    double f_p = 0;                      // NaN for a perfect fit
    double residual_sd = 0;              // residual standard deviation, √(rss / df_residual)
    double log_likelihood = 0;           // Gaussian, with its constants; NaN for a perfect fit
    double aic = 0;                      // −2 log L + 2 (parameters + 1): σ² counts as a parameter
    double bic = 0;                      // −2 log L + log(n) (parameters + 1)
    bool perfect_fit = false;            // residuals at the rounding level of the data: σ = 0

    std::vector<double> fitted;
    std::vector<double> residuals;
    std::vector<double> leverage;        // diagonal of the hat matrix

    // The fitted design B (centred predictors scaled by powers of two, and a constant column) and
    // G = P R⁻¹ with (BᵀB)⁻¹ = G Gᵀ, so that a new row's leverage ‖b G‖² keeps the digits that
    // xᵀ(XᵀX)⁻¹x in raw units would lose (FIT.PREDICT).
    double y_centre = 0;
    double constant_column = 0;          // the constant column's value (0 without intercept)
    std::vector<double> centre, scale;   // per predictor
    std::vector<double> solution;        // u: the coefficients of B, parameters values
    std::vector<double> inverse_factor;  // G, parameters × parameters, row-major

    // The fitted value ŷ(x) and the leverage h(x) = ‖b(x) G‖² of a new row x (one value per
    // predictor): Var(ŷ) = σ² h, Var(new reading − ŷ) = σ² (1 + h).
    double predicted_at(std::span<const double> x) const;
    double leverage_at(std::span<const double> x) const;

    // Confidence limits of term j at `level` (t with df_residual degrees of freedom).
    double ci_low(std::size_t j, double level) const;
    double ci_high(std::size_t j, double level) const;
};

// Least squares of y on the predictor columns (each with y.size() values), with or without an
// intercept. Refuses: no more observations than terms, a constant (or, without intercept, all-zero)
// predictor or response, and predictors that are linear combinations of one another (naming the
// column), rather than return numbers that mean nothing.
LinearModel fit_least_squares(std::span<const double> y, const std::vector<std::vector<double>>& predictors,
                              const std::vector<std::string>& names, bool intercept);

// y and xs read from the sheet for a regression function (FIT.LINEAR, FIT.POINTS, CHECK.REGRESSION):
// a row is used when y and every predictor hold a number.
struct RegressionData {
    std::vector<double> y;
    std::vector<std::vector<double>> predictors;  // one per term: a column of xs, or a factor's indicator
    std::vector<std::string> names;               // a text first row of xs, else x1, x2, …; `zone: high`
    std::vector<Factor> factors;                  // the label columns of xs (predictors.hpp)
    std::vector<int> factor_of_column;            // per column of xs: its index in factors, or −1
    std::vector<std::size_t> used_rows;           // range row of each observation
    std::size_t rows = 0;                         // rows of the input ranges, header included
    std::size_t n_dropped = 0;
    bool has_header = false;
};
RegressionData read_regression(const Range& y, const Range& xs);

// FIT.LINEAR's output keywords, default first.

// The `coefficients` table: header, then one row per term.
Table coefficient_table(const LinearModel& model, double level);

// The `model` quantities (r-squared, r-squared-adjusted, statistic, df, df2, p, residual-sd, aic, bic, n, n dropped) and the
// report sentence.
// The sentence ends with the slope and its interval where there is one numeric predictor
// (`with_slope` false where that one column is a factor's indicator: no slope to speak of).
TestResult model_summary(const LinearModel& model, std::size_t n_dropped, double level, bool with_slope = true);

// The joint F test of one factor's indicator columns, the factor adjusted for every other
// predictor: F = ((RSS without the factor − RSS) / q) / (RSS / df_residual) with q = its levels − 1
// (the extra-sum-of-squares principle, Draper & Smith 1998, Applied Regression Analysis, §6.1; with
// no interaction terms this is the type-2 test). NaN for a perfect fit.
std::vector<FactorTest> factor_tests(const LinearModel& model, const RegressionData& data);

// What FIT.LINEAR shows for `output` (already matched against the keyword table linear_outputs()):
// the `model` table adds `<factor>: F`, `<factor>: df`, `<factor>: p` per factor.
Table linear_output(const LinearModel& model, std::size_t n_dropped, const std::string& output, double level,
                    const std::vector<FactorTest>& factors = {});

}  // namespace quadrat
