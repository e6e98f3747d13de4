#!/usr/bin/python3
"""Writes tests/office/trend.fods: TRACK.TREND in real cells.

    /usr/bin/python3 tests/office/make_trend_workbook.py

Data and expected values come from tests/reference/trend.json (tests/reference/generate_trend.py:
SciPy 1.10 kendalltau/theilslopes, the seasonal Kendall test and the Sen interval by brute force from
Hirsch, Slack & Smith 1982 and Sen 1968). The river sheet holds the invented monthly phosphorus
series with its sampling dates written as dates (office:value-type="date", so Calc formats them as
dates and the slope comes per year), the month as the season, and the readings under 0.05 written
`<0.05`; a header row, one `n/a` reading (dropped and counted), and an open-ended range reaching
far below the data, so that next year's rows typed below are taken in. The plain sheet holds the
EPA example with times as plain numbers (slope per unit of time). Refusal texts are the core's.
"""

import datetime
import os

from quadrat_sheets.fods import Checks, Workbook
from quadrat_sheets.reference import reference
from quadrat_sheets.report_numbers import fmt_df, fmt_number, fmt_p

HERE = os.path.dirname(os.path.abspath(__file__))
CASES = reference("trend.json")["cases"]

SRC = ("brute-force Mann-Kendall / seasonal Kendall and the Sen slope over all listed pairs "
       "(tests/reference/generate_trend.py, Hirsch, Slack & Smith 1982); 1e-9 relative")
SRC_SCIPY = "scipy.stats.kendalltau / theilslopes 1.10 (tests/reference/generate_trend.py); 1e-9 relative"
SRC_TEXT = "the core's text, exact"
SRC_COUNT = "counted by tests/reference/generate_trend.py, exact"

book = Workbook()
checks = Checks(book)
check, checked = checks.add, checks.formula


def put_date(sheet, ref, serial):
    """A cell holding a date (the office gives it its date format on loading)."""
    from quadrat_sheets.cells import cell_position
    day = datetime.date(1899, 12, 30) + datetime.timedelta(days=int(serial))
    sheet.cells[cell_position(ref)] = ('<table:table-cell office:value-type="date" office:date-value="%s"/>'
                                       % day.isoformat())


# --- river: seasons, dates, censored readings, header, a missing reading, open-ended range -------
case = CASES["censored"]
ref = case["reference"]
river = book.sheet("river")
river.row("A1", ["date", "month", "total P mg/L"])
row = 2
missing_row = 12
for t, s, y, c in zip(case["t"], case["seasons"], case["y"], case["censored"]):
    if row == missing_row:  # one reading lost: n/a, dropped and counted
        put_date(river, "A%d" % row, t - 3)
        river.put("B%d" % row, int(s))
        river.put("C%d" % row, "n/a")
        row += 1
    put_date(river, "A%d" % row, t)
    river.put("B%d" % row, int(s))
    river.put("C%d" % row, ("<%g" % y) if c else y)
    row += 1
LAST = 2000  # open-ended: rows typed below the data are taken in
V, T, S = "[.C1:.C%d]" % LAST, "[.A1:.A%d]" % LAST, "[.B1:.B%d]" % LAST
call = "TRACK.TREND(%s;%s;%s" % (V, T, S)
n = ref["n"]
cells = [
    ("E2", call + ")", ref["p"], 1e-9, SRC),
    ("E3", call + ';"statistic")', ref["S"], None, SRC + " (S exact)"),
    ("E4", call + ';"n")', n, None, SRC_COUNT),
    ("E5", call + ';"estimate")', ref["slope"], 1e-9, SRC + "; per year: dates read as dates, slope per day x 365.25"),
    ("E6", call + ';"ci-low")', ref["ci_low"], 1e-9, SRC),
    ("E7", call + ';"ci-high")', ref["ci_high"], 1e-9, SRC),
    ("E8", call + ';"intercept")', ref["intercept"], 1e-9, SRC + "; the line's value at the first sampling date"),
    ("E9", call + ';"percent")', ref["percent"], 1e-9, SRC),
    ("E10", call + ';"effect")', ref["tau"], 1e-9, SRC),
    ("E11", call + ';"ci-low";0.9)', case["reference_90"]["ci_low"], 1e-9, SRC + "; level 0.90"),
    ("E12", call + ';"estimate";;"day")', ref["slope"] / 365.25, 1e-9, SRC + "; unit day: per year / 365.25"),
    ("E13", call + ';"estimate";;"none")', ref["slope"] / 365.25, 1e-9, SRC + "; unit none: per unit of times (days)"),
    ("E14", call + ';"estimate";;"year")', ref["slope"], 1e-9, SRC + "; unit year"),
    ("E15", call + ';"slope")', "unknown output 'slope'; valid: p, statistic, n, estimate, ci-low, ci-high, intercept, "
                                "percent, effect, table, report", None, SRC_TEXT),
    ("E16", call + ';;;"month")', "unknown unit 'month'; valid: auto, year, day, none", None, SRC_TEXT),
]
for where, formula, value, tol, src in cells:
    checked(river, where, formula, value, tol, src)

checked(river, "E17", call + ';"report")',
        "Seasonal Kendall trend test (normal approximation): S = %s, %s, n = %d; Sen slope per year %s "
        "(95%% CI %s to %s), τ = %s; change per year as %% of the median %s (12 seasons; %d readings below the "
        "detection limit <0.05)" % (fmt_df(ref["S"]), fmt_p(ref["p"]), n, fmt_number(ref["slope"]),
                                    fmt_number(ref["ci_low"]), fmt_number(ref["ci_high"]), fmt_number(ref["tau"]),
                                    fmt_number(ref["percent"]), ref["censored"]), None,
        "the report form of src/core/trend.cpp with the generator's values rounded by report_numbers.py, exact")

# The whole table as an array (18 rows x 2).
table = [["quantity", "value"], ["test", "Seasonal Kendall trend test (normal approximation)"],
         ["n", n], ["n dropped", 1], ["seasons", 12], ["statistic", ref["S"]], ["variance", ref["variance"]],
         ["z", ref["z"]], ["p", ref["p"]], ["effect", ref["tau"]], ["estimate", ref["slope"]],
         ["ci-low", ref["ci_low"]], ["ci-high", ref["ci_high"]], ["unit", "per year"],
         ["intercept", ref["intercept"]], ["percent", ref["percent"]], ["censored", ref["censored"]],
         ["lag-1 correlation", ref["lag1"]],
         ["caution", "serial correlation makes p too small (Hamed & Rao 1998, J. Hydrology 204, 182–196)"]]
river.formula("G1", call + ';"table")', array=(len(table), 2))
expected = book.sheet("expected")
expected.block("A1", table)
check("river.G1:H%d" % len(table), "block expected.A1:B%d" % len(table), 1e-9, SRC + "; counts and texts exact")

# The same dates as plain numbers (a copy of column A through VALUE): slope per day, not per year.
for r in range(2, row):
    river.formula("J%d" % r, "IF(ISBLANK([.A%d]);\"\";VALUE([.A%d]))" % (r, r))
river.put("J1", "day number")
checked(river, "E18", "TRACK.TREND(%s;[.J1:.J%d];%s;\"estimate\")" % (V, LAST, S),
        ref["slope"] / 365.25, 1e-9, SRC + "; times as plain numbers: per unit of times (days)")

# Without seasons, first 40 readings, a detected value under the limit tied with <0.05.
plain = CASES["censored_plain"]
pref = plain["reference"]
sheet = book.sheet("station")
sheet.row("A1", ["date", "total P mg/L"])
for i, (t, y, c) in enumerate(zip(plain["t"], plain["y"], plain["censored"])):
    put_date(sheet, "A%d" % (i + 2), t)
    sheet.put("B%d" % (i + 2), ("<%g" % y) if c else y)
last = len(plain["t"]) + 1
call = "TRACK.TREND([.B1:.B%d];[.A1:.A%d]" % (last, last)
for where, formula, value, tol, src in [
    ("D2", call + ")", pref["p"], 1e-9, SRC),
    ("D3", call + ';;"statistic")', pref["S"], None, SRC + " (S exact)"),
    ("D4", call + ';;"estimate")', pref["slope"], 1e-9, SRC + "; per year"),
    ("D5", "INDEX(%s;;\"table\");17;2)" % call, pref["censored"], None, SRC_COUNT + "; row 17 of the table"),
    ("D6", "INDEX(%s;;\"table\");18;2)" % call, pref["lag1"], 1e-9,
     SRC + "; lag-1 correlation of the time-ordered readings"),
]:
    checked(sheet, where, formula, value, tol, src)

# --- plain numbers: the EPA example (times 1..11), SciPy's tau-b and Theil slope -----------------
epa = CASES["epa"]
eref = epa["reference"]
sheet = book.sheet("epa")
sheet.row("A1", ["year", "reading"])
for i, (t, y) in enumerate(zip(epa["t"], epa["y"])):
    sheet.row("A%d" % (i + 2), [t, y])
last = len(epa["t"]) + 1
call = "TRACK.TREND([.B1:.B%d];[.A1:.A%d];;" % (last, last)
for where, formula, value, tol, src in [
    ("D2", call + '"statistic")', 22, None, "US EPA QA/G-9S (2006), Mann-Kendall example (second-hand): S = 22, "
                                            "recomputed by hand from the data"),
    ("D3", call + '"p")', eref["p"], 1e-9, SRC + "; normal approximation (ties) with continuity correction"),
    ("D4", call + '"effect")', epa["scipy"]["tau_b"], 1e-9, SRC_SCIPY + "; tau-b"),
    ("D5", call + '"estimate")', epa["scipy"]["theil_slope"], 1e-12, SRC_SCIPY + "; Theil slope"),
    ("D6", call + '"percent")', eref["percent"], 1e-9, SRC),
    ("D7", call + '"report")', "Mann–Kendall trend test (normal approximation): S = 22, p = 0.092, n = 11; Sen slope "
                               "per unit of time 1.00 (95% CI 0.00 to 2.00), τ = 0.43; change per unit of time as % of "
                               "the median 6.67", None, "the report form of src/core/trend.cpp, numbers by hand, exact"),
]:
    checked(sheet, where, formula, value, tol, src)

# --- refusals ----------------------------------------------------------------------------------
sheet = book.sheet("refusals")
sheet.block("A1", [["time", "reading", "season"], [1, "<0.5", "a"], [2, "<1", "a"], [3, 2, "b"], [4, 3, "b"],
                   [5, "ND", "a"]])
cases = [
    ("E2", "TRACK.TREND([.B1:.B5];[.A1:.A5])",
     "values hold readings below 2 different detection limits (<0.5, <1); TRACK.TREND takes one limit for now: "
     "write every reading below the highest limit as <1 first"),
    ("E3", "TRACK.TREND([.B1:.B6];[.A1:.A6])", "B6 holds ND: write the detection limit as <0.5"),
    ("E4", "TRACK.TREND([.B4:.B5];[.A4:.A5])", "needs at least 3 readings with a time, found 2"),
    ("E5", "TRACK.TREND([.A2:.B5];[.A2:.A5])", "values must be one column, found 2"),
]
for where, formula, text in cases:
    checked(sheet, where, formula, text, None, SRC_TEXT)

book.write(os.path.join(HERE, "trend.fods"), comment="Generated by tests/office/make_trend_workbook.py")
print("wrote", os.path.join(HERE, "trend.fods"))
