// COMPARE.POSTHOC: Tukey–Kramer, Games–Howell, Dunn, pairwise Welch t and pairwise rank-sum tests.
#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <nlohmann/json.hpp>

#include "addin/registry.hpp"
#include "core/data.hpp"
#include "core/posthoc.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

namespace quadrat {
namespace {

const nlohmann::json& cases() { return test_support::reference_file("posthoc.json")["posthoc"]; }

// Long format: one value column and one label column, in group order.
Groups groups_of(const nlohmann::json& c) {
    std::vector<double> values;
    std::vector<std::string> labels;
    const auto names = c["names"].get<std::vector<std::string>>();
    const auto data = c["values"].get<std::vector<std::vector<double>>>();
    for (std::size_t g = 0; g < names.size(); ++g)
        for (double x : data[g]) {
            values.push_back(x);
            labels.push_back(names[g]);
        }
    return read_groups(Range::column(values), Range::text_column(labels));
}

double number(const CellValue& v) { return std::get<double>(v); }

// Compares every pair with the reference rows: relative tolerance `tol` on each listed field.
void expect_rows(const PosthocResult& r, const nlohmann::json& rows, double tol, bool with_interval,
                 const std::string& what) {
    ASSERT_EQ(r.pairs.size(), rows.size()) << what;
    for (std::size_t i = 0; i < rows.size(); ++i) {
        const auto& e = rows[i];
        const auto& c = r.pairs[i];
        auto near = [&](double got, const nlohmann::json& expected, const char* field) {
            const double x = expected.get<double>();
            EXPECT_NEAR(got, x, tol * std::max(1.0, std::abs(x))) << what << " pair " << i << " " << field;
        };
        if (e.contains("estimate")) near(c.estimate, e["estimate"], "estimate");
        if (with_interval) {
            near(number(c.ci_low), e["ci_low"], "ci-low");
            near(number(c.ci_high), e["ci_high"], "ci-high");
        }
        near(c.statistic, e["statistic"], "statistic");
        // p relative to itself: p-values are compared to their own digits.
        EXPECT_NEAR(c.p, e["p"].get<double>(), tol * e["p"].get<double>() + 1e-13) << what << " pair " << i << " p";
        if (e.contains("adjusted_p")) {
            EXPECT_NEAR(c.adjusted_p, e["adjusted_p"].get<double>(), tol * e["adjusted_p"].get<double>() + 1e-13)
                << what << " pair " << i << " adjusted p";
        }
    }
}

// Tukey–Kramer (Tukey 1953; Kramer 1956, Biometrics 12, 307–310) against the published formula with
// scipy.stats.studentized_range 1.10 and against statsmodels 0.13 pairwise_tukeyhsd (generator
// tests/reference/generate_posthoc.py), on invented data with unequal n, ties, 2 groups, n = 2 per
// group and 20 groups. Tolerance 1e-6 relative: the studentized range's p and quantile, both ours
// and SciPy's, are good to about 1e-9, and SciPy's ppf root-finding to about 1e-7.
TEST(Posthoc, TukeyKramerAgreesWithScipyAndStatsmodels) {
    for (const auto& c : cases()) {
        const PosthocResult r = compare_posthoc(groups_of(c), PosthocMethod::tukey, std::nullopt, Transform::none, 0.95);
        expect_rows(r, c["tukey"], 1e-6, true, c["name"].get<std::string>() + " tukey");
        const auto& sm = c["tukey_statsmodels"];
        for (std::size_t i = 0; i < r.pairs.size(); ++i) {
            EXPECT_NEAR(r.pairs[i].estimate, sm[i]["estimate"].get<double>(), 1e-12 * std::max(1.0, std::abs(r.pairs[i].estimate)));
            EXPECT_NEAR(number(r.pairs[i].ci_low), sm[i]["ci_low"].get<double>(), 1e-6 * std::max(1.0, std::abs(number(r.pairs[i].ci_low))));
            EXPECT_NEAR(r.pairs[i].p, sm[i]["p"].get<double>(), 1e-6 * sm[i]["p"].get<double>() + 1e-13);
            // Family-adjusted already: the p is shown twice.
            EXPECT_EQ(r.pairs[i].adjusted_p, r.pairs[i].p);
        }
    }
}

// Games–Howell (Games & Howell 1976, J. Educ. Stat. 1, 113–125) computed in the generator from the
// published formula with SciPy's studentized range (no library has it). Tolerance 1e-6 as above.
TEST(Posthoc, GamesHowellAgreesWithPublishedFormula) {
    for (const auto& c : cases()) {
        if (!c.contains("games-howell")) continue;
        const PosthocResult r =
            compare_posthoc(groups_of(c), PosthocMethod::games_howell, std::nullopt, Transform::none, 0.95);
        expect_rows(r, c["games-howell"], 1e-6, true, c["name"].get<std::string>() + " games-howell");
    }
}

// Dunn (1964, Technometrics 6, 241–252), tie-corrected, computed in the generator from the published
// formula with scipy.stats.rankdata and norm; Holm by statsmodels multipletests. Closed form:
// tolerance 1e-10 relative.
TEST(Posthoc, DunnAgreesWithPublishedFormula) {
    for (const auto& c : cases()) {
        if (!c.contains("dunn")) continue;
        const PosthocResult r = compare_posthoc(groups_of(c), PosthocMethod::dunn, std::nullopt, Transform::none, 0.95);
        expect_rows(r, c["dunn"], 1e-10, true, c["name"].get<std::string>() + " dunn");
    }
}

// Pairwise Welch t (scipy.stats.ttest_ind, equal_var=False) and pairwise rank-sum tests
// (scipy.stats.mannwhitneyu, exact without ties, else asymptotic with continuity correction), Holm by
// multipletests. Tolerance 1e-9 relative (the t distribution and the exact U counts are exact to
// rounding; SciPy's asymptotic p is a closed form).
TEST(Posthoc, PairwiseTestsAgreeWithScipy) {
    for (const auto& c : cases()) {
        if (!c.contains("pairwise-t")) continue;
        const Groups g = groups_of(c);
        expect_rows(compare_posthoc(g, PosthocMethod::pairwise_t, std::nullopt, Transform::none, 0.95), c["pairwise-t"], 1e-9,
                    false, c["name"].get<std::string>() + " pairwise-t");
        expect_rows(compare_posthoc(g, PosthocMethod::pairwise_ranks, std::nullopt, Transform::none, 0.95),
                    c["pairwise-ranks"], 1e-9, false, c["name"].get<std::string>() + " pairwise-ranks");
    }
}

// log transform: Tukey–Kramer on ln x in the generator, estimate and limits exponentiated (ratios of
// geometric means, first ÷ second). Tolerance 1e-6 relative as for Tukey.
TEST(Posthoc, LogTransformGivesRatios) {
    for (const auto& c : cases()) {
        if (!c.contains("tukey_log")) continue;
        const PosthocResult r = compare_posthoc(groups_of(c), PosthocMethod::tukey, std::nullopt, Transform::log, 0.95);
        expect_rows(r, c["tukey_log"], 1e-6, true, "positive tukey log");
        for (const auto& p : r.pairs) EXPECT_GT(p.estimate, 0.0);
    }
}

// Common practice, no source: the table's shape and order, and the adjustment choice.
TEST(Posthoc, TableShapeOrderAndAdjustment) {
    const Groups g = read_groups(Range::column({1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12}),
                                 Range::text_column({"b", "b", "b", "a", "a", "a", "c", "c", "c", "d", "d", "d"}));
    const PosthocResult r = compare_posthoc(g, PosthocMethod::dunn, Adjustment::bonferroni, Transform::none, 0.95);
    const Table t = r.table();
    ASSERT_EQ(t.size(), 4u * 3u / 2u + 1u);
    ASSERT_EQ(t[0].size(), 9u);
    EXPECT_EQ(std::get<std::string>(t[0][7]), "adjusted p");
    EXPECT_EQ(std::get<std::string>(t[1][0]), "b");  // group order: first appearance
    EXPECT_EQ(std::get<std::string>(t[1][1]), "a");
    EXPECT_EQ(std::get<std::string>(t[3][1]), "d");
    EXPECT_EQ(std::get<std::string>(t[4][0]), "a");
    EXPECT_EQ(std::get<std::string>(t[4][1]), "c");
    // Bonferroni: 6 pairs; tolerance 1e-15 (one multiplication).
    for (const auto& p : r.pairs) EXPECT_NEAR(p.adjusted_p, std::min(1.0, 6 * p.p), 1e-15);
    // b vs d: mean ranks 2 and 11 → z negative, first minus second.
    EXPECT_LT(r.pairs[2].statistic, 0.0);
    EXPECT_EQ(std::get<std::string>(t[3][8]), r.pairs[2].adjusted_p < 0.05 ? "yes" : "no");
}

// Common practice, no source: refusals at the top, each with its reason.
TEST(Posthoc, Refusals) {
    const Groups one = read_groups(Range::column({1, 2, 3}), Range::text_column({"a", "a", "a"}));
    EXPECT_THROW(compare_posthoc(one, PosthocMethod::tukey, std::nullopt, Transform::none, 0.95), Refusal);
    // Games–Howell: two groups with no spread cannot be compared; one of them may be flat.
    const Groups flat = read_groups(Range::column({2, 2, 2, 3, 3, 3, 1, 4, 6}),
                                    Range::text_column({"a", "a", "a", "b", "b", "b", "c", "c", "c"}));
    EXPECT_THROW(compare_posthoc(flat, PosthocMethod::games_howell, std::nullopt, Transform::none, 0.95), Refusal);
    const Groups one_flat = read_groups(Range::column({2, 2, 2, 3, 5, 4, 1, 4, 6}),
                                        Range::text_column({"a", "a", "a", "b", "b", "b", "c", "c", "c"}));
    const PosthocResult gh = compare_posthoc(one_flat, PosthocMethod::games_howell, std::nullopt, Transform::none, 0.95);
    // With 'a' flat, the a–b df is nb − 1 = 2 (Welch–Satterthwaite with one variance zero).
    EXPECT_TRUE(std::isfinite(gh.pairs[0].p));
    // Tukey with no spread in any group.
    const Groups no_spread = read_groups(Range::column({2, 2, 3, 3}), Range::text_column({"a", "a", "b", "b"}));
    EXPECT_THROW(compare_posthoc(no_spread, PosthocMethod::tukey, std::nullopt, Transform::none, 0.95), Refusal);
    // A single value per group: Games–Howell and the pairwise tests need two.
    const Groups singles = read_groups(Range::column({1, 2, 3, 4}), Range::text_column({"a", "b", "c", "c"}));
    EXPECT_THROW(compare_posthoc(singles, PosthocMethod::games_howell, std::nullopt, Transform::none, 0.95), Refusal);
    EXPECT_THROW(compare_posthoc(singles, PosthocMethod::pairwise_t, std::nullopt, Transform::none, 0.95), Refusal);
    // All values equal: no ranks to compare.
    const Groups equal = read_groups(Range::column({5, 5, 5, 5}), Range::text_column({"a", "a", "b", "b"}));
    EXPECT_THROW(compare_posthoc(equal, PosthocMethod::dunn, std::nullopt, Transform::none, 0.95), Refusal);
    EXPECT_THROW(parse_posthoc_method("scheffe"), Refusal);
}

// A group whose cells are all missing does not exist as a group (data layer): three groups remain.
TEST(PosthocCells, EmptyGroupIsNoGroupAndTableIsFixedSize) {
    const auto* f = addin::find_function("comparePosthoc");
    ASSERT_NE(f, nullptr);
    Range values = Range::column({1.1, 1.3, 1.2, 0, 0, 2.2, 2.5, 2.1, 3.3, 3.0, 3.4});
    values.cells[3] = Cell::make_text("n/a");
    values.cells[4] = Cell{};
    const Range labels = Range::text_column({"a", "a", "a", "gone", "gone", "b", "b", "b", "c", "c", "c"});
    const Table t = addin::call_fenced(*f, {values, labels, Range::omitted_argument(), Range::omitted_argument(),
                                            Range::omitted_argument(), Range::omitted_argument()});
    ASSERT_EQ(t.size(), 4u);
    for (const auto& row : t) EXPECT_EQ(row.size(), 9u);
    // Unknown adjust keyword is a refusal even for tukey.
    const Table bad = addin::call_fenced(*f, {values, labels, Range::omitted_argument(),
                                              Range::scalar(Cell::make_text("fdr")), Range::omitted_argument(),
                                              Range::omitted_argument()});
    ASSERT_EQ(bad.size(), 1u);
    EXPECT_TRUE(std::holds_alternative<std::string>(bad[0][0]));
}

// Common practice, no source: multiplying the data by 1e200 multiplies estimates and limits by 1e200
// and leaves q and p alone (sums of squares are scaled by a power of two first). Tolerance 1e-12.
TEST(Posthoc, HugeValuesKeepTheirDigits) {
    const std::vector<double> x = {1.1, 1.3, 1.2, 2.2, 2.5, 2.1, 3.3, 3.0, 3.4};
    std::vector<double> big;
    for (double v : x) big.push_back(v * 1e200);
    const Range labels = Range::text_column({"a", "a", "a", "b", "b", "b", "c", "c", "c"});
    for (PosthocMethod m : {PosthocMethod::tukey, PosthocMethod::games_howell}) {
        const PosthocResult small = compare_posthoc(read_groups(Range::column(x), labels), m, std::nullopt, Transform::none, 0.95);
        const PosthocResult large = compare_posthoc(read_groups(Range::column(big), labels), m, std::nullopt, Transform::none, 0.95);
        for (std::size_t i = 0; i < small.pairs.size(); ++i) {
            EXPECT_NEAR(large.pairs[i].estimate / 1e200, small.pairs[i].estimate, 1e-12);
            EXPECT_NEAR(number(large.pairs[i].ci_high) / 1e200, number(small.pairs[i].ci_high), 1e-12);
            EXPECT_NEAR(large.pairs[i].p, small.pairs[i].p, 1e-12);
        }
    }
}

// Bounded time: 20 groups with Games–Howell (190 pairs, each with its own df and quantile).
TEST(Posthoc, TwentyGroupsGamesHowellIsBounded) {
    std::vector<double> values;
    std::vector<std::string> labels;
    for (int g = 0; g < 20; ++g)
        for (int i = 0; i < 4; ++i) {
            values.push_back(10.0 + 0.3 * g + 0.37 * ((i * 7 + g * 3) % 5) + 0.05 * g * i);
            labels.push_back("site " + std::to_string(g + 1));
        }
    const auto start = std::chrono::steady_clock::now();
    const PosthocResult r = compare_posthoc(read_groups(Range::column(values), Range::text_column(labels)),
                                            PosthocMethod::games_howell, std::nullopt, Transform::none, 0.95);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    EXPECT_EQ(r.pairs.size(), 190u);
    std::printf("games-howell, 20 groups: %.2f s\n", seconds);
}

}  // namespace
}  // namespace quadrat
