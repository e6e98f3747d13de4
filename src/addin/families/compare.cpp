// COMPARE.*: tests of a difference.
#include <optional>

#include "addin/families/common.hpp"
#include "core/adjust.hpp"
#include "core/blocks.hpp"
#include "core/censored.hpp"
#include "core/counts.hpp"
#include "core/letters.hpp"
#include "core/nested.hpp"
#include "core/oneway.hpp"
#include "core/paired.hpp"
#include "core/posthoc.hpp"

namespace quadrat::addin {
namespace {

// COMPARE.POSTHOC's and COMPARE.LETTERS' arguments, in this order.
std::vector<Argument> posthoc_arguments() {
    return {values_argument(), groups_argument(), keyword("method", posthoc_methods(), "tukey", "Post-hoc method"),
            keyword("adjust", adjustment_methods(), "",
                    "Adjustment, holm when empty (tukey and games-howell adjust already)"),
            transform_argument(), level()};
}

std::optional<Adjustment> adjustment_of(const Request& r) {
    const std::string& adjust = r.keyword("adjust");
    return adjust.empty() ? std::nullopt : std::optional<Adjustment>(parse_adjustment(adjust));
}

// COMPARE.BLOCKS: the test is remembered on the data and method (`adjust` changes only `pairs`);
// `pairs` is COMPARE.POSTHOC's array, computed when asked.
Entry blocks_entry() {
    const auto columns = [](const Request& r) {
        return read_labelled_columns(r.range("values"), r.range("groups"), r.range("blocks"), "blocks");
    };
    Entry e = test([columns](const Request& r) { return compare_blocks(columns(r).blocks(), r.keyword("method")); });
    e.keyed = {"values", "groups", "blocks", "method"};
    e.show = [columns](const void* result, const Request& r) -> Table {
        if (r.keyword("output") == "pairs")
            return compare_blocks_pairs(columns(r).blocks(), r.keyword("method"), adjustment_of(r)).table();
        return show_test(*static_cast<const TestResult*>(result), r);
    };
    return e;
}

const Declare compare{
    Function{"COMPARE.GROUPS", "compareGroups",
             "Tests a difference in location between two or more groups: Welch, pooled or ranks.",
             {values_argument(), groups_argument(), keyword("method", location_methods(), "welch", "Test"),
              test_output(), transform_argument()},
             test([](const Request& r) {
                 return compare_groups(r.groups("values", "groups"), r.keyword("method"), parse_transform(r.keyword("transform")));
             })},

    // `second` is an `any` so that it can be a typed number (a one-sample test), yet it is required.
    Function{"COMPARE.PAIRED", "comparePaired",
             "Tests the difference of readings paired by row (before/after), or one sample against a number.",
             {data("first", "First reading of each pair (numbers)."),
              cells("second", "Required: the second reading of each pair (same rows), or one number to test against."),
              keyword("method", paired_methods(), "t", "Test"), test_output(), transform_argument()},
             test([](const Request& r) {
                 return compare_paired(read_paired(r.range("first"), r.range("second")), r.keyword("method"),
                                       parse_transform(r.keyword("transform")));
             })},

    Function{"COMPARE.POSTHOC", "comparePosthoc",
             "Every pair of groups as an array (array formula): estimate, interval, statistic, p, adjusted p, significant.",
             posthoc_arguments(),
             table([](const Request& r) {
                 return compare_posthoc(r.groups("values", "groups"), parse_posthoc_method(r.keyword("method")),
                                        adjustment_of(r), parse_transform(r.keyword("transform")), r.level())
                     .table();
             })},

    Function{"COMPARE.LETTERS", "compareLetters",
             "Compact letter display (array formula): groups sharing a letter do not differ significantly.",
             posthoc_arguments(),
             table([](const Request& r) {
                 return compare_letters(r.groups("values", "groups"), parse_posthoc_method(r.keyword("method")),
                                        adjustment_of(r), parse_transform(r.keyword("transform")), r.level())
                     .table();
             })},

    // One argument: a block of counts; two: two label columns cross-tabulated. Remembered: an
    // exact r×c test can take a noticeable fraction of a second.
    Function{"COMPARE.COUNTS", "compareCounts",
             "Tests association between two categorical variables, from a block of counts or two label columns.",
             {data("categories", "A block of counts (a text first row and column name them), or a first label column."),
              optional(labels("labels2", "Second label column, when categories holds labels.")),
              keyword("method", count_methods(), "chi-square", "Test"), test_output(count_outputs())},
             test([](const Request& r) {
                 const ContingencyTable table = r.given("labels2") ? cross_tabulate(r.range("categories"), r.range("labels2"))
                                                                   : read_count_block(r.range("categories"));
                 return compare_counts(table, r.keyword("method"));
             })},

    Function{"COMPARE.EXPECTED", "compareExpected",
             "χ² goodness of fit of observed counts against expected proportions or counts.",
             {data("observed", "Observed counts, one per category."),
              optional(cells("expected", "Expected proportions or counts, same size (equal when empty).")),
              test_output(expected_outputs())},
             test([](const Request& r) {
                 const ExpectedInput in = read_expected_input(r.range("observed"), r.range("expected"));
                 return compare_expected(in.observed, in.expected, in.n_dropped);
             })},

    Function{"COMPARE.BLOCKS", "compareBlocks",
             "Compares groups within blocks (site, transect, date): block ANOVA, Friedman, or paired tests for two groups.",
             {values_argument(), labels("groups", "Group (treatment, zone, visit) of each row."),
              labels("blocks", "Block (transect, site, date) of each row; a block missing a group is dropped."),
              keyword("method", block_methods(), "pooled", "Test"),
              output(block_outputs(), "p", "What the cell shows (p from 0 to 1); pairs: array of every pair"),
              keyword("adjust", adjustment_methods(), "holm", "Adjustment of the pairs' p")},
             blocks_entry()},

    Function{"COMPARE.NESTED", "compareNested",
             "Compares groups when several subsamples come from each sampling unit (nested ANOVA, variance components).",
             {values_argument(), labels("groups", "Group of each row."),
              labels("units", "Sampling unit (plot, net, well) each subsample came from; one group per unit."),
              output(nested_outputs(), "p", "What the cell shows (p from 0 to 1)")},
             test([](const Request& r) { return compare_nested(r.range("values"), r.range("groups"), r.range("units")); })},

    // Values below a detection limit (`<0.5`) are read with their limit and flag, never dropped.
    Function{"COMPARE.CENSORED", "compareCensored",
             "Tests a difference between two or more groups holding values below detection limits (<0.5): "
             "generalized Wilcoxon tests.",
             {data("values", "Measurements in their unit; a lab's <0.5 is a value below that limit, not a missing one."),
              groups_argument(), keyword("method", censored_test_methods(), "peto-prentice", "Test"),
              test_output(censored_test_outputs())},
             test([](const Request& r) {
                 return compare_censored(censored_groups(read_censored_groups(r.range("values"), r.range("groups"))),
                                         r.keyword("method"));
             })},
};

}  // namespace
}  // namespace quadrat::addin
