#include "exact_scaling.hpp"

#include <algorithm>
#include <cmath>

namespace quadrat {

double power_of_two_scale(std::span<const std::span<const double>> groups) {
    double largest = 0;
    for (const auto& g : groups)
        for (double x : g) largest = std::max(largest, std::fabs(x));
    if (largest == 0 || !std::isfinite(largest)) return 1.0;
    int exponent = 0;
    std::frexp(largest, &exponent);
    return std::ldexp(1.0, std::clamp(-exponent, -1000, 1000));
}

double power_of_two_scale(std::span<const double> values) {
    const std::span<const double> one[] = {values};
    return power_of_two_scale(one);
}

std::vector<double> scaled(std::span<const double> values, double scale) {
    std::vector<double> out(values.begin(), values.end());
    for (double& x : out) x *= scale;
    return out;
}

std::vector<std::vector<double>> scaled(std::span<const std::vector<double>> groups, double scale) {
    std::vector<std::vector<double>> out(groups.begin(), groups.end());
    for (auto& g : out)
        for (double& x : g) x *= scale;
    return out;
}

double power_of_two_below(double x) { return std::ldexp(1.0, std::ilogb(x)); }

int range_exponent(double lowest, double highest) {
    const double range = highest - lowest;
    return std::isfinite(range) ? std::ilogb(range) : std::ilogb(highest / 2 - lowest / 2) + 1;
}

}  // namespace quadrat
