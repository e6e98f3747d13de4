// Handlers of the post-hoc family: ADJUST.P, COMPARE.POSTHOC, COMPARE.LETTERS.
// Read the arguments, call the core, shape what the cells show. Nothing statistical here.
#include <optional>
#include <string>
#include <vector>

#include "addin/arguments.hpp"
#include "addin/handlers.hpp"
#include "core/adjust.hpp"
#include "core/letters.hpp"
#include "core/posthoc.hpp"
#include "core/transform.hpp"
#include "core/data.hpp"
#include "core/refusal.hpp"

namespace quadrat::addin {

// ADJUST.P(pvalues; [method]): the same shape back; blank cells stay blank and are not counted.
Table adjust_p(const Arguments& a) {
    const Range& cells = a[0];
    const Adjustment method = parse_adjustment(keyword_argument(a[1], "method"));
    std::vector<double> p;
    std::vector<std::size_t> where;  // index into cells of each p-value
    // The catalogue's header rule: a text in the first row above a column of numbers (no text
    // below) is that column's header, left blank in the result, so that AA:AA under a title works.
    auto is_header = [&](std::size_t col) {
        if (cells.rows < 2 || cells.at(0, col).kind != CellKind::text) return false;
        bool numbers = false;
        for (std::size_t row = 1; row < cells.rows; ++row) {
            const Cell& c = cells.at(row, col);
            if (c.kind == CellKind::text && !c.text.empty()) return false;
            numbers = numbers || c.kind == CellKind::number;
        }
        return numbers;
    };
    for (std::size_t row = 0; row < cells.rows; ++row)
        for (std::size_t col = 0; col < cells.columns; ++col) {
            const Cell& c = cells.at(row, col);
            if (c.kind == CellKind::error) throw Refusal(error_cell_message(cells, row, col, "pvalues"));
            if (c.kind == CellKind::empty || (c.kind == CellKind::text && c.text.empty())) continue;
            if (row == 0 && is_header(col)) continue;
            const std::string place = cells.is_reference ? cell_address(cells, row, col)
                                                         : "pvalues cell " + std::to_string(row * cells.columns + col + 1);
            if (c.kind == CellKind::text)
                throw Refusal(place + " holds text ('" + c.text + "'); pvalues takes p-values from 0 to 1 or blank cells");
            if (!(c.number >= 0.0 && c.number <= 1.0))
                throw Refusal(place + " holds " + number_label(c.number) + "; a p-value lies between 0 and 1");
            p.push_back(c.number);
            where.push_back(row * cells.columns + col);
        }
    if (p.empty()) throw Refusal("pvalues holds no p-values; give a range of numbers from 0 to 1");
    const std::vector<double> adjusted = quadrat::adjust_p(p, method);
    Table out(cells.rows, std::vector<CellValue>(cells.columns));
    for (std::size_t i = 0; i < p.size(); ++i) out[where[i] / cells.columns][where[i] % cells.columns] = adjusted[i];
    return out;
}

// COMPARE.POSTHOC(values; groups; [method]; [adjust]; [transform]; [level]): the pairs table.
// `adjust` is checked for every method but only used by dunn, t-pairs and rank-pairs.
Table compare_posthoc(const Arguments& a) {
    const Groups g = read_groups(a[0], a[1]);
    const PosthocMethod method = parse_posthoc_method(keyword_argument(a[2], "method"));
    const std::string adjust = keyword_argument(a[3], "adjust");
    const std::optional<Adjustment> adjustment =
        adjust.empty() ? std::nullopt : std::optional<Adjustment>(parse_adjustment(adjust));
    const Transform t = parse_transform(keyword_argument(a[4], "transform"));
    return quadrat::compare_posthoc(g, method, adjustment, t, level_argument(a[5])).table();
}

// COMPARE.LETTERS(values; groups; [method]; [level]; [transform]): one row per group with letters.
Table compare_letters(const Arguments& a) {
    const Groups g = read_groups(a[0], a[1]);
    const PosthocMethod method = parse_posthoc_method(keyword_argument(a[2], "method"));
    const Transform t = parse_transform(keyword_argument(a[4], "transform"));
    return quadrat::compare_letters(g, method, level_argument(a[3]), t).table();
}

}  // namespace quadrat::addin
