#include "normality.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>
#include <limits>
#include <numbers>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>

#include "exact_scaling.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

const boost::math::normal standard_normal(0.0, 1.0);
constexpr std::size_t no_upper_limit = std::numeric_limits<std::size_t>::max();

// Σ c[k] x^k by Horner's rule.
template <std::size_t N>
double polynomial(const std::array<double, N>& c, double x) {
    double value = 0.0;
    for (std::size_t k = N; k-- > 0;) value = value * x + c[k];
    return value;
}

double upper_normal(double z) { return boost::math::cdf(boost::math::complement(standard_normal, z)); }
double upper_chi_squared(double x, double df) {
    return boost::math::cdf(boost::math::complement(boost::math::chi_squared(df), x));
}

// ln Φ(z) without underflow: Φ itself underflows below z ≈ −38, and the standardized values of a
// sample reach |z| = (n − 1)/√n (about 70 at n = 5000). Below −30 the asymptotic series
// Φ(z) ≈ φ(z)/|z| · (1 − 1/z² + 3/z⁴ − 15/z⁶ + 105/z⁸) (Abramowitz & Stegun 1964, 26.2.12)
// is exact to about 1e-12 relative in its argument.
double log_normal_cdf(double z) {
    if (z > 0) return std::log1p(-upper_normal(z));
    if (z > -30.0) return std::log(boost::math::cdf(standard_normal, z));
    const double r = 1.0 / (z * z);
    const double series = 1.0 - r * (1.0 - r * (3.0 - r * (15.0 - r * 105.0)));
    return -0.5 * z * z - std::log(-z) - 0.5 * std::log(2.0 * std::numbers::pi) + std::log(series);
}

std::string count_refusal(std::size_t n, std::size_t min_n, std::size_t max_n) {
    if (max_n == no_upper_limit)
        return "needs at least " + std::to_string(min_n) + " values, found " + std::to_string(n);
    return "needs " + std::to_string(min_n) + " to " + std::to_string(max_n) + " values, found " + std::to_string(n);
}

// A sample made ready for a location–scale invariant test: sorted, shifted to the mid-range and
// scaled by a power of two to a range in [1, 2) (so nothing can overflow or underflow, whatever the
// magnitudes), then centred on its compensated mean. The tests below only see these deviations.
struct Deviations {
    std::vector<double> sorted;  // ascending, mean zero, |d| < 2
    double sum_of_squares = 0;   // Σ d²
    std::size_t n = 0;
};

Deviations prepare(std::span<const double> values, std::size_t min_n, std::size_t max_n) {
    Deviations s;
    s.n = values.size();
    if (s.n < min_n || s.n > max_n) throw Refusal(count_refusal(s.n, min_n, max_n));
    for (double x : values)
        if (!std::isfinite(x)) throw Refusal("values must be finite numbers");
    s.sorted.assign(values.begin(), values.end());
    std::sort(s.sorted.begin(), s.sorted.end());
    const double lowest = s.sorted.front(), highest = s.sorted.back();
    // Edge case: no spread at all, so no shape to test.
    if (lowest == highest)
        throw Refusal("all " + std::to_string(s.n) + " values are equal: a normality test needs values that vary");
    // Divided by the power of two that brings the range into [1, 2): exact, and neither 1e300 nor
    // values a few denormals apart leave the ordinary numbers. The mid-range is only a rough centre.
    const double range = highest - lowest;
    const int exponent = range_exponent(lowest, highest);
    const double mid = mid_range(lowest, highest);
    for (double& x : s.sorted)
        x = std::isfinite(range) ? std::ldexp(x - mid, -exponent) : std::ldexp(x, -exponent) - std::ldexp(mid, -exponent);
    const double centre = mean(s.sorted);
    Accumulator squares;
    for (double& x : s.sorted) {
        x -= centre;
        squares.add(x * x);
    }
    s.sum_of_squares = squares.sum();
    if (!(s.sum_of_squares > 0))
        throw Refusal("all " + std::to_string(s.n) + " values are equal: a normality test needs values that vary");
    return s;
}

// 1 − r² between the sorted deviations d and a score vector c (mean zero), accumulated as the
// residual sum of squares of d on c over Σd²: no digits are lost when r² is close to 1, where the
// textbook 1 − (Σcd)²/(Σc² Σd²) would subtract two nearly equal numbers.
double one_minus_squared_correlation(const Deviations& s, const std::vector<double>& scores) {
    Accumulator cross, score_squares;
    for (std::size_t i = 0; i < s.n; ++i) {
        cross.add(scores[i] * s.sorted[i]);
        score_squares.add(scores[i] * scores[i]);
    }
    const double slope = cross.sum() / score_squares.sum();
    Accumulator residual_squares;
    for (std::size_t i = 0; i < s.n; ++i) {
        const double r = s.sorted[i] - slope * scores[i];
        residual_squares.add(r * r);
    }
    return std::clamp(residual_squares.sum() / s.sum_of_squares, 0.0, 1.0);
}

// Royston's (1995) approximation to the Shapiro–Wilk coefficients, as the full antisymmetric
// vector over sorted positions (AS R94, steps for n > 3; n = 3 uses the exact 1/√2).
std::vector<double> shapiro_wilk_coefficients(std::size_t n) {
    std::vector<double> a(n, 0.0);
    const std::size_t half = n / 2;
    if (n == 3) {
        a[0] = -std::sqrt(0.5);
        a[2] = std::sqrt(0.5);
        return a;
    }
    // Royston (1995), AS R94: polynomial corrections for the two extreme coefficients in 1/√n.
    static constexpr std::array<double, 6> c1 = {0.0, 0.221157, -0.147981, -2.071190, 4.434685, -2.706056};
    static constexpr std::array<double, 6> c2 = {0.0, 0.042981, -0.293762, -1.752461, 5.682633, -3.582633};
    const double an = static_cast<double>(n);
    std::vector<double> m(half);  // Blom scores of the lower half (negative)
    Accumulator m_squares;
    for (std::size_t i = 0; i < half; ++i) {
        m[i] = boost::math::quantile(standard_normal, (static_cast<double>(i + 1) - 0.375) / (an + 0.25));
        m_squares.add(m[i] * m[i]);
    }
    const double summ2 = 2.0 * m_squares.sum();
    const double ssumm2 = std::sqrt(summ2);
    const double rsn = 1.0 / std::sqrt(an);
    std::vector<double> upper(half);  // a_1 ≥ a_2 ≥ … > 0, for the pairs x_(n+1−i) − x_(i)
    upper[0] = polynomial(c1, rsn) - m[0] / ssumm2;
    std::size_t first_plain = 1;
    double fac;
    if (n > 5) {
        upper[1] = -m[1] / ssumm2 + polynomial(c2, rsn);
        fac = std::sqrt((summ2 - 2.0 * m[0] * m[0] - 2.0 * m[1] * m[1]) /
                        (1.0 - 2.0 * upper[0] * upper[0] - 2.0 * upper[1] * upper[1]));
        first_plain = 2;
    } else {
        fac = std::sqrt((summ2 - 2.0 * m[0] * m[0]) / (1.0 - 2.0 * upper[0] * upper[0]));
    }
    for (std::size_t i = first_plain; i < half; ++i) upper[i] = -m[i] / fac;
    for (std::size_t i = 0; i < half; ++i) {
        a[i] = -upper[i];
        a[n - 1 - i] = upper[i];
    }
    return a;
}

// Blom scores Φ⁻¹((i − 3/8)/(n + 1/4)), i = 1..n.
std::vector<double> blom_scores(std::size_t n) {
    std::vector<double> m(n);
    const double an = static_cast<double>(n);
    for (std::size_t i = 0; i < n; ++i)
        m[i] = boost::math::quantile(standard_normal, (static_cast<double>(i + 1) - 0.375) / (an + 0.25));
    // Exact antisymmetry, so the scores sum to zero.
    for (std::size_t i = 0; i < n / 2; ++i) m[n - 1 - i] = -m[i];
    if (n % 2 == 1) m[n / 2] = 0.0;
    return m;
}

TestResult finish(std::string test, const std::string& symbol, double statistic, double p, std::size_t n) {
    TestResult r;
    r.test = std::move(test);
    r.add("statistic", statistic).add("p", p).add("n", static_cast<double>(n));
    r.words.shown = true;
    r.words.statistic_symbol = symbol;
    r.words.n_after_p = true;
    return r;
}

// Standardized values z = d/s with the sample SD (n − 1), used by the EDF tests.
std::vector<double> standardized(const Deviations& s) {
    const double sd = std::sqrt(s.sum_of_squares / static_cast<double>(s.n - 1));
    std::vector<double> z(s.sorted);
    for (double& x : z) x /= sd;
    return z;
}

// Dallal & Wilkinson (1986), American Statistician 40, 294–296, eq. for the upper tail of the
// Lilliefors statistic; n > 100 is mapped onto n = 100 by D·(n/100)^0.49. Valid for p <= 0.1.
double dallal_wilkinson_log_p(double d, std::size_t n, double* kd_out = nullptr, double* nd_out = nullptr) {
    double kd = d, nd = static_cast<double>(n);
    if (n > 100) {
        kd = d * std::pow(nd / 100.0, 0.49);
        nd = 100.0;
    }
    if (kd_out) *kd_out = kd;
    if (nd_out) *nd_out = nd;
    return -7.01256 * kd * kd * (nd + 2.78019) + 2.99587 * kd * std::sqrt(nd + 2.78019) - 0.122119 +
           0.974598 / std::sqrt(nd) + 1.67997 / nd;
}

}  // namespace

TestResult shapiro_wilk(std::span<const double> values) {
    const Deviations s = prepare(values, 3, 5000);
    const std::size_t n = s.n;
    const double one_minus_w = one_minus_squared_correlation(s, shapiro_wilk_coefficients(n));
    const double w = 1.0 - one_minus_w;
    double p;
    if (n == 3) {
        // Exact null distribution for n = 3 (Shapiro & Wilk 1965): p = (6/π)(asin √W − π/3).
        p = std::clamp(6.0 / std::numbers::pi * (std::asin(std::sqrt(w)) - std::numbers::pi / 3.0), 0.0, 1.0);
    } else if (!(one_minus_w > 0)) {
        p = 1.0;  // a perfect fit to the normal scores
    } else {
        // Royston (1995), AS R94: log(1 − W) (after a further log for n <= 11) is nearly normal.
        static constexpr std::array<double, 4> c3 = {0.5440, -0.39978, 0.025054, -6.714e-4};
        static constexpr std::array<double, 4> c4 = {1.3822, -0.77857, 0.062767, -0.0020322};
        static constexpr std::array<double, 4> c5 = {-1.5861, -0.31082, -0.083751, 0.0038915};
        static constexpr std::array<double, 3> c6 = {-0.4803, -0.082676, 0.0030302};
        static constexpr std::array<double, 2> g = {-2.273, 0.459};
        const double an = static_cast<double>(n);
        double y = std::log(one_minus_w);
        double mu, sigma;
        if (n <= 11) {
            const double gamma = polynomial(g, an);
            if (y >= gamma) {
                p = 0.0;  // beyond the approximation's support: W smaller than any it describes
                return finish("Shapiro–Wilk normality test", "W", w, p, n);
            }
            y = -std::log(gamma - y);
            mu = polynomial(c3, an);
            sigma = std::exp(polynomial(c4, an));
        } else {
            const double ln_n = std::log(an);
            mu = polynomial(c5, ln_n);
            sigma = std::exp(polynomial(c6, ln_n));
        }
        p = upper_normal((y - mu) / sigma);
    }
    return finish("Shapiro–Wilk normality test", "W", w, p, n);
}

TestResult shapiro_francia(std::span<const double> values) {
    const Deviations s = prepare(values, 5, 5000);
    const std::size_t n = s.n;
    const double one_minus_w = one_minus_squared_correlation(s, blom_scores(n));
    const double w = 1.0 - one_minus_w;
    double p = 1.0;
    if (one_minus_w > 0) {
        // Royston (1993), Statistics in Medicine 12, 181–184: ln(1 − W′) is normal with
        // μ = −1.2725 + 1.0521(v − u), σ = 1.0308 − 0.26758(v + 2/u), u = ln n, v = ln u.
        const double u = std::log(static_cast<double>(n));
        const double v = std::log(u);
        const double mu = -1.2725 + 1.0521 * (v - u);
        const double sigma = 1.0308 - 0.26758 * (v + 2.0 / u);
        p = upper_normal((std::log(one_minus_w) - mu) / sigma);
    }
    return finish("Shapiro–Francia normality test", "W′", w, p, n);
}

TestResult anderson_darling(std::span<const double> values) {
    const Deviations s = prepare(values, 8, no_upper_limit);
    const std::size_t n = s.n;
    const std::vector<double> z = standardized(s);
    // A² = −n − (1/n) Σ (2i − 1)[ln Φ(z_(i)) + ln(1 − Φ(z_(n+1−i)))]; 1 − Φ(z) = Φ(−z) keeps the tail.
    Accumulator sum;
    for (std::size_t i = 0; i < n; ++i)
        sum.add(static_cast<double>(2 * i + 1) * (log_normal_cdf(z[i]) + log_normal_cdf(-z[n - 1 - i])));
    const double an = static_cast<double>(n);
    const double a2 = -an - sum.sum() / an;
    // D'Agostino & Stephens (1986), Goodness-of-Fit Techniques, Table 4.9 (case 3, mean and
    // variance estimated): p from the adjusted A*² (quoted from memory; checked against statsmodels).
    const double a = a2 * (1.0 + 0.75 / an + 2.25 / (an * an));
    double p;
    if (a < 0.2)
        p = 1.0 - std::exp(-13.436 + 101.14 * a - 223.73 * a * a);
    else if (a < 0.34)
        p = 1.0 - std::exp(-8.318 + 42.796 * a - 59.938 * a * a);
    else if (a < 0.6)
        p = std::exp(0.9177 - 4.279 * a - 1.38 * a * a);
    else {
        // The last quadratic turns upward at A* = 5.709/(2 · 0.0186) ≈ 153.5, far outside its range;
        // held at its minimum there so that p never grows with A*.
        const double held = std::min(a, 5.709 / (2.0 * 0.0186));
        p = std::exp(1.2937 - 5.709 * held + 0.0186 * held * held);
    }
    return finish("Anderson–Darling normality test", "A²", a2, std::clamp(p, 0.0, 1.0), n);
}

TestResult lilliefors(std::span<const double> values) {
    const Deviations s = prepare(values, 5, no_upper_limit);
    const std::size_t n = s.n;
    const std::vector<double> z = standardized(s);
    const double an = static_cast<double>(n);
    double d = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        const double f = boost::math::cdf(standard_normal, z[i]);
        d = std::max({d, static_cast<double>(i + 1) / an - f, f - static_cast<double>(i) / an});
    }
    double kd, nd;
    const double log_p = dallal_wilkinson_log_p(d, n, &kd, &nd);
    double p;
    if (log_p <= std::log(0.1)) {
        p = std::exp(log_p);
    } else {
        // Above p = 0.1 Dallal and Wilkinson give no formula. There the p-value comes from a curve
        // fitted to a fixed-seed simulation (tests/reference/generate_normality.py --fit-lilliefors:
        // 100 000 normal samples at each of 14 sizes from 5 to 5000): logit p as a quartic in
        // Stephens' (1974, JASA 69, 730–737) modified statistic t = K(√m − 0.01 + 0.85/√m), taken
        // on Dallal–Wilkinson's own scale (K = D, m = n up to 100; K = D(n/100)^0.49, m = 100
        // above), whose null distribution hardly depends on n. Largest error against the
        // simulation above p = 0.1: 0.013 for 8 <= n <= 1000, 0.016 at n = 2000, 0.024 at 5000,
        // 0.036 at n = 5. The curve is rescaled to meet Dallal–Wilkinson's 0.1 exactly where that
        // formula reaches it for this n, so p is continuous and never rises as D grows.
        static constexpr std::array<double, 5> logit_fit = {39.10344237, -189.85951058, 364.4710349,
                                                            -326.05542532, 108.58633351};
        const double stephens = std::sqrt(nd) - 0.01 + 0.85 / std::sqrt(nd);
        auto fitted = [&](double k) { return 1.0 / (1.0 + std::exp(-polynomial(logit_fit, k * stephens))); };
        // Where Dallal–Wilkinson equals 0.1 for this n: the larger root of a quadratic in K.
        const double q = nd + 2.78019;
        const double c = -0.122119 + 0.974598 / std::sqrt(nd) + 1.67997 / nd - std::log(0.1);
        const double kd_join = (2.99587 * std::sqrt(q) + std::sqrt(2.99587 * 2.99587 * q + 4.0 * 7.01256 * q * c)) /
                               (2.0 * 7.01256 * q);
        const double p_join = fitted(kd_join);
        const double p_here = fitted(std::min(kd, kd_join));
        p = p_here >= p_join ? 0.1 + 0.9 * (p_here - p_join) / (1.0 - p_join) : 0.1;
    }
    return finish("Lilliefors (Kolmogorov–Smirnov) normality test", "D", d, std::clamp(p, 0.0, 1.0), n);
}

namespace {
struct Moments {
    double skewness;  // √b1 = m3 / m2^1.5
    double kurtosis;  // b2 = m4 / m2² (3 for the normal)
};
Moments sample_moments(const Deviations& s) {
    const double an = static_cast<double>(s.n);
    Accumulator third, fourth;
    for (double d : s.sorted) {
        third.add(d * d * d);
        fourth.add(d * d * d * d);
    }
    const double m2 = s.sum_of_squares / an;
    return {third.sum() / an / std::pow(m2, 1.5), fourth.sum() / an / (m2 * m2)};
}
}  // namespace

TestResult dagostino_pearson(std::span<const double> values) {
    const Deviations s = prepare(values, 8, no_upper_limit);
    const double n = static_cast<double>(s.n);
    const Moments m = sample_moments(s);
    // Skewness: D'Agostino (1970) transform, as given by D'Agostino, Belanger & D'Agostino (1990), p. 317.
    const double y = m.skewness * std::sqrt((n + 1) * (n + 3) / (6 * (n - 2)));
    const double beta2 = 3 * (n * n + 27 * n - 70) * (n + 1) * (n + 3) / ((n - 2) * (n + 5) * (n + 7) * (n + 9));
    const double w2 = -1 + std::sqrt(2 * (beta2 - 1));
    const double delta = 1 / std::sqrt(0.5 * std::log(w2));
    const double alpha = std::sqrt(2 / (w2 - 1));
    const double z_skew = delta * std::asinh(y / alpha);
    // Kurtosis: Anscombe & Glynn (1983), as given by D'Agostino, Belanger & D'Agostino (1990), p. 318.
    const double expected = 3 * (n - 1) / (n + 1);
    const double variance_b2 = 24 * n * (n - 2) * (n - 3) / ((n + 1) * (n + 1) * (n + 3) * (n + 5));
    const double x = (m.kurtosis - expected) / std::sqrt(variance_b2);
    const double root_beta1 = 6 * (n * n - 5 * n + 2) / ((n + 7) * (n + 9)) * std::sqrt(6 * (n + 3) * (n + 5) / (n * (n - 2) * (n - 3)));
    const double a = 6 + 8 / root_beta1 * (2 / root_beta1 + std::sqrt(1 + 4 / (root_beta1 * root_beta1)));
    const double denominator = 1 + x * std::sqrt(2 / (a - 4));
    // Edge case: the cube-root transform has a pole where its denominator vanishes.
    if (denominator == 0) throw Refusal("the kurtosis falls on the pole of the Anscombe–Glynn transform; use another method");
    const double term = std::cbrt((1 - 2 / a) / denominator);
    const double z_kurt = (1 - 2 / (9 * a) - term) / std::sqrt(2 / (9 * a));
    const double k2 = z_skew * z_skew + z_kurt * z_kurt;
    TestResult r = finish("D'Agostino–Pearson normality test", "K²", k2, upper_chi_squared(k2, 2), s.n);
    r.quantities.insert(r.quantities.begin() + 1, Quantity{"df", 2.0});
    return r;
}

TestResult jarque_bera(std::span<const double> values) {
    const Deviations s = prepare(values, 8, no_upper_limit);
    const Moments m = sample_moments(s);
    const double excess = m.kurtosis - 3;
    const double jb = static_cast<double>(s.n) / 6 * (m.skewness * m.skewness + excess * excess / 4);
    TestResult r = finish("Jarque–Bera normality test", "JB", jb, upper_chi_squared(jb, 2), s.n);
    r.quantities.insert(r.quantities.begin() + 1, Quantity{"df", 2.0});
    return r;
}

TestResult normality_test(std::span<const double> values, const std::string& method) {
    const std::string m = normality_methods().match(method, "method", "shapiro-wilk");
    if (m == "shapiro-wilk") return shapiro_wilk(values);
    if (m == "shapiro-francia") return shapiro_francia(values);
    if (m == "anderson-darling") return anderson_darling(values);
    if (m == "lilliefors") return lilliefors(values);
    if (m == "dagostino-pearson") return dagostino_pearson(values);
    return jarque_bera(values);
}

std::vector<double> residuals_from_group_means(const Groups& groups) {
    std::vector<double> residuals;
    residuals.reserve(groups.n_used);
    for (const auto& g : groups.values) {
        if (g.empty()) continue;
        const double centre = mean_from_mid_range(g);
        for (double x : g) residuals.push_back(x - centre);
    }
    return residuals;
}

TestResult check_normal(const Groups& groups, const std::string& method) {
    const std::string m = normality_methods().match(method, "method", "shapiro-wilk");
    if (groups.n_used == 0) throw Refusal(no_usable_rows(groups));
    std::size_t filled = 0;
    for (const auto& g : groups.values) filled += g.empty() ? 0 : 1;
    TestResult r;
    if (filled <= 1) {
        for (const auto& g : groups.values)
            if (!g.empty()) r = normality_test(g, m);
        r.add("n dropped", static_cast<double>(groups.n_dropped));
        return r;
    }
    if (std::all_of(groups.values.begin(), groups.values.end(), [](const auto& g) { return g.size() <= 1; }))
        throw Refusal("every group has a single value: residuals from group means need groups of 2 or more values");
    const std::vector<double> residuals = residuals_from_group_means(groups);
    // Edge case: constant within every group leaves residuals that are all zero.
    if (std::all_of(residuals.begin(), residuals.end(), [](double x) { return x == 0.0; }))
        throw Refusal("the values are equal within every group: no spread to test");
    r = normality_test(residuals, m);
    const std::string of_residuals = " of the residuals from " + std::to_string(filled) + " group means";
    r.test += of_residuals;
    r.add("n dropped", static_cast<double>(groups.n_dropped));
    for (std::size_t i = 0; i < groups.group_count(); ++i) {
        const std::string& name = groups.names[i];
        try {
            const TestResult own = normality_test(groups.values[i], m);
            r.add(name + ": statistic", own.number("statistic"));
            r.add(name + ": p", own.number("p"));
        } catch (const Refusal& refusal) {
            r.add(name + ": statistic", std::string(refusal.what()));
            r.add(name + ": p", std::string(refusal.what()));
        }
    }
    return r;
}

std::vector<QQPoint> normal_qq(std::span<const double> values) {
    std::vector<double> sorted(values.begin(), values.end());
    std::sort(sorted.begin(), sorted.end());
    const std::vector<double> scores = blom_scores(sorted.size());
    std::vector<QQPoint> points(sorted.size());
    for (std::size_t i = 0; i < sorted.size(); ++i) points[i] = {scores[i], sorted[i]};
    return points;
}

Table check_qq(const Groups& groups, std::size_t rows) {
    if (groups.wide)
        throw Refusal("CHECK.QQ gives one row per row of values: put the groups in one column with a groups column beside it");
    if (groups.n_used == 0) throw Refusal(no_usable_rows(groups));
    std::vector<double> values;
    if (groups.group_count() > 1)
        values = residuals_from_group_means(groups);
    else
        values = groups.values.front();
    for (double x : values)
        if (!std::isfinite(x)) throw Refusal("values are too far apart to compute residuals (beyond the largest number)");
    const std::vector<QQPoint> points = normal_qq(values);
    Table t(rows, std::vector<CellValue>(2, CellValue{std::monostate{}}));
    for (std::size_t i = 0; i < points.size() && i < rows; ++i) t[i] = {points[i].normal_quantile, points[i].sorted_value};
    return t;
}

}  // namespace quadrat
