#!/usr/bin/python3
"""Reference values for the categorical family (COMPARE.COUNTS, COMPARE.EXPECTED, FIT.LOGISTIC,
FIT.FACTORIAL). Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):

    /usr/bin/python3 tests/reference/generate_categorical.py

writes tests/reference/categorical.json beside this script. Every data set is an invented field
scenario or is drawn from a generator with a fixed seed. Where no library has the method (the
Freeman-Halton exact test on r x c tables), the value is computed here from the published formula
in exact rational arithmetic.
"""
import json
import math
import os
from fractions import Fraction
from itertools import product

import numpy as np
import scipy
import scipy.stats as st
from scipy.stats.contingency import association, expected_freq

OUT = {"generator": "tests/reference/generate_categorical.py",
       "scipy": scipy.__version__}


def fnum(x):
    return float(x)


# ----------------------------------------------------------------------------------------------
# COMPARE.COUNTS

def freeman_halton_p(table):
    """Freeman & Halton (1951): sum of P(table) over all tables with the observed margins whose
    probability is no larger than the observed one (relative tolerance 1e-7), in exact fractions."""
    R, C = len(table), len(table[0])
    rows = [sum(r) for r in table]
    cols = [sum(table[i][j] for i in range(R)) for j in range(C)]
    N = sum(rows)
    f = math.factorial
    const = Fraction(math.prod(f(r) for r in rows) * math.prod(f(c) for c in cols), f(N))

    def prob(t):
        return const / math.prod(f(x) for row in t for x in row)

    p_obs = prob(table)
    bound = p_obs * Fraction(10**7 + 1, 10**7)
    total = Fraction(0)

    def columns_of(col_total, remaining):
        # every way to split col_total among rows within the remaining row totals
        def rec(i, left):
            if i == R - 1:
                if left <= remaining[i]:
                    yield (left,)
                return
            for v in range(0, min(left, remaining[i]) + 1):
                for rest in rec(i + 1, left - v):
                    yield (v,) + rest
        yield from rec(0, col_total)

    def rec_cols(j, remaining, cols_so_far):
        nonlocal total
        if j == C - 1:
            t = [list(r) for r in zip(*(cols_so_far + [tuple(remaining)]))]
            p = prob(t)
            if p <= bound:
                total += p
            return
        for col in columns_of(cols[j], remaining):
            rec_cols(j + 1, [remaining[i] - col[i] for i in range(R)], cols_so_far + [col])

    rec_cols(0, rows, [])
    return float(total)


count_tables = {
    # Tea tasting (Fisher's lady): 4 cups of each kind, 3 of each guessed right.
    "tea": [[3, 1], [1, 3]],
    # Mayfly nymphs present/absent in riffle and pool kick samples (invented).
    "mayfly_2x2": [[23, 9], [12, 21]],
    # A 2x2 with an empty cell: invasive snail found at 0 of 7 upstream sites (invented).
    "snail_zero": [[0, 7], [5, 4]],
    # Habitat (riffle, run, pool) by dominant substrate (gravel, sand, silt, bedrock) (invented).
    "substrate_3x4": [[12, 7, 3, 9], [5, 14, 8, 2], [6, 3, 15, 11]],
    # Marsh zone by bird guild, 2x3 (invented).
    "guild_2x3": [[23, 12, 5], [9, 14, 17]],
    # Small r x c tables for the Freeman-Halton exact test (invented).
    "small_2x3": [[3, 1, 0], [1, 3, 4]],
    "small_3x3": [[2, 0, 1], [1, 3, 0], [0, 1, 4]],
    # Huge counts: regional survey totals (invented), far beyond any integer product of 32 bits.
    "huge_2x2": [[1000000000, 1200000000], [1100000000, 900000000]],
}
# Random 2x2 tables with a fixed seed, for Fisher across a range of sizes and imbalances.
rng = np.random.default_rng(20261202)
for k in range(12):
    scale = [5, 20, 200, 3000][k % 4]
    count_tables[f"random_2x2_{k}"] = rng.integers(0, scale, size=(2, 2)).tolist()

counts = {}
for name, t in count_tables.items():
    a = np.array(t, dtype=float)
    if (a.sum(axis=0) == 0).any() or (a.sum(axis=1) == 0).any():
        continue
    entry = {"table": t}
    chi2, p, dof, exp = st.chi2_contingency(a, correction=False)
    entry["chi-square"] = {"statistic": fnum(chi2), "p": fnum(p), "df": int(dof)}
    g, pg, _, _ = st.chi2_contingency(a, correction=False, lambda_="log-likelihood")
    entry["g"] = {"statistic": fnum(g), "p": fnum(pg), "df": int(dof)}
    if a.shape == (2, 2):
        y, py, _, _ = st.chi2_contingency(a, correction=True)
        entry["yates"] = {"statistic": fnum(y), "p": fnum(py), "df": 1}
        if a.sum() < 2**30:
            entry["fisher"] = {"p": fnum(st.fisher_exact(a.astype(np.int64), alternative="two-sided")[1])}
    elif a.sum() <= 30:
        entry["fisher"] = {"p": freeman_halton_p(t), "source": "Freeman-Halton, exact fractions"}
    entry["effect"] = fnum(association(a.astype(np.int64), method="cramer"))
    entry["n"] = fnum(a.sum())
    e = expected_freq(a)
    entry["smallest expected count"] = fnum(e.min())
    entry["cells expected below 5"] = int((e < 5).sum())
    counts[name] = entry
OUT["counts"] = counts

# ----------------------------------------------------------------------------------------------
# COMPARE.EXPECTED

expected_cases = {
    # Sex ratio of a trapped vole sample against 1:1 (invented).
    "sex_ratio": ([58, 42], [1, 1]),
    # Four colour morphs of a beetle against a 9:3:3:1 ratio (invented).
    "morphs_9331": ([301, 110, 95, 38], [9, 3, 3, 1]),
    # Nest boxes used per side of a wood, equal shares (expected omitted) (invented).
    "boxes_equal": ([12, 19, 25, 8], None),
    # Expected given as proportions that do not sum to the observed total.
    "proportions": ([30, 45, 25], [0.25, 0.5, 0.25]),
}
expected = {}
for name, (obs, exp) in expected_cases.items():
    o = np.array(obs, dtype=float)
    e = np.full(len(o), o.sum() / len(o)) if exp is None else np.array(exp, float) / sum(exp) * o.sum()
    chi2, p = st.chisquare(o, e)
    expected[name] = {"observed": obs, "expected": exp, "statistic": fnum(chi2), "p": fnum(p),
                      "df": len(o) - 1, "n": fnum(o.sum()), "smallest expected count": fnum(e.min())}
OUT["expected"] = expected


# ----------------------------------------------------------------------------------------------
# FIT.LOGISTIC: statsmodels Logit, Newton with a tight tolerance

import statsmodels.api as sm  # noqa: E402

OUT["statsmodels"] = sm.__version__


def logistic_case(y, xs, names, level=0.95):
    X = sm.add_constant(np.column_stack(xs))
    res = sm.Logit(np.asarray(y, float), X).fit(method="newton", tol=1e-14, maxiter=200, disp=0)
    assert res.mle_retvals["converged"]
    ci = np.exp(res.conf_int(alpha=1 - level))
    # statsmodels fits the null model by a second optimisation (llnull, converged only to its
    # default tolerance, about 1e-10 relative); the intercept-only maximum has the closed form
    # -2 sum(y log ybar + (1 - y) log(1 - ybar)), used here for the null deviance, the LR test
    # and McFadden's pseudo-R².
    yy = np.asarray(y, float)
    ybar = yy.mean()
    null_dev = -2 * np.sum(yy * np.log(ybar) + (1 - yy) * np.log(1 - ybar))
    dev = -2 * res.llf
    return {
        "y": list(map(float, y)), "xs": [list(map(float, x)) for x in xs], "names": names, "level": level,
        "estimate": res.params.tolist(), "std_error": res.bse.tolist(), "z": res.tvalues.tolist(),
        "p": res.pvalues.tolist(), "or_low": ci[:, 0].tolist(), "or_high": ci[:, 1].tolist(),
        "deviance": fnum(dev), "null_deviance": fnum(null_dev),
        "statistic": fnum(null_dev - dev), "df": fnum(res.df_model),
        "lr_p": fnum(st.chi2.sf(null_dev - dev, res.df_model)),
        "aic": fnum(res.aic), "pseudo_r_squared": fnum(1 - dev / null_dev), "n": int(res.nobs),
        "statsmodels_llnull_deviance": fnum(-2 * res.llnull),
    }


rng = np.random.default_rng(7101)
# Brook trout present (1) or absent (0) at 60 stream reaches against water temperature (deg C)
# and dissolved oxygen (mg/L) (invented, drawn with a fixed seed).
temp = np.round(rng.uniform(8, 22, 60), 1)
oxygen = np.round(rng.normal(8, 1.5, 60), 2)
eta = 6 - 0.45 * temp + 0.6 * (oxygen - 8)
trout = (rng.uniform(size=60) < 1 / (1 + np.exp(-eta))).astype(int)
# Mussel found at 40 sites against depth (m), one predictor.
depth = np.round(rng.uniform(0.2, 3.0, 40), 2)
mussel = (rng.uniform(size=40) < 1 / (1 + np.exp(-(-2.0 + 1.3 * depth)))).astype(int)
# Badly scaled: a fern present at 80 plots against elevation (m, 1200-1800) and canopy cover (0-1).
elevation = np.round(rng.uniform(1200, 1800, 80), 0)
canopy = np.round(rng.uniform(0, 1, 80), 3)
fern = (rng.uniform(size=80) < 1 / (1 + np.exp(-(-9 + 0.006 * elevation + 1.5 * canopy)))).astype(int)

OUT["logistic"] = {
    "trout": logistic_case(trout, [temp, oxygen], ["temperature", "oxygen"]),
    "mussel": logistic_case(mussel, [depth], ["depth"], level=0.90),
    "fern": logistic_case(fern, [elevation, canopy], ["elevation", "canopy"]),
}

# ----------------------------------------------------------------------------------------------
# FIT.FACTORIAL: statsmodels ols + anova_lm (typ=2; typ=3 with sum-to-zero contrasts)

import pandas as pd  # noqa: E402
from statsmodels.formula.api import ols  # noqa: E402
from statsmodels.stats.anova import anova_lm  # noqa: E402


def anova_rows(table, names, resid):
    rows = []
    for name in names:
        r = table.loc[name]
        rows.append({"ss": fnum(r["sum_sq"]), "df": fnum(r["df"]), "f": fnum(r["F"]), "p": fnum(r["PR(>F)"]),
                     "partial_eta_squared": fnum(r["sum_sq"] / (r["sum_sq"] + table.loc[resid]["sum_sq"]))})
    r = table.loc[resid]
    rows.append({"ss": fnum(r["sum_sq"]), "df": fnum(r["df"])})
    return rows


def factorial_case(y, a, b):
    df = pd.DataFrame({"y": y, "a": a, "b": b})
    t2 = anova_lm(ols("y ~ C(a) * C(b)", df).fit(), typ=2)
    t3 = anova_lm(ols("y ~ C(a, Sum) * C(b, Sum)", df).fit(), typ=3)
    return {"y": list(map(float, y)), "a": list(a), "b": list(b),
            "type2": anova_rows(t2, ["C(a)", "C(b)", "C(a):C(b)"], "Residual"),
            "type3": anova_rows(t3, ["C(a, Sum)", "C(b, Sum)", "C(a, Sum):C(b, Sum)"], "Residual")}


rng = np.random.default_rng(3303)
# Plant biomass (g) by fertiliser (none, low, high) and watering (dry, wet), unequal cell sizes
# (invented, drawn with a fixed seed).
a, b, y = [], [], []
means = {("none", "dry"): 10, ("none", "wet"): 13, ("low", "dry"): 12, ("low", "wet"): 17,
         ("high", "dry"): 13, ("high", "wet"): 21}
for (fa, fb), size in zip(means, [4, 6, 5, 7, 3, 6]):
    for v in rng.normal(means[(fa, fb)], 2.0, size):
        a.append(fa); b.append(fb); y.append(round(float(v), 2))
order = rng.permutation(len(y))
biomass = factorial_case([y[i] for i in order], [a[i] for i in order], [b[i] for i in order])
# Snail density (per m2) by season (spring, autumn) and site (four sites), unbalanced, weak effects.
a, b, y = [], [], []
for season in ["spring", "autumn"]:
    for k, site in enumerate(["S1", "S2", "S3", "S4"]):
        size = int(rng.integers(3, 8))
        for v in rng.normal(40 + 2 * k + (3 if season == "autumn" else 0), 6.0, size):
            a.append(season); b.append(site); y.append(round(float(v), 1))
snails = factorial_case(y, a, b)


def type2_by_projection(y, a, b):
    """Type II sums of squares as distances between nested least-squares fits (numpy lstsq on
    sum-to-zero effect columns), for a design with an empty cell where anova_lm's dummy design
    is singular."""
    y = np.asarray(y, float)
    la, lb = list(dict.fromkeys(a)), list(dict.fromkeys(b))

    def effect(levels, labels):
        X = np.zeros((len(labels), len(levels) - 1))
        for i, v in enumerate(labels):
            k = levels.index(v)
            if k == len(levels) - 1:
                X[i, :] = -1
            else:
                X[i, k] = 1
        return X

    A, B = effect(la, a), effect(lb, b)
    AB = np.column_stack([A[:, i] * B[:, j] for i in range(A.shape[1]) for j in range(B.shape[1])])
    one = np.ones((len(y), 1))

    def fit(*blocks):
        X = np.column_stack((one,) + blocks)
        beta, _, rank, _ = np.linalg.lstsq(X, y, rcond=None)
        return X @ beta, rank

    full, rf = fit(A, B, AB)
    add, ra = fit(A, B)
    oa, rank_a = fit(A)
    ob, rank_b = fit(B)
    res_ss, res_df = float(np.sum((y - full) ** 2)), len(y) - rf
    rows = []
    for big, small, dfb, dfs in [(add, ob, ra, rank_b), (add, oa, ra, rank_a), (full, add, rf, ra)]:
        ss, dfe = float(np.sum((big - small) ** 2)), dfb - dfs
        F = ss / dfe / (res_ss / res_df)
        rows.append({"ss": ss, "df": float(dfe), "f": F, "p": fnum(st.f.sf(F, dfe, res_df)),
                     "partial_eta_squared": ss / (ss + res_ss)})
    rows.append({"ss": res_ss, "df": float(res_df)})
    return rows


# Three grazing levels by three soil types with one combination never sampled (invented).
a, b, y = [], [], []
for i, graze in enumerate(["none", "light", "heavy"]):
    for j, soil in enumerate(["clay", "loam", "sand"]):
        if (graze, soil) == ("heavy", "sand"):
            continue
        for v in rng.normal(20 + 3 * i - 2 * j + (2 if i == j else 0), 2.5, 4 + (i + j) % 3):
            a.append(graze); b.append(soil); y.append(round(float(v), 2))
empty_cell = {"y": y, "a": a, "b": b, "type2": type2_by_projection(y, a, b)}

OUT["factorial"] = {"biomass": biomass, "snails": snails, "grazing_empty_cell": empty_cell}

if __name__ == "__main__":
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "categorical.json")
    with open(path, "w") as fh:
        json.dump(OUT, fh, indent=1, sort_keys=True)
        fh.write("\n")
    print("wrote", path)
