// The keyword tables of the catalogue (FUNCTIONS.md revision 2), each written once. The order of
// a table is the order the docs, the wizard and a refusal list it in; where an enum mirrors a
// table (Transform, Adjustment, PosthocMethod, Design) the enum keeps the table's order.
#include "keywords.hpp"

#include <cctype>

#include "refusal.hpp"

namespace quadrat {

namespace {
std::string folded(const std::string& s) {
    std::size_t b = 0, e = s.size();
    while (b < e && std::isspace(static_cast<unsigned char>(s[b]))) ++b;
    while (e > b && std::isspace(static_cast<unsigned char>(s[e - 1]))) --e;
    std::string out;
    out.reserve(e - b);
    for (std::size_t i = b; i < e; ++i) out.push_back(static_cast<char>(std::tolower(static_cast<unsigned char>(s[i]))));
    return out;
}
}  // namespace

KeywordTable::KeywordTable(std::string name, std::vector<Keyword> words) : name_(std::move(name)), words_(std::move(words)) {}

std::vector<std::string> KeywordTable::list() const {
    std::vector<std::string> out;
    out.reserve(words_.size());
    for (const auto& k : words_) out.push_back(k.word);
    return out;
}

bool KeywordTable::contains(const std::string& word) const {
    for (const auto& k : words_)
        if (k.word == word) return true;
    return false;
}

std::size_t KeywordTable::index(const std::string& given, const std::string& argument) const {
    const std::string key = folded(given);
    if (key.empty()) return 0;
    for (std::size_t i = 0; i < words_.size(); ++i)
        if (folded(words_[i].word) == key) return i;
    throw Refusal("unknown " + argument + " '" + given + "'; valid: " + join(list()));
}

std::string KeywordTable::match(const std::string& given, const std::string& argument, const std::string& fallback) const {
    if (folded(given).empty()) return fallback;
    return words_[index(given, argument)].word;
}

std::string join(const std::vector<std::string>& items, const std::string& separator) {
    std::string out;
    for (std::size_t i = 0; i < items.size(); ++i) {
        if (i) out += separator;
        out += items[i];
    }
    return out;
}

// ---- Methods and options ------------------------------------------------------------------------

const KeywordTable& normality_methods() {
    static const KeywordTable t{"normality methods",
                                {{"shapiro-wilk", "Shapiro–Wilk W, n from 3 to 5000"},
                                 {"shapiro-francia", "Shapiro–Francia W′"},
                                 {"anderson-darling", "Anderson–Darling A²"},
                                 {"lilliefors", "Lilliefors D (Kolmogorov–Smirnov with estimated mean and SD)"},
                                 {"dagostino-pearson", "D'Agostino–Pearson skewness–kurtosis K², n ≥ 8"},
                                 {"jarque-bera", "Jarque–Bera JB, χ² with 2 df"}}};
    return t;
}

const KeywordTable& variance_methods() {
    static const KeywordTable t{"spread methods",
                                {{"brown-forsythe", "deviations from group medians"},
                                 {"levene", "deviations from group means"},
                                 {"bartlett", "Bartlett's χ²"},
                                 {"fligner", "Fligner–Killeen, median-centred"},
                                 {"f-ratio", "two groups: variance of the first over the second"}}};
    return t;
}

const KeywordTable& location_methods() {
    static const KeywordTable t{"location methods",
                                {{"welch", "Welch's t-test, Welch's one-way ANOVA"},
                                 {"pooled", "Student's t-test, classic one-way ANOVA"},
                                 {"ranks", "Wilcoxon–Mann–Whitney, Kruskal–Wallis"}}};
    return t;
}

const KeywordTable& paired_methods() {
    static const KeywordTable t{"paired methods",
                                {{"t", "paired (or one-sample) t-test"},
                                 {"signed-rank", "Wilcoxon signed-rank test, statistic T⁺"},
                                 {"sign", "exact sign test"}}};
    return t;
}

const KeywordTable& posthoc_methods() {
    static const KeywordTable t{"post-hoc methods",
                                {{"tukey", "Tukey–Kramer, studentized range"},
                                 {"games-howell", "unequal variances, studentized range"},
                                 {"dunn", "ranks, tie-corrected z"},
                                 {"pairwise-t", "pairwise Welch t-tests"},
                                 {"pairwise-ranks", "pairwise Wilcoxon–Mann–Whitney tests"}}};
    return t;
}

const KeywordTable& adjustment_methods() {
    static const KeywordTable t{"p-value adjustments",
                                {{"holm", "Holm's step-down: any false finding"},
                                 {"bonferroni", "Bonferroni: any false finding"},
                                 {"hochberg", "Hochberg's step-up: any false finding"},
                                 {"hommel", "Hommel: any false finding"},
                                 {"benjamini-hochberg", "false discovery rate"},
                                 {"benjamini-yekutieli", "false discovery rate under any dependence"},
                                 {"sidak", "Šidák single-step, 1 − (1 − p)^m"}}};
    return t;
}

const KeywordTable& transforms() {
    static const KeywordTable t{"transforms",
                                {{"none", "the values as they are"},
                                 {"log", "natural logarithm (values > 0)"},
                                 {"log10", "base-10 logarithm (values > 0)"},
                                 {"log(x+1)", "log of x + 1, for counts with zeros"},
                                 {"sqrt", "square root (values ≥ 0)"}}};
    return t;
}

const KeywordTable& count_methods() {
    static const KeywordTable t{"count methods",
                                {{"chi-square", "Pearson's χ², no continuity correction"},
                                 {"yates", "χ² with Yates' correction, 2×2 only"},
                                 {"g", "likelihood-ratio G"},
                                 {"fisher", "Fisher's exact test"}}};
    return t;
}

const KeywordTable& correlation_methods() {
    static const KeywordTable t{"correlation methods",
                                {{"pearson", "Pearson's r"}, {"spearman", "Spearman's ρ"}, {"kendall", "Kendall's τ-b"}}};
    return t;
}

const KeywordTable& sums_of_squares() {
    static const KeywordTable t{"sums of squares",
                                {{"type-2", "each factor adjusted for the other"},
                                 {"type-3", "each term adjusted for all others, sum-to-zero contrasts"}}};
    return t;
}

const KeywordTable& designs() {
    static const KeywordTable t{"designs",
                                {{"auto", "read from the columns"},
                                 {"groups", "the predictor is a label, even where it holds numbers"},
                                 {"paired", "the two columns are readings on the same units, row by row"},
                                 {"relationship", "two continuous variables"},
                                 {"trend", "the predictor is sampling time"},
                                 {"blocks", "groups within blocks given by structure"},
                                 {"nested", "subsamples within the units given by structure"}}};
    return t;
}

// ---- Outputs -------------------------------------------------------------------------------------

// The shared outputs (FUNCTIONS.md, "Outputs"). Functions rather than constants: a family file's
// declarations read these tables while the program starts, before this file's constants would be.
namespace {
Keyword p_() { return {"p", "the p-value"}; }
Keyword statistic_() { return {"statistic", "the test statistic"}; }
Keyword df_() { return {"df", "degrees of freedom (the first for F)"}; }
Keyword df2_() { return {"df2", "the second degrees of freedom of F"}; }
Keyword n_() { return {"n", "observations used"}; }
Keyword estimate_() { return {"estimate", "the effect on the data's scale"}; }
Keyword ci_low_() { return {"ci-low", "lower confidence limit of the estimate"}; }
Keyword ci_high_() { return {"ci-high", "upper confidence limit of the estimate"}; }
Keyword effect_() { return {"effect", "the standardized effect size"}; }
Keyword table_() { return {"table", "the whole result as an array"}; }
Keyword report_() { return {"report", "one sentence"}; }
}  // namespace

const KeywordTable& test_outputs() {
    static const KeywordTable t{"test outputs",
                                {p_(), statistic_(), df_(), df2_(), n_(), estimate_(), ci_low_(), ci_high_(), effect_(), table_(), report_()}};
    return t;
}

const KeywordTable& normality_outputs() {
    static const KeywordTable t{"normality outputs", {p_(), statistic_(), df_(), n_(), table_(), report_()}};
    return t;
}

const KeywordTable& variance_outputs() {
    static const KeywordTable t{"spread outputs", {p_(), statistic_(), df_(), df2_(), n_(), table_(), report_()}};
    return t;
}

const KeywordTable& correlation_outputs() {
    static const KeywordTable t{"correlation outputs",
                                {p_(), statistic_(), df_(), n_(), {"estimate", "the coefficient"}, ci_low_(), ci_high_(), table_(), report_()}};
    return t;
}

const KeywordTable& count_outputs() {
    static const KeywordTable t{"count outputs", {p_(), statistic_(), df_(), n_(), effect_(), table_(), report_()}};
    return t;
}

const KeywordTable& expected_outputs() {
    static const KeywordTable t{"goodness-of-fit outputs", {p_(), statistic_(), df_(), n_(), table_(), report_()}};
    return t;
}

const KeywordTable& linear_outputs() {
    static const KeywordTable t{"linear model outputs",
                                {{"coefficients", "the coefficient table"},
                                 {"model", "the model table"},
                                 {"r-squared", "R², 0 to 1"},
                                 {"p", "the overall F test's p"},
                                 {"slope", "the slope, one predictor only"},
                                 {"intercept", "the intercept, one predictor only"},
                                 {"residual-sd", "the residual standard deviation"},
                                 report_()}};
    return t;
}

const KeywordTable& logistic_outputs() {
    static const KeywordTable t{"logistic model outputs",
                                {{"coefficients", "the coefficient table with odds ratios"}, {"model", "the model table"}}};
    return t;
}

const KeywordTable& point_outputs() {
    static const KeywordTable t{"per-row outputs",
                                {{"fitted", "fitted value"},
                                 {"residual", "residual"},
                                 {"standardized", "internally studentized residual"},
                                 {"studentized", "externally studentized residual"},
                                 {"leverage", "leverage"},
                                 {"cook", "Cook's distance"}}};
    return t;
}

const KeywordTable& count_model_methods() {
    static const KeywordTable t{"count model methods",
                                {{"auto", "Poisson, or the negative binomial when the Poisson fit's Pearson χ²/df exceeds 1.5"},
                                 {"poisson", "Poisson regression"},
                                 {"negative-binomial", "negative binomial (NB2), its aggregation k by maximum likelihood"}}};
    return t;
}

const KeywordTable& count_model_outputs() {
    static const KeywordTable t{"count model outputs",
                                {{"coefficients", "the coefficient table with rate ratios"}, {"model", "the model table"}}};
    return t;
}

const KeywordTable& prediction_outputs() {
    static const KeywordTable t{"prediction outputs",
                                {{"predicted", "the model's value at the row"},
                                 {"mean-ci-low", "lower confidence limit of the mean there"},
                                 {"mean-ci-high", "upper confidence limit of the mean there"},
                                 {"reading-low", "lower limit for one new reading there"},
                                 {"reading-high", "upper limit for one new reading there"}}};
    return t;
}

const KeywordTable& regression_checks() {
    static const KeywordTable t{"regression checks",
                                {{"table", "every check with its verdict"},
                                 {"normality", "Shapiro–Wilk p of the residuals"},
                                 {"spread", "Breusch–Pagan p"},
                                 {"independence", "Durbin–Watson statistic"},
                                 {"linearity", "RESET p"},
                                 {"collinearity", "largest variance inflation factor"},
                                 {"influence", "largest Cook's distance"},
                                 {"outliers", "rows with |studentized residual| > 3"}}};
    return t;
}

const KeywordTable& factorial_outputs() {
    static const KeywordTable t{"two-way ANOVA outputs",
                                {{"table", "the ANOVA table"},
                                 {"p-factor1", "p of the first factor"},
                                 {"p-factor2", "p of the second factor"},
                                 {"p-interaction", "p of the interaction"}}};
    return t;
}

const KeywordTable& advice_outputs() {
    static const KeywordTable t{"advice outputs",
                                {{"report", "a sentence with the reasons"},
                                 {"method", "the method keyword"},
                                 {"transform", "the transform keyword"},
                                 {"posthoc", "the COMPARE.POSTHOC method"},
                                 {"function", "the function name"},
                                 {"table", "each step, what was found, what it decided"}}};
    return t;
}

}  // namespace quadrat
