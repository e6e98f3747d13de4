#!/usr/bin/python3
"""Writes tests/office/categorical.fods: COMPARE.COUNTS, COMPARE.EXPECTED, FIT.LOGISTIC and
FIT.FACTORIAL in real cells.

    python3 tests/office/make_categorical_workbook.py

The data are the invented field scenarios of tests/reference/generate_categorical.py, and the
expected numbers come from its JSON (SciPy 1.10 / statsmodels 0.13, or exact fractions for the
Freeman-Halton test), except where Calc's own CHITEST computes the same p-value independently.
"""

import os

from quadrat_sheets.fods import Workbook
from quadrat_sheets.reference import reference
from quadrat_sheets.report_numbers import fmt_number, fmt_p

HERE = os.path.dirname(os.path.abspath(__file__))
REF = reference("categorical.json")

SRC_GEN = "tests/reference/generate_categorical.py (%s)"
SRC_TEXT = "FUNCTIONS.md and the core's refusal text, exact"


book = Workbook()
checks_rows = [["result", "expected", "tolerance", "source"]]

# --- counts: a block of counts with names --------------------------------------------------------
mayfly = REF["counts"]["mayfly_2x2"]
counts = book.sheet("counts")
counts.rows("A1", [[None, "present", "absent"], ["riffle"] + mayfly["table"][0], ["pool"] + mayfly["table"][1]])
counts.formula("E1", "COMPARE.COUNTS([.A1:.C3])")
counts.formula("E2", 'COMPARE.COUNTS([.A1:.C3];;"fisher")')
counts.formula("E3", 'COMPARE.COUNTS([.A1:.C3];;"yates";"statistic")')
counts.formula("E4", 'COMPARE.COUNTS([.A1:.C3];;"G";"statistic")')
counts.formula("E5", 'COMPARE.COUNTS([.A1:.C3];;;"effect")')
counts.formula("E6", 'COMPARE.COUNTS([.A1:.C3];;;"report")')
counts.formula("E8", 'COMPARE.COUNTS([.A1:.C3];;;"table")', array=(10, 2))
# Calc's CHITEST with the expected counts R_i C_j / N written as formulas: an independent p.
counts.rows("A20", [["expected"], ["=SUM($B2:$C2)*SUM(B$2:B$3)/SUM($B$2:$C$3)", "=SUM($B2:$C2)*SUM(C$2:C$3)/SUM($B$2:$C$3)"],
                         ["=SUM($B3:$C3)*SUM(B$2:B$3)/SUM($B$2:$C$3)", "=SUM($B3:$C3)*SUM(C$2:C$3)/SUM($B$2:$C$3)"]])
chi = mayfly["chi-square"]
report = "Pearson's chi-square test: χ²(1) = %s, %s, n = %d; φ = %s" % (
    fmt_number(chi["statistic"]), fmt_p(chi["p"]), mayfly["n"], fmt_number(mayfly["effect"]))
expected_table = [["quantity", "value"], ["test", "Pearson's chi-square test"],
                  ["statistic", chi["statistic"]], ["df", 1], ["p", chi["p"]], ["n", mayfly["n"]], ["n dropped", 0],
                  ["effect", mayfly["effect"]], ["smallest expected count", mayfly["smallest expected count"]],
                  ["cells expected below 5", mayfly["cells expected below 5"]]]
counts.rows("H8", expected_table)
# A 3×3 for the Freeman-Halton exact test, without names.
small = REF["counts"]["small_3x3"]
counts.rows("A12", small["table"])
counts.formula("E19", 'COMPARE.COUNTS([.A12:.C14];;"fisher")')
# Refusals.
counts.rows("A25", [[4, 5, 6], [3, -1, 2]])
counts.formula("E25", "COMPARE.COUNTS([.A25:.C25])")
counts.formula("E26", "COMPARE.COUNTS([.A25:.C26])")
counts.formula("E27", 'COMPARE.COUNTS([.A1:.C3];;"exact")')
counts.formula("E28", 'COMPARE.COUNTS([$counts.A12:.C14];;"yates")')
checks_rows += [
    ["counts.E1", chi["p"], 1e-9, "default chi-square p; " + SRC_GEN % "scipy.stats.chi2_contingency, correction=False"],
    ["counts.E1", "=LEGACY.CHITEST([$counts.B2:.C3];[$counts.A21:.B22])", 1e-9,
     "Calc's CHITEST with expected counts from SUM formulas: an independent Pearson p"],
    ["counts.E2", mayfly["fisher"]["p"], 1e-9, "Fisher exact, two-sided; " + SRC_GEN % "scipy.stats.fisher_exact"],
    ["counts.E3", mayfly["yates"]["statistic"], 1e-10, "Yates-corrected X2; " + SRC_GEN % "chi2_contingency correction=True"],
    ["counts.E4", mayfly["g"]["statistic"], 1e-10, "keyword in capitals; G; " + SRC_GEN % "lambda_='log-likelihood'"],
    ["counts.E5", mayfly["effect"], 1e-10, "phi; " + SRC_GEN % "scipy.stats.contingency.association, cramer"],
    ["counts.E6", report, None, "report sentence in the catalogue's number style; numbers " + SRC_GEN % "SciPy"],
    ["counts.E8:F17", "block counts.H8:I17", 1e-9, "table entered as an array; " + SRC_GEN % "SciPy"],
    ["counts.E19", small["fisher"]["p"], 1e-9,
     "3x3 exact test; " + SRC_GEN % "Freeman-Halton in exact fractions"],
    ["counts.E25", "needs at least 2 rows and 2 columns of categories, found 1x3; for one set of counts against "
                   "expected shares use COMPARE.EXPECTED", None, SRC_TEXT],
    ["counts.E26", "B26 holds a negative count (-1); counts must be 0 or more", None, SRC_TEXT],
    ["counts.E27", "unknown method 'exact'; valid: chi-square, yates, g, fisher", None, SRC_TEXT],
    ["counts.E28", "method 'yates' is for 2x2 tables; this table is 3x3 (use chi-square, g or fisher)", None, SRC_TEXT],
]

# --- labels: two label columns cross-tabulated, header row, missing markers, whole columns --------
labels = book.sheet("labels")
zone = ["zone"] + ["riffle"] * 32 + ["pool"] * 33 + ["n/a", "pool"]
found = (["mayfly"] + ["present"] * 23 + ["absent"] * 9 + ["present"] * 12 + ["absent"] * 21 + ["present", "-"])
labels.column("A1", zone)
labels.column("B1", found)
labels.formula("D1", "COMPARE.COUNTS([.A1:.A68];[.B1:.B68])")
labels.formula("D2", "COMPARE.COUNTS([.A:.A];[.B:.B])")
labels.formula("D3", 'COMPARE.COUNTS([.A:.A];[.B:.B];;"n")')
labels.formula("D4", 'INDEX(COMPARE.COUNTS([.A:.A];[.B:.B];;"table");7;2)')
checks_rows += [
    ["labels.D1", chi["p"], 1e-9, "two label columns with a header row give the mayfly table again; " + SRC_GEN % "SciPy"],
    ["labels.D2", chi["p"], 1e-9, "whole columns A:A and B:B; " + SRC_GEN % "SciPy"],
    ["labels.D3", 65, None, "rows with both labels (common practice, no source: counted by hand)"],
    ["labels.D4", 2, None, "n dropped: one missing zone (n/a), one missing label (-) (counted by hand)"],
]

# --- expected: goodness of fit --------------------------------------------------------------------
sex, morphs = REF["expected"]["sex_ratio"], REF["expected"]["morphs_9331"]
exp = book.sheet("expected")
exp.column("A1", ["voles"] + sex["observed"])
exp.column("C1", ["morph"] + morphs["observed"])
exp.column("D1", ["ratio"] + morphs["expected"])
exp.formula("F1", "COMPARE.EXPECTED([.A1:.A3])")
exp.formula("F2", "COMPARE.EXPECTED([.A1:.A3];{1;1};\"statistic\")")
exp.formula("F3", "COMPARE.EXPECTED([.C1:.C5];[.D1:.D5])")
exp.formula("F4", "COMPARE.EXPECTED([.C:.C];[.D:.D];\"df\")")
exp.formula("F5", "COMPARE.EXPECTED([.A1:.A3];;\"effect\")")
for i in range(2, 6):  # the ratio rescaled to the observed total, for Calc's CHITEST
    exp.formula("E%d" % i, "[.D%d]*SUM([.C$2:.C$5])/SUM([.D$2:.D$5])" % i)
exp.formula("F6", "LEGACY.CHITEST([.C2:.C5];[.E2:.E5])")
checks_rows += [
    ["expected.F1", sex["p"], 1e-10, "1:1 sex ratio, expected omitted; " + SRC_GEN % "scipy.stats.chisquare"],
    ["expected.F2", sex["statistic"], 1e-12, "expected typed as the inline array {1;1}; " + SRC_GEN % "scipy.stats.chisquare"],
    ["expected.F3", morphs["p"], 1e-10, "9:3:3:1 ratio rescaled to the total; " + SRC_GEN % "scipy.stats.chisquare"],
    ["expected.F3", "=[$expected.F6]", 1e-9, "Calc's CHITEST with the rescaled expected counts: an independent p"],
    ["expected.F4", 3, None, "whole columns; df = categories - 1 (common practice, no source)"],
    ["expected.F5", "unknown output 'effect'; valid: p, statistic, df, n, table, report", None, SRC_TEXT],
]

# --- logistic ---------------------------------------------------------------------------------------
mussel = REF["logistic"]["mussel"]
lg = book.sheet("logistic")
lg.column("A1", ["mussel"] + [int(v) for v in mussel["y"]])
lg.column("B1", ["depth"] + mussel["xs"][0])
n = len(mussel["y"])
lg.formula("D1", "FIT.LOGISTIC([.A1:.A%d];[.B1:.B%d];;0.9)" % (n + 1, n + 1), array=(3, 8))
lg.formula("D6", 'FIT.LOGISTIC([.A:.A];[.B:.B];"model")', array=(13, 2))
lg.formula("D21", 'FIT.LOGISTIC([.A1:.A%d];[.B1:.B%d];"r-squared")' % (n + 1, n + 1))
coef = [["variable", "coefficient", "SE", "z", "p", "odds ratio", "ci-low", "ci-high"]]
import math  # noqa: E402
for j, term in enumerate(["intercept", "depth"]):
    # The intercept's odds-ratio cells stay blank (FUNCTIONS.md, FIT.LOGISTIC).
    odds = [None, None, None] if j == 0 else [math.exp(mussel["estimate"][j]), mussel["or_low"][j], mussel["or_high"][j]]
    coef.append([term, mussel["estimate"][j], mussel["std_error"][j], mussel["z"][j], mussel["p"][j]] + odds)
lg.rows("D25", coef)
model = [["quantity", "value"], ["model", "Logistic regression (logit link, maximum likelihood)"], ["event", "1"],
         ["deviance", mussel["deviance"]], ["null deviance", mussel["null_deviance"]], ["statistic", mussel["statistic"]],
         ["df", mussel["df"]], ["p", mussel["lr_p"]], ["aic", mussel["aic"]], ["pseudo-r-squared", mussel["pseudo_r_squared"]],
         ["n", mussel["n"]], ["n dropped", 0], ["iterations", "=[$logistic.E18]"]]
lg.rows("D30", model)
checks_rows += [
    ["logistic.D1:K3", "block logistic.D25:K27", 1e-9,
     "coefficients with 90% odds-ratio intervals; " + SRC_GEN % "statsmodels Logit, Newton, tol 1e-14"],
    ["logistic.D6:E18", "block logistic.D30:E42", 1e-9,
     "model table over whole columns (iterations compared with itself: the count is the method's own); "
     + SRC_GEN % "statsmodels Logit; null deviance in closed form"],
    ["logistic.D21", "unknown output 'r-squared'; valid: coefficients, model", None, SRC_TEXT],
]

# --- factorial ----------------------------------------------------------------------------------------
bio = REF["factorial"]["biomass"]
fa = book.sheet("factorial")
fa.column("A1", ["biomass"] + bio["y"])
fa.column("B1", ["fertiliser"] + bio["a"])
fa.column("C1", ["watering"] + bio["b"])
m = len(bio["y"]) + 1
fa.formula("E1", "FIT.FACTORIAL([.A1:.A%d];[.B1:.B%d];[.C1:.C%d])" % (m, m, m), array=(5, 7))
fa.formula("E8", 'FIT.FACTORIAL([.A:.A];[.B:.B];[.C:.C];"p-factor1";"type-3")')
fa.formula("E9", 'FIT.FACTORIAL([.A:.A];[.B:.B];[.C:.C];"p-interaction")')
fa.formula("E10", 'FIT.FACTORIAL([.A:.A];[.B:.B];[.C:.C];;"type-4")')
table = [["source", "SS", "df", "MS", "F", "p", "partial η²"]]
for name, row in zip(["fertiliser", "watering", "fertiliser × watering"], bio["type2"][:3]):
    table.append([name, row["ss"], row["df"], row["ss"] / row["df"], row["f"], row["p"], row["partial_eta_squared"]])
res = bio["type2"][3]
table.append(["residual", res["ss"], res["df"], res["ss"] / res["df"], None, None, None])
fa.rows("E14", table)
checks_rows += [
    ["factorial.E1:K5", "block factorial.E14:K18", 1e-9,
     "Type II table with blank residual cells; " + SRC_GEN % "statsmodels ols + anova_lm(typ=2)"],
    ["factorial.E8", bio["type3"][0]["p"], 1e-9,
     "sums type-3 over whole columns; " + SRC_GEN % "anova_lm(typ=3) with C(x, Sum)"],
    ["factorial.E9", bio["type2"][2]["p"], 1e-9, SRC_GEN % "statsmodels anova_lm(typ=2)"],
    ["factorial.E10", "unknown sums 'type-4'; valid: type-2, type-3", None, SRC_TEXT],
]

checks = book.sheet("checks")
checks.rows("A1", checks_rows)
book.write(os.path.join(HERE, "categorical.fods"),
           comment="Generated by tests/office/make_categorical_workbook.py: edit that script, not this file.")
print("wrote tests/office/categorical.fods")
