// Multiple-comparison adjustment of p-values (ADJUST.P, and the `adjust` of COMPARE.POSTHOC).
#pragma once

#include <span>
#include <string>
#include <vector>

namespace quadrat {

enum class Adjustment { holm, bonferroni, hochberg, hommel, benjamini_hochberg, benjamini_yekutieli, sidak };

// The catalogue's keywords in its order; the first (holm) is the default.
Adjustment parse_adjustment(const std::string& keyword);  // blank is holm; unknown is a refusal
std::string adjustment_keyword(Adjustment method);
std::string adjustment_name(Adjustment method);  // "Holm", "Benjamini–Hochberg", … for reports

// Hommel's procedure costs O(m²); beyond this many p-values it is a refusal rather than a hang.
inline constexpr std::size_t hommel_limit = 5000;

// Adjusted p-values in the order given, for a family of m = p.size() p-values. Each p must lie in
// 0..1 (else a refusal). Every method but Hommel's is O(m log m).
//   bonferroni  min(1, m·p)
//   sidak       1 − (1 − p)^m, single-step (Šidák 1967, JASA 62, 626–633)
//   holm        step-down, max over j ≤ i of (m − j + 1)·p(j) (Holm 1979, Scand. J. Statist. 6, 65–70)
//   hochberg    step-up, min over j ≥ i of (m − j + 1)·p(j) (Hochberg 1988, Biometrika 75, 800–802)
//   hommel      closed Simes tests (Hommel 1988, Biometrika 75, 383–386), adjusted p-values by
//               Wright's algorithm (Wright 1992, Biometrics 48, 1005–1013)
//   benjamini-hochberg   min over j ≥ i of m·p(j)/j (Benjamini & Hochberg 1995, JRSS B 57, 289–300)
//   benjamini-yekutieli  benjamini-hochberg times Σ 1/i, i = 1..m (Benjamini & Yekutieli 2001,
//                        Ann. Statist. 29, 1165–1188)
std::vector<double> adjust_p(std::span<const double> p, Adjustment method);

}  // namespace quadrat
