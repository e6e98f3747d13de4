#include "addin/arguments.hpp"

#include "core/refusal.hpp"
#include "core/transform.hpp"

namespace quadrat::addin {

bool is_blank(const Range& argument) {
    if (argument.empty()) return true;
    if (argument.cells.size() != 1) return false;
    const Cell& c = argument.cells.front();
    return c.kind == CellKind::empty || (c.kind == CellKind::text && c.text.empty());
}

namespace {
const Cell& single_cell(const Range& argument, const std::string& name) {
    if (argument.cells.size() != 1)
        throw Refusal(name + " must be a single value, found " + std::to_string(argument.rows) + "x" +
                      std::to_string(argument.columns) + " cells");
    const Cell& c = argument.cells.front();
    if (c.kind == CellKind::error) throw Refusal(name + " holds an error" + (c.text.empty() ? "" : " (" + c.text + ")"));
    return c;
}
}  // namespace

std::string keyword_argument(const Range& argument, const std::string& name) {
    if (is_blank(argument)) return {};
    const Cell& c = single_cell(argument, name);
    if (c.kind != CellKind::text) throw Refusal(name + " must be a keyword in quotes (a text, not a number)");
    return c.text;
}

double number_argument(const Range& argument, const std::string& name, double fallback) {
    if (is_blank(argument)) return fallback;
    const Cell& c = single_cell(argument, name);
    if (c.kind != CellKind::number) throw Refusal(name + " must be a number");
    return c.number;
}

double level_argument(const Range& argument) {
    if (is_blank(argument)) return parse_level(0, true);
    return parse_level(number_argument(argument, "level", 0.95), false);
}

}  // namespace quadrat::addin
