#include "effect_interval.hpp"

#include <cmath>
#include <cstdint>
#include <limits>

#include <boost/math/distributions/non_central_f.hpp>
#include <boost/math/distributions/non_central_t.hpp>
#include <boost/math/tools/roots.hpp>

namespace quadrat {

namespace {

constexpr double not_available = std::numeric_limits<double>::quiet_NaN();

// Beyond these the noncentral series take tenths of a second per limit (measured: t = 5000 about
// 0.25 s, df1·F = 1e9 about 0.3 s) for an effect that no interval makes clearer; none is given.
constexpr double max_t = 1000.0, max_lambda = 1e7;

// The root of a decreasing function `gap` of the noncentrality, bracketed by stepping outward from
// `start` by `step` (doubling) in the direction the sign says; TOMS 748 (Alefeld, Potra & Shi
// 1995) to about 1e-13 relative. NaN when no bracket is found within 60 steps.
template <class Gap>
double decreasing_root(Gap gap, double start, double step, double floor) {
    double lo = start, hi = start;
    double g_lo = gap(lo), g_hi = g_lo;
    for (int i = 0; i < 60 && g_lo < 0; ++i) {  // the root lies below: move lo down
        hi = lo;
        g_hi = g_lo;
        lo = std::max(floor, lo - step);
        step *= 2;
        g_lo = gap(lo);
        if (lo == floor && g_lo < 0) return floor;
    }
    for (int i = 0; i < 60 && g_hi > 0; ++i) {  // the root lies above: move hi up
        lo = hi;
        g_lo = g_hi;
        hi += step;
        step *= 2;
        g_hi = gap(hi);
    }
    if (!(g_lo >= 0 && g_hi <= 0)) return not_available;
    if (g_lo == 0) return lo;
    if (g_hi == 0) return hi;
    std::uintmax_t iterations = 100;
    const auto root = boost::math::tools::toms748_solve(gap, lo, hi, g_lo, g_hi,
                                                        boost::math::tools::eps_tolerance<double>(44), iterations);
    return 0.5 * (root.first + root.second);
}

// The limits evaluated with Boost.Math's noncentral distributions; an evaluation Boost refuses
// (extreme arguments) leaves the interval not available rather than reaching the cell.
template <class Solve>
Interval guarded(Solve solve) {
    try {
        return solve();
    } catch (const std::exception&) {
        return {not_available, not_available};
    }
}

}  // namespace

Interval noncentral_t_interval(double t, double df, double level) {
    if (!std::isfinite(t) || !(df > 0) || std::fabs(t) > max_t) return {not_available, not_available};
    const double alpha = 1.0 - level;
    return guarded([&] {
        auto gap_at = [&](double probability) {
            return [=](double delta) {
                return boost::math::cdf(boost::math::non_central_t_distribution<double>(df, delta), t) - probability;
            };
        };
        const double step = 1.0 + 0.5 * std::fabs(t);
        const double lowest = -std::numeric_limits<double>::max();
        return Interval{decreasing_root(gap_at(1.0 - alpha / 2), t, step, lowest),
                        decreasing_root(gap_at(alpha / 2), t, step, lowest)};
    });
}

Interval noncentral_f_interval(double f, double df1, double df2, double level) {
    if (!std::isfinite(f) || !(f >= 0) || !(df1 > 0) || !(df2 > 0) || df1 * f > max_lambda)
        return {not_available, not_available};
    const double alpha = 1.0 - level;
    return guarded([&] {
        auto gap_at = [&](double probability) {
            return [=](double lambda) {
                return boost::math::cdf(boost::math::non_central_f_distribution<double>(df1, df2, lambda), f) - probability;
            };
        };
        // λ̂ = df1 (F − 1) is where the statistic sits near its centre: a good first guess.
        const double start = std::max(0.0, df1 * (f - 1.0));
        const double step = 1.0 + 0.5 * start;
        return Interval{decreasing_root(gap_at(1.0 - alpha / 2), start, step, 0.0),
                        decreasing_root(gap_at(alpha / 2), start, step, 0.0)};
    });
}

}  // namespace quadrat
