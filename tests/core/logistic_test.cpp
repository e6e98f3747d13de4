// FIT.LOGISTIC in the core: reading the response, the maximum-likelihood fit, separation.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "core/logistic.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"
#include "sheet_cells.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("categorical.json"); }


// A referenced block starting at A2 from columns of cells.
Range block(const std::vector<std::vector<Cell>>& columns) {
    Range r;
    r.columns = columns.size();
    r.rows = columns.front().size();
    r.is_reference = true;
    r.first_row = 1;
    for (std::size_t i = 0; i < r.rows; ++i)
        for (std::size_t j = 0; j < r.columns; ++j) r.cells.push_back(columns[j][i]);
    return r;
}

std::string refusal_of(const Range& y, const Range& xs) {
    try {
        fit_logistic(read_logistic_data(y, xs));
    } catch (const Refusal& r) {
        return r.what();
    }
    return "no refusal";
}

// statsmodels 0.13 Logit(...).fit(method="newton", tol=1e-14) via
// tests/reference/generate_categorical.py, on three invented data sets (trout against temperature
// and oxygen, a mussel against depth, a fern against elevation in metres and canopy cover, the
// last badly scaled on purpose). Both fits converge to the same maximum; what is left is the
// rounding of two different Newton paths and of the inverse information matrix (measured: 2e-13
// relative at worst): tolerance 1e-10 relative for estimates, errors, z, p and the odds-ratio
// limits, 1e-12 for the deviances. The null deviance, LR statistic, its p and McFadden's R² are
// taken from the closed-form intercept-only fit in the generator (statsmodels' own llnull is a
// second optimisation, good to about 1e-10).
TEST(FitLogistic, AgreesWithStatsmodels) {
    for (const auto& [name, c] : reference()["logistic"].items()) {
        SCOPED_TRACE(name);
        LogisticData d;
        d.y = c["y"].get<std::vector<double>>();
        for (const auto& x : c["xs"]) d.xs.push_back(x.get<std::vector<double>>());
        d.names = c["names"].get<std::vector<std::string>>();
        d.event = "1";
        const LogisticFit fit = fit_logistic(d);
        const Table coefficients = logistic_coefficients(fit, c["level"].get<double>());
        for (std::size_t j = 0; j < fit.terms.size(); ++j) {
            SCOPED_TRACE(fit.terms[j]);
            EXPECT_LT(relative_error(fit.estimate[j], c["estimate"][j].get<double>()), 1e-10);
            EXPECT_LT(relative_error(fit.std_error[j], c["std_error"][j].get<double>()), 1e-10);
            EXPECT_LT(relative_error(fit.z[j], c["z"][j].get<double>()), 1e-10);
            EXPECT_LT(relative_error(fit.p[j], c["p"][j].get<double>()), 1e-10);
            if (j == 0) {
                // FUNCTIONS.md, FIT.LOGISTIC: the intercept's odds-ratio cells stay blank.
                for (std::size_t col = 5; col < 8; ++col)
                    EXPECT_TRUE(std::holds_alternative<std::monostate>(coefficients[1][col])) << col;
                continue;
            }
            EXPECT_LT(relative_error(std::get<double>(coefficients[j + 1][6]), c["or_low"][j].get<double>()), 1e-10);
            EXPECT_LT(relative_error(std::get<double>(coefficients[j + 1][7]), c["or_high"][j].get<double>()), 1e-10);
        }
        EXPECT_LT(relative_error(fit.deviance, c["deviance"].get<double>()), 1e-12);
        EXPECT_LT(relative_error(fit.null_deviance, c["null_deviance"].get<double>()), 1e-12);
        EXPECT_LT(relative_error(fit.lr_statistic, c["statistic"].get<double>()), 1e-10);
        EXPECT_LT(relative_error(fit.lr_p, c["lr_p"].get<double>()), 1e-10);
        EXPECT_LT(relative_error(fit.aic, c["aic"].get<double>()), 1e-10);
        EXPECT_LT(relative_error(fit.pseudo_r_squared, c["pseudo_r_squared"].get<double>()), 1e-10);
        EXPECT_EQ(fit.df, c["df"].get<double>());
        EXPECT_EQ(fit.n, c["n"].get<double>());
        EXPECT_LT(fit.iterations, 15);
    }
}

TEST(FitLogistic, ReadsTwoLabelsAndNamesTheEvent) {
    const auto& c = reference()["logistic"]["trout"];
    std::vector<Cell> y{txt("trout")}, temp{txt("temperature")}, oxygen{txt("oxygen")};
    for (std::size_t i = 0; i < c["y"].size(); ++i) {
        y.push_back(txt(c["y"][i].get<double>() == 1 ? "Present" : "absent"));
        temp.push_back(num(c["xs"][0][i].get<double>()));
        oxygen.push_back(num(c["xs"][1][i].get<double>()));
    }
    // A row with a missing label and a row with a missing reading: both dropped.
    y.push_back(txt("n/a")), temp.push_back(num(12)), oxygen.push_back(num(8));
    y.push_back(txt("absent")), temp.push_back(txt("-")), oxygen.push_back(num(8));
    const LogisticData d = read_logistic_data(block({y}), block({temp, oxygen}));
    // Case-insensitive character order: `Present` comes after `absent`, so it is the event.
    EXPECT_EQ(d.event, "Present");
    EXPECT_EQ(d.names, (std::vector<std::string>{"temperature", "oxygen"}));
    EXPECT_EQ(d.n_dropped, 2u);
    const LogisticFit fit = fit_logistic(d);
    // statsmodels 0.13 via the generator, as above; tolerance 1e-8 relative.
    EXPECT_LT(relative_error(fit.estimate[1], c["estimate"][1].get<double>()), 1e-8);
    const Table model = logistic_model(fit);
    ASSERT_EQ(model.size(), 13u);
    EXPECT_EQ(std::get<std::string>(model[1][0]), "model");
    EXPECT_EQ(std::get<std::string>(model[2][1]), "Present");
    EXPECT_EQ(std::get<double>(model[11][1]), 2.0);  // n dropped
}

TEST(FitLogistic, RefusesSeparationNamingThePredictor) {
    // Complete separation: every site deeper than 1.5 m has the mussel.
    Range y = Range::column({0, 0, 0, 0, 1, 1, 1, 1});
    Range depth = block({{txt("depth"), num(0.5), num(0.8), num(1.0), num(1.4), num(1.6), num(2.0), num(2.2), num(2.9)}});
    Range y_h = block({{txt("mussel"), num(0), num(0), num(0), num(0), num(1), num(1), num(1), num(1)}});
    EXPECT_EQ(refusal_of(y_h, depth),
              "the outcome is perfectly predicted by depth (complete separation): no finite coefficient exists; "
              "remove or combine that predictor, or add data where the outcomes overlap");
    // Quasi-complete: the two outcomes meet at one depth only.
    Range y_q = block({{txt("mussel"), num(0), num(0), num(0), num(1), num(0), num(1), num(1), num(1)}});
    Range depth_q = block({{txt("depth"), num(0.5), num(0.8), num(1.0), num(1.5), num(1.5), num(2.0), num(2.2), num(2.9)}});
    EXPECT_NE(refusal_of(y_q, depth_q).find("by depth (quasi-complete separation)"), std::string::npos);
    // Separation by a combination: neither predictor alone separates, x1 + x2 > 0 does.
    Range y_c = block({{txt("y"), num(0), num(0), num(0), num(0), num(1), num(1), num(1), num(1)}});
    Range xs_c = block({{txt("a"), num(-1), num(2), num(-3), num(0.5), num(1), num(-2), num(3), num(0.5)},
                        {txt("b"), num(0.5), num(-3), num(2), num(-1), num(0.5), num(3), num(-2), num(0)}});
    EXPECT_NE(refusal_of(y_c, xs_c).find("(complete separation)"), std::string::npos) << refusal_of(y_c, xs_c);
    (void)y;
}

TEST(FitLogistic, RefusesBadResponsesAndPredictors) {
    Range x = Range::column({1, 2, 3, 4, 5, 6});
    EXPECT_EQ(refusal_of(Range::column({0, 1, 2, 0, 1, 0}), x),
              "y holds 2 in A3; a numeric response must be 0 or 1 (or use two labels such as present/absent)");
    EXPECT_EQ(refusal_of(Range::text_column({"a", "b", "c", "a", "b", "c"}), x),
              "y has 3 labels (a, b, c); logistic regression needs exactly two outcomes");
    EXPECT_EQ(refusal_of(Range::column({1, 1, 1, 1, 1, 1}), x),
              "every used row has the same outcome (all are 1); logistic regression needs both outcomes");
    EXPECT_EQ(refusal_of(Range::column({0, 1, 0, 1, 1, 0}), Range::column({3, 3, 3, 3, 3, 3})),
              "predictor x1 is constant; remove it");
    Range collinear = block({{num(1), num(2), num(3), num(4), num(5), num(6)}, {num(2), num(4), num(6), num(8), num(10), num(12)}});
    EXPECT_EQ(refusal_of(Range::column({0, 1, 0, 1, 1, 0}), collinear),
              "predictor x2 is a linear combination of the predictors before it (collinear); remove it");
    EXPECT_EQ(refusal_of(Range::column({0, 1}), Range::column({1, 2})),
              "needs more rows than coefficients: 2 rows for 2 coefficients");
}

}  // namespace
}  // namespace quadrat
