// TRACK.TREND: a monotonic trend over time. The Mann–Kendall test (Mann 1945, Econometrica 13,
// 245–259; Kendall 1975, Rank Correlation Methods) or, with seasons, the seasonal Kendall test
// (Hirsch, Slack & Smith 1982, Water Resources Research 18, 107–121), with the Sen slope (Sen 1968,
// JASA 63, 1379–1389; Theil 1950) and its distribution-free interval.
//
// The n(n−1)/2 pairwise slopes are never listed: an order statistic is selected by randomized
// interval shrinking over inversion counts (Matoušek 1991, Inf. Process. Lett. 39, 183–187;
// Dillencourt, Mount & Netanyahu 1992, Int. J. Comput. Geom. Appl. 2, 1–27), expected O(n log n).
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

#include "cells.hpp"
#include "keywords.hpp"
#include "result.hpp"

namespace quadrat {

// The pairwise slopes (y_j − y_i)/(t_j − t_i) over the pairs at different times within the same
// season (one season when `seasons` is empty), held implicitly.
class PairwiseSlopes {
public:
    // Every number finite; `seasons` empty or one code per reading. Refuses times too close together
    // for their size (a slope between them would overflow).
    PairwiseSlopes(std::span<const double> times, std::span<const double> values,
                   std::span<const std::uint32_t> seasons = {});

    std::uint64_t count() const { return count_; }

    // The k-th smallest slope (1-based, 1 ≤ k ≤ count()).
    double order_statistic(std::uint64_t k) const;
    // At ranks 1 ≤ rank ≤ count() that may be fractional: interpolated between the neighbouring
    // slopes. Several ranks at once share the first narrowing step.
    std::vector<double> at_ranks(const std::vector<double>& ranks) const;
    // The median slope (the mean of the two middle ones when count() is even).
    double median() const;
    // The rank of the median, (count() + 1)/2, for at_ranks.
    double median_rank() const { return (static_cast<double>(count_) + 1) / 2; }

private:
    struct Point {
        double t, y;
    };
    // The slopes in [lo, hi): `below` slopes lie under lo, `inside` within; the points in their order
    // by y − s·t at s = lo and at s = hi.
    struct Bracket {
        double lo, hi;
        std::vector<std::uint32_t> order_lo, order_hi;
        std::uint64_t below, inside;
    };
    std::vector<Point> points_;                 // grouped by season, scaled by powers of two to magnitudes ≤ 1
    std::vector<std::size_t> season_start_;     // where each season's points begin, and the end
    int t_exponent_ = 0, y_exponent_ = 0;
    std::uint64_t count_ = 0;
    Bracket all_;                               // from slope −∞ to +∞

    std::vector<std::uint32_t> order_at(double slope) const;
    std::vector<double> sample_between(const Bracket& b, double fraction, std::uint64_t seed) const;
    std::vector<double> list_between(const Bracket& b) const;
    bool narrow(Bracket& b, double new_lo, double new_hi, std::uint64_t first, std::uint64_t last) const;
    void shared_step(Bracket& b, std::uint64_t first, std::uint64_t last) const;
    std::vector<double> select(Bracket b, std::uint64_t first, std::uint64_t last) const;  // 0-based, last ≤ first + 1
    static double slope_of(const Point& p, const Point& q);
    std::vector<Point> in_order(const std::vector<std::uint32_t>& order) const;
    double unscaled(double slope) const;
};

// How the slope is expressed (FUNCTIONS.md, TRACK.TREND `unit`).
enum class TrendUnit { automatic, year, day, none };

const KeywordTable& trend_units();    // TRACK.TREND `unit`: auto, year, day, none (order of TrendUnit)
const KeywordTable& trend_outputs();  // TRACK.TREND `output`
TrendUnit parse_trend_unit(const std::string& keyword);  // a matched keyword of trend_units()

// One series of readings. A censored reading (`<0.05`) holds its detection limit in `values` and a 1
// in `censored`.
struct TrendSeries {
    std::span<const double> values;
    std::span<const double> times;               // day numbers when the cells are dates
    std::span<const unsigned char> censored;     // empty: nothing censored
    std::span<const std::string> seasons;        // empty: no seasons
    std::size_t n_dropped = 0;                   // rows the reader left out, for the table
};

struct TrendOptions {
    double level = 0.95;
    bool times_are_dates = false;  // the `times` cells are formatted as dates
    TrendUnit unit = TrendUnit::automatic;
};

// TRACK.TREND on typed data: named numbers `n`, `n dropped`, `seasons`, `statistic` (S), `variance`,
// `z`, `p`, `effect` (τ), `estimate` (Sen slope per unit), `ci-low`, `ci-high`, `unit`, `intercept`,
// `percent`, `censored`, `lag-1 correlation`, `caution`, and the report sentence.
TestResult mann_kendall_trend(const TrendSeries& series, const TrendOptions& options = {});

// TRACK.TREND from cells: `values` numbers or readings below a detection limit (`<0.5`), `times`
// numbers (day numbers formatted as dates when times.dates is set), `seasons` labels (omitted or
// empty: no seasons). The data layer's rules for headers, missing cells and refusals.
TestResult track_trend(const Range& values, const Range& times, const Range& seasons, TrendUnit unit, double level);

}  // namespace quadrat
