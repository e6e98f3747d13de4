// CHECK.VARIANCE in the core: the reference fixture (tests/reference/generate_normality.py →
// normality.json, scipy 1.10) and the catalogue's refusals and table rows.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <limits>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "core/data.hpp"
#include "core/refusal.hpp"
#include "core/variance.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& fixture() { return reference_file("normality.json"); }

Groups groups_of(const nlohmann::json& c) {
    Groups g;
    for (const auto& group : c.at("groups")) {
        g.names.push_back(group.at("name"));
        g.values.push_back(group.at("values").get<std::vector<double>>());
        g.n_used += g.values.back().size();
    }
    return g;
}

Groups make_groups(std::vector<std::string> names, std::vector<std::vector<double>> values) {
    Groups g;
    g.names = std::move(names);
    g.values = std::move(values);
    for (const auto& v : g.values) g.n_used += v.size();
    return g;
}

// scipy 1.10 levene(center='median'), levene(center='mean'), bartlett, fligner(center='median') and
// the F distribution (generate_normality.py): the same closed forms, 1e-9 relative.
TEST(CheckVariance, MatchesScipy) {
    const std::vector<std::pair<std::string, std::string>> methods = {
        {"brown-forsythe", "brown_forsythe"}, {"levene", "levene"}, {"bartlett", "bartlett"}, {"fligner", "fligner"}};
    for (const auto& c : fixture().at("variance")) {
        const Groups g = groups_of(c);
        for (const auto& [method, key] : methods) {
            const TestResult r = check_variance(g, method);
            const auto& ref = c.at(key);
            const double statistic = ref.contains("F") ? ref["F"] : ref.contains("T") ? ref["T"] : ref["X2"];
            EXPECT_LT(relative_error(r.number("statistic"), statistic), 1e-9) << c["name"] << " " << method;
            EXPECT_LT(relative_error(r.number("p"), ref["p"]), 1e-9) << c["name"] << " " << method;
        }
        const auto variances = c["variances"].get<std::vector<double>>();
        const TestResult r = check_variance(g, "");
        for (std::size_t i = 0; i < g.names.size(); ++i)
            EXPECT_LT(relative_error(r.number(g.names[i] + ": variance"), variances[i]), 1e-12) << c["name"];
        EXPECT_LT(relative_error(r.number("variance ratio"),
                                 *std::max_element(variances.begin(), variances.end()) /
                                     *std::min_element(variances.begin(), variances.end())),
                  1e-12);
        if (c.contains("f_ratio")) {
            const TestResult f = check_variance(g, "f-ratio");
            EXPECT_LT(relative_error(f.number("statistic"), c["f_ratio"]["F"]), 1e-12);
            EXPECT_EQ(f.number("df"), c["f_ratio"]["df1"].get<double>());
            EXPECT_EQ(f.number("df2"), c["f_ratio"]["df2"].get<double>());
            EXPECT_LT(relative_error(f.number("p"), c["f_ratio"]["p"]), 1e-9);
        }
    }
}

TEST(CheckVariance, TableRowsInCatalogueOrder) {
    const Groups g = make_groups({"high", "low"}, {{4.1, 5.2, 3.9, 6.0}, {2.2, 2.4, 2.1, 2.6, 2.3}});
    const Table t = check_variance(g, "levene").table();
    std::vector<std::string> labels;
    for (const auto& row : t) labels.push_back(std::get<std::string>(row[0]));
    EXPECT_EQ(labels, (std::vector<std::string>{"quantity", "test", "statistic", "df", "df2", "p", "n", "n dropped", "high: n",
                                                 "high: variance", "low: n", "low: variance", "variance ratio"}));
}

TEST(CheckVariance, Refusals) {
    const Groups three = make_groups({"high", "low", "mid"}, {{1, 2, 3}, {2, 4, 7}, {1, 5, 6}});
    EXPECT_EQ(refusal_text([&] { check_variance(three, "f-ratio"); }),
              "groups has 3 labels (high, low, mid); method 'f-ratio' compares exactly 2");
    const Groups one = make_groups({"marsh"}, {{1, 2, 3}});
    EXPECT_EQ(refusal_text([&] { check_variance(one, ""); }), "groups has 1 label (marsh); comparing spreads needs 2 or more groups");
    const Groups small = make_groups({"a", "b"}, {{1, 2, 3}, {4}});
    EXPECT_EQ(refusal_text([&] { check_variance(small, ""); }), "group 'b' has 1 value; each group needs at least 2");
    const Groups flat = make_groups({"a", "b"}, {{3, 3, 3}, {5, 5}});
    for (const std::string& m : variance_methods().list())
        EXPECT_EQ(refusal_text([&] { check_variance(flat, m); }), "the values are equal within every group: no spread to compare") << m;
    const Groups one_flat = make_groups({"a", "b"}, {{3, 3, 3}, {5, 6, 8}});
    EXPECT_EQ(refusal_text([&] { check_variance(one_flat, "bartlett"); }),
              "group 'a' has zero spread (all values equal), so bartlett (which takes logarithms of the variances) is undefined; try brown-forsythe");
    EXPECT_EQ(refusal_text([&] { check_variance(one_flat, "f-ratio"); }),
              "group 'a' has zero spread (all values equal), so the variance ratio is undefined");
    // Brown–Forsythe answers; the variance ratio row says why it has no number.
    const TestResult bf = check_variance(one_flat, "brown-forsythe");
    EXPECT_TRUE(std::isfinite(bf.number("p")));
    EXPECT_EQ(std::get<std::string>(*bf.find("variance ratio")), "undefined: group 'a' has zero variance");
    // Groups of two: deviations from the median are constant within each group.
    const Groups pairs = make_groups({"a", "b"}, {{1, 3}, {5, 9}});
    EXPECT_NE(refusal_text([&] { check_variance(pairs, "brown-forsythe"); }).find("groups of 2"), std::string::npos);
    EXPECT_TRUE(std::isfinite(check_variance(pairs, "f-ratio").number("p")));
    // The same with decimals, where |x − median| differs in the last bits within a group: still a
    // refusal, not p ≈ 1e-28 from a within-group sum of squares made of rounding errors.
    const Groups decimal_pairs = make_groups({"a", "b"}, {{4.1, 4.6}, {5.3, 5.9}});
    for (const std::string m : {"brown-forsythe", "levene"})
        EXPECT_NE(refusal_text([&] { check_variance(decimal_pairs, m); }).find("groups of 2"), std::string::npos) << m;
}

// A 1e300 among ordinary readings: numbers, not NaN (common practice, no source). The outlier's
// group variance is beyond the largest double and says so; the other groups keep their own
// variances (to 1e-12 relative against the same group alone); the tests still answer.
TEST(CheckVariance, HugeOutlierDoesNotOverflow) {
    const Groups g = make_groups({"a", "b", "c"}, {{1.2, 1.5, 1.1, 1.9, 1e300}, {2.2, 2.0, 2.9, 2.4}, {0.9, 1.4, 1.3, 1.0}});
    for (const std::string m : {"brown-forsythe", "levene", "bartlett", "fligner"}) {
        const TestResult r = check_variance(g, m);
        EXPECT_TRUE(std::isfinite(r.number("statistic"))) << m;
        EXPECT_TRUE(std::isfinite(r.number("p"))) << m;
    }
    const TestResult r = check_variance(g, "bartlett");
    EXPECT_LT(r.number("p"), 1e-6);
    EXPECT_TRUE(std::holds_alternative<std::string>(*r.find("a: variance")));
    const Groups bc = make_groups({"b", "c"}, {g.values[1], g.values[2]});
    EXPECT_LT(relative_error(r.number("b: variance"), check_variance(bc, "").number("b: variance")), 1e-12);
}

// Groups a few denormals apart answer as the same groups scaled up (scale invariance, common
// practice, no source; 1e-9 relative).
TEST(CheckVariance, DenormalsKeepTheirSpread) {
    const double tiny = std::numeric_limits<double>::denorm_min();
    const Groups small = make_groups({"a", "b"}, {{0, tiny, 3 * tiny, 4 * tiny}, {0, 8 * tiny, 2 * tiny, 16 * tiny, 5 * tiny}});
    const Groups plain = make_groups({"a", "b"}, {{0, 1, 3, 4}, {0, 8, 2, 16, 5}});
    for (const std::string& m : variance_methods().list())
        EXPECT_LT(relative_error(check_variance(small, m).number("p"), check_variance(plain, m).number("p")), 1e-9) << m;
}

// Ties in whole-centimetre lengths are in the fixture ("fish lengths with ties"); 5000 values in
// two groups run in O(n log n) (common practice, no source: equal spreads are not rejected at 1e-3).
TEST(CheckVariance, FiveThousandValues) {
    std::vector<double> a, b;
    for (int i = 0; i < 2500; ++i) {
        a.push_back(std::sin(i * 0.7) * 3);
        b.push_back(std::cos(i * 1.3) * 3);
    }
    const Groups g = make_groups({"a", "b"}, {a, b});
    for (const std::string& m : variance_methods().list()) EXPECT_GT(check_variance(g, m).number("p"), 1e-3) << m;
}

}  // namespace
}  // namespace quadrat
