#include "adjust.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"

namespace quadrat {

// Adjustment keeps the order of the keyword table adjustment_methods().
Adjustment parse_adjustment(const std::string& keyword) {
    return static_cast<Adjustment>(adjustment_methods().index(keyword, "adjust"));
}

std::string adjustment_keyword(Adjustment method) { return adjustment_methods().words()[static_cast<std::size_t>(method)].word; }

std::string adjustment_name(Adjustment method) {
    switch (method) {
        case Adjustment::holm: return "Holm";
        case Adjustment::bonferroni: return "Bonferroni";
        case Adjustment::hochberg: return "Hochberg";
        case Adjustment::hommel: return "Hommel";
        case Adjustment::benjamini_hochberg: return "Benjamini–Hochberg";
        case Adjustment::benjamini_yekutieli: return "Benjamini–Yekutieli";
        case Adjustment::sidak: return "Šidák";
    }
    return {};
}

namespace {

// Step-down and step-up methods work on the sorted p-values: p(1) ≤ … ≤ p(m).
// Ties keep their input order (stable sort); every method below gives tied p-values the same
// adjusted value, so the order among ties does not matter.
std::vector<std::size_t> ascending_order(std::span<const double> p) {
    std::vector<std::size_t> order(p.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return p[a] < p[b]; });
    return order;
}

// Hommel (1988) adjusted p-values by Wright (1992), on sorted p: start from the Simes p-value
// of the whole family, then for every subset size s = m − 1 … 2 raise each adjusted value to the
// Simes p-value of the worst intersection hypothesis of size s that contains it.
std::vector<double> hommel_sorted(const std::vector<double>& p) {
    const std::size_t m = p.size();
    double simes = 1.0;
    for (std::size_t j = 1; j <= m; ++j) simes = std::min(simes, static_cast<double>(m) * p[j - 1] / static_cast<double>(j));
    std::vector<double> adjusted(m, simes), q(m);
    for (std::size_t s = m - 1; s >= 2; --s) {
        // The s − 1 largest p-values with the weights of positions 2..s of a Simes test of size s.
        double tail = 1.0;
        for (std::size_t j = 2; j <= s; ++j)
            tail = std::min(tail, static_cast<double>(s) * p[m - s + j - 1] / static_cast<double>(j));
        for (std::size_t i = 0; i <= m - s; ++i) q[i] = std::min(static_cast<double>(s) * p[i], tail);
        for (std::size_t i = m - s + 1; i < m; ++i) q[i] = q[m - s];
        for (std::size_t i = 0; i < m; ++i) adjusted[i] = std::max(adjusted[i], q[i]);
    }
    for (std::size_t i = 0; i < m; ++i) adjusted[i] = std::min(1.0, std::max(adjusted[i], p[i]));
    return adjusted;
}

}  // namespace

std::vector<double> adjust_p(std::span<const double> p, Adjustment method) {
    const std::size_t m = p.size();
    for (double x : p)
        if (!(x >= 0.0 && x <= 1.0))
            throw Refusal("p-values must lie between 0 and 1; found " + format_number(x));
    std::vector<double> adjusted(m);
    if (m == 0) return adjusted;
    const double family = static_cast<double>(m);

    if (method == Adjustment::bonferroni) {
        for (std::size_t i = 0; i < m; ++i) adjusted[i] = std::min(1.0, family * p[i]);
        return adjusted;
    }
    if (method == Adjustment::sidak) {
        // 1 − (1 − p)^m through log1p/expm1, so that p = 1e-12 keeps its digits.
        for (std::size_t i = 0; i < m; ++i)
            adjusted[i] = p[i] >= 1.0 ? 1.0 : -std::expm1(family * std::log1p(-p[i]));
        return adjusted;
    }
    if (method == Adjustment::hommel && m > hommel_limit)
        throw Refusal("method 'hommel' takes at most " + std::to_string(hommel_limit) + " p-values, found " +
                      std::to_string(m) + "; use hochberg or holm");

    const std::vector<std::size_t> order = ascending_order(p);
    std::vector<double> sorted(m), result(m);
    for (std::size_t i = 0; i < m; ++i) sorted[i] = p[order[i]];

    switch (method) {
        case Adjustment::holm: {
            double running = 0.0;  // step-down: a running maximum from the smallest p up
            for (std::size_t i = 0; i < m; ++i) {
                running = std::max(running, std::min(1.0, static_cast<double>(m - i) * sorted[i]));
                result[i] = running;
            }
            break;
        }
        case Adjustment::hochberg: {
            double running = 1.0;  // step-up: a running minimum from the largest p down
            for (std::size_t i = m; i-- > 0;) {
                running = std::min(running, static_cast<double>(m - i) * sorted[i]);
                result[i] = running;
            }
            break;
        }
        case Adjustment::benjamini_hochberg:
        case Adjustment::benjamini_yekutieli: {
            double factor = 1.0;  // Benjamini–Yekutieli's c(m) = Σ 1/i for arbitrary dependence
            if (method == Adjustment::benjamini_yekutieli) {
                factor = 0.0;
                for (std::size_t i = m; i >= 1; --i) factor += 1.0 / static_cast<double>(i);
            }
            double running = 1.0;
            for (std::size_t i = m; i-- > 0;) {
                running = std::min(running, factor * family * sorted[i] / static_cast<double>(i + 1));
                result[i] = running;
            }
            break;
        }
        case Adjustment::hommel:
            result = hommel_sorted(sorted);
            break;
        default:
            break;
    }
    for (std::size_t i = 0; i < m; ++i) adjusted[order[i]] = result[i];
    return adjusted;
}

}  // namespace quadrat
