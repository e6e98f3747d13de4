#include "addin/registry.hpp"

#include <exception>

#include "addin/handlers.hpp"
#include "core/refusal.hpp"
#include "core/result.hpp"

namespace quadrat::addin {

namespace {

// Argument texts shared by many functions, so that the wizard says the same thing everywhere.
constexpr const char* values_text = "Measurements: a column (long format) or a block of columns, one per group (wide format). Empty and text cells are missing.";
constexpr const char* groups_text = "Group labels beside the values, same number of rows (site, zone, treatment).";
constexpr const char* transform_text = "Transform before testing: none (default), log, log10, log1p (log of x+1, for counts with zeros), sqrt. With log or log10 a difference comes back as a ratio of geometric means; with log1p or sqrt it stays on that scale.";
constexpr const char* level_text = "Confidence level: 0.95 (default) or a percentage such as 99.";

}  // namespace

const std::vector<FunctionInfo>& registry() {
    static const std::vector<FunctionInfo> functions = {
        {"CHECK.NORMAL", "checkNormal",
         "Tests whether values look normally distributed (of one column, or of the residuals from the group means). Default output: the p-value (0 to 1); small p means not normal.",
         {{"values", values_text, true},
          {"groups", "Optional group labels: then the residuals from the group means are tested.", false},
          {"method", "shapiro-wilk (default), shapiro-francia, anderson-darling, lilliefors, dagostino, jarque-bera.", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (W, W', A2, D, K2 or JB; no unit), df (dagostino, jarque-bera), n (values used), table (array) or report (a sentence).", false}},
         check_normal},
        {"CHECK.VARIANCE", "checkVariance",
         "Tests whether the groups have equal spread. Default output: the p-value (0 to 1); small p means the spreads differ.",
         {{"values", values_text, true},
          {"groups", groups_text, true},
          {"method", "brown-forsythe (default), levene, bartlett, fligner, f-ratio (two groups).", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (F or chi-square; no unit), df, df2 (F methods), n (values used), table (array, with each group's variance in squared data units) or report (a sentence).", false}},
         check_variance},
        {"CHECK.QQ", "checkQq",
         "Normal Q-Q plot data as an array (enter as array formula), one row per input row: the normal quantile (no unit) and the sorted value (data units).",
         {{"values", values_text, true},
          {"groups", "Optional group labels: then the residuals from the group means are plotted.", false}},
         check_qq},
        {"CHECK.MODEL", "checkModel",
         "Regression diagnostics as a table (array formula): normality, constant variance, independence, linearity, collinearity, influence, outliers, each with a verdict ok or look.",
         {{"y", "Response column (numbers).", true},
          {"xs", "Predictor columns (numbers); a text first row names them.", true},
          {"output", "table (default), or one check's number: normality, variance, linearity (each a p, 0 to 1), independence (Durbin-Watson, 0 to 4), collinearity (largest VIF), influence (largest Cook's distance), outliers (how many rows).", false}},
         check_model},
        {"COMPARE.GROUPS", "compareGroups",
         "Tests a difference in location between two or more groups (Welch, pooled, or ranks). Default output: the p-value (0 to 1).",
         {{"values", values_text, true},
          {"groups", groups_text, true},
          {"method", "welch (default), pooled, ranks.", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (t, F, U or H; no unit), df, df2 (F), n (values used), estimate (difference in the data's units, a ratio with log), ci-low, ci-high (its limits, two groups), effect (Hedges' g, omega squared, rank-biserial r or epsilon squared; no unit), table (array) or report (a sentence).", false},
          {"transform", transform_text, false}},
         compare_groups},
        {"COMPARE.PAIRED", "comparePaired",
         "Tests the difference of readings paired by row (before/after, upstream/downstream), or one sample against a number. Default output: the p-value (0 to 1).",
         {{"first", "First reading of each pair (numbers).", true},
          {"second", "Second reading of each pair, same rows; or a single number for a one-sample test.", false},
          {"method", "t (default), signed-rank, sign.", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (t, T+ or the number of positive differences), df (t), n (pairs used), estimate (mean or median difference in the data's units, a ratio with log), ci-low, ci-high (its limits), effect (Cohen's d or matched-pairs rank-biserial r; no unit), table (array) or report (a sentence).", false},
          {"transform", transform_text, false}},
         compare_paired},
        {"COMPARE.POSTHOC", "comparePosthoc",
         "Every pair of groups as an array (enter as array formula): the two groups, estimate and interval (data units; a ratio with log), statistic, p, adjusted p (0 to 1), significant yes or no.",
         {{"values", values_text, true},
          {"groups", groups_text, true},
          {"method", "tukey (default), games-howell, dunn, t-pairs, rank-pairs.", false},
          {"adjust", "p-value adjustment for dunn, t-pairs, rank-pairs: holm (default), bonferroni, hochberg, hommel, bh, by, sidak.", false},
          {"transform", transform_text, false},
          {"level", level_text, false}},
         compare_posthoc},
        {"COMPARE.LETTERS", "compareLetters",
         "Compact letter display: groups sharing a letter do not differ significantly. Array (enter as array formula): group, n, mean (median for rank methods; data units), letters.",
         {{"values", values_text, true},
          {"groups", groups_text, true},
          {"method", "tukey (default), games-howell, dunn, t-pairs, rank-pairs.", false},
          {"level", level_text, false},
          {"transform", transform_text, false}},
         compare_letters},
        {"COMPARE.COUNTS", "compareCounts",
         "Tests association between two categorical variables, from a block of counts or two label columns. Default output: the p-value (0 to 1).",
         {{"counts_or_labels", "A block of counts (text first row and column name the categories), or a first label column.", true},
          {"labels2", "Second label column, when the first argument holds labels.", false},
          {"method", "chi-square (default), yates (2x2), g, fisher.", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (chi-square or G; none for fisher), df, n (total count), effect (Cramer's V or phi, 0 to 1), table (array) or report (a sentence).", false}},
         compare_counts},
        {"COMPARE.EXPECTED", "compareExpected",
         "Chi-square goodness of fit of observed counts against expected proportions or counts. Default output: the p-value (0 to 1).",
         {{"observed", "Observed counts, one per category.", true},
          {"expected", "Expected proportions or counts, same size (equal when omitted).", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (chi-square), df, n (total count), table (array) or report (a sentence).", false}},
         compare_expected},
        {"RELATE.CORRELATION", "relateCorrelation",
         "Correlation between two columns, paired by row. Default output: the p-value (0 to 1); estimate gives the coefficient (-1 to 1).",
         {{"x", "First variable (numbers).", true},
          {"y", "Second variable (numbers), same rows.", true},
          {"method", "pearson (default), spearman, kendall.", false},
          {"output", "What the cell shows: p (default, 0 to 1), statistic (t; for kendall z, or tau when exact), df (pearson, spearman), n (pairs used), estimate (the coefficient, -1 to 1), ci-low, ci-high (its limits, pearson), table (array) or report (a sentence).", false}},
         relate_correlation},
        {"FIT.LINEAR", "fitLinear",
         "Linear regression by least squares. Default: the coefficient table (array formula): term, estimate, std. error, t, p, ci-low, ci-high, VIF.",
         {{"y", "Response column (numbers).", true},
          {"xs", "Predictor columns (numbers); a text first row names them.", true},
          {"output", "coefficients (default; array), model (array), r2 (0 to 1), p (overall F test, 0 to 1), slope (y units per x unit), intercept (y units), sigma (residual SD, y units) or report (a sentence).", false},
          {"level", level_text, false}},
         fit_linear},
        {"FIT.LOGISTIC", "fitLogistic",
         "Logistic regression for a 0/1 or two-label response. Default: the coefficient table (array formula) with odds ratios.",
         {{"y", "Response: 0/1, or exactly two labels (present/absent).", true},
          {"xs", "Predictor columns (numbers); a text first row names them.", true},
          {"output", "coefficients (default; array: term, estimate, std. error, z, p, odds ratio and its interval) or model (array: event, deviance, likelihood-ratio test, AIC, pseudo-R2, n).", false},
          {"level", level_text, false}},
         fit_logistic},
        {"FIT.POINTS", "fitPoints",
         "Per-row values of a linear fit, aligned with the raw rows (array formula): fitted, residual, standardized, studentized, leverage, Cook's distance.",
         {{"y", "Response column (numbers).", true},
          {"xs", "Predictor columns (numbers).", true},
          {"what", "All six columns (default), or one: fitted, residual (y units), standardized, studentized (no unit), leverage (0 to 1), cooks (Cook's distance).", false}},
         fit_points},
        {"FIT.FACTORIAL", "fitFactorial",
         "Two-way analysis of variance with interaction. Default: the ANOVA table (array formula).",
         {{"values", "Measurements (numbers).", true},
          {"factor1", "First factor's labels, same rows.", true},
          {"factor2", "Second factor's labels, same rows.", true},
          {"output", "table (default; array: source, SS, df, MS, F, p, partial eta squared) or the p-value (0 to 1) of one effect: p-first, p-second, p-interaction.", false},
          {"sstype", "Sums of squares: 2 (default, Type II) or 3 (Type III).", false}},
         fit_factorial},
        {"ADJUST.P", "adjustP",
         "Adjusts p-values for multiple comparisons; returns an array of the same shape (adjusted p, 0 to 1). Blank cells stay blank.",
         {{"pvalues", "p-values (0 to 1), any shape.", true},
          {"method", "holm (default), bonferroni, hochberg, hommel, bh, by, sidak.", false}},
         adjust_p},
        {"DESCRIBE.GROUPS", "describeGroups",
         "Summary per group as an array (array formula): group, n, mean, SD, SE, ci-low, ci-high, median, minimum, maximum (all but n in the data's units).",
         {{"values", values_text, true},
          {"groups", "Optional group labels, same rows as values.", false},
          {"transform", "none (default), log, log10, log1p, sqrt: with a log, the geometric mean and its interval replace the mean.", false},
          {"level", level_text, false}},
         &describe_groups},
        {"ADVISE.TEST", "adviseTest",
         "Suggests which test fits these columns and why. A guide, not a verdict: check the design with a statistician before decisions that matter.",
         {{"response", "The measured or counted variable: one column of numbers or labels.", true},
          {"predictor", "Optional: group labels, a second measurement, or a second categorical variable.", false},
          {"output", "report (default, a sentence), method or transform (keywords to pass to the suggested function), function (its name), table (array: each step, what was found, what it decided).", false},
          {"design", "auto (default), groups (the predictor holds labels, even numeric zone codes), paired (the same units, row by row), relationship (two measurements).", false}},
         &advise_test},
    };
    return functions;
}

const FunctionInfo* find_function(std::string_view method) {
    for (const auto& f : registry())
        if (method == f.method) return &f;
    return nullptr;
}

Table call_fenced(const FunctionInfo& function, const Arguments& arguments) noexcept {
    try {
        try {
            if (!function.handler) return single(std::string(function.display_name) + " is not available in this version");
            // Handlers index their arguments by position; a caller that hands over fewer than the
            // registry lists (the office never does) gets the rest as omitted, not a read past the end.
            if (arguments.size() < function.arguments.size()) {
                Arguments padded = arguments;
                padded.resize(function.arguments.size(), Range::omitted_argument());
                return function.handler(padded);
            }
            return function.handler(arguments);
        } catch (const Refusal& r) {
            return single(std::string(r.what()));
        } catch (const std::bad_alloc&) {
            return single(std::string("not enough memory for this range"));
        } catch (const std::exception& e) {
            return single(std::string("internal error in ") + function.display_name + ": " + e.what());
        } catch (...) {
            return single(std::string("internal error in ") + function.display_name);
        }
    } catch (...) {
        // Building the refusal text itself failed (out of memory): a blank answer beats a crash.
        return Table{};
    }
}

}  // namespace quadrat::addin
