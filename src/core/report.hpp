// Numbers in report sentences, by common practice in field and ecology reports (no single
// published source): p with three decimals and "p < 0.001" below that; statistics and estimates
// with two decimals, three significant digits when smaller than 0.1; Welch df with one decimal.
#pragma once

#include <string>

#include "result.hpp"

namespace quadrat {

struct Advice;

// "p = 0.034", "p = 0.002", "p < 0.001".
std::string format_p(double p);
// 3.41, -0.12, 0.0123, 1.23e-05, 1250.00.
std::string format_number(double x);
// Degrees of freedom: whole numbers as integers (38), fractional ones with one decimal (37.4).
std::string format_df(double df);
// "95%" from 0.95; "99.9%" from 0.999.
std::string format_level(double level);

// The one place where report sentences are built: the result's test name, its named numbers and
// the words of ReportWords, in the form of the catalogue's illustration
// ("Welch's t-test (two groups): t(37.4) = 3.41, p = 0.002; mean difference 0.12 (95% CI 0.05 to
// 0.19), Hedges' g = 0.82"). No statistics file builds or edits a sentence.
std::string render_report(const TestResult& result);

// ADVISE.TEST's paragraph: the suggestion, then each step's finding and decision, then the caution.
std::string render_advice(const Advice& advice);
// The suggestion alone ("Suggested: COMPARE.GROUPS, method 'welch'."), also the advice table's last row.
std::string render_suggestion(const Advice& advice);

}  // namespace quadrat
