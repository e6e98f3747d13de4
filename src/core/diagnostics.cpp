#include "diagnostics.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/fisher_f.hpp>

#include "data.hpp"
#include "keywords.hpp"
#include "normality.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

constexpr double not_defined = std::numeric_limits<double>::quiet_NaN();

// A leverage this close to 1 means the row fits itself exactly: its residual is 0 and every
// ratio with 1 − h below is not defined.
constexpr double leverage_one = 1.0 - 1e-10;

CellValue number_or_blank(double x) {
    if (std::isfinite(x)) return x;
    return std::monostate{};
}

std::string count_rows(std::size_t count) { return std::to_string(count) + (count == 1 ? " row" : " rows"); }

// The rows used by the fit (0 … n − 1) in sampling order: sorted by their `order` cell, ties kept
// in row order. Every used row needs a number there.
std::vector<std::size_t> sampling_order(const Range& order, const RegressionData& data) {
    if (order.columns != 1) throw Refusal("order must be one column (found " + std::to_string(order.columns) + ")");
    if (order.rows != data.rows)
        throw Refusal("order has " + std::to_string(order.rows) + " rows and y has " + std::to_string(data.rows) +
                      "; give one date, time or distance per row of y");
    const std::size_t n = data.used_rows.size();
    std::vector<double> key(n);
    for (std::size_t i = 0; i < n; ++i) {
        const std::size_t row = data.used_rows[i];
        const Cell& c = order.at(row, 0);
        if (c.kind == CellKind::error) throw Refusal(error_cell_message(order, row, 0, "order"));
        if (c.kind != CellKind::number || !std::isfinite(c.number)) {
            const std::string at = order.is_reference ? cell_address(order, row, 0) : "row " + std::to_string(row + 1) + " of order";
            throw Refusal(at + (c.kind == CellKind::empty ? " is empty" : " holds no number") +
                          ", but its row is used by the fit; give every used row its date, time or distance");
        }
        key[i] = c.number;
    }
    std::vector<std::size_t> rows(n);
    for (std::size_t i = 0; i < n; ++i) rows[i] = i;
    std::stable_sort(rows.begin(), rows.end(), [&](std::size_t a, std::size_t b) { return key[a] < key[b]; });
    return rows;
}

}  // namespace

Influence influence_measures(const LinearModel& m) {
    const std::size_t n = m.n;
    Influence inf;
    inf.standardized.assign(n, not_defined);
    inf.studentized.assign(n, not_defined);
    inf.cook.assign(n, not_defined);
    if (m.perfect_fit || !(m.residual_sd > 0)) return inf;  // σ = 0: no residual is out of scale

    const double s = m.residual_sd;
    const double df = m.df_residual;
    const double p = static_cast<double>(m.parameters);
    for (std::size_t i = 0; i < n; ++i) {
        const double h = m.leverage[i];
        if (h >= leverage_one) continue;
        const double e = m.residuals[i];
        const double r = e / (s * std::sqrt(1.0 - h));
        inf.standardized[i] = r;
        inf.cook[i] = r * r * h / (p * (1.0 - h));
        // Deleting row i: s₍ᵢ₎² = (rss − e²/(1 − h)) / (df − 1) (Belsley, Kuh & Welsch 1980, eq. 2.8).
        if (df > 1) {
            const double deleted = (m.rss - e * e / (1.0 - h)) / (df - 1.0);
            if (deleted > 0) inf.studentized[i] = e / (std::sqrt(deleted) * std::sqrt(1.0 - h));
        }
    }
    return inf;
}

const std::vector<std::string>& point_headers() {
    static const std::vector<std::string> words = {"fitted value",         "residual", "standardized residual",
                                                   "studentized residual", "leverage", "Cook's distance"};
    return words;
}

Table fit_points_table(const LinearModel& m, const RegressionData& data, const std::string& output) {
    const Influence inf = influence_measures(m);
    const std::vector<const std::vector<double>*> columns = {&m.fitted,      &m.residuals, &inf.standardized,
                                                             &inf.studentized, &m.leverage, &inf.cook};
    if (!output.empty()) {
        // The columns above keep the order of the keyword table point_outputs().
        const std::size_t c = point_outputs().index(output, "output");
        Table t(data.rows, std::vector<CellValue>(1));
        for (std::size_t i = 0; i < m.n; ++i) t[data.used_rows[i]][0] = number_or_blank((*columns[c])[i]);
        return t;
    }
    // All six under a header row: it takes the input's header row when there is one (same size as
    // the input), else sits on top (one row more).
    const std::size_t offset = data.has_header ? 0 : 1;
    const std::size_t width = columns.size();
    Table t(data.rows + offset, std::vector<CellValue>(width));
    for (std::size_t c = 0; c < width; ++c) t[0][c] = point_headers()[c];
    for (std::size_t i = 0; i < m.n; ++i)
        for (std::size_t c = 0; c < width; ++c)
            t[data.used_rows[i] + offset][c] = number_or_blank((*columns[c])[i]);
    return t;
}

ModelChecks check_regression(const LinearModel& m, const RegressionData& data, const Range& order) {
    if (m.perfect_fit)
        throw Refusal("the fit is perfect (every residual is 0): there is nothing to check");
    ModelChecks c;
    const std::size_t n = m.n;
    const double nn = static_cast<double>(n);
    const std::size_t k = data.predictors.size();

    // Residual normality: Shapiro–Wilk on the residuals (Royston 1995, from the normality family).
    try {
        const TestResult sw = shapiro_wilk(m.residuals);
        c.normality_w = sw.number("statistic");
        c.normality_p = sw.number("p");
    } catch (const Refusal& r) {
        c.normality_w = c.normality_p = not_defined;
        c.normality_note = r.what();  // beyond 5000 rows, or residuals that do not vary
    }

    // Constant variance: Breusch–Pagan in Koenker's studentized form, LM = n R² of the squared
    // residuals on the predictors, χ² with k df (Breusch & Pagan 1979, Econometrica 47, 1287–1294;
    // Koenker 1981, J. Econometrics 17, 107–112).
    try {
        std::vector<double> squared(n);
        for (std::size_t i = 0; i < n; ++i) squared[i] = m.residuals[i] * m.residuals[i];
        const LinearModel aux = fit_least_squares(squared, data.predictors, data.names, true);
        c.spread_lm = nn * aux.r_squared;
        c.spread_df = static_cast<double>(k);
        const boost::math::chi_squared dist(c.spread_df);
        c.spread_p = boost::math::cdf(boost::math::complement(dist, std::max(0.0, c.spread_lm)));
    } catch (const Refusal&) {
        // Squared residuals all equal (or too few rows): the auxiliary regression has nothing to explain.
        c.spread_lm = c.spread_p = not_defined;
        c.spread_note = "not defined: the squared residuals do not vary";
    }

    // Independence in sampling order: Durbin–Watson (Durbin & Watson 1950, Biometrika 37, 409–428).
    // Rows in no particular order (plots of a forest, say) cannot be judged: without `order` there
    // is no statistic, rather than one computed in an order that means nothing.
    c.ordered = !order.empty();
    c.durbin_watson = not_defined;
    if (c.ordered) {
        const std::vector<std::size_t> rows = sampling_order(order, data);
        Accumulator differences, squares;
        for (std::size_t i = 0; i < n; ++i) {
            const double e = m.residuals[rows[i]];
            squares.add(e * e);
            if (i > 0) {
                const double d = e - m.residuals[rows[i - 1]];
                differences.add(d * d);
            }
        }
        c.durbin_watson = differences.sum() / squares.sum();
    }

    // Linearity: Ramsey's RESET, adding the squared and cubed fitted values, F test of the two
    // added terms (Ramsey 1969, JRSS B 31, 350–371). The fitted values are standardized first:
    // the same column space, better conditioned.
    c.reset_df = 2;
    c.reset_df2 = nn - static_cast<double>(m.parameters) - 2.0;
    try {
        if (c.reset_df2 < 1) throw Refusal("too few rows");
        const double centre = mean(m.fitted);
        const double spread = std::sqrt(sum_of_squares(m.fitted, centre) / nn);
        if (!(spread > 0)) throw Refusal("the fitted values do not vary");
        std::vector<std::vector<double>> augmented = data.predictors;
        std::vector<std::string> names = data.names;
        std::vector<double> square(n), cube(n);
        for (std::size_t i = 0; i < n; ++i) {
            const double z = (m.fitted[i] - centre) / spread;
            square[i] = z * z;
            cube[i] = z * z * z;
        }
        augmented.push_back(std::move(square));
        augmented.push_back(std::move(cube));
        names.push_back("fitted²");
        names.push_back("fitted³");
        const LinearModel wide = fit_least_squares(data.y, augmented, names, true);
        if (wide.perfect_fit) throw Refusal("the augmented model fits exactly");
        c.reset_f = ((m.rss - wide.rss) / 2.0) / (wide.rss / c.reset_df2);
        c.reset_f = std::max(0.0, c.reset_f);
        const boost::math::fisher_f dist(c.reset_df, c.reset_df2);
        c.reset_p = boost::math::cdf(boost::math::complement(dist, c.reset_f));
    } catch (const Refusal&) {
        // Too few rows, or fitted² and fitted³ already in the predictors' span (a predictor with
        // two or three distinct values): the added terms cannot be tested.
        c.reset_f = c.reset_p = not_defined;
        c.linearity_note = c.reset_df2 < 1 ? "not defined: needs at least " + std::to_string(m.parameters + 3) + " rows"
                                           : std::string("not defined: the squared and cubed fitted values add nothing "
                                                         "to the predictors (too few distinct values)");
    }

    // Collinearity: the largest variance inflation factor.
    c.max_vif = 0;
    for (std::size_t j = 0; j < m.parameters; ++j)
        if (std::isfinite(m.vif[j])) c.max_vif = std::max(c.max_vif, m.vif[j]);

    // Influence and outliers. The cut-off of the verdict is the median of F(p, n − p) (Cook &
    // Weisberg 1982, Residuals and Influence in Regression, p. 118): a row moving the estimates
    // beyond the centre of their joint confidence region. 4/n and 2p/n are counted for information.
    const Influence inf = influence_measures(m);
    const double p = static_cast<double>(m.parameters);
    c.cook_cut = m.df_residual >= 1 ? boost::math::median(boost::math::fisher_f(p, m.df_residual)) : not_defined;
    const double four_over_n = 4.0 / nn;
    const double leverage_cut = 2.0 * p / nn;
    c.max_cook = not_defined;
    for (std::size_t i = 0; i < n; ++i) {
        if (std::isfinite(inf.cook[i])) {
            c.max_cook = std::isfinite(c.max_cook) ? std::max(c.max_cook, inf.cook[i]) : inf.cook[i];
            if (inf.cook[i] > four_over_n) ++c.cook_above;
            if (inf.cook[i] > c.cook_cut) ++c.cook_above_cut;
        }
        if (m.leverage[i] > leverage_cut) ++c.high_leverage;
        if (std::isfinite(inf.studentized[i]) && std::fabs(inf.studentized[i]) > 3.0) ++c.outliers;
    }
    return c;
}

const std::vector<std::string>& check_regression_outputs() {
    static const std::vector<std::string> keys = {"table",        "normality",    "spread",    "independence",
                                                  "linearity",    "collinearity", "influence", "outliers"};
    return keys;
}

Table check_regression_output(const LinearModel& m, const RegressionData& data, const std::string& output,
                              const Range& order) {
    const ModelChecks c = check_regression(m, data, order);
    const auto need = [](double x, const std::string& what, const std::string& note) -> Table {
        if (!std::isfinite(x)) throw Refusal(what + " is " + (note.empty() ? "not defined for these data" : note));
        return single(x);
    };
    if (output == "normality") return need(c.normality_p, "the normality check", c.normality_note);
    if (output == "spread") return need(c.spread_p, "the spread check", c.spread_note);
    if (output == "independence") {
        if (!c.ordered)
            throw Refusal("independence needs the sampling order: give order (a column of dates, times or distances); "
                          "rows in no particular order cannot be judged");
        return need(c.durbin_watson, "the independence check", "");
    }
    if (output == "linearity") return need(c.reset_p, "the linearity check", c.linearity_note);
    if (output == "collinearity") return single(c.max_vif);
    if (output == "influence") return need(c.max_cook, "the influence check", "");
    if (output == "outliers") return single(static_cast<double>(c.outliers));

    // The table. Screening rules, stated in the rule column: p < 0.05 and Durbin–Watson 1.5 to 2.5
    // and VIF > 10 are common practice, no single source; the influence cut-off is Cook and
    // Weisberg's (1982).
    const double nn = static_cast<double>(m.n);
    const std::string ok = "ok", look = "look";
    const auto verdict_p = [&](double p) -> CellValue {
        if (!std::isfinite(p)) return std::monostate{};
        return p < 0.05 ? look : ok;
    };
    const std::size_t predictors = data.predictors.size();
    Table t;
    t.push_back({std::string("check"), std::string("statistic"), std::string("p"), std::string("rule"), std::string("verdict")});
    t.push_back({std::string("normality"), number_or_blank(c.normality_w), number_or_blank(c.normality_p),
                 c.normality_note.empty() ? std::string("Shapiro–Wilk W on the residuals; look when p < 0.05")
                                          : "Shapiro–Wilk W on the residuals: " + c.normality_note,
                 verdict_p(c.normality_p)});
    t.push_back({std::string("spread"), number_or_blank(c.spread_lm), number_or_blank(c.spread_p),
                 c.spread_note.empty()
                     ? "Breusch–Pagan (studentized) LM, χ² with " + format_df(c.spread_df) + " df; look when p < 0.05"
                     : "Breusch–Pagan (studentized): " + c.spread_note,
                 verdict_p(c.spread_p)});
    if (c.ordered)
        t.push_back({std::string("independence"), number_or_blank(c.durbin_watson), std::monostate{},
                     std::string("Durbin–Watson in the order given by order; look outside 1.5 to 2.5"),
                     !std::isfinite(c.durbin_watson)                          ? CellValue{std::monostate{}}
                     : (c.durbin_watson < 1.5 || c.durbin_watson > 2.5) ? CellValue{look}
                                                                              : CellValue{ok}});
    else
        t.push_back({std::string("independence"), std::monostate{}, std::monostate{},
                     std::string("no verdict: rows in no particular order cannot be judged; give order (dates, times "
                                 "or distances) for Durbin–Watson"),
                     std::monostate{}});
    t.push_back({std::string("linearity"), number_or_blank(c.reset_f), number_or_blank(c.reset_p),
                 c.linearity_note.empty()
                     ? "RESET with fitted² and fitted³, F(2, " + format_df(c.reset_df2) + "); look when p < 0.05"
                     : "RESET: " + c.linearity_note,
                 verdict_p(c.reset_p)});
    t.push_back({std::string("collinearity"), c.max_vif, std::monostate{},
                 predictors == 1 ? std::string("largest VIF (one predictor: always 1); look when > 10")
                                 : std::string("largest VIF; look when > 10"),
                 c.max_vif > 10 ? look : ok});
    const std::string influence_rule =
        "largest Cook's distance; look when above the median of F(" + format_df(static_cast<double>(m.parameters)) + ", " +
        format_df(m.df_residual) + ") = " + format_number(c.cook_cut) + " (Cook & Weisberg 1982); for information, " +
        count_rows(c.cook_above) + " above 4/n = " + format_number(4.0 / nn) + ", " + count_rows(c.high_leverage) +
        " with leverage above 2p/n = " + format_number(2.0 * static_cast<double>(m.parameters) / nn);
    t.push_back({std::string("influence"), number_or_blank(c.max_cook), std::monostate{}, influence_rule,
                 !std::isfinite(c.max_cook) || !std::isfinite(c.cook_cut) ? CellValue{std::monostate{}}
                 : c.max_cook > c.cook_cut                                  ? CellValue{look}
                                                                              : CellValue{ok}});
    t.push_back({std::string("outliers"), static_cast<double>(c.outliers), std::monostate{},
                 std::string("rows with |externally studentized residual| > 3; look when any"),
                 c.outliers > 0 ? look : ok});
    return t;
}

}  // namespace quadrat
