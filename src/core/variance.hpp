// CHECK.VARIANCE: do the groups have equal spread? Each group's variance is computed on the group
// shifted to its own mid-range and divided by its own range and kept as a logarithm, and the
// deviation methods work on the data multiplied by a power of two (exact; every method is scale
// invariant): a 1e300 among ordinary readings overflows nothing, and the other groups keep their digits.
#pragma once

#include <string>
#include <vector>

#include "data.hpp"
#include "result.hpp"

namespace quadrat {

// CHECK.VARIANCE's methods in catalogue order (the first is the default).

// One method by its keyword, with the catalogue's table rows: statistic, df (and df2 for the F
// tests), p, n, n dropped, then `<group>: n` and `<group>: variance` for each group and
// `variance ratio` (largest over smallest).
//   brown-forsythe  one-way ANOVA F on |x − group median| (Brown & Forsythe 1974, JASA 69, 364–367)
//   levene          the same on |x − group mean| (Levene 1960, in Contributions to Probability and Statistics)
//   bartlett        Bartlett (1937), Proc. Royal Society A 160, 268–282; χ² with k − 1 df
//   fligner         Fligner–Killeen, median-centred, normal scores of the ranks of |x − median|
//                   (Conover, Johnson & Johnson 1981, Technometrics 23, 351–361); χ² with k − 1 df
//   f-ratio         variance of the first group over the second, two-sided F test (two groups only)
TestResult check_variance(const Groups& groups, const std::string& method);

}  // namespace quadrat
