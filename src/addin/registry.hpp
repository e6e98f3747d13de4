// The registry: every declared cell function (declare.hpp, one file per family under
// src/addin/families/), in catalogue order, and the fence every call goes through. The IDL, the
// CalcAddIns.xcu and the UNO forwarding methods are generated from it at build time
// (tools/interface.cpp), so they cannot drift apart.
#pragma once

#include <string_view>
#include <vector>

#include "addin/declare.hpp"

namespace quadrat::addin {

// Every function the extension ships: by family in the catalogue's order (CHECK, COMPARE, RELATE,
// TRACK, FIT, LIMIT, PLAN, ADJUST, DESCRIBE, ADVISE), then in declaration order.
const std::vector<const Function*>& registry();
const Function* find_function(std::string_view method);

// The fence: reads the arguments by the declaration, runs the entry and turns every exception (a
// Refusal, anything else, `...`) into a 1×1 text answer, so nothing thrown reaches the office.
Table call_fenced(const Function& function, const Arguments& arguments) noexcept;

// Every keyword table some declared argument uses, each once, in registry order.
std::vector<const KeywordTable*> declared_keyword_tables();

}  // namespace quadrat::addin
