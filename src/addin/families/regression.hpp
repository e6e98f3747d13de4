// The least-squares fit that FIT.LINEAR, FIT.POINTS and CHECK.REGRESSION share: declared with
// `regression_entry`, one result kind keyed on y and xs, so a sheet laid out as a technician would
// (coefficients, checks, fitted points over the same columns) computes it once.
#pragma once

#include <utility>

#include "addin/declare.hpp"
#include "core/linear_model.hpp"

namespace quadrat::addin {

struct FittedRegression {
    RegressionData data;
    LinearModel model;
    std::vector<FactorTest> factor_tests;  // one joint F per factor (label column) of xs
};

inline FittedRegression fit_regression(const Request& r) {
    RegressionData data = read_regression(r.range("y"), r.range("xs"));
    LinearModel model = fit_least_squares(data.y, data.predictors, data.names, true);
    std::vector<FactorTest> tests = factor_tests(model, data);
    return FittedRegression{std::move(data), std::move(model), std::move(tests)};
}

template <class Show>
Entry regression_entry(Show show) {
    return shared("regression", {"y", "xs"}, fit_regression, show);
}

}  // namespace quadrat::addin
