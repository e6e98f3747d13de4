#!/usr/bin/python3
"""Writes tests/office/linear.fods: FIT.LINEAR, FIT.POINTS, CHECK.REGRESSION and RELATE.CORRELATION in
real cells.

    python3 tests/office/make_linear_workbook.py

Data and expected values come from tests/reference/linear.json (tests/reference/generate_linear.py:
invented field scenarios drawn with a fixed seed; statsmodels 0.13 OLS(method='qr'), OLSInfluence,
het_breuschpagan(robust=True), linear_reset(power=3, test_type='fitted', use_f=True),
durbin_watson, variance_inflation_factor; SciPy 1.10 pearsonr, spearmanr, kendalltau(method=
'exact'), shapiro). The stream sheet adds two rows with a missing cell (dropped, left blank in
FIT.POINTS) to the generator's 40 reaches; layouts and refusal texts are the catalogue's.
"""

import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference
from quadrat_sheets.report_numbers import fmt_number, fmt_p

HERE = os.path.dirname(os.path.abspath(__file__))
REF = reference("linear.json")

SRC_SM = "statsmodels 0.13 (tests/reference/generate_linear.py)"
SRC_SP = "SciPy 1.10 (tests/reference/generate_linear.py)"
TOL_EST = 1e-9   # estimates, SEs, fitted values: both sides solve a well-conditioned fit by QR
TOL_P = 1e-8     # p-values and limits: Boost.Math against SciPy's distribution code
SRC_TEXT = "FUNCTIONS.md layout and the core's text, exact"


book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula


# --- stream: header row, 40 reaches, two rows with a missing cell ---------------------------------
stream = REF["stream"]
ref = stream["reference"]
sheet = book.sheet("stream")
rows = [["density", "flow", "canopy"]]
data_rows = []  # 1-based sheet row of each reach
for i, y in enumerate(stream["y"]):
    if i == 5:
        rows.append([99, "n/a", 50])   # text in a predictor: dropped
        rows.append([98, 0.5, None])   # empty predictor cell: dropped
    rows.append([y, stream["xs"][0][i], stream["xs"][1][i]])
    data_rows.append(len(rows))
sheet.block("A1", rows)
last = len(rows)
Y = "[.A1:.A%d]" % last
XS = "[.B1:.C%d]" % last

expected = book.sheet("expected")

# Coefficients table (array 4 × 8).
sheet.formula("E1", "FIT.LINEAR(%s;%s)" % (Y, XS), array=(4, 8))
coef = [["variable", "coefficient", "SE", "t", "p", "ci-low", "ci-high", "VIF"]]
for j, term in enumerate(["intercept"] + stream["names"]):
    coef.append([term, ref["estimate"][j], ref["std_error"][j], ref["t"][j], ref["p"][j],
                 ref["ci"]["0.95"][j][0], ref["ci"]["0.95"][j][1], None if j == 0 else ref["vif"][j - 1]])
expected.block("A1", coef)
check("stream.E1:L4", "block expected.A1:H4", TOL_P, SRC_SM + "; p and limits at the p tolerance")

# Model table (array 13 × 2).
sheet.formula("E7", 'FIT.LINEAR(%s;%s;"model")' % (Y, XS), array=(13, 2))
model = [["quantity", "value"], ["model", "Linear regression (ordinary least squares)"],
         ["r-squared", ref["r_squared"]], ["r-squared-adjusted", ref["r_squared_adjusted"]], ["statistic", ref["f"]], ["df", ref["df"]],
         ["df2", ref["df2"]], ["p", ref["f_p"]], ["residual-sd", ref["residual_sd"]], ["aic", ref["aic"]],
         ["bic", ref["bic"]], ["n", 40], ["n dropped", 2]]
expected.block("A7", model)
check("stream.E7:F19", "block expected.A7:B19", TOL_P,
      SRC_SM + "; AIC/BIC from its llf with σ² counted as a parameter; n and n dropped by count")

checked(sheet, "E21", 'FIT.LINEAR(%s;%s;"r-squared")' % (Y, XS), ref["r_squared"], TOL_EST, SRC_SM)
checked(sheet, "E22", 'FIT.LINEAR([.A:.A];[.B:.C];"residual-sd")',
        ref["residual_sd"], TOL_EST, SRC_SM + "; whole-column references")
checked(sheet, "E23", 'FIT.LINEAR(%s;%s;"slope")' % (Y, XS),
        "output 'slope' needs exactly one predictor (xs has 2 columns); "
        "use output 'coefficients' for the whole table", None, SRC_TEXT)
checked(sheet, "E25", 'FIT.LINEAR(%s;%s;"slopes")' % (Y, XS),
        "unknown output 'slopes'; valid: coefficients, model, r-squared, p, slope, intercept, residual-sd, report",
        None, SRC_TEXT)

# FIT.POINTS: all six columns in place of the header row (array 43 × 6), and one column.
sheet.formula("N1", "FIT.POINTS(%s;%s)" % (Y, XS), array=(last, 6))
expected.row("D21", ["fitted value", "residual", "standardized residual", "studentized residual", "leverage",
                     "Cook's distance"])
for i, r in enumerate(data_rows):
    expected.row("D%d" % (20 + r), [ref["fitted"][i], ref["residual"][i], ref["standardized"][i],
                                    ref["studentized"][i], ref["leverage"][i], ref["cook"][i]])
check("stream.N1:S%d" % last, "block expected.D21:I%d" % (20 + last), 1e-8,
      SRC_SM + " OLSInfluence; residuals near 0 limit the relative tolerance to 1e-8; dropped rows blank")
sheet.formula("U1", 'FIT.POINTS(%s;%s;"studentized")' % (Y, XS), array=(last, 1))
for i, r in enumerate(data_rows):
    expected.put("K%d" % (20 + r), ref["studentized"][i])
check("stream.U1:U%d" % last, "block expected.K21:K%d" % (20 + last), TOL_EST,
      SRC_SM + " OLSInfluence.resid_studentized_external; header and dropped rows blank")

# CHECK.REGRESSION: one number per check, and verdicts read from the table.
c = ref["checks"]
for address, output, value, tol, source in [
        ("E27", "spread", c["breusch_pagan_p"], TOL_P, SRC_SM + " het_breuschpagan(robust=True)"),
        ("E28", "independence", "independence needs the sampling order: give order (a column of dates, times or "
         "distances); rows in no particular order cannot be judged", None, "FUNCTIONS.md: no order, no Durbin–Watson"),
        ("E29", "linearity", c["reset_p"], TOL_P, SRC_SM + " linear_reset(power=3, fitted, F)"),
        ("E30", "collinearity", c["max_vif"], TOL_EST, SRC_SM + " variance_inflation_factor"),
        ("E31", "influence", c["max_cook"], TOL_EST, SRC_SM + " OLSInfluence.cooks_distance"),
        ("E32", "outliers", c["outliers"], None, SRC_SM + " OLSInfluence: rows with |t| > 3, a count"),
        ("E33", "normality", c["shapiro_p"], 1e-3, SRC_SP + " shapiro computes in single precision: 1e-3")]:
    checked(sheet, address, 'CHECK.REGRESSION(%s;%s;"%s")' % (Y, XS, output), value, tol, source)
checked(sheet, "E34", "INDEX(CHECK.REGRESSION(%s;%s);3;5)" % (Y, XS),
        "look", None, "BP p = 0.027 < 0.05 (" + SRC_SM + "); verdict rule of FUNCTIONS.md")
checked(sheet, "E35", "INDEX(CHECK.REGRESSION(%s;%s);4;4)" % (Y, XS),
        "no verdict: rows in no particular order cannot be judged; give order (dates, times or distances) "
        "for Durbin–Watson", None, "FUNCTIONS.md: without order the independence row gives no verdict")
checked(sheet, "E36", "INDEX(CHECK.REGRESSION(%s;%s);1;5)" % (Y, XS), "verdict", None, SRC_TEXT)

# --- marsh: one predictor, no header ---------------------------------------------------------------
marsh = REF["marsh"]
mref = marsh["reference"]
msheet = book.sheet("marsh")
msheet.block("A1", [[y, x] for y, x in zip(marsh["y"], marsh["xs"][0])])
n = len(marsh["y"])
MY, MX = "[.A1:.A%d]" % n, "[.B1:.B%d]" % n
checked(msheet, "D1", 'FIT.LINEAR(%s;%s;"slope")' % (MY, MX), mref["estimate"][1], TOL_EST, SRC_SM)
checked(msheet, "D2", 'FIT.LINEAR(%s;%s;"intercept")' % (MY, MX), mref["estimate"][0], TOL_EST, SRC_SM)
checked(msheet, "D3", 'FIT.LINEAR(%s;%s;"p")' % (MY, MX), mref["f_p"], TOL_P, SRC_SM)
msheet.formula("D4", 'FIT.LINEAR(%s;%s;"report")' % (MY, MX))
lo, hi = mref["ci"]["0.95"][1]
report = "Linear regression (ordinary least squares): R² = %s, F(1, %d) = %s, %s, n = %d; slope %s (95%% CI %s to %s)" % (
    fmt_number(mref["r_squared"]), n - 2, fmt_number(mref["f"]), fmt_p(mref["f_p"]), n,
    fmt_number(mref["estimate"][1]), fmt_number(lo), fmt_number(hi))
check("marsh.D4", report, None, SRC_SM + " numbers, formatted by the catalogue's report rules; exact")
checked(msheet, "D5", "ROWS(FIT.POINTS(%s;%s))" % (MY, MX),
        n + 1, None, "no header in the input: the header row goes on top, one row more (FUNCTIONS.md)")
checked(msheet, "D6", "INDEX(FIT.POINTS(%s;%s);1;6)" % (MY, MX), "Cook's distance", None, SRC_TEXT)
checked(msheet, "D7", 'ROWS(FIT.POINTS(%s;%s;"leverage"))' % (MY, MX),
        n, None, "one column: exactly the input's rows (FUNCTIONS.md)")

# --- cores: correlation, no ties ------------------------------------------------------------------
cores = REF["cores"]
cref = cores["reference"]
csheet = book.sheet("cores")
csheet.block("A1", [["organic", "bulk"]] + [[x, y] for x, y in zip(cores["x"], cores["y"])])
CX, CY = "[.A1:.A21]", "[.B1:.B21]"
for address, args, value, tol, source in [
        ("D1", "", cref["pearson"]["p"], TOL_P, SRC_SP + " pearsonr"),
        ("D2", ';;"estimate"', cref["pearson"]["r"], TOL_EST, SRC_SP + " pearsonr"),
        ("D3", ';;"ci-low"', cref["pearson"]["ci_low"], TOL_P, SRC_SP + " pearsonr confidence_interval (Fisher z)"),
        ("D4", ';;"ci-high"', cref["pearson"]["ci_high"], TOL_P, SRC_SP + " pearsonr confidence_interval (Fisher z)"),
        ("D5", ';"spearman"', cref["spearman"]["p"], TOL_P, SRC_SP + " spearmanr"),
        ("D6", ';"kendall";"estimate"', cref["kendall"]["tau"], TOL_EST, SRC_SP + " kendalltau"),
        ("D7", ';"kendall"', cref["kendall"]["p"], TOL_P, SRC_SP + " kendalltau(method='exact')"),
        ("D8", ';"KENDALL";"statistic"', cref["kendall"]["tau"], TOL_EST,
         SRC_SP + " kendalltau: τ is the statistic in the exact case"),
        ("D9", ';;"n"', 20, None, "20 data rows under a header, a count")]:
    checked(csheet, address, "RELATE.CORRELATION(%s;%s%s)" % (CX, CY, args), value, tol, source)
checked(csheet, "D10", 'RELATE.CORRELATION(%s;%s;"tau")' % (CX, CY),
        "unknown method 'tau'; valid: pearson, spearman, kendall", None, SRC_TEXT)

fish = REF["fish"]
fsheet = book.sheet("fish")
fsheet.block("A1", [[x, y] for x, y in zip(fish["x"], fish["y"])])
checked(fsheet, "D1", 'RELATE.CORRELATION([.A1:.A60];[.B1:.B60];"kendall")',
        fish["reference"]["kendall"]["p"], TOL_P, SRC_SP + " kendalltau(method='asymptotic'), ties")


book.write(os.path.join(HERE, "linear.fods"), comment="Generated by tests/office/make_linear_workbook.py")
