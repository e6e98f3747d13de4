// FIT.*: models.
#include "addin/families/common.hpp"
#include "addin/families/regression.hpp"
#include "core/count_model.hpp"
#include "core/diagnostics.hpp"
#include "core/factorial.hpp"
#include "core/logistic.hpp"
#include "core/predict.hpp"

namespace quadrat::addin {
namespace {

Argument response_argument() { return data("y", "Response column (numbers)."); }
Argument predictors_argument() {
    return data("xs", "Predictor columns: numbers, or labels for a factor (site, zone); a text first row names them.");
}

const Declare fit{
    Function{"FIT.LINEAR", "fitLinear",
             "Linear regression by least squares. Default: the coefficient table (array formula).",
             {response_argument(), predictors_argument(),
              output(linear_outputs(), "coefficients", "A table, or one number (slope in y units per x unit)"), level()},
             regression_entry([](const FittedRegression& fit, const Request& r) {
                 return linear_output(fit.model, fit.data.n_dropped, r.keyword("output"), r.level(), fit.factor_tests);
             })},

    Function{"FIT.LOGISTIC", "fitLogistic",
             "Logistic regression for a 0/1 or two-label response. Default: the coefficient table with odds ratios.",
             {data("y", "Response: 0/1, or exactly two labels (present/absent); with trials, successes per row."),
              predictors_argument(), output(logistic_outputs(), "coefficients", "The table to show"), level(),
              optional(data("trials", "Optional: trials per row (seeds sown, fish stocked); y then holds successes."))},
             shared("fitLogistic", {"y", "xs", "trials"},
                    [](const Request& r) {
                        return fit_logistic(r.given("trials") ? read_logistic_data(r.range("y"), r.range("xs"), r.range("trials"))
                                                              : read_logistic_data(r.range("y"), r.range("xs")));
                    },
                    [](const LogisticFit& fit, const Request& r) {
                        return r.keyword("output") == "model" ? logistic_model(fit) : logistic_coefficients(fit, r.level());
                    })},

    Function{"FIT.POINTS", "fitPoints",
             "Per-row values of a linear fit beside the raw rows (array formula), or one column of them.",
             {response_argument(), predictors_argument(),
              output(point_outputs(), "", "All six columns when empty, or one (residuals in y units)")},
             regression_entry([](const FittedRegression& fit, const Request& r) {
                 return fit_points_table(fit.model, fit.data, r.keyword("output"));
             })},

    Function{"FIT.FACTORIAL", "fitFactorial",
             "Two-way analysis of variance with interaction. Default: the ANOVA table (array formula).",
             {data("values", "Measurements (numbers)."), labels("factor1", "First factor's labels, same rows."),
              labels("factor2", "Second factor's labels, same rows."),
              output(factorial_outputs(), "table", "The table, or the p (0 to 1) of one effect"),
              keyword("sums", sums_of_squares(), "type-2", "Sums of squares")},
             shared("", {},
                    [](const Request& r) {
                        const FactorialData data = read_factorial_data(r.range("values"), r.range("factor1"), r.range("factor2"));
                        return fit_factorial(data, r.keyword("sums") == "type-3" ? 3 : 2);
                    },
                    [](const FactorialAnova& anova, const Request& r) {
                        const std::string& output = r.keyword("output");
                        if (output == "p-factor1") return single(anova.first.p);
                        if (output == "p-factor2") return single(anova.second.p);
                        if (output == "p-interaction") return single(anova.interaction.p);
                        return factorial_table(anova);
                    })},

    Function{"FIT.COUNTS", "fitCounts",
             "Poisson or negative binomial regression of counts, with effort as a log offset. Default: coefficients with rate ratios.",
             {data("counts", "Counts per sampling unit (whole numbers from 0)."), predictors_argument(),
              optional(data("effort", "Optional: effort per row (trap-nights, minutes, m²), so that rates are modelled.")),
              keyword("method", count_model_methods(), "auto", "Model"),
              output(count_model_outputs(), "coefficients", "The table to show"), level()},
             shared("fitCounts", {"counts", "xs", "effort", "method"},
                    [](const Request& r) {
                        const CountData data = read_count_data(r.range("counts"), r.range("xs"),
                                                               r.given("effort") ? r.range("effort") : Range::omitted_argument());
                        return fit_counts(data, parse_count_method(r.keyword("method")));
                    },
                    [](const CountFit& fit, const Request& r) {
                        return r.keyword("output") == "model" ? count_model_table(fit) : count_coefficients(fit, r.level());
                    })},

    Function{"FIT.PREDICT", "fitPredict",
             "The linear fit at new predictor rows (array formula): predicted value, interval of the mean, interval of one new reading.",
             {response_argument(), predictors_argument(),
              data("at", "New predictor rows laid out like xs (same columns; factors by their labels)."),
              output(prediction_outputs(), "", "All five columns when empty, or one (in y units)"), level()},
             regression_entry([](const FittedRegression& fit, const Request& r) {
                 const NewRows at = read_new_rows(fit.data.factors, fit.data.factor_of_column, r.range("at"));
                 const std::string& output = r.keyword("output");
                 const std::size_t column = output.empty() ? 5 : prediction_outputs().index(output, "output");
                 return prediction_table(fit.model, at.rows, at.has_header, r.level(), column);
             })},
};

}  // namespace
}  // namespace quadrat::addin
