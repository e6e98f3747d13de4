// ADJUST.P: multiple-comparison adjustment of p-values already in cells.
#include "addin/families/common.hpp"
#include "core/adjust.hpp"

namespace quadrat::addin {
namespace {

const Declare adjust{
    Function{"ADJUST.P", "adjustP",
             "Adjusts p-values for multiple comparisons: an array of the same shape; blank cells stay blank.",
             {data("pvalues", "p-values (0 to 1), any shape."),
              keyword("method", adjustment_methods(), "holm", "Adjustment")},
             table([](const Request& r) {
                 const Range& cells = r.range("pvalues");
                 const Probabilities p = read_probabilities(cells, "pvalues");
                 const std::vector<double> adjusted = adjust_p(p.values, parse_adjustment(r.keyword("method")));
                 Table out(cells.rows, std::vector<CellValue>(cells.columns));
                 for (std::size_t i = 0; i < adjusted.size(); ++i)
                     out[p.positions[i] / cells.columns][p.positions[i] % cells.columns] = adjusted[i];
                 return out;
             })},
};

}  // namespace
}  // namespace quadrat::addin
