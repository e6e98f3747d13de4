#include "result.hpp"

#include <cmath>
#include <limits>

#include "keywords.hpp"
#include "refusal.hpp"
#include "report.hpp"

namespace quadrat {

TestResult& TestResult::add(std::string label, double value) {
    quantities.push_back({std::move(label), CellValue{value}});
    return *this;
}

TestResult& TestResult::add(std::string label, std::string text) {
    quantities.push_back({std::move(label), CellValue{std::move(text)}});
    return *this;
}

const CellValue* TestResult::find(const std::string& label) const {
    for (const auto& q : quantities)
        if (q.label == label) return &q.value;
    for (const auto& q : unlisted)
        if (q.label == label) return &q.value;
    return nullptr;
}

double TestResult::number(const std::string& label) const {
    const CellValue* v = find(label);
    if (v && std::holds_alternative<double>(*v)) return std::get<double>(*v);
    return std::numeric_limits<double>::quiet_NaN();
}

Table TestResult::table() const {
    Table t;
    t.reserve(quantities.size() + 2);
    t.push_back({std::string("quantity"), std::string("value")});
    t.push_back({std::string("test"), test});
    for (const auto& q : quantities) t.push_back({q.label, q.value});
    return t;
}

Table select_output(const TestResult& result, const std::string& output, const KeywordTable& allowed) {
    const std::string key = allowed.match(output, "output", allowed.words().front().word);
    if (key == "table") return result.table();
    if (key == "report") {
        return single(render_report(result));
    }
    const CellValue* v = result.find(key);
    if (!v) throw Refusal("output '" + key + "' is not available for " + result.test);
    if (const double* x = std::get_if<double>(v); x && !std::isfinite(*x))
        throw Refusal("output '" + key + "' is not defined for these data (" + result.test + ")");
    return single(*v);
}

}  // namespace quadrat
