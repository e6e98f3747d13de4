#include "report.hpp"

#include <cmath>
#include <cstdio>

namespace quadrat {

namespace {
std::string printf_string(const char* format, double x) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, format, x);
    return buffer;
}
}  // namespace

std::string format_p(double p) {
    if (!std::isfinite(p)) return "p = n/a";
    if (p < 0.001) return "p < 0.001";
    return "p = " + printf_string("%.3f", p);
}

std::string format_number(double x) {
    if (!std::isfinite(x)) return std::isnan(x) ? "n/a" : (x > 0 ? "infinity" : "-infinity");
    const double a = std::fabs(x);
    if (a == 0) return "0.00";
    if (a >= 0.1) return printf_string("%.2f", x);
    if (a >= 1e-4) {
        // Three significant digits in fixed notation: 0.0123, 0.000123. The decimals follow the
        // value as rounded to three digits, so 0.0099996 shows 0.0100 (not 0.01000) and 0.09999,
        // which rounds to 0.1, takes the two-decimal form 0.10 (not 0.1000).
        int exponent = static_cast<int>(std::floor(std::log10(a)));
        if (std::round(a * std::pow(10.0, 2 - exponent)) >= 1000) ++exponent;  // 999.6 rounds to 1000
        if (exponent >= -1) return printf_string("%.2f", x);
        const int decimals = 2 - exponent;
        char format[16];
        std::snprintf(format, sizeof format, "%%.%df", decimals);
        return printf_string(format, x);
    }
    return printf_string("%.2e", x);
}

std::string format_df(double df) {
    if (std::isfinite(df) && df == std::round(df)) return printf_string("%.0f", df);
    return printf_string("%.1f", df);
}

std::string format_level(double level) {
    const double percent = level * 100.0;
    if (std::fabs(percent - std::round(percent)) < 1e-9) return printf_string("%.0f", percent) + "%";
    return printf_string("%.1f", percent) + "%";
}

}  // namespace quadrat
