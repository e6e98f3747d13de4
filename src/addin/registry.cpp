#include "addin/registry.hpp"

#include <algorithm>
#include <array>
#include <deque>
#include <exception>
#include <mutex>

#include "addin/arguments.hpp"
#include "addin/memo.hpp"
#include "core/refusal.hpp"

namespace quadrat::addin {

// ---- Declaring ---------------------------------------------------------------------------------

Argument data(std::string name, std::string description) {
    return Argument{std::move(name), ArgumentKind::data, std::move(description)};
}
Argument labels(std::string name, std::string description) {
    return Argument{std::move(name), ArgumentKind::labels, std::move(description)};
}
Argument cells(std::string name, std::string description) {
    return Argument{std::move(name), ArgumentKind::cells, std::move(description)};
}
Argument keyword(std::string name, const KeywordTable& table, std::string fallback, std::string description) {
    return Argument{std::move(name), ArgumentKind::keyword, std::move(description), true, &table, std::move(fallback)};
}
Argument output(const KeywordTable& table, std::string fallback, std::string description) {
    return Argument{"output", ArgumentKind::output, std::move(description), true, &table, std::move(fallback)};
}
Argument number(std::string name, std::string description) {
    return Argument{std::move(name), ArgumentKind::number, std::move(description), true};
}
Argument level() {
    return Argument{"level", ArgumentKind::level, "Confidence level: 0.95 (default), or a percentage such as 99.", true};
}
Argument optional(Argument a) {
    a.optional = true;
    return a;
}
Argument dated(Argument a) {
    a.dates = true;
    return a;
}

Function::Function(std::string display_name_, std::string method_, std::string description_, std::vector<Argument> arguments_,
                   Entry entry_, std::string category_)
    : display_name(std::move(display_name_)),
      method(std::move(method_)),
      description(std::move(description_)),
      category(std::move(category_)),
      arguments(std::move(arguments_)),
      entry(std::move(entry_)) {}

const Argument* Function::output_argument() const {
    for (const auto& a : arguments)
        if (a.kind == ArgumentKind::output) return &a;
    return nullptr;
}

namespace {

// Declarations in the order their family files were initialised; stable addresses.
std::deque<Function>& declared() {
    static std::deque<Function> functions;
    return functions;
}

// The catalogue's order of families: a name's first word.
std::size_t family_rank(const std::string& display_name) {
    static const std::array<std::string_view, 10> families = {"CHECK", "COMPARE", "RELATE", "TRACK", "FIT",
                                                                "LIMIT", "PLAN",    "ADJUST", "DESCRIBE", "ADVISE"};
    const std::string_view family = std::string_view(display_name).substr(0, display_name.find('.'));
    for (std::size_t i = 0; i < families.size(); ++i)
        if (families[i] == family) return i;
    return families.size();
}

}  // namespace

Declare::Declare(std::initializer_list<Function> functions) {
    for (const auto& f : functions) declared().push_back(f);
}

const std::vector<const Function*>& registry() {
    static const std::vector<const Function*> functions = [] {
        std::vector<const Function*> all;
        for (const auto& f : declared()) all.push_back(&f);
        // Families in the catalogue's order; within a family the order of declaration, families
        // declared in several files ordered by the first function's method name, so that the
        // generated IDL does not depend on the order the linker put the files in.
        std::stable_sort(all.begin(), all.end(), [](const Function* a, const Function* b) {
            return family_rank(a->display_name) < family_rank(b->display_name);
        });
        return all;
    }();
    return functions;
}

const Function* find_function(std::string_view method) {
    for (const Function* f : registry())
        if (method == f->method) return f;
    return nullptr;
}

std::vector<const KeywordTable*> declared_keyword_tables() {
    std::vector<const KeywordTable*> tables;
    for (const Function* f : registry())
        for (const auto& a : f->arguments)
            if (a.keywords && std::find(tables.begin(), tables.end(), a.keywords) == tables.end()) tables.push_back(a.keywords);
    return tables;
}

// ---- Reading a call ------------------------------------------------------------------------------

Request::Request(const Function& function, const Arguments& arguments) : function_(function), arguments_(arguments) {
    keywords_.resize(function.arguments.size());
    numbers_.resize(function.arguments.size());
    // Keywords and levels first: they are cheap, and a misspelt keyword is named before the data
    // are read.
    static const Range omitted = Range::omitted_argument();
    for (std::size_t i = 0; i < function.arguments.size(); ++i) {
        const Argument& a = function.arguments[i];
        const Range& cells = i < arguments.size() ? arguments[i] : omitted;
        if (a.kind == ArgumentKind::keyword || a.kind == ArgumentKind::output)
            keywords_[i] = a.keywords->match(keyword_argument(cells, a.name), a.name, a.fallback);
        else if (a.kind == ArgumentKind::level)
            numbers_[i] = level_argument(cells);
    }
}

std::size_t Request::position(std::string_view name) const {
    for (std::size_t i = 0; i < function_.arguments.size(); ++i)
        if (function_.arguments[i].name == name) return i;
    // A declaration that asks for an argument it does not have: a slip in src/addin/families.
    throw std::logic_error(function_.display_name + " has no argument " + std::string(name));
}

const Range& Request::range(std::string_view name) const {
    static const Range omitted = Range::omitted_argument();
    const std::size_t i = position(name);
    return i < arguments_.size() ? arguments_[i] : omitted;
}

const std::string& Request::keyword(std::string_view name) const { return keywords_[position(name)]; }

double Request::number(std::string_view name, double fallback) const {
    return number_argument(range(name), std::string(name), fallback);
}

double Request::level() const { return numbers_[position("level")]; }

bool Request::given(std::string_view name) const { return !is_blank(range(name)); }

Groups Request::groups(std::string_view values, std::string_view groups) const {
    return read_groups(range(values), range(groups), std::string(values), std::string(groups));
}

Table show_test(const TestResult& result, const Request& request) {
    const Argument* out = request.function().output_argument();
    return select_output(result, request.keyword("output"), *out->keywords);
}

// ---- The fence -------------------------------------------------------------------------------------

namespace {

Table run(const Function& f, const Arguments& arguments) {
    const Request request(f, arguments);
    const Entry& e = f.entry;
    if (!e.remember) return e.show(e.compute(request).get(), request);
    std::vector<std::size_t> keyed;
    if (e.keyed.empty()) {
        for (std::size_t i = 0; i < f.arguments.size(); ++i)
            if (f.arguments[i].kind != ArgumentKind::output) keyed.push_back(i);
    } else {
        for (std::size_t i = 0; i < f.arguments.size(); ++i)
            if (std::find(e.keyed.begin(), e.keyed.end(), f.arguments[i].name) != e.keyed.end()) keyed.push_back(i);
    }
    const auto result = remembered_result(e.kind.empty() ? f.method : e.kind, arguments, keyed,
                                          [&] { return e.compute(request); });
    return e.show(result.get(), request);
}

}  // namespace

Table call_fenced(const Function& function, const Arguments& arguments) noexcept {
    try {
        try {
            // A caller that hands over fewer arguments than declared (the office never does) gets
            // the rest as omitted, not a read past the end.
            if (arguments.size() < function.arguments.size()) {
                Arguments padded = arguments;
                padded.pad_to(function.arguments.size());
                return run(function, padded);
            }
            return run(function, arguments);
        } catch (const Refusal& r) {
            return single(std::string(r.what()));
        } catch (const std::bad_alloc&) {
            return single(std::string("not enough memory for this range"));
        } catch (const std::exception& e) {
            return single(std::string("internal error in ") + function.display_name + ": " + e.what());
        } catch (...) {
            return single(std::string("internal error in ") + function.display_name);
        }
    } catch (...) {
        // Building the refusal text itself failed (out of memory): a blank answer beats a crash.
        return Table{};
    }
}

}  // namespace quadrat::addin
