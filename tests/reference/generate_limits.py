#!/usr/bin/python3
"""Reference values for LIMIT.*, CHECK.OUTLIERS and PLAN.* (tests/core/limits_test.cpp,
outliers_test.cpp, plan_test.cpp), from Debian's SciPy 1.10, statsmodels 0.13 and mpmath.

Run from the repository root:  /usr/bin/python3 tests/reference/generate_limits.py
Writes tests/reference/limits.json. Refuses to write when a printed value quoted below is not
reproduced to its printed digits, so a misread number fails loudly.

Sources of the printed values:
- NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.5.17 (generalized ESD test), its R
  listing for Rosner's example (the handbook's "R commands and output" for that section, read
  through the stored copy found by searching for its printed R1 = 3.118906): the 54 values, the
  statistics R1..R10 and the critical values λ1..λ10 below, printed to 6 decimals. The same 54
  values appear as Rosner (1983)'s example in other public listings; the handbook's page itself
  could not be opened here.
- NIST/SEMATECH e-Handbook §7.2.6.3 (tolerance intervals for a normal distribution): N = 43,
  coverage 0.90, confidence 0.99, printed k1 = 1.8752 (one-sided) and k2 = 2.2173 (two-sided), both
  from approximations (Natrella's one-sided formula, Howe's two-sided one), quoted from the issue
  that filed this work (second-hand); this script recomputes both approximations to those digits.
"""
import json
import math
import pathlib
import sys
from fractions import Fraction

import numpy as np
from scipy import stats
from scipy.optimize import brentq
from statsmodels.stats.power import FTestAnovaPower, TTestIndPower, TTestPower

from generate_describe import t_quantile  # 40-digit mpmath Student quantile

ROSNER = [-0.25, 0.68, 0.94, 1.15, 1.20, 1.26, 1.26, 1.34, 1.38, 1.43, 1.49, 1.49, 1.55, 1.56,
          1.58, 1.65, 1.69, 1.70, 1.76, 1.77, 1.81, 1.91, 1.94, 1.96, 1.99, 2.06, 2.09, 2.10,
          2.14, 2.15, 2.23, 2.24, 2.26, 2.35, 2.37, 2.40, 2.47, 2.54, 2.62, 2.64, 2.90, 2.92,
          2.92, 2.93, 3.21, 3.26, 3.30, 3.59, 3.68, 4.30, 4.64, 5.34, 5.42, 6.01]
ROSNER_R = [3.118906, 2.942973, 3.179424, 2.810181, 2.815580, 2.848172, 2.279327, 2.310366,
            2.101581, 2.067178]
ROSNER_LAMBDA = [3.158794, 3.151430, 3.143890, 3.136165, 3.128247, 3.120128, 3.111796, 3.103243,
                 3.094456, 3.085425]

# Invented: ammonia (mg/L) in 24 weekly effluent samples of an imaginary treatment works.
AMMONIA = [0.62, 0.48, 0.91, 0.55, 1.34, 0.71, 0.66, 0.83, 0.59, 0.77, 1.12, 0.52,
           0.68, 0.95, 0.61, 0.73, 2.05, 0.64, 0.87, 0.58, 0.79, 1.01, 0.69, 0.74]


def require(ok, what):
    if not ok:
        sys.exit("generate_limits.py: " + what)


def esd_steps(values, steps, alpha):
    """Rosner's procedure written out plainly: drop the farthest value, one at a time."""
    y = list(values)
    n = len(y)
    out = []
    for i in range(1, steps + 1):
        a = np.asarray(y)
        m, s = a.mean(), a.std(ddof=1)
        far = int(np.argmax(np.abs(a - m)))
        p = 1 - alpha / (2 * (n - i + 1))
        t = stats.t.ppf(p, n - i - 1)
        lam = t * (n - i) / math.sqrt((n - i - 1 + t * t) * (n - i + 1))
        out.append({"value": y[far], "R": abs(y[far] - m) / s, "lambda": lam})
        del y[far]
    return out


def natrella_k1(n, p, g):
    zp, zg = stats.norm.ppf(p), stats.norm.ppf(g)
    a = 1 - zg ** 2 / (2 * (n - 1))
    b = zp ** 2 - zg ** 2 / n
    return (zp + math.sqrt(zp ** 2 - a * b)) / a


def howe_k2(n, p, g):
    return stats.norm.ppf((1 + p) / 2) * math.sqrt((n - 1) * (1 + 1 / n) / stats.chi2.ppf(1 - g, n - 1))


def exact_k1(n, p, g):
    k = stats.nct.ppf(g, n - 1, stats.norm.ppf(p) * math.sqrt(n)) / math.sqrt(n)
    # SciPy's nct.ppf gives up (inf/NaN) in the far tails at 1 df; such cases are left out.
    return float(k) if math.isfinite(k) else None


def rank_by_binomial(n, p, level):
    """Smallest r with P(Bin(n, p) <= r - 1) >= level, by walking r up (no bisection)."""
    for r in range(1, n + 1):
        if stats.binom.cdf(r - 1, n, p) >= level:
            return r
    return 0


def share_of_orderings(gaps, n, m):
    """C(G + m - 1, m) / C(n + m, m) in exact fractions."""
    return Fraction(math.comb(gaps + m - 1, m), math.comb(n + m, m))


def main():
    out = {}

    # --- generalized ESD and Grubbs on Rosner's data ---
    steps = esd_steps(ROSNER, 10, 0.05)
    for got, r, lam in zip(steps, ROSNER_R, ROSNER_LAMBDA):
        require(abs(got["R"] - r) < 5e-7, f"R {got['R']} does not print as {r}")
        require(abs(got["lambda"] - lam) < 5e-7, f"lambda {got['lambda']} does not print as {lam}")
    out["rosner"] = {"values": ROSNER, "printed_R": ROSNER_R, "printed_lambda": ROSNER_LAMBDA,
                     "steps": steps, "outliers": 3}

    # --- tolerance factors ---
    k1_printed, k2_printed = 1.8752, 2.2173
    require(round(natrella_k1(43, 0.90, 0.99), 4) == k1_printed, "Natrella k1 does not print as 1.8752")
    require(round(howe_k2(43, 0.90, 0.99), 4) == k2_printed, "Howe k2 does not print as 2.2173")
    out["nist_tolerance"] = {"n": 43, "proportion": 0.90, "confidence": 0.99,
                             "printed_k1": k1_printed, "printed_k2": k2_printed,
                             "natrella_k1": natrella_k1(43, 0.90, 0.99),
                             "exact_k1": exact_k1(43, 0.90, 0.99)}
    out["tolerance_factors"] = [
        {"n": n, "proportion": p, "confidence": g, "k1": exact_k1(n, p, g), "k2": howe_k2(n, p, g)}
        for n in (2, 5, 10, 43, 100, 1000) for p in (0.75, 0.90, 0.99) for g in (0.90, 0.95, 0.99)]

    # --- Clopper–Pearson: one-sided upper at level = binomtest(alternative='less') ---
    cp = []
    for k, n, level in [(0, 10, 0.95), (1, 10, 0.95), (3, 24, 0.95), (12, 24, 0.90), (23, 24, 0.99),
                        (24, 24, 0.95), (0, 1, 0.95), (5, 1000, 0.95), (250, 1000, 0.99)]:
        upper = stats.binomtest(k, n, alternative="less").proportion_ci(confidence_level=level, method="exact").high
        two = stats.binomtest(k, n).proportion_ci(confidence_level=2 * level - 1, method="exact").high
        require(abs(upper - two) < 1e-9 * max(1, upper), "one-sided and two-sided Clopper-Pearson disagree")
        cp.append({"k": k, "n": n, "level": level, "upper": upper})
    out["clopper_pearson"] = cp

    # --- LIMIT.* on the invented ammonia samples ---
    x = np.asarray(AMMONIA)
    n = len(x)
    m, s = x.mean(), x.std(ddof=1)
    t95 = t_quantile(0.95, n - 1)
    ordered = np.sort(x)
    r90 = rank_by_binomial(n, 0.5, 0.95)  # the median's upper limit
    zp = stats.norm.ppf(0.9)
    out["ammonia"] = {
        "values": AMMONIA, "mean": m, "sd": s,
        "t_ucl": m + t95 * s / math.sqrt(n),
        "t_ucl_99": m + t_quantile(0.99, n - 1) * s / math.sqrt(n),
        "chebyshev_ucl": m + math.sqrt(1 / 0.05 - 1) * s / math.sqrt(n),
        "percentile_80": float(np.percentile(x, 80)),  # linear interpolation = PERCENTILE.INC
        "p80_rank": rank_by_binomial(n, 0.8, 0.95),
        "p80_ucl": float(ordered[rank_by_binomial(n, 0.8, 0.95) - 1]),
        "median": float(np.percentile(x, 50)),
        "median_rank": r90, "median_ucl": float(ordered[r90 - 1]),
        "exceed_count": int((x > 1.0).sum()),
        "exceed_upper": stats.binomtest(int((x > 1.0).sum()), n, alternative="less").proportion_ci(
            confidence_level=0.95, method="exact").high,
        "tolerance_upper": m + exact_k1(n, 0.9, 0.95) * s,
        "tolerance_lower": m - exact_k1(n, 0.9, 0.95) * s,
        "tolerance_percentile": m + zp * s,
        "tolerance_two_low": m - howe_k2(n, 0.9, 0.95) * s,
        "tolerance_two_high": m + howe_k2(n, 0.9, 0.95) * s,
        "prediction_upper_1": m + t_quantile(0.95, n - 1) * s * math.sqrt(1 + 1 / n),
        "prediction_upper_3": m + t_quantile(1 - 0.05 / 3, n - 1) * s * math.sqrt(1 + 1 / n),
        "prediction_two_3_high": m + t_quantile(1 - 0.05 / 6, n - 1) * s * math.sqrt(1 + 1 / n),
    }

    # --- distribution-free ranks, by walking the binomial / exact fractions ---
    out["percentile_ranks"] = [{"n": n_, "p": p, "level": lv, "rank": rank_by_binomial(n_, p, lv)}
                               for n_, p, lv in [(100, 0.5, 0.95), (59, 0.95, 0.95), (30, 0.9, 0.95),
                                                 (200, 0.9, 0.99), (1000, 0.95, 0.9)]]
    pred = []
    for n_, m_, lv in [(19, 1, 0.95), (50, 1, 0.95), (50, 3, 0.95), (120, 5, 0.99), (40, 2, 0.90)]:
        rank = next((r for r in range(1, n_ + 1) if share_of_orderings(r, n_, m_) >= Fraction(lv).limit_denominator(1000)), 0)
        j = max((j for j in range(1, n_ // 2 + 1) if share_of_orderings(n_ - 2 * j + 1, n_, m_) >= Fraction(lv).limit_denominator(1000)), default=0)
        pred.append({"n": n_, "readings": m_, "level": lv, "rank": rank, "two_sided_j": j})
    out["prediction_ranks"] = pred

    # --- power (statsmodels) ---
    # The detectable difference is solved here on statsmodels' power function with brentq at xtol
    # 1e-14: statsmodels' solve_power stops about 2e-6 short, and for F searches f only in (0, 1).
    power = []
    for design, d, nn, alpha, k in [("two-groups", 0.5, 64, 0.05, 2), ("two-groups", 0.8, 26, 0.05, 2),
                                    ("two-groups", 1.2, 10, 0.01, 2), ("paired", 0.5, 34, 0.05, 1),
                                    ("one-sample", 0.3, 90, 0.10, 1), ("several-groups", 1.0, 20, 0.05, 3),
                                    ("several-groups", 0.8, 15, 0.05, 5), ("several-groups", 1.5, 6, 0.01, 4)]:
        target = 0.8 if alpha != 0.01 else 0.9
        if design == "two-groups":
            model = TTestIndPower()
            pw = model.power(effect_size=d, nobs1=nn, alpha=alpha, ratio=1.0, alternative="two-sided")
            need = model.solve_power(effect_size=d, nobs1=None, alpha=alpha, power=target, ratio=1.0)
            det = brentq(lambda dd: model.power(effect_size=dd, nobs1=nn, alpha=alpha, ratio=1.0) - target,
                         1e-6, 50, xtol=1e-14, rtol=1e-14)
        elif design in ("paired", "one-sample"):
            model = TTestPower()
            pw = model.power(effect_size=d, nobs=nn, alpha=alpha, alternative="two-sided")
            need = model.solve_power(effect_size=d, nobs=None, alpha=alpha, power=target)
            det = brentq(lambda dd: model.power(effect_size=dd, nobs=nn, alpha=alpha) - target,
                         1e-6, 50, xtol=1e-14, rtol=1e-14)
        else:
            # Cohen's f of the least favourable arrangement: two means at ±D/2, k − 2 at the midpoint,
            # σ_means² = (2·(D/2)²)/k = D²/(2k), f = σ_means/σ = (D/σ)·√(1/(2k)). FTestAnovaPower takes
            # the total number of readings and uses λ = f²·N = k·n·D²/(2kσ²) = n·D²/(2σ²).
            f = d * math.sqrt(1 / (2 * k))
            model = FTestAnovaPower()
            pw = model.power(effect_size=f, nobs=k * nn, alpha=alpha, k_groups=k)
            need = model.solve_power(effect_size=f, nobs=None, alpha=alpha, power=target, k_groups=k) / k
            det = brentq(lambda dd: model.power(effect_size=dd * math.sqrt(1 / (2 * k)), nobs=k * nn, alpha=alpha,
                                                k_groups=k) - target, 1e-6, 50, xtol=1e-14, rtol=1e-14)
        power.append({"design": design, "d": d, "n": nn, "level": 1 - alpha, "count": k, "power": float(pw),
                      "target": target, "n_fractional": float(need), "detectable_d": float(det)})
    out["power"] = power

    path = pathlib.Path(__file__).with_name("limits.json")
    path.write_text(json.dumps(out, indent=1) + "\n")
    print("wrote", path)


if __name__ == "__main__":
    main()
