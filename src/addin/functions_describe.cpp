// DESCRIBE.GROUPS: the group summary that belongs beside a test.
#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "core/describe.hpp"

namespace quadrat::addin {

Table describe_groups(const Arguments& a) {
    const Groups groups = read_groups(a[0], a[1]);
    const Transform transform = parse_transform(keyword_argument(a[2], "transform"));
    return quadrat::describe_groups(groups, transform, level_argument(a[3]));
}

}  // namespace quadrat::addin
