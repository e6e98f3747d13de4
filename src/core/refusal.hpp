// A refusal: the honest answer when no number can be given. It carries the text the cell shows.
#pragma once

#include <cstddef>
#include <stdexcept>
#include <string>

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

}  // namespace quadrat
