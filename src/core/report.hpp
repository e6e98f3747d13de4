// Numbers in report sentences, by common practice in field and ecology reports (no single
// published source): p with three decimals and "p < 0.001" below that; statistics and estimates
// with two decimals, three significant digits when smaller than 0.1; Welch df with one decimal.
#pragma once

#include <cstddef>
#include <string>

#include "result.hpp"

namespace quadrat {

struct Advice;
struct LimitResult;
struct OutlierCheck;

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

// LIMIT.*'s sentence: "<title>: <limit, or limit-low to limit-high> (<details>, n = N)", e.g.
// "Upper 95% confidence limit of the mean (Student's t): 0.93 (mean 0.81, SD 0.33, n = 24)".
std::string render_limit_report(const LimitResult& limit);

// CHECK.OUTLIERS' sentence: the test, what it tested, n, what stands out (or "no clear sign of an
// outlier (R1 = 3.12 against a critical 3.16)"), then the note.
std::string render_outlier_report(const OutlierCheck& check);
// The note of CHECK.OUTLIERS' table and sentence: what the method assumes (the tests: the other
// values normal; fences: where the fences lie), and that a flagged value is one to check, not to delete.
std::string render_outlier_note(const OutlierCheck& check);

// "1st", "22nd", "53rd", "90th".
std::string ordinal(std::size_t whole);

}  // namespace quadrat
