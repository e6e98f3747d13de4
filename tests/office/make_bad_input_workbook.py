#!/usr/bin/python3
"""Writes tests/office/bad_input.fods: every Quadrat function fed each kind of bad input in real
cells (the bad-input matrix).

    /usr/bin/python3 tests/office/make_bad_input_workbook.py

The catalogue's rule (FUNCTIONS.md, "Refusals"): when a function cannot give an honest number it
returns a short text that says what is wrong and how to fix it, never a plausible number from bad
input, and never takes the office suite down. So every answer on the `matrix` sheet expects one of
- a refusal, compared exactly (source "FUNCTIONS.md refusal rule, exact text");
- an error that Calc raises before the add-in runs: Err:504 for an error cell inside a range given
  to an optional (`any`) argument, or the cell's own error (#DIV/0!) when that argument is the
  single error cell (Calc passes neither to an add-in);
- or the honest number, computed independently: by Calc's own functions on the same cells (T.TEST,
  CORREL, RSQ, SLOPE, AVERAGE, NORMSINV, CHISQ.DIST.RT ...), or from tests/reference/bad_input.json
  (tests/reference/generate_bad_input.py: SciPy 1.10, statsmodels 0.13, mpmath). Bad input that
  still has an honest answer is answered by the clean data it stands for: depths times 9e306 or
  1e-311 have the depths' p (the statistics are scale invariant), logicals are their 1/0 values,
  a whole column is its used rows, an empty label drops its row.
Cases where the add-in gives a wrong answer today are kept out of `checks` (which must pass) and
listed on the `findings` sheet with the answer seen and the honest one; move a case back into
`checks` (drop it from FINDINGS below) when the core is fixed.

Data (sheet `data`, rows 2..13): invented water depths (cm) in two marsh zones with distances,
paired readings, presence, seasons, p-values, and one column per kind of bad input; small samples
at each method's limit on `few`; blocks of counts on `counts`; wide format on `wide`.
"""

import os

from quadrat_sheets.fods import Workbook
from quadrat_sheets.reference import reference

HERE = os.path.dirname(os.path.abspath(__file__))
REFERENCE = reference("bad_input.json")
D = REFERENCE["data"]
REF = REFERENCE["reference"]

REFUSAL = "FUNCTIONS.md refusal rule, exact text"
ERR504 = ("Calc refuses an error cell inside a range given to an optional (`any`) argument with Err:504 "
          "before the add-in runs (tests/office/README.md)")
ERR_OWN = ("Calc passes a single error cell in an optional (`any`) argument on as its own error and does "
           "not call the add-in")
SRC_GEN = "tests/reference/generate_bad_input.py (%s); %s"
# Long format with no row holding both a number and a label (the 12 data rows all dropped).
NO_USABLE = "no row has both a number in values and a label in groups (12 rows dropped)"
SCALE = "scale invariance: the values are the depths times a constant, so the depths' answer"

book = Workbook()

# --- data: rows 2..13, one column per kind of input -----------------------------------------------
ZONE, DEPTH, SECOND, DIST, BOOLS = D["zone"], D["depth"], D["second"], D["distance"], D["logicals"]


def decimal(x):
    """The double nearest the decimal product (at most 4 digits here): a saved .ods writes 15
    significant digits, so only such a number reads back unchanged after save and reload."""
    return float("%.4g" % x)


def factor_r_squared(values, labels):
    """R² of a one-factor linear model: 1 − within-group SS / total SS over the rows with a label."""
    missing = {"", "n/a", "na", "-", "—", "?", "missing"}
    rows = [(v, l) for v, l in zip(values, labels) if l.strip().lower() not in missing]
    mean = sum(v for v, _ in rows) / len(rows)
    groups = {}
    for v, l in rows:
        groups.setdefault(l, []).append(v)
    within = sum(sum((v - sum(g) / len(g)) ** 2 for v in g) for g in groups.values())
    total = sum((v - mean) ** 2 for v, _ in rows)
    return 1 - within / total


COLUMNS = {
    "A": ("zone", ZONE),
    "B": ("depth", DEPTH),
    # C: no cell at all (all blank)
    "D": ("notes", ["dry", "n/a", "-", "frozen", "dry", "missing", "ice", "?", "dry", "-", "n/a", "flooded"]),
    "E": ("depth", DEPTH),          # E4 becomes =1/0
    "F": ("depth", DEPTH),          # F9 becomes =NA()
    "G": ("equal", [5.0] * 12),
    "H": ("scaled up", [decimal(x * 9e306) for x in DEPTH]),          # each below 1.8e308 (the largest double), their sum overflows
    "I": ("plus-minus", D["plus_minus"]),                    # deviations overflow
    "J": ("tiny", [decimal(x * 1e-311) for x in DEPTH]),             # denormal numbers
    # K: logicals TRUE/FALSE (written below)
    "L": ("as text", ["%g" % x for x in DEPTH]),
    "M": ("zone", ["marsh"] * 12),
    "N": ("zone", ZONE),           # N3 blank, N10 an empty text
    "O": ("second", SECOND),
    "P": ("distance", DIST),
    "Q": ("double distance", [2 * x for x in DIST]),
    "R": ("constant", [4.0] * 12),
    "S": ("separated", [0] * 6 + [1] * 6),
    "T": ("present", D["present"]),
    "U": ("with zero", DEPTH),     # U3 = 0, U8 = -1.5
    "X": ("season", D["season"]),
    "Y": ("season", ["wet"] * 12),
    "Z": ("zone", ZONE),           # Z5 becomes =1/0 (an error in a label column)
    "AD": ("habitat", ["a", "b", "c"] * 4),
    "AE": ("tiny distance", [decimal(x * 1e-311) for x in DIST]),
    "AF": ("huge distance", [decimal(x * 9e306) for x in DIST]),
}
data = book.sheet("data")
for col, (head, values) in COLUMNS.items():
    data.column(col + "1", [head] + values)
data.formula("E4", "1/0")
data.formula("F9", "NA()")
data.put("K1", "logical")
for i, b in enumerate(BOOLS):
    data.formula("K%d" % (i + 2), "TRUE()" if b else "FALSE()")
data.put("N3", None)
data.put("N10", "")
data.put("U3", 0)
data.put("U8", -1.5)
data.formula("Z5", "1/0")
# p-values: V one above 1, W one below 0, AA a good set under a header, AB an error, AC a text
data.column("V1", ["p", 0.01, 0.04, 1.2, 0.3])
data.column("W1", ["p", 0.01, -0.1, 0.2])
data.column("AA1", ["p", 0.01, 0.02, 0.03, 0.04])
data.column("AB1", ["p", 0.01, 0.02])
data.formula("AB4", "1/0")
data.column("AC1", ["p", 0.01, "n/a", 0.03])


def col(c, header=False):
    return "[$data.%s%d:.%s13]" % (c, 1 if header else 2, c)


V, G, P, O, T, X = col("B"), col("A"), col("P"), col("O"), col("T"), col("X")
MARSH, REED = "[$data.B2:.B7]", "[$data.B8:.B13]"

# --- few: too few values for the method, on each side of the limit --------------------------------
few = book.sheet("few")
few.column("A1", [4.1, 5.3])                       # n = 2
few.column("B1", [4.1, 5.3, 4.8])                  # n = 3
few.column("C1", ["a", "b"])                       # one value per group
few.column("D1", [4.1, 5.3])
few.column("E1", ["a", "a", "b", "b"])             # two values per group
few.column("F1", [4.1, 4.6, 5.3, 5.9])
few.column("G1", [4.1, 5.3, 4.8, 6.0, 5.5, 4.9, 5.1])          # n = 7 (D'Agostino needs 8)
few.column("H1", [4.1, 5.3, 4.8, 6.0, 5.5, 4.9, 5.1, 5.7])     # n = 8
few.column("I1", ["a", "a", "b", "b", "c", "c"])    # three groups of two
few.column("J1", [4.1, 4.6, 5.3, 5.9, 6.2, 6.8])
few.column("K1", [1, 0])                           # logistic: two rows
few.column("L1", [1.0, 2.0])
few.column("M1", ["wet", "dry", "wet", "dry"])     # factorial: one value per cell
few.column("N1", ["a", "a", "b", "b"])
few.column("O1", [4.1, 4.6, 5.3, 5.9])

# --- kept: the cells a person keeps when rows 3 and 10 lose their zone label ---------------------
kept = book.sheet("kept")
for i, row in enumerate([2, 4, 5, 6, 7]):
    kept.formula("A%d" % (i + 1), "[$data.B%d]" % row)
for i, row in enumerate([8, 9, 11, 12, 13]):
    kept.formula("B%d" % (i + 1), "[$data.B%d]" % row)
KEPT_MARSH, KEPT_REED = "[$kept.A1:.A5]", "[$kept.B1:.B5]"

# --- counts ---------------------------------------------------------------------------------------
counts = book.sheet("counts")
COUNT_BLOCKS = {
    "good": ("A1", [[None, "present", "absent"], ["riffle", 12, 5], ["pool", 4, 11]]),
    "zero row": ("A5", [[None, "present", "absent"], ["riffle", 12, 5], ["pool", 0, 0]]),
    "zero column": ("A9", [[None, "present", "absent"], ["riffle", 12, 0], ["pool", 4, 0]]),
    "negative": ("A13", [[None, "present", "absent"], ["riffle", 12, -5], ["pool", 4, 11]]),
    "non-integer": ("A17", [[None, "present", "absent"], ["riffle", 12.5, 5], ["pool", 4, 11]]),
    "duplicate names": ("A21", [[None, "present", "present"], ["riffle", 12, 5], ["riffle", 4, 11]]),
    "huge": ("A25", [[None, "present", "absent"], ["riffle", 1e308, 5], ["pool", 4, 1e308]]),
    "error cell": ("A29", [[None, "present", "absent"], ["riffle", None, 5], ["pool", 4, 11]]),
    "all text": ("A33", [[None, "present", "absent"], ["riffle", "many", "few"], ["pool", "some", "none"]]),
}
for ref, rows in COUNT_BLOCKS.values():
    counts.block(ref, rows)
counts.formula("B30", "1/0")
# observed / expected columns for COMPARE.EXPECTED
counts.column("F1", ["observed", 30, 20, 10])
counts.column("G1", ["negative", 30, -20, 10])
counts.column("H1", ["non-integer", 30, 20.5, 10])
counts.column("I1", ["expected", 1, 1, 0])
counts.column("J1", ["expected", 1, -1, 1])
counts.column("K1", ["expected", 1, 1])
counts.column("L1", ["observed", 0, 0, 0])
counts.column("M1", ["observed", 30, None, 10])
counts.formula("M3", "1/0")
counts.column("N1", ["observed", 30, None, 10])
counts.formula("N3", "NA()")


def block(name):
    ref, _ = COUNT_BLOCKS[name]
    top = int(ref[1:])
    return "[$counts.A%d:.C%d]" % (top, top + 2)


# --- wide: wide format with duplicate and empty names ---------------------------------------------
wide = book.sheet("wide")
wide.block("A1", [["marsh", "marsh"]] + [[DEPTH[i], DEPTH[i + 6]] for i in range(6)])
wide.block("D1", [["marsh", None]] + [[DEPTH[i], DEPTH[i + 6]] for i in range(6)])

# --- matrix ---------------------------------------------------------------------------------------
matrix = book.sheet("matrix")
matrix.row("A1", ["function", "bad input", "argument", "answer"])
CASES = []

# Wrong answers today (function, kind, argument) → what the cell shows now. Kept out of `checks`;
# listed on the `findings` sheet with the honest answer. Drop an entry when the core is fixed.
FINDINGS = {}
seen_findings = set()


def case(function, kind, argument, formula, expected, tolerance=None, source=REFUSAL):
    """One cell of the matrix. `expected`: a refusal text, an error name, a number, or a Calc formula
    ("=..." for a plain formula, "{=...}" for one evaluated as an array)."""
    r = len(CASES) + 2
    address = "D%d" % r
    matrix.row("A%d" % r, [function, kind, argument])
    matrix.formula(address, formula)
    key = (function, kind, argument)
    assert key not in [c[:3] for c in CASES], key
    if key in FINDINGS:
        seen_findings.add(key)
    CASES.append((function, kind, argument, "matrix." + address, expected, tolerance, source))


def refusal(function, kind, argument, formula, text):
    case(function, kind, argument, formula, text)


VALUE_KINDS = {
    "all cells blank": col("C"), "all text": col("D"), "error cell #DIV/0!": col("E"), "error cell #N/A": col("F"),
    "zero spread": col("G"), "sum overflows": col("H"), "+-1e308": col("I"), "denormal": col("J"),
    "logicals": col("K"), "numbers as text": col("L"),
}
NO_NUMBERS = ("all cells blank", "all text", "numbers as text")
E4, F9 = "E4 holds an error (#DIV/0!)", "F9 holds an error (#N/A)"
Z5 = "Z5 holds an error (#DIV/0!)"
MISMATCH = "%s and %s must have the same number of rows (12 and 9)"
NUMBER_FOR_KEYWORD = '%s must be a keyword in quotes (a text, not a number)'


GENERIC_DONE = set()


def keyword_cases(name, args, argument, valid):
    """An unknown keyword where a keyword belongs (every keyword argument); a number and a single
    error cell there too, for the first keyword argument of each function (they take the same
    path, the registry's generic reader, for every keyword argument). `args`: the arguments before it."""
    call = name + "(" + ";".join(args) + ";%s)"
    refusal(name, "unknown keyword", argument, call % '"bogus"', "unknown %s 'bogus'; valid: %s" % (argument, valid))
    if name in GENERIC_DONE:
        return
    GENERIC_DONE.add(name)
    refusal(name, "number for a keyword", argument, call % "7", NUMBER_FOR_KEYWORD % argument)
    case(name, "error cell for a keyword", argument, call % "[$data.E4]", "#DIV/0!", None, ERR_OWN)


LEVEL_TEXT = "level must be a fraction such as 0.95 or a percentage from 50 to 99.9"


def level_cases(name, args):
    call = name + "(" + args + ";%s)"
    for kind, value in (("level 0", "0"), ("level 1", "1"), ("level 100", "100"), ("level -5", "-5")):
        refusal(name, kind, "level", call % value, LEVEL_TEXT)
    refusal(name, "level as text", "level", call % '"high"', "level must be a number")


def transform_cases(name, before, after=""):
    """The U column: 0 in U3 and -1.5 in U8."""
    for kind, t, text in (("log of 0 and negative", "log", "transform 'log' needs values > 0; 2 values are not"),
                          ("log(x+1) of -1.5", "log(x+1)", "transform 'log(x+1)' needs values > -1; 1 value is not"),
                          ("sqrt of negative", "sqrt", "transform 'sqrt' needs values >= 0; 1 value is not")):
        refusal(name, kind, "transform", '%s(%s;%s"%s"%s)' % (name, col("U"), before, t, after), text)


def ttest(a, b, kind, array=False):
    return ("{=%s}" if array else "=%s") % ("T.TEST(%s;%s;2;%d)" % (a, b, kind))


def scaled(ref, factor):
    return "%s*%s" % (ref, factor)


SRC_TTEST = "Calc's T.TEST on the same cells; 1e-9 relative (Calc's t distribution)"
SRC_SCALED = SCALE + ": Calc's T.TEST on the cells rescaled; 1e-9 relative (denormals keep about 13 digits)"

# ================================== CHECK.NORMAL(values; [groups]; [method]; [output]) ==========
N = "CHECK.NORMAL"
SRC_SW = SRC_GEN % ("Royston's AS R94 in mpmath", "1e-9 relative")
for kind in NO_NUMBERS:
    refusal(N, kind, "values", "%s(%s)" % (N, VALUE_KINDS[kind]), "values holds no numbers")
refusal(N, "error cell #DIV/0!", "values", "%s(%s)" % (N, col("E")), E4)
refusal(N, "error cell #N/A", "values", "%s(%s)" % (N, col("F")), F9)
refusal(N, "zero spread", "values", "%s(%s)" % (N, col("G")),
        "all 12 values are equal: a normality test needs values that vary")
case(N, "sum overflows", "values", "%s(%s)" % (N, col("H")), REF["shapiro p, depth"], 1e-9, SCALE + "; " + SRC_SW)
case(N, "+-1e308", "values", "%s(%s)" % (N, col("I")), REF["shapiro p, plus-minus / 1e308"], 1e-9,
     "the values divided by 1e308; " + SRC_SW)
case(N, "denormal", "values", "%s(%s)" % (N, col("J")), REF["shapiro p, depth"], 1e-9, SCALE + "; " + SRC_SW)
case(N, "logicals", "values", "%s(%s)" % (N, col("K")), REF["shapiro p, logicals"], 1e-9,
     "logicals are 1/0 (FUNCTIONS.md); " + SRC_SW)
case(N, "whole column", "values", "%s([$data.B:.B])" % N, REF["shapiro p, depth"], 1e-9, SRC_SW)
refusal(N, "1x1 range", "values", "%s([$data.B2])" % N, "needs 3 to 5000 values, found 1")
refusal(N, "n = 2 (Shapiro-Wilk needs 3)", "values", "%s([$few.A1:.A2])" % N, "needs 3 to 5000 values, found 2")
case(N, "n = 3 (Shapiro-Wilk limit)", "values", "%s([$few.B1:.B3])" % N,
     "=6/PI()*(ASIN(SQRT((MAX([$few.B1:.B3])-MIN([$few.B1:.B3]))^2/2/DEVSQ([$few.B1:.B3])))-PI()/3)", 1e-10,
     "n = 3: W = (x(3) - x(1))^2 / (2 SS) and its exact p = (6/pi)(asin(sqrt W) - pi/3) (Shapiro and Wilk "
     "1965; Royston 1995, AS R94, from memory), by Calc's MAX, MIN, DEVSQ, ASIN; 1e-10 relative")
refusal(N, "n = 7 (D'Agostino needs 8)", "values", '%s([$few.G1:.G7];;"dagostino-pearson")' % N,
        "needs at least 8 values, found 7")
case(N, "n = 8 (D'Agostino limit)", "values", '%s([$few.H1:.H8];;"dagostino-pearson";"n")' % N,
     "=COUNT([$few.H1:.H8])", None, "Calc's COUNT: the eight values are used")
case(N, "one group only", "groups", "%s(%s;%s)" % (N, V, col("M")), REF["shapiro p, depth"], 1e-9,
     "residuals from one group mean are the depths less a constant; " + SRC_SW)
refusal(N, "mismatched lengths", "groups", "%s(%s;[$data.A2:.A10])" % (N, V), MISMATCH % ("values", "groups"))
case(N, "error cell in labels", "groups", "%s(%s;%s)" % (N, V, col("Z")), "Err:504", None, ERR504)
refusal(N, "one value per group", "groups", "%s([$few.D1:.D2];[$few.C1:.C2])" % N,
        "every group has a single value: residuals from group means need groups of 2 or more values")
keyword_cases(N, [V, ""], "method", "shapiro-wilk, shapiro-francia, anderson-darling, lilliefors, dagostino-pearson, jarque-bera")
keyword_cases(N, [V, "", ""], "output", "p, statistic, df, n, table, report")


# ================================== CHECK.VARIANCE(values; groups; [method]; [output]) ==========
def brown_forsythe(a, b, factor=""):
    """Brown-Forsythe with two groups is the pooled t-test on the absolute deviations from the
    group medians (F = t^2)."""
    a, b = a + factor, b + factor
    return "{=T.TEST(ABS(%s-MEDIAN(%s));ABS(%s-MEDIAN(%s));2;2)}" % (a, a, b, b)


SRC_BF = ("Brown-Forsythe with two groups is the pooled t-test on absolute deviations from the group "
          "medians (F = t^2): Calc's T.TEST, MEDIAN, ABS; 1e-9 relative")
N = "CHECK.VARIANCE"
for kind in NO_NUMBERS:
    refusal(N, kind, "values", "%s(%s;%s)" % (N, VALUE_KINDS[kind], G), NO_USABLE)
refusal(N, "error cell #DIV/0!", "values", "%s(%s;%s)" % (N, col("E"), G), E4)
refusal(N, "error cell #N/A", "values", "%s(%s;%s)" % (N, col("F"), G), F9)
refusal(N, "zero spread", "values", "%s(%s;%s)" % (N, col("G"), G),
        "the values are equal within every group: no spread to compare")
case(N, "sum overflows", "values", "%s(%s;%s)" % (N, col("H"), G), brown_forsythe(MARSH, REED), 1e-9, SCALE + "; " + SRC_BF)
case(N, "+-1e308", "values", "%s(%s;%s)" % (N, col("I"), G),
     brown_forsythe("[$data.I2:.I7]", "[$data.I8:.I13]", "/1e308"), 1e-12,
     "the values divided by 1e308: both groups hold the same absolute deviations, F = 0; " + SRC_BF)
case(N, "denormal", "values", "%s(%s;%s)" % (N, col("J"), G), brown_forsythe(MARSH, REED), 1e-9, SCALE + "; " + SRC_BF)
case(N, "logicals", "values", "%s(%s;%s)" % (N, col("K"), G),
     brown_forsythe("[$data.K2:.K7]", "[$data.K8:.K13]"), 1e-9, "logicals are 1/0; " + SRC_BF)
case(N, "whole columns", "values", "%s([$data.B:.B];[$data.A:.A])" % N, brown_forsythe(MARSH, REED), 1e-9, SRC_BF)
refusal(N, "1x1 range", "values", "%s([$data.B2];[$data.A2])" % N,
        "groups has 1 label (marsh); comparing spreads needs 2 or more groups")
refusal(N, "one group only", "groups", "%s(%s;%s)" % (N, V, col("M")),
        "groups has 1 label (marsh); comparing spreads needs 2 or more groups")
refusal(N, "mismatched lengths", "groups", "%s(%s;[$data.A2:.A10])" % (N, V), MISMATCH % ("values", "groups"))
case(N, "empty labels", "groups", "%s(%s;%s)" % (N, V, col("N")), brown_forsythe(KEPT_MARSH, KEPT_REED), 1e-9,
     "rows 3 and 10 (blank and empty label) dropped; " + SRC_BF)
refusal(N, "all labels blank", "groups", "%s(%s;%s)" % (N, V, col("C")), NO_USABLE)
refusal(N, "error cell in labels", "groups", "%s(%s;%s)" % (N, V, col("Z")), Z5)
case(N, "duplicate names (wide)", "values", "%s([$wide.A1:.B7];)" % N, brown_forsythe(MARSH, REED), 1e-9,
     "wide format, both columns named marsh: two groups all the same; " + SRC_BF)
refusal(N, "one value per group", "values", "%s([$few.D1:.D2];[$few.C1:.C2])" % N,
        "group 'a' has 1 value; each group needs at least 2")
case(N, "two values per group", "values", "%s([$few.F1:.F4];[$few.E1:.E4])" % N,
     "in every group the values lie equally far from the group median (groups of 2?), so brown-forsythe is "
     "undefined; try bartlett or fligner", None,
     REFUSAL + " (with two values per group the absolute deviations from the median are equal, F divides by 0)")
refusal(N, "three groups for f-ratio", "method", '%s([$few.J1:.J6];[$few.I1:.I6];"f-ratio")' % N,
        "groups has 3 labels (a, b, c); method 'f-ratio' compares exactly 2")
keyword_cases(N, [V, G], "method", "brown-forsythe, levene, bartlett, fligner, f-ratio")
keyword_cases(N, [V, G, ""], "output", "p, statistic, df, df2, n, table, report")

# ================================== CHECK.QQ(values; [groups]) ===================================
N = "CHECK.QQ"
SRC_BLOM = ("Blom position (i - 3/8)/(n + 1/4) by Calc's NORMSINV (FUNCTIONS.md CHECK.QQ); 1e-12 relative: "
            "the top-left cell is the first normal quantile")
BLOM_FIRST_12 = "=NORMSINV((1-3/8)/(12+1/4))"
for kind in NO_NUMBERS:
    refusal(N, kind, "values", "%s(%s)" % (N, VALUE_KINDS[kind]), "values holds no numbers")
refusal(N, "error cell #DIV/0!", "values", "%s(%s)" % (N, col("E")), E4)
refusal(N, "error cell #N/A", "values", "%s(%s)" % (N, col("F")), F9)
for kind in ("zero spread", "sum overflows", "+-1e308", "denormal", "logicals"):
    case(N, kind, "values", "%s(%s)" % (N, VALUE_KINDS[kind]), BLOM_FIRST_12, 1e-12,
         "a Q-Q plot needs no spread or sums; " + SRC_BLOM)
for kind, c in (("sum overflows", "H"), ("+-1e308", "I"), ("denormal", "J")):
    case(N, kind + ", sorted value", "values", "INDEX(%s(%s);1;2)" % (N, col(c)), "=MIN(%s)" % col(c), None,
         "the smallest value first, Calc's MIN, exact")
case(N, "1x1 range", "values", "%s([$data.B2])" % N, 0, None, "Blom position of one value: (1 - 3/8)/(1 + 1/4) = 0.5, quantile 0")
case(N, "n = 2", "values", "INDEX(%s([$few.A1:.A2]);2;2)" % N, "=MAX([$few.A1:.A2])", None, "Calc's MAX, exact")
case(N, "one group only", "groups", "INDEX(%s(%s;%s);2;1)" % (N, V, col("M")), "=NORMSINV((2-3/8)/(12+1/4))", 1e-12,
     SRC_BLOM.replace("the top-left cell is the first", "second row:"))
refusal(N, "mismatched lengths", "groups", "%s(%s;[$data.A2:.A10])" % (N, V), MISMATCH % ("values", "groups"))
case(N, "error cell in labels", "groups", "%s(%s;%s)" % (N, V, col("Z")), "Err:504", None, ERR504)
case(N, "whole column", "values", "ROWS(%s([$data.B:.B]))" % N, "=ROWS([$data.B1:.B13])", None,
     "a whole column is read down to the sheet's used rows (13 here): one output row per input row")

# ================================== CHECK.REGRESSION(y; xs; [output]; [order]) ===================
N = "CHECK.REGRESSION"
NO_ROWS = "needs more complete rows than terms: found %d rows for 2 terms; add rows or remove predictors"
NO_ROWS_ONE = "needs more complete rows than terms: found 1 row for 2 terms; add rows or remove predictors"
RULE = "INDEX(%s(%%s;%%s);4;4)" % N   # the independence row's rule
for kind in NO_NUMBERS:
    refusal(N, kind, "y", "%s(%s;%s)" % (N, VALUE_KINDS[kind], P), NO_ROWS % 0)
refusal(N, "error cell #DIV/0!", "y", "%s(%s;%s)" % (N, col("E"), P), E4)
refusal(N, "error cell #N/A", "y", "%s(%s;%s)" % (N, col("F"), P), F9)
refusal(N, "zero spread", "y", "%s(%s;%s)" % (N, col("G"), P),
        "y is constant (every used row holds 5.00); there is no variation to explain")
SRC_SCALE_REFUSAL = ("FUNCTIONS.md refusal rule, exact text: squares of numbers beyond 1e150 (or below 1e-150) in "
                     "size overflow (underflow), so a model refuses them and says to rescale")
for kind, c, largest in (("sum overflows", "H", "1.63e+308"), ("+-1e308", "I", "1e+308"), ("denormal", "J", "1.81e-310")):
    case(N, kind, "y", "%s(%s;%s)" % (N, col(c), P),
         "y holds numbers too %s to fit (largest %s); rescale y, e.g. into other units" % (
             "small" if "e-" in largest else "large", largest), None, SRC_SCALE_REFUSAL)
# Without `order` the independence row has no statistic (FUNCTIONS.md), so these read cases check
# that the fit goes through by the row's rule text; Durbin–Watson in order is checked in the core tests.
NO_ORDER = ("no verdict: rows in no particular order cannot be judged; give order (dates, times or distances) "
            "for Durbin–Watson")
case(N, "logicals", "y", RULE % (col("K"), P), NO_ORDER, None, "logicals are 1/0; FUNCTIONS.md, CHECK.REGRESSION")
refusal(N, "all cells blank", "xs", "%s(%s;%s)" % (N, V, col("C")), NO_ROWS % 0)
# A column of labels among xs is a factor (FUNCTIONS.md, FIT.LINEAR): the checks run on the fit.
case(N, "all text (a factor)", "xs", "%s(%s;%s)" % (N, V, col("D")), "check", None,
     "FUNCTIONS.md: a text column among xs is a factor; the table's header, exact")
refusal(N, "error cell #DIV/0!", "xs", "%s(%s;%s)" % (N, V, col("E")), E4)
refusal(N, "constant predictor", "xs", "%s(%s;%s)" % (N, V, col("R")),
        "x1 is constant (every used row holds 4.00); a constant predictor cannot be told apart from the intercept")
case(N, "denormal", "xs", "%s(%s;%s)" % (N, V, col("AE")),
     "x1 holds numbers too small to fit (largest 1.2e-310); rescale x1, e.g. into other units", None, SRC_SCALE_REFUSAL)
refusal(N, "collinear predictors", "xs", "%s(%s;[$data.P2:.Q13])" % (N, V),
        "x2 is a linear combination of x1 and the intercept (collinear predictors); remove one of them")
refusal(N, "mismatched lengths", "xs", "%s(%s;[$data.P2:.P10])" % (N, V), MISMATCH % ("y", "xs"))
refusal(N, "n = 2 complete rows", "y", "%s([$few.B1:.B3];[$few.A1:.A3])" % N, NO_ROWS % 2)
case(N, "whole columns", "y", RULE % ("[$data.B:.B]", "[$data.P:.P]"), NO_ORDER, None, "FUNCTIONS.md, CHECK.REGRESSION")
keyword_cases(N, [V, P], "output",
              "table, normality, spread, independence, linearity, collinearity, influence, outliers")

# ================================== COMPARE.GROUPS(values; groups; [method]; [output]; [transform])
N = "COMPARE.GROUPS"
NO_GROUPS = "needs at least 2 groups, found 1 (%s); give group labels in groups, or two or more columns of values"
for kind in NO_NUMBERS:
    refusal(N, kind, "values", "%s(%s;%s)" % (N, VALUE_KINDS[kind], G), NO_USABLE)
refusal(N, "error cell #DIV/0!", "values", "%s(%s;%s)" % (N, col("E"), G), E4)
refusal(N, "error cell #N/A", "values", "%s(%s;%s)" % (N, col("F"), G), F9)
refusal(N, "zero spread", "values", "%s(%s;%s)" % (N, col("G"), G),
        "both groups have zero spread (all values equal within each group); a t-test needs spread")
case(N, "sum overflows", "values", "%s(%s;%s)" % (N, col("H"), G), ttest(MARSH, REED, 3), 1e-9, SCALE + "; " + SRC_TTEST)
case(N, "+-1e308", "values", "%s(%s;%s)" % (N, col("I"), G),
     ttest("[$data.I2:.I7]/1e308", "[$data.I8:.I13]/1e308", 3, True), 1e-12,
     "the values divided by 1e308: both means are 0, t = 0; " + SRC_TTEST)
case(N, "denormal", "values", "%s(%s;%s)" % (N, col("J"), G),
     ttest("[$data.J2:.J7]*1e300*1e11", "[$data.J8:.J13]*1e300*1e11", 3, True), 1e-9, SRC_SCALED)
case(N, "logicals", "values", "%s(%s;%s)" % (N, col("K"), G), ttest("[$data.K2:.K7]", "[$data.K8:.K13]", 3), 1e-9,
     "logicals are 1/0; " + SRC_TTEST)
case(N, "whole columns", "values", "%s([$data.B:.B];[$data.A:.A])" % N, ttest(MARSH, REED, 3), 1e-9, SRC_TTEST)
refusal(N, "1x1 range", "values", "%s([$data.B2];[$data.A2])" % N, NO_GROUPS % "marsh")
refusal(N, "one group only", "groups", "%s(%s;%s)" % (N, V, col("M")), NO_GROUPS % "marsh")
refusal(N, "mismatched lengths", "groups", "%s(%s;[$data.A2:.A10])" % (N, V), MISMATCH % ("values", "groups"))
case(N, "empty labels", "groups", "%s(%s;%s)" % (N, V, col("N")), ttest(KEPT_MARSH, KEPT_REED, 3), 1e-9,
     "rows 3 and 10 (blank and empty label) dropped; " + SRC_TTEST)
refusal(N, "all labels blank", "groups", "%s(%s;%s)" % (N, V, col("C")), NO_USABLE)
refusal(N, "error cell in labels", "groups", "%s(%s;%s)" % (N, V, col("Z")), Z5)
case(N, "duplicate names (wide)", "values", "%s([$wide.A1:.B7];)" % N, ttest(MARSH, REED, 3), 1e-9,
     "wide format with an empty groups argument, both columns named marsh; " + SRC_TTEST)
case(N, "empty name (wide)", "values", "%s([$wide.D1:.E7];)" % N, ttest(MARSH, REED, 3), 1e-9,
     "wide format, the second column unnamed; " + SRC_TTEST)
refusal(N, "one value per group", "values", "%s([$few.D1:.D2];[$few.C1:.C2])" % N,
        "group 'a' has 1 value; each group needs at least 2")
case(N, "two values per group", "values", "%s([$few.F1:.F4];[$few.E1:.E4])" % N,
     ttest("[$few.F1:.F2]", "[$few.F3:.F4]", 3), 1e-9, SRC_TTEST)
refusal(N, "one value per group, ranks", "values", '%s([$few.D1:.D2];[$few.C1:.C2];"ranks")' % N,
        "group 'a' has 1 value; each group needs at least 2")
keyword_cases(N, [V, G], "method", "welch, pooled, ranks")
OUTPUTS = "p, statistic, df, df2, n, estimate, ci-low, ci-high, effect, table, report"
keyword_cases(N, [V, G, ""], "output", OUTPUTS)
keyword_cases(N, [V, G, "", ""], "transform", "none, log, log10, log(x+1), sqrt")
transform_cases(N, G + ";;;")

# ================================== COMPARE.PAIRED(first; second; [method]; [output]; [transform])
N = "COMPARE.PAIRED"
NO_PAIRS = "needs at least 2 pairs, found %d"
for kind in NO_NUMBERS:
    refusal(N, kind, "first", "%s(%s;%s)" % (N, VALUE_KINDS[kind], O), NO_PAIRS % 0)
refusal(N, "error cell #DIV/0!", "first", "%s(%s;%s)" % (N, col("E"), O), E4)
refusal(N, "error cell #N/A", "first", "%s(%s;%s)" % (N, col("F"), O), F9)
case(N, "zero spread", "first", "%s(%s;%s)" % (N, col("G"), O), ttest(col("G"), O, 1), 1e-9,
     "equal first readings still give differences that vary; " + SRC_TTEST)
case(N, "sum overflows", "first", "%s(%s;%s)" % (N, col("H"), O),
     ttest(col("H") + "/9e306", O + "/9e306", 1, True), 1e-9, SCALE + " (both readings rescaled); " + SRC_TTEST)
case(N, "+-1e308", "first", "%s(%s;%s)" % (N, col("I"), O), 1, 1e-12,
     "differences of +-1e308 around a mean of about -15: t is about 1e-306, p = 1 to double precision "
     "(common practice, no source)")
case(N, "denormal", "first", "%s(%s;%s)" % (N, col("J"), O), ttest(col("J"), O, 1), 1e-9,
     "the denormal first readings vanish against the second: " + SRC_TTEST)
case(N, "logicals", "first", "%s(%s;%s)" % (N, col("K"), O), ttest(col("K"), O, 1), 1e-9,
     "logicals are 1/0; " + SRC_TTEST)
refusal(N, "numbers as text in second", "second", "%s(%s;%s)" % (N, V, col("L")), NO_PAIRS % 0)
case(N, "error cell in second", "second", "%s(%s;%s)" % (N, V, col("E")), "Err:504", None, ERR504)
refusal(N, "zero spread of differences", "second", "%s(%s;%s)" % (N, V, V),
        "all differences are equal (no spread); a t-test needs spread in the differences")
refusal(N, "mismatched lengths", "second", "%s(%s;[$data.O2:.O10])" % (N, V), MISMATCH % ("first", "second"))
case(N, "whole columns", "first", "%s([$data.B:.B];[$data.O:.O])" % N, ttest(V, O, 1), 1e-9, SRC_TTEST)
refusal(N, "1x1 range", "first", "%s([$data.B2];[$data.O2])" % N, NO_PAIRS % 1)
refusal(N, "one sample, n = 1", "first", "%s([$data.B2];10)" % N, NO_PAIRS % 1)
case(N, "n = 2", "first", "%s([$few.A1:.A2];[$few.F1:.F2])" % N, ttest("[$few.A1:.A2]", "[$few.F1:.F2]", 1), 1e-9,
     SRC_TTEST)
refusal(N, "second as text", "second", '%s(%s;"ten")' % (N, V), "second must be a range of readings or a single number")
refusal(N, "second omitted", "second", "%s(%s)" % (N, V),
        "second is missing: give the second reading of each pair, or a number for a one-sample test")
refusal(N, "sign test, all differences zero", "second", '%s(%s;%s;"sign")' % (N, V, V),
        "needs at least 2 non-zero differences, found 0 (12 pairs differ by zero)")
keyword_cases(N, [V, O], "method", "t, signed-rank, sign")
keyword_cases(N, [V, O, ""], "output", OUTPUTS)
keyword_cases(N, [V, O, "", ""], "transform", "none, log, log10, log(x+1), sqrt")
transform_cases(N, O + ";;;")


# ================================== COMPARE.POSTHOC / COMPARE.LETTERS =============================
def pairwise(N, pick, expect_pick, src_pick):
    """Both tables by nature: a refusal is one text; a number is read with INDEX."""
    none = "pairwise comparisons need at least 2 groups, found %d; give group labels beside the values"
    for kind in NO_NUMBERS:
        refusal(N, kind, "values", "%s(%s;%s)" % (N, VALUE_KINDS[kind], G), NO_USABLE)
    refusal(N, "error cell #DIV/0!", "values", "%s(%s;%s)" % (N, col("E"), G), E4)
    refusal(N, "error cell #N/A", "values", "%s(%s;%s)" % (N, col("F"), G), F9)
    refusal(N, "zero spread", "values", "%s(%s;%s)" % (N, col("G"), G),
            "the values do not vary within any group; tukey needs spread within groups (try dunn)")
    at = "INDEX(%s(%%s;%%s);%s)" % (N, pick)
    case(N, "sum overflows", "values", at % (col("H"), G), expect_pick(MARSH, REED, "", "*9e306"), 1e-6,
         SCALE + "; " + src_pick)
    case(N, "+-1e308", "values", at % (col("I"), G),
         expect_pick("[$data.I2:.I7]", "[$data.I8:.I13]", "/1e308", "*1e308"), 1e-6,
         "the values divided by 1e308 (both means 0); " + src_pick)
    case(N, "denormal", "values", at % (col("J"), G), expect_pick(MARSH, REED, "", "/1e300/1e11"), 1e-6,
         SCALE + "; " + src_pick)
    case(N, "logicals", "values", at % (col("K"), G), expect_pick("[$data.K2:.K7]", "[$data.K8:.K13]", "", ""), 1e-6,
         "logicals are 1/0; " + src_pick)
    case(N, "whole columns", "values", at % ("[$data.B:.B]", "[$data.A:.A]"), expect_pick(MARSH, REED, "", ""), 1e-6,
         src_pick)
    refusal(N, "1x1 range", "values", "%s([$data.B2];[$data.A2])" % N, none % 1)
    refusal(N, "one group only", "groups", "%s(%s;%s)" % (N, V, col("M")), none % 1)
    refusal(N, "mismatched lengths", "groups", "%s(%s;[$data.A2:.A10])" % (N, V), MISMATCH % ("values", "groups"))
    case(N, "empty labels", "groups", at % (V, col("N")), expect_pick(KEPT_MARSH, KEPT_REED, "", ""), 1e-6,
         "rows 3 and 10 (blank and empty label) dropped; " + src_pick)
    refusal(N, "all labels blank", "groups", "%s(%s;%s)" % (N, V, col("C")), NO_USABLE)
    refusal(N, "error cell in labels", "groups", "%s(%s;%s)" % (N, V, col("Z")), Z5)
    case(N, "duplicate names (wide)", "values", at % ("[$wide.A1:.B7]", ""), expect_pick(MARSH, REED, "", ""), 1e-6,
         "wide format with an empty groups argument, both columns named marsh; " + src_pick)
    refusal(N, "one value per group", "values", "%s([$few.D1:.D2];[$few.C1:.C2])" % N,
            "tukey needs more values than groups to estimate the spread within groups; found 2 values in 2 groups")
    case(N, "two values per group", "values", at % ("[$few.F1:.F4]", "[$few.E1:.E4]"),
         expect_pick("[$few.F1:.F2]", "[$few.F3:.F4]", "", ""), 1e-6, src_pick)
    keyword_cases(N, [V, G], "method", "tukey, games-howell, dunn, pairwise-t, pairwise-ranks")


ADJUSTMENTS = "holm, bonferroni, hochberg, hommel, benjamini-hochberg, benjamini-yekutieli, sidak"
N = "COMPARE.POSTHOC"
pairwise(N, "2;7", lambda a, b, f, _: ("{=T.TEST(%s%s;%s%s;2;2)}" % (a, f, b, f)) if f else ttest(a, b, 2),
         "the p of the only pair: Tukey-Kramer with two groups equals the pooled t-test (q = t sqrt 2), Calc's "
         "T.TEST; 1e-6 relative: the studentized range integration")
keyword_cases(N, [V, G, '"pairwise-t"'], "adjust", ADJUSTMENTS)
keyword_cases(N, [V, G, "", ""], "transform", "none, log, log10, log(x+1), sqrt")
transform_cases(N, G + ";;;")
level_cases(N, "%s;%s;;;" % (V, G))
case(N, "level 99 (percent)", "level", "INDEX(%s(%s;%s;;;;99);2;4)" % (N, V, G),
     "=AVERAGE(%s)-AVERAGE(%s)-T.INV.2T(0.01;10)*SQRT((DEVSQ(%s)+DEVSQ(%s))/10*(1/6+1/6))" % (MARSH, REED, MARSH, REED),
     1e-6, "99 read as 99%: Tukey's lower limit with two groups is the pooled t interval, Calc's AVERAGE, DEVSQ, "
     "T.INV.2T; 1e-6 relative: the studentized range quantile")

N = "COMPARE.LETTERS"
pairwise(N, "2;3", lambda a, b, f, back: "{=AVERAGE(%s%s)%s}" % (a, f, back) if f else "=AVERAGE(%s)%s" % (a, back),
         "the first group's mean in the letters table, Calc's AVERAGE; 1e-6 relative")
case(N, "letters of the whole columns", "values", "INDEX(%s([$data.B:.B];[$data.A:.A]);2;4)" % N, "b", None,
     "the pair's p (0.00026, Calc's T.TEST) is below 0.05 and reed has the larger mean: marsh gets b "
     "(FUNCTIONS.md COMPARE.LETTERS)")
keyword_cases(N, [V, G, "", ""], "transform", "none, log, log10, log(x+1), sqrt")
transform_cases(N, G + ";;;")
keyword_cases(N, [V, G, '"pairwise-t"'], "adjust", ADJUSTMENTS)
level_cases(N, "%s;%s;;;" % (V, G))
case(N, "level 99 (percent)", "level", "INDEX(%s(%s;%s;;;;99);2;4)" % (N, V, G), "b", None,
     "99 read as 99%: the pair's p (0.00026, Calc's T.TEST) is below 0.01, so marsh keeps b")

# ================================== COMPARE.COUNTS(categories; [labels2]; [method]; [output]) =====
N = "COMPARE.COUNTS"
SRC_CHI = SRC_GEN % ("scipy.stats.chi2_contingency, correction=False", "1e-9 relative")
refusal(N, "zero row in counts", "categories", "%s(%s)" % (N, block("zero row")),
        "row 'pool' has no observations (total 0); remove that category")
refusal(N, "zero column in counts", "categories", "%s(%s)" % (N, block("zero column")),
        "column 'absent' has no observations (total 0); remove that category")
refusal(N, "negative count", "categories", "%s(%s)" % (N, block("negative")),
        "C14 holds a negative count (-5); counts must be 0 or more")
refusal(N, "non-integer count", "categories", "%s(%s)" % (N, block("non-integer")),
        "B18 holds 12.5; counts must be whole numbers (use the raw counts, not percentages)")
case(N, "duplicate names in counts", "categories", "%s(%s)" % (N, block("duplicate names")),
     REF["chi-square p, riffle/pool present/absent"], 1e-9,
     "names only label the rows and columns: the counts are those of the good block; " + SRC_CHI)
refusal(N, "huge count", "categories", "%s(%s)" % (N, block("huge")),
        "B26 holds a count too large to count exactly (over 2^53); counts must be raw tallies of observations")
refusal(N, "error cell in counts", "categories", "%s(%s)" % (N, block("error cell")),
        "B30 holds an error (#DIV/0!)")
refusal(N, "all cells blank", "categories", "%s(%s)" % (N, col("C")),
        "needs at least 2 rows and 2 columns of categories, found 0x0; for one set of counts against expected "
        "shares use COMPARE.EXPECTED")
refusal(N, "all text in counts", "categories", "%s(%s)" % (N, block("all text")),
        "B34 holds text ('many'); counts must be whole numbers (to cross-tabulate labels, give the second label "
        "column as labels2)")
refusal(N, "1x1 range", "categories", "%s([$counts.B2])" % N,
        "needs at least 2 rows and 2 columns of categories, found 1x1; for one set of counts against expected "
        "shares use COMPARE.EXPECTED")
refusal(N, "one label only", "labels2", "%s(%s;%s)" % (N, G, col("M")),
        "needs at least 2 rows and 2 columns of categories, found 2x1; for one set of counts against expected "
        "shares use COMPARE.EXPECTED")
refusal(N, "mismatched lengths", "labels2", "%s(%s;[$data.X2:.X10])" % (N, G),
        MISMATCH % ("categories", "labels2"))
case(N, "error cell in labels2", "labels2", "%s(%s;%s)" % (N, X, col("Z")), "Err:504", None, ERR504)
case(N, "empty labels", "categories", "%s(%s;%s)" % (N, col("N"), X),
     REF["chi-square p, zone with gaps by season"], 1e-9, "rows 3 and 10 dropped; " + SRC_CHI)
case(N, "whole columns", "categories", '%s([$data.A:.A];[$data.X:.X];;"n")' % N, "=COUNTA(%s)" % G, None,
     "the header row is not counted, the used rows are: Calc's COUNTA")
refusal(N, "yates on a 2x3 table", "method", '%s(%s;%s;"yates")' % (N, G, col("AD")),
        "method 'yates' is for 2x2 tables; this table is 2x3 (use chi-square, g or fisher)")
keyword_cases(N, [block("good"), ""], "method", "chi-square, yates, g, fisher")
keyword_cases(N, [block("good"), "", ""], "output", "p, statistic, df, n, effect, table, report")

# ================================== COMPARE.EXPECTED(observed; [expected]; [output]) =============
N = "COMPARE.EXPECTED"
refusal(N, "negative count", "observed", "%s([$counts.G2:.G4])" % N, "G3 holds a negative count (-20); counts must be 0 or more")
refusal(N, "non-integer count", "observed", "%s([$counts.H2:.H4])" % N,
        "H3 holds 20.5; counts must be whole numbers (use the raw counts, not percentages)")
refusal(N, "all zero", "observed", "%s([$counts.L2:.L4])" % N, "the observed counts are all 0; nothing to test")
refusal(N, "zero expected", "expected", "%s([$counts.F2:.F4];[$counts.I2:.I4])" % N,
        "expected row 3 column 1 must be positive (found 0); every category needs a share above 0")
refusal(N, "negative expected", "expected", "%s([$counts.F2:.F4];[$counts.J2:.J4])" % N,
        "expected row 2 column 1 must be positive (found -1); every category needs a share above 0")
refusal(N, "mismatched lengths", "expected", "%s([$counts.F2:.F4];[$counts.K2:.K3])" % N,
        "expected has 2 values for 3 observed counts; give one per category")
case(N, "error cell in expected", "expected", "%s([$counts.F2:.F4];[$data.E2:.E4])" % N, "Err:504", None, ERR504)
refusal(N, "1x1 range", "observed", "%s([$counts.F2])" % N, "needs at least 2 categories of counts, found 1")
refusal(N, "all cells blank", "observed", "%s(%s)" % (N, col("C")), "needs at least 2 categories of counts, found 0")
refusal(N, "all text", "observed", "%s(%s)" % (N, col("D")), "D2 holds text ('dry'); counts must be whole numbers")
refusal(N, "error cell #DIV/0!", "observed", "%s([$counts.M2:.M4])" % N, "M3 holds an error (#DIV/0!)")
refusal(N, "error cell #N/A", "observed", "%s([$counts.N2:.N4])" % N, "N3 holds an error (#N/A)")
case(N, "logicals", "observed", "%s(%s)" % (N, col("K")),
     "=CHISQ.DIST.RT(SUMPRODUCT((%s-5/12)^2)/(5/12);11)" % col("K"), 1e-9,
     "logicals are 1/0 counts, 5 in all over 12 categories: Pearson's chi-square by Calc's SUMPRODUCT and "
     "CHISQ.DIST.RT; 1e-9 relative")
refusal(N, "numbers as text", "observed", "%s(%s)" % (N, col("L")), "L2 holds text ('12.1'); counts must be whole numbers")
case(N, "whole column", "observed", "%s([$counts.F:.F])" % N, "=CHISQ.DIST.RT(10;2)", 1e-12,
     "30, 20, 10 against equal shares: chi-square = (100 + 0 + 100)/20 = 10 with 2 df (by hand), Calc's "
     "CHISQ.DIST.RT; the header row is skipped")
keyword_cases(N, ["[$counts.F2:.F4]", ""], "output", "p, statistic, df, n, table, report")

# ================================== RELATE.CORRELATION(x; y; [method]; [output]) =================
N = "RELATE.CORRELATION"


def pearson_p(x, y, n, array=False):
    r = "CORREL(%s;%s)" % (x, y)
    return ("{=%s}" if array else "=%s") % ("T.DIST.2T(ABS(%s)*SQRT(%d)/SQRT(1-%s^2);%d)" % (r, n - 2, r, n - 2))


SRC_R = ("Pearson's r by Calc's CORREL, p from t = r sqrt(n-2)/sqrt(1-r^2) by T.DIST.2T (FUNCTIONS.md); "
         "1e-9 relative")
NO_XY = "needs at least 3 rows with both x and y, found %d"
for kind in NO_NUMBERS:
    refusal(N, kind, "x", "%s(%s;%s)" % (N, VALUE_KINDS[kind], P), NO_XY % 0)
refusal(N, "error cell #DIV/0!", "x", "%s(%s;%s)" % (N, col("E"), P), E4)
refusal(N, "error cell #N/A", "x", "%s(%s;%s)" % (N, col("F"), P), F9)
refusal(N, "zero spread", "x", "%s(%s;%s)" % (N, col("G"), P),
        "x is constant (every used row holds 5.00); a correlation needs spread in both")
case(N, "sum overflows", "x", "%s(%s;%s)" % (N, col("H"), P), pearson_p(V, P, 12), 1e-9, SCALE + "; " + SRC_R)
case(N, "+-1e308", "x", "%s(%s;%s)" % (N, col("I"), P), pearson_p(col("I") + "/1e308", P, 12, True), 1e-9,
     "the values divided by 1e308; " + SRC_R)
case(N, "denormal", "x", "%s(%s;%s)" % (N, col("J"), P), pearson_p(V, P, 12), 1e-9, SCALE + "; " + SRC_R)
case(N, "logicals", "x", "%s(%s;%s)" % (N, col("K"), P), pearson_p(col("K"), P, 12), 1e-9, "logicals are 1/0; " + SRC_R)
refusal(N, "mismatched lengths", "y", "%s(%s;[$data.P2:.P10])" % (N, V), MISMATCH % ("x", "y"))
case(N, "whole columns", "x", "%s([$data.B:.B];[$data.P:.P])" % N, pearson_p(V, P, 12), 1e-9, SRC_R)
refusal(N, "1x1 range", "x", "%s([$data.B2];[$data.P2])" % N, NO_XY % 1)
refusal(N, "n = 2", "x", "%s([$few.A1:.A2];[$few.L1:.L2])" % N, NO_XY % 2)
case(N, "n = 3", "x", "%s([$few.B1:.B3];[$few.F1:.F3])" % N, pearson_p("[$few.B1:.B3]", "[$few.F1:.F3]", 3), 1e-9, SRC_R)
for method in ("spearman", "kendall"):
    refusal(N, "zero spread, " + method, "x", '%s(%s;%s;"%s")' % (N, col("G"), P, method),
            "x is constant (every used row holds 5.00); a correlation needs spread in both")
keyword_cases(N, [V, P], "method", "pearson, spearman, kendall")
keyword_cases(N, [V, P, ""], "output", "p, statistic, df, n, estimate, ci-low, ci-high, table, report")

# ================================== FIT.LINEAR(y; xs; [output]; [level]) =========================
N = "FIT.LINEAR"
SRC_RSQ = "Calc's RSQ on the same rows; 1e-9 relative"
Y_CONSTANT = "y is constant (every used row holds 5.00); there is no variation to explain"
X_CONSTANT = ("x1 is constant (every used row holds 4.00); a constant predictor cannot be told apart from the "
              "intercept")
COLLINEAR = "x2 is a linear combination of x1 and the intercept (collinear predictors); remove one of them"
for kind in NO_NUMBERS:
    refusal(N, kind, "y", '%s(%s;%s;"r-squared")' % (N, VALUE_KINDS[kind], P), NO_ROWS % 0)
refusal(N, "error cell #DIV/0!", "y", '%s(%s;%s;"r-squared")' % (N, col("E"), P), E4)
refusal(N, "error cell #N/A", "y", '%s(%s;%s;"r-squared")' % (N, col("F"), P), F9)
refusal(N, "zero spread", "y", '%s(%s;%s;"r-squared")' % (N, col("G"), P), Y_CONSTANT)
for kind, c, largest in (("sum overflows", "H", "1.63e+308"), ("+-1e308", "I", "1e+308"), ("denormal", "J", "1.81e-310")):
    case(N, kind, "y", '%s(%s;%s;"r-squared")' % (N, col(c), P),
         "y holds numbers too %s to fit (largest %s); rescale y, e.g. into other units" % (
             "small" if "e-" in largest else "large", largest), None, SRC_SCALE_REFUSAL)
case(N, "logicals", "y", '%s(%s;%s;"r-squared")' % (N, col("K"), P), "=RSQ(%s;%s)" % (col("K"), P), 1e-9,
     "logicals are 1/0; " + SRC_RSQ)
refusal(N, "all cells blank", "xs", '%s(%s;%s;"r-squared")' % (N, V, col("C")), NO_ROWS % 0)
case(N, "all text (a factor)", "xs", '%s(%s;%s;"r-squared")' % (N, V, col("D")), factor_r_squared(DEPTH, COLUMNS["D"][1]),
     1e-12, "FUNCTIONS.md: a text column among xs is a factor; R² of the group means, 1 − SS within / SS total, "
     "computed in this generator (common practice, no source)")
refusal(N, "error cell #DIV/0!", "xs", '%s(%s;%s;"r-squared")' % (N, V, col("E")), E4)
refusal(N, "constant predictor", "xs", '%s(%s;%s;"r-squared")' % (N, V, col("R")), X_CONSTANT)
for kind, c, largest in (("denormal", "AE", "1.2e-310"), ("sum overflows", "AF", "1.08e+308")):
    case(N, kind, "xs", '%s(%s;%s;"r-squared")' % (N, V, col(c)),
         "x1 holds numbers too %s to fit (largest %s); rescale x1, e.g. into other units" % (
             "small" if "e-" in largest else "large", largest), None, SRC_SCALE_REFUSAL)
refusal(N, "collinear predictors", "xs", '%s(%s;[$data.P2:.Q13];"r-squared")' % (N, V), COLLINEAR)
refusal(N, "mismatched lengths", "xs", '%s(%s;[$data.P2:.P10];"r-squared")' % (N, V), MISMATCH % ("y", "xs"))
case(N, "whole columns", "y", '%s([$data.B:.B];[$data.P:.P];"slope")' % N, "=SLOPE(%s;%s)" % (V, P), 1e-9,
     "Calc's SLOPE on the used rows; 1e-9 relative")
refusal(N, "1x1 range", "y", '%s([$data.B2];[$data.P2];"r-squared")' % N, NO_ROWS_ONE)
refusal(N, "n = 2 (no residual df)", "y", '%s([$few.A1:.A2];[$few.L1:.L2];"slope")' % N, NO_ROWS % 2)
case(N, "n = 3", "y", '%s([$few.B1:.B3];[$few.F1:.F3];"slope")' % N, "=SLOPE([$few.B1:.B3];[$few.F1:.F3])", 1e-9,
     "Calc's SLOPE; 1e-9 relative")
keyword_cases(N, [V, P], "output", "coefficients, model, r-squared, p, slope, intercept, residual-sd, report")
level_cases(N, '%s;%s;"coefficients"' % (V, P))
case(N, "level 99 (percent)", "level", 'INDEX(%s(%s;%s;"coefficients";99);3;6)' % (N, V, P),
     "=SLOPE(%s;%s)-T.INV.2T(0.01;10)*STEYX(%s;%s)/SQRT(DEVSQ(%s))" % (V, P, V, P, P), 1e-9,
     "99 read as 99%: the slope's lower limit by Calc's SLOPE, STEYX, DEVSQ, T.INV.2T; 1e-9 relative")

# ================================== FIT.LOGISTIC(y; xs; [output]; [level]) =======================
N = "FIT.LOGISTIC"
SRC_LOGIT = SRC_GEN % ("statsmodels Logit", "1e-8 relative: both iterate to convergence")
refusal(N, "all cells blank", "y", "%s(%s;%s)" % (N, col("C"), P),
        "no row has both a response and a value in every predictor column")
refusal(N, "all text", "y", "%s(%s;%s)" % (N, col("D"), P),
        "y has 4 labels (dry, flooded, frozen, ice); logistic regression needs exactly two outcomes")
refusal(N, "error cell #DIV/0!", "y", "%s(%s;%s)" % (N, col("E"), P), E4)
refusal(N, "error cell #N/A", "y", "%s(%s;%s)" % (N, col("F"), P), F9)
refusal(N, "zero spread", "y", "%s(%s;%s)" % (N, col("G"), P),
        "y holds 5 in G2; a numeric response must be 0 or 1 (or use two labels such as present/absent)")
case(N, "logicals", "y", "INDEX(%s(%s;%s);3;2)" % (N, col("K"), P), REF["logistic, logicals on distance"]["slope"], 1e-8,
     "logicals are the 0/1 response; " + SRC_LOGIT)
refusal(N, "numbers as text", "y", "%s(%s;%s)" % (N, col("L"), P),
        "y has 12 labels (11.8, 12.1, 12.9, 13.5, 14.3, …); logistic regression needs exactly two outcomes")
refusal(N, "separation", "xs", "%s(%s;%s)" % (N, col("S"), P),
        "the outcome is perfectly predicted by x1 (complete separation): no finite coefficient exists; remove or "
        "combine that predictor, or add data where the outcomes overlap")
refusal(N, "one label only", "y", "%s(%s;%s)" % (N, col("M"), P),
        "every used row has the same outcome (all are marsh); logistic regression needs both outcomes")
refusal(N, "three labels", "y", "%s([$few.I1:.I6];[$few.J1:.J6])" % N,
        "y has 3 labels (a, b, c); logistic regression needs exactly two outcomes")
refusal(N, "numbers other than 0/1", "y", "%s(%s;%s)" % (N, V, P),
        "y holds 12.1 in B2; a numeric response must be 0 or 1 (or use two labels such as present/absent)")
refusal(N, "all cells blank", "xs", "%s(%s;%s)" % (N, T, col("C")),
        "no row has both a response and a value in every predictor column")
refusal(N, "error cell #DIV/0!", "xs", "%s(%s;%s)" % (N, T, col("E")), E4)
refusal(N, "constant predictor", "xs", "%s(%s;%s)" % (N, T, col("R")), "predictor x1 is constant; remove it")
for kind, c, largest in (("+-1e308", "I", "1e+308"), ("denormal", "AE", "1.2e-310")):
    case(N, kind, "xs", "%s(%s;%s)" % (N, T, col(c)),
         "x1 holds numbers too %s to fit (largest %s); rescale x1, e.g. into other units" % (
             "small" if "e-" in largest else "large", largest), None, SRC_SCALE_REFUSAL)
refusal(N, "collinear predictors", "xs", "%s(%s;[$data.P2:.Q13])" % (N, T),
        "predictor x2 is a linear combination of the predictors before it (collinear); remove it")
refusal(N, "mismatched lengths", "xs", "%s(%s;[$data.P2:.P10])" % (N, T), MISMATCH % ("y", "xs"))
refusal(N, "n = 2", "y", "%s([$few.K1:.K2];[$few.L1:.L2])" % N, "needs more rows than coefficients: 2 rows for 2 coefficients")
case(N, "whole columns", "y", "INDEX(%s([$data.T:.T];[$data.P:.P]);3;2)" % N,
     REF["logistic, present on distance"]["slope"], 1e-8, SRC_LOGIT)
case(N, "labels as response", "y", 'INDEX(%s(%s;%s;"model");3;2)' % (N, G, T), "reed", None,
     "two labels: the later in character order is the event (FUNCTIONS.md FIT.LOGISTIC)")
keyword_cases(N, [T, P], "output", "coefficients, model")
level_cases(N, '%s;%s;"coefficients"' % (T, P))
case(N, "level 99 (percent)", "level", 'INDEX(%s(%s;%s;"coefficients";99);3;7)' % (N, T, P),
     REF["logistic 99%, present on distance"]["or_low"], 1e-8, "99 read as 99%: the odds ratio's lower limit; " + SRC_LOGIT)

# ================================== FIT.POINTS(y; xs; [output]) ==================================
N = "FIT.POINTS"
FITTED_1 = "(INTERCEPT(%s;%s)+SLOPE(%s;%s)*[$data.P2])"
SRC_FIT = "the first row's fitted value by Calc's INTERCEPT and SLOPE; 1e-9 relative"
for kind in NO_NUMBERS:
    refusal(N, kind, "y", '%s(%s;%s;"fitted")' % (N, VALUE_KINDS[kind], P), NO_ROWS % 0)
refusal(N, "error cell #DIV/0!", "y", '%s(%s;%s;"fitted")' % (N, col("E"), P), E4)
refusal(N, "error cell #N/A", "y", '%s(%s;%s;"fitted")' % (N, col("F"), P), F9)
refusal(N, "zero spread", "y", '%s(%s;%s;"fitted")' % (N, col("G"), P), Y_CONSTANT)
for kind, c, largest in (("sum overflows", "H", "1.63e+308"), ("+-1e308", "I", "1e+308"), ("denormal", "J", "1.81e-310")):
    case(N, kind, "y", '%s(%s;%s;"fitted")' % (N, col(c), P),
         "y holds numbers too %s to fit (largest %s); rescale y, e.g. into other units" % (
             "small" if "e-" in largest else "large", largest), None, SRC_SCALE_REFUSAL)
case(N, "logicals", "y", '%s(%s;%s;"fitted")' % (N, col("K"), P), "=" + FITTED_1 % (col("K"), P, col("K"), P), 1e-9,
     "logicals are 1/0; " + SRC_FIT)
refusal(N, "all cells blank", "xs", '%s(%s;%s;"fitted")' % (N, V, col("C")), NO_ROWS % 0)
refusal(N, "constant predictor", "xs", '%s(%s;%s;"fitted")' % (N, V, col("R")), X_CONSTANT)
refusal(N, "collinear predictors", "xs", '%s(%s;[$data.P2:.Q13];"fitted")' % (N, V), COLLINEAR)
refusal(N, "mismatched lengths", "xs", '%s(%s;[$data.P2:.P10];"fitted")' % (N, V), MISMATCH % ("y", "xs"))
refusal(N, "n = 2", "y", '%s([$few.A1:.A2];[$few.L1:.L2];"leverage")' % N, NO_ROWS % 2)
case(N, "whole columns", "y", "ROWS(%s([$data.B:.B];[$data.P:.P]))" % N, "=ROWS([$data.B1:.B13])", None,
     "a whole column is read down to the used rows (13 here); the header row takes the column names "
     "(FUNCTIONS.md FIT.POINTS)")
keyword_cases(N, [V, P], "output", "fitted, residual, standardized, studentized, leverage, cook")

# ================================== FIT.FACTORIAL(values; factor1; factor2; [output]; [sums]) ====
N = "FIT.FACTORIAL"
SRC_AOV = SRC_GEN % ("statsmodels ols + anova_lm typ=2", "1e-9 relative")
NO_ROW = "no row has a value and both factor labels"
for kind in NO_NUMBERS:
    refusal(N, kind, "values", '%s(%s;%s;%s;"p-factor1")' % (N, VALUE_KINDS[kind], G, X), NO_ROW)
refusal(N, "error cell #DIV/0!", "values", '%s(%s;%s;%s;"p-factor1")' % (N, col("E"), G, X), E4)
refusal(N, "error cell #N/A", "values", '%s(%s;%s;%s;"p-factor1")' % (N, col("F"), G, X), F9)
refusal(N, "zero spread", "values", '%s(%s;%s;%s;"p-factor1")' % (N, col("G"), G, X),
        "no spread within the combinations of factor1 and factor2: every value equals its combination's mean, so "
        "F cannot be formed")
for kind, c, largest in (("sum overflows", "H", "1.63e+308"), ("+-1e308", "I", "1e+308"), ("denormal", "J", "1.81e-310")):
    case(N, kind, "values", '%s(%s;%s;%s;"p-factor1")' % (N, col(c), G, X),
         "values holds numbers too %s to fit (largest %s); rescale values, e.g. into other units" % (
             "small" if "e-" in largest else "large", largest), None, SRC_SCALE_REFUSAL)
case(N, "logicals", "values", '%s(%s;%s;%s;"p-factor1")' % (N, col("K"), G, X), REF["factorial p-factor1, logicals"], 1e-9,
     "logicals are 1/0; " + SRC_AOV)
refusal(N, "one level only", "factor2", '%s(%s;%s;%s;"p-factor1")' % (N, V, G, col("Y")),
        "factor2 has a single level (wet); a two-way analysis needs at least 2 levels of each factor (for one "
        "factor use COMPARE.GROUPS)")
refusal(N, "same factor twice", "factor2", '%s(%s;%s;%s;"p-factor1")' % (N, V, G, G),
        "the interaction cannot be estimated: 2 combinations of levels have no observations; fill them or drop a level")
refusal(N, "mismatched lengths", "factor2", '%s(%s;%s;[$data.X2:.X10];"p-factor1")' % (N, V, G),
        MISMATCH % ("values", "factor2"))
refusal(N, "error cell in labels", "factor1", '%s(%s;%s;%s;"p-factor1")' % (N, V, col("Z"), X), Z5)
refusal(N, "one value per cell", "values", '%s([$few.O1:.O4];[$few.N1:.N4];[$few.M1:.M4];"p-factor1")' % N,
        "no replication: each combination of factor1 and factor2 has one value, so there is no residual to test against")
case(N, "whole columns", "values", '%s([$data.B:.B];[$data.A:.A];[$data.X:.X];"p-factor1")' % N,
     REF["factorial p-factor1, depth"], 1e-9, SRC_AOV)
keyword_cases(N, [V, G, X], "output", "table, p-factor1, p-factor2, p-interaction")
keyword_cases(N, [V, G, X, '"p-factor1"'], "sums", "type-2, type-3")

# ================================== ADJUST.P(pvalues; [method]) ==================================
N = "ADJUST.P"
refusal(N, "p above 1", "pvalues", "%s([$data.V2:.V5])" % N, "V4 holds 1.2; a p-value lies between 0 and 1")
refusal(N, "p below 0", "pvalues", "%s([$data.W2:.W4])" % N, "W3 holds -0.1; a p-value lies between 0 and 1")
refusal(N, "error cell", "pvalues", "%s([$data.AB2:.AB4])" % N, "AB4 holds an error (#DIV/0!)")
refusal(N, "text among p", "pvalues", "%s([$data.AC2:.AC4])" % N,
        "AC3 holds text ('n/a'); pvalues takes p-values from 0 to 1 or blank cells")
refusal(N, "all cells blank", "pvalues", "%s(%s)" % (N, col("C")), "pvalues holds no p-values; give a range of numbers from 0 to 1")
refusal(N, "all text", "pvalues", "%s(%s)" % (N, col("D")),
        "D2 holds text ('dry'); pvalues takes p-values from 0 to 1 or blank cells")
case(N, "1x1 range", "pvalues", "%s([$data.AA2])" % N, "=[$data.AA2]", None, "one p-value: every method leaves it as it is")
case(N, "whole column with a header", "pvalues", 'INDEX(%s([$data.AA:.AA];"bonferroni");5;1)' % N,
     "=MIN(1;4*[$data.AA5])", 1e-12, "the header row skipped (FUNCTIONS.md header rule), Bonferroni m p by hand")
case(N, "denormal p", "pvalues", "%s([$data.J2])" % N, "=[$data.J2]", None, "one p-value, a denormal one: left as it is")
case(N, "logicals", "pvalues", 'INDEX(%s([$data.K2:.K5];"bonferroni");3;1)' % N, "=MIN(1;4*[$data.K4])", None,
     "logicals are 1/0, both valid p-values: Bonferroni m p by hand")
keyword_cases(N, ["[$data.AA2:.AA5]"], "method", ADJUSTMENTS)

# ================================== DESCRIBE.GROUPS(values; [groups]; [transform]; [level]) ======
N = "DESCRIBE.GROUPS"
MEAN = "INDEX(%s(%%s;%%s);2;3)" % N  # the first group's mean
SRC_AVG = "the first group's mean by Calc's AVERAGE; 1e-12 relative"
for kind in NO_NUMBERS:
    refusal(N, kind, "values", "%s(%s;%s)" % (N, VALUE_KINDS[kind], G), NO_USABLE)
refusal(N, "error cell #DIV/0!", "values", "%s(%s;%s)" % (N, col("E"), G), E4)
refusal(N, "error cell #N/A", "values", "%s(%s;%s)" % (N, col("F"), G), F9)
case(N, "zero spread", "values", MEAN % (col("G"), G), "=AVERAGE([$data.G2:.G7])", 1e-12, SRC_AVG)
case(N, "sum overflows", "values", MEAN % (col("H"), G), "=AVERAGE(%s)*9e306" % MARSH, 1e-12, SCALE + "; " + SRC_AVG)
case(N, "+-1e308", "values", MEAN % (col("I"), G), 0, None, "the marsh cells are three +- pairs: the mean is 0 exactly")
case(N, "denormal", "values", MEAN % (col("J"), G), "=AVERAGE([$data.J2:.J7])", 1e-12, SRC_AVG)
case(N, "logicals", "values", MEAN % (col("K"), G), "=AVERAGE([$data.K2:.K7])", 1e-12, "logicals are 1/0; " + SRC_AVG)
case(N, "1x1 range", "values", "INDEX(%s([$data.B2]);2;3)" % N, "=[$data.B2]", None, "one value is its own mean")
case(N, "one group only", "groups", MEAN % (V, col("M")), "=AVERAGE(%s)" % V, 1e-12, SRC_AVG)
refusal(N, "mismatched lengths", "groups", "%s(%s;[$data.A2:.A10])" % (N, V), MISMATCH % ("values", "groups"))
case(N, "error cell in labels", "groups", "%s(%s;%s)" % (N, V, col("Z")), "Err:504", None, ERR504)
case(N, "empty labels", "groups", "INDEX(%s(%s;%s);2;2)" % (N, V, col("N")), "=COUNT(%s)" % KEPT_MARSH, None,
     "rows 3 and 10 (blank and empty label) dropped: marsh keeps 5 values, Calc's COUNT")
case(N, "duplicate names (wide)", "values", "INDEX(%s([$wide.A1:.B7]);3;1)" % N, "marsh", None,
     "wide format: each column a group named by its header, even twice (FUNCTIONS.md)")
case(N, "empty name (wide)", "values", "INDEX(%s([$wide.D1:.E7]);3;1)" % N, "column 2", None,
     "wide format: a column without a name is 'column 2' (FUNCTIONS.md)")
keyword_cases(N, [V, G], "transform", "none, log, log10, log(x+1), sqrt")
transform_cases(N, G + ";")
level_cases(N, "%s;%s;" % (V, G))
case(N, "level 99 (percent)", "level", "INDEX(%s(%s;%s;;99);2;4)" % (N, V, G),
     "=AVERAGE(%s)-T.INV.2T(0.01;5)*STDEV(%s)/SQRT(6)" % (MARSH, MARSH), 1e-9,
     "99 read as 99%: marsh's lower limit by Calc's AVERAGE, STDEV, T.INV.2T; 1e-9 relative")

# ================================== ADVISE.TEST(response; [predictor]; [output]; [design]) =======
N = "ADVISE.TEST"
SRC_ADV = "FUNCTIONS.md ADVISE.TEST: %s"
refusal(N, "all cells blank", "response", '%s(%s;%s;"function")' % (N, col("C"), G), "response holds no values")
case(N, "all text", "response", '%s(%s;%s;"function")' % (N, col("D"), G), "COMPARE.COUNTS", None,
     SRC_ADV % "two label columns are two categorical variables")
refusal(N, "error cell #DIV/0!", "response", '%s(%s;%s;"function")' % (N, col("E"), G), E4)
refusal(N, "error cell #N/A", "response", '%s(%s;%s;"function")' % (N, col("F"), G), F9)
refusal(N, "zero spread", "response", '%s(%s;%s;"function")' % (N, col("G"), G),
        "all 12 response values are equal: there is nothing to test")
case(N, "sum overflows", "response", '%s(%s;%s;"function")' % (N, col("H"), G), "COMPARE.GROUPS", None,
     SRC_ADV % "a measurement in two groups; the same advice as for the depths")
for kind in ("+-1e308", "denormal"):
    case(N, kind, "response", '%s(%s;%s;"function")' % (N, VALUE_KINDS[kind], G), "COMPARE.GROUPS", None,
         SRC_ADV % "a measurement in two groups")
case(N, "logicals", "response", '%s(%s;%s;"function")' % (N, col("K"), G), "COMPARE.COUNTS", None,
     SRC_ADV % "a 0/1 response against labels is a pair of categorical variables")
case(N, "numbers as text", "response", '%s(%s;%s;"function")' % (N, col("L"), G), "COMPARE.COUNTS", None,
     SRC_ADV % "text is a label, never a number (FUNCTIONS.md missing data): two categorical variables")
refusal(N, "one group only", "predictor", '%s(%s;%s;"function")' % (N, V, col("M")),
        "the predictor has 1 group; a comparison needs 2 or more")
refusal(N, "mismatched lengths", "predictor", '%s(%s;[$data.A2:.A10];"function")' % (N, V),
        MISMATCH % ("response", "predictor"))
case(N, "error cell in predictor", "predictor", '%s(%s;%s;"function")' % (N, V, col("Z")), "Err:504", None, ERR504)
refusal(N, "1x1 range", "response", '%s([$data.B2];[$data.A2];"function")' % N,
        "response holds 1 value; a test needs more rows")
case(N, "whole columns", "response", '%s([$data.B:.B];[$data.A:.A];"function")' % N, "COMPARE.GROUPS", None,
     SRC_ADV % "a measurement in two groups")
refusal(N, "paired with mismatched lengths", "design", '%s(%s;[$data.O2:.O10];"function";"paired")' % (N, V),
        MISMATCH % ("response", "predictor"))
keyword_cases(N, [V, G], "output", "report, method, transform, posthoc, function, table")
keyword_cases(N, [V, G, '"function"'], "design", "auto, groups, paired, relationship, trend, blocks, nested")

# --- checks and findings --------------------------------------------------------------------------
unused = set(FINDINGS) - seen_findings
assert not unused, "findings without a case: %s" % sorted(unused)


# Calc's names as a saved workbook stores them (OpenFormula): the dotted statistical names under
# their COM.MICROSOFT. prefix, NORMSINV under LEGACY.
ODF_NAMES = {"T.TEST(": "COM.MICROSOFT.T.TEST(", "T.DIST.2T(": "COM.MICROSOFT.T.DIST.2T(",
             "T.INV.2T(": "COM.MICROSOFT.T.INV.2T(", "CHISQ.DIST.RT(": "COM.MICROSOFT.CHISQ.DIST.RT(",
             "NORMSINV(": "LEGACY.NORMSINV("}


def odf(formula):
    for name, stored in ODF_NAMES.items():
        formula = formula.replace(name, stored)
    return formula


def put(sheet, address, v):
    if isinstance(v, str) and v.startswith("{="):
        sheet.formula(address, odf(v[1:-1]), array=(1, 1))
    elif isinstance(v, str) and v.startswith("="):
        sheet.formula(address, odf(v))
    else:
        sheet.put(address, v)


checks = book.sheet("checks")
checks.row("A1", ["result", "expected", "tolerance", "source"])
findings = book.sheet("findings")
findings.row("A1", ["result", "honest answer", "tolerance", "source", "function", "bad input", "argument",
                    "what the cell gives today"])
rows = {"checks": 2, "findings": 2}
for function, kind, argument, address, expected, tolerance, source in CASES:
    key = (function, kind, argument)
    sheet, name = (findings, "findings") if key in FINDINGS else (checks, "checks")
    r = rows[name]
    rows[name] += 1
    sheet.put("A%d" % r, address)
    put(sheet, "B%d" % r, expected)
    sheet.put("C%d" % r, tolerance)
    sheet.put("D%d" % r, "%s, %s (%s): %s" % (function, kind, argument, source))
    if name == "findings":
        sheet.row("E%d" % r, [function, kind, argument, FINDINGS[key]])

book.write(os.path.join(HERE, "bad_input.fods"), comment="Generated by tests/office/make_bad_input_workbook.py")
print("%d cases: %d checks, %d findings" % (len(CASES), rows["checks"] - 2, rows["findings"] - 2))
