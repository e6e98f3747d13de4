// The studentized range distribution: the range of k independent standard normal values divided
// by an independent estimate of their standard deviation on df degrees of freedom (df = ∞: by σ
// itself). Tukey's and Games–Howell's pairwise comparisons refer q to it.
#pragma once

#include <limits>

namespace quadrat {

// Accepted parameters: 2 ≤ k ≤ 1000 groups (tested over 2..100), df ≥ 1 real or
// std::numeric_limits<double>::infinity(). Outside these: a refusal.
inline constexpr int studentized_range_max_groups = 1000;

struct StudentizedRangeTails {
    double lower;  // P(Q ≤ q)
    double upper;  // P(Q > q), computed directly (not as 1 − lower) so that small p keep their digits
};

// Both tails at q ≥ 0 (q ≤ 0 gives lower 0, upper 1).
StudentizedRangeTails studentized_range_tails(double q, int k, double df);
double studentized_range_cdf(double q, int k, double df);
double studentized_range_sf(double q, int k, double df);

// The q with P(Q ≤ q) = probability, for 0 < probability < 1 (e.g. 0.95 for Tukey's 95% interval).
double studentized_range_quantile(double probability, int k, double df);

}  // namespace quadrat
