#include "limits.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <limits>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/non_central_t.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>
#include <boost/math/special_functions/beta.hpp>

#include "data.hpp"
#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "keywords.hpp"
#include "plan.hpp"
#include "random.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"
#include "transform.hpp"

namespace quadrat {

namespace {

// The values scaled by a power of two (exact) so that squares of 1e200 or 1e-200 stay in range, with
// their mean and SD on that scale; a refusal for fewer than 2 values or no spread.
struct Scaled {
    std::vector<double> x;
    double scale = 1, n = 0, mean = 0, sd = 0;
    double unscaled(double v) const { return v / scale; }
};

Scaled scaled_moments(std::span<const double> values, const std::string& what) {
    if (values.size() < 2) throw Refusal(what + " needs at least 2 values, found " + std::to_string(values.size()));
    require_finite(values);
    const std::span<const double> views[] = {values};
    Scaled s;
    s.scale = power_of_two_scale(views);
    s.x.assign(values.begin(), values.end());
    for (double& v : s.x) v *= s.scale;
    s.n = static_cast<double>(s.x.size());
    s.mean = mean(s.x);
    s.sd = std::sqrt(sum_of_squares(s.x, s.mean) / (s.n - 1));
    if (!(s.sd > 0))
        throw Refusal("all values are equal (no spread); " + what + " needs values that vary");
    return s;
}

std::vector<double> sorted_finite(std::span<const double> values, std::size_t minimum, const std::string& what) {
    if (values.size() < minimum)
        throw Refusal(what + " needs at least " + std::to_string(minimum) + " values, found " +
                      std::to_string(values.size()));
    require_finite(values);
    std::vector<double> sorted(values.begin(), values.end());
    std::sort(sorted.begin(), sorted.end());
    return sorted;
}

// A limit that left the range of numbers (data near 1e308) is a refusal, never an infinity in a cell.
double finite_limit(double x) {
    if (!std::isfinite(x))
        throw Refusal("the limit lies beyond the range of numbers a cell holds; rescale the values (other units)");
    return x;
}

double fraction_argument(double p, const std::string& name) {
    if (!(p > 0 && p < 1)) throw Refusal(name + " must be a fraction between 0 and 1 (such as 0.9), found " + number_label(p));
    return p;
}

enum class Side { upper, lower, two_sided };

Side side_keyword(const std::string& given) {
    const std::string key = limit_sides().pick(given, "side");
    return key == "upper" ? Side::upper : key == "lower" ? Side::lower : Side::two_sided;
}

std::string side_words(Side side) {
    return side == Side::upper ? "upper" : side == Side::lower ? "lower" : "two-sided";
}

// "90th", "95th", "97.5th", "99.9999th".
std::string percentile_name(double fraction) {
    const double percent = fraction * 100;
    if (std::fabs(percent - std::round(percent)) < 1e-9) return ordinal(static_cast<std::size_t>(std::lround(percent)));
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10gth", percent);
    return buffer;
}

using Form = LimitDetail::Form;

// One part of a report sentence's parenthesis (report.hpp renders it).
LimitDetail detail(std::string before, std::string quantity, std::string after = "", Form form = Form::number) {
    return {std::move(before), std::move(quantity), std::move(after), form};
}

std::string capitalized(std::string text) {
    if (!text.empty()) text[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(text[0])));
    return text;
}

// A proportion as a percentage with the digits it needs: "90%", "97.5%", "99.9999%" (format_level
// would round 0.999999 to "100.0%").
std::string percent(double proportion) {
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10g%%", proportion * 100);
    return buffer;
}

// Adds `limit` (one side) or `limit-low` and `limit-high` (two-sided) as centre ∓/± a half-width.
void add_limits(LimitResult& r, Side side, double low, double high) {
    if (side == Side::two_sided) {
        r.two_sided = true;
        r.result.add("limit-low", finite_limit(low)).add("limit-high", finite_limit(high));
    } else {
        r.result.add("limit", finite_limit(side == Side::upper ? high : low));
    }
}

// Efron's bias-corrected and accelerated bootstrap upper limit of the mean (Efron 1987, JASA 82,
// 171–185; Efron & Tibshirani 1993, An Introduction to the Bootstrap, §14.3). bootstrap_draws
// resamples from a fixed seed, so a cell gives the same number on every recalculation; each
// resample costs n index draws (draws × n in all). The acceleration is the jackknife's, which for
// the mean is Σd³ / (6·(Σd²)^{3/2}) with d the deviations from the mean.
struct Bootstrap {
    double limit, z0, acceleration, adjusted_level;
};

Bootstrap bca_upper_limit(const Scaled& s, double level) {
    const std::size_t n = s.x.size();
    std::vector<double> d(n);
    double d2 = 0, d3 = 0;
    for (std::size_t i = 0; i < n; ++i) {
        d[i] = s.x[i] - s.mean;
        d2 += d[i] * d[i];
        d3 += d[i] * d[i] * d[i];
    }
    SplitMix64 generator{19870301};  // fixed seed: the cell is stable (any constant would do)
    std::vector<double> shifts(bootstrap_draws);
    std::size_t below = 0;
    // An index in 0..n−1 by multiply-shift (Lemire 2019, ACM TOMACS 29, 3): from each 32-bit half of
    // a draw while n ≤ 2²⁰ (a sheet's rows; each index's chance off by at most n/2³², 2.4e-4
    // relative), from the whole 64 bits beyond.
    const bool halves = n <= (std::size_t{1} << 20);
    const std::uint64_t n64 = n;
    for (double& shift : shifts) {
        double total = 0;
        if (halves) {
            std::size_t i = 0;
            for (; i + 1 < n; i += 2) {
                const std::uint64_t r = generator();
                total += d[((r & 0xffffffffu) * n64) >> 32];
                total += d[((r >> 32) * n64) >> 32];
            }
            if (i < n) total += d[((generator() & 0xffffffffu) * n64) >> 32];
        } else {
            __extension__ using wide = unsigned __int128;
            for (std::size_t i = 0; i < n; ++i) total += d[static_cast<std::size_t>((static_cast<wide>(generator()) * n64) >> 64)];
        }
        shift = total / static_cast<double>(n);
        if (shift < 0) ++below;
    }
    if (below == 0 || below == bootstrap_draws)
        throw Refusal("every bootstrap mean fell on one side of the sample mean; use method t or chebyshev");
    const boost::math::normal standard;
    const double z0 = quantile(standard, static_cast<double>(below) / bootstrap_draws);
    const double acceleration = d3 / (6 * std::pow(d2, 1.5));
    const double w = z0 + quantile(standard, level);
    const double denominator = 1 - acceleration * w;
    if (!(denominator > 0))
        throw Refusal("the data are too skewed for the bootstrap at this level (acceleration " + format_number(acceleration) +
                      "); use method chebyshev");
    const double adjusted = cdf(standard, z0 + w / denominator);
    std::sort(shifts.begin(), shifts.end());
    return {s.mean + quantile_of_sorted(shifts, adjusted), z0, acceleration, adjusted};
}

constexpr std::size_t largest_searched_n = 1000000000;

std::string needs_n(std::size_t n_needed, const std::string& what, std::size_t n) {
    if (n_needed == 0)
        return what + " needs more than " + std::to_string(largest_searched_n) + " values, found " + std::to_string(n);
    return what + " needs at least " + std::to_string(n_needed) + " values, found " + std::to_string(n);
}

// P(all m new readings fall in G given gaps of n ordered readings) = C(G + m − 1, m)/C(n + m, m)
// = Π (G + i)/(n + 1 + i), i = 0..m − 1: each of the C(n + m, m) orderings of old and new readings is
// equally likely for exchangeable continuous readings.
double share_of_orderings(double gaps, double n, double readings) {
    double product = 1;
    for (double i = 0; i < readings && product > 0; ++i) product *= (gaps + i) / (n + 1 + i);
    return product;
}

}  // namespace

namespace {
// The words several output tables share. A function, not a namespace-scope object: the registry's
// declarations read the tables while the program's static objects are still being made.
std::vector<Keyword> limit_output_words(std::initializer_list<Keyword> own) {
    std::vector<Keyword> words = {{"limit", "the limit the function is for"}, {"estimate", "the quantity it bounds"}};
    words.insert(words.end(), own.begin(), own.end());
    words.push_back({"table", "the whole result as an array"});
    words.push_back({"report", "one sentence"});
    return words;
}
Keyword k_factor_word() { return {"k-factor", "the normal methods' multiplier"}; }
Keyword n_word() { return {"n", "observations used"}; }
}  // namespace

const KeywordTable& limit_outputs() {
    static const KeywordTable t{"mean limit outputs", limit_output_words({k_factor_word(), n_word()})};
    return t;
}

const KeywordTable& percentile_limit_outputs() {
    static const KeywordTable t{"percentile limit outputs", limit_output_words({n_word()})};
    return t;
}

const KeywordTable& exceedance_outputs() {
    static const KeywordTable t{"exceedance outputs", limit_output_words({{"count", "values above the standard"}, n_word()})};
    return t;
}

const KeywordTable& sided_limit_outputs() {
    static const KeywordTable t{"sided limit outputs",
                                limit_output_words({k_factor_word(), n_word(), {"limit-low", "lower limit, two-sided"},
                                                    {"limit-high", "upper limit, two-sided"}})};
    return t;
}

const KeywordTable& limit_sides() {
    static const KeywordTable t{"sides",
                                {{"upper", "an upper limit"}, {"lower", "a lower limit"}, {"two-sided", "both limits"}}};
    return t;
}

const KeywordTable& mean_limit_methods() {
    static const KeywordTable t{"mean limit methods",
                                {{"t", "Student's t"},
                                 {"bootstrap", "bias-corrected and accelerated bootstrap, fixed seed"},
                                 {"chebyshev", "distribution-free, conservative"}}};
    return t;
}

const KeywordTable& limit_methods() {
    static const KeywordTable t{"limit methods",
                                {{"normal", "from the normal distribution"}, {"distribution-free", "from order statistics"}}};
    return t;
}

Table select_limit_output(const LimitResult& limit, const std::string& output, const KeywordTable& allowed) {
    const std::string key = allowed.pick(output, "output");
    if (key == "limit" && limit.two_sided)
        throw Refusal("side two-sided gives two limits: ask for output limit-low or limit-high");
    if ((key == "limit-low" || key == "limit-high") && !limit.two_sided)
        throw Refusal("output " + key + " needs side two-sided; a one-sided limit is output limit");
    if (key == "report") return single(render_limit_report(limit));
    if (key == "estimate") {
        if (limit.estimate_label.empty())
            throw Refusal("output 'estimate' is not available for " + limit.result.test);
        return select_output(limit.result, limit.estimate_label, KeywordTable("output", {{limit.estimate_label, ""}}));
    }
    return select_output(limit.result, key, allowed);
}

std::size_t order_statistic_rank(std::size_t n, double p, double confidence) {
    if (n == 0) return 0;
    const boost::math::binomial dist(static_cast<double>(n), p);
    auto covers = [&](std::size_t r) { return cdf(dist, static_cast<double>(r - 1)) >= confidence; };
    if (!covers(n)) return 0;
    std::size_t fails = 0, good = n;  // r = 0 stands for "never covers"
    while (good - fails > 1) {
        const std::size_t middle = fails + (good - fails) / 2;
        (middle > 0 && covers(middle) ? good : fails) = middle;
    }
    return good;
}

double clopper_pearson_upper(double successes, double trials, double confidence) {
    // Upper limit: the p at which P(X ≤ k) = 1 − confidence, i.e. the `confidence` quantile of
    // Beta(k + 1, n − k); 1 when every trial succeeded (Clopper & Pearson 1934).
    if (successes >= trials) return 1.0;
    return boost::math::ibeta_inv(successes + 1, trials - successes, confidence);
}

double tolerance_factor_one_sided(double n, double proportion, double confidence) {
    // The noncentral t form (Johnson & Welch 1940, Biometrika 31, 362–389): x̄ + k·s exceeds the
    // proportion-quantile with confidence γ when √n·k is the γ-quantile of t′(n − 1, z_p·√n).
    const boost::math::normal standard;
    const double delta = quantile(standard, proportion) * std::sqrt(n);
    const boost::math::non_central_t_distribution<double> t(n - 1, delta);
    return quantile(t, confidence) / std::sqrt(n);
}

double tolerance_factor_two_sided(double n, double proportion, double confidence) {
    // Howe (1969), JASA 64, 610–620, his approximation (the one NIST/SEMATECH §7.2.6.3 prints).
    const boost::math::normal standard;
    const boost::math::chi_squared chi(n - 1);
    return quantile(standard, (1 + proportion) / 2) * std::sqrt((n - 1) * (1 + 1 / n) / quantile(chi, 1 - confidence));
}

LimitResult limit_mean(std::span<const double> values, const std::string& method_given, double level_given) {
    const std::string method = mean_limit_methods().pick(method_given, "method");
    const double level = parse_level(level_given, false);
    if (method == "bootstrap" && values.size() < 10)
        throw Refusal("method bootstrap needs at least 10 values, found " + std::to_string(values.size()) +
                      " (fewer give too few distinct resamples); use method t");
    // Its cost is bootstrap_draws × n index draws (0.27 s of processor time at 10⁵ values, measured);
    // beyond that a cell would take seconds, for a limit that approaches the t limit as n grows.
    if (method == "bootstrap" && values.size() > max_bootstrap_values)
        throw Refusal("method bootstrap takes up to " + std::to_string(max_bootstrap_values) + " values, found " +
                      std::to_string(values.size()) + " (it draws " + std::to_string(bootstrap_draws) + " resamples of them all); with this many values "
                      "use method t, which the bootstrap approaches as n grows");
    const Scaled s = scaled_moments(values, "an upper confidence limit of the mean");
    const std::string level_text = format_level(level);
    LimitResult r;
    r.estimate_label = "mean";
    TestResult& t = r.result;
    t.add("n", s.n).add("mean", s.unscaled(s.mean)).add("SD", s.unscaled(s.sd));
    std::string name;
    if (method == "bootstrap") {
        const Bootstrap b = bca_upper_limit(s, level);
        name = "bootstrap BCa, " + std::to_string(bootstrap_draws) + " resamples";
        t.test = "One-sided " + level_text + " upper confidence limit of the mean (bootstrap BCa, Efron 1987)";
        t.add("draws", static_cast<double>(bootstrap_draws))
            .add("bias correction z0", b.z0)
            .add("acceleration", b.acceleration)
            .add("bootstrap level used", b.adjusted_level)
            .add("limit", finite_limit(s.unscaled(b.limit)));
    } else {
        double k = 0;
        if (method == "t") {
            // The one-sided t limit (Student 1908): x̄ + t(level, n − 1)·s/√n.
            k = quantile(boost::math::students_t(s.n - 1), level) / std::sqrt(s.n);
            name = "Student's t";
        } else {
            // Cantelli's one-sided Chebyshev inequality (Cantelli 1928) for the sample mean, with s in
            // place of σ: P(x̄ − μ ≥ c·σ/√n) ≤ 1/(1 + c²), so c = √(1/α − 1). Conservative and
            // distribution-free but for s standing in for σ.
            k = std::sqrt(1 / (1 - level) - 1) / std::sqrt(s.n);
            name = "Chebyshev, distribution-free";
        }
        t.test = "One-sided " + level_text + " upper confidence limit of the mean (" + name + ")";
        t.add("k-factor", k).add("limit", finite_limit(s.unscaled(s.mean + k * s.sd)));
    }
    r.title = "Upper " + level_text + " confidence limit of the mean (" + name + ")";
    r.details = {detail("mean ", "mean"), detail("SD ", "SD")};
    return r;
}

LimitResult limit_percentile(std::span<const double> values, double fraction, double level_given) {
    const double level = parse_level(level_given, false);
    if (!(fraction >= 0 && fraction < 1))
        throw Refusal(fraction == 1 ? std::string("fraction 1 is the largest value, which has no upper confidence limit; use a fraction below 1")
                                    : "fraction must be from 0 to 1 (0.9 for the 90th percentile), found " + number_label(fraction));
    const std::vector<double> sorted = sorted_finite(values, 1, "a percentile");
    const std::size_t n = sorted.size();
    const std::size_t rank = order_statistic_rank(n, fraction, level);
    const std::string name = percentile_name(fraction) + " percentile";
    if (rank == 0) {
        // 1 − p^n ≥ level: the largest value covers the percentile.
        const std::size_t needed = smallest_n(n + 1, largest_searched_n, [&](std::size_t m) {
            return -std::expm1(static_cast<double>(m) * std::log(fraction)) >= level;
        });
        throw Refusal(needs_n(needed, "a " + format_level(level) + " upper limit of the " + name, n));
    }
    LimitResult r;
    r.estimate_label = "percentile";
    TestResult& t = r.result;
    t.test = "Distribution-free one-sided " + format_level(level) + " upper confidence limit of the " + name +
             " (order statistics, binomial)";
    const boost::math::binomial dist(static_cast<double>(n), fraction);
    t.add("n", static_cast<double>(n))
        .add("fraction", fraction)
        .add("percentile", quantile_of_sorted(sorted, fraction))
        .add("order statistic", static_cast<double>(rank))
        .add("confidence", cdf(dist, static_cast<double>(rank - 1)))
        .add("limit", sorted[rank - 1]);
    r.title = "Upper " + format_level(level) + " confidence limit of the " + name;
    r.details = {detail(name + " ", "percentile"), detail("", "order statistic", ", distribution-free", Form::order)};
    return r;
}

LimitResult limit_exceedance(std::span<const double> values, double standard, double level_given) {
    const double level = parse_level(level_given, false);
    if (!std::isfinite(standard)) throw Refusal("standard must be a number");
    if (values.empty()) throw Refusal("the share above a standard needs at least 1 value, found 0");
    require_finite(values);
    const auto count = static_cast<double>(std::count_if(values.begin(), values.end(), [&](double x) { return x > standard; }));
    const double n = static_cast<double>(values.size());
    LimitResult r;
    r.estimate_label = "share above standard";
    TestResult& t = r.result;
    t.test = "Share of values above the standard with its one-sided " + format_level(level) +
             " upper confidence limit (Clopper–Pearson exact)";
    t.add("n", n)
        .add("standard", standard)
        .add("count", count)
        .add("share above standard", count / n)
        .add("limit", clopper_pearson_upper(count, n, level));
    r.title = "Upper " + format_level(level) + " confidence limit of the share above the standard (Clopper–Pearson)";
    r.details = {detail("standard ", "standard", "", Form::typed), detail("", "count", " above it", Form::whole),
                 detail("share ", "share above standard")};
    return r;
}

LimitResult limit_tolerance(std::span<const double> values, double proportion, double level_given,
                            const std::string& side_given, const std::string& method_given) {
    const double level = parse_level(level_given, false);
    fraction_argument(proportion, "proportion");
    const Side side = side_keyword(side_given);
    const std::string method = limit_methods().pick(method_given, "method");
    const std::string head = side_words(side) + " tolerance limit" + (side == Side::two_sided ? "s" : "") + " for " +
                             percent(proportion) + " of the population at " + format_level(level) + " confidence";
    LimitResult r;
    TestResult& t = r.result;
    if (method == "normal") {
        const Scaled s = scaled_moments(values, "a normal tolerance limit");
        const double k = side == Side::two_sided ? tolerance_factor_two_sided(s.n, proportion, level)
                                                 : tolerance_factor_one_sided(s.n, proportion, level);
        t.test = "Normal " + head + (side == Side::two_sided ? " (Howe 1969)" : " (exact, noncentral t)");
        t.add("n", s.n).add("mean", s.unscaled(s.mean)).add("SD", s.unscaled(s.sd)).add("proportion", proportion);
        if (side != Side::two_sided) {
            const double z = quantile(boost::math::normal(), proportion);
            r.estimate_label = "percentile";
            t.add("percentile", s.unscaled(side == Side::upper ? s.mean + z * s.sd : s.mean - z * s.sd));
        }
        t.add("k-factor", k);
        add_limits(r, side, s.unscaled(s.mean - k * s.sd), s.unscaled(s.mean + k * s.sd));
        r.details = {detail("mean ", "mean"), detail("SD ", "SD"), detail("k = ", "k-factor")};
    } else {
        // Order statistics (Wilks 1941, Ann. Math. Stat. 12, 91–96): the coverage F(x(r)) is
        // Beta(r, n − r + 1), so P(F(x(r)) ≥ p) = P(Bin(n, p) ≤ r − 1); two-sided with m values set
        // aside at each end, P(coverage ≥ p) = P(Bin(n, p) ≤ n − 2m − 2).
        const std::vector<double> sorted = sorted_finite(values, 1, "a tolerance limit");
        const std::size_t n = sorted.size();
        t.test = "Distribution-free " + head + " (order statistics)";
        t.add("n", static_cast<double>(n)).add("proportion", proportion);
        const boost::math::binomial dist(static_cast<double>(n), proportion);
        if (side == Side::two_sided) {
            auto covers = [&](std::size_t m) {
                return 2 * m + 2 <= n && cdf(dist, static_cast<double>(n - 2 * m - 2)) >= level;
            };
            if (!covers(0)) {
                const std::size_t needed = smallest_n(std::max<std::size_t>(n + 1, 2), largest_searched_n, [&](std::size_t m) {
                    return cdf(boost::math::binomial(static_cast<double>(m), proportion), static_cast<double>(m - 2)) >= level;
                });
                throw Refusal(needs_n(needed, "a distribution-free two-sided tolerance interval for " + percent(proportion) +
                                                  " at " + format_level(level) + " confidence",
                                      n));
            }
            std::size_t good = 0, fails = n;  // largest m that still covers
            while (fails - good > 1) {
                const std::size_t middle = good + (fails - good) / 2;
                (covers(middle) ? good : fails) = middle;
            }
            t.add("values set aside at each end", static_cast<double>(good))
                .add("confidence", cdf(dist, static_cast<double>(n - 2 * good - 2)));
            add_limits(r, side, sorted[good], sorted[n - 1 - good]);
            t.unlisted.push_back({"order from each end", static_cast<double>(good + 1)});
            r.details = {detail("", "order from each end", ", distribution-free", Form::outer)};
        } else {
            const std::size_t rank = order_statistic_rank(n, proportion, level);
            if (rank == 0) {
                const std::size_t needed = smallest_n(n + 1, largest_searched_n, [&](std::size_t m) {
                    return -std::expm1(static_cast<double>(m) * std::log(proportion)) >= level;
                });
                throw Refusal(needs_n(needed, "a distribution-free " + side_words(side) + " tolerance limit for " +
                                                  percent(proportion) + " at " + format_level(level) + " confidence",
                                      n));
            }
            r.estimate_label = "percentile";
            const double at = side == Side::upper ? proportion : 1 - proportion;
            t.add("percentile", quantile_of_sorted(sorted, at))
                .add("order statistic", static_cast<double>(side == Side::upper ? rank : n + 1 - rank))
                .add("confidence", cdf(dist, static_cast<double>(rank - 1)));
            add_limits(r, side, sorted[n - rank], sorted[rank - 1]);
            r.details = {detail("", "order statistic", ", distribution-free", Form::order)};
        }
    }
    r.title = capitalized(head);
    return r;
}

LimitResult limit_prediction(std::span<const double> values, double readings, double level_given,
                             const std::string& side_given, const std::string& method_given) {
    const double level = parse_level(level_given, false);
    if (!(readings >= 1 && readings <= 1e6 && readings == std::floor(readings)))
        throw Refusal("readings must be a whole number of new readings from 1 to 1000000, found " + number_label(readings));
    const Side side = side_keyword(side_given);
    const std::string method = limit_methods().pick(method_given, "method");
    const std::string next = readings == 1 ? "the next reading" : "each of the next " + format_df(readings) + " readings";
    const std::string head = side_words(side) + " prediction limit" + (side == Side::two_sided ? "s" : "") + " for " + next +
                             " at " + format_level(level) + " confidence";
    LimitResult r;
    TestResult& t = r.result;
    if (method == "normal") {
        // x̄ ± t·s·√(1 + 1/n), with t at 1 − α/m (one side) or 1 − α/(2m) (two-sided) for m readings:
        // the Bonferroni rule of common practice (Hahn & Meeker 1991, Statistical Intervals).
        const Scaled s = scaled_moments(values, "a normal prediction limit");
        const double alpha = (1 - level) / readings / (side == Side::two_sided ? 2 : 1);
        const double k = quantile(complement(boost::math::students_t(s.n - 1), alpha)) * std::sqrt(1 + 1 / s.n);
        t.test = "Normal " + head + (readings > 1 ? " (t, Bonferroni)" : " (t)");
        r.estimate_label = "mean";
        t.add("n", s.n).add("mean", s.unscaled(s.mean)).add("SD", s.unscaled(s.sd)).add("readings", readings).add("k-factor", k);
        add_limits(r, side, s.unscaled(s.mean - k * s.sd), s.unscaled(s.mean + k * s.sd));
        r.details = {detail("mean ", "mean"), detail("SD ", "SD"), detail("k = ", "k-factor")};
    } else {
        // The m new readings all fall in the G gaps of the ordered sample below x(r) (G = r) or between
        // x(j) and x(n + 1 − j) (G = n − 2j + 1) with probability share_of_orderings(G, n, m).
        const std::vector<double> sorted = sorted_finite(values, 1, "a prediction limit");
        const std::size_t n = sorted.size();
        const double nd = static_cast<double>(n);
        t.test = "Distribution-free " + head + " (order statistics)";
        t.add("n", nd).add("readings", readings);
        if (side == Side::two_sided) {
            auto covers = [&](std::size_t j) {
                return 2 * j <= n && share_of_orderings(nd - 2.0 * j + 1, nd, readings) >= level;
            };
            if (!covers(1)) {
                const std::size_t needed = smallest_n(std::max<std::size_t>(n + 1, 2), largest_searched_n, [&](std::size_t m) {
                    return share_of_orderings(static_cast<double>(m) - 1, static_cast<double>(m), readings) >= level;
                });
                throw Refusal(needs_n(needed, "distribution-free two-sided prediction limits for " + next + " at " +
                                                  format_level(level) + " confidence",
                                      n));
            }
            std::size_t good = 1, fails = n / 2 + 1;
            while (fails - good > 1) {
                const std::size_t middle = good + (fails - good) / 2;
                (covers(middle) ? good : fails) = middle;
            }
            t.add("order statistic", static_cast<double>(good))
                .add("confidence", share_of_orderings(nd - 2.0 * good + 1, nd, readings));
            add_limits(r, side, sorted[good - 1], sorted[n - good]);
            r.details = {detail("", "order statistic", ", distribution-free", Form::outer)};
        } else {
            auto covers = [&](std::size_t rank) { return share_of_orderings(static_cast<double>(rank), nd, readings) >= level; };
            if (!covers(n)) {
                const std::size_t needed = smallest_n(n + 1, largest_searched_n, [&](std::size_t m) {
                    return share_of_orderings(static_cast<double>(m), static_cast<double>(m), readings) >= level;
                });
                throw Refusal(needs_n(needed, "a distribution-free " + side_words(side) + " prediction limit for " + next +
                                                  " at " + format_level(level) + " confidence",
                                      n));
            }
            std::size_t fails = 0, good = n;
            while (good - fails > 1) {
                const std::size_t middle = fails + (good - fails) / 2;
                (covers(middle) ? good : fails) = middle;
            }
            t.add("order statistic", static_cast<double>(side == Side::upper ? good : n + 1 - good))
                .add("confidence", share_of_orderings(static_cast<double>(good), nd, readings));
            add_limits(r, side, sorted[n - good], sorted[good - 1]);
            r.details = {detail("", "order statistic", ", distribution-free", Form::order)};
        }
    }
    r.title = capitalized(head);
    return r;
}

}  // namespace quadrat
