// Keyword arguments (methods, outputs, transforms): case-insensitive, and an unknown one is a
// refusal that lists the valid ones.
#pragma once

#include <string>
#include <vector>

namespace quadrat {

// Returns the matching entry of `valid` (as spelled there). An empty `given` returns valid[0],
// the default. Otherwise a refusal: "unknown method 'x'; valid: a, b, c".
std::string match_keyword(const std::string& given, const std::vector<std::string>& valid, const std::string& argument);

// "a, b, c"
std::string join(const std::vector<std::string>& items, const std::string& separator = ", ");

}  // namespace quadrat
