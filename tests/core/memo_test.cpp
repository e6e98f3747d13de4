// The result cache: same data and options → one computation; any change → a new one.
// Behaviour checks, no numbers from a source.
#include <gtest/gtest.h>

#include "addin/memo.hpp"
#include "addin/registry.hpp"
#include "core/refusal.hpp"

namespace quadrat::addin {
namespace {

TestResult counted(int& calls) {
    ++calls;
    TestResult r;
    r.test = "counting test";
    r.add("p", 0.5);
    return r;
}

// The result of `compute` through the cache, keyed on every argument but the output (position 2).
template <class Compute>
auto remembered(std::string_view kind, const Arguments& a, std::size_t output_position, Compute compute) {
    std::vector<std::size_t> keyed;
    for (std::size_t i = 0; i < a.size(); ++i)
        if (i != output_position) keyed.push_back(i);
    using Result = std::invoke_result_t<Compute&>;
    return std::static_pointer_cast<const Result>(
        remembered_result(kind, a, keyed, [&]() -> std::shared_ptr<const void> { return std::make_shared<const Result>(compute()); }));
}

Arguments arguments_with_output(const char* output) {
    return {Range::column({1, 2, 3}), Range::text_column({"a", "a", "b"}), Range::scalar(Cell::make_text(output))};
}

TEST(ResultCache, DifferentOutputsOfTheSameTestComputeOnce) {
    forget_all();
    int calls = 0;
    remembered("f", arguments_with_output("p"), 2, [&] { return counted(calls); });
    remembered("f", arguments_with_output("statistic"), 2, [&] { return counted(calls); });
    EXPECT_EQ(calls, 1);
    EXPECT_EQ(remembered_hits(), 1u);
}

TEST(ResultCache, AChangedCellOrFunctionRecomputes) {
    forget_all();
    int calls = 0;
    Arguments a = arguments_with_output("p");
    remembered("f", a, 2, [&] { return counted(calls); });
    a.change(0).cells[1].number = 2.0000000000000004;  // the next double: still a different cell
    remembered("f", a, 2, [&] { return counted(calls); });
    remembered("g", a, 2, [&] { return counted(calls); });
    EXPECT_EQ(calls, 3);
}

TEST(ResultCache, IsBoundedAndKeepsTheMostRecent) {
    forget_all();
    int calls = 0;
    // memo.cpp's capacity: 256 results.
    for (int i = 0; i < 300; ++i) {
        Arguments a = {Range::column({static_cast<double>(i)})};
        remembered("f", a, 9, [&] { return counted(calls); });
    }
    EXPECT_EQ(calls, 300);
    remembered("f", {Range::column({299.0})}, 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 300);  // the most recent is kept
    remembered("f", {Range::column({0.0})}, 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 301);  // the oldest was evicted
}

// Big results are bounded by the cells behind them (memo.cpp: 8 million): two results over
// 3 million cells each are kept, a third evicts the oldest.
TEST(ResultCache, IsBoundedByTheCellsBehindItsResults) {
    forget_all();
    int calls = 0;
    auto big = [](double first) {
        std::vector<double> xs(3'000'000, 1.0);
        xs[0] = first;
        Range r = Range::column(xs);
        r.content_id = static_cast<std::uint64_t>(first) + 1;  // shared: the key names the id
        return Arguments{r};
    };
    for (double first : {1.0, 2.0, 3.0}) remembered("f", big(first), 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 3);
    remembered("f", big(3.0), 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 3);
    remembered("f", big(1.0), 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 4);
}

// A shared range is keyed by its content id: the same id is the same data, another id recomputes.
TEST(ResultCache, ASharedRangeIsKeyedByItsId) {
    forget_all();
    int calls = 0;
    Range r = Range::column({1, 2, 3});
    r.content_id = 7;
    remembered("f", {r}, 9, [&] { return counted(calls); });
    remembered("f", {r}, 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 1);
    r.content_id = 8;
    remembered("f", {r}, 9, [&] { return counted(calls); });
    EXPECT_EQ(calls, 2);
}

TEST(ResultCache, ARefusalIsNotKept) {
    forget_all();
    int calls = 0;
    const Arguments a = arguments_with_output("p");
    auto refuse = [&]() -> TestResult {
        ++calls;
        throw Refusal("no");
    };
    EXPECT_THROW(remembered("f", a, 2, refuse), Refusal);
    EXPECT_THROW(remembered("f", a, 2, refuse), Refusal);
    EXPECT_EQ(calls, 2);
}

// A result of another type, keyed on chosen positions only: the fourth argument does not matter.
TEST(ResultCache, KeysOnTheChosenPositions) {
    forget_all();
    int calls = 0;
    auto count = [&]() -> std::shared_ptr<const void> { return std::make_shared<const int>(++calls); };
    Arguments a = arguments_with_output("p");
    EXPECT_EQ(*std::static_pointer_cast<const int>(remembered_result("k", a, {0, 1}, count)), 1);
    a.set(2, Range::scalar(Cell::make_text("table")));
    EXPECT_EQ(*std::static_pointer_cast<const int>(remembered_result("k", a, {0, 1}, count)), 1);
    a.change(1).cells[2].text = "c";
    EXPECT_EQ(*std::static_pointer_cast<const int>(remembered_result("k", a, {0, 1}, count)), 2);
}

Table call(const char* method, const Arguments& a) { return call_fenced(*find_function(method), a); }

// FIT.LINEAR's coefficients and model, CHECK.REGRESSION and FIT.POINTS over the same y and xs: one
// fit, through the registry's generic path.
TEST(ResultCache, OneRegressionServesItsNeighbours) {
    forget_all();
    const Range y = Range::column({2.1, 3.9, 6.2, 7.8, 10.1, 12.2}), x = Range::column({1, 2, 3, 4, 5, 6});
    const Range blank = Range::omitted_argument();
    call("fitLinear", {y, x, Range::scalar(Cell::make_text("coefficients")), blank});
    call("fitLinear", {y, x, Range::scalar(Cell::make_text("model")), blank});
    call("checkRegression", {y, x, blank, blank});
    call("fitPoints", {y, x, blank});
    EXPECT_EQ(remembered_hits(), 3u);
}

// Neighbouring cells asking other outputs of one test share one computation; another option or a
// changed cell computes again.
TEST(ResultCache, OutputsOfOneTestShareOneComputation) {
    forget_all();
    const Range values = Range::column({5.1, 4.8, 5.6, 6.2, 6.8, 7.1}), groups = Range::text_column({"a", "a", "a", "b", "b", "b"});
    const Range blank = Range::omitted_argument();
    call("compareGroups", {values, groups, blank, Range::scalar(Cell::make_text("p")), blank});
    call("compareGroups", {values, groups, blank, Range::scalar(Cell::make_text("statistic")), blank});
    call("compareGroups", {values, groups, blank, Range::scalar(Cell::make_text("report")), blank});
    EXPECT_EQ(remembered_hits(), 2u);
    call("compareGroups", {values, groups, Range::scalar(Cell::make_text("ranks")), blank, blank});
    EXPECT_EQ(remembered_hits(), 2u);
}

}  // namespace
}  // namespace quadrat::addin
