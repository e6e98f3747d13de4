// FIT.*: models.
#include "addin/families/common.hpp"
#include "addin/families/regression.hpp"
#include "core/diagnostics.hpp"
#include "core/factorial.hpp"
#include "core/logistic.hpp"

namespace quadrat::addin {
namespace {

Argument response_argument() { return data("y", "Response column (numbers)."); }
Argument predictors_argument() { return data("xs", "Predictor columns (numbers); a text first row names them."); }

const Declare fit{
    Function{"FIT.LINEAR", "fitLinear",
             "Linear regression by least squares. Default: the coefficient table (array formula).",
             {response_argument(), predictors_argument(),
              output(linear_outputs(), "coefficients", "A table, or one number (slope in y units per x unit)"), level()},
             regression_entry([](const FittedRegression& fit, const Request& r) {
                 return linear_output(fit.model, fit.data.n_dropped, r.keyword("output"), r.level());
             })},

    Function{"FIT.LOGISTIC", "fitLogistic",
             "Logistic regression for a 0/1 or two-label response. Default: the coefficient table with odds ratios.",
             {data("y", "Response: 0/1, or exactly two labels (present/absent)."), predictors_argument(),
              output(logistic_outputs(), "coefficients", "The table to show"), level()},
             shared("fitLogistic", {"y", "xs"},
                    [](const Request& r) { return fit_logistic(read_logistic_data(r.range("y"), r.range("xs"))); },
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
};

}  // namespace
}  // namespace quadrat::addin
