// How a cell function is declared. One declaration describes a function completely: its display
// name, its lowerCamel method (stored in saved workbooks: never renamed), its category and
// description, every argument (kind, keyword table and default, optional or not, one line of
// wizard text), the outputs it offers, and one typed compute entry into the core. The generic
// reader (registry.cpp) builds a Request from the declaration; the entry computes and picks what
// the cell shows. The IDL, CalcAddIns.xcu, the wizard's keyword lists, the refusal that lists
// valid keywords and the docs' keyword appendix are all generated from declarations.
//
//   // src/addin/families/compare.cpp
//   const Declare compare{
//       Function{"COMPARE.GROUPS", "compareGroups", "Tests a difference in location between two or more groups.",
//                {data("values", "readings: one column beside groups, or one column per group"),
//                 labels("groups", "the group of each row; leave empty (keep the ;) for one column per group"),
//                 keyword("method", location_methods(), "welch", "how to compare"),
//                 output(test_outputs(), "p", "what the cell shows; estimate in the data's units"),
//                 keyword("transform", transforms(), "none", "applied before testing")},
//                test([](const Request& r) {
//                    return quadrat::compare_groups(r.groups("values", "groups"), r.keyword("method"),
//                                                   parse_transform(r.keyword("transform")));
//                })},
//   };
//
// A family adds its own file under src/addin/families/: nothing else to register.
#pragma once

#include <functional>
#include <initializer_list>
#include <memory>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "core/cells.hpp"
#include "core/data.hpp"
#include "core/keywords.hpp"
#include "core/result.hpp"

namespace quadrat::addin {

// Arguments in call order, as the seam converted them; an omitted one has `omitted` set. A range
// may be shared with other calls (the seam's store of decoded ranges, read once per change), so
// it is read-only here; `change` gives a private copy to alter (tests, the fuzzer).
class Arguments {
public:
    Arguments() = default;
    Arguments(std::initializer_list<Range> ranges) {
        for (const Range& r : ranges) push_back(r);
    }

    void push_back(Range range) { ranges_.push_back(std::make_shared<const Range>(std::move(range))); }
    void push_back(std::shared_ptr<const Range> range) { ranges_.push_back(std::move(range)); }
    void set(std::size_t i, Range range) { ranges_.at(i) = std::make_shared<const Range>(std::move(range)); }
    Range& change(std::size_t i) {
        auto copy = std::make_shared<Range>(*ranges_.at(i));
        ranges_[i] = copy;
        return *copy;
    }
    // Up to n arguments, the new ones omitted.
    void pad_to(std::size_t n) {
        while (ranges_.size() < n) push_back(Range::omitted_argument());
    }

    const Range& operator[](std::size_t i) const { return *ranges_[i]; }
    const Range& back() const { return *ranges_.back(); }
    std::size_t size() const { return ranges_.size(); }
    bool empty() const { return ranges_.empty(); }
    void reserve(std::size_t n) { ranges_.reserve(n); }

private:
    std::vector<std::shared_ptr<const Range>> ranges_;
};

enum class ArgumentKind {
    data,     // numbers from cells (values, y, xs, …)
    labels,   // labels from cells (groups, factors, …)
    cells,    // cells or a typed value (second: a range or one number; expected; pvalues …)
    keyword,  // one word from a keyword table
    output,   // the keyword that picks what the cell shows
    number,   // a typed number or a cell
    level,    // a confidence level: a fraction, or 50 to 99.9 as a percentage
};

struct Argument {
    std::string name;         // the catalogue's name, also the IDL parameter name
    ArgumentKind kind = ArgumentKind::data;
    std::string description;  // one line for the wizard: what it holds, its unit
    bool optional = false;    // may be left out (the wizard then shows it as optional)
    const KeywordTable* keywords = nullptr;  // keyword and output arguments
    std::string fallback;     // the default keyword ("" where the core decides, e.g. adjust)
    bool dates = false;       // a reference whose cells the seam asks for date formatting (Range::dates)

    // A required cell argument reaches the add-in as a cell range (used rows only, error cells
    // named); everything else is an `any`, which the office treats as optional.
    bool reference() const { return !optional && (kind == ArgumentKind::data || kind == ArgumentKind::labels); }
};

Argument data(std::string name, std::string description);
Argument labels(std::string name, std::string description);
Argument cells(std::string name, std::string description);
Argument keyword(std::string name, const KeywordTable& table, std::string fallback, std::string description);
Argument output(const KeywordTable& table, std::string fallback, std::string description);
Argument number(std::string name, std::string description);
Argument level();  // "level", optional, 0.95 by default
// The same argument, optional: `optional(labels("groups", "…"))`.
Argument optional(Argument a);
// A required reference whose date formatting the seam reads (Range::dates); only where the core
// uses it, so other long columns pay nothing: `dated(data("times", "…"))`.
Argument dated(Argument a);

class Function;

// What the generic reader made of one call, by argument name. Keywords are already matched
// (canonical spelling, the default filled in); a level is already a fraction.
class Request {
public:
    Request(const Function& function, const Arguments& arguments);

    const Range& range(std::string_view name) const;
    const std::string& keyword(std::string_view name) const;  // "" when blank and no default
    double number(std::string_view name, double fallback) const;
    double level() const;  // the `level` argument, 0.95 when blank
    bool given(std::string_view name) const;  // present and not a single blank cell

    // read_groups over two of the arguments, refusals named by them.
    Groups groups(std::string_view values, std::string_view groups) const;

    const Function& function() const { return function_; }
    const Arguments& arguments() const { return arguments_; }

private:
    std::size_t position(std::string_view name) const;
    const Function& function_;
    const Arguments& arguments_;
    std::vector<std::string> keywords_;
    std::vector<double> numbers_;
};

// The compute entry: how the core is called and how the cell's value is picked from its result.
struct Entry {
    // Results are remembered (memo.hpp) under `kind` on the arguments named in `keyed` (empty:
    // all but `output`), so that neighbouring cells asking other outputs share one computation,
    // and functions naming the same kind share one result (FIT.LINEAR, FIT.POINTS and
    // CHECK.REGRESSION share one fit). An empty kind is the function's method name.
    std::string kind;
    std::vector<std::string> keyed;
    bool remember = true;
    std::function<std::shared_ptr<const void>(const Request&)> compute;
    std::function<Table(const void* result, const Request&)> show;
};

// The cell's value from a test result: the quantity, table or report named by `output`.
Table show_test(const TestResult& result, const Request& request);

// A test: the core returns a TestResult; the `output` argument picks the cell's value from it.
template <class Compute>
Entry test(Compute compute) {
    Entry e;
    e.compute = [compute](const Request& r) -> std::shared_ptr<const void> {
        return std::make_shared<const TestResult>(compute(r));
    };
    e.show = [](const void* result, const Request& r) { return show_test(*static_cast<const TestResult*>(result), r); };
    return e;
}

// A function that is a table by nature (no output argument): the core returns the Table.
template <class Compute>
Entry table(Compute compute) {
    Entry e;
    e.remember = false;
    e.compute = [compute](const Request& r) -> std::shared_ptr<const void> { return std::make_shared<const Table>(compute(r)); };
    e.show = [](const void* result, const Request&) { return *static_cast<const Table*>(result); };
    return e;
}

// A result several cells or functions share (a fitted model): computed by `compute` under `kind`
// on the arguments named in `keyed`, shown by `show` (which reads the output and level itself).
template <class Compute, class Show>
Entry shared(std::string kind, std::vector<std::string> keyed, Compute compute, Show show) {
    using Result = std::invoke_result_t<Compute&, const Request&>;
    Entry e;
    e.kind = std::move(kind);
    e.keyed = std::move(keyed);
    e.compute = [compute](const Request& r) -> std::shared_ptr<const void> { return std::make_shared<const Result>(compute(r)); };
    e.show = [show](const void* result, const Request& r) -> Table { return show(*static_cast<const Result*>(result), r); };
    return e;
}

class Function {
public:
    Function(std::string display_name, std::string method, std::string description, std::vector<Argument> arguments,
             Entry entry, std::string category = "Statistical");

    std::string display_name;  // COMPARE.GROUPS: what a person types
    std::string method;        // compareGroups: stored in saved workbooks, never renamed
    std::string description;   // one or two plain sentences for the wizard
    std::string category;
    std::vector<Argument> arguments;
    Entry entry;

    // The argument that picks the output, or nullptr.
    const Argument* output_argument() const;
};

// Declares the functions of one family file (a static object there); the registry collects them.
struct Declare {
    Declare(std::initializer_list<Function> functions);
};

}  // namespace quadrat::addin
