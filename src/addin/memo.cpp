#include "addin/memo.hpp"

#include <cstring>
#include <list>
#include <mutex>
#include <string>

namespace quadrat::addin {

namespace {

// A workbook of a few hundred cells over a few dozen ranges has that many results to keep: with
// shared ranges a key is a few bytes per argument, so the bound is on what the results may hold.
// A result's size grows with its arguments' cells (fitted values, residuals, ranks), so the cells
// behind the kept results are bounded, not only their number.
constexpr std::size_t capacity = 256;
constexpr std::size_t largest_kept_cells = 8'000'000;
constexpr std::size_t largest_key_cells = 4'000'000;  // cells copied into one key

struct Entry {
    std::string key;
    std::shared_ptr<const void> result;
    std::size_t cells;  // behind the result (its arguments' cells)
};

std::mutex guard;
std::list<Entry> entries;  // most recent first
std::size_t kept_cells = 0;
std::size_t hits = 0;

void append_bytes(std::string& key, const void* p, std::size_t n) { key.append(static_cast<const char*>(p), n); }

template <class T>
void append_value(std::string& key, T value) {
    append_bytes(key, &value, sizeof value);
}

// Every cell in a byte string: exact equality of the key is exact equality of the data (a shared
// range's cells by their content id).
// The key's exact length first, so that a million-cell key is written once, not regrown.
std::size_t key_size(std::string_view kind, const Arguments& arguments, const std::vector<std::size_t>& keyed) {
    std::size_t size = kind.size() + 1;
    for (std::size_t i : keyed) {
        size += sizeof i;
        if (i >= arguments.size()) continue;
        const Range& r = arguments[i];
        size += sizeof r.rows + sizeof r.columns + sizeof r.omitted + sizeof r.is_reference + sizeof r.dates + sizeof r.first_row +
                sizeof r.first_column + sizeof r.content_id;
        if (r.content_id != 0) continue;
        for (const Cell& c : r.cells) {
            size += 1;
            if (c.kind == CellKind::number) size += sizeof c.number;
            if (c.kind == CellKind::text || c.kind == CellKind::error) size += sizeof(std::size_t) + c.text.size();
        }
    }
    return size;
}

std::string make_key(std::string_view kind, const Arguments& arguments, const std::vector<std::size_t>& keyed) {
    std::string key;
    key.reserve(key_size(kind, arguments, keyed));
    key += kind;
    key.push_back('\0');
    for (std::size_t i : keyed) {
        append_value(key, i);
        if (i >= arguments.size()) continue;  // left off by the caller
        const Range& r = arguments[i];
        append_value(key, r.rows);
        append_value(key, r.columns);
        append_value(key, r.omitted);
        append_value(key, r.is_reference);
        append_value(key, r.dates);  // the same day numbers formatted as dates give a slope per year
        append_value(key, r.first_row);
        append_value(key, r.first_column);
        // Cells the seam decoded once and shares carry an id that stands for all of them.
        append_value(key, r.content_id);
        if (r.content_id != 0) continue;
        for (const Cell& c : r.cells) {
            key.push_back(static_cast<char>(c.kind));
            if (c.kind == CellKind::number) append_value(key, c.number);
            if (c.kind == CellKind::text || c.kind == CellKind::error) {
                append_value(key, c.text.size());
                key += c.text;
            }
        }
    }
    return key;
}

// The cells of the keyed arguments; `copied_only`: those a key copies (a shared range is named by
// its id).
std::size_t cell_count(const Arguments& arguments, const std::vector<std::size_t>& keyed, bool copied_only) {
    std::size_t n = 0;
    for (std::size_t i : keyed)
        if (i < arguments.size() && !(copied_only && arguments[i].content_id != 0)) n += arguments[i].cells.size();
    return n;
}

}  // namespace

std::shared_ptr<const void> remembered_result(std::string_view kind, const Arguments& arguments,
                                              const std::vector<std::size_t>& keyed,
                                              const std::function<std::shared_ptr<const void>()>& compute) {
    const std::size_t cells = cell_count(arguments, keyed, false);
    if (cell_count(arguments, keyed, true) > largest_key_cells || cells > largest_kept_cells) return compute();
    std::string key = make_key(kind, arguments, keyed);
    {
        std::lock_guard<std::mutex> lock(guard);
        for (auto it = entries.begin(); it != entries.end(); ++it)
            if (it->key == key) {
                entries.splice(entries.begin(), entries, it);
                ++hits;
                return entries.front().result;
            }
    }
    // Computed outside the lock: a slow test does not hold up other cells.
    auto result = compute();
    std::lock_guard<std::mutex> lock(guard);
    entries.push_front({std::move(key), result, cells});
    kept_cells += cells;
    while (entries.size() > capacity || kept_cells > largest_kept_cells) {
        kept_cells -= entries.back().cells;
        entries.pop_back();
    }
    return result;
}

std::size_t remembered_hits() {
    std::lock_guard<std::mutex> lock(guard);
    return hits;
}

void forget_all() {
    std::lock_guard<std::mutex> lock(guard);
    entries.clear();
    kept_cells = 0;
    hits = 0;
}

}  // namespace quadrat::addin
