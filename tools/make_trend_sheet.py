#!/usr/bin/python3
"""Writes sample_sheets/river-trends.fods: ten years of monthly nitrate readings at three stations of
an invented river, with TRACK.TREND beside them.

    /usr/bin/python3 tools/make_trend_sheet.py --oxt build/quadrat.oxt

Built like the other sample workbooks (tools/make_sample_sheets.py: a headless Calc with the
extension, number formats, widths, caution note, charts; its helpers are reused here unchanged).
All data are invented with a fixed seed: the Alder, a small river with three stations sampled on the
same day every month from January 2016 to December 2025 — Upper Alder (forest, readings near the
laboratory's detection limit of 0.5 mg/L, written `<0.5`), Mill Bridge (below a sewage works whose
upgrade lowers nitrate year by year) and Lower Ford (farmland, rising). Nitrate is higher in winter
(leaching) than in summer (uptake), so the months are seasons; the month-to-month noise is serially
correlated, as real river readings are.
"""

import datetime
import math
import os
import random
import sys

import uno
from make_sample_sheets import CAUTION_COLOUR, HELPER_NOTE, P, ROOT, WHOLE, enum, finish, new_workbook, run_builder

LIMIT = 0.5  # the laboratory's detection limit, mg/L
LAST = 400   # the formulas read down to row 400: next year's rows typed below are taken in
STATIONS = [  # name, median level mg/L, change per year, winter-summer swing (share of the level)
    ("Upper Alder", 0.80, 0.000, 0.35),
    ("Mill Bridge", 2.6, -0.045, 0.30),
    ("Lower Ford", 1.5, 0.030, 0.40),
]
NO_SEASON_COLUMN = 9  # index of the "Mann–Kendall p without seasons" column in the results table


def readings():
    """Rows [date, month, reading per station…, note]; a reading below the limit as '<0.5'."""
    rng = random.Random(20261204)
    rows = []
    noise = [0.0] * len(STATIONS)
    for year in range(2016, 2026):
        for month in range(1, 13):
            date = datetime.date(year, month, rng.randint(6, 14))
            t = (year - 2016) + (month - 0.5) / 12
            row = [date, month]
            for k, (name, level, change, swing) in enumerate(STATIONS):
                noise[k] = 0.35 * noise[k] + rng.gauss(0, 0.16)  # AR(1): serially correlated, as rivers are
                winter = math.cos(2 * math.pi * (month - 1.5) / 12)  # highest in January–February
                value = level * (1 + change) ** t * (1 + swing * winter) * math.exp(noise[k])
                value = round(value, 2)
                row.append("<%g" % LIMIT if value < LIMIT else value)
            row.append(None)
            rows.append(row)
    # What a monitoring sheet looks like after ten years.
    rows[27][3], rows[27][5] = "n/a", "bottle broken in transit"
    rows[50][4], rows[50][5] = None, "Lower Ford not sampled: flood"
    rows[83][2], rows[83][5] = None, "Upper Alder road closed"
    return rows


def style_trend_chart(chart):
    """A scatter chart of the readings with the Sen line: the readings as points, the line without."""
    diagram = chart.getDiagram()
    diagram.Lines = True
    # Data row 0 is the x column; 1 the readings, 2 the Sen line.
    points = diagram.getDataRowProperties(1)
    points.LineStyle = uno_enum("com.sun.star.drawing.LineStyle", "NONE")
    line = diagram.getDataRowProperties(2)
    # The line as a string of small markers at the sampling dates (a series' own line style is not
    # honoured in an XY diagram created without lines).
    line.LineStyle = uno_enum("com.sun.star.drawing.LineStyle", "SOLID")
    line.SymbolType = 0  # a filled square
    size = uno.createUnoStruct("com.sun.star.awt.Size")
    size.Width = size.Height = 120
    line.SymbolSize = size
    x_axis = diagram.getXAxis()
    x_axis.AutoMin = x_axis.AutoMax = False
    x_axis.Min, x_axis.Max = 2016, 2026
    x_axis.AutoStepMain = False
    x_axis.StepMain = 2


def uno_enum(kind, value):
    return uno.Enum(kind, value)


def river(office, available):
    if "TRACK.TREND" not in available:
        print("TRACK.TREND is not in this .oxt: river-trends.fods not written")
        return 1
    rows = readings()
    last_data = len(rows) + 1
    doc, (r, s, q) = new_workbook(office, "readings", ["trends", "chart data"])

    # --- the raw table ---------------------------------------------------------------------------
    r.header("A1", ["date", "month"] + ["%s nitrate-N mg/L" % name for name, *_ in STATIONS] + ["note"], wrap=True)
    r.block("A2", rows)
    r.format("C2:E%d" % LAST, "0.00")
    r.format("B2:B%d" % LAST, WHOLE)
    r.sheet.getCellRangeByName("C2:E%d" % LAST).HoriJustify = enum("CellHoriJustify", "RIGHT")  # <0.5 beside numbers
    r.widths([2.3, 1.4, 2.6, 2.6, 2.6, 5.4])

    A, B = "$readings.$A$1:$A$%d" % LAST, "$readings.$B$1:$B$%d" % LAST
    columns = ["C", "D", "E"]

    # --- the trend per station ---------------------------------------------------------------------
    s.label("A1", "Nitrate-N at three stations of the Alder, monthly 2016–2025: trend per station (TRACK.TREND)",
            bold=True)
    s.header("A3", ["station", "readings", "below 0.5 mg/L", "seasonal Kendall p", "Sen slope mg/L per year",
                    "95% low", "95% high", "change % of median per year", "line at first date mg/L",
                    "Mann–Kendall p, no seasons", "lag-1 correlation"], wrap=True)
    for i, (name, *_rest) in enumerate(STATIONS):
        row = 4 + i
        V = "$readings.$%s$1:$%s$%d" % (columns[i], columns[i], LAST)
        call = "TRACK.TREND(%s;%s;%s" % (V, A, B)
        s.put("A%d" % row, name)
        s.formula("B%d" % row, call + ';"n")', WHOLE)
        s.formula("C%d" % row, 'INDEX(%s;"table");17;2)' % call, WHOLE)  # row 17: censored
        s.formula("D%d" % row, call + ")", P)
        s.formula("E%d" % row, call + ';"estimate")', "0.000")
        s.formula("F%d" % row, call + ';"ci-low")', "0.000")
        s.formula("G%d" % row, call + ';"ci-high")', "0.000")
        s.formula("H%d" % row, call + ';"percent")', "0.0")
        s.formula("I%d" % row, call + ';"intercept")', "0.00")
        s.formula("J%d" % row, "TRACK.TREND(%s;%s;;\"p\")" % (V, A), P)
        s.formula("K%d" % row, 'INDEX(%s;"table");18;2)' % call, "0.00")  # row 18: lag-1 correlation
    s.widths([2.6, 1.9, 1.9, 2.2, 2.3, 1.7, 1.7, 2.4, 2.3, 2.4, 1.9, 0.4, 2.2, 2.6])

    s.label("A8", "The same in words (TRACK.TREND \"report\", with the months as seasons)", bold=True)
    for i in range(len(STATIONS)):
        V = "$readings.$%s$1:$%s$%d" % (columns[i], columns[i], LAST)
        s.sentence("A%d" % (9 + 3 * i), '=TRACK.TREND(%s;%s;%s;"report")' % (V, A, B), 11, 3)

    s.sentence("A19", "How to read this. The seasonal Kendall test compares each month only with the same month "
               "of other years, so the winter high and summer low are not read as a trend; without the months "
               "(column J) the seasonal swing adds noise and the test is weaker. The Sen slope is the median "
               "change per year over all pairs of years within a month, in mg/L per year because the dates are "
               "formatted as dates. Readings below the detection limit (<0.5) count as lower than every detected "
               "reading and tied with each other, which leaves less to rank (Upper Alder).",
               11, 5, italic=True)
    s.caution("A25", "Monthly river readings are correlated with the month before (lag-1 correlation, column K): "
              "serial correlation makes these p-values too small (Hamed & Rao 1998), so read a p near 0.05 as "
              "weak. A trend test that finds nothing is not proof of no trend: Upper Alder's interval says how "
              "large a change the data still allow. A trend says nothing about its cause; check the sampling and "
              "laboratory history (a new limit, a new method) before reading one.", 11, 5)

    s.label("A31", "Mill Bridge: the whole result (TRACK.TREND \"table\")", bold=True)
    V = "$readings.$D$1:$D$%d" % LAST
    rows_out, _ = s.array("A32", 'TRACK.TREND(%s;%s;%s;"table")' % (V, A, B), 19, 2)
    s.format("B34:B%d" % (32 + rows_out - 1), "General")

    # --- chart data: decimal year, reading (below the limit drawn at the limit), Sen line -------------
    q.sentence("A1", HELPER_NOTE.format(sheet="trends") + " Readings below the detection limit are drawn at "
               "the limit (0.5).", 12, 2, colour=CAUTION_COLOUR)
    for i, (name, *_rest) in enumerate(STATIONS):
        c0 = 4 * i
        cols = [chr(65 + c0 + k) for k in range(3)]
        q.header("%s3" % cols[0], ["year", name, "Sen line"])
        out = 4
        for k, data in enumerate(rows):
            value = data[2 + i]
            if value is None or value == "n/a":
                continue
            src = k + 2
            q.formula("%s%d" % (cols[0], out), "YEAR($readings.$A%d)+($readings.$A%d-DATE(YEAR($readings.$A%d);1;1))"
                      "/365.25" % (src, src, src), "0.00")
            reading = "$readings.$%s%d" % (columns[i], src)
            q.formula("%s%d" % (cols[1], out), 'IF(ISNUMBER(%s);%s;VALUE(MID(%s;2;9)))' % (reading, reading, reading),
                      "0.00")
            q.formula("%s%d" % (cols[2], out), "$trends.$I$%d+$trends.$E$%d*($readings.$A%d-MIN($readings.$A$2:$A$%d))"
                      "/365.25" % (4 + i, 4 + i, src, last_data), "0.00")
            out += 1
        station_last = out - 1
        s.chart("trend%d" % i, "A%d" % (53 + 19 * i), 12.5, 7.0, "%s3:%s%d" % (cols[0], cols[2], station_last),
                "scatter", "%s: monthly nitrate-N with the Sen line" % name, "year", "nitrate-N (mg/L)",
                headers=(True, False), data_sheet=q.sheet, legend=True)
    q.widths([1.5, 2.4, 1.8, 0.4] * 3)

    def style_charts():
        for i in range(len(STATIONS)):
            style_trend_chart(s.sheet.getCharts().getByName("trend%d" % i).getEmbeddedObject())

    # The results open first (and are the workbook's picture in the README); the readings follow.
    return finish(doc, [r, s, q], os.path.join(ROOT, "sample_sheets", "river-trends.fods"), style_charts,
                  opens_on="trends")


if __name__ == "__main__":
    sys.exit(run_builder("write sample_sheets/river-trends.fods", river))
