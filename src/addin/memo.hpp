// A small bounded cache of test results. A workbook often asks one test for its p, statistic and
// report in neighbouring cells over the same data; each cell is a separate call, and only the
// `output` argument differs. The key is every other argument, cell by cell, so a changed cell,
// an added row or another option recomputes.
#pragma once

#include <cstddef>
#include <functional>
#include <memory>
#include <string_view>

#include "addin/registry.hpp"
#include "core/result.hpp"

namespace quadrat::addin {

// The result of `compute` for these arguments, ignoring argument `output_position` (the output
// keyword). Keeps the 16 most recent results whose arguments total at most 4 million cells.
// A refusal is not kept: it is cheap to give again. Thread-safe.
std::shared_ptr<const TestResult> remembered(std::string_view function, const Arguments& arguments,
                                             std::size_t output_position, const std::function<TestResult()>& compute);

// For tests and benchmarks: how many calls were answered from the cache, and emptying it.
std::size_t remembered_hits();
void forget_all();

}  // namespace quadrat::addin
