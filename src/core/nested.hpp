// Groups compared when several subsamples come from each sampling unit (COMPARE.NESTED): three
// cores per plot, five fish per net. The groups are tested over the variation between units, so
// subsamples are not counted as independent replicates.
#pragma once

#include <cstddef>
#include <span>
#include <string>

#include "cells.hpp"
#include "keywords.hpp"
#include "result.hpp"

namespace quadrat {

// The readings as read from the sheet: three columns of the same length (rows with a missing cell
// already left out and counted in n_dropped). A unit label names one unit: the same label in two
// groups is a refusal, not two units.
struct NestedReadings {
    std::span<const double> values;
    std::span<const std::string> groups;
    std::span<const std::string> units;
    std::size_t n_dropped = 0;
};

// Two-level nested ANOVA (Sokal & Rohlf, Biometry, ch. 10). The test: F = MS_groups / MS_units
// on (a − 1, U − a) df, a groups and U units, computed as the one-way ANOVA of the unit means —
// the same F as the nested ANOVA when every unit has the same number of subsamples, and the
// sound test when they differ (each unit then counts once; the table says so).
// Variance components by the classical expected mean squares of the nested ANOVA on all readings
// (Sokal & Rohlf, Box 10.1 for equal and the n₀ coefficients for unequal subsample counts):
//   E[MS_within] = σ²,  E[MS_units] = σ² + n₀′σ²_u,  E[MS_groups] = σ² + n₀″σ²_u + n₀‴σ²_g,
//   n₀′ = (N − Σᵢ Σⱼ nᵢⱼ²/nᵢ) / (U − a),  n₀″ = (Σᵢ Σⱼ nᵢⱼ²/nᵢ − Σᵢⱼ nᵢⱼ²/N) / (a − 1),
//   n₀‴ = (N − Σᵢ nᵢ²/N) / (a − 1);
// a negative estimate is set to 0 (and the table says so); shares are of the sum of the three.
TestResult compare_nested(const NestedReadings& readings);

// COMPARE.NESTED's outputs; and the test from cells (values, groups, units: the data layer's rules).
const KeywordTable& nested_outputs();
TestResult compare_nested(const Range& values, const Range& groups, const Range& units);

}  // namespace quadrat
