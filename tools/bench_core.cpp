// bench_core: the core's share of a DESCRIBE.GROUPS call, without the office, so that
// tools/bench_seam.py can tell the seam's cost (Calc recalculation minus this) from the
// statistics'. Same data shape as bench_seam.py: a header row, then n values (and labels
// alternating upstream/downstream).
//
// Usage: quadrat_bench_core [rows ...]     (default 10000 100000); prints one line per case.

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <random>
#include <string>
#include <vector>

#include "addin/registry.hpp"

namespace {

using quadrat::Cell;
using quadrat::Range;

double fastest_ms(const quadrat::addin::FunctionInfo& f, const quadrat::addin::Arguments& args) {
    std::vector<double> times;
    for (int i = 0; i < 9; ++i) {
        const auto start = std::chrono::steady_clock::now();
        const quadrat::Table t = quadrat::addin::call_fenced(f, args);
        const auto stop = std::chrono::steady_clock::now();
        if (t.empty()) std::abort();
        times.push_back(std::chrono::duration<double, std::milli>(stop - start).count());
    }
    std::sort(times.begin(), times.end());
    return times.front();  // the fastest: on a shared machine the others measure the neighbours
}

}  // namespace

int main(int argc, char** argv) {
    std::vector<std::size_t> sizes;
    for (int i = 1; i < argc; ++i) sizes.push_back(static_cast<std::size_t>(std::strtoul(argv[i], nullptr, 10)));
    if (sizes.empty()) sizes = {10000, 100000};
    const quadrat::addin::FunctionInfo* describe = quadrat::addin::find_function("describeGroups");
    if (!describe || !describe->handler) {
        std::fprintf(stderr, "DESCRIBE.GROUPS has no handler\n");
        return 1;
    }
    for (std::size_t n : sizes) {
        std::mt19937 rng(1234);
        std::normal_distribution<double> oxygen(8.0, 0.8);
        Range values;
        values.rows = n + 1;
        values.columns = 1;
        values.is_reference = true;
        values.cells.push_back(Cell::make_text("oxygen"));
        Range groups = values;
        groups.is_reference = false;
        groups.cells.assign(1, Cell::make_text("site"));
        for (std::size_t i = 0; i < n; ++i) {
            values.cells.push_back(Cell::make_number(oxygen(rng)));
            groups.cells.push_back(Cell::make_text(i % 2 == 0 ? "upstream" : "downstream"));
        }
        const Range omitted = Range::omitted_argument();
        std::printf("core DESCRIBE.GROUPS(values)          %7zu rows: %8.2f ms\n", n,
                    fastest_ms(*describe, {values, omitted, omitted, omitted}));
        std::printf("core DESCRIBE.GROUPS(values; groups)  %7zu rows: %8.2f ms\n", n,
                    fastest_ms(*describe, {values, groups, omitted, omitted}));
    }
    return 0;
}
