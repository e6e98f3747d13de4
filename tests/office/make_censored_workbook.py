#!/usr/bin/python3
"""Writes tests/office/censored.fods: DESCRIBE.CENSORED and COMPARE.CENSORED in real cells, and the
refusal of the other functions on a cell holding a value below a detection limit.

    /usr/bin/python3 tests/office/make_censored_workbook.py

Data and expected values come from tests/reference/censored.json (tests/reference/
generate_censored.py: statsmodels 0.13 SurvfuncRight and survdiff on the flipped values, exact
fractions, ROS worked by hand with mpmath). Censored cells are written as the lab reports them:
the text "<0.5", "< 1" (a space) and, in a comma-decimal form, "<0,5" is not used here because the
test profile runs in an en-US locale (the reader's locale rule is tested in the core).
Refusal texts are the core's, exact.
"""

import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference
from quadrat_sheets.report_numbers import fmt_number, fmt_p

HERE = os.path.dirname(os.path.abspath(__file__))
REF = reference("censored.json")
SRC_KM = ("statsmodels 0.13 SurvfuncRight on the values flipped about 100, mean and Greenwood-type SE from its "
          "curve (tests/reference/generate_censored.py); 1e-9 relative (the flip costs about 1e-14)")
SRC_DIFF = ("statsmodels 0.13 survdiff on the flipped values, weight_type %s "
            "(tests/reference/generate_censored.py); 1e-9 relative: the same weighted log-rank definition")
SRC_ROS = ("Helsel & Cohn (1988) ROS worked by hand (positions in exact fractions), line and filled-in values "
           "in 30-digit mpmath (tests/reference/generate_censored.py); 1e-9 relative")
SRC_TEXT = "the core's refusal text, exact"
SRC_COUNT = "counted from the data rows, exact"

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula


def cell_text(value, censored, spaced=False):
    """What the lab sheet shows: a number, or "<0.5" (written "< 0.5" where `spaced`)."""
    if not censored:
        return value
    return ("< %g" if spaced else "<%g") % value


# --- three wells, long format, header row ---------------------------------------------------------
wells = REF["survdiff"]["three_wells"]["groups"]
field = book.sheet("wells")
rows = [["well", "zinc ug/L"]]
index = 0
for name, cells in wells:
    for value, censored in cells:
        rows.append([name, cell_text(value, censored, spaced=index % 5 == 0)])
        index += 1
field.block("A1", rows)
last = len(rows)
V, G = "[.B1:.B%d]" % last, "[.A1:.A%d]" % last
n_total = last - 1
n_censored = sum(1 for _, cells in wells for _, c in cells if c)

field.formula("D2", "COMPARE.CENSORED(%s;%s)" % (V, G))
field.formula("D3", 'COMPARE.CENSORED(%s;%s;"peto-prentice";"statistic")' % (V, G))
field.formula("D4", 'COMPARE.CENSORED(%s;%s;"gehan")' % (V, G))
field.formula("D5", 'COMPARE.CENSORED(%s;%s;"gehan";"statistic")' % (V, G))
field.formula("D6", 'COMPARE.CENSORED(%s;%s;;"df")' % (V, G))
field.formula("D7", 'COMPARE.CENSORED(%s;%s;;"n")' % (V, G))
field.formula("D8", 'COMPARE.CENSORED(%s;%s;"logrank")' % (V, G))
field.formula("D9", 'COMPARE.CENSORED(%s;%s;;"estimate")' % (V, G))
diff = REF["survdiff"]["three_wells"]
check("wells.D2", diff["peto-prentice"][1], 1e-9, SRC_DIFF % '"fh", fh_p=1')
check("wells.D3", diff["peto-prentice"][0], 1e-9, SRC_DIFF % '"fh", fh_p=1')
check("wells.D4", diff["gehan"][1], 1e-9, SRC_DIFF % '"gb"')
check("wells.D5", diff["gehan"][0], 1e-9, SRC_DIFF % '"gb"')
check("wells.D6", 2, None, "k - 1 = 2 for three wells, exact")
check("wells.D7", n_total, None, SRC_COUNT)
check("wells.D8", "unknown method 'logrank'; valid: peto-prentice, gehan", None, SRC_TEXT)
check("wells.D9", "unknown output 'estimate'; valid: p, statistic, df, n, table, report", None,
      SRC_TEXT + " (the output list of FUNCTIONS.md's COMPARE.CENSORED entry)")

# The table: test, statistic, df, p, n, n dropped, then per well n, censored, median.
table_rows = 6 + 3 * len(wells) + 1
field.formula("F2", 'COMPARE.CENSORED(%s;%s;;"table")' % (V, G), array=(table_rows, 2))
expected = book.sheet("expected")
block = [["quantity", "value"], ["test", "Peto–Prentice generalized Wilcoxon test"],
         ["statistic", diff["peto-prentice"][0]], ["df", 2], ["p", diff["peto-prentice"][1]],
         ["n", n_total], ["n dropped", 0]]
# Kaplan–Meier medians worked by hand in tests/core/censored_test.cpp (TableAndReport): upstream 0.7,
# pond 1.8; outfall: 6.4, 5.3, 4.4, 3.8 leave 5/9 after 3.8, 2.7 gives 4/9 < 0.5: median 2.7.
medians = {"upstream": 0.7, "pond": 1.8, "outfall": 2.7}
for name, cells in wells:
    block += [["%s: n" % name, len(cells)], ["%s: censored" % name, sum(1 for _, c in cells if c)],
              ["%s: median" % name, medians[name]]]
expected.block("A1", block)
check("wells.F2:G%d" % (1 + table_rows), "block expected.A1:B%d" % table_rows, 1e-9,
      SRC_DIFF % '"fh", fh_p=1' + "; counts exact; medians by hand (tests/core/censored_test.cpp)")
field.formula("D11", 'COMPARE.CENSORED(%s;%s;;"report")' % (V, G))
check("wells.D11",
      "Peto–Prentice generalized Wilcoxon test: χ²(2) = %s, %s; Kaplan–Meier medians upstream 0.70, pond 1.80, "
      "outfall 2.70 (3 groups; %d of %d values below a detection limit)"
      % (fmt_number(diff["peto-prentice"][0]), fmt_p(diff["peto-prentice"][1]), n_censored, n_total), None,
      "the catalogue's report form (tools/quadrat_sheets/report_numbers.py) on the statsmodels values above")

# Whole columns cost only their used rows; the header row is read as a header.
checked(field, "D13", "INDEX(DESCRIBE.CENSORED([.B:.B];[.A:.A]);2;3)",
        sum(1 for _, c in wells[0][1] if c), None, SRC_COUNT + " (upstream's censored values, whole columns)")

# The same wells in wide format (one column per well, names in the first row): groups left empty.
wide = book.sheet("wide")
longest = max(len(cells) for _, cells in wells)
wide.row("A1", [name for name, _ in wells])
for j, (_, cells) in enumerate(wells):
    wide.column("%s2" % "ABC"[j], [cell_text(v, c) for v, c in cells])
WIDE = "[.A1:.C%d]" % (1 + longest)
checked(wide, "E2", "COMPARE.CENSORED(%s;;\"gehan\")" % WIDE,
        diff["gehan"][1], 1e-9, SRC_DIFF % '"gb"' + "; wide format gives the long format's groups")
checked(wide, "E3", "INDEX(DESCRIBE.CENSORED(%s);4;3)" % WIDE,
        sum(1 for _, c in wells[2][1] if c), None, SRC_COUNT + " (outfall's censored values)")

# --- DESCRIBE.CENSORED on one well (Kaplan–Meier) and ROS by hand ---------------------------------
zinc = REF["kaplan_meier"]["zinc_well_a"]
single = book.sheet("wellA")
single.put("A1", "zinc ug/L")
single.column("A2", [cell_text(v, c) for v, c in zinc["values"]])
Z = "[.A1:.A%d]" % (1 + len(zinc["values"]))
single.formula("C2", "DESCRIBE.CENSORED(%s)" % Z, array=(2, 15))
# Columns D..R of `expected`: mean in J2, SE in K2; the interval by Calc's own NORMSINV.
expected.rows("D1", [["group", "n", "censored", "censored %", "lowest limit", "highest limit", "mean", "SE",
                      "ci-low", "ci-high", "q1", "median", "q3", "maximum", "method"],
                     ["zinc ug/L", 12, 3, 25, 0.5, 0.5, zinc["mean"], zinc["mean_se"],
                      "=J2-LEGACY.NORMSINV(0.975)*K2", "=J2+LEGACY.NORMSINV(0.975)*K2", None, zinc["quantiles"]["0.5"],
                      zinc["quantiles"]["0.75"], 3.1,
                      "Kaplan–Meier; mean restricted at the lowest value <0.5 (biased upward)"]])
check("wellA.C2:Q3", "block expected.D1:R2", 1e-9,
      SRC_KM + "; the interval mean ± NORMSINV(0.975)·SE by Calc; q1 blank (undetermined mass below 0.5)")

ros = REF["ros"]
hand = book.sheet("ros")
hand.put("A1", "arsenic ug/L")
hand.column("A2", [cell_text(v, c) for v, c in ros["values"]])
R = "[.A1:.A%d]" % (1 + len(ros["values"]))
hand.formula("C2", 'DESCRIBE.CENSORED(%s;;"ros")' % R, array=(2, 15))
checked(hand, "C5", 'INDEX(DESCRIBE.CENSORED(%s;;"ros");2;7)' % R, ros["mean"], 1e-9, SRC_ROS)
checked(hand, "C6", 'INDEX(DESCRIBE.CENSORED(%s;;"ros");2;8)' % R,
        ros["sd"] / len(ros["values"]) ** 0.5, 1e-9, SRC_ROS + "; SE = SD/sqrt(8)")
checked(hand, "C7", 'INDEX(DESCRIBE.CENSORED(%s;;"ros");2;15)' % R, "ROS, lognormal", None, "method text, exact")

# --- refusals -----------------------------------------------------------------------------------
bad = book.sheet("refusals")
bad.block("A1", [["well", "zinc"], ["north", "<1"], ["north", "< 1"], ["north", "<0.5"], ["north", "<1"],
                 ["north", "<0.5"], ["north", 2.0], ["south", 1.2], ["south", 2.5], ["south", 3.1]])
B, A = "[.B1:.B10]", "[.A1:.A10]"
checked(bad, "D2", "DESCRIBE.CENSORED(%s;%s)" % (B, A),
        "north has 5 of 6 values below a detection limit (83%); above 80% no method estimates a "
        "mean or quartiles: report how many were detected, or describe the other groups without it", None, SRC_TEXT)
checked(bad, "D3", 'DESCRIBE.CENSORED(%s;%s;"mle")' % (B, A),
        "unknown method 'mle'; valid: kaplan-meier, ros", None, SRC_TEXT)
# The functions outside the family refuse the censored cell B2, naming it (FUNCTIONS.md, "Values
# below a detection limit").
CENSORED_CELL = ("B2 holds a value below a detection limit (<1); leaving it out would bias the result upward: "
                 "use DESCRIBE.CENSORED or COMPARE.CENSORED")
for row, formula in enumerate(["DESCRIBE.GROUPS(%s;%s)" % (B, A), "COMPARE.GROUPS(%s;%s)" % (B, A),
                               'COMPARE.GROUPS(%s;%s;"ranks")' % (B, A), "CHECK.NORMAL(%s)" % B,
                               "CHECK.VARIANCE(%s;%s)" % (B, A)], start=5):
    bad.formula("D%d" % row, formula)
    check("refusals.D%d" % row, CENSORED_CELL, None, "FUNCTIONS.md censored-cell rule, exact text")
# The same rule for functions of every family, tables included (a table function shows the text
# alone), with a depth column as the second variable.
bad.column("N1", ["depth m", 0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5, 4.0, 4.5])
Y = "[.N1:.N10]"
for row, formula in enumerate(["COMPARE.POSTHOC(%s;%s)" % (B, A), "COMPARE.LETTERS(%s;%s)" % (B, A),
                               "CHECK.QQ(%s)" % B, "COMPARE.PAIRED(%s;%s)" % (B, Y),
                               "RELATE.CORRELATION(%s;%s)" % (B, Y), 'FIT.LINEAR(%s;%s;"report")' % (B, Y),
                               "FIT.FACTORIAL(%s;%s;%s)" % (B, A, A)], start=12):
    bad.formula("D%d" % row, formula)
    check("refusals.D%d" % row, CENSORED_CELL, None, "FUNCTIONS.md censored-cell rule, exact text")
# ADVISE.TEST points a response holding censored values to the censored functions.
checked(bad, "D20", 'ADVISE.TEST(%s;%s;"function")' % (B, A),
        "COMPARE.CENSORED", None, "FUNCTIONS.md ADVISE.TEST: censored response, exact")
checked(bad, "D21", 'ADVISE.TEST(%s;%s;"method")' % (B, A),
        "peto-prentice", None, "FUNCTIONS.md ADVISE.TEST: COMPARE.CENSORED's default, exact")

# A non-detect without its limit is refused with a request for it.
bad.block("F1", [["zinc"], ["ND"], [1.0], [2.0], [3.0]])
checked(bad, "H2", "DESCRIBE.CENSORED([.F1:.F5])",
        "F2 holds ND: write the detection limit as <0.5", None, "FUNCTIONS.md non-detect rule, exact")
# A number stored as text ("1.5" typed with a leading apostrophe) is text, missing, not a value.
bad.block("J1", [["zinc"], ["<0.5"], ["1.5"], [2.0], [3.0], [4.0]])
checked(bad, "L2", 'INDEX(DESCRIBE.CENSORED([.J1:.J6]);2;2)',
        4, None, "FUNCTIONS.md missing-data rule: a text that is not <number is missing (n = 4)")

book.write(os.path.join(HERE, "censored.fods"),
           comment="Generated by tests/office/make_censored_workbook.py from tests/reference/censored.json")
print("wrote tests/office/censored.fods")
