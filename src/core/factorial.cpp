#include "factorial.hpp"

#include <cmath>
#include <unordered_map>

#include <Eigen/Dense>
#include <boost/math/distributions/fisher_f.hpp>

#include "data.hpp"
#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

using Eigen::Index;
using Eigen::MatrixXd;
using Eigen::VectorXd;

// Effect coding for one factor with sum-to-zero contrasts: column i is +1 for level i, −1 for the
// last level, 0 otherwise. Type III tests depend on this coding (Searle 1987, Linear Models for
// Unbalanced Data, §4); Type II tests do not.
MatrixXd effect_columns(const std::vector<std::size_t>& level, std::size_t levels) {
    MatrixXd X = MatrixXd::Zero(Index(level.size()), Index(levels - 1));
    for (std::size_t i = 0; i < level.size(); ++i)
        for (std::size_t c = 0; c + 1 < levels; ++c)
            X(Index(i), Index(c)) = level[i] == c ? 1.0 : (level[i] == levels - 1 ? -1.0 : 0.0);
    return X;
}

MatrixXd interaction_columns(const MatrixXd& A, const MatrixXd& B) {
    MatrixXd X(A.rows(), A.cols() * B.cols());
    for (Index i = 0; i < A.cols(); ++i)
        for (Index j = 0; j < B.cols(); ++j) X.col(i * B.cols() + j) = A.col(i).cwiseProduct(B.col(j));
    return X;
}

MatrixXd with_intercept(std::initializer_list<const MatrixXd*> blocks, Index n) {
    Index columns = 1;
    for (const MatrixXd* b : blocks) columns += b->cols();
    MatrixXd X(n, columns);
    X.col(0).setOnes();
    Index at = 1;
    for (const MatrixXd* b : blocks) {
        X.middleCols(at, b->cols()) = *b;
        at += b->cols();
    }
    return X;
}

// A least-squares fit by column-pivoted Householder QR: the fitted values (the projection of y on
// the columns' span, rank-deficient designs included) and the rank. Sums of squares of an effect
// are then ‖ŷ_larger − ŷ_smaller‖², not a difference of two residual sums, so that a small effect
// beside a large residual keeps its digits.
struct LeastSquares {
    VectorXd fitted;
    Index rank = 0;
};

LeastSquares project(const MatrixXd& X, const VectorXd& y) {
    Eigen::ColPivHouseholderQR<MatrixXd> qr(X);
    qr.setThreshold(1e-10);
    LeastSquares fit;
    fit.rank = qr.rank();
    VectorXd qty = qr.householderQ().transpose() * y;
    qty.tail(qty.size() - fit.rank).setZero();
    fit.fitted = qr.householderQ() * qty;
    return fit;
}

double squared_distance(const VectorXd& a, const VectorXd& b) {
    Accumulator s;
    for (Index i = 0; i < a.size(); ++i) s.add((a[i] - b[i]) * (a[i] - b[i]));
    return s.sum();
}

AnovaRow effect_row(std::string source, const LeastSquares& larger, const LeastSquares& smaller) {
    AnovaRow r;
    r.source = std::move(source);
    r.ss = squared_distance(larger.fitted, smaller.fitted);
    r.df = double(larger.rank - smaller.rank);
    return r;
}

void finish(AnovaRow& effect, const AnovaRow& residual) {
    effect.ms = effect.ss / effect.df;
    effect.f = effect.ms / residual.ms;
    effect.p = boost::math::cdf(boost::math::complement(boost::math::fisher_f_distribution<double>(effect.df, residual.df), effect.f));
    // Partial η² = SS_effect / (SS_effect + SS_residual) (Cohen 1973, Educ. Psychol. Meas. 33, 107–112).
    effect.partial_eta_squared = effect.ss / (effect.ss + residual.ss);
}

std::vector<std::size_t> level_indices(const std::vector<std::string>& labels, std::vector<std::string>& levels) {
    std::unordered_map<std::string, std::size_t> index;
    std::vector<std::size_t> out;
    out.reserve(labels.size());
    for (const auto& label : labels) {
        auto [it, inserted] = index.try_emplace(label, levels.size());
        if (inserted) levels.push_back(label);
        out.push_back(it->second);
    }
    return out;
}

}  // namespace

FactorialData read_factorial_data(const Range& values, const Range& factor1, const Range& factor2) {
    if (values.empty()) throw Refusal("values is empty");
    if (values.columns != 1 || factor1.columns != 1 || factor2.columns != 1)
        throw Refusal("values, factor1 and factor2 must each be one column");
    const Frame f = read_frame({{&values, ColumnKind::numeric, "values"},
                                {&factor1, ColumnKind::label, "factor1"},
                                {&factor2, ColumnKind::label, "factor2"}});
    FactorialData d;
    d.y = f.numbers[0];
    d.first = level_indices(f.labels[1], d.first_levels);
    d.second = level_indices(f.labels[2], d.second_levels);
    d.first_name = f.names[1].empty() ? "factor1" : f.names[1];
    d.second_name = f.names[2].empty() ? "factor2" : f.names[2];
    d.n_dropped = f.n_dropped;
    return d;
}

FactorialAnova fit_factorial(const FactorialData& d, int sstype) {
    if (sstype != 2 && sstype != 3) throw Refusal("sstype must be 2 (Type II) or 3 (Type III)");
    const std::size_t n = d.y.size(), a = d.first_levels.size(), b = d.second_levels.size();
    if (n == 0) throw Refusal("no row has a value and both factor labels");
    auto one_level = [](const std::string& argument, const std::vector<std::string>& levels) {
        return Refusal(argument + " has a single level (" + levels.front() +
                       "); a two-way analysis needs at least 2 levels of each factor (for one factor use COMPARE.GROUPS)");
    };
    if (a < 2) throw one_level("factor1", d.first_levels);
    if (b < 2) throw one_level("factor2", d.second_levels);

    // Cell counts: an empty combination leaves the Type III hypotheses undefined (their
    // sum-to-zero means average over a cell that has no mean).
    std::vector<std::size_t> cell(a * b, 0);
    for (std::size_t i = 0; i < n; ++i) ++cell[d.first[i] * b + d.second[i]];
    std::size_t empty_cells = 0;
    for (std::size_t i = 0; i < a && sstype == 3; ++i)
        for (std::size_t j = 0; j < b; ++j)
            if (cell[i * b + j] == 0)
                throw Refusal("no observations for " + d.first_name + " = " + d.first_levels[i] + " with " + d.second_name +
                              " = " + d.second_levels[j] +
                              "; Type III sums of squares compare means of every combination, so each needs data (use sstype 2)");
    for (std::size_t c : cell) empty_cells += c == 0;

    // Centre y: every model has an intercept, so this changes no sum of squares and keeps digits.
    VectorXd y(static_cast<Index>(n));
    const double centre = mean(d.y);
    for (std::size_t i = 0; i < n; ++i) y[Index(i)] = d.y[i] - centre;

    const MatrixXd A = effect_columns(d.first, a), B = effect_columns(d.second, b), AB = interaction_columns(A, B);
    const Index rows = Index(n);
    const LeastSquares full = project(with_intercept({&A, &B, &AB}, rows), y);
    const LeastSquares additive = project(with_intercept({&A, &B}, rows), y);

    FactorialAnova anova;
    anova.sstype = sstype;
    anova.n = double(n);
    anova.n_dropped = double(d.n_dropped);
    anova.residual.source = "residual";
    anova.residual.df = double(rows - full.rank);
    if (anova.residual.df < 1)
        throw Refusal("no replication: each combination of " + d.first_name + " and " + d.second_name +
                      " has one value, so there is no residual to test against");
    anova.residual.ss = squared_distance(y, full.fitted);
    anova.residual.ms = anova.residual.ss / anova.residual.df;
    Accumulator total;
    for (Index i = 0; i < rows; ++i) total.add(y[i] * y[i]);
    if (!(anova.residual.ss > 1e-13 * total.sum()))
        throw Refusal("no spread within the combinations of " + d.first_name + " and " + d.second_name +
                      ": every value equals its combination's mean, so F cannot be formed");

    const std::string interaction = d.first_name + " × " + d.second_name;
    if (sstype == 2) {
        // Type II: SS(A | B), SS(B | A), SS(AB | A, B) (Langsrud 2003, Statistics and Computing 13, 163–167).
        const LeastSquares only_first = project(with_intercept({&A}, rows), y);
        const LeastSquares only_second = project(with_intercept({&B}, rows), y);
        anova.first = effect_row(d.first_name, additive, only_second);
        anova.second = effect_row(d.second_name, additive, only_first);
    } else {
        // Type III: each effect against the full model without its own columns, sum-to-zero coding.
        anova.first = effect_row(d.first_name, full, project(with_intercept({&B, &AB}, rows), y));
        anova.second = effect_row(d.second_name, full, project(with_intercept({&A, &AB}, rows), y));
    }
    anova.interaction = effect_row(interaction, full, additive);
    if (anova.interaction.df < 1)
        throw Refusal("the interaction cannot be estimated: " + std::to_string(empty_cells) +
                      (empty_cells == 1 ? " combination of levels has" : " combinations of levels have") +
                      " no observations; fill them or drop a level");
    finish(anova.first, anova.residual);
    finish(anova.second, anova.residual);
    finish(anova.interaction, anova.residual);
    return anova;
}

const std::vector<std::string>& factorial_outputs() {
    static const std::vector<std::string> outputs = {"table", "p-first", "p-second", "p-interaction"};
    return outputs;
}

Table factorial_table(const FactorialAnova& anova) {
    Table t;
    t.push_back({std::string("source"), std::string("SS"), std::string("df"), std::string("MS"), std::string("F"),
                 std::string("p"), std::string("partial η²")});
    for (const AnovaRow* r : {&anova.first, &anova.second, &anova.interaction})
        t.push_back({r->source, r->ss, r->df, r->ms, r->f, r->p, r->partial_eta_squared});
    const AnovaRow& e = anova.residual;
    t.push_back({e.source, e.ss, e.df, e.ms, std::monostate{}, std::monostate{}, std::monostate{}});
    return t;
}

}  // namespace quadrat
