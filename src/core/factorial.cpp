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

// Every model here is constant within a cell (a combination of levels), so a least-squares fit
// of the n values is a weighted fit of the cell means with weights n_c, and the distance between
// two fits is Σ n_c (f_big − f_small)². Working on the cells keeps the cost at O(n) for reading
// plus a QR of a (cells × columns) matrix, whatever n is; the residual sum of squares is the
// within-cell sum, computed about each cell's own mean.
//
// The projection of √n·m (cell means scaled by √n_c) on the span of √n·X, by column-pivoted
// Householder QR (rank-deficient designs included), and the rank. Sums of squares of an effect
// are then ‖p_larger − p_smaller‖², not a difference of two residual sums, so that a small effect
// beside a large residual keeps its digits.
struct LeastSquares {
    VectorXd fitted;  // in the weighted (√n_c) scale
    Index rank = 0;
};

LeastSquares project(const MatrixXd& X, const VectorXd& root_n, const VectorXd& weighted_means) {
    const MatrixXd WX = root_n.asDiagonal() * X;
    Eigen::ColPivHouseholderQR<MatrixXd> qr(WX);
    qr.setThreshold(1e-10);
    LeastSquares fit;
    fit.rank = qr.rank();
    VectorXd qty = qr.householderQ().transpose() * weighted_means;
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
    refuse_beyond_model_scale(d.y, "values");
    d.first = level_indices(f.labels[1], d.first_levels);
    d.second = level_indices(f.labels[2], d.second_levels);
    d.first_name = f.names[1].empty() ? "factor1" : f.names[1];
    d.second_name = f.names[2].empty() ? "factor2" : f.names[2];
    d.n_dropped = f.n_dropped;
    return d;
}

FactorialAnova fit_factorial(const FactorialData& d, int sums) {
    if (sums != 2 && sums != 3) throw Refusal("sums must be type-2 or type-3");
    const std::size_t n = d.y.size(), a = d.first_levels.size(), b = d.second_levels.size();
    if (n == 0) throw Refusal("no row has a value and both factor labels");
    auto one_level = [](const std::string& argument, const std::vector<std::string>& levels) {
        return Refusal(argument + " has a single level (" + levels.front() +
                       "); a two-way analysis needs at least 2 levels of each factor (for one factor use COMPARE.GROUPS)");
    };
    if (a < 2) throw one_level("factor1", d.first_levels);
    if (b < 2) throw one_level("factor2", d.second_levels);

    // Designs with very many combinations are refused rather than given a huge dense QR.
    constexpr std::size_t largest_design = 400;
    if (a * b > largest_design)
        throw Refusal("factor1 and factor2 make " + std::to_string(a * b) + " combinations of levels; at most " +
                      std::to_string(largest_design) + " are supported");

    // The cells: count, mean and within-cell sum of squares of y centred on its grand mean (every
    // model has an intercept, so centring changes no sum of squares and keeps digits).
    const double centre = mean(d.y);
    std::vector<std::vector<double>> cell_values(a * b);
    for (std::size_t i = 0; i < n; ++i) cell_values[d.first[i] * b + d.second[i]].push_back(d.y[i] - centre);

    // An empty combination leaves the Type III hypotheses undefined (their sum-to-zero means
    // average over a cell that has no mean).
    std::size_t empty_cells = 0;
    for (std::size_t i = 0; i < a; ++i)
        for (std::size_t j = 0; j < b; ++j) {
            if (!cell_values[i * b + j].empty()) continue;
            ++empty_cells;
            if (sums == 3)
                throw Refusal("no observations for " + d.first_name + " = " + d.first_levels[i] + " with " + d.second_name +
                              " = " + d.second_levels[j] +
                              "; Type III sums of squares compare means of every combination, so each needs data (use sums type-2)");
        }
    const std::size_t cells = a * b - empty_cells;
    std::vector<std::size_t> cell_first, cell_second;
    VectorXd root_n(static_cast<Index>(cells)), weighted_means(static_cast<Index>(cells));
    Accumulator within;
    for (std::size_t i = 0, c = 0; i < a; ++i)
        for (std::size_t j = 0; j < b; ++j) {
            const auto& v = cell_values[i * b + j];
            if (v.empty()) continue;
            const double m = mean(v);
            within.add(sum_of_squares(v, m));
            cell_first.push_back(i);
            cell_second.push_back(j);
            root_n[Index(c)] = std::sqrt(double(v.size()));
            weighted_means[Index(c)] = root_n[Index(c)] * m;
            ++c;
        }

    FactorialAnova anova;
    anova.sums = sums;
    anova.n = double(n);
    anova.n_dropped = double(d.n_dropped);
    anova.residual.source = "residual";
    // The full model fits every non-empty cell's mean: its rank is the number of such cells.
    anova.residual.df = double(n - cells);
    if (anova.residual.df < 1)
        throw Refusal("no replication: each combination of " + d.first_name + " and " + d.second_name +
                      " has one value, so there is no residual to test against");
    anova.residual.ss = within.sum();
    anova.residual.ms = anova.residual.ss / anova.residual.df;
    Accumulator total;
    for (double x : d.y) total.add((x - centre) * (x - centre));
    if (!(anova.residual.ss > 1e-13 * total.sum()))
        throw Refusal("no spread within the combinations of " + d.first_name + " and " + d.second_name +
                      ": every value equals its combination's mean, so F cannot be formed");

    const MatrixXd A = effect_columns(cell_first, a), B = effect_columns(cell_second, b), AB = interaction_columns(A, B);
    const Index rows = Index(cells);
    auto fit = [&](std::initializer_list<const MatrixXd*> blocks) {
        return project(with_intercept(blocks, rows), root_n, weighted_means);
    };
    LeastSquares full;
    full.fitted = weighted_means;
    full.rank = rows;
    const LeastSquares additive = fit({&A, &B});

    const std::string interaction = d.first_name + " × " + d.second_name;
    if (sums == 2) {
        // Type II: SS(A | B), SS(B | A), SS(AB | A, B) (Langsrud 2003, Statistics and Computing 13, 163–167).
        const LeastSquares only_first = fit({&A});
        const LeastSquares only_second = fit({&B});
        anova.first = effect_row(d.first_name, additive, only_second);
        anova.second = effect_row(d.second_name, additive, only_first);
    } else {
        // Type III: each effect against the full model without its own columns, sum-to-zero coding.
        anova.first = effect_row(d.first_name, full, fit({&B, &AB}));
        anova.second = effect_row(d.second_name, full, fit({&A, &AB}));
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
