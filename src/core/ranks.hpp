// Mid-ranks with ties, shared by every rank method (Wilcoxon, Kruskal–Wallis, Dunn, Spearman,
// Fligner–Killeen). Ties are values equal as stored numbers (FUNCTIONS.md, "Ties and precision").
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

namespace quadrat {

struct Ranking {
    std::vector<double> ranks;         // mid-rank of each input value, in input order (1-based)
    double tie_term = 0.0;             // Σ(t³ − t) over groups of tied values
    std::size_t tied_groups = 0;       // how many values-groups have t > 1
    bool has_ties() const { return tied_groups > 0; }
};

// O(n log n): sorts an index, then gives each run of equal values the mean of its positions.
Ranking rank_with_ties(std::span<const double> values);

// Rounds to 10 significant digits, so that differences equal on paper tie as a person expects
// (1.09 − 1 and 1 − 0.91); used before ranking paired differences and Walsh averages.
double round_significant(double x, int digits = 10);

// What an exact null distribution P(S = v), v = 0, 1, …, of a symmetric rank statistic (the
// rank-sum U, the signed-rank T⁺) gives: the two-sided p of the observed value, twice the smaller
// tail, and the position k of the interval's limits among the ordered pairwise differences or
// Walsh averages: the largest k with P(S ≤ k − 1) ≤ α/2, so that the interval covers with at
// least `level` (Bauer 1972, JASA 67, 687–690).
struct ExactRankInference {
    double p;
    std::uint64_t interval_position;  // 0: too few values for an interval at this level
};
ExactRankInference exact_rank_inference(std::span<const double> probability, double observed, double level);

}  // namespace quadrat
