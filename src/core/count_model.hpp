// Count regression (FIT.COUNTS): log-linear Poisson and negative binomial (NB2) models of counts
// per sampling unit, with sampling effort (trap-nights, minutes, area) as a log offset, so that
// what is modelled is a rate: log E[count] = log(effort) + β₀ + β₁x₁ + …
//
// Poisson by iteratively reweighted least squares (McCullagh & Nelder 1989, Generalized Linear
// Models, 2nd ed., §2.5 and §6.2). The negative binomial in its NB2 form, Var = μ + μ²/k, with
// β and the aggregation k (ecologists' clumping parameter) by maximum likelihood (Lawless 1987,
// Canadian Journal of Statistics 15, 209–225); standard errors from the observed information of
// (β, k) together.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "cells.hpp"
#include "predictors.hpp"

namespace quadrat {

// Counts and predictor columns, rows aligned.
struct CountData {
    std::vector<double> counts;                // whole numbers ≥ 0
    std::vector<std::vector<double>> xs;       // per predictor column, counts.size() values
    std::vector<std::string> names;            // per predictor column; `site: B` for a factor's level
    std::vector<Factor> factors;               // the label columns of xs, as indicator columns in xs
    std::vector<double> effort;                // empty: no offset; else > 0, one per row
    std::size_t n_dropped = 0;
};

// In the order of count_model_methods() (keywords.hpp): auto, poisson, negative-binomial.
enum class CountMethod { automatic, poisson, negative_binomial };
CountMethod parse_count_method(const std::string& keyword);

// Above this Pearson χ²/df of the Poisson fit, `auto` fits the negative binomial (FUNCTIONS.md,
// FIT.COUNTS: a rule of thumb of common practice, no single source).
inline constexpr double overdispersion_threshold = 1.5;

struct CountFit {
    bool negative_binomial = false;
    std::string model;                         // the model's full name, and why under `auto`
    std::vector<std::string> terms;            // "intercept", then the predictors
    std::vector<double> estimate, std_error, z, p;
    double log_likelihood = 0, null_log_likelihood = 0;
    double deviance = 0, null_deviance = 0;    // the negative binomial's both at the fitted k
    double lr_statistic = 0, df = 0, lr_p = 0; // 2(ℓ − ℓ₀), ℓ₀ the intercept-only model (own k)
    double aic = 0;
    double pseudo_r_squared = 0;               // McFadden: 1 − ℓ/ℓ₀
    double overdispersion = 0;                 // Pearson χ²/df of the Poisson fit
    double aggregation_k = 0;                  // NB2's k; NaN for Poisson
    double n = 0, n_dropped = 0;
    int iterations = 0;
    std::vector<FactorTest> factor_tests;      // likelihood-ratio χ² per factor of xs
};

// Reads FIT.COUNTS' `counts`, `xs` (numbers, or labels for a factor) and `effort` (omitted: no
// offset) with the catalogue's missing-data and header rules.
CountData read_count_data(const Range& counts, const Range& xs, const Range& effort);

// Maximum-likelihood fit. Refuses: negative or fractional counts, effort ≤ 0, too few rows, all
// counts 0, a constant or collinear predictor, a predictor whose rows of one level hold only zero
// counts (no finite rate ratio: the estimate runs off to −∞), and, for the negative binomial,
// counts no more variable than Poisson (k has no finite estimate).
CountFit fit_counts(const CountData& data, CountMethod method);

// `coefficients`: header `variable | coefficient | SE | z | p | rate ratio | ci-low | ci-high`,
// then the intercept (its rate-ratio cells blank, as FIT.LOGISTIC leaves its odds ratio) and each
// predictor, with the Wald interval of the rate ratio at `level`.
Table count_coefficients(const CountFit& fit, double level);

// `model`: label/value table (model, deviance, null deviance, statistic, df, p, aic,
// pseudo-r-squared, n, n dropped, iterations, overdispersion, aggregation k), then per factor
// `<factor>: χ²`, `<factor>: df`, `<factor>: p`.
Table count_model_table(const CountFit& fit);

}  // namespace quadrat
