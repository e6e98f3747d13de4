#!/usr/bin/python3
"""Writes tests/office/seam.fods: how cells reach the add-in and how its answers come back.

    python3 tests/office/make_seam_workbook.py

Invented data (a dissolved-oxygen round at upstream, downstream and tributary sites, mg/L).
Covers what the seam must get right, through DESCRIBE.GROUPS: a header row inside the range,
blank cells, `n/a` text and a missing label, whole-column references (A:A), a wide-format block,
an inline array and typed keywords/numbers in `any` arguments, array-entered tables with blank
cells, a table function read through INDEX, refusal texts, and error cells named by the refusal.
Expected values come from Calc's own functions (AVERAGE, STDEV, TINV, MEDIAN, MIN, MAX, GEOMEAN,
COUNT) over the cells a person would keep, so they are an independent computation; group names,
headers and refusal texts are the catalogue's (FUNCTIONS.md) and the core's.
"""

import os

from quadrat_sheets.fods import Workbook

HERE = os.path.dirname(os.path.abspath(__file__))

HEADER = ["group", "n", "mean", "ci-low", "ci-high", "SD", "SE", "CV %", "minimum", "q1", "median", "q3", "maximum"]

# Sources and tolerances, stated once.
SRC_CALC = ("Calc's AVERAGE, STDEV, MEDIAN, MIN, MAX and TINV over the kept cells (independent "
            "implementation); 1e-9 relative: Calc's TINV is found by iteration, the rest agree to rounding")
SRC_TEXT = "FUNCTIONS.md and the core's refusal text, exact"

book = Workbook()

# --- field: long format, header row inside the range ---------------------------------------------
field = book.sheet("field")
field.block("A1", [
    ["site", "oxygen"],
    ["upstream", 8.1],
    ["upstream", 7.9],
    ["downstream", 6.2],
    ["upstream", None],        # blank value: missing, dropped
    ["downstream", 5.8],
    ["upstream", "n/a"],       # text in a value column: missing, dropped
    ["downstream", 6.5],
    ["upstream", 8.4],
    ["tributary", 9.2],        # a group of one: SD, SE and interval blank
    [None, 7.0],               # missing label: dropped
    ["downstream", 5.9],
    ["downstream", 6.1],
    ["N/A", 6.6],              # a missing marker as label (any case): dropped
])
KEPT = {"upstream": ["B2", "B3", "B9"], "downstream": ["B4", "B6", "B8", "B12", "B13"], "tributary": ["B10"]}
ALL_NUMBERS = ["B2", "B3", "B4", "B6", "B8", "B9", "B10", "B11", "B12", "B13", "B14"]

field.formula("D1", "DESCRIBE.GROUPS([.B1:.B14];[.A1:.A14])", array=(4, 13))
field.formula("D6", "DESCRIBE.GROUPS([.B:.B];[.A:.A])", array=(4, 13))
field.formula("D11", "DESCRIBE.GROUPS([.B1:.B14])", array=(2, 13))
field.formula("D14", 'DESCRIBE.GROUPS([.B2:.B4];{"a"|"b"|"a"})', array=(3, 13))
field.formula("D18", "DESCRIBE.GROUPS([.B1:.B14])")
field.formula("D19", "INDEX(DESCRIBE.GROUPS([.B1:.B14]);2;3)")
field.formula("D20", 'INDEX(DESCRIBE.GROUPS([.B1:.B14];;"log");2;3)')
field.formula("D21", 'INDEX(DESCRIBE.GROUPS([.B1:.B14];;"LOG";99);2;4)')
field.formula("D22", "INDEX(DESCRIBE.GROUPS([.B1:.B14];[.A1:.A14];;0.9);3;5)")
field.formula("D24", "DESCRIBE.GROUPS([.B1:.B40];[.A1:.A40])", array=(4, 13))

# --- wide: one column per group, header names them -----------------------------------------------
wide = book.sheet("wide")
wide.block("A1", [
    ["upstream", "downstream"],
    [8.1, 6.2],
    [7.9, 5.8],
    ["n/a", 6.5],
    [8.4, None],
    [None, 5.9],
])
WIDE_KEPT = {"upstream": ["A2", "A3", "A5"], "downstream": ["B2", "B3", "B4", "B6"]}
wide.formula("D1", "DESCRIBE.GROUPS([.A1:.B6])", array=(3, 13))
wide.formula("D5", "DESCRIBE.GROUPS([.A:.B])", array=(3, 13))

# --- errors: a data cell holding a formula error is named ---------------------------------------
errors = book.sheet("errors")
errors.row("A1", ["oxygen", "oxygen", "oxygen", "site"])
errors.column("A2", [7.1])
errors.formula("A3", "1/0")
errors.column("A4", [6.8])
errors.formula("B2", "NA()")
errors.column("B3", [6.5])
errors.column("C2", [7.0])
errors.formula("C3", "SQRT(-1)")
errors.column("D2", ["upstream"])
errors.formula("D3", "1/0")
errors.column("D4", ["upstream"])
errors.formula("F1", "DESCRIBE.GROUPS([.A1:.A4])")
errors.formula("F2", "DESCRIBE.GROUPS([.B1:.B3])")
errors.formula("F3", "DESCRIBE.GROUPS([.C1:.C3])")
errors.formula("F4", "DESCRIBE.GROUPS([.A:.A])")
errors.formula("F5", "DESCRIBE.GROUPS([.C1:.C4];[.D1:.D4])")

# --- refusals: what the cell says when no honest number exists ----------------------------------
refusals = book.sheet("refusals")
refusals.column("A1", ["notes", "dry", "n/a", "-"])
refusals.column("B1", ["count", 0, 3, 12])
refusals.formula("D1", "DESCRIBE.GROUPS([.A1:.A4])")
refusals.formula("D2", 'DESCRIBE.GROUPS([$field.B1:.B14];;"cube")')
refusals.formula("D3", "DESCRIBE.GROUPS([$field.B1:.B14];;;120)")
refusals.formula("D4", 'DESCRIBE.GROUPS([.B1:.B4];;"log")')
refusals.formula("D5", "DESCRIBE.GROUPS([$field.B1:.B14];[$field.A1:.A10])")
refusals.formula("D6", "DESCRIBE.GROUPS([.B1:.B4];;7)")
refusals.formula("D7", "DESCRIBE.GROUPS([$field.A1:.B14];[$field.A1:.A14])")


# --- expected: independent computations with Calc's own functions -------------------------------
def refs(sheet, cells):
    return ";".join("[$%s.%s]" % (sheet, c) for c in cells)


def summary_row(name, sheet, cells, level=0.95):
    """Calc formulas for one DESCRIBE.GROUPS row over the listed cells; the quartiles by Calc's own
    QUARTILE.INC over the union of the cells (FUNCTIONS.md: quartiles as Calc computes them)."""
    r = refs(sheet, cells)
    union = "(" + "~".join("[$%s.%s]" % (sheet, c) for c in cells) + ")"
    n = len(cells)
    # QUARTILE is stored as such in OpenFormula; Calc computes it as QUARTILE.INC.
    q1, q3 = "=QUARTILE(%s;1)" % union, "=QUARTILE(%s;3)" % union
    if n == 1:
        return [name, 1, "=%s" % r, None, None, None, None, None, "=%s" % r, q1, "=%s" % r, q3, "=%s" % r]
    half = "TINV(%r;%d)*STDEV(%s)/SQRT(%d)" % (1 - level, n - 1, r, n)
    return [name, n, "=AVERAGE(%s)" % r, "=AVERAGE(%s)-%s" % (r, half), "=AVERAGE(%s)+%s" % (r, half),
            "=STDEV(%s)" % r, "=STDEV(%s)/SQRT(%d)" % (r, n), "=100*STDEV(%s)/ABS(AVERAGE(%s))" % (r, r),
            "=MIN(%s)" % r, q1, "=MEDIAN(%s)" % r, q3, "=MAX(%s)" % r]


expected = book.sheet("expected")
expected.rows("A1", [HEADER] + [summary_row(g, "field", KEPT[g]) for g in ("upstream", "downstream", "tributary")])
expected.rows("A6", [HEADER, summary_row("a", "field", ["B2", "B4"]), summary_row("b", "field", ["B3"])])
expected.rows("A10", [HEADER, summary_row("oxygen", "field", ALL_NUMBERS)])
expected.rows("A13", [HEADER] + [summary_row(g, "wide", WIDE_KEPT[g]) for g in ("upstream", "downstream")])

# --- checks: result | expected | tolerance | source ----------------------------------------------
checks = book.sheet("checks")
rows = [
    ["result", "expected", "tolerance", "source"],
    ["field.D1:P4", "block expected.A1:M4", 1e-9,
     "long format, header row inside the range, blank, n/a and missing labels dropped, a group of one "
     "with blank SD/SE/interval. " + SRC_CALC],
    ["field.D6:P9", "block expected.A1:M4", 1e-9,
     "whole columns B:B and A:A (A:A reaches the `any` argument whole and is cut to B:B's used rows): "
     "the same answer as the bounded range. " + SRC_CALC],
    ["field.D11:P12", "block expected.A10:M11", 1e-9,
     "one column without groups: named by its header, text and blanks left out. " + SRC_CALC],
    ["field.D14:P16", "block expected.A6:M8", 1e-9,
     "groups typed as an inline array {\"a\"|\"b\"|\"a\"} (an `any` argument). " + SRC_CALC],
    ["field.D18", "group", None,
     "a table function entered in one cell shows the table's top-left cell (Calc's rule for arrays)"],
    ["field.D19", "=AVERAGE([$field.B2:.B14])", 1e-12,
     "INDEX picks the mean out of the table; Calc's AVERAGE skips the text and the blank as the add-in does"],
    ["field.D20", "=GEOMEAN([$field.B2:.B14])", 1e-12,
     "transform typed as text \"log\": geometric mean; Calc's GEOMEAN on the same cells"],
    ["field.D21", "=EXP(AVERAGE(%s)-TINV(0.01;10)*STDEV(%s)/SQRT(11))" % (
        ";".join("LN([$field.%s])" % c for c in ALL_NUMBERS), ";".join("LN([$field.%s])" % c for c in ALL_NUMBERS)),
     1e-9, "keyword in capitals (\"LOG\") and level typed as the percentage 99, with an empty argument "
     "between: the geometric mean's 99% lower limit from Calc's LN, AVERAGE, STDEV, TINV; 1e-9 for TINV's iteration"],
    ["field.D22", "=AVERAGE(%s)+TINV(0.1;4)*STDEV(%s)/SQRT(5)" % (refs("field", KEPT["downstream"]), refs("field", KEPT["downstream"])),
     1e-9, "level typed as the fraction 0.9: downstream ci-high from Calc's AVERAGE, STDEV, TINV"],
    ["field.D24:P27", "block expected.A1:M4", 1e-9,
     "a range reaching below the data (B1:B40): its empty rows are neither used nor dropped. " + SRC_CALC],
    ["wide.D1:P3", "block expected.A13:M15", 1e-9,
     "wide format: one column per group named by the header row; n/a dropped, blanks at a column's end. " + SRC_CALC],
    ["wide.D5:P7", "block expected.A13:M15", 1e-9, "wide format over whole columns A:B. " + SRC_CALC],
    ["errors.F1", "A3 holds an error (#DIV/0!)", None, "an error cell in a reference is named with its error. " + SRC_TEXT],
    ["errors.F2", "B2 holds an error (#N/A)", None, "=NA() in the data. " + SRC_TEXT],
    ["errors.F3", "C3 holds an error (Err:502)", None, "=SQRT(-1) gives Calc's Err:502 (invalid argument). " + SRC_TEXT],
    ["errors.F4", "A3 holds an error (#DIV/0!)", None, "the same through a whole column A:A. " + SRC_TEXT],
    ["errors.F5", "Err:504", None,
     "an error cell inside an `any` argument (groups): Calc refuses the call itself with Err:504 "
     "(ARCHITECTURE.md, measured); data arguments are references so that their errors are named"],
    ["refusals.D1", "values holds no numbers", None, "a column of text and missing markers. " + SRC_TEXT],
    ["refusals.D2", "unknown transform 'cube'; valid: none, log, log10, log(x+1), sqrt", None, "unknown keyword. " + SRC_TEXT],
    ["refusals.D3", "level must be a fraction such as 0.95 or a percentage from 50 to 99.9", None,
     "level outside both readings. " + SRC_TEXT],
    ["refusals.D4", "transform 'log' needs values > 0; 1 value is not", None, "a zero under log. " + SRC_TEXT],
    ["refusals.D5", "values and groups must have the same number of rows (14 and 10)", None,
     "ranges of different lengths. " + SRC_TEXT],
    ["refusals.D6", "transform must be a keyword in quotes (a text, not a number)", None,
     "a number typed where a keyword belongs. " + SRC_TEXT],
    ["refusals.D7", "values and groups must each be one column (found 2 and 1)", None,
     "a two-column block with groups. " + SRC_TEXT],
]
checks.rows("A1", rows)

book.write(os.path.join(HERE, "seam.fods"),
           comment="Generated by tests/office/make_seam_workbook.py: edit that script, not this file.")
print("wrote tests/office/seam.fods")
