// FIT.COUNTS in the core: Poisson and negative binomial (NB2) regression with effort as offset.
#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <variant>

#include "core/count_model.hpp"
#include "core/logistic.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

using namespace quadrat::test_support;

namespace quadrat {
namespace {

const nlohmann::json& reference() { return reference_file("counts.json"); }

std::string refusal_of(const CountData& data, CountMethod method = CountMethod::automatic) {
    try {
        fit_counts(data, method);
    } catch (const Refusal& r) {
        return r.what();
    }
    return "no refusal";
}

double cell_number(const Table& t, std::size_t row, std::size_t column) { return std::get<double>(t.at(row).at(column)); }

// A Poisson model with one 0/1 predictor and an offset has a closed form (worked by hand from the
// likelihood equations, McCullagh & Nelder 1989 §6.2): the fitted rate of each level is its total
// count over its total effort, so e^intercept = Σy₀/Σe₀ = 10/30 and the rate ratio
// e^β = (Σy₁/Σe₁)/(Σy₀/Σe₀) = (27/35)/(10/30); the information matrix gives
// SE(β) = √(1/Σy₁ + 1/Σy₀) = √(1/27 + 1/10) and SE(intercept) = √(1/10).
// Tolerance 1e-10: the iteration stops at a relative change of 1e-13 in −2ℓ.
TEST(FitCounts, PoissonWithOneIndicatorHasTheClosedForm) {
    CountData d;
    d.counts = {3, 5, 2, 9, 7, 11};
    d.effort = {10, 12, 8, 10, 10, 15};
    d.xs = {{0, 0, 0, 1, 1, 1}};
    d.names = {"treated"};
    const CountFit fit = fit_counts(d, CountMethod::poisson);
    expect_relative(fit.estimate[0], std::log(10.0 / 30.0), 1e-10, "intercept");
    expect_relative(std::exp(fit.estimate[1]), (27.0 / 35.0) / (10.0 / 30.0), 1e-10, "rate ratio");
    expect_relative(fit.std_error[1], std::sqrt(1.0 / 27 + 1.0 / 10), 1e-10, "SE of log rate ratio");
    expect_relative(fit.std_error[0], std::sqrt(1.0 / 10), 1e-10, "SE of intercept");
    const Table coefficients = count_coefficients(fit, 0.95);
    EXPECT_EQ(std::get<std::string>(coefficients[0][5]), "rate ratio");
    EXPECT_TRUE(std::holds_alternative<std::monostate>(coefficients[1][5])) << "the intercept's rate ratio stays blank";
    // Wald interval of the rate ratio: e^(β ± 1.959963984540054 SE) (the normal 97.5% point).
    const double b = std::log((27.0 / 35.0) / (10.0 / 30.0)), se = std::sqrt(1.0 / 27 + 1.0 / 10);
    expect_relative(cell_number(coefficients, 2, 6), std::exp(b - 1.959963984540054 * se), 1e-9, "ci-low");
    expect_relative(cell_number(coefficients, 2, 7), std::exp(b + 1.959963984540054 * se), 1e-9, "ci-high");
}

// Dobson, A. J. & Barnett, A. G. (2008), An Introduction to Generalized Linear Models, 3rd ed.,
// §9.2.1 (from memory; the same values come out of statsmodels on the data in
// tests/reference/generate_counts.py, which confirms both): coronary deaths among British doctors
// with log person-years as offset; printed estimates (SE) −10.79 (0.450), smoking 1.441 (0.372),
// age 2.376 (0.208), age² −0.198 (0.027), smoking × age −0.308 (0.097), deviance 1.635.
// Held to the printed digits (half a unit of the last printed digit).
TEST(FitCounts, PoissonMatchesDobsonsDoctorsExample) {
    const auto& c = reference()["doctors"];
    CountData d;
    d.counts = c["deaths"].get<std::vector<double>>();
    d.effort = c["person_years"].get<std::vector<double>>();
    const auto smoke = c["smoke"].get<std::vector<double>>();
    const auto age = c["agecat"].get<std::vector<double>>();
    std::vector<double> age2, smoke_age;
    for (std::size_t i = 0; i < age.size(); ++i) {
        age2.push_back(age[i] * age[i]);
        smoke_age.push_back(smoke[i] * age[i]);
    }
    d.xs = {smoke, age, age2, smoke_age};
    d.names = {"smoking", "age", "age²", "smoking × age"};
    const CountFit fit = fit_counts(d, CountMethod::poisson);
    const double printed[] = {-10.79, 1.441, 2.376, -0.198, -0.308};
    const double printed_se[] = {0.450, 0.372, 0.208, 0.027, 0.097};
    const double half_unit[] = {0.005, 0.0005, 0.0005, 0.0005, 0.0005};
    for (std::size_t j = 0; j < 5; ++j) {
        EXPECT_NEAR(fit.estimate[j], printed[j], half_unit[j]) << fit.terms[j];
        EXPECT_NEAR(fit.std_error[j], printed_se[j], 0.0005) << fit.terms[j];
    }
    EXPECT_NEAR(fit.deviance, 1.635, 0.0005);

    // statsmodels 0.13 GLM Poisson with offset (tests/reference/generate_counts.py): 1e-9 relative,
    // two IRLS runs to a relative change of 1e-13 to 1e-15.
    const auto& sm = c["poisson"];
    for (std::size_t j = 0; j < 5; ++j) {
        expect_relative(fit.estimate[j], sm["coefficient"][j].get<double>(), 1e-9, "coefficient " + fit.terms[j]);
        expect_relative(fit.std_error[j], sm["SE"][j].get<double>(), 1e-9, "SE " + fit.terms[j]);
        expect_relative(fit.p[j], sm["p"][j].get<double>(), 1e-8, "p " + fit.terms[j]);
    }
    expect_relative(fit.deviance, sm["deviance"].get<double>(), 1e-9, "deviance");
    expect_relative(fit.null_deviance, sm["null deviance"].get<double>(), 1e-9, "null deviance");
    expect_relative(fit.aic, sm["aic"].get<double>(), 1e-11, "aic");
    expect_relative(fit.overdispersion, sm["overdispersion"].get<double>(), 1e-9, "Pearson χ²/df");
}

CountData fish_passes() {
    const auto& c = reference()["fish_passes"];
    CountData d;
    d.counts = c["fish"].get<std::vector<double>>();
    d.effort = c["minutes"].get<std::vector<double>>();
    d.xs = {c["depth"].get<std::vector<double>>(), c["site"].get<std::vector<double>>()};
    d.names = {"depth", "site"};
    return d;
}

// statsmodels 0.13 discrete NegativeBinomial (NB2, exposure = minutes, Newton to 1e-14) on the
// invented electrofishing survey (tests/reference/generate_counts.py). Its own convergence is
// about 1e-9 relative (its coefficients and those of its GLM at the same fixed k differ by that),
// so 1e-7 relative for coefficients, standard errors, z, p and k; the log-likelihoods 1e-10.
TEST(FitCounts, NegativeBinomialAgreesWithStatsmodels) {
    const auto& sm = reference()["fish_passes"]["negative_binomial"];
    const CountFit fit = fit_counts(fish_passes(), CountMethod::negative_binomial);
    ASSERT_TRUE(fit.negative_binomial);
    for (std::size_t j = 0; j < 3; ++j) {
        expect_relative(fit.estimate[j], sm["coefficient"][j].get<double>(), 1e-7, "coefficient " + fit.terms[j]);
        expect_relative(fit.std_error[j], sm["SE"][j].get<double>(), 1e-7, "SE " + fit.terms[j]);
        expect_relative(fit.z[j], sm["z"][j].get<double>(), 1e-7, "z " + fit.terms[j]);
        expect_relative(fit.p[j], sm["p"][j].get<double>(), 1e-6, "p " + fit.terms[j]);
    }
    expect_relative(fit.aggregation_k, sm["aggregation k"].get<double>(), 1e-7, "aggregation k");
    expect_relative(fit.log_likelihood, sm["loglik"].get<double>(), 1e-10, "log-likelihood");
    expect_relative(fit.null_log_likelihood, sm["null loglik"].get<double>(), 1e-10, "null log-likelihood");
    expect_relative(fit.aic, sm["aic"].get<double>(), 1e-10, "aic");
    expect_relative(fit.lr_statistic, sm["lr statistic"].get<double>(), 1e-7, "likelihood-ratio χ²");
    expect_relative(fit.lr_p, sm["lr p"].get<double>(), 1e-6, "likelihood-ratio p");
    // statsmodels' GLM negative binomial with alpha = 1/k held at the fitted k: deviances (1e-7:
    // they inherit the error of k).
    expect_relative(fit.deviance, sm["deviance"].get<double>(), 1e-7, "deviance");
    expect_relative(fit.null_deviance, sm["null deviance"].get<double>(), 1e-7, "null deviance");
}

// The same survey under `auto`: the Poisson fit's Pearson χ²/df (statsmodels GLM, 1e-9) is 2.58,
// above the catalogue's 1.5, so the negative binomial is fitted and `model` says why.
TEST(FitCounts, AutoChoosesTheNegativeBinomialWhenOverdispersed) {
    const auto& sm = reference()["fish_passes"];
    const CountFit poisson = fit_counts(fish_passes(), CountMethod::poisson);
    for (std::size_t j = 0; j < 3; ++j)
        expect_relative(poisson.estimate[j], sm["poisson"]["coefficient"][j].get<double>(), 1e-9, "Poisson coefficient");
    expect_relative(poisson.overdispersion, sm["poisson"]["overdispersion"].get<double>(), 1e-9, "Pearson χ²/df");
    const CountFit automatic = fit_counts(fish_passes(), CountMethod::automatic);
    EXPECT_TRUE(automatic.negative_binomial);
    EXPECT_EQ(automatic.model,
              "negative binomial regression (NB2, log link, effort as log offset), chosen as the Poisson fit's Pearson χ²/df 2.58 exceeds 1.5");
    const Table model = count_model_table(automatic);
    ASSERT_EQ(model.size(), 14u);
    EXPECT_EQ(std::get<std::string>(model[1][0]), "model");
    EXPECT_EQ(std::get<std::string>(model[12][0]), "overdispersion");
    EXPECT_EQ(std::get<std::string>(model[13][0]), "aggregation k");
    expect_relative(cell_number(model, 13, 1), sm["negative_binomial"]["aggregation k"].get<double>(), 1e-7, "k in the table");
}

// Invented point counts drawn Poisson (tests/reference/generate_counts.py): Pearson χ²/df 1.11,
// not above 1.5, so `auto` stays with Poisson, without effort; statsmodels GLM Poisson, 1e-9.
// The `aggregation k` row is blank for Poisson.
TEST(FitCounts, AutoStaysPoissonWithoutOverdispersion) {
    const auto& c = reference()["point_counts"];
    CountData d;
    d.counts = c["birds"].get<std::vector<double>>();
    d.xs = {c["cover"].get<std::vector<double>>()};
    d.names = {"shrub cover"};
    const CountFit fit = fit_counts(d, CountMethod::automatic);
    EXPECT_FALSE(fit.negative_binomial);
    EXPECT_EQ(fit.model, "Poisson regression (log link); the Poisson fit's Pearson χ²/df 1.11 is not above 1.5");
    for (std::size_t j = 0; j < 2; ++j) {
        expect_relative(fit.estimate[j], c["poisson"]["coefficient"][j].get<double>(), 1e-9, "coefficient");
        expect_relative(fit.std_error[j], c["poisson"]["SE"][j].get<double>(), 1e-9, "SE");
    }
    expect_relative(fit.log_likelihood, c["poisson"]["loglik"].get<double>(), 1e-11, "log-likelihood");
    expect_relative(fit.null_log_likelihood, c["poisson"]["null loglik"].get<double>(), 1e-11, "null log-likelihood");
    const Table model = count_model_table(fit);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(model[13][1]));
    // Asked for the negative binomial, counts no more variable than Poisson have no finite k.
    CountData flat = d;
    flat.counts.assign(d.counts.size(), 0);
    for (std::size_t i = 0; i < flat.counts.size(); ++i) flat.counts[i] = 3 + double(i % 2);  // underdispersed
    EXPECT_EQ(refusal_of(flat, CountMethod::negative_binomial).rfind("the counts are no more variable than Poisson (Pearson χ²/df ", 0), 0u);
}

TEST(FitCounts, RefusesWhatHasNoHonestEstimate) {
    CountData d;
    d.counts = {0, 2, 1, 4, 3, 5};
    d.xs = {{1, 2, 3, 4, 5, 6}};
    d.names = {"depth"};
    EXPECT_EQ(refusal_of(d), "no refusal") << "zero counts are fine";
    CountData negative = d;
    negative.counts[1] = -2;
    EXPECT_EQ(refusal_of(negative), "counts holds -2; counts must be whole numbers from 0 up");
    CountData fractional = d;
    fractional.counts[1] = 2.5;
    EXPECT_EQ(refusal_of(fractional), "counts holds 2.5; counts must be whole numbers from 0 up");
    CountData no_effort = d;
    no_effort.effort = {1, 1, 0, 1, 1, 1};
    EXPECT_EQ(refusal_of(no_effort), "effort holds 0; effort must be a positive number");
    CountData zeros = d;
    zeros.counts.assign(6, 0);
    EXPECT_EQ(refusal_of(zeros), "every count is 0; there is no rate to model");
    CountData constant = d;
    constant.xs = {{2, 2, 2, 2, 2, 2}};
    EXPECT_EQ(refusal_of(constant), "predictor depth is constant; remove it");
    CountData few = d;
    few.counts = {1, 2};
    few.xs = {{1, 2}};
    EXPECT_EQ(refusal_of(few), "needs more rows than coefficients: 2 rows for 2 coefficients");
    // A site where every count is 0: its rate is 0 and its rate ratio runs off to 0 (Haberman 1974).
    CountData empty_site;
    empty_site.counts = {0, 0, 0, 4, 2, 5};
    empty_site.xs = {{1, 1, 1, 0, 0, 0}};
    empty_site.names = {"site: upper"};
    EXPECT_EQ(refusal_of(empty_site),
              "every count is 0 where site: upper is 1: that rate is 0 and its rate ratio has no finite estimate; merge that level "
              "with another, or remove site: upper");
    // Zero counts at one end of a continuous predictor only when combined with another: the fit
    // walks off, and the refusal says so instead of giving a huge coefficient.
    CountData runaway;
    runaway.counts = {0, 0, 0, 0, 3, 5, 4, 6};
    runaway.xs = {{1, 2, 3, 4, 5, 6, 7, 8}, {0, 0, 0, 0, 1, 1, 1, 1}};
    runaway.names = {"depth", "site"};
    EXPECT_EQ(refusal_of(runaway).substr(0, 40), "every count is 0 where site is 0: that r");
    // Counts only at the largest depth, zeros below: no single level is all zeros, but the line
    // can tilt without end (the counts' rows lie on one value of depth); caught by the fit
    // running off, as for logistic separation.
    CountData tilt;
    tilt.counts = {0, 0, 0, 0, 0, 0, 4, 6};
    tilt.xs = {{1, 2, 3, 4, 5, 6, 8, 8}};
    tilt.names = {"depth"};
    EXPECT_EQ(refusal_of(tilt, CountMethod::poisson),
              "the counts are 0 wherever depth (with the other predictors) is at one extreme: no finite coefficient exists; merge or "
              "remove that predictor");
}

// Counts near the top of what doubles hold exactly, and effort spanning twelve orders of
// magnitude, still fit (no overflow of e^η; rate ratio from the closed form as above).
TEST(FitCounts, LargeCountsAndWideEffort) {
    CountData d;
    d.counts = {3e12, 5e12, 2e12, 9e12, 7e12, 11e12};
    d.effort = {1e-3, 1.2e-3, 0.8e-3, 1e9, 1e9, 1.5e9};
    d.xs = {{0, 0, 0, 1, 1, 1}};
    d.names = {"treated"};
    const CountFit fit = fit_counts(d, CountMethod::poisson);
    expect_relative(std::exp(fit.estimate[1]), (27e12 / 3.5e9) / (10e12 / 3e-3), 1e-9, "rate ratio");
}

// FIT.LOGISTIC with `trials`: successes out of trials per row, a binomial GLM. statsmodels 0.13 GLM
// Binomial with a (successes, failures) response on the invented seed trays
// (tests/reference/generate_counts.py): 1e-9 relative (both Newton/IRLS to ~1e-15); the AIC and
// McFadden's R² with the full log-likelihood, binomial coefficients included, as statsmodels has it.
TEST(FitLogistic, WithTrialsAgreesWithStatsmodels) {
    const auto& c = reference()["germination"];
    LogisticData d;
    d.y = c["germinated"].get<std::vector<double>>();
    d.trials = c["sown"].get<std::vector<double>>();
    d.xs = {c["moisture"].get<std::vector<double>>(), c["shade"].get<std::vector<double>>()};
    d.names = {"moisture", "shade"};
    d.event = "success";
    const LogisticFit fit = fit_logistic(d);
    for (std::size_t j = 0; j < 3; ++j) {
        expect_relative(fit.estimate[j], c["coefficient"][j].get<double>(), 1e-9, "coefficient " + fit.terms[j]);
        expect_relative(fit.std_error[j], c["SE"][j].get<double>(), 1e-9, "SE " + fit.terms[j]);
        expect_relative(fit.p[j], c["p"][j].get<double>(), 1e-8, "p " + fit.terms[j]);
    }
    expect_relative(fit.deviance, c["deviance"].get<double>(), 1e-9, "deviance");
    expect_relative(fit.null_deviance, c["null deviance"].get<double>(), 1e-11, "null deviance");
    expect_relative(fit.aic, c["aic"].get<double>(), 1e-11, "aic");
    expect_relative(fit.pseudo_r_squared, c["pseudo-r-squared"].get<double>(), 1e-10, "McFadden R²");
    // With one trial per row the same fit is the 0/1 model: trials of 1 change nothing.
    LogisticData ones = d;
    ones.y = {1, 0, 1, 1, 0, 0, 1, 0};
    ones.xs = {{3, 1, 4, 1, 5, 9, 2, 6}};
    ones.names = {"x"};
    LogisticData plain = ones;
    ones.trials.assign(8, 1);
    plain.trials.clear();
    const LogisticFit a = fit_logistic(ones), b = fit_logistic(plain);
    expect_relative(a.estimate[1], b.estimate[1], 1e-13, "trials of 1 against 0/1");
    expect_relative(a.aic, b.aic, 1e-13, "aic");
}

// Reading successes and trials from cells: a row whose successes exceed its trials is refused by
// cell (FUNCTIONS.md, FIT.LOGISTIC with trials).
TEST(FitLogistic, RefusesSuccessesAboveTrials) {
    const auto column = [](std::vector<double> xs, std::size_t first_column) {
        Range r = Range::column(xs);
        r.is_reference = true;
        r.first_row = 1;
        r.first_column = first_column;
        return r;
    };
    const Range y = column({3, 7, 2}, 0), xs = column({1, 2, 3}, 1), trials = column({5, 5, 4}, 2);
    try {
        read_logistic_data(y, xs, trials);
        ADD_FAILURE() << "no refusal";
    } catch (const Refusal& r) {
        EXPECT_EQ(std::string(r.what()), "y holds 7 in A3 but trials only 5 in C3; successes cannot exceed trials");
    }
}

}  // namespace
}  // namespace quadrat
