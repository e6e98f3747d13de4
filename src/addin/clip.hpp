// Whole columns side by side. A reference argument is read only down to the sheet's used area
// (a whole column B:B costs its used rows), but an `any` argument such as `groups` = A:A arrives
// whole from the office, a million rows. An `any` block spanning exactly the rows of a clipped
// reference is read only as far, when the rows left out are empty, so that values B:B and groups
// A:A keep the same number of rows, as they have on the sheet, and the empty rest of the column
// costs a scan rather than a million converted cells. Pure and UNO-free, so it is unit-tested.
#pragma once

#include <cstddef>
#include <functional>
#include <vector>

namespace quadrat::addin {

// A reference read only down to the end of the used area: how many rows it spans on the sheet,
// and how many were read.
struct Clip {
    std::size_t sheet_rows;
    std::size_t used_rows;
};

// How many rows of an `any` block of `block_rows` rows to read: the used rows of the first clip
// spanning exactly `block_rows` whose left-out rows are all empty, else all of them.
// `row_is_empty(r)` tells whether every cell of row r is empty.
std::size_t rows_to_read(std::size_t block_rows, const std::vector<Clip>& clips,
                         const std::function<bool(std::size_t)>& row_is_empty);

}  // namespace quadrat::addin
