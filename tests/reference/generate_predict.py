#!/usr/bin/python3
"""Reference values for FIT.PREDICT. Run with Debian's /usr/bin/python3 (statsmodels 0.13):

    /usr/bin/python3 tests/reference/generate_predict.py

writes tests/reference/predict.json beside this script: statsmodels OLS(...).get_prediction(at)
.summary_frame(alpha) (mean, mean_ci_lower/upper, obs_ci_lower/upper) on an invented stream
survey (fixed seed): dissolved oxygen (mg/L) against water temperature (°C) and elevation (m),
predicted inside and outside the observed range.
"""
import json
import os

import numpy as np
import statsmodels
import statsmodels.api as sm

rng = np.random.default_rng(20261204)
n = 30
temperature = np.round(rng.uniform(4, 22, n), 1)
elevation = np.round(rng.uniform(150, 1450, n), 0)
oxygen = np.round(13.2 - 0.21 * temperature + 0.0009 * elevation + rng.normal(0, 0.35, n), 2)
X = sm.add_constant(np.column_stack([temperature, elevation]))
fit = sm.OLS(oxygen, X).fit()
at = [[5.0, 300.0], [12.5, 800.0], [25.0, 1600.0], [18.2, 150.0]]
OUT = {"generator": "tests/reference/generate_predict.py", "statsmodels": statsmodels.__version__,
       "temperature": temperature.tolist(), "elevation": elevation.tolist(), "oxygen": oxygen.tolist(),
       "at": at, "cases": {}}
for level in (0.95, 0.9):
    frame = fit.get_prediction(sm.add_constant(np.array(at), has_constant="add")).summary_frame(alpha=1 - level)
    OUT["cases"][str(level)] = {
        "predicted": frame["mean"].tolist(),
        "mean ci-low": frame["mean_ci_lower"].tolist(), "mean ci-high": frame["mean_ci_upper"].tolist(),
        "reading low": frame["obs_ci_lower"].tolist(), "reading high": frame["obs_ci_upper"].tolist()}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "predict.json"), "w") as f:
    json.dump(OUT, f, indent=1)
    f.write("\n")
