// ADVISE.TEST: which test fits these columns, and why.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "core/advisor.hpp"
#include "core/keywords.hpp"
#include "core/result.hpp"

namespace quadrat::addin {

Table advise_test(const Arguments& a) {
    const Design design = parse_design(keyword_argument(a[3], "design"));
    const std::string output =
        match_keyword(keyword_argument(a[2], "output"), {"report", "method", "transform", "posthoc", "function", "table"}, "output");
    const Advice advice = quadrat::advise_test(a[0], a[1], design, argument(a, 4));  // structure: not declared yet
    if (output == "method") return single(advice.method);
    if (output == "transform") return single(advice.transform);
    if (output == "posthoc") return single(advice.posthoc);
    if (output == "function") return single(advice.function);
    if (output == "table") return advice.table();
    return single(advice.report);
}

}  // namespace quadrat::addin
