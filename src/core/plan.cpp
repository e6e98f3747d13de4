#include "plan.hpp"

#include <cmath>
#include <cstdint>

#include <boost/math/distributions/fisher_f.hpp>
#include <boost/math/distributions/non_central_f.hpp>
#include <boost/math/distributions/non_central_t.hpp>
#include <boost/math/distributions/students_t.hpp>
#include <boost/math/tools/roots.hpp>

#include "data.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "transform.hpp"

namespace quadrat {

const KeywordTable& plan_designs() {
    static const KeywordTable t{"plan designs",
                                {{"two-groups", "two independent groups, noncentral t"},
                                 {"paired", "paired readings, sd of the differences"},
                                 {"one-sample", "one sample against a value"},
                                 {"several-groups", "one-way ANOVA over count groups, noncentral F"}}};
    return t;
}

namespace {

double positive(double x, const std::string& name, const std::string& what) {
    if (!(std::isfinite(x) && x > 0)) throw Refusal(name + " must be a positive number (" + what + "), found " + number_label(x));
    return x;
}

double per_group(double n) {
    if (!(n >= 2 && n <= 1e9 && n == std::floor(n)))
        throw Refusal("n must be a whole number of readings per group from 2 to 1000000000, found " + number_label(n));
    return n;
}

// α = 1 − level, and a target power that a test at α can fall short of: at no difference the
// two-sided test already flags α of the time, so a power at or below α asks for nothing.
double alpha_of(double level) { return 1 - parse_level(level, false); }

double target_power(double power, double alpha) {
    if (!(power > 0 && power < 1))
        throw Refusal("power must be a fraction between 0 and 1 (such as 0.8), found " + number_label(power));
    if (!(power > alpha))
        throw Refusal("power must be above " + number_label(alpha) +
                      ", the share of tests that flag a difference where there is none at this level");
    return power;
}

// Power at standardized difference d (see plan.hpp for each design's distribution); may throw
// where Boost.Math's noncentral series give up (noncentrality in the millions).
double power_evaluated(double n, double d, const Design& g, double alpha) {
    if (g.kind == DesignKind::several_groups) {
        // One-way ANOVA F (Tang 1938, Stat. Res. Mem. 2, 126–149, for the noncentral F's power):
        // λ = n·Σ(μ_i − μ̄)²/σ² = n·D²/(2σ²) with two means at ±D/2 and the rest at the midpoint.
        const double df1 = g.groups - 1, df2 = g.groups * (n - 1);
        const boost::math::fisher_f central(df1, df2);
        const double critical = quantile(complement(central, alpha));
        const double lambda = n * d * d / 2;
        // Below 1e-14 the power differs from the central F's by less than λ/2 (the Poisson-mixture
        // weights move that little), and Boost.Math's noncentral F misbehaves at λ = 0 (measured:
        // −0.95 at df (9999, 10000)).
        if (lambda < 1e-14) return cdf(complement(central, critical));
        const boost::math::non_central_f_distribution<double> f(df1, df2, lambda);
        return std::min(1.0, cdf(complement(f, critical)));
    }
    const bool two = g.kind == DesignKind::two_groups;
    const double df = two ? 2 * n - 2 : n - 1;
    const double delta = two ? d * std::sqrt(n / 2) : d * std::sqrt(n);
    const double critical = quantile(complement(boost::math::students_t(df), alpha / 2));
    const boost::math::non_central_t_distribution<double> t(df, delta);
    // Both tails of the two-sided test: P(T′ > t_c) + P(T′ < −t_c).
    return std::min(1.0, cdf(complement(t, critical)) + cdf(t, -critical));
}

// The power, or where the series give up, 1 when a smaller difference (power rises with the
// difference) already has power 1 to double precision; a refusal otherwise.
double power_at(double n, double d, const Design& g, double alpha) {
    for (double smaller = d; smaller > 0; smaller /= 2) {
        try {
            const double p = power_evaluated(n, smaller, g, alpha);
            if (smaller == d) return p;
            if (p >= 1 - 0x1p-53) return 1.0;
            break;
        } catch (const std::exception&) {
        }
    }
    throw Refusal("the power cannot be evaluated this far out (standardized difference " + number_label(d) + ", n = " +
                  number_label(n) + ")");
}

}  // namespace

Design plan_design(const std::string& design, double count, bool count_given) {
    const std::string key = plan_designs().pick(design, "design");
    Design g;
    g.kind = key == "two-groups" ? DesignKind::two_groups
             : key == "paired"   ? DesignKind::paired
             : key == "one-sample" ? DesignKind::one_sample
                                   : DesignKind::several_groups;
    if (g.kind == DesignKind::several_groups) {
        // Two groups are allowed: the F test on 1 degree of freedom is the two-sided t test squared.
        if (!count_given)
            throw Refusal("design several-groups needs count, the number of groups (a whole number from 2 to 10000)");
        if (!(count >= 2 && count <= 10000 && count == std::floor(count)))
            throw Refusal("count must be a whole number of groups from 2 to 10000, found " + number_label(count));
        g.groups = count;
    } else if (count_given) {
        throw Refusal("count is the number of groups of design several-groups; leave it empty for design " + key);
    }
    return g;
}

double plan_power(double n, double difference, double sd, const Design& design, double level) {
    const double alpha = alpha_of(level);
    per_group(n);
    const double d = positive(difference, "difference", "the size of the difference to detect") /
                     positive(sd, "sd", "the standard deviation of the readings");
    if (!std::isfinite(d) || d == 0) throw Refusal("difference over sd is beyond the range of numbers; rescale the two");
    return power_at(n, d, design, alpha);
}

double plan_samples(double difference, double sd, const Design& design, double power, double level) {
    const double alpha = alpha_of(level);
    const double target = target_power(power, alpha);
    const double d = positive(difference, "difference", "the size of the difference to detect") /
                     positive(sd, "sd", "the standard deviation of the readings");
    if (!std::isfinite(d) || d == 0) throw Refusal("difference over sd is beyond the range of numbers; rescale the two");
    const auto cap = static_cast<std::size_t>(largest_planned_n);
    const std::size_t n = smallest_n(2, cap, [&](std::size_t m) {
        return power_at(static_cast<double>(m), d, design, alpha) >= target;
    });
    if (n == 0)
        throw Refusal("no n up to " + std::to_string(cap) + " per group reaches power " + number_label(target) +
                      " (power there " + format_number(power_at(largest_planned_n, d, design, alpha)) +
                      "); the difference is too small against sd");
    return static_cast<double>(n);
}

double plan_detectable(double n, double sd, const Design& design, double power, double level) {
    const double alpha = alpha_of(level);
    const double target = target_power(power, alpha);
    per_group(n);
    positive(sd, "sd", "the standard deviation of the readings");
    auto gap = [&](double d) { return power_at(n, d, design, alpha) - target; };
    // Bracket the standardized difference: power − target < 0 at d → 0 (power α), ≥ 0 once d is large.
    double low = 0, high = 1, gap_low = alpha - target, gap_high = gap(high);
    while (gap_high < 0) {
        if (high > 1e6) throw Refusal("no difference up to 1000000 × sd reaches power " + number_label(target));
        low = high;
        gap_low = gap_high;
        high *= 2;
        gap_high = gap(high);
    }
    if (gap_high == 0) return high * sd;
    // TOMS 748 (Alefeld, Potra & Shi 1995, ACM TOMS 21, 327–344) to about 1e-13 relative.
    std::uintmax_t iterations = 100;
    const auto root = boost::math::tools::toms748_solve(gap, low, high, gap_low, gap_high,
                                                        boost::math::tools::eps_tolerance<double>(44), iterations);
    const double detectable = 0.5 * (root.first + root.second) * sd;
    if (!std::isfinite(detectable)) throw Refusal("the detectable difference lies beyond the range of numbers; rescale sd");
    return detectable;
}

}  // namespace quadrat
