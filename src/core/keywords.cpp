#include "keywords.hpp"

#include <cctype>

#include "refusal.hpp"

namespace quadrat {

namespace {
std::string folded(const std::string& s) {
    std::size_t b = 0, e = s.size();
    while (b < e && std::isspace(static_cast<unsigned char>(s[b]))) ++b;
    while (e > b && std::isspace(static_cast<unsigned char>(s[e - 1]))) --e;
    std::string out;
    out.reserve(e - b);
    for (std::size_t i = b; i < e; ++i) out.push_back(static_cast<char>(std::tolower(static_cast<unsigned char>(s[i]))));
    return out;
}
}  // namespace

std::string join(const std::vector<std::string>& items, const std::string& separator) {
    std::string out;
    for (std::size_t i = 0; i < items.size(); ++i) {
        if (i) out += separator;
        out += items[i];
    }
    return out;
}

std::string match_keyword(const std::string& given, const std::vector<std::string>& valid, const std::string& argument) {
    const std::string key = folded(given);
    if (key.empty() && !valid.empty()) return valid.front();
    for (const auto& v : valid)
        if (folded(v) == key) return v;
    throw Refusal("unknown " + argument + " '" + given + "'; valid: " + join(valid));
}

}  // namespace quadrat
