// A small bounded cache of results. A workbook often asks one test for its p, statistic and
// report in neighbouring cells over the same data, or one regression for its coefficients, its
// checks and its fitted points; each cell is a separate call, and only the `output` argument (or
// the function) differs. The key is the arguments that matter, cell by cell, so a changed cell, an
// added row or another option recomputes.
#pragma once

#include <cstddef>
#include <functional>
#include <initializer_list>
#include <memory>
#include <string_view>
#include <type_traits>
#include <vector>

#include "addin/registry.hpp"
#include "core/result.hpp"

namespace quadrat::addin {

// The result of `compute` for the arguments at positions `keyed` under the name `kind` (one kind,
// one result type). Keeps the 16 most recent results whose arguments total at most 4 million
// cells. A refusal is not kept: it is cheap to give again. Thread-safe.
std::shared_ptr<const void> remembered_result(std::string_view kind, const Arguments& arguments,
                                              const std::vector<std::size_t>& keyed,
                                              const std::function<std::shared_ptr<const void>()>& compute);

// The result of `compute` for these arguments, keyed on the positions listed.
template <class Compute>
auto remembered_on(std::string_view kind, const Arguments& arguments, std::initializer_list<std::size_t> keyed,
                   Compute compute) {
    using Result = std::invoke_result_t<Compute&>;
    return std::static_pointer_cast<const Result>(remembered_result(
        kind, arguments, std::vector<std::size_t>(keyed),
        [&]() -> std::shared_ptr<const void> { return std::make_shared<const Result>(compute()); }));
}

// The result of `compute` for these arguments, ignoring argument `output_position` (the output
// keyword).
template <class Compute>
auto remembered(std::string_view function, const Arguments& arguments, std::size_t output_position, Compute compute) {
    using Result = std::invoke_result_t<Compute&>;
    std::vector<std::size_t> keyed;
    for (std::size_t i = 0; i < arguments.size(); ++i)
        if (i != output_position) keyed.push_back(i);
    return std::static_pointer_cast<const Result>(remembered_result(
        function, arguments, keyed, [&]() -> std::shared_ptr<const void> { return std::make_shared<const Result>(compute()); }));
}

// For tests and benchmarks: how many calls were answered from the cache, and emptying it.
std::size_t remembered_hits();
void forget_all();

}  // namespace quadrat::addin
