"""The catalogue's number rules for report sentences (FUNCTIONS.md; src/core/report.cpp), written once
for every generator that predicts a sentence: generate_reports.py and the office workbook scripts."""
import math


def fmt_p(p):
    return "p < 0.001" if p < 0.001 else "p = %.3f" % p


def fmt_number(x):
    a = abs(x)
    if a == 0:
        return "0.00"
    if a >= 0.1:
        return "%.2f" % x
    if a >= 1e-4:
        # three significant digits; a value that rounds up to 0.1 takes the two-decimal form
        rounded = float("%.3g" % x)
        if abs(rounded) >= 0.1:
            return "%.2f" % rounded
        decimals = 2 - math.floor(math.log10(abs(rounded)))
        return "%.*f" % (decimals, x)
    return "%.2e" % x


def fmt_df(d):
    return "%d" % d if d == round(d) else "%.1f" % d
