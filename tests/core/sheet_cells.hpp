// Cells and blocks of cells as the glue hands them to a handler, for tests that lay out a small
// sheet by hand.
#pragma once

#include <cstddef>
#include <string>
#include <utility>
#include <vector>

#include "core/cells.hpp"

namespace quadrat::test_support {

inline Cell num(double x) { return Cell::make_number(x); }
inline Cell txt(const std::string& s) { return Cell::make_text(s); }

// A reference to `rows` × `columns` cells given row by row, whose top-left cell sits at
// (first_row, first_column) of the sheet, 0-based (B2 is 1, 1): refusals name cells by it.
inline Range block(std::size_t rows, std::size_t columns, std::vector<Cell> cells, std::size_t first_row = 0,
                   std::size_t first_column = 0) {
    Range r;
    r.rows = rows;
    r.columns = columns;
    r.cells = std::move(cells);
    r.is_reference = true;
    r.first_row = first_row;
    r.first_column = first_column;
    return r;
}

}  // namespace quadrat::test_support
