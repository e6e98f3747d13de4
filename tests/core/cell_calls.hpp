// Calling a cell function as a cell would: through the registry and its fence, with keyword,
// number and omitted arguments as the office hands them over, and what the cell shows read back.
#pragma once

#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <variant>

#include "addin/registry.hpp"
#include "core/cells.hpp"

namespace quadrat::test_support {

// An argument left empty (`;;`).
inline const Range omitted = Range::omitted_argument();
// A keyword typed in quotes, or a typed number.
inline Range keyword(const std::string& text) { return Range::scalar(Cell::make_text(text)); }
inline Range typed(double x) { return Range::scalar(Cell::make_number(x)); }

// What the cell shows for `method` (the IDL name, e.g. "compareGroups") on these arguments.
inline Table call(const char* method, const addin::Arguments& arguments) {
    const addin::Function* f = addin::find_function(method);
    EXPECT_NE(f, nullptr) << method << " is not declared";
    if (!f) return Table{};
    return addin::call_fenced(*f, arguments);
}

// The single text or number a cell shows; a marker that fails the comparison otherwise.
inline std::string text_of(const Table& t) {
    if (t.size() != 1 || t[0].size() != 1 || !std::holds_alternative<std::string>(t[0][0])) return "(not a single text)";
    return std::get<std::string>(t[0][0]);
}
inline double number_of(const Table& t) {
    if (t.size() != 1 || t[0].size() != 1 || !std::holds_alternative<double>(t[0][0])) return std::nan("");
    return std::get<double>(t[0][0]);
}

}  // namespace quadrat::test_support
