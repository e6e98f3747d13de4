#!/usr/bin/python3
"""Writes tests/office/models.fods: FIT.COUNTS, FIT.PREDICT, factors among `xs` and `trials` in
FIT.LOGISTIC, in real cells.

    python3 tests/office/make_models_workbook.py

Data and expected values come from tests/reference/counts.json (generate_counts.py: Dobson &
Barnett's doctors table, an invented electrofishing survey, invented seed trays; statsmodels 0.13
GLM Poisson/Binomial and NegativeBinomial), tests/reference/predict.json (generate_predict.py:
statsmodels OLS get_prediction) and tests/reference/factors.json (generate_factors.py: OLS with a
treatment-coded factor and anova_lm typ=2, GLM Poisson with a site factor, GLM Binomial with
trials). Layouts and refusal texts are the catalogue's (FUNCTIONS.md, FIT).
"""

import math
import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference

HERE = os.path.dirname(os.path.abspath(__file__))

COUNTS = reference("counts.json")
PREDICT = reference("predict.json")
FACTORS = reference("factors.json")

SRC_COUNTS = "statsmodels 0.13 (tests/reference/generate_counts.py)"
SRC_PREDICT = "statsmodels 0.13 get_prediction (tests/reference/generate_predict.py)"
SRC_FACTORS = "statsmodels 0.13 (tests/reference/generate_factors.py)"
SRC_TEXT = "FUNCTIONS.md layout and the core's text, exact"
TOL_GLM = 1e-7   # two IRLS/Newton optima on the same likelihood (core tests measure ≤1e-9)
TOL_OLS = 1e-9   # least squares by QR on both sides

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula
expected = book.sheet("expected")


def column(sheet, ref, header, values):
    sheet.column(ref, [header] + list(values))


# --- fish: trout per pass, minutes as effort, depth and site (0/1) --------------------------------
fish = COUNTS["fish_passes"]
n = len(fish["fish"])
s = book.sheet("fish")
column(s, "A1", "trout", fish["fish"])
column(s, "B1", "depth", fish["depth"])
column(s, "C1", "site", fish["site"])
column(s, "D1", "minutes", fish["minutes"])
last = n + 1
Y, XS, EFFORT = "[.A1:.A%d]" % last, "[.B1:.C%d]" % last, "[.D1:.D%d]" % last

s.formula("F1", "FIT.COUNTS(%s;%s;%s;\"poisson\")" % (Y, XS, EFFORT), array=(4, 8))
rows = [["variable", "coefficient", "SE", "z", "p", "rate ratio", "ci-low", "ci-high"]]
ref = fish["poisson"]
for j, term in enumerate(["intercept", "depth", "site"]):
    rows.append([term, ref["coefficient"][j], ref["SE"][j], ref["z"][j], ref["p"][j]] +
                ([None, None, None] if j == 0 else [math.exp(ref["coefficient"][j]), None, None]))
expected.block("A1", [r[:6] for r in rows])
check("fish.F1:K4", "block expected.A1:F4", TOL_GLM, SRC_COUNTS + "; rate ratio = exp(coefficient)")

s.formula("F7", "FIT.COUNTS(%s;%s;%s;\"negative-binomial\";\"model\")" % (Y, XS, EFFORT), array=(14, 2))
nb = fish["negative_binomial"]
check("fish.G9", nb["deviance"], 1e-6, SRC_COUNTS + " (GLM NB deviance at the fitted k)")
check("fish.G10", nb["null deviance"], 1e-5, SRC_COUNTS + " (GLM NB null deviance at the fitted k)")
check("fish.G11", nb["lr statistic"], 1e-6, SRC_COUNTS)
check("fish.G14", nb["aic"], 1e-8, SRC_COUNTS)
check("fish.G20", nb["aggregation k"], 1e-6, SRC_COUNTS + "; k = 1/alpha")
check("fish.F20", "aggregation k", None, SRC_TEXT)

s.formula("F24", "FIT.COUNTS(%s;%s;%s;;\"model\")" % (Y, XS, EFFORT), array=(14, 2))
check("fish.G36", ref["overdispersion"], 1e-9, SRC_COUNTS + " (Pearson χ²/df of the Poisson fit)")

# Refusals: fractional and negative counts, a bad keyword.
s.block("N1", [["count", "x"], [1, 1], [2.5, 2], [3, 3], [4, 4], [5, 5], [6, 6]])
checked(s, "F42", "FIT.COUNTS([.N1:.N7];[.O1:.O7])",
        "counts holds 2.5; counts must be whole numbers from 0 up", None, SRC_TEXT)
checked(s, "F43", "FIT.COUNTS(%s;%s;%s;\"quasi\")" % (Y, XS, EFFORT),
        "unknown method 'quasi'; valid: auto, poisson, negative-binomial", None, SRC_TEXT)

# --- doctors: a published table (Dobson & Barnett 2008, Table 9.1) --------------------------------
doc = COUNTS["doctors"]
s = book.sheet("doctors")
column(s, "A1", "deaths", doc["deaths"])
column(s, "B1", "smoke", doc["smoke"])
column(s, "C1", "agecat", doc["agecat"])
column(s, "D1", "agesq", [a * a for a in doc["agecat"]])
column(s, "E1", "smokeage", [a * b for a, b in zip(doc["smoke"], doc["agecat"])])
column(s, "F1", "person-years", doc["person_years"])
s.formula("H1", "FIT.COUNTS([.A1:.A11];[.B1:.E11];[.F1:.F11];\"poisson\")", array=(6, 8))
for j in range(5):
    check("doctors.I%d" % (j + 2), doc["poisson"]["coefficient"][j], TOL_GLM,
          "Dobson & Barnett 2008, Table 9.1 data; " + SRC_COUNTS)

# --- site factor with effort (labels in xs) ------------------------------------------------------
pf = FACTORS["poisson"]
s = book.sheet("sites")
column(s, "A1", "trout", pf["trout"])
column(s, "B1", "site", pf["site"])
column(s, "C1", "pass length", pf["length"])
last = len(pf["trout"]) + 1
s.formula("E1", "FIT.COUNTS([.A1:.A%d];[.B1:.B%d];[.C1:.C%d];\"poisson\")" % (last, last, last), array=(4, 8))
for j, term in enumerate(pf["terms"]):
    check("sites.E%d" % (j + 2), term, None, SRC_TEXT + " (factor levels named `site: Birch`)")
    check("sites.F%d" % (j + 2), pf["coefficient"][j], TOL_GLM, SRC_FACTORS)
s.formula("E7", "FIT.COUNTS([.A1:.A%d];[.B1:.B%d];[.C1:.C%d];\"poisson\";\"model\")" % (last, last, last), array=(18, 2))
check("sites.E21", "site: χ²", None, SRC_TEXT)
check("sites.F21", pf["site chi2"], TOL_GLM, SRC_FACTORS + " (likelihood-ratio χ² against the model without site)")
check("sites.F23", pf["site p"], 1e-6, SRC_FACTORS)

# --- ANCOVA: oxygen by zone and temperature; predictions at rows naming a zone ---------------------
lf = FACTORS["linear"]
s = book.sheet("ancova")
column(s, "A1", "oxygen", lf["oxygen"])
column(s, "B1", "zone", lf["zone"])
column(s, "C1", "temperature", lf["temperature"])
last = len(lf["oxygen"]) + 1
Y, XS = "[.A1:.A%d]" % last, "[.B1:.C%d]" % last
s.formula("E1", "FIT.LINEAR(%s;%s)" % (Y, XS), array=(5, 8))
for j, term in enumerate(lf["terms"]):
    check("ancova.E%d" % (j + 2), term, None, SRC_TEXT)
    check("ancova.F%d" % (j + 2), lf["coefficient"][j], TOL_OLS, SRC_FACTORS)
    check("ancova.G%d" % (j + 2), lf["SE"][j], TOL_OLS, SRC_FACTORS)
s.formula("E8", "FIT.LINEAR(%s;%s;\"model\")" % (Y, XS), array=(16, 2))
check("ancova.E21", "zone: F", None, SRC_TEXT)
check("ancova.F21", lf["zone F"], 1e-9, SRC_FACTORS + " (anova_lm typ=2)")
check("ancova.F22", lf["zone df"], 0, SRC_FACTORS)
check("ancova.F23", lf["zone p"], 1e-8, SRC_FACTORS)
# New rows laid out like xs, with a header row: the result's header takes its place.
s.block("N1", [["zone", "temperature"]] + [[z, t] for z, t in zip(lf["at zone"], lf["at temperature"])])
s.formula("Q1", "FIT.PREDICT(%s;%s;[.N1:.O4])" % (Y, XS), array=(4, 5))
check("ancova.R1", "mean ci-low", None, SRC_TEXT)
for i in range(3):
    for j, key in enumerate(["predicted", "mean ci-low", "mean ci-high", "reading low", "reading high"]):
        check("ancova.%s%d" % ("QRSTU"[j], i + 2), lf[key][i], TOL_OLS, SRC_FACTORS + " (get_prediction summary_frame)")
s.formula("W1", "FIT.PREDICT(%s;%s;[.N1:.O4];\"reading-high\")" % (Y, XS), array=(4, 1))
check("ancova.W3", lf["reading high"][1], TOL_OLS, SRC_FACTORS)
s.block("N7", [["estuary", 12]])
checked(s, "Q7", "FIT.PREDICT(%s;%s;[.N7:.O7])" % (Y, XS),
        "N7 holds zone 'estuary', a level the data never had (upper, middle, lower); "
        "a model predicts only at levels it was fitted on", None, SRC_TEXT)
checked(s, "Q8", "FIT.PREDICT(%s;%s;[.N7:.N7])" % (Y, XS),
        "at has 1 column but xs has 2; lay at out like xs, one column per predictor", None, SRC_TEXT)
# Factors reach FIT.POINTS and CHECK.REGRESSION through the same reading.
s.formula("Y1", "FIT.POINTS(%s;%s;\"fitted\")" % (Y, XS), array=(last, 1))
check("ancova.Y2", "=%r+%r*[$ancova.C2]" % (lf["coefficient"][0], lf["coefficient"][3]), TOL_OLS,
      SRC_FACTORS + " (row 2 is zone upper, the reference level)")
checked(s, "Z1", "CHECK.REGRESSION(%s;%s;\"normality\")" % (Y, XS),
        "=IF(AND(ISNUMBER([$ancova.Z1]);[$ancova.Z1]>=0;[$ancova.Z1]<=1);[$ancova.Z1];-1)", 0,
        "a p-value from 0 to 1 (common practice, no source)")

# --- predictions: oxygen on temperature and elevation (numbers only) ------------------------------
s = book.sheet("predict")
column(s, "A1", "temperature", PREDICT["temperature"])
column(s, "B1", "elevation", PREDICT["elevation"])
column(s, "C1", "oxygen", PREDICT["oxygen"])
last = len(PREDICT["oxygen"]) + 1
s.block("E1", [[t, e] for t, e in PREDICT["at"]])   # no header row: the result's header sits on top
s.formula("H1", "FIT.PREDICT([.C1:.C%d];[.A1:.B%d];[.E1:.F4])" % (last, last), array=(5, 5))
case = PREDICT["cases"]["0.95"]
for i in range(4):
    for j, key in enumerate(["predicted", "mean ci-low", "mean ci-high", "reading low", "reading high"]):
        check("predict.%s%d" % ("HIJKL"[j], i + 2), case[key][i], TOL_OLS, SRC_PREDICT)
s.formula("N1", "FIT.PREDICT([.C1:.C%d];[.A1:.B%d];[.E1:.F4];\"mean-ci-low\";90)" % (last, last), array=(4, 1))
for i in range(4):
    check("predict.N%d" % (i + 1), PREDICT["cases"]["0.9"]["mean ci-low"][i], TOL_OLS, SRC_PREDICT + " at level 90%")

# --- seed trays: successes out of trials, a factor and a covariate --------------------------------
bf = FACTORS["binomial"]
s = book.sheet("trays")
column(s, "A1", "germinated", bf["germinated"])
column(s, "B1", "treatment", bf["treatment"])
column(s, "C1", "moisture", bf["moisture"])
column(s, "D1", "sown", bf["sown"])
last = len(bf["sown"]) + 1
s.formula("F1", "FIT.LOGISTIC([.A1:.A%d];[.B1:.C%d];;;[.D1:.D%d])" % (last, last, last), array=(4, 8))
for j, term in enumerate(bf["terms"]):
    check("trays.F%d" % (j + 2), term, None, SRC_TEXT)
    check("trays.G%d" % (j + 2), bf["coefficient"][j], TOL_GLM, SRC_FACTORS + " (GLM Binomial on successes, failures)")
s.formula("F7", "FIT.LOGISTIC([.A1:.A%d];[.B1:.C%d];\"model\";;[.D1:.D%d])" % (last, last, last), array=(16, 2))
check("trays.F20", "treatment: χ²", None, SRC_TEXT)
check("trays.G20", bf["treatment chi2"], TOL_GLM, SRC_FACTORS + " (deviance difference)")
s.block("K24", [[3, 1, 4], [5, 2, 4], [9, 3, 10], [2, 4, 8]])
checked(s, "F24", "FIT.LOGISTIC([.K24:.K27];[.L24:.L27];;;[.M24:.M27])",
        "y holds 5 in K25 but trials only 4; successes cannot exceed trials", None, SRC_TEXT + " (trials is an optional argument: the office hands it over without its address)")

book.write(os.path.join(HERE, "models.fods"),
           "Generated by tests/office/make_models_workbook.py; do not edit by hand.")
