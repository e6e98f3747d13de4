// NIST Statistical Reference Datasets: one-way ANOVA (11 sets) and univariate summary statistics
// (9 sets). Accuracy is the log relative error LRE = −log10(|computed − certified|/|certified|),
// capped at 15 (NIST StRD; tests/data/nist-strd/README.md).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <map>
#include <string>
#include <vector>

#include "core/oneway.hpp"
#include "core/summary.hpp"
#include "reference.hpp"

namespace quadrat {
namespace {

using namespace test_support;

struct AnovaSet {
    std::vector<std::vector<double>> groups;
    double ss_between = 0, ss_within = 0, f = 0;
};

// Certified values from the "Between" (df, SS, MS, F) and "Within" (df, SS, MS) rows; the data as
// treatment/response pairs.
AnovaSet read_anova(const std::string& name) {
    const StrdFile file = read_strd("anova/" + name);
    AnovaSet s;
    if (const auto between = file.certified("Between"); between.size() == 4) {
        s.ss_between = between[1];
        s.f = between[3];
    }
    if (const auto within = file.certified("Within"); within.size() == 3) s.ss_within = within[1];
    std::map<double, std::size_t> group_of;
    for (const auto& row : file.rows) {
        if (row.size() != 2) continue;
        auto [it, inserted] = group_of.try_emplace(row[0], s.groups.size());
        if (inserted) s.groups.emplace_back();
        s.groups[it->second].push_back(row[1]);
    }
    return s;
}

struct Ceiling {
    double f, between, within;
};

// The binary64 ceiling: LRE of the exact answer from the binary64 inputs (100-digit arithmetic),
// from the table "What double precision can reach" in nist-strd/README.md.
const std::map<std::string, Ceiling>& anova_ceilings() {
    static const std::map<std::string, Ceiling> c = {
        {"SiRstv", {13.1, 14.0, 13.1}},  {"SmLs01", {15.0, 15.0, 15.0}}, {"SmLs02", {15.0, 15.0, 15.0}},
        {"SmLs03", {15.0, 15.0, 15.0}},  {"AtmWtAg", {10.2, 10.2, 10.9}}, {"SmLs04", {10.4, 10.1, 10.3}},
        {"SmLs05", {10.2, 9.9, 10.3}},   {"SmLs06", {10.2, 9.9, 10.3}},  {"SmLs07", {4.4, 4.0, 4.3}},
        {"SmLs08", {4.2, 3.9, 4.3}},     {"SmLs09", {4.2, 3.9, 4.3}}};
    return c;
}

// NIST StRD one-way ANOVA, all 11 sets: F, between-groups SS and within-groups SS must reach
// an LRE within 0.3 of the binary64 ceiling (README table). The LRE table is printed and recorded.
TEST(StrdAnova, WithinThreeTenthsOfCeiling) {
    std::printf("\n  NIST StRD one-way ANOVA: LRE (ceiling)\n");
    std::printf("  %-8s %-14s %-14s %-14s\n", "set", "F", "SS between", "SS within");
    for (const auto& [name, ceiling] : anova_ceilings()) {
        const AnovaSet s = read_anova(name);
        ASSERT_GE(s.groups.size(), 2u) << name;
        ASSERT_TRUE(s.f != 0 && s.ss_between != 0 && s.ss_within != 0) << name << ": certified values not found";
        const AnovaTable t = one_way_anova_table(s.groups);
        const double f = lre(t.f, s.f), between = lre(t.ss_between, s.ss_between), within = lre(t.ss_within, s.ss_within);
        std::printf("  %-8s %5.2f (%4.1f)   %5.2f (%4.1f)   %5.2f (%4.1f)\n", name.c_str(), f, ceiling.f, between,
                    ceiling.between, within, ceiling.within);
        char property[64];
        std::snprintf(property, sizeof property, "%.1f/%.1f/%.1f", f, between, within);
        RecordProperty("LRE_" + name, property);
        EXPECT_GE(f, ceiling.f - 0.3) << name << " F";
        EXPECT_GE(between, ceiling.between - 0.3) << name << " SS between";
        EXPECT_GE(within, ceiling.within - 0.3) << name << " SS within";
    }
}

// NIST StRD univariate sets: mean and SD (denominator n − 1) of summary.hpp. The ceiling (the LRE
// of the exact mean and SD of the binary64 inputs) is computed with exact rational arithmetic by
// tests/reference/generate_compare.py; the target is within 0.3 of it.
TEST(StrdUnivariate, MeanAndSdWithinThreeTenthsOfCeiling) {
    const auto& ceilings = reference_file("compare.json")["strd_univariate_ceiling"];
    std::printf("\n  NIST StRD univariate: LRE (ceiling)\n  %-9s %-14s %-14s\n", "set", "mean", "SD");
    for (const auto& [name, ceiling] : ceilings.items()) {
        const StrdFile file = read_strd("univariate/" + name);
        const auto certified_mean = file.certified("Sample Mean"), certified_sd = file.certified("Sample Standard Deviation");
        ASSERT_EQ(certified_mean.size(), 1u) << name;
        ASSERT_EQ(certified_sd.size(), 1u) << name;
        std::vector<double> xs;
        for (const auto& row : file.rows) xs.push_back(row.at(0));
        ASSERT_EQ(xs.size(), ceiling["n"].get<std::size_t>()) << name;
        const double m = lre(mean(xs), certified_mean[0]), sd = lre(standard_deviation(xs), certified_sd[0]);
        std::printf("  %-9s %5.2f (%4.1f)   %5.2f (%4.1f)\n", name.c_str(), m, ceiling["mean"].get<double>(), sd,
                    ceiling["sd"].get<double>());
        char property[64];
        std::snprintf(property, sizeof property, "%.1f/%.1f", m, sd);
        RecordProperty("LRE_" + name, property);
        EXPECT_GE(m, ceiling["mean"].get<double>() - 0.3) << name << " mean";
        EXPECT_GE(sd, ceiling["sd"].get<double>() - 0.3) << name << " SD";
    }
}

// Not StRD, worked by hand: three readings near the largest double (1.8e308) whose sum overflows
// have the mean (1.5 + 1.6 + 1.7)/3 · 1e308 = 1.6e308; the scaled path must give it to a few
// roundings (1e-15 relative), and a true infinity among the values still gives no finite mean.
TEST(SummaryMean, SurvivesASumBeyondTheLargestDouble) {
    const std::vector<double> huge = {1.5e308, 1.6e308, 1.7e308};
    EXPECT_NEAR(mean(huge) / 1.6e308, 1.0, 1e-15);
    EXPECT_NEAR(mean(std::vector<double>{-1.7e308, -1.7e308, 1.0}) / (-1.7e308 / 3 * 2), 1.0, 1e-15);
    EXPECT_FALSE(std::isfinite(mean(std::vector<double>{1.7e308, HUGE_VAL})));
}

}  // namespace
}  // namespace quadrat
