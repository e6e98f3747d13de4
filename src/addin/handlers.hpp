// One handler per cell function: converted cells in, what the cell shows out. Each does three
// things in order: read the arguments, call the core, pick the output. Nothing statistical.
#pragma once

#include "addin/registry.hpp"

namespace quadrat::addin {

// The i-th argument; one the caller left off reads as omitted (call_fenced pads the list already; a
// direct C++ caller may pass fewer).
inline const Range& argument(const Arguments& a, std::size_t i) {
    static const Range omitted = Range::omitted_argument();
    return i < a.size() ? a[i] : omitted;
}

// functions_check.cpp
Table check_normal(const Arguments& a);
Table check_variance(const Arguments& a);
Table check_qq(const Arguments& a);

// functions_compare.cpp
Table compare_groups(const Arguments& a);
Table compare_paired(const Arguments& a);

// functions_posthoc.cpp
Table compare_posthoc(const Arguments& a);
Table compare_letters(const Arguments& a);
Table adjust_p(const Arguments& a);

// functions_counts.cpp: categorical responses and factors
Table compare_counts(const Arguments& a);
Table compare_expected(const Arguments& a);
Table fit_logistic(const Arguments& a);
Table fit_factorial(const Arguments& a);

// functions_fit.cpp: the linear model, its diagnostics, correlation
Table relate_correlation(const Arguments& a);
Table fit_linear(const Arguments& a);
Table fit_points(const Arguments& a);
Table check_model(const Arguments& a);

// functions_describe.cpp, functions_advise.cpp
Table describe_groups(const Arguments& a);
Table advise_test(const Arguments& a);

}  // namespace quadrat::addin
