#!/usr/bin/python3
"""Reference values for TRACK.TREND (Mann–Kendall, seasonal Kendall, Sen slope), from SciPy 1.10
(Debian's python3-scipy) and from brute-force implementations written here from the papers.
Run with /usr/bin/python3; writes trend.json beside this script.

- scipy.stats.kendalltau(times, values) gives τ-b against time; its S is τ-b times
  √((N − Tt)(N − Ty)), the Mann–Kendall S. Its p is not the Mann–Kendall p (no continuity
  correction), so p is not taken from it.
- scipy.stats.theilslopes(values, times, alpha, method='separate') gives Sen's slope (the median
  of the slopes over pairs at different times: the same set). Its interval differs from ours in
  two ways, so it is stored but only compared loosely: SciPy rounds the ranks (N ∓ C)/2 to whole
  numbers where we interpolate, and its C uses Sen's (1968) eq. 2.6 variance without the two
  cross terms of Kendall's tie correction. Our interval is checked against the brute-force list
  of all slopes below, with our rule.
- The seasonal Kendall test is not in SciPy or statsmodels: worked here from Hirsch, Slack &
  Smith (1982) by brute force, O(n²) per season: S_g = Σ sign(y_j − y_i)·sign(t_j − t_i) over
  pairs in season g, Var(S_g) by Kendall's (1970, eq. 4.3) tie-corrected formula from the tie
  counts, summed over seasons; z = (S − sign S)/√Var; two-sided normal p.
- The exact p (no ties, n < 50) from the Mahonian numbers counted in integers here (the number
  of permutations of n with k inversions), checked against scipy.stats.kendalltau(method='exact').
- The tie-corrected variance formula is itself checked by enumerating all 8! orders of a tied
  series (values permuted against fixed times): the variance of S over them.

The data are invented field scenarios drawn with a fixed seed (numpy default_rng(20261204)),
rounded as a field sheet holds them, and stored in the JSON so that the C++ tests use exactly
these numbers.
"""
import itertools
import json
import math
import os
from fractions import Fraction

import numpy as np
import scipy
import scipy.stats as st

rng = np.random.default_rng(20261204)


def sign(x):
    return (x > 0) - (x < 0)


def tie_counts(v):
    counts = {}
    for a in v:
        counts[a] = counts.get(a, 0) + 1
    return [c for c in counts.values() if c > 1]


def kendall_variance(t, y):
    """Kendall (1970) eq. 4.3, ties in t and in y; exact in fractions."""
    n = len(t)
    if n < 2:
        return Fraction(0)
    tt, uu = tie_counts(t), tie_counts(y)
    v = Fraction(n * (n - 1) * (2 * n + 5) - sum(a * (a - 1) * (2 * a + 5) for a in tt)
                 - sum(b * (b - 1) * (2 * b + 5) for b in uu), 18)
    if n > 2:
        v += Fraction(sum(a * (a - 1) * (a - 2) for a in tt) * sum(b * (b - 1) * (b - 2) for b in uu),
                      9 * n * (n - 1) * (n - 2))
    v += Fraction(sum(a * (a - 1) for a in tt) * sum(b * (b - 1) for b in uu), 2 * n * (n - 1))
    return v


def brute_s(t, y):
    n = len(t)
    return sum(sign(y[j] - y[i]) * sign(t[j] - t[i]) for i in range(n) for j in range(i + 1, n))


def pair_slopes(t, y):
    n = len(t)
    return sorted((y[j] - y[i]) / (t[j] - t[i]) for i in range(n) for j in range(i + 1, n) if t[i] != t[j])


def at_rank(sorted_slopes, rank):
    """1-based, fractional ranks interpolated between neighbours."""
    k = math.floor(rank)
    f = rank - k
    a = sorted_slopes[k - 1]
    if f == 0 or k == len(sorted_slopes):
        return a
    return a + f * (sorted_slopes[k] - a)


def normal_quantile(level):
    return float(st.norm.isf((1 - level) / 2))


def mahonian_two_sided_p(n, discordant):
    """Two-sided exact p from the count of permutations of n with k inversions."""
    counts = [1]
    for j in range(2, n + 1):
        new = [0] * (len(counts) + j - 1)
        for k, c in enumerate(counts):
            for m in range(j):
                new[k + m] += c
        counts = new
    total = math.factorial(n)
    all_pairs = n * (n - 1) // 2
    c = min(discordant, all_pairs - discordant)
    if 4 * c == n * (n - 1):
        return 1.0
    return min(1.0, 2 * sum(counts[:c + 1]) / total)


def trend_reference(t, y, seasons=None, level=0.95, censored=None, dates=False):
    """Everything TRACK.TREND reports, by brute force from the definitions."""
    n = len(y)
    limit = None
    if censored is not None and any(censored):
        limits = {y[i] for i in range(n) if censored[i]}
        assert len(limits) == 1
        limit = limits.pop()
    # One limit: below it, censored or not, all tied and under everything else; half the limit for the slope.
    below = [limit is not None and (censored[i] or y[i] < limit) for i in range(n)]
    ordered = [(-1e300 if below[i] else y[i]) for i in range(n)]
    numeric = [(limit / 2 if below[i] else y[i]) for i in range(n)]
    groups = {}
    for i in range(n):
        groups.setdefault(seasons[i] if seasons else '', []).append(i)
    s = 0
    variance = Fraction(0)
    tau_den = 0.0
    slopes = []
    ties = False
    for rows in groups.values():
        gt = [t[i] for i in rows]
        gy = [ordered[i] for i in rows]
        s += brute_s(gt, gy)
        flat = len(set(gy)) == 1 or len(set(gt)) == 1
        if not flat:
            variance += kendall_variance(gt, gy)
        m = len(rows)
        pairs = m * (m - 1) // 2
        tt = sum(a * (a - 1) // 2 for a in tie_counts(gt))
        uu = sum(b * (b - 1) // 2 for b in tie_counts(gy))
        ties = ties or tt > 0 or uu > 0
        tau_den += math.sqrt((pairs - tt) * (pairs - uu))
        slopes += pair_slopes(gt, [numeric[i] for i in rows])
    slopes.sort()
    var = float(variance)
    z = (s - sign(s)) / math.sqrt(var)
    exact = seasons is None and not ties and n < 50
    if exact:
        order = sorted(range(n), key=lambda i: t[i])
        ys = [ordered[i] for i in order]
        discordant = sum(1 for i in range(n) for j in range(i + 1, n) if ys[j] < ys[i])
        p = mahonian_two_sided_p(n, discordant)
    else:
        p = float(2 * st.norm.sf(abs(z)))
    big_n = len(slopes)
    median_slope = at_rank(slopes, (big_n + 1) / 2)
    c = normal_quantile(level) * math.sqrt(var)
    lower_rank, upper_rank = (big_n - c) / 2, (big_n + c) / 2 + 1
    factor = 365.25 if dates else 1.0
    out = {
        'n': n, 'seasons': len(groups), 'S': s, 'variance': var, 'z': z, 'p': p, 'exact': exact,
        'tau': s / tau_den, 'slope': median_slope * factor, 'pairs': big_n,
        'lower_rank': lower_rank, 'upper_rank': upper_rank,
    }
    if lower_rank >= 1 and upper_rank <= big_n:
        out['ci_low'] = at_rank(slopes, lower_rank) * factor
        out['ci_high'] = at_rank(slopes, upper_rank) * factor
    med_y = float(np.median(numeric))
    med_t = float(np.median(t))
    origin = min(t) if dates else 0.0
    out['intercept'] = med_y - median_slope * (med_t - origin)
    out['percent'] = 100 * median_slope * factor / abs(med_y)
    order = sorted(range(n), key=lambda i: (t[i], i))
    xs = np.array([numeric[i] for i in order])
    d = xs - xs.mean()
    out['lag1'] = float(np.sum(d[:-1] * d[1:]) / np.sum(d * d))
    out['censored'] = sum(1 for c in (censored or []) if c)
    return out


def scipy_reference(t, y, level=0.95):
    tau = st.kendalltau(t, y, method='asymptotic')
    n = len(t)
    pairs = n * (n - 1) // 2
    tt = sum(a * (a - 1) // 2 for a in tie_counts(t))
    uu = sum(b * (b - 1) // 2 for b in tie_counts(y))
    ts = st.theilslopes(y, t, alpha=level, method='separate')
    return {
        'tau_b': float(tau.statistic),
        'S_from_tau': float(tau.statistic) * math.sqrt((pairs - tt) * (pairs - uu)),
        'theil_slope': float(ts.slope),
        'theil_low': float(ts.low_slope),
        'theil_high': float(ts.high_slope),
    }


cases = {}

# US EPA QA/G-9S (2006), Mann–Kendall example (second-hand), consecutive sampling occasions 1..11.
epa = [10, 10, 10, 5, 10, 20, 18, 17, 15, 24, 15]
cases['epa'] = {'t': list(range(1, 12)), 'y': epa}
# Gilbert (1987) p. 212 (second-hand), 22 values at consecutive sampling occasions 1..22.
gilbert = [20, 20, 20, 20, 15, 20, 20, 30, 27, 26, 23, 35, 25, 28, 70, 26, 24, 34, 32, 23, 50, 30]
cases['gilbert'] = {'t': list(range(1, 23)), 'y': gilbert}

# Invented: nitrate at a spring, 24 untied readings at irregular days (exact p).
days = np.sort(rng.choice(np.arange(0, 2000), 24, replace=False)).tolist()
nitrate = [round(2.0 + 0.0004 * d + float(rng.normal(0, 0.35)), 3) for d in days]
assert len(set(nitrate)) == len(nitrate)
cases['spring'] = {'t': days, 'y': nitrate}

# Invented: conductivity with ties in values and duplicate sampling days (normal approximation).
tdays = sorted(int(d) for d in rng.integers(0, 60, 45))
cond = [round(float(310 + 0.4 * d + rng.normal(0, 6))) for d in tdays]
cases['ties'] = {'t': tdays, 'y': cond}

# Invented: 300 readings of a logger, no ties (n ≥ 50: normal approximation).
lt = np.sort(rng.uniform(0, 3000, 300)).round(4).tolist()
ly = [round(12 + 0.001 * x + float(rng.normal(0, 1.5)), 5) for x in lt]
cases['logger'] = {'t': lt, 'y': ly}

# Invented: monthly total phosphorus at a river station, 9 years, dates as day numbers
# (Calc's 45000 is 2023-03-15), a seasonal cycle, some months missed, a duplicate visit.
start = 41640  # 2014-01-01
st_t, st_y, st_s = [], [], []
for year in range(9):
    for month in range(12):
        if rng.random() < 0.08:
            continue  # a missed visit
        day = start + int(round(year * 365.25 + month * 30.44 + rng.integers(0, 10)))
        value = 0.08 + 0.02 * math.sin(2 * math.pi * month / 12) - 0.003 * year + float(rng.normal(0, 0.012))
        st_t.append(day)
        st_y.append(round(max(value, 0.012), 3))
        st_s.append(str(month + 1))
st_t.append(st_t[30])
st_y.append(round(st_y[30] + 0.004, 3))
st_s.append(st_s[30])
cases['seasonal'] = {'t': st_t, 'y': st_y, 'seasons': st_s, 'dates': True}

# The same readings with everything under 0.05 reported as <0.05 (one detection limit).
cens_y = [0.05 if v < 0.05 else v for v in st_y]
cens_c = [1 if v < 0.05 else 0 for v in st_y]
cases['censored'] = {'t': st_t, 'y': cens_y, 'censored': cens_c, 'seasons': st_s, 'dates': True}
# Without seasons, with a detected value below the limit (a lab's 0.041 against <0.05): tied with the <0.05.
c2_y = list(cens_y[:40])
c2_c = list(cens_c[:40])
c2_y[5], c2_c[5] = 0.041, 0
cases['censored_plain'] = {'t': st_t[:40], 'y': c2_y, 'censored': c2_c, 'dates': True}

for name, case in cases.items():
    ref = trend_reference(case['t'], case['y'], case.get('seasons'), 0.95, case.get('censored'), case.get('dates', False))
    case['reference'] = ref
    case['reference_90'] = trend_reference(case['t'], case['y'], case.get('seasons'), 0.90, case.get('censored'),
                                           case.get('dates', False))
    if 'seasons' not in case and 'censored' not in case:
        sp = scipy_reference(case['t'], case['y'])
        case['scipy'] = sp
        # Cross-checks of the brute force against SciPy before anything is written.
        assert abs(sp['S_from_tau'] - ref['S']) < 1e-6 * max(1, abs(ref['S'])), name
        assert abs(sp['theil_slope'] - ref['slope']) <= 1e-12 * max(1, abs(ref['slope'])), name
        if ref['exact']:
            exact = st.kendalltau(case['t'], case['y'], method='exact')
            assert abs(exact.pvalue - ref['p']) < 1e-12, (name, exact.pvalue, ref['p'])
            case['scipy']['exact_p'] = float(exact.pvalue)

# The tie-corrected variance by enumeration: all 8! orders of tied values against tied times.
enum_t = [1, 1, 2, 3, 3, 3, 4, 5]
enum_y = [2, 2, 2, 5, 7, 7, 9, 9]
sums = [0, 0]
for perm in itertools.permutations(enum_y):
    s = brute_s(enum_t, perm)
    sums[0] += s
    sums[1] += s * s
count = math.factorial(len(enum_y))
enum_var = Fraction(sums[1], count) - Fraction(sums[0], count) ** 2
assert enum_var == kendall_variance(enum_t, enum_y), (enum_var, kendall_variance(enum_t, enum_y))
enumerated = {'t': enum_t, 'y': enum_y, 'variance': float(enum_var), 'variance_fraction': str(enum_var)}

out = {'scipy_version': scipy.__version__, 'cases': cases, 'enumerated_variance': enumerated}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), 'trend.json')
with open(path, 'w') as f:
    json.dump(out, f, indent=1)
print('wrote', path)
