// ADVISE.TEST's decision path on constructed data sets, one per branch. The data are made so
// that the deciding check is far from its threshold (p ≈ 1 or p ≪ 0.05), so each expected choice
// follows from the rule in advisor.cpp and not from the last digit of a p-value:
// - "normal" samples are normal quantiles at Blom positions (Shapiro–Wilk p close to 1);
// - "skewed" samples are exponential quantiles (Shapiro–Wilk p well below 0.05 at n = 40);
// - "log-normal" samples are exp of normal quantiles: skewed, normal after a log transform.
#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

#include <boost/math/distributions/normal.hpp>

#include "addin/registry.hpp"
#include "core/advisor.hpp"
#include "core/refusal.hpp"

namespace quadrat {
namespace {

std::vector<double> normal_sample(std::size_t n, double mean = 10, double sd = 1) {
    std::vector<double> xs;
    const boost::math::normal z;
    for (std::size_t i = 1; i <= n; ++i) xs.push_back(mean + sd * quantile(z, (i - 0.375) / (n + 0.25)));
    return xs;
}

std::vector<double> skewed_sample(std::size_t n, double shift = 0, double scale = 1) {
    std::vector<double> xs;
    for (std::size_t i = 1; i <= n; ++i) xs.push_back(shift - scale * std::log(1 - (i - 0.5) / n));
    return xs;
}

std::vector<double> log_normal_sample(std::size_t n, double log_mean, double log_sd) {
    std::vector<double> xs = normal_sample(n, log_mean, log_sd);
    for (double& x : xs) x = std::exp(x);
    return xs;
}

// Long format: every group's values one after another, labels beside them.
struct LongTable {
    Range values;
    Range labels;
};

LongTable long_table(const std::vector<std::pair<std::string, std::vector<double>>>& groups) {
    std::vector<double> v;
    std::vector<std::string> l;
    for (const auto& [name, xs] : groups)
        for (double x : xs) {
            v.push_back(x);
            l.push_back(name);
        }
    return {Range::column(v), Range::text_column(l)};
}

TEST(Advisor, TwoNormalGroupsGetWelchsTest) {
    // Two normal groups: Welch's t by the two-group rule (Ruxton 2006), whatever the spreads.
    const auto t = long_table({{"upstream", normal_sample(20, 8)}, {"downstream", normal_sample(25, 7, 3)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.function, "COMPARE.GROUPS");
    EXPECT_EQ(a.method, "welch");
    EXPECT_EQ(a.transform, "none");
    EXPECT_EQ(a.posthoc, "");
}

TEST(Advisor, ThreeNormalGroupsWithEqualSpreadGetClassicAnovaAndTukey) {
    const auto t = long_table({{"reed", normal_sample(15, 5)}, {"sedge", normal_sample(15, 6)}, {"rush", normal_sample(15, 7)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.method, "pooled");
    EXPECT_EQ(a.posthoc, "tukey");
}

TEST(Advisor, ThreeNormalGroupsWithUnequalSpreadGetWelchAndGamesHowell) {
    // Standard deviations 1, 1 and 6: Brown–Forsythe p far below 0.05.
    const auto t = long_table({{"reed", normal_sample(20, 5)}, {"sedge", normal_sample(20, 6)}, {"rush", normal_sample(20, 7, 6)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.method, "welch");
    EXPECT_EQ(a.posthoc, "games-howell");
}

TEST(Advisor, SkewedPositiveDataThatALogMendsGetTheLogTransform) {
    const auto t = long_table({{"pool", log_normal_sample(30, 1, 0.8)}, {"riffle", log_normal_sample(30, 2, 0.8)},
                               {"run", log_normal_sample(30, 1.5, 0.8)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.transform, "log");
    // Equal log-scale spreads by construction: classic ANOVA on the logs.
    EXPECT_EQ(a.method, "pooled");
    EXPECT_EQ(a.posthoc, "tukey");
}

TEST(Advisor, SkewedDataThatNoTransformMendsGetRanks) {
    // Exponential with a negative shift: not normal, and a log transform cannot take values <= 0.
    const auto t = long_table({{"a", skewed_sample(40, -1)}, {"b", skewed_sample(40, -0.5)}, {"c", skewed_sample(40, 0)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.method, "ranks");
    EXPECT_EQ(a.transform, "none");
    EXPECT_EQ(a.posthoc, "dunn");
    // Never a test whose assumption was just seen to fail.
    EXPECT_NE(a.report.find("depart from normal"), std::string::npos) << a.report;
}

TEST(Advisor, TwoSkewedGroupsGetTheRankSumTestWithoutPosthoc) {
    const auto t = long_table({{"a", skewed_sample(40, -1)}, {"b", skewed_sample(40, 0)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.method, "ranks");
    EXPECT_EQ(a.posthoc, "");
}

TEST(Advisor, NumbersCanBeGroupLabelsByDesign) {
    // Zone codes 1, 2, 3 are numbers; design 'groups' reads them as labels.
    std::vector<double> v, zones;
    for (int zone = 1; zone <= 3; ++zone)
        for (double x : normal_sample(12, 4.0 + zone)) {
            v.push_back(x);
            zones.push_back(zone);
        }
    const Advice auto_design = advise_test(Range::column(v), Range::column(zones), Design::automatic);
    EXPECT_EQ(auto_design.function, "RELATE.CORRELATION");
    const Advice by_groups = advise_test(Range::column(v), Range::column(zones), Design::groups);
    EXPECT_EQ(by_groups.function, "COMPARE.GROUPS");
}

TEST(Advisor, PairedNormalDifferencesGetThePairedT) {
    const std::vector<double> before = normal_sample(20, 10, 2);
    std::vector<double> after;
    const std::vector<double> change = normal_sample(20, 0.5, 0.3);
    for (std::size_t i = 0; i < before.size(); ++i) after.push_back(before[i] + change[(i * 7) % 20]);
    const Advice a = advise_test(Range::column(before), Range::column(after), Design::paired);
    EXPECT_EQ(a.function, "COMPARE.PAIRED");
    EXPECT_EQ(a.method, "t");
}

TEST(Advisor, PairedSkewedDifferencesGetTheSignedRankTest) {
    // Differences exponential around a negative shift: not normal; a log ratio needs positive readings,
    // which these are, but the ratio of (base + skewed change) to base is not log-normal either.
    std::vector<double> first, second;
    const std::vector<double> change = skewed_sample(40, -0.5, 3);
    for (std::size_t i = 0; i < change.size(); ++i) {
        second.push_back(-5.0 + static_cast<double>(i % 5));
        first.push_back(second.back() + change[i]);
    }
    const Advice a = advise_test(Range::column(first), Range::column(second), Design::paired);
    EXPECT_EQ(a.method, "signed-rank");
}

TEST(Advisor, OneColumnGetsAOneSampleTest) {
    const Advice normal = advise_test(Range::column(normal_sample(25)), Range::omitted_argument(), Design::automatic);
    EXPECT_EQ(normal.function, "COMPARE.PAIRED");
    EXPECT_EQ(normal.method, "t");
    const Advice skewed = advise_test(Range::column(skewed_sample(40, -1)), Range::omitted_argument(), Design::automatic);
    EXPECT_EQ(skewed.method, "signed-rank");
    const Advice log_normal = advise_test(Range::column(log_normal_sample(40, 1, 1)), Range::omitted_argument(), Design::automatic);
    EXPECT_EQ(log_normal.method, "t");
    EXPECT_EQ(log_normal.transform, "log");
}

TEST(Advisor, StraightLineWithNormalResidualsGetsPearson) {
    std::vector<double> x, y;
    const std::vector<double> noise = normal_sample(30, 0, 0.5);
    for (std::size_t i = 0; i < 30; ++i) {
        x.push_back(static_cast<double>(i));
        y.push_back(2.0 + 0.3 * static_cast<double>(i) + noise[(i * 11) % 30]);
    }
    const Advice a = advise_test(Range::column(y), Range::column(x), Design::automatic);
    EXPECT_EQ(a.function, "RELATE.CORRELATION");
    EXPECT_EQ(a.method, "pearson");
}

TEST(Advisor, CurvedRelationshipGetsSpearman) {
    std::vector<double> x, y;
    for (std::size_t i = 1; i <= 30; ++i) {
        x.push_back(static_cast<double>(i));
        y.push_back(std::exp(0.25 * static_cast<double>(i)) + 0.01 * static_cast<double>(i % 3));
    }
    const Advice a = advise_test(Range::column(y), Range::column(x), Design::relationship);
    EXPECT_EQ(a.method, "spearman");
}

TEST(Advisor, CountsFollowCochransRule) {
    // 200 observations over a 2×2 table: every expected count is 50 → chi-square.
    std::vector<std::string> habitat, present;
    for (int i = 0; i < 200; ++i) {
        habitat.push_back(i % 2 ? "reed" : "open water");
        present.push_back((i / 2) % 2 ? "yes" : "no");
    }
    const Advice large = advise_test(Range::text_column(present), Range::text_column(habitat), Design::automatic);
    EXPECT_EQ(large.function, "COMPARE.COUNTS");
    EXPECT_EQ(large.method, "chi-square");
    // 12 observations: expected counts of 3 in every cell → Fisher's exact test.
    habitat.resize(12);
    present.resize(12);
    const Advice small = advise_test(Range::text_column(present), Range::text_column(habitat), Design::automatic);
    EXPECT_EQ(small.method, "fisher");
}

TEST(Advisor, BinaryResponseWithAMeasurementGetsLogisticRegression) {
    std::vector<std::string> present;
    std::vector<double> depth;
    for (int i = 0; i < 60; ++i) {
        depth.push_back(i * 0.5);
        present.push_back((i * 37) % 60 < i ? "present" : "absent");
    }
    const Advice a = advise_test(Range::text_column(present), Range::column(depth), Design::automatic);
    EXPECT_EQ(a.function, "FIT.LOGISTIC");
    EXPECT_EQ(a.method, "");
}

TEST(Advisor, LabelsExplainedByAMeasurementSwapRoles) {
    const auto t = long_table({{"bog", normal_sample(15, 3)}, {"fen", normal_sample(15, 5)}, {"marsh", normal_sample(15, 7)}});
    const Advice a = advise_test(t.labels, t.values, Design::automatic);
    EXPECT_EQ(a.function, "COMPARE.GROUPS");
    EXPECT_EQ(a.steps.front().step, "roles");
}

TEST(Advisor, LargeSamplesSkipShapiroWilkAndSaySo) {
    const auto t = long_table({{"a", skewed_sample(3000, 1)}, {"b", skewed_sample(3000, 1.2)}});
    const Advice a = advise_test(t.values, t.labels, Design::automatic);
    EXPECT_EQ(a.method, "welch");
    EXPECT_NE(a.report.find("central limit theorem"), std::string::npos) << a.report;
}

// ---------------------------------------------------------------- revision 2: trend, blocks, nested,
// detection limits, and the wording rule

TEST(Advisor, TrendDesignPointsToTrackTrend) {
    std::vector<double> years, values;
    for (int i = 0; i < 12; ++i) {
        years.push_back(2010 + i);
        values.push_back(normal_sample(12)[static_cast<std::size_t>((i * 5) % 12)]);
    }
    const Advice a = advise_test(Range::column(values), Range::column(years), Design::trend);
    EXPECT_EQ(a.function, "TRACK.TREND");
    EXPECT_EQ(a.method, "");
    EXPECT_EQ(a.posthoc, "");
    EXPECT_NE(a.report.find("12 distinct times"), std::string::npos) << a.report;
    // Times must be numbers (dates are numbers in a sheet).
    EXPECT_THROW(advise_test(Range::column(values), Range::text_column(std::vector<std::string>(12, "spring")), Design::trend),
                 Refusal);
}

// Three treatments on eight transects: a block effect far larger than the treatment effect, and
// residuals from normal quantiles (p close to 1) or from exponential ones (p ≪ 0.05).
struct BlockSheet {
    Range values, groups, blocks;
};
BlockSheet block_sheet(const std::vector<double>& noise) {
    std::vector<double> v;
    std::vector<std::string> g, b;
    const char* treatment[] = {"control", "low", "high"};
    for (std::size_t block = 0; block < 8; ++block)
        for (std::size_t t = 0; t < 3; ++t) {
            v.push_back(10.0 * static_cast<double>(block) + static_cast<double>(t) + noise[block * 3 + t]);
            g.push_back(treatment[t]);
            b.push_back("transect " + std::to_string(block + 1));
        }
    return {Range::column(v), Range::text_column(g), Range::text_column(b)};
}

TEST(Advisor, StructureGivesBlocksByDefault) {
    const BlockSheet s = block_sheet(normal_sample(24, 0, 0.3));
    const Advice a = advise_test(s.values, s.groups, Design::automatic, s.blocks);
    EXPECT_EQ(a.function, "COMPARE.BLOCKS");
    EXPECT_EQ(a.method, "pooled");
    EXPECT_EQ(a.posthoc, "");
    EXPECT_NE(a.report.find("8 complete blocks"), std::string::npos) << a.report;
    const BlockSheet skewed = block_sheet(skewed_sample(24, 0, 3));
    EXPECT_EQ(advise_test(skewed.values, skewed.groups, Design::blocks, skewed.blocks).method, "ranks");
    // blocks without structure, and structure with another design, are refused.
    EXPECT_THROW(advise_test(s.values, s.groups, Design::blocks), Refusal);
    EXPECT_THROW(advise_test(s.values, s.groups, Design::groups, s.blocks), Refusal);
}

TEST(Advisor, NestedDesignComparesUnitsNotSubsamples) {
    // Two zones, four plots each, three cores per plot.
    std::vector<double> v;
    std::vector<std::string> zone, plot;
    const std::vector<double> plot_effect = normal_sample(8, 0, 1);
    for (std::size_t p = 0; p < 8; ++p)
        for (std::size_t core = 0; core < 3; ++core) {
            v.push_back(20 + (p < 4 ? 0 : 2) + plot_effect[(p * 3) % 8] + 0.1 * static_cast<double>(core));
            zone.push_back(p < 4 ? "upper" : "lower");
            plot.push_back("plot " + std::to_string(p + 1));
        }
    const Advice a = advise_test(Range::column(v), Range::text_column(zone), Design::nested, Range::text_column(plot));
    EXPECT_EQ(a.function, "COMPARE.NESTED");
    EXPECT_NE(a.report.find("8 sampling units"), std::string::npos) << a.report;
    EXPECT_NE(a.report.find("averaged first"), std::string::npos) << a.report;
    // A plot holding both zones is not nested.
    std::vector<std::string> crossed = plot;
    crossed[0] = "plot 8";
    EXPECT_THROW(advise_test(Range::column(v), Range::text_column(zone), Design::nested, Range::text_column(crossed)), Refusal);
}

TEST(Advisor, DetectionLimitsPointToTheCensoredFunctions) {
    // Invented: zinc (mg/L) at two outfalls, 3 of 12 readings below the 0.5 limit.
    Range zinc = Range::column({0.8, 1.2, 0.9, 0, 1.5, 0.7, 2.1, 0, 1.1, 0, 0.6, 1.9});
    zinc.cells[3] = Cell::make_text("<0.5");
    zinc.cells[7] = Cell::make_text("< 0.5");
    zinc.cells[9] = Cell::make_text("<0,5");
    const Range outfall = Range::text_column({"east", "east", "east", "east", "east", "east", "west", "west", "west", "west",
                                              "west", "west"});
    const Advice grouped = advise_test(zinc, outfall, Design::automatic);
    EXPECT_EQ(grouped.function, "COMPARE.CENSORED");
    EXPECT_EQ(grouped.method, "peto-prentice");
    // The share censored, 3 of 12 = 25%, is in the reason.
    EXPECT_NE(grouped.report.find("3 of 12 values (25%)"), std::string::npos) << grouped.report;
    const Advice alone = advise_test(zinc, Range::omitted_argument(), Design::automatic);
    EXPECT_EQ(alone.function, "DESCRIBE.CENSORED");
    // A non-detect without its limit is refused with a request for the limit (FUNCTIONS.md, Missing
    // data: "<DL" is never dropped as missing).
    Range unlimited = zinc;
    unlimited.cells[3] = Cell::make_text("<DL");
    try {
        advise_test(unlimited, outfall, Design::automatic);
        ADD_FAILURE() << "no refusal";
    } catch (const Refusal& r) {
        EXPECT_EQ(std::string(r.what()), "A4 holds <DL: write the detection limit as <0.5");
    }
    // A text that is no limit ("dry") is missing, not censored.
    Range other = zinc;
    other.cells[3] = Cell::make_number(0.3);
    other.cells[7] = Cell::make_text("dry");
    other.cells[9] = Cell::make_number(0.4);
    EXPECT_EQ(advise_test(other, outfall, Design::automatic).function, "COMPARE.GROUPS");
}

// FUNCTIONS.md, "Wording": a check that finds nothing is never shown as proof of the opposite.
TEST(Advisor, NoTextClaimsWhatACheckDidNotFind) {
    const std::vector<std::string> forbidden = {"look normal", "are normal", "is normal", "similar", "valid", "are equal",
                                                "is linear", "describes it", "but they do"};
    std::vector<Advice> advice;
    const auto two = long_table({{"upstream", normal_sample(20, 8)}, {"downstream", normal_sample(25, 7, 3)}});
    advice.push_back(advise_test(two.values, two.labels, Design::automatic));
    const auto three = long_table({{"a", normal_sample(20, 8)}, {"b", normal_sample(20, 9)}, {"c", normal_sample(20, 10)}});
    advice.push_back(advise_test(three.values, three.labels, Design::automatic));
    const auto logs = long_table({{"pool", log_normal_sample(30, 1, 0.8)}, {"run", log_normal_sample(30, 1.5, 0.8)}});
    advice.push_back(advise_test(logs.values, logs.labels, Design::automatic));
    std::vector<double> x, y;
    for (int i = 0; i < 30; ++i) {
        x.push_back(i);
        y.push_back(2 * i + normal_sample(30)[static_cast<std::size_t>((i * 7) % 30)]);
    }
    advice.push_back(advise_test(Range::column(y), Range::column(x), Design::relationship));
    advice.push_back(advise_test(Range::column(normal_sample(25)), Range::omitted_argument(), Design::automatic));
    for (const Advice& a : advice) {
        std::string all = a.report;
        for (const auto& row : a.table())
            for (const auto& cell : row)
                if (const auto* text = std::get_if<std::string>(&cell)) all += " | " + *text;
        for (const auto& phrase : forbidden) EXPECT_EQ(all.find(phrase), std::string::npos) << phrase << " in: " << all;
    }
    // The log-transform step says both findings in order, without the broken "but they do".
    EXPECT_NE(advice[2].report.find("after a log transform, no clear sign of non-normality"), std::string::npos)
        << advice[2].report;
}

TEST(Advisor, PosthocGoesWithTheMethod) {
    const auto equal = long_table({{"a", normal_sample(20, 8)}, {"b", normal_sample(20, 9)}, {"c", normal_sample(20, 10)}});
    EXPECT_EQ(advise_test(equal.values, equal.labels, Design::automatic).posthoc, "tukey");
    const auto unequal = long_table({{"a", normal_sample(20, 8, 1)}, {"b", normal_sample(20, 9, 4)}, {"c", normal_sample(20, 10, 9)}});
    const Advice welch = advise_test(unequal.values, unequal.labels, Design::automatic);
    EXPECT_EQ(welch.method, "welch");
    EXPECT_EQ(welch.posthoc, "games-howell");
}

TEST(Advisor, RefusesWhatItCannotAdvise) {
    const Range one_group = Range::text_column({"a", "a", "a"});
    EXPECT_THROW(advise_test(Range::column({1, 2, 3}), one_group, Design::automatic), Refusal);
    EXPECT_THROW(advise_test(Range::text_column({"x", "y", "x"}), Range::omitted_argument(), Design::automatic), Refusal);
    EXPECT_THROW(advise_test(Range::column({1, 2, 3}), Range::omitted_argument(), Design::paired), Refusal);
    const auto t = long_table({{"a", {1.0, 2.0, 3.0}}, {"b", {4.0}}});
    EXPECT_THROW(advise_test(t.values, t.labels, Design::automatic), Refusal);
}

// The refusals name ADVISE.TEST's own arguments (common practice, no source: the wording is ours).
TEST(Advisor, RefusalsNameResponseAndPredictor) {
    const auto refusal_of = [](const Range& response, const Range& predictor) {
        try {
            advise_test(response, predictor, Design::automatic);
        } catch (const Refusal& r) {
            return std::string(r.what());
        }
        return std::string("no refusal");
    };
    const Range labels = Range::text_column({"a", "a", "b", "b"});
    EXPECT_EQ(refusal_of(Range::column({5, 5, 5, 5}), labels), "all 4 response values are equal: there is nothing to test");
    EXPECT_EQ(refusal_of(Range::column({5}), Range::text_column({"a"})), "response holds 1 value; a test needs more rows");
    EXPECT_EQ(refusal_of(Range::column({1, 2, 3, 4}), Range::text_column({"a", "a", "b"})),
              "response and predictor must have the same number of rows (4 and 3)");
    EXPECT_EQ(refusal_of(Range::column({1, 2, 3}), Range::text_column({"a", "a", "a"})),
              "the predictor has 1 group; a comparison needs 2 or more");
}

TEST(AdvisorCell, OutputsAndTableThroughTheRegistry) {
    const auto* f = addin::find_function("adviseTest");
    ASSERT_NE(f, nullptr);
    const auto t = long_table({{"upstream", normal_sample(20, 8)}, {"downstream", normal_sample(20, 7)}});
    auto call = [&](const char* output) {
        return addin::call_fenced(*f, {t.values, t.labels, Range::scalar(Cell::make_text(output)), Range::omitted_argument()});
    };
    EXPECT_EQ(std::get<std::string>(call("method")[0][0]), "welch");
    EXPECT_EQ(std::get<std::string>(call("transform")[0][0]), "none");
    EXPECT_EQ(std::get<std::string>(call("function")[0][0]), "COMPARE.GROUPS");
    // Two groups need no post-hoc step: `none`, as transform says when no transform helps.
    EXPECT_EQ(std::get<std::string>(call("posthoc")[0][0]), "none");
    const Table table = call("table");
    EXPECT_EQ(std::get<std::string>(table[0][0]), "step");
    EXPECT_GE(table.size(), 4u);
    const std::string report = std::get<std::string>(call("")[0][0]);
    EXPECT_EQ(report.rfind("Suggested: COMPARE.GROUPS, method 'welch'.", 0), 0u) << report;
    EXPECT_EQ(std::get<std::string>(call("verdict")[0][0]), "unknown output 'verdict'; valid: report, method, transform, posthoc, function, table");
}

}  // namespace
}  // namespace quadrat
