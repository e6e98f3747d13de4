// COMPARE.COUNTS, COMPARE.EXPECTED, FIT.LOGISTIC and FIT.FACTORIAL: read the arguments, call the
// core, pick the output.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "addin/memo.hpp"
#include "core/refusal.hpp"
#include "core/counts.hpp"
#include "core/factorial.hpp"
#include "core/keywords.hpp"
#include "core/logistic.hpp"

namespace quadrat::addin {

Table compare_counts(const Arguments& a) {
    // One argument: a block of counts; two: two label columns cross-tabulated.
    // Neighbouring cells asking other outputs of the same table are answered from the cache (an
    // exact r×c test can take a noticeable fraction of a second).
    const auto result = remembered("compareCounts", a, 3, [&] {
        const bool labels = !is_blank(argument(a, 1));
        const ContingencyTable table = labels ? cross_tabulate(argument(a, 0), argument(a, 1)) : read_count_block(argument(a, 0));
        return quadrat::compare_counts(table, keyword_argument(argument(a, 2), "method"));
    });
    return select_output(*result, keyword_argument(argument(a, 3), "output"), count_outputs());
}

Table compare_expected(const Arguments& a) {
    const ExpectedInput in = read_expected_input(argument(a, 0), argument(a, 1));
    return select_output(quadrat::compare_expected(in.observed, in.expected, in.n_dropped),
                         keyword_argument(argument(a, 2), "output"), expected_outputs());
}

Table fit_logistic(const Arguments& a) {
    // The model table and the coefficient table of one fit in neighbouring cells share it.
    const auto fit = remembered_on("fitLogistic", a, {0, 1}, [&] {
        return quadrat::fit_logistic(read_logistic_data(argument(a, 0), argument(a, 1)));
    });
    const std::string output = match_keyword(keyword_argument(argument(a, 2), "output"), logistic_outputs(), "output");
    const double level = level_argument(argument(a, 3));
    return output == "model" ? logistic_model(*fit) : logistic_coefficients(*fit, level);
}

Table fit_factorial(const Arguments& a) {
    const FactorialData data = read_factorial_data(argument(a, 0), argument(a, 1), argument(a, 2));
    const std::string output = match_keyword(keyword_argument(argument(a, 3), "output"), factorial_outputs(), "output");
    // sstype: 2 or 3, typed as a number or as text.
    const Range& sstype_argument = argument(a, 4);
    int sstype = 2;
    if (!is_blank(sstype_argument)) {
        const Cell& c = sstype_argument.cells.size() == 1 ? sstype_argument.cells.front() : Cell::make_text("?");
        if (c.kind == CellKind::number && (c.number == 2 || c.number == 3))
            sstype = int(c.number);
        else if (c.kind == CellKind::text && (c.text == "2" || c.text == "3"))
            sstype = c.text == "2" ? 2 : 3;
        else
            throw Refusal("sstype must be 2 (Type II, the default) or 3 (Type III)");
    }
    // The three p-values and the table in neighbouring cells share one fit.
    const auto anova = remembered("fitFactorial", a, 3, [&] { return quadrat::fit_factorial(data, sstype); });
    if (output == "p-first") return single(anova->first.p);
    if (output == "p-second") return single(anova->second.p);
    if (output == "p-interaction") return single(anova->interaction.p);
    return factorial_table(*anova);
}

}  // namespace quadrat::addin
