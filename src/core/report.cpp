#include "report.hpp"

#include <cmath>
#include <cstdio>
#include <variant>

#include "advisor.hpp"
#include "data.hpp"
#include "limits.hpp"
#include "outliers.hpp"
#include "refusal.hpp"

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

namespace {

double number_of(const TestResult& r, const std::string& label) { return r.number(label); }

// "95% CI 0.05 to 0.19" from `<prefix>ci-low`/`<prefix>ci-high`, or the text those cells hold
// ("too few values for a 95% interval"); empty when the result has no interval.
std::string interval_words(const TestResult& r, const std::string& low_label, const std::string& high_label, double level) {
    const CellValue* low = r.find(low_label);
    const CellValue* high = r.find(high_label);
    if (!low || !high) return {};
    if (const auto* text = std::get_if<std::string>(low)) return *text;
    const double lo = number_of(r, low_label), hi = number_of(r, high_label);
    if (!std::isfinite(lo) || !std::isfinite(hi)) return {};
    return format_level(level) + " CI " + format_number(lo) + " to " + format_number(hi);
}

std::string statistic_words(const TestResult& r, const ReportWords& w) {
    const double x = number_of(r, "statistic");
    switch (w.statistic_form) {
        case ReportWords::Statistic::none: return {};
        case ReportWords::Statistic::positive_count:
            return format_df(x) + " of " + format_df(number_of(r, "differences used")) + " differences positive";
        case ReportWords::Statistic::whole: return w.statistic_symbol + " = " + format_df(x);
        case ReportWords::Statistic::number: break;
    }
    std::string s = w.statistic_symbol;
    if (w.statistic_df) {
        s += "(" + format_df(number_of(r, "df"));
        if (r.find("df2")) s += ", " + format_df(number_of(r, "df2"));
        s += ")";
    }
    return s + " = " + format_number(x);
}

}  // namespace

std::string render_report(const TestResult& r) {
    const ReportWords& w = r.words;
    if (!w.shown) throw Refusal("output 'report' is not available for " + r.test);
    std::string s = (w.title.empty() ? r.test : w.title) + ": ";
    std::string part;  // the comma-separated run before the first semicolon
    const auto then = [&part](const std::string& piece) {
        if (piece.empty()) return;
        if (!part.empty()) part += ", ";
        part += piece;
    };
    if (!w.note.empty()) {
        then(w.note);
    } else {
        if (!w.lead_symbol.empty()) {
            std::string lead = w.lead_symbol + " = " + format_number(number_of(r, w.lead_quantity));
            if (w.lead_interval) {
                const std::string ci = interval_words(r, "ci-low", "ci-high", w.level);
                if (!ci.empty()) lead += " (" + ci + ")";
            }
            then(lead);
        }
        then(statistic_words(r, w));
        then(format_p(number_of(r, "p")));
    }
    if (w.n_after_p) then("n = " + format_df(number_of(r, "n")));
    s += part;
    if (!w.estimate.empty()) {
        const std::string& q = w.estimate_quantity;
        const bool plain = q == "estimate";
        const std::string ci =
            interval_words(r, plain ? "ci-low" : q + " ci-low", plain ? "ci-high" : q + " ci-high", w.level);
        std::string inside = w.direction;
        if (!ci.empty()) inside += (inside.empty() ? "" : "; ") + ci;
        s += "; " + w.estimate + " " + format_number(number_of(r, q));
        if (!inside.empty()) s += " (" + inside + ")";
    }
    if (!w.effect.empty()) s += (w.estimate.empty() ? "; " : ", ") + w.effect + " = " + format_number(number_of(r, "effect"));
    if (!w.extra.empty()) {
        const CellValue* v = r.find(w.extra_quantity);
        std::string value = "undefined";
        if (const double* x = v ? std::get_if<double>(v) : nullptr) value = format_number(*x);
        if (const std::string* text = v ? std::get_if<std::string>(v) : nullptr) value = *text;
        s += "; " + w.extra + " " + value;
    }
    if (!w.per_group.empty()) {
        const std::string suffix = ": " + w.per_group_quantity;
        std::string list;
        for (const auto& q : r.quantities) {
            if (q.label.size() <= suffix.size() || q.label.compare(q.label.size() - suffix.size(), suffix.size(), suffix) != 0)
                continue;
            std::string value = "undetermined";
            if (const double* x = std::get_if<double>(&q.value)) value = format_number(*x);
            else if (const CellValue* bound = r.find(q.label + " bound"); bound && std::holds_alternative<std::string>(*bound))
                value = std::get<std::string>(*bound);
            list += (list.empty() ? "" : ", ") + q.label.substr(0, q.label.size() - suffix.size()) + " " + value;
        }
        s += "; " + w.per_group + " " + list;
    }
    if (!w.closing.empty()) s += " (" + w.closing + ")";
    return s;
}

std::string render_suggestion(const Advice& a) {
    std::string s = "Suggested: " + a.function;
    if (!a.method.empty()) s += ", method '" + a.method + "'";
    if (a.transform != "none" && !a.transform.empty()) s += ", transform '" + a.transform + "'";
    if (!a.posthoc.empty()) s += ", then COMPARE.POSTHOC with '" + a.posthoc + "'";
    return s + ".";
}

std::string render_advice(const Advice& a) {
    std::string s = render_suggestion(a) + " Why: ";
    for (std::size_t i = 0; i < a.steps.size(); ++i) {
        if (i) s += "; ";
        s += a.steps[i].found + ", so " + a.steps[i].decision;
    }
    return s + ". A guide, not a verdict: check it against the study design.";
}

// ---- LIMIT.* and CHECK.OUTLIERS -----------------------------------------------------------------

std::string ordinal(std::size_t whole) {
    const std::size_t last = whole % 10, last_two = whole % 100;
    const char* suffix = (last_two >= 11 && last_two <= 13) ? "th" : last == 1 ? "st" : last == 2 ? "nd" : last == 3 ? "rd" : "th";
    return std::to_string(whole) + suffix;
}

namespace {

// "the largest value", "the 2nd largest value", "the 3rd smallest value" for order statistic k of n.
std::string order_words(std::size_t k, std::size_t n) {
    if (k == n) return "the largest value";
    if (k == 1) return "the smallest value";
    return 2 * k > n ? "the " + ordinal(n + 1 - k) + " largest value" : "the " + ordinal(k) + " smallest value";
}

// "the smallest and largest values", "the 3rd smallest and 3rd largest values".
std::string outer_words(std::size_t j) {
    return j == 1 ? std::string("the smallest and largest values")
                  : "the " + ordinal(j) + " smallest and " + ordinal(j) + " largest values";
}

std::size_t whole_of(double x) { return std::isfinite(x) && x >= 0 ? static_cast<std::size_t>(std::llround(x)) : 0; }

}  // namespace

std::string render_limit_report(const LimitResult& limit) {
    const TestResult& t = limit.result;
    const std::string value = limit.two_sided
                                  ? format_number(t.number("limit-low")) + " to " + format_number(t.number("limit-high"))
                                  : format_number(t.number("limit"));
    std::string details;
    const auto then = [&details](const std::string& piece) { details += (details.empty() ? "" : ", ") + piece; };
    for (const LimitDetail& d : limit.details) {
        const double x = t.number(d.quantity);
        std::string shown;
        switch (d.form) {
            case LimitDetail::Form::number: shown = format_number(x); break;
            case LimitDetail::Form::whole: shown = format_df(x); break;
            case LimitDetail::Form::typed: shown = number_label(x); break;
            case LimitDetail::Form::order: shown = order_words(whole_of(x), whole_of(t.number("n"))); break;
            case LimitDetail::Form::outer: shown = outer_words(whole_of(x)); break;
        }
        then(d.before + shown + d.after);
    }
    then("n = " + format_df(t.number("n")));
    return limit.title + ": " + value + " (" + details + ")";
}

std::string render_outlier_note(const OutlierCheck& c) {
    const std::string check = "a flagged value is one to check (a transcription slip, a fouled probe), not one to delete";
    if (c.method == "fences")
        return "fences at " + format_number(c.low_fence) + " and " + format_number(c.high_fence) +
               " (quartiles ∓ 1.5 × IQR); " + check;
    return "the test assumes the other values come from a normal distribution; " + check;
}

std::string render_outlier_report(const OutlierCheck& c) {
    std::vector<std::string> flagged;
    for (const Suspect& s : c.suspects)
        if (s.outlier) flagged.push_back(format_number(s.value));
    std::string values;
    for (const auto& v : flagged) values += (values.empty() ? "" : ", ") + v;
    const std::string many = count_of(c.count, "value");
    std::string scope, found;
    if (c.method == "fences") {
        found = c.count == 0 ? std::string("no value beyond the fences") : many + " beyond the fences (" + values + ")";
    } else {
        const std::string alpha = "α = " + number_label(c.alpha);
        scope = c.method == "generalized-esd" ? "up to " + std::to_string(c.most) + " values at " + alpha + ", " : alpha + ", ";
        if (c.count == 0 && !c.suspects.empty()) {
            const Suspect& first = c.suspects.front();
            found = "no clear sign of an outlier (" + std::string(c.method == "grubbs" ? "G" : "R1") + " = " +
                    format_number(first.statistic) + " against a critical " + format_number(first.critical) + ")";
        } else {
            found = many + (c.count == 1 ? " stands out (" : " stand out (") + values + ")";
        }
    }
    return c.test + ", " + scope + "n = " + std::to_string(c.n) + ": " + found + "; " + render_outlier_note(c) + ".";
}

}  // namespace quadrat
