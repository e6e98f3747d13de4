#!/usr/bin/python3
"""Writes sample_sheets/groundwater-metals.fods: an invented groundwater monitoring sheet whose lab
results include values below a detection limit ("<1", "<0.5", "<0.2"), with censored summaries per
well and a censored comparison of the wells beside them.

    /usr/bin/python3 tools/make_groundwater_sheet.py --oxt build/quadrat.oxt

The data are invented and generated with a fixed seed (nothing measured anywhere): four monitoring
wells around an imaginary closed plating works, one upgradient (MW-1) and three downgradient
(MW-2 to MW-4), sampled every quarter for four years; dissolved nickel in µg/L. The lab's
detection limit was 1 µg/L in 2022, 0.5 µg/L in 2023–2024 and 0.2 µg/L from 2025 (new
instruments), so the sheet holds three limits, as long records do. Like real lab sheets it has a
dry well and a broken bottle. The workbook is built like the other sample workbooks
(tools/make_sample_sheets.py: a headless Calc with the extension, number formats, widths, a caution
note and a chart) and stored as flat ODF.
"""

import datetime
import math
import os
import random
import sys

from make_sample_sheets import CAUTION_COLOUR, HELPER_NOTE, P, ROOT, WHOLE, enum, finish, new_workbook, run_builder

WELLS = [("MW-1", "upgradient", 0.6), ("MW-2", "downgradient", 1.3), ("MW-3", "downgradient", 2.2),
         ("MW-4", "downgradient", 2.9)]  # well, position, median nickel µg/L (invented)


def limit_of(year):
    return 1.0 if year == 2022 else 0.5 if year < 2025 else 0.2


NOTE = ("Why not AVERAGE()? Calc's AVERAGE skips the cells reading \"<1\", \"<0.5\" or \"<0.2\" as text, so it "
        "averages only the detected values and overstates the level; putting half the limit (or any fixed "
        "fraction of it) in their place invents numbers that bias the mean, its spread and every test built on "
        "them (Helsel 2006, Chemosphere 65, 2434–2439). DESCRIBE.CENSORED and COMPARE.CENSORED use each "
        "non-detect for what it is: a value somewhere below its own limit. A blank cell in the tables is an "
        "estimate these data cannot give: a quartile below the lowest limit, or a mean where more than half "
        "the values are censored.")

DESIGN = ("Quarterly samples of one well are not independent of each other, four wells are few, and a limit "
          "that changed over the record changes what can be seen in each year.")


def rows_of_data():
    rng = random.Random(20261204)
    rows = []
    for year in range(2022, 2026):
        limit = limit_of(year)
        for quarter in range(4):
            date = datetime.date(year, 2 + 3 * quarter, 15)
            for well, position, median in WELLS:
                nickel = round(math.exp(math.log(median) + rng.gauss(0, 0.6)), 2)
                value = ("<%g" % limit) if nickel < limit else nickel
                rows.append([date, well, position, value, None])
    rows[9][3], rows[9][4] = None, "well dry, not sampled"
    rows[42][3], rows[42][4] = None, "bottle broken in transit"
    return rows


def build(office, available):
    rows = rows_of_data()
    last = 300  # read down to row 300: next year's rows below are picked up
    doc, (s, q) = new_workbook(office, "lab results", ["chart data"])
    s.header("A1", ["date", "well", "position", "nickel µg/L", "note"], wrap=True)
    s.block("A2", rows)
    s.sheet.getCellRangeByName("D2:D%d" % last).HoriJustify = enum("CellHoriJustify", "RIGHT")
    # Raw table, a gap, then the tables' columns G to U; the method column holds the longest texts
    # and is the last printed column, so it is given their width rather than left to overflow.
    s.widths([2.3, 1.5, 2.5, 1.9, 4.4, 0.5, 2.6, 1.0, 1.8, 2.0, 2.1, 2.3, 1.3, 1.2, 1.4, 1.5, 1.3, 1.5, 1.3, 1.9,
              13.5])

    N, W, POS = ("$%s$1:$%s$%d" % (x, x, last) for x in "DBC")
    # Columns of DESCRIBE.CENSORED: group, n, censored, censored %, lowest limit, highest limit,
    # mean, SE, ci-low, ci-high, q1, median, q3, maximum, method.
    ugl = ["", WHOLE, WHOLE, "0", "0.0", "0.0", "0.00", "0.00", "0.00", "0.00", "0.00", "0.00", "0.00", "0.00", ""]
    s.label("G1", "Dissolved nickel by well, µg/L (DESCRIBE.CENSORED, Kaplan–Meier; rows 1–%d)" % last, bold=True)
    table_rows, _ = s.array("G2", "DESCRIBE.CENSORED(%s;%s)" % (N, W))
    s.formats("G3:U%d" % (1 + table_rows), ugl)
    r = 2 + table_rows + 1
    s.label("G%d" % r, "Upgradient against downgradient, µg/L (DESCRIBE.CENSORED, method 'ros': robust regression "
            "on order statistics, lognormal)", bold=True)
    ros_rows, _ = s.array("G%d" % (r + 1), 'DESCRIBE.CENSORED(%s;%s;"ros")' % (N, POS))
    s.formats("G%d:U%d" % (r + 2, r + ros_rows), ugl)
    r += ros_rows + 2
    s.sentence("G%d" % r, NOTE, 15, 4, italic=True)
    r += 5

    s.label("G%d" % r, "Do the wells differ? (COMPARE.CENSORED, Peto–Prentice generalized Wilcoxon test)", bold=True)
    s.result("G%d" % (r + 1), "p-value", "COMPARE.CENSORED(%s;%s)" % (N, W), P, 4)
    s.result("G%d" % (r + 2), "χ² statistic (3 df)", 'COMPARE.CENSORED(%s;%s;;"statistic")' % (N, W), "0.00", 4)
    s.sentence("G%d" % (r + 3), '=COMPARE.CENSORED(%s;%s;;"report")' % (N, W), 15, 2)
    s.label("G%d" % (r + 6), "Upgradient against downgradient (COMPARE.CENSORED, Gehan's test)", bold=True)
    s.result("G%d" % (r + 7), "p-value", 'COMPARE.CENSORED(%s;%s;"gehan")' % (N, POS), P, 4)
    s.sentence("G%d" % (r + 8), '=COMPARE.CENSORED(%s;%s;"gehan";"report")' % (N, POS), 15, 2)
    s.caution("G%d" % (r + 11), DESIGN, 15, 3)
    chart_row = r + 15

    # Chart data: each well's Kaplan–Meier quartiles, read from the table (columns Q, R, S).
    q.sentence("A1", HELPER_NOTE.format(sheet="lab results"), 4, 4, colour=CAUTION_COLOUR)
    # The headers name the chart's series: the table's own (q1, median, q3), the unit on the axis.
    q.label("A5", "Kaplan–Meier quartiles by well, µg/L", bold=True)
    q.header("A6", ["well", "q1", "median", "q3"])
    wells = table_rows - 1
    for i in range(wells):
        row = 3 + i  # the table's group rows on the lab results sheet
        q.formula("A%d" % (7 + i), "$'lab results'.G%d" % row)
        for column, source in zip("BCD", "QRS"):
            q.formula("%s%d" % (column, 7 + i), "$'lab results'.%s%d" % (source, row), "0.00")
    q.widths([2.0, 2.2, 2.6, 2.2])
    # Wide and tall, in larger type: the sheet prints one page wide (about 0.4 of its size), and the
    # chart must still read there.
    s.chart("quartiles", "G%d" % chart_row, 24.0, 13.0, "A6:D%d" % (6 + wells), "columns",
            "Dissolved nickel by well: Kaplan–Meier quartiles", "well (a blank bar: below the lowest limit)",
            "nickel (µg/L)", headers=(True, True), data_sheet=q.sheet, legend=True)

    def style_charts():
        chart = s.sheet.getCharts().getByName("quartiles").getEmbeddedObject()
        chart.getTitle().CharHeight = 14.0
        chart.getLegend().CharHeight = 14.0
        diagram = chart.getDiagram()
        for axis, title in ((diagram.getXAxis(), diagram.getXAxisTitle()), (diagram.getYAxis(), diagram.getYAxisTitle())):
            axis.CharHeight = 14.0
            title.CharHeight = 14.0

    return finish(doc, [s, q], os.path.join(ROOT, "sample_sheets", "groundwater-metals.fods"), style_charts)


if __name__ == "__main__":
    sys.exit(run_builder("write sample_sheets/groundwater-metals.fods", build))
