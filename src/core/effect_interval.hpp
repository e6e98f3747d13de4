// Confidence intervals for standardized effect sizes, by inverting the noncentral distribution of
// the test statistic (Steiger & Fouladi 1997, in Harlow, Mulaik & Steiger (eds.), What if there
// were no significance tests?, 221–257; Steiger 2004, Psychological Methods 9, 164–182): the
// limits are the noncentralities under which the observed statistic sits at the upper and lower
// (1 − level)/2 points.
#pragma once

namespace quadrat {

struct Interval {
    double low, high;
};

// Noncentrality δ of a t statistic with `df` degrees of freedom: P(T ≤ t | δ_low) = 1 − α/2 and
// P(T ≤ t | δ_high) = α/2. NaN limits beyond |t| = 1000, where the noncentral t gets slow to evaluate.
Interval noncentral_t_interval(double t, double df, double level);

// Noncentrality λ ≥ 0 of an F statistic with (df1, df2) degrees of freedom; a limit is 0 where
// even λ = 0 leaves the observed F below that limit's point. NaN limits beyond df1·F = 1e7.
Interval noncentral_f_interval(double f, double df1, double df2, double level);

}  // namespace quadrat
