// Reading the keyword and number arguments of a handler (methods, outputs, levels).
#pragma once

#include <string>

#include "core/cells.hpp"

namespace quadrat::addin {

// The text of a keyword argument; "" when omitted or blank (the function's default).
// A number where a keyword is expected is a refusal naming the argument.
std::string keyword_argument(const Range& argument, const std::string& name);

// The number of a numeric argument, or `fallback` when omitted or blank.
double number_argument(const Range& argument, const std::string& name, double fallback);

// True when the argument was omitted or is a single blank cell.
bool is_blank(const Range& argument);

// The confidence level (0.95 default; 50..99.9 read as a percentage).
double level_argument(const Range& argument);

}  // namespace quadrat::addin
