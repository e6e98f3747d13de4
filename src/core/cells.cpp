#include "cells.hpp"

namespace quadrat {

Range Range::column(const std::vector<double>& xs) {
    Range r;
    r.rows = xs.size();
    r.columns = 1;
    r.is_reference = true;
    r.cells.reserve(xs.size());
    for (double x : xs) r.cells.push_back(Cell::make_number(x));
    return r;
}

Range Range::text_column(const std::vector<std::string>& labels) {
    Range r;
    r.rows = labels.size();
    r.columns = 1;
    r.is_reference = true;
    r.cells.reserve(labels.size());
    for (const auto& s : labels) r.cells.push_back(s.empty() ? Cell{} : Cell::make_text(s));
    return r;
}

std::string cell_address(const Range& range, std::size_t row, std::size_t column) {
    std::size_t c = range.first_column + column;
    std::string letters;
    // Bijective base 26: A..Z, AA..AZ, …
    ++c;
    while (c > 0) {
        --c;
        letters.insert(letters.begin(), static_cast<char>('A' + c % 26));
        c /= 26;
    }
    return letters + std::to_string(range.first_row + row + 1);
}

}  // namespace quadrat
