// The store of read ranges: a range argument is read from the sheet once per change and shared by
// every Quadrat cell of the document that names it (issue #19: a workbook of dozens of cells over
// the same logger columns read them once per edit, not once per cell).
//
// When a stored range may no longer hold what the sheet holds, it is read again:
// - Calc tells us: a modify listener on the range object (XModifyBroadcaster, what Calc's own charts
//   listen with) hears every change of a cell inside the range: typed, pasted, undone, sorted,
//   cleared, filled, moved in. The call comes when the change is broadcast, before the formula
//   cells that depend on the range compute again (they compute on demand after it).
// - A range that holds formula cells is never stored: a formula cell can change at a
//   recalculation without any edit (RAND, a hard recalculation), and that is not broadcast
//   before the cells that read it compute. (Measured: a hard recalculation calls every range's
//   listener after the formulas have computed.)
// - After such a call the range is read again at its next use; when it holds the same cells as
//   before, the earlier read stays, with its content id, so the results cached on it stay good
//   (a hard recalculation with nothing changed then costs a read per range, no statistics).
// - The range object follows inserted and deleted rows and moved sheets; a stored range whose
//   object no longer has the address it was stored under is dropped.
// - A long range is read down to the sheet's used area; a change of that area reads it again.
// - Kept per calling document (Calc's hidden caller argument), so two documents with the same
//   sheet names never share; a closing document takes its ranges with it (the listener's
//   disposing call).
// Bounded: at most 64 ranges and 4 million cells, the least recently used released first.
#pragma once

#include <cstddef>
#include <functional>
#include <memory>

#include <com/sun/star/table/CellRangeAddress.hpp>
#include <com/sun/star/table/XCellRange.hpp>
#include <com/sun/star/uno/XInterface.hpp>

#include "core/cells.hpp"

namespace quadrat::seam {

// One read of a range: its cells, the rows the reference spans on the sheet (before the cut to
// the used area), and whether any cell holds a formula (such a read is not stored).
struct RangeRead {
    Range range;
    std::size_t sheet_rows = 0;
    bool has_formulas = false;
};

// Where a read starts from: the document, the address the formula names, the last row read
// (the used area's, for a long range), and whether date formatting was asked.
struct RangeKey {
    const void* document = nullptr;  // the caller's XInterface; nullptr: no document, not stored
    com::sun::star::table::CellRangeAddress address;
    sal_Int32 last_row = 0;
    bool dates = false;
};

// The stored read of `key`, or `read()` (stored when it holds no formula cell). `reference` is
// the range object the call received: a newly stored range is watched through it.
std::shared_ptr<const RangeRead> stored_read(const RangeKey& key, const com::sun::star::uno::Reference<com::sun::star::table::XCellRange>& reference,
                                             const std::function<RangeRead()>& read);

// For the benchmark and tests: how many reads were served from the store.
std::size_t store_hits();

}  // namespace quadrat::seam
