#include "linear_model.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include <Eigen/Dense>
#include <boost/math/distributions/fisher_f.hpp>
#include <boost/math/distributions/students_t.hpp>

#include "data.hpp"
#include "exact_scaling.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

// The QR runs in extended precision (x87 long double, 64-bit significand): about three more
// digits than double on the hardest certified designs (NIST Wampler5, Filip) for O(n p²) work.
using Real = long double;
using Matrix = Eigen::Matrix<Real, Eigen::Dynamic, Eigen::Dynamic>;
using Vector = Eigen::Matrix<Real, Eigen::Dynamic, 1>;
using RowVector = Eigen::Matrix<Real, 1, Eigen::Dynamic>;

constexpr double not_defined = std::numeric_limits<double>::quiet_NaN();

// More predictor columns than this would make a single cell recompute for seconds (the cost is
// O(n p²)); no field table has them. Our bound, no source.
constexpr std::size_t max_predictors = 100;

// A pivot of the column-scaled R below this fraction of the largest is taken as a linear
// dependence. Exactly collinear columns give about 1e-16; the hardest certified design (NIST
// Filip, a degree-10 polynomial) gives about 1e-9 after centring and scaling, and is kept.
constexpr double rank_tolerance = 1e-12;

// Designs whose condition number (of the centred, scaled design) is below this are factored in
// double: the refinement then gains about 14 digits per step and settles in two, and the standard
// errors, taken from the double R, lose under a tenth of a digit. Measured: NIST Longley (κ 115
// after centring and scaling) lost 0.4 digit of its standard errors with double factors, so it
// stays in extended precision with the polynomials (10³ to 10⁹); the test designs and a field
// table of a few predictors have κ from 1 to about 15. Our bound, no source.
constexpr double well_conditioned = 30;

// Residuals whose root mean square is within this many units of rounding of the data's magnitude
// are rounding, not misfit: the fit is perfect (NIST Wampler1 and Wampler2 certify σ = 0).
constexpr double perfect_fit_ulps = 64.0;

// Σx², uncentred (the total sum of squares of a model through the origin).
double sum_of_raw_squares(std::span<const double> xs) {
    Accumulator acc;
    for (double v : xs) acc.add(v * v);
    return acc.sum();
}

std::string list_names(const std::vector<std::string>& names, std::size_t count) {
    std::string s;
    const std::size_t shown = std::min<std::size_t>(count, 5);
    for (std::size_t j = 0; j < shown; ++j) s += (j ? ", " : "") + names[j];
    if (count > shown) s += ", …";
    return s;
}

// Numerical rank of the first `count` columns of X.
Eigen::Index rank_of_leading(const Matrix& x, Eigen::Index count) {
    Eigen::ColPivHouseholderQR<Matrix> qr(x.leftCols(count));
    qr.setThreshold(rank_tolerance);
    return qr.rank();
}

// The first column (in column order) that is a linear combination of those before it.
[[noreturn]] void refuse_collinear(const Matrix& x, const std::vector<std::string>& names, bool intercept) {
    for (Eigen::Index j = 1; j <= x.cols(); ++j)
        if (rank_of_leading(x, j) < j) {
            const auto col = static_cast<std::size_t>(j - 1);
            if (col == 0)  // only reachable without intercept: the first column is (numerically) zero
                throw Refusal(names[0] + " is zero in every used row; it cannot be estimated");
            throw Refusal(names[col] + " is a linear combination of " + list_names(names, col) +
                          (intercept ? " and the intercept" : "") +
                          " (collinear predictors); remove one of them");
        }
    throw Refusal("the predictors are collinear; remove one of them");
}

double two_sided_t_p(double t, double df) {
    if (!std::isfinite(t)) return not_defined;
    const boost::math::students_t dist(df);
    return 2.0 * boost::math::cdf(boost::math::complement(dist, std::fabs(t)));
}

}  // namespace

double LinearModel::ci_low(std::size_t j, double level) const {
    const boost::math::students_t dist(df_residual);
    const double q = boost::math::quantile(boost::math::complement(dist, (1.0 - level) / 2.0));
    return estimate[j] - q * std_error[j];
}

double LinearModel::ci_high(std::size_t j, double level) const {
    const boost::math::students_t dist(df_residual);
    const double q = boost::math::quantile(boost::math::complement(dist, (1.0 - level) / 2.0));
    return estimate[j] + q * std_error[j];
}

namespace {
// The row of B for predictor values x: the constant column, then (x_j − centre_j)/scale_j.
std::vector<double> design_row(const LinearModel& m, std::span<const double> x) {
    if (x.size() != m.centre.size())
        throw Refusal("a prediction row needs " + std::to_string(m.centre.size()) + " predictor values, found " +
                      std::to_string(x.size()));
    std::vector<double> b;
    if (m.intercept) b.push_back(m.constant_column);
    for (std::size_t j = 0; j < x.size(); ++j) b.push_back((x[j] - m.centre[j]) / m.scale[j]);
    return b;
}
}  // namespace

double LinearModel::predicted_at(std::span<const double> x) const {
    const std::vector<double> b = design_row(*this, x);
    Accumulator sum;
    sum.add(y_centre);
    for (std::size_t j = 0; j < b.size(); ++j) sum.add(b[j] * solution[j]);
    return sum.sum();
}

double LinearModel::leverage_at(std::span<const double> x) const {
    const std::vector<double> b = design_row(*this, x);
    const std::size_t p = b.size();
    double h = 0;
    for (std::size_t j = 0; j < p; ++j) {
        Accumulator entry;  // (b G)_j
        for (std::size_t i = 0; i < p; ++i) entry.add(b[i] * inverse_factor[i * p + j]);
        h += entry.sum() * entry.sum();
    }
    return h;
}

LinearModel fit_least_squares(std::span<const double> y, const std::vector<std::vector<double>>& predictors,
                              const std::vector<std::string>& names, bool intercept) {
    const std::size_t n = y.size();
    const std::size_t k = predictors.size();
    const std::size_t parameters = k + (intercept ? 1 : 0);

    // Edge cases first, each with what to do about it.
    if (parameters == 0) throw Refusal("the model has no terms");
    if (k > max_predictors)
        throw Refusal("xs has " + std::to_string(k) + " columns; at most " + std::to_string(max_predictors) +
                      " predictors are fitted");
    if (n <= parameters)
        throw Refusal("needs more complete rows than terms: found " + count_of(n, "row") + " for " +
                      std::to_string(parameters) + " terms; add rows or remove predictors");
    for (double v : y)
        if (!std::isfinite(v)) throw Refusal("y holds a value that is not a finite number");
    for (std::size_t j = 0; j < k; ++j)
        for (double v : predictors[j])
            if (!std::isfinite(v)) throw Refusal(names[j] + " holds a value that is not a finite number");
    refuse_beyond_model_scale(y, "y");
    for (std::size_t j = 0; j < k; ++j) refuse_beyond_model_scale(predictors[j], names[j]);

    // Centre y and the predictors when there is an intercept: the intercept's column is then
    // orthogonal to the rest and the QR works on the spread, not on the level (Longley's x6 ≈ 1950).
    const double y_centre = intercept ? mean(y) : 0.0;
    const double tss = intercept ? sum_of_squares(y, y_centre) : sum_of_raw_squares(y);
    if (tss == 0.0)
        throw Refusal(intercept ? "y is constant (every used row holds " + format_number(y[0]) +
                                      "); there is no variation to explain"
                                : "y is zero in every used row; there is nothing to explain");

    // The design B: a constant column (with an intercept), then each predictor centred and scaled
    // by a power of two near its spread. In extended precision the centring is exact for doubles of
    // similar magnitude and the scaling always is, so B is the data's design, not a rounded copy.
    const Eigen::Index offset = intercept ? 1 : 0;
    const Eigen::Index columns = static_cast<Eigen::Index>(parameters);
    const Eigen::Index rows = static_cast<Eigen::Index>(n);
    std::vector<double> centre(k, 0.0), scale(k, 1.0);
    Matrix design(rows, columns);
    // The intercept's column holds 2^-k near 1/√n, so that every column has a norm from 1 to 2.
    const double ones = intercept ? 1.0 / power_of_two_below(std::sqrt(static_cast<double>(n))) : 0.0;
    if (intercept) design.col(0).setConstant(ones);
    for (std::size_t j = 0; j < k; ++j) {
        const std::vector<double>& column = predictors[j];
        centre[j] = intercept ? mean(column) : 0.0;
        const double spread = std::sqrt(intercept ? sum_of_squares(column, centre[j]) : sum_of_raw_squares(column));
        if (spread == 0.0)
            throw Refusal(intercept ? names[j] + " is constant (every used row holds " + format_number(column[0]) +
                                          "); a constant predictor cannot be told apart from the intercept"
                                    : names[j] + " is zero in every used row; it cannot be estimated");
        scale[j] = power_of_two_below(spread);  // exact: changes the conditioning, not the data
        const Eigen::Index jj = offset + static_cast<Eigen::Index>(j);
        for (Eigen::Index i = 0; i < rows; ++i)
            design(i, jj) = (static_cast<Real>(column[static_cast<std::size_t>(i)]) - centre[j]) / scale[j];
    }
    Vector yc(rows);
    for (Eigen::Index i = 0; i < rows; ++i) yc(i) = static_cast<Real>(y[static_cast<std::size_t>(i)]) - y_centre;

    // The factors: in double (vectorized, several times faster) where the design is well
    // conditioned, else in extended precision. Either way the refinement below works on the exact
    // extended design B and its residuals, so the double factors only have to be good enough for
    // its corrections to contract (κ ε_double ≪ 1; Higham 2002, §20.5 on refinement with a
    // lower-precision factorization), and the solution reaches what extended precision allows.
    Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr_double(design.cast<double>());
    qr_double.setThreshold(rank_tolerance);
    bool in_double = qr_double.rank() == columns;
    if (in_double) {
        const Eigen::MatrixXd r = qr_double.matrixR().topLeftCorner(columns, columns).triangularView<Eigen::Upper>();
        const Eigen::JacobiSVD<Eigen::MatrixXd> svd(r);
        in_double = svd.singularValues()(columns - 1) * well_conditioned > svd.singularValues()(0);
    }
    Eigen::ColPivHouseholderQR<Matrix> qr_extended;
    if (!in_double) {
        qr_extended.compute(design);
        qr_extended.setThreshold(rank_tolerance);
        if (qr_extended.rank() < columns)
            refuse_collinear(Matrix(design.rightCols(static_cast<Eigen::Index>(k))), names, intercept);
    }
    const Matrix r_factor = in_double ? Matrix(qr_double.matrixR().topLeftCorner(columns, columns).cast<Real>())
                                      : Matrix(qr_extended.matrixR().topLeftCorner(columns, columns));
    const Eigen::PermutationMatrix<Eigen::Dynamic, Eigen::Dynamic> permutation =
        in_double ? qr_double.colsPermutation() : qr_extended.colsPermutation();
    // Q'f, its first `columns` entries.
    const auto q_adjoint_head = [&](const Vector& f) -> Vector {
        if (in_double) return (qr_double.householderQ().adjoint() * f.cast<double>()).head(columns).cast<Real>();
        return (qr_extended.householderQ().adjoint() * f).head(columns);
    };

    // Solve, then refine the solution and the residuals together on the augmented system
    // [I B; B' 0][r; u] = [y; 0] with the same factors (Björck 1967, BIT 7, 257–278). Refining u
    // alone leaves an error that grows with κ² ‖r‖, which shows on large-residual designs
    // (NIST Wampler4/5); the augmented refinement removes it.
    const auto upper = r_factor.triangularView<Eigen::Upper>();
    const auto& pivots = permutation.indices();
    // One correction of the augmented system from its residuals f = y − r − Bu and g = −Bᵀr.
    const auto correction = [&](const Vector& f, const Vector& g, Vector& du) {
        Vector permuted_g(columns);
        for (Eigen::Index i = 0; i < columns; ++i) permuted_g(i) = g(pivots(i));
        const Vector h = upper.transpose().solve(permuted_g);   // R' h = P' g
        const Vector d = q_adjoint_head(f);                     // Q' f
        const Vector z = upper.solve(d - h);                    // R z = d₁ − h
        du.resize(columns);
        for (Eigen::Index i = 0; i < columns; ++i) du(pivots(i)) = z(i);
    };
    // The first solution from the refinement's own step (r = 0, u = 0: f = y, g = 0).
    Vector u;
    correction(yc, Vector::Zero(columns), u);
    Vector residual = yc - design * u;
    for (int step = 0; step < 4; ++step) {
        const Vector f = yc - residual - design * u;
        const Vector g = -(design.transpose() * residual);
        Vector du;
        correction(f, g, du);
        u += du;
        residual += f - design * du;
        // Settled: a correction below extended precision's own rounding of u changes nothing more
        // (a well-conditioned design settles after one or two; each step costs O(np)).
        bool settled = true;
        for (Eigen::Index j = 0; j < columns; ++j)
            settled = settled && std::fabs(du(j)) <= std::numeric_limits<Real>::epsilon() * std::fabs(u(j));
        if (settled) break;
    }

    // Refinement in extended precision converges to what κ allows in it: a relative error of
    // about κ ε_ld in u (κ² ε_ld with large residuals), and the intercept, moved back from the
    // centred origin, also carries ε_ld Σ|b_j c_j|. Where either could reach a tenth of a double's
    // rounding (NIST Wampler1–5, polynomials of degree 5), the same refinement continues with
    // its residuals f, g and the solution accumulated in binary128 (Björck 1967; Higham 2002,
    // Accuracy and Stability of Numerical Algorithms, §20.5: mixed-precision refinement converges
    // to the higher precision while κ ε_ld < 1). Elsewhere its O(np) software arithmetic is skipped.
    using Quad = __float128;
    double explained = 0;
    std::vector<Quad> u_quad(static_cast<std::size_t>(columns));
    for (Eigen::Index j = 0; j < columns; ++j) u_quad[static_cast<std::size_t>(j)] = u(j);
    {
        const Eigen::JacobiSVD<Matrix> svd{Matrix(upper)};
        const auto& singular = svd.singularValues();
        const long double kappa = singular(0) / singular(columns - 1);
        long double moved = 0, level = std::fabs(static_cast<long double>(y_centre) + u(0) * ones);
        for (std::size_t j = 0; intercept && j < k; ++j)
            moved += std::fabs(u(offset + static_cast<Eigen::Index>(j)) / scale[j] * centre[j]);
        const long double large_residual = 1 + residual.norm() / std::max(yc.norm() - residual.norm(), 1e-300L);
        const long double eps = std::numeric_limits<long double>::epsilon();
        const bool needed = kappa * kappa * large_residual * eps > 1e-17L || (intercept && moved * eps > 1e-17L * level);
        std::vector<Quad> r_quad(static_cast<std::size_t>(rows));
        for (Eigen::Index i = 0; i < rows; ++i) r_quad[static_cast<std::size_t>(i)] = residual(i);
        for (int step = 0; needed && step < 4; ++step) {
            Vector f(rows), g(columns);
            for (Eigen::Index i = 0; i < rows; ++i) {
                Quad fitted = 0;
                for (Eigen::Index j = 0; j < columns; ++j) fitted += Quad(design(i, j)) * u_quad[static_cast<std::size_t>(j)];
                f(i) = static_cast<Real>(Quad(yc(i)) - r_quad[static_cast<std::size_t>(i)] - fitted);
            }
            for (Eigen::Index j = 0; j < columns; ++j) {
                Quad sum = 0;
                for (Eigen::Index i = 0; i < rows; ++i) sum -= Quad(design(i, j)) * r_quad[static_cast<std::size_t>(i)];
                g(j) = static_cast<Real>(sum);
            }
            Vector du;
            correction(f, g, du);
            bool settled = true;  // every correction below binary128's own rounding of its u
            for (Eigen::Index j = 0; j < columns; ++j) {
                const Quad before = u_quad[static_cast<std::size_t>(j)];
                u_quad[static_cast<std::size_t>(j)] += du(j);
                settled = settled && u_quad[static_cast<std::size_t>(j)] == before;
            }
            const Vector moved_rows = f - design * du;
            for (Eigen::Index i = 0; i < rows; ++i) r_quad[static_cast<std::size_t>(i)] += moved_rows(i);
            if (settled) break;
        }
        if (needed) {
            for (Eigen::Index j = 0; j < columns; ++j) u(j) = static_cast<Real>(u_quad[static_cast<std::size_t>(j)]);
            for (Eigen::Index i = 0; i < rows; ++i) residual(i) = static_cast<Real>(r_quad[static_cast<std::size_t>(i)]);
        }
        // The explained sum of squares Σ(ŷ − ȳ)², from the fitted deviations themselves (the
        // predictor columns of B u; through the origin, all of B u), so that R² = ESS/TSS keeps its
        // digits when it is small: 1 − RSS/TSS would lose log10(1/R²) of them (NIST Wampler5,
        // R² = 0.0022). In binary128 where the refinement needed it (the terms then cancel).
        if (needed) {
            Quad ess = 0;
            for (Eigen::Index i = 0; i < rows; ++i) {
                Quad fitted = 0;
                for (Eigen::Index j = offset; j < columns; ++j) fitted += Quad(design(i, j)) * u_quad[static_cast<std::size_t>(j)];
                ess += fitted * fitted;
            }
            explained = static_cast<double>(ess);
        } else {
            // In extended precision: binary128's software arithmetic per row cost a fifth of a fit.
            explained = static_cast<double>((design.rightCols(columns - offset) * u.tail(columns - offset)).squaredNorm());
        }
    }

    std::vector<double> slope(k);
    Quad b0 = intercept ? Quad(y_centre) + u_quad[0] * Quad(ones) : Quad(0);
    for (std::size_t j = 0; j < k; ++j) {
        const Quad s = u_quad[static_cast<std::size_t>(offset) + j] / Quad(scale[j]);
        slope[j] = static_cast<double>(s);
        if (intercept) b0 -= s * Quad(centre[j]);
    }

    LinearModel m;
    m.intercept = intercept;
    m.n = n;
    m.parameters = parameters;
    m.df_model = static_cast<double>(k);
    m.df_residual = static_cast<double>(n - parameters);
    m.tss = tss;

    m.rss = static_cast<double>(residual.squaredNorm());

    if (intercept) {
        m.terms.push_back("intercept");
        m.estimate.push_back(static_cast<double>(b0));
    }
    for (std::size_t j = 0; j < k; ++j) {
        m.terms.push_back(names[j]);
        m.estimate.push_back(slope[j]);
    }

    // Perfect fit: residuals no larger than the rounding of the data (see perfect_fit_ulps).
    double magnitude = 0;
    for (std::size_t i = 0; i < n; ++i) {
        double row = std::fabs(y[i]) + (intercept ? std::fabs(m.estimate[0]) : 0.0);
        for (std::size_t j = 0; j < k; ++j) row += std::fabs(slope[j] * predictors[j][i]);
        magnitude = std::max(magnitude, row);
    }
    const double rms = std::sqrt(m.rss / static_cast<double>(n));
    m.perfect_fit = rms <= perfect_fit_ulps * std::numeric_limits<double>::epsilon() * magnitude;
    if (m.perfect_fit) {
        m.rss = 0.0;
        residual.setZero();
    }
    m.residual_sd = std::sqrt(m.rss / m.df_residual);

    // (B'B)⁻¹ = G G' with G = P R⁻¹ (B P = Q R).
    const Matrix g = permutation * Matrix(upper.solve(Matrix::Identity(columns, columns)));

    if (intercept) {
        // b0 = ȳ + a u₀ − Σ c_j u_j / s_j (a the constant column's value), a linear combination ℓ'u: var = σ² ‖ℓ'G‖².
        RowVector combination(columns);
        combination(0) = ones;
        for (std::size_t j = 0; j < k; ++j) combination(offset + static_cast<Eigen::Index>(j)) = -centre[j] / scale[j];
        m.std_error.push_back(m.residual_sd * std::sqrt(static_cast<double>((combination * g).squaredNorm())));
        m.vif.push_back(not_defined);
    }
    for (std::size_t j = 0; j < k; ++j) {
        const Eigen::Index jj = offset + static_cast<Eigen::Index>(j);
        const double row_norm2 = static_cast<double>(g.row(jj).squaredNorm());
        m.std_error.push_back(m.residual_sd * std::sqrt(row_norm2) / scale[j]);
        // VIF_j = (C⁻¹)_jj C_jj for the centred cross-product C: scale-free, and equal to
        // 1/(1 − R²_j) of x_j on the other predictors (Marquardt 1970, Technometrics 12, 591–612).
        // With an intercept the predictor block of (B'B)⁻¹ is C⁻¹ of the exactly centred columns.
        if (intercept) {
            const Vector centred = design.col(jj).array() - design.col(jj).mean();
            m.vif.push_back(row_norm2 * static_cast<double>(centred.squaredNorm()));
        } else {
            m.vif.push_back(not_defined);
        }
    }

    for (std::size_t j = 0; j < parameters; ++j) {
        const double t = m.perfect_fit ? not_defined : m.estimate[j] / m.std_error[j];
        m.t.push_back(t);
        m.p.push_back(two_sided_t_p(t, m.df_residual));
    }

    m.r_squared = m.perfect_fit ? 1.0 : std::min(1.0, explained / tss);
    const double df_total = m.df_residual + m.df_model;
    m.r_squared_adjusted = m.perfect_fit ? 1.0 : 1.0 - (m.rss / m.df_residual) / (tss / df_total);
    if (m.perfect_fit || k == 0) {
        m.f_statistic = not_defined;
        m.f_p = not_defined;
    } else {
        // From the explained sum of squares itself: never negative, and exact to its digits where
        // TSS − RSS would cancel (predictors that explain almost nothing).
        m.f_statistic = (explained / m.df_model) / (m.rss / m.df_residual);
        const boost::math::fisher_f dist(m.df_model, m.df_residual);
        m.f_p = boost::math::cdf(boost::math::complement(dist, m.f_statistic));
    }

    // Gaussian log-likelihood at the maximum, σ̂² = rss/n, with its constants.
    const double nn = static_cast<double>(n);
    if (m.perfect_fit) {
        m.log_likelihood = m.aic = m.bic = not_defined;
    } else {
        m.log_likelihood = -0.5 * nn * (std::log(2.0 * std::numbers::pi) + std::log(m.rss / nn) + 1.0);
        const double counted = static_cast<double>(parameters + 1);
        m.aic = -2.0 * m.log_likelihood + 2.0 * counted;
        m.bic = -2.0 * m.log_likelihood + std::log(nn) * counted;
    }

    m.y_centre = y_centre;
    m.constant_column = ones;
    m.centre = centre;
    m.scale = scale;
    for (Eigen::Index j = 0; j < columns; ++j) m.solution.push_back(static_cast<double>(u(j)));
    for (Eigen::Index i = 0; i < columns; ++i)
        for (Eigen::Index j = 0; j < columns; ++j) m.inverse_factor.push_back(static_cast<double>(g(i, j)));

    // Per row: residuals, fitted values, leverage h_i = ‖B_i G‖². O(n p²), no n×n hat matrix.
    m.residuals.resize(n);
    m.fitted.resize(n);
    m.leverage.resize(n);
    for (std::size_t i = 0; i < n; ++i) {
        const auto ii = static_cast<Eigen::Index>(i);
        m.residuals[i] = static_cast<double>(residual(ii));
        m.fitted[i] = static_cast<double>(static_cast<Real>(y[i]) - residual(ii));
        const double h = static_cast<double>((design.row(ii) * g).squaredNorm());
        m.leverage[i] = std::min(h, 1.0);
    }
    return m;
}

RegressionData read_regression(const Range& y, const Range& xs) {
    if (y.empty()) throw Refusal("y is empty");
    if (xs.empty()) throw Refusal("xs is empty");
    if (y.columns != 1) throw Refusal("y must be one column (found " + std::to_string(y.columns) + ")");
    ModelFrame m = read_model_frame({{&y, ColumnKind::numeric, "y"}}, xs);
    RegressionData d;
    d.y = std::move(m.frame.numbers[0]);
    d.predictors = std::move(m.predictors.columns);
    d.names = std::move(m.predictors.names);
    d.factors = std::move(m.predictors.factors);
    d.factor_of_column = std::move(m.predictors.factor_of_column);
    d.used_rows = std::move(m.frame.used_rows);
    d.rows = m.frame.rows;
    d.n_dropped = m.frame.n_dropped;
    d.has_header = m.frame.has_header;
    return d;
}

namespace {
CellValue number_or_blank(double x) {
    if (std::isfinite(x)) return x;
    return std::monostate{};
}
}  // namespace

Table coefficient_table(const LinearModel& m, double level) {
    Table t;
    t.reserve(m.parameters + 1);
    t.push_back({std::string("variable"), std::string("coefficient"), std::string("SE"), std::string("t"),
                 std::string("p"), std::string("ci-low"), std::string("ci-high"), std::string("VIF")});
    for (std::size_t j = 0; j < m.parameters; ++j)
        t.push_back({m.terms[j], m.estimate[j], m.std_error[j], number_or_blank(m.t[j]), number_or_blank(m.p[j]),
                     m.ci_low(j, level), m.ci_high(j, level), number_or_blank(m.vif[j])});
    return t;
}

TestResult model_summary(const LinearModel& m, std::size_t n_dropped, double level, bool with_slope) {
    TestResult r;
    r.test = m.intercept ? "Linear regression (ordinary least squares)"
                         : "Linear regression through the origin (ordinary least squares)";
    r.add("r-squared", m.r_squared);
    r.add("r-squared-adjusted", m.r_squared_adjusted);
    r.add("statistic", m.f_statistic);
    r.add("df", m.df_model);
    r.add("df2", m.df_residual);
    r.add("p", m.f_p);
    r.add("residual-sd", m.residual_sd);
    r.add("aic", m.aic);
    r.add("bic", m.bic);
    r.add("n", static_cast<double>(m.n));
    r.add("n dropped", static_cast<double>(n_dropped));

    r.words.shown = true;
    r.words.level = level;
    r.words.statistic_symbol = "F";
    r.words.statistic_df = true;
    r.words.n_after_p = true;
    if (m.perfect_fit)
        r.words.note = "perfect fit (R² = 1, residual SD 0): the coefficients are exact; standard errors are 0, and t, F "
                       "and p are not defined";
    else
        r.words.lead_symbol = "R²", r.words.lead_quantity = "r-squared";
    // With one predictor the sentence ends with the slope and its interval (not rows of the table).
    if (with_slope && m.intercept && m.parameters == 2) {
        r.words.estimate = "slope";
        r.words.estimate_quantity = "slope";
        r.unlisted.push_back({"slope", m.estimate[1]});
        if (!m.perfect_fit) {
            r.unlisted.push_back({"slope ci-low", m.ci_low(1, level)});
            r.unlisted.push_back({"slope ci-high", m.ci_high(1, level)});
        }
    }
    return r;
}

std::vector<FactorTest> factor_tests(const LinearModel& m, const RegressionData& data) {
    std::vector<FactorTest> tests;
    for (const Factor& factor : data.factors) {
        FactorTest test{factor.name, std::numeric_limits<double>::quiet_NaN(), static_cast<double>(factor.terms()),
                        std::numeric_limits<double>::quiet_NaN()};
        double reduced_rss = m.tss;  // the factor alone: the model without it is the mean
        const std::vector<std::size_t> kept = columns_without(factor, data.predictors.size());
        if (!kept.empty()) {
            std::vector<std::vector<double>> columns;
            std::vector<std::string> names;
            for (std::size_t j : kept) columns.push_back(data.predictors[j]), names.push_back(data.names[j]);
            reduced_rss = fit_least_squares(data.y, columns, names, true).rss;
        }
        if (!m.perfect_fit && m.df_residual > 0) {
            test.statistic = std::max(0.0, reduced_rss - m.rss) / test.df / (m.rss / m.df_residual);
            const boost::math::fisher_f f(test.df, m.df_residual);
            test.p = boost::math::cdf(boost::math::complement(f, test.statistic));
        }
        tests.push_back(std::move(test));
    }
    return tests;
}

Table linear_output(const LinearModel& m, std::size_t n_dropped, const std::string& output, double level,
                    const std::vector<FactorTest>& factors) {
    if (output == "coefficients") return coefficient_table(m, level);
    const TestResult summary = model_summary(m, n_dropped, level, factors.empty());
    if (output == "model") {
        // The catalogue's model table: `model` (not `test`) under the header; undefined values blank.
        Table t = summary.table();
        t[1][0] = std::string("model");
        append_factor_rows(t, factors, "F");
        for (auto& row : t)
            if (const double* v = std::get_if<double>(&row[1]); v && !std::isfinite(*v)) row[1] = std::monostate{};
        return t;
    }
    if (output == "slope" || output == "intercept") {
        if (!factors.empty())
            throw Refusal("output '" + output + "' needs one numeric predictor; " + factors.front().name +
                          " is a factor (labels): use output 'coefficients' for the whole table");
        if (!m.intercept || m.parameters != 2)
            throw Refusal("output '" + output + "' needs exactly one predictor (xs has " +
                          std::to_string(m.parameters - (m.intercept ? 1 : 0)) +
                          " columns); use output 'coefficients' for the whole table");
        return single(m.estimate[output == "slope" ? 1 : 0]);
    }
    if (m.perfect_fit && output == "p")
        throw Refusal("the fit is perfect (residual SD 0): the F test's p is not defined");
    return select_output(summary, output, linear_outputs());
}

}  // namespace quadrat
