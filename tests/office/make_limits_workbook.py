#!/usr/bin/python3
"""Writes tests/office/limits.fods: LIMIT.*, CHECK.OUTLIERS and PLAN.* in real cells.

    /usr/bin/python3 tests/office/make_limits_workbook.py

Data and expected values come from tests/reference/limits.json (written by
tests/reference/generate_limits.py with SciPy 1.10, statsmodels 0.13 and mpmath): the invented
ammonia samples, Rosner's 54 values from the NIST/SEMATECH e-Handbook §1.3.5.17, and the power
cases. Where Calc has its own function for a number (PERCENTILE.INC, COUNTIF, MAX), the check
compares with it too. Refusal texts are the core's, exact.
"""

import math
import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference

HERE = os.path.dirname(os.path.abspath(__file__))
REF = reference("limits.json")
SRC = "tests/reference/generate_limits.py"
SRC_TEXT = "the core's refusal text, exact"

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula

# --- LIMIT.* on the invented ammonia samples (header row and one n/a: 24 used, 1 dropped) ----
a = REF["ammonia"]
sheet = book.sheet("ammonia")
sheet.row("A1", ["week", "ammonia mg/L"])
sheet.block("A2", [[i + 1, x] for i, x in enumerate(a["values"])] + [[25, "n/a"]])
V = "[.B1:.B26]"
n, mean, sd = len(a["values"]), a["mean"], a["sd"]
cells = [
    ("D2", "LIMIT.MEAN(%s)" % V, a["t_ucl"], 1e-12, "mean + t·SD/√n with a 40-digit mpmath t quantile (%s)" % SRC),
    ("D3", 'LIMIT.MEAN(%s;"t";"estimate")' % V, "=AVERAGE([$ammonia.B1:.B26])", 1e-12, "Calc's AVERAGE on the same cells"),
    ("D4", 'LIMIT.MEAN(%s;"t";"k-factor")' % V, (a["t_ucl"] - mean) / sd, 1e-12, "t(0.95, 23)/√24, mpmath (%s)" % SRC),
    ("D5", 'LIMIT.MEAN(%s;"t";"n")' % V, n, None, "count of the numeric cells, exact"),
    ("D6", 'LIMIT.MEAN(%s;"chebyshev")' % V, a["chebyshev_ucl"], 1e-12, "mean + √19·SD/√24, NumPy (%s)" % SRC),
    ("D7", 'LIMIT.MEAN(%s;"median")' % V, "unknown method 'median'; valid: t, bootstrap, chebyshev", None, SRC_TEXT),
    ("D8", 'LIMIT.PERCENTILE(%s;0.8)' % V, a["p80_ucl"], 1e-12,
     "the %s smallest value: binomial order-statistic rule walked in %s" % (a["p80_rank"], SRC)),
    ("D9", 'LIMIT.PERCENTILE(%s;0.8;"estimate")' % V, "=PERCENTILE([$ammonia.B1:.B26];0.8)", 1e-12,
     "Calc's own PERCENTILE (stored name of PERCENTILE.INC, the same definition) on the same cells"),
    ("D10", 'LIMIT.PERCENTILE(%s;0.9)' % V, "a 95% upper limit of the 90th percentile needs at least 29 values, found 24",
     None, SRC_TEXT + " (1 − 0.9²⁹ = 0.953, 1 − 0.9²⁸ = 0.948: worked by hand)"),
    ("D11", 'LIMIT.EXCEEDANCE(%s;1)' % V, a["exceed_upper"], 1e-10,
     "scipy.stats.binomtest(4, 24, alternative='less').proportion_ci(0.95, 'exact') 1.10 (%s)" % SRC),
    ("D12", 'LIMIT.EXCEEDANCE(%s;1;"count")' % V, '=COUNTIF([$ammonia.B1:.B26];">1")', None, "Calc's COUNTIF"),
    ("D13", 'LIMIT.EXCEEDANCE(%s;100)' % V, "=1-0.05^(1/24)", 1e-12, "closed form for no exceedance: 1 − (1 − level)^(1/n)"),
    ("D14", 'LIMIT.TOLERANCE(%s;0.9)' % V, a["tolerance_upper"], 1e-9, "mean + k·SD, k from scipy.stats.nct.ppf 1.10 (%s)" % SRC),
    ("D15", 'LIMIT.TOLERANCE(%s;0.9;"limit-high";;"two-sided")' % V, a["tolerance_two_high"], 1e-12,
     "Howe's k from scipy norm/chi2 1.10 (%s)" % SRC),
    ("D16", 'LIMIT.TOLERANCE(%s;0.9;"limit";;"two-sided")' % V,
     "side two-sided gives two limits: ask for output limit-low or limit-high", None, SRC_TEXT),
    ("D17", 'LIMIT.TOLERANCE(%s;0.9;;;"two-sided";"distribution-free")' % V,
     "a distribution-free two-sided tolerance interval for 90% at 95% confidence needs at least 46 values, found 24",
     None, SRC_TEXT + " (Wilks: 1 − 0.9⁴⁶ − 46·0.1·0.9⁴⁵ = 0.952, n = 45 gives 0.948, worked by hand)"),
    ("D18", 'LIMIT.PREDICTION(%s)' % V, a["prediction_upper_1"], 1e-12, "mean + t·SD·√(1 + 1/n), mpmath t (%s)" % SRC),
    ("D19", 'LIMIT.PREDICTION(%s;3)' % V, a["prediction_upper_3"], 1e-12, "t at 1 − 0.05/3, mpmath (%s)" % SRC),
    ("D20", 'LIMIT.PREDICTION(%s;1;;;;"distribution-free")' % V, "=MAX([$ammonia.B1:.B26])", None,
     "the largest of 24 covers the next reading with 24/25 ≥ 95%: Calc's MAX"),
    ("D21", 'LIMIT.PREDICTION(%s;1;;0.99;;"distribution-free")' % V,
     "a distribution-free upper prediction limit for the next reading at 99% confidence needs at least 99 values, found 24",
     None, SRC_TEXT + " (n/(n + 1) ≥ 0.99 from n = 99, by hand)"),
    ("D22", 'LIMIT.MEAN(%s;"t";"report")' % V, "Upper 95% confidence limit of the mean (Student's t): 0.93 (mean 0.81, SD 0.33, n = 24)",
     None, "the numbers above rounded by hand, exact"),
    ("D23", 'LIMIT.MEAN(%s;"bootstrap")' % V, a["t_ucl"], 0.1,
     "the BCa bootstrap (fixed seed) near the t limit: within 10% (its coverage is tested in the core, not its digits)"),
    ("D24", 'LIMIT.EXCEEDANCE(%s;1;"estimate")' % V, '=COUNTIF([$ammonia.B1:.B26];">1")/COUNT([$ammonia.B1:.B26])', 1e-12,
     "Calc's COUNTIF over COUNT"),
    ("D25", 'LIMIT.TOLERANCE(%s;0.9;"limit-low";;"two-sided")' % V, a["tolerance_two_low"], 1e-12,
     "Howe's k from scipy norm/chi2 1.10 (%s)" % SRC),
    ("D26", 'LIMIT.TOLERANCE(%s;0.9;;;"lower")' % V, a["tolerance_lower"], 1e-9,
     "mean − k·SD, k from scipy.stats.nct.ppf 1.10 (%s)" % SRC),
    ("D27", 'LIMIT.TOLERANCE(%s;0.9;"k-factor")' % V, (a["tolerance_upper"] - mean) / sd, 1e-9,
     "scipy.stats.nct.ppf(0.95, 23, z(0.9)·√24)/√24 1.10 (%s)" % SRC),
    ("D28", 'LIMIT.TOLERANCE(%s;1.5)' % V, "proportion must be a fraction between 0 and 1 (such as 0.9), found 1.5", None, SRC_TEXT),
    ("D29", 'LIMIT.PREDICTION(%s;3;"limit-high";;"two-sided")' % V, a["prediction_two_3_high"], 1e-12,
     "t at 1 − 0.05/6, mpmath (%s)" % SRC),
    ("D30", 'LIMIT.PERCENTILE(%s;0.5)' % V, a["median_ucl"], 1e-12,
     "the %s smallest value: binomial order-statistic rule walked in %s" % (a["median_rank"], SRC)),
    ("D31", 'LIMIT.PERCENTILE(%s;"table")' % V, "fraction must be a number", None,
     SRC_TEXT + " (a keyword where the number goes)"),
    ("D32", 'LIMIT.PERCENTILE(%s)' % V, "fraction is needed: 0.9 for the 90th percentile", None, SRC_TEXT),
    ("D33", 'LIMIT.MEAN([.B2:.B2])', "an upper confidence limit of the mean needs at least 2 values, found 1", None, SRC_TEXT),
    ("D34", 'LIMIT.MEAN([.E2:.E6])', "all values are equal (no spread); an upper confidence limit of the mean needs values that vary",
     None, SRC_TEXT),
    ("D35", 'LIMIT.EXCEEDANCE(%s;1;"k-factor")' % V, "unknown output 'k-factor'; valid: limit, estimate, count, n, table, report",
     None, SRC_TEXT),
    ("D36", 'LIMIT.MEAN(%s;;95)' % V, "output must be a keyword in quotes (a text, not a number)", None,
     SRC_TEXT + " (a number typed where output goes)"),
    ("D37", 'LIMIT.MEAN(%s;;;99)' % V, a["t_ucl_99"], 1e-12, "level 99 read as 99%%: mpmath t quantile (%s)" % SRC),
]
sheet.column("E2", [1.5, 1.5, 1.5, 1.5, 1.5])
for ref, formula, expected, tolerance, source in cells:
    checked(sheet, ref, formula, expected, tolerance, source)

# LIMIT.MEAN table, entered as an array: 8 rows × 2.
sheet.formula("F2", 'LIMIT.MEAN(%s;"t";"table")' % V, array=(8, 2))
expected = book.sheet("expected")
expected.block("A1", [["quantity", "value"],
                      ["test", "One-sided 95% upper confidence limit of the mean (Student's t)"],
                      ["n", n], ["n dropped", 1], ["mean", mean], ["SD", sd],
                      ["k-factor", (a["t_ucl"] - mean) / sd], ["limit", a["t_ucl"]]])
check("ammonia.F2:G9", "block expected.A1:B8", 1e-12, "NumPy mean/SD and the mpmath t limit (%s)" % SRC)

# --- CHECK.OUTLIERS on Rosner's 54 values (NIST/SEMATECH e-Handbook §1.3.5.17) --------------
r = REF["rosner"]
out = book.sheet("rosner")
out.row("A1", ["value"])
out.column("A2", r["values"])
R = "[.A2:.A55]"
out.formula("C2", "CHECK.OUTLIERS(%s)" % R, array=(54, 1))
flags = book.sheet("flags")
top3 = sorted(range(54), key=lambda i: -r["values"][i])[:3]
flags.column("A1", ["outlier" if i in top3 else None for i in range(54)])
check("rosner.C2:C55", "block flags.A1:A54", None,
      "NIST/SEMATECH e-Handbook §1.3.5.17: three outliers, 6.01, 5.42, 5.34 (the last three rows)")
checked(out, "E2", 'CHECK.OUTLIERS(%s;;"count";10)' % R,
        3, None, "NIST/SEMATECH e-Handbook §1.3.5.17: three outliers with up to 10 tested")
checked(out, "E3", 'CHECK.OUTLIERS(%s;"grubbs";"count")' % R,
        0, None, "Grubbs: G = R1 = 3.118906 below λ1 = 3.158794 (the handbook's figures)")
checked(out, "E4", 'CHECK.OUTLIERS(%s;"fences";"count")' % R,
        "=COUNTIF([$rosner.A2:.A55];\">\"&(QUARTILE([$rosner.A2:.A55];3)+1.5*(QUARTILE([$rosner.A2:.A55];3)-QUARTILE([$rosner.A2:.A55];1))))+COUNTIF([$rosner.A2:.A55];\"<\"&(QUARTILE([$rosner.A2:.A55];1)-1.5*(QUARTILE([$rosner.A2:.A55];3)-QUARTILE([$rosner.A2:.A55];1))))",
        None, "Tukey's fences from Calc's own QUARTILE (stored name of QUARTILE.INC) and COUNTIF")
checked(out, "E5", 'CHECK.OUTLIERS([.A2:.A25])',
        "method generalized-esd needs at least 25 values (Rosner 1983), found 24; method grubbs tests the one most extreme value from 3 values",
        None, SRC_TEXT)
out.formula("G2", 'CHECK.OUTLIERS(%s;;"table";10)' % R, array=(12, 4))
tab = [["cell", "statistic", "critical value", "verdict"]]
order = [6.01, 5.42, 5.34, 4.64, 4.30, 3.68, 3.59, 3.30, 3.26, -0.25]
for i, step in enumerate(r["steps"]):
    row = 2 + r["values"].index(step["value"])
    tab.append(["A%d" % row, r["printed_R"][i], r["printed_lambda"][i], "outlier" if i < 3 else "not flagged"])
tab.append(["note", "the test assumes the other values come from a normal distribution; a flagged value is one to "
            "check (a transcription slip, a fouled probe), not one to delete", None, None])
book.sheet("table").block("A1", tab)
check("rosner.G2:J13", "block table.A1:D12", 5e-7,
      "NIST/SEMATECH e-Handbook §1.3.5.17 R1–R10 and λ1–λ10 as printed (6 decimals: 5e-7 relative is about half a unit)")

# --- CHECK.OUTLIERS beside a raw column with a header, a missing reading and a blank row --------
# Worked by hand: 1, 2, …, 10 and 30 (n = 11); QUARTILE.INC gives Q1 = 3.5, Q3 = 8.5, IQR 5, fences
# −4 and 16: only 30 lies beyond (4.3 IQRs above Q3).
probe = book.sheet("probe")
raw = ["turbidity NTU", 1, 2, 30, 3, "n/a", 4, 5, 6, 7, None, 8, 9, 10]
probe.column("A1", raw)
probe.formula("B1", 'CHECK.OUTLIERS([.A1:.A14];"fences")', array=(14, 1))
book.sheet("probe_flags").column("A1", [None, None, None, "outlier"] + [None] * 10)
check("probe.B1:B14", "block probe_flags.A1:A14", None,
      "worked by hand: fences at −4 and 16 from QUARTILE.INC; one flag beside 30, blank beside the header, n/a and blank rows")
checked(probe, "D1", 'CHECK.OUTLIERS([.A1:.A14];"fences";"report")',
        "Tukey's fences (1.5 × IQR), n = 11: 1 value beyond the fences (30.00); fences at -4.00 and 16.00 "
        "(quartiles ∓ 1.5 × IQR); a flagged value is one to check (a transcription slip, a fouled probe), not one to delete.",
        None, "worked by hand as above; numbers as report sentences format them")
checked(probe, "D2", 'CHECK.OUTLIERS([.A1:.A14];"grubbs";"count")',
        1, None, "worked by hand: G = (30 − 7.73)/7.93 = 2.81 against Grubbs' critical 2.36 at n = 11, α = 0.05 "
        "(λ from the t quantile, Grubbs 1969)")
checked(probe, "D3", 'CHECK.OUTLIERS([.A1:.A14];"grubbs";"count";3)',
        "most applies to method generalized-esd only; leave it empty", None, SRC_TEXT)
checked(probe, "D4", 'CHECK.OUTLIERS([.A1:.A14];"dixon")',
        "unknown method 'dixon'; valid: generalized-esd, grubbs, fences", None, SRC_TEXT)

# --- PLAN.* (statsmodels 0.13) --------------------------------------------------------------
plan = book.sheet("plan")
row = 2
plan.row("A1", ["design", "difference", "sd", "n", "count", "level", "target"])
for case in REF["power"]:
    d, nn, k, level, target = case["d"], case["n"], case["count"], case["level"], case["target"]
    design = case["design"]
    plan.row("A%d" % row, [design, 2 * d, 2.0, nn, k if design == "several-groups" else None, level, target])
    count = ";[.E%d]" % row if design == "several-groups" else ""
    plan.formula("H%d" % row, "PLAN.POWER([.D{r}];[.B{r}];[.C{r}];[.A{r}];[.F{r}]{c})".format(r=row, c=count))
    plan.formula("I%d" % row, "PLAN.SAMPLES([.B{r}];[.C{r}];[.A{r}];[.G{r}];[.F{r}]{c})".format(r=row, c=count))
    plan.formula("J%d" % row, "PLAN.DETECTABLE([.D{r}];[.C{r}];[.A{r}];[.G{r}];[.F{r}]{c})".format(r=row, c=count))
    source = "statsmodels 0.13 %s (%s)" % ({"two-groups": "TTestIndPower", "paired": "TTestPower",
                                              "one-sample": "TTestPower"}.get(design, "FTestAnovaPower, f = (D/σ)·√(1/(2k))"), SRC)
    check("plan.H%d" % row, case["power"], 1e-8, source + "; 1e-8: both evaluate Boost.Math's noncentral distributions")
    check("plan.I%d" % row, math.ceil(case["n_fractional"]), None, source + ": solve_power's n rounded up")
    check("plan.J%d" % row, 2 * case["detectable_d"], 1e-9, source + ": brentq on its power at xtol 1e-14")
    row += 1
plan.formula("H%d" % row, "PLAN.SAMPLES(0.5;1;;0.8)")
check("plan.H%d" % row, 64, None, "Cohen (1988) Table 2.4.1, d = 0.5, 80%, two-sided 5%: 64 per group (from memory)")
plan.formula("I%d" % row, "PLAN.SAMPLES(0.5;1;;1.2)")
check("plan.I%d" % row, "power must be a fraction between 0 and 1 (such as 0.8), found 1.2", None, SRC_TEXT)
plan.formula("J%d" % row, 'PLAN.POWER(20;0.5;1;"several-groups")')
check("plan.J%d" % row, "design several-groups needs count, the number of groups (a whole number from 2 to 10000)", None, SRC_TEXT)
row += 1
plan.formula("H%d" % row, "PLAN.POWER(20;0.5;1;;;4)")
check("plan.H%d" % row, "count is the number of groups of design several-groups; leave it empty for design two-groups", None,
      SRC_TEXT)
plan.formula("I%d" % row, "PLAN.DETECTABLE(20;1;;0)")
check("plan.I%d" % row, "power must be a fraction between 0 and 1 (such as 0.8), found 0", None, SRC_TEXT)
plan.formula("J%d" % row, "PLAN.POWER(1;0.5;1)")
check("plan.J%d" % row, "n must be a whole number of readings per group from 2 to 1000000000, found 1", None, SRC_TEXT)

book.write(os.path.join(HERE, "limits.fods"), comment="Generated by tests/office/make_limits_workbook.py")
print("wrote tests/office/limits.fods")
