// FIT.LINEAR's core against statsmodels 0.13 (OLS fit(method='qr')) on invented field data, and
// its refusals. Reference values: tests/reference/generate_linear.py → linear.json.
// Tolerance 1e-10 relative for estimates, SEs, R², F, σ, AIC, BIC: both sides solve a
// well-conditioned problem by QR to near full precision; 1e-8 relative for p-values and
// confidence limits (Boost.Math against SciPy's own distribution code, each accurate to ~1e-14
// but through different quantile routines).
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>

#include <nlohmann/json.hpp>

#include "core/linear_model.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

using nlohmann::json;

const json& reference() { return reference_file("linear.json"); }


LinearModel fit_set(const std::string& name) {
    const json& set = reference()[name];
    return fit_least_squares(set["y"].get<std::vector<double>>(), set["xs"].get<std::vector<std::vector<double>>>(),
                             set["names"].get<std::vector<std::string>>(), true);
}

TEST(LinearModel, MatchesStatsmodelsOnBothFieldSets) {
    for (const std::string name : {"stream", "marsh"}) {
        const LinearModel m = fit_set(name);
        const json& ref = reference()[name]["reference"];
        ASSERT_EQ(m.parameters, ref["estimate"].size());
        for (std::size_t j = 0; j < m.parameters; ++j) {
            // statsmodels OLS(method='qr') via generate_linear.py.
            expect_relative(m.estimate[j], ref["estimate"][j], 1e-10, name + " estimate");
            expect_relative(m.std_error[j], ref["std_error"][j], 1e-10, name + " std. error");
            expect_relative(m.t[j], ref["t"][j], 1e-10, name + " t");
            expect_relative(m.p[j], ref["p"][j], 1e-8, name + " p");
            for (const std::string level : {"0.95", "0.9"}) {
                expect_relative(m.ci_low(j, std::stod(level)), ref["ci"][level][j][0], 1e-8, name + " ci-low " + level);
                expect_relative(m.ci_high(j, std::stod(level)), ref["ci"][level][j][1], 1e-8, name + " ci-high " + level);
            }
            // statsmodels variance_inflation_factor (no VIF for the intercept).
            if (j > 0) expect_relative(m.vif[j], ref["vif"][j - 1], 1e-10, name + " VIF");
        }
        EXPECT_TRUE(std::isnan(m.vif[0]));
        expect_relative(m.r_squared, ref["r_squared"], 1e-12, name + " r-squared");
        expect_relative(m.r_squared_adjusted, ref["r_squared_adjusted"], 1e-12, name + " r-squared-adjusted");
        expect_relative(m.f_statistic, ref["f"], 1e-10, name + " F");
        expect_relative(m.f_p, ref["f_p"], 1e-8, name + " F p");
        EXPECT_EQ(m.df_model, ref["df"].get<double>());
        EXPECT_EQ(m.df_residual, ref["df2"].get<double>());
        expect_relative(m.residual_sd, ref["residual_sd"], 1e-12, name + " residual-sd");
        // AIC/BIC: −2 llf + (2 or log n)(parameters + 1), llf from statsmodels (generator).
        expect_relative(m.log_likelihood, ref["log_likelihood"], 1e-12, name + " log-likelihood");
        expect_relative(m.aic, ref["aic"], 1e-12, name + " aic");
        expect_relative(m.bic, ref["bic"], 1e-12, name + " bic");
        for (std::size_t i = 0; i < m.n; ++i) {
            // statsmodels fittedvalues, resid, OLSInfluence.hat_matrix_diag; residuals are compared
            // absolutely at 1e-9 of the response's scale (a residual near 0 has no relative digits).
            expect_relative(m.fitted[i], ref["fitted"][i], 1e-11, name + " fitted");
            EXPECT_NEAR(m.residuals[i], ref["residual"][i].get<double>(), 1e-9) << name;
            expect_relative(m.leverage[i], ref["leverage"][i], 1e-10, name + " leverage");
        }
    }
}

TEST(LinearModel, OutputsFollowTheCatalogue) {
    const LinearModel m = fit_set("stream");
    const Table coefficients = linear_output(m, 2, "coefficients", 0.95);
    ASSERT_EQ(coefficients.size(), 4u);
    ASSERT_EQ(coefficients[0].size(), 8u);
    // FUNCTIONS.md, FIT.LINEAR: variable | coefficient | SE | t | p | ci-low | ci-high | VIF.
    const std::vector<std::string> header = {"variable", "coefficient", "SE", "t", "p", "ci-low", "ci-high", "VIF"};
    for (std::size_t c = 0; c < header.size(); ++c) EXPECT_EQ(std::get<std::string>(coefficients[0][c]), header[c]);
    EXPECT_EQ(std::get<std::string>(coefficients[1][0]), "intercept");
    EXPECT_EQ(std::get<std::string>(coefficients[2][0]), "flow");
    EXPECT_TRUE(std::holds_alternative<std::monostate>(coefficients[1][7]));  // no VIF for the intercept

    const Table model = linear_output(m, 2, "model", 0.95);
    const std::vector<std::string> labels = {"quantity", "model", "r-squared", "r-squared-adjusted", "statistic", "df",
                                             "df2",      "p",     "residual-sd", "aic", "bic",       "n",  "n dropped"};
    ASSERT_EQ(model.size(), labels.size());
    for (std::size_t i = 0; i < labels.size(); ++i) EXPECT_EQ(std::get<std::string>(model[i][0]), labels[i]);
    EXPECT_EQ(std::get<double>(model[12][1]), 2.0);

    // Several predictors: slope is a refusal that points to the coefficient table.
    try {
        linear_output(m, 0, "slope", 0.95);
        FAIL() << "slope with two predictors must be refused";
    } catch (const Refusal& r) {
        EXPECT_NE(std::string(r.what()).find("coefficients"), std::string::npos);
    }
    const LinearModel one = fit_set("marsh");
    // statsmodels OLS(method='qr') via generate_linear.py.
    expect_relative(std::get<double>(linear_output(one, 0, "slope", 0.95)[0][0]),
                    reference()["marsh"]["reference"]["estimate"][1], 1e-10, "slope");
    const std::string report = std::get<std::string>(linear_output(one, 0, "report", 0.95)[0][0]);
    EXPECT_NE(report.find("F(1, 23)"), std::string::npos) << report;
    EXPECT_NE(report.find("slope -1.64 (95% CI"), std::string::npos) << report;
}

TEST(LinearModel, OneRowMoreThanTermsIsTheSmallestFit) {
    // Common practice, no source: y = 1 + 2x + e through three points with one residual df;
    // the least-squares line through (0,1), (1,3), (2,6) is 0.8333… + 2.5x (closed form).
    const LinearModel m = fit_least_squares(std::vector<double>{1, 3, 6}, {{0, 1, 2}}, {"x"}, true);
    EXPECT_NEAR(m.estimate[0], 5.0 / 6.0, 1e-14);
    EXPECT_NEAR(m.estimate[1], 2.5, 1e-14);
    EXPECT_EQ(m.df_residual, 1.0);
    EXPECT_THROW(fit_least_squares(std::vector<double>{1, 3}, {{0, 1}}, {"x"}, true), Refusal);
}

TEST(LinearModel, RefusesWhatCannotBeEstimatedAndNamesTheColumn) {
    const std::vector<double> y = {1, 2, 4, 3, 5, 7};
    const auto message = [&](const std::vector<std::vector<double>>& xs, const std::vector<std::string>& names) {
        try {
            fit_least_squares(y, xs, names, true);
        } catch (const Refusal& r) {
            return std::string(r.what());
        }
        return std::string("no refusal");
    };
    // A constant predictor.
    EXPECT_NE(message({{1, 2, 3, 4, 5, 6}, {3, 3, 3, 3, 3, 3}}, {"depth", "site"}).find("site is constant"), std::string::npos);
    // Collinear: width = 2·depth − 1, named as the later column.
    const std::string collinear = message({{1, 2, 3, 4, 5, 7}, {1, 3, 5, 7, 9, 13}, {2, 1, 2, 1, 2, 1}}, {"depth", "width", "shade"});
    EXPECT_NE(collinear.find("width is a linear combination of depth"), std::string::npos) << collinear;
    // A constant response.
    EXPECT_THROW(fit_least_squares(std::vector<double>(6, 2.0), {{1, 2, 3, 4, 5, 6}}, {"x"}, true), Refusal);
}

TEST(LinearModel, PerfectFitSaysWhatIsAndIsNotDefined) {
    // Common practice, no source: y = 3 + 0.5x exactly.
    const LinearModel m = fit_least_squares(std::vector<double>{3.5, 4, 4.5, 5, 5.5}, {{1, 2, 3, 4, 5}}, {"x"}, true);
    EXPECT_TRUE(m.perfect_fit);
    EXPECT_EQ(m.residual_sd, 0.0);
    EXPECT_EQ(m.r_squared, 1.0);
    EXPECT_NEAR(m.estimate[1], 0.5, 1e-15);
    EXPECT_TRUE(std::isnan(m.t[1]));
    EXPECT_TRUE(std::isnan(m.f_p));
    EXPECT_THROW(linear_output(m, 0, "p", 0.95), Refusal);
    const Table coefficients = coefficient_table(m, 0.95);
    EXPECT_EQ(std::get<double>(coefficients[2][2]), 0.0);                    // std. error 0
    EXPECT_TRUE(std::holds_alternative<std::monostate>(coefficients[2][4]));  // p blank
    const std::string report = std::get<std::string>(linear_output(m, 0, "report", 0.95)[0][0]);
    EXPECT_NE(report.find("not defined"), std::string::npos) << report;
}

TEST(LinearModel, HundredThousandRowsStayLinearInN) {
    // Common practice, no source: a seeded linear congruential sequence, y = 2 + 3a − b + noise.
    const std::size_t n = 100000;
    std::vector<double> a(n), b(n), y(n);
    std::uint64_t state = 12345;
    const auto next = [&] {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        return static_cast<double>(state >> 11) / 9007199254740992.0;
    };
    for (std::size_t i = 0; i < n; ++i) {
        a[i] = next();
        b[i] = next();
        y[i] = 2 + 3 * a[i] - b[i] + 0.1 * (next() - 0.5);
    }
    const LinearModel m = fit_least_squares(y, {a, b}, {"a", "b"}, true);
    // Uniform noise of width 0.1 has SD 0.1/√12 ≈ 0.0289: estimates within a few SEs (~1e-3).
    EXPECT_NEAR(m.estimate[1], 3.0, 2e-3);
    EXPECT_NEAR(m.estimate[2], -1.0, 2e-3);
    EXPECT_NEAR(m.residual_sd, 0.1 / std::sqrt(12.0), 1e-3);
}

// Numbers whose squares overflow or underflow a double are refused with what to do, not called
// constant (FUNCTIONS.md refusal rule; the catalogue's refusal, exact).
TEST(LinearModel, RefusesNumbersBeyondTheScaleOfSquares) {
    const std::vector<double> x = {3, 5, 2, 4, 6, 7};
    const std::vector<double> y = {12.1, 14.3, 11.8, 13.5, 12.9, 15.0};
    auto text = [](auto&& call) {
        try {
            call();
        } catch (const Refusal& r) {
            return std::string(r.what());
        }
        return std::string("no refusal");
    };
    std::vector<double> huge = y, tiny = x;
    for (double& v : huge) v *= 1e300;
    for (double& v : tiny) v *= 1e-311;
    EXPECT_EQ(text([&] { fit_least_squares(huge, {x}, {"x1"}, true); }),
              "y holds numbers too large to fit (largest 1.5e+301); rescale y, e.g. into other units");
    EXPECT_EQ(text([&] { fit_least_squares(y, {tiny}, {"x1"}, true); }),
              "x1 holds numbers too small to fit (largest 7e-311); rescale x1, e.g. into other units");
    // 1e100 is still fitted.
    std::vector<double> large = y;
    for (double& v : large) v *= 1e100;
    EXPECT_NO_THROW(fit_least_squares(large, {x}, {"x1"}, true));
}

}  // namespace
}  // namespace quadrat
