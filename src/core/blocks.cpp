#include "blocks.hpp"

#include <algorithm>
#include <cmath>
#include <string_view>
#include <unordered_map>
#include <utility>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/fisher_f.hpp>
#include <boost/math/distributions/students_t.hpp>

#include "data.hpp"
#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "keywords.hpp"
#include "paired.hpp"
#include "ranks.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

const KeywordTable& block_methods() {
    static const KeywordTable t{"block methods",
                                {{"pooled", "randomized complete block ANOVA; paired t for two groups"},
                                 {"ranks", "Friedman test; Wilcoxon signed-rank for two groups"},
                                 {"sign", "exact sign test, two groups"}}};
    return t;
}

const KeywordTable& block_outputs() {
    static const KeywordTable t{"block outputs",
                                {{"p", "the p-value"},
                                 {"statistic", "F, χ², t, T⁺ or the count of positive differences"},
                                 {"df", "degrees of freedom (the first for F)"},
                                 {"df2", "the second degrees of freedom of F"},
                                 {"n", "readings used"},
                                 {"effect", "partial η² (pooled) or Kendall's W (ranks)"},
                                 {"table", "the whole result as an array"},
                                 {"report", "one sentence"},
                                 {"pairs", "every pair of groups, in COMPARE.POSTHOC's layout"}}};
    return t;
}

LabelledColumns read_labelled_columns(const Range& values, const Range& groups, const Range& structure,
                                      const std::string& structure_name) {
    for (const auto& [range, name] : {std::pair<const Range*, std::string>{&values, "values"}, {&groups, "groups"}, {&structure, structure_name}})
        if (!range->empty() && range->columns != 1)
            throw Refusal(name + " must be one column, found " + std::to_string(range->columns));
    const Frame f = read_frame({{&values, ColumnKind::numeric, "values"},
                                {&groups, ColumnKind::label, "groups"},
                                {&structure, ColumnKind::label, structure_name}});
    LabelledColumns c;
    c.values = f.numbers[0];
    c.groups = f.labels[1];
    c.structure = f.labels[2];
    c.n_dropped = f.n_dropped;
    return c;
}

namespace {

std::string method_of(const std::string& given, std::size_t groups) {
    const std::string method = block_methods().pick(given, "method");
    if (method == "sign" && groups != 2)
        throw Refusal("method 'sign' compares exactly 2 groups, found " + std::to_string(groups) +
                      "; use 'pooled' (block ANOVA) or 'ranks' (Friedman test)");
    return method;
}

// COMPARE.PAIRED's method for the two-group case.
std::string paired_method(const std::string& method) {
    return method == "pooled" ? "t" : method == "ranks" ? "signed-rank" : "sign";
}

// "8 blocks used, 1 dropped for a missing group, 4 readings averaged": the design clause of every
// report sentence (kept in this one function so that it can move to the report renderer).
std::string design_clause(const BlockLayout& l) {
    std::string s = count_of(l.block_count(), "block") + " used";
    if (l.blocks_dropped > 0) s += ", " + std::to_string(l.blocks_dropped) + " dropped for a missing group";
    if (l.readings_averaged > 0) s += ", " + count_of(l.readings_averaged, "reading") + " averaged within their cells";
    return s;
}

void add_design_rows(TestResult& r, const BlockLayout& l) {
    r.add("blocks used", static_cast<double>(l.block_count()))
        .add("blocks dropped", static_cast<double>(l.blocks_dropped))
        .add("readings averaged", static_cast<double>(l.readings_averaged));
}

void set_number(TestResult& r, const std::string& label, double value) {
    for (auto& q : r.quantities)
        if (q.label == label) q.value = value;
}

void insert_after(TestResult& r, const std::string& after, Quantity q) {
    auto at = std::find_if(r.quantities.begin(), r.quantities.end(), [&](const Quantity& x) { return x.label == after; });
    r.quantities.insert(at == r.quantities.end() ? at : at + 1, std::move(q));
}

PairedReadings matched_pairs(const BlockLayout& l, std::size_t first, std::size_t second, std::size_t n_dropped) {
    PairedReadings p;
    p.first = l.column(first);
    p.second = l.column(second);
    p.first_name = l.groups[first];
    p.second_name = l.groups[second];
    p.n_dropped = n_dropped;
    return p;
}

// Ranks within each block (mid-ranks for ties): rank sums per group, Σr², Σ(t³ − t).
struct BlockRanks {
    std::vector<double> rank_sums;
    double sum_of_squared_ranks = 0;  // A₁
    double tie_term = 0;
};

BlockRanks rank_within_blocks(const BlockLayout& l) {
    const std::size_t k = l.group_count(), b = l.block_count();
    BlockRanks out;
    out.rank_sums.assign(k, 0.0);
    for (std::size_t i = 0; i < b; ++i) {
        const Ranking r = rank_with_ties(std::span<const double>(l.cells).subspan(i * k, k));
        for (std::size_t j = 0; j < k; ++j) {
            out.rank_sums[j] += r.ranks[j];  // multiples of ½: exact
            out.sum_of_squared_ranks += r.ranks[j] * r.ranks[j];
        }
        out.tie_term += r.tie_term;
    }
    return out;
}

// A₁ − C₁ = (bk(k² − 1) − Σ(t³ − t))/12, exact in whole numbers; zero when every block is all tied.
double rank_spread(const BlockRanks& r, double b, double k) { return (b * k * (k * k - 1) - r.tie_term) / 12; }

}  // namespace

LabelIndex::LabelIndex(std::span<const std::string> labels) {
    std::unordered_map<std::string_view, std::size_t> index;
    index.reserve(std::min<std::size_t>(labels.size(), std::size_t{1} << 16));
    of_row.resize(labels.size());
    for (std::size_t i = 0; i < labels.size(); ++i) {
        const auto [at, added] = index.try_emplace(std::string_view(labels[i]), names.size());
        if (added) names.push_back(labels[i]);
        of_row[i] = at->second;
    }
}

std::vector<double> BlockLayout::column(std::size_t group) const {
    std::vector<double> out(blocks.size());
    for (std::size_t i = 0; i < blocks.size(); ++i) out[i] = cell(i, group);
    return out;
}

LabelledReadings index_readings(std::span<const double> values, std::span<const std::string> groups,
                                std::span<const std::string> structure, const std::string& structure_name) {
    const std::size_t n = values.size();
    if (groups.size() != n || structure.size() != n)
        throw Refusal("values, groups and " + structure_name + "s must have the same number of rows");
    if (n == 0)
        throw Refusal("no row has a value with both a group and a " + structure_name + " label; values needs numbers, groups and " +
                      structure_name + "s labels in the same rows");
    require_finite(values);
    LabelledReadings out{LabelIndex(groups), LabelIndex(structure)};
    if (out.groups.names.size() < 2)
        throw Refusal("needs at least 2 groups, found 1 (" + out.groups.names[0] +
                      "); groups holds the label of each reading's group");
    return out;
}

BlockLayout lay_out_blocks(const BlockReadings& in) {
    const std::size_t n = in.values.size();
    const LabelledReadings labels = index_readings(in.values, in.groups, in.blocks, "block");
    const LabelIndex &group = labels.groups, &block = labels.structure;
    const std::size_t k = group.names.size(), blocks = block.names.size();
    if (blocks < 2)
        throw Refusal("all readings are in one block (" + block.names[0] +
                      "); a block design compares groups within at least 2 blocks — with independent groups use COMPARE.GROUPS");

    // Rows by block (a counting sort: stable, so row order is kept inside a block).
    std::vector<std::size_t> start(blocks + 1, 0), order(n);
    for (std::size_t i = 0; i < n; ++i) ++start[block.of_row[i] + 1];
    for (std::size_t j = 0; j < blocks; ++j) start[j + 1] += start[j];
    {
        std::vector<std::size_t> next(start.begin(), start.end() - 1);
        for (std::size_t i = 0; i < n; ++i) order[next[block.of_row[i]]++] = i;
    }

    // Readings are summed multiplied by one power of two (exact), so that 1e308 readings average
    // without overflow; the means are scaled back.
    const std::span<const double> views[] = {in.values};
    const double scale = power_of_two_scale(views);
    constexpr std::size_t unseen = static_cast<std::size_t>(-1);
    std::vector<std::size_t> seen_in(k, unseen), count(k, 0), blocks_of_group(k, 0), last_block_of_group(k, 0);
    std::vector<Accumulator> sum(k);
    BlockLayout out;
    out.groups = group.names;
    out.n_dropped = in.n_dropped;
    for (std::size_t j = 0; j < blocks; ++j) {
        std::size_t present = 0;
        for (std::size_t at = start[j]; at < start[j + 1]; ++at) {
            const std::size_t row = order[at], g = group.of_row[row];
            if (seen_in[g] != j) {
                seen_in[g] = j;
                sum[g] = Accumulator();
                count[g] = 0;
                ++present;
                ++blocks_of_group[g];
                last_block_of_group[g] = j;
            }
            sum[g].add(in.values[row] * scale);
            ++count[g];
        }
        if (present < k) {
            ++out.blocks_dropped;
            continue;
        }
        out.blocks.push_back(block.names[j]);
        for (std::size_t g = 0; g < k; ++g) {
            out.cells.push_back(sum[g].sum() / static_cast<double>(count[g]) / scale);
            if (count[g] > 1) out.readings_averaged += count[g];
        }
        out.readings_used += start[j + 1] - start[j];
    }

    for (std::size_t g = 0; g < k; ++g)
        if (blocks_of_group[g] == 1)
            throw Refusal("group " + in_quotes(group.names[g]) + " is read in block " +
                          in_quotes(block.names[last_block_of_group[g]]) +
                          " only; each group must be read in at least 2 blocks (a block missing a group is dropped whole)");
    if (out.blocks.empty())
        throw Refusal("no block holds every group (" + std::to_string(k) + " groups, " + std::to_string(blocks) +
                      " blocks); a block missing a group is dropped whole — check the group and block labels");
    if (out.blocks.size() == 1)
        throw Refusal("only block " + in_quotes(out.blocks[0]) + " holds every group (" +
                      std::to_string(out.blocks_dropped) + " dropped for a missing group); a block comparison needs at least 2 complete blocks");
    return out;
}

TestResult randomized_block_anova(const BlockLayout& l) {
    const std::size_t k = l.group_count(), b = l.block_count();
    // Cell means scaled by a power of two and centred on their grand mean before any square.
    const std::span<const double> views[] = {l.cells};
    const double scale = power_of_two_scale(views);
    std::vector<double> y(l.cells);
    for (double& x : y) x *= scale;
    const double centre = mean(y);
    for (double& x : y) x -= centre;
    const double grand = mean(y);
    std::vector<double> group_mean(k), block_mean(b);
    for (std::size_t g = 0; g < k; ++g) {
        Accumulator s;
        for (std::size_t i = 0; i < b; ++i) s.add(y[i * k + g]);
        group_mean[g] = s.sum() / static_cast<double>(b);
    }
    for (std::size_t i = 0; i < b; ++i) block_mean[i] = mean(std::span<const double>(y).subspan(i * k, k));
    Accumulator ss_groups, ss_blocks, ss_residual, ss_total;
    for (std::size_t g = 0; g < k; ++g) ss_groups.add(static_cast<double>(b) * (group_mean[g] - grand) * (group_mean[g] - grand));
    for (std::size_t i = 0; i < b; ++i) ss_blocks.add(static_cast<double>(k) * (block_mean[i] - grand) * (block_mean[i] - grand));
    for (std::size_t i = 0; i < b; ++i)
        for (std::size_t g = 0; g < k; ++g) {
            const double e = y[i * k + g] - block_mean[i] - group_mean[g] + grand;
            ss_residual.add(e * e);
            ss_total.add((y[i * k + g] - grand) * (y[i * k + g] - grand));
        }
    // A residual at the rounding level of the data (readings that are exactly group + block) is no
    // spread: F would be a quotient of rounding errors.
    if (!(ss_residual.sum() > 1e-24 * ss_total.sum()))
        throw Refusal("the readings are fitted exactly by group and block (no residual spread); the block ANOVA needs "
                      "variation beyond group and block effects");
    const double df1 = static_cast<double>(k - 1), df2 = static_cast<double>((b - 1) * (k - 1));
    const double f = require_finite_statistic((ss_groups.sum() / df1) / (ss_residual.sum() / df2), "F");
    const boost::math::fisher_f dist(df1, df2);
    const double unscale = 1.0 / (scale * scale);
    TestResult r;
    r.test = "Randomized complete block ANOVA";
    r.add("statistic", f)
        .add("df", df1)
        .add("df2", df2)
        .add("p", cdf(complement(dist, f)))
        .add("n", static_cast<double>(l.readings_used))
        .add("effect", ss_groups.sum() / (ss_groups.sum() + ss_residual.sum()))
        .add("sum of squares (groups)", ss_groups.sum() * unscale)
        .add("sum of squares (blocks)", ss_blocks.sum() * unscale)
        .add("sum of squares (residual)", ss_residual.sum() * unscale);
    for (std::size_t g = 0; g < k; ++g) r.add(l.groups[g] + ": mean", (group_mean[g] + centre) / scale);
    return r;
}

TestResult friedman_test(const BlockLayout& l) {
    const std::size_t k = l.group_count(), b = l.block_count();
    const double kk = static_cast<double>(k), bb = static_cast<double>(b);
    const BlockRanks ranks = rank_within_blocks(l);
    const double spread = rank_spread(ranks, bb, kk);
    if (!(spread > 0))
        throw Refusal("every block has all its groups tied; the Friedman test needs at least one block where the groups differ");
    Accumulator deviations;
    for (double rj : ranks.rank_sums) deviations.add((rj - bb * (kk + 1) / 2) * (rj - bb * (kk + 1) / 2));
    const double t1 = (kk - 1) * deviations.sum() / spread;
    const double df = kk - 1, df2 = (bb - 1) * (kk - 1);
    const boost::math::chi_squared chi(df);
    TestResult r;
    r.test = "Friedman test (tie-corrected χ²)";
    r.add("statistic", t1)
        .add("df", df)
        .add("p", cdf(complement(chi, t1)))
        .add("n", static_cast<double>(l.readings_used))
        .add("effect", t1 / (bb * (kk - 1)));
    // Iman–Davenport: b(k − 1) − T₁ is zero when every block ranks the groups alike without ties.
    const double room = bb * (kk - 1) - t1;
    if (room > 1e-12 * bb * (kk - 1)) {
        const double f = (bb - 1) * t1 / room;
        const boost::math::fisher_f dist(df, df2);
        r.add("Iman–Davenport F", f).add("Iman–Davenport df", df).add("Iman–Davenport df2", df2);
        r.add("Iman–Davenport p", cdf(complement(dist, f)));
    } else {
        r.add("Iman–Davenport F", std::string("unbounded: every block ranks the groups alike"));
        r.add("Iman–Davenport df", df).add("Iman–Davenport df2", df2).add("Iman–Davenport p", 0.0);
    }
    for (std::size_t g = 0; g < k; ++g) r.add(l.groups[g] + ": rank sum", ranks.rank_sums[g]);
    for (std::size_t g = 0; g < k; ++g) r.add(l.groups[g] + ": median", median(l.column(g)));
    return r;
}

TestResult compare_blocks(const BlockReadings& readings, const std::string& method_given) {
    const BlockLayout l = lay_out_blocks(readings);
    const std::string method = method_of(method_given, l.group_count());
    const double n = static_cast<double>(l.readings_used);
    TestResult r;
    if (l.group_count() == 2) {
        // COMPARE.PAIRED on the matched cell means: the same statistic, p, estimate and interval.
        r = compare_paired(matched_pairs(l, 0, 1, l.n_dropped), paired_method(method), Transform::none);
        r.test += ", pairs matched by block";
        set_number(r, "n", n);
        insert_after(r, "n dropped", {"blocks used", static_cast<double>(l.block_count())});
        insert_after(r, "blocks used", {"blocks dropped", static_cast<double>(l.blocks_dropped)});
        insert_after(r, "blocks dropped", {"readings averaged", static_cast<double>(l.readings_averaged)});
        r.words.title = r.test.substr(0, r.test.find(", pairs matched by block"));
        r.words.closing = "pairs matched by block: " + design_clause(l);
        return r;
    }
    r = method == "pooled" ? randomized_block_anova(l) : friedman_test(l);
    insert_after(r, "n", {"n dropped", static_cast<double>(l.n_dropped)});
    // Design rows after the effect, before the method's own rows.
    TestResult design;
    add_design_rows(design, l);
    auto at = std::find_if(r.quantities.begin(), r.quantities.end(), [](const Quantity& q) { return q.label == "effect"; });
    r.quantities.insert(at + 1, design.quantities.begin(), design.quantities.end());

    r.words.shown = true;
    r.words.title = r.test.substr(0, r.test.find(" ("));
    r.words.statistic_symbol = method == "pooled" ? "F" : "χ²";
    r.words.statistic_df = true;
    r.words.effect = method == "pooled" ? "partial η²" : "Kendall's W";
    r.words.closing = std::to_string(l.group_count()) + " groups; " + design_clause(l);
    mark_non_finite(r);
    return r;
}

PosthocResult compare_blocks_pairs(const BlockReadings& readings, const std::string& method_given,
                                   std::optional<Adjustment> adjust, double level) {
    const BlockLayout l = lay_out_blocks(readings);
    const std::string method = method_of(method_given, l.group_count());
    const std::size_t k = l.group_count(), b = l.block_count();
    if (k > posthoc_max_groups)
        throw Refusal("pairwise comparisons take at most " + std::to_string(posthoc_max_groups) + " groups, found " +
                      std::to_string(k));
    PosthocResult result;
    result.groups = l.groups;
    result.n.assign(k, b);
    for (std::size_t i = 0; i < k; ++i)
        for (std::size_t j = i + 1; j < k; ++j) {
            PairComparison c;
            c.first = i;
            c.second = j;
            result.pairs.push_back(c);
        }

    if (method == "ranks" && k > 2) {
        // Conover (1999), §5.8, eq. 8: the rank sums compared on (b − 1)(k − 1) df.
        const BlockRanks ranks = rank_within_blocks(l);
        const double kk = static_cast<double>(k), bb = static_cast<double>(b);
        if (!(rank_spread(ranks, bb, kk) > 0))
            throw Refusal("every block has all its groups tied; the Friedman test needs at least one block where the groups differ");
        Accumulator squared_sums;
        for (double rj : ranks.rank_sums) squared_sums.add(rj * rj);
        const double spread = bb * ranks.sum_of_squared_ranks - squared_sums.sum();
        if (!(spread > 0))
            throw Refusal("every block ranks the groups alike; Conover's comparisons need some disagreement between "
                          "blocks (the Friedman test itself is in output 'p')");
        const double df = (bb - 1) * (kk - 1);
        const double se = std::sqrt(2 * spread / df);
        const boost::math::students_t dist(df);
        const double critical = quantile(complement(dist, (1 - level) / 2));
        for (auto& c : result.pairs) {
            const double d = ranks.rank_sums[c.first] - ranks.rank_sums[c.second];
            c.statistic = d / se;
            c.p = std::min(1.0, 2 * cdf(complement(dist, std::fabs(c.statistic))));
            c.estimate = d / bb;
            c.ci_low = (d - critical * se) / bb;
            c.ci_high = (d + critical * se) / bb;
        }
        result.test = "Conover's pairwise comparisons of rank sums after the Friedman test";
    } else {
        const std::string test = k == 2 ? paired_method(method) : "t";
        for (auto& c : result.pairs) {
            TestResult r;
            try {
                r = compare_paired(matched_pairs(l, c.first, c.second, 0), test, Transform::none, level);
            } catch (const Refusal& e) {
                throw Refusal("groups " + in_quotes(l.groups[c.first]) + " and " + in_quotes(l.groups[c.second]) + ": " + e.what());
            }
            c.statistic = r.number("statistic");
            c.p = r.number("p");
            c.estimate = r.number("estimate");
            c.ci_low = *r.find("ci-low");
            c.ci_high = *r.find("ci-high");
            if (k == 2) result.test = r.test + ", pairs matched by block";
        }
        if (k > 2) result.test = "paired t-tests, pairs matched by block";
    }

    const Adjustment a = adjust.value_or(Adjustment::holm);
    std::vector<double> p;
    for (const auto& c : result.pairs) p.push_back(c.p);
    const std::vector<double> adjusted = adjust_p(p, a);
    for (std::size_t i = 0; i < adjusted.size(); ++i) {
        result.pairs[i].adjusted_p = adjusted[i];
        result.pairs[i].significant = adjusted[i] < 1 - level;
    }
    result.test += ", " + adjustment_name(a) + "-adjusted";
    return result;
}

}  // namespace quadrat
