#!/usr/bin/python3
"""Reference values for COMPARE.BLOCKS and COMPARE.NESTED.

Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):
    /usr/bin/python3 tests/reference/generate_blocks.py
writes tests/reference/blocks.json beside this script.

Sources, case by case:
- Block ANOVA: statsmodels OLS with treatment and block factors (`value ~ C(group) + C(block)`,
  anova_lm typ=2) and AnovaRM (block as subject, group as the within factor) on the cell means;
  the cell means are taken here with plain Python (subsamples averaged, blocks missing a group
  dropped) before either library sees them.
- Friedman: scipy.stats.friedmanchisquare (tie-corrected); the Iman–Davenport F from its statistic
  and scipy.stats.f; Kendall's W = chi2/(b(k-1)).
- Conover's pairwise comparisons after Friedman: no library here has them; computed from Conover
  (1999, section 5.8, eq. 8) with the ranks from scipy.stats.rankdata, p from scipy.stats.t and the interval's t
  quantile from mpmath.
- Pairs for the block ANOVA and the two-group case: scipy.stats.ttest_rel, wilcoxon
  (zero_method='wilcox', method given explicitly), binomtest; Holm from
  statsmodels.stats.multitest.multipletests.
- Nested: the F of groups over units from scipy.stats.f_oneway on the unit means; the sums of
  squares of the nested ANOVA from the residuals of statsmodels OLS fits `value ~ C(group)` and
  `value ~ C(unit)` (units are nested, so the second spans the first); the variance components from the classical expected mean squares (Sokal & Rohlf,
  Biometry, ch. 10; n0 coefficients for unequal subsample counts) evaluated here in exact
  fractions from the raw readings, independently of the C++ code. No mixed model is fitted.

Data: the published examples are stored with their source (and marked from memory where they
are); the field cases are invented scenarios with a fixed seed.
"""
import json
import os
import random
from fractions import Fraction

import mpmath as mp
import numpy as np
import pandas as pd
import scipy.stats as st
import statsmodels.formula.api as smf
from statsmodels.stats.anova import AnovaRM, anova_lm
from statsmodels.stats.multitest import multipletests

LEVEL = 0.95
mp.mp.dps = 40


def t_quantile(upper, df):
    """The t quantile with upper tail `upper`, by mpmath (SciPy 1.10's t.isf is good to only about
    1e-9 relative at small df, DEVELOPERS.md)."""
    nu = mp.mpf(df)
    tail = lambda t: mp.betainc(nu / 2, mp.mpf(1) / 2, 0, nu / (nu + t * t), regularized=True) / 2
    return float(mp.findroot(lambda t: tail(t) - upper, st.t.isf(upper, df)))


def first_appearance(labels):
    seen = []
    for x in labels:
        if x not in seen:
            seen.append(x)
    return seen


def cell_table(values, groups, blocks):
    """Cell means of complete blocks (group order and block order by first appearance), and the
    counts COMPARE.BLOCKS reports."""
    g_order, b_order = first_appearance(groups), first_appearance(blocks)
    cells = {}
    for v, g, b in zip(values, groups, blocks):
        cells.setdefault((b, g), []).append(v)
    used, dropped, n, averaged = [], 0, 0, 0
    for b in b_order:
        if all((b, g) in cells for g in g_order):
            used.append(b)
            for g in g_order:
                n += len(cells[(b, g)])
                averaged += len(cells[(b, g)]) if len(cells[(b, g)]) > 1 else 0
        else:
            dropped += 1
    table = [[sum(cells[(b, g)]) / len(cells[(b, g)]) for g in g_order] for b in used]
    return g_order, used, table, {"n": n, "blocks used": len(used), "blocks dropped": dropped,
                                  "readings averaged": averaged}


def block_anova(g_order, used, table):
    rows = [{"value": table[i][j], "group": "g%d" % j, "block": "b%d" % i}
            for i in range(len(used)) for j in range(len(g_order))]
    df = pd.DataFrame(rows)
    fit = smf.ols("value ~ C(group) + C(block)", data=df).fit(method="qr")
    a = anova_lm(fit, typ=2)
    rm = AnovaRM(df, "value", "block", within=["group"]).fit().anova_table
    ss_g, ss_b, ss_e = a.loc["C(group)", "sum_sq"], a.loc["C(block)", "sum_sq"], a.loc["Residual", "sum_sq"]
    return {"statistic": a.loc["C(group)", "F"], "df": a.loc["C(group)", "df"], "df2": a.loc["Residual", "df"],
            "p": a.loc["C(group)", "PR(>F)"], "effect": ss_g / (ss_g + ss_e),
            "sum of squares (groups)": ss_g, "sum of squares (blocks)": ss_b, "sum of squares (residual)": ss_e,
            "anovarm F": rm.loc["group", "F Value"], "anovarm p": rm.loc["group", "Pr > F"],
            "means": [float(np.mean([row[j] for row in table])) for j in range(len(g_order))]}


def friedman(table):
    b, k = len(table), len(table[0])
    chi2, p = st.friedmanchisquare(*[[row[j] for row in table] for j in range(k)])
    out = {"statistic": chi2, "df": k - 1, "p": p, "effect": chi2 / (b * (k - 1))}
    f = (b - 1) * chi2 / (b * (k - 1) - chi2)
    out.update({"Iman–Davenport F": f, "Iman–Davenport df2": (b - 1) * (k - 1),
                "Iman–Davenport p": st.f.sf(f, k - 1, (b - 1) * (k - 1))})
    ranks = [st.rankdata(row) for row in table]
    out["rank sums"] = [float(sum(r[j] for r in ranks)) for j in range(k)]
    return out


def conover_pairs(table, level=LEVEL):
    """Conover (1999), section 5.8, eq. 8, with Holm-adjusted p."""
    b, k = len(table), len(table[0])
    ranks = [st.rankdata(row) for row in table]
    a1 = sum(float(x) ** 2 for r in ranks for x in r)
    R = [sum(float(r[j]) for r in ranks) for j in range(k)]
    df = (b - 1) * (k - 1)
    se = np.sqrt(2 * (b * a1 - sum(x * x for x in R)) / df)
    crit = t_quantile((1 - level) / 2, df)
    pairs = []
    for i in range(k):
        for j in range(i + 1, k):
            d = R[i] - R[j]
            pairs.append({"estimate": d / b, "ci-low": (d - crit * se) / b, "ci-high": (d + crit * se) / b,
                          "statistic": d / se, "p": 2 * st.t.sf(abs(d / se), df)})
    return holm(pairs)


def paired_t_pairs(table, level=LEVEL):
    k = len(table[0])
    pairs = []
    for i in range(k):
        for j in range(i + 1, k):
            d = np.array([row[i] - row[j] for row in table])
            t, p = st.ttest_rel([row[i] for row in table], [row[j] for row in table])
            se = d.std(ddof=1) / np.sqrt(len(d))
            crit = t_quantile((1 - level) / 2, len(d) - 1)
            pairs.append({"estimate": d.mean(), "ci-low": d.mean() - crit * se, "ci-high": d.mean() + crit * se,
                          "statistic": t, "p": p})
    return holm(pairs)


def holm(pairs):
    adjusted = multipletests([q["p"] for q in pairs], method="holm")[1]
    for q, a in zip(pairs, adjusted):
        q["adjusted p"] = a
    return pairs


def long_rows(g_names, b_names, table):
    values, groups, blocks = [], [], []
    for i, b in enumerate(b_names):
        for j, g in enumerate(g_names):
            values.append(table[i][j])
            groups.append(g)
            blocks.append(b)
    return values, groups, blocks


def block_case(values, groups, blocks, source):
    g_order, used, table, counts = cell_table(values, groups, blocks)
    case = {"source": source, "values": values, "groups": groups, "blocks": blocks, "counts": counts,
            "groups in order": g_order, "blocks used": used}
    if len(g_order) > 2:
        case["pooled"] = block_anova(g_order, used, table)
        case["ranks"] = friedman(table)
        case["pairs pooled"] = paired_t_pairs(table)
        case["pairs ranks"] = conover_pairs(table)
    return case


# ---------------------------------------------------------------- published examples
# Montgomery, Design and Analysis of Experiments (5th ed., Table 4-3; Table 5-1 of an earlier
# edition): hardness testing, four tips on four metal coupons (coupons are the blocks). Data as a
# course page reprints them (second-hand); printed ANOVA: SS tips 0.385, SS coupons 0.825, SS error
# 0.080, F = 14.44, p = 0.0009 (Type I table of that page).
HARDNESS = [[9.3, 9.4, 9.2, 9.7],   # coupon 1: tips 1..4
            [9.4, 9.3, 9.4, 9.6],
            [9.6, 9.8, 9.5, 10.0],
            [10.0, 9.9, 9.7, 10.2]]

# Conover, Practical Nonparametric Statistics (3rd ed., 1999), the Friedman example of section 5.8:
# twelve homeowners rank four grass mixtures (ranks within each homeowner, ties as mid-ranks).
# From memory: rank sums 38, 23.5, 24.5, 34; T1 = 8.097, T2 = 3.19.
GRASS = [[4, 3, 2, 1], [4, 2, 3, 1], [3, 1.5, 1.5, 4], [3, 1, 2, 4], [4, 2, 1, 3], [2, 2, 2, 4],
         [1, 3, 2, 4], [2, 4, 1, 3], [3.5, 1, 2, 3.5], [4, 1, 3, 2], [4, 2, 3, 1], [3.5, 1, 2, 3.5]]

# Sokal & Rohlf, Biometry (Box 10.1): glycogen in rat livers, 3 treatments, 2 rats per treatment,
# 3 preparations per rat, 2 readings per preparation (from memory; the printed sums of squares
# treatments 1557.56 and rats within treatments 797.67, also from memory, are reproduced below).
# As a two-level design: units = rats, 6 subsamples each.
RATS = {("control", "rat 1"): [131, 130, 131, 125, 136, 142],
        ("control", "rat 2"): [150, 148, 140, 143, 160, 150],
        ("compound 217", "rat 3"): [157, 145, 154, 142, 147, 153],
        ("compound 217", "rat 4"): [151, 155, 147, 147, 162, 152],
        ("217 + sugar", "rat 5"): [134, 125, 138, 138, 135, 136],
        ("217 + sugar", "rat 6"): [138, 140, 139, 138, 134, 127]}


def exact_conover_t(table):
    """T1 and T2 of Conover's example in exact fractions (hand-worked check)."""
    b, k = len(table), len(table[0])
    R = [sum(Fraction(row[j]).limit_denominator(4) for row in table) for j in range(k)]
    a1 = sum(Fraction(x).limit_denominator(4) ** 2 for row in table for x in row)
    c1 = Fraction(b * k * (k + 1) ** 2, 4)
    t1 = (k - 1) * sum((r - Fraction(b * (k + 1), 2)) ** 2 for r in R) / (a1 - c1)
    t2 = (b - 1) * t1 / (b * (k - 1) - t1)
    return {"rank sums": [float(r) for r in R], "A1": float(a1), "C1": float(c1), "T1": float(t1), "T2": float(t2)}


# ---------------------------------------------------------------- nested
def nested_case(readings, source):
    """readings: {(group, unit): [values]} in row order."""
    values, groups, units = [], [], []
    for (g, u), vs in readings.items():
        for v in vs:
            values.append(v)
            groups.append(g)
            units.append(u)
    g_order = first_appearance(groups)
    unit_means = {key: Fraction(sum(Fraction(v) for v in vs), len(vs)) for key, vs in readings.items()}
    f, p = st.f_oneway(*[[float(unit_means[key]) for key in readings if key[0] == g] for g in g_order])
    df = pd.DataFrame({"value": values, "group": groups, "unit": units})
    # Units are nested in groups, so `C(unit)` alone spans the groups: its residual is the within-units
    # SS, and the rise to the residual of `C(group)` is the units-within-groups SS.
    rss_groups = smf.ols("value ~ C(group)", data=df).fit(method="qr").ssr
    rss_units = smf.ols("value ~ C(unit)", data=df).fit(method="qr").ssr
    total_ss = float(np.sum((df["value"] - df["value"].mean()) ** 2))

    # Classical expected mean squares in exact fractions.
    xs = {key: [Fraction(v) for v in vs] for key, vs in readings.items()}
    N = sum(len(vs) for vs in xs.values())
    grand = sum(sum(vs) for vs in xs.values()) / N
    n_i = {g: sum(len(vs) for key, vs in xs.items() if key[0] == g) for g in g_order}
    mean_i = {g: sum(sum(vs) for key, vs in xs.items() if key[0] == g) / n_i[g] for g in g_order}
    ss_w = sum((v - unit_means[key]) ** 2 for key, vs in xs.items() for v in vs)
    ss_u = sum(len(vs) * (unit_means[key] - mean_i[key[0]]) ** 2 for key, vs in xs.items())
    ss_g = sum(n_i[g] * (mean_i[g] - grand) ** 2 for g in g_order)
    a_, U = len(g_order), len(xs)
    ms_g, ms_u, ms_w = ss_g / (a_ - 1), ss_u / (U - a_), ss_w / (N - U)
    s_nij2_ni = sum(Fraction(sum(len(vs) ** 2 for key, vs in xs.items() if key[0] == g), n_i[g]) for g in g_order)
    s_nij2 = sum(len(vs) ** 2 for vs in xs.values())
    n0u = (N - s_nij2_ni) / (U - a_)
    n0ug = (s_nij2_ni - Fraction(s_nij2, N)) / (a_ - 1)
    n0g = (N - Fraction(sum(n * n for n in n_i.values()), N)) / (a_ - 1)
    var_u = (ms_u - ms_w) / n0u
    var_g = (ms_g - ms_w - n0ug * var_u) / n0g
    comps = [max(var_g, 0), max(var_u, 0), ms_w]
    total = sum(comps)
    return {"source": source, "values": values, "groups": groups, "units": units,
            "statistic": f, "df": a_ - 1, "df2": U - a_, "p": p, "n": N,
            "statsmodels SS": {"groups": total_ss - rss_groups, "units": rss_groups - rss_units, "within": rss_units},
            "exact SS": {"groups": float(ss_g), "units": float(ss_u), "within": float(ss_w)},
            "variance between groups": float(comps[0]), "variance between units": float(comps[1]),
            "variance within units": float(comps[2]),
            "share between groups": float(comps[0] / total), "share between units": float(comps[1] / total),
            "share within units": float(comps[2] / total),
            "raw between groups": float(var_g), "raw between units": float(var_u),
            "group means": [float(sum(unit_means[key] for key in xs if key[0] == g) /
                                  sum(1 for key in xs if key[0] == g)) for g in g_order]}


def main():
    rng = random.Random(20261204)
    out = {"generator": "tests/reference/generate_blocks.py", "scipy": st.__name__ and __import__("scipy").__version__,
           "statsmodels": __import__("statsmodels").__version__}

    v, g, b = long_rows(["tip 1", "tip 2", "tip 3", "tip 4"], ["coupon 1", "coupon 2", "coupon 3", "coupon 4"], HARDNESS)
    out["hardness"] = block_case(v, g, b, "Montgomery, hardness testing (second-hand)")

    v, g, b = long_rows(["A", "B", "C", "D"], ["homeowner %d" % (i + 1) for i in range(12)], GRASS)
    case = block_case(v, g, b, "Conover 1999, section 5.8 (from memory)")
    case["exact"] = exact_conover_t(GRASS)
    out["grass"] = case

    # Invented: sedge cover (%) in 5 marsh zones along 12 transects; two quadrats in some zone-transect
    # cells (subsamples, averaged), transect T07 lost its 'upper' quadrat (dropped whole), one row with
    # a missing reading counted by the caller, and rows shuffled.
    zones = ["seaward", "low", "mid", "high", "upper"]
    effect = {"seaward": 0.0, "low": 4.0, "mid": 7.5, "high": 6.0, "upper": 2.0}
    rows = []
    for t in range(1, 13):
        transect = "T%02d" % t
        level = rng.gauss(40, 8)
        for z in zones:
            if transect == "T07" and z == "upper":
                continue
            for _ in range(2 if (t + zones.index(z)) % 4 == 0 else 1):
                rows.append((round(level + effect[z] + rng.gauss(0, 3), 1), z, transect))
    rng.shuffle(rows)
    out["field"] = block_case([r[0] for r in rows], [r[1] for r in rows], [r[2] for r in rows],
                              "invented marsh scenario, seed 20261204")

    # Invented: two methods (grab, core) at 14 stations, rows in any order, one station with only one
    # method (dropped), one cell with three readings; ties among the differences.
    rows = []
    for s in range(1, 15):
        station = "S%02d" % s
        base = rng.gauss(12, 3)
        rows.append((round(base + rng.gauss(0.8, 1.0), 1), "grab", station))
        if s != 9:
            for _ in range(3 if s == 4 else 1):
                rows.append((round(base + rng.gauss(0, 1.0), 1), "core", station))
    rng.shuffle(rows)
    values, groups, blocks = [r[0] for r in rows], [r[1] for r in rows], [r[2] for r in rows]
    case = block_case(values, groups, blocks, "invented two-method scenario, seed 20261204")
    g_order, used, table, _ = cell_table(values, groups, blocks)
    first, second = [row[0] for row in table], [row[1] for row in table]
    d = [a - c for a, c in zip(first, second)]
    t, p = st.ttest_rel(first, second)
    case["first"], case["second"] = first, second
    case["t"] = {"statistic": t, "p": p, "df": len(d) - 1, "estimate": float(np.mean(d))}
    dr = [round(x, 10) for x in d]
    nz = [x for x in dr if x != 0]
    w = st.wilcoxon(nz, zero_method="wilcox", correction=True, method="approx")
    ranks = st.rankdata([abs(x) for x in nz])
    case["signed-rank"] = {"statistic": float(sum(r for r, x in zip(ranks, nz) if x > 0)), "p": w.pvalue}
    pos = sum(1 for x in nz if x > 0)
    case["sign"] = {"statistic": pos, "p": st.binomtest(pos, len(nz), 0.5).pvalue}
    out["two groups"] = case

    out["rats"] = nested_case(RATS, "Sokal & Rohlf, Biometry, Box 10.1 (from memory), units = rats")

    # Invented: nitrate in 4 land uses, 3-5 wells each, 1-4 samples per well (unequal subsamples).
    wells = {}
    for use, level in (("forest", 2.0), ("pasture", 4.5), ("crop", 6.0), ("urban", 3.5)):
        for w_ in range(rng.randint(3, 5)):
            well_level = level + rng.gauss(0, 1.2)
            wells[(use, "%s well %d" % (use, w_ + 1))] = [round(well_level + rng.gauss(0, 0.6), 2)
                                                          for _ in range(rng.randint(1, 4))]
    out["wells"] = nested_case(wells, "invented groundwater scenario, seed 20261204")
    # A case whose between-units estimate is negative (unit means closer than subsamples imply).
    out["negative"] = nested_case({("a", "u1"): [10, 14, 12.5], ("a", "u2"): [11, 13, 12],
                                   ("b", "u3"): [15, 19, 17], ("b", "u4"): [18, 16, 17.4]},
                                  "hand-made: unit means closer than their subsamples' spread")

    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "blocks.json")
    with open(path, "w") as f:
        json.dump(out, f, indent=1, default=float)
    print("wrote", path)


if __name__ == "__main__":
    main()
