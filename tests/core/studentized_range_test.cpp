// The studentized range distribution against SciPy, against Student's t (k = 2, exact) and against
// published critical values.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <limits>
#include <nlohmann/json.hpp>

#include <boost/math/distributions/students_t.hpp>

#include "core/refusal.hpp"
#include "core/studentized_range.hpp"
#include "reference.hpp"

namespace quadrat {
namespace {

constexpr double infinity = std::numeric_limits<double>::infinity();

const nlohmann::json& studentized_range_reference() {
    return test_support::reference_file("posthoc.json")["studentized_range"];
}

double df_of(const nlohmann::json& df) { return df.is_string() ? infinity : df.get<double>(); }

// scipy.stats.studentized_range 1.10 cdf and sf (tests/reference/generate_posthoc.py) on the grid
// k ∈ {2, 3, 4, 5, 10, 20, 50, 100}, df ∈ {2, 3, 5, 10, 20, 60, 120, 1000, ∞}, q from 0.5 to 25.
// Tolerance: 1e-6 relative (the six significant digits asked of a p-value) plus 5e-13 absolute.
// The absolute part is SciPy's: its sf is 1 − cdf with an integration error near 3e-13, so its
// tails below 1e-6 carry fewer digits than ours (at k = 3, df = 1000, q = 8 SciPy gives
// 6.029935e-8, mpmath at 20 digits 6.029884e-8, ours 6.029884e-8: see the mpmath test below, and
// the exact k = 2 test). Points below 1e-9 are left to those tests. Worst differences are printed.
TEST(StudentizedRange, AgreesWithScipyOnTheGrid) {
    const auto ref = studentized_range_reference();
    double worst_sf = 0.0, worst_cdf = 0.0, worst_large = 0.0;
    int compared = 0;
    for (const auto& point : ref["points"]) {
        const int k = point["k"].get<int>();
        const double df = df_of(point["df"]);
        const double q = point["q"].get<double>();
        const StudentizedRangeTails t = studentized_range_tails(q, k, df);
        const double sf = point["sf"].get<double>(), cdf = point["cdf"].get<double>();
        if (sf > 1e-9) {
            const double e = std::abs(t.upper - sf) / sf;
            worst_sf = std::max(worst_sf, e);
            if (sf > 1e-4) worst_large = std::max(worst_large, e);
            EXPECT_NEAR(t.upper, sf, 1e-6 * sf + 5e-13) << "sf k=" << k << " df=" << df << " q=" << q;
            ++compared;
        }
        if (cdf > 1e-9) {
            worst_cdf = std::max(worst_cdf, std::abs(t.lower - cdf) / cdf);
            EXPECT_NEAR(t.lower, cdf, 1e-6 * cdf + 5e-13) << "cdf k=" << k << " df=" << df << " q=" << q;
        }
        // Both tails always add to one (each is integrated directly, so this checks the pair).
        EXPECT_NEAR(t.lower + t.upper, 1.0, 1e-12);
    }
    std::printf("studentized range vs SciPy: %d points; worst relative difference sf %.2e (%.2e where sf > 1e-4), "
                "cdf %.2e\n",
                compared, worst_sf, worst_large, worst_cdf);
}

// mpmath from the defining integrals (generator; 50 digits for df = ∞, 20 for the finite-df point),
// small upper tails where SciPy has few digits, down to 1.4e-22 (k = 100, q = 15). Tolerance 1e-9
// relative (the 20-digit difference form keeps about 12 digits of a 1e-8 tail).
TEST(StudentizedRange, SmallTailsAgreeWithMpmath) {
    const auto& ref = test_support::reference_file("posthoc.json")["studentized_range_mpmath"];
    ASSERT_FALSE(ref.empty());
    double worst = 0.0;
    for (const auto& point : ref) {
        const int k = point["k"].get<int>();
        const double df = df_of(point["df"]);
        const double q = point["q"].get<double>();
        const double expected = point["sf"].get<double>();
        const double ours = studentized_range_sf(q, k, df);
        worst = std::max(worst, std::abs(ours - expected) / expected);
        EXPECT_NEAR(ours, expected, 1e-9 * expected) << "k=" << k << " df=" << df << " q=" << q;
    }
    std::printf("studentized range vs mpmath: worst relative error %.2e\n", worst);
}

// For k = 2 the range is √2 |T|: P(Q > q) = 2 P(T_df > q/√2) exactly (Boost.Math students_t, and the
// normal for df = ∞). Tolerance 1e-9 relative, down to tails of 1e-200.
TEST(StudentizedRange, TwoGroupsIsStudentsT) {
    double worst = 0.0;
    for (double df : {1.0, 2.0, 3.5, 7.0, 30.0, 500.0, 1e6}) {
        const boost::math::students_t t(df);
        for (double q = 0.05; q < 200.0; q *= 1.4) {
            const double exact = 2.0 * boost::math::cdf(boost::math::complement(t, q / std::sqrt(2.0)));
            if (exact < 1e-200) continue;
            const double ours = studentized_range_sf(q, 2, df);
            worst = std::max(worst, std::abs(ours - exact) / exact);
            EXPECT_NEAR(ours, exact, 1e-9 * exact) << "df=" << df << " q=" << q;
        }
    }
    std::printf("studentized range k = 2 vs Student's t: worst relative error %.2e\n", worst);
    // df = ∞: 2 (1 − Φ(q/√2)) = erfc(q/2).
    EXPECT_NEAR(studentized_range_sf(3.0, 2, infinity), std::erfc(1.5), 1e-15);
}

// Harter (1960), Tables of range and studentized range, Ann. Math. Statist. 31, 1122–1147, upper 5%
// and 1% points as printed to three decimals in common Tukey tables (from memory). Tolerance 5e-4:
// the rounding of a three-decimal table.
TEST(StudentizedRange, PublishedCriticalValues) {
    EXPECT_NEAR(studentized_range_quantile(0.95, 3, 10), 3.877, 5e-4);
    EXPECT_NEAR(studentized_range_quantile(0.95, 4, 20), 3.958, 5e-4);
    EXPECT_NEAR(studentized_range_quantile(0.95, 5, 10), 4.654, 5e-4);
    EXPECT_NEAR(studentized_range_quantile(0.95, 10, 20), 5.008, 5e-4);
    EXPECT_NEAR(studentized_range_quantile(0.95, 3, infinity), 3.314, 5e-4);
    EXPECT_NEAR(studentized_range_quantile(0.99, 3, 10), 5.270, 5e-4);
    // k = 2, df = ∞: √2 · 1.959964 = 2.771808 (normal quantile, exact). Tolerance 1e-9.
    EXPECT_NEAR(studentized_range_quantile(0.95, 2, infinity), 2.7718076486, 1e-9);
}

// scipy.stats.studentized_range.ppf 1.10 (generator) at a few (k, df, p). Tolerance 1e-6 relative:
// SciPy's root finder works to about that.
TEST(StudentizedRange, QuantilesAgreeWithScipyAndInvertTheCdf) {
    const auto ref = studentized_range_reference();
    for (const auto& point : ref["quantiles"]) {
        const int k = point["k"].get<int>();
        const double df = df_of(point["df"]);
        const double p = point["p"].get<double>();
        const double q = studentized_range_quantile(p, k, df);
        EXPECT_NEAR(q, point["q"].get<double>(), 1e-6 * q) << "k=" << k << " df=" << df << " p=" << p;
        // Round trip: the quantile gives back its probability (common practice, no source); 1e-10.
        EXPECT_NEAR(studentized_range_cdf(q, k, df), p, 1e-10);
    }
}

// Common practice, no source: limits and refusals.
TEST(StudentizedRange, LimitsAndRefusals) {
    EXPECT_EQ(studentized_range_sf(0.0, 5, 10), 1.0);
    EXPECT_EQ(studentized_range_cdf(-1.0, 5, 10), 0.0);
    EXPECT_EQ(studentized_range_sf(infinity, 5, 10), 0.0);
    EXPECT_THROW(studentized_range_sf(1.0, 1, 10), Refusal);
    EXPECT_THROW(studentized_range_sf(1.0, 5, 0.5), Refusal);
    EXPECT_THROW(studentized_range_sf(std::nan(""), 5, 10), Refusal);
    EXPECT_THROW(studentized_range_quantile(1.0, 5, 10), Refusal);
    // Very large q: a tiny tail, never negative or NaN.
    const double far = studentized_range_sf(400.0, 10, 5);
    EXPECT_TRUE(far > 0.0 && far < 1e-6);
    EXPECT_EQ(studentized_range_sf(1e6, 10, infinity), 0.0);
}

}  // namespace
}  // namespace quadrat
