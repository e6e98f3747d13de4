#!/usr/bin/python3
"""Writes tests/office/groups.fods: COMPARE.GROUPS and COMPARE.PAIRED in real cells.

    /usr/bin/python3 tests/office/make_groups_workbook.py

Data and expected values come from tests/reference/compare.json (written by
tests/reference/generate_compare.py with SciPy 1.10 / statsmodels 0.13): the invented nitrate
case (upstream/downstream, long format), the marsh zones (three groups) and the dissolved-oxygen
pairs. Refusal texts are the core's, exact.
"""

import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference

HERE = os.path.dirname(os.path.abspath(__file__))
REF = reference("compare.json")["cases"]
SRC_T = ("scipy.stats.ttest_ind 1.10 (tests/reference/generate_compare.py); 1e-9 relative: "
         "closed forms in double precision on both sides")
SRC_K = ("scipy.stats.f_oneway / kruskal 1.10, statsmodels 0.13 anova_oneway "
         "(tests/reference/generate_compare.py); 1e-9 relative")
SRC_P = ("scipy.stats.ttest_rel / wilcoxon(zero_method='wilcox', method='exact') 1.10 "
         "(tests/reference/generate_compare.py); 1e-9 relative")
SRC_R = ("scipy.stats.mannwhitneyu(method='exact') 1.10 and the brute-force Hodges-Lehmann "
         "shift (tests/reference/generate_compare.py); 1e-9 relative")
SRC_TEXT = "the core's refusal text, exact"

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula


# --- two groups, long format with a header row -----------------------------------------------
nitrate = REF["nitrate"]
field = book.sheet("nitrate")
rows = [["station", "nitrate"]]
rows += [["upstream", x] for x in nitrate["first"]]
rows += [["downstream", x] for x in nitrate["second"]]
field.block("A1", rows)
last = len(rows)
values, groups = "[.B1:.B%d]" % last, "[.A1:.A%d]" % last
field.formula("D2", "COMPARE.GROUPS(%s;%s)" % (values, groups))
field.formula("D3", 'COMPARE.GROUPS(%s;%s;"welch";"statistic")' % (values, groups))
field.formula("D4", 'COMPARE.GROUPS(%s;%s;"welch";"df")' % (values, groups))
field.formula("D5", 'COMPARE.GROUPS(%s;%s;"welch";"ci-low")' % (values, groups))
field.formula("D6", 'COMPARE.GROUPS(%s;%s;"welch";"effect")' % (values, groups))
field.formula("D7", 'COMPARE.GROUPS(%s;%s;"pooled")' % (values, groups))
field.formula("D8", 'COMPARE.GROUPS(%s;%s;"pooled";"n")' % (values, groups))
field.formula("D9", 'COMPARE.GROUPS(%s;%s;"anova")' % (values, groups))
field.formula("D10", 'COMPARE.GROUPS(%s;%s;;"report")' % (values, groups))
w, s = nitrate["welch"], nitrate["pooled"]
check("nitrate.D2", w["p"], 1e-9, SRC_T)
check("nitrate.D3", w["statistic"], 1e-9, SRC_T)
check("nitrate.D4", w["df"], 1e-9, SRC_T)
check("nitrate.D5", w["ci-low"], 1e-9, SRC_T)
check("nitrate.D6", w["effect"], 1e-9, "Hedges' g from the published formula in tests/reference/generate_compare.py; 1e-9")
check("nitrate.D7", s["p"], 1e-9, SRC_T)
check("nitrate.D8", len(nitrate["first"]) + len(nitrate["second"]), None, "count of the data rows, exact")
check("nitrate.D9", "unknown method 'anova'; valid: welch, pooled, ranks", None, SRC_TEXT)
check("nitrate.D10",
      "Welch's t-test (two groups): t(26.4) = 1.85, p = 0.075; mean difference 0.29 (upstream − downstream; "
      "95% CI -0.0319 to 0.62), Hedges' g = 0.62",
      None, "the catalogue's report form with the scipy values above rounded by hand, exact")

# --- rank-sum, wide format (two columns, header row) ------------------------------------------
ranks = REF["ranks_exact"]
wide = book.sheet("ranks")
a, b = ranks["first"], ranks["second"]
block = [["reach A", "reach B"]]
for i in range(max(len(a), len(b))):
    block.append([a[i] if i < len(a) else None, b[i] if i < len(b) else None])
wide.block("A1", block)
end = len(block)
wide.formula("D2", 'COMPARE.GROUPS([.A1:.B%d];;"ranks")' % end)
wide.formula("D3", 'COMPARE.GROUPS([.A1:.B%d];;"ranks";"statistic")' % end)
wide.formula("D4", 'COMPARE.GROUPS([.A1:.B%d];;"ranks";"estimate")' % end)
check("ranks.D2", ranks["ranks"]["p"], 1e-9, SRC_R)
check("ranks.D3", ranks["ranks"]["statistic"], None, SRC_R + " (U is exact)")
check("ranks.D4", ranks["ranks"]["estimate"], 1e-9, SRC_R)

# --- three groups -----------------------------------------------------------------------------
zones = REF["zones"]
marsh = book.sheet("zones")
rows = [["zone", "salinity"]]
for name, g in zip(["low", "mid", "high"], zones["groups"]):
    rows += [[name, x] for x in g]
marsh.block("A1", rows)
last = len(rows)
values, groups = "[.B1:.B%d]" % last, "[.A1:.A%d]" % last
marsh.formula("D2", "COMPARE.GROUPS(%s;%s)" % (values, groups))
marsh.formula("D3", 'COMPARE.GROUPS(%s;%s;"welch";"df2")' % (values, groups))
marsh.formula("D4", 'COMPARE.GROUPS(%s;%s;"pooled";"statistic")' % (values, groups))
marsh.formula("D5", 'COMPARE.GROUPS(%s;%s;"ranks";"statistic")' % (values, groups))
marsh.formula("D6", 'COMPARE.GROUPS(%s;%s;"pooled";"effect")' % (values, groups))
check("zones.D2", zones["welch"]["p"], 1e-9, SRC_K)
check("zones.D3", zones["welch"]["df2"], 1e-9, SRC_K)
check("zones.D4", zones["classic"]["statistic"], 1e-9, SRC_K)
check("zones.D5", zones["ranks"]["statistic"], 1e-9, SRC_K)
check("zones.D6", zones["classic"]["effect"], 1e-9, "omega squared from the published formula (generate_compare.py); 1e-9")

# --- paired -----------------------------------------------------------------------------------
oxygen = REF["oxygen"]
pairs = book.sheet("pairs")
rows = [["above", "below"]] + [[x, y] for x, y in zip(oxygen["first"], oxygen["second"])]
pairs.block("A1", rows)
last = len(rows)
first, second = "[.A1:.A%d]" % last, "[.B1:.B%d]" % last
pairs.formula("D2", "COMPARE.PAIRED(%s;%s)" % (first, second))
pairs.formula("D3", 'COMPARE.PAIRED(%s;%s;"t";"estimate")' % (first, second))
pairs.formula("D4", 'COMPARE.PAIRED(%s;%s;"signed-rank")' % (first, second))
pairs.formula("D5", 'COMPARE.PAIRED(%s;%s;"signed-rank";"statistic")' % (first, second))
pairs.formula("D6", 'COMPARE.PAIRED(%s;%s;"sign")' % (first, second))
pairs.formula("D7", 'COMPARE.PAIRED(%s;%s;"wilcoxon")' % (first, second))
check("pairs.D2", oxygen["t"]["p"], 1e-9, SRC_P)
check("pairs.D3", oxygen["t"]["estimate"], 1e-9, SRC_P)
check("pairs.D4", oxygen["signed-rank"]["p"], 1e-9, SRC_P)
check("pairs.D5", oxygen["signed-rank"]["statistic"], None, SRC_P + " (T+ is exact)")
check("pairs.D6", oxygen["sign"]["p"], 1e-9, "scipy.stats.binomtest 1.10 (generate_compare.py); 1e-9")
check("pairs.D7", "unknown method 'wilcoxon'; valid: t, signed-rank, sign", None, SRC_TEXT)

# One sample against a typed number.
ph = REF["ph"]
one = book.sheet("ph")
one.block("A1", [["pH"]] + [[x] for x in ph["first"]])
checked(one, "C2", "COMPARE.PAIRED([.A1:.A%d];7)" % (len(ph["first"]) + 1),
        ph["t"]["p"], 1e-9, "scipy.stats.ttest_1samp 1.10 (generate_compare.py); 1e-9")

book.write(os.path.join(HERE, "groups.fods"), comment="Generated by tests/office/make_groups_workbook.py")
print("wrote", os.path.join(HERE, "groups.fods"))
