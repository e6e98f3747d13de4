#include "count_model.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <Eigen/Dense>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/special_functions/digamma.hpp>
#include <boost/math/special_functions/trigamma.hpp>
#include <boost/math/tools/minima.hpp>

#include "data.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "result.hpp"
#include "scaled_design.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

using Eigen::MatrixXd;
using Eigen::VectorXd;

// IRLS stops when −2ℓ changes by less than this, relative; Newton converges quadratically, so the
// coefficients are then good to about the square root of it or better.
constexpr double objective_tolerance = 1e-13;
constexpr int iteration_cap = 200;
constexpr int halving_cap = 40;
// At an optimum the last step moves the linear predictor by about √tolerance or less; when a
// level holds only zero counts its coefficient walks off towards −∞ by about 1 per step while ℓ
// no longer changes. A last step above this marks that.
constexpr double runaway_step = 1e-3;
// The negative binomial's k beyond which it cannot be told from Poisson in double precision
// (μ²/k below 1e-8 μ for counts up to 100): ML then puts k at infinity.
constexpr double k_ceiling = 1e10;
constexpr double k_floor = 1e-8;
// Up to this count, Γ-ratios and their derivatives are summed term by term (exact); above it the
// special functions are used (their relative error is then small against the sum itself).
constexpr double small_count = 64;

// The model in centred and scaled coordinates, so that a predictor in the thousands and one in
// thousandths keep their digits; coefficients are transformed back at the end.
struct Design {
    MatrixXd Z;              // intercept, then (x − centre)/scale; only the intercept for the null model
    VectorXd offset;         // log effort, or 0
    VectorXd y;
    ScaledDesign scaled;     // its centres and scales: the way back to the predictors' units
    // The distinct counts and how often each occurs: the Γ terms of the negative binomial depend
    // on a row through its count alone, so they are summed once per distinct count.
    std::vector<std::pair<double, double>> distinct_counts;
};

std::vector<std::pair<double, double>> tally(const VectorXd& y) {
    std::vector<double> sorted(y.data(), y.data() + y.size());
    std::sort(sorted.begin(), sorted.end());
    std::vector<std::pair<double, double>> out;
    for (double v : sorted) {
        if (out.empty() || out.back().first != v) out.push_back({v, 0});
        out.back().second += 1;
    }
    return out;
}

double log_factorial(double y) { return std::lgamma(y + 1); }

// log Γ(y + k) − log Γ(k), ψ(y + k) − ψ(k), ψ′(y + k) − ψ′(k) for a whole y ≥ 0.
double log_gamma_ratio(double y, double k) {
    if (y <= small_count) {
        double s = 0;
        for (double j = 0; j < y; ++j) s += std::log(k + j);
        return s;
    }
    return std::lgamma(y + k) - std::lgamma(k);
}
double digamma_difference(double y, double k) {
    if (y <= small_count) {
        double s = 0;
        for (double j = 0; j < y; ++j) s += 1 / (k + j);
        return s;
    }
    return boost::math::digamma(y + k) - boost::math::digamma(k);
}
double trigamma_difference(double y, double k) {
    if (y <= small_count) {
        double s = 0;
        for (double j = 0; j < y; ++j) s -= 1 / ((k + j) * (k + j));
        return s;
    }
    return boost::math::trigamma(y + k) - boost::math::trigamma(k);
}

bool is_poisson(double k) { return !std::isfinite(k); }

// ℓ at means μ: Poisson when k is infinite, else NB2 with aggregation k.
double log_likelihood(const Design& d, const VectorXd& mu, double k) {
    Accumulator a;
    for (const auto& [y, times] : d.distinct_counts)
        a.add(times * ((is_poisson(k) ? 0.0 : log_gamma_ratio(y, k)) - log_factorial(y)));
    for (Eigen::Index i = 0; i < mu.size(); ++i) {
        const double y = d.y[i], m = mu[i];
        if (is_poisson(k))
            a.add((y > 0 ? y * std::log(m) : 0.0) - m);
        else
            a.add(-k * std::log1p(m / k) + (y > 0 ? y * std::log(m / (k + m)) : 0.0));
    }
    return a.sum();
}

// Deviance against the saturated model (McCullagh & Nelder 1989, §6.2 and §11.3 for the negative
// binomial at a fixed k).
double deviance(const VectorXd& y, const VectorXd& mu, double k) {
    Accumulator a;
    for (Eigen::Index i = 0; i < y.size(); ++i) {
        const double yi = y[i], m = mu[i];
        const double y_log = yi > 0 ? yi * std::log(yi / m) : 0.0;
        a.add(is_poisson(k) ? y_log - (yi - m) : y_log - (yi + k) * std::log1p((yi - m) / (m + k)));
    }
    return 2 * a.sum();
}

VectorXd means_at(const Design& d, const VectorXd& gamma) { return (d.Z * gamma + d.offset).array().exp().matrix(); }

struct IrlsOutcome {
    double objective;  // −2ℓ at the end
    int iterations;
    bool converged;
    double last_eta_step;
    VectorXd last_step;
};

// Fisher scoring for β at a fixed k (McCullagh & Nelder 1989, §2.5): each step solves
// (ZᵀWZ) δ = Zᵀ(W(y − μ)/μ) with weights W = μ/(1 + μ/k), halving the step when −2ℓ would rise.
// The predictors are centred and scaled, so ZᵀWZ is well conditioned unless they are nearly
// collinear (refused before); and the fixed point is set by the score Zᵀ(W(y − μ)/μ) = 0, which
// is evaluated directly, so the solve's rounding slows the last step at most.
IrlsOutcome fit_coefficients(const Design& d, double k, VectorXd& gamma) {
    const Eigen::Index p = d.Z.cols();
    VectorXd mu = means_at(d, gamma);
    double objective = -2 * log_likelihood(d, mu, k);
    IrlsOutcome out{objective, 0, false, INFINITY, VectorXd::Zero(p)};
    while (out.iterations < iteration_cap) {
        const VectorXd w = is_poisson(k) ? mu : (mu.array() / (1 + mu.array() / k)).matrix();
        const VectorXd score = d.Z.transpose() * ((d.y - mu).array() * w.array() / mu.array()).matrix();
        const MatrixXd information = d.Z.transpose() * w.asDiagonal() * d.Z;
        VectorXd step = information.ldlt().solve(score);
        if (!step.allFinite()) break;
        ++out.iterations;
        VectorXd mu_new;
        double objective_new = 0;
        for (int halvings = 0;; ++halvings) {
            mu_new = means_at(d, gamma + step);
            objective_new = -2 * log_likelihood(d, mu_new, k);
            if ((std::isfinite(objective_new) && objective_new <= objective * (1 + 1e-15) + 1e-300) || halvings == halving_cap)
                break;
            step *= 0.5;
        }
        out.last_step = step;
        out.last_eta_step = (d.Z * step).cwiseAbs().maxCoeff();
        gamma += step;
        mu = mu_new;
        const double change = std::fabs(objective - objective_new);
        objective = objective_new;
        if (change <= objective_tolerance * (std::fabs(objective) + 1)) {
            out.converged = true;
            break;
        }
    }
    out.objective = objective;
    return out;
}

// dℓ/dk and d²ℓ/dk² of NB2 at fixed means (Lawless 1987, eq. 2.3).
void k_derivatives(const Design& d, const VectorXd& mu, double k, double& first, double& second) {
    Accumulator g, h;
    for (const auto& [y, times] : d.distinct_counts) {
        g.add(times * digamma_difference(y, k));
        h.add(times * trigamma_difference(y, k));
    }
    for (Eigen::Index i = 0; i < mu.size(); ++i) {
        const double y = d.y[i], m = mu[i];
        g.add(-std::log1p(m / k) + (m - y) / (k + m));
        h.add(1 / k - 1 / (k + m) - (m - y) / ((k + m) * (k + m)));
    }
    first = g.sum();
    second = h.sum();
}

// The k that maximises ℓ at fixed means: Newton steps on log k with the analytic derivatives
// from `start`; where Newton cannot go on (no start yet, or the curvature is not that of a
// maximum), Brent's method on log k over [k_floor, k_ceiling] first. Infinity when the maximum
// lies at the ceiling (the counts are no more variable than Poisson).
double best_k(const Design& d, const VectorXd& mu, double start) {
    const double lo = std::log(k_floor), hi = std::log(k_ceiling);
    const auto newton = [&](double t) {
        for (int i = 0; i < 50; ++i) {
            const double k = std::exp(t);
            double g = 0, h = 0;
            k_derivatives(d, mu, k, g, h);
            const double gt = k * g, ht = k * k * h + k * g;  // derivatives in t = log k
            if (!(ht < 0)) return std::numeric_limits<double>::quiet_NaN();
            const double step = std::clamp(-gt / ht, -2.0, 2.0);
            t += step;
            if (!(t > lo && t < hi)) return std::numeric_limits<double>::quiet_NaN();
            if (std::fabs(step) < 1e-12) return t;
        }
        return std::numeric_limits<double>::quiet_NaN();
    };
    if (std::isfinite(start)) {
        const double t = newton(std::log(start));
        if (std::isfinite(t)) return std::exp(t);
    }
    const auto minus_loglik = [&](double t) { return -log_likelihood(d, mu, std::exp(t)); };
    const double t = boost::math::tools::brent_find_minima(minus_loglik, lo, hi, 40).first;
    if (t > hi - 1) return INFINITY;
    const double polished = newton(t);
    return std::exp(std::isfinite(polished) ? polished : t);
}

struct ModelFit {
    VectorXd gamma;
    double k = INFINITY;
    double log_likelihood = 0;
    int iterations = 0;
    IrlsOutcome last;
};

// Poisson (k infinite), or the negative binomial with β and k alternately maximised until ℓ
// settles (β and k are orthogonal in expected information, so this converges quickly; Lawless
// 1987, §3).
ModelFit fit_model(const Design& d, bool negative_binomial, VectorXd gamma) {
    ModelFit f;
    f.last = fit_coefficients(d, INFINITY, gamma);
    f.iterations = f.last.iterations;
    f.gamma = gamma;
    f.log_likelihood = -f.last.objective / 2;
    if (!negative_binomial) return f;
    // Start k by the method of moments on the Poisson means: Σ((y − μ)² − μ) = Σ μ²/k.
    VectorXd mu = means_at(d, gamma);
    double excess = 0, square = 0;
    for (Eigen::Index i = 0; i < d.y.size(); ++i) {
        excess += (d.y[i] - mu[i]) * (d.y[i] - mu[i]) - mu[i];
        square += mu[i] * mu[i];
    }
    double k = excess > 0 ? square / excess : INFINITY;
    double previous = -INFINITY;
    for (int round = 0; round < 200; ++round) {
        k = best_k(d, mu, k);
        if (!std::isfinite(k)) break;
        f.last = fit_coefficients(d, k, gamma);
        f.iterations += f.last.iterations;
        mu = means_at(d, gamma);
        const double ll = log_likelihood(d, mu, k);
        if (std::fabs(ll - previous) <= 1e-14 * (std::fabs(ll) + 1)) {
            previous = ll;
            break;
        }
        previous = ll;
    }
    f.gamma = gamma;
    f.k = k;
    f.log_likelihood = std::isfinite(k) ? previous : f.log_likelihood;
    return f;
}

[[noreturn]] void refuse_zero_level(const std::string& name, bool where_one) {
    throw Refusal("every count is 0 where " + name + " is " + (where_one ? "1" : "0") +
                  ": that rate is 0 and its rate ratio has no finite estimate; merge that level with another, or remove " +
                  name);
}

// A 0/1 column whose rows of one value hold only zero counts: the maximum-likelihood estimate
// does not exist (its coefficient goes to −∞; Haberman 1974, The Analysis of Frequency Data, §1.2).
void refuse_zero_levels(const CountData& data) {
    for (std::size_t j = 0; j < data.xs.size(); ++j) {
        const auto& x = data.xs[j];
        if (!std::all_of(x.begin(), x.end(), [](double v) { return v == 0 || v == 1; })) continue;
        double at_one = 0, at_zero = 0;
        for (std::size_t i = 0; i < x.size(); ++i) (x[i] == 1 ? at_one : at_zero) += data.counts[i];
        if (at_one == 0) refuse_zero_level(data.names[j], true);
        if (at_zero == 0) refuse_zero_level(data.names[j], false);
    }
}

std::string model_name(bool negative_binomial, bool effort) {
    std::string s = negative_binomial ? "negative binomial regression (NB2, log link" : "Poisson regression (log link";
    return s + (effort ? ", effort as log offset)" : ")");
}

}  // namespace

CountMethod parse_count_method(const std::string& keyword) {
    return static_cast<CountMethod>(count_model_methods().index(keyword, "method"));
}

CountFit fit_counts(const CountData& data, CountMethod method) {
    const std::size_t n = data.counts.size(), k = data.xs.size(), p = k + 1;
    if (k == 0) throw Refusal("xs has no predictor columns");
    for (std::size_t i = 0; i < n; ++i) {
        const double y = data.counts[i];
        if (!(y >= 0) || y != std::floor(y))
            throw Refusal("counts holds " + number_label(y) + "; counts must be whole numbers from 0 up");
        if (y > 9007199254740992.0) throw Refusal("counts holds " + number_label(y) + "; counts must be below 2^53 to be exact");
    }
    const bool has_effort = !data.effort.empty();
    for (double e : data.effort)
        if (!(e > 0) || !std::isfinite(e)) throw Refusal("effort holds " + number_label(e) + "; effort must be a positive number");
    if (n < p + 1)
        throw Refusal("needs more rows than coefficients: " + count_of(n, "row") + " for " + std::to_string(p) + " coefficients");
    const double total = sum(data.counts);
    if (total == 0) throw Refusal("every count is 0; there is no rate to model");
    refuse_zero_levels(data);

    Design d;
    d.y = Eigen::Map<const VectorXd>(data.counts.data(), Eigen::Index(n));
    d.distinct_counts = tally(d.y);
    d.offset = VectorXd::Zero(n);
    double total_effort = double(n);
    if (has_effort) {
        total_effort = sum(data.effort);
        for (std::size_t i = 0; i < n; ++i) d.offset[i] = std::log(data.effort[i]);
    }
    d.scaled = scaled_design(data.xs, data.names);
    d.Z = std::move(d.scaled.Z);  // the centre and scale stay for the way back
    // A predictor that is a linear combination of the others has no estimate. One rank check of
    // the whole design; only when it fails, the columns are added one by one to name the first.
    const auto full_rank = [&](Eigen::Index columns) {
        Eigen::ColPivHouseholderQR<MatrixXd> qr(d.Z.leftCols(columns));
        qr.setThreshold(1e-10);
        return qr.rank() == columns;
    };
    if (!full_rank(Eigen::Index(p)))
        for (std::size_t j = 1; j < p; ++j)
            if (!full_rank(Eigen::Index(j + 1)))
                throw Refusal("predictor " + data.names[j - 1] + " is a linear combination of the predictors before it (collinear); remove it");

    // Start every fit at the overall rate, which is the intercept-only Poisson estimate.
    VectorXd start = VectorXd::Zero(p);
    start[0] = std::log(total / total_effort);

    const ModelFit poisson = fit_model(d, false, start);
    const auto runaway = [&](const IrlsOutcome& o) { return !o.converged || o.last_eta_step > runaway_step; };
    if (runaway(poisson.last)) {
        std::size_t chief = 0;
        for (std::size_t j = 1; j < k; ++j)
            if (std::fabs(poisson.last.last_step[Eigen::Index(j + 1)]) > std::fabs(poisson.last.last_step[Eigen::Index(chief + 1)])) chief = j;
        if (poisson.last.last_eta_step <= runaway_step)
            throw Refusal("the fit did not converge in " + std::to_string(iteration_cap) + " iterations");
        throw Refusal("the counts are 0 wherever " + data.names[chief] +
                      " (with the other predictors) is at one extreme: no finite coefficient exists; merge or remove that predictor");
    }
    const VectorXd mu_poisson = means_at(d, poisson.gamma);
    Accumulator pearson;
    for (std::size_t i = 0; i < n; ++i) {
        const double r = d.y[Eigen::Index(i)] - mu_poisson[Eigen::Index(i)];
        pearson.add(r * r / mu_poisson[Eigen::Index(i)]);
    }
    const double overdispersion = pearson.sum() / double(n - p);

    const bool negative_binomial = method == CountMethod::negative_binomial ||
                                   (method == CountMethod::automatic && overdispersion > overdispersion_threshold);
    const ModelFit fit = negative_binomial ? fit_model(d, true, poisson.gamma) : poisson;
    if (negative_binomial && !std::isfinite(fit.k))
        throw Refusal("the counts are no more variable than Poisson (Pearson χ²/df " + format_number(overdispersion) +
                      "): the negative binomial's k has no finite estimate; use method 'poisson'");
    if (negative_binomial && runaway(fit.last)) throw Refusal("the negative binomial fit did not converge");

    // The intercept-only model of the same family, with its own k, for the likelihood-ratio test
    // and McFadden's pseudo-R²; at the full model's k for the null deviance (the GLM convention).
    Design null_design = d;
    null_design.Z = d.Z.leftCols(1);
    VectorXd null_start = start.head(1);
    const ModelFit null_fit = fit_model(null_design, negative_binomial, null_start);
    VectorXd null_gamma_at_k = start.head(1);
    if (negative_binomial) fit_coefficients(null_design, fit.k, null_gamma_at_k);

    // Covariance of γ: the inverse of the observed information. For Poisson (the canonical link)
    // observed and expected agree, ZᵀWZ with W = μ; for NB2 the information of (γ, log k) together,
    // of which the γ block of the inverse is the Schur complement.
    const VectorXd mu = means_at(d, fit.gamma);
    MatrixXd information = MatrixXd::Zero(p, p);
    if (!negative_binomial) {
        information = d.Z.transpose() * mu.asDiagonal() * d.Z;
    } else {
        const double kk = fit.k;
        const Eigen::ArrayXd m = mu.array(), y = d.y.array(), spread = (kk + m) * (kk + m);
        // −∂²ℓ/∂γ∂γᵀ = Σ z zᵀ μk(k + y)/(k + μ)²; −∂²ℓ/∂γ∂(log k) = −Σ z k μ(y − μ)/(k + μ)².
        information = d.Z.transpose() * (m * kk * (kk + y) / spread).matrix().asDiagonal() * d.Z;
        const VectorXd cross = -(d.Z.transpose() * (kk * m * (y - m) / spread).matrix());
        double g = 0, h = 0;
        k_derivatives(d, mu, kk, g, h);
        const double info_log_k = -(kk * kk * h + kk * g);
        if (!(info_log_k > 0)) throw Refusal("the negative binomial fit did not reach a maximum; try method 'poisson'");
        information -= cross * cross.transpose() / info_log_k;
    }
    const MatrixXd cov_gamma = information.ldlt().solve(MatrixXd::Identity(p, p));
    const MatrixXd T = d.scaled.to_original_units();
    const VectorXd beta = T * fit.gamma;
    const MatrixXd cov = T * cov_gamma * T.transpose();

    CountFit out;
    out.negative_binomial = negative_binomial;
    out.model = model_name(negative_binomial, has_effort);
    if (method == CountMethod::automatic)
        out.model += std::string(negative_binomial ? ", chosen as the Poisson fit's Pearson χ²/df " : "; the Poisson fit's Pearson χ²/df ") +
                     format_number(overdispersion) + (negative_binomial ? " exceeds 1.5" : " is not above 1.5");
    const boost::math::normal_distribution<double> normal;
    out.terms.push_back("intercept");
    for (const auto& name : data.names) out.terms.push_back(name);
    for (std::size_t j = 0; j < p; ++j) {
        const double se = std::sqrt(cov(Eigen::Index(j), Eigen::Index(j)));
        // A nearly singular information (a predictor with almost no spread among the rows that
        // carry the fit, found by the fuzzer) leaves no standard error: say so rather than pass
        // a NaN on to the p-value.
        if (!(se > 0) || !std::isfinite(se) || !std::isfinite(beta[Eigen::Index(j)]))
            throw Refusal("the fit leaves no standard error for " + out.terms[j] +
                          " (its information is nearly singular: a predictor barely varies where the counts are); remove that "
                          "predictor or gather rows where it varies");
        const double z = beta[Eigen::Index(j)] / se;
        out.estimate.push_back(beta[Eigen::Index(j)]);
        out.std_error.push_back(se);
        out.z.push_back(z);
        out.p.push_back(2 * boost::math::cdf(boost::math::complement(normal, std::fabs(z))));
    }
    out.log_likelihood = fit.log_likelihood;
    out.null_log_likelihood = null_fit.log_likelihood;
    out.deviance = deviance(d.y, mu, fit.k);
    out.null_deviance = deviance(d.y, means_at(null_design, negative_binomial ? null_gamma_at_k : null_fit.gamma), fit.k);
    out.lr_statistic = std::max(0.0, 2 * (out.log_likelihood - out.null_log_likelihood));
    if (!std::isfinite(out.log_likelihood) || !std::isfinite(out.null_log_likelihood))
        throw Refusal("the fit's likelihood is not a finite number; check the counts and effort");
    out.df = double(k);
    out.lr_p = boost::math::cdf(boost::math::complement(boost::math::chi_squared_distribution<double>(out.df), out.lr_statistic));
    out.aic = -2 * out.log_likelihood + 2 * double(p + (negative_binomial ? 1 : 0));
    out.pseudo_r_squared = 1 - out.log_likelihood / out.null_log_likelihood;
    out.overdispersion = overdispersion;
    out.aggregation_k = negative_binomial ? fit.k : std::numeric_limits<double>::quiet_NaN();
    out.n = double(n);
    out.n_dropped = double(data.n_dropped);
    out.iterations = fit.iterations;
    const CountMethod family = negative_binomial ? CountMethod::negative_binomial : CountMethod::poisson;
    out.factor_tests = likelihood_ratio_tests(data.factors, k, out.log_likelihood, [&](const std::vector<std::size_t>& kept) {
        if (kept.empty()) return out.null_log_likelihood;  // the factor alone: without it, the null model
        CountData reduced = data;
        reduced.factors.clear();
        reduced.xs.clear();
        reduced.names.clear();
        for (std::size_t j : kept) reduced.xs.push_back(data.xs[j]), reduced.names.push_back(data.names[j]);
        return fit_counts(reduced, family).log_likelihood;
    });
    return out;
}

CountData read_count_data(const Range& counts, const Range& xs, const Range& effort) {
    if (counts.empty()) throw Refusal("counts is empty");
    if (counts.columns != 1) throw Refusal("counts must be one column (found " + std::to_string(counts.columns) + ")");
    const bool has_effort = !effort.empty();
    if (has_effort && effort.columns != 1)
        throw Refusal("effort must be one column (found " + std::to_string(effort.columns) + ")");
    std::vector<FrameBlock> after;
    if (has_effort) after.push_back({&effort, ColumnKind::numeric, "effort"});
    ModelFrame m = read_model_frame({{&counts, ColumnKind::numeric, "counts"}}, xs, after);
    if (m.frame.n_used == 0)
        throw Refusal(std::string("no row has a count") + (has_effort ? ", an effort" : "") + " and a value in every predictor column");
    CountData d;
    d.counts = std::move(m.frame.numbers[0]);
    if (has_effort) d.effort = std::move(m.frame.numbers.back());
    d.xs = std::move(m.predictors.columns);
    d.names = std::move(m.predictors.names);
    d.factors = std::move(m.predictors.factors);
    d.n_dropped = m.frame.n_dropped;
    return d;
}

Table count_coefficients(const CountFit& fit, double level) {
    const boost::math::normal_distribution<double> normal;
    const double z_crit = boost::math::quantile(boost::math::complement(normal, (1 - level) / 2));
    Table t;
    t.push_back({std::string("variable"), std::string("coefficient"), std::string("SE"), std::string("z"), std::string("p"),
                 std::string("rate ratio"), std::string("ci-low"), std::string("ci-high")});
    for (std::size_t j = 0; j < fit.terms.size(); ++j) {
        const double b = fit.estimate[j], se = fit.std_error[j];
        if (j == 0) {
            // e^intercept is the rate at every predictor 0, rarely a quantity anyone reports.
            t.push_back({fit.terms[j], b, se, fit.z[j], fit.p[j], std::monostate{}, std::monostate{}, std::monostate{}});
            continue;
        }
        t.push_back({fit.terms[j], b, se, fit.z[j], fit.p[j], std::exp(b), std::exp(b - z_crit * se), std::exp(b + z_crit * se)});
    }
    return t;
}

Table count_model_table(const CountFit& fit) {
    TestResult r;
    r.test = fit.model;
    r.add("deviance", fit.deviance)
        .add("null deviance", fit.null_deviance)
        .add("statistic", fit.lr_statistic)
        .add("df", fit.df)
        .add("p", fit.lr_p)
        .add("aic", fit.aic)
        .add("pseudo-r-squared", fit.pseudo_r_squared)
        .add("n", fit.n)
        .add("n dropped", fit.n_dropped)
        .add("iterations", double(fit.iterations))
        .add("overdispersion", fit.overdispersion);
    if (fit.negative_binomial)
        r.add("aggregation k", fit.aggregation_k);
    else
        r.quantities.push_back({"aggregation k", std::monostate{}});
    Table t = r.table();
    t[1][0] = std::string("model");  // a model's table opens with `model`, not `test`
    append_factor_rows(t, fit.factor_tests, "χ²");
    return t;
}

}  // namespace quadrat
