// What the core tests share: the committed reference fixtures (tests/reference/generate_*.py
// writes them) and the relative-error checks every comparison with a reference uses.
#pragma once

#include <algorithm>
#include <cmath>
#include <fstream>
#include <map>
#include <string>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

namespace quadrat::test_support {

// tests/reference/<name>, parsed once per test run.
inline const nlohmann::json& reference_file(const std::string& name) {
    static std::map<std::string, nlohmann::json> parsed;
    auto found = parsed.find(name);
    if (found == parsed.end()) {
        std::ifstream in(std::string(QUADRAT_REFERENCE_DIR) + "/" + name);
        found = parsed.emplace(name, nlohmann::json::parse(in)).first;
    }
    return found->second;
}

// |got − want| / |want|, or |got| when the reference is exactly 0.
inline double relative_error(double got, double want) {
    if (want == 0) return std::fabs(got);
    return std::fabs(got - want) / std::fabs(want);
}

inline void expect_relative(double computed, double expected, double tolerance, const std::string& what) {
    EXPECT_NEAR(computed, expected, tolerance * std::max(1e-300, std::fabs(expected))) << what;
}

}  // namespace quadrat::test_support
