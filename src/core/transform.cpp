#include "transform.hpp"

#include <cmath>

#include "keywords.hpp"
#include "refusal.hpp"

namespace quadrat {

// Transform keeps the order of the keyword table transforms().
Transform parse_transform(const std::string& keyword) { return static_cast<Transform>(transforms().index(keyword, "transform")); }

std::string transform_keyword(Transform t) { return transforms().words()[static_cast<std::size_t>(t)].word; }

namespace {
// The domain of each transform, and the words of its refusal.
bool in_domain(Transform t, double x) {
    switch (t) {
        case Transform::log:
        case Transform::log10: return x > 0;
        case Transform::log_plus_one: return x > -1;
        case Transform::sqrt: return x >= 0;
        case Transform::none: break;
    }
    return true;
}

const char* domain_words(Transform t) {
    switch (t) {
        case Transform::log:
        case Transform::log10: return "values > 0";
        case Transform::log_plus_one: return "values > -1";
        case Transform::sqrt: return "values >= 0";
        case Transform::none: break;
    }
    return "";
}

double forward(Transform t, double x) {
    switch (t) {
        case Transform::log: return std::log(x);
        case Transform::log10: return std::log10(x);
        case Transform::log_plus_one: return std::log1p(x);
        case Transform::sqrt: return std::sqrt(x);
        case Transform::none: break;
    }
    return x;
}
}  // namespace

void apply_transform(Transform t, std::vector<std::vector<double>>& groups) {
    if (t == Transform::none) return;
    std::size_t outside = 0;
    for (const auto& g : groups)
        for (double x : g) outside += in_domain(t, x) ? 0 : 1;
    if (outside > 0)
        throw Refusal("transform '" + transform_keyword(t) + "' needs " + domain_words(t) + "; " +
                      std::to_string(outside) + (outside == 1 ? " value is not" : " values are not"));
    for (auto& g : groups)
        for (double& x : g) x = forward(t, x);
}

void apply_transform(Transform t, std::vector<double>& values) {
    std::vector<std::vector<double>> one{std::move(values)};
    apply_transform(t, one);
    values = std::move(one.front());
}

double back_transform(Transform t, double x) {
    switch (t) {
        case Transform::log: return std::exp(x);
        case Transform::log10: return std::pow(10.0, x);
        case Transform::log_plus_one: return std::expm1(x);
        case Transform::sqrt: return x * x;
        case Transform::none: break;
    }
    return x;
}

double parse_level(double given, bool omitted) {
    if (omitted) return 0.95;
    if (std::isfinite(given) && given > 0 && given < 1) return given;
    if (std::isfinite(given) && given >= 50 && given <= 99.9) return given / 100.0;
    throw Refusal("level must be a fraction such as 0.95 or a percentage from 50 to 99.9");
}

}  // namespace quadrat
