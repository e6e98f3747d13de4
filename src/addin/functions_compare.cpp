// COMPARE.* handlers: read the arguments, call the core, pick the output.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "core/data.hpp"
#include "core/keywords.hpp"
#include "core/oneway.hpp"
#include "core/result.hpp"
#include "core/transform.hpp"

namespace quadrat::addin {

namespace {
// The i-th argument, or an omitted one when the caller passed fewer.
const Range& argument(const Arguments& a, std::size_t i) {
    static const Range omitted = Range::omitted_argument();
    return i < a.size() ? a[i] : omitted;
}
}  // namespace

// COMPARE.GROUPS(values; groups; [method]; [output]; [transform])
Table compare_groups(const Arguments& a) {
    const Groups g = read_groups(argument(a, 0), argument(a, 1));
    const std::string method =
        match_keyword(keyword_argument(argument(a, 2), "method"), {"welch", "pooled", "ranks"}, "method");
    const Transform t = parse_transform(keyword_argument(argument(a, 4), "transform"));
    return select_output(quadrat::compare_groups(g, method, t), keyword_argument(argument(a, 3), "output"),
                         standard_outputs());
}

}  // namespace quadrat::addin
