// ADVISE.TEST: which test fits these columns, and why.
#include "addin/families/common.hpp"
#include "core/advisor.hpp"

namespace quadrat::addin {
namespace {

// `structure` is declared as the catalogue has it (revision 2); the advisor reads it once its
// blocks and nested branches are written.
const Declare advise{
    Function{"ADVISE.TEST", "adviseTest",
             "Suggests which test fits these columns and why. A guide, not a verdict: check it against the study design.",
             {labels("response", "The measured or counted variable: one column of numbers or labels."),
              optional(labels("predictor", "Group labels, a second measurement, or a second categorical variable.")),
              output(advice_outputs(), "report", "What the cell shows; method, transform, posthoc feed other cells"),
              keyword("design", designs(), "auto", "What the columns cannot show"),
              optional(labels("structure", "Block or sampling unit of each row, for designs blocks and nested."))},
             shared("", {},
                    [](const Request& r) { return advise_test(r.range("response"), r.range("predictor"), parse_design(r.keyword("design")), r.range("structure")); },
                    [](const Advice& advice, const Request& r) {
                        const std::string& output = r.keyword("output");
                        if (output == "method") return single(advice.method);
                        if (output == "transform") return single(advice.transform);
                        // With two groups or none there is no post-hoc step: `none`, as `transform` says `none`.
                        if (output == "posthoc") return single(advice.posthoc.empty() ? std::string("none") : advice.posthoc);
                        if (output == "function") return single(advice.function);
                        if (output == "table") return advice.table();
                        return single(advice.report);
                    })},
};

}  // namespace
}  // namespace quadrat::addin
