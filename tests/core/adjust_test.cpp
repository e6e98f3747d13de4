// ADJUST.P: adjusted p-values against statsmodels and against the published definitions.
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "addin/registry.hpp"
#include "core/adjust.hpp"
#include "core/refusal.hpp"
#include "reference.hpp"

namespace quadrat {
namespace {

const nlohmann::json& reference() { return test_support::reference_file("posthoc.json"); }

// statsmodels 0.13 multipletests (tests/reference/generate_posthoc.py) on invented and seeded
// families, including ties, p = 0 and p = 1. Every method is a closed form of sorted p-values, so
// the tolerance is a few units of rounding: 1e-12 relative.
TEST(AdjustP, AgreesWithStatsmodels) {
    const auto ref = reference();
    for (const auto& c : ref["adjust"]) {
        const std::vector<double> p = c["p"].get<std::vector<double>>();
        for (const auto& keyword : adjustment_methods().list()) {
            const std::vector<double> expected = c["adjusted"][keyword].get<std::vector<double>>();
            const std::vector<double> got = adjust_p(p, parse_adjustment(keyword));
            ASSERT_EQ(got.size(), expected.size());
            for (std::size_t i = 0; i < got.size(); ++i)
                EXPECT_NEAR(got[i], expected[i], 1e-12 * std::max(1e-300, std::abs(expected[i])) + 1e-300)
                    << c["name"] << " " << keyword << " #" << i;
        }
    }
}

// Holm (1979), Scand. J. Statist. 6, 65–70, definition, by hand: p = (0.01, 0.04, 0.03), m = 3, sorted
// (0.01, 0.03, 0.04) → 3·0.01, max(0.03, 2·0.03), max(0.06, 1·0.04) = (0.03, 0.06, 0.06).
// Hochberg (1988), Biometrika 75, 800–802, step-up: running minimum from the top of
// (3·0.01, 2·0.03, 1·0.04) = (0.03, 0.04, 0.04). Tolerance 1e-15: one multiplication each.
TEST(AdjustP, PublishedDefinitionsByHand) {
    const std::vector<double> p = {0.01, 0.04, 0.03};
    const auto holm = adjust_p(p, Adjustment::holm);
    EXPECT_NEAR(holm[0], 0.03, 1e-15);
    EXPECT_NEAR(holm[1], 0.06, 1e-15);
    EXPECT_NEAR(holm[2], 0.06, 1e-15);
    const auto hochberg = adjust_p(p, Adjustment::hochberg);
    EXPECT_NEAR(hochberg[0], 0.03, 1e-15);
    EXPECT_NEAR(hochberg[1], 0.04, 1e-15);
    EXPECT_NEAR(hochberg[2], 0.04, 1e-15);
    // Benjamini & Hochberg (1995), JRSS B 57, 289–300, step-up m·p(i)/i: (0.03, 0.04, 0.04).
    const auto benjamini_hochberg = adjust_p(p, Adjustment::benjamini_hochberg);
    EXPECT_NEAR(benjamini_hochberg[0], 0.03, 1e-15);
    EXPECT_NEAR(benjamini_hochberg[1], 0.04, 1e-15);
    EXPECT_NEAR(benjamini_hochberg[2], 0.04, 1e-15);
    // Šidák single step with p = 1e-12, m = 3: 1 − (1 − p)³ = 3e-12 − 3e-24 …; relative 1e-12 needs log1p.
    const auto sidak = adjust_p(std::vector<double>{1e-12, 0.5, 1.0}, Adjustment::sidak);
    EXPECT_NEAR(sidak[0], 3e-12, 1e-23);
    EXPECT_NEAR(sidak[1], 0.875, 1e-15);
    EXPECT_EQ(sidak[2], 1.0);
}

// Common practice, no source: p exactly 0 stays 0 and p exactly 1 stays 1 under every method;
// an adjusted p never falls below its p and never exceeds 1.
TEST(AdjustP, ZeroAndOneAndBounds) {
    const std::vector<double> p = {0.0, 1.0, 0.2, 0.2, 0.9};
    for (const auto& keyword : adjustment_methods().list()) {
        const auto q = adjust_p(p, parse_adjustment(keyword));
        EXPECT_EQ(q[0], 0.0) << keyword;
        EXPECT_EQ(q[1], 1.0) << keyword;
        for (std::size_t i = 0; i < p.size(); ++i) {
            EXPECT_GE(q[i], p[i]) << keyword;
            EXPECT_LE(q[i], 1.0) << keyword;
        }
        EXPECT_EQ(q[2], q[3]) << keyword << ": tied p-values get the same adjusted value";
    }
}

TEST(AdjustP, RefusesOutsideZeroOneAndUnknownMethod) {
    EXPECT_THROW(adjust_p(std::vector<double>{0.2, 1.5}, Adjustment::holm), Refusal);
    EXPECT_THROW(adjust_p(std::vector<double>{-0.01}, Adjustment::benjamini_hochberg), Refusal);
    EXPECT_THROW(adjust_p(std::vector<double>{std::nan("")}, Adjustment::benjamini_hochberg), Refusal);
    EXPECT_THROW(parse_adjustment("fdr"), Refusal);
    EXPECT_EQ(parse_adjustment(""), Adjustment::holm);
    EXPECT_EQ(parse_adjustment("Benjamini-Hochberg"), Adjustment::benjamini_hochberg);
    EXPECT_TRUE(adjust_p(std::vector<double>{}, Adjustment::hommel).empty());
    EXPECT_THROW(adjust_p(std::vector<double>(hommel_limit + 1, 0.5), Adjustment::hommel), Refusal);
}

// The cell function keeps the shape: blanks stay blank and are not counted (m = 2 here).
TEST(AdjustPCells, KeepsShapeAndBlanks) {
    const auto* f = addin::find_function("adjustP");
    ASSERT_NE(f, nullptr);
    Range r;
    r.rows = 2;
    r.columns = 2;
    r.is_reference = true;
    r.cells = {Cell::make_number(0.01), Cell{}, Cell::make_text(""), Cell::make_number(0.04)};
    const Table t = addin::call_fenced(*f, {r, Range::scalar(Cell::make_text("bonferroni"))});
    ASSERT_EQ(t.size(), 2u);
    ASSERT_EQ(t[0].size(), 2u);
    // Bonferroni with m = 2 (blanks not counted): 2·0.01, 2·0.04. Tolerance 1e-15.
    EXPECT_NEAR(std::get<double>(t[0][0]), 0.02, 1e-15);
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[0][1]));
    EXPECT_TRUE(std::holds_alternative<std::monostate>(t[1][0]));
    EXPECT_NEAR(std::get<double>(t[1][1]), 0.08, 1e-15);
    // Default method is holm: (2·0.01, max(0.02, 0.04)).
    const Table h = addin::call_fenced(*f, {r, Range::omitted_argument()});
    EXPECT_NEAR(std::get<double>(h[1][1]), 0.04, 1e-15);
}

TEST(AdjustPCells, RefusesTextAndOutOfRange) {
    const auto* f = addin::find_function("adjustP");
    const Table text = addin::call_fenced(*f, {Range::text_column({"0.01", "n/a"}), Range::omitted_argument()});
    ASSERT_EQ(text.size(), 1u);
    EXPECT_EQ(std::get<std::string>(text[0][0]), "A1 holds text ('0.01'); pvalues takes p-values from 0 to 1 or blank cells");
    const Table big = addin::call_fenced(*f, {Range::column({0.2, 1.2}), Range::omitted_argument()});
    EXPECT_EQ(std::get<std::string>(big[0][0]), "A2 holds 1.2; a p-value lies between 0 and 1");
    const Table none = addin::call_fenced(*f, {Range::column({}), Range::omitted_argument()});
    EXPECT_TRUE(std::holds_alternative<std::string>(none[0][0]));
}

}  // namespace
}  // namespace quadrat
