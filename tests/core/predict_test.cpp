// FIT.PREDICT in the core: the fitted model at new predictor values with its two intervals.
#include <gtest/gtest.h>

#include <cmath>
#include <optional>
#include <string>
#include <variant>

#include "core/linear_model.hpp"
#include "core/predict.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

// Straight line through (1, 2), (2, 3), (3, 5), (4, 4), (5, 6), worked by hand: x̄ = 3, Sxx = 10,
// slope 0.9, intercept 1.3, RSS = 1.9, σ² = 1.9/3; at x₀ = 6, ŷ = 6.7 and h = 1/5 + (6 − 3)²/10 =
// 1.1 (Draper & Smith 1998 §3.1); t(3) at 97.5% = 3.182446305284263 (Boost.Math, cross-checked
// against printed t tables: 3.182). 1e-12 relative: a closed form.
TEST(FitPredict, StraightLineByHand) {
    const std::vector<double> y = {2, 3, 5, 4, 6};
    const LinearModel m = fit_least_squares(y, {{1, 2, 3, 4, 5}}, {"x"}, true);
    const std::vector<double> x0 = {6};
    const Prediction p = predict_at(m, x0, 0.95);
    const double t = 3.182446305284263, residual_sd = std::sqrt(1.9 / 3);
    expect_relative(p.predicted, 6.7, 1e-12, "ŷ");
    expect_relative(p.mean_high - p.predicted, t * residual_sd * std::sqrt(1.1), 1e-12, "mean half-width");
    expect_relative(p.reading_high - p.predicted, t * residual_sd * std::sqrt(2.1), 1e-12, "reading half-width");
    // At a data row the new-row leverage equals the fitted one, and ŷ the fitted value.
    const std::vector<double> x3 = {3};
    expect_relative(m.leverage_at(x3), m.leverage[2], 1e-13, "leverage at x = 3");
    expect_relative(m.predicted_at(x3), m.fitted[2], 1e-13, "fitted at x = 3");
}

// statsmodels 0.13 OLS get_prediction().summary_frame (tests/reference/generate_predict.py) on the
// invented stream survey, two predictors, inside and outside the observed range, at 95% and 90%:
// 1e-10 relative (both solve the same least squares in double precision or better).
TEST(FitPredict, AgreesWithStatsmodels) {
    const auto& ref = reference_file("predict.json");
    const LinearModel m = fit_least_squares(ref["oxygen"].get<std::vector<double>>(),
                                            {ref["temperature"].get<std::vector<double>>(), ref["elevation"].get<std::vector<double>>()},
                                            {"temperature", "elevation"}, true);
    const auto at = ref["at"].get<std::vector<std::vector<double>>>();
    for (const auto& [level_text, c] : ref["cases"].items()) {
        const double level = std::stod(level_text);
        for (std::size_t i = 0; i < at.size(); ++i) {
            SCOPED_TRACE(level_text + " row " + std::to_string(i));
            const Prediction p = predict_at(m, at[i], level);
            expect_relative(p.predicted, c["predicted"][i].get<double>(), 1e-10, "predicted");
            expect_relative(p.mean_low, c["mean ci-low"][i].get<double>(), 1e-10, "mean ci-low");
            expect_relative(p.mean_high, c["mean ci-high"][i].get<double>(), 1e-10, "mean ci-high");
            expect_relative(p.reading_low, c["reading low"][i].get<double>(), 1e-10, "reading low");
            expect_relative(p.reading_high, c["reading high"][i].get<double>(), 1e-10, "reading high");
        }
    }
}

// The layout of FUNCTIONS.md (FIT.PREDICT): header row, one row per row of `at`, blank where a
// row has a missing cell; a single column has exactly at's rows.
TEST(FitPredict, TableLayout) {
    const std::vector<double> y = {2, 3, 5, 4, 6};
    const LinearModel m = fit_least_squares(y, {{1, 2, 3, 4, 5}}, {"x"}, true);
    const std::vector<std::optional<std::vector<double>>> at = {std::vector<double>{6}, std::nullopt, std::vector<double>{2}};
    const Table all = prediction_table(m, at, false, 0.95, 5);
    ASSERT_EQ(all.size(), 4u);
    EXPECT_EQ(std::get<std::string>(all[0][0]), "predicted");
    EXPECT_EQ(std::get<std::string>(all[0][4]), "reading high");
    EXPECT_NEAR(std::get<double>(all[1][0]), 6.7, 1e-12);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(all[2][0]));
    const Table with_header = prediction_table(m, {std::nullopt, std::vector<double>{6}}, true, 0.95, 5);
    ASSERT_EQ(with_header.size(), 2u) << "the header takes the place of at's own header row";
    EXPECT_NEAR(std::get<double>(with_header[1][0]), 6.7, 1e-12);
    const Table one = prediction_table(m, at, false, 0.95, 0);
    ASSERT_EQ(one.size(), 3u);
    EXPECT_NEAR(std::get<double>(one[2][0]), 1.3 + 0.9 * 2, 1e-12);
}

}  // namespace
}  // namespace quadrat
