#!/usr/bin/python3
"""Reference numbers for the `report` sentences (tests/core/report_sentences_test.cpp).

Run from anywhere with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):
    /usr/bin/python3 tests/reference/generate_reports.py
writes tests/reference/reports.json beside this script.

Every data set is an invented field scenario of our own, small enough to read in the test. For
each case the script stores the reference numbers and, under "tokens", the same numbers formatted
here by the catalogue's rules (FUNCTIONS.md, "Outputs"): p with three decimals and "p < 0.001"
below; statistics and estimates with two decimals, three significant digits below 0.1 (and
x.xxe-05 below 1e-4); df as whole numbers, fractional (Welch) df with one decimal. The test
spells each sentence out in full and checks that every token stored here appears in it, so each
number of a sentence is traced to a library value computed independently of the C++ code.

Sources, per method: scipy.stats (ttest_ind, mannwhitneyu, f_oneway, kruskal, wilcoxon,
binomtest, levene, bartlett, fligner, normaltest, jarque_bera, chi2_contingency, fisher_exact,
chisquare, pearsonr, spearmanr, kendalltau), statsmodels (anova_oneway for Welch's ANOVA,
normal_ad, lilliefors, OLS, survdiff and SurvfuncRight on flipped values for the censored tests); and where no library has the method, the published formula in plain
Python or mpmath, reused from the other generators: Hedges' g, ω², ε², Hodges–Lehmann
intervals (generate_compare.py), Shapiro–Wilk and Shapiro–Francia by Royston (1995, 1993) in
mpmath (generate_normality.py), Freeman–Halton in exact fractions (generate_categorical.py).

A number whose rounding would flip under a relative change of 1e-9 is reported on stdout: the
data are chosen so that none does, so the C++ values (which agree with these to about 1e-12)
round to the same digits.
"""
import json
import math
import os

import numpy as np
import scipy
import scipy.stats as st
import statsmodels
import statsmodels.api as sm
from statsmodels.stats.diagnostic import lilliefors, normal_ad

from generate_categorical import freeman_halton_p
from generate_censored import km_reference, parse, survdiff_reference
from generate_compare import k_reference, paired_reference, rank_sum_reference, t_reference
from generate_limits import AMMONIA, ROSNER, esd_steps
from generate_normality import royston_shapiro_francia, royston_shapiro_wilk
from quadrat_sheets.report_numbers import fmt_df, fmt_number, fmt_p
from quadrat_sheets.report_scenarios import (  # invented field scenarios, one comment each there
    RIFFLE, POOL, GRAVEL, SILT, FOREST, PASTURE, CROPLAND, ABOVE, BELOW, PH, SPRINGS, MAYFLY,
    NESTS, NEWTS, WIDTH, CANOPY, TRAPS, CRAYFISH, WILLOW, LEAD_UP, LEAD_DOWN)

HERE = os.path.dirname(os.path.abspath(__file__))

near_boundary = []


# ---------------------------------------------------------------- the catalogue's number rules
# fmt_p, fmt_number, fmt_df: tools/quadrat_sheets/report_numbers.py
def checked(formatter, x):
    """Format x, noting it when a relative change of 1e-9 would change its digits."""
    s = formatter(x)
    if x != 0 and (formatter(x * (1 + 1e-9)) != s or formatter(x * (1 - 1e-9)) != s):
        near_boundary.append((s, x))
    return s


def P(p):
    return checked(fmt_p, p)


def N(x):
    return checked(fmt_number, x)


def DF(d):
    # whole-number df are exact (n − 1, k − 1, counts): nothing to round
    return fmt_df(d) if d == round(d) else checked(fmt_df, d)


def hedges_log_groups(a, b):
    return t_reference(np.log(a), np.log(b), False), t_reference(np.log(a), np.log(b), True)


def exp_interval(ref):
    out = dict(ref)
    for key in ("estimate", "ci-low", "ci-high"):
        if key in out:
            out[key] = math.exp(out[key])
    return out


def two_group_cases():
    cases = {}
    for name, a, b in (("oxygen", RIFFLE, POOL), ("oxygen reversed", POOL, RIFFLE)):
        for transform in ("none", "log"):
            fa, fb = (np.log(a), np.log(b)) if transform == "log" else (np.asarray(a), np.asarray(b))
            welch = t_reference(fa, fb, False)
            pooled = t_reference(fa, fb, True)
            ranks = rank_sum_reference(list(fa), list(fb), True)
            if transform == "log":
                welch, pooled, ranks = exp_interval(welch), exp_interval(pooled), exp_interval(ranks)
            for method, ref in (("welch", welch), ("pooled", pooled), ("ranks", ranks)):
                tokens = {"p": P(ref["p"]), "estimate": N(ref["estimate"]), "ci-low": N(ref["ci-low"]),
                          "ci-high": N(ref["ci-high"]), "effect": N(ref["effect"])}
                if method == "ranks":
                    tokens["statistic"] = DF(ref["statistic"])
                else:
                    tokens["statistic"] = N(ref["statistic"])
                    tokens["df"] = DF(ref["df"])
                cases[f"{name} {method} {transform}"] = {"reference": ref, "tokens": tokens}
    # Counts with ties: rank-sum by the normal approximation; Welch on the log(x+1) scale.
    ranks = rank_sum_reference(GRAVEL, SILT, False)
    cases["mayfly ranks none"] = {"reference": ranks, "tokens": {
        "statistic": DF(ranks["statistic"]), "p": P(ranks["p"]), "estimate": N(ranks["estimate"]),
        "ci-low": N(ranks["ci-low"]), "ci-high": N(ranks["ci-high"]), "effect": N(ranks["effect"])}}
    welch = t_reference(np.log1p(GRAVEL), np.log1p(SILT), False)
    cases["mayfly welch log(x+1)"] = {"reference": welch, "tokens": {
        "statistic": N(welch["statistic"]), "df": DF(welch["df"]), "p": P(welch["p"]),
        "estimate": N(welch["estimate"]), "ci-low": N(welch["ci-low"]), "ci-high": N(welch["ci-high"]),
        "effect": N(welch["effect"])}}
    return cases


def three_group_cases():
    cases = {}
    raw = [FOREST, PASTURE, CROPLAND]
    for transform in ("none", "log"):
        groups = [np.log(g) for g in raw] if transform == "log" else [np.asarray(g, float) for g in raw]
        ref = k_reference(groups)
        for method, key in (("welch", "welch"), ("pooled", "classic"), ("ranks", "ranks")):
            r = dict(ref[key])
            tokens = {"statistic": N(r["statistic"]), "df": DF(r["df"]), "p": P(r["p"]), "effect": N(r["effect"])}
            if "df2" in r:
                tokens["df2"] = DF(r["df2"])
            cases[f"nitrate {method} {transform}"] = {"reference": r, "tokens": tokens}
    return cases


def paired_tokens(ref, method):
    tokens = {"p": P(ref["p"]), "estimate": N(ref["estimate"]), "effect": N(ref["effect"])}
    if "ci-low" in ref:
        tokens["ci-low"] = N(ref["ci-low"])
        tokens["ci-high"] = N(ref["ci-high"])
    if method == "t":
        tokens["statistic"] = N(ref["statistic"])
        tokens["df"] = DF(ref["df"])
    else:
        tokens["statistic"] = DF(ref["statistic"])
    if method == "sign":
        tokens["n"] = DF(ref["n"])  # "8 of 9 differences positive"
    return tokens


def paired_cases():
    cases = {}
    d = [a - b for a, b in zip(ABOVE, BELOW)]
    ref = paired_reference(d, True)
    for method in ("t", "signed-rank", "sign"):
        cases[f"culvert {method} none"] = {"reference": ref[method], "tokens": paired_tokens(ref[method], method)}
    # On the log scale; the mean difference and its limits come back as ratios, Cohen's d stays
    # as it is (a standardized effect has no unit to return to).
    log_ref = exp_interval(paired_reference([math.log(a) - math.log(b) for a, b in zip(ABOVE, BELOW)], True)["t"])
    cases["culvert t log"] = {"reference": log_ref, "tokens": paired_tokens(log_ref, "t")}
    ref = paired_reference([x - 7 for x in PH], True)
    for method in ("t", "signed-rank", "sign"):
        cases[f"ph {method}"] = {"reference": ref[method], "tokens": paired_tokens(ref[method], method)}
    return cases


def normality_cases():
    cases = {}
    x = np.asarray(SPRINGS)
    w, p = royston_shapiro_wilk(x)
    cases["springs shapiro-wilk"] = {"W": w, "p": p}
    w, p = royston_shapiro_francia(x)
    cases["springs shapiro-francia"] = {"W": w, "p": p}
    a2, p = normal_ad(x)
    cases["springs anderson-darling"] = {"A2": float(a2), "p": float(p)}
    dstat, p = lilliefors(x, dist="norm", pvalmethod="approx")
    cases["springs lilliefors"] = {"D": float(dstat), "p": float(p)}
    k2 = st.normaltest(x)
    cases["springs dagostino-pearson"] = {"K2": float(k2.statistic), "p": float(k2.pvalue)}
    jb = st.jarque_bera(x)
    cases["springs jarque-bera"] = {"JB": float(jb.statistic), "p": float(jb.pvalue)}
    out = {}
    for name, ref in cases.items():
        stat = [v for k, v in ref.items() if k != "p"][0]
        out[name] = {"reference": ref, "tokens": {"statistic": N(stat), "p": P(ref["p"])}}
    # Grouped form: residuals from the two site means of the oxygen data.
    residuals = [v - np.mean(RIFFLE) for v in RIFFLE] + [v - np.mean(POOL) for v in POOL]
    w, p = royston_shapiro_wilk(residuals)
    out["oxygen residuals shapiro-wilk"] = {"reference": {"W": w, "p": p}, "tokens": {"statistic": N(w), "p": P(p)}}
    return out


def variance_cases():
    groups = [np.asarray(g) for g in (FOREST, PASTURE, CROPLAND)]
    variances = [g.var(ddof=1) for g in groups]
    ratio = max(variances) / min(variances)
    k, n = len(groups), sum(len(g) for g in groups)
    out = {}
    for method, res, dfs in (("brown-forsythe", st.levene(*groups, center="median"), (k - 1, n - k)),
                             ("levene", st.levene(*groups, center="mean"), (k - 1, n - k)),
                             ("bartlett", st.bartlett(*groups), (k - 1,)),
                             ("fligner", st.fligner(*groups, center="median"), (k - 1,))):
        ref = {"statistic": float(res.statistic), "p": float(res.pvalue), "df": list(dfs), "variance ratio": ratio}
        out[f"nitrate {method}"] = {"reference": ref, "tokens": {
            "statistic": N(ref["statistic"]), "p": P(ref["p"]), "variance ratio": N(ratio)}}
    a, b = np.asarray(RIFFLE), np.asarray(POOL)
    f = a.var(ddof=1) / b.var(ddof=1)
    d1, d2 = len(a) - 1, len(b) - 1
    p = min(1.0, 2 * min(st.f.cdf(f, d1, d2), st.f.sf(f, d1, d2)))
    ratio = max(a.var(ddof=1), b.var(ddof=1)) / min(a.var(ddof=1), b.var(ddof=1))
    out["oxygen f-ratio"] = {"reference": {"statistic": f, "p": p, "df": [d1, d2], "variance ratio": ratio},
                             "tokens": {"statistic": N(f), "p": P(p), "variance ratio": N(ratio)}}
    return out


def counts_cases():
    out = {}
    a = np.asarray(MAYFLY, float)
    phi = float(st.contingency.association(a.astype(np.int64), method="cramer"))
    for method, correction, lam in (("chi-square", False, None), ("yates", True, None), ("g", False, "log-likelihood")):
        stat, p, dof, _ = st.chi2_contingency(a, correction=correction, lambda_=lam)
        out[f"mayfly {method}"] = {"reference": {"statistic": float(stat), "p": float(p), "df": int(dof), "effect": phi},
                                   "tokens": {"statistic": N(stat), "p": P(p), "effect": N(phi)}}
    p = float(st.fisher_exact(a.astype(np.int64), alternative="two-sided")[1])
    out["mayfly fisher"] = {"reference": {"p": p, "effect": phi}, "tokens": {"p": P(p), "effect": N(phi)}}
    b = np.asarray(NESTS, float)
    v = float(st.contingency.association(b.astype(np.int64), method="cramer"))
    stat, p, dof, _ = st.chi2_contingency(b, correction=False)
    out["nests chi-square"] = {"reference": {"statistic": float(stat), "p": float(p), "df": int(dof), "effect": v},
                               "tokens": {"statistic": N(stat), "p": P(p), "effect": N(v)}}
    p = freeman_halton_p(NESTS)
    out["nests fisher"] = {"reference": {"p": p, "effect": v}, "tokens": {"p": P(p), "effect": N(v)}}
    stat, p = st.chisquare(NEWTS)
    out["newts"] = {"reference": {"statistic": float(stat), "p": float(p)}, "tokens": {"statistic": N(stat), "p": P(p)}}
    return out


def correlation_cases():
    out = {}
    n = len(WIDTH)
    r = st.pearsonr(WIDTH, CANOPY)
    ci = r.confidence_interval(confidence_level=0.95)
    t = r.statistic * math.sqrt((n - 2) / (1 - r.statistic ** 2))
    out["width pearson"] = {"reference": {"r": float(r.statistic), "ci-low": float(ci.low), "ci-high": float(ci.high),
                                          "t": float(t), "p": float(r.pvalue)},
                            "tokens": {"estimate": N(r.statistic), "ci-low": N(ci.low), "ci-high": N(ci.high),
                                       "statistic": N(t), "p": P(r.pvalue)}}
    rho = st.spearmanr(WIDTH, CANOPY)
    t = rho.correlation * math.sqrt((n - 2) / (1 - rho.correlation ** 2))
    out["width spearman"] = {"reference": {"rho": float(rho.correlation), "t": float(t), "p": float(rho.pvalue)},
                             "tokens": {"estimate": N(rho.correlation), "statistic": N(t), "p": P(rho.pvalue)}}
    tau = st.kendalltau(WIDTH, CANOPY, method="exact")
    out["width kendall"] = {"reference": {"tau": float(tau.correlation), "p": float(tau.pvalue)},
                            "tokens": {"estimate": N(tau.correlation), "p": P(tau.pvalue)}}
    tau = st.kendalltau(TRAPS, CRAYFISH, method="asymptotic")
    # scipy gives no z: the two-sided normal p read back into |z|, signed as τ.
    z = math.copysign(st.norm.isf(tau.pvalue / 2), tau.correlation)
    out["crayfish kendall"] = {"reference": {"tau": float(tau.correlation), "z": z, "p": float(tau.pvalue)},
                               "tokens": {"estimate": N(tau.correlation), "statistic": N(z), "p": P(tau.pvalue)}}
    return out


def linear_cases():
    out = {}
    X = sm.add_constant(np.asarray(WIDTH, float))
    res = sm.OLS(np.asarray(CANOPY, float), X).fit(method="qr")
    low, high = res.conf_int(alpha=0.05)[1]
    out["canopy on width"] = {
        "reference": {"r-squared": float(res.rsquared), "f": float(res.fvalue), "p": float(res.f_pvalue),
                      "slope": float(res.params[1]), "ci-low": float(low), "ci-high": float(high)},
        "tokens": {"r-squared": N(res.rsquared), "statistic": N(res.fvalue), "p": P(res.f_pvalue),
                   "estimate": N(res.params[1]), "ci-low": N(low), "ci-high": N(high)}}
    X = sm.add_constant(np.column_stack([WIDTH, WILLOW]).astype(float))
    res = sm.OLS(np.asarray(CANOPY, float), X).fit(method="qr")
    out["canopy on width and willow"] = {
        "reference": {"r-squared": float(res.rsquared), "f": float(res.fvalue), "p": float(res.f_pvalue)},
        "tokens": {"r-squared": N(res.rsquared), "statistic": N(res.fvalue), "p": P(res.f_pvalue)}}
    return out


def advisor_cases():
    # The advisor's two-group path on the oxygen data: Brown–Forsythe across the sites, then
    # Shapiro–Wilk on the residuals from the site means (spreads similar, so not rescaled).
    bf = st.levene(RIFFLE, POOL, center="median")
    residuals = [v - np.mean(RIFFLE) for v in RIFFLE] + [v - np.mean(POOL) for v in POOL]
    _, sw_p = royston_shapiro_wilk(residuals)
    return {"oxygen": {"reference": {"brown-forsythe p": float(bf.pvalue), "shapiro-wilk p": sw_p},
                       "tokens": {"spread p": P(bf.pvalue), "normality p": P(sw_p)}}}


def limit_cases():
    """LIMIT.* on the invented ammonia samples (generate_limits.py): the t limit (SciPy's t
    quantile), the share above 1 mg/L with its one-sided 95% Clopper–Pearson limit (the upper end of
    SciPy's two-sided 90% exact interval), and the normal upper tolerance limit for 90% (k from
    SciPy's noncentral t)."""
    a = np.asarray(AMMONIA)
    n, m, s = len(a), float(a.mean()), float(a.std(ddof=1))
    ucl = m + st.t.ppf(0.95, n - 1) * s / math.sqrt(n)
    out = {"ammonia t": {"reference": {"limit": ucl, "mean": m, "SD": s, "n": n},
                         "tokens": {"limit": N(ucl), "mean": N(m), "SD": N(s), "n": DF(n)}}}
    count = int((a > 1).sum())
    upper = float(st.binomtest(count, n).proportion_ci(0.90, method="exact").high)
    out["ammonia exceedance 1"] = {"reference": {"limit": upper, "count": count, "share": count / n},
                                   "tokens": {"limit": N(upper), "count": DF(count), "share": N(count / n), "n": DF(n)}}
    k = float(st.nct.ppf(0.95, n - 1, st.norm.ppf(0.9) * math.sqrt(n)) / math.sqrt(n))
    # The median with its distribution-free limit: the smallest order statistic x(r) with
    # P(Bin(24, 0.5) ≤ r − 1) ≥ 0.95 (SciPy's binomial), the median as NumPy's (PERCENTILE.INC's) one.
    r = next(r for r in range(1, n + 1) if st.binom.cdf(r - 1, n, 0.5) >= 0.95)
    median, sorted_a = float(np.percentile(a, 50)), sorted(AMMONIA)
    out["ammonia median"] = {"reference": {"limit": sorted_a[r - 1], "rank": r, "median": median},
                             "tokens": {"limit": N(sorted_a[r - 1]), "median": N(median), "n": DF(n)}}
    # The next reading: mean + t(0.95, n − 1)·SD·√(1 + 1/n).
    kp = float(st.t.ppf(0.95, n - 1) * math.sqrt(1 + 1 / n))
    out["ammonia prediction"] = {"reference": {"limit": m + kp * s, "k-factor": kp},
                                 "tokens": {"limit": N(m + kp * s), "mean": N(m), "SD": N(s), "k": N(kp)}}
    out["ammonia tolerance 0.9"] = {"reference": {"limit": m + k * s, "k-factor": k},
                                    "tokens": {"limit": N(m + k * s), "mean": N(m), "SD": N(s), "k": N(k)}}
    return out


def outlier_cases():
    """CHECK.OUTLIERS on Rosner's 54 values (NIST/SEMATECH e-Handbook §1.3.5.17, generate_limits.py):
    the generalized ESD's three outliers with 5 tested (10% of 54), and Grubbs' G = R1 against λ1,
    both from Rosner's procedure written out in generate_limits.py."""
    steps = esd_steps(ROSNER, 5, 0.05)
    flagged = [st_["value"] for st_ in steps[:3]]
    out = {"rosner generalized-esd": {"reference": {"outliers": flagged},
                                      "tokens": {"value%d" % (i + 1): N(v) for i, v in enumerate(flagged)}}}
    first = steps[0]
    out["rosner grubbs"] = {"reference": {"G": first["R"], "critical": first["lambda"]},
                            "tokens": {"G": N(first["R"]), "critical": N(first["lambda"])}}
    return out


def over_time_cases():
    """TRACK.TREND, COMPARE.BLOCKS and COMPARE.NESTED on the published examples their own generators
    hold: the EPA Mann-Kendall example (generate_trend.py: S and p by brute force from the definitions,
    tau-b and the Theil slope from scipy.stats.kendalltau/theilslopes, the Sen interval from the listed
    slopes), Montgomery's hardness example (generate_blocks.py: statsmodels OLS anova_lm, SciPy
    friedmanchisquare) and Sokal & Rohlf's rat livers (generate_blocks.py: SciPy f_oneway on the rat
    means, the variance components in exact fractions)."""
    with open(os.path.join(HERE, "trend.json")) as fh:
        epa = json.load(fh)["cases"]["epa"]
    with open(os.path.join(HERE, "blocks.json")) as fh:
        blocks = json.load(fh)
    ref, sp = epa["reference"], epa["scipy"]
    out = {"epa": {"reference": ref, "tokens": {
        "statistic": DF(ref["S"]), "p": P(ref["p"]), "n": DF(ref["n"]), "estimate": N(sp["theil_slope"]),
        "ci-low": N(ref["ci_low"]), "ci-high": N(ref["ci_high"]), "effect": N(sp["tau_b"]), "percent": N(ref["percent"])}}}
    hard = blocks["hardness"]
    for method in ("pooled", "ranks"):
        r = hard[method]
        out["hardness " + method] = {"reference": r, "tokens": {
            "statistic": N(r["statistic"]), "df": DF(r["df"]), "p": P(r["p"]), "effect": N(r["effect"])}}
    rats = blocks["rats"]
    shares = {k: "%d%%" % round(100 * rats["share " + k]) for k in ("between groups", "between units", "within units")}
    out["rats"] = {"reference": {k: rats[k] for k in ("statistic", "df", "df2", "p")},
                   "tokens": {"statistic": N(rats["statistic"]), "df": DF(rats["df"]), "df2": DF(rats["df2"]),
                              "p": P(rats["p"]), **shares}}
    return out


def censored_cases():
    # statsmodels 0.13 survdiff on the flipped values (generate_censored.py: "fh" with fh_p=1 for
    # peto-prentice, "gb" for gehan) and the Kaplan-Meier medians from SurvfuncRight's curve.
    out = {}
    groups = {"upgradient": LEAD_UP, "downgradient": LEAD_DOWN}
    tests = survdiff_reference(groups)
    medians = {name: km_reference(parse(cells))["quantiles"]["0.5"] for name, cells in groups.items()}
    for method in ("peto-prentice", "gehan"):
        stat, p = tests[method]
        out["lead " + method] = {"reference": {"statistic": stat, "p": p, "medians": medians},
                                 "tokens": {"statistic": N(stat), "p": P(p),
                                            **{"median " + k: N(v) for k, v in medians.items()}}}
    return out


def main():
    out = {"generator": "tests/reference/generate_reports.py", "scipy": scipy.__version__,
           "statsmodels": statsmodels.__version__}
    out["groups"] = {**two_group_cases(), **three_group_cases()}
    out["paired"] = paired_cases()
    out["normality"] = normality_cases()
    out["variance"] = variance_cases()
    out["counts"] = counts_cases()
    out["correlation"] = correlation_cases()
    out["linear"] = linear_cases()
    out["advisor"] = advisor_cases()
    out["limits"] = limit_cases()
    out["outliers"] = outlier_cases()
    out["over time"] = over_time_cases()
    out["censored"] = censored_cases()
    path = os.path.join(HERE, "reports.json")
    with open(path, "w") as fh:
        json.dump(out, fh, indent=1, sort_keys=True, default=float)
        fh.write("\n")
    print("wrote", path)
    for s, x in near_boundary:
        print("near a rounding boundary:", s, repr(x))


if __name__ == "__main__":
    main()
