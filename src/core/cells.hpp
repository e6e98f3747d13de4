// Cells as the glue hands them to the core: no office type reaches past this file.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <variant>
#include <vector>

namespace quadrat {

// What one spreadsheet cell held when the function was called.
enum class CellKind { empty, number, text, error };

struct Cell {
    CellKind kind = CellKind::empty;
    double number = 0.0;  // valid when kind == number
    std::string text;     // the text when kind == text; the error's name (#DIV/0!) when kind == error

    static Cell make_number(double x) { return Cell{CellKind::number, x, {}}; }
    static Cell make_text(std::string s) { return Cell{CellKind::text, 0.0, std::move(s)}; }
    static Cell make_error(std::string name) { return Cell{CellKind::error, 0.0, std::move(name)}; }
};

// One argument: a block of cells in row-major order. A typed scalar is a 1×1 block; an omitted
// argument has `omitted` set and no cells. `first_row`/`first_column` are the sheet position of
// the top-left cell (0-based) when the argument was a reference, so a refusal can name a cell.
struct Range {
    std::size_t rows = 0;
    std::size_t columns = 0;
    std::vector<Cell> cells;
    bool omitted = false;
    bool is_reference = false;
    // Only for an argument declared to ask for it (TRACK.TREND `times`): its used cells hold date or
    // time content (numbers formatted as dates), so they are day numbers.
    bool dates = false;
    // Nonzero when the seam decoded these cells once and shares them between calls (its store of
    // read ranges): two ranges with the same id hold the same cells, so a cache key can name the
    // id instead of copying every cell. 0: no such promise.
    std::uint64_t content_id = 0;
    std::size_t first_row = 0;
    std::size_t first_column = 0;

    const Cell& at(std::size_t row, std::size_t column) const { return cells[row * columns + column]; }
    bool empty() const { return omitted || cells.empty(); }

    static Range omitted_argument() {
        Range r;
        r.omitted = true;
        return r;
    }
    static Range scalar(Cell c) {
        Range r;
        r.rows = r.columns = 1;
        r.cells.push_back(std::move(c));
        return r;
    }
    // A column of numbers, for tests and benchmarks.
    static Range column(const std::vector<double>& xs);
    // A column of texts, for tests and benchmarks.
    static Range text_column(const std::vector<std::string>& labels);
};

// "B17": the sheet address of a cell inside a referenced range (A1 style).
std::string cell_address(const Range& range, std::size_t row, std::size_t column);

// What one output cell shows: blank, a number, or text.
using CellValue = std::variant<std::monostate, double, std::string>;
using Table = std::vector<std::vector<CellValue>>;

}  // namespace quadrat
