// RELATE.*: tests of a relationship.
#include "addin/families/common.hpp"
#include "core/correlation.hpp"

namespace quadrat::addin {
namespace {

const Declare relate{
    Function{"RELATE.CORRELATION", "relateCorrelation",
             "Correlation between two columns paired by row; estimate gives the coefficient (−1 to 1).",
             {data("x", "First variable (numbers)."), data("y", "Second variable (numbers), same rows."),
              keyword("method", correlation_methods(), "pearson", "Coefficient"), test_output(correlation_outputs())},
             test([](const Request& r) { return relate_correlation(r.range("x"), r.range("y"), r.keyword("method")); })},
};

}  // namespace
}  // namespace quadrat::addin
