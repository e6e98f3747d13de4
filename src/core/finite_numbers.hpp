// Keeping infinities and NaN out of data and out of what a cell shows: refusals for non-finite
// values and statistics, and texts for the non-finite numbers of a result.
#pragma once

#include <span>

#include "result.hpp"

namespace quadrat {

// Refuses infinities and NaN (the data layer never passes them; direct callers might).
void require_finite(std::span<const double> values);

// The statistic itself, or a refusal when it overflowed (a spread within groups that is tiny
// against the difference between them, beyond the range of a double).
double require_finite_statistic(double statistic, const char* name);

// Replaces every non-finite number of a result (an estimate beyond the range of numbers after
// back-transformation, say) by a text saying so, so that no table cell carries inf or NaN.
void mark_non_finite(TestResult& result);

}  // namespace quadrat
