// Two-way analysis of variance with interaction for unbalanced designs: Type II and Type III sums
// of squares from nested least-squares fits.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "cells.hpp"

namespace quadrat {

// One numeric response and two factors, rows aligned; levels in order of first appearance.
struct FactorialData {
    std::vector<double> y;
    std::vector<std::size_t> first, second;   // level index of each row
    std::vector<std::string> first_levels, second_levels;
    std::string first_name, second_name;      // header text, else factor1 / factor2
    std::size_t n_dropped = 0;
};

FactorialData read_factorial_data(const Range& values, const Range& factor1, const Range& factor2);

struct AnovaRow {
    std::string source;
    double ss = 0, df = 0, ms = 0, f = 0, p = 0, partial_eta_squared = 0;
};

struct FactorialAnova {
    AnovaRow first, second, interaction, residual;
    int sums = 2;  // type of the sums of squares: 2 or 3
    double n = 0, n_dropped = 0;
};

// `sums` 2 (`type-2`, Type II: each main effect adjusted for the other, the interaction for both) or 3
// (Type III: each effect adjusted for all others, sum-to-zero contrasts). Type III refuses a design
// with an empty combination of levels; both refuse a factor with one level, no replication, and no
// spread within the combinations.
FactorialAnova fit_factorial(const FactorialData& data, int sums);

// The outputs of FIT.FACTORIAL: table (default), p-factor1, p-factor2, p-interaction.
// Header source | SS | df | MS | F | p | partial η², then the first factor, the second, their
// interaction and the residual (SS, df and MS only).
Table factorial_table(const FactorialAnova& anova);

}  // namespace quadrat
