// PLAN.SAMPLES, PLAN.POWER, PLAN.DETECTABLE.
#include <gtest/gtest.h>

#include <cmath>

#include "core/plan.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

Design design_of(const nlohmann::json& c) {
    const std::string name = c["design"];
    return plan_design(name, c["count"], name == "several-groups");
}

// statsmodels 0.13 TTestIndPower, TTestPower and FTestAnovaPower via tests/reference/generate_limits.py
// (several groups through Cohen's f of the least favourable arrangement, f = (D/σ)·√(1/(2k)), derived
// there). Power to 1e-8 relative (both sides evaluate Boost.Math's noncentral t and F; statsmodels
// adds its own critical value); PLAN.SAMPLES is statsmodels' fractional n rounded up (exact); the
// detectable difference to 1e-9 relative (solved in the generator by brentq on statsmodels' power at
// xtol 1e-14; statsmodels' own solve_power stops about 2e-6 short).
TEST(Plan, AgreesWithStatsmodels) {
    for (const auto& c : reference_file("limits.json")["power"]) {
        const Design g = design_of(c);
        const double level = c["level"], d = c["d"], n = c["n"], target = c["target"];
        const std::string what = c.dump();
        expect_relative(plan_power(n, 2 * d, 2, g, level), c["power"].get<double>(), 1e-8, "power " + what);
        EXPECT_EQ(plan_samples(3 * d, 3, g, target, level), std::ceil(c["n_fractional"].get<double>())) << what;
        expect_relative(plan_detectable(n, 5, g, target, level), 5 * c["detectable_d"].get<double>(), 1e-9, "detectable " + what);
    }
}

// Cohen (1988), Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Table 2.4.1 (from
// memory): two groups, two-sided α = 0.05, power 0.80: n = 393, 64, 26 per group for d = 0.2, 0.5, 0.8.
// 64 and 26 exactly; for d = 0.2 the exact noncentral t needs 393.4 (statsmodels' TTestIndPower gives
// the same), so 394 whole readings: Cohen's table came from an approximation, and is held to within 1.
TEST(Plan, CohenTable) {
    const Design g = plan_design("", 0, false);
    EXPECT_NEAR(plan_samples(0.2, 1, g, 0.8, 0.95), 393, 1);
    EXPECT_EQ(plan_samples(0.5, 1, g, 0.8, 0.95), 64);
    EXPECT_EQ(plan_samples(0.8, 1, g, 0.8, 0.95), 26);
}

// The answer is the smallest n: one fewer falls short (by construction of the search; checked here
// on the paired design and several groups).
TEST(Plan, SmallestN) {
    for (const Design& g : {plan_design("paired", 0, false), plan_design("several-groups", 4, true)}) {
        const double n = plan_samples(1.3, 2.1, g, 0.9, 0.95);
        EXPECT_GE(plan_power(n, 1.3, 2.1, g, 0.95), 0.9);
        EXPECT_LT(plan_power(n - 1, 1.3, 2.1, g, 0.95), 0.9);
    }
}

// Bad input (common practice, no source).
TEST(Plan, Refusals) {
    const Design g = plan_design("", 0, false);
    EXPECT_NE(refusal_text([&] { plan_samples(1, 1, g, 1, 0.95); }).find("power must be a fraction"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_samples(1, 1, g, 0, 0.95); }).find("power must be a fraction"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_samples(1, 1, g, 0.04, 0.95); }).find("power must be above 0.05"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_samples(0, 1, g, 0.8, 0.95); }).find("difference must be a positive number"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_samples(1, -1, g, 0.8, 0.95); }).find("sd must be a positive number"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_samples(1, 1, g, 0.8, 1.2); }).find("level must be"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_power(1, 1, 1, g, 0.95); }).find("n must be a whole number"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_power(2.5, 1, 1, g, 0.95); }).find("n must be a whole number"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_detectable(1, 1, g, 0.8, 0.95); }).find("n must be a whole number"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_design("several-groups", 2.5, true); }).find("count must be a whole number"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_design("paired", 3, true); }).find("leave it empty"), std::string::npos);
    EXPECT_NE(refusal_text([&] { plan_design("blocks", 0, false); }).find("valid: two-groups, paired, one-sample, several-groups"),
              std::string::npos);
    // A difference no season can detect: the refusal names the n searched up to.
    EXPECT_NE(refusal_text([&] { plan_samples(1e-4, 1, g, 0.8, 0.95); }).find("no n up to 10000000 per group reaches power 0.8"),
              std::string::npos);
}

// count, the number of groups of several-groups: the refusal for a missing one names the range the
// check accepts (common practice, no source: one-way ANOVA needs at least 2 groups; 10000 is the
// project's cap).
TEST(Plan, CountRange) {
    EXPECT_EQ(refusal_text([&] { plan_design("several-groups", 0, false); }),
              "design several-groups needs count, the number of groups (a whole number from 2 to 10000)");
    EXPECT_EQ(refusal_text([&] { plan_design("several-groups", 1, true); }),
              "count must be a whole number of groups from 2 to 10000, found 1");
    EXPECT_EQ(refusal_text([&] { plan_design("several-groups", 10001, true); }),
              "count must be a whole number of groups from 2 to 10000, found 10001");
    EXPECT_EQ(plan_design("several-groups", 2, true).groups, 2);
    EXPECT_EQ(plan_design("several-groups", 10000, true).groups, 10000);
}

// The smallest count, 2, is the two-groups design: with two means at ±D/2 the F test on (1, 2(n − 1))
// degrees of freedom is the two-sided t test squared, λ = δ² (the identity F(1, ν) = t(ν)², textbook
// algebra, no table). Held to 1e-9 relative: two different Boost.Math series (noncentral F, noncentral
// t) evaluate the same number, each to about 1e-12 or better away from its extreme tails.
TEST(Plan, TwoGroupsAsSeveralGroups) {
    const Design two = plan_design("two-groups", 0, false), several = plan_design("several-groups", 2, true);
    for (double n : {3.0, 10.0, 64.0})
        for (double d : {0.3, 0.8, 1.5}) {
            const std::string what = "n " + std::to_string(n) + " d " + std::to_string(d);
            expect_relative(plan_power(n, d, 1, several, 0.95), plan_power(n, d, 1, two, 0.95), 1e-9, what);
        }
    EXPECT_EQ(plan_samples(0.5, 1, several, 0.8, 0.95), plan_samples(0.5, 1, two, 0.8, 0.95));
}

// Extreme arguments (what the fuzzer throws): a number in [0, 1] or a refusal, within a few seconds.
TEST(Plan, ExtremeArguments) {
    const Design g = plan_design("", 0, false);
    for (double n : {2.0, 1e3, 1e9})
        for (double d : {1e-300, 1e-3, 1.0, 1e3, 1e300})
            for (const Design& design : {g, plan_design("one-sample", 0, false), plan_design("several-groups", 10000, true)}) {
                try {
                    const double p = plan_power(n, d, 1, design, 0.95);
                    EXPECT_TRUE(p >= 0 && p <= 1) << n << " " << d;
                } catch (const Refusal&) {
                }
                try {
                    const double det = plan_detectable(n, d, design, 0.8, 0.95);
                    EXPECT_TRUE(std::isfinite(det) && det > 0);
                } catch (const Refusal&) {
                }
            }
}

}  // namespace
}  // namespace quadrat
