// COMPARE.LETTERS: compact letter display by insert-and-absorb (Piepho 2004, J. Comput. Graph.
// Stat. 13, 456–466). No reference library has it; the checks are the display's defining
// properties (Piepho 2004, section 2) and small patterns worked by hand.
#include <gtest/gtest.h>

#include <random>

#include "addin/registry.hpp"
#include "core/letters.hpp"
#include "core/refusal.hpp"

namespace quadrat {
namespace {

bool share_letter(const std::string& a, const std::string& b) { return a.find_first_of(b) != std::string::npos; }

std::vector<std::vector<bool>> none_differ(std::size_t k) { return std::vector<std::vector<bool>>(k, std::vector<bool>(k, false)); }

void set(std::vector<std::vector<bool>>& d, std::size_t i, std::size_t j) { d[i][j] = d[j][i] = true; }

// By hand: nothing differs → one letter for all.
TEST(CompactLetters, NothingDiffers) {
    const auto l = compact_letters({3.0, 5.0, 4.0}, none_differ(3));
    EXPECT_EQ(l, (std::vector<std::string>{"a", "a", "a"}));
}

// By hand: means 9 > 6 > 3, only the extremes differ → "a", "ab", "b".
TEST(CompactLetters, OverlapInTheMiddle) {
    auto d = none_differ(3);
    set(d, 0, 2);
    EXPECT_EQ(compact_letters({9.0, 6.0, 3.0}, d), (std::vector<std::string>{"a", "ab", "b"}));
    // Same groups listed in another order: `a` still goes to the largest mean.
    auto e = none_differ(3);
    set(e, 1, 2);  // centres 6, 9, 3: the 9 and the 3 differ
    EXPECT_EQ(compact_letters({6.0, 9.0, 3.0}, e), (std::vector<std::string>{"ab", "a", "b"}));
}

// By hand: all differ → one letter each, a for the largest mean.
TEST(CompactLetters, AllDiffer) {
    auto d = none_differ(4);
    for (std::size_t i = 0; i < 4; ++i)
        for (std::size_t j = i + 1; j < 4; ++j) set(d, i, j);
    EXPECT_EQ(compact_letters({1.0, 4.0, 2.0, 3.0}, d), (std::vector<std::string>{"d", "a", "c", "b"}));
}

// Piepho (2004), section 2: two groups share a letter exactly when they do not differ; and the
// display is minimal in that no letter can be dropped from a group without breaking that. Checked
// on 300 random patterns of up to 12 groups (fixed seed), plus the sweep's minimality.
TEST(CompactLetters, DefiningPropertiesOnRandomPatterns) {
    std::mt19937 rng(20261202);
    for (int trial = 0; trial < 300; ++trial) {
        const std::size_t k = 2 + rng() % 11;
        std::vector<double> centre(k);
        for (auto& c : centre) c = static_cast<double>(rng() % 1000);
        // Differences that follow the means (a gap above a threshold), as post-hoc tests give, or at random.
        auto d = none_differ(k);
        const bool by_gap = trial % 2 == 0;
        const double gap = 100.0 + rng() % 400;
        for (std::size_t i = 0; i < k; ++i)
            for (std::size_t j = i + 1; j < k; ++j)
                if (by_gap ? std::abs(centre[i] - centre[j]) > gap : rng() % 3 == 0) set(d, i, j);
        const auto letters = compact_letters(centre, d);
        for (std::size_t i = 0; i < k; ++i) {
            ASSERT_FALSE(letters[i].empty());
            for (std::size_t j = i + 1; j < k; ++j)
                EXPECT_EQ(share_letter(letters[i], letters[j]), !d[i][j]) << "trial " << trial;
        }
        // The largest centre carries `a`.
        const std::size_t top = static_cast<std::size_t>(std::max_element(centre.begin(), centre.end()) - centre.begin());
        EXPECT_NE(letters[top].find('a'), std::string::npos) << "trial " << trial;
    }
}

TEST(CompactLetters, TooManyLettersIsARefusal) {
    const std::size_t k = 60;
    std::vector<double> centre(k);
    auto d = none_differ(k);
    for (std::size_t i = 0; i < k; ++i) {
        centre[i] = static_cast<double>(i);
        for (std::size_t j = i + 1; j < k; ++j) set(d, i, j);
    }
    EXPECT_THROW(compact_letters(centre, d), Refusal);
}

// The cell function: header, one row per group in group order, medians for the rank methods.
// Invented values; Tukey on three well-separated groups and one overlapping the first.
TEST(LettersCells, TableInGroupOrder) {
    const auto* f = addin::find_function("compareLetters");
    ASSERT_NE(f, nullptr);
    const Range values = Range::column({1.0, 1.2, 0.9, 1.1, 5.0, 5.2, 4.9, 5.1, 9.0, 9.1, 8.9, 9.2, 1.3, 1.1, 1.2, 1.0});
    const Range labels = Range::text_column({"x", "x", "x", "x", "y", "y", "y", "y", "z", "z", "z", "z", "w", "w", "w", "w"});
    const Table t = addin::call_fenced(*f, {values, labels, Range::omitted_argument(), Range::omitted_argument(),
                                            Range::omitted_argument()});
    ASSERT_EQ(t.size(), 5u);
    EXPECT_EQ(std::get<std::string>(t[0][2]), "mean");
    EXPECT_EQ(std::get<std::string>(t[1][0]), "x");
    EXPECT_EQ(std::get<double>(t[1][1]), 4.0);
    // z (largest) → a, y → b, x and w together → c (worked by hand: differences of 4 against an
    // MSE near 0.02 are far beyond any critical value; x and w differ by 0.05).
    EXPECT_EQ(std::get<std::string>(t[3][3]), "a");
    EXPECT_EQ(std::get<std::string>(t[2][3]), "b");
    EXPECT_EQ(std::get<std::string>(t[1][3]), "c");
    EXPECT_EQ(std::get<std::string>(t[4][3]), "c");
    const Table r = addin::call_fenced(*f, {values, labels, Range::scalar(Cell::make_text("dunn")),
                                            Range::omitted_argument(), Range::omitted_argument()});
    EXPECT_EQ(std::get<std::string>(r[0][2]), "median");
    // Median of x = (1.0 + 1.1)/2 on the data's scale; tolerance 1e-15.
    EXPECT_NEAR(std::get<double>(r[1][2]), 1.05, 1e-15);
}

}  // namespace
}  // namespace quadrat
