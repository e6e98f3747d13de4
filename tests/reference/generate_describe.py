#!/usr/bin/python3
"""Reference values for DESCRIBE.GROUPS, computed with Debian's NumPy and mpmath (see t_quantile).

Run from the repository root:  /usr/bin/python3 tests/reference/generate_describe.py
Writes tests/reference/describe.json. Quartiles: numpy.percentile(method="linear"), Hyndman & Fan's
type 7 — position (n − 1)p, linear interpolation —, which is how LibreOffice Calc's QUARTILE.INC
and PERCENTILE.INC are defined (Calc's help; the office test workbook checks them against the
sheet's own QUARTILE.INC). CV % = 100 · SD / |mean| on the data's scale. The data are invented (dissolved oxygen in mg/L at three
reaches of an imaginary stream) so the fixture can be regenerated and read by anyone.
"""
import json
import pathlib

import mpmath
import numpy as np
import scipy

# SciPy 1.10's stats.t.ppf is only good to about 1e-9 relative at small df (measured here:
# t(0.975, 6) = 2.4469118487916806 against 2.44691185114497 from a 40-digit mpmath inversion),
# so the Student quantile comes from mpmath: the regularized incomplete beta inverted at 40 digits.
mpmath.mp.dps = 40


def t_quantile(probability, df):
    def cdf(x):
        return 1 - mpmath.betainc(mpmath.mpf(df) / 2, mpmath.mpf(1) / 2, 0, df / (df + x * x), regularized=True) / 2
    return float(mpmath.findroot(lambda x: cdf(x) - mpmath.mpf(probability), 2.0))

CASES = {
    "oxygen": {
        "upper reach": [8.1, 7.9, 8.4, 8.8, 7.6, 8.2, 8.0, 8.5],
        "mill pond": [6.2, 5.9, 6.8, 7.1, 6.4, 5.5],
        "culvert": [7.0],
    },
    # Right-skewed counts of caddisfly larvae per kick sample, for the log (geometric) summary.
    "larvae": {
        "riffle": [12.0, 30.0, 45.0, 18.0, 110.0, 22.0, 64.0],
        "pool": [3.0, 8.0, 5.0, 2.0, 14.0],
    },
}


def summary(values, level, transform):
    x = np.asarray(values, dtype=float)
    n = len(x)
    f, back = {
        "none": (lambda v: v, lambda v: v),
        "log": (np.log, np.exp),
        "log10": (np.log10, lambda v: 10.0 ** v),
        "sqrt": (np.sqrt, lambda v: v * v),
    }[transform]
    y = f(x)
    row = {"n": n, "centre": float(back(y.mean())), "median": float(np.median(x)),
           "q1": float(np.percentile(x, 25, method="linear")), "q3": float(np.percentile(x, 75, method="linear")),
           "minimum": float(x.min()), "maximum": float(x.max())}
    if n >= 2:
        sd = float(x.std(ddof=1))
        row["sd"] = sd
        row["se"] = sd / np.sqrt(n)
        row["cv"] = 100 * sd / abs(x.mean())
        se_y = y.std(ddof=1) / np.sqrt(n)
        t = t_quantile(0.5 + level / 2.0, n - 1)
        row["ci_low"] = float(back(y.mean() - t * se_y))
        row["ci_high"] = float(back(y.mean() + t * se_y))
    return row


def main():
    out = {"generator": "tests/reference/generate_describe.py",
           "library": f"numpy {np.__version__}, scipy {scipy.__version__}, mpmath {mpmath.__version__}", "cases": []}
    for name, groups in CASES.items():
        for transform in ("none", "log", "log10", "sqrt"):
            for level in (0.95, 0.99):
                out["cases"].append({
                    "data": name, "transform": transform, "level": level,
                    "groups": [{"name": g, "values": v, **summary(v, level, transform)} for g, v in groups.items()],
                })
    path = pathlib.Path(__file__).with_name("describe.json")
    path.write_text(json.dumps(out, indent=1) + "\n")


if __name__ == "__main__":
    main()
