#include "trend.hpp"

#include <algorithm>
#include <bit>
#include <cmath>
#include <limits>
#include <numeric>
#include <random>
#include <set>
#include <unordered_map>
#include <utility>

#include <boost/math/distributions/normal.hpp>

#include "correlation.hpp"
#include "data.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

constexpr double infinity = std::numeric_limits<double>::infinity();
constexpr double epsilon = std::numeric_limits<double>::epsilon();
// Below this, in the scaled units of PairwiseSlopes (values and times of magnitude ≤ 1), a slope
// counts as zero when bracketing; far below any slope of real data.
constexpr double tiniest_slope = 0x1p-1000;

// A little beyond v either way: wide enough that a pair whose exact slope rounds to v lies inside
// (a computed slope is within a few units of rounding of the exact one), so a group of tied slopes
// is never split by its own rounded value.
double just_below(double v) { return v - (16 * epsilon * std::fabs(v) + tiniest_slope); }
double just_above(double v) { return v + (16 * epsilon * std::fabs(v) + tiniest_slope); }
bool same_slope(double a, double b) { return std::fabs(a - b) <= 32 * epsilon * std::max(std::fabs(a), std::fabs(b)) + 2 * tiniest_slope; }

// The power of two that brings the largest magnitude of v to [0.5, 1): exact scaling, so values near
// 1e308 keep their differences finite and denormals keep their digits.
int scale_exponent(std::span<const double> v) {
    double largest = 0;
    for (double a : v) largest = std::max(largest, std::fabs(a));
    if (largest == 0) return 0;
    int exponent = 0;
    std::frexp(largest, &exponent);
    return exponent;
}

// Visits the inversions of the permutation a (positions p < q with a[p] > a[q]) in a fixed order
// while merge-sorting it bottom-up: visit(right, left, count, offset) for each element `right`
// that passes the `count` larger elements left[0..count) of the run beside it, the inversions
// numbered from `offset` on. Returns how many there are.
template <class Visit>
std::uint64_t visit_inversions(std::vector<std::uint32_t> a, Visit visit) {
    const std::size_t n = a.size();
    std::vector<std::uint32_t> merged(n);
    std::uint64_t total = 0;
    for (std::size_t width = 1; width < n; width *= 2) {
        for (std::size_t lo = 0; lo < n; lo += 2 * width) {
            const std::size_t mid = std::min(lo + width, n), hi = std::min(lo + 2 * width, n);
            std::size_t i = lo, j = mid, out = lo;
            while (i < mid && j < hi) {
                if (a[j] < a[i]) {
                    visit(a[j], &a[i], mid - i, total);
                    total += mid - i;
                    merged[out++] = a[j++];
                } else {
                    merged[out++] = a[i++];
                }
            }
            while (i < mid) merged[out++] = a[i++];
            while (j < hi) merged[out++] = a[j++];
        }
        a.swap(merged);
    }
    return total;
}

// The positions in `to` of the points listed in `from` order: the permutation whose inversions
// are the pairs of points that the two orders put the other way round.
std::vector<std::uint32_t> relative_order(const std::vector<std::uint32_t>& from, const std::vector<std::uint32_t>& to) {
    std::vector<std::uint32_t> position(to.size()), a(from.size());
    for (std::size_t i = 0; i < to.size(); ++i) position[to[i]] = static_cast<std::uint32_t>(i);
    for (std::size_t i = 0; i < from.size(); ++i) a[i] = position[from[i]];
    return a;
}

std::uint64_t pairs_between(const std::vector<std::uint32_t>& from, const std::vector<std::uint32_t>& to) {
    return visit_inversions(relative_order(from, to), [](std::uint32_t, const std::uint32_t*, std::size_t, std::uint64_t) {});
}

[[noreturn]] void selection_failed() {
    throw Refusal("could not select the Sen slope for these data; please report this data set");
}

}  // namespace

// ---------------------------------------------------------------------------------------------
// Slope selection. A pair i, j (t_i < t_j) has slope below s exactly when u_j < u_i for
// u = y − s·t: so the pairs with slopes in [lo, hi) are the pairs of points that the order by
// u at lo and the order by u at hi put the other way round, counted by a merge sort in
// O(n log n) and sampled uniformly by numbering them in the merge. Each step samples slopes in the
// current bracket, narrows it around the wanted rank to the sample's order statistics ± 3√r, and
// checks the counts (Matoušek 1991; Dillencourt, Mount & Netanyahu 1992): a few steps reach a
// bracket of O(n) slopes, which are listed and selected from. The season is the first sort key,
// so pairs across seasons are never counted; equal u is broken by time, so a pair whose slope is
// exactly s counts as not below s, and pairs at one time never change order.
// ---------------------------------------------------------------------------------------------

PairwiseSlopes::PairwiseSlopes(std::span<const double> times, std::span<const double> values,
                               std::span<const std::uint32_t> seasons) {
    const std::size_t n = times.size();
    if (values.size() != n || (!seasons.empty() && seasons.size() != n))
        throw Refusal("times, values and seasons must have the same number of rows");
    if (n >= std::numeric_limits<std::uint32_t>::max()) throw Refusal("too many readings");
    t_exponent_ = scale_exponent(times);
    y_exponent_ = scale_exponent(values);

    // Points grouped by season, so that each season is one block of every order below.
    std::vector<std::size_t> rows(n);
    std::iota(rows.begin(), rows.end(), std::size_t{0});
    if (!seasons.empty())
        std::stable_sort(rows.begin(), rows.end(), [&](std::size_t a, std::size_t b) { return seasons[a] < seasons[b]; });
    points_.resize(n);
    season_start_.push_back(0);
    for (std::size_t i = 0; i < n; ++i) {
        points_[i] = {std::ldexp(times[rows[i]], -t_exponent_), std::ldexp(values[rows[i]], -y_exponent_)};
        if (i > 0 && !seasons.empty() && seasons[rows[i]] != seasons[rows[i - 1]]) season_start_.push_back(i);
    }
    season_start_.push_back(n);

    // Seen from slope −∞, y − s·t orders the points by time; from +∞ by time reversed; ties in time
    // by value, then by position.
    all_.order_lo.resize(n);
    std::iota(all_.order_lo.begin(), all_.order_lo.end(), 0u);
    all_.order_hi = all_.order_lo;
    for (std::size_t g = 0; g + 1 < season_start_.size(); ++g) {
        const auto from = static_cast<std::ptrdiff_t>(season_start_[g]), to = static_cast<std::ptrdiff_t>(season_start_[g + 1]);
        std::sort(all_.order_lo.begin() + from, all_.order_lo.begin() + to, [&](std::uint32_t a, std::uint32_t b) {
            const Point &p = points_[a], &q = points_[b];
            return p.t != q.t ? p.t < q.t : p.y != q.y ? p.y < q.y : a < b;
        });
        std::sort(all_.order_hi.begin() + from, all_.order_hi.begin() + to, [&](std::uint32_t a, std::uint32_t b) {
            const Point &p = points_[a], &q = points_[b];
            return p.t != q.t ? p.t > q.t : p.y != q.y ? p.y < q.y : a < b;
        });
    }

    // Pairs at different times within a season; and the closest two times, for the overflow guard.
    double closest = infinity;
    for (std::size_t g = 0; g + 1 < season_start_.size(); ++g) {
        const std::uint64_t m = season_start_[g + 1] - season_start_[g];
        count_ += m * (m - 1) / 2;
        std::size_t run = season_start_[g];
        for (std::size_t i = season_start_[g] + 1; i <= season_start_[g + 1]; ++i) {
            const bool same_time = i < season_start_[g + 1] && points_[all_.order_lo[i]].t == points_[all_.order_lo[run]].t;
            if (same_time) continue;
            const std::uint64_t tied = i - run;
            count_ -= tied * (tied - 1) / 2;
            if (i < season_start_[g + 1]) closest = std::min(closest, points_[all_.order_lo[i]].t - points_[all_.order_lo[run]].t);
            run = i;
        }
    }
    all_.lo = -infinity, all_.hi = infinity, all_.below = 0, all_.inside = count_;
    // Slopes are at most 2/closest in scaled units; keys y − s·t must stay finite.
    if (count_ > 0 && closest < 0x1p-990)
        throw Refusal("times are too close together for their size to give a slope; subtract a start time or rescale them");
}

double PairwiseSlopes::slope_of(const Point& p, const Point& q) { return (q.y - p.y) / (q.t - p.t); }

// The points laid out in `order`, so that a pair found by its positions in that order is read
// without a second indirection (the reads of a sample are cache misses, most of its time).
std::vector<PairwiseSlopes::Point> PairwiseSlopes::in_order(const std::vector<std::uint32_t>& order) const {
    std::vector<Point> out(order.size());
    for (std::size_t i = 0; i < order.size(); ++i) out[i] = points_[order[i]];
    return out;
}

double PairwiseSlopes::unscaled(double slope) const { return std::ldexp(slope, y_exponent_ - t_exponent_); }

std::vector<std::uint32_t> PairwiseSlopes::order_at(double s) const {
    // u = y − s·t as an unevaluated sum hi + lo (the exact product by fma, Knuth's two-sum), so that
    // the order is that of the exact slopes, not of their rounded values. Sorted on hi's bits as
    // an integer (monotone for doubles once the sign is folded), lo and time only on ties.
    const std::size_t n = points_.size();
    struct Key {
        std::uint64_t hi;
        std::uint32_t index;
    };
    std::vector<Key> keys(n);
    std::vector<double> low(n);
    for (std::uint32_t i = 0; i < n; ++i) {
        const Point& p = points_[i];
        const double product = s * p.t;
        const double product_error = std::fma(s, p.t, -product);
        const double sum = p.y - product;
        const double back = sum - p.y;
        const double sum_error = (p.y - (sum - back)) + (-product - back);
        const double rest = sum_error - product_error;
        double hi = sum + rest;
        low[i] = rest - (hi - sum);
        if (hi == 0) hi = 0.0;  // −0 and +0 are one value
        const auto bits = std::bit_cast<std::uint64_t>(hi);
        keys[i] = {bits >> 63 ? ~bits : bits | (std::uint64_t{1} << 63), i};
    }
    const auto before = [&](const Key& a, const Key& b) {
        if (a.hi != b.hi) return a.hi < b.hi;
        if (low[a.index] != low[b.index]) return low[a.index] < low[b.index];
        if (points_[a.index].t != points_[b.index].t) return points_[a.index].t < points_[b.index].t;
        return a.index < b.index;
    };
    for (std::size_t g = 0; g + 1 < season_start_.size(); ++g)
        std::sort(keys.begin() + static_cast<std::ptrdiff_t>(season_start_[g]),
                  keys.begin() + static_cast<std::ptrdiff_t>(season_start_[g + 1]), before);
    std::vector<std::uint32_t> order(n);
    for (std::size_t i = 0; i < n; ++i) order[i] = keys[i].index;
    return order;
}

std::vector<double> PairwiseSlopes::list_between(const Bracket& b) const {
    std::vector<double> out;
    out.reserve(b.inside);
    const std::vector<Point> at = in_order(b.order_hi);
    visit_inversions(relative_order(b.order_lo, b.order_hi), [&](std::uint32_t right, const std::uint32_t* left, std::size_t count, std::uint64_t) {
        for (std::size_t q = 0; q < count; ++q) out.push_back(slope_of(at[left[q]], at[right]));
    });
    return out;
}

std::vector<double> PairwiseSlopes::sample_between(const Bracket& b, double fraction, std::uint64_t seed) const {
    // Each slope of the bracket is kept with probability `fraction`: the gaps between kept ones
    // are geometric, so the kept numbers come in order without sorting them.
    std::mt19937_64 random(seed);
    std::geometric_distribution<std::uint64_t> gap(fraction);
    std::vector<double> out;
    out.reserve(static_cast<std::size_t>(fraction * static_cast<double>(b.inside) * 1.1) + 16);
    std::uint64_t next = gap(random);
    const std::vector<Point> at = in_order(b.order_hi);
    visit_inversions(relative_order(b.order_lo, b.order_hi), [&](std::uint32_t right, const std::uint32_t* left, std::size_t count,
                                                                 std::uint64_t offset) {
        while (next < offset + count) {
            out.push_back(slope_of(at[left[next - offset]], at[right]));
            next += 1 + gap(random);
        }
    });
    return out;
}

bool PairwiseSlopes::narrow(Bracket& b, double new_lo, double new_hi, std::uint64_t first, std::uint64_t last) const {
    new_lo = std::max(new_lo, b.lo);
    new_hi = std::min(new_hi, b.hi);
    if (!(new_lo < new_hi)) return false;
    std::vector<std::uint32_t> at_lo = new_lo == b.lo ? b.order_lo : order_at(new_lo);
    std::vector<std::uint32_t> at_hi = new_hi == b.hi ? b.order_hi : order_at(new_hi);
    const std::uint64_t under = b.below + pairs_between(b.order_lo, at_lo);
    const std::uint64_t upto = under + pairs_between(at_lo, at_hi);
    if (upto > b.below + b.inside) selection_failed();
    if (first >= under && last < upto) {  // both ends move
        b.lo = new_lo, b.hi = new_hi, b.below = under, b.inside = upto - under;
        b.order_lo.swap(at_lo), b.order_hi.swap(at_hi);
    } else if (last < under) {
        b.hi = new_lo, b.inside = under - b.below;
        b.order_hi.swap(at_lo);
    } else if (first >= upto) {
        b.lo = new_hi, b.inside = b.below + b.inside - upto, b.below = upto;
        b.order_lo.swap(at_hi);
    } else if (last < upto) {  // some wanted ranks under new_lo, none above new_hi
        b.hi = new_hi, b.inside = upto - b.below;
        b.order_hi.swap(at_hi);
    } else if (first >= under) {
        b.lo = new_lo, b.inside = b.below + b.inside - under, b.below = under;
        b.order_lo.swap(at_lo);
    } else {
        return false;
    }
    return true;
}

namespace {

// Sample positions around the wanted ranks: the sample's order statistics ± 3√r hold them with
// high probability (Matoušek 1991).
struct SamplePositions {
    long long lo, mid, hi, last;
};
SamplePositions positions_around(std::size_t sample, std::uint64_t first, std::uint64_t last, std::uint64_t below, std::uint64_t inside) {
    const double r = static_cast<double>(sample);
    const double from = static_cast<double>(first - below) / static_cast<double>(inside) * r;
    const double to = static_cast<double>(last - below + 1) / static_cast<double>(inside) * r;
    const double spread = 3 * std::sqrt(r);
    const auto end = static_cast<long long>(sample) - 1;
    return {static_cast<long long>(std::floor(from - spread)), std::clamp(static_cast<long long>(std::floor((from + to) / 2)), 0LL, end),
            static_cast<long long>(std::ceil(to + spread)), end};
}

// Puts the sample's order statistics at positions lo, mid and hi (clamped) in place: three
// selections instead of a sort.
void place(std::vector<double>& sample, const SamplePositions& at) {
    const auto mid = sample.begin() + at.mid;
    std::nth_element(sample.begin(), mid, sample.end());
    if (at.lo > 0 && at.lo < at.mid) std::nth_element(sample.begin(), sample.begin() + at.lo, mid);
    if (at.hi > at.mid && at.hi <= at.last) std::nth_element(mid + 1, sample.begin() + at.hi, sample.end());
    if (at.lo <= 0) std::nth_element(sample.begin(), sample.begin(), mid);  // the minimum
    if (at.hi > at.last) std::nth_element(mid + 1, sample.end() - 1, sample.end());  // the maximum
}

}  // namespace

void PairwiseSlopes::shared_step(Bracket& b, std::uint64_t first, std::uint64_t last) const {
    const std::uint64_t list_at_most = std::max<std::uint64_t>(4 * points_.size(), 1 << 16);
    const double wanted = static_cast<double>(std::clamp<std::uint64_t>(points_.size() / 2, 4096, 1 << 18));
    if (b.inside <= list_at_most) return;
    std::vector<double> sample = sample_between(b, wanted / static_cast<double>(b.inside), 1);
    if (sample.size() < 16) return;
    const SamplePositions at = positions_around(sample.size(), first, last, b.below, b.inside);
    place(sample, at);
    if (at.lo < 0 && at.hi > at.last) return;
    const double lo_end = at.lo < 0 ? -infinity : sample[at.lo], hi_end = at.hi > at.last ? infinity : sample[at.hi];
    if (std::isfinite(lo_end) && std::isfinite(hi_end) && same_slope(lo_end, hi_end)) return;
    narrow(b, at.lo < 0 ? b.lo : just_above(lo_end), at.hi > at.last ? b.hi : just_below(hi_end), first, last);
}

std::vector<double> PairwiseSlopes::select(Bracket b, std::uint64_t first, std::uint64_t last) const {
    const std::uint64_t list_at_most = std::max<std::uint64_t>(4 * points_.size(), 1 << 16);
    const double wanted = static_cast<double>(std::clamp<std::uint64_t>(points_.size() / 2, 4096, 1 << 18));

    for (std::uint64_t step = 0; step < 200; ++step) {
        if (first < b.below || last >= b.below + b.inside) selection_failed();
        if (b.inside <= list_at_most) {
            std::vector<double> listed = list_between(b);
            if (listed.size() != b.inside) selection_failed();
            auto nth = listed.begin() + static_cast<std::ptrdiff_t>(first - b.below);
            std::nth_element(listed.begin(), nth, listed.end());
            std::vector<double> out{*nth};
            if (last > first) out.push_back(*std::min_element(nth + 1, listed.end()));
            return out;
        }
        // The seed changes every step (a failed step draws again), fixed overall: the result never
        // depends on it, only the time does.
        std::vector<double> sample = sample_between(b, wanted / static_cast<double>(b.inside), 1000 + step);
        if (sample.size() < 16) continue;
        const SamplePositions at = positions_around(sample.size(), first, last, b.below, b.inside);
        place(sample, at);
        const double v = sample[at.mid];

        // Many pairs share the slope v (tied values, censored readings, readings on a grid): try the
        // group of v itself, so that its own rounded value never holds the bracket still.
        if (same_slope(sample[std::max(at.lo, 0LL)], v) || same_slope(sample[std::min(at.hi, at.last)], v)) {
            Bracket group = b;
            const double group_lo = std::max(b.lo, just_below(v)), group_hi = std::min(b.hi, just_above(v));
            std::vector<std::uint32_t> at_lo = group_lo == b.lo ? b.order_lo : order_at(group_lo);
            std::vector<std::uint32_t> at_hi = group_hi == b.hi ? b.order_hi : order_at(group_hi);
            const std::uint64_t under = b.below + pairs_between(b.order_lo, at_lo);
            const std::uint64_t upto = under + pairs_between(at_lo, at_hi);
            if (upto > b.below + b.inside) selection_failed();
            const bool first_in = first >= under && first < upto, last_in = last >= under && last < upto;
            if (first_in && last_in) return last > first ? std::vector<double>{v, v} : std::vector<double>{v};
            if (first_in || last_in || (first < under && last >= upto))  // the ranks straddle the group
                return {select(b, first, first).front(), select(b, last, last).front()};
            if (last < under) {
                b.hi = group_lo, b.inside = under - b.below;
                b.order_hi.swap(at_lo);
            } else {
                b.lo = group_hi, b.inside = b.below + b.inside - upto, b.below = upto;
                b.order_lo.swap(at_hi);
            }
            continue;
        }
        // The bracket's ends are left out with their own ties, so a tie group at an end is never kept.
        narrow(b, at.lo < 0 ? b.lo : just_above(sample[at.lo]), at.hi > at.last ? b.hi : just_below(sample[at.hi]), first, last);
    }
    selection_failed();
}

std::vector<double> PairwiseSlopes::at_ranks(const std::vector<double>& ranks) const {
    std::uint64_t lowest = count_, highest = 0;
    for (double rank : ranks) {
        if (!(rank >= 1 && rank <= static_cast<double>(count_))) throw Refusal("slope rank out of range");
        const auto k = static_cast<std::uint64_t>(std::floor(rank));
        lowest = std::min(lowest, k - 1);
        highest = std::max(highest, std::min(k, count_ - 1));
    }
    Bracket shared = all_;
    shared_step(shared, lowest, highest);
    std::vector<double> out;
    for (double rank : ranks) {
        const auto k = static_cast<std::uint64_t>(std::floor(rank));
        const double fraction = rank - std::floor(rank);
        if (fraction == 0 || k == count_) {
            out.push_back(unscaled(select(shared, k - 1, k - 1).front()));
        } else {
            const std::vector<double> two = select(shared, k - 1, k);
            const double a = unscaled(two[0]), b = unscaled(two[1]);
            out.push_back(a + fraction * (b - a));
        }
    }
    return out;
}

double PairwiseSlopes::order_statistic(std::uint64_t k) const { return at_ranks({static_cast<double>(k)}).front(); }

double PairwiseSlopes::median() const {
    if (count_ == 0) throw Refusal("no pairs of readings at different times");
    return at_ranks({median_rank()}).front();
}

// ---------------------------------------------------------------------------------------------
// TRACK.TREND
// ---------------------------------------------------------------------------------------------

namespace {

CellValue finite_or(double x, const std::string& text) { return std::isfinite(x) ? CellValue{x} : CellValue{text}; }

void add_value(TestResult& r, const std::string& label, const CellValue& v) {
    if (const double* x = std::get_if<double>(&v)) r.add(label, *x);
    else r.add(label, std::get<std::string>(v));
}

}  // namespace

TestResult mann_kendall_trend(const TrendSeries& series, const TrendOptions& options) {
    const std::span<const double> values = series.values, times = series.times;
    const std::size_t n = values.size();
    if (times.size() != n) throw Refusal("values and times must have the same number of rows");
    if (!series.censored.empty() && series.censored.size() != n) throw Refusal("values and their censored flags must have the same number of rows");
    if (!series.seasons.empty() && series.seasons.size() != n) throw Refusal("values and seasons must have the same number of rows");
    if (!(options.level > 0 && options.level < 1)) throw Refusal("level must be between 0 and 1 (e.g. 0.95), or a percentage from 50 to 99.9");
    if (n < 3) throw Refusal("needs at least 3 readings with a time, found " + std::to_string(n));
    for (std::size_t i = 0; i < n; ++i)
        if (!std::isfinite(values[i]) || !std::isfinite(times[i])) throw Refusal("values and times must be finite numbers");

    // One detection limit (FUNCTIONS.md): every reading below it, censored or not, ties with the
    // others below it and lies under every reading at or above it.
    const auto is_censored = [&](std::size_t i) { return !series.censored.empty() && series.censored[i] != 0; };
    std::set<double> limits;
    for (std::size_t i = 0; i < n; ++i)
        if (is_censored(i)) limits.insert(values[i]);
    if (limits.size() > 1) {
        std::string listed;
        for (double l : limits) listed += (listed.empty() ? "<" : ", <") + number_label(l);
        throw Refusal("values hold readings below " + std::to_string(limits.size()) + " different detection limits (" + listed +
                      "); TRACK.TREND takes one limit for now: write every reading below the highest limit as <" +
                      number_label(*limits.rbegin()) + " first");
    }
    const double limit = limits.empty() ? 0.0 : *limits.begin();
    if (!limits.empty() && !(limit > 0)) throw Refusal("a detection limit must be above 0 (found <" + number_label(limit) + ")");
    std::vector<double> ordered(n), numeric(n);  // ordered: for S; numeric: for the slope and medians
    std::size_t below_limit = 0, censored = 0;
    for (std::size_t i = 0; i < n; ++i) {
        const bool below = !limits.empty() && (is_censored(i) || values[i] < limit);
        censored += is_censored(i) ? 1 : 0;
        below_limit += below ? 1 : 0;
        ordered[i] = below ? std::nextafter(limit, -infinity) : values[i];
        // The slope needs a number: half the limit for every reading below it (common practice,
        // no single source; it ties them, as the test does).
        numeric[i] = below ? limit / 2 : values[i];
    }
    if (std::all_of(ordered.begin(), ordered.end(), [&](double v) { return v == ordered[0]; }))
        throw Refusal(below_limit == n ? "every reading is below the detection limit (<" + number_label(limit) + "); a trend needs readings that vary"
                                       : "every reading is the same (" + number_label(values[0]) + "); a trend needs readings that vary");

    // Seasons in order of first appearance; one season when none are given.
    std::vector<std::uint32_t> season(n, 0);
    std::vector<std::string> season_names;
    if (!series.seasons.empty()) {
        std::unordered_map<std::string, std::uint32_t> code;
        for (std::size_t i = 0; i < n; ++i) {
            const auto [at, added] = code.emplace(series.seasons[i], static_cast<std::uint32_t>(season_names.size()));
            if (added) season_names.push_back(series.seasons[i]);
            season[i] = at->second;
        }
    }
    const std::size_t season_count = std::max<std::size_t>(1, season_names.size());

    // S and its variance, summed over seasons (Hirsch, Slack & Smith 1982, eqs. 2–4): each season is
    // Kendall's score of its readings against their times, ties in both corrected for.
    std::vector<std::vector<std::size_t>> members(season_count);
    for (std::size_t i = 0; i < n; ++i) members[season[i]].push_back(i);
    double s = 0, variance = 0, tau_denominator = 0;
    bool ties = false;
    std::uint64_t discordant = 0;
    for (const auto& rows : members) {
        std::vector<double> t(rows.size()), y(rows.size());
        for (std::size_t k = 0; k < rows.size(); ++k) t[k] = times[rows[k]], y[k] = ordered[rows[k]];
        const KendallScore score = kendall_score(t, y);
        ties = ties || score.ties;
        discordant += score.discordant;
        tau_denominator += score.denominator;
        s += score.s;
        // A season whose readings, or whose times, are all equal adds nothing (its formula's terms
        // cancel only up to rounding).
        const bool flat = std::all_of(y.begin(), y.end(), [&](double v) { return v == y[0]; }) ||
                          std::all_of(t.begin(), t.end(), [&](double v) { return v == t[0]; });
        if (!flat) variance += score.variance;
    }

    const PairwiseSlopes slopes(times, numeric, season_names.empty() ? std::span<const std::uint32_t>{} : season);
    if (slopes.count() == 0)
        throw Refusal(season_names.empty()
                          ? "times hold one time only (" + number_label(times[0]) + "); a trend needs readings at two or more times"
                          : "no season has readings at two different times; the seasonal test compares readings within a season");
    if (!(variance > 0))
        throw Refusal("the readings never differ between two times of the same season; a trend needs readings that vary over time");

    const bool seasonal = season_names.size() > 1 || !series.seasons.empty();
    const bool exact = !seasonal && !ties && n < 50;
    // Continuity correction: S moves in steps of 2, and ±1 is half a step (Kendall 1975; Hirsch,
    // Slack & Smith 1982).
    const double z = (s - (s > 0 ? 1.0 : s < 0 ? -1.0 : 0.0)) / std::sqrt(variance);
    const double p = exact ? kendall_exact_p(n, discordant)
                           : std::min(1.0, 2.0 * boost::math::cdf(boost::math::complement(boost::math::normal(), std::fabs(z))));
    const double tau = s / tau_denominator;

    // Sen slope per unit of times, and its interval from the ranks (N ∓ C)/2 and (N ± C)/2 + 1 of the
    // ordered slopes, C = z₁₋α/₂ √Var(S) (Sen 1968; Gilbert 1987, Statistical Methods for
    // Environmental Pollution Monitoring, § 16.5).
    const double big_n = static_cast<double>(slopes.count());
    const double c = boost::math::quantile(boost::math::complement(boost::math::normal(), (1.0 - options.level) / 2.0)) * std::sqrt(variance);
    const double lower_rank = (big_n - c) / 2, upper_rank = (big_n + c) / 2 + 1;
    const bool has_interval = lower_rank >= 1 && upper_rank <= big_n;
    const std::vector<double> chosen =
        slopes.at_ranks(has_interval ? std::vector<double>{slopes.median_rank(), lower_rank, upper_rank} : std::vector<double>{slopes.median_rank()});
    const double per_time = chosen[0];

    const bool per_year = options.unit == TrendUnit::year || (options.unit == TrendUnit::automatic && options.times_are_dates);
    const double factor = per_year ? 365.25 : 1.0;
    const std::string unit = per_year ? "per year" : options.unit == TrendUnit::day ? "per day" : "per unit of time";
    const std::string too_large = "too large to show (beyond the largest number)";
    const double slope = per_time * factor;
    const CellValue estimate = finite_or(slope, too_large);
    const std::string no_interval = "too few readings for a " + format_level(options.level) + " interval";
    const CellValue ci_low = has_interval ? finite_or(chosen[1] * factor, too_large) : CellValue{no_interval};
    const CellValue ci_high = has_interval ? finite_or(chosen[2] * factor, too_large) : CellValue{no_interval};

    // Intercept median(y) − slope·median(t): at time zero, or at the first sampling date for dates.
    // Percent: the slope as a share of the median reading.
    std::vector<double> sorted_numeric = numeric;
    std::sort(sorted_numeric.begin(), sorted_numeric.end());
    const double median_y = median_of_sorted(sorted_numeric);
    const bool median_censored = n % 2 == 1 ? 2 * below_limit > n : 2 * below_limit >= n;
    const double origin = options.times_are_dates ? *std::min_element(times.begin(), times.end()) : 0.0;
    const double median_t = median(std::vector<double>(times.begin(), times.end()));
    CellValue intercept, percent;
    if (median_censored) {
        intercept = percent = std::string("not defined: half or more of the readings are below the detection limit");
    } else {
        intercept = finite_or(median_y - per_time * (median_t - origin), too_large);
        percent = median_y == 0 ? CellValue{std::string("not defined: the median reading is 0")}
                                : finite_or(100.0 * slope / std::fabs(median_y), too_large);
    }

    // Lag-1 serial correlation of the readings in time order (ties in time in row order), on values
    // scaled by a power of two so that their squares neither overflow nor underflow.
    std::vector<std::size_t> by_time(n);
    std::iota(by_time.begin(), by_time.end(), std::size_t{0});
    std::stable_sort(by_time.begin(), by_time.end(), [&](std::size_t a, std::size_t b) { return times[a] < times[b]; });
    const int exponent = scale_exponent(numeric);
    std::vector<double> series_scaled(n);
    for (std::size_t i = 0; i < n; ++i) series_scaled[i] = std::ldexp(numeric[by_time[i]], -exponent);
    const double centre = mean(series_scaled);
    const double squares = sum_of_squares(series_scaled, centre);
    Accumulator lagged;
    for (std::size_t i = 0; i + 1 < n; ++i) lagged.add((series_scaled[i] - centre) * (series_scaled[i + 1] - centre));
    const CellValue lag1 = squares > 0 ? CellValue{lagged.sum() / squares} : CellValue{std::string("not defined: the readings do not vary")};

    TestResult result;
    result.test = std::string(seasonal ? "Seasonal Kendall trend test" : "Mann–Kendall trend test") +
                  (exact ? " (exact p)" : " (normal approximation)");
    result.add("n", static_cast<double>(n));
    result.add("n dropped", static_cast<double>(series.n_dropped));
    result.add("seasons", static_cast<double>(season_count));
    result.add("statistic", s);
    result.add("variance", variance);
    result.add("z", z);
    result.add("p", p);
    result.add("effect", tau);
    add_value(result, "estimate", estimate);
    add_value(result, "ci-low", ci_low);
    add_value(result, "ci-high", ci_high);
    result.add("unit", unit);
    add_value(result, "intercept", intercept);
    add_value(result, "percent", percent);
    result.add("censored", static_cast<double>(censored));
    add_value(result, "lag-1 correlation", lag1);
    result.add("caution", std::string("serial correlation makes p too small (Hamed & Rao 1998, J. Hydrology 204, 182–196)"));

    // The sentence's words (report.hpp renders it): S, p and n; the Sen slope with its interval and τ;
    // the percent; seasons and censored readings in the closing words.
    ReportWords& w = result.words;
    w.shown = true;
    w.statistic_form = ReportWords::Statistic::whole;
    w.statistic_symbol = "S";
    w.n_after_p = true;
    w.estimate = "Sen slope " + unit;
    w.effect = "τ";
    w.extra = "change " + unit + " as % of the median";
    w.extra_quantity = "percent";
    w.level = options.level;
    std::string closing;
    if (seasonal) closing = count_of(season_count, "season");
    if (censored > 0)
        closing += (closing.empty() ? "" : "; ") + count_of(censored, "reading") + " below the detection limit <" + number_label(limit);
    w.closing = closing;
    return result;
}

const KeywordTable& trend_units() {
    static const KeywordTable t{"trend units",
                                {{"auto", "per year when times are formatted as dates, else per unit of times"},
                                 {"year", "per year of 365.25 days (times read as day numbers)"},
                                 {"day", "per day (times read as day numbers)"},
                                 {"none", "per unit of times"}}};
    return t;
}

const KeywordTable& trend_outputs() {
    static const KeywordTable t{"trend outputs",
                                {{"p", "the p-value"},
                                 {"statistic", "Kendall's S"},
                                 {"n", "readings used"},
                                 {"estimate", "the Sen slope per unit"},
                                 {"ci-low", "lower confidence limit of the slope"},
                                 {"ci-high", "upper confidence limit of the slope"},
                                 {"intercept", "the line's value at time zero, or at the first date"},
                                 {"percent", "the slope as a percentage of the median"},
                                 {"effect", "Kendall's τ"},
                                 {"table", "the whole result as an array"},
                                 {"report", "one sentence"}}};
    return t;
}

TrendUnit parse_trend_unit(const std::string& keyword) {
    return static_cast<TrendUnit>(trend_units().index(keyword, "unit"));
}

TestResult track_trend(const Range& values, const Range& times, const Range& seasons, TrendUnit unit, double level) {
    const bool seasonal = !seasons.empty();
    for (const auto& [range, name] : {std::pair<const Range*, const char*>{&values, "values"}, {&times, "times"}, {&seasons, "seasons"}})
        if (!range->empty() && range->columns != 1)
            throw Refusal(std::string(name) + " must be one column, found " + std::to_string(range->columns));
    std::vector<FrameBlock> blocks{{&values, ColumnKind::censored, "values"}, {&times, ColumnKind::numeric, "times"}};
    if (seasonal) blocks.push_back({&seasons, ColumnKind::label, "seasons"});
    const Frame f = read_frame(blocks);
    std::vector<unsigned char> censored(f.censored[0].begin(), f.censored[0].end());
    TrendSeries series;
    series.values = f.numbers[0];
    series.times = f.numbers[1];
    series.censored = censored;
    if (seasonal) series.seasons = f.labels[2];
    series.n_dropped = f.n_dropped;
    TrendOptions options;
    options.level = level;
    options.times_are_dates = times.dates;
    options.unit = unit;
    return mann_kendall_trend(series, options);
}

}  // namespace quadrat
