// LIMIT.* (the limits a compliance report asks for) and PLAN.* (planning the next season). Their
// numbers (fraction, standard, proportion, readings; difference, sd, n, power, count) are plain
// numbers or cells (FUNCTIONS.md revision 2): a required one is a `cells` argument, an optional one
// a `number`. PLAN.* return one plain number per cell (no output argument).
#include <algorithm>
#include <limits>

#include "addin/families/common.hpp"
#include "core/data.hpp"
#include "core/limits.hpp"
#include "core/plan.hpp"
#include "core/refusal.hpp"

namespace quadrat::addin {
namespace {

// A number the function cannot do without: blank is a refusal saying what to type.
double required(const Request& r, std::string_view name, const std::string& example) {
    if (!r.given(name)) throw Refusal(std::string(name) + " is needed: " + example);
    return r.number(name, std::numeric_limits<double>::quiet_NaN());
}

// The `values` column read by the data layer (header, missing cells, censored cells refused), the
// core's limit, and `n dropped` under `n` as in every label/value table. The output is picked from
// the result, so neighbouring cells asking other outputs share one computation.
template <class Compute>
Entry limit_entry(const KeywordTable& outputs, Compute compute) {
    Entry e;
    e.compute = [compute](const Request& r) -> std::shared_ptr<const void> {
        const Column column = read_column(r.range("values"));
        LimitResult limit = compute(std::span<const double>(column.values), r);
        auto& q = limit.result.quantities;
        const auto n = std::find_if(q.begin(), q.end(), [](const Quantity& x) { return x.label == "n"; });
        q.insert(n == q.end() ? q.end() : n + 1, Quantity{"n dropped", static_cast<double>(column.n_dropped)});
        return std::make_shared<const LimitResult>(std::move(limit));
    };
    e.show = [&outputs](const void* result, const Request& r) {
        return select_limit_output(*static_cast<const LimitResult*>(result), r.keyword("output"), outputs);
    };
    return e;
}

Argument limit_values() { return data("values", "Readings (numbers), one column; a text first row is a header."); }
Argument limit_output(const KeywordTable& outputs) {
    return output(outputs, "limit", "What the cell shows; limit, estimate and k-factor in the readings' units");
}
Argument side_argument() { return keyword("side", limit_sides(), "upper", "Which limit"); }
Argument limit_method() { return keyword("method", limit_methods(), "normal", "How the limit is found"); }

const Declare limits{
    Function{"LIMIT.MEAN", "limitMean",
             "One-sided upper confidence limit of the mean: the figure a site is judged by against a standard.",
             {limit_values(), keyword("method", mean_limit_methods(), "t", "How the limit is found"),
              limit_output(limit_outputs()), level()},
             limit_entry(limit_outputs(), [](std::span<const double> x, const Request& r) {
                 return limit_mean(x, r.keyword("method"), r.level());
             })},

    Function{"LIMIT.PERCENTILE", "limitPercentile",
             "A percentile as PERCENTILE.INC computes it, with its distribution-free upper confidence limit.",
             {limit_values(), cells("fraction", "Required: 0 to 1, as PERCENTILE.INC takes it (0.9 for the 90th percentile)."),
              limit_output(percentile_limit_outputs()), level()},
             limit_entry(percentile_limit_outputs(), [](std::span<const double> x, const Request& r) {
                 return limit_percentile(x, required(r, "fraction", "0.9 for the 90th percentile"), r.level());
             })},

    Function{"LIMIT.EXCEEDANCE", "limitExceedance",
             "Share of readings above a standard, with its exact (Clopper–Pearson) upper confidence limit.",
             {limit_values(), cells("standard", "Required: the standard, in the readings' units."),
              output(exceedance_outputs(), "limit", "What the cell shows; limit and estimate as fractions from 0 to 1"),
              level()},
             limit_entry(exceedance_outputs(), [](std::span<const double> x, const Request& r) {
                 return limit_exceedance(x, required(r, "standard", "the standard, in the readings' units"), r.level());
             })},

    Function{"LIMIT.TOLERANCE", "limitTolerance",
             "The limit a proportion of the population stays below (or above, or within), with confidence level.",
             {limit_values(), cells("proportion", "Required: share of the population covered, 0 to 1 (such as 0.95)."),
              limit_output(sided_limit_outputs()), level(), side_argument(), limit_method()},
             limit_entry(sided_limit_outputs(), [](std::span<const double> x, const Request& r) {
                 return limit_tolerance(x, required(r, "proportion", "the share of the population covered, such as 0.95"),
                                        r.level(), r.keyword("side"), r.keyword("method"));
             })},

    Function{"LIMIT.PREDICTION", "limitPrediction",
             "The limit the next new readings all stay within (below, above or between), with confidence level.",
             {limit_values(), number("readings", "How many new readings the limit covers: 1 (default) or more."),
              limit_output(sided_limit_outputs()), level(), side_argument(), limit_method()},
             limit_entry(sided_limit_outputs(), [](std::span<const double> x, const Request& r) {
                 return limit_prediction(x, r.number("readings", 1), r.level(), r.keyword("side"), r.keyword("method"));
             })},
};

// ---- PLAN.* ----------------------------------------------------------------------------------

Argument difference_argument() { return cells("difference", "Required: the difference to detect, in the readings' units."); }
Argument sd_argument() { return cells("sd", "Required: SD of single readings, in their units (paired: SD of the differences)."); }
Argument n_argument() { return cells("n", "Required: readings per group (pairs for paired)."); }
Argument design_argument() { return keyword("design", plan_designs(), "two-groups", "The planned comparison"); }
Argument power_argument() { return number("power", "Power wanted, a fraction from 0 to 1 (0.8 default)."); }
Argument count_argument() { return number("count", "Number of groups, for design several-groups only."); }
Design design_of(const Request& r) { return plan_design(r.keyword("design"), r.number("count", 0), r.given("count")); }

const char* const difference_example = "the difference to detect, in the readings' units";
const char* const sd_example = "the SD of single readings, in their units";

const Declare plan{
    Function{"PLAN.SAMPLES", "planSamples",
             "Readings per group needed to detect a difference with the power asked (a whole number, rounded up).",
             {difference_argument(), sd_argument(), design_argument(), power_argument(), level(), count_argument()},
             table([](const Request& r) {
                 return single(plan_samples(required(r, "difference", difference_example), required(r, "sd", sd_example),
                                            design_of(r), r.number("power", 0.8), r.level()));
             })},

    Function{"PLAN.POWER", "planPower",
             "The power (0 to 1) of the planned test with n readings per group to detect a difference.",
             {n_argument(), difference_argument(), sd_argument(), design_argument(), level(), count_argument()},
             table([](const Request& r) {
                 return single(plan_power(required(r, "n", "readings per group"), required(r, "difference", difference_example),
                                          required(r, "sd", sd_example), design_of(r), r.level()));
             })},

    Function{"PLAN.DETECTABLE", "planDetectable",
             "The smallest difference (readings' units) the design with n per group detects with the power asked.",
             {n_argument(), sd_argument(), design_argument(), power_argument(), level(), count_argument()},
             table([](const Request& r) {
                 return single(plan_detectable(required(r, "n", "readings per group"), required(r, "sd", sd_example),
                                               design_of(r), r.number("power", 0.8), r.level()));
             })},
};

}  // namespace
}  // namespace quadrat::addin
