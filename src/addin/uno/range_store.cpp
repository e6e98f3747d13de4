#include "addin/uno/range_store.hpp"

#include <atomic>
#include <cstring>
#include <cstdint>
#include <list>
#include <mutex>
#include <utility>
#include <vector>

#include <com/sun/star/lang/EventObject.hpp>
#include <com/sun/star/sheet/XCellRangeAddressable.hpp>
#include <com/sun/star/util/XModifyBroadcaster.hpp>
#include <com/sun/star/util/XModifyListener.hpp>
#include <cppuhelper/implbase1.hxx>

namespace quadrat::seam {

namespace {

namespace css = com::sun::star;
using css::uno::Reference;

constexpr std::size_t most_ranges = 64;
constexpr std::size_t most_cells = 4'000'000;

bool same_address(const css::table::CellRangeAddress& a, const css::table::CellRangeAddress& b) {
    return a.Sheet == b.Sheet && a.StartColumn == b.StartColumn && a.StartRow == b.StartRow && a.EndColumn == b.EndColumn &&
           a.EndRow == b.EndRow;
}

bool same_key(const RangeKey& a, const RangeKey& b) {
    return a.document == b.document && same_address(a.address, b.address) && a.last_row == b.last_row && a.dates == b.dates;
}

struct Stored {
    std::uint64_t id;  // how its watch names it
    RangeKey key;
    Reference<css::util::XModifyBroadcaster> range;  // the watched range object
    Reference<css::util::XModifyListener> watch;
    std::shared_ptr<const RangeRead> read;
    // False once Calc said a cell inside changed. The old read is kept until the range is read
    // again: a hard recalculation calls every listener without changing a constant, and a read
    // that finds the same cells keeps its content id, so the results cached on it stay good.
    bool current = true;
};

std::size_t cells_of(const std::shared_ptr<const RangeRead>& read) { return read ? read->range.cells.size() : 0; }

// The same cells, bit for bit (a number's bits, so that -0 and 0 differ as they may in a result).
bool same_cells(const Range& a, const Range& b) {
    if (a.rows != b.rows || a.columns != b.columns || a.dates != b.dates || a.cells.size() != b.cells.size()) return false;
    for (std::size_t i = 0; i < a.cells.size(); ++i) {
        const Cell& x = a.cells[i];
        const Cell& y = b.cells[i];
        if (x.kind != y.kind || std::memcmp(&x.number, &y.number, sizeof x.number) != 0 || x.text != y.text) return false;
    }
    return true;
}

// The range object still covers the address the read was stored under (rows inserted or deleted
// above or inside it, or a sheet moved, change its address).
bool unmoved(const Stored& s) {
    Reference<css::sheet::XCellRangeAddressable> addressable(s.range, css::uno::UNO_QUERY);
    return addressable.is() && same_address(addressable->getRangeAddress(), s.key.address);
}

using Unwatch = std::vector<std::pair<Reference<css::util::XModifyBroadcaster>, Reference<css::util::XModifyListener>>>;

class Store {
public:
    std::mutex guard;
    std::list<Stored> entries;  // most recently used first
    std::size_t cells = 0;
    std::size_t hits = 0;
    std::uint64_t next_id = 1;
    // Range objects of a closing document: let go at the next call, not inside Calc's own
    // notification of the closing.
    std::vector<Reference<css::uno::XInterface>> released;

    std::list<Stored>::iterator find(const RangeKey& key) {
        for (auto it = entries.begin(); it != entries.end(); ++it)
            if (same_key(it->key, key)) return it;
        return entries.end();
    }
    std::list<Stored>::iterator find(std::uint64_t id) {
        for (auto it = entries.begin(); it != entries.end(); ++it)
            if (it->id == id) return it;
        return entries.end();
    }
    // Forgets an entry; its listener is removed by the caller, outside the lock.
    void drop(std::list<Stored>::iterator it, Unwatch& unwatch) {
        cells -= cells_of(it->read);
        unwatch.emplace_back(it->range, it->watch);
        entries.erase(it);
    }

    void changed(std::uint64_t id) {
        std::lock_guard<std::mutex> lock(guard);
        auto it = find(id);
        if (it != entries.end()) it->current = false;
    }
    void disposed(std::uint64_t id) {
        std::lock_guard<std::mutex> lock(guard);
        auto it = find(id);
        if (it == entries.end()) return;
        cells -= cells_of(it->read);
        released.push_back(it->range);
        entries.erase(it);
    }
};

// Never destroyed: releasing office objects from a static destructor, after the office has shut
// its services down, would crash the office at exit.
Store& store() {
    static Store* s = new Store;
    return *s;
}

std::atomic<std::uint64_t> next_content_id{1};

class Watch : public cppu::WeakImplHelper1<css::util::XModifyListener> {
public:
    explicit Watch(std::uint64_t id) : id_(id) {}
    // Called by Calc: nothing may escape into it. Only the lock can fail here, and a store whose
    // lock fails serves nothing (every call through it throws, and its cell shows the refusal).
    void SAL_CALL modified(const css::lang::EventObject&) override {
        try {
            store().changed(id_);
        } catch (...) {
            forget();  // the same lock: if it failed above, this fails too, quietly
        }
    }
    void SAL_CALL disposing(const css::lang::EventObject&) override { forget(); }

private:
    void forget() noexcept {
        try {
            store().disposed(id_);
        } catch (...) {
            // See modified().
        }
    }
    std::uint64_t id_;
};

void remove_listeners(const Unwatch& unwatch) {
    for (const auto& [range, watch] : unwatch) {
        try {
            if (range.is() && watch.is()) range->removeModifyListener(watch);
        } catch (...) {
            // A range of a closed document: nothing left to remove.
        }
    }
}

}  // namespace

std::shared_ptr<const RangeRead> stored_read(const RangeKey& key, const Reference<css::table::XCellRange>& reference,
                                             const std::function<RangeRead()>& read) {
    if (key.document == nullptr) return std::make_shared<const RangeRead>(read());
    Store& s = store();
    std::vector<Reference<css::uno::XInterface>> release;  // let go after the lock, at return
    Unwatch unwatch;
    {
        std::lock_guard<std::mutex> lock(s.guard);
        release.swap(s.released);
        auto it = s.find(key);
        if (it != s.entries.end()) {
            if (!unmoved(*it)) {
                s.drop(it, unwatch);
            } else if (it->current) {
                s.entries.splice(s.entries.begin(), s.entries, it);
                ++s.hits;
                return it->read;
            }
        }
    }
    remove_listeners(unwatch);
    unwatch.clear();

    RangeRead fresh = read();
    if (fresh.has_formulas) {
        // Never stored; an entry for these cells (they held no formula before) goes.
        {
            std::lock_guard<std::mutex> lock(s.guard);
            auto it = s.find(key);
            if (it != s.entries.end()) s.drop(it, unwatch);
        }
        remove_listeners(unwatch);
        return std::make_shared<const RangeRead>(std::move(fresh));
    }
    std::shared_ptr<const RangeRead> kept;  // the earlier read of these cells, if any
    {
        std::lock_guard<std::mutex> lock(s.guard);
        auto it = s.find(key);
        if (it != s.entries.end()) kept = it->read;
    }
    if (kept && kept->sheet_rows == fresh.sheet_rows && same_cells(kept->range, fresh.range)) {
        std::lock_guard<std::mutex> lock(s.guard);
        auto it = s.find(key);
        if (it != s.entries.end() && it->read == kept) {
            it->current = true;
            s.entries.splice(s.entries.begin(), s.entries, it);
        }
        return kept;
    }
    fresh.range.content_id = next_content_id++;
    auto shared = std::make_shared<const RangeRead>(std::move(fresh));
    const std::size_t n = cells_of(shared);
    if (n > most_cells) return shared;

    {
        std::lock_guard<std::mutex> lock(s.guard);
        auto it = s.find(key);
        if (it != s.entries.end()) {
            // Read again after a change: the range object and its listener stay.
            s.cells -= cells_of(it->read);
            it->read = shared;
            it->current = true;
            s.cells += n;
            s.entries.splice(s.entries.begin(), s.entries, it);
        } else {
            Reference<css::util::XModifyBroadcaster> broadcaster(reference, css::uno::UNO_QUERY);
            if (!broadcaster.is()) return shared;
            const std::uint64_t id = s.next_id++;
            Reference<css::util::XModifyListener> watch(new Watch(id));
            // Calc registers the listener and returns: it calls back only when a cell changes later.
            broadcaster->addModifyListener(watch);
            s.entries.push_front(Stored{id, key, broadcaster, watch, shared, true});
            s.cells += n;
        }
        // Least recently used out first (never the one just stored).
        while (s.entries.size() > 1 && (s.entries.size() > most_ranges || s.cells > most_cells)) s.drop(std::prev(s.entries.end()), unwatch);
    }
    remove_listeners(unwatch);
    return shared;
}

std::size_t store_hits() {
    std::lock_guard<std::mutex> lock(store().guard);
    return store().hits;
}

}  // namespace quadrat::seam
