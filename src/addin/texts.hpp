// Texts generated from the declarations: the function wizard's line per argument (its valid
// keywords read from the keyword table) and the keyword appendix of docs/functions.md.
#pragma once

#include <string>

#include "addin/registry.hpp"

namespace quadrat::addin {

// One line: the declaration's description, then for a keyword argument its valid keywords,
// the default marked: "Test: welch (default), pooled, ranks."
std::string wizard_text(const Argument& argument);

// The markdown between `<!-- keywords:begin -->` and `<!-- keywords:end -->` in docs/functions.md:
// every keyword table a declared argument uses, with the functions and arguments that take it.
std::string keyword_appendix();

inline constexpr const char* appendix_begin = "<!-- keywords:begin -->";
inline constexpr const char* appendix_end = "<!-- keywords:end -->";

// `document` with the text between the markers replaced by `keyword_appendix()` (the markers are
// added at the end when absent).
std::string with_keyword_appendix(const std::string& document);

}  // namespace quadrat::addin
