#include "data.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <deque>
#include <unordered_map>

#include "refusal.hpp"

namespace quadrat {

namespace {

// A printable ASCII byte other than a space: a space in no locale.
bool plain(char c) { return c > ' ' && c < '\x7f'; }

inline std::string_view trimmed(std::string_view s) {
    if (!s.empty() && plain(s.front()) && plain(s.back())) return s;  // the common case, without isspace
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
    // A cell repeats the header when its label equals the header's: a text that trims to it (the
    // header is no missing marker, so neither is that text), or a number that shows as it, which
    // only a header made of the characters a number shows (digits, sign, point, exponent) can be.
    const std::string_view head = trimmed(r.at(0, column).text);
    const bool number_like = head.find_first_not_of("0123456789+-.e") == std::string_view::npos;
    for (std::size_t row = 1; row < r.rows; ++row) {
        const Cell& c = r.at(row, column);
        if (c.kind == CellKind::text ? trimmed(c.text) == head
                                     : number_like && is_value(c) && number_label(c.number) == head)
            return false;
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
    if (t.size() > 7) return false;  // longer than "missing", the longest marker
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

namespace {

// The labels of one column, each distinct text judged once (issue #19: labels at logger scale):
// a text cell's label is a view of its trimmed text inside the cell (no copy per cell), a number
// cell's label is made once per distinct number, and whether a text is a missing marker is decided
// once per distinct text. Each distinct text gets a key in order of first sight.
class LabelKeys {
public:
    static constexpr std::uint32_t none = static_cast<std::uint32_t>(-1);

    // The key of the cell's label, or `none` when the cell holds no label (is_label).
    std::uint32_t of(const Cell& c) {
        if (c.kind == CellKind::text) {
            const std::string_view t = c.text;
            const bool bare = !t.empty() && plain(t.front()) && plain(t.back());  // nothing to trim
            const std::uint32_t key = find(bare ? t : trimmed(t));
            return is_label_[key] ? key : none;
        }
        if (c.kind == CellKind::number && std::isfinite(c.number)) return of_number(c.number);
        return none;
    }
    std::size_t size() const { return texts_.size(); }
    std::string_view text(std::uint32_t key) const { return texts_[key]; }

private:
    // Few distinct labels (the usual column of sites or treatments) are found by comparing with
    // each; past this many, through a hash table.
    static constexpr std::size_t linear_search_up_to = 16;

    std::uint32_t find(std::string_view t) {
        // A small table remembers, by a fingerprint of the text, the key last found there: with few
        // distinct labels nearly every cell is found by one comparison that does not miss.
        std::uint32_t& remembered = recent_[slot(t)];
        if (remembered != none && same_text(texts_[remembered], t)) return remembered;
        return remembered = search(t);
    }

    [[gnu::noinline]] std::uint32_t search(std::string_view t) {
        if (index_.empty()) {
            for (std::uint32_t k = 0; k < texts_.size(); ++k)
                if (texts_[k] == t) return k;
        } else if (const auto it = index_.find(t); it != index_.end()) {
            return it->second;
        }
        const auto key = static_cast<std::uint32_t>(texts_.size());
        texts_.push_back(t);
        is_label_.push_back(!is_missing_marker(t));
        if (!index_.empty())
            index_.emplace(t, key);
        else if (texts_.size() > linear_search_up_to)
            for (std::uint32_t k = 0; k < texts_.size(); ++k) index_.emplace(texts_[k], k);
        return key;
    }

    static std::uint32_t load4(const char* p) {
        std::uint32_t x;
        std::memcpy(&x, p, sizeof x);
        return x;
    }
    static std::uint64_t load8(const char* p) {
        std::uint64_t x;
        std::memcpy(&x, p, sizeof x);
        return x;
    }
    // Equal texts, short ones compared by whole words (no call to memcmp per cell).
    static bool same_text(std::string_view a, std::string_view b) {
        const std::size_t n = a.size();
        if (n != b.size()) return false;
        if (n > 16) return std::memcmp(a.data(), b.data(), n) == 0;
        if (n >= 8) return load8(a.data()) == load8(b.data()) && load8(a.data() + n - 8) == load8(b.data() + n - 8);
        if (n >= 4) return load4(a.data()) == load4(b.data()) && load4(a.data() + n - 4) == load4(b.data() + n - 4);
        for (std::size_t i = 0; i < n; ++i)
            if (a[i] != b[i]) return false;
        return true;
    }
    // The text's length, first and last bytes, mixed into one of the table's slots.
    static std::size_t slot(std::string_view t) {
        const std::size_t n = t.size();
        std::uint64_t x = n;
        if (n >= 4)
            x ^= (std::uint64_t{load4(t.data())} << 32 | load4(t.data() + n - 4)) + n;
        else
            for (std::size_t i = 0; i < n; ++i) x = x << 8 | static_cast<unsigned char>(t[i]);
        return static_cast<std::size_t>((x * 0x9E3779B97F4A7C15ull) >> (64 - recent_bits));
    }

    // A number's label as the office shows it (number_label): 2 and the text "2" are one label.
    std::uint32_t of_number(double x) {
        std::uint64_t bits;
        std::memcpy(&bits, &x, sizeof bits);
        if (const auto it = numbers_.find(bits); it != numbers_.end()) return it->second;
        const std::uint32_t key = find(owned_.emplace_back(number_label(x)));
        numbers_.emplace(bits, key);
        return key;
    }

    std::vector<std::string_view> texts_;  // per key: views into the cells, or into owned_
    std::vector<char> is_label_;           // per key: not a missing marker
    std::unordered_map<std::string_view, std::uint32_t> index_;
    std::unordered_map<std::uint64_t, std::uint32_t> numbers_;
    std::deque<std::string> owned_;  // number labels (a deque: its strings never move)
    static constexpr int recent_bits = 6;
    std::array<std::uint32_t, std::size_t{1} << recent_bits> recent_ = filled(none);
    static std::array<std::uint32_t, std::size_t{1} << recent_bits> filled(std::uint32_t v) {
        std::array<std::uint32_t, std::size_t{1} << recent_bits> a;
        a.fill(v);
        return a;
    }
};

constexpr std::size_t nowhere = static_cast<std::size_t>(-1);

// The first cell of each block that read_frame refuses, found in the same pass as the reading:
// errors come first (in block order), then censored or non-detect values of non-label blocks —
// the order of one scan for errors followed by one for censored cells.
struct FirstRefusals {
    struct Place {
        std::size_t row = nowhere, column = 0;
    };
    std::vector<Place> error, censored;

    explicit FirstRefusals(std::size_t blocks) : error(blocks), censored(blocks) {}

    // For an error or text cell of block b.
    void note(const FrameBlock& block, std::size_t b, std::size_t row, std::size_t column, const Cell& c) {
        if (c.kind == CellKind::error) {
            if (error[b].row == nowhere) error[b] = {row, column};
        } else if (block.kind != ColumnKind::label && censored[b].row == nowhere) {
            const CensoredText kind = censored_text(c.text);
            if (kind == CensoredText::without_limit || (kind == CensoredText::censored && block.kind != ColumnKind::censored))
                censored[b] = {row, column};
        }
    }
    void refuse(const std::vector<FrameBlock>& blocks) const {
        for (std::size_t b = 0; b < blocks.size(); ++b)
            if (error[b].row != nowhere)
                throw Refusal(error_cell_message(*blocks[b].range, error[b].row, error[b].column, blocks[b].argument));
        for (std::size_t b = 0; b < blocks.size(); ++b)
            if (censored[b].row != nowhere)
                refuse_censored_cell(*blocks[b].range, censored[b].row, censored[b].column, blocks[b].argument,
                                     blocks[b].kind == ColumnKind::censored);
    }
};

}  // namespace

Frame read_frame(const std::vector<FrameBlock>& blocks, LabelForm form) {
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
    for (const auto& b : blocks)
        for (std::size_t col = 0; col < b.range->columns; ++col) {
            if (b.kind == ColumnKind::numeric) {
                any_numeric = true;
                numeric_header = numeric_header || numeric_column_has_header(*b.range, col);
            } else if (b.kind == ColumnKind::censored) {
                any_numeric = true;
                numeric_header = numeric_header || censored_column_has_header(*b.range, col);
            }
        }
    if (any_numeric) {
        f.has_header = numeric_header;
    } else {
        f.has_header = true;
        for (const auto& b : blocks)
            for (std::size_t col = 0; col < b.range->columns && f.has_header; ++col)
                f.has_header = label_column_has_header(*b.range, col);
    }
    const std::size_t start = f.has_header ? 1 : 0;

    for (const auto& b : blocks)
        for (std::size_t col = 0; col < b.range->columns; ++col) {
            const Cell& head = b.range->at(0, col);
            f.names.push_back(f.has_header && head.kind != CellKind::empty ? label_of(head) : std::string());
            f.kinds.push_back(b.kind);
        }
    const std::size_t ncols = f.names.size();
    f.numbers.resize(ncols);
    f.labels.resize(ncols);
    f.levels.resize(ncols);
    f.codes.resize(ncols);
    f.censored.resize(ncols);
    // Room for every row at once: growing by doubling would copy a long column several times and
    // touch fresh memory at each step (on 10⁶ rows that was most of a call's time).
    for (std::size_t k = 0; k < ncols; ++k) {
        if (f.kinds[k] != ColumnKind::label)
            f.numbers[k].reserve(f.rows - start);
        else if (form == LabelForm::texts)
            f.labels[k].reserve(f.rows - start);
        else
            f.codes[k].reserve(f.rows - start);
        if (f.kinds[k] == ColumnKind::censored) f.censored[k].reserve(f.rows - start);
    }
    f.used_rows.reserve(f.rows - start);

    // One pass over the cells: the refusals (errors anywhere, header row included; censored values
    // in value columns) are noted and given after it, the rows read meanwhile.
    FirstRefusals refusals(blocks.size());
    for (std::size_t b = 0; b < blocks.size() && start == 1; ++b)
        for (std::size_t col = 0; col < blocks[b].range->columns; ++col) {
            const Cell& c = blocks[b].range->at(0, col);
            if (c.kind == CellKind::error || c.kind == CellKind::text) refusals.note(blocks[b], b, 0, col, c);
        }
    // Each column once more as where its cells lie (a column of a block: a first cell and a stride).
    struct Source {
        const Cell* first;
        std::size_t stride, block, column;
        ColumnKind kind;
    };
    std::vector<Source> sources;
    for (std::size_t b = 0; b < blocks.size(); ++b)
        for (std::size_t col = 0; col < blocks[b].range->columns; ++col)
            sources.push_back({blocks[b].range->cells.data() + col, blocks[b].range->columns, b, col, blocks[b].kind});
    std::vector<LabelKeys> keys(ncols);
    std::vector<std::vector<std::uint32_t>> code_of_key(ncols);  // per label column, per key: its code once used
    std::vector<std::uint32_t> row_keys(ncols, LabelKeys::none);
    for (std::size_t row = start; row < f.rows; ++row) {
        bool all_present = true;
        bool anything = false;
        for (std::size_t k = 0; k < ncols; ++k) {
            const Source& from = sources[k];
            const Cell& c = from.first[row * from.stride];
            anything = anything || c.kind != CellKind::empty;
            if (c.kind == CellKind::error || (c.kind == CellKind::text && from.kind != ColumnKind::label))
                refusals.note(blocks[from.block], from.block, row, from.column, c);
            if (from.kind == ColumnKind::label) {
                row_keys[k] = keys[k].of(c);
                all_present = all_present && row_keys[k] != LabelKeys::none;
            } else {
                all_present = all_present && (is_value(c) || (from.kind == ColumnKind::censored && is_censored_value(c)));
            }
        }
        if (!all_present) {
            if (anything) ++f.n_dropped;
            continue;
        }
        for (std::size_t k = 0; k < ncols; ++k) {
            const Source& from = sources[k];
            const Cell& c = from.first[row * from.stride];
            if (from.kind == ColumnKind::numeric) {
                f.numbers[k].push_back(c.number);
            } else if (from.kind == ColumnKind::censored) {
                double limit = c.number;
                const bool censored = c.kind == CellKind::text && censored_text(c.text, &limit) == CensoredText::censored;
                f.numbers[k].push_back(limit);
                f.censored[k].push_back(censored);
            } else {
                // Codes in order of first use: a label seen only on dropped rows gets none.
                auto& codes = code_of_key[k];
                const std::uint32_t key = row_keys[k];
                if (key >= codes.size()) codes.resize(keys[k].size(), LabelKeys::none);
                if (codes[key] == LabelKeys::none) {
                    codes[key] = static_cast<std::uint32_t>(f.levels[k].size());
                    f.levels[k].emplace_back(keys[k].text(key));
                }
                if (form == LabelForm::texts)
                    f.labels[k].push_back(f.levels[k][codes[key]]);
                else
                    f.codes[k].push_back(codes[key]);
            }
        }
        f.used_rows.push_back(row);
    }
    refusals.refuse(blocks);
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
        Frame f = read_frame({{&values, kind, values_name}, {&groups, ColumnKind::label, groups_name}}, LabelForm::codes);
        g.labelled = true;
        g.has_header = f.has_header;
        g.n_used = f.n_used;
        g.n_dropped = f.n_dropped;
        // Groups in order of first appearance (the codes' order); each group's room counted first,
        // so that no group's values are copied as it grows.
        g.names = std::move(f.levels[1]);
        const std::vector<std::uint32_t>& codes = f.codes[1];
        const std::vector<double>& numbers = f.numbers[0];
        std::vector<std::size_t> sizes(g.names.size(), 0);
        for (std::uint32_t code : codes) ++sizes[code];
        g.values.resize(g.names.size());
        for (std::size_t j = 0; j < sizes.size(); ++j) g.values[j].reserve(sizes[j]);
        if (censored) {
            g.censored.resize(g.names.size());
            for (std::size_t j = 0; j < sizes.size(); ++j) g.censored[j].reserve(sizes[j]);
        }
        for (std::size_t i = 0; i < f.n_used; ++i) g.values[codes[i]].push_back(numbers[i]);
        if (censored)
            for (std::size_t i = 0; i < f.n_used; ++i) g.censored[codes[i]].push_back(f.censored[0][i]);
        // Row by row, each written once: the used rows ascend.
        g.row_group.resize(f.rows);
        g.row_value.resize(f.rows);
        for (std::size_t row = 0, i = 0; row < f.rows; ++row) {
            const bool used = i < f.n_used && f.used_rows[i] == row;
            g.row_group[row] = used ? codes[i] : no_group;
            g.row_value[row] = used ? numbers[i] : 0.0;
            i += used;
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
    bool header = false;
    for (std::size_t col = 0; col < values.columns; ++col)
        header = header || (censored ? censored_column_has_header(values, col) : numeric_column_has_header(values, col));
    g.has_header = header;
    const std::size_t start = header ? 1 : 0;
    g.values.resize(values.columns);
    if (censored) g.censored.resize(values.columns);
    for (std::size_t col = 0; col < values.columns; ++col) {
        const Cell& head = values.at(0, col);
        g.names.push_back(header && is_header_text(head) ? label_of(head) : "column " + std::to_string(col + 1));
        g.values[col].reserve(values.rows - start);
        if (censored) g.censored[col].reserve(values.rows - start);
    }
    // One pass, row by row as the cells lie: the refusals (errors first, then censored values, each
    // the first in reading order) are noted and given after it.
    const FrameBlock block{&values, kind, values_name};
    FirstRefusals refusals(1);
    for (std::size_t row = 0; row < values.rows; ++row)
        for (std::size_t col = 0; col < values.columns; ++col) {
            const Cell& c = values.at(row, col);
            if (c.kind == CellKind::error || c.kind == CellKind::text) refusals.note(block, 0, row, col, c);
            if (row < start) continue;
            double limit = 0.0;
            if (is_value(c)) {
                g.values[col].push_back(c.number);
                if (censored) g.censored[col].push_back(false);
            } else if (censored && c.kind == CellKind::text && censored_text(c.text, &limit) == CensoredText::censored) {
                g.values[col].push_back(limit);
                g.censored[col].push_back(true);
            } else if (c.kind != CellKind::empty) {
                ++g.n_dropped;
            }
        }
    refusals.refuse({block});
    for (const auto& column : g.values) g.n_used += column.size();
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
