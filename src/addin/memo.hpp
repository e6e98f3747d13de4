// A small bounded cache of results. A workbook often asks one test for its p, statistic and
// report in neighbouring cells over the same data, or one regression for its coefficients, its
// checks and its fitted points; each cell is a separate call, and only the `output` argument (or
// the function) differs. The key is the arguments that matter, cell by cell (or, for a range the
// seam shares, the id of its decoded cells), so a changed cell, an added row or another option
// recomputes.
#pragma once

#include <cstddef>
#include <functional>
#include <memory>
#include <string_view>
#include <vector>

#include "addin/declare.hpp"
#include "core/result.hpp"

namespace quadrat::addin {

// The result of `compute` for the arguments at positions `keyed` under the name `kind` (one kind,
// one result type; declare.hpp's Entry says which). Used by the registry's generic path only.
// Keeps the 256 most recent results, as long as their arguments total at most 8 million cells. A
// refusal is not kept: it is cheap to give again. Thread-safe.
std::shared_ptr<const void> remembered_result(std::string_view kind, const Arguments& arguments,
                                              const std::vector<std::size_t>& keyed,
                                              const std::function<std::shared_ptr<const void>()>& compute);

// For tests and benchmarks: how many calls were answered from the cache, and emptying it.
std::size_t remembered_hits();
void forget_all();

}  // namespace quadrat::addin
