// Confidence intervals of the standardized effects: Hedges' g (two groups), Cohen's d of paired
// differences, ω² (three or more groups), by inversion of the noncentral t and F.
#include <cmath>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "core/effect_interval.hpp"
#include "core/oneway.hpp"
#include "core/paired.hpp"
#include "core/two_groups.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& cases() { return reference_file("compare.json")["cases"]; }

std::vector<double> numbers(const nlohmann::json& j) { return j.get<std::vector<double>>(); }

// An interval limit against the reference: relative, or absolute where the limit is exactly 0.
void expect_limit(const TestResult& r, const nlohmann::json& ref, const char* key) {
    const double expected = ref[key].get<double>();
    EXPECT_NEAR(r.number(key), expected, 1e-9 * std::max(std::fabs(expected), 1e-3)) << key;
}

void expect_effect_interval(const TestResult& r, const nlohmann::json& ref) {
    expect_limit(r, ref, "effect ci-low");
    expect_limit(r, ref, "effect ci-high");
    EXPECT_LE(r.number("effect ci-low"), r.number("effect"));
    EXPECT_GE(r.number("effect ci-high"), r.number("effect"));
}

// tests/reference/generate_compare.py: the noncentral t and F distributions evaluated in 40-digit
// mpmath from their defining integral and Poisson mixture, inverted by bisection to 1e-25
// (Steiger & Fouladi 1997; Steiger 2004). No library in the reference set has these intervals.
// Tolerance 1e-9 relative: Boost.Math's noncentral cdfs are good to about 1e-13, and the inversion
// divides by the slope of the cdf in the noncentrality.
TEST(EffectInterval, HedgesGAgreesWithMpmath) {
    for (const char* name : {"nitrate", "tiny"}) {
        SCOPED_TRACE(name);
        const auto& c = cases()[name];
        const auto a = numbers(c["first"]), b = numbers(c["second"]);
        // Both t-tests report the same g (pooled SD by the catalogue), so the same interval.
        expect_effect_interval(welch_t_test(a, b, 0.95), c["welch"]);
        expect_effect_interval(pooled_t_test(a, b, 0.95), c["pooled"]);
    }
}

TEST(EffectInterval, PairedCohensDAgreesWithMpmath) {
    for (const char* name : {"oxygen", "ph"}) {
        SCOPED_TRACE(name);
        const auto& c = cases()[name];
        PairedReadings readings;
        readings.first = numbers(c["first"]);
        if (c["second"].is_number()) {
            readings.one_sample = true;
            readings.reference_value = c["second"].get<double>();
        } else {
            readings.second = numbers(c["second"]);
        }
        expect_effect_interval(compare_paired(readings, "t", Transform::none), c["t"]);
    }
}

TEST(EffectInterval, OmegaSquaredAgreesWithMpmath) {
    for (const char* name : {"zones", "plots20"}) {
        SCOPED_TRACE(name);
        const auto& c = cases()[name];
        std::vector<std::vector<double>> groups;
        for (const auto& g : c["groups"]) groups.push_back(numbers(g));
        const TestResult classic = classic_one_way_anova(groups), welch = welch_one_way_anova(groups);
        expect_limit(classic, c["classic"], "effect ci-low");
        expect_limit(classic, c["classic"], "effect ci-high");
        // Welch's ANOVA reports the same ω², so the same interval.
        EXPECT_EQ(welch.number("effect ci-low"), classic.number("effect ci-low"));
        EXPECT_EQ(welch.number("effect ci-high"), classic.number("effect ci-high"));
    }
}

// Properties of the inversion (common practice, no source): swapping the groups mirrors the
// interval; at t = 0 it is symmetric about 0; an F below its lower point gives a lower limit of 0
// and an F of 0 gives [0, 0] once even λ = 0 leaves it below the upper point.
TEST(EffectInterval, MirrorsAndLimits) {
    const std::vector<double> a = {5.1, 4.8, 6.0, 5.5, 5.9}, b = {4.2, 4.9, 3.8, 4.4};
    const TestResult ab = pooled_t_test(a, b, 0.95), ba = pooled_t_test(b, a, 0.95);
    EXPECT_NEAR(ab.number("effect ci-low"), -ba.number("effect ci-high"), 1e-12);
    EXPECT_NEAR(ab.number("effect ci-high"), -ba.number("effect ci-low"), 1e-12);
    const Interval zero = noncentral_t_interval(0.0, 10, 0.95);
    EXPECT_NEAR(zero.low, -zero.high, 1e-12);
    EXPECT_GT(zero.high, 0.0);
    EXPECT_EQ(noncentral_f_interval(0.2, 2, 20, 0.95).low, 0.0);
    const Interval none = noncentral_f_interval(0.0, 2, 20, 0.95);
    EXPECT_EQ(none.low, 0.0);
    EXPECT_EQ(none.high, 0.0);
    // Beyond what the noncentral t can be evaluated at: no interval rather than a wrong one.
    EXPECT_TRUE(std::isnan(noncentral_t_interval(1e6, 10, 0.95).low));
    EXPECT_TRUE(std::isnan(noncentral_f_interval(1e8, 5, 10, 0.95).high));
}

}  // namespace
}  // namespace quadrat
