#!/usr/bin/python3
"""Reference values for the bad-input matrix (tests/office/make_bad_input_workbook.py).

Run from the repository root:  /usr/bin/python3 tests/reference/generate_bad_input.py
Writes tests/reference/bad_input.json: the invented data of the matrix (water depth in cm in two
marsh zones, distances, paired readings, presence) and the numbers that Calc's own functions
cannot compute, for the cases where bad input must still give the honest number:
- Shapiro-Wilk p: Royston's (1995) AS R94 in 50-digit mpmath, imported from
  tests/reference/generate_normality.py (SciPy's shapiro works in single precision);
- logistic coefficients: statsmodels 0.13 Logit (Newton, tolerance 1e-14);
- two-way ANOVA p (Type II): statsmodels 0.13 ols + anova_lm(typ=2);
- chi-square of a cross-table: scipy.stats.chi2_contingency(correction=False) 1.10;
- Durbin-Watson of a straight-line fit: numpy lstsq residuals, sum of squared successive
  differences over the sum of squares (Durbin and Watson 1950, the statistic's definition).
The value a bad input must give is the value of the clean data it stands for: numbers that are
the depths times 1e307 or 1e-311 give the depths' p (every statistic here is scale invariant),
logicals give the p of their 1/0 values, a whole column gives the bounded range's answer.
"""
import json
import pathlib

import numpy as np
import pandas as pd
import scipy
import scipy.stats
import statsmodels
import statsmodels.api as sm
from statsmodels.formula.api import ols
from statsmodels.stats.anova import anova_lm

from generate_normality import royston_shapiro_wilk

DATA = {
    "zone": ["marsh"] * 6 + ["reed"] * 6,
    "depth": [12.1, 14.3, 11.8, 13.5, 12.9, 15.0, 16.2, 17.8, 15.5, 18.1, 16.9, 17.0],
    "second": [11.7, 14.5, 11.2, 13.2, 12.4, 15.1, 15.4, 17.6, 15.1, 17.2, 16.8, 16.7],
    "distance": [3, 5, 2, 4, 6, 7, 9, 11, 8, 12, 10, 10.5],
    "logicals": [1, 0, 1, 1, 0, 1, 0, 0, 1, 0, 0, 0],
    "plus_minus": [1e308, -1e308, 9e307, -9e307, 1e308, -1e308, -1e308, 1e308, -9e307, 9e307, -1e308, 1e308],
    "present": [0, 1, 0, 0, 1, 0, 1, 0, 1, 1, 1, 0],
    "season": ["wet", "dry", "wet", "dry", "wet", "dry"] * 2,
    # the zone column with row 3 blank and row 10 an empty text: both rows dropped
    "zone_with_gaps": ["marsh", None, "marsh", "marsh", "marsh", "marsh", "reed", "reed", None, "reed", "reed", "reed"],
}


def shapiro_p(values):
    return royston_shapiro_wilk(values)[1]


def logistic(y, x, level=0.95):
    X = sm.add_constant(np.asarray(x, float))
    res = sm.Logit(np.asarray(y, float), X).fit(method="newton", tol=1e-14, maxiter=200, disp=0)
    assert res.mle_retvals["converged"]
    ci = np.exp(res.conf_int(alpha=1 - level))
    return {"slope": float(res.params[1]), "or_low": float(ci[1, 0])}


def factorial_p_factor1(y, a, b):
    df = pd.DataFrame({"y": np.asarray(y, float), "a": a, "b": b})
    table = anova_lm(ols("y ~ C(a) * C(b)", df).fit(), typ=2)
    return float(table.loc["C(a)"]["PR(>F)"])


def durbin_watson(y, x):
    X = np.column_stack([np.ones(len(x)), np.asarray(x, float)])
    e = np.asarray(y, float) - X @ np.linalg.lstsq(X, np.asarray(y, float), rcond=None)[0]
    return float(np.sum(np.diff(e) ** 2) / np.sum(e ** 2))


def crosstab_p(rows, columns):
    kept = [(r, c) for r, c in zip(rows, columns) if r is not None and c is not None]
    table = pd.crosstab(pd.Series([r for r, _ in kept]), pd.Series([c for _, c in kept])).to_numpy()
    return float(scipy.stats.chi2_contingency(table, correction=False)[1])


def main():
    d = DATA
    scaled_plus_minus = [x / 1e308 for x in d["plus_minus"]]
    ref = {
        "shapiro p, depth": shapiro_p(d["depth"]),
        "shapiro p, logicals": shapiro_p(d["logicals"]),
        "shapiro p, plus-minus / 1e308": shapiro_p(scaled_plus_minus),
        "logistic, present on distance": logistic(d["present"], d["distance"]),
        "logistic 99%, present on distance": logistic(d["present"], d["distance"], 0.99),
        "logistic, logicals on distance": logistic(d["logicals"], d["distance"]),
        "factorial p-factor1, depth": factorial_p_factor1(d["depth"], d["zone"], d["season"]),
        "factorial p-factor1, logicals": factorial_p_factor1(d["logicals"], d["zone"], d["season"]),
        "durbin-watson, depth on distance": durbin_watson(d["depth"], d["distance"]),
        "durbin-watson, logicals on distance": durbin_watson(d["logicals"], d["distance"]),
        "durbin-watson, plus-minus / 1e308 on distance": durbin_watson(scaled_plus_minus, d["distance"]),
        "factorial p-factor1, plus-minus / 1e308": factorial_p_factor1(scaled_plus_minus, d["zone"], d["season"]),
        "chi-square p, riffle/pool present/absent": float(
            scipy.stats.chi2_contingency(np.array([[12, 5], [4, 11]]), correction=False)[1]),
        "chi-square p, zone with gaps by season": crosstab_p(d["zone_with_gaps"], d["season"]),
    }
    out = {
        "generator": "tests/reference/generate_bad_input.py",
        "library": "numpy %s, scipy %s, statsmodels %s, pandas %s" % (
            np.__version__, scipy.__version__, statsmodels.__version__, pd.__version__),
        "data": d,
        "reference": ref,
    }
    path = pathlib.Path(__file__).with_name("bad_input.json")
    path.write_text(json.dumps(out, indent=1) + "\n")


if __name__ == "__main__":
    main()
