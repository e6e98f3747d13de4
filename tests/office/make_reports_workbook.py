#!/usr/bin/python3
"""Writes tests/office/reports.fods: the `report` sentence of every function that has one, in
real cells, word for word.

    python3 tests/office/make_reports_workbook.py

The data are the invented scenarios of tools/quadrat_sheets/report_scenarios.py (as in
tests/reference/generate_reports.py), and
each expected sentence is the one tests/core/report_sentences_test.cpp spells out for the same
data, whose numbers that generator computes with SciPy 1.10 / statsmodels 0.13 and formats by the
catalogue's rules. Here the point is that the sentence reaches a cell unchanged: the UNO string
conversion keeps every character (en dashes, minus signs, χ², τ, ρ, ÷, ′).
"""

import os

import quadrat_sheets.report_scenarios as data  # the same invented data as the core tests
from quadrat_sheets.fods import Workbook

HERE = os.path.dirname(os.path.abspath(__file__))

SOURCE = "tests/core/report_sentences_test.cpp (%s), numbers from tests/reference/generate_reports.py; exact text"

book = Workbook()
checks = [["result", "expected", "tolerance", "source"]]


def reported(sheet, address, formula, sentence, case):
    """A report formula in `sheet` at `address`, and its check: the whole sentence, exact."""
    sheet.formula(address, formula)
    checks.append(["%s.%s" % (sheet.name, address), sentence, None, SOURCE % case])


# Long format: site label and value under headers.
def long_sheet(name, value_header, groups):
    sheet = book.sheet(name)
    labels, values = ["site"], [value_header]
    for label, xs in groups:
        labels += [label] * len(xs)
        values += xs
    sheet.column("A1", labels)
    sheet.column("B1", values)
    return sheet, len(labels)


oxygen, n = long_sheet("oxygen", "oxygen", [("riffle", data.RIFFLE), ("pool", data.POOL)])
reported(oxygen, "D1", 'COMPARE.GROUPS([.B1:.B%d];[.A1:.A%d];"welch";"report")' % (n, n),
         "Welch's t-test (two groups): t(10.7) = 3.00, p = 0.012; mean difference 0.66 "
         "(riffle − pool; 95% CI 0.17 to 1.15), Hedges' g = 1.50", "oxygen welch none")
reported(oxygen, "D2", 'COMPARE.GROUPS([.B1:.B%d];[.A1:.A%d];"welch";"report";"log")' % (n, n),
         "Welch's t-test (two groups): t(10.2) = 3.00, p = 0.013; ratio of geometric means 1.08 "
         "(riffle ÷ pool; 95% CI 1.02 to 1.14), Hedges' g = 1.50", "oxygen welch log")
reported(oxygen, "D3", 'CHECK.NORMAL([.B1:.B%d];[.A1:.A%d];;"report")' % (n, n),
         "Shapiro–Wilk normality test of the residuals from 2 group means: W = 0.98, p = 0.941, n = 15",
         "oxygen residuals shapiro-wilk")
reported(oxygen, "D4", 'ADVISE.TEST([.B1:.B%d];[.A1:.A%d])' % (n, n),
         "Suggested: COMPARE.GROUPS, method 'welch'. Why: continuous response (n = 15), predictor with 2 groups "
         "(sizes 7 to 8), so compare two groups; no clear sign of non-normality in the residuals from the group "
         "means (Shapiro–Wilk p = 0.941), so a test of means can be used; no clear sign of unequal spread "
         "(Brown–Forsythe p = 0.485), so Welch's t-test, which does not assume equal spreads. A guide, not a verdict: "
         "check it against the study design.", "advisor oxygen")

nitrate, n = long_sheet("nitrate", "nitrate", [("forest", data.FOREST), ("pasture", data.PASTURE),
                                               ("cropland", data.CROPLAND)])
reported(nitrate, "D1", 'CHECK.VARIANCE([.B1:.B%d];[.A1:.A%d];;"report")' % (n, n),
         "Brown–Forsythe test (deviations from group medians): F(2, 20) = 8.07, p = 0.003, "
         "n = 23; largest variance over smallest 56.50", "nitrate brown-forsythe")

culvert = book.sheet("culvert")
culvert.column("A1", ["above"] + data.ABOVE)
culvert.column("B1", ["below"] + data.BELOW)
m = len(data.ABOVE) + 1
reported(culvert, "D1", 'COMPARE.PAIRED([.A1:.A%d];[.B1:.B%d];"t";"report")' % (m, m),
         "Paired t-test: t(9) = -4.06, p = 0.003; mean difference -13.80 (above − below; 95% CI -21.49 to -6.11), "
         "Cohen's d = -1.28", "culvert t none")
reported(culvert, "D2", 'COMPARE.PAIRED([.A1:.A%d];[.B1:.B%d];"signed-rank";"report")' % (m, m),
         "Wilcoxon signed-rank test (exact p): T⁺ = 1, p = 0.004; Hodges–Lehmann pseudo-median -13.00 "
         "(above − below; 95% CI -23.00 to -4.50), matched-pairs rank-biserial r = -0.96", "culvert signed-rank none")

ponds = book.sheet("ponds")
ponds.column("A1", ["pH"] + data.PH)
reported(ponds, "C1", 'COMPARE.PAIRED([.A1:.A%d];7;"sign";"report")' % (len(data.PH) + 1),
         "One-sample sign test (exact binomial): 8 of 9 differences positive, p = 0.039; median difference 0.36 "
         "(pH − 7; 95% CI 0.0800 to 0.85), matched-pairs rank-biserial r = 0.91", "ph sign")

springs = book.sheet("springs")
springs.column("A1", ["temperature"] + data.SPRINGS)
m = len(data.SPRINGS) + 1
reported(springs, "C1", 'CHECK.NORMAL([.A1:.A%d];;"shapiro-francia";"report")' % m,
         "Shapiro–Francia normality test: W′ = 0.81, p = 0.002, n = 20", "springs shapiro-francia")
reported(springs, "C2", 'CHECK.NORMAL([.A1:.A%d];;"anderson-darling";"report")' % m,
         "Anderson–Darling normality test: A² = 1.34, p = 0.001, n = 20", "springs anderson-darling")

counts = book.sheet("counts")
counts.block("A1", [["mayfly", "riffle", "pool"], ["found"] + data.MAYFLY[0], ["not found"] + data.MAYFLY[1]])
reported(counts, "E1", 'COMPARE.COUNTS([.A1:.C3];;"chi-square";"report")',
         "Pearson's chi-square test: χ²(1) = 9.03, p = 0.003, n = 44; φ = 0.45", "mayfly chi-square")
counts.column("A6", data.NEWTS)
reported(counts, "E2", 'COMPARE.EXPECTED([.A6:.A7];;"report")',
         "Chi-square goodness-of-fit test: χ²(1) = 2.57, p = 0.109, n = 56", "newts")

reaches = book.sheet("reaches")
reaches.column("A1", ["width"] + data.WIDTH)
reaches.column("B1", ["canopy"] + data.CANOPY)
reaches.column("C1", ["traps"] + data.TRAPS)
reaches.column("D1", ["crayfish"] + data.CRAYFISH)
m = len(data.WIDTH) + 1
reported(reaches, "F1", 'RELATE.CORRELATION([.A2:.A%d];[.B2:.B%d];"pearson";"report")' % (m, m),
         "Pearson's correlation: r = -0.46 (95% CI -0.82 to 0.16), t(10) = -1.63, p = 0.133, n = 12", "width pearson")
reported(reaches, "F2", 'RELATE.CORRELATION([.C2:.C%d];[.D2:.D%d];"kendall";"report")' % (m, m),
         "Kendall's tau-b (normal approximation): τ = 0.82, z = 3.55, p < 0.001, n = 12", "crayfish kendall")
reported(reaches, "F3", 'FIT.LINEAR([.B1:.B%d];[.A1:.A%d];"report")' % (m, m),
         "Linear regression (ordinary least squares): R² = 0.21, F(1, 10) = 2.67, p = 0.133, n = 12; slope -4.55 (95% CI -10.74 to 1.65)",
         "canopy on width")

book.sheet("checks").rows("A1", checks)
book.write(os.path.join(HERE, "reports.fods"),
           comment="Generated by tests/office/make_reports_workbook.py: edit that script, not this file.")
print("wrote tests/office/reports.fods")
