#include "logistic.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <set>

#include <Eigen/Dense>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>

#include "data.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "scaled_design.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

using Eigen::MatrixXd;
using Eigen::VectorXd;

// Newton–Raphson stops when the deviance changes by less than this, relative (it converges
// quadratically, so the coefficients are then good to about the square of that).
constexpr double deviance_tolerance = 1e-12;
constexpr int iteration_cap = 100;
constexpr int halving_cap = 40;
// A fitted linear predictor beyond ±500 means a probability of 1 − e^-500: only separated data
// drive a fit there.
constexpr double linear_predictor_limit = 500;
// At a genuine optimum the last Newton step moves the linear predictor by about the square root
// of the deviance tolerance or less; along a separating direction it keeps moving by about 1 per
// step while the deviance no longer changes. A last step above this marks separation.
constexpr double separation_step = 1e-3;

std::string lower(std::string s) {
    for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return s;
}

// log(1 + e^t) without overflow or loss of digits.
double softplus(double t) { return std::max(t, 0.0) + std::log1p(std::exp(-std::fabs(t))); }

// Deviance of binomial data (y successes of m trials; m = 1 for a 0/1 response) at linear
// predictor η: 2Σ[y softplus(−η) + (m − y) softplus(η)] less twice the saturated model's
// −log-likelihood, 2Σ[−y log(y/m) − (m − y) log(1 − y/m)] (0 for 0/1 data), since −log μ =
// softplus(−η) and −log(1 − μ) = softplus(η) (McCullagh & Nelder 1989, §4.4.3).
double deviance_at(const VectorXd& y, const VectorXd& m, const VectorXd& eta) {
    Accumulator d;
    for (Eigen::Index i = 0; i < y.size(); ++i) {
        const double yi = y[i], fail = m[i] - y[i];
        d.add((yi > 0 ? yi * (softplus(-eta[i]) + std::log(yi / m[i])) : 0.0) +
              (fail > 0 ? fail * (softplus(eta[i]) + std::log(fail / m[i])) : 0.0));
    }
    return 2 * d.sum();
}

// Σ log C(m, y): the binomial coefficients of the log-likelihood (0 for 0/1 data).
double log_binomial_coefficients(const VectorXd& y, const VectorXd& m) {
    Accumulator a;
    for (Eigen::Index i = 0; i < y.size(); ++i)
        if (m[i] > 1) a.add(std::lgamma(m[i] + 1) - std::lgamma(y[i] + 1) - std::lgamma(m[i] - y[i] + 1));
    return a.sum();
}

// The saturated model's log-likelihood less the binomial coefficients (0 for 0/1 data).
double saturated_log_likelihood(const VectorXd& y, const VectorXd& m) {
    Accumulator a;
    for (Eigen::Index i = 0; i < y.size(); ++i) {
        if (y[i] > 0) a.add(y[i] * std::log(y[i] / m[i]));
        if (m[i] - y[i] > 0) a.add((m[i] - y[i]) * std::log((m[i] - y[i]) / m[i]));
    }
    return a.sum();
}

[[noreturn]] void refuse_separation(const std::string& name, bool complete, bool combination) {
    const std::string kind = complete ? "complete separation" : "quasi-complete separation";
    const std::string by = combination ? "a combination of predictors, chiefly " + name : name;
    throw Refusal("the outcome is perfectly predicted by " + by + " (" + kind +
                  "): no finite coefficient exists; remove or combine that predictor, or add data where the outcomes overlap");
}

// Separation by one predictor alone: every event on one side of a threshold and every non-event
// on the other (touching at the threshold for quasi-complete separation). Albert & Anderson
// (1984), Biometrika 71, 1–10: the maximum-likelihood estimate then does not exist.
void refuse_single_predictor_separation(const LogisticData& d) {
    // With trials, a row with some successes and some failures overlaps every threshold; rows of
    // all successes or all failures are events and non-events.
    for (std::size_t i = 0; i < d.trials.size(); ++i)
        if (d.y[i] > 0 && d.y[i] < d.trials[i]) return;
    const auto is_event = [&](std::size_t i) { return d.trials.empty() ? d.y[i] > 0.5 : d.y[i] > 0; };
    for (std::size_t j = 0; j < d.xs.size(); ++j) {
        double min1 = INFINITY, max1 = -INFINITY, min0 = INFINITY, max0 = -INFINITY;
        for (std::size_t i = 0; i < d.y.size(); ++i) {
            const double x = d.xs[j][i];
            if (is_event(i)) {
                min1 = std::min(min1, x);
                max1 = std::max(max1, x);
            } else {
                min0 = std::min(min0, x);
                max0 = std::max(max0, x);
            }
        }
        if (max0 < min1 || max1 < min0) refuse_separation(d.names[j], true, false);
        if (max0 == min1 || max1 == min0) refuse_separation(d.names[j], false, false);
    }
}

}  // namespace

namespace {

// The predictor part of a logistic model's data: design columns, their names, the factors.
LogisticData with_predictors(ModelFrame& m) {
    LogisticData d;
    d.n_dropped = m.frame.n_dropped;
    d.xs = std::move(m.predictors.columns);
    d.names = std::move(m.predictors.names);
    d.factors = std::move(m.predictors.factors);
    return d;
}

}  // namespace

LogisticData read_logistic_data(const Range& y, const Range& xs) {
    if (y.empty()) throw Refusal("y is empty");
    if (xs.empty()) throw Refusal("xs is empty");
    if (y.columns != 1) throw Refusal("y must be one column (found " + std::to_string(y.columns) + ")");
    ModelFrame m = read_model_frame({{&y, ColumnKind::label, "y"}}, xs);
    const Frame& f = m.frame;
    if (f.n_used == 0) throw Refusal("no row has both a response and a value in every predictor column");
    LogisticData d = with_predictors(m);

    // A response of numbers only is 0/1 with event 1; otherwise the cells are labels.
    bool all_numbers = f.n_used > 0;
    for (std::size_t row : f.used_rows) all_numbers = all_numbers && y.at(row, 0).kind == CellKind::number;
    if (all_numbers) {
        for (std::size_t k = 0; k < f.n_used; ++k) {
            const double v = y.at(f.used_rows[k], 0).number;
            if (v != 0 && v != 1)
                throw Refusal("y holds " + number_label(v) + (y.is_reference ? " in " + cell_address(y, f.used_rows[k], 0) : "") +
                              "; a numeric response must be 0 or 1 (or use two labels such as present/absent)");
            d.y.push_back(v);
        }
        d.event = "1";
        return d;
    }
    std::set<std::string> distinct(f.labels[0].begin(), f.labels[0].end());
    if (distinct.size() > 2) {
        std::vector<std::string> shown(distinct.begin(), distinct.end());
        if (shown.size() > 5) shown.resize(5), shown.push_back("…");
        throw Refusal("y has " + std::to_string(distinct.size()) + " labels (" + join(shown) +
                      "); logistic regression needs exactly two outcomes");
    }
    // The event is the later label in case-insensitive character order (`present` over `absent`);
    // labels equal but for case are ordered by their bytes so that the choice is still fixed.
    std::vector<std::string> labels(distinct.begin(), distinct.end());
    std::sort(labels.begin(), labels.end(), [](const std::string& a, const std::string& b) {
        const std::string la = lower(a), lb = lower(b);
        return la != lb ? la < lb : a < b;
    });
    d.event = labels.back();
    for (const auto& label : f.labels[0]) d.y.push_back(label == d.event ? 1.0 : 0.0);
    return d;
}

LogisticData read_logistic_data(const Range& y, const Range& xs, const Range& trials) {
    if (trials.empty()) return read_logistic_data(y, xs);
    if (y.empty()) throw Refusal("y is empty");
    if (xs.empty()) throw Refusal("xs is empty");
    if (y.columns != 1) throw Refusal("y must be one column (found " + std::to_string(y.columns) + ")");
    if (trials.columns != 1) throw Refusal("trials must be one column (found " + std::to_string(trials.columns) + ")");
    ModelFrame model_frame =
        read_model_frame({{&y, ColumnKind::numeric, "y"}}, xs, {{&trials, ColumnKind::numeric, "trials"}});
    const Frame& f = model_frame.frame;
    if (f.n_used == 0) throw Refusal("no row has a number of successes, of trials and a value in every predictor column");
    LogisticData d = with_predictors(model_frame);
    const std::size_t last = f.numbers.size() - 1;
    const auto where = [&](const Range& r, std::size_t k) {
        return r.is_reference ? " in " + cell_address(r, f.used_rows[k], 0) : std::string();
    };
    for (std::size_t k = 0; k < f.n_used; ++k) {
        const double successes = f.numbers[0][k], m = f.numbers[last][k];
        if (!(m >= 1) || m != std::floor(m) || m > 9007199254740992.0)
            throw Refusal("trials holds " + number_label(m) + where(trials, k) + "; trials must be whole numbers from 1 up");
        if (!(successes >= 0) || successes != std::floor(successes))
            throw Refusal("y holds " + number_label(successes) + where(y, k) +
                          "; with trials, y holds the number of successes: a whole number from 0 up");
        if (successes > m)
            throw Refusal("y holds " + number_label(successes) + where(y, k) + " but trials only " + number_label(m) +
                          where(trials, k) + "; successes cannot exceed trials");
    }
    d.y = f.numbers[0];
    d.trials = f.numbers[last];
    d.event = "success";
    return d;
}

LogisticFit fit_logistic(const LogisticData& d) {
    const std::size_t n = d.y.size(), k = d.xs.size(), p = k + 1;
    if (k == 0) throw Refusal("xs has no predictor columns");
    if (n < p + 1)
        throw Refusal("needs more rows than coefficients: " + count_of(n, "row") + " for " + std::to_string(p) +
                      " coefficients");
    double events = 0, total = 0;
    for (std::size_t i = 0; i < n; ++i) {
        events += d.y[i];
        total += d.trials.empty() ? 1.0 : d.trials[i];
    }
    if (events == 0 || events == total)
        throw Refusal(d.trials.empty() ? "every used row has the same outcome (" + std::string(events == 0 ? "none is " : "all are ") +
                                             d.event + "); logistic regression needs both outcomes"
                                       : std::string(events == 0 ? "no trial succeeded" : "every trial succeeded") +
                                             "; logistic regression needs both outcomes");

    // Predictors centred and scaled for the fit (scaled_design.hpp); coefficients transformed back.
    const ScaledDesign design = scaled_design(d.xs, d.names);
    const MatrixXd& Z = design.Z;
    // A predictor that is a linear combination of the others (and the intercept) has no estimate.
    for (std::size_t j = 1; j < p; ++j) {
        Eigen::ColPivHouseholderQR<MatrixXd> qr(Z.leftCols(j + 1));
        qr.setThreshold(1e-10);
        if (qr.rank() < Eigen::Index(j + 1))
            throw Refusal("predictor " + d.names[j - 1] + " is a linear combination of the predictors before it (collinear); remove it");
    }
    refuse_single_predictor_separation(d);

    VectorXd y(n), trials(n);
    for (std::size_t i = 0; i < n; ++i) {
        y[i] = d.y[i];
        trials[i] = d.trials.empty() ? 1.0 : d.trials[i];
    }
    const double ybar = events / total;

    // Null model: the intercept alone, at the log-odds of the observed proportion.
    LogisticFit fit;
    fit.null_deviance = deviance_at(y, trials, VectorXd::Constant(n, std::log(ybar / (1 - ybar))));

    // Newton–Raphson on the log-likelihood, each step a weighted least-squares problem
    // (iteratively reweighted least squares; McCullagh & Nelder 1989, Generalized Linear Models,
    // §4.4), solved by QR on √W Z rather than by forming ZᵀWZ, with step halving when the
    // deviance would rise.
    VectorXd gamma = VectorXd::Zero(p);
    gamma[0] = std::log(ybar / (1 - ybar));
    VectorXd eta = Z * gamma;
    double dev = deviance_at(y, trials, eta);
    VectorXd last_step = VectorXd::Zero(p);
    double last_eta_step = INFINITY;
    bool converged = false;
    int iterations = 0;
    Eigen::ColPivHouseholderQR<MatrixXd> qr;
    auto weighted_system = [&](const VectorXd& eta_now, MatrixXd& A, VectorXd& b) {
        A.resize(n, p);
        b.resize(n);
        for (std::size_t i = 0; i < n; ++i) {
            // μ(1 − μ) and y − μ from e^-|η|, so neither rounds to 0 before it must.
            const double e = std::exp(-std::fabs(eta_now[i]));
            const double mu = eta_now[i] >= 0 ? 1 / (1 + e) : e / (1 + e);
            const double one_minus_mu = eta_now[i] >= 0 ? e / (1 + e) : 1 / (1 + e);
            // Weight m μ(1 − μ); residual y − mμ, from whichever of μ, 1 − μ is not rounded.
            const double root_w = std::sqrt(trials[i] * e) / (1 + e);
            const double residual = eta_now[i] >= 0 ? trials[i] * one_minus_mu - (trials[i] - y[i]) : y[i] - trials[i] * mu;
            A.row(i) = root_w * Z.row(i);
            b[i] = residual / root_w;
        }
    };
    MatrixXd A;
    VectorXd b;
    while (iterations < iteration_cap) {
        if (eta.cwiseAbs().maxCoeff() > linear_predictor_limit) break;
        weighted_system(eta, A, b);
        qr.compute(A);
        VectorXd step = qr.solve(b);
        if (!step.allFinite()) break;
        ++iterations;
        double dev_new = 0;
        VectorXd eta_new;
        int halvings = 0;
        for (;; ++halvings) {
            eta_new = Z * (gamma + step);
            dev_new = deviance_at(y, trials, eta_new);
            if (dev_new <= dev * (1 + 1e-14) + 1e-300 || halvings == halving_cap) break;
            step *= 0.5;
        }
        last_step = step;
        last_eta_step = (eta_new - eta).cwiseAbs().maxCoeff();
        gamma += step;
        eta = eta_new;
        const double change = std::fabs(dev - dev_new);
        dev = dev_new;
        if (change <= deviance_tolerance * (std::fabs(dev) + 0.1)) {
            converged = true;
            break;
        }
    }

    // Separation by a combination of predictors: the deviance stops changing while the fit still
    // walks off along a separating direction. The predictor named is the one whose (scaled)
    // coefficient moved most in the last step.
    if (!converged || last_eta_step > separation_step || eta.cwiseAbs().maxCoeff() > linear_predictor_limit) {
        std::size_t chief = 0;
        for (std::size_t j = 1; j < k; ++j)
            if (std::fabs(last_step[j + 1]) > std::fabs(last_step[chief + 1])) chief = j;
        if (!converged && last_eta_step <= separation_step)
            throw Refusal("the fit did not converge in " + std::to_string(iteration_cap) + " iterations");
        refuse_separation(d.names[chief], dev < 1e-6, k > 1);
    }

    // Covariance of γ from the final weighted QR: (ZᵀWZ)⁻¹ = P R⁻¹ R⁻ᵀ Pᵀ.
    weighted_system(eta, A, b);
    qr.compute(A);
    const MatrixXd R = qr.matrixR().topLeftCorner(p, p).triangularView<Eigen::Upper>();
    const MatrixXd R_inverse = R.triangularView<Eigen::Upper>().solve(MatrixXd::Identity(p, p));
    const MatrixXd P = qr.colsPermutation();
    const MatrixXd cov_gamma = P * (R_inverse * R_inverse.transpose()) * P.transpose();
    const MatrixXd T = design.to_original_units();
    const VectorXd beta = T * gamma;
    const MatrixXd cov = T * cov_gamma * T.transpose();

    const boost::math::normal_distribution<double> normal;
    fit.terms.push_back("intercept");
    for (const auto& name : d.names) fit.terms.push_back(name);
    for (std::size_t j = 0; j < p; ++j) {
        const double se = std::sqrt(cov(j, j));
        // As in FIT.COUNTS: a nearly singular weighted design leaves no standard error; say so
        // rather than pass a NaN on to the p-value.
        if (!(se > 0) || !std::isfinite(se) || !std::isfinite(beta[j]))
            throw Refusal("the fit leaves no standard error for " + fit.terms[j] +
                          " (its information is nearly singular: a predictor barely varies among the rows that carry "
                          "the fit); remove that predictor or gather rows where it varies");
        const double z = beta[j] / se;
        fit.estimate.push_back(beta[j]);
        fit.std_error.push_back(se);
        fit.z.push_back(z);
        fit.p.push_back(2 * boost::math::cdf(boost::math::complement(normal, std::fabs(z))));
    }
    fit.event = d.event;
    fit.deviance = dev;
    fit.lr_statistic = std::max(0.0, fit.null_deviance - dev);
    fit.df = double(k);
    fit.lr_p = boost::math::cdf(boost::math::complement(boost::math::chi_squared_distribution<double>(fit.df), fit.lr_statistic));
    // The full log-likelihood, binomial coefficients included (for 0/1 data it is −deviance/2).
    const double constants = log_binomial_coefficients(y, trials) + saturated_log_likelihood(y, trials);
    const double log_l = constants - dev / 2, log_l0 = constants - fit.null_deviance / 2;
    fit.aic = -2 * log_l + 2.0 * double(p);
    // McFadden's pseudo-R² = 1 − log L / log L₀ (McFadden 1974, in Frontiers in Econometrics,
    // 105–142); for 0/1 data, 1 − deviance / null deviance.
    fit.pseudo_r_squared = 1 - log_l / log_l0;
    fit.n = double(n);
    fit.n_dropped = double(d.n_dropped);
    fit.iterations = iterations;
    // Deviances share the saturated model's constant, so −deviance/2 stands in for ℓ.
    fit.factor_tests = likelihood_ratio_tests(d.factors, k, -fit.deviance / 2, [&](const std::vector<std::size_t>& kept) {
        if (kept.empty()) return -fit.null_deviance / 2;  // the factor alone: the model without it is the null model
        LogisticData reduced = d;
        reduced.factors.clear();
        reduced.xs.clear();
        reduced.names.clear();
        for (std::size_t j : kept) reduced.xs.push_back(d.xs[j]), reduced.names.push_back(d.names[j]);
        return -fit_logistic(reduced).deviance / 2;
    });
    return fit;
}

Table logistic_coefficients(const LogisticFit& fit, double level) {
    const boost::math::normal_distribution<double> normal;
    const double z_crit = boost::math::quantile(boost::math::complement(normal, (1 - level) / 2));
    Table t;
    t.push_back({std::string("variable"), std::string("coefficient"), std::string("SE"), std::string("z"), std::string("p"),
                 std::string("odds ratio"), std::string("ci-low"), std::string("ci-high")});
    for (std::size_t j = 0; j < fit.terms.size(); ++j) {
        const double b = fit.estimate[j], se = fit.std_error[j];
        // The intercept's odds (all predictors at zero) is rarely a quantity anyone reports
        // (FUNCTIONS.md, FIT.LOGISTIC): its odds-ratio cells stay blank.
        if (j == 0) {
            t.push_back({fit.terms[j], b, se, fit.z[j], fit.p[j], std::monostate{}, std::monostate{}, std::monostate{}});
            continue;
        }
        t.push_back({fit.terms[j], b, se, fit.z[j], fit.p[j], std::exp(b), std::exp(b - z_crit * se), std::exp(b + z_crit * se)});
    }
    return t;
}

Table logistic_model(const LogisticFit& fit) {
    TestResult r;
    r.test = "Logistic regression (logit link, maximum likelihood)";
    r.add("event", fit.event)
        .add("deviance", fit.deviance)
        .add("null deviance", fit.null_deviance)
        .add("statistic", fit.lr_statistic)
        .add("df", fit.df)
        .add("p", fit.lr_p)
        .add("aic", fit.aic)
        .add("pseudo-r-squared", fit.pseudo_r_squared)
        .add("n", fit.n)
        .add("n dropped", fit.n_dropped)
        .add("iterations", double(fit.iterations));
    Table t = r.table();
    t[1][0] = std::string("model");  // a model's table opens with `model`, not `test`
    append_factor_rows(t, fit.factor_tests, "χ²");
    return t;
}

}  // namespace quadrat
