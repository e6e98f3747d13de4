// A refusal: the honest answer when no number can be given. It carries the text the cell shows.
#pragma once

#include <cstddef>
#include <stdexcept>
#include <string>
#include <vector>

namespace quadrat {

// Thrown by the core when input cannot give an honest result (too few values, zero spread, an
// unknown keyword, …). The glue turns it into the cell's text; the message says what is wrong
// and how to fix it, in the catalogue's words.
class Refusal : public std::runtime_error {
public:
    explicit Refusal(const std::string& message) : std::runtime_error(message) {}
};

// "1 row", "3 rows": a count with its noun for a refusal text.
inline std::string count_of(std::size_t n, const std::string& noun) {
    return std::to_string(n) + " " + noun + (n == 1 ? "" : "s");
}

// 'name': a group, keyword or label named inside a refusal text.
inline std::string in_quotes(const std::string& name) { return "'" + name + "'"; }

// For a method that needs a spread inside every group: refuses the first group with fewer than 2
// values ("group 'pool' has 1 value; each group needs at least 2"), `names[i]` naming `values[i]`.
inline void require_two_values_per_group(const std::vector<std::string>& names,
                                         const std::vector<std::vector<double>>& values) {
    for (std::size_t i = 0; i < values.size(); ++i)
        if (values[i].size() < 2)
            throw Refusal("group " + in_quotes(names[i]) + " has " + count_of(values[i].size(), "value") +
                          "; each group needs at least 2");
}

}  // namespace quadrat
