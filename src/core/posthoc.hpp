// Pairwise comparisons after a test of several groups (COMPARE.POSTHOC) and the compact letter
// display built on them (COMPARE.LETTERS, letters.hpp).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "adjust.hpp"
#include "cells.hpp"
#include "data.hpp"
#include "transform.hpp"

namespace quadrat {

enum class PosthocMethod { tukey, games_howell, dunn, pairwise_t, pairwise_ranks };

// tukey (default), games-howell, dunn, pairwise-t, pairwise-ranks.
PosthocMethod parse_posthoc_method(const std::string& keyword);
// dunn and pairwise-ranks compare ranks: their groups are summarized by medians.
bool is_rank_method(PosthocMethod method);
// Tukey and Games–Howell refer q to the studentized range: their p is already for the family.
bool is_family_adjusted(PosthocMethod method);

// At most this many groups (4950 pairs), so a table stays a size a sheet can show.
inline constexpr std::size_t posthoc_max_groups = 100;

// One row of the table: groups `first` and `second` (indices into the group order).
struct PairComparison {
    std::size_t first = 0, second = 0;
    double estimate = 0.0;       // on the data's scale (a ratio after a log transform)
    CellValue ci_low, ci_high;   // a number, or a text where no interval exists (too few values)
    double statistic = 0.0;      // q (positive), z, t or U₁
    double p = 1.0;
    double adjusted_p = 1.0;
    bool significant = false;    // adjusted_p < 1 − level
};

struct PosthocResult {
    std::string test;                   // e.g. "Tukey–Kramer (studentized range)"
    std::vector<std::string> groups;    // names in group order
    std::vector<std::size_t> n;         // values per group
    std::vector<PairComparison> pairs;  // (1,2), (1,3), …, (2,3), … in group order
    // Header row then one row per pair, 9 columns.
    Table table() const;
};

// All pairs of the groups by `method`. `adjust` is the adjustment of p for dunn, pairwise-t and
// pairwise-ranks (holm when empty); tukey and games-howell are adjusted for the family already and
// show their p twice. The transform is applied first; estimates and limits are back-transformed
// to ratios for log and log10 and stay on the transformed scale for log(x+1) and sqrt.
PosthocResult compare_posthoc(const Groups& groups, PosthocMethod method, std::optional<Adjustment> adjust,
                              Transform transform, double level);

}  // namespace quadrat
