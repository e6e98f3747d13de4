#!/usr/bin/python3
"""Reference values for the post-hoc family (ADJUST.P, the studentized range, COMPARE.POSTHOC).

Run with Debian's /usr/bin/python3 (SciPy 1.10, statsmodels 0.13):
    /usr/bin/python3 tests/reference/generate_posthoc.py
writes tests/reference/posthoc.json beside this script. Data are invented or drawn with a fixed seed.
"""
import json
import os

import numpy as np
import scipy
import statsmodels
from statsmodels.stats.multitest import multipletests

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "posthoc.json")

# ---------------------------------------------------------------------------------------------
# ADJUST.P: statsmodels.stats.multitest.multipletests. Its 'sidak' is single-step (the catalogue's
# sidak); 'simes-hochberg' is Hochberg's step-up; 'fdr_bh'/'fdr_by' are Benjamini–Hochberg/-Yekutieli.
METHODS = {"holm": "holm", "bonferroni": "bonferroni", "hochberg": "simes-hochberg", "hommel": "hommel",
           "bh": "fdr_bh", "by": "fdr_by", "sidak": "sidak"}


def adjust_cases():
    rng = np.random.default_rng(20261202)
    families = {
        "invented_ten": [0.001, 0.008, 0.039, 0.041, 0.042, 0.06, 0.074, 0.205, 0.212, 0.216],
        "ties_zero_one": [0.0, 0.02, 0.02, 0.5, 1.0, 0.02, 0.0001],
        "single": [0.03],
        "tiny": [1e-12, 3e-10, 0.2],
        "seeded_40": list(rng.uniform(0, 1, 40) ** 3),
        "seeded_200": list(rng.uniform(0, 1, 200) ** 2),
    }
    out = []
    for name, p in families.items():
        case = {"name": name, "p": [float(x) for x in p], "adjusted": {}}
        for ours, theirs in METHODS.items():
            case["adjusted"][ours] = [float(x) for x in multipletests(p, alpha=0.05, method=theirs)[1]]
        out.append(case)
    return out


def main():
    ref = {
        "generator": "tests/reference/generate_posthoc.py",
        "scipy": scipy.__version__,
        "statsmodels": statsmodels.__version__,
        "adjust": adjust_cases(),
    }
    with open(OUT, "w") as f:
        json.dump(ref, f, indent=1)


if __name__ == "__main__":
    main()
