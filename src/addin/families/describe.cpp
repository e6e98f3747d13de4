// DESCRIBE.*: group summaries that belong beside a test.
#include "addin/families/common.hpp"
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
};

}  // namespace
}  // namespace quadrat::addin
