#!/usr/bin/python3
"""Published check values for the group comparisons that have no printed worked example at hand:
Welch's one-way ANOVA, Games–Howell, Dunn, pairwise Welch t, pairwise rank-sum tests, the
Hodges–Lehmann shift and pseudo-median, and the Holm, Hommel, Benjamini–Yekutieli and Šidák
adjustments. Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):

    /usr/bin/python3 tests/reference/generate_published_compare.py

writes tests/reference/published_compare.json beside this script. Two kinds of case:

- Worked by hand: small invented data on which each method's definition gives a value in closed
  form; here it is counted again in exact fractions where the method allows.
- At a published table point: a sample built so that the statistic equals a critical value of a
  standard table (quoted from memory in TABLE below); then its p must be the table's level. The
  script REFUSES to write the fixture unless SciPy (or exact enumeration, for the rank tables)
  reproduces each quoted table value to its printed digits, so a wrong memory fails here, loudly,
  and is never tuned.

Beside each case stands what a reference library gives on the same data: SciPy or statsmodels
where they have the method, otherwise the published formula computed here (said so in the key).
The tests (tests/core/published_compare_test.cpp) name the source of each check.
"""
import json
import math
import os
import sys
from fractions import Fraction
from itertools import combinations

import mpmath
import numpy as np
import scipy
import scipy.stats as st
import statsmodels
from statsmodels.stats.multitest import multipletests
from statsmodels.stats.oneway import anova_oneway

from generate_compare import signed_rank_counts  # (T⁺ counts over the 2ⁿ sign patterns, Wilcoxon 1945)

mpmath.mp.dps = 40
OUT = {"generator": "tests/reference/generate_published_compare.py",
       "scipy": scipy.__version__, "statsmodels": statsmodels.__version__}


def flt(xs):
    return [float(x) for x in xs]


def frac(x):
    return [x.numerator, x.denominator]


def refuse(message):
    sys.exit("generate_published_compare.py: REFUSED, fixture not written: " + message)


def confirm(name, quoted, computed):
    """A table value quoted from memory must equal the library's value rounded to the printed digits."""
    decimals = len(quoted.split(".")[1]) if "." in quoted else 0
    if round(computed, decimals) != float(quoted):
        refuse(f"{name}: the table value {quoted} (from memory) is not {computed!r} rounded to {decimals} decimals")
    return {"printed": quoted, "library": computed}


# ----------------------------------------------------------------------------------------------
# Table values quoted from memory, each confirmed below against SciPy or exact enumeration.

TABLE = {}
# Pearson & Hartley (1966), Biometrika Tables for Statisticians I, Table 18 (F): upper 5% point of F(2, 8).
TABLE["f_2_8_05"] = confirm("F(0.95; 2, 8)", "4.46", float(st.f.ppf(0.95, 2, 8)))
# Harter (1960) / Pearson & Hartley (1966) Table 29: upper 5% point of the studentized range, k = 3, 8 df.
TABLE["q_3_8_05"] = confirm("q(0.95; 3, 8)", "4.04", float(st.studentized_range.ppf(0.95, 3, 8)))
# Student's t table (e.g. Pearson & Hartley Table 12): two-sided 5% point, 8 df.
TABLE["t_8_025"] = confirm("t(0.975; 8)", "2.306", float(st.t.ppf(0.975, 8)))
# Standard normal table: two-sided 5% point.
TABLE["z_025"] = confirm("z(0.975)", "1.960", float(st.norm.ppf(0.975)))


def rank_sum_counts(m, n):
    """Number of the C(m+n, m) arrangements with each value of U (Mann & Whitney 1947), by enumeration."""
    counts = [0] * (m * n + 1)
    for first in combinations(range(m + n), m):
        counts[sum(first) - m * (m - 1) // 2] += 1  # ranks 0-based: U = Σ ranks − m(m−1)/2
    return counts


def critical_lower(counts, alpha_half):
    """Largest c with P(S ≤ c) ≤ α/2 (the table's critical value: reject when S ≤ c)."""
    total = sum(counts)
    c, cumulative = -1, 0
    for v, k in enumerate(counts):
        cumulative += k
        if Fraction(cumulative, total) > alpha_half:
            break
        c = v
    return c


# Mann–Whitney table (e.g. Siegel 1956, Nonparametric Statistics, Table K; from memory): two-sided
# 5% critical U for n₁ = n₂ = 5 is 2.
U55 = rank_sum_counts(5, 5)
if critical_lower(U55, Fraction(1, 40)) != 2:
    refuse("Mann–Whitney critical U for n1 = n2 = 5, two-sided 5%, is not 2 by enumeration")
TABLE["u_5_5_05"] = {"printed": "2", "enumerated": critical_lower(U55, Fraction(1, 40))}
# Wilcoxon signed-rank table (e.g. Siegel 1956, Table G; from memory): two-sided 5% critical T for n = 15 is 25.
T15 = signed_rank_counts(15)
if critical_lower(T15, Fraction(1, 40)) != 25:
    refuse("signed-rank critical T for n = 15, two-sided 5%, is not 25 by enumeration")
TABLE["t_15_05"] = {"printed": "25", "enumerated": critical_lower(T15, Fraction(1, 40))}
OUT["table"] = TABLE


def exact_rank_sum_p(u, m, n):
    counts = rank_sum_counts(m, n)
    total = sum(counts)
    low = min(u, m * n - u)
    return min(Fraction(1), 2 * Fraction(sum(counts[: low + 1]), total))


# Shared invented groups: three groups of five, the same spread (s² = 2.5), means 3, 5 and 7.
BY_HAND = {"names": ["low", "middle", "high"], "values": [[1, 2, 3, 4, 5], [3, 4, 5, 6, 7], [5, 6, 7, 8, 9]]}
SPREAD_2_5 = [-2, -1, 0, 1, 2]   # s² = 10/4 = 2.5
SPREAD_5 = [-3, -1, 0, 1, 3]     # s² = 20/4 = 5, so s²/n = 1 for n = 5


# ----------------------------------------------------------------------------------------------
# Welch's one-way ANOVA (Welch 1951, Biometrika 38, 330–336)

def welch_exact(groups):
    """Welch's F and df2 from the definition, in exact fractions."""
    k = len(groups)
    means = [Fraction(sum(g), len(g)) for g in groups]
    variances = [sum((Fraction(x) - m) ** 2 for x in g) / (len(g) - 1) for g, m in zip(groups, means)]
    w = [Fraction(len(g)) / v for g, v in zip(groups, variances)]
    total = sum(w)
    centre = sum(wi * m for wi, m in zip(w, means)) / total
    a = sum(wi * (m - centre) ** 2 for wi, m in zip(w, means)) / (k - 1)
    lam = sum((1 - wi / total) ** 2 / (len(g) - 1) for wi, g in zip(w, groups))
    return a / (1 + Fraction(2 * (k - 2), k * k - 1) * lam), Fraction(k * k - 1) / (3 * lam)


def classic_f_exact(groups):
    k, n = len(groups), sum(len(g) for g in groups)
    means = [Fraction(sum(g), len(g)) for g in groups]
    grand = Fraction(sum(sum(g) for g in groups), n)
    between = sum(len(g) * (m - grand) ** 2 for g, m in zip(groups, means)) / (k - 1)
    within = sum(sum((Fraction(x) - m) ** 2 for x in g) for g, m in zip(groups, means)) / (n - k)
    return between / within


def statsmodels_welch(values):
    r = anova_oneway([np.array(v, float) for v in values], use_var="unequal", welch_correction=True)
    return {"statsmodels_f": float(r.statistic), "statsmodels_df2": float(r.df[1]), "statsmodels_p": float(r.pvalue)}


f_w, df2 = welch_exact(BY_HAND["values"])
f_classic = classic_f_exact(BY_HAND["values"])
if f_w != Fraction(12, 13) * f_classic or df2 != 8 or f_w != Fraction(96, 13):
    refuse("Welch's F on the hand-worked groups is not 12/13 of the classic F = 8 with df2 = 8")
# For F on (2, ν) df the upper tail is (1 + 2x/ν)^(−ν/2): at x = 96/13, ν = 8 it is (37/13)⁻⁴.
welch_p = Fraction(13, 37) ** 4
if abs(float(welch_p) - st.f.sf(float(f_w), 2, 8)) > 1e-15:
    refuse("the closed form of the F(2, 8) tail disagrees with scipy")
OUT["welch_by_hand"] = dict(BY_HAND, f=frac(f_w), classic_f=frac(f_classic), df2=frac(df2), p=frac(welch_p),
                            **statsmodels_welch(BY_HAND["values"]))

# Built: equal n (5) and equal spread, so F_W = 12F/13 with the classic F = Σ(x̄ᵢ − x̄)²·5/2/2.5 = 2δ²
# for means 10, 10 + δ, 10 + 2δ; δ chosen so that F_W = 4.46.
delta = math.sqrt(4.46 * 13 / 24)
built = [[10 + i * delta + s for s in SPREAD_2_5] for i in range(3)]
OUT["welch_table_point"] = dict({"names": ["a", "b", "c"], "values": built, "point": 4.46},
                                **statsmodels_welch(built))
if abs(OUT["welch_table_point"]["statsmodels_f"] / 4.46 - 1) > 1e-12:
    refuse("the built Welch sample does not have F = 4.46")


# ----------------------------------------------------------------------------------------------
# Games–Howell (Games & Howell 1976, J. Educational Statistics 1, 113–125). No library at hand has
# it (statsmodels 0.13 and SciPy 1.10 do not): the published formula, computed here with SciPy's
# studentized range: q = |x̄ᵢ − x̄ⱼ| / √((sᵢ²/nᵢ + sⱼ²/nⱼ)/2), Welch–Satterthwaite df, k groups.

def games_howell_formula(values):
    k = len(values)
    rows = []
    for i, j in combinations(range(k), 2):
        a, b = np.array(values[i], float), np.array(values[j], float)
        vi, vj = a.var(ddof=1) / len(a), b.var(ddof=1) / len(b)
        df = (vi + vj) ** 2 / (vi ** 2 / (len(a) - 1) + vj ** 2 / (len(b) - 1))
        q = abs(a.mean() - b.mean()) / math.sqrt((vi + vj) / 2)
        rows.append({"q": q, "df": df, "p": float(st.studentized_range.sf(q, k, df)),
                     "critical": float(st.studentized_range.ppf(0.95, k, df))})
    return rows


OUT["games_howell_by_hand"] = dict(BY_HAND, formula=games_howell_formula(BY_HAND["values"]))
# Built: s²/n = 1 in each group of 5, so q of a pair is the difference of its means: 4.04.
built = [[20 + s for s in SPREAD_5], [20 + 4.04 + s for s in SPREAD_5], [35 + s for s in SPREAD_5]]
OUT["games_howell_table_point"] = {"names": ["a", "b", "c"], "values": built, "point": 4.04,
                                   "density": float(st.studentized_range.pdf(4.04, 3, 8)),
                                   "formula": games_howell_formula(built)}
if abs(OUT["games_howell_table_point"]["formula"][0]["q"] / 4.04 - 1) > 1e-12:
    refuse("the built Games–Howell pair does not have q = 4.04")


# ----------------------------------------------------------------------------------------------
# Dunn (1964), Technometrics 6, 241–252: z = (R̄ᵢ − R̄ⱼ)/√(N(N+1)/12 · (1/nᵢ + 1/nⱼ)) without ties.
# Neither library has it: the formula here, z² in exact fractions and p = 2Φ(−|z|) by mpmath.

def dunn_formula(values):
    pooled = sorted(x for g in values for x in g)
    if len(set(pooled)) != len(pooled):
        refuse("the Dunn cases are meant to be untied")
    rank = {x: i + 1 for i, x in enumerate(pooled)}
    n = len(pooled)
    mean_rank = [Fraction(sum(rank[x] for x in g), len(g)) for g in values]
    rows = []
    for i, j in combinations(range(len(values)), 2):
        d = mean_rank[i] - mean_rank[j]
        z2 = d * d / (Fraction(n * (n + 1), 12) * (Fraction(1, len(values[i])) + Fraction(1, len(values[j]))))
        z = mpmath.sqrt(mpmath.mpf(z2.numerator) / z2.denominator) * (1 if d >= 0 else -1)
        rows.append({"mean_rank_difference": frac(d), "z_squared": frac(z2), "z": float(z),
                     "p": float(mpmath.erfc(abs(z) / mpmath.sqrt(2)))})
    p = [r["p"] for r in rows]
    for r, h in zip(rows, multipletests(p, method="holm")[1]):
        r["statsmodels_holm"] = float(h)
    return rows


DUNN_BY_HAND = {"names": ["low", "middle", "high"], "values": [[1, 2, 3], [4, 5, 6], [7, 8, 9]]}
OUT["dunn_by_hand"] = dict(DUNN_BY_HAND, formula=dunn_formula(DUNN_BY_HAND["values"]))
# Built: N = 50 values equal to their ranks; group a (8 values, mean rank 258/8 = 32.25) against
# group b (17 values, ranks 12..28, mean rank 20): SE² = 50·51/12 · (1/8 + 1/17) = 39.0625 = 6.25²,
# so z = 12.25/6.25 = 1.96 exactly. Group c holds the other 25 ranks.
a = [1, 2, 40, 41, 42, 43, 44, 45]
b = list(range(12, 29))
c = [r for r in range(1, 51) if r not in a and r not in b]
dunn_built = {"names": ["a", "b", "c"], "values": [a, b, c]}
OUT["dunn_table_point"] = dict(dunn_built, point=1.96, formula=dunn_formula(dunn_built["values"]))
if OUT["dunn_table_point"]["formula"][0]["z_squared"] != frac(Fraction(196, 100) ** 2):
    refuse("the built Dunn pair does not have z = 1.96 exactly")


# ----------------------------------------------------------------------------------------------
# Pairwise Welch t (Welch 1947; Satterthwaite 1946): scipy.stats.ttest_ind(equal_var=False) per pair,
# then statsmodels' Holm over the pairs.

def pairwise_t_reference(values):
    rows = []
    for i, j in combinations(range(len(values)), 2):
        r = st.ttest_ind(values[i], values[j], equal_var=False)
        rows.append({"t": float(r.statistic), "p": float(r.pvalue)})
    for r, h in zip(rows, multipletests([r["p"] for r in rows], method="holm")[1]):
        r["statsmodels_holm"] = float(h)
    return rows


OUT["pairwise_t_by_hand"] = dict(BY_HAND, scipy=pairwise_t_reference(BY_HAND["values"]))
# Built: s² = 2.5 in groups of 5, so the standard error √(2s²/n) is 1 and t is the difference: −2.306.
built = [[10 + s for s in SPREAD_2_5], [10 + 2.306 + s for s in SPREAD_2_5], [20 + s for s in SPREAD_2_5]]
OUT["pairwise_t_table_point"] = {"names": ["a", "b", "c"], "values": built, "point": 2.306,
                              "scipy": pairwise_t_reference(built)}
if abs(OUT["pairwise_t_table_point"]["scipy"][0]["t"] / -2.306 - 1) > 1e-12:
    refuse("the built t pair does not have t = −2.306")


# ----------------------------------------------------------------------------------------------
# Pairwise Wilcoxon–Mann–Whitney, each pair ranked on its own: U₁ = R₁ − n₁(n₁+1)/2 and the exact
# two-sided p counted over the C(n₁+n₂, n₁) arrangements; scipy.stats.mannwhitneyu(method='exact').

def pairwise_ranks_reference(values):
    rows = []
    for i, j in combinations(range(len(values)), 2):
        x, y = values[i], values[j]
        u = sum(1 for p in x for q in y if p > q)  # no ties: U₁ counts the pairs where the first is larger
        p = exact_rank_sum_p(u, len(x), len(y))
        r = st.mannwhitneyu(x, y, alternative="two-sided", method="exact")
        rows.append({"u": u, "p": frac(p), "scipy_u": float(r.statistic), "scipy_p": float(r.pvalue)})
    return rows


# Fully separated groups of three, the middle one first: U₁ = 9 for (middle, low), 0 for the others,
# and each exact p = 2/C(6, 3) = 0.1.
SEPARATED = {"names": ["middle", "low", "high"], "values": [[4, 5, 6], [1, 2, 3], [7, 8, 9]]}
OUT["pairwise_ranks_by_hand"] = dict(SEPARATED, exact=pairwise_ranks_reference(SEPARATED["values"]))
OUT["pairwise_ranks_by_hand"]["statsmodels_holm"] = flt(multipletests([0.1, 0.1, 0.1], method="holm")[1])
# At the table point n₁ = n₂ = 5: U₁ = 2 (first group ranks 1, 2, 3, 5, 6) and U₁ = 3 (1, 2, 3, 5, 7).
OUT["pairwise_ranks_table_point"] = [
    {"names": ["a", "b"], "values": [[1, 2, 3, 5, 6], [4, 7, 8, 9, 10]]},
    {"names": ["a", "b"], "values": [[1, 2, 3, 5, 7], [4, 6, 8, 9, 10]]},
]
for case in OUT["pairwise_ranks_table_point"]:
    case["exact"] = pairwise_ranks_reference(case["values"])


# ----------------------------------------------------------------------------------------------
# Hodges–Lehmann (1963), Ann. Math. Statist. 34, 598–611: the shift, median of the n₁n₂ differences,
# and the pseudo-median, median of the n(n+1)/2 Walsh averages, with the interval between the
# (c+1)-th smallest and (c+1)-th largest of them, c the exact critical value (Moses 1965; Lehmann
# 1975, Nonparametrics, §§2.6, 4.3). No library at hand has them: counted here in exact fractions.

def median(sorted_fractions):
    n = len(sorted_fractions)
    return (sorted_fractions[(n - 1) // 2] + sorted_fractions[n // 2]) / 2


# Invented: fish lengths (mm) below and above a weir, five each, no ties across the ten.
ABOVE, BELOW = [109, 111, 124, 131, 145], [105, 113, 114, 117, 123]
differences = sorted(Fraction(x - y) for x in ABOVE for y in BELOW)
c = TABLE["u_5_5_05"]["enumerated"]
u1 = sum(1 for x in ABOVE for y in BELOW if x > y)
OUT["shift"] = {"names": ["above", "below"], "values": [ABOVE, BELOW], "differences": flt(differences),
                "estimate": float(median(differences)), "ci_low": float(differences[c]),
                "ci_high": float(differences[len(differences) - 1 - c]), "u": u1,
                "p": frac(exact_rank_sum_p(u1, 5, 5)),
                "scipy_p": float(st.mannwhitneyu(ABOVE, BELOW, alternative="two-sided", method="exact").pvalue)}

# Darwin's Zea mays differences as given by Fisher (1935), The Design of Experiments, ch. III
# (the same data as published_examples.json): 15 differences, 120 Walsh averages.
ZEA_MAYS = [49, -67, 8, 16, 6, 23, 28, 41, 14, 29, 56, 24, 75, 60, -48]
walsh = sorted(Fraction(ZEA_MAYS[i] + ZEA_MAYS[j], 2) for i in range(15) for j in range(i, 15))
c = TABLE["t_15_05"]["enumerated"]
OUT["pseudo_median"] = {"differences": flt(ZEA_MAYS), "walsh": flt(walsh), "estimate": float(median(walsh)),
                        "ci_low": float(walsh[c]), "ci_high": float(walsh[len(walsh) - 1 - c])}


# ----------------------------------------------------------------------------------------------
# ADJUST.P on four p-values, from each method's definition in exact fractions, and statsmodels.

P4 = [Fraction(s) for s in ["0.04", "0.02", "0.10", "0.03"]]


def holm(p):
    m, run, out = len(p), Fraction(0), [None] * len(p)
    for r, i in enumerate(sorted(range(m), key=lambda i: p[i])):
        run = max(run, min(Fraction(1), (m - r) * p[i]))
        out[i] = run
    return out


def hommel(p):
    """Closed testing of Simes tests: the largest Simes p over every subset holding the hypothesis."""
    m, out = len(p), [Fraction(0)] * len(p)
    for size in range(1, m + 1):
        for subset in combinations(range(m), size):
            ps = sorted(p[i] for i in subset)
            simes = min(min(Fraction(1), size * ps[j] / (j + 1)) for j in range(size))
            for i in subset:
                out[i] = max(out[i], simes)
    return out


def benjamini_yekutieli(p):
    m, run, out = len(p), Fraction(1), [None] * len(p)
    c = sum(Fraction(1, i) for i in range(1, m + 1))
    order = sorted(range(m), key=lambda i: p[i])
    for r in range(m - 1, -1, -1):
        run = min(run, c * m * p[order[r]] / (r + 1))
        out[order[r]] = run
    return out


def sidak(p):
    return [1 - (1 - x) ** len(p) for x in p]


OUT["adjust"] = {"p": flt(P4)}
for key, exact, theirs in [("holm", holm, "holm"), ("hommel", hommel, "hommel"), ("benjamini-yekutieli", benjamini_yekutieli, "fdr_by"),
                           ("sidak", sidak, "sidak")]:
    values = exact(P4)
    library = multipletests(flt(P4), alpha=0.05, method=theirs)[1]
    if max(abs(float(v) - w) for v, w in zip(values, library)) > 1e-15:
        refuse(f"{key}: the exact fractions and statsmodels disagree")
    OUT["adjust"][key] = {"exact": [frac(v) for v in values], "statsmodels": flt(library)}


def main():
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "published_compare.json")
    with open(path, "w") as fh:
        json.dump(OUT, fh, indent=1, sort_keys=True)
        fh.write("\n")


if __name__ == "__main__":
    main()
