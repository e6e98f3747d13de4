#!/usr/bin/python3
"""Writes tests/office/assumptions.fods: CHECK.NORMAL, CHECK.VARIANCE, CHECK.QQ, COMPARE.POSTHOC,
COMPARE.LETTERS, ADJUST.P and ADVISE.TEST in real cells.

    /usr/bin/python3 tests/office/make_assumptions_workbook.py

Data and expected values come from the committed fixtures tests/reference/normality.json and
tests/reference/posthoc.json (their generators name the libraries and formulas); the Q-Q points
are checked against Calc's own NORMSINV and SMALL on the same cells.
"""

import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference

HERE = os.path.dirname(os.path.abspath(__file__))
NORMALITY = reference("normality.json")
POSTHOC = reference("posthoc.json")

SRC_SW = ("Royston (1995) AS R94 in 50-digit mpmath (tests/reference/generate_normality.py); "
          "1e-9 relative: the same algorithm in double precision")
SRC_NORMAL = ("statsmodels 0.13 / SciPy 1.10 (tests/reference/generate_normality.py); 1e-8 relative: "
              "closed forms in double precision on both sides")
SRC_VARIANCE = "scipy.stats.levene / bartlett / fligner 1.10 (tests/reference/generate_normality.py); 1e-8 relative"
SRC_QQ = "Calc's own NORMSINV((i-3/8)/(n+1/4)) and SMALL(values; i) on the same cells; 1e-12 relative"
SRC_TUKEY = ("Tukey-Kramer with SciPy 1.10's studentized range (tests/reference/generate_posthoc.py); "
             "1e-6 relative: SciPy's integration accuracy")
SRC_ADJUST = "statsmodels 0.13 multipletests (tests/reference/generate_posthoc.py); 1e-12 relative"
SRC_RULE = "FUNCTIONS.md: a continuous response with group labels is a group comparison"
SRC_COUNT = "the number of values of the group in the data above"
SRC_TEXT = "the core's refusal text, exact"

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula


# --- CHECK.NORMAL and CHECK.QQ on one column with a header row ------------------------------
case = NORMALITY["normality"][0]
normal = book.sheet("normal")
values = case["values"]
normal.block("A1", [["weight"]] + [[x] for x in values])
last = len(values) + 1
rng = "[.A1:.A%d]" % last
methods = [("shapiro-wilk", case["shapiro_wilk"]["p"], SRC_SW),
           ("shapiro-francia", case["shapiro_francia"]["p"], SRC_NORMAL.replace("statsmodels 0.13 / SciPy 1.10", "Royston (1993) in mpmath")),
           ("anderson-darling", case["anderson_darling"]["p"], SRC_NORMAL),
           ("dagostino-pearson", case["dagostino-pearson"]["p"], SRC_NORMAL),
           ("jarque-bera", case["jarque_bera"]["p"], SRC_NORMAL),
           ("lilliefors", case["lilliefors"]["p_approx"], SRC_NORMAL)]
for i, (method, p, source) in enumerate(methods):
    normal.formula("C%d" % (i + 2), 'CHECK.NORMAL(%s;;"%s")' % (rng, method))
    check("normal.C%d" % (i + 2), p, 1e-9 if method == "shapiro-wilk" else 1e-6, source)
checked(normal, "C9", 'CHECK.NORMAL(%s;;;"statistic")' % rng, case["shapiro_wilk"]["W"], 1e-9, SRC_SW)
checked(normal, "C10", 'CHECK.NORMAL([.A1:.A3])', "needs 3 to 5000 values, found 2", "", SRC_TEXT)
# Q-Q: as many rows as the input range (12 with the header), the last row blank.
normal.formula("E1", "CHECK.QQ(%s)" % rng, array=(last, 2))
expected = book.sheet("expected")
n = len(values)
for i in range(1, n + 1):
    # ODF names: LEGACY.NORMSINV is Calc's NORMSINV.
    expected.formula("A%d" % i, "LEGACY.NORMSINV((%d-0.375)/(%d+0.25))" % (i, n))
    expected.formula("B%d" % i, "SMALL([$normal.$A$1:.$A$%d];%d)" % (last, i))
check("normal.E1:F%d" % last, "block expected.A1:B%d" % last, 1e-12, SRC_QQ)

# --- CHECK.VARIANCE on three groups, long format ---------------------------------------------
vcase = NORMALITY["variance"][0]
spread = book.sheet("spread")
rows = [["outfall", "nitrate"]]
for g in vcase["groups"]:
    rows += [[g["name"], x] for x in g["values"]]
spread.block("A1", rows)
last = len(rows)
v, g = "[.B1:.B%d]" % last, "[.A1:.A%d]" % last
for i, (method, key) in enumerate([("brown-forsythe", "brown_forsythe"), ("levene", "levene"),
                                   ("bartlett", "bartlett"), ("fligner", "fligner")]):
    spread.formula("D%d" % (i + 2), 'CHECK.VARIANCE(%s;%s;"%s")' % (v, g, method))
    check("spread.D%d" % (i + 2), vcase[key]["p"], 1e-8, SRC_VARIANCE)
checked(spread, "D7", 'CHECK.VARIANCE(%s;%s;"f-ratio")' % (v, g),
        "groups has 3 labels (north, east, south); method 'f-ratio' compares exactly 2", "", SRC_TEXT)
checked(spread, "D8", "ADVISE.TEST(%s;%s;\"function\")" % (v, g), "COMPARE.GROUPS", "", SRC_RULE)

# --- COMPARE.POSTHOC and COMPARE.LETTERS on four groups of unequal size ---------------------
pcase = POSTHOC["posthoc"][0]
pairs = book.sheet("pairs")
rows = [["reach", "length"]]
for name, xs in zip(pcase["names"], pcase["values"]):
    rows += [[name, x] for x in xs]
pairs.block("A1", rows)
last = len(rows)
v, g = "[.B1:.B%d]" % last, "[.A1:.A%d]" % last
k = len(pcase["names"])
for j, expected_pair in enumerate(pcase["tukey"]):
    r = j + 2  # header row first
    pairs.formula("D%d" % r, "INDEX(COMPARE.POSTHOC(%s;%s);%d;7)" % (v, g, r))
    check("pairs.D%d" % r, expected_pair["p"], 1e-6, SRC_TUKEY)
    pairs.formula("E%d" % r, "INDEX(COMPARE.POSTHOC(%s;%s);%d;3)" % (v, g, r))
    check("pairs.E%d" % r, expected_pair["estimate"], 1e-12, SRC_TUKEY.replace("; 1e-6 relative: SciPy's integration accuracy", "; a difference of means, 1e-12"))
pairs.formula("G2", "COMPARE.LETTERS(%s;%s)" % (v, g), array=(k + 1, 4))
for i, xs in enumerate(pcase["values"]):
    check("pairs.H%d" % (i + 3), len(xs), 0, SRC_COUNT)

# --- ADJUST.P keeps the shape and the blanks --------------------------------------------------
acase = POSTHOC["adjust"][0]
adjust = book.sheet("adjust")
ps = acase["p"]
adjust.block("A1", [[x] for x in ps[:3]] + [[None]] + [[x] for x in ps[3:]])
adjust.formula("C1", "ADJUST.P([.A1:.A%d])" % (len(ps) + 1), array=(len(ps) + 1, 1))
holm = acase["adjusted"]["holm"]
for i, x in enumerate(holm):
    cell = i + 1 if i < 3 else i + 2
    check("adjust.C%d" % cell, x, 1e-12, SRC_ADJUST)
check("adjust.C4", None, "", "a blank cell stays blank (FUNCTIONS.md, ADJUST.P)")

book.write(os.path.join(HERE, "assumptions.fods"), comment="Generated by tests/office/make_assumptions_workbook.py")
print("wrote", os.path.join(HERE, "assumptions.fods"))
