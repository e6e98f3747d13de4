// bench_core: the core's time per call, through quadrat::addin::call_fenced (the path a cell
// takes, minus the UNO seam: cells in, the handler's argument reading, the statistics, the
// chosen output), on the arrays tools/benchmark.py wrote, so that it can set them beside SciPy
// and statsmodels on the very same numbers. Not a test: a measuring tool.
//
// Usage: quadrat_bench_core DATA_DIR
//   DATA_DIR/cases.tsv lists `case<TAB>n` lines; DATA_DIR/<name>.f64 (float64) and <name>.i32
//   (int32 label codes) hold the arrays, little-endian, a case at size n using their first n rows.
//   Prints one line per case: `case<TAB>n<TAB>fastest ms<TAB>runs<TAB>top-left answer`.
// Usage: quadrat_bench_core DATA_DIR CASE N
//   One case at one size (tools/benchmark.py starts one process per case and size, so that no
//   case inherits the heap another left behind: on this VM that alone changed a 10⁶-row call
//   from 56 ms to 876 ms).
// Usage: quadrat_bench_core DATA_DIR --cache LARGEST_N
//   The result cache (src/addin/memo.*): a call that computes, a call answered from the cache,
//   and ten cells asking ten outputs of one test, with and without the cache.
//
// Usage: quadrat_bench_core DATA_DIR --split LARGEST_N
//   Where a COMPARE.GROUPS welch call's time goes (cache key, reading the cells, statistics).
// Usage: quadrat_bench_core DATA_DIR --stages CASE N
//   For a case that reads labels (groups-*, variance-*, describe-groups, counts-chi-square): the
//   reading alone (cells into groups, or two label columns into a table) and the statistics alone
//   (on the groups or table already read), fastest of several runs each:
//   `case<TAB>n<TAB>reading ms<TAB>statistics ms`.
//
// Every timed call starts with the cache emptied (forget_all), so it measures the computation;
// the fastest of several runs is kept, since on a shared machine the slower ones measure the
// neighbours.

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>
#include <variant>
#include <vector>

#include "addin/memo.hpp"
#include "addin/registry.hpp"
#include "core/counts.hpp"
#include "core/data.hpp"
#include "core/describe.hpp"
#include "core/oneway.hpp"
#include "core/transform.hpp"
#include "core/variance.hpp"

namespace {

using quadrat::Cell;
using quadrat::Range;
using quadrat::addin::Arguments;
using quadrat::addin::Function;
using Clock = std::chrono::steady_clock;

std::string data_dir;

template <class T>
std::vector<T> read_array(const std::string& name, std::size_t n) {
    const std::string path = data_dir + "/" + name;
    std::ifstream in(path, std::ios::binary);
    std::vector<T> out(n);
    in.read(reinterpret_cast<char*>(out.data()), static_cast<std::streamsize>(n * sizeof(T)));
    if (static_cast<std::size_t>(in.gcount()) != n * sizeof(T)) {
        std::fprintf(stderr, "%s: fewer than %zu values\n", path.c_str(), n);
        std::exit(1);
    }
    return out;
}

// A referenced block of `columns` columns with a text header row (or none), as Calc hands it over.
Range block(const std::vector<std::vector<double>>& columns, std::size_t n, bool header = true) {
    Range r;
    r.rows = n + (header ? 1 : 0);
    r.columns = columns.size();
    r.is_reference = true;
    r.first_row = 0;
    r.cells.reserve(r.rows * r.columns);
    if (header)
        for (std::size_t c = 0; c < columns.size(); ++c) r.cells.push_back(Cell::make_text("x" + std::to_string(c + 1)));
    for (std::size_t i = 0; i < n; ++i)
        for (const auto& column : columns) r.cells.push_back(Cell::make_number(column[i]));
    return r;
}

Range numbers(const std::string& name, std::size_t n) { return block({read_array<double>(name + ".f64", n)}, n); }

// 0/1 codes as numbers (a logistic response).
Range codes_as_numbers(const std::string& name, std::size_t n) {
    const auto codes = read_array<std::int32_t>(name + ".i32", n);
    return block({std::vector<double>(codes.begin(), codes.end())}, n);
}

// Label codes as text cells ("site 0", "site 1", …) under a header.
Range labels(const std::string& name, std::size_t n) {
    const auto codes = read_array<std::int32_t>(name + ".i32", n);
    std::vector<std::string> texts = {"label"};
    texts.reserve(n + 1);
    for (std::int32_t c : codes) {
        std::string label = name;
        label += ' ';
        label += std::to_string(c);
        texts.push_back(std::move(label));
    }
    Range r = Range::text_column(texts);
    r.is_reference = true;
    return r;
}

Range text(const char* s) { return Range::scalar(Cell::make_text(s)); }
const Range omitted = Range::omitted_argument();

struct Case {
    const Function* function;
    Arguments arguments;
};

const Function& function(const char* method) {
    const Function* f = quadrat::addin::find_function(method);
    if (!f) {
        std::fprintf(stderr, "%s is not declared\n", method);
        std::exit(1);
    }
    return *f;
}

// The calls, by the case names tools/benchmark.py uses for the same arrays.
Case make_case(const std::string& name, std::size_t n) {
    if (name == "normal-shapiro-wilk") return {&function("checkNormal"), {numbers("a", n), omitted, text("shapiro-wilk"), text("p")}};
    if (name == "normal-anderson-darling")
        return {&function("checkNormal"), {numbers("a", n), omitted, text("anderson-darling"), text("p")}};
    if (name == "variance-brown-forsythe")
        return {&function("checkVariance"), {numbers("v", n), labels("g4", n), text("brown-forsythe"), text("p")}};
    if (name == "groups-welch") return {&function("compareGroups"), {numbers("v", n), labels("g2", n), text("welch"), text("p"), omitted}};
    if (name == "groups-ranks-2") return {&function("compareGroups"), {numbers("v", n), labels("g2", n), text("ranks"), text("p"), omitted}};
    if (name == "groups-pooled-4") return {&function("compareGroups"), {numbers("v", n), labels("g4", n), text("pooled"), text("p"), omitted}};
    if (name == "groups-ranks-4") return {&function("compareGroups"), {numbers("v", n), labels("g4", n), text("ranks"), text("p"), omitted}};
    if (name == "paired-t") return {&function("comparePaired"), {numbers("a", n), numbers("b", n), text("t"), text("p"), omitted}};
    if (name == "paired-signed-rank")
        return {&function("comparePaired"), {numbers("a", n), numbers("b", n), text("signed-rank"), text("p"), omitted}};
    if (name == "posthoc-tukey")
        return {&function("comparePosthoc"), {numbers("v", n), labels("g4", n), text("tukey"), omitted, omitted, omitted}};
    // p-values in cells have no header: ADJUST.P gives back an array of the same shape.
    if (name == "adjust-holm") return {&function("adjustP"), {block({read_array<double>("p.f64", n)}, n, false), text("holm")}};
    for (const char* method : {"pearson", "spearman", "kendall"})
        if (name == std::string("correlation-") + method)
            return {&function("relateCorrelation"), {numbers("a", n), numbers("b", n), text(method), text("p")}};
    if (name == "fit-linear") {
        Range xs = block({read_array<double>("a.f64", n), read_array<double>("x2.f64", n), read_array<double>("x3.f64", n)}, n);
        return {&function("fitLinear"), {numbers("y", n), std::move(xs), omitted, omitted}};
    }
    if (name == "fit-logistic") {
        Range xs = block({read_array<double>("x2.f64", n), read_array<double>("x3.f64", n)}, n);
        return {&function("fitLogistic"), {codes_as_numbers("yb", n), std::move(xs), omitted, omitted}};
    }
    if (name == "fit-counts") {
        Range xs = block({read_array<double>("a.f64", n), read_array<double>("b.f64", n), read_array<double>("x2.f64", n),
                          read_array<double>("x3.f64", n), read_array<double>("v.f64", n)},
                         n);
        return {&function("fitCounts"), {numbers("cnt", n), std::move(xs), numbers("eff", n), text("poisson"), omitted, omitted}};
    }
    if (name == "fit-factorial")
        return {&function("fitFactorial"), {numbers("vf", n), labels("f1", n), labels("f2", n), omitted, omitted}};
    if (name == "counts-chi-square")
        return {&function("compareCounts"), {labels("c1", n), labels("c2", n), text("chi-square"), text("p")}};
    if (name == "describe-groups") return {&function("describeGroups"), {numbers("v", n), labels("g4", n), omitted, omitted}};
    std::fprintf(stderr, "unknown case %s\n", name.c_str());
    std::exit(1);
}

double ms_since(Clock::time_point start) { return std::chrono::duration<double, std::milli>(Clock::now() - start).count(); }

// The answer's first number (a p, or the first number of a table), or its first text (a refusal).
std::string top_left(const quadrat::Table& t) {
    std::string first_text;
    for (const auto& row : t)
        for (const auto& v : row) {
            if (const double* x = std::get_if<double>(&v)) {
                char buffer[40];
                std::snprintf(buffer, sizeof buffer, "%.17g", *x);
                return buffer;
            }
            if (const std::string* s = std::get_if<std::string>(&v); s && first_text.empty()) first_text = *s;
        }
    return "text: " + first_text;
}

// Fastest of up to `most` runs, stopping once `budget_ms` is spent (at least 3 runs when they fit).
struct Timing {
    double fastest_ms;
    int runs;
    std::string answer;
};

Timing time_calls(const Case& c, bool empty_cache_first, int most = 9, double budget_ms = 3000.0) {
    Timing t{1e300, 0, {}};
    double spent = 0.0;
    while (t.runs < most && (t.runs < 3 || spent < budget_ms)) {
        if (empty_cache_first) quadrat::addin::forget_all();
        const auto start = Clock::now();
        const quadrat::Table answer = quadrat::addin::call_fenced(*c.function, c.arguments);
        const double ms = ms_since(start);
        if (t.runs == 0) t.answer = top_left(answer);
        t.fastest_ms = std::min(t.fastest_ms, ms);
        spent += ms;
        ++t.runs;
        if (spent > budget_ms && t.runs >= 1 && ms > budget_ms) break;  // one slow run is all we can afford
    }
    return t;
}

void run_case(const std::string& name, std::size_t n) {
    const Case c = make_case(name, n);
    const Timing t = time_calls(c, true);
    std::printf("%s\t%zu\t%.6f\t%d\t%s\n", name.c_str(), n, t.fastest_ms, t.runs, t.answer.c_str());
    std::fflush(stdout);
}

int run_cases() {
    std::ifstream list(data_dir + "/cases.tsv");
    std::string line;
    while (std::getline(list, line)) {
        std::istringstream fields(line);
        std::string name;
        std::size_t n = 0;
        if (fields >> name >> n) run_case(name, n);
    }
    return 0;
}

// The cache: one computing call, one call answered from the cache, and ten cells asking ten
// outputs of one test (the first computes, nine are hits) against ten computing calls.
int run_cache(std::size_t largest) {
    const char* outputs[] = {"p", "statistic", "df", "n", "estimate", "ci-low", "ci-high", "effect", "report", "table"};
    for (std::size_t n : {std::size_t{10000}, std::size_t{100000}}) {
        if (n > largest) continue;
        for (const char* method : {"welch", "ranks"}) {
            Case c = make_case(std::string("groups-") + (std::string(method) == "welch" ? "welch" : "ranks-2"), n);
            const Timing miss = time_calls(c, true);
            quadrat::addin::call_fenced(*c.function, c.arguments);  // now cached
            const Timing hit = time_calls(c, false);
            double ten_with = 1e300, ten_without = 1e300;
            for (int repeat = 0; repeat < 5; ++repeat) {
                quadrat::addin::forget_all();
                auto start = Clock::now();
                for (const char* o : outputs) {
                    c.arguments.set(3, text(o));
                    quadrat::addin::call_fenced(*c.function, c.arguments);
                }
                ten_with = std::min(ten_with, ms_since(start));
                start = Clock::now();
                for (const char* o : outputs) {
                    quadrat::addin::forget_all();
                    c.arguments.set(3, text(o));
                    quadrat::addin::call_fenced(*c.function, c.arguments);
                }
                ten_without = std::min(ten_without, ms_since(start));
            }
            std::printf("cache\tCOMPARE.GROUPS %s\t%zu\t%.6f\t%.6f\t%.6f\t%.6f\n", method, n, miss.fastest_ms, hit.fastest_ms,
                        ten_without, ten_with);
        }
    }
    return 0;
}

// Where a COMPARE.GROUPS welch call's time goes: the whole call (cache emptied first), a call
// answered from the cache (building the key from every cell, finding it), reading the cells into
// groups (read_groups), and the statistics alone (quadrat::compare_groups on the groups).
int run_split(std::size_t largest) {
    for (std::size_t n : {std::size_t{10000}, std::size_t{100000}, std::size_t{1000000}}) {
        if (n > largest) continue;
        const Case c = make_case("groups-welch", n);
        const Timing whole = time_calls(c, true);
        const Timing hit = time_calls(c, false);
        double reading = 1e300, statistics = 1e300;
        for (int i = 0; i < 5; ++i) {
            auto start = Clock::now();
            const quadrat::Groups g = quadrat::read_groups(c.arguments[0], c.arguments[1]);
            reading = std::min(reading, ms_since(start));
            start = Clock::now();
            const quadrat::TestResult r = quadrat::compare_groups(g, "welch", quadrat::parse_transform(""));
            statistics = std::min(statistics, ms_since(start));
            if (r.quantities.empty()) std::abort();
        }
        std::printf("split\tCOMPARE.GROUPS welch\t%zu\t%.6f\t%.6f\t%.6f\t%.6f\n", n, whole.fastest_ms, hit.fastest_ms,
                    reading, statistics);
    }
    return 0;
}

// The reading and the statistics of one case apart (see the usage above).
int run_stages(const std::string& name, std::size_t n) {
    const Case c = make_case(name, n);
    const Range& first = c.arguments[0];
    const Range& second = c.arguments[1];
    const bool counts = name == "counts-chi-square";
    const std::string method = name == "groups-welch"                   ? "welch"
                               : name.rfind("groups-ranks", 0) == 0      ? "ranks"
                               : name == "groups-pooled-4"               ? "pooled"
                               : name == "variance-brown-forsythe"       ? "brown-forsythe"
                               : name == "describe-groups" || counts     ? ""
                                                                         : "?";
    if (method == "?") {
        std::fprintf(stderr, "--stages: %s reads no labels\n", name.c_str());
        return 2;
    }
    double reading = 1e300, statistics = 1e300, spent = 0.0;
    for (int run = 0; run < 9 && (run < 3 || spent < 3000.0); ++run) {
        auto start = Clock::now();
        quadrat::Groups g;
        quadrat::ContingencyTable table;
        if (counts)
            table = quadrat::cross_tabulate(first, second);
        else
            g = quadrat::read_groups(first, second);
        const double read_ms = ms_since(start);
        start = Clock::now();
        std::size_t size = 0;
        if (counts)
            size = quadrat::compare_counts(table, "chi-square").quantities.size();
        else if (name == "describe-groups")
            size = quadrat::describe_groups(g, quadrat::Transform::none, 0.95).size();
        else if (name == "variance-brown-forsythe")
            size = quadrat::check_variance(g, method).quantities.size();
        else
            size = quadrat::compare_groups(g, method, quadrat::parse_transform("")).quantities.size();
        const double statistics_ms = ms_since(start);
        if (size == 0) std::abort();
        reading = std::min(reading, read_ms);
        statistics = std::min(statistics, statistics_ms);
        spent += read_ms + statistics_ms;
    }
    std::printf("%s\t%zu\t%.6f\t%.6f\n", name.c_str(), n, reading, statistics);
    return 0;
}

}  // namespace

int main(int argc, char** argv) {
    if (argc < 2) {
        std::fprintf(stderr, "usage: quadrat_bench_core DATA_DIR [--cache LARGEST_N]\n");
        return 2;
    }
    data_dir = argv[1];
    if (argc == 4 && std::string(argv[2]).rfind("--", 0) != 0) {
        run_case(argv[2], std::strtoul(argv[3], nullptr, 10));
        return 0;
    }
    if (argc > 4 && std::string(argv[2]) == "--stages") return run_stages(argv[3], std::strtoul(argv[4], nullptr, 10));
    if (argc > 3 && std::string(argv[2]) == "--split") return run_split(std::strtoul(argv[3], nullptr, 10));
    if (argc > 3 && std::string(argv[2]) == "--cache") return run_cache(std::strtoul(argv[3], nullptr, 10));
    return run_cases();
}
