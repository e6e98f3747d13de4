#include "ranks.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace quadrat {

Ranking rank_with_ties(std::span<const double> values) {
    const std::size_t n = values.size();
    Ranking r;
    r.ranks.assign(n, 0.0);
    std::vector<std::size_t> order(n);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return values[a] < values[b]; });
    for (std::size_t i = 0; i < n;) {
        std::size_t j = i + 1;
        while (j < n && values[order[j]] == values[order[i]]) ++j;
        const double mid = 0.5 * static_cast<double>(i + 1 + j);  // mean of positions i+1 .. j
        for (std::size_t k = i; k < j; ++k) r.ranks[order[k]] = mid;
        const double t = static_cast<double>(j - i);
        if (j - i > 1) {
            r.tie_term += t * t * t - t;
            ++r.tied_groups;
        }
        i = j;
    }
    return r;
}

double round_significant(double x, int digits) {
    if (x == 0 || !std::isfinite(x)) return x;
    const int magnitude = static_cast<int>(std::floor(std::log10(std::fabs(x))));
    const double scale = std::pow(10.0, digits - 1 - magnitude);
    if (!std::isfinite(scale) || scale == 0) return x;
    return std::round(x * scale) / scale;
}

ExactRankInference exact_rank_inference(std::span<const double> probability, double observed, double level) {
    const auto s = static_cast<std::size_t>(std::llround(observed));
    double lower = 0, upper = 0;
    for (std::size_t v = 0; v <= s && v < probability.size(); ++v) lower += probability[v];
    for (std::size_t v = probability.size(); v-- > s;) upper += probability[v];
    ExactRankInference out{std::min(1.0, 2 * std::min(lower, upper)), 0};
    const double alpha_half = (1 - level) / 2;
    double cumulative = 0;
    for (std::size_t v = 0; v < probability.size(); ++v) {
        cumulative += probability[v];
        if (cumulative > alpha_half * (1 + 1e-12)) break;
        out.interval_position = v + 1;
    }
    return out;
}

}  // namespace quadrat
