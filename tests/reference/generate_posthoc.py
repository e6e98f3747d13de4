#!/usr/bin/python3
"""Reference values for the post-hoc family (ADJUST.P, the studentized range, COMPARE.POSTHOC).

Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):
    /usr/bin/python3 tests/reference/generate_posthoc.py
writes tests/reference/posthoc.json beside this script. Data are invented or drawn with a fixed seed.
"""
import json
import os

import numpy as np
import scipy
import statsmodels
from statsmodels.stats.multitest import multipletests

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "posthoc.json")

# ---------------------------------------------------------------------------------------------
# ADJUST.P: statsmodels.stats.multitest.multipletests. Its 'sidak' is single-step (the catalogue's
# sidak); 'simes-hochberg' is Hochberg's step-up; 'fdr_bh'/'fdr_by' are Benjamini–Hochberg/-Yekutieli.
METHODS = {"holm": "holm", "bonferroni": "bonferroni", "hochberg": "simes-hochberg", "hommel": "hommel",
           "benjamini-hochberg": "fdr_bh", "benjamini-yekutieli": "fdr_by", "sidak": "sidak"}


def adjust_cases():
    rng = np.random.default_rng(20261202)
    families = {
        "invented_ten": [0.001, 0.008, 0.039, 0.041, 0.042, 0.06, 0.074, 0.205, 0.212, 0.216],
        "ties_zero_one": [0.0, 0.02, 0.02, 0.5, 1.0, 0.02, 0.0001],
        "single": [0.03],
        "tiny": [1e-12, 3e-10, 0.2],
        "seeded_40": list(rng.uniform(0, 1, 40) ** 3),
        "seeded_200": list(rng.uniform(0, 1, 200) ** 2),
    }
    out = []
    for name, p in families.items():
        case = {"name": name, "p": [float(x) for x in p], "adjusted": {}}
        for ours, theirs in METHODS.items():
            case["adjusted"][ours] = [float(x) for x in multipletests(p, alpha=0.05, method=theirs)[1]]
        out.append(case)
    return out


# ---------------------------------------------------------------------------------------------
# The studentized range: scipy.stats.studentized_range (SciPy ≥ 1.7 integrates numerically), cdf and
# sf on a grid of k, df and q; df = inf uses SciPy's infinite-df form. SciPy's sf is 1 − cdf
# computed in double precision, so only values well above 1e-12 carry full relative digits.
SR_GROUPS = [2, 3, 4, 5, 10, 20, 50, 100]
SR_DF = [2, 3, 5, 10, 20, 60, 120, 1000, "inf"]
SR_Q = [0.5, 1, 2, 3, 4, 5, 6, 8, 10, 15, 25]
SR_QUANTILES = [(2, 5, 0.95), (3, 10, 0.95), (5, 20, 0.95), (10, 60, 0.99), (20, "inf", 0.95),
                (100, 2, 0.95), (50, 1000, 0.999), (4, 3, 0.9)]


def studentized_range_grid():
    from scipy.stats import studentized_range
    points = []
    for k in SR_GROUPS:
        for df in SR_DF:
            nu = np.inf if df == "inf" else df
            for q in SR_Q:
                points.append({"k": k, "df": df, "q": q,
                               "cdf": float(studentized_range.cdf(q, k, nu)),
                               "sf": float(studentized_range.sf(q, k, nu))})
    quantiles = []
    for k, df, p in SR_QUANTILES:
        nu = np.inf if df == "inf" else df
        quantiles.append({"k": k, "df": df, "p": p, "q": float(studentized_range.ppf(p, k, nu))})
    return {"points": points, "quantiles": quantiles}


# Small upper tails at high precision with mpmath, from the defining integrals of the
# studentized range (Lund & Lund 1983; Copenhaver & Holland 1988), where SciPy's 1 − cdf has
# fewer digits. The difference form loses as many digits as the tail is small, so infinite df runs
# at 50 digits and the finite-df point (its tail near 1e-8) at 20. P(W > q) = k ∫ φ(z) [Φ(z)^(k−1) − (Φ(z) − Φ(z−q))^(k−1)] dz, and for finite df
# the mixture over s = S/σ with νS² ~ χ²(ν). The one finite-df point takes about 7 minutes.
MP_POINTS = [(3, "inf", 8), (10, "inf", 6), (10, "inf", 10), (50, "inf", 10), (100, "inf", 15), (3, 1000, 8)]


def studentized_range_mpmath():
    import mpmath as mp
    mp.mp.dps = 20

    def upper_inf(q, k):
        f = lambda z: mp.npdf(z) * (mp.ncdf(z) ** (k - 1) - (mp.ncdf(z) - mp.ncdf(z - q)) ** (k - 1))
        return k * mp.quad(f, [-mp.inf, -5, 0, mp.mpf(q) / 2, q, q + 5, mp.inf])

    def upper(q, k, df):
        if df == "inf":
            return upper_inf(q, k)
        nu = mp.mpf(df)
        c = nu ** (nu / 2) / (mp.gamma(nu / 2) * 2 ** (nu / 2 - 1))
        g = lambda s: c * s ** (nu - 1) * mp.exp(-nu * s * s / 2) * upper_inf(q * s, k)
        sd = 1 / mp.sqrt(2 * nu)
        pts = [0] + [1 + j * sd for j in range(-8, 9) if 1 + j * sd > 0] + [mp.inf]
        return mp.quad(g, pts)

    out = []
    for k, df, q in MP_POINTS:
        mp.mp.dps = 50 if df == "inf" else 20
        out.append({"k": k, "df": df, "q": q, "sf": float(upper(q, k, df))})
    return out


# ---------------------------------------------------------------------------------------------
# COMPARE.POSTHOC. Tukey–Kramer from statsmodels pairwise_tukeyhsd (0.13 takes its p and critical
# value from scipy.stats.studentized_range when SciPy has it, else from the psturng/qsturng
# approximations) and, independently, from the published formula with SciPy's studentized range.
# Games–Howell and Dunn have no SciPy/statsmodels implementation: computed here from the published
# formulas (Games & Howell 1976; Dunn 1964) with SciPy's distributions. pairwise-t: scipy ttest_ind
# (Welch); pairwise-ranks: scipy mannwhitneyu (exact without ties when both n < 50, else asymptotic with
# continuity correction), U of the first group; both Holm-adjusted by multipletests.
def posthoc_data():
    rng = np.random.default_rng(7012)
    sets = {}
    # Invented stream-invertebrate scenario: four reaches, unequal n.
    sets["unequal_n"] = {"names": ["upper", "middle", "lower", "estuary"],
                         "values": [list(np.round(rng.normal(m, s, n), 3)) for m, s, n in
                                    [(12.0, 2.0, 6), (14.5, 2.5, 9), (11.0, 1.5, 7), (16.0, 3.5, 12)]]}
    # Counts-like readings with many ties, three plots.
    sets["ties"] = {"names": ["plot A", "plot B", "plot C"],
                    "values": [list(np.round(rng.normal(m, 1.2, n))) for m, n in [(5, 8), (6, 10), (7.5, 9)]]}
    sets["two_groups"] = {"names": ["north", "south"],
                          "values": [list(np.round(rng.normal(m, 1.0, n), 2)) for m, n in [(3.0, 7), (4.1, 8)]]}
    sets["n_two"] = {"names": ["g1", "g2", "g3"], "values": [[1.2, 1.9], [2.8, 3.1], [4.4, 3.6]]}
    sets["positive"] = {"names": ["reference", "grazed", "burned"],
                        "values": [list(np.round(rng.lognormal(mu, 0.4, n), 3)) for mu, n in
                                   [(1.0, 8), (1.5, 7), (0.7, 9)]]}
    sets["twenty_groups"] = {"names": ["site %d" % (i + 1) for i in range(20)],
                             "values": [list(np.round(rng.normal(10 + 0.4 * i, 1.0, 3), 2)) for i in range(20)]}
    return sets


def tukey_reference(groups, level):
    from scipy.stats import studentized_range
    from statsmodels.stats.multicomp import pairwise_tukeyhsd
    k = len(groups)
    n = [len(g) for g in groups]
    means = [float(np.mean(g)) for g in groups]
    df = sum(n) - k
    mse = sum(float(np.sum((np.array(g) - np.mean(g)) ** 2)) for g in groups) / df
    crit = float(studentized_range.ppf(level, k, df))
    rows = []
    for i in range(k):
        for j in range(i + 1, k):
            d = means[i] - means[j]
            se = np.sqrt(mse / 2 * (1 / n[i] + 1 / n[j]))
            q = abs(d) / se
            rows.append({"estimate": d, "ci_low": d - crit * se, "ci_high": d + crit * se, "statistic": q,
                         "p": float(studentized_range.sf(q, k, df))})
    # statsmodels: endog/labels in long format; it reports group2 − group1 with labels sorted, so the
    # labels are made to sort in group order.
    endog = np.concatenate([np.array(g, dtype=float) for g in groups])
    labels = np.concatenate([[("%03d" % i)] * len(g) for i, g in enumerate(groups)])
    res = pairwise_tukeyhsd(endog, labels, alpha=1 - level)
    sm = []
    for idx, (d, lo, hi, p) in enumerate(zip(res.meandiffs, res.confint[:, 0], res.confint[:, 1], res.pvalues)):
        sm.append({"estimate": -float(d), "ci_low": -float(hi), "ci_high": -float(lo), "p": float(p)})
    return rows, sm


def games_howell_reference(groups, level):
    from scipy.stats import studentized_range
    k = len(groups)
    rows = []
    for i in range(k):
        for j in range(i + 1, k):
            a, b = np.array(groups[i]), np.array(groups[j])
            va, vb = np.var(a, ddof=1) / len(a), np.var(b, ddof=1) / len(b)
            df = (va + vb) ** 2 / (va ** 2 / (len(a) - 1) + vb ** 2 / (len(b) - 1))
            se = np.sqrt((va + vb) / 2)
            d = float(np.mean(a) - np.mean(b))
            q = abs(d) / se
            crit = float(studentized_range.ppf(level, k, df))
            rows.append({"estimate": d, "ci_low": d - crit * se, "ci_high": d + crit * se, "statistic": q,
                         "p": float(studentized_range.sf(q, k, df)), "df": float(df)})
    return rows


def dunn_reference(groups, level):
    from scipy.stats import norm, rankdata
    pooled = np.concatenate([np.array(g, dtype=float) for g in groups])
    ranks = rankdata(pooled)
    N = len(pooled)
    _, counts = np.unique(pooled, return_counts=True)
    ties = float(np.sum(counts ** 3 - counts))
    sigma2 = N * (N + 1) / 12 - ties / (12 * (N - 1))
    bounds = np.cumsum([0] + [len(g) for g in groups])
    mean_rank = [float(np.mean(ranks[bounds[i]:bounds[i + 1]])) for i in range(len(groups))]
    z_crit = norm.ppf(1 - (1 - level) / 2)
    rows = []
    for i in range(len(groups)):
        for j in range(i + 1, len(groups)):
            se = np.sqrt(sigma2 * (1 / len(groups[i]) + 1 / len(groups[j])))
            d = mean_rank[i] - mean_rank[j]
            z = d / se
            rows.append({"estimate": d, "ci_low": d - z_crit * se, "ci_high": d + z_crit * se, "statistic": z,
                         "p": float(2 * norm.sf(abs(z)))})
    return rows


def pairwise_reference(groups, kind):
    from scipy.stats import mannwhitneyu, ttest_ind
    rows = []
    for i in range(len(groups)):
        for j in range(i + 1, len(groups)):
            a, b = np.array(groups[i], dtype=float), np.array(groups[j], dtype=float)
            if kind == "t":
                r = ttest_ind(a, b, equal_var=False)
                rows.append({"estimate": float(np.mean(a) - np.mean(b)), "statistic": float(r.statistic),
                             "p": float(r.pvalue)})
            else:
                both = np.concatenate([a, b])
                exact = len(np.unique(both)) == len(both) and len(a) < 50 and len(b) < 50
                r = mannwhitneyu(a, b, alternative="two-sided", use_continuity=True,
                                 method="exact" if exact else "asymptotic")
                rows.append({"statistic": float(r.statistic), "p": float(r.pvalue)})
    return rows


def add_adjusted(rows, method="holm"):
    adjusted = multipletests([r["p"] for r in rows], method=method)[1]
    for r, a in zip(rows, adjusted):
        r["adjusted_p"] = float(a)
    return rows


def posthoc_cases():
    out = []
    level = 0.95
    for name, data in posthoc_data().items():
        groups = data["values"]
        case = {"name": name, "names": data["names"], "values": [[float(x) for x in g] for g in groups],
                "level": level}
        tukey, sm = tukey_reference(groups, level)
        case["tukey"] = tukey
        case["tukey_statsmodels"] = sm
        if name != "twenty_groups":
            case["games-howell"] = games_howell_reference(groups, level)
            case["dunn"] = add_adjusted(dunn_reference(groups, level))
            case["pairwise-t"] = add_adjusted(pairwise_reference(groups, "t"))
            case["pairwise-ranks"] = add_adjusted(pairwise_reference(groups, "rank"))
        if name == "positive":
            # log transform: Tukey–Kramer on ln x; estimate and limits back as ratios of geometric means.
            logged = [list(np.log(np.array(g))) for g in groups]
            lt, _ = tukey_reference(logged, level)
            for r in lt:
                for key in ("estimate", "ci_low", "ci_high"):
                    r[key] = float(np.exp(r[key]))
            case["tukey_log"] = lt
        out.append(case)
    return out


def main():
    ref = {
        "generator": "tests/reference/generate_posthoc.py",
        "scipy": scipy.__version__,
        "statsmodels": statsmodels.__version__,
        "adjust": adjust_cases(),
        "studentized_range": studentized_range_grid(),
        "studentized_range_mpmath": studentized_range_mpmath(),
        "posthoc": posthoc_cases(),
    }
    with open(OUT, "w") as f:
        json.dump(ref, f, indent=1)


if __name__ == "__main__":
    main()
