// CHECK.OUTLIERS: which single values stand out, for a technician to look at again before anything
// is set aside. Nothing is ever removed: the result names values to check, not values to delete.
#pragma once

#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "cells.hpp"
#include "keywords.hpp"

namespace quadrat {

// One value a method looked at, in the order the method takes them.
struct Suspect {
    std::size_t index = 0;  // position in the values handed to check_outliers
    double value = 0;
    double statistic = 0;   // R_i, G, or how many IQRs beyond the quartile
    double critical = 0;    // λ_i, the critical G, or 1.5
    bool outlier = false;
};

// The sentence and the table's note are rendered from these by report.hpp (render_outlier_report,
// render_outlier_note): nothing here builds a sentence.
struct OutlierCheck {
    std::string method;             // the keyword: generalized-esd, grubbs, fences
    std::string test;               // the method's full name
    std::size_t n = 0;
    std::vector<Suspect> suspects;  // in the order the method takes them
    std::size_t count = 0;          // values that stand out
    std::size_t most = 0;           // generalized-esd: the most values tested
    double alpha = 0.05;            // the tests' α = 1 − level
    double low_fence = 0, high_fence = 0;  // fences: quartiles ∓ 1.5 × IQR, in the values' units
};

// `method`: generalized-esd (default; Rosner 1983, n ≥ 25, up to `most` values, default 10% of n
// rounded down, at least 1 and at most 10), grubbs (Grubbs 1969, n ≥ 3, two-sided), fences
// (Tukey 1977, beyond 1.5 × IQR outside the quartiles, quartiles as QUARTILE.INC). α = 1 − level.
// `most` ≤ 0 means omitted; it is refused with the other methods.
OutlierCheck check_outliers(std::span<const double> values, const std::string& method, double most, double level);

// The outputs and methods of CHECK.OUTLIERS (keyword tables, keywords.hpp).
const KeywordTable& outlier_outputs();
const KeywordTable& outlier_methods();

// `flags`: one cell per row of the raw range (`rows` of them), `outlier` beside each value that
// stands out and blank elsewhere; row_of[i] is the raw row of values[i].
Table outlier_flags(const OutlierCheck& check, std::span<const std::size_t> row_of, std::size_t rows);

// `table`: header `cell | statistic | critical value | verdict` (FUNCTIONS.md), one row per value the
// method took, in its order, then a `note` row (what the method assumes; a flag is not a deletion);
// cell_of[i] names values[i] (B7).
Table outlier_table(const OutlierCheck& check, const std::vector<std::string>& cell_of);

}  // namespace quadrat
