// The `any`-block trim beside a clipped reference (src/addin/clip.hpp): behaviour checks, no
// numbers from a source.
#include <gtest/gtest.h>

#include <set>

#include "addin/clip.hpp"

namespace quadrat::addin {
namespace {

// A block of `rows` rows whose non-empty rows are listed.
std::function<bool(std::size_t)> filled(std::set<std::size_t> rows) {
    return [rows](std::size_t r) { return rows.count(r) == 0; };
}

TEST(ClipAnyBlock, AWholeColumnBesideAClippedReferenceKeepsItsRows) {
    // values B:B read down to row 40 of a 1,048,576-row column; groups A:A arrives whole, empty below.
    const std::vector<Clip> clips = {{1048576, 40}};
    EXPECT_EQ(rows_to_read(1048576, clips, filled({0, 5, 39})), 40u);
}

TEST(ClipAnyBlock, AnythingBelowTheClipKeepsTheWholeBlock) {
    const std::vector<Clip> clips = {{1000, 40}};
    EXPECT_EQ(rows_to_read(1000, clips, filled({3, 500})), 1000u);  // the function then refuses the mismatch
}

TEST(ClipAnyBlock, OnlyABlockOfExactlyTheSheetRowsIsCut) {
    const std::vector<Clip> clips = {{1000, 40}};
    EXPECT_EQ(rows_to_read(999, clips, filled({})), 999u);
    EXPECT_EQ(rows_to_read(1000, {}, filled({})), 1000u);
}

TEST(ClipAnyBlock, TheFirstFittingClipWins) {
    const std::vector<Clip> clips = {{1000, 10}, {1000, 60}};
    EXPECT_EQ(rows_to_read(1000, clips, filled({2, 30})), 60u);  // row 30 is below the first clip
    EXPECT_EQ(rows_to_read(1000, clips, filled({2})), 10u);
}

}  // namespace
}  // namespace quadrat::addin
