#!/usr/bin/python3
"""Reference values for the linear model family (FIT.LINEAR, FIT.POINTS, CHECK.REGRESSION,
RELATE.CORRELATION), from statsmodels 0.13 and SciPy 1.10 (Debian's python3-statsmodels and
python3-scipy). Run with /usr/bin/python3; writes linear.json beside this script.

The data are invented field scenarios drawn with a fixed seed (numpy default_rng(20261202)) and
rounded to the digits a field sheet would hold; they are stored in the JSON so the C++ tests use
exactly these numbers.

Notes on the calls (shared/reference/LIBRARY-NOTES.md):
- OLS is fitted with fit(method='qr'), never the default pinv.
- AIC and BIC are computed here from statsmodels' llf with the residual variance counted as a
  parameter (the catalogue's definition): statsmodels' own aic/bic leave it out.
- het_breuschpagan(robust=True) is the studentized (Koenker) form; linear_reset(power=3,
  test_type='fitted', use_f=True) is RESET with squared and cubed fitted values, F form.
- scipy.stats.kendalltau is called with method='exact' and method='asymptotic' explicitly.
- CHECK.REGRESSION's Durbin–Watson follows the `order` column (sampling days, with ties): the
  residuals sorted by a stable argsort of the days (ties keep row order), then statsmodels'
  durbin_watson. Its influence cut-off is the median of F(p, n − p) (Cook & Weisberg 1982),
  scipy.stats.f.median.
"""
import json
import math
import os

import numpy as np
import scipy
import scipy.stats as st
import statsmodels
import statsmodels.api as sm
from statsmodels.stats.diagnostic import het_breuschpagan, linear_reset
from statsmodels.stats.outliers_influence import OLSInfluence, variance_inflation_factor
from statsmodels.stats.stattools import durbin_watson

rng = np.random.default_rng(20261202)
# Sampling days for the `order` argument, from a generator of their own so the data above stay as
# they were drawn: whole days over a month, so some reaches share a day (ties).
order_rng = np.random.default_rng(20261204)


def regression_reference(y, xs, order, levels=(0.95, 0.90)):
    y = np.asarray(y, dtype=float)
    X = sm.add_constant(np.column_stack(xs))
    res = sm.OLS(y, X).fit(method='qr')
    n, p = X.shape
    llf = float(res.llf)
    out = {
        'estimate': res.params.tolist(),
        'std_error': res.bse.tolist(),
        't': res.tvalues.tolist(),
        'p': res.pvalues.tolist(),
        'ci': {str(level): res.conf_int(alpha=1 - level).tolist() for level in levels},
        'vif': [variance_inflation_factor(X, j) for j in range(1, p)],
        'r_squared': float(res.rsquared),
        'r_squared_adjusted': float(res.rsquared_adj),
        'f': float(res.fvalue),
        'f_p': float(res.f_pvalue),
        'df': float(res.df_model),
        'df2': float(res.df_resid),
        'residual_sd': float(math.sqrt(res.scale)),
        'log_likelihood': llf,
        'aic': -2 * llf + 2 * (p + 1),
        'bic': -2 * llf + math.log(n) * (p + 1),
    }
    # OLSInfluence needs the pinv fit's pseudo-inverse; on these well-scaled invented data the two
    # fits agree to rounding (checked below), so the influence measures come from the pinv fit.
    res_pinv = sm.OLS(y, X).fit()
    assert np.allclose(res_pinv.params, res.params, rtol=1e-10, atol=0)
    infl = OLSInfluence(res_pinv)
    out['fitted'] = res.fittedvalues.tolist()
    out['residual'] = res.resid.tolist()
    out['leverage'] = infl.hat_matrix_diag.tolist()
    out['standardized'] = infl.resid_studentized_internal.tolist()
    out['studentized'] = infl.resid_studentized_external.tolist()
    out['cook'] = infl.cooks_distance[0].tolist()
    lm, lm_p, _, _ = het_breuschpagan(res.resid, X, robust=True)
    reset = linear_reset(res, power=3, test_type='fitted', use_f=True)
    w, w_p = st.shapiro(res.resid)
    out['checks'] = {
        'breusch_pagan': float(lm),
        'breusch_pagan_p': float(lm_p),
        'reset_f': float(reset.fvalue),
        'reset_p': float(reset.pvalue),
        'durbin_watson': float(durbin_watson(np.asarray(res.resid)[np.argsort(order, kind='stable')])),
        'shapiro_w': float(w),
        'shapiro_p': float(w_p),
        'max_vif': max(out['vif']),
        'max_cook': float(np.max(infl.cooks_distance[0])),
        'cook_above': int(np.sum(infl.cooks_distance[0] > 4 / n)),
        'cook_cut': float(st.f.median(p, n - p)),
        'cook_above_cut': int(np.sum(infl.cooks_distance[0] > st.f.median(p, n - p))),
        'high_leverage': int(np.sum(infl.hat_matrix_diag > 2 * p / n)),
        'outliers': int(np.sum(np.abs(infl.resid_studentized_external) > 3)),
    }
    return out


def correlation_reference(x, y, kendall_method):
    r = st.pearsonr(x, y)
    ci = r.confidence_interval(confidence_level=0.95)
    n = len(x)
    rho = st.spearmanr(x, y)
    tau = st.kendalltau(x, y, method=kendall_method)
    return {
        'pearson': {'r': float(r.statistic), 'p': float(r.pvalue), 'ci_low': float(ci.low),
                    'ci_high': float(ci.high),
                    't': float(r.statistic * math.sqrt((n - 2) / (1 - r.statistic ** 2)))},
        'spearman': {'rho': float(rho.correlation), 'p': float(rho.pvalue)},
        'kendall': {'tau': float(tau.correlation), 'p': float(tau.pvalue), 'method': kendall_method},
    }


data = {'generator': 'tests/reference/generate_linear.py', 'scipy': scipy.__version__,
        'statsmodels': statsmodels.__version__}

# Stream reach survey: invertebrate density (per m²) against flow velocity (m/s) and canopy cover
# (%), 40 reaches; one reach with a spate (large residual) so influence measures have work to do.
n = 40
flow = np.round(rng.uniform(0.05, 1.2, n), 2)
canopy = np.round(rng.uniform(5, 95, n), 0)
density = np.round(120 + 85 * flow - 0.6 * canopy + rng.normal(0, 12, n), 1)
density[17] += 60.0
days = order_rng.integers(1, 31, n).astype(float)
data['stream'] = {'y': density.tolist(), 'xs': [flow.tolist(), canopy.tolist()], 'names': ['flow', 'canopy'],
                  'order': days.tolist()}
data['stream']['reference'] = regression_reference(density, [flow, canopy], days)

# Salt marsh transect: plant height (cm) against pore-water salinity (ppt), 25 plots, spread
# growing with height (for the constant-variance check).
n = 25
salinity = np.round(rng.uniform(8, 35, n), 1)
height = np.round(90 - 1.8 * salinity + rng.normal(0, 1, n) * (0.2 * (90 - 1.8 * salinity)), 1)
days = order_rng.integers(1, 31, n).astype(float)
data['marsh'] = {'y': height.tolist(), 'xs': [salinity.tolist()], 'names': ['salinity'], 'order': days.tolist()}
data['marsh']['reference'] = regression_reference(height, [salinity], days)

# Correlations. Soil cores: organic matter (%) against bulk density (g/cm³), 20 cores, no ties:
# Kendall's exact p applies.
n = 20
organic = np.round(rng.uniform(2, 18, n), 2)
bulk = np.round(1.6 - 0.045 * organic + rng.normal(0, 0.12, n), 3)
assert len(set(organic)) == n and len(set(bulk)) == n
data['cores'] = {'x': organic.tolist(), 'y': bulk.tolist()}
data['cores']['reference'] = correlation_reference(organic, bulk, 'exact')

# Fish counts: fork length class (cm, rounded: many ties) against age in years, 60 fish: Kendall's
# normal approximation with tie-corrected variance.
n = 60
age = rng.integers(1, 7, n).astype(float)
length = np.round(8 + 4.5 * age + rng.normal(0, 3, n), 0)
data['fish'] = {'x': age.tolist(), 'y': length.tolist()}
data['fish']['reference'] = correlation_reference(age, length, 'asymptotic')

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), 'linear.json'), 'w') as f:
    json.dump(data, f, indent=1)
    f.write('\n')
