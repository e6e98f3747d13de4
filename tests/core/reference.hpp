// Reference values and how close a result comes to them: the committed fixtures
// (tests/reference/generate_*.py writes them), the NIST StRD files with their certified values
// (tests/data/nist-strd/), the relative error every comparison uses, and the log relative error
// (LRE) of the StRD tests.
#pragma once

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "core/refusal.hpp"

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

// `computed` within `tolerance` of `expected`, relative to |expected|; where |expected| is below
// `absolute_below` the tolerance is absolute there (1 for p-values and statistics near 0).
inline void expect_relative(double computed, double expected, double tolerance, const std::string& what,
                            double absolute_below = 1e-300) {
    EXPECT_NEAR(computed, expected, tolerance * std::max(absolute_below, std::fabs(expected))) << what;
}

// Log relative error, NIST's measure of StRD accuracy (tests/data/nist-strd/README.md):
// −log10 of the relative error, the absolute error where the certified value is 0, capped at the
// 15 digits NIST prints; 0 for a value that is not finite or has no correct digit.
inline double lre(double computed, double certified) {
    if (!std::isfinite(computed)) return 0.0;
    const double error = relative_error(computed, certified);
    if (error == 0) return 15.0;
    return std::clamp(-std::log10(error), 0.0, 15.0);
}

// One NIST StRD file (tests/data/nist-strd/<kind>/<set>.dat): the header with the certified values
// and the data rows (every line of numbers after the last "Data:" caption).
struct StrdFile {
    std::vector<std::string> header;
    std::vector<std::vector<double>> rows;

    // The numbers on the first header line that starts with `words` and holds any ("B3",
    // "Between", "Standard Deviation", "R-Squared", "Sample Mean"): certified values are found by
    // keyword, since AtmWtAg's sit one line lower than its header says.
    std::vector<double> certified(std::string_view words) const {
        for (const auto& line : header) {
            const auto start = line.find_first_not_of(' ');
            if (start == std::string::npos || line.compare(start, words.size(), words) != 0) continue;
            if (line.size() > start + words.size() && line[start + words.size()] != ' ') continue;
            const auto found = numbers_in(line.substr(start + words.size()));
            if (!found.empty()) return found;
        }
        return {};
    }

    // The words of `line` that are numbers, in order ("s:" and "(denom." are not).
    static std::vector<double> numbers_in(const std::string& line) {
        std::istringstream words(line);
        std::vector<double> out;
        for (std::string w; words >> w;) {
            char* end = nullptr;
            const double x = std::strtod(w.c_str(), &end);
            if (end != w.c_str() && *end == '\0') out.push_back(x);
        }
        return out;
    }
};

// `kind_and_set` as "linreg/Norris", "anova/SmLs01", "univariate/Lew".
inline StrdFile read_strd(const std::string& kind_and_set) {
    std::ifstream in(std::string(QUADRAT_STRD_DIR) + "/" + kind_and_set + ".dat");
    EXPECT_TRUE(in.good()) << kind_and_set << ": NIST StRD file not found under " << QUADRAT_STRD_DIR;
    std::vector<std::string> lines;
    for (std::string line; std::getline(in, line);) lines.push_back(line);
    std::size_t data_start = lines.size();
    for (std::size_t i = 0; i < lines.size(); ++i)
        if (lines[i].rfind("Data:", 0) == 0) data_start = i + 1;
    StrdFile file;
    file.header.assign(lines.begin(), lines.begin() + static_cast<std::ptrdiff_t>(std::min(data_start, lines.size())));
    for (std::size_t i = data_start; i < lines.size(); ++i) {
        auto row = StrdFile::numbers_in(lines[i]);
        if (!row.empty()) file.rows.push_back(std::move(row));  // skips blank lines and the rule under "Data: Y"
    }
    return file;
}

// The text of the refusal `call` throws, or "(no refusal)".
inline std::string refusal_text(auto&& call) {
    try {
        call();
    } catch (const Refusal& r) {
        return r.what();
    }
    return "(no refusal)";
}

}  // namespace quadrat::test_support
