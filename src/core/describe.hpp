// Group summaries that belong beside a test (DESCRIBE.GROUPS).
#pragma once

#include "data.hpp"
#include "transform.hpp"

namespace quadrat {

// Header row, then one row per group in group order: group, n, mean, ci-low, ci-high, SD, SE,
// CV %, minimum, q1, median, q3, maximum. The interval is mean ± t(n−1) · SE at `level`. With a
// transform the mean and its interval are computed on the transformed scale and back-transformed
// (with log or log10 that is the geometric mean and its interval; the header says so); SD, SE,
// CV % (100 · SD / |mean|), the quartiles (as Calc's QUARTILE.INC), minimum and maximum stay on
// the data's scale. Cells that are undefined for a group of one value (SD, SE, CV %, interval) are
// blank.
Table describe_groups(const Groups& groups, Transform transform, double level);

}  // namespace quadrat
