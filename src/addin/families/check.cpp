// CHECK.*: assumption checks and screening.
#include "addin/families/common.hpp"
#include "addin/families/regression.hpp"
#include "core/data.hpp"
#include "core/diagnostics.hpp"
#include "core/normality.hpp"
#include "core/outliers.hpp"
#include "core/refusal.hpp"
#include "core/report.hpp"
#include "core/variance.hpp"

namespace quadrat::addin {
namespace {

// CHECK.OUTLIERS' result with where each value came from, so that `flags` has exactly the input's
// rows (blank where a row was not used) and the table names each value's cell.
struct LocatedCheck {
    OutlierCheck check;
    std::vector<std::size_t> used_rows;
    std::size_t rows = 0;
    std::vector<std::string> cells;
};

Entry outliers_entry() {
    Entry e;
    e.compute = [](const Request& r) -> std::shared_ptr<const void> {
        const Range& values = r.range("values");
        if (values.empty()) throw Refusal("values is empty");
        if (values.columns != 1)
            throw Refusal("values must be one column (found " + std::to_string(values.columns) + ")");
        const Frame frame = read_frame({{&values, ColumnKind::numeric, "values"}});
        LocatedCheck located;
        located.check = check_outliers(frame.numbers[0], r.keyword("method"), r.number("most", 0), r.level());
        located.used_rows = frame.used_rows;
        located.rows = frame.rows;
        for (std::size_t row : frame.used_rows) located.cells.push_back(cell_address(values, row, 0));
        return std::make_shared<const LocatedCheck>(std::move(located));
    };
    e.show = [](const void* result, const Request& r) -> Table {
        const auto& c = *static_cast<const LocatedCheck*>(result);
        const std::string& output = r.keyword("output");
        if (output == "count") return single(static_cast<double>(c.check.count));
        if (output == "table") return outlier_table(c.check, c.cells);
        if (output == "report") return single(render_outlier_report(c.check));
        return outlier_flags(c.check, c.used_rows, c.rows);
    };
    return e;
}

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

    // Nothing is removed: the flags sit beside the raw column (FUNCTIONS.md revision 2).
    Function{"CHECK.OUTLIERS", "checkOutliers",
             "Which single values stand out, to look at again before anything is set aside; nothing is removed.",
             {data("values", "Readings (numbers), one column; a text first row is a header."),
              keyword("method", outlier_methods(), "generalized-esd", "Test"),
              output(outlier_outputs(), "flags", "What the cell shows; flags is an array beside the values"),
              number("most", "generalized-esd: most values tested (default 10% of n, 1 to 10)."), level()},
             outliers_entry()},
};

}  // namespace
}  // namespace quadrat::addin
