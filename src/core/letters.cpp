#include "letters.hpp"

#include <algorithm>
#include <bitset>
#include <numeric>

#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

// One letter: the set of groups (positions in descending order of centre) that carry it.
using LetterSet = std::bitset<posthoc_max_groups>;

// Bounds the work of insert-and-absorb on adversarial patterns (the number of columns can grow
// combinatorially in principle); real comparisons stay far below.
constexpr std::size_t max_columns = 256;

// Absorb: drop every column contained in another (keeping the first of equal ones).
void absorb(std::vector<LetterSet>& columns) {
    std::vector<LetterSet> kept;
    for (std::size_t i = 0; i < columns.size(); ++i) {
        bool contained = false;
        for (std::size_t j = 0; j < columns.size() && !contained; ++j) {
            if (i == j) continue;
            const bool subset = (columns[i] & ~columns[j]).none();
            const bool equal = columns[i] == columns[j];
            contained = subset && (!equal || j < i);
        }
        if (!contained) kept.push_back(columns[i]);
    }
    columns.swap(kept);
}

std::string letter(std::size_t index) {
    return std::string(1, index < 26 ? static_cast<char>('a' + index) : static_cast<char>('A' + (index - 26)));
}

}  // namespace

std::vector<std::string> compact_letters(const std::vector<double>& centre, const std::vector<std::vector<bool>>& differs) {
    const std::size_t k = centre.size();
    if (k == 0) return {};
    if (k > posthoc_max_groups) throw Refusal("a letter display takes at most 100 groups");
    // Positions: 0 is the group with the largest centre.
    std::vector<std::size_t> order(k);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return centre[a] > centre[b]; });

    // Insert: for each differing pair, split every letter shared by both into one without each.
    std::vector<LetterSet> columns(1);
    for (std::size_t i = 0; i < k; ++i) columns[0].set(i);
    for (std::size_t a = 0; a < k; ++a)
        for (std::size_t b = a + 1; b < k; ++b) {
            if (!differs[order[a]][order[b]]) continue;
            std::vector<LetterSet> next;
            bool split = false;
            for (const LetterSet& c : columns) {
                if (c.test(a) && c.test(b)) {
                    LetterSet without_a = c, without_b = c;
                    without_a.reset(a);
                    without_b.reset(b);
                    next.push_back(without_a);
                    next.push_back(without_b);
                    split = true;
                } else {
                    next.push_back(c);
                }
            }
            if (!split) continue;
            absorb(next);
            if (next.size() > max_columns)
                throw Refusal("the pattern of differences is too tangled for a letter display; use COMPARE.POSTHOC");
            columns.swap(next);
        }

    // Sweep: a group keeps a letter only if some group in it shares no other letter with it.
    for (std::size_t c = 0; c < columns.size(); ++c)
        for (std::size_t g = 0; g < k; ++g) {
            if (!columns[c].test(g)) continue;
            bool needed = false;
            bool elsewhere = false;
            for (std::size_t other = 0; other < columns.size(); ++other)
                if (other != c && columns[other].test(g)) elsewhere = true;
            if (!elsewhere) continue;  // its only letter
            for (std::size_t h = 0; h < k && !needed; ++h) {
                if (h == g || !columns[c].test(h)) continue;
                bool shared = false;
                for (std::size_t other = 0; other < columns.size() && !shared; ++other)
                    shared = other != c && columns[other].test(g) && columns[other].test(h);
                needed = !shared;
            }
            if (!needed) columns[c].reset(g);
        }
    columns.erase(std::remove_if(columns.begin(), columns.end(), [](const LetterSet& c) { return c.none(); }), columns.end());
    absorb(columns);

    if (columns.size() > max_letters)
        throw Refusal("the groups need " + std::to_string(columns.size()) + " letters; a letter display stops at " +
                      std::to_string(max_letters) + " (use COMPARE.POSTHOC)");
    // Letters in order of their first group down the centres: `a` for the largest.
    auto key = [&](const LetterSet& c) {
        std::vector<std::size_t> members;
        for (std::size_t i = 0; i < k; ++i)
            if (c.test(i)) members.push_back(i);
        return members;
    };
    std::stable_sort(columns.begin(), columns.end(), [&](const LetterSet& x, const LetterSet& y) { return key(x) < key(y); });
    std::vector<std::string> letters(k);
    for (std::size_t c = 0; c < columns.size(); ++c)
        for (std::size_t position = 0; position < k; ++position)
            if (columns[c].test(position)) letters[order[position]] += letter(c);
    return letters;
}

Table LettersResult::table() const {
    Table t;
    t.push_back({std::string("group"), std::string("n"), std::string(medians ? "median" : "mean"), std::string("letters")});
    for (std::size_t i = 0; i < groups.size(); ++i)
        t.push_back({groups[i], static_cast<double>(n[i]), centre[i], letters[i]});
    return t;
}

LettersResult compare_letters(const Groups& groups, PosthocMethod method, std::optional<Adjustment> adjust,
                              Transform transform, double level) {
    const PosthocResult pairs = compare_posthoc(groups, method, adjust, transform, level);
    const std::size_t k = groups.group_count();
    LettersResult r;
    r.groups = groups.names;
    r.n = pairs.n;
    r.medians = is_rank_method(method);
    // Centres on the data's scale: the median of the values as recorded (a monotone transform does
    // not move it), or the mean of the transformed values back-transformed (a geometric mean for
    // the logs).
    for (std::size_t i = 0; i < k; ++i) {
        if (r.medians) {
            r.centre.push_back(median(groups.values[i]));
        } else {
            std::vector<double> x = groups.values[i];
            apply_transform(transform, x);
            r.centre.push_back(back_transform(transform, mean(x)));
        }
    }
    std::vector<std::vector<bool>> differs(k, std::vector<bool>(k, false));
    for (const auto& c : pairs.pairs) differs[c.first][c.second] = differs[c.second][c.first] = c.significant;
    r.letters = compact_letters(r.centre, differs);
    return r;
}

}  // namespace quadrat
