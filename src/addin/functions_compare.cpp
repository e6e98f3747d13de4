// COMPARE.* handlers: read the arguments, call the core, pick the output.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "addin/memo.hpp"
#include "core/data.hpp"
#include "core/keywords.hpp"
#include "core/oneway.hpp"
#include "core/paired.hpp"
#include "core/refusal.hpp"
#include "core/result.hpp"
#include "core/transform.hpp"

namespace quadrat::addin {

// COMPARE.GROUPS(values; groups; [method]; [output]; [transform])
Table compare_groups(const Arguments& a) {
    const std::string output = keyword_argument(argument(a, 3), "output");
    // Neighbouring cells asking other outputs of the same test share one computation (memo.hpp).
    const auto result = remembered("compareGroups", a, 3, [&] {
        const Groups g = read_groups(argument(a, 0), argument(a, 1));
        const std::string method =
            match_keyword(keyword_argument(argument(a, 2), "method"), {"welch", "pooled", "ranks"}, "method");
        const Transform t = parse_transform(keyword_argument(argument(a, 4), "transform"));
        return quadrat::compare_groups(g, method, t);
    });
    return select_output(*result, output, standard_outputs());
}

namespace {
// The readings of COMPARE.PAIRED: a single number in `second` makes it a one-sample test.
TestResult paired_result(const Arguments& a) {
    const Range& first = argument(a, 0);
    const Range& second = argument(a, 1);
    const std::string method =
        match_keyword(keyword_argument(argument(a, 2), "method"), {"t", "signed-rank", "sign"}, "method");
    const Transform t = parse_transform(keyword_argument(argument(a, 4), "transform"));
    if (is_blank(second))
        throw Refusal("second is missing: give the second reading of each pair, or a number for a one-sample test");
    PairedReadings readings;
    if (second.cells.size() == 1) {
        const Cell& c = second.cells.front();
        if (c.kind != CellKind::number) throw Refusal("second must be a range of readings or a single number");
        const Column column = read_column(first, "first");
        readings.one_sample = true;
        readings.reference_value = c.number;
        readings.first = column.values;
        readings.n_dropped = column.n_dropped;
        if (!column.name.empty()) readings.first_name = column.name;
    } else {
        if (first.columns != 1 || second.columns != 1)
            throw Refusal("first and second must each be one column (found " + std::to_string(first.columns) + " and " +
                          std::to_string(second.columns) + ")");
        Frame f = read_frame({{&first, ColumnKind::numeric, "first"}, {&second, ColumnKind::numeric, "second"}});
        readings.first = std::move(f.numbers[0]);
        readings.second = std::move(f.numbers[1]);
        readings.n_dropped = f.n_dropped;
        if (!f.names[0].empty()) readings.first_name = f.names[0];
        if (!f.names[1].empty()) readings.second_name = f.names[1];
    }
    return quadrat::compare_paired(readings, method, t);
}
}  // namespace

// COMPARE.PAIRED(first; second; [method]; [output]; [transform])
Table compare_paired(const Arguments& a) {
    const std::string output = keyword_argument(argument(a, 3), "output");
    // Neighbouring cells asking other outputs of the same test share one computation (memo.hpp).
    const auto result = remembered("comparePaired", a, 3, [&] { return paired_result(a); });
    return select_output(*result, output, standard_outputs());
}

}  // namespace quadrat::addin
