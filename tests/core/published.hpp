// What the tests of published worked examples share: a printed figure is matched to its printed
// digits, by our value and by the reference library's value alike.
#pragma once

#include <cmath>
#include <string>

#include <gtest/gtest.h>

namespace quadrat::test_support {

// Both `ours` and `library` (from the committed generator) round to `printed`: each within half a
// unit in the last printed digit, `half_unit`.
inline void expect_printed(double ours, double library, double printed, double half_unit, const std::string& what) {
    EXPECT_LE(std::fabs(ours - printed), half_unit) << what << ": ours " << ours << ", printed " << printed;
    EXPECT_LE(std::fabs(library - printed), half_unit) << what << ": library " << library << ", printed " << printed;
}

}  // namespace quadrat::test_support
