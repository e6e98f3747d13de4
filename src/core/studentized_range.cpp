// The studentized range distribution by numerical integration of its defining double integral,
// following Copenhaver & Holland (1988), J. Statist. Comput. Simul. 30, 1–15 (the integrals of
// Lund & Lund 1983, Applied Statistics 32, 204–210, AS 190): fixed Gauss–Legendre panels in both
// dimensions, marching outward until the rest is provably negligible. Nodes and weights come from
// Boost.Math (boost/math/quadrature/gauss.hpp), the normal and χ² functions from Boost.Math.
//
// Infinite df (the range W of k standard normals):
//   P(W ≤ q) = k ∫ φ(z) [Φ(z) − Φ(z − q)]^(k−1) dz
//   P(W > q) = k ∫ φ(z) Φ(z)^(k−1) [1 − (1 − Φ(z − q)/Φ(z))^(k−1)] dz   (the same, complemented
//              inside the integral since k ∫ φ Φ^(k−1) = 1), so that a small upper tail keeps
//              its digits instead of being 1 minus something close to 1.
// Finite df: Q = W / S with νS² ~ χ²(ν), so P(Q ≤ q) = ∫ f_S(s) P(W ≤ q s) ds, integrated over
// u = ln s, whose density ν s² γ'(ν/2, ν s²/2) (γ' = Boost's gamma_p_derivative) stays accurate at
// large ν. Both tails are accumulated in the same pass, each from its own direct integrand.
//
// The inner integral (the range of k normals at x = qS) is needed at every node of the outer one,
// and a quantile or a table of pairs asks for many outer integrals with the same k. So for each k
// the logarithm of the range's smaller tail is tabulated once as piecewise Chebyshev series
// (Clenshaw 1955 recurrence), split until the series' last terms are below 1e-14, and kept for
// the next call; outside the tabulated span the integral is computed directly.
#include "studentized_range.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <list>
#include <memory>
#include <mutex>
#include <string>
#include <vector>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/quadrature/gauss.hpp>
#include <boost/math/special_functions/erf.hpp>
#include <boost/math/special_functions/gamma.hpp>
#include <boost/math/tools/roots.hpp>

#include "refusal.hpp"

namespace quadrat {

namespace {

// Double precision throughout: Boost's default promotes double to long double, ten times slower
// here, for no digit that survives the quadrature.
using Fast = boost::math::policies::policy<boost::math::policies::promote_double<false>>;

constexpr double inv_sqrt2 = 0.70710678118654752440;
constexpr double inv_sqrt2pi = 0.39894228040143267794;

// Beyond this many df the distribution differs from df = ∞ by O(1/df), below 1e-10.
constexpr double df_as_infinite = 1e10;

// The outer march stops when what is left beyond is provably below this share of the sum.
constexpr double outer_remainder = 1e-12;

double normal_density(double z) { return inv_sqrt2pi * std::exp(-0.5 * z * z); }
double normal_lower(double z) { return 0.5 * boost::math::erfc(-z * inv_sqrt2, Fast()); }  // Φ(z)
double normal_upper(double z) { return 0.5 * boost::math::erfc(z * inv_sqrt2, Fast()); }   // 1 − Φ(z)

// 12-point Gauss–Legendre on [−1, 1]: all nodes with their weights.
struct Rule {
    std::array<double, 12> node{}, weight{};
};
const Rule& rule() {
    static const Rule r = [] {
        Rule out;
        using G = boost::math::quadrature::gauss<double, 12>;
        for (std::size_t i = 0; i < 6; ++i) {
            out.node[2 * i] = G::abscissa()[i];
            out.node[2 * i + 1] = -G::abscissa()[i];
            out.weight[2 * i] = out.weight[2 * i + 1] = G::weights()[i];
        }
        return out;
    }();
    return r;
}

// Below this q the lower tail of the range is the smaller one and is integrated directly; above,
// the upper. Any value near the median works: 1 + 2 log10 k lies between the quartiles of the
// range for k = 2..1000 (median 0.95 at k = 2, 3.0 at k = 10, 5.0 at k = 100).
double switch_point(int k) { return 1.0 + 2.0 * std::log10(static_cast<double>(k)); }

// Upper bound of P(W ≤ q): all k values within a window of width q, k (q φ(0))^(k−1).
double range_lower_bound(double q, int k) { return k * std::pow(q * inv_sqrt2pi, k - 1.0); }

// The range of k standard normals, with the parts of both integrands that do not depend on q
// computed once at the nodes of a fixed grid of panels from z = −8.5 (outside [−8.5, 8.5] φ is
// below 1e-16 of its peak). Upper tail: panels of width 1.5; lower tail: width 1 (its integrand
// narrows as k grows). Widths chosen against an adaptive Gauss–Kronrod evaluation to 1e-14:
// relative error below 2e-12 on the upper tail; on the lower tail below 1e-7 where it exceeds
// 1e-12, and below 1e-17 absolute elsewhere.
class RangeOfNormals {
public:
    explicit RangeOfNormals(int k) : k_(k), power_(k - 1.0) {
        build(upper_grid_, upper_width);
        build(lower_grid_, lower_width);
    }

    StudentizedRangeTails tails(double q) const {
        if (q <= 0.0) return {0.0, 1.0};
        if (k_ == 2) return {std::erf(0.5 * q), std::erfc(0.5 * q)};  // W = √2 |Z|: exact
        if (q < switch_point(k_)) {
            const double lower = lower_tail(q);
            return {lower, 1.0 - lower};
        }
        const double upper = upper_tail(q);
        return {1.0 - upper, upper};
    }

private:
    static constexpr double grid_start = -8.5;
    static constexpr double upper_width = 2.0;
    static constexpr double lower_width = 1.0;
    static constexpr double grid_end = 27.0;  // covers q + 9 for every q ≤ 18

    struct Node {
        double z, weighted_density, below, above, weighted_max_density;  // wφ, Φ, 1 − Φ, wφΦ^(k−1)
    };
    struct Grid {
        double width = 0.0;
        std::vector<Node> nodes;  // 12 per panel, panel after panel
    };

    void build(Grid& grid, double width) const {
        grid.width = width;
        const Rule& r = rule();
        const int count = static_cast<int>(std::ceil((grid_end - grid_start) / width));
        grid.nodes.reserve(static_cast<std::size_t>(count) * 12);
        for (int p = 0; p < count; ++p) {
            const double centre = grid_start + (p + 0.5) * width;
            for (std::size_t i = 0; i < 12; ++i) {
                const double z = centre + 0.5 * width * r.node[i];
                const double w = 0.5 * width * r.weight[i] * normal_density(z);
                const double below = normal_lower(z);
                grid.nodes.push_back({z, w, below, normal_upper(z), w * std::pow(below, power_)});
            }
        }
    }

    // Panels of `grid` covering [lo, hi].
    static std::pair<std::size_t, std::size_t> span(const Grid& grid, double lo, double hi) {
        const auto first = static_cast<std::size_t>(std::max(0.0, std::floor((lo - grid_start) / grid.width)));
        const auto last = std::min(grid.nodes.size() / 12, static_cast<std::size_t>(std::ceil((hi - grid_start) / grid.width)));
        return {first * 12, last * 12};
    }

    // P(W ≤ q), q below the switch point (≤ 7 for k ≤ 1000), over [−8.5, q + 8.5].
    double lower_tail(double q) const {
        const auto [from, to] = span(lower_grid_, grid_start, q + 8.5);
        double sum = 0.0;
        for (std::size_t i = from; i < to; ++i) {
            const Node& n = lower_grid_.nodes[i];
            // Φ(z) − Φ(z − q) from whichever tail keeps the difference of two small numbers.
            const double d = n.z - 0.5 * q > 0.0 ? normal_upper(n.z - q) - n.above : n.below - normal_lower(n.z - q);
            if (d > 0.0) sum += n.weighted_density * std::exp(power_ * std::log(d));
        }
        return std::min(1.0, k_ * sum);
    }

    // P(W > q). The integrand behaves as φ(z) Φ(z − q), peaked at q/2 with width 1/√2.
    // Left: the part below z holds at most Φ(z)^k of the mass, cut where that is below 1e-17 of
    // erfc(q/2) = P(|Z₁ − Z₂| > q) ≤ P(W > q). Right: past q/2 + 9 the product is below e^−81 of
    // its peak, and past z the rest is at most k(1 − Φ(z)), cut likewise.
    double upper_tail(double q) const {
        const double least = std::erfc(0.5 * q);
        const double cut = 1e-17 * least;
        // Φ(z)^k ≤ cut ⇔ Φ(z) ≤ cut^(1/k): the normal quantile, found on the grid (monotone).
        const double lo_target = std::pow(cut, 1.0 / k_);
        double lo = grid_start;
        while (lo + upper_width < 8.5 && normal_lower(lo + upper_width) <= lo_target) lo += upper_width;
        double hi = std::max(0.5 * q + 9.0, 8.5);
        if (q > 18.0) return direct_upper(q, std::max(lo, 0.5 * q - 9.0), hi);
        while (hi < q + 9.0 && k_ * normal_upper(hi) > cut) hi += 0.5;
        const auto [from, to] = span(upper_grid_, lo, std::min(hi, q + 9.0));
        double sum = 0.0;
        for (std::size_t i = from; i < to; ++i) {
            const Node& n = upper_grid_.nodes[i];
            if (n.weighted_max_density == 0.0) continue;
            const double ratio = normal_lower(n.z - q) / n.below;
            sum += n.weighted_max_density * -std::expm1(power_ * std::log1p(-ratio));  // 1 − (1 − ratio)^(k−1)
        }
        return std::min(1.0, k_ * sum);
    }

    // P(W > q) for q > 18 (below 1e-50 for every k ≤ 1000), on panels placed around q/2.
    double direct_upper(double q, double lo, double hi) const {
        const Rule& r = rule();
        const int count = static_cast<int>(std::ceil((hi - lo) / upper_width));
        const double width = (hi - lo) / count;
        double sum = 0.0;
        for (int p = 0; p < count; ++p) {
            const double centre = lo + (p + 0.5) * width;
            for (std::size_t i = 0; i < 12; ++i) {
                const double z = centre + 0.5 * width * r.node[i];
                const double below = normal_lower(z);
                if (below <= 0.0) continue;
                const double ratio = normal_lower(z - q) / below;
                sum += 0.5 * width * r.weight[i] * normal_density(z) * std::pow(below, power_) *
                       -std::expm1(power_ * std::log1p(-ratio));
            }
        }
        return std::min(1.0, k_ * sum);
    }

    int k_;
    double power_;
    Grid upper_grid_, lower_grid_;
};

// A smooth function on [a, b] as a Chebyshev series of `points` terms, fitted at the Chebyshev
// nodes; evaluated with Clenshaw's recurrence.
class ChebyshevPiece {
public:
    static constexpr std::size_t points = 16;

    template <class F>
    ChebyshevPiece(double a, double b, F f) : a_(a), b_(b) {
        std::array<double, points> values{};
        for (std::size_t j = 0; j < points; ++j)
            values[j] = f(centre() + half() * std::cos(pi * (j + 0.5) / points));
        for (std::size_t m = 0; m < points; ++m) {
            double sum = 0.0;
            for (std::size_t j = 0; j < points; ++j) sum += values[j] * std::cos(pi * m * (j + 0.5) / points);
            coefficient_[m] = 2.0 * sum / points;
        }
    }

    // How far the series may be from the function: the size of its last terms.
    double truncation() const { return std::fabs(coefficient_[points - 1]) + std::fabs(coefficient_[points - 2]); }
    double size() const { return std::fabs(0.5 * coefficient_[0]); }  // about the mean of |f|
    double a() const { return a_; }
    double b() const { return b_; }

    double operator()(double x) const {
        const double y = (x - centre()) / half();
        double next = 0.0, after = 0.0;
        for (std::size_t m = points - 1; m > 0; --m) {
            const double current = 2.0 * y * next - after + coefficient_[m];
            after = next;
            next = current;
        }
        return y * next - after + 0.5 * coefficient_[0];
    }

private:
    static constexpr double pi = 3.14159265358979323846;
    double centre() const { return 0.5 * (a_ + b_); }
    double half() const { return 0.5 * (b_ - a_); }
    double a_, b_;
    std::array<double, points> coefficient_{};
};

// Piecewise Chebyshev series of f over [a, b], halving a piece until its truncation is below
// `tolerance` or it is narrower than `narrowest` (where the last fit is kept).
class PiecewiseChebyshev {
public:
    template <class F>
    void fit(double a, double b, F f, double tolerance, double narrowest) {
        ChebyshevPiece piece(a, b, f);
        if (piece.truncation() > tolerance * std::max(1.0, piece.size()) && b - a > narrowest) {
            fit(a, 0.5 * (a + b), f, tolerance, narrowest);
            fit(0.5 * (a + b), b, f, tolerance, narrowest);
            return;
        }
        pieces_.push_back(piece);
    }
    std::size_t count() const { return pieces_.size(); }
    double from() const { return pieces_.front().a(); }
    double to() const { return pieces_.back().b(); }
    // For x in [from(), to()].
    double operator()(double x) const {
        const auto found = std::upper_bound(pieces_.begin(), pieces_.end(), x,
                                            [](double v, const ChebyshevPiece& p) { return v < p.b(); });
        return (found == pieces_.end() ? pieces_.back() : *found)(x);
    }

private:
    std::vector<ChebyshevPiece> pieces_;  // adjacent, in order
};

// The range of k normals with its smaller tail tabulated: ln P(W ≤ x) against ln x below the
// switch point (a power law near 0, so linear there), ln P(W > x) against x above it, up to
// x = 52 (tails below 1e-290). The lower table starts where P(W ≤ x) is provably below 1e-18,
// the level below which the outer integral does not ask for it. Against the direct integral the
// tables differ by at most 2e-12 relative (measured while writing this at 10⁴ points for each k
// of 3, 4, 5, 10, 20, 50, 100, 1000; the tests hold the whole distribution to SciPy and mpmath);
// a table costs 3–70 ms to build.
class TabulatedRange {
public:
    explicit TabulatedRange(int k)
        : k_(k), exact_(k), switch_(switch_point(k)),
          // k (x φ(0))^(k−1) = 1e-18 ⇔ x = (1e-18 / k)^(1/(k−1)) / φ(0)
          negligible_below_(std::pow(1e-18 / k, 1.0 / (k - 1.0)) / inv_sqrt2pi) {
        if (k == 2) return;  // the exact erf form needs no table
        constexpr double tolerance = 1e-13, narrowest = 1.0 / 16;
        // From where the outer integral starts asking, but not below x = 1e-5, where the direct
        // lower tail loses digits to cancellation, nor where the tail itself nears the smallest
        // doubles (large k).
        double lowest = std::max(1e-5, negligible_below_);
        while (lowest < switch_ && !(exact_.tails(lowest).lower > 1e-280)) lowest *= 1.05;
        lower_.fit(std::log(lowest), std::log(switch_), [&](double t) { return std::log(exact_.tails(std::exp(t)).lower); },
                   tolerance, narrowest);
        upper_.fit(switch_, highest, [&](double x) { return std::log(exact_.tails(x).upper); }, tolerance, narrowest);
    }

    int groups() const { return k_; }

    // Below this x, P(W ≤ x) is provably under 1e-18 (the window bound).
    double negligible_below() const { return negligible_below_; }

    // At least P(W > x), cheaply: 1 below the switch point, where that tail is above 1/4 anyway.
    double upper_bound(double x) const { return x < switch_ ? 1.0 : tails(x).upper; }

    StudentizedRangeTails tails(double x) const {
        if (k_ == 2 || x <= 0.0) return exact_.tails(x);
        // P(W > x) ≤ C(k, 2) erfc(x/2) (some pair differs by more than x) < 1e-290 here: no sum
        // of normal-sized doubles notices it.
        if (x >= highest) return {1.0, 0.0};
        if (x < switch_) {
            const double t = std::log(x);
            if (t < lower_.from()) return exact_.tails(x);
            const double lower = std::exp(lower_(t));
            return {lower, 1.0 - lower};
        }
        const double upper = std::exp(upper_(x));
        return {1.0 - upper, upper};
    }

private:
    static constexpr double highest = 52.0;
    int k_;
    RangeOfNormals exact_;
    double switch_;
    double negligible_below_;
    PiecewiseChebyshev lower_, upper_;
};

// The tables of the last few k asked for, shared by every call (a Tukey table of 190 pairs,
// a quantile's root search, the cells of one workbook).
std::shared_ptr<const TabulatedRange> range_of(int k) {
    static std::mutex guard;
    static std::list<std::shared_ptr<const TabulatedRange>> recent;  // most recent first
    constexpr std::size_t kept = 8;
    {
        const std::lock_guard<std::mutex> lock(guard);
        for (auto it = recent.begin(); it != recent.end(); ++it)
            if ((*it)->groups() == k) {
                recent.splice(recent.begin(), recent, it);
                return recent.front();
            }
    }
    auto built = std::make_shared<const TabulatedRange>(k);  // outside the lock: it takes a while
    const std::lock_guard<std::mutex> lock(guard);
    recent.push_front(built);
    if (recent.size() > kept) recent.pop_back();
    return built;
}

// ∫ density of ln S · P(W ≤ qS) and · P(W > qS) over u = ln S, panel by panel outward from the
// mode of ln S (u = 0) until the mass of S left beyond, times a bound on each tail there, is below
// outer_remainder of each sum (the stopping rule of Copenhaver & Holland).
StudentizedRangeTails integrate_over_spread(double q, const TabulatedRange& range, int k, double df) {
    const boost::math::chi_squared_distribution<double, Fast> chi2(df);
    const double half_df = 0.5 * df;
    const Rule& r = rule();
    double lower = 0.0, upper = 0.0;
    auto add_panel = [&](double a, double b) {
        for (std::size_t i = 0; i < 12; ++i) {
            const double u = 0.5 * (a + b) + 0.5 * (b - a) * r.node[i];
            const double s2 = std::exp(2.0 * u);
            // Far down (df = 1 marches to u ≈ −690) S² underflows: the density there, of order
            // S^df, is below 1e-150, and Boost's γ' would overflow at 0.
            if (s2 < std::numeric_limits<double>::min()) continue;
            const double density =
                0.5 * (b - a) * r.weight[i] * df * s2 * boost::math::gamma_p_derivative(half_df, half_df * s2, Fast());
            if (density == 0.0) continue;
            const double x = q * std::sqrt(s2);
            // Where P(W ≤ x) is provably below 1e-18, its integral is not worth computing.
            if (x < range.negligible_below()) {
                upper += density;
                continue;
            }
            const StudentizedRangeTails t = range.tails(x);
            lower += density * t.lower;
            upper += density * t.upper;
        }
    };
    // Panel width near the mode: ln S has standard deviation about 1/√(2 df); 12 points resolve
    // two of those, and the tails of the range, which change with ln x on a scale above 0.3.
    const double width = std::min(0.7, 3.0 / std::sqrt(2.0 * df));
    // Upwards: the mass of S above e^u falls off like exp(−df e^(2u)/2); there P(W ≤ qS) ≤ 1 and
    // P(W > qS) ≤ P(W > q e^u).
    for (double u = 0.0; u < 50.0; u += width) {
        add_panel(u, u + width);
        const double beyond = boost::math::cdf(boost::math::complement(chi2, df * std::exp(2.0 * (u + width))));
        if (beyond < 1e-300) break;
        const double upper_left = beyond * range.upper_bound(q * std::exp(u + width));
        if (beyond <= outer_remainder * lower && upper_left <= outer_remainder * upper) break;
    }
    // Downwards: the mass of S below e^u falls off like e^(df u); there P(W > qS) ≤ 1 and
    // P(W ≤ qS) ≤ the window bound. Where q e^u is a tenth of the switch point the tails are
    // flat in u and the panels may widen, as far as the exponential decay of the density allows.
    double step = width;
    for (double u = 0.0; u > -750.0;) {
        add_panel(u - step, u);
        u -= step;
        const double x = q * std::exp(u);
        const double below = boost::math::cdf(chi2, df * std::exp(2.0 * u));
        if (below < 1e-300) break;
        const double lower_left = below * std::min(1.0, range_lower_bound(x, k));
        if (below <= outer_remainder * upper && lower_left <= outer_remainder * lower) break;
        if (x < 0.1 * switch_point(k)) step = std::min(1.5 * step, std::max(width, 3.0 / (df + k - 1.0)));
    }
    return {std::clamp(lower, 0.0, 1.0), std::clamp(upper, 0.0, 1.0)};
}

void check_parameters(double q, int k, double df) {
    if (k < 2 || k > studentized_range_max_groups)
        throw Refusal("the studentized range needs 2 to " + std::to_string(studentized_range_max_groups) +
                      " groups, found " + std::to_string(k));
    if (!(df >= 1.0)) throw Refusal("the studentized range needs at least 1 degree of freedom");
    if (std::isnan(q)) throw Refusal("the studentized range statistic is not a number");
}

StudentizedRangeTails tails_with(const TabulatedRange& range, double q, int k, double df) {
    if (q <= 0.0) return {0.0, 1.0};
    if (std::isinf(q)) return {1.0, 0.0};
    if (df > df_as_infinite) return range.tails(q);
    return integrate_over_spread(q, range, k, df);
}

}  // namespace

StudentizedRangeTails studentized_range_tails(double q, int k, double df) {
    check_parameters(q, k, df);
    return tails_with(*range_of(k), q, k, df);
}

double studentized_range_cdf(double q, int k, double df) { return studentized_range_tails(q, k, df).lower; }
double studentized_range_sf(double q, int k, double df) { return studentized_range_tails(q, k, df).upper; }

double studentized_range_quantile(double probability, int k, double df) {
    check_parameters(1.0, k, df);
    if (!(probability > 0.0 && probability < 1.0))
        throw Refusal("a quantile needs a probability strictly between 0 and 1");
    const auto range = range_of(k);
    // Solve on the smaller tail's logarithm: monotone and nearly linear in q.
    const bool upper = probability > 0.5;
    const double target = std::log(upper ? 1.0 - probability : probability);
    auto gap = [&](double q) {
        const StudentizedRangeTails t = tails_with(*range, q, k, df);
        const double tail = upper ? t.upper : t.lower;
        return (tail > 0.0 ? std::log(tail) : -1e300) - target;
    };
    // Bracket from the switch point by factors of 1.5, then TOMS 748 (Alefeld, Potra & Shi 1995)
    // to about 1e-12 relative in q; at most 60 evaluations.
    std::uintmax_t iterations = 60;
    const boost::math::tools::eps_tolerance<double> tolerance(40);
    const auto bracket =
        boost::math::tools::bracket_and_solve_root(gap, switch_point(k), 1.5, !upper, tolerance, iterations, Fast());
    const double q = 0.5 * (bracket.first + bracket.second);
    if (!std::isfinite(q) || q <= 0.0) throw Refusal("the studentized range quantile could not be found");
    return q;
}

}  // namespace quadrat
