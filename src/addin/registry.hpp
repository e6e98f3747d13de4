// The registry: one table of every cell function, the single source of display names, method
// names, wizard texts and argument names. The IDL, the CalcAddIns.xcu and the UNO forwarding
// methods are generated from it at build time (tools/describe.cpp), so they cannot drift apart.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "core/cells.hpp"

namespace quadrat::addin {

// Arguments in call order; an omitted one has `omitted` set.
using Arguments = std::vector<Range>;
// Converted cells in → what the cell (or array) shows out. May throw; the fence catches.
using Handler = Table (*)(const Arguments&);

struct ArgumentInfo {
    const char* name;         // IDL parameter name, as in FUNCTIONS.md
    const char* description;  // wizard text
    // A required cell reference (XCellRange: used rows only, errors named by cell). Everything else
    // is an `any`, which the office suite treats as optional and fills from references, numbers,
    // text and inline arrays alike.
    bool reference;
};

struct FunctionInfo {
    const char* display_name;  // CHECK.NORMAL
    const char* method;        // checkNormal: stored in saved workbooks, never renamed
    const char* description;   // wizard text
    std::vector<ArgumentInfo> arguments;
    Handler handler;
};

// Every function the extension ships, in catalogue order.
const std::vector<FunctionInfo>& registry();
const FunctionInfo* find_function(std::string_view method);

// The fence: runs the handler and turns every exception (a Refusal, anything else, `...`) into a
// 1×1 text answer, so nothing thrown ever reaches the office suite.
Table call_fenced(const FunctionInfo& function, const Arguments& arguments) noexcept;

}  // namespace quadrat::addin
