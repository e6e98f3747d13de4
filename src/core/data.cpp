#include "data.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <cstdlib>
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

}  // namespace

bool is_label(const Cell& c) {
    if (c.kind == CellKind::number) return std::isfinite(c.number);
    if (c.kind == CellKind::text) return !is_missing_marker(c.text);
    return false;
}

std::string label_of(const Cell& c) {
    if (c.kind == CellKind::number) return number_label(c.number);
    return std::string(trimmed(c.text));
}

namespace {

bool is_censored_value(const Cell& c) { return c.kind == CellKind::text && censored_text(c.text) == CensoredText::censored; }

bool present(const Cell& c, ColumnKind kind) {
    switch (kind) {
        case ColumnKind::numeric: return is_value(c);
        case ColumnKind::label: return is_label(c);
        case ColumnKind::censored: return is_value(c) || is_censored_value(c);
    }
    return false;
}

// The header rule of a censored value column: a header text above a number or a censored value.
bool censored_column_has_header(const Range& r, std::size_t column) {
    if (r.rows < 2 || !is_header_text(r.at(0, column)) || is_censored_value(r.at(0, column))) return false;
    for (std::size_t row = 1; row < r.rows; ++row)
        if (is_value(r.at(row, column)) || is_censored_value(r.at(row, column))) return true;
    return false;
}

// "B7", or "values row 7" for an inline array.
std::string place_of(const Range& r, std::size_t row, std::size_t column, const std::string& argument) {
    if (r.is_reference) return cell_address(r, row, column);
    return argument + " row " + std::to_string(row + 1);
}

void refuse_errors(const Range& r, const std::string& argument, std::size_t first_row) {
    for (std::size_t row = first_row; row < r.rows; ++row)
        for (std::size_t col = 0; col < r.columns; ++col)
            if (r.at(row, col).kind == CellKind::error) throw Refusal(error_cell_message(r, row, col, argument));
}

}  // namespace

bool is_header_text(const Cell& c) { return c.kind == CellKind::text && !is_missing_marker(c.text); }

bool numeric_column_has_header(const Range& r, std::size_t column) {
    if (r.rows < 2 || !is_header_text(r.at(0, column))) return false;
    for (std::size_t row = 1; row < r.rows; ++row)
        if (is_value(r.at(row, column))) return true;
    return false;
}

bool label_column_has_header(const Range& r, std::size_t column) {
    if (r.rows < 2 || !is_header_text(r.at(0, column))) return false;
    const std::string head = label_of(r.at(0, column));
    for (std::size_t row = 1; row < r.rows; ++row) {
        const Cell& c = r.at(row, column);
        if (is_label(c) && label_of(c) == head) return false;
    }
    return true;
}

CensoredText censored_text(std::string_view text, double* limit) {
    const std::string_view t = trimmed(text);
    if (t.empty()) return CensoredText::no;
    if (t.front() == '<') {
        // The limit as written: a decimal point or, in a comma-decimal locale, one comma.
        std::string number(trimmed(t.substr(1)));
        if (number.find('.') == std::string::npos) {
            const std::size_t comma = number.find(',');
            if (comma != std::string::npos && number.find(',', comma + 1) == std::string::npos) number[comma] = '.';
        }
        char* end = nullptr;
        const double x = number.empty() ? 0.0 : std::strtod(number.c_str(), &end);
        const bool whole = !number.empty() && end == number.c_str() + number.size() &&
                           (std::isdigit(static_cast<unsigned char>(number.front())) || number.front() == '.');
        if (whole && std::isfinite(x)) {
            if (limit) *limit = x;
            return CensoredText::censored;
        }
        return CensoredText::without_limit;
    }
    for (std::string_view marker : {"nd", "n.d.", "bdl"})
        if (equals_ignoring_case(t, marker)) return CensoredText::without_limit;
    return CensoredText::no;
}

// The refusal for one censored or non-detect cell, or nothing.
void refuse_censored_cell(const Range& r, std::size_t row, std::size_t column, const std::string& argument,
                          bool censored_allowed) {
    const Cell& c = r.at(row, column);
    if (c.kind != CellKind::text) return;
    const CensoredText kind = censored_text(c.text);
    if (kind == CensoredText::no || (kind == CensoredText::censored && censored_allowed)) return;
    const std::string shown(trimmed(c.text));
    if (kind == CensoredText::without_limit)
        throw Refusal(place_of(r, row, column, argument) + " holds " + shown + ": write the detection limit as <0.5");
    // Helsel (2006), Chemosphere 65, 2434–2439: leaving censored values out, or putting a
    // fraction of the limit in their place, biases every summary and test.
    throw Refusal(place_of(r, row, column, argument) + " holds a value below a detection limit (" + shown +
                  "); leaving it out would bias the result upward: use DESCRIBE.CENSORED or COMPARE.CENSORED");
}

namespace {

void refuse_censored_cells(const Range& r, const std::string& argument, std::size_t first, std::size_t last,
                           bool censored_allowed) {
    for (std::size_t row = 0; row < r.rows; ++row)
        for (std::size_t col = first; col < last; ++col) refuse_censored_cell(r, row, col, argument, censored_allowed);
}
}  // namespace

void refuse_censored_cells(const Range& r, const std::string& argument, std::size_t column) {
    if (column == static_cast<std::size_t>(-1))
        refuse_censored_cells(r, argument, 0, r.columns, false);
    else
        refuse_censored_cells(r, argument, column, column + 1, false);
}

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
            } else if (b.kind == ColumnKind::censored) {
                any_numeric = true;
                numeric_header = numeric_header || censored_column_has_header(*b.range, col);
            } else {
                all_labels_header = all_labels_header && label_column_has_header(*b.range, col);
            }
        }
    f.has_header = any_numeric ? numeric_header : all_labels_header;
    const std::size_t start = f.has_header ? 1 : 0;

    for (const auto& b : blocks) refuse_errors(*b.range, b.argument, 0);
    for (const auto& b : blocks)
        if (b.kind != ColumnKind::label)
            refuse_censored_cells(*b.range, b.argument, 0, b.range->columns, b.kind == ColumnKind::censored);

    for (const auto& b : blocks)
        for (std::size_t col = 0; col < b.range->columns; ++col) {
            const Cell& head = b.range->at(0, col);
            f.names.push_back(f.has_header && head.kind != CellKind::empty ? label_of(head) : std::string());
            f.kinds.push_back(b.kind);
        }
    const std::size_t ncols = f.names.size();
    f.numbers.resize(ncols);
    f.labels.resize(ncols);
    f.censored.resize(ncols);
    // Room for every row at once: growing by doubling would copy a long column several times and
    // touch fresh memory at each step (on 10⁶ rows that was most of a call's time).
    for (std::size_t k = 0; k < ncols; ++k) {
        if (f.kinds[k] == ColumnKind::label)
            f.labels[k].reserve(f.rows - start);
        else
            f.numbers[k].reserve(f.rows - start);
        if (f.kinds[k] == ColumnKind::censored) f.censored[k].reserve(f.rows - start);
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
                if (b.kind == ColumnKind::numeric) {
                    f.numbers[k].push_back(c.number);
                } else if (b.kind == ColumnKind::censored) {
                    double limit = c.number;
                    const bool censored = c.kind == CellKind::text && censored_text(c.text, &limit) == CensoredText::censored;
                    f.numbers[k].push_back(limit);
                    f.censored[k].push_back(censored);
                } else {
                    f.labels[k].push_back(label_of(c));
                }
            }
        f.used_rows.push_back(row);
    }
    f.n_used = f.used_rows.size();
    return f;
}

namespace {
Groups read_groups_as(const Range& values, const Range& groups, const std::string& values_name,
                      const std::string& groups_name, ColumnKind kind) {
    const bool censored = kind == ColumnKind::censored;
    Groups g;
    if (values.empty()) throw Refusal(values_name + " is empty");

    if (!groups.empty()) {
        if (values.columns != 1 || groups.columns != 1)
            throw Refusal(values_name + " and " + groups_name + " must each be one column (found " + std::to_string(values.columns) +
                          " and " + std::to_string(groups.columns) + ")");
        const Frame f = read_frame({{&values, kind, values_name}, {&groups, ColumnKind::label, groups_name}});
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
                if (censored) g.censored.emplace_back();
            }
            g.values[it->second].push_back(f.numbers[0][i]);
            if (censored) g.censored[it->second].push_back(f.censored[0][i]);
            g.row_group[f.used_rows[i]] = it->second;
            g.row_value[f.used_rows[i]] = f.numbers[0][i];
        }
        return g;
    }

    if (values.columns == 1) {
        const Frame f = read_frame({{&values, kind, values_name}});
        g.has_header = f.has_header;
        g.n_used = f.n_used;
        g.n_dropped = f.n_dropped;
        g.names.push_back(f.names[0].empty() ? "values" : f.names[0]);
        g.values.push_back(f.numbers[0]);
        if (censored) g.censored.push_back(f.censored[0]);
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
    refuse_errors(values, values_name, 0);
    refuse_censored_cells(values, values_name, 0, values.columns, censored);
    bool header = false;
    for (std::size_t col = 0; col < values.columns; ++col)
        header = header || (censored ? censored_column_has_header(values, col) : numeric_column_has_header(values, col));
    g.has_header = header;
    const std::size_t start = header ? 1 : 0;
    for (std::size_t col = 0; col < values.columns; ++col) {
        const Cell& head = values.at(0, col);
        g.names.push_back(header && is_header_text(head) ? label_of(head) : "column " + std::to_string(col + 1));
        std::vector<double> column;
        std::vector<bool> flags;
        for (std::size_t row = start; row < values.rows; ++row) {
            const Cell& c = values.at(row, col);
            double limit = 0.0;
            if (is_value(c)) {
                column.push_back(c.number);
                flags.push_back(false);
            } else if (censored && c.kind == CellKind::text && censored_text(c.text, &limit) == CensoredText::censored) {
                column.push_back(limit);
                flags.push_back(true);
            } else if (c.kind != CellKind::empty) {
                ++g.n_dropped;
            }
        }
        g.n_used += column.size();
        g.values.push_back(std::move(column));
        if (censored) g.censored.push_back(std::move(flags));
    }
    return g;
}
}  // namespace

Groups read_groups(const Range& values, const Range& groups, const std::string& values_name, const std::string& groups_name) {
    return read_groups_as(values, groups, values_name, groups_name, ColumnKind::numeric);
}

Groups read_censored_groups(const Range& values, const Range& groups, const std::string& values_name,
                            const std::string& groups_name) {
    return read_groups_as(values, groups, values_name, groups_name, ColumnKind::censored);
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

Probabilities read_probabilities(const Range& cells, const std::string& argument) {
    Probabilities out;
    for (std::size_t row = 0; row < cells.rows; ++row)
        for (std::size_t col = 0; col < cells.columns; ++col) {
            const Cell& c = cells.at(row, col);
            if (c.kind == CellKind::error) throw Refusal(error_cell_message(cells, row, col, argument));
            if (c.kind == CellKind::empty || (c.kind == CellKind::text && c.text.empty())) continue;
            if (row == 0 && numeric_column_has_header(cells, col)) continue;
            const std::string place = cells.is_reference ? cell_address(cells, row, col)
                                                         : argument + " cell " + std::to_string(row * cells.columns + col + 1);
            if (c.kind == CellKind::text)
                throw Refusal(place + " holds text ('" + c.text + "'); " + argument + " takes p-values from 0 to 1 or blank cells");
            if (!(c.number >= 0.0 && c.number <= 1.0))
                throw Refusal(place + " holds " + number_label(c.number) + "; a p-value lies between 0 and 1");
            out.values.push_back(c.number);
            out.positions.push_back(row * cells.columns + col);
        }
    if (out.values.empty()) throw Refusal(argument + " holds no p-values; give a range of numbers from 0 to 1");
    return out;
}

}  // namespace quadrat
