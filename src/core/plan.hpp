// Planning the next season (PLAN.*): readings per group, power, and the smallest detectable
// difference of a two-sided test at 1 − level, from the noncentral t and F distributions (exact; no
// normal shortcut).
#pragma once

#include <algorithm>
#include <cstddef>
#include <string>
#include "keywords.hpp"

namespace quadrat {

// PLAN.*'s `design` (a keyword table, keywords.hpp).
const KeywordTable& plan_designs();

// Smallest whole n ≥ start with predicate(n) true, by doubling from `start` and then bisection
// (O(log n) evaluations); 0 when none up to `cap`. The predicate must be monotone in n.
template <class Predicate>
std::size_t smallest_n(std::size_t start, std::size_t cap, Predicate predicate) {
    std::size_t fails = start - 1, good = start;
    while (!predicate(good)) {
        if (good >= cap) return 0;
        fails = good;
        good = std::min(cap, good * 2);
    }
    while (good - fails > 1) {
        const std::size_t middle = fails + (good - fails) / 2;
        (predicate(middle) ? good : fails) = middle;
    }
    return good;
}

enum class DesignKind { two_groups, paired, one_sample, several_groups };

struct Design {
    DesignKind kind = DesignKind::two_groups;
    double groups = 2;  // `count`, for several-groups
};

// `design` keyword (two-groups default, paired, one-sample, several-groups) and `count` (the number
// of groups, required for several-groups and refused with the others; count_given false = omitted).
Design plan_design(const std::string& design, double count, bool count_given);

// Power of the two-sided test with n readings per group (pairs for paired, readings for one-sample)
// to detect `difference` when the readings (or, paired, the differences) have SD `sd`.
// two-groups: t on 2n − 2 df, noncentrality (D/σ)·√(n/2); paired, one-sample: t on n − 1 df,
// noncentrality (D/σ)·√n; several-groups (k groups): F on (k − 1, k(n − 1)) df, noncentrality
// n·D²/(2σ²): two means at ±D/2 and the others at the midpoint, the least favourable arrangement of
// means whose range is D.
double plan_power(double n, double difference, double sd, const Design& design, double level);

// The smallest whole n per group whose power reaches `power`; a refusal naming the n searched up
// to (largest_planned_n) when none does.
double plan_samples(double difference, double sd, const Design& design, double power, double level);
inline constexpr double largest_planned_n = 10000000;

// The difference whose power with n per group is exactly `power` (TOMS 748 root of power − target).
double plan_detectable(double n, double sd, const Design& design, double power, double level);

}  // namespace quadrat
