// CHECK.NORMAL, CHECK.VARIANCE, CHECK.QQ: read the arguments, call the core, pick the output.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "addin/memo.hpp"
#include "core/data.hpp"
#include "core/keywords.hpp"
#include "core/normality.hpp"
#include "core/result.hpp"
#include "core/variance.hpp"

namespace quadrat::addin {

namespace {
// The outputs a normality test has: `df` only for the χ² tests (dagostino, jarque-bera).
const std::vector<std::string>& normality_outputs() {
    static const std::vector<std::string> keys = {"p", "statistic", "df", "n", "table", "report"};
    return keys;
}
}  // namespace

Table check_normal(const Arguments& a) {
    const auto result = remembered("checkNormal", a, 3, [&] {
        const Groups g = read_groups(a[0], a[1]);
        return quadrat::check_normal(g, match_keyword(keyword_argument(a[2], "method"), normality_methods(), "method"));
    });
    return select_output(*result, keyword_argument(a[3], "output"), normality_outputs());
}

Table check_variance(const Arguments& a) {
    const auto result = remembered("checkVariance", a, 3, [&] {
        const Groups g = read_groups(a[0], a[1]);
        return quadrat::check_variance(g, match_keyword(keyword_argument(a[2], "method"), variance_methods(), "method"));
    });
    static const std::vector<std::string> outputs = {"p", "statistic", "df", "df2", "n", "table", "report"};
    return select_output(*result, keyword_argument(a[3], "output"), outputs);
}

Table check_qq(const Arguments& a) {
    const Groups g = read_groups(a[0], a[1]);
    return quadrat::check_qq(g, a[0].rows);
}

}  // namespace quadrat::addin
