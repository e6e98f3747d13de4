// Compact letter display (COMPARE.LETTERS): groups sharing a letter do not differ significantly.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "cells.hpp"
#include "data.hpp"
#include "posthoc.hpp"
#include "transform.hpp"

namespace quadrat {

// Letters a–z, then A–Z: beyond 52 letters a display no longer helps and is a refusal.
inline constexpr std::size_t max_letters = 52;

// Letters for groups with these centres (mean or median) given which pairs differ
// (differs[i][j] == differs[j][i]). Insert-and-absorb, then sweeping of redundant letters
// (Piepho 2004, J. Comput. Graph. Stat. 13, 456–466). Groups are taken from the largest centre
// down (ties in group order), so `a` goes to the largest and letters run down the centres.
std::vector<std::string> compact_letters(const std::vector<double>& centre, const std::vector<std::vector<bool>>& differs);

struct LettersResult {
    std::vector<std::string> groups;
    std::vector<std::size_t> n;
    std::vector<double> centre;  // mean (back-transformed), or median for the rank methods
    bool medians = false;
    std::vector<std::string> letters;
    // Header `group | n | mean | letters` (`median` for rank methods), one row per group.
    Table table() const;
};

// The post-hoc `method` at `level` with `adjust` (its default when empty); a pair differs when its adjusted
// p is below 1 − level.
LettersResult compare_letters(const Groups& groups, PosthocMethod method, std::optional<Adjustment> adjust,
                              Transform transform, double level);

}  // namespace quadrat
