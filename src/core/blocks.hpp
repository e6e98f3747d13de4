// Groups compared within blocks (COMPARE.BLOCKS): the randomized complete block ANOVA, the Friedman
// test, and with two groups the paired tests of paired.hpp matched by block label. Long format: each
// reading has a value, a group label and a block label, in any row order.
#pragma once

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "adjust.hpp"
#include "cells.hpp"
#include "posthoc.hpp"
#include "result.hpp"
#include "keywords.hpp"

namespace quadrat {

// COMPARE.BLOCKS' methods and outputs (keyword tables, keywords.hpp).
const KeywordTable& block_methods();
const KeywordTable& block_outputs();

// Labels → indices in order of first appearance (the catalogue's group order), one hash look-up per
// row and one string copy per distinct label. Shared with COMPARE.NESTED.
struct LabelIndex {
    std::vector<std::string> names;   // distinct labels in order of first appearance
    std::vector<std::size_t> of_row;  // index of each row's label
    explicit LabelIndex(std::span<const std::string> labels);
};

// The three columns of a labelled layout — values, groups, and blocks or units — checked and indexed:
// the same number of rows, at least one row, finite values, at least 2 groups (else a refusal that
// names `structure_name`: "block" or "unit").
struct LabelledReadings {
    LabelIndex groups, structure;
};
LabelledReadings index_readings(std::span<const double> values, std::span<const std::string> groups,
                                std::span<const std::string> structure, const std::string& structure_name);

// The readings as read from the sheet: three columns of the same length (rows with a missing cell
// already left out and counted in n_dropped).
struct BlockReadings {
    std::span<const double> values;
    std::span<const std::string> groups;
    std::span<const std::string> blocks;
    std::size_t n_dropped = 0;
};

// The three columns read from cells (the data layer's rules: a header row, missing cells dropped and
// counted, a number in a label column is a label): values, groups, and blocks or units, the last named
// `structure_name` in refusals.
struct LabelledColumns {
    std::vector<double> values;
    std::vector<std::string> groups, structure;
    std::size_t n_dropped = 0;
    BlockReadings blocks() const { return {values, groups, structure, n_dropped}; }
};
LabelledColumns read_labelled_columns(const Range& values, const Range& groups, const Range& structure,
                                      const std::string& structure_name);

// The readings laid out as blocks × groups. Several readings of one group in one block are
// averaged (they are subsamples of one plot, not replicates); a block missing a group is dropped
// whole. One pass over the rows (labels looked up in hash maps), then one pass over each block.
struct BlockLayout {
    std::vector<std::string> groups;       // in order of first appearance
    std::vector<std::string> blocks;       // the complete blocks, in order of first appearance
    std::vector<double> cells;             // blocks × groups, row-major: each cell's mean reading
    std::size_t readings_used = 0;         // readings in the complete blocks
    std::size_t readings_averaged = 0;     // of those, readings in cells holding more than one
    std::size_t blocks_dropped = 0;        // blocks missing at least one group
    std::size_t n_dropped = 0;             // rows with a missing cell (from the reading)

    std::size_t group_count() const { return groups.size(); }
    std::size_t block_count() const { return blocks.size(); }
    double cell(std::size_t block, std::size_t group) const { return cells[block * groups.size() + group]; }
    // One group's cell means over the complete blocks, in block order.
    std::vector<double> column(std::size_t group) const;
};

// Refuses, each with its own text: no usable row, fewer than 2 groups, a single block, a group
// read in one block only, no block (or only one) holding every group.
BlockLayout lay_out_blocks(const BlockReadings& readings);

// Randomized complete block ANOVA, additive model y = μ + group + block + e on the cell means:
// F = MS_groups / MS_residual on (k − 1, (b − 1)(k − 1)) df, the residual being the group-by-block
// interaction (Fisher 1935, The Design of Experiments; Montgomery, Design and Analysis of
// Experiments, ch. 4). effect: partial η² = SS_groups/(SS_groups + SS_residual).
TestResult randomized_block_anova(const BlockLayout& layout);

// Friedman test (Friedman 1937, JASA 32, 675–701): cell means ranked within each block (mid-ranks),
// tie-corrected statistic in Conover's form T₁ = (k − 1) Σ(Rⱼ − b(k + 1)/2)² / (A₁ − C₁), A₁ = Σ r²,
// C₁ = bk(k + 1)²/4, referred to χ² on k − 1 df; the Iman–Davenport F = (b − 1)T₁/(b(k − 1) − T₁)
// on (k − 1, (b − 1)(k − 1)) df beside it (Iman & Davenport 1980, Commun. Statist. A9, 571–595;
// Conover 1999, Practical Nonparametric Statistics, 3rd ed., §5.8). effect: Kendall's
// W = T₁/(b(k − 1)) (Kendall & Babington Smith 1939, Ann. Math. Statist. 10, 275–287).
TestResult friedman_test(const BlockLayout& layout);

// COMPARE.BLOCKS: method pooled (default), ranks or sign (two groups only). With two groups the
// result is COMPARE.PAIRED's on the matched cell means (paired t, signed-rank, sign), with `n`
// the readings used; with more, the randomized block ANOVA or the Friedman test. The table adds
// blocks used, blocks dropped and readings averaged; the report says them too.
TestResult compare_blocks(const BlockReadings& readings, const std::string& method);

// The `pairs` output: every pair of groups over the complete blocks in COMPARE.POSTHOC's layout.
// pooled: paired t-tests; ranks: Conover's comparisons of rank sums after the Friedman test
// (Conover 1999, §5.8, eq. 8: t = (Rᵢ − Rⱼ)/√(2(bA₁ − ΣR²)/((b − 1)(k − 1))) on (b − 1)(k − 1) df;
// estimate the difference of mean ranks with its t interval). With two groups, the one pair is the
// two-group test itself (paired t, signed-rank or sign). p adjusted by `adjust` (Holm when absent).
PosthocResult compare_blocks_pairs(const BlockReadings& readings, const std::string& method,
                                   std::optional<Adjustment> adjust, double level = 0.95);

}  // namespace quadrat
