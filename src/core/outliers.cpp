#include "outliers.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include <boost/math/distributions/students_t.hpp>

#include "data.hpp"
#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"
#include "transform.hpp"

namespace quadrat {

namespace {

// Two-sided critical value of the largest studentized deviation among m values at α (Grubbs 1969,
// Technometrics 11, 1–21; the same λ Rosner 1983 uses at each step): with t the upper α/(2m) point of
// t(m − 2), λ = (m − 1)·t / √((m − 2 + t²)·m).
double studentized_deviation_critical(double m, double alpha) {
    const double t = quantile(complement(boost::math::students_t(m - 2), alpha / (2 * m)));
    return (m - 1) * t / std::sqrt((m - 2 + t * t) * m);
}

// The values sorted, with their positions, scaled by a power of two (exact) so that squares stay in
// range for 1e200-sized data.
struct SortedValues {
    std::vector<double> x;             // scaled, ascending
    std::vector<std::size_t> index;    // position of x[i] in the input
    double scale = 1;
};

SortedValues sorted_values(std::span<const double> values) {
    require_finite(values);
    const std::span<const double> views[] = {values};
    SortedValues s;
    s.scale = power_of_two_scale(views);
    s.index.resize(values.size());
    std::iota(s.index.begin(), s.index.end(), std::size_t{0});
    std::stable_sort(s.index.begin(), s.index.end(), [&](std::size_t a, std::size_t b) { return values[a] < values[b]; });
    s.x.reserve(values.size());
    for (std::size_t i : s.index) s.x.push_back(values[i] * s.scale);
    return s;
}

OutlierCheck generalized_esd(std::span<const double> values, double most_given, double alpha) {
    const std::size_t n = values.size();
    if (n < 25)
        throw Refusal("method generalized-esd needs at least 25 values (Rosner 1983), found " + std::to_string(n) +
                      "; method grubbs tests the one most extreme value from 3 values");
    std::size_t most = std::clamp<std::size_t>(n / 10, 1, 10);
    if (most_given > 0) {
        if (!(most_given == std::floor(most_given) && most_given <= static_cast<double>(n / 2)))
            throw Refusal("most must be a whole number from 1 to " + std::to_string(n / 2) +
                          " (half the values), found " + number_label(most_given));
        most = static_cast<std::size_t>(most_given);
    }
    const SortedValues s = sorted_values(values);
    OutlierCheck c;
    c.method = "generalized-esd";
    c.test = "Generalized ESD test (Rosner 1983)";
    c.n = n;
    c.most = most;
    c.alpha = alpha;
    // Rosner (1983), Technometrics 25, 165–172: at step i the value farthest from the mean of the
    // n − i + 1 values left gives R_i = max|x − x̄|/s; it is set aside for the next step. The number of
    // outliers is the largest i with R_i > λ_i. The farthest value is always the smallest or largest
    // left, so the steps walk in from both ends of the sorted values. Mean and sum of squares are
    // downdated as values leave (Welford's update run backwards) and recomputed from the values left
    // whenever the sum of squares has shrunk a thousandfold, where the downdate would lose digits.
    std::size_t lo = 0, hi = n - 1;
    long double m = 0, ss = 0, ss_at_refresh = 0;
    auto refresh = [&] {
        const std::span<const double> left(s.x.data() + lo, hi - lo + 1);
        m = mean(left);
        ss = sum_of_squares(left, static_cast<double>(m));
        ss_at_refresh = ss;
    };
    refresh();
    for (std::size_t step = 1; step <= most; ++step) {
        const double size = static_cast<double>(hi - lo + 1);
        const double sd = std::sqrt(static_cast<double>(ss) / (size - 1));
        if (!(sd > 0)) break;  // the values left are all equal: nothing further can stand out
        const bool take_high = std::fabs(s.x[hi] - static_cast<double>(m)) >= std::fabs(s.x[lo] - static_cast<double>(m));
        const std::size_t at = take_high ? hi : lo;
        Suspect suspect;
        suspect.index = s.index[at];
        suspect.value = values[suspect.index];
        suspect.statistic = std::fabs(s.x[at] - static_cast<double>(m)) / sd;
        suspect.critical = studentized_deviation_critical(size, alpha);
        c.suspects.push_back(suspect);
        const long double x = s.x[at];
        const long double m_after = (size * m - x) / (size - 1);
        ss -= (x - m) * (x - m_after);
        m = m_after;
        take_high ? --hi : ++lo;
        if (ss < ss_at_refresh / 1000 || ss <= 0) refresh();
    }
    if (c.suspects.empty()) throw Refusal("all values are equal (no spread); no value can stand out");
    for (std::size_t i = c.suspects.size(); i-- > 0;)
        if (c.suspects[i].statistic > c.suspects[i].critical) {
            c.count = i + 1;
            break;
        }
    for (std::size_t i = 0; i < c.count; ++i) c.suspects[i].outlier = true;
    return c;
}

OutlierCheck grubbs(std::span<const double> values, double alpha) {
    const std::size_t n = values.size();
    if (n < 3) throw Refusal("method grubbs needs at least 3 values, found " + std::to_string(n));
    const SortedValues s = sorted_values(values);
    const double m = mean(s.x);
    const double sd = std::sqrt(sum_of_squares(s.x, m) / static_cast<double>(n - 1));
    if (!(sd > 0)) throw Refusal("all values are equal (no spread); no value can stand out");
    // Grubbs (1969), Technometrics 11, 1–21: G = max|x − x̄|/s, two-sided.
    const bool take_high = std::fabs(s.x.back() - m) >= std::fabs(s.x.front() - m);
    const std::size_t at = take_high ? n - 1 : 0;
    Suspect suspect;
    suspect.index = s.index[at];
    suspect.value = values[suspect.index];
    suspect.statistic = std::fabs(s.x[at] - m) / sd;
    suspect.critical = studentized_deviation_critical(static_cast<double>(n), alpha);
    suspect.outlier = suspect.statistic > suspect.critical;
    OutlierCheck c;
    c.method = "grubbs";
    c.test = "Grubbs' test (two-sided)";
    c.n = n;
    c.alpha = alpha;
    c.suspects.push_back(suspect);
    c.count = suspect.outlier ? 1 : 0;
    return c;
}

OutlierCheck fences(std::span<const double> values) {
    const std::size_t n = values.size();
    if (n < 4) throw Refusal("method fences needs at least 4 values, found " + std::to_string(n));
    const SortedValues s = sorted_values(values);
    // Tukey (1977), Exploratory Data Analysis: beyond 1.5 × IQR outside the quartiles. Quartiles as
    // Calc's QUARTILE.INC (linear interpolation between order statistics).
    const double q1 = quantile_of_sorted(s.x, 0.25), q3 = quantile_of_sorted(s.x, 0.75);
    const double iqr = q3 - q1;
    if (!(iqr > 0))
        throw Refusal("the middle half of the values are all equal (IQR = 0): fences at the quartiles would flag every other "
                      "value; use method generalized-esd or grubbs");
    const double low_fence = (q1 - 1.5 * iqr) / s.scale, high_fence = (q3 + 1.5 * iqr) / s.scale;
    if (!std::isfinite(low_fence) || !std::isfinite(high_fence))
        throw Refusal("the fences lie beyond the range of numbers a cell holds; rescale the values (other units)");
    OutlierCheck c;
    c.method = "fences";
    c.test = "Tukey's fences (1.5 × IQR)";
    c.n = n;
    c.low_fence = low_fence;
    c.high_fence = high_fence;
    for (std::size_t i = 0; i < n; ++i) {
        const double x = values[i] * s.scale;
        const double beyond = x > q3 ? (x - q3) / iqr : x < q1 ? (q1 - x) / iqr : 0;
        if (beyond > 1.5) c.suspects.push_back({i, values[i], beyond, 1.5, true});
    }
    c.count = c.suspects.size();
    return c;
}

}  // namespace

OutlierCheck check_outliers(std::span<const double> values, const std::string& method_given, double most, double level_given) {
    const std::string method = outlier_methods().pick(method_given, "method");
    const double level = parse_level(level_given, false);
    if (most > 0 && method != "generalized-esd") throw Refusal("most applies to method generalized-esd only; leave it empty");
    if (most < 0 || std::isnan(most)) throw Refusal("most must be a whole number of values from 1, found " + number_label(most));
    if (method == "generalized-esd") return generalized_esd(values, most, 1 - level);
    if (method == "grubbs") return grubbs(values, 1 - level);
    return fences(values);
}

const KeywordTable& outlier_outputs() {
    static const KeywordTable t{"outlier outputs",
                                {{"flags", "outlier beside each value that stands out"},
                                 {"count", "how many stand out"},
                                 {"table", "each suspected value with its test"},
                                 {"report", "one sentence"}}};
    return t;
}

const KeywordTable& outlier_methods() {
    static const KeywordTable t{"outlier methods",
                                {{"generalized-esd", "Rosner's generalized ESD, n ≥ 25"},
                                 {"grubbs", "Grubbs' test of the most extreme value"},
                                 {"fences", "beyond 1.5 × IQR outside the quartiles"}}};
    return t;
}

Table outlier_flags(const OutlierCheck& check, std::span<const std::size_t> row_of, std::size_t rows) {
    Table t(rows, std::vector<CellValue>(1));
    for (const Suspect& s : check.suspects)
        if (s.outlier && s.index < row_of.size() && row_of[s.index] < rows) t[row_of[s.index]][0] = std::string("outlier");
    return t;
}

Table outlier_table(const OutlierCheck& check, const std::vector<std::string>& cell_of) {
    Table t;
    t.push_back({std::string("cell"), std::string("statistic"), std::string("critical value"), std::string("verdict")});
    for (const Suspect& s : check.suspects)
        t.push_back({s.index < cell_of.size() ? CellValue{cell_of[s.index]} : CellValue{}, s.statistic, s.critical,
                     std::string(s.outlier ? "outlier" : "not flagged")});
    t.push_back({std::string("note"), render_outlier_note(check), CellValue{}, CellValue{}});
    return t;
}

}  // namespace quadrat
