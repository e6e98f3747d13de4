#include "advisor.hpp"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <map>
#include <optional>
#include <set>

#include "data.hpp"
#include "diagnostics.hpp"
#include "linear_model.hpp"
#include "keywords.hpp"
#include "normality.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"
#include "transform.hpp"
#include "variance.hpp"

namespace quadrat {

namespace {

// Significance level of every assumption check: 0.05, common practice, no single source.
constexpr double check_alpha = 0.05;
// A column counts as numeric when at least this share of its non-blank cells are numbers (the
// rest, such as "<0.5" or "dry", are then missing): common practice, no source.
constexpr double numeric_share = 0.8;
// Shapiro–Wilk's range (Royston 1995); above it the central limit theorem covers the means.
constexpr std::size_t shapiro_wilk_max = 5000;
// Cochran (1954), Biometrics 10, 417–451: χ² is trusted when no expected count is below 1 and
// at most 20% are below 5; otherwise Fisher's exact test.
constexpr double cochran_min_expected = 1.0;
constexpr double cochran_small_expected = 5.0;
constexpr double cochran_small_share = 0.2;
// Peduzzi et al. (1996), J. Clin. Epidemiol. 49, 1373–1379: about 10 events per predictor
// for a stable logistic model.
constexpr std::size_t events_per_predictor = 10;

struct Profile {
    bool numeric = false;
    std::size_t values = 0;     // usable cells (numbers, or labels)
    std::size_t distinct = 0;
    bool zero_one = false;      // numeric and only 0 and 1
};

// How a person reads a column: numbers or labels, and how many different ones.
Profile profile_of(const Range& r) {
    Profile p;
    if (r.empty()) return p;
    std::size_t numbers = 0, texts = 0;
    std::set<double> numeric_values;
    std::set<std::string> labels;
    // The data layer's header rule: a value column's header, or a label column's.
    const std::size_t first = numeric_column_has_header(r, 0) || label_column_has_header(r, 0) ? 1 : 0;
    for (std::size_t row = first; row < r.rows; ++row)
        for (std::size_t col = 0; col < r.columns; ++col) {
            const Cell& c = r.at(row, col);
            if (c.kind == CellKind::number && std::isfinite(c.number)) {
                ++numbers;
                numeric_values.insert(c.number);
                labels.insert(number_label(c.number));
            } else if (c.kind == CellKind::text && !is_missing_marker(c.text)) {
                ++texts;
                labels.insert(c.text);
            }
        }
    p.numeric = numbers > 0 && static_cast<double>(numbers) >= numeric_share * static_cast<double>(numbers + texts);
    p.values = p.numeric ? numbers : numbers + texts;
    p.distinct = p.numeric ? numeric_values.size() : labels.size();
    p.zero_one = p.numeric && std::all_of(numeric_values.begin(), numeric_values.end(), [](double x) { return x == 0 || x == 1; });
    return p;
}

// Normality of a sample by Shapiro–Wilk, or "not testable" with the reason.
struct NormalityFinding {
    bool normal = true;
    bool tested = false;
    double p = 1.0;
    std::string words;
};

NormalityFinding normality_of(std::span<const double> xs, const std::string& what) {
    NormalityFinding f;
    if (xs.size() > shapiro_wilk_max) {
        f.words = what + ": n = " + std::to_string(xs.size()) +
                  ", above Shapiro–Wilk's 5000; at this size the means are close to normal whatever the data (central limit theorem)";
        return f;
    }
    if (xs.size() < 3) throw Refusal("too few values to advise (" + std::to_string(xs.size()) + "); collect at least 3");
    const double lo = *std::min_element(xs.begin(), xs.end());
    const double hi = *std::max_element(xs.begin(), xs.end());
    if (lo == hi) throw Refusal("all values are equal: there is nothing to test");
    const TestResult sw = shapiro_wilk(xs);
    f.tested = true;
    f.p = sw.number("p");
    f.normal = f.p >= check_alpha;
    // A check that finds nothing is no proof of normality (FUNCTIONS.md, "Wording").
    f.words = (f.normal ? "no clear sign of non-normality in " + what : what + " depart from normal") + " (Shapiro–Wilk " +
              format_p(f.p) + ")";
    return f;
}

// Each value minus its group mean, divided by its group's SD (a group with no spread gives zeros).
std::vector<double> residuals_scaled_by_group(const Groups& groups) {
    std::vector<double> out;
    out.reserve(groups.n_used);
    for (const auto& values : groups.values) {
        const double centre = mean(values);
        const double sd = standard_deviation(values);
        for (double x : values) out.push_back(sd > 0 ? (x - centre) / sd : 0.0);
    }
    return out;
}

bool all_positive(const std::vector<std::vector<double>>& groups) {
    for (const auto& g : groups)
        for (double x : g)
            if (!(x > 0)) return false;
    return true;
}

bool counts_with_zeros(const std::vector<std::vector<double>>& groups) {
    bool zero = false;
    for (const auto& g : groups)
        for (double x : g) {
            if (x < 0 || x != std::floor(x)) return false;
            zero = zero || x == 0;
        }
    return zero;
}

std::string group_sizes(const Groups& g) {
    std::size_t lo = g.values[0].size(), hi = lo;
    for (const auto& v : g.values) {
        lo = std::min(lo, v.size());
        hi = std::max(hi, v.size());
    }
    return lo == hi ? std::to_string(lo) + " each" : "sizes " + std::to_string(lo) + " to " + std::to_string(hi);
}

struct Censoring {
    std::size_t censored = 0, values = 0;  // cells below a limit; those plus the numbers
    std::string first;                     // the first censored cell's text
    double percent() const { return values ? 100.0 * static_cast<double>(censored) / static_cast<double>(values) : 0.0; }
};

Censoring censoring_of(const Range& r) {
    Censoring c;
    for (std::size_t row = 0; row < r.rows; ++row)
        for (std::size_t col = 0; col < r.columns; ++col) {
            const Cell& cell = r.at(row, col);
            if (cell.kind == CellKind::number && std::isfinite(cell.number)) ++c.values;
            // A non-detect without its limit ("<DL", "ND") is refused, as in every function.
            if (cell.kind == CellKind::text) refuse_censored_cell(r, row, col, "response", true);
            if (cell.kind == CellKind::text && censored_text(cell.text) == CensoredText::censored) {
                if (c.censored++ == 0) c.first = cell.text;
                ++c.values;
            }
        }
    return c;
}

std::string censored_words(const Censoring& c) {
    char percent[32];
    std::snprintf(percent, sizeof percent, "%.0f%%", c.percent());
    return std::to_string(c.censored) + " of " + std::to_string(c.values) + " values (" + percent +
           ") are below a detection limit (such as " + c.first + ")";
}

// Values below detection limits: the censored family (Helsel 2006, Chemosphere 65, 2434–2439:
// leaving them out or putting a fraction of the limit in their place biases every summary).
void advise_censored(const Censoring& c, bool grouped, Advice& advice) {
    advice.function = grouped ? "COMPARE.CENSORED" : "DESCRIBE.CENSORED";
    advice.method = grouped ? "peto-prentice" : "kaplan-meier";
    advice.transform = "none";
    advice.steps.push_back({"detection limits", censored_words(c),
                            "use methods for censored values: leaving them out or putting a fraction of the limit in "
                            "their place would bias the result"});
    if (c.percent() > 80)
        advice.steps.push_back({"share censored", "more than 80% censored",
                                "no method estimates a mean there: report how often the limit was exceeded"});
    advice.steps.push_back({"test", grouped ? "groups with censored values" : "one column with censored values",
                            grouped ? "generalized Wilcoxon test (Peto–Prentice) on the censored values"
                                    : "Kaplan–Meier summary of the censored values"});
}

// The predictor is sampling time: a monotonic trend (Mann–Kendall with the Sen slope), which
// needs neither normal residuals nor a straight line.
void advise_trend(const Range& response, const Range& times, const Censoring& censoring, Advice& advice) {
    const Frame f = read_frame({{&response, ColumnKind::numeric, "response"}, {&times, ColumnKind::numeric, "predictor"}});
    std::set<double> distinct(f.numbers[1].begin(), f.numbers[1].end());
    advice.function = "TRACK.TREND";
    advice.method = "";
    advice.transform = "none";
    advice.steps.push_back({"variables",
                            "response (n = " + std::to_string(f.n_used + censoring.censored) + ") against sampling time (" +
                                std::to_string(distinct.size()) + " distinct times)",
                            "test for a monotonic trend: Mann–Kendall with the Sen slope, which assumes neither normal "
                            "residuals nor a straight line"});
    if (censoring.censored)
        advice.steps.push_back({"detection limits", censored_words(censoring),
                                "TRACK.TREND compares them as below their limit"});
    advice.steps.push_back({"seasons", "readings may follow the seasons",
                            "give seasons (month or quarter) for the seasonal Kendall test if they do"});
}

// Index of each label in order of first appearance.
std::vector<std::size_t> label_codes(const std::vector<std::string>& labels, std::vector<std::string>& names) {
    std::map<std::string, std::size_t> index;
    std::vector<std::size_t> codes;
    codes.reserve(labels.size());
    for (const auto& label : labels) {
        const auto [it, added] = index.emplace(label, names.size());
        if (added) names.push_back(label);
        codes.push_back(it->second);
    }
    return codes;
}

// Groups compared within blocks (COMPARE.BLOCKS) or over sampling units nested in groups
// (COMPARE.NESTED). Several readings of one group in one block are averaged first, as
// COMPARE.BLOCKS does; a block missing a group is left out.
void advise_structured(const Range& response, const Range& predictor, const Range& structure, bool nested,
                       Advice& advice) {
    const Frame f = read_frame({{&response, ColumnKind::numeric, "response"},
                                {&predictor, ColumnKind::label, "predictor"},
                                {&structure, ColumnKind::label, "structure"}});
    std::vector<std::string> groups, units;
    const std::vector<std::size_t> g = label_codes(f.labels[1], groups);
    const std::vector<std::size_t> u = label_codes(f.labels[2], units);
    const std::size_t k = groups.size(), b = units.size();
    if (k < 2) throw Refusal("the predictor has " + std::to_string(k) + " group; a comparison needs 2 or more");
    const std::string unit_word = nested ? "sampling units" : "blocks";
    std::vector<std::vector<double>> sum(b, std::vector<double>(k, 0.0)), count(b, std::vector<double>(k, 0.0));
    for (std::size_t i = 0; i < f.n_used; ++i) {
        sum[u[i]][g[i]] += f.numbers[0][i];
        count[u[i]][g[i]] += 1;
    }
    std::size_t averaged = 0;
    for (std::size_t j = 0; j < b; ++j)
        for (std::size_t i = 0; i < k; ++i) averaged += count[j][i] > 1 ? static_cast<std::size_t>(count[j][i]) : 0;

    std::vector<double> residuals;
    std::string checked;
    if (nested) {
        // Each unit belongs to one group; its mean is one replicate of that group.
        std::vector<std::vector<double>> unit_means(k);
        for (std::size_t j = 0; j < b; ++j) {
            std::size_t owner = k;
            for (std::size_t i = 0; i < k; ++i)
                if (count[j][i] > 0) {
                    if (owner != k)
                        throw Refusal("sampling unit '" + units[j] + "' holds readings of groups '" + groups[owner] + "' and '" +
                                      groups[i] + "'; in a nested design each unit belongs to one group (for units that "
                                      "see every group use design 'blocks')");
                    owner = i;
                }
            unit_means[owner].push_back(sum[j][owner] / count[j][owner]);
        }
        for (std::size_t i = 0; i < k; ++i)
            if (unit_means[i].size() < 2)
                throw Refusal("group '" + groups[i] + "' has " + std::to_string(unit_means[i].size()) +
                              " sampling unit; each group needs at least 2 units to compare groups over units");
        for (const auto& means : unit_means) {
            const double centre = mean(means);
            for (double m : means) residuals.push_back(m - centre);
        }
        advice.steps.push_back({"variables",
                                "continuous response (n = " + std::to_string(f.n_used) + ") in " + std::to_string(k) +
                                    " groups, from " + std::to_string(b) + " sampling units",
                                "compare groups over the variation between units: the subsamples of a unit are not "
                                "independent replicates"});
        checked = "the unit means' residuals from their group means";
    } else {
        std::vector<std::size_t> complete;
        for (std::size_t j = 0; j < b; ++j)
            if (std::all_of(count[j].begin(), count[j].end(), [](double c) { return c > 0; })) complete.push_back(j);
        if (complete.size() < 2)
            throw Refusal("only " + std::to_string(complete.size()) + " of " + std::to_string(b) +
                          " blocks hold every group; comparing within blocks needs at least 2 complete blocks");
        // Residuals of the additive model on the complete blocks: m − group mean − block mean + grand mean;
        // with two groups, the within-block differences (what the paired tests use).
        const double nb = static_cast<double>(complete.size()), nk = static_cast<double>(k);
        std::vector<double> group_mean(k, 0.0), block_mean(complete.size(), 0.0);
        double grand = 0;
        for (std::size_t c = 0; c < complete.size(); ++c)
            for (std::size_t i = 0; i < k; ++i) {
                const double m = sum[complete[c]][i] / count[complete[c]][i];
                group_mean[i] += m / nb;
                block_mean[c] += m / nk;
                grand += m / (nb * nk);
            }
        for (std::size_t c = 0; c < complete.size(); ++c) {
            if (k == 2) {
                residuals.push_back(sum[complete[c]][0] / count[complete[c]][0] - sum[complete[c]][1] / count[complete[c]][1]);
                continue;
            }
            for (std::size_t i = 0; i < k; ++i)
                residuals.push_back(sum[complete[c]][i] / count[complete[c]][i] - group_mean[i] - block_mean[c] + grand);
        }
        const std::size_t dropped = b - complete.size();
        advice.steps.push_back({"variables",
                                "continuous response (n = " + std::to_string(f.n_used) + ") in " + std::to_string(k) +
                                    " groups within " + std::to_string(complete.size()) + " complete blocks" +
                                    (dropped ? " (" + std::to_string(dropped) + " missing a group, left out)" : std::string()),
                                "compare groups within blocks, so that differences between blocks do not hide them"});
        checked = k == 2 ? "the within-block differences" : "the residuals from the additive block model";
    }
    if (averaged)
        advice.steps.push_back({"subsamples",
                                std::to_string(averaged) + " readings share a group and " + (nested ? "unit" : "block") +
                                    " with others",
                                "they are averaged first: subsamples, not replicates"});
    const NormalityFinding normal = normality_of(residuals, checked);
    advice.transform = "none";
    if (nested) {
        if (normal.normal) {
            advice.function = "COMPARE.NESTED";
            advice.method = "";
            advice.steps.push_back({"normality", normal.words, "nested ANOVA: F of groups over units within groups"});
        } else {
            // COMPARE.NESTED has no rank method: the units are the replicates, so their means are
            // compared by ranks.
            advice.function = "COMPARE.GROUPS";
            advice.method = "ranks";
            if (k > 2) advice.posthoc = "dunn";
            advice.steps.push_back({"normality", normal.words,
                                    "compare one mean per sampling unit by ranks (COMPARE.GROUPS, method 'ranks')"});
        }
        return;
    }
    advice.function = "COMPARE.BLOCKS";
    advice.method = normal.normal ? "pooled" : "ranks";
    advice.steps.push_back({"normality", normal.words,
                            normal.normal ? (k == 2 ? "paired t-test matched by block (method 'pooled')"
                                                    : "randomized block ANOVA (method 'pooled')")
                                          : (k == 2 ? "Wilcoxon signed-rank test matched by block (method 'ranks')"
                                                    : "Friedman test (method 'ranks')")});
}

// Continuous response across two or more groups.
void advise_groups(const Range& values, const Range& labels, Advice& advice, const std::string& values_name,
                   const std::string& labels_name) {
    Groups g = read_groups(values, labels, values_name, labels_name);
    const std::size_t k = g.group_count();
    if (k < 2)
        throw Refusal("the " + labels_name + " has " + std::to_string(k) + (k == 1 ? " group" : " groups") +
                      "; a comparison needs 2 or more");
    for (std::size_t i = 0; i < k; ++i)
        if (g.values[i].size() < 2)
            throw Refusal("group " + g.names[i] + " has " + std::to_string(g.values[i].size()) +
                          " value; each group needs at least 2 to compare spreads and locations");
    advice.function = "COMPARE.GROUPS";
    advice.steps.push_back({"variables",
                            "continuous response (n = " + std::to_string(g.n_used) + "), predictor with " +
                                std::to_string(k) + " groups (" + group_sizes(g) + ")",
                            k == 2 ? "compare two groups" : "compare " + std::to_string(k) + " groups, then pairs"});

    // Spread first: with unequal spreads the pooled residuals are a mixture of normals of different
    // widths, heavy-tailed even when every group is normal, so each group's residuals are then
    // scaled by its own SD before the normality check (what Welch's tests assume is normality
    // within groups, not a common spread).
    struct Scale {
        Groups groups;
        double spread_p;
        NormalityFinding normal;
    };
    auto examine = [](Groups groups, const std::string& words) {
        const double spread_p = check_variance(groups, "brown-forsythe").number("p");
        const bool scaled = spread_p < check_alpha;
        const NormalityFinding normal =
            normality_of(scaled ? residuals_scaled_by_group(groups) : residuals_from_group_means(groups),
                         scaled ? words + " residuals, each group scaled by its SD," : words + " residuals from the group means");
        return Scale{std::move(groups), spread_p, normal};
    };
    Scale chosen = examine(g, "the");
    std::string transform = "none";
    if (!chosen.normal.normal) {
        std::optional<Transform> candidate;
        if (all_positive(g.values)) candidate = Transform::log;
        else if (counts_with_zeros(g.values)) candidate = Transform::log_plus_one;
        if (candidate) {
            const std::string keyword = transform_keyword(*candidate);
            Groups scaled = g;
            apply_transform(*candidate, scaled.values);
            Scale after = examine(std::move(scaled), "the " + keyword + "-scale");
            if (after.normal.normal) {
                transform = keyword;
                advice.steps.push_back({"normality", chosen.normal.words + "; after a " + keyword + " transform, " +
                                                         after.normal.words,
                                        "use transform " + in_quotes(keyword)});
                chosen = std::move(after);
            } else {
                advice.steps.push_back({"normality", chosen.normal.words + ", and still after a " + keyword +
                                                         " transform (Shapiro–Wilk " + format_p(after.normal.p) + ")",
                                        "use a rank test"});
            }
        } else {
            advice.steps.push_back({"normality", chosen.normal.words + "; a log transform needs positive values", "use a rank test"});
        }
    } else {
        advice.steps.push_back({"normality", chosen.normal.words, "a test of means can be used"});
    }
    advice.transform = transform;
    const NormalityFinding& normal = chosen.normal;
    const double spread_p = chosen.spread_p;
    const bool equal_spread = spread_p >= check_alpha;
    const std::string scale = transform == "none" ? "" : " on the " + transform + " scale";
    const std::string spread_words = std::string(equal_spread ? "no clear sign of unequal spread" : "clear sign of unequal spread") +
                                     scale + " (Brown–Forsythe " + format_p(spread_p) + ")";

    if (!normal.normal) {
        advice.method = "ranks";
        advice.steps.push_back({"spread", spread_words,
                                equal_spread ? "rank test compares locations"
                                             : "rank test compares whole distributions, not only medians"});
        advice.steps.push_back({"test", std::to_string(k) + " groups, clear sign of non-normality",
                                k == 2 ? "Wilcoxon–Mann–Whitney (method 'ranks')" : "Kruskal–Wallis (method 'ranks'), then Dunn's pairs"});
        if (k > 2) advice.posthoc = "dunn";
        return;
    }
    if (k == 2) {
        // Welch's t does not need equal spreads and loses little when they are equal
        // (Ruxton 2006, Behavioral Ecology 17, 688–690): it is the default for two groups.
        advice.method = "welch";
        advice.steps.push_back({"spread", spread_words, "Welch's t-test, which does not assume equal spreads"});
        return;
    }
    if (equal_spread) {
        advice.method = "pooled";
        advice.posthoc = "tukey";
        advice.steps.push_back({"spread", spread_words, "classic one-way ANOVA (method 'pooled'), then Tukey–Kramer pairs"});
    } else {
        advice.method = "welch";
        advice.posthoc = "games-howell";
        advice.steps.push_back({"spread", spread_words, "Welch's ANOVA (method 'welch'), then Games–Howell pairs"});
    }
}

// Readings paired by row, or one sample against a target value (no second column).
void advise_paired(const Range& first, const Range* second, Advice& advice) {
    advice.function = "COMPARE.PAIRED";
    std::vector<double> differences;
    std::vector<double> log_ratios;
    bool positive = true;
    if (second) {
        const Frame f = read_frame({{&first, ColumnKind::numeric, "response"}, {second, ColumnKind::numeric, "predictor"}});
        for (std::size_t i = 0; i < f.n_used; ++i) {
            const double a = f.numbers[0][i], b = f.numbers[1][i];
            differences.push_back(a - b);
            positive = positive && a > 0 && b > 0;
            if (positive) log_ratios.push_back(std::log(a) - std::log(b));
        }
        advice.steps.push_back({"variables", "two measurements on the same " + std::to_string(f.n_used) + " units, row by row",
                                "test the differences (first − second)"});
    } else {
        const Column c = read_column(first, "response");
        differences = c.values;
        for (double x : c.values) {
            positive = positive && x > 0;
            if (positive) log_ratios.push_back(std::log(x));
        }
        advice.steps.push_back({"variables", "one continuous column (n = " + std::to_string(c.n_used) + "), no predictor",
                                "one-sample test against a target value: COMPARE.PAIRED(values; target)"});
    }
    const std::string what = second ? "the differences" : "the values";
    const NormalityFinding normal = normality_of(differences, what);
    advice.transform = "none";
    if (normal.normal) {
        advice.method = "t";
        advice.steps.push_back({"normality", normal.words, second ? "paired t-test" : "one-sample t-test"});
        return;
    }
    if (positive && log_ratios.size() == differences.size()) {
        const NormalityFinding after = normality_of(log_ratios, second ? "the log ratios" : "the log values");
        if (after.normal) {
            advice.method = "t";
            advice.transform = "log";
            advice.steps.push_back({"normality", normal.words + "; " + after.words, "t-test with transform 'log'"});
            return;
        }
    }
    advice.method = "signed-rank";
    advice.steps.push_back({"normality", normal.words, "Wilcoxon signed-rank test (method 'signed-rank')"});
}

// Two categorical variables: χ² or Fisher by Cochran's rule on the expected counts.
void advise_counts(const Range& a, const Range& b, Advice& advice) {
    const Frame f = read_frame({{&a, ColumnKind::label, "response"}, {&b, ColumnKind::label, "predictor"}});
    std::map<std::string, std::size_t> rows, cols;
    std::map<std::pair<std::string, std::string>, double> cells;
    for (std::size_t i = 0; i < f.n_used; ++i) {
        rows[f.labels[0][i]]++;
        cols[f.labels[1][i]]++;
    }
    if (rows.size() < 2 || cols.size() < 2)
        throw Refusal("each variable needs at least 2 categories (found " + std::to_string(rows.size()) + " and " +
                      std::to_string(cols.size()) + ")");
    const double n = static_cast<double>(f.n_used);
    std::size_t below_one = 0, below_five = 0;
    double smallest = n;
    for (const auto& [r, nr] : rows)
        for (const auto& [c, nc] : cols) {
            const double e = static_cast<double>(nr) * static_cast<double>(nc) / n;
            smallest = std::min(smallest, e);
            below_one += e < cochran_min_expected;
            below_five += e < cochran_small_expected;
        }
    const std::size_t cells_total = rows.size() * cols.size();
    advice.function = "COMPARE.COUNTS";
    advice.transform = "none";
    advice.steps.push_back({"variables",
                            "two categorical variables: " + std::to_string(rows.size()) + "×" + std::to_string(cols.size()) +
                                " table of " + std::to_string(f.n_used) + " observations",
                            "test of association"});
    const bool chi_ok = below_one == 0 && static_cast<double>(below_five) <= cochran_small_share * static_cast<double>(cells_total);
    advice.method = chi_ok ? "chi-square" : "fisher";
    advice.steps.push_back({"expected counts",
                            "smallest expected count " + format_number(smallest) + ", " + std::to_string(below_five) + " of " +
                                std::to_string(cells_total) + " cells below 5",
                            chi_ok ? "Pearson's chi-square (Cochran's rule holds)" : "Fisher's exact test (Cochran's rule fails)"});
}

void advise_logistic(const Range& response, const Range& predictor, const Profile& outcome, Advice& advice) {
    const Frame f = read_frame({{&response, ColumnKind::label, "response"}, {&predictor, ColumnKind::numeric, "predictor"}});
    std::map<std::string, std::size_t> counts;
    for (const auto& label : f.labels[0]) counts[label]++;
    std::size_t rarer = f.n_used;
    for (const auto& [label, count] : counts) rarer = std::min(rarer, count);
    advice.function = "FIT.LOGISTIC";
    advice.method = "";
    advice.transform = "none";
    advice.steps.push_back({"variables",
                            std::string("binary response (") + (outcome.numeric ? "0/1" : "two labels") +
                                ") and a continuous predictor, n = " + std::to_string(f.n_used),
                            "logistic regression"});
    advice.steps.push_back({"events", "the rarer outcome occurs " + std::to_string(rarer) + " times",
                            rarer >= events_per_predictor ? "enough for one predictor (about 10 per predictor)"
                                                          : "fewer than 10: estimates will be unstable; read them with care"});
}

// Two continuous variables: Pearson (with the straight-line fit) when the relationship is linear
// and the residuals normal, else Spearman's rank correlation, which needs only a monotone trend.
void advise_relationship(const Range& response, const Range& predictor, Advice& advice) {
    const RegressionData data = read_regression(response, predictor);
    const LinearModel model = fit_least_squares(data.y, data.predictors, data.names, true);
    const ModelChecks checks = check_regression(model, data);
    advice.function = "RELATE.CORRELATION";
    advice.transform = "none";
    advice.steps.push_back({"variables", "two continuous variables, n = " + std::to_string(model.n) + " pairs",
                            "correlation, or a straight-line fit (FIT.LINEAR)"});
    const bool linearity_known = std::isfinite(checks.reset_p);
    const bool linear = !linearity_known || checks.reset_p >= check_alpha;
    advice.steps.push_back({"linearity",
                            linearity_known ? std::string(linear ? "no clear sign of curvature" : "clear sign of curvature") +
                                                  " (RESET " + format_p(checks.reset_p) + ")"
                                            : "RESET could not be computed: " + checks.linearity_note,
                            linear ? "a straight line may serve" : "use a rank correlation, which needs only a monotone trend"});
    const bool normality_known = std::isfinite(checks.normality_p);
    const bool normal = !normality_known || checks.normality_p >= check_alpha;
    advice.steps.push_back({"normality",
                            normality_known ? std::string(normal ? "no clear sign of non-normality in the residuals"
                                                                 : "the residuals depart from normal") +
                                                  " (Shapiro–Wilk " + format_p(checks.normality_p) + ")"
                                            : "residual normality not tested: " + checks.normality_note,
                            normal ? "Pearson's test can be used" : "Pearson's p would not be trustworthy"});
    advice.method = linear && normal ? "pearson" : "spearman";
    advice.steps.push_back({"test",
                            advice.method == "pearson" ? "no clear sign against a straight line with normal residuals"
                                                       : "clear sign against an assumption of Pearson's test",
                            advice.method == "pearson" ? "Pearson's r (method 'pearson'); FIT.LINEAR and CHECK.REGRESSION for the line itself"
                                                       : "Spearman's rank correlation (method 'spearman')"});
}

}  // namespace

Design parse_design(const std::string& keyword) {
    return static_cast<Design>(designs().index(keyword, "design"));  // designs() lists them in Design's order
}

namespace {
std::string design_keyword(Design d) {
    switch (d) {
        case Design::groups: return "groups";
        case Design::paired: return "paired";
        case Design::relationship: return "relationship";
        case Design::trend: return "trend";
        case Design::blocks: return "blocks";
        case Design::nested: return "nested";
        case Design::automatic: break;
    }
    return "auto";
}
}  // namespace

Table Advice::table() const {
    Table t;
    t.push_back({std::string("step"), std::string("found"), std::string("decision")});
    for (const auto& s : steps) t.push_back({s.step, s.found, s.decision});
    t.push_back({std::string("suggestion"), render_suggestion(*this), std::string("A guide, not a verdict: check it against the study design.")});
    return t;
}

Advice advise_test(const Range& response, const Range& predictor, Design design, const Range& structure) {
    if (response.empty()) throw Refusal("response is empty");
    if (response.columns != 1) throw Refusal("response must be one column");
    if (!predictor.empty() && predictor.columns != 1) throw Refusal("predictor must be one column");
    if (!structure.empty() && structure.columns != 1) throw Refusal("structure must be one column");
    // structure gives the blocks by default (FUNCTIONS.md, ADVISE.TEST).
    if (!structure.empty() && design == Design::automatic) design = Design::blocks;
    const bool structured = design == Design::blocks || design == Design::nested;
    if (structured && structure.empty())
        throw Refusal("design '" + design_keyword(design) + "' needs structure: the " +
                      (design == Design::blocks ? "block of each row (site, transect, date)"
                                                : "sampling unit each reading came from (plot, net, core)"));
    if (!structure.empty() && !structured)
        throw Refusal("structure is read with design 'blocks' or 'nested'; design '" + design_keyword(design) +
                      "' does not use it");
    if ((structured || design == Design::trend) && predictor.empty())
        throw Refusal("design '" + design_keyword(design) + "' needs a predictor column (" +
                      (design == Design::trend ? "the sampling times" : "the groups") + ")");
    Advice advice;
    const Profile y = profile_of(response);
    const Censoring censoring = censoring_of(response);
    if (y.values == 0 && censoring.censored == 0) throw Refusal("response holds no values");

    if (design == Design::trend) {
        if (!profile_of(predictor).numeric)
            throw Refusal("design 'trend' needs the sampling times in predictor (dates, times or numbers)");
        advise_trend(response, predictor, censoring, advice);
        advice.report = render_advice(advice);
        return advice;
    }
    if (censoring.censored > 0) {
        if (design == Design::automatic && !predictor.empty() && profile_of(predictor).numeric)
            throw Refusal("response holds values below a detection limit (" + censored_words(censoring) +
                          "): for a trend over time give design 'trend' (TRACK.TREND); to compare groups give design "
                          "'groups' (COMPARE.CENSORED)");
        if (design != Design::automatic && design != Design::groups)
            throw Refusal("response holds values below a detection limit (" + censored_words(censoring) +
                          "); only DESCRIBE.CENSORED, COMPARE.CENSORED and TRACK.TREND use them");
        advise_censored(censoring, !predictor.empty(), advice);
        advice.report = render_advice(advice);
        return advice;
    }
    if (structured) {
        if (!y.numeric) throw Refusal("design '" + design_keyword(design) + "' needs a response of numbers");
        advise_structured(response, predictor, structure, design == Design::nested, advice);
        advice.report = render_advice(advice);
        return advice;
    }

    if (predictor.empty()) {
        if (design != Design::automatic) throw Refusal("design '" + design_keyword(design) + "' needs a predictor column");
        if (!y.numeric)
            throw Refusal("one column of labels: count each category and compare the counts with COMPARE.EXPECTED");
        advise_paired(response, nullptr, advice);
    } else {
        const Profile x = profile_of(predictor);
        // A response that never varies cannot be explained by a predictor (against a target value,
        // above, a constant column can still be tested by signs).
        if (y.distinct == 1)
            throw Refusal(y.values == 1 ? "response holds 1 value; a test needs more rows"
                                        : "all " + std::to_string(y.values) + " response values are equal: there is nothing to test");
        if (design == Design::paired) {
            if (!y.numeric || !x.numeric) throw Refusal("design 'paired' needs two columns of numbers");
            advise_paired(response, &predictor, advice);
        } else if (design == Design::relationship) {
            if (!y.numeric || !x.numeric) throw Refusal("design 'relationship' needs two columns of numbers");
            advise_relationship(response, predictor, advice);
        } else if (y.numeric && y.distinct > 2 && (design == Design::groups || !x.numeric)) {
            advise_groups(response, predictor, advice, "response", "predictor");
        } else if (y.numeric && y.distinct > 2 && x.numeric) {
            advise_relationship(response, predictor, advice);
        } else if ((y.zero_one || (!y.numeric && y.distinct == 2)) && x.numeric && x.distinct > 2 && design != Design::groups) {
            advise_logistic(response, predictor, y, advice);
        } else if (!y.numeric && x.numeric && x.distinct > 2 && design != Design::groups) {
            // Labels explained by a measurement: compare the measurement across the categories.
            advise_groups(predictor, response, advice, "predictor", "response");
            advice.steps.insert(advice.steps.begin(),
                                {"roles", "the response holds labels and the predictor numbers",
                                 "compare the predictor across the response's categories: COMPARE.GROUPS(predictor; response)"});
        } else {
            advise_counts(response, predictor, advice);
        }
    }
    advice.report = render_advice(advice);
    return advice;
}

}  // namespace quadrat
