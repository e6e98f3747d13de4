// FIT.FACTORIAL in the core: Type II and Type III two-way ANOVA on unbalanced designs.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "core/factorial.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("categorical.json"); }


// Columns with a header row, as they stand on a sheet.
struct Sheet {
    Range values, factor1, factor2;
};

Sheet sheet_of(const nlohmann::json& c, const std::string& first = "fertiliser", const std::string& second = "watering") {
    std::vector<std::string> a{first}, b{second};
    std::vector<Cell> y{Cell::make_text("response")};
    for (std::size_t i = 0; i < c["y"].size(); ++i) {
        y.push_back(Cell::make_number(c["y"][i].get<double>()));
        a.push_back(c["a"][i].get<std::string>());
        b.push_back(c["b"][i].get<std::string>());
    }
    Sheet s{Range::column({}), Range::text_column(a), Range::text_column(b)};
    s.values.rows = y.size();
    s.values.cells = y;
    return s;
}

void expect_rows(const FactorialAnova& got, const nlohmann::json& want, double tolerance) {
    const AnovaRow* rows[] = {&got.first, &got.second, &got.interaction};
    for (std::size_t k = 0; k < 3; ++k) {
        SCOPED_TRACE(rows[k]->source);
        EXPECT_LT(relative_error(rows[k]->ss, want[k]["ss"].get<double>()), tolerance);
        EXPECT_EQ(rows[k]->df, want[k]["df"].get<double>());
        EXPECT_LT(relative_error(rows[k]->f, want[k]["f"].get<double>()), tolerance);
        EXPECT_LT(relative_error(rows[k]->p, want[k]["p"].get<double>()), tolerance);
        EXPECT_LT(relative_error(rows[k]->partial_eta_squared, want[k]["partial_eta_squared"].get<double>()), tolerance);
    }
    EXPECT_LT(relative_error(got.residual.ss, want[3]["ss"].get<double>()), tolerance);
    EXPECT_EQ(got.residual.df, want[3]["df"].get<double>());
}

// statsmodels 0.13 ols("y ~ C(a) * C(b)") + anova_lm(typ=2), and ols("y ~ C(a, Sum) * C(b, Sum)")
// + anova_lm(typ=3), via tests/reference/generate_categorical.py, on two invented unbalanced
// designs (3×2 biomass, 2×4 snail density). Both solve the same least-squares problems by
// different factorisations (measured: 2e-14 relative at worst): tolerance 1e-12 relative (sums of
// squares, F, p, partial η²).
TEST(FitFactorial, AgreesWithStatsmodelsTypeIIAndIII) {
    for (const char* name : {"biomass", "snails"}) {
        SCOPED_TRACE(name);
        const auto& c = reference()["factorial"][name];
        const Sheet s = sheet_of(c);
        const FactorialData d = read_factorial_data(s.values, s.factor1, s.factor2);
        EXPECT_EQ(d.first_name, "fertiliser");
        expect_rows(fit_factorial(d, 2), c["type2"], 1e-12);
        expect_rows(fit_factorial(d, 3), c["type3"], 1e-12);
    }
}

// An empty combination: Type II from nested least-squares fits (numpy lstsq in the generator,
// the published definition, since anova_lm's dummy design is singular there); measured 5e-14,
// tolerance 1e-12.
// Type III is refused and says why.
TEST(FitFactorial, EmptyCellTypeIIWorksTypeIIIRefuses) {
    const auto& c = reference()["factorial"]["grazing_empty_cell"];
    const Sheet s = sheet_of(c, "grazing", "soil");
    const FactorialData d = read_factorial_data(s.values, s.factor1, s.factor2);
    const FactorialAnova anova = fit_factorial(d, 2);
    expect_rows(anova, c["type2"], 1e-12);
    EXPECT_EQ(anova.interaction.df, 3.0);  // (3 − 1)(3 − 1) − 1 empty cell
    try {
        fit_factorial(d, 3);
        FAIL() << "expected a refusal";
    } catch (const Refusal& r) {
        EXPECT_EQ(std::string(r.what()),
                  "no observations for grazing = heavy with soil = sand; Type III sums of squares compare means "
                  "of every combination, so each needs data (use sums type-2)");
    }
}

TEST(FitFactorial, TableLayout) {
    const Sheet s = sheet_of(reference()["factorial"]["biomass"]);
    const Table t = factorial_table(fit_factorial(read_factorial_data(s.values, s.factor1, s.factor2), 2));
    ASSERT_EQ(t.size(), 5u);
    ASSERT_EQ(t[0].size(), 7u);
    EXPECT_EQ(std::get<std::string>(t[0][6]), "partial η²");
    EXPECT_EQ(std::get<std::string>(t[3][0]), "fertiliser × watering");
    EXPECT_EQ(std::get<std::string>(t[4][0]), "residual");
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[4][4]));
    EXPECT_TRUE(std::holds_alternative<double>(t[4][3]));
}

TEST(FitFactorial, Refusals) {
    auto refusal = [](const std::vector<double>& y, const std::vector<std::string>& a, const std::vector<std::string>& b,
                      int type = 2) {
        try {
            fit_factorial(read_factorial_data(Range::column(y), Range::text_column(a), Range::text_column(b)), type);
        } catch (const Refusal& r) {
            return std::string(r.what());
        }
        return std::string("no refusal");
    };
    EXPECT_EQ(refusal({1, 2, 3, 4}, {"x", "x", "x", "x"}, {"p", "q", "p", "q"}),
              "factor1 has a single level (x); a two-way analysis needs at least 2 levels of each factor (for one factor use COMPARE.GROUPS)");
    EXPECT_EQ(refusal({1, 2, 3, 4}, {"x", "x", "y", "y"}, {"p", "q", "p", "q"}),
              "no replication: each combination of factor1 and factor2 has one value, so there is no residual to test against");
    EXPECT_EQ(refusal({1, 1, 2, 2, 3, 3, 4, 4}, {"x", "x", "x", "x", "y", "y", "y", "y"}, {"p", "p", "q", "q", "p", "p", "q", "q"}),
              "no spread within the combinations of factor1 and factor2: every value equals its combination's mean, so F cannot be formed");
    // A 2×2 with one empty cell leaves no interaction to estimate, even for Type II.
    EXPECT_EQ(refusal({1, 2, 3, 4, 5, 6}, {"x", "x", "x", "x", "y", "y"}, {"p", "p", "q", "q", "p", "p"}),
              "the interaction cannot be estimated: 1 combination of levels has no observations; fill them or drop a level");
    EXPECT_EQ(refusal({1, 2, 3, 4}, {"x", "x", "y", "y"}, {"p", "q", "p", "q"}, 1), "sums must be type-2 or type-3");
    // 21 × 20 combinations: refused before any matrix is built.
    std::vector<double> y;
    std::vector<std::string> a, b;
    for (int i = 0; i < 21; ++i)
        for (int j = 0; j < 20; ++j) y.push_back(i + j), a.push_back("a" + std::to_string(i)), b.push_back("b" + std::to_string(j));
    EXPECT_EQ(refusal(y, a, b), "factor1 and factor2 make 420 combinations of levels; at most 400 are supported");
}

// A long sheet costs one pass over the rows: the fit works on the cell summary (common practice,
// no source: the within-cell and between-cell sums of squares of a balanced 2×2 design with
// values i mod 2 + (i mod 4 < 2 ? 0 : 10) + noise-free structure).
TEST(FitFactorial, LongSheetIsSummarisedByCells) {
    const std::size_t n = 200000;
    std::vector<double> y(n);
    std::vector<std::size_t> first(n), second(n);
    for (std::size_t i = 0; i < n; ++i) {
        first[i] = i % 2;
        second[i] = (i / 2) % 2;
        // Cell means 0, 1, 10, 11 plus a within-cell pattern −1, +1 (i / 4 odd or even).
        y[i] = double(first[i]) + 10.0 * double(second[i]) + ((i / 4) % 2 ? 1.0 : -1.0);
    }
    FactorialData d;
    d.y = y;
    d.first = first;
    d.second = second;
    d.first_levels = {"x", "y"};
    d.second_levels = {"p", "q"};
    d.first_name = "factor1";
    d.second_name = "factor2";
    const FactorialAnova anova = fit_factorial(d, 2);
    // Balanced: SS_first = n · (1/2)², SS_second = n · 5², no interaction, residual = n · 1²;
    // tolerance 1e-9 relative (sums over 200,000 terms, compensated).
    EXPECT_NEAR(anova.first.ss, 0.25 * double(n), 1e-9 * double(n));
    EXPECT_NEAR(anova.second.ss, 25.0 * double(n), 1e-9 * 25 * double(n));
    EXPECT_NEAR(anova.interaction.ss, 0.0, 1e-9 * double(n));
    EXPECT_NEAR(anova.residual.ss, double(n), 1e-9 * double(n));
    EXPECT_EQ(anova.residual.df, double(n - 4));
}

}  // namespace
}  // namespace quadrat
