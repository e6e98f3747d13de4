// A refusal: the honest answer when no number can be given. It carries the text the cell shows.
#pragma once

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

}  // namespace quadrat
