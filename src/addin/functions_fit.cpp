// FIT.LINEAR, FIT.POINTS, CHECK.MODEL and RELATE.CORRELATION: read the cells, call the core, pick
// the output. Nothing statistical here.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "addin/memo.hpp"
#include "core/correlation.hpp"
#include "core/diagnostics.hpp"
#include "core/keywords.hpp"
#include "core/linear_model.hpp"

namespace quadrat::addin {

namespace {

struct FittedRegression {
    RegressionData data;
    LinearModel model;
};

// FIT.LINEAR, FIT.POINTS and CHECK.MODEL over the same y and xs share one fit: a sheet laid out
// as a technician would (coefficients, checks, fitted points) computes it once.
std::shared_ptr<const FittedRegression> fitted_regression(const Arguments& a) {
    return remembered_on("regression", a, {0, 1}, [&] {
        RegressionData data = read_regression(argument(a, 0), argument(a, 1));
        LinearModel model = fit_least_squares(data.y, data.predictors, data.names, true);
        return FittedRegression{std::move(data), std::move(model)};
    });
}
}  // namespace

Table fit_linear(const Arguments& a) {
    const auto fit = fitted_regression(a);
    const std::string output = match_keyword(keyword_argument(argument(a, 2), "output"), linear_outputs(), "output");
    const double level = level_argument(argument(a, 3));
    return linear_output(fit->model, fit->data.n_dropped, output, level);
}

Table fit_points(const Arguments& a) {
    const auto fit = fitted_regression(a);
    const std::string given = keyword_argument(argument(a, 2), "what");
    const std::string what = given.empty() ? given : match_keyword(given, point_columns(), "what");
    return fit_points_table(fit->model, fit->data, what);
}

Table check_model(const Arguments& a) {
    const auto fit = fitted_regression(a);
    const std::string output = match_keyword(keyword_argument(argument(a, 2), "output"), check_regression_outputs(), "output");
    return check_regression_output(fit->model, fit->data, output, argument(a, 3));  // order: not declared yet
}

Table relate_correlation(const Arguments& a) {
    const std::string method = match_keyword(keyword_argument(argument(a, 2), "method"), {"pearson", "spearman", "kendall"}, "method");
    // Neighbouring cells asking p, estimate and report of one correlation compute it once.
    const auto result = remembered("relateCorrelation", a, 3, [&] {
        return quadrat::relate_correlation(argument(a, 0), argument(a, 1), method);
    });
    return select_output(*result, keyword_argument(argument(a, 3), "output"), standard_outputs());
}

}  // namespace quadrat::addin
