#include "censored.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include <Eigen/Dense>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include "data.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

const KeywordTable& censored_summary_methods() {
    static const KeywordTable t{"censored summary methods",
                                {{"kaplan-meier", "Kaplan–Meier on flipped values"},
                                 {"ros", "robust regression on order statistics, lognormal"}}};
    return t;
}

const KeywordTable& censored_test_methods() {
    static const KeywordTable t{"censored test methods",
                                {{"peto-prentice", "generalized Wilcoxon score test (Peto–Prentice)"},
                                 {"gehan", "Gehan's generalized Wilcoxon test"}}};
    return t;
}

const KeywordTable& censored_test_outputs() {
    static const KeywordTable t{"censored test outputs",
                                {{"p", "the p-value"},
                                 {"statistic", "χ² on k − 1 df"},
                                 {"df", "degrees of freedom, k − 1"},
                                 {"n", "observations used"},
                                 {"table", "the whole result as an array, with per-group medians"},
                                 {"report", "one sentence"}}};
    return t;
}

CensoredGroups censored_groups(const Groups& groups) {
    CensoredGroups out;
    out.names = groups.names;
    out.n_dropped = groups.n_dropped;
    out.values.resize(groups.values.size());
    for (std::size_t g = 0; g < groups.values.size(); ++g) {
        const auto& flags = groups.censored.size() > g ? groups.censored[g] : std::vector<bool>{};
        out.values[g].reserve(groups.values[g].size());
        for (std::size_t i = 0; i < groups.values[g].size(); ++i)
            out.values[g].push_back({groups.values[g][i], i < flags.size() && flags[i]});
    }
    return out;
}

std::size_t CensoredGroups::n_used() const {
    std::size_t n = 0;
    for (const auto& g : values) n += g.size();
    return n;
}

namespace {

// Two Kaplan–Meier probabilities that differ by less than this are equal: the products of
// (1 − m/b) carry rounding of a few ulps, and a flat stretch of the curve at exactly p (a complete
// sample of even size at its median) must be recognised as one.
constexpr double probability_tie = 1e-12;

std::size_t censored_count(std::span<const CensoredValue> values) {
    return static_cast<std::size_t>(
        std::count_if(values.begin(), values.end(), [](const CensoredValue& v) { return v.censored; }));
}

// Lowest and highest detection limit of a group (only meaningful when it has censored values).
std::pair<double, double> limit_range(std::span<const CensoredValue> values) {
    double low = HUGE_VAL, high = -HUGE_VAL;
    for (const auto& v : values)
        if (v.censored) {
            low = std::min(low, v.value);
            high = std::max(high, v.value);
        }
    return {low, high};
}

double largest_detect(std::span<const CensoredValue> values) {
    double high = -HUGE_VAL;
    for (const auto& v : values)
        if (!v.censored) high = std::max(high, v.value);
    return high;
}

// Every number of the groups, detects and limits alike, must sum and square without overflow.
void refuse_beyond_scale(const CensoredGroups& groups) {
    std::vector<double> all;
    all.reserve(groups.n_used());
    for (const auto& g : groups.values)
        for (const auto& v : g) {
            // The cell reader never gives NaN; a caller that did would break every sort below.
            if (std::isnan(v.value)) throw Refusal("values holds a number that is not a number (NaN)");
            all.push_back(v.value);
        }
    refuse_beyond_model_scale(all, "values");
}

// "<0.5": a limit as the cell shows it.
std::string limit_text(double limit) { return "<" + number_label(limit); }

}  // namespace

// Kaplan & Meier (1958), JASA 53, 457–481, on the flipped values: the sweep runs from the largest
// value down, which is the flipped time order. At a detected value v the observations at risk are
// those at or below v, a limit equal to v included (a censored value at the limit is below a
// detect there); P̂(X < v) is the product of (1 − m/b) over the detected values from the top to v.
KaplanMeierCurve kaplan_meier_left(std::span<const CensoredValue> values) {
    if (values.empty()) throw Refusal("no values to estimate from");
    if (censored_count(values) == values.size())
        throw Refusal("every value is below a detection limit; at least one detected value is needed");

    std::vector<CensoredValue> sorted(values.begin(), values.end());
    // Descending; at equal numbers the detect first (it is the higher of the two).
    std::sort(sorted.begin(), sorted.end(), [](const CensoredValue& a, const CensoredValue& b) {
        if (a.value != b.value) return a.value > b.value;
        return !a.censored && b.censored;
    });

    KaplanMeierCurve curve;
    const double n = static_cast<double>(sorted.size());
    double processed = 0;  // observations strictly above the current value
    double below = 1.0;
    std::size_t i = 0;
    while (i < sorted.size()) {
        const double v = sorted[i].value;
        double detects = 0, limits = 0;
        for (; i < sorted.size() && sorted[i].value == v; ++i) (sorted[i].censored ? limits : detects) += 1;
        if (detects > 0) {
            const double at_risk = n - processed;
            below *= 1.0 - detects / at_risk;
            curve.detected_values.push_back(v);
            curve.at_risk.push_back(at_risk);
            curve.detections.push_back(detects);
            curve.below.push_back(below);
        }
        processed += detects + limits;
        curve.lowest = v;
        curve.lowest_censored = limits > 0;
    }

    // The mean is the area under the flipped survival curve taken back to the data's scale:
    // mean = v₁ − Σ_j P̂(X < v_j)·(v_j − v_{j+1}), v_{J+1} = the lowest observation, where the
    // restriction falls when that one is censored (the mass below the smallest detect is put at
    // the lowest limit, so the mean is then biased upward). area_below[j] = Σ_{i ≥ j} is what
    // the variance needs: Var = Σ_j area_j² m_j / (b_j (b_j − m_j)) (Kaplan & Meier 1958; Klein &
    // Moeschberger 2003, Survival Analysis, 2nd ed., eq. 4.5.2). A step with b_j = m_j leaves no
    // mass below it, so its area is zero and it adds nothing.
    const std::size_t steps = curve.detected_values.size();
    std::vector<double> area_below(steps);
    Accumulator area;
    for (std::size_t j = steps; j-- > 0;) {
        const double next = j + 1 < steps ? curve.detected_values[j + 1] : curve.lowest;
        area.add(curve.below[j] * (curve.detected_values[j] - next));
        area_below[j] = area.sum();
    }
    curve.mean = curve.detected_values.front() - area_below.front();
    Accumulator variance;
    for (std::size_t j = 0; j < steps; ++j) {
        const double b = curve.at_risk[j], m = curve.detections[j];
        if (b > m) variance.add(area_below[j] * area_below[j] * m / (b * (b - m)));
    }
    curve.mean_se = std::sqrt(variance.sum());
    return curve;
}

std::optional<double> kaplan_meier_quantile(const KaplanMeierCurve& curve, double p) {
    // P̂(X ≤ x) = below[j] for detected_values[j+1] ≤ x < detected_values[j]; the first step
    // (largest value) with below[j] < p is where P̂(X ≤ x) first reaches p going up.
    const auto& below = curve.below;
    for (std::size_t j = 0; j < below.size(); ++j) {
        if (below[j] >= p + probability_tie) continue;
        if (below[j] > p - probability_tie) {
            // Flat at exactly p from the next detect up to this one: the midpoint.
            if (j + 1 < below.size()) return (curve.detected_values[j] + curve.detected_values[j + 1]) / 2;
            return std::nullopt;
        }
        return curve.detected_values[j];
    }
    return std::nullopt;  // below the smallest detect: undetermined
}

// Helsel & Cohn (1988), with the plotting positions of Hirsch & Stedinger (1987) for several
// limits DL_1 < … < DL_m: A_j detects in [DL_j, DL_{j+1}), B_j observations below DL_j (a
// non-detect at DL_j among them), pe_j = pe_{j+1} + A_j/(A_j + B_j)·(1 − pe_{j+1}) from
// pe_{m+1} = 0 down, pe_0 = 1. Detects in [DL_j, DL_{j+1}) ranked r = 1…A_j:
// pp = (1 − pe_j) + (pe_j − pe_{j+1})·r/(A_j + 1); non-detects at DL_j, r = 1…C_j:
// pp = (1 − pe_j)·r/(C_j + 1). A detect equal to DL_j is in [DL_j, …): above the non-detects there.
RosFit robust_ros(std::span<const CensoredValue> values) {
    std::vector<double> detects, limits;
    for (const auto& v : values) {
        if (!(v.value > 0))
            throw Refusal("ROS fits a lognormal distribution and needs values and limits above zero (found " +
                          number_label(v.value) + "); use method 'kaplan-meier'");
        (v.censored ? limits : detects).push_back(v.value);
    }
    std::sort(detects.begin(), detects.end());
    if (detects.size() < 2 || detects.front() == detects.back())
        throw Refusal("ROS fits a line through the detected values and needs at least two different ones; use "
                      "method 'kaplan-meier'");
    std::vector<double> sorted_limits = limits;
    std::sort(sorted_limits.begin(), sorted_limits.end());
    std::vector<double> dl = sorted_limits;
    dl.erase(std::unique(dl.begin(), dl.end()), dl.end());
    const std::size_t m = dl.size();

    // Threshold j = 0 is −∞; j = 1…m the limits; pe has m + 2 entries, pe[m+1] = 0.
    auto detects_below = [&](double x) {
        return static_cast<double>(std::lower_bound(detects.begin(), detects.end(), x) - detects.begin());
    };
    auto limits_at_or_below = [&](double x) {
        return static_cast<double>(std::upper_bound(sorted_limits.begin(), sorted_limits.end(), x) -
                                   sorted_limits.begin());
    };
    std::vector<double> pe(m + 2, 0.0);
    std::vector<double> a(m + 1, 0.0);
    for (std::size_t j = 0; j <= m; ++j) {
        const double low = j == 0 ? 0.0 : detects_below(dl[j - 1]);
        const double high = j == m ? static_cast<double>(detects.size()) : detects_below(dl[j]);
        a[j] = high - low;
    }
    pe[0] = 1.0;
    for (std::size_t j = m; j >= 1; --j) {
        const double b = detects_below(dl[j - 1]) + limits_at_or_below(dl[j - 1]);
        pe[j] = pe[j + 1] + a[j] / (a[j] + b) * (1.0 - pe[j + 1]);
    }

    // Positions by rank within each interval (detects) or limit (non-detects), in sorted order;
    // observations tied in value take consecutive ranks in input order.
    const std::size_t n = values.size();
    std::vector<std::size_t> order(n);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t x, std::size_t y) { return values[x].value < values[y].value; });
    RosFit fit;
    fit.plotting_positions.assign(n, 0.0);
    fit.filled.assign(n, 0.0);
    std::vector<double> rank_in_interval(m + 1, 0.0), rank_at_limit(m, 0.0);
    for (std::size_t idx : order) {
        const CensoredValue& v = values[idx];
        if (v.censored) {
            const std::size_t j = static_cast<std::size_t>(std::lower_bound(dl.begin(), dl.end(), v.value) - dl.begin());
            const double c = limits_at_or_below(dl[j]) - (j == 0 ? 0.0 : limits_at_or_below(dl[j - 1]));
            fit.plotting_positions[idx] = (1.0 - pe[j + 1]) * ++rank_at_limit[j] / (c + 1.0);
        } else {
            const std::size_t j = static_cast<std::size_t>(std::upper_bound(dl.begin(), dl.end(), v.value) - dl.begin());
            fit.plotting_positions[idx] = (1.0 - pe[j]) + (pe[j] - pe[j + 1]) * ++rank_in_interval[j] / (a[j] + 1.0);
        }
    }

    // Least squares of ln(detect) on its normal score, centred sums.
    const boost::math::normal standard;
    std::vector<double> z, y;
    for (std::size_t i = 0; i < n; ++i)
        if (!values[i].censored) {
            z.push_back(boost::math::quantile(standard, fit.plotting_positions[i]));
            y.push_back(std::log(values[i].value));
        }
    const double z_mean = mean(z), y_mean = mean(y);
    Accumulator sxy, sxx;
    for (std::size_t i = 0; i < z.size(); ++i) {
        sxy.add((z[i] - z_mean) * (y[i] - y_mean));
        sxx.add((z[i] - z_mean) * (z[i] - z_mean));
    }
    fit.slope = sxy.sum() / sxx.sum();
    fit.intercept = y_mean - fit.slope * z_mean;
    for (std::size_t i = 0; i < n; ++i) {
        if (!values[i].censored) {
            fit.filled[i] = values[i].value;
            continue;
        }
        fit.filled[i] = std::exp(fit.intercept + fit.slope * boost::math::quantile(standard, fit.plotting_positions[i]));
        if (!std::isfinite(fit.filled[i]) || fit.filled[i] == 0)
            throw Refusal("the ROS line reaches beyond the range of numbers at a censored value; use method 'kaplan-meier'");
    }
    return fit;
}

namespace {

CellValue number_or_blank(std::optional<double> x) {
    if (x && std::isfinite(*x)) return *x;
    return std::monostate{};
}

// The columns every method fills the same way, and the checks before any estimate.
struct GroupSummary {
    std::size_t n = 0, censored = 0;
    double lowest_limit = 0, highest_limit = 0, maximum = 0;
    bool maximum_known = true;
    bool mean_shown = true;  // at most half censored
};

GroupSummary summarise(std::span<const CensoredValue> values) {
    GroupSummary s;
    s.n = values.size();
    s.censored = censored_count(values);
    s.maximum = largest_detect(values);
    if (s.censored > 0) {
        std::tie(s.lowest_limit, s.highest_limit) = limit_range(values);
        // A limit above every detect: the true largest value may lie anywhere below that limit.
        s.maximum_known = !(s.highest_limit > s.maximum);
    }
    s.mean_shown = 2 * s.censored <= s.n;
    return s;
}

// A percentile below the lowest limit is blank (the catalogue's rule): the values there are known
// only through the non-detects' share, not their positions.
std::optional<double> percentile_shown(const GroupSummary& s, std::optional<double> q) {
    if (!q) return std::nullopt;
    if (s.censored > 0 && *q < s.lowest_limit) return std::nullopt;
    return q;
}

struct Estimates {
    std::optional<double> mean, se, low, high, q1, median, q3;
    std::string method;
};

Estimates kaplan_meier_estimates(std::span<const CensoredValue> values, const GroupSummary& s, double level) {
    const KaplanMeierCurve curve = kaplan_meier_left(values);
    Estimates e;
    e.method = "Kaplan–Meier";
    if (s.mean_shown) {
        e.mean = curve.mean;
        if (s.n >= 2) {
            // Normal quantile: the KM mean's interval is asymptotic (Klein & Moeschberger 2003, §4.5).
            const double z = boost::math::quantile(boost::math::normal(), 0.5 + level / 2);
            e.se = curve.mean_se;
            e.low = curve.mean - z * curve.mean_se;
            e.high = curve.mean + z * curve.mean_se;
        }
        if (curve.lowest_censored)
            e.method += "; mean restricted at the lowest value " + limit_text(curve.lowest) + " (biased upward)";
    }
    e.q1 = kaplan_meier_quantile(curve, 0.25);
    e.median = kaplan_meier_quantile(curve, 0.5);
    e.q3 = kaplan_meier_quantile(curve, 0.75);
    return e;
}

Estimates ros_estimates(std::span<const CensoredValue> values, const GroupSummary& s, double level, const std::string& name) {
    Estimates e;
    std::vector<double> filled;
    if (s.censored == 0) {
        e.method = "ROS, lognormal (no censored values: ordinary summaries)";
        for (const auto& v : values) filled.push_back(v.value);
    } else {
        e.method = "ROS, lognormal";
        try {
            filled = robust_ros(values).filled;
        } catch (const Refusal& r) {
            throw Refusal(name + ": " + r.what());
        }
    }
    const double n = static_cast<double>(filled.size());
    if (s.mean_shown) {
        e.mean = mean(filled);
        if (filled.size() >= 2) {
            // The ordinary SE of the filled-in sample with Student's t (n − 1 df), as DESCRIBE.GROUPS
            // gives it; it does not count the uncertainty of the imputed values (Helsel 2012, §6.3).
            const double se = standard_deviation(filled) / std::sqrt(n);
            const double t = boost::math::quantile(boost::math::students_t(n - 1), 0.5 + level / 2);
            e.se = se;
            e.low = *e.mean - t * se;
            e.high = *e.mean + t * se;
        }
    }
    std::sort(filled.begin(), filled.end());
    e.q1 = quantile_of_sorted(filled, 0.25);
    e.median = quantile_of_sorted(filled, 0.5);
    e.q3 = quantile_of_sorted(filled, 0.75);
    return e;
}

std::string share_text(std::size_t part, std::size_t whole) {
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.0f%%", 100.0 * static_cast<double>(part) / static_cast<double>(whole));
    return buffer;
}

void require_some_values(const CensoredGroups& groups) {
    if (groups.n_used() == 0) throw Refusal("values holds no numbers and no values below a detection limit (<0.5)");
}

}  // namespace

Table describe_censored(const CensoredGroups& groups, const std::string& method_given, double level) {
    const std::string method = censored_summary_methods().pick(method_given, "method");
    require_some_values(groups);
    if (!(level > 0 && level < 1)) throw Refusal("level must be a fraction such as 0.95 or a percentage from 50 to 99.9");
    refuse_beyond_scale(groups);
    // More than 80% censored: no method estimates the summaries (Helsel 2012, §8.1 table of methods).
    for (std::size_t g = 0; g < groups.names.size(); ++g) {
        const auto& v = groups.values[g];
        const std::size_t c = censored_count(v);
        if (!v.empty() && 5 * c > 4 * v.size())
            throw Refusal(groups.names[g] + " has " + std::to_string(c) + " of " + count_of(v.size(), "value") +
                          " below a detection limit (" + share_text(c, v.size()) +
                          "); above 80% no method estimates a mean or quartiles: report how many were detected, "
                          "or describe the other groups without it");
    }

    Table table;
    table.push_back({std::string("group"), std::string("n"), std::string("censored"), std::string("censored %"),
                     std::string("lowest limit"), std::string("highest limit"), std::string("mean"), std::string("SE"),
                     std::string("ci-low"), std::string("ci-high"), std::string("q1"), std::string("median"),
                     std::string("q3"), std::string("maximum"), std::string("method")});
    for (std::size_t g = 0; g < groups.names.size(); ++g) {
        const auto& values = groups.values[g];
        std::vector<CellValue> row{groups.names[g], static_cast<double>(values.size())};
        if (values.empty()) {
            // A wide-format column with no values keeps its row, as in DESCRIBE.GROUPS.
            row.resize(15, std::monostate{});
            table.push_back(std::move(row));
            continue;
        }
        const GroupSummary s = summarise(values);
        Estimates e = method == "ros" ? ros_estimates(values, s, level, groups.names[g])
                                      : kaplan_meier_estimates(values, s, level);
        if (!s.maximum_known) e.method += "; maximum unknown: the limit " + limit_text(s.highest_limit) + " is above every detected value";
        row.push_back(static_cast<double>(s.censored));
        row.push_back(100.0 * static_cast<double>(s.censored) / static_cast<double>(s.n));
        row.push_back(s.censored > 0 ? CellValue{s.lowest_limit} : CellValue{});
        row.push_back(s.censored > 0 ? CellValue{s.highest_limit} : CellValue{});
        for (const auto& x : {e.mean, e.se, e.low, e.high}) row.push_back(number_or_blank(x));
        for (const auto& q : {e.q1, e.median, e.q3}) row.push_back(number_or_blank(percentile_shown(s, q)));
        row.push_back(s.maximum_known ? CellValue{s.maximum} : CellValue{});
        row.push_back(e.method);
        table.push_back(std::move(row));
    }
    return table;
}

namespace {

// What a blank median is known to lie below, for the sentence: with no detect, the highest limit;
// a median below the lowest limit, that limit; a median in the mass the Kaplan–Meier curve leaves
// below the smallest detect, the highest limit at or below that detect (every value carrying that
// mass is below its own limit, and those limits are at most that one).
double median_bound(std::span<const CensoredValue> values, const GroupSummary& s, bool determined) {
    if (s.censored == s.n) return s.highest_limit;
    if (determined) return s.lowest_limit;
    double smallest = HUGE_VAL, bound = -HUGE_VAL;
    for (const auto& v : values)
        if (!v.censored) smallest = std::min(smallest, v.value);
    for (const auto& v : values)
        if (v.censored && v.value <= smallest) bound = std::max(bound, v.value);
    return bound;
}

}  // namespace

// The generalized Wilcoxon tests as weighted log-rank (score) tests on the flipped values, for k
// groups: at each detected value v (largest first) with b observations at risk (at or below v),
// m detects, and b_g, m_g in group g, U_g = Σ w (m_g − b_g·m/b) and
// V_gh = Σ w² · m(b − m)/(b − 1) · (b_g/b)(δ_gh − b_h/b); χ² = U'V⁻¹U over the first k − 1 groups
// on k − 1 df. Weights: `gehan`, w = b (Gehan 1965, Biometrika 52, 203–223, for k groups Breslow
// 1970, Biometrika 57, 579–594); `peto-prentice`, w = Ŝ(v−), the pooled Kaplan–Meier estimate just
// before v in flipped order (Peto & Peto 1972, JRSS A 135, 185–207; Prentice 1978, Biometrika 65,
// 167–179; in this weighted form the G^ρ test with ρ = 1 of Harrington & Fleming 1982, Biometrika
// 69, 553–566). O(n log n + n·k + k³).
TestResult compare_censored(const CensoredGroups& groups, const std::string& method_given) {
    const std::string method = censored_test_methods().pick(method_given, "method");
    require_some_values(groups);
    const std::size_t k = groups.names.size();
    if (k < 2)
        throw Refusal("groups has " + count_of(k, "label") + "; COMPARE.CENSORED compares two or more groups");
    // The score test's variance is a (k − 1)² matrix built over every observation: beyond 100 groups
    // it would take seconds in a cell, and a χ² over so many groups says little anyway.
    if (k > 100) throw Refusal("groups has " + count_of(k, "label") + "; COMPARE.CENSORED compares up to 100 groups");
    for (std::size_t g = 0; g < k; ++g)
        if (groups.values[g].empty()) throw Refusal(groups.names[g] + " has no values to compare");
    refuse_beyond_scale(groups);

    struct Observation {
        double value;
        bool censored;
        std::size_t group;
    };
    std::vector<Observation> all;
    all.reserve(groups.n_used());
    std::size_t total_censored = 0;
    for (std::size_t g = 0; g < k; ++g)
        for (const auto& v : groups.values[g]) {
            all.push_back({v.value, v.censored, g});
            total_censored += v.censored;
        }
    if (total_censored == all.size())
        throw Refusal("every value is below a detection limit; the groups can only be compared on detected values");
    std::sort(all.begin(), all.end(), [](const Observation& a, const Observation& b) { return a.value > b.value; });

    // A group whose values are all limits above every detect is never at risk at a detected value.
    double top_detect = -HUGE_VAL;
    for (const auto& o : all)
        if (!o.censored) top_detect = std::max(top_detect, o.value);
    for (std::size_t g = 0; g < k; ++g) {
        const auto& v = groups.values[g];
        const auto lowest = std::min_element(v.begin(), v.end(), [](const CensoredValue& x, const CensoredValue& y) { return x.value < y.value; });
        if (lowest->value > top_detect)
            throw Refusal(groups.names[g] + " holds only values below limits above every detected value (" +
                          limit_text(lowest->value) + " and up): they cannot be ranked against any detect; leave " +
                          groups.names[g] + " out or ask the lab for lower limits");
    }

    // The sums run lazily so that the sweep costs O(n·k), not O(T·k²): b_g changes only when one
    // of g's observations leaves, so Σ_j w·m·b_g/b, Σ_j c_j·b_g/b and Σ_j c_j·b_g·b_h/b²
    // (c_j = w² m(b − m)/(b − 1)) are taken as b_g (or b_g·b_h) times a stretch of the running
    // sums Σ w·m/b, Σ c/b and Σ c/b², settled whenever b_g is about to change.
    const bool gehan = method == "gehan";
    const std::size_t d = k - 1;
    std::vector<double> at_risk(k, 0.0);
    for (const auto& o : all) at_risk[o.group] += 1;
    double total_at_risk = static_cast<double>(all.size());
    double survival_before = 1.0;  // pooled Kaplan–Meier just before the current value (flipped order)
    Accumulator expected_sum, diagonal_sum, product_sum;  // Σ w·m/b, Σ c/b, Σ c/b²
    std::vector<Accumulator> observed(k), expected(k), diagonal(k);
    std::vector<double> expected_mark(k, 0.0), diagonal_mark(k, 0.0);
    std::vector<double> product_mark(k * k, 0.0);
    Eigen::MatrixXd products = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(k));
    auto settle = [&](std::size_t g) {
        const double now_expected = expected_sum.sum(), now_diagonal = diagonal_sum.sum(), now_product = product_sum.sum();
        expected[g].add(at_risk[g] * (now_expected - expected_mark[g]));
        diagonal[g].add(at_risk[g] * (now_diagonal - diagonal_mark[g]));
        expected_mark[g] = now_expected;
        diagonal_mark[g] = now_diagonal;
        for (std::size_t h = 0; h < k; ++h) {
            const std::size_t lo = std::min(g, h), hi = std::max(g, h);
            double& mark = product_mark[lo * k + hi];
            products(static_cast<Eigen::Index>(lo), static_cast<Eigen::Index>(hi)) += at_risk[g] * at_risk[h] * (now_product - mark);
            mark = now_product;
        }
    };

    std::size_t i = 0;
    while (i < all.size()) {
        const double v = all[i].value;
        const std::size_t start = i;
        double m = 0;
        for (; i < all.size() && all[i].value == v; ++i) m += all[i].censored ? 0 : 1;
        const double b = total_at_risk;
        if (m > 0 && b > 1) {
            const double w = gehan ? b : survival_before;
            const double c = w * w * m * (b - m) / (b - 1);
            expected_sum.add(w * m / b);
            diagonal_sum.add(c / b);
            product_sum.add(c / b / b);
            for (std::size_t j = start; j < i; ++j)
                if (!all[j].censored) observed[all[j].group].add(w);
        }
        if (m > 0) survival_before *= 1.0 - m / b;
        for (std::size_t j = start; j < i; ++j) {
            settle(all[j].group);
            at_risk[all[j].group] -= 1;
        }
        total_at_risk -= static_cast<double>(i - start);
    }

    // U_g = Σ w·m_g − Σ w·b_g·m/b; V_gh = δ_gh Σ c·b_g/b − Σ c·b_g·b_h/b², over the first k − 1 groups.
    Eigen::MatrixXd variance(static_cast<Eigen::Index>(d), static_cast<Eigen::Index>(d));
    Eigen::VectorXd u(static_cast<Eigen::Index>(d));
    for (std::size_t g = 0; g < d; ++g) {
        const auto row = static_cast<Eigen::Index>(g);
        u(row) = observed[g].sum() - expected[g].sum();
        for (std::size_t h = 0; h < d; ++h) {
            const auto column = static_cast<Eigen::Index>(h);
            const double product = products(std::min(row, column), std::max(row, column));
            variance(row, column) = (g == h ? diagonal[g].sum() : 0.0) - product;
        }
    }

    // χ² = U'V⁻¹U through the eigen-decomposition of the symmetric V; a direction with no variance
    // is a refusal rather than a huge statistic.
    const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eigen(variance);
    const Eigen::VectorXd lambda = eigen.eigenvalues();
    if (!(lambda.minCoeff() > 1e-12 * lambda.maxCoeff()) || !(lambda.maxCoeff() > 0))
        throw Refusal("the groups cannot be told apart at any detected value (the test's variance is zero); more "
                      "detected values are needed");
    const Eigen::VectorXd projected = eigen.eigenvectors().transpose() * u;
    double statistic = 0;
    for (Eigen::Index j = 0; j < projected.size(); ++j) statistic += projected(j) * projected(j) / lambda(j);
    const double df = static_cast<double>(d);

    TestResult r;
    r.test = gehan ? "Gehan's generalized Wilcoxon test" : "Peto–Prentice generalized Wilcoxon test";
    r.add("statistic", statistic)
        .add("df", df)
        .add("p", boost::math::cdf(boost::math::complement(boost::math::chi_squared(df), statistic)))
        .add("n", static_cast<double>(groups.n_used()))
        .add("n dropped", static_cast<double>(groups.n_dropped));
    for (std::size_t g = 0; g < k; ++g) {
        const auto& values = groups.values[g];
        const GroupSummary s = summarise(values);
        r.add(groups.names[g] + ": n", static_cast<double>(s.n));
        r.add(groups.names[g] + ": censored", static_cast<double>(s.censored));
        std::optional<double> estimate;
        if (s.censored < s.n) estimate = kaplan_meier_quantile(kaplan_meier_left(values), 0.5);
        if (const std::optional<double> median = percentile_shown(s, estimate)) {
            r.add(groups.names[g] + ": median", *median);
        } else {
            // Undetermined or below the lowest limit: blank in the table, "<bound" in the sentence.
            r.quantities.push_back({groups.names[g] + ": median", std::monostate{}});
            r.unlisted.push_back({groups.names[g] + ": median bound", limit_text(median_bound(values, s, estimate.has_value()))});
        }
    }
    r.words.shown = true;
    r.words.statistic_symbol = "χ²";
    r.words.statistic_df = true;
    r.words.per_group = "Kaplan–Meier medians";
    r.words.per_group_quantity = "median";
    r.words.closing = count_of(k, "group") + "; " + std::to_string(total_censored) + " of " +
                      std::to_string(groups.n_used()) + " values below a detection limit";
    return r;
}

}  // namespace quadrat
