// The limits a compliance report asks for (LIMIT.*): the upper confidence limit of a mean, a
// percentile with its distribution-free upper limit, the share of readings above a standard, and
// tolerance and prediction limits, normal and distribution-free.
#pragma once

#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include "result.hpp"
#include "keywords.hpp"

namespace quadrat {

// What every LIMIT.* function returns: the named numbers (`n`, `limit` or `limit-low`/`limit-high`,
// `k-factor` for the normal methods, …), and which row `estimate` shows (the mean, the percentile,
// the share), so the table keeps readable row names.
//
// The report sentence is rendered by report.hpp (render_limit_report) from the title and the
// details: "<title>: <limit, or limit-low to limit-high> (<details>, n = N)".
struct LimitDetail {
    // How the quantity shows: a number as report.hpp formats it, a whole number, a number as the
    // person typed it (a standard: 50, 0.5), or an order
    // statistic in words ("the 3rd largest value": `order` counts from the smallest of n,
    // `outer` from each end, "the 2nd smallest and 2nd largest values").
    enum class Form { number, whole, typed, order, outer };
    std::string before, quantity, after;  // words, a named quantity of the result (listed or not), words
    Form form = Form::number;
};

struct LimitResult {
    TestResult result;
    std::string estimate_label;  // the row `estimate` selects; empty when the method has none
    bool two_sided = false;      // then `limit` is a refusal pointing to limit-low and limit-high
    std::string title;           // "Upper 95% confidence limit of the mean (Student's t)"
    std::vector<LimitDetail> details;
};

// The outputs of the LIMIT.* functions, in the order a refusal lists them (FUNCTIONS.md: `limit`,
// `estimate`, `k-factor`, `n`, `table`, `report`; LIMIT.EXCEEDANCE's `count`; `limit-low` and
// `limit-high` where a `side` can be two-sided), and the keyword tables of their options.
const KeywordTable& limit_outputs();             // LIMIT.MEAN
const KeywordTable& percentile_limit_outputs();  // LIMIT.PERCENTILE (no multiplier)
const KeywordTable& exceedance_outputs();        // LIMIT.EXCEEDANCE
const KeywordTable& sided_limit_outputs();       // LIMIT.TOLERANCE, LIMIT.PREDICTION
const KeywordTable& limit_sides();         // `side`
const KeywordTable& mean_limit_methods();  // LIMIT.MEAN
const KeywordTable& limit_methods();       // LIMIT.TOLERANCE, LIMIT.PREDICTION
// What a cell shows for `output` (a keyword of `allowed`).
Table select_limit_output(const LimitResult& limit, const std::string& output,
                          const KeywordTable& allowed = sided_limit_outputs());

// One-sided upper confidence limit of the mean at `level`. `method`: `t` (mean + t(level, n − 1)·s/√n),
// `bootstrap` (BCa, Efron 1987, with bootstrap_draws resamples from a fixed seed), `chebyshev`
// (Cantelli's one-sided inequality: mean + √(1/α − 1)·s/√n). The k-factor is the multiplier of s.
LimitResult limit_mean(std::span<const double> values, const std::string& method, double level);
inline constexpr std::size_t bootstrap_draws = 2000;
inline constexpr std::size_t max_bootstrap_values = 100000;

// The percentile at `fraction` as PERCENTILE.INC computes it (linear interpolation between order
// statistics) and its distribution-free upper confidence limit: the smallest order statistic
// x(r) with P(Bin(n, fraction) ≤ r − 1) ≥ level.
LimitResult limit_percentile(std::span<const double> values, double fraction, double level);

// The share of values above `standard` and its one-sided exact upper confidence limit at `level`
// (Clopper & Pearson 1934, Biometrika 26, 404–413).
LimitResult limit_exceedance(std::span<const double> values, double standard, double level);

// The limit that `proportion` of the population stays below (`side` upper), above (lower) or within
// (two-sided) with confidence `level`; `method` normal or distribution-free.
LimitResult limit_tolerance(std::span<const double> values, double proportion, double level, const std::string& side,
                            const std::string& method);

// The limit the next `readings` new readings all stay within with confidence `level`; `method`
// normal or distribution-free.
LimitResult limit_prediction(std::span<const double> values, double readings, double level, const std::string& side,
                             const std::string& method);

// The building blocks, exposed for their tests.
// Exact one-sided normal tolerance factor: k = t′⁻¹(γ; n − 1, z_p·√n)/√n (noncentral t).
double tolerance_factor_one_sided(double n, double proportion, double confidence);
// Howe's (1969) two-sided normal tolerance factor: z_{(1+p)/2}·√((n − 1)(1 + 1/n)/χ²_{1−γ, n−1}).
double tolerance_factor_two_sided(double n, double proportion, double confidence);
// One-sided exact (Clopper–Pearson) upper limit for k successes in n trials.
double clopper_pearson_upper(double successes, double trials, double confidence);
// Smallest r (1-based) with P(Bin(n, p) ≤ r − 1) ≥ confidence; 0 when even r = n falls short.
std::size_t order_statistic_rank(std::size_t n, double p, double confidence);

}  // namespace quadrat
