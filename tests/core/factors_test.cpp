// Factors (label columns) among `xs`: FIT.LINEAR's joint F per factor (analysis of covariance),
// FIT.PREDICT at rows naming a level, FIT.COUNTS and FIT.LOGISTIC (with trials) with their
// likelihood-ratio χ² per factor, and the reading rules (which column is a factor, refusals).
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "cell_calls.hpp"
#include "core/predictors.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"
#include "sheet_cells.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("factors.json"); }

// Columns laid side by side from A1 (a header row first), as a person types them.
Range sheet(const std::vector<std::string>& headers, const std::vector<std::vector<Cell>>& columns) {
    const std::size_t rows = columns.front().size() + 1;
    std::vector<Cell> cells;
    for (std::size_t i = 0; i < rows; ++i)
        for (std::size_t j = 0; j < columns.size(); ++j) cells.push_back(i == 0 ? txt(headers[j]) : columns[j][i - 1]);
    return block(rows, columns.size(), std::move(cells));
}
std::vector<Cell> numbers(const nlohmann::json& xs) {
    std::vector<Cell> cells;
    for (double x : xs.get<std::vector<double>>()) cells.push_back(num(x));
    return cells;
}
std::vector<Cell> labels(const nlohmann::json& xs) {
    std::vector<Cell> cells;
    for (const auto& x : xs.get<std::vector<std::string>>()) cells.push_back(txt(x));
    return cells;
}
double at(const Table& t, std::size_t row, std::size_t column) {
    if (row >= t.size() || column >= t[row].size() || !std::holds_alternative<double>(t[row][column])) return std::nan("");
    return std::get<double>(t[row][column]);
}
std::string text_at(const Table& t, std::size_t row, std::size_t column) {
    if (row >= t.size() || column >= t[row].size() || !std::holds_alternative<std::string>(t[row][column])) return "";
    return std::get<std::string>(t[row][column]);
}
// The value of the label/value row `label`, NaN when absent or blank.
double row_value(const Table& t, const std::string& label) {
    for (const auto& row : t)
        if (row.size() == 2 && std::holds_alternative<std::string>(row[0]) && std::get<std::string>(row[0]) == label)
            return std::holds_alternative<double>(row[1]) ? std::get<double>(row[1]) : std::nan("");
    return std::nan("missing row");
}

struct Ancova {
    Range y, xs, at;
};
Ancova ancova() {
    const auto& c = reference()["linear"];
    Ancova a;
    a.y = sheet({"oxygen"}, {numbers(c["oxygen"])});
    a.xs = sheet({"zone", "temperature"}, {labels(c["zone"]), numbers(c["temperature"])});
    a.at = sheet({"zone", "temperature"}, {labels(c["at zone"]), numbers(c["at temperature"])});
    return a;
}

// statsmodels 0.13 OLS with C(zone, Treatment('upper')) + temperature via
// tests/reference/generate_factors.py: coefficients in the order intercept, zone: middle,
// zone: lower, temperature. Both are QR least squares in double precision on 24 rows with
// condition number below 10³: 1e-10 relative.
TEST(Factors, LinearCoefficientsMatchTreatmentCoding) {
    const auto& c = reference()["linear"];
    const Ancova a = ancova();
    const Table t = call("fitLinear", {a.y, a.xs, keyword("coefficients"), omitted});
    ASSERT_EQ(t.size(), 5u) << text_of(t);
    for (std::size_t j = 0; j < 4; ++j) {
        EXPECT_EQ(text_at(t, j + 1, 0), c["terms"][j].get<std::string>());
        expect_relative(at(t, j + 1, 1), c["coefficient"][j].get<double>(), 1e-10, "coefficient");
        expect_relative(at(t, j + 1, 2), c["SE"][j].get<double>(), 1e-10, "SE");
    }
}

// anova_lm(typ=2) in the same generator: the joint F of the zone factor adjusted for temperature
// (extra sum of squares), 2 and 20 df; 1e-9 relative (a difference of two residual sums of squares).
TEST(Factors, LinearModelTableHasJointTestPerFactor) {
    const auto& c = reference()["linear"];
    const Ancova a = ancova();
    const Table t = call("fitLinear", {a.y, a.xs, keyword("model"), omitted});
    expect_relative(row_value(t, "zone: F"), c["zone F"].get<double>(), 1e-9, "zone F");
    EXPECT_EQ(row_value(t, "zone: df"), c["zone df"].get<double>());
    expect_relative(row_value(t, "zone: p"), c["zone p"].get<double>(), 1e-8, "zone p");
    // A numeric column gets no joint-test rows: only factors do (FUNCTIONS.md, FIT.LINEAR).
    EXPECT_TRUE(std::isnan(row_value(t, "temperature: F")));
    // One predictor column that is a factor has no slope (FUNCTIONS.md: slope needs one predictor).
    const Range zone_only = sheet({"zone"}, {labels(c["zone"])});
    EXPECT_NE(text_of(call("fitLinear", {a.y, zone_only, keyword("slope"), omitted})).find("factor"), std::string::npos);
    // Nor does the report speak of a slope for a two-level factor alone (one indicator column).
    const Range two_zones = sheet({"zone"}, {{txt("a"), txt("b"), txt("a"), txt("b"), txt("a"), txt("b")}});
    const Range y6 = sheet({"y"}, {{num(1), num(2.5), num(1.5), num(3), num(1.2), num(2.9)}});
    const std::string report = text_of(call("fitLinear", {y6, two_zones, keyword("report"), omitted}));
    EXPECT_EQ(report.find("slope"), std::string::npos) << report;
    EXPECT_NE(report.find("R²"), std::string::npos) << report;
}

// The same generator's get_prediction(at).summary_frame(alpha=0.05): mean, its interval and the
// interval of one new reading at three rows naming a zone; 1e-9 relative.
TEST(Factors, PredictAtRowsNamingALevel) {
    const auto& c = reference()["linear"];
    const Ancova a = ancova();
    const Table t = call("fitPredict", {a.y, a.xs, a.at, omitted, omitted});
    ASSERT_EQ(t.size(), 4u) << text_of(t);  // at's header row becomes the result's header
    EXPECT_EQ(text_at(t, 0, 1), "mean ci-low");
    const char* const columns[] = {"predicted", "mean ci-low", "mean ci-high", "reading low", "reading high"};
    for (std::size_t i = 0; i < 3; ++i)
        for (std::size_t j = 0; j < 5; ++j) expect_relative(at(t, i + 1, j), c[columns[j]][i].get<double>(), 1e-9, columns[j]);
    // One column alone keeps exactly at's rows: blank in the header row.
    const Table high = call("fitPredict", {a.y, a.xs, a.at, keyword("reading-high"), omitted});
    ASSERT_EQ(high.size(), 4u);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(high[0][0]));
    expect_relative(at(high, 2, 0), c["reading high"][1].get<double>(), 1e-9, "reading high");
}

// A level the data never had cannot be predicted: refused by name and cell (FUNCTIONS.md).
TEST(Factors, PredictRefusesAnUnseenLevel) {
    const Ancova a = ancova();
    const Range at = sheet({"zone", "temperature"}, {{txt("estuary")}, {num(12)}});
    const std::string refusal = text_of(call("fitPredict", {a.y, a.xs, at, omitted, omitted}));
    EXPECT_NE(refusal.find("A2 holds zone 'estuary'"), std::string::npos) << refusal;
    EXPECT_NE(refusal.find("upper, middle, lower"), std::string::npos) << refusal;
}

// statsmodels GLM Poisson with offset log(length) via generate_factors.py; the site factor's
// likelihood-ratio χ² against the model without it; 1e-8 relative (two IRLS optima).
TEST(Factors, CountsWithSiteFactorAndEffort) {
    const auto& c = reference()["poisson"];
    const Range counts = sheet({"trout"}, {numbers(c["trout"])});
    const Range xs = sheet({"site"}, {labels(c["site"])});
    const Range effort = sheet({"pass length"}, {numbers(c["length"])});
    const Table coefficients = call("fitCounts", {counts, xs, effort, keyword("poisson"), omitted, omitted});
    ASSERT_EQ(coefficients.size(), 4u) << text_of(coefficients);
    for (std::size_t j = 0; j < 3; ++j) {
        EXPECT_EQ(text_at(coefficients, j + 1, 0), c["terms"][j].get<std::string>());
        expect_relative(at(coefficients, j + 1, 1), c["coefficient"][j].get<double>(), 1e-8, "coefficient");
        expect_relative(at(coefficients, j + 1, 2), c["SE"][j].get<double>(), 1e-8, "SE");
    }
    const Table model = call("fitCounts", {counts, xs, effort, keyword("poisson"), keyword("model"), omitted});
    expect_relative(row_value(model, "site: χ²"), c["site chi2"].get<double>(), 1e-8, "site χ²");
    EXPECT_EQ(row_value(model, "site: df"), 2.0);
    expect_relative(row_value(model, "site: p"), c["site p"].get<double>(), 1e-7, "site p");
    // The site factor is the only predictor: its test is the model's own likelihood-ratio test.
    expect_relative(row_value(model, "site: χ²"), row_value(model, "statistic"), 1e-12, "same test");
}

// Hand-worked (closed form, no source needed beyond the likelihood equations): a Poisson model
// with one two-level factor and effort fits each level's rate exactly, so the rate ratio is
// (Σ counts / Σ effort at level B) / (the same at level A).
TEST(Factors, PoissonRateRatioOfATwoLevelFactorIsTheRatioOfRates) {
    const Range counts = sheet({"birds"}, {{num(1), num(3), num(0), num(2), num(4), num(5)}});
    const Range xs = sheet({"habitat"}, {{txt("open"), txt("open"), txt("open"), txt("hedge"), txt("hedge"), txt("hedge")}});
    const Range effort = sheet({"minutes"}, {{num(10), num(20), num(10), num(10), num(10), num(10)}});
    // open: 4 birds in 40 minutes; hedge: 11 in 30. Rate ratio (11/30)/(4/40) = 11/3.
    const Table t = call("fitCounts", {counts, xs, effort, keyword("poisson"), omitted, omitted});
    EXPECT_EQ(text_at(t, 2, 0), "habitat: hedge");
    EXPECT_NEAR(at(t, 2, 5), 11.0 / 3.0, 1e-10);
}

// statsmodels GLM Binomial on (germinated, sown − germinated) via generate_factors.py: the
// treatment factor's likelihood-ratio χ² (deviance difference); 1e-8 relative.
TEST(Factors, LogisticWithTrialsAndAFactor) {
    const auto& c = reference()["binomial"];
    const Range y = sheet({"germinated"}, {numbers(c["germinated"])});
    const Range xs = sheet({"treatment", "moisture"}, {labels(c["treatment"]), numbers(c["moisture"])});
    const Range trials = sheet({"sown"}, {numbers(c["sown"])});
    const Table t = call("fitLogistic", {y, xs, omitted, omitted, trials});
    ASSERT_EQ(t.size(), 4u) << text_of(t);
    for (std::size_t j = 0; j < 3; ++j) {
        EXPECT_EQ(text_at(t, j + 1, 0), c["terms"][j].get<std::string>());
        expect_relative(at(t, j + 1, 1), c["coefficient"][j].get<double>(), 1e-8, "coefficient");
        expect_relative(at(t, j + 1, 2), c["SE"][j].get<double>(), 1e-8, "SE");
    }
    const Table model = call("fitLogistic", {y, xs, keyword("model"), omitted, trials});
    expect_relative(row_value(model, "treatment: χ²"), c["treatment chi2"].get<double>(), 1e-8, "treatment χ²");
    expect_relative(row_value(model, "treatment: p"), c["treatment p"].get<double>(), 1e-7, "treatment p");
}

// Published: Bliss (1935) beetles killed by carbon disulphide, as Dobson & Barnett (2008), An
// Introduction to Generalized Linear Models, 3rd ed., §7.3.1, fit them (printed values from
// memory): intercept −60.72 (SE 5.18), dose 34.27 (SE 2.91), deviance 11.23 on 6 df. Held to half a
// unit of the printed digit; statsmodels GLM Binomial via generate_factors.py to 1e-8 relative.
TEST(Factors, BlissBeetlesWithTrialsMatchThePrintedFit) {
    const auto& c = reference()["bliss"];
    const Range y = sheet({"killed"}, {numbers(c["killed"])});
    const Range xs = sheet({"dose"}, {numbers(c["dose"])});
    const Range trials = sheet({"beetles"}, {numbers(c["beetles"])});
    const Table t = call("fitLogistic", {y, xs, omitted, omitted, trials});
    ASSERT_EQ(t.size(), 3u) << text_of(t);
    EXPECT_NEAR(at(t, 1, 1), -60.72, 0.005);
    EXPECT_NEAR(at(t, 1, 2), 5.18, 0.005);
    EXPECT_NEAR(at(t, 2, 1), 34.27, 0.005);
    EXPECT_NEAR(at(t, 2, 2), 2.91, 0.005);
    for (std::size_t j = 0; j < 2; ++j) {
        expect_relative(at(t, j + 1, 1), c["coefficient"][j].get<double>(), 1e-8, "coefficient");
        expect_relative(at(t, j + 1, 2), c["SE"][j].get<double>(), 1e-8, "SE");
    }
    const Table model = call("fitLogistic", {y, xs, keyword("model"), omitted, trials});
    EXPECT_NEAR(row_value(model, "deviance"), 11.23, 0.005);
    expect_relative(row_value(model, "deviance"), c["deviance"].get<double>(), 1e-9, "deviance");
}

// Published: Anscombe (1973), Am. Statist. 27, 17–21, set I: fitted line 3.00 + 0.500x, residual
// SD 1.237 (printed figures from memory). Hand-worked from them at x = 9, the mean of x, where
// h = 1/n: ŷ = 7.50, the mean's interval 7.50 ± t(0.975; 9)·1.237/√11 = 7.50 ± 0.844, one reading's
// 7.50 ± t·1.237·√(1 + 1/11) = 7.50 ± 2.922 (t = 2.262). Held to 0.005 (the printed digits);
// statsmodels get_prediction (generate_factors.py) to 1e-10 relative.
TEST(Factors, PredictionAtTheMeanOfAnscombesSetI) {
    const auto& c = reference()["anscombe_prediction"];
    const Range y = sheet({"y"}, {numbers(c["y"])});
    const Range xs = sheet({"x"}, {numbers(c["x"])});
    const Range at_rows = block(1, 1, {num(9)});
    const Table t = call("fitPredict", {y, xs, at_rows, omitted, omitted});
    ASSERT_EQ(t.size(), 2u) << text_of(t);  // no header row in at: the result's header on top
    EXPECT_NEAR(at(t, 1, 0), 7.50, 0.005);
    EXPECT_NEAR(at(t, 1, 1), 7.50 - 0.844, 0.005);
    EXPECT_NEAR(at(t, 1, 4), 7.50 + 2.922, 0.005);
    const char* const columns[] = {"predicted", "mean ci-low", "mean ci-high", "reading low", "reading high"};
    for (std::size_t j = 0; j < 5; ++j) expect_relative(at(t, 1, j), c[columns[j]].get<double>(), 1e-10, columns[j]);
}

// Cross-check between functions (no source needed): a factor alone in FIT.LINEAR is a one-way
// analysis of variance, so its joint F equals COMPARE.GROUPS' pooled F on the same rows.
TEST(Factors, AFactorAloneIsTheOneWayAnova) {
    const auto& c = reference()["linear"];
    const Range y = sheet({"oxygen"}, {numbers(c["oxygen"])});
    const Range zone = sheet({"zone"}, {labels(c["zone"])});
    const Table model = call("fitLinear", {y, zone, keyword("model"), omitted});
    const double anova_f = number_of(call("compareGroups", {y, zone, keyword("pooled"), keyword("statistic"), omitted}));
    expect_relative(row_value(model, "zone: F"), anova_f, 1e-10, "zone F");
    expect_relative(row_value(model, "zone: F"), row_value(model, "statistic"), 1e-12, "the model's own F");
}

// The reading rules of predictors.hpp (common practice, no source: what a person reading the
// column would call it).
TEST(Factors, WhichColumnIsAFactor) {
    // Labels with a number among them (zone 2): a factor, the number a label.
    EXPECT_TRUE(is_factor_column(sheet({"zone"}, {{txt("a"), num(2), txt("b"), txt("a")}}), 0));
    // Numbers with one stray note: numeric, the note read as missing.
    EXPECT_FALSE(is_factor_column(sheet({"depth"}, {{num(1), num(2), txt("broken probe"), num(4)}}), 0));
    // Readings below a detection limit keep a column numeric, so that it is refused as such.
    EXPECT_FALSE(is_factor_column(sheet({"zinc"}, {{txt("<0.5"), txt("ND"), num(2)}}), 0));
    // Missing markers are not labels.
    EXPECT_FALSE(is_factor_column(sheet({"depth"}, {{num(1), txt("n/a"), num(2)}}), 0));
}

TEST(Factors, RefusesAFactorWithOneLevel) {
    const Range y = sheet({"y"}, {{num(1), num(2), num(3), num(5)}});
    const Range xs = sheet({"zone", "t"}, {{txt("high"), txt("high"), txt("high"), txt("high")}, {num(1), num(2), num(4), num(3)}});
    EXPECT_EQ(text_of(call("fitLinear", {y, xs, omitted, omitted})),
              "zone holds one level (high) in the rows used; a factor needs two or more levels");
}

// Rows with a missing label are dropped like any missing predictor (FUNCTIONS.md, Missing data).
TEST(Factors, MissingLabelDropsTheRow) {
    const Range y = sheet({"y"}, {{num(1), num(2), num(3), num(5), num(4), num(6), num(2)}});
    const Range xs = sheet({"zone"}, {{txt("a"), txt("b"), txt("a"), txt("b"), txt("n/a"), txt("b"), txt("a")}});
    const Table model = call("fitLinear", {y, xs, keyword("model"), omitted});
    EXPECT_EQ(row_value(model, "n"), 6.0);
    EXPECT_EQ(row_value(model, "n dropped"), 1.0);
}

}  // namespace
}  // namespace quadrat
