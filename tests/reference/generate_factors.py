#!/usr/bin/python3
"""Reference values for factors (label columns) among `xs`. Run with Debian's /usr/bin/python3
(statsmodels 0.13):

    /usr/bin/python3 tests/reference/generate_factors.py

writes tests/reference/factors.json beside this script. Invented surveys, fixed seed:
- least squares: dissolved oxygen (mg/L) by zone (three levels, first-appearance order
  upper, middle, lower) and water temperature (°C): statsmodels OLS with C(zone, Treatment('upper')),
  anova_lm(typ=2) for each term's joint F (an analysis of covariance), and get_prediction(...)
  .summary_frame for FIT.PREDICT at new rows that name a zone;
- Poisson: trout per electrofishing pass by site (three levels) and pass length (m) as effort:
  GLM Poisson with log(effort) as offset; the likelihood-ratio χ² of the site factor by refitting
  without it;
- logistic with trials: seeds germinated out of sown by treatment (two levels) and soil moisture
  (%): GLM Binomial on (successes, failures); the treatment factor's likelihood-ratio χ².
Published data sets beside them (the tests also check the printed figures): Bliss's beetles
(binomial with trials) and Anscombe's set I (a prediction at the mean of x).
"""
import json
import os

import numpy as np
import pandas as pd
import statsmodels
import statsmodels.api as sm
import statsmodels.formula.api as smf
from scipy import stats

rng = np.random.default_rng(4122026)
OUT = {"generator": "tests/reference/generate_factors.py", "statsmodels": statsmodels.__version__}


def flt(xs):
    return [float(x) for x in xs]


# Least squares with a factor and a covariate.
zones = ["upper", "middle", "lower"]
n = 24
zone = [zones[i % 3] for i in range(n)]
temperature = np.round(rng.uniform(6, 20, n), 1)
shift = {"upper": 0.0, "middle": -0.6, "lower": -1.3}
oxygen = np.round(12.5 - 0.2 * temperature + np.array([shift[z] for z in zone]) + rng.normal(0, 0.4, n), 2)
frame = pd.DataFrame({"oxygen": oxygen, "zone": zone, "temperature": temperature})
ols = smf.ols("oxygen ~ C(zone, Treatment('upper')) + temperature", data=frame).fit()
anova = sm.stats.anova_lm(ols, typ=2)
zone_row = anova.loc["C(zone, Treatment('upper'))"]
at = pd.DataFrame({"zone": ["lower", "upper", "middle"], "temperature": [10.0, 15.5, 20.0]})
pred = ols.get_prediction(at).summary_frame(alpha=0.05)
# statsmodels names the terms C(zone, ...)[T.middle]; ours are `zone: middle` (first appearance order).
OUT["linear"] = {
    "zone": zone, "temperature": temperature.tolist(), "oxygen": oxygen.tolist(),
    "terms": ["intercept", "zone: middle", "zone: lower", "temperature"],
    "coefficient": [float(ols.params["Intercept"]), float(ols.params["C(zone, Treatment('upper'))[T.middle]"]),
                    float(ols.params["C(zone, Treatment('upper'))[T.lower]"]), float(ols.params["temperature"])],
    "SE": [float(ols.bse["Intercept"]), float(ols.bse["C(zone, Treatment('upper'))[T.middle]"]),
           float(ols.bse["C(zone, Treatment('upper'))[T.lower]"]), float(ols.bse["temperature"])],
    "zone F": float(zone_row["F"]), "zone df": float(zone_row["df"]), "zone p": float(zone_row["PR(>F)"]),
    "temperature F": float(anova.loc["temperature", "F"]),
    "at zone": at["zone"].tolist(), "at temperature": at["temperature"].tolist(),
    "predicted": flt(pred["mean"]), "mean ci-low": flt(pred["mean_ci_lower"]), "mean ci-high": flt(pred["mean_ci_upper"]),
    "reading low": flt(pred["obs_ci_lower"]), "reading high": flt(pred["obs_ci_upper"]),
}

# Poisson counts with a site factor and effort.
sites = ["Alder", "Birch", "Cedar"]
m = 30
site = [sites[i % 3] for i in range(m)]
length = np.round(rng.uniform(40, 120, m), 0)
rate = {"Alder": 0.08, "Birch": 0.05, "Cedar": 0.12}
trout = rng.poisson(np.array([rate[s] for s in site]) * length).astype(float)
X = np.column_stack([np.ones(m), [1.0 if s == "Birch" else 0.0 for s in site], [1.0 if s == "Cedar" else 0.0 for s in site]])
full = sm.GLM(trout, X, family=sm.families.Poisson(), offset=np.log(length)).fit(tol=1e-15, maxiter=200)
null = sm.GLM(trout, X[:, :1], family=sm.families.Poisson(), offset=np.log(length)).fit(tol=1e-15, maxiter=200)
lr = 2 * (full.llf - null.llf)
OUT["poisson"] = {
    "site": site, "length": length.tolist(), "trout": trout.tolist(),
    "terms": ["intercept", "site: Birch", "site: Cedar"],
    "coefficient": flt(full.params), "SE": flt(full.bse),
    "site chi2": float(lr), "site p": float(stats.chi2.sf(lr, 2)),
    "overdispersion": float(full.pearson_chi2 / full.df_resid),
}

# Binomial with trials, a two-level factor and a covariate.
k = 20
treatment = ["control" if i % 2 == 0 else "scarified" for i in range(k)]
moisture = np.round(rng.uniform(10, 40, k), 1)
sown = rng.integers(20, 41, k).astype(float)
logit = -1.2 + 0.05 * moisture + np.array([0.0 if t == "control" else 0.7 for t in treatment])
germinated = rng.binomial(sown.astype(int), 1 / (1 + np.exp(-logit))).astype(float)
Xb = np.column_stack([np.ones(k), [1.0 if t == "scarified" else 0.0 for t in treatment], moisture])
endog = np.column_stack([germinated, sown - germinated])
fb = sm.GLM(endog, Xb, family=sm.families.Binomial()).fit(tol=1e-15, maxiter=200)
rb = sm.GLM(endog, Xb[:, [0, 2]], family=sm.families.Binomial()).fit(tol=1e-15, maxiter=200)
OUT["binomial"] = {
    "treatment": treatment, "moisture": moisture.tolist(), "sown": sown.tolist(), "germinated": germinated.tolist(),
    "terms": ["intercept", "treatment: scarified", "moisture"],
    "coefficient": flt(fb.params), "SE": flt(fb.bse),
    "treatment chi2": float(rb.deviance - fb.deviance),
    "treatment p": float(stats.chi2.sf(rb.deviance - fb.deviance, 1)),
}

# Published: Bliss (1935), Ann. Appl. Biol. 22, 134–167, beetles killed by carbon disulphide, as
# tabulated in Dobson & Barnett (2008), An Introduction to Generalized Linear Models, 3rd ed.,
# §7.3.1 (data and printed fit from memory): dose log10 CS2 mg/l, beetles, killed.
dose = np.array([1.6907, 1.7242, 1.7552, 1.7842, 1.8113, 1.8369, 1.8610, 1.8839])
beetles = np.array([59, 60, 62, 56, 63, 59, 62, 60], float)
killed = np.array([6, 13, 18, 28, 52, 53, 61, 60], float)
bliss = sm.GLM(np.column_stack([killed, beetles - killed]), sm.add_constant(dose), family=sm.families.Binomial()).fit(
    tol=1e-15, maxiter=200)
OUT["bliss"] = {"dose": dose.tolist(), "beetles": beetles.tolist(), "killed": killed.tolist(),
                "coefficient": flt(bliss.params), "SE": flt(bliss.bse), "deviance": float(bliss.deviance)}

# Published: Anscombe (1973), Am. Statist. 27, 17–21, set I; the prediction at x = 9 (the mean of
# x) by statsmodels get_prediction, beside the hand formula from the printed fit (see the test).
ax = np.array([10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5], float)
ay = np.array([8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68])
anscombe = sm.OLS(ay, sm.add_constant(ax)).fit()
frame = anscombe.get_prediction(np.array([[1.0, 9.0]])).summary_frame(alpha=0.05)
OUT["anscombe_prediction"] = {"x": ax.tolist(), "y": ay.tolist(), "at": 9.0,
                              "predicted": float(frame["mean"][0]), "mean ci-low": float(frame["mean_ci_lower"][0]),
                              "mean ci-high": float(frame["mean_ci_upper"][0]),
                              "reading low": float(frame["obs_ci_lower"][0]), "reading high": float(frame["obs_ci_upper"][0]),
                              "residual sd": float(np.sqrt(anscombe.scale))}

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "factors.json"), "w") as f:
    json.dump(OUT, f, indent=1)
    f.write("\n")
