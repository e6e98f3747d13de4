#!/usr/bin/python3
"""Reference values for count regression (FIT.COUNTS). Run with Debian's /usr/bin/python3
(statsmodels 0.13):

    /usr/bin/python3 tests/reference/generate_counts.py

writes tests/reference/counts.json beside this script.
- `doctors`: a public data set printed with a Poisson model in a GLM textbook (Doll & Hill's British
  doctors, as printed in Dobson & Barnett 2008, An Introduction to Generalized Linear Models, 3rd
  ed., Table 9.1 / Example 9.2.1); the published estimates stand in tests/core/count_model_test.cpp
  beside the check, and statsmodels' GLM Poisson on the same data is written here.
- `fish_passes`: an invented electrofishing survey (fixed seed): fish per pass with pass length in
  minutes as effort, a depth covariate and a site indicator, drawn overdispersed; statsmodels'
  discrete NegativeBinomial (NB2, exposure = effort) and GLM Poisson (offset log effort).
- `point_counts`: invented bird point counts drawn Poisson (fixed seed), no effort: GLM Poisson.
- `germination`: invented seed trays (seeds germinated out of sown, FIT.LOGISTIC with `trials`)
  against soil moisture and shade: GLM Binomial with a (successes, failures) response.
"""
import json
import os

import numpy as np
import statsmodels
import statsmodels.api as sm

OUT = {"generator": "tests/reference/generate_counts.py", "statsmodels": statsmodels.__version__}


def flt(xs):
    return [float(x) for x in xs]


def poisson(y, X, effort=None):
    offset = None if effort is None else np.log(effort)
    r = sm.GLM(y, X, family=sm.families.Poisson(), offset=offset).fit(tol=1e-15, maxiter=200)
    null = sm.GLM(y, X[:, :1], family=sm.families.Poisson(), offset=offset).fit(tol=1e-15, maxiter=200)
    return {"coefficient": flt(r.params), "SE": flt(r.bse), "z": flt(r.tvalues), "p": flt(r.pvalues),
            "deviance": float(r.deviance), "null deviance": float(r.null_deviance),
            "loglik": float(r.llf), "null loglik": float(null.llf), "aic": float(r.aic),
            "overdispersion": float(r.pearson_chi2 / r.df_resid)}


def negative_binomial(y, X, effort=None):
    model = sm.NegativeBinomial(y, X, loglike_method="nb2", exposure=effort)
    r = model.fit(method="newton", maxiter=500, tol=1e-14, disp=0)
    null = sm.NegativeBinomial(y, X[:, :1], loglike_method="nb2", exposure=effort).fit(
        method="newton", maxiter=500, tol=1e-14, disp=0)
    alpha = float(r.params[-1])
    k = 1 / alpha
    # The deviance at the fitted k, by the GLM family with that k held fixed (statsmodels' GLM
    # negative binomial takes alpha = 1/k).
    offset = None if effort is None else np.log(effort)
    fam = sm.families.NegativeBinomial(alpha=alpha)
    glm = sm.GLM(y, X, family=fam, offset=offset).fit(tol=1e-15, maxiter=500)
    glm_null = sm.GLM(y, X[:, :1], family=fam, offset=offset).fit(tol=1e-15, maxiter=500)
    return {"coefficient": flt(r.params[:-1]), "SE": flt(r.bse[:-1]), "z": flt(r.tvalues[:-1]),
            "p": flt(r.pvalues[:-1]), "aggregation k": k, "loglik": float(r.llf),
            "null loglik": float(null.llf), "aic": float(r.aic), "lr statistic": float(r.llr),
            "lr p": float(r.llr_pvalue), "deviance": float(glm.deviance),
            "null deviance": float(glm_null.deviance),
            "glm coefficient": flt(glm.params)}


# Dobson & Barnett (2008) Table 9.1: deaths from coronary heart disease and person-years among
# British doctors by age group (35–44 … 75–84 coded 1–5) and smoking (Doll & Hill 1966).
DOCTORS = {"deaths": [32, 104, 206, 186, 102, 2, 12, 28, 28, 31],
           "person_years": [52407, 43248, 28612, 12663, 5317, 18790, 10673, 5710, 2585, 1462],
           "smoke": [1, 1, 1, 1, 1, 0, 0, 0, 0, 0],
           "agecat": [1, 2, 3, 4, 5, 1, 2, 3, 4, 5]}
d = DOCTORS
age = np.array(d["agecat"], float)
smoke = np.array(d["smoke"], float)
X = np.column_stack([np.ones(10), smoke, age, age ** 2, smoke * age])
OUT["doctors"] = dict(DOCTORS, poisson=poisson(np.array(d["deaths"], float), X,
                                               np.array(d["person_years"], float)))

# An invented electrofishing survey: 60 passes at two sites, pass length 5–20 minutes, depth
# 0.2–1.2 m; trout per pass drawn negative binomial (k = 2.5) around a rate that falls with depth.
rng = np.random.default_rng(20261204)
n = 60
minutes = rng.integers(5, 21, n).astype(float)
depth = np.round(rng.uniform(0.2, 1.2, n), 2)
site = (np.arange(n) % 2).astype(float)
rate = np.exp(-0.6 - 0.9 * depth + 0.5 * site)
mu = minutes * rate
k_true = 2.5
fish = rng.negative_binomial(k_true, k_true / (k_true + mu)).astype(float)
Xf = np.column_stack([np.ones(n), depth, site])
OUT["fish_passes"] = {"fish": flt(fish), "minutes": flt(minutes), "depth": flt(depth), "site": flt(site),
                      "poisson": poisson(fish, Xf, minutes),
                      "negative_binomial": negative_binomial(fish, Xf, minutes)}

# Invented bird point counts at 40 points, no effort: counts Poisson around a rate that rises with
# shrub cover (%).
rng = np.random.default_rng(7)
cover = np.round(rng.uniform(0, 80, 40), 1)
birds = rng.poisson(np.exp(0.4 + 0.015 * cover)).astype(float)
Xb = np.column_stack([np.ones(40), cover])
OUT["point_counts"] = {"birds": flt(birds), "cover": flt(cover), "poisson": poisson(birds, Xb)}

# Invented seed trays: 24 trays, 20–50 seeds sown, germinated seeds drawn binomial around a
# probability that rises with soil moisture (%) and falls under shade.
rng = np.random.default_rng(11)
sown = rng.integers(20, 51, 24).astype(float)
moisture = np.round(rng.uniform(10, 40, 24), 1)
shade = (np.arange(24) % 3 == 0).astype(float)
prob = 1 / (1 + np.exp(-(-2.0 + 0.08 * moisture - 0.6 * shade)))
germinated = rng.binomial(sown.astype(int), prob).astype(float)
Xg = np.column_stack([np.ones(24), moisture, shade])
g = sm.GLM(np.column_stack([germinated, sown - germinated]), Xg, family=sm.families.Binomial()).fit(tol=1e-15)
g0 = sm.GLM(np.column_stack([germinated, sown - germinated]), Xg[:, :1], family=sm.families.Binomial()).fit(tol=1e-15)
OUT["germination"] = {"germinated": flt(germinated), "sown": flt(sown), "moisture": flt(moisture), "shade": flt(shade),
                      "coefficient": flt(g.params), "SE": flt(g.bse), "p": flt(g.pvalues),
                      "deviance": float(g.deviance), "null deviance": float(g.null_deviance),
                      "loglik": float(g.llf), "null loglik": float(g0.llf), "aic": float(g.aic),
                      "pseudo-r-squared": float(1 - g.llf / g0.llf)}

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "counts.json"), "w") as f:
    json.dump(OUT, f, indent=1)
    f.write("\n")
