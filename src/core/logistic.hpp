// Logistic regression for a binary response: maximum likelihood by Newton–Raphson (IRLS), Wald
// intervals for the odds ratios, the likelihood-ratio test of the whole model.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "cells.hpp"
#include "predictors.hpp"
#include "result.hpp"

namespace quadrat {

// The response coded 0/1 (1 = the event) and the predictor columns, rows aligned.
struct LogisticData {
    std::vector<double> y;
    std::vector<std::vector<double>> xs;  // per predictor, n values
    std::vector<std::string> names;       // per predictor: header text, else x1, x2, …; `zone: high`
    std::vector<Factor> factors;          // the label columns of xs, as indicator columns in xs
    std::string event;                    // the label modelled: "1" for a 0/1 response
    std::size_t n_dropped = 0;
    // With `trials`: y holds successes out of that many trials per row (seeds germinated out of
    // sown); empty for a 0/1 response (one trial per row).
    std::vector<double> trials;
};

// Reads `y` (0/1 numbers, or exactly two labels: the later one in case-insensitive character
// order is the event, `present` over `absent`) and `xs` (numeric columns; a text first row names
// them), with the catalogue's missing-data and header rules.
LogisticData read_logistic_data(const Range& y, const Range& xs);
// With `trials` (FIT.LOGISTIC's fifth argument): y holds successes, trials the number of trials of
// each row, whole numbers with 0 ≤ y ≤ trials; a row is used when y, trials and every predictor
// hold a number.
LogisticData read_logistic_data(const Range& y, const Range& xs, const Range& trials);

struct LogisticFit {
    std::vector<std::string> terms;  // "intercept", then the predictors
    std::vector<double> estimate, std_error, z, p;
    std::string event;
    double deviance = 0, null_deviance = 0;
    double lr_statistic = 0, df = 0, lr_p = 0;
    double aic = 0, pseudo_r_squared = 0;
    double n = 0, n_dropped = 0;
    int iterations = 0;
    std::vector<FactorTest> factor_tests;  // likelihood-ratio χ² per factor of xs
};

// Maximum-likelihood fit. Refuses too few rows, a constant or collinear predictor, and data where
// the outcome is (quasi-)completely separated, naming the predictor: the estimate does not exist
// there, and a huge coefficient would pretend that it does.
LogisticFit fit_logistic(const LogisticData& data);

// The outputs of FIT.LOGISTIC.
// `coefficients`: header row, then variable, coefficient, SE, z, p, odds ratio, ci-low, ci-high
// (Wald interval of the odds ratio at `level`) for each predictor; the intercept's odds-ratio
// cells stay blank.
Table logistic_coefficients(const LogisticFit& fit, double level);
// `model`: label/value table (model, event, deviance, null deviance, statistic, df, p, aic,
// pseudo-r-squared, n, n dropped, iterations, then `<factor>: χ²`, `: df`, `: p` per factor).
Table logistic_model(const LogisticFit& fit);

}  // namespace quadrat
