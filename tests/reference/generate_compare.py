#!/usr/bin/python3
"""Reference values for COMPARE.GROUPS and COMPARE.PAIRED.

Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):
    /usr/bin/python3 tests/reference/generate_compare.py
writes tests/reference/compare.json beside this script.

Data are invented field scenarios generated with fixed seeds. Where SciPy/statsmodels have the
method, the value comes from them, called with every option that matters spelled out (see
LIBRARY-NOTES.md: mannwhitneyu and wilcoxon get `method` and `zero_method` explicitly). Where no
library has it (Hodges–Lehmann intervals, Hedges' g, omega squared, epsilon squared, the t
intervals; SciPy 1.10's ttest_ind has no df), it is computed here from the published formula in
plain Python or 40-digit mpmath (the effect-size intervals: noncentral t and F inverted by their
defining integral and Poisson mixture, Steiger & Fouladi 1997, Steiger 2004), by brute force (every pairwise difference / Walsh average listed and sorted, exact
null distributions counted with Python integers), independently of the C++ selection algorithm.
"""
import json
import math
import os
from fractions import Fraction

import mpmath as mp
import numpy as np
import scipy
import scipy.stats as st
import statsmodels
from statsmodels.stats.oneway import anova_oneway

LEVEL = 0.95
mp.mp.dps = 40


# ---------------------------------------------------------------- effect-size intervals
def nct_cdf(t, nu, delta):
    """P(T <= t) for the noncentral t: the integral over chi-square u of Phi(t sqrt(u/nu) - delta)."""
    t, nu, delta = mp.mpf(t), mp.mpf(nu), mp.mpf(delta)
    dens = lambda u: mp.exp((nu / 2 - 1) * mp.log(u) - u / 2 - (nu / 2) * mp.log(2) - mp.loggamma(nu / 2))
    return mp.quad(lambda u: mp.ncdf(t * mp.sqrt(u / nu) - delta) * dens(u), [0, nu / 4, nu, 4 * nu, mp.inf])


def ncf_cdf(f, d1, d2, lam):
    """P(F <= f) for the noncentral F: the Poisson(lam/2) mixture of regularized incomplete betas."""
    f, d1, d2, lam = mp.mpf(f), mp.mpf(d1), mp.mpf(d2), mp.mpf(lam)
    x = d1 * f / (d1 * f + d2)
    total, j = mp.mpf(0), 0
    while True:
        w = mp.exp(-lam / 2 + j * mp.log(lam / 2) - mp.loggamma(j + 1)) if lam > 0 else (1 if j == 0 else 0)
        term = w * mp.betainc(d1 / 2 + j, d2 / 2, 0, x, regularized=True)
        total += term
        if j > lam / 2 + 10 and term < mp.mpf(10) ** -35:
            return total
        if lam == 0:
            return total
        j += 1


def decreasing_root(cdf, target, guess, floor=None):
    """The noncentrality where cdf(ncp) = target, cdf decreasing in ncp: bracket from scipy's
    guess, then bisect in mpmath to 1e-25."""
    if floor is not None and cdf(floor) < target:
        return float(floor)
    step = 0.5 + abs(guess) * 0.1
    lo, hi = guess - step, guess + step
    if floor is not None:
        lo = max(lo, floor)
    while cdf(lo) < target:
        lo -= step
        step *= 2
        if floor is not None and lo <= floor:
            lo = floor
            break
    while cdf(hi) > target:
        hi += step
        step *= 2
    lo, hi = mp.mpf(lo), mp.mpf(hi)
    while hi - lo > mp.mpf(10) ** -25 * (1 + abs(lo)):
        mid = (lo + hi) / 2
        if cdf(mid) > target:
            lo = mid
        else:
            hi = mid
    return float((lo + hi) / 2)


def t_effect_interval(t, df, level=LEVEL):
    a = (1 - level) / 2
    lo = decreasing_root(lambda d: nct_cdf(t, df, d), 1 - a, t)
    hi = decreasing_root(lambda d: nct_cdf(t, df, d), a, t)
    return lo, hi


def f_effect_interval(f, d1, d2, level=LEVEL):
    a = (1 - level) / 2
    guess = max(0.0, d1 * (f - 1))
    lo = decreasing_root(lambda l: ncf_cdf(f, d1, d2, l), 1 - a, guess, floor=0)
    hi = decreasing_root(lambda l: ncf_cdf(f, d1, d2, l), a, guess, floor=0)
    return lo, hi


def r10(x):
    """Round to 10 significant digits, as the catalogue does before ranking differences."""
    return float('%.10g' % x)


def flt(xs):
    return [float(x) for x in xs]


# ---------------------------------------------------------------- two-group t-tests
def t_reference(a, b, equal_var):
    a, b = np.asarray(a), np.asarray(b)
    n1, n2 = len(a), len(b)
    res = st.ttest_ind(a, b, equal_var=equal_var)
    v1, v2 = a.var(ddof=1), b.var(ddof=1)
    if equal_var:
        df = n1 + n2 - 2
        se = math.sqrt(((n1 - 1) * v1 + (n2 - 1) * v2) / df * (1 / n1 + 1 / n2))
    else:
        se = math.sqrt(v1 / n1 + v2 / n2)
        df = (v1 / n1 + v2 / n2) ** 2 / ((v1 / n1) ** 2 / (n1 - 1) + (v2 / n2) ** 2 / (n2 - 1))
    diff = a.mean() - b.mean()
    q = st.t.ppf(1 - (1 - LEVEL) / 2, df)
    sp = math.sqrt(((n1 - 1) * v1 + (n2 - 1) * v2) / (n1 + n2 - 2))
    J = 1 - 3 / (4 * (n1 + n2) - 9)
    g = diff / sp * J
    root = math.sqrt(n1 * n2 / (n1 + n2))
    lo, hi = t_effect_interval(diff / sp * root, n1 + n2 - 2)
    return {"statistic": float(res.statistic), "p": float(res.pvalue), "df": float(df),
            "estimate": float(diff), "ci-low": diff - q * se, "ci-high": diff + q * se, "effect": g,
            "effect ci-low": lo / root * J, "effect ci-high": hi / root * J}


# ---------------------------------------------------------------- rank-sum (Mann–Whitney)
def u_counts(m, n):
    """Exact null frequencies of U for sizes m, n (Python integers)."""
    # f[i][j] = list of counts for sizes (i, j)
    prev = [[1] for _ in range(n + 1)]
    for i in range(1, m + 1):
        cur = [[1]]
        for j in range(1, n + 1):
            out = [0] * (i * j + 1)
            for u, c in enumerate(prev[j]):
                out[u + j] += c
            for u, c in enumerate(cur[j - 1]):
                out[u] += c
            cur.append(out)
        prev = cur
    return prev[n]


def exact_critical_k(counts, alpha_half):
    """The interval's order statistic from an exact null distribution given as the count of each
    value of the statistic: the largest k with P(statistic <= k - 1) <= alpha/2."""
    total = sum(counts)
    k, cum = 0, 0
    for v, c in enumerate(counts):
        cum += c
        if Fraction(cum, total) > Fraction(alpha_half):
            break
        k = v + 1
    return k


def rank_sum_reference(a, b, exact):
    m, n = len(a), len(b)
    method = 'exact' if exact else 'asymptotic'
    res = st.mannwhitneyu(a, b, alternative='two-sided', method=method, use_continuity=True)
    diffs = sorted(r10(x - y) for x in a for y in b)
    N = m * n
    hl = diffs[N // 2] if N % 2 else 0.5 * (diffs[N // 2 - 1] + diffs[N // 2])
    alpha_half = (1 - LEVEL) / 2
    if exact:
        k = exact_critical_k(u_counts(m, n), alpha_half)
    else:
        pooled = np.concatenate([a, b])
        _, t = np.unique(pooled, return_counts=True)
        tie = float(((t ** 3) - t).sum())
        Nt = m + n
        sd = math.sqrt(m * n / 12 * ((Nt + 1) - tie / (Nt * (Nt - 1))))
        k = int(math.floor(m * n / 2 - st.norm.ppf(1 - alpha_half) * sd))
    out = {"statistic": float(res.statistic), "p": float(res.pvalue), "estimate": hl,
           "effect": 2 * float(res.statistic) / (m * n) - 1, "k": k}
    if k >= 1:
        out["ci-low"] = diffs[k - 1]
        out["ci-high"] = diffs[N - k]
    return out


# ---------------------------------------------------------------- k groups
def k_reference(groups):
    arrays = [np.asarray(g) for g in groups]
    classic = st.f_oneway(*arrays)
    welch = anova_oneway(arrays, use_var='unequal', welch_correction=True)
    kw = st.kruskal(*arrays)
    allv = np.concatenate(arrays)
    grand = allv.mean()
    ssb = sum(len(g) * (g.mean() - grand) ** 2 for g in arrays)
    ssw = sum(((g - g.mean()) ** 2).sum() for g in arrays)
    k, N = len(arrays), len(allv)
    msw = ssw / (N - k)
    omega = (ssb - (k - 1) * msw) / (ssb + ssw + msw)
    lam_lo, lam_hi = f_effect_interval(float(classic.statistic), k - 1, N - k)
    omega_ci = {"effect ci-low": lam_lo / (lam_lo + N), "effect ci-high": lam_hi / (lam_hi + N)}
    # No estimate for 3 or more groups: COMPARE.GROUPS refuses one (a difference picked by the data
    # has no honest interval; FUNCTIONS.md, revision 2).
    return {
        "classic": {"statistic": float(classic.statistic), "p": float(classic.pvalue), "df": k - 1,
                    "df2": N - k, "effect": omega, **omega_ci},
        "welch": {"statistic": float(welch.statistic), "p": float(welch.pvalue), "df": float(welch.df[0]),
                  "df2": float(welch.df[1]), "effect": omega, **omega_ci},
        "ranks": {"statistic": float(kw.statistic), "p": float(kw.pvalue), "df": k - 1,
                  "effect": float(kw.statistic) / (N - 1)},
    }


# ---------------------------------------------------------------- paired
def signed_rank_counts(n):
    counts = [1]
    for i in range(1, n + 1):
        new = counts + [0] * i
        for s, c in enumerate(counts):
            new[s + i] += c
        counts = new
    return counts


def paired_reference(d, exact):
    d = np.asarray([r10(x) for x in d])
    t = st.ttest_1samp(d, 0.0)
    n_all = len(d)
    sd = d.std(ddof=1)
    q = st.t.ppf(1 - (1 - LEVEL) / 2, n_all - 1)
    out_t = {"statistic": float(t.statistic), "p": float(t.pvalue), "df": n_all - 1,
             "estimate": float(d.mean()), "ci-low": d.mean() - q * sd / math.sqrt(n_all),
             "ci-high": d.mean() + q * sd / math.sqrt(n_all), "effect": float(d.mean() / sd)}
    lo, hi = t_effect_interval(float(t.statistic), n_all - 1)
    out_t["effect ci-low"], out_t["effect ci-high"] = lo / math.sqrt(n_all), hi / math.sqrt(n_all)
    nz = np.sort(d[d != 0])
    n = len(nz)
    w = st.wilcoxon(nz, zero_method='wilcox', correction=not exact, method='exact' if exact else 'approx',
                    alternative='two-sided')
    ranks = st.rankdata(np.abs(nz))
    tplus = float(ranks[nz > 0].sum())
    walsh = sorted(r10(0.5 * nz[i] + 0.5 * nz[j]) for i in range(n) for j in range(i, n))
    M = len(walsh)
    hl = walsh[M // 2] if M % 2 else 0.5 * (walsh[M // 2 - 1] + walsh[M // 2])
    alpha_half = (1 - LEVEL) / 2
    if exact:
        k = exact_critical_k(signed_rank_counts(n), alpha_half)  # counts over the 2^n sign patterns
    else:
        _, tc = np.unique(np.abs(nz), return_counts=True)
        var = n * (n + 1) * (2 * n + 1) / 24 - float(((tc ** 3) - tc).sum()) / 48
        k = int(math.floor(M / 2 - st.norm.ppf(1 - alpha_half) * math.sqrt(var)))
    out_sr = {"statistic": tplus, "p": float(w.pvalue), "n": n, "estimate": hl,
              "effect": 4 * tplus / (n * (n + 1)) - 1, "k": k}
    if k >= 1:
        out_sr["ci-low"] = walsh[k - 1]
        out_sr["ci-high"] = walsh[M - k]
    pos = int((nz > 0).sum())
    b = st.binomtest(pos, n, 0.5, alternative='two-sided')
    out_sign = {"statistic": pos, "p": float(b.pvalue), "n": n, "estimate": float(np.median(nz)),
                "effect": 4 * tplus / (n * (n + 1)) - 1}
    # Order-statistic interval at the binomial critical value (largest k with P(X <= k-1) <= alpha/2).
    ks = [k for k in range(1, n + 1) if st.binom.cdf(k - 1, n, 0.5) <= alpha_half]
    if ks:
        k = max(ks)
        out_sign["ci-low"], out_sign["ci-high"] = float(nz[k - 1]), float(nz[n - k])
    return {"t": out_t, "signed-rank": out_sr, "sign": out_sign}


# ---------------------------------------------------------------- NIST StRD univariate ceilings
def strd_univariate_ceilings():
    """LRE of the exact mean and SD of the binary64 inputs against NIST's certified values: what a
    double-precision program can reach at best (the README gives this ceiling for ANOVA and
    regression only). Exact rational arithmetic (fractions), square root in 50-digit decimal."""
    from decimal import Decimal, getcontext
    getcontext().prec = 50
    folder = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "data", "nist-strd", "univariate")
    out = {}
    for name in sorted(os.listdir(folder)):
        if not name.endswith(".dat"):
            continue
        lines = open(os.path.join(folder, name)).read().splitlines()
        cert = {}
        for line in lines:
            if "ybar:" in line:
                cert["mean"] = Decimal(line.split("ybar:")[1].split()[0])
            if " s:" in line and "Deviation" in line:
                cert["sd"] = Decimal(line.split(" s:")[1].split()[0])
        start = [i for i, l in enumerate(lines) if l.startswith("Data: Y")][0] + 2
        xs = [Fraction(float(l.split()[0])) for l in lines[start:] if l.strip()]
        n = len(xs)
        mean = sum(xs) / n
        var = sum((x - mean) ** 2 for x in xs) / (n - 1)
        exact_mean = Decimal(mean.numerator) / Decimal(mean.denominator)
        exact_sd = (Decimal(var.numerator) / Decimal(var.denominator)).sqrt()

        def lre(x, c):
            if x == c:
                return 15.0
            return min(15.0, float(-(abs(x - c) / abs(c)).log10()))
        out[name[:-4]] = {"n": n, "mean": lre(exact_mean, cert["mean"]), "sd": lre(exact_sd, cert["sd"])}
    return out


def main():
    rng = np.random.default_rng(20261202)
    cases = {}

    # Nitrate (mg/L) at an upstream and a downstream station, invented; 3 decimals like a field meter.
    up = np.round(rng.normal(1.25, 0.30, 12), 3)
    down = np.round(rng.normal(0.95, 0.55, 17), 3)
    cases["nitrate"] = {"first": flt(up), "second": flt(down),
                        "welch": t_reference(up, down, False), "pooled": t_reference(up, down, True)}

    # Two per group, unequal spreads.
    a2, b2 = np.array([4.1, 5.3]), np.array([2.0, 2.9, 7.5])
    cases["tiny"] = {"first": flt(a2), "second": flt(b2),
                     "welch": t_reference(a2, b2, False), "pooled": t_reference(a2, b2, True)}

    # Positive skewed biomass (g), for the log transform: reference on log values.
    bio1 = np.round(rng.lognormal(2.0, 0.5, 15), 2)
    bio2 = np.round(rng.lognormal(1.6, 0.6, 11), 2)
    cases["biomass"] = {"first": flt(bio1), "second": flt(bio2),
                        "welch_log": t_reference(np.log(bio1), np.log(bio2), False),
                        "welch_log10": t_reference(np.log10(bio1), np.log10(bio2), False),
                        "welch_sqrt": t_reference(np.sqrt(bio1), np.sqrt(bio2), False)}

    # Rank-sum, no ties, small: exact.
    x = rng.permutation(np.round(rng.normal(10, 2, 9), 2))
    y = np.round(rng.normal(12, 2, 13), 2)
    assert len(np.unique(np.concatenate([x, y]))) == len(x) + len(y)
    cases["ranks_exact"] = {"first": flt(x), "second": flt(y), "ranks": rank_sum_reference(x, y, True)}

    # Rank-sum with ties (counts of mayfly nymphs per kick sample): normal approximation.
    c1 = rng.poisson(6, 14).astype(float)
    c2 = rng.poisson(4, 16).astype(float)
    cases["ranks_ties"] = {"first": flt(c1), "second": flt(c2), "ranks": rank_sum_reference(c1, c2, False)}

    # Rank-sum, 49 and 45 values, no ties: still exact under the catalogue's rule.
    x49 = np.round(rng.normal(0, 1, 49), 6)
    y45 = np.round(rng.normal(0.4, 1, 45), 6)
    assert len(np.unique(np.concatenate([x49, y45]))) == 94
    cases["ranks_exact_49"] = {"first": flt(x49), "second": flt(y45), "ranks": rank_sum_reference(x49, y45, True)}

    # Rank-sum, 60 and 75 values, no ties: normal approximation because a group has 50 or more.
    x60 = np.round(rng.normal(0, 1, 60), 6)
    y75 = np.round(rng.normal(0.3, 1.3, 75), 6)
    cases["ranks_large"] = {"first": flt(x60), "second": flt(y75), "ranks": rank_sum_reference(x60, y75, False)}

    # Three marsh zones, soil salinity (ppt), invented.
    zones = [np.round(rng.normal(mu, sd, n), 2) for mu, sd, n in [(12, 1.5, 8), (14, 3.0, 11), (13, 0.8, 6)]]
    cases["zones"] = {"groups": [flt(g) for g in zones], **k_reference(zones)}

    # Twenty plots with 2 to 6 trees each, diameter growth (mm), invented.
    plots = []
    for i in range(20):
        n = 2 + i % 5
        plots.append(np.round(rng.normal(3 + 0.05 * i, 0.5 + 0.05 * (i % 4), n), 3))
    cases["plots20"] = {"groups": [flt(g) for g in plots], **k_reference(plots)}

    # Paired: dissolved oxygen (mg/L) above and below an outfall on 14 dates, invented; no ties.
    above = np.round(rng.normal(8.4, 0.8, 14), 2)
    below = np.round(above - rng.normal(0.5, 0.6, 14), 2)
    d = above - below
    ref = paired_reference(d, True)
    ref["t"] = {**ref["t"], **{"statistic": float(st.ttest_rel(above, below).statistic),
                               "p": float(st.ttest_rel(above, below).pvalue)}}
    cases["oxygen"] = {"first": flt(above), "second": flt(below), **ref}

    # Paired with zeros and ties: fish counts on two passes, invented.
    pass1 = rng.poisson(9, 25).astype(float)
    pass2 = np.maximum(0, pass1 - rng.integers(-2, 5, 25)).astype(float)
    cases["passes"] = {"first": flt(pass1), "second": flt(pass2), **paired_reference(pass1 - pass2, False)}

    # One sample against a number: pH of 10 samples against 7.
    ph = np.round(rng.normal(7.25, 0.3, 10), 3)
    ref = paired_reference(ph - 7.0, True)
    cases["ph"] = {"first": flt(ph), "second": 7.0, **ref}

    strd = strd_univariate_ceilings()

    out = {"generator": "tests/reference/generate_compare.py", "scipy": scipy.__version__, "mpmath": mp.__version__,
           "statsmodels": statsmodels.__version__, "numpy": np.__version__, "level": LEVEL, "cases": cases,
           "strd_univariate_ceiling": strd}
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "compare.json")
    with open(path, "w") as f:
        json.dump(out, f, indent=1)
    print("wrote", path)


if __name__ == "__main__":
    main()
