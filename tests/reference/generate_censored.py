#!/usr/bin/python3
"""Reference values for DESCRIBE.CENSORED and COMPARE.CENSORED (src/core/censored.cpp).

Run from the repository root:  /usr/bin/python3 tests/reference/generate_censored.py
Writes tests/reference/censored.json from Debian's statsmodels 0.13 (duration module), mpmath and
exact fractions:

- kaplan_meier: statsmodels.duration.survfunc.SurvfuncRight on the values flipped about a constant
  (t = M - x, status 1 for a detect), as Helsel (2012) flips left-censored data. A censored value
  tied with a detect becomes a right-censored time tied with an event; statsmodels, like every
  survival program, keeps it at risk at that time (the detect is above the non-detect), which is
  the convention of the core. From statsmodels' curve (surv_prob, n_risk, n_events) this script
  takes the estimate at each detect, the restricted mean (area under the flipped curve up to the
  lowest observation) and its Greenwood-type SE (Klein & Moeschberger 2003, eq. 4.5.2; statsmodels
  has no mean); quantiles by the core's rule (smallest v with P(X <= v) >= p, midpoint of a flat
  stretch at exactly p) and, beside them, statsmodels' own quantile(1 - p) on the flipped scale
  (strict inequality: the lower end of a flat stretch), so the two can be compared where no
  stretch is flat.
- survdiff: statsmodels.duration.survfunc.survdiff on the flipped values, weight_type "gb"
  (Gehan-Breslow: weight = number at risk) and "fh" with fh_p=1 (weight = pooled Kaplan-Meier
  S(t-) at the previous event time: the Peto-Prentice weight in the Harrington-Fleming form).
  Both use the hypergeometric (log-rank) variance; so does the core.
- exact: the same weighted log-rank statistics worked in exact fractions (fractions.Fraction),
  independent of statsmodels, on two small sets (the hand check of the score and variance).
- ros: Helsel & Cohn (1988) robust ROS with Hirsch-Stedinger plotting positions on a small set
  with two limits: exceedance probabilities and positions in exact fractions (also written out
  in tests/core/censored_test.cpp), normal scores by mpmath at 30 digits, the least-squares line
  and the filled-in values in mpmath.

The data are invented (dissolved metals, ug/L, at imaginary wells) except the 6-MP remission
times, which the core test carries itself.
"""
import json
import pathlib
from fractions import Fraction

import mpmath
import numpy as np
import statsmodels
from statsmodels.duration.survfunc import SurvfuncRight, survdiff

mpmath.mp.dps = 30

# Left-censored sets: (value, censored). A censored value is its detection limit.
def parse(cells):
    out = []
    for c in cells:
        if isinstance(c, str):
            out.append((float(c[1:]), True))
        else:
            out.append((float(c), False))
    return out


KM_CASES = {
    # One limit, ties between a detect and a limit at 0.5, a flat stretch at the median.
    "zinc_well_a": ["<0.5", 0.5, 0.7, "<0.5", 1.2, 0.9, 2.4, 0.5, "<0.5", 1.6, 3.1, 0.8],
    # Several limits (0.2, 0.5, 1), a limit above some detects, lowest value a detect.
    "copper_well_b": [0.1, "<0.2", 0.3, "<0.5", 0.45, 0.6, "<1", 0.8, 1.1, "<0.2", 1.9, 2.2, 0.35, "<0.5"],
    # Complete data of even size: the median is the midpoint.
    "complete_even": [4.0, 1.0, 3.0, 2.0, 6.0, 5.0, 8.0, 7.0],
    # A limit above every detect (the largest value is censored), 3 of 7 censored.
    "limit_above_detects": [0.4, "<2", 0.9, "<0.5", 1.3, "<0.5", 0.7],
}

COMPARE_CASES = {
    "three_wells": {
        "upstream": ["<0.5", 0.6, "<0.5", 0.9, 1.4, "<1", 0.7, 2.2, "<0.5", 1.1],
        "pond": [1.8, 2.6, "<1", 3.4, 1.2, 2.9, 0.8, "<0.5", 4.1, 2.0, 1.6],
        "outfall": [2.2, "<1", 5.3, 3.8, 1.9, 6.4, 2.7, 4.4, "<0.5"],
    },
    "two_wells_ties": {
        "north": [0.5, "<0.5", 0.5, 1.0, "<1", 1.5, 2.0, "<0.5"],
        "south": ["<0.5", 1.0, 1.0, 2.5, "<1", 3.0, 1.5, 2.0, 0.5],
    },
}

# Small sets for the exact-fraction hand check (also the glue of the test comment).
EXACT_CASES = {
    "tiny_two": {"a": [1.0, "<2", 3.0, 5.0], "b": ["<1", 2.0, 2.0, 4.0, "<4"]},
    "tiny_three": {"a": [1.0, "<2", 3.0], "b": ["<1", 2.0, 4.0], "c": [5.0, "<3", 6.0, 2.0]},
}

# Helsel & Cohn ROS, two limits (1 and 2); worked by hand in censored_test.cpp.
ROS_CASE = ["<1", 1.5, "<2", 2.5, 3.0, "<1", 4.0, 6.0]

FLIP = 100.0  # above every value of the sets


def flipped(obs):
    t = np.array([FLIP - v for v, _ in obs])
    status = np.array([0 if c else 1 for _, c in obs])
    return t, status


def km_reference(obs):
    t, status = flipped(obs)
    sf = SurvfuncRight(t, status)
    times = np.asarray(sf.surv_times)     # flipped event times, ascending = detects descending
    prob = np.asarray(sf.surv_prob)
    n_risk = np.asarray(sf.n_risk, dtype=float)
    n_events = np.asarray(sf.n_events, dtype=float)
    values = FLIP - times
    # The restriction point: the largest flipped time (the lowest observation).
    tau = float(t.max())
    # Area under S from each event time to tau; S = 1 before the first event time.
    steps = list(times) + [tau]
    area_from = []
    for j in range(len(times)):
        area_from.append(sum(prob[i] * (steps[i + 1] - steps[i]) for i in range(j, len(times))))
    mean = FLIP - (times[0] + area_from[0])
    var = sum(area_from[j] ** 2 * n_events[j] / (n_risk[j] * (n_risk[j] - n_events[j]))
              for j in range(len(times)) if n_risk[j] > n_events[j])

    def quantile(p):
        for j, s in enumerate(prob):
            if s >= p + 1e-12:
                continue
            if s > p - 1e-12:
                return float((values[j] + values[j + 1]) / 2) if j + 1 < len(prob) else None
            return float(values[j])
        return None

    def statsmodels_quantile(p):
        q = sf.quantile(1 - p)
        return None if np.isnan(q) else float(FLIP - q)

    return {
        "values": [[v, c] for v, c in obs],
        "detected_values": [float(v) for v in values],
        "at_risk": n_risk.tolist(),
        "detections": n_events.tolist(),
        "below": prob.tolist(),
        "mean": float(mean),
        "mean_se": float(np.sqrt(var)),
        "quantiles": {str(p): quantile(p) for p in (0.25, 0.5, 0.75)},
        "statsmodels_quantiles": {str(p): statsmodels_quantile(p) for p in (0.25, 0.5, 0.75)},
    }


def survdiff_reference(groups):
    obs, labels = [], []
    for g, (name, cells) in enumerate(groups.items()):
        for o in parse(cells):
            obs.append(o)
            labels.append(g)
    t, status = flipped(obs)
    labels = np.array(labels)
    gehan, p_gehan = survdiff(t, status, labels, weight_type="gb")
    peto, p_peto = survdiff(t, status, labels, weight_type="fh", fh_p=1)
    return {"gehan": [float(gehan), float(p_gehan)], "peto-prentice": [float(peto), float(p_peto)]}


def exact_statistics(groups):
    """The weighted log-rank statistic in exact fractions, from the definition, largest value first."""
    obs = []
    for g, cells in enumerate(groups.values()):
        obs += [(Fraction(v).limit_denominator(10**6), c, g) for v, c in parse(cells)]
    k = len(groups)
    out = {}
    for method in ("gehan", "peto-prentice"):
        u = [Fraction(0)] * (k - 1)
        var = [[Fraction(0)] * (k - 1) for _ in range(k - 1)]
        s_before = Fraction(1)
        for v in sorted({o[0] for o in obs}, reverse=True):
            risk = [sum(1 for o in obs if o[0] <= v and o[2] == g) for g in range(k)]
            events = [sum(1 for o in obs if o[0] == v and not o[1] and o[2] == g) for g in range(k)]
            b, m = sum(risk), sum(events)
            if m == 0:
                continue
            if b > 1:
                w = Fraction(b) if method == "gehan" else s_before
                for g in range(k - 1):
                    u[g] += w * (events[g] - Fraction(risk[g] * m, b))
                    for h in range(k - 1):
                        var[g][h] += w * w * Fraction(m * (b - m), b - 1) * Fraction(risk[g], b) * (
                            (1 if g == h else 0) - Fraction(risk[h], b))
            s_before *= 1 - Fraction(m, b)
        # chi2 = u' V^-1 u by exact Gaussian elimination.
        a = [row[:] + [u[i]] for i, row in enumerate(var)]
        n = k - 1
        for c in range(n):
            piv = next(r for r in range(c, n) if a[r][c] != 0)
            a[c], a[piv] = a[piv], a[c]
            for r in range(n):
                if r != c and a[r][c] != 0:
                    f = a[r][c] / a[c][c]
                    a[r] = [x - f * y for x, y in zip(a[r], a[c])]
        x = [a[i][n] / a[i][i] for i in range(n)]
        chi2 = sum(ui * xi for ui, xi in zip(u, x))
        out[method] = {"u": [str(q) for q in u], "chi2": str(chi2), "chi2_float": float(chi2)}
    return out


def ros_reference(cells):
    obs = parse(cells)
    limits = sorted({v for v, c in obs if c})
    detects = sorted(v for v, c in obs if not c)
    m = len(limits)
    F = Fraction
    a = []
    for j in range(m + 1):
        lo = -np.inf if j == 0 else limits[j - 1]
        hi = np.inf if j == m else limits[j]
        a.append(sum(1 for d in detects if lo <= d < hi))
    pe = [F(0)] * (m + 2)
    pe[0] = F(1)
    for j in range(m, 0, -1):
        b = sum(1 for d in detects if d < limits[j - 1]) + sum(1 for v, c in obs if c and v <= limits[j - 1])
        pe[j] = pe[j + 1] + F(a[j], a[j] + b) * (1 - pe[j + 1])
    pp_detect, pp_censored = [], []
    for j in range(m + 1):
        lo = -np.inf if j == 0 else limits[j - 1]
        hi = np.inf if j == m else limits[j]
        inside = [d for d in detects if lo <= d < hi]
        for r, d in enumerate(inside, 1):
            pp_detect.append((d, (1 - pe[j]) + (pe[j] - pe[j + 1]) * F(r, a[j] + 1)))
    for j, dl in enumerate(limits, 1):
        c = sum(1 for v, cen in obs if cen and v == dl)
        for r in range(1, c + 1):
            pp_censored.append((dl, (1 - pe[j]) * F(r, c + 1)))
    z = [mpmath.sqrt(2) * mpmath.erfinv(2 * mpmath.mpf(p.numerator) / p.denominator - 1) for _, p in pp_detect]
    y = [mpmath.log(d) for d, _ in pp_detect]
    zm, ym = sum(z) / len(z), sum(y) / len(y)
    slope = sum((zi - zm) * (yi - ym) for zi, yi in zip(z, y)) / sum((zi - zm) ** 2 for zi in z)
    intercept = ym - slope * zm
    imputed = [mpmath.exp(intercept + slope * mpmath.sqrt(2) * mpmath.erfinv(2 * mpmath.mpf(p.numerator) / p.denominator - 1))
               for _, p in pp_censored]
    filled = [mpmath.mpf(d) for d in detects] + imputed
    mean = sum(filled) / len(filled)
    sd = mpmath.sqrt(sum((f - mean) ** 2 for f in filled) / (len(filled) - 1))
    return {
        "values": [[v, c] for v, c in obs],
        "exceedance": [str(p) for p in pe],
        "detect_positions": [[d, str(p)] for d, p in pp_detect],
        "censored_positions": [[dl, str(p)] for dl, p in pp_censored],
        "intercept": float(intercept),
        "slope": float(slope),
        "imputed": [float(x) for x in imputed],
        "mean": float(mean),
        "sd": float(sd),
    }


def main():
    out = {
        "source": "tests/reference/generate_censored.py, statsmodels " + statsmodels.__version__ +
                  ", mpmath " + mpmath.__version__,
        "flip": FLIP,
        "kaplan_meier": {name: km_reference(parse(cells)) for name, cells in KM_CASES.items()},
        "survdiff": {name: {"groups": [[g, [[v, c] for v, c in parse(cells)]] for g, cells in groups.items()],
                            **survdiff_reference(groups)} for name, groups in COMPARE_CASES.items()},
        "exact": {name: {"groups": [[g, [[v, c] for v, c in parse(cells)]] for g, cells in groups.items()],
                         **exact_statistics(groups)} for name, groups in EXACT_CASES.items()},
        "ros": ros_reference(ROS_CASE),
    }
    # statsmodels' survdiff on the exact sets too: the same definition, so it must agree.
    for name, groups in EXACT_CASES.items():
        sm = survdiff_reference(groups)
        for method in ("gehan", "peto-prentice"):
            exact = out["exact"][name][method]["chi2_float"]
            if abs(sm[method][0] - exact) > 1e-10 * max(1.0, exact):
                raise SystemExit(f"statsmodels {method} on {name}: {sm[method][0]} against exact {exact}")
        out["exact"][name]["statsmodels"] = sm
    path = pathlib.Path(__file__).with_name("censored.json")
    path.write_text(json.dumps(out, indent=1, ensure_ascii=False) + "\n")
    print("wrote", path)


if __name__ == "__main__":
    main()
