// Values below a detection limit (`<0.5`): DESCRIBE.CENSORED and COMPARE.CENSORED.
// Left-censored values are handled by the survival methods on values flipped about a constant, so
// that "below the limit" becomes "beyond the censoring time" (Helsel 2012, Statistics for Censored
// Environmental Data, 2nd ed., ch. 6 and 9). The flip is done implicitly: every sweep below runs
// over the values from the largest down, which is the flipped order, and never subtracts the
// values from a constant (that would lose the digits of small values beside large ones).
//
// Ties between a detected value and a limit at the same number: a detect at the limit is above a
// non-detect at that limit (`0.5` > `<0.5`). After the flip the censored one comes later, which is
// the usual survival convention (an observation censored at t is still at risk at t).
#pragma once

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "cells.hpp"
#include "result.hpp"
#include "keywords.hpp"

namespace quadrat {

struct Groups;

// DESCRIBE.CENSORED's and COMPARE.CENSORED's methods and COMPARE.CENSORED's outputs (keyword
// tables, keywords.hpp).
const KeywordTable& censored_summary_methods();
const KeywordTable& censored_test_methods();
const KeywordTable& censored_test_outputs();

// One observation: a measured value, or (censored) a value known only to lie below `value`, its
// detection limit.
struct CensoredValue {
    double value = 0.0;
    bool censored = false;
};

// Groups of censored observations, in group order (the typed input of the *.CENSORED functions).
struct CensoredGroups {
    std::vector<std::string> names;
    std::vector<std::vector<CensoredValue>> values;  // per group, in row order
    std::size_t n_dropped = 0;

    std::size_t n_used() const;
};

// The groups as the data layer read them with read_censored_groups (a limit as its value, with
// its flag).
CensoredGroups censored_groups(const Groups& groups);

// The Kaplan–Meier estimate of the distribution of left-censored values (Kaplan & Meier 1958,
// JASA 53, 457–481, on the flipped values). Steps at the distinct detected values, largest first.
struct KaplanMeierCurve {
    std::vector<double> detected_values;  // distinct detected values, descending
    std::vector<double> at_risk;          // b_j: observations at or below detected_values[j] (limits ≤ it included)
    std::vector<double> detections;       // m_j: detects equal to detected_values[j]
    std::vector<double> below;            // P̂(X < detected_values[j]) = Π_{i ≤ j} (1 − m_i/b_i)
    double lowest = 0.0;                  // the lowest observation (a detect, or the lowest limit)
    bool lowest_censored = false;         // then the mass below the smallest detect is undetermined
    double mean = 0.0;                    // restricted at `lowest` when that is censored
    double mean_se = 0.0;                 // Greenwood-type SE of that mean (Klein & Moeschberger 2003, eq. 4.5.2)
};

// Needs at least one detected value. O(n log n).
KaplanMeierCurve kaplan_meier_left(std::span<const CensoredValue> values);

// The p-th quantile of the Kaplan–Meier distribution: the smallest value v with P̂(X ≤ v) ≥ p;
// where P̂(X ≤ v) equals p exactly over a flat stretch, the midpoint of that stretch (so a
// complete sample of even size gets the usual median). Empty when the quantile lies in the
// undetermined mass below the smallest detect.
std::optional<double> kaplan_meier_quantile(const KaplanMeierCurve& curve, double p);

// Robust regression on order statistics (Helsel & Cohn 1988, Water Resources Research 24,
// 1997–2004), lognormal: the logs of the detects are regressed on the normal scores of their
// plotting positions (Hirsch & Stedinger 1987, Water Resources Research 23, 715–727, for several
// limits), and each censored value is replaced by the fitted value at its own plotting position.
struct RosFit {
    std::vector<double> plotting_positions;  // per input observation
    std::vector<double> filled;              // per input observation: the detect itself, or its imputed value
    double intercept = 0.0;                  // of ln(value) on the normal score
    double slope = 0.0;
};
RosFit robust_ros(std::span<const CensoredValue> values);

// DESCRIBE.CENSORED: header row, then per group: group, n, censored, censored %, lowest limit,
// highest limit, mean, SE, ci-low, ci-high, q1, median, q3, maximum, method. `method`:
// kaplan-meier (default) or ros. `level` a fraction in (0, 1).
Table describe_censored(const CensoredGroups& groups, const std::string& method, double level);

// COMPARE.CENSORED: the generalized Wilcoxon score test for two or more groups, `peto-prentice`
// (default) or `gehan`: statistic (χ², k − 1 df), df, p, n, n dropped, per group n, censored and
// the Kaplan–Meier median (blank below the lowest limit or where it is undetermined); the report
// sentence's words, with the bound of a blank median ("<0.5").
TestResult compare_censored(const CensoredGroups& groups, const std::string& method);

}  // namespace quadrat
