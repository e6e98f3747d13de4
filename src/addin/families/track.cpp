// TRACK.*: change over time.
#include "addin/families/common.hpp"
#include "core/trend.hpp"

namespace quadrat::addin {
namespace {

const Declare track{
    // `times` is read with its date formatting (Range::dates): dates give a slope per year. `seasons`
    // is optional, so an `any` (most series have none).
    Function{"TRACK.TREND", "trackTrend",
             "Tests a monotonic trend over time (Mann–Kendall, or seasonal Kendall with seasons) with the Sen slope.",
             {data("values", "Readings in time order or not: numbers, or <0.5 for a reading below a detection limit."),
              dated(data("times", "Sampling time of each row: dates (slope per year) or numbers (slope per unit).")),
              optional(labels("seasons", "Optional season of each row (month, quarter, spring): pairs compared within a season.")),
              output(trend_outputs(), "p", "What the cell shows; estimate: Sen slope in the readings' units"),
              level(),
              keyword("unit", trend_units(), "auto", "Slope per year (dates), day or unit of times; auto by the times' format")},
             test([](const Request& r) {
                 static const Range none = Range::omitted_argument();
                 return track_trend(r.range("values"), r.range("times"), r.given("seasons") ? r.range("seasons") : none,
                                    parse_trend_unit(r.keyword("unit")), r.level());
             })},
};

}  // namespace
}  // namespace quadrat::addin
