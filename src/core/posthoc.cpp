#include "posthoc.hpp"

#include <algorithm>
#include <cmath>
#include <span>

#include <boost/math/distributions/normal.hpp>

#include "exact_scaling.hpp"
#include "keywords.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "studentized_range.hpp"
#include "summary.hpp"
#include "two_groups.hpp"

namespace quadrat {

// PosthocMethod keeps the order of the keyword table posthoc_methods().
PosthocMethod parse_posthoc_method(const std::string& keyword) {
    return static_cast<PosthocMethod>(posthoc_methods().index(keyword, "method"));
}

bool is_rank_method(PosthocMethod method) { return method == PosthocMethod::dunn || method == PosthocMethod::pairwise_ranks; }

bool is_family_adjusted(PosthocMethod method) {
    return method == PosthocMethod::tukey || method == PosthocMethod::games_howell;
}

Table PosthocResult::table() const {
    Table t;
    t.reserve(pairs.size() + 1);
    t.push_back({std::string("first group"), std::string("second group"), std::string("estimate"), std::string("ci-low"),
                 std::string("ci-high"), std::string("statistic"), std::string("p"), std::string("adjusted p"),
                 std::string("significant")});
    for (const auto& c : pairs)
        t.push_back({groups[c.first], groups[c.second], c.estimate, c.ci_low, c.ci_high, c.statistic, c.p, c.adjusted_p,
                     std::string(c.significant ? "yes" : "no")});
    return t;
}

namespace {

using GroupValues = std::vector<std::vector<double>>;

// Every pair (i, j), i < j, in the catalogue's order (1,2), (1,3), …, (2,3), …
std::vector<PairComparison> all_pairs(std::size_t k) {
    std::vector<PairComparison> pairs;
    pairs.reserve(k * (k - 1) / 2);
    for (std::size_t i = 0; i < k; ++i)
        for (std::size_t j = i + 1; j < k; ++j) {
            PairComparison c;
            c.first = i;
            c.second = j;
            pairs.push_back(c);
        }
    return pairs;
}

// Sums of squares are taken on values multiplied by a power of two that brings the largest near 1
// (exact), so that 1e200 or 1e-200 measurements neither overflow nor underflow; q is unchanged.
double common_scale(const GroupValues& x) {
    std::vector<std::span<const double>> spans(x.begin(), x.end());
    return power_of_two_scale(spans);
}

// A difference of transformed means (or its limit) back on the data's scale: a ratio for the logs.
double difference_on_data_scale(Transform t, double d) { return is_ratio_scale(t) ? back_transform(t, d) : d; }

// Tukey–Kramer: q = |x̄ᵢ − x̄ⱼ| / √(MSE/2 · (1/nᵢ + 1/nⱼ)) referred to the studentized range with k
// groups and N − k df; simultaneous limits x̄ᵢ − x̄ⱼ ± q₁₋α · √(MSE/2 · (1/nᵢ + 1/nⱼ)).
// Tukey (1953), The problem of multiple comparisons; Kramer (1956), Biometrics 12, 307–310.
void tukey_kramer(const GroupValues& raw, Transform t, double level, std::vector<PairComparison>& pairs) {
    const std::size_t k = raw.size();
    const double scale = common_scale(raw);
    const GroupValues x = scaled(raw, scale);
    std::size_t total = 0;
    std::vector<double> means(k);
    double within = 0.0;  // Σ over groups of Σ(x − x̄)², each centred on its own mean
    for (std::size_t i = 0; i < k; ++i) {
        total += x[i].size();
        means[i] = mean(x[i]);
        within += sum_of_squares(x[i], means[i]);
    }
    if (total <= k)
        throw Refusal("tukey needs more values than groups to estimate the spread within groups; found " +
                      std::to_string(total) + " values in " + std::to_string(k) + " groups");
    const double df = static_cast<double>(total - k);
    const double mse = within / df;
    if (!(mse > 0.0) || !std::isfinite(mse))
        throw Refusal("the values do not vary within any group; tukey needs spread within groups (try dunn)");
    const double critical = studentized_range_quantile(level, static_cast<int>(k), df);
    for (auto& c : pairs) {
        const double d = means[c.first] - means[c.second];
        const double se = std::sqrt(0.5 * mse * (1.0 / x[c.first].size() + 1.0 / x[c.second].size()));
        c.statistic = std::abs(d) / se;
        c.p = studentized_range_sf(c.statistic, static_cast<int>(k), df);
        c.estimate = difference_on_data_scale(t, d / scale);
        c.ci_low = difference_on_data_scale(t, (d - critical * se) / scale);
        c.ci_high = difference_on_data_scale(t, (d + critical * se) / scale);
    }
}

// Games–Howell: each pair with its own standard error √(sᵢ²/nᵢ + sⱼ²/nⱼ) and Welch–Satterthwaite
// df, q = √2 |t| referred to the studentized range with k groups at that df.
// Games & Howell (1976), J. Educ. Stat. 1, 113–125.
void games_howell(const Groups& g, const GroupValues& raw, Transform t, double level, std::vector<PairComparison>& pairs) {
    const std::size_t k = raw.size();
    const double scale = common_scale(raw);
    const GroupValues x = scaled(raw, scale);
    std::vector<double> means(k), spread(k);  // spread: s²/n
    for (std::size_t i = 0; i < k; ++i) {
        if (x[i].size() < 2)
            throw Refusal("games-howell needs at least 2 values in each group; " + in_quotes(g.names[i]) + " has " +
                          std::to_string(x[i].size()));
        means[i] = mean(x[i]);
        spread[i] = sum_of_squares(x[i], means[i]) / (x[i].size() - 1.0) / x[i].size();
    }
    for (auto& c : pairs) {
        const double a = spread[c.first], b = spread[c.second];
        const double se2 = a + b;
        if (!(se2 > 0.0) || !std::isfinite(se2))
            throw Refusal("groups " + in_quotes(g.names[c.first]) + " and " + in_quotes(g.names[c.second]) +
                          " both have zero spread; games-howell needs spread within groups (try dunn)");
        const double df = se2 * se2 / (a * a / (x[c.first].size() - 1.0) + b * b / (x[c.second].size() - 1.0));
        const double se = std::sqrt(0.5 * se2);  // on the scale of q: √2 |t| = |d| / √(se2/2)
        const double d = means[c.first] - means[c.second];
        c.statistic = std::abs(d) / se;
        c.p = studentized_range_sf(c.statistic, static_cast<int>(k), df);
        const double critical = studentized_range_quantile(level, static_cast<int>(k), df);
        c.estimate = difference_on_data_scale(t, d / scale);
        c.ci_low = difference_on_data_scale(t, (d - critical * se) / scale);
        c.ci_high = difference_on_data_scale(t, (d + critical * se) / scale);
    }
}

// Dunn: all values ranked together (mid-ranks), z = (R̄ᵢ − R̄ⱼ) / √(σ² (1/nᵢ + 1/nⱼ)) with
// σ² = N(N+1)/12 − Σ(t³ − t)/(12(N − 1)) (tie-corrected), two-sided normal p.
// Dunn (1964), Technometrics 6, 241–252. The estimate is the difference of mean ranks, with a
// per-pair normal interval R̄ᵢ − R̄ⱼ ± z₁₋α/₂ · SE (ranks have no back-transformation).
void dunn(const GroupValues& x, double level, std::vector<PairComparison>& pairs) {
    const std::size_t k = x.size();
    std::vector<double> pooled;
    for (const auto& v : x) pooled.insert(pooled.end(), v.begin(), v.end());
    const double total = static_cast<double>(pooled.size());
    const Ranking ranking = rank_with_ties(pooled);
    const double variance = total * (total + 1.0) / 12.0 - ranking.tie_term / (12.0 * (total - 1.0));
    if (!(variance > 0.0) || ranking.tie_term == total * total * total - total)
        throw Refusal("all values are equal; a rank test needs at least two different values");
    std::vector<double> mean_rank(k);
    std::size_t at = 0;
    for (std::size_t i = 0; i < k; ++i) {
        Accumulator sum;
        for (std::size_t j = 0; j < x[i].size(); ++j) sum.add(ranking.ranks[at + j]);
        at += x[i].size();
        mean_rank[i] = sum.sum() / x[i].size();
    }
    const boost::math::normal standard;
    const double critical = quantile(complement(standard, (1.0 - level) / 2.0));
    for (auto& c : pairs) {
        const double d = mean_rank[c.first] - mean_rank[c.second];
        const double se = std::sqrt(variance * (1.0 / x[c.first].size() + 1.0 / x[c.second].size()));
        c.statistic = d / se;
        c.p = std::min(1.0, 2.0 * cdf(complement(standard, std::abs(c.statistic))));
        c.estimate = d;
        c.ci_low = d - critical * se;
        c.ci_high = d + critical * se;
    }
}

// Pairwise two-group tests (Welch's t or the rank-sum test), each pair on its own.
void pairwise_tests(const Groups& g, const GroupValues& x, PosthocMethod method, Transform t, double level,
                    std::vector<PairComparison>& pairs) {
    for (std::size_t i = 0; i < x.size(); ++i)
        if (x[i].size() < 2)
            throw Refusal(posthoc_methods().words()[static_cast<std::size_t>(method)].word +
                          " needs at least 2 values in each group; " + in_quotes(g.names[i]) + " has " +
                          std::to_string(x[i].size()));
    for (auto& c : pairs) {
        const TestResult r = method == PosthocMethod::pairwise_t ? welch_t_test(x[c.first], x[c.second], level)
                                                              : rank_sum_test(x[c.first], x[c.second], level);
        c.statistic = r.number("statistic");
        c.p = r.number("p");
        c.estimate = difference_on_data_scale(t, r.number("estimate"));
        for (auto [label, cell] : {std::pair{"ci-low", &c.ci_low}, std::pair{"ci-high", &c.ci_high}}) {
            const CellValue* v = r.find(label);
            if (v && std::holds_alternative<double>(*v))
                *cell = difference_on_data_scale(t, std::get<double>(*v));
            else if (v)
                *cell = *v;
        }
    }
}

std::string method_name(PosthocMethod method) {
    switch (method) {
        case PosthocMethod::tukey: return "Tukey–Kramer pairwise comparisons (studentized range)";
        case PosthocMethod::games_howell: return "Games–Howell pairwise comparisons (studentized range, Welch df)";
        case PosthocMethod::dunn: return "Dunn pairwise comparisons of mean ranks (tie-corrected)";
        case PosthocMethod::pairwise_t: return "pairwise Welch t-tests";
        case PosthocMethod::pairwise_ranks: return "pairwise Wilcoxon–Mann–Whitney rank-sum tests";
    }
    return {};
}

}  // namespace

PosthocResult compare_posthoc(const Groups& groups, PosthocMethod method, std::optional<Adjustment> adjust,
                              Transform transform, double level) {
    const std::size_t k = groups.group_count();
    if (groups.n_used == 0) throw Refusal(no_usable_rows(groups));
    // A wide-format column of text only is a group without values: no pair with it has a statistic.
    for (std::size_t i = 0; i < k; ++i)
        if (groups.values[i].empty())
            throw Refusal("group " + in_quotes(groups.names[i]) + " has no values; every group needs at least 1");
    if (k < 2)
        throw Refusal("pairwise comparisons need at least 2 groups, found " + std::to_string(k) +
                      "; give group labels beside the values");
    if (k > posthoc_max_groups)
        throw Refusal("pairwise comparisons take at most " + std::to_string(posthoc_max_groups) + " groups, found " +
                      std::to_string(k));
    GroupValues x = groups.values;
    apply_transform(transform, x);

    PosthocResult result;
    result.groups = groups.names;
    for (const auto& v : x) result.n.push_back(v.size());
    result.pairs = all_pairs(k);
    switch (method) {
        case PosthocMethod::tukey: tukey_kramer(x, transform, level, result.pairs); break;
        case PosthocMethod::games_howell: games_howell(groups, x, transform, level, result.pairs); break;
        case PosthocMethod::dunn: dunn(x, level, result.pairs); break;
        case PosthocMethod::pairwise_t:
        case PosthocMethod::pairwise_ranks: pairwise_tests(groups, x, method, transform, level, result.pairs); break;
    }

    result.test = method_name(method);
    if (is_family_adjusted(method)) {
        for (auto& c : result.pairs) c.adjusted_p = c.p;
    } else {
        const Adjustment a = adjust.value_or(Adjustment::holm);
        std::vector<double> p;
        p.reserve(result.pairs.size());
        for (const auto& c : result.pairs) p.push_back(c.p);
        const std::vector<double> adjusted = adjust_p(p, a);
        for (std::size_t i = 0; i < adjusted.size(); ++i) result.pairs[i].adjusted_p = adjusted[i];
        result.test += ", " + adjustment_name(a) + "-adjusted";
    }
    const double alpha = 1.0 - level;
    for (auto& c : result.pairs) c.significant = c.adjusted_p < alpha;
    return result;
}

}  // namespace quadrat
