// The glue of FIT.LINEAR, FIT.POINTS, CHECK.REGRESSION and RELATE.CORRELATION through the fence, as a
// cell sees it: sizes, header rows, missing cells, refusals as text. These are the catalogue's
// layout rules (FUNCTIONS.md), not numbers, except where a reference is named.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>

#include <nlohmann/json.hpp>

#include "addin/registry.hpp"
#include "reference.hpp"
#include "cell_calls.hpp"
#include "sheet_cells.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

using nlohmann::json;

const json& reference() { return reference_file("linear.json"); }

Range block(const std::vector<std::vector<Cell>>& rows) {
    Range r;
    r.rows = rows.size();
    r.columns = rows.front().size();
    for (const auto& row : rows) r.cells.insert(r.cells.end(), row.begin(), row.end());
    r.is_reference = true;
    r.first_row = 0;
    r.first_column = 1;
    return r;
}


// The stream set as a sheet: a header row, the 40 reaches, and two rows inserted after reach 5
// with a missing cell (an `n/a` flow and an empty canopy) that must be dropped and left blank.
struct StreamSheet {
    Range y, xs;
    std::vector<std::size_t> data_rows;  // sheet row of each reach
};
StreamSheet stream_sheet() {
    const json& set = reference()["stream"];
    std::vector<std::vector<Cell>> y = {{txt("density")}}, xs = {{txt("flow"), txt("canopy")}};
    StreamSheet s;
    for (std::size_t i = 0; i < set["y"].size(); ++i) {
        if (i == 5) {
            y.push_back({num(99)});
            xs.push_back({txt("n/a"), num(50)});
            y.push_back({num(98)});
            xs.push_back({num(0.5), Cell{}});
        }
        s.data_rows.push_back(y.size());
        y.push_back({num(set["y"][i])});
        xs.push_back({num(set["xs"][0][i]), num(set["xs"][1][i])});
    }
    s.y = block(y);
    s.xs = block(xs);
    return s;
}

TEST(FitLinearGlue, CoefficientTableWithHeaderNamesAndDroppedRows) {
    const StreamSheet s = stream_sheet();
    const Table t = call("fitLinear", {s.y, s.xs});
    ASSERT_EQ(t.size(), 4u);
    ASSERT_EQ(t[0].size(), 8u);
    EXPECT_EQ(std::get<std::string>(t[2][0]), "flow");
    EXPECT_EQ(std::get<std::string>(t[3][0]), "canopy");
    // statsmodels OLS(method='qr') on the 40 complete rows (generate_linear.py): the two rows with a
    // missing cell are dropped, 1e-10 relative.
    const double slope = reference()["stream"]["reference"]["estimate"][1];
    EXPECT_NEAR(std::get<double>(t[2][1]), slope, 1e-10 * std::fabs(slope));
    const Table model = call("fitLinear", {s.y, s.xs, keyword("model")});
    EXPECT_EQ(std::get<std::string>(model[1][0]), "model");
    EXPECT_EQ(std::get<double>(model[11][1]), 40.0);  // n
    EXPECT_EQ(std::get<double>(model[12][1]), 2.0);   // n dropped
    const Table slope_refused = call("fitLinear", {s.y, s.xs, keyword("slope")});
    ASSERT_EQ(slope_refused.size(), 1u);
    EXPECT_NE(std::get<std::string>(slope_refused[0][0]).find("coefficients"), std::string::npos);
}

TEST(FitLinearGlue, NoHeaderNamesPredictorsXOneXTwo) {
    const Range y = Range::column({1, 2, 4, 3, 5, 7, 6});
    const Range xs = block({{num(1), num(2)}, {num(2), num(1)}, {num(3), num(5)}, {num(4), num(3)},
                            {num(5), num(4)}, {num(6), num(7)}, {num(7), num(5)}});
    const Table t = call("fitLinear", {y, xs});
    EXPECT_EQ(std::get<std::string>(t[2][0]), "x1");
    EXPECT_EQ(std::get<std::string>(t[3][0]), "x2");
    const Table unknown = call("fitLinear", {y, xs, keyword("slopes")});
    EXPECT_NE(std::get<std::string>(unknown[0][0]).find("coefficients, model"), std::string::npos);
}

TEST(FitPointsGlue, RowsAlignWithTheSheet) {
    const StreamSheet s = stream_sheet();
    const json& ref = reference()["stream"]["reference"];
    // Default: six columns; the header row replaces the input's header: same size as the input.
    const Table all = call("fitPoints", {s.y, s.xs});
    ASSERT_EQ(all.size(), s.y.rows);
    ASSERT_EQ(all[0].size(), 6u);
    // FUNCTIONS.md, FIT.POINTS: the header words.
    const std::vector<std::string> header = {"fitted value",         "residual", "standardized residual",
                                             "studentized residual", "leverage", "Cook's distance"};
    for (std::size_t c = 0; c < header.size(); ++c) EXPECT_EQ(std::get<std::string>(all[0][c]), header[c]);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(all[6][0]));  // the dropped rows stay blank
    EXPECT_TRUE(std::holds_alternative<std::monostate>(all[7][3]));
    for (std::size_t i = 0; i < s.data_rows.size(); ++i) {
        // statsmodels OLSInfluence (generate_linear.py), 1e-9 relative.
        const double cook = ref["cook"][i];
        EXPECT_NEAR(std::get<double>(all[s.data_rows[i]][5]), cook, 1e-9 * cook);
    }
    // One column: exactly the input's rows, the header row blank.
    const Table leverage = call("fitPoints", {s.y, s.xs, keyword("Leverage")});
    ASSERT_EQ(leverage.size(), s.y.rows);
    ASSERT_EQ(leverage[0].size(), 1u);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(leverage[0][0]));
    const double h0 = ref["leverage"][0];
    EXPECT_NEAR(std::get<double>(leverage[s.data_rows[0]][0]), h0, 1e-10 * h0);

    // Without a header row the default sits on top: one row more than the input.
    const Range y = Range::column({1, 2, 4, 3, 5, 7});
    const Range x = Range::column({1, 2, 3, 4, 5, 6});
    const Table top = call("fitPoints", {y, x});
    EXPECT_EQ(top.size(), 7u);
    EXPECT_EQ(std::get<std::string>(top[0][1]), "residual");
    EXPECT_EQ(call("fitPoints", {y, x, keyword("fitted")}).size(), 6u);
}

TEST(CheckRegressionGlue, DefaultIsTheTableAndRefusalsAreText) {
    const StreamSheet s = stream_sheet();
    const Table t = call("checkRegression", {s.y, s.xs});
    ASSERT_EQ(t.size(), 8u);
    ASSERT_EQ(t[0].size(), 5u);
    EXPECT_EQ(std::get<std::string>(t[0][4]), "verdict");
    // Without order the independence row has no verdict and its single value asks for the order
    // (FUNCTIONS.md, CHECK.REGRESSION); Durbin–Watson in sampling order is checked in diagnostics_test.cpp.
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[3][4]));
    EXPECT_NE(std::get<std::string>(call("checkRegression", {s.y, s.xs, keyword("independence")})[0][0]).find("sampling order"),
              std::string::npos);
    // A constant predictor: one text cell naming it.
    const Table refused = call("checkRegression", {Range::column({1, 2, 3, 4}), Range::column({5, 5, 5, 5})});
    ASSERT_EQ(refused.size(), 1u);
    EXPECT_NE(std::get<std::string>(refused[0][0]).find("x1 is constant"), std::string::npos);
}

TEST(RelateCorrelationGlue, DefaultIsPearsonP) {
    const json& set = reference()["cores"];
    Range x = Range::column(set["x"].get<std::vector<double>>());
    Range y = Range::column(set["y"].get<std::vector<double>>());
    // scipy.stats.pearsonr (generate_linear.py), 1e-9 relative.
    const double p = set["reference"]["pearson"]["p"];
    EXPECT_NEAR(std::get<double>(call("relateCorrelation", {x, y})[0][0]), p, 1e-9 * p);
    // scipy.stats.kendalltau(method='exact').
    const double tau = set["reference"]["kendall"]["tau"];
    EXPECT_NEAR(std::get<double>(call("relateCorrelation", {x, y, keyword("kendall"), keyword("estimate")})[0][0]), tau,
                1e-12 * std::fabs(tau));
    const Table report = call("relateCorrelation", {x, y, keyword("spearman"), keyword("report")});
    EXPECT_NE(std::get<std::string>(report[0][0]).find("n = 20"), std::string::npos);
    const Table bad = call("relateCorrelation", {x, y, keyword("tau")});
    EXPECT_NE(std::get<std::string>(bad[0][0]).find("pearson, spearman, kendall"), std::string::npos);
}

}  // namespace
}  // namespace quadrat
