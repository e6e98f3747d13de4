#include "data.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <unordered_map>

#include "refusal.hpp"

namespace quadrat {

namespace {

std::string_view trimmed(std::string_view s) {
    while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
    while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
    return s;
}

bool equals_ignoring_case(std::string_view a, std::string_view b) {
    if (a.size() != b.size()) return false;
    for (std::size_t i = 0; i < a.size(); ++i)
        if (std::tolower(static_cast<unsigned char>(a[i])) != std::tolower(static_cast<unsigned char>(b[i])))
            return false;
    return true;
}

// A usable number: the office suite never stores NaN or infinity in a cell, so one that arrives
// (from a fuzzer or a foreign caller) is treated as missing rather than carried into a sum.
bool is_value(const Cell& c) { return c.kind == CellKind::number && std::isfinite(c.number); }

bool is_label(const Cell& c) {
    if (c.kind == CellKind::number) return std::isfinite(c.number);
    if (c.kind == CellKind::text) return !is_missing_marker(c.text);
    return false;
}

std::string label_of(const Cell& c) {
    if (c.kind == CellKind::number) return number_label(c.number);
    return std::string(trimmed(c.text));
}

bool is_header_text(const Cell& c) { return c.kind == CellKind::text && !is_missing_marker(c.text); }

bool present(const Cell& c, ColumnKind kind) { return kind == ColumnKind::numeric ? is_value(c) : is_label(c); }

// The catalogue's header rule for a single column of numbers: text (not a missing marker) above
// at least one number.
bool numeric_column_has_header(const Range& r, std::size_t column) {
    if (r.rows < 2 || !is_header_text(r.at(0, column))) return false;
    for (std::size_t row = 1; row < r.rows; ++row)
        if (is_value(r.at(row, column))) return true;
    return false;
}

// The header rule for a label column when every argument is a label column: a text that appears
// nowhere else in its column.
bool label_column_has_header(const Range& r, std::size_t column) {
    if (r.rows < 2 || !is_header_text(r.at(0, column))) return false;
    const std::string head = label_of(r.at(0, column));
    for (std::size_t row = 1; row < r.rows; ++row) {
        const Cell& c = r.at(row, column);
        if (is_label(c) && label_of(c) == head) return false;
    }
    return true;
}

void refuse_errors(const Range& r, const std::string& argument, std::size_t first_row) {
    for (std::size_t row = first_row; row < r.rows; ++row)
        for (std::size_t col = 0; col < r.columns; ++col)
            if (r.at(row, col).kind == CellKind::error) throw Refusal(error_cell_message(r, row, col, argument));
}

}  // namespace

bool is_missing_marker(std::string_view text) {
    const std::string_view t = trimmed(text);
    if (t.empty()) return true;
    static constexpr std::string_view markers[] = {"n/a", "na", "-", "\xE2\x80\x94" /* — */, "?", "missing"};
    for (auto m : markers)
        if (equals_ignoring_case(t, m)) return true;
    return false;
}

std::string number_label(double x) {
    if (x == 0) return "0";  // also for -0
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.15g", x);
    return buffer;
}

std::string error_cell_message(const Range& range, std::size_t row, std::size_t column,
                               const std::string& argument) {
    const std::string& name = range.at(row, column).text;
    const std::string what = name.empty() ? "an error" : "an error (" + name + ")";
    if (range.is_reference) return cell_address(range, row, column) + " holds " + what;
    return argument + " holds " + what + " in row " + std::to_string(row + 1);
}

Frame read_frame(const std::vector<FrameBlock>& blocks) {
    Frame f;
    if (blocks.empty()) return f;
    f.rows = blocks.front().range->rows;
    for (const auto& b : blocks) {
        if (b.range->empty())
            throw Refusal(b.argument + " is empty");
        if (b.range->rows != f.rows)
            throw Refusal(blocks.front().argument + " and " + b.argument + " must have the same number of rows (" +
                          std::to_string(f.rows) + " and " + std::to_string(b.range->rows) + ")");
    }

    // Header: a numeric column with text over numbers decides it; where every argument is a label
    // column, each first-row text must be unique in its column.
    bool any_numeric = false;
    bool numeric_header = false;
    bool all_labels_header = true;
    for (const auto& b : blocks)
        for (std::size_t col = 0; col < b.range->columns; ++col) {
            if (b.kind == ColumnKind::numeric) {
                any_numeric = true;
                numeric_header = numeric_header || numeric_column_has_header(*b.range, col);
            } else {
                all_labels_header = all_labels_header && label_column_has_header(*b.range, col);
            }
        }
    f.has_header = any_numeric ? numeric_header : all_labels_header;
    const std::size_t start = f.has_header ? 1 : 0;

    for (const auto& b : blocks) refuse_errors(*b.range, b.argument, 0);

    for (const auto& b : blocks)
        for (std::size_t col = 0; col < b.range->columns; ++col) {
            const Cell& head = b.range->at(0, col);
            f.names.push_back(f.has_header && head.kind != CellKind::empty ? label_of(head) : std::string());
            f.kinds.push_back(b.kind);
        }
    const std::size_t ncols = f.names.size();
    f.numbers.resize(ncols);
    f.labels.resize(ncols);
    // Room for every row at once: growing by doubling would copy a long column several times and
    // touch fresh memory at each step (on 10⁶ rows that was most of a call's time).
    for (std::size_t k = 0; k < ncols; ++k) {
        if (f.kinds[k] == ColumnKind::numeric)
            f.numbers[k].reserve(f.rows - start);
        else
            f.labels[k].reserve(f.rows - start);
    }
    f.used_rows.reserve(f.rows - start);

    for (std::size_t row = start; row < f.rows; ++row) {
        bool all_present = true;
        bool anything = false;
        for (const auto& b : blocks)
            for (std::size_t col = 0; col < b.range->columns; ++col) {
                const Cell& c = b.range->at(row, col);
                anything = anything || c.kind != CellKind::empty;
                all_present = all_present && present(c, b.kind);
            }
        if (!all_present) {
            if (anything) ++f.n_dropped;
            continue;
        }
        std::size_t k = 0;
        for (const auto& b : blocks)
            for (std::size_t col = 0; col < b.range->columns; ++col, ++k) {
                const Cell& c = b.range->at(row, col);
                if (b.kind == ColumnKind::numeric)
                    f.numbers[k].push_back(c.number);
                else
                    f.labels[k].push_back(label_of(c));
            }
        f.used_rows.push_back(row);
    }
    f.n_used = f.used_rows.size();
    return f;
}

Groups read_groups(const Range& values, const Range& groups, const std::string& values_name, const std::string& groups_name) {
    Groups g;
    if (values.empty()) throw Refusal(values_name + " is empty");

    if (!groups.empty()) {
        if (values.columns != 1 || groups.columns != 1)
            throw Refusal(values_name + " and " + groups_name + " must each be one column (found " + std::to_string(values.columns) +
                          " and " + std::to_string(groups.columns) + ")");
        const Frame f = read_frame({{&values, ColumnKind::numeric, values_name}, {&groups, ColumnKind::label, groups_name}});
        g.labelled = true;
        g.has_header = f.has_header;
        g.n_used = f.n_used;
        g.n_dropped = f.n_dropped;
        g.row_group.assign(f.rows, no_group);
        g.row_value.assign(f.rows, 0.0);
        std::unordered_map<std::string, std::size_t> index;
        for (std::size_t i = 0; i < f.n_used; ++i) {
            const std::string& label = f.labels[1][i];
            auto [it, inserted] = index.try_emplace(label, g.names.size());
            if (inserted) {
                g.names.push_back(label);
                g.values.emplace_back();
            }
            g.values[it->second].push_back(f.numbers[0][i]);
            g.row_group[f.used_rows[i]] = it->second;
            g.row_value[f.used_rows[i]] = f.numbers[0][i];
        }
        return g;
    }

    if (values.columns == 1) {
        const Frame f = read_frame({{&values, ColumnKind::numeric, "values"}});
        g.has_header = f.has_header;
        g.n_used = f.n_used;
        g.n_dropped = f.n_dropped;
        g.names.push_back(f.names[0].empty() ? "values" : f.names[0]);
        g.values.push_back(f.numbers[0]);
        g.row_group.assign(f.rows, no_group);
        g.row_value.assign(f.rows, 0.0);
        for (std::size_t i = 0; i < f.n_used; ++i) {
            g.row_group[f.used_rows[i]] = 0;
            g.row_value[f.used_rows[i]] = f.numbers[0][i];
        }
        return g;
    }

    // Wide format: each column a group. An empty cell is the end of a shorter column, not a
    // dropped observation; a text cell (n/a, -) below the header is dropped.
    g.wide = true;
    refuse_errors(values, "values", 0);
    bool header = false;
    for (std::size_t col = 0; col < values.columns; ++col) header = header || numeric_column_has_header(values, col);
    g.has_header = header;
    const std::size_t start = header ? 1 : 0;
    for (std::size_t col = 0; col < values.columns; ++col) {
        const Cell& head = values.at(0, col);
        g.names.push_back(header && is_header_text(head) ? label_of(head) : "column " + std::to_string(col + 1));
        std::vector<double> column;
        for (std::size_t row = start; row < values.rows; ++row) {
            const Cell& c = values.at(row, col);
            if (is_value(c))
                column.push_back(c.number);
            else if (c.kind != CellKind::empty)
                ++g.n_dropped;
        }
        g.n_used += column.size();
        g.values.push_back(std::move(column));
    }
    return g;
}

std::string no_usable_rows(const Groups& groups) {
    if (!groups.labelled || groups.n_dropped == 0) return "values holds no numbers";
    return "no row has both a number in values and a label in groups (" + std::to_string(groups.n_dropped) +
           (groups.n_dropped == 1 ? " row" : " rows") + " dropped)";
}

void refuse_beyond_model_scale(std::span<const double> values, const std::string& name) {
    double largest = 0.0;
    for (double x : values) largest = std::max(largest, std::fabs(x));
    if (largest == 0.0 || (largest >= 1e-150 && largest <= 1e150)) return;
    char shown[32];
    std::snprintf(shown, sizeof shown, "%.3g", largest);
    throw Refusal(name + " holds numbers too " + (largest > 1.0 ? "large" : "small") + " to fit (largest " + shown +
                  "); rescale " + name + ", e.g. into other units");
}

Column read_column(const Range& values, const std::string& argument) {
    if (values.empty()) throw Refusal(argument + " is empty");
    if (values.columns != 1)
        throw Refusal(argument + " must be one column (found " + std::to_string(values.columns) + ")");
    Frame f = read_frame({{&values, ColumnKind::numeric, argument}});
    Column c;
    c.name = f.names[0];
    c.values = std::move(f.numbers[0]);
    c.n_used = f.n_used;
    c.n_dropped = f.n_dropped;
    return c;
}

}  // namespace quadrat
