// Regression diagnostics: per-row influence measures (FIT.POINTS) and the screening checks of
// CHECK.REGRESSION. Definitions follow Belsley, Kuh & Welsch (1980), Regression Diagnostics, Wiley,
// ch. 2, and Cook (1977), Technometrics 19, 15–18.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "cells.hpp"
#include "linear_model.hpp"

namespace quadrat {

// Per observation; NaN where a measure is not defined (σ = 0, leverage 1, or no degrees of
// freedom left once the row is deleted).
struct Influence {
    std::vector<double> standardized;  // internally studentized: e / (s √(1 − h))
    std::vector<double> studentized;   // externally studentized: e / (s₍ᵢ₎ √(1 − h))
    std::vector<double> cook;          // Cook's distance: r² h / (p (1 − h))
};
Influence influence_measures(const LinearModel& model);

// The header words of FIT.POINTS' six-column table, in the order of point_outputs().
const std::vector<std::string>& point_headers();

// FIT.POINTS: `output` empty gives all six columns under a header row (in place of the input's
// header row when it has one, else on top); a keyword gives that column alone with exactly the
// input's rows. Rows not used stay blank.
Table fit_points_table(const LinearModel& model, const RegressionData& data, const std::string& output);

// The numbers behind CHECK.REGRESSION's rows (NaN where a check could not be computed; `*_note`
// then says why).
struct ModelChecks {
    double normality_w = 0, normality_p = 0;       // Shapiro–Wilk on the residuals
    std::string normality_note;
    double spread_lm = 0, spread_p = 0, spread_df = 0;  // Breusch–Pagan, studentized (Koenker)
    std::string spread_note;
    bool ordered = false;           // an order was given: Durbin–Watson follows it
    double durbin_watson = 0;       // NaN without an order
    double reset_f = 0, reset_p = 0, reset_df = 0, reset_df2 = 0;  // RESET, fitted² and fitted³
    std::string linearity_note;
    double max_vif = 0;
    double max_cook = 0;
    double cook_cut = 0;              // median of F(p, n − p) (Cook & Weisberg 1982)
    std::size_t cook_above_cut = 0;   // rows above that median
    std::size_t cook_above = 0;       // rows with Cook's distance > 4/n (for information)
    std::size_t high_leverage = 0;    // rows with leverage > 2p/n (for information)
    std::size_t outliers = 0;         // rows with |externally studentized residual| > 3
};

// `order` (optional, the `order` argument: dates, times or distances, one per row of y) puts the
// rows used by the fit in sampling order for Durbin–Watson: sorted by order, ties kept in row
// order; a used row without a number there is a refusal. Omitted: no Durbin–Watson.
ModelChecks check_regression(const LinearModel& model, const RegressionData& data,
                             const Range& order = Range::omitted_argument());

// CHECK.REGRESSION's output keywords, default (`table`) first.
const std::vector<std::string>& check_regression_outputs();

// CHECK.REGRESSION: the table of checks, or one check's number. `order` as for check_regression.
Table check_regression_output(const LinearModel& model, const RegressionData& data, const std::string& output,
                              const Range& order = Range::omitted_argument());

}  // namespace quadrat
