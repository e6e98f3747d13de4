#!/usr/bin/python3
"""Public data sets of published worked examples, and what the reference libraries give on them.
Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):

    /usr/bin/python3 tests/reference/generate_published_examples.py

writes tests/reference/published_examples.json beside this script. Each data set below is a classic public
data set named with the book or paper that prints it. The published figures themselves are not in
this file: they stand in tests/core/published_compare_test.cpp and published_models_test.cpp, each
with its source on the line above the check, and those tests hold both our value and the library
value written here to the printed digits. Where no library has the method (the exact null
distributions of the signed-rank and sign tests and of Kendall's tau), the value is counted here
in exact fractions from its definition.
"""
import json
import os
from fractions import Fraction
from itertools import permutations

import numpy as np
import pandas as pd
import scipy
import scipy.stats as st
import statsmodels
import statsmodels.api as sm
from statsmodels.formula.api import ols
from statsmodels.stats.multitest import multipletests

OUT = {"generator": "tests/reference/generate_published_examples.py",
       "scipy": scipy.__version__, "statsmodels": statsmodels.__version__}


def flt(xs):
    return [float(x) for x in xs]


# ----------------------------------------------------------------------------------------------
# One-way layouts

# Montgomery, D. C. (2001), Design and Analysis of Experiments, 5th ed., Wiley, Example 3.1:
# etch rate (Å/min) of a plasma etching tool at four RF power settings, five wafers each.
ETCH = {"names": ["160 W", "180 W", "200 W", "220 W"],
        "values": [[575, 542, 530, 539, 570], [565, 593, 590, 579, 610],
                   [600, 651, 610, 637, 629], [725, 700, 715, 685, 710]]}

# NIST/SEMATECH e-Handbook of Statistical Methods, §7.4.3 (one-way ANOVA worked example, three
# levels of a factor, five observations each), reused in §7.4.7 for Tukey's method.
NIST_ONEWAY = {"names": ["level 1", "level 2", "level 3"],
               "values": [[6.9, 5.4, 5.8, 4.6, 4.0], [8.3, 6.8, 7.8, 9.2, 6.5],
                          [8.0, 10.5, 8.1, 6.9, 9.3]]}

# Montgomery, D. C. & Runger, G. C. (2003), Applied Statistics and Probability for Engineers,
# 3rd ed., Wiley, Example 13-1: tensile strength (psi) of paper at four hardwood concentrations.
TENSILE = {"names": ["5%", "10%", "15%", "20%"],
           "values": [[7, 8, 15, 11, 9, 10], [12, 17, 13, 18, 19, 15],
                      [14, 18, 19, 17, 16, 18], [19, 25, 22, 23, 18, 20]]}


def oneway(data):
    g = [np.array(v, float) for v in data["values"]]
    grand = np.concatenate(g).mean()
    f = st.f_oneway(*g)
    h = st.kruskal(*g)
    k, n = len(g), sum(len(v) for v in g)
    ss_between = sum(len(v) * (v.mean() - grand) ** 2 for v in g)
    ss_within = sum(((v - v.mean()) ** 2).sum() for v in g)
    ms_within = ss_within / (n - k)
    out = dict(data)
    out.update({"f": float(f.statistic), "f_p": float(f.pvalue), "ss_between": float(ss_between),
                "ss_within": float(ss_within), "ms_within": float(ms_within),
                "df_within": n - k, "h": float(h.statistic), "h_p": float(h.pvalue)})
    # Tukey's honestly significant difference (equal n): q(0.95; k, N − k)·√(MS_within/n).
    if len({len(v) for v in g}) == 1:
        q = float(st.studentized_range.ppf(0.95, k, n - k))
        out["tukey_q"] = q
        out["tukey_half_width"] = q * float(np.sqrt(ms_within / len(g[0])))
    return out


OUT["oneway"] = {"etch": oneway(ETCH), "nist": oneway(NIST_ONEWAY), "tensile": oneway(TENSILE)}


# ----------------------------------------------------------------------------------------------
# Paired: Darwin's Zea mays

# Darwin (1876), The Effects of Cross and Self Fertilisation, as given by Fisher, R. A. (1935),
# The Design of Experiments, ch. III: 15 pairs of plants, height of the crossed minus the
# self-fertilised plant in eighths of an inch.
ZEA_MAYS = [49, -67, 8, 16, 6, 23, 28, 41, 14, 29, 56, 24, 75, 60, -48]


def signed_rank_exact_two_sided(d):
    """Exact P of the signed-rank statistic without ties: count the 2^n sign assignments."""
    n = len(d)
    ranks = {v: i + 1 for i, v in enumerate(sorted(abs(x) for x in d))}
    assert len(ranks) == n, "no ties in |d|"
    t_plus = sum(ranks[abs(x)] for x in d if x > 0)
    counts = [1]  # counts[t] = number of subsets of {1..n} with rank sum t
    for r in range(1, n + 1):
        new = counts + [0] * r
        for t, c in enumerate(counts):
            new[t + r] += c
        counts = new
    total = 2 ** n
    low = min(t_plus, n * (n + 1) // 2 - t_plus)
    tail = Fraction(sum(counts[: low + 1]), total)
    return t_plus, min(Fraction(1), 2 * tail)


def sign_exact_two_sided(d):
    n = sum(1 for x in d if x != 0)
    k = sum(1 for x in d if x > 0)
    low = min(k, n - k)
    tail = Fraction(sum(binom(n, i) for i in range(low + 1)), 2 ** n)
    return k, n, min(Fraction(1), 2 * tail)


def binom(n, k):
    out = 1
    for i in range(k):
        out = out * (n - i) // (i + 1)
    return out


t_plus, sr_p = signed_rank_exact_two_sided(ZEA_MAYS)
k_pos, n_sign, sign_p = sign_exact_two_sided(ZEA_MAYS)
tt = st.ttest_1samp(ZEA_MAYS, 0.0)
OUT["zea_mays"] = {
    "differences": flt(ZEA_MAYS),
    "mean": float(np.mean(ZEA_MAYS)), "t": float(tt.statistic), "t_p": float(tt.pvalue),
    "t_plus": t_plus, "signed_rank_p_fraction": [sr_p.numerator, sr_p.denominator],
    "signed_rank_p": float(sr_p),
    "scipy_signed_rank_p": float(st.wilcoxon(ZEA_MAYS, method="exact").pvalue),
    "positive": k_pos, "n_sign": n_sign, "sign_p_fraction": [sign_p.numerator, sign_p.denominator],
    "sign_p": float(sign_p), "scipy_sign_p": float(st.binomtest(k_pos, n_sign).pvalue),
}


# ----------------------------------------------------------------------------------------------
# ADJUST.P: Benjamini & Hochberg (1995), JRSS B 57, 289–300, §4, the 15 p-values of their example.

BENJAMINI_HOCHBERG_1995 = [0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459,
           0.3240, 0.4262, 0.5719, 0.6528, 0.7590, 1.000]
OUT["benjamini_hochberg_1995"] = {"p": BENJAMINI_HOCHBERG_1995}
for method, key in [("bonferroni", "bonferroni"), ("holm", "holm"), ("simes-hochberg", "hochberg"),
                    ("hommel", "hommel"), ("fdr_bh", "benjamini-hochberg"), ("fdr_by", "benjamini-yekutieli"), ("sidak", "sidak")]:
    with np.errstate(divide="ignore"):  # Šidák takes log1p(−p), −inf for p = 1, which gives 1
        OUT["benjamini_hochberg_1995"][key] = flt(multipletests(BENJAMINI_HOCHBERG_1995, 0.05, method)[1])


# ----------------------------------------------------------------------------------------------
# RELATE.CORRELATION: Anscombe, F. J. (1973), Graphs in statistical analysis, The American
# Statistician 27, 17–21, Table 1: four data sets of 11 (x, y) pairs.

X123 = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5]
ANSCOMBE = {
    "I": (X123, [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68]),
    "II": (X123, [9.14, 8.14, 8.74, 8.77, 9.26, 8.10, 6.13, 3.10, 9.13, 7.26, 4.74]),
    "III": (X123, [7.46, 6.77, 12.74, 7.11, 7.81, 8.84, 6.08, 5.39, 8.15, 6.42, 5.73]),
    "IV": ([8, 8, 8, 8, 8, 8, 8, 19, 8, 8, 8], [6.58, 5.76, 7.71, 8.84, 8.47, 7.04, 5.25, 12.50, 5.56, 7.91, 6.89]),
}
OUT["anscombe"] = {}
for name, (x, y) in ANSCOMBE.items():
    r = st.pearsonr(x, y)
    ci = r.confidence_interval(0.95)  # Fisher's z, SciPy ≥ 1.9
    ols_fit = sm.OLS(y, sm.add_constant(np.array(x, float))).fit()
    OUT["anscombe"][name] = {"x": flt(x), "y": flt(y), "r": float(r.statistic), "p": float(r.pvalue),
                             "ci_low": float(ci.low), "ci_high": float(ci.high),
                             "estimate": flt(ols_fit.params), "std_error": flt(ols_fit.bse),
                             "r_squared": float(ols_fit.rsquared)}


def kendall_exact_two_sided(y):
    """x = 1..n, y a permutation: the exact two-sided p of tau from all n! permutations."""
    n = len(y)

    def inversions(p):
        return sum(1 for i in range(n) for j in range(i + 1, n) if p[i] > p[j])

    observed = inversions(y)
    pairs = n * (n - 1) // 2
    dist = [0] * (pairs + 1)
    for p in permutations(range(n)):
        dist[inversions(p)] += 1
    low = min(observed, pairs - observed)
    tail = Fraction(sum(dist[: low + 1]), sum(dist))
    tau = Fraction(pairs - 2 * observed, pairs)
    return tau, min(Fraction(1), 2 * tail), dist


# A small ranking counted by hand: x = 1..5 against y = 2, 1, 4, 3, 5 (two discordant pairs).
KENDALL_Y = [2, 1, 4, 3, 5]
tau, kp, dist = kendall_exact_two_sided([v - 1 for v in KENDALL_Y])
OUT["kendall_n5"] = {"x": [1.0, 2.0, 3.0, 4.0, 5.0], "y": flt(KENDALL_Y),
                     "tau": float(tau), "p_fraction": [kp.numerator, kp.denominator], "p": float(kp),
                     "inversion_counts": dist,
                     "scipy_tau": float(st.kendalltau([1, 2, 3, 4, 5], KENDALL_Y).statistic),
                     "scipy_p": float(st.kendalltau([1, 2, 3, 4, 5], KENDALL_Y, method="exact").pvalue),
                     "scipy_rho": float(st.spearmanr([1, 2, 3, 4, 5], KENDALL_Y).statistic)}


# ----------------------------------------------------------------------------------------------
# FIT.LOGISTIC: Dalal, Fowlkes & Hoadley (1989), JASA 84, 945–957, Table 1: the 23 space-shuttle
# flights before the Challenger accident, launch temperature (°F) and the number of the six field
# O-rings with thermal distress.

TEMPERATURE = [66, 70, 69, 68, 67, 72, 73, 70, 57, 63, 70, 78, 67, 53, 67, 75, 70, 81, 76, 79, 75, 76, 58]
DISTRESSED = [0, 1, 0, 0, 0, 0, 0, 0, 1, 1, 1, 0, 0, 2, 0, 0, 0, 0, 0, 0, 2, 0, 1]
X = sm.add_constant(np.array(TEMPERATURE, float))
binomial = sm.GLM(np.column_stack([DISTRESSED, [6 - d for d in DISTRESSED]]), X,
                  family=sm.families.Binomial()).fit(tol=1e-13, maxiter=100)
# (statsmodels' default IRLS tolerance, 1e-8 on the deviance, leaves the standard errors good to only
# about 4e-7 relative here; the tighter tolerance settles them to the last digits.)
OUT["challenger"] = {
    "temperature": flt(TEMPERATURE), "distressed": DISTRESSED,
    "binomial_estimate": flt(binomial.params), "binomial_std_error": flt(binomial.bse),
}


# ----------------------------------------------------------------------------------------------
# FIT.FACTORIAL: Montgomery (2001), Design and Analysis of Experiments, 5th ed., Example 5.1:
# battery life (hours) for three plate materials at three temperatures (°F), four batteries each.

BATTERY = {
    ("1", "15"): [130, 155, 74, 180], ("1", "70"): [34, 40, 80, 75], ("1", "125"): [20, 70, 82, 58],
    ("2", "15"): [150, 188, 159, 126], ("2", "70"): [136, 122, 106, 115], ("2", "125"): [25, 70, 58, 45],
    ("3", "15"): [138, 110, 168, 160], ("3", "70"): [174, 120, 150, 139], ("3", "125"): [96, 104, 82, 60],
}
rows = [(m, t, float(v)) for (m, t), vs in BATTERY.items() for v in vs]
frame = pd.DataFrame(rows, columns=["material", "temperature", "life"])
table = sm.stats.anova_lm(ols("life ~ C(material) * C(temperature)", frame).fit(), typ=2)
OUT["battery"] = {
    "y": [r[2] for r in rows], "a": [r[0] for r in rows], "b": [r[1] for r in rows],
    "ss": flt(table["sum_sq"]), "df": flt(table["df"]), "f": flt(table["F"][:3]),
    "p": flt(table["PR(>F)"][:3]),
}


# ----------------------------------------------------------------------------------------------
# COMPARE.COUNTS and COMPARE.EXPECTED

# Agresti, A. (2007), An Introduction to Categorical Data Analysis, 2nd ed., Wiley, Table 2.5:
# party identification by gender (General Social Survey).
PARTY = [[762, 327, 468], [484, 239, 477]]
OUT["counts"] = {}
for name, t in [("party", PARTY)]:
    x2 = st.chi2_contingency(t, correction=False)
    g2 = st.chi2_contingency(t, correction=False, lambda_="log-likelihood")
    OUT["counts"][name] = {"counts": t, "chi_square": float(x2[0]), "chi_square_p": float(x2[1]),
                           "df": int(x2[2]), "g": float(g2[0]), "g_p": float(g2[1])}

# Mendel (1866): round-yellow, wrinkled-yellow, round-green, wrinkled-green seeds of the dihybrid
# cross, against 9:3:3:1.
MENDEL = [315, 108, 101, 32]
mendel = st.chisquare(MENDEL, np.array([9, 3, 3, 1]) / 16 * sum(MENDEL))
OUT["mendel"] = {"observed": flt(MENDEL), "expected": [9.0, 3.0, 3.0, 1.0],
                 "chi_square": float(mendel.statistic), "p": float(mendel.pvalue)}


def main():
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "published_examples.json")
    with open(path, "w") as fh:
        json.dump(OUT, fh, indent=1, sort_keys=True)
        fh.write("\n")


if __name__ == "__main__":
    main()
