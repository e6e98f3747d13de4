#include "addin/memo.hpp"

#include <cstring>
#include <list>
#include <mutex>
#include <string>

namespace quadrat::addin {

namespace {

constexpr std::size_t capacity = 16;
constexpr std::size_t largest_key_cells = 4'000'000;

struct Entry {
    std::string key;
    std::shared_ptr<const void> result;
};

std::mutex guard;
std::list<Entry> entries;  // most recent first
std::size_t hits = 0;

void append_bytes(std::string& key, const void* p, std::size_t n) { key.append(static_cast<const char*>(p), n); }

template <class T>
void append_value(std::string& key, T value) {
    append_bytes(key, &value, sizeof value);
}

// Every cell in a byte string: exact equality of the key is exact equality of the data.
// The key's exact length first, so that a million-cell key is written once, not regrown.
std::size_t key_size(std::string_view kind, const Arguments& arguments, const std::vector<std::size_t>& keyed) {
    std::size_t size = kind.size() + 1;
    for (std::size_t i : keyed) {
        size += sizeof i;
        if (i >= arguments.size()) continue;
        const Range& r = arguments[i];
        size += sizeof r.rows + sizeof r.columns + sizeof r.omitted + sizeof r.is_reference + sizeof r.dates + sizeof r.first_row +
                sizeof r.first_column;
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

std::size_t cell_count(const Arguments& arguments, const std::vector<std::size_t>& keyed) {
    std::size_t n = 0;
    for (std::size_t i : keyed)
        if (i < arguments.size()) n += arguments[i].cells.size();
    return n;
}

}  // namespace

std::shared_ptr<const void> remembered_result(std::string_view kind, const Arguments& arguments,
                                              const std::vector<std::size_t>& keyed,
                                              const std::function<std::shared_ptr<const void>()>& compute) {
    if (cell_count(arguments, keyed) > largest_key_cells) return compute();
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
    entries.push_front({std::move(key), result});
    if (entries.size() > capacity) entries.pop_back();
    return result;
}

std::size_t remembered_hits() {
    std::lock_guard<std::mutex> lock(guard);
    return hits;
}

void forget_all() {
    std::lock_guard<std::mutex> lock(guard);
    entries.clear();
    hits = 0;
}

}  // namespace quadrat::addin
