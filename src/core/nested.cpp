#include "nested.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

#include "blocks.hpp"
#include "exact_scaling.hpp"
#include "finite_numbers.hpp"
#include "oneway.hpp"
#include "refusal.hpp"
#include "report.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

// A share as a whole percentage ("37%"), or with its digits below 1% ("0.42%", "0%").
std::string percent(double share) {
    const double p = 100 * share;
    return (p >= 1 ? std::to_string(std::lround(p)) : p == 0 ? std::string("0") : format_number(p)) + "%";
}

}  // namespace

TestResult compare_nested(const NestedReadings& in) {
    const std::size_t n = in.values.size();
    const LabelledReadings labels = index_readings(in.values, in.groups, in.units, "unit");
    const LabelIndex &group = labels.groups, &unit = labels.structure;
    const std::size_t a = group.names.size(), u_count = unit.names.size();

    // Each unit belongs to one group; readings summed per unit (scaled by a power of two, exact).
    constexpr std::size_t unseen = static_cast<std::size_t>(-1);
    const std::span<const double> views[] = {in.values};
    const double scale = power_of_two_scale(views);
    std::vector<std::size_t> group_of_unit(u_count, unseen), count(u_count, 0);
    std::vector<Accumulator> sum(u_count);
    for (std::size_t i = 0; i < n; ++i) {
        const std::size_t g = group.of_row[i], u = unit.of_row[i];
        if (group_of_unit[u] == unseen) group_of_unit[u] = g;
        if (group_of_unit[u] != g)
            throw Refusal("unit " + in_quotes(unit.names[u]) + " appears in groups " + in_quotes(group.names[group_of_unit[u]]) +
                          " and " + in_quotes(group.names[g]) +
                          "; in a nested design each unit belongs to one group — give units in different groups different labels");
        sum[u].add(in.values[i] * scale);
        ++count[u];
    }
    std::vector<std::vector<double>> unit_means(a);  // scaled, per group
    std::vector<std::vector<std::size_t>> units_of(a);
    std::vector<double> mean_of_unit(u_count);
    for (std::size_t u = 0; u < u_count; ++u) {
        mean_of_unit[u] = sum[u].sum() / static_cast<double>(count[u]);
        unit_means[group_of_unit[u]].push_back(mean_of_unit[u]);
        units_of[group_of_unit[u]].push_back(u);
    }
    for (std::size_t g = 0; g < a; ++g)
        if (units_of[g].size() < 2)
            throw Refusal("group " + in_quotes(group.names[g]) + " has 1 unit (" + unit.names[units_of[g][0]] +
                          "); the test of groups over units needs at least 2 units in each group");
    const auto [fewest, most] = std::minmax_element(count.begin(), count.end());
    if (*most == 1)
        throw Refusal("every unit has a single reading, so there are no subsamples to nest; compare the groups with COMPARE.GROUPS");
    const bool unequal = *fewest != *most;

    // The test: one-way ANOVA of the unit means (each unit counts once).
    AnovaTable test;
    try {
        test = one_way_anova_table(unit_means);
        if (!(test.ss_within > 1e-24 * (test.ss_between + test.ss_within))) throw Refusal("");
    } catch (const Refusal&) {
        throw Refusal("the unit means do not vary within any group; the test of groups over units needs variation between units");
    }

    // The nested ANOVA on all readings for the variance components, centred on the grand mean.
    const double total = static_cast<double>(n);
    Accumulator grand_sum;
    for (std::size_t u = 0; u < u_count; ++u) grand_sum.add(sum[u].sum());
    const double grand = grand_sum.sum() / total;
    Accumulator ss_within, ss_units, ss_groups;
    for (std::size_t i = 0; i < n; ++i) {
        const double e = in.values[i] * scale - mean_of_unit[unit.of_row[i]];
        ss_within.add(e * e);
    }
    double sum_nij2_over_ni = 0, sum_nij2 = 0, sum_ni2 = 0;
    for (std::size_t g = 0; g < a; ++g) {
        Accumulator group_sum;
        double ni = 0, nij2 = 0;
        for (std::size_t u : units_of[g]) {
            group_sum.add(static_cast<double>(count[u]) * (mean_of_unit[u] - grand));
            ni += static_cast<double>(count[u]);
            nij2 += static_cast<double>(count[u]) * static_cast<double>(count[u]);
        }
        const double group_mean = group_sum.sum() / ni;  // about the grand mean
        for (std::size_t u : units_of[g]) {
            const double d = mean_of_unit[u] - grand - group_mean;
            ss_units.add(static_cast<double>(count[u]) * d * d);
        }
        ss_groups.add(ni * group_mean * group_mean);
        sum_nij2_over_ni += nij2 / ni;
        sum_nij2 += nij2;
        sum_ni2 += ni * ni;
    }
    const double df_groups = static_cast<double>(a - 1), df_units = static_cast<double>(u_count - a);
    const double df_within = total - static_cast<double>(u_count);
    // Components and shares on the scaled readings; variances multiplied back only where shown.
    const double unscale = 1.0 / (scale * scale);
    const double ms_groups = ss_groups.sum() / df_groups, ms_units = ss_units.sum() / df_units;
    const double ms_within = ss_within.sum() / df_within;
    const double n0_units = (total - sum_nij2_over_ni) / df_units;
    const double n0_units_in_groups = (sum_nij2_over_ni - sum_nij2 / total) / df_groups;
    const double n0_groups = (total - sum_ni2 / total) / df_groups;
    const double raw_units = (ms_units - ms_within) / n0_units;
    const double raw_groups = (ms_groups - ms_within - n0_units_in_groups * raw_units) / n0_groups;
    const double var_within = ms_within, var_units = std::max(0.0, raw_units), var_groups = std::max(0.0, raw_groups);
    const double var_total = var_within + var_units + var_groups;

    TestResult r;
    r.test = "Nested ANOVA (groups over units within groups)";
    r.add("statistic", test.f)
        .add("df", test.df_between)
        .add("df2", test.df_within)
        .add("p", test.p)
        .add("n", total)
        .add("n dropped", static_cast<double>(in.n_dropped))
        .add("units", static_cast<double>(u_count));
    if (unequal) {
        r.add("subsamples per unit", std::to_string(*fewest) + " to " + std::to_string(*most));
        r.add("test on", std::string("unit means: subsample counts differ, so each unit counts once"));
    } else {
        r.add("subsamples per unit", static_cast<double>(*most));
    }
    r.add("sum of squares (groups)", ss_groups.sum() * unscale)
        .add("sum of squares (units within groups)", ss_units.sum() * unscale)
        .add("sum of squares (within units)", ss_within.sum() * unscale);
    r.add("variance between groups", var_groups * unscale)
        .add("share between groups", var_groups / var_total)
        .add("variance between units", var_units * unscale)
        .add("share between units", var_units / var_total)
        .add("variance within units", var_within * unscale)
        .add("share within units", var_within / var_total);
    std::string note = "classical expected mean squares (Sokal & Rohlf, Biometry)";
    if (raw_groups < 0 || raw_units < 0) {
        note += "; a negative estimate is set to 0:";
        if (raw_groups < 0) note += " between groups " + format_number(raw_groups * unscale);
        if (raw_groups < 0 && raw_units < 0) note += ",";
        if (raw_units < 0) note += " between units " + format_number(raw_units * unscale);
    }
    r.add("variance components", note);
    for (std::size_t g = 0; g < a; ++g) {
        r.add(group.names[g] + ": units", static_cast<double>(units_of[g].size()));
        r.add(group.names[g] + ": mean", mean(unit_means[g]) / scale);
    }
    // The sentence's words (report.hpp renders it); the shares as one phrase it reads, not a table row.
    r.unlisted.push_back({"variance shares", "between groups " + percent(var_groups / var_total) + ", between units " +
                                                 percent(var_units / var_total) + ", within units " + percent(var_within / var_total)});
    r.words.shown = true;
    r.words.title = "Nested ANOVA";
    r.words.statistic_symbol = "F";
    r.words.statistic_df = true;
    r.words.extra = "variance components:";
    r.words.extra_quantity = "variance shares";
    r.words.closing = "groups tested over " + count_of(u_count, "unit") + (unequal ? ", on the unit means: subsample counts differ" : "") +
                      "; " + count_of(static_cast<std::size_t>(total), "reading");
    mark_non_finite(r);
    return r;
}

const KeywordTable& nested_outputs() {
    static const KeywordTable t{"nested outputs",
                                {{"p", "the p-value"},
                                 {"statistic", "F of groups over units"},
                                 {"df", "degrees of freedom of groups"},
                                 {"df2", "degrees of freedom of units within groups"},
                                 {"n", "readings used"},
                                 {"table", "the whole result with the variance components"},
                                 {"report", "one sentence"}}};
    return t;
}

TestResult compare_nested(const Range& values, const Range& groups, const Range& units) {
    const LabelledColumns c = read_labelled_columns(values, groups, units, "units");
    return compare_nested(NestedReadings{c.values, c.groups, c.structure, c.n_dropped});
}

}  // namespace quadrat
