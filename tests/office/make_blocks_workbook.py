#!/usr/bin/python3
"""Writes tests/office/blocks.fods: COMPARE.BLOCKS and COMPARE.NESTED in real cells.

    /usr/bin/python3 tests/office/make_blocks_workbook.py

Data and expected values come from tests/reference/blocks.json (tests/reference/generate_blocks.py:
statsmodels 0.13 OLS/AnovaRM for the block ANOVA, SciPy 1.10 friedmanchisquare, ttest_rel,
wilcoxon, binomtest, f_oneway; Conover's pairs and the nested variance components from their
published formulas, the components in exact fractions). The marsh sheet holds the invented
zone-by-transect readings in shuffled rows (subsamples, a transect missing a zone) under a header
row, plus one row with a missing reading (`n/a`, dropped and counted). The two-method sheet sets
COMPARE.BLOCKS beside COMPARE.PAIRED on the same pairs matched by hand. Refusal texts are the
core's, exact.
"""

import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference
from quadrat_sheets.report_numbers import fmt_df, fmt_number, fmt_p

HERE = os.path.dirname(os.path.abspath(__file__))
REF = reference("blocks.json")

SRC_SM = ("statsmodels 0.13 OLS value ~ C(group) + C(block), anova_lm typ=2 (tests/reference/generate_blocks.py); "
          "1e-9 relative: closed forms on both sides")
SRC_FR = "scipy.stats.friedmanchisquare 1.10 (tests/reference/generate_blocks.py); 1e-9 relative"
SRC_PAIRS = ("scipy.stats.ttest_rel 1.10 per pair, Holm by statsmodels multipletests, t quantile by mpmath "
             "(tests/reference/generate_blocks.py); 1e-8 relative")
SRC_CONOVER = ("Conover (1999) section 5.8 eq. 8 evaluated in tests/reference/generate_blocks.py (SciPy ranks and t); "
               "1e-8 relative")
SRC_NESTED = ("scipy.stats.f_oneway 1.10 on the unit means; variance components by the classical expected mean "
              "squares in exact fractions (tests/reference/generate_blocks.py); 1e-9 relative")
SRC_TEXT = "the core's text, exact"
SRC_COUNT = "counted by tests/reference/generate_blocks.py, exact"

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula
expected = book.sheet("expected")
expected_row = [1]


def expected_block(rows):
    """Writes rows on the expected sheet and returns 'block expected.A<r>:<col><r2>'."""
    top = expected_row[0]
    expected.block("A%d" % top, rows)
    expected_row[0] += len(rows) + 1
    width = max(len(r) for r in rows)
    return "block expected.A%d:%s%d" % (top, chr(64 + width), top + len(rows) - 1)


def pairs_rows(groups, pairs):
    rows = [["first group", "second group", "estimate", "ci-low", "ci-high", "statistic", "p", "adjusted p",
             "significant"]]
    at = 0
    for i in range(len(groups)):
        for j in range(i + 1, len(groups)):
            q = pairs[at]
            at += 1
            rows.append([groups[i], groups[j], q["estimate"], q["ci-low"], q["ci-high"], q["statistic"], q["p"],
                         q["adjusted p"], "yes" if q["adjusted p"] < 0.05 else "no"])
    return rows


def design_clause(counts):
    s = "%d blocks used" % counts["blocks used"]
    if counts["blocks dropped"]:
        s += ", %d dropped for a missing group" % counts["blocks dropped"]
    if counts["readings averaged"]:
        s += ", %d readings averaged within their cells" % counts["readings averaged"]
    return s


def labelled_readings(name, header, first, second, values):
    """A sheet holding `header` over the columns first, second, values (A, B, C), one reading a row;
    returns the sheet and the references of its columns A, B, C."""
    sheet = book.sheet(name)
    sheet.block("A1", [header] + [[a, b, v] for a, b, v in zip(first, second, values)])
    n = len(values) + 1
    return sheet, ["[.%s1:.%s%d]" % (c, c, n) for c in "ABC"]


def percent(share):
    p = 100 * share
    return ("%d" % int(p + 0.5) if p >= 1 else "0" if p == 0 else fmt_number(p)) + "%"


# --- marsh: zones within transects, shuffled rows, header, one missing reading -------------------------
field = REF["field"]
marsh = book.sheet("marsh")
rows = [["transect", "zone", "cover %"]]
rows += [[b, g, v] for v, g, b in zip(field["values"], field["groups"], field["blocks"])]
rows.insert(9, ["T03", "mid", "n/a"])
marsh.block("A1", rows)
last = len(rows)
V, G, B = "[.C1:.C%d]" % last, "[.B1:.B%d]" % last, "[.A1:.A%d]" % last
call = "COMPARE.BLOCKS(%s;%s;%s" % (V, G, B)
pooled, ranks, counts = field["pooled"], field["ranks"], field["counts"]
groups = field["groups in order"]
cells = [
    ("E2", call + ")", pooled["p"], 1e-9, SRC_SM),
    ("E3", call + ';"pooled";"statistic")', pooled["statistic"], 1e-9, SRC_SM),
    ("E4", call + ';"pooled";"df")', pooled["df"], None, SRC_SM + " (df exact)"),
    ("E5", call + ';"pooled";"df2")', pooled["df2"], None, SRC_SM + " (df exact)"),
    ("E6", call + ';"pooled";"n")', counts["n"], None, SRC_COUNT),
    ("E7", call + ';"pooled";"effect")', pooled["effect"], 1e-9, SRC_SM + "; partial eta squared from its SS"),
    ("E8", call + ';"ranks")', ranks["p"], 1e-9, SRC_FR),
    ("E9", call + ';"ranks";"statistic")', ranks["statistic"], 1e-9, SRC_FR),
    ("E10", call + ';"ranks";"effect")', ranks["effect"], 1e-9, SRC_FR + "; Kendall's W = chi2/(b(k-1))"),
    ("E11", call + ';"sign")', "method 'sign' compares exactly 2 groups, found 5; use 'pooled' (block ANOVA) or "
                               "'ranks' (Friedman test)", None, SRC_TEXT),
    ("E12", call + ';"pooled";"estimate")', "unknown output 'estimate'; valid: p, statistic, df, df2, n, effect, "
                                            "table, report, pairs", None, SRC_TEXT),
]
for ref, formula, value, tol, src in cells:
    checked(marsh, ref, formula, value, tol, src)
checked(marsh, "E13", call + ';"pooled";"report")',
        "Randomized complete block ANOVA: F(%s, %s) = %s, %s; partial η² = %s (%d groups; %s)" % (
    fmt_df(pooled["df"]), fmt_df(pooled["df2"]), fmt_number(pooled["statistic"]), fmt_p(pooled["p"]),
    fmt_number(pooled["effect"]), len(groups), design_clause(counts)), None,
    "the report form of src/core/blocks.cpp with the statsmodels values rounded by report_numbers.py, exact")
checked(marsh, "E14", call + ';"ranks";"report")',
        "Friedman test: χ²(%s) = %s, %s; Kendall's W = %s (%d groups; %s)" % (
    fmt_df(ranks["df"]), fmt_number(ranks["statistic"]), fmt_p(ranks["p"]), fmt_number(ranks["effect"]),
    len(groups), design_clause(counts)), None,
    "the report form of src/core/blocks.cpp with the SciPy values rounded by report_numbers.py, exact")

# The whole table as an array (20 rows × 2).
table = [["quantity", "value"], ["test", "Randomized complete block ANOVA"],
         ["statistic", pooled["statistic"]], ["df", pooled["df"]], ["df2", pooled["df2"]], ["p", pooled["p"]],
         ["n", counts["n"]], ["n dropped", 1], ["effect", pooled["effect"]],
         ["blocks used", counts["blocks used"]], ["blocks dropped", counts["blocks dropped"]],
         ["readings averaged", counts["readings averaged"]],
         ["sum of squares (groups)", pooled["sum of squares (groups)"]],
         ["sum of squares (blocks)", pooled["sum of squares (blocks)"]],
         ["sum of squares (residual)", pooled["sum of squares (residual)"]]]
table += [["%s: mean" % g, m] for g, m in zip(groups, pooled["means"])]
marsh.formula("G1", call + ';"pooled";"table")', array=(len(table), 2))
check("marsh.G1:H%d" % len(table), expected_block(table), 1e-9, SRC_SM + "; counts exact")

# Pairs: paired t-tests (Holm) and Conover's comparisons, 11 rows × 9 columns.
t_rows = pairs_rows(groups, field["pairs pooled"])
marsh.formula("J1", call + ';"pooled";"pairs")', array=(len(t_rows), 9))
check("marsh.J1:R%d" % len(t_rows), expected_block(t_rows), 1e-8, SRC_PAIRS)
c_rows = pairs_rows(groups, field["pairs ranks"])
marsh.formula("J14", call + ';"ranks";"pairs";"bonferroni")', array=(len(c_rows), 9))
bonferroni = [dict(q, **{"adjusted p": min(1.0, q["p"] * len(field["pairs ranks"]))}) for q in field["pairs ranks"]]
check("marsh.J14:R%d" % (13 + len(c_rows)), expected_block(pairs_rows(groups, bonferroni)), 1e-8,
      SRC_CONOVER + "; Bonferroni: min(1, 10 p) by hand")

# --- hardness: Montgomery's four tips on four coupons ---------------------------------------------------
hard = REF["hardness"]
sheet, (A, B, C) = labelled_readings("hardness", ["coupon", "tip", "hardness"], hard["blocks"], hard["groups"],
                                     hard["values"])
call = "COMPARE.BLOCKS(%s;%s;%s" % (C, B, A)
checked(sheet, "E2", call + ';;"statistic")',
        14.44, 0.005 / 14.44, "Montgomery, Design and Analysis of Experiments: F = 14.44 as printed; "
        "half a unit of the last printed digit")
checked(sheet, "E3", call + ")", hard["pooled"]["p"], 1e-9, SRC_SM)
checked(sheet, "E4", call + ';;"statistic")',
        hard["pooled"]["anovarm F"], 1e-9, "statsmodels 0.13 AnovaRM (generate_blocks.py); 1e-9")

# --- grass: Conover's Friedman example ------------------------------------------------------------------
grass = REF["grass"]
sheet, (A, B, C) = labelled_readings("grass", ["homeowner", "mixture", "rank"], grass["blocks"], grass["groups"],
                                     grass["values"])
call = "COMPARE.BLOCKS(%s;%s;%s;\"ranks\"" % (C, B, A)
checked(sheet, "E2", call + ';"statistic")',
        grass["exact"]["T1"], 1e-12, "Conover 1999 section 5.8 (T1 = 8.097 from memory), worked in "
        "exact fractions in generate_blocks.py; 1e-12")
checked(sheet, "E3", "INDEX(%s;\"table\");12;2)" % call,
        grass["exact"]["T2"], 1e-12, "Conover 1999 (T2 = 3.19 from memory), exact fractions; 1e-12")
checked(sheet, "E4", "INDEX(%s;\"table\");12;1)" % call, "Iman–Davenport F", None, SRC_TEXT)
checked(sheet, "E5", call + ")", grass["ranks"]["p"], 1e-9, SRC_FR)

# --- two methods matched by station: COMPARE.BLOCKS beside COMPARE.PAIRED -------------------------------
two = REF["two groups"]
sheet, (A, B, C) = labelled_readings("methods", ["station", "method", "chlorophyll"], two["blocks"], two["groups"],
                                     two["values"])
order = two["groups in order"]
sheet.block("K1", [[order[0], order[1]]] + [[a, b] for a, b in zip(two["first"], two["second"])])
m = len(two["first"]) + 1
call = "COMPARE.BLOCKS(%s;%s;%s" % (C, B, A)
paired = "COMPARE.PAIRED([$methods.K1:.K%d];[$methods.L1:.L%d]" % (m, m)
row = 2
for method, test, key in (("pooled", "t", "t"), ("ranks", "signed-rank", "signed-rank"), ("sign", "sign", "sign")):
    sheet.formula("E%d" % row, call + ';"%s")' % method)
    check("methods.E%d" % row, "=%s;\"%s\")" % (paired, test), 1e-12,
          "COMPARE.PAIRED on the cell means matched by hand (generate_blocks.py): the same computation; 1e-12 for "
          "the 15 digits a saved file keeps of the expected cell")
    sheet.formula("F%d" % row, call + ';"%s")' % method)
    check("methods.F%d" % row, two[key]["p"], 1e-9, "SciPy 1.10 ttest_rel / wilcoxon / binomtest on the matched "
          "pairs (generate_blocks.py); 1e-9")
    row += 1
checked(sheet, "E5", call + ';"pooled";"n")', two["counts"]["n"], None, SRC_COUNT)
sheet.formula("E6", "INDEX(%s;\"pooled\";\"table\");9;2)" % call)  # row 9: blocks dropped
check("methods.E6", two["counts"]["blocks dropped"], None, SRC_COUNT)

# --- nested: Sokal & Rohlf's rat livers, and wells with unequal subsamples ------------------------------
rats = REF["rats"]
sheet, (A, B, C) = labelled_readings("rats", ["treatment", "rat", "glycogen"], rats["groups"], rats["units"],
                                     rats["values"])
call = "COMPARE.NESTED(%s;%s;%s" % (C, A, B)
checked(sheet, "E2", call + ")", rats["p"], 1e-9, SRC_NESTED)
checked(sheet, "E3", call + ';"statistic")',
        2.929, 0.0005 / 2.929, "Sokal & Rohlf, Biometry, Box 10.1 (from memory): F from the printed SS, "
        "(1557.56/2)/(797.67/3) = 2.929; half a unit of the last digit")
checked(sheet, "E4", call + ';"report")',
        "Nested ANOVA: F(2, 3) = %s, %s; variance components: between groups %s, between units %s, "
        "within units %s (groups tested over 6 units; 36 readings)" % (
            fmt_number(rats["statistic"]), fmt_p(rats["p"]), percent(rats["share between groups"]),
            percent(rats["share between units"]), percent(rats["share within units"])), None,
        "the report form of src/core/nested.cpp (rendered by report.cpp) with the generator's values rounded, exact")
g_order = ["control", "compound 217", "217 + sugar"]
table = [["quantity", "value"], ["test", "Nested ANOVA (groups over units within groups)"],
         ["statistic", rats["statistic"]], ["df", 2], ["df2", 3], ["p", rats["p"]], ["n", 36], ["n dropped", 0],
         ["units", 6], ["subsamples per unit", 6],
         ["sum of squares (groups)", rats["exact SS"]["groups"]],
         ["sum of squares (units within groups)", rats["exact SS"]["units"]],
         ["sum of squares (within units)", rats["exact SS"]["within"]]]
for where in ("between groups", "between units", "within units"):
    table += [["variance " + where, rats["variance " + where]], ["share " + where, rats["share " + where]]]
table += [["variance components", "classical expected mean squares (Sokal & Rohlf, Biometry)"]]
for g, mean in zip(g_order, rats["group means"]):
    table += [["%s: units" % g, 2], ["%s: mean" % g, mean]]
sheet.formula("G1", call + ';"table")', array=(len(table), 2))
check("rats.G1:H%d" % len(table), expected_block(table), 1e-9, SRC_NESTED)

wells = REF["wells"]
sheet, (A, B, C) = labelled_readings("wells", ["land use", "well", "nitrate mg/L"], wells["groups"], wells["units"],
                                     wells["values"])
call = "COMPARE.NESTED(%s;%s;%s" % (C, A, B)
checked(sheet, "E2", call + ")", wells["p"], 1e-9, SRC_NESTED)
sheet.formula("E3", "INDEX(%s;\"table\");11;2)" % call)  # row 11: test on
check("wells.E3", "unit means: subsample counts differ, so each unit counts once", None, SRC_TEXT)
sheet.formula("E4", "INDEX(%s;\"table\");18;2)" % call)  # row 18: share between units
check("wells.E4", wells["share between units"], 1e-9, SRC_NESTED)
checked(sheet, "E5", call + ';"effect")',
        "unknown output 'effect'; valid: p, statistic, df, df2, n, table, report", None, SRC_TEXT)

# --- refusals -------------------------------------------------------------------------------------------
sheet = book.sheet("refusals")
cases = [
    ("one block", [["x", "a", 1], ["x", "b", 2], ["x", "c", 3]], "BLOCKS",
     "all readings are in one block (x); a block design compares groups within at least 2 blocks — with "
     "independent groups use COMPARE.GROUPS"),
    ("a group in one block", [["x", "a", 1], ["x", "b", 2], ["y", "a", 3], ["y", "b", 4], ["y", "c", 5]], "BLOCKS",
     "group 'c' is read in block 'y' only; each group must be read in at least 2 blocks (a block missing a group is "
     "dropped whole)"),
    ("no complete block", [["x", "a", 1], ["x", "b", 2], ["y", "b", 3], ["y", "c", 4], ["z", "c", 5], ["z", "a", 6]],
     "BLOCKS", "no block holds every group (3 groups, 3 blocks); a block missing a group is dropped whole — check "
               "the group and block labels"),
    ("unit in two groups", [["p1", "a", 1], ["p1", "a", 2], ["p2", "b", 3], ["p2", "b", 4], ["p1", "b", 5],
                            ["p1", "b", 6]], "NESTED",
     "unit 'p1' appears in groups 'a' and 'b'; in a nested design each unit belongs to one group — give units in "
     "different groups different labels"),
    ("a group with one unit", [["p1", "a", 1], ["p1", "a", 2], ["p2", "b", 3], ["p2", "b", 4], ["p3", "b", 5],
                               ["p3", "b", 6]], "NESTED",
     "group 'a' has 1 unit (p1); the test of groups over units needs at least 2 units in each group"),
]
top = 1
for i, (name, data, function, text) in enumerate(cases):
    sheet.put("A%d" % top, name)
    sheet.block("A%d" % (top + 1), data)
    rng = "[.%%s%d:.%%s%d]" % (top + 1, top + len(data))
    if function == "BLOCKS":
        formula = "COMPARE.BLOCKS(%s;%s;%s)" % (rng % ("C", "C"), rng % ("B", "B"), rng % ("A", "A"))
    else:
        formula = "COMPARE.NESTED(%s;%s;%s)" % (rng % ("C", "C"), rng % ("B", "B"), rng % ("A", "A"))
    sheet.formula("E%d" % (top + 1), formula)
    check("refusals.E%d" % (top + 1), text, None, SRC_TEXT)
    top += len(data) + 2

book.write(os.path.join(HERE, "blocks.fods"), comment="Generated by tests/office/make_blocks_workbook.py")
print("wrote", os.path.join(HERE, "blocks.fods"))
