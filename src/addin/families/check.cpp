// CHECK.*: assumption checks and screening.
#include "addin/families/common.hpp"
#include "addin/families/regression.hpp"
#include "core/diagnostics.hpp"
#include "core/normality.hpp"
#include "core/variance.hpp"

namespace quadrat::addin {
namespace {

const Declare check{
    Function{"CHECK.NORMAL", "checkNormal",
             "Tests whether values look normally distributed: one column, or the residuals from the group means.",
             {values_argument(), optional_groups_argument("then the residuals from the group means are tested."),
              keyword("method", normality_methods(), "shapiro-wilk", "Test"),
              test_output(normality_outputs())},
             test([](const Request& r) { return check_normal(r.groups("values", "groups"), r.keyword("method")); })},

    Function{"CHECK.VARIANCE", "checkVariance", "Tests whether the groups have equal spread.",
             {values_argument(), groups_argument(), keyword("method", variance_methods(), "brown-forsythe", "Test"),
              test_output(variance_outputs())},
             test([](const Request& r) { return check_variance(r.groups("values", "groups"), r.keyword("method")); })},

    Function{"CHECK.QQ", "checkQq",
             "Normal Q-Q plot data, one row per input row (array formula): the normal quantile and the sorted value.",
             {values_argument(), optional_groups_argument("then the residuals from the group means are plotted.")},
             table([](const Request& r) { return check_qq(r.groups("values", "groups"), r.range("values").rows); })},

    // `order` is passed on for the Durbin–Watson check in sampling order (FUNCTIONS.md revision 2).
    Function{"CHECK.REGRESSION", "checkRegression",
             "Regression diagnostics as a table (array formula): each check with its rule and a verdict ok or look.",
             {data("y", "Response column (numbers)."), data("xs", "Predictor columns (numbers); a text first row names them."),
              output(regression_checks(), "table", "The table, or one check's number (a p, statistic, VIF or count)"),
              optional(data("order", "Sampling order of the rows (dates, times or distances), for independence."))},
             regression_entry([](const FittedRegression& fit, const Request& r) {
                 return check_regression_output(fit.model, fit.data, r.keyword("output"), r.range("order"));
             })},
};

}  // namespace
}  // namespace quadrat::addin
