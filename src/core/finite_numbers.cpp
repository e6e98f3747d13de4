#include "finite_numbers.hpp"

#include <cmath>
#include <string>
#include <variant>

#include "refusal.hpp"

namespace quadrat {

void require_finite(std::span<const double> values) {
    for (double x : values)
        if (!std::isfinite(x)) throw Refusal("a value is not a finite number; remove infinities and NaN from the data");
}

double require_finite_statistic(double statistic, const char* name) {
    if (!std::isfinite(statistic))
        throw Refusal(std::string("the statistic ") + name +
                      " is beyond the range of numbers: the spread is too small against the difference to test");
    return statistic;
}

void mark_non_finite(TestResult& result) {
    for (auto& q : result.quantities)
        if (const double* x = std::get_if<double>(&q.value); x && !std::isfinite(*x))
            q.value = std::string(std::isnan(*x) ? "not defined for these data" : "beyond the range of numbers");
}

}  // namespace quadrat
