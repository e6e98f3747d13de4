// DESCRIBE.*: group summaries that belong beside a test.
#include "addin/families/common.hpp"
#include "core/censored.hpp"
#include "core/describe.hpp"

namespace quadrat::addin {
namespace {

const Declare describe{
    Function{"DESCRIBE.GROUPS", "describeGroups",
             "Summary per group as an array (array formula): n, mean and its interval, spread, quartiles, range.",
             {values_argument(), optional_groups_argument("one row each; else one row per column."),
              keyword("transform", transforms(), "none", "With a log, the geometric mean and its interval"), level()},
             table([](const Request& r) {
                 return describe_groups(r.groups("values", "groups"), parse_transform(r.keyword("transform")), r.level());
             })},

    // Values below a detection limit (`<0.5`) are read with their limit and flag, never dropped.
    Function{"DESCRIBE.CENSORED", "describeCensored",
             "Summary per group of values, some below a detection limit (<0.5), as an array (array formula): n, share "
             "censored, limits, mean and interval, quartiles.",
             {data("values", "Measurements in their unit; a lab's <0.5 is a value below that limit, not a missing one."),
              optional_groups_argument("one row each; else one row per column."),
              keyword("method", censored_summary_methods(), "kaplan-meier", "Estimator"), level()},
             table([](const Request& r) {
                 return describe_censored(censored_groups(read_censored_groups(r.range("values"), r.range("groups"))),
                                          r.keyword("method"), r.level());
             })},
};

}  // namespace
}  // namespace quadrat::addin
