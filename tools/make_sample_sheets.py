#!/usr/bin/python3
"""Writes the sample workbooks with charts: sample_sheets/marsh-vegetation.fods,
forest-regression.fods and fish-counts.fods.

    /usr/bin/python3 tools/make_sample_sheets.py --oxt build/quadrat.oxt [marsh forest fish]

All data are invented and generated with fixed seeds (nothing measured anywhere). Each workbook
is built through UNO in a headless Calc with the extension installed in a throwaway profile
(tools/quadrat_sheets/office.py): the raw long-format table is filled in (header row, a few blanks and
an `n/a`, as real field sheets have), the Quadrat formulas are typed beside it under their
display names, array formulas are sized to their result, the charts are added over the result
cells, and the document is stored as flat ODF. Rerunning the script reproduces the files.

Functions whose handler is not yet set in src/addin/registry.cpp are left out (read from the
source at run time), so that no cell shows "not available".
"""

import argparse
import os
import random
import re
import sys

import uno  # noqa: F401  (sets up the UNO types used below)
from com.sun.star.awt import Rectangle, Size

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
from quadrat_sheets.cells import column_name
from quadrat_sheets.office import Office, file_url, props

NOT_AVAILABLE = 32767  # the office's #N/A: a cell of an array block beyond the result


def available_functions():
    """Display names whose handler is set in src/addin/registry.cpp (not nullptr)."""
    text = open(os.path.join(ROOT, "src", "addin", "registry.cpp"), encoding="utf-8").read()
    names = set()
    for m in re.finditer(r'\{"([A-Z]+\.[A-Z]+)", "\w+",(.*?)\n\s+(&?\w+)\},', text, re.S):
        if m.group(3) != "nullptr":
            names.add(m.group(1))
    return names


def position(ref):
    m = re.fullmatch(r"([A-Z]+)(\d+)", ref)
    column = 0
    for ch in m.group(1):
        column = column * 26 + (ord(ch) - 64)
    return column - 1, int(m.group(2)) - 1


class Builder:
    """One sheet being filled: values, labelled formulas, sized array formulas, charts."""

    def __init__(self, doc, sheet):
        self.doc = doc
        self.sheet = sheet

    def cell(self, ref):
        return self.sheet.getCellRangeByName(ref)

    def put(self, ref, value):
        cell = self.cell(ref)
        if value is None:
            return
        if isinstance(value, (int, float)):
            cell.setValue(value)
        else:
            cell.setString(str(value))

    def row(self, ref, values):
        c, r = position(ref)
        for i, v in enumerate(values):
            self.put("%s%d" % (column_name(c + i), r + 1), v)

    def block(self, ref, rows):
        c, r = position(ref)
        for j, values in enumerate(rows):
            self.row("%s%d" % (column_name(c), r + 1 + j), values)

    def label(self, ref, text, bold=False, italic=False):
        self.put(ref, text)
        cell = self.cell(ref)
        if bold:
            cell.CharWeight = 150.0  # com.sun.star.awt.FontWeight.BOLD
        if italic:
            cell.CharPosture = uno.Enum("com.sun.star.awt.FontSlant", "ITALIC")

    def formula(self, ref, formula):
        self.cell(ref).setFormula("=" + formula)

    def sentence(self, ref, formula, columns, rows=2):
        """A report sentence: merged over `columns` columns, wrapped, so it reads in print."""
        c, r = position(ref)
        block = self.sheet.getCellRangeByPosition(c, r, c + columns - 1, r + rows - 1)
        block.merge(True)
        block.IsTextWrapped = True
        block.VertJustify = uno.Enum("com.sun.star.table.CellVertJustify", "TOP")
        if formula.startswith("="):
            self.cell(ref).setFormula(formula)
        else:
            self.cell(ref).setString(formula)

    def array(self, ref, formula, rows=None, columns=None):
        """An array formula at `ref`. Without a size, the result is measured first in a probe
        block far below (its rows are removed afterwards), so the block has the exact size the
        function gives and no cell shows #N/A. Data references must be absolute."""
        if rows is None or columns is None:
            probe_row = 5000
            probe = self.sheet.getCellRangeByPosition(0, probe_row, 14, probe_row + 59)
            probe.setArrayFormula("=" + formula)
            self.doc.calculateAll()
            rows = columns = 0
            for r in range(60):
                for c in range(15):
                    if probe.getCellByPosition(c, r).getError() != NOT_AVAILABLE:
                        rows, columns = max(rows, r + 1), max(columns, c + 1)
            probe.setArrayFormula("")
            self.sheet.getRows().removeByIndex(probe_row, 60)
            if rows == 0 or (rows, columns) == (60, 15):
                raise RuntimeError("%s gives no array here: is the function in this .oxt?" % formula)
        c, r = position(ref)
        target = self.sheet.getCellRangeByPosition(c, r, c + columns - 1, r + rows - 1)
        target.setArrayFormula("=" + formula)
        return rows, columns

    def widths(self, widths):
        """Column widths in cm, from column A."""
        columns = self.sheet.getColumns()
        for i, w in enumerate(widths):
            if w:
                columns.getByIndex(i).Width = int(w * 1000)

    def number_format(self, ref_range, code):
        formats = self.doc.getNumberFormats()
        locale = uno.createUnoStruct("com.sun.star.lang.Locale")
        key = formats.queryKey(code, locale, False)
        if key == -1:
            key = formats.addNew(code, locale)
        self.sheet.getCellRangeByName(ref_range).NumberFormat = key

    def chart(self, name, anchor, width_cm, height_cm, data_range, kind, title, x_title, y_title,
              headers=(False, False), data_sheet=None):
        """A chart over `data_range` (on `data_sheet` when given), its top-left corner at cell
        `anchor`. kind: 'columns' (first column = categories) or 'scatter' (first column = x)."""
        source = data_sheet or self.sheet
        address = source.getCellRangeByName(data_range).getRangeAddress()
        corner = self.cell(anchor).Position
        rect = Rectangle(corner.X, corner.Y, int(width_cm * 1000), int(height_cm * 1000))
        charts = self.sheet.getCharts()
        charts.addNewByName(name, rect, (address,), headers[0], headers[1])
        chart = charts.getByName(name).getEmbeddedObject()
        if kind == "scatter":
            chart.setDiagram(chart.createInstance("com.sun.star.chart.XYDiagram"))
            diagram = chart.getDiagram()
            diagram.Lines = False
            diagram.SymbolType = -2  # com.sun.star.chart.ChartSymbolType.AUTO
        diagram = chart.getDiagram()
        start = uno.Enum("com.sun.star.chart.ChartAxisPosition", "START")
        for axis in (diagram.getXAxis(), diagram.getYAxis()):
            axis.CrossoverPosition = start
        chart.HasMainTitle = True
        chart.getTitle().String = title
        chart.getTitle().CharHeight = 11.0
        chart.HasLegend = False
        diagram.HasXAxisTitle = True
        diagram.getXAxisTitle().String = x_title
        diagram.HasYAxisTitle = True
        diagram.getYAxisTitle().String = y_title
        # A caption under the chart, its last word under the chart's right edge, so that the
        # sheet's used area (what prints) covers the chart.
        c, r = position(anchor)
        below = r + int(height_cm / 0.452) + 2
        self.label("%s%d" % (column_name(c), below), "Chart: %s" % title, italic=True)
        right = c
        x = corner.X + int(width_cm * 1000)
        columns = self.sheet.getColumns()
        while columns.getByIndex(right).Position.X + columns.getByIndex(right).Width < x:
            right += 1
        self.label("%s%d" % (column_name(right), below + 1), "data: %s.%s" % (source.getName(), data_range),
                   italic=True)
        self.cell("%s%d" % (column_name(right), below + 1)).HoriJustify = uno.Enum(
            "com.sun.star.table.CellHoriJustify", "RIGHT")
        return chart


def store(doc, path):
    doc.storeToURL(file_url(path), props(FilterName="OpenDocument Spreadsheet Flat XML"))
    print("wrote %s" % os.path.relpath(path, ROOT))


CAUTION = ("A p-value is not an effect size: read the estimates, their intervals and the effect size beside it. "
           "Check the assumptions and the design (one quadrat per zone and transect is not independent of its "
           "neighbours on the same transect in every study); for decisions that matter, ask a statistician.")


# ------------------------------------------------------------------------------------------------
# 1. Marsh vegetation: plant height in four zones along transects
# ------------------------------------------------------------------------------------------------

def marsh(office, available):
    """Fifteen invented transects from the creek bank to the upland edge, one 1 m² quadrat per
    zone; the height (cm) of the tallest shoot in each quadrat."""
    rng = random.Random(20260611)
    zones = [("low marsh", 78, 11), ("mid marsh", 56, 9), ("high marsh", 41, 7), ("upland edge", 47, 10)]
    rows = []
    for t in range(15):
        date = "2026-07-%02d" % (6 + t // 3 * 2)
        for z, (zone, mean, sd) in enumerate(zones):
            height = round(rng.gauss(mean, sd), 1)
            rows.append([date, "T%02d-%d" % (t + 1, z + 1), zone, height, None])
    rows[9][3], rows[9][4] = None, "quadrat under water at high tide"
    rows[26][3], rows[26][4] = "n/a", "tallest shoot grazed"
    rows[43][3], rows[43][4] = None, "flag lost, quadrat not found"
    last = 500  # read down to row 500: a new season's rows below are picked up

    doc = office.new_calc()
    sheet = doc.Sheets.getByIndex(0)
    sheet.setName("survey")
    doc.Sheets.insertNewByName("chart data", 1)
    s = Builder(doc, sheet)
    q = Builder(doc, doc.Sheets.getByName("chart data"))
    s.row("A1", ["date", "quadrat", "zone", "height cm", "note"])
    s.block("A2", rows)

    H = "$D$1:$D$%d" % last
    Z = "$C$1:$C$%d" % last
    s.label("G1", "Plant height by zone, cm (DESCRIBE.GROUPS, rows 1-%d)" % last, bold=True)
    s.array("G2", "DESCRIBE.GROUPS(%s;%s)" % (H, Z))

    s.label("G8", "Assumptions", bold=True)
    s.label("G9", "Residuals normal? Shapiro-Wilk p")
    s.formula("K9", "CHECK.NORMAL(%s;%s)" % (H, Z))
    s.label("G10", "Equal spread? Brown-Forsythe p")
    s.formula("K10", "CHECK.VARIANCE(%s;%s)" % (H, Z))
    s.label("G11", "Which test? ADVISE.TEST (a guide, not a verdict):", italic=True)
    s.sentence("G12", "=ADVISE.TEST(%s;%s)" % (H, Z), 10, 5)

    # The test follows the advice: its method, transform and post-hoc method are cells computed
    # from ADVISE.TEST, so a new season's data that change the advice change the test with it.
    s.label("G17", "The advice as keywords: method, transform, post-hoc method")
    s.formula("M17", 'ADVISE.TEST(%s;%s;"method")' % (H, Z))
    s.formula("N17", 'ADVISE.TEST(%s;%s;"transform")' % (H, Z))
    s.formula("O17", 'IF(M17="welch";"games-howell";IF(M17="pooled";"tukey";"dunn"))')
    M, T, P = "$M$17", "$N$17", "$O$17"
    s.label("G18", "Do the zones differ? (COMPARE.GROUPS with the method the advice picks)", bold=True)
    s.label("G19", "p-value")
    s.formula("K19", 'COMPARE.GROUPS(%s;%s;%s;"p";%s)' % (H, Z, M, T))
    s.label("G20", "F statistic")
    s.formula("K20", 'COMPARE.GROUPS(%s;%s;%s;"statistic";%s)' % (H, Z, M, T))
    s.label("G21", "effect size ω²")
    s.formula("K21", 'COMPARE.GROUPS(%s;%s;%s;"effect";%s)' % (H, Z, M, T))
    s.label("G22", "largest - smallest mean, cm")
    s.formula("K22", 'COMPARE.GROUPS(%s;%s;%s;"estimate";%s)' % (H, Z, M, T))
    s.sentence("G23", '=COMPARE.GROUPS(%s;%s;%s;"report";%s)' % (H, Z, M, T), 10, 2)
    s.sentence("G25", CAUTION, 10, 2)
    s.cell("G25").CharColor = 0x9C2A00

    row = 28
    letters_block = None
    if "COMPARE.POSTHOC" in available:
        s.label("G%d" % row, "Pairs of zones by the advised post-hoc method: difference in cm, 95% interval "
                "(COMPARE.POSTHOC)", bold=True)
        rows_, _ = s.array("G%d" % (row + 1), 'COMPARE.POSTHOC(%s;%s;%s;;%s)' % (H, Z, P, T))
        s.number_format("I%d:N%d" % (row + 2, row + rows_), "0.000")
        row += rows_ + 2
    if "COMPARE.LETTERS" in available:
        s.label("G%d" % row, "Zones sharing a letter do not differ (same method, 5%; COMPARE.LETTERS)", bold=True)
        rows_, _ = s.array("G%d" % (row + 1), 'COMPARE.LETTERS(%s;%s;%s;;%s)' % (H, Z, P, T))
        s.number_format("I%d:I%d" % (row + 2, row + rows_), "0.0")
        letters_block = row + 2  # first group row
        row += rows_ + 2

    # Bar chart data on the chart data sheet: zone (with its letters) and mean, from the cells above.
    q.label("A1", "Bar chart data: zone (with its COMPARE.LETTERS letters) and mean height, read from the "
            "DESCRIBE.GROUPS cells of the survey sheet", bold=True)
    q.row("A2", ["zone", "mean height cm"])
    for i in range(4):
        r = 3 + i
        if letters_block:
            q.formula("A%d" % r, '$survey.G%d&"  ("&$survey.J%d&")"' % (3 + i, letters_block + i))
        else:
            q.formula("A%d" % r, "$survey.G%d" % (3 + i))
        q.formula("B%d" % r, "$survey.I%d" % (3 + i))
    q.number_format("B3:B6", "0.0")
    s.chart("means", "Q1", 12.0, 8.5, "A2:B6", "columns",
            "Mean plant height by zone" + (" (letters: the advised post-hoc method)" if letters_block else ""),
            "zone", "mean height (cm)", headers=(True, True), data_sheet=q.sheet)

    # Normal Q-Q plot of the residuals from the zone means, over all 500 rows.
    q.label("D1", "Normal Q-Q data: residuals from the zone means, CHECK.QQ over rows 1-%d "
            "(blank rows stay blank, so the chart redraws as rows are added)" % last, bold=True)
    q.row("D2", ["normal quantile", "residual cm"])
    q.array("D3", "CHECK.QQ($survey.%s;$survey.%s)" % (H, Z), last, 2)
    q.number_format("D3:E%d" % (last + 2), "0.00")
    s.chart("qq", "Q23", 12.0, 8.5, "D3:E%d" % (last + 2), "scatter",
            "Normal Q-Q plot of residuals (CHECK.QQ)", "normal quantile", "residual (cm)",
            data_sheet=q.sheet)

    s.widths([2.2, 1.8, 2.3, 2.0, 5.5, 0.6, 2.6])
    s.number_format("I3:P6", "0.0")
    s.number_format("K9:K10", "0.000")
    s.number_format("K19:K19", '[<0.0001]"< 0.0001";0.0000')
    s.number_format("K20:K22", "0.00")
    doc.calculateAll()
    store(doc, os.path.join(ROOT, "sample_sheets", "marsh-vegetation.fods"))
    doc.close(True)


# ------------------------------------------------------------------------------------------------
# 2. Forest regression: stand biomass against elevation and soil moisture
# ------------------------------------------------------------------------------------------------

def forest(office, available):
    """Forty-eight invented 20 m × 20 m plots on a hillside: elevation (m), soil moisture
    (% volumetric, mean of three probe readings) and above-ground tree biomass (t/ha)."""
    rng = random.Random(20260714)
    rows = []
    for p in range(48):
        elevation = round(rng.uniform(320, 1150))
        moisture = round(min(45.0, max(8.0, 34 - 0.012 * elevation + rng.gauss(0, 5.0))), 1)
        biomass = round(265 - 0.11 * elevation + 3.2 * moisture + rng.gauss(0, 22), 1)
        rows.append(["P%02d" % (p + 1), elevation, moisture, biomass, None])
    rows[13][2], rows[13][4] = "n/a", "moisture probe failed"
    rows[30][3], rows[30][4] = None, "windthrow: plot not measured"
    last = 200

    doc = office.new_calc()
    sheet = doc.Sheets.getByIndex(0)
    sheet.setName("plots")
    doc.Sheets.insertNewByName("qq data", 1)
    s = Builder(doc, sheet)
    q = Builder(doc, doc.Sheets.getByName("qq data"))
    s.row("A1", ["plot", "elevation m", "soil moisture %", "biomass t/ha", "note"])
    s.block("A2", rows)

    Y = "$D$1:$D$%d" % last
    X = "$B$1:$C$%d" % last
    # FIT.POINTS beside the raw rows: its header replaces the raw header row, one row per plot.
    s.array("F1", "FIT.POINTS(%s;%s)" % (Y, X), last, 6)
    s.label("M1", "Biomass (t/ha) from elevation and soil moisture — FIT.LINEAR coefficients, "
            "rows 1 to %d" % last, bold=True)
    rows_, _ = s.array("M2", "FIT.LINEAR(%s;%s)" % (Y, X))
    r = 2 + rows_ + 1
    s.sentence("M%d" % r, '=FIT.LINEAR(%s;%s;"report")' % (Y, X), 8, 2)
    r += 3
    s.label("M%d" % r, "Model fit — FIT.LINEAR model", bold=True)
    model_rows, _ = s.array("M%d" % (r + 1), 'FIT.LINEAR(%s;%s;"model")' % (Y, X))
    s.label("P%d" % r, "Does the model hold? — CHECK.MODEL", bold=True)
    check_rows, _ = s.array("P%d" % (r + 1), "CHECK.MODEL(%s;%s)" % (Y, X))
    r2 = r + 1 + check_rows + 1
    s.label("P%d" % r2, "Correlation with biomass (Pearson) — RELATE.CORRELATION", bold=True)
    s.row("P%d" % (r2 + 1), ["variable", "r", "95% CI low", "95% CI high", "p"])
    for i, (name, col) in enumerate([("elevation", "B"), ("soil moisture", "C")]):
        x = "$%s$1:$%s$%d" % (col, col, last)
        rr = r2 + 2 + i
        s.put("P%d" % rr, name)
        s.formula("Q%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"estimate")' % (x, Y))
        s.formula("R%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"ci-low")' % (x, Y))
        s.formula("S%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"ci-high")' % (x, Y))
        s.formula("T%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"p")' % (x, Y))
    s.sentence("P%d" % (r2 + 4), '=RELATE.CORRELATION($C$1:$C$%d;%s;"pearson";"report")' % (last, Y), 5, 3)
    r = max(r + 1 + model_rows, r2 + 7) + 1
    s.sentence("M%d" % r, CAUTION.replace(
        "(one quadrat per zone and transect is not independent of its neighbours on the same transect in every study)",
        "(neighbouring plots on one slope are not always independent)"), 8, 2)
    s.cell("M%d" % r).CharColor = 0x9C2A00
    chart_row = r + 3
    s.chart("residuals", "M%d" % chart_row, 10.0, 7.5, "F2:G%d" % last, "scatter",
            "Residuals against fitted values (FIT.POINTS)", "fitted biomass (t/ha)", "residual (t/ha)")

    q.label("A1", "Normal Q-Q data of the model residuals — CHECK.QQ over FIT.POINTS' residual column "
            "(rows 1 to %d)" % last, bold=True)
    q.row("A2", ["normal quantile", "residual t/ha"])
    q.array("A3", "CHECK.QQ($plots.$G$1:$G$%d)" % last, last, 2)
    q.number_format("A3:B%d" % (last + 2), "0.00")
    s.chart("qq", "R%d" % chart_row, 10.0, 7.5, "A3:B%d" % (last + 2), "scatter",
            "Normal Q-Q plot of residuals (CHECK.QQ)", "normal quantile", "residual (t/ha)",
            data_sheet=q.sheet)

    s.widths([1.4, 2.3, 2.8, 2.4, 4.8, 1.9, 1.9, 1.9, 1.9, 1.9, 1.9, 0.6, 2.6, 2.6, 2.0, 2.6, 2.0, 2.0, 8.0, 2.0])
    s.number_format("N3:S5", "0.0000")
    s.number_format("N13:N14", "0.000")
    s.number_format("N19:N19", "0.000")
    s.number_format("Q12:R17", "0.000")
    s.number_format("T3:T5", "0.00")
    s.number_format("Q22:S23", "0.00")
    s.number_format("T22:T23", "0.0000")
    s.number_format("F2:G%d" % last, "0.0")
    s.number_format("H2:K%d" % last, "0.000")
    doc.calculateAll()
    store(doc, os.path.join(ROOT, "sample_sheets", "forest-regression.fods"))
    doc.close(True)


# ------------------------------------------------------------------------------------------------
# 3. Fish counts: species by reach, trout sex ratio, trout presence at electrofishing sites
# ------------------------------------------------------------------------------------------------

def fish(office, available):
    """An invented electrofishing survey of a small river: every fish caught in three reaches
    (species, sex where it could be told, fork length), and a second table of 40 sites with
    summer water temperature, canopy cover and whether brown trout were caught there."""
    rng = random.Random(20260823)
    species = ["brown trout", "bullhead", "minnow", "stone loach"]
    mix = {"upper": [0.45, 0.30, 0.10, 0.15], "middle": [0.25, 0.30, 0.25, 0.20],
           "lower": [0.08, 0.22, 0.45, 0.25]}
    lengths = {"brown trout": (190, 45), "bullhead": (85, 15), "minnow": (60, 10), "stone loach": (80, 12)}
    catch = []
    for reach, n in [("upper", 58), ("middle", 64), ("lower", 70)]:
        for i in range(n):
            sp = rng.choices(species, mix[reach])[0]
            sex = rng.choice(["female", "male"]) if sp == "brown trout" and rng.random() < 0.85 else "n/a"
            length = round(rng.gauss(*lengths[sp]))
            catch.append(["2026-08-%02d" % {"upper": 11, "middle": 12, "lower": 13}[reach], reach, sp, sex,
                          length, None])
    catch[17][4], catch[17][5] = None, "escaped before measuring"
    catch[75][2], catch[75][5] = None, "juvenile, species not told"
    catch[120][4], catch[120][5] = "n/a", "measuring board lost"
    last = 400

    doc = office.new_calc()
    sheet = doc.Sheets.getByIndex(0)
    sheet.setName("catch")
    doc.Sheets.insertNewByName("sites", 1)
    s = Builder(doc, sheet)
    t = Builder(doc, doc.Sheets.getByName("sites"))
    s.row("A1", ["date", "reach", "species", "sex", "length mm", "note"])
    s.block("A2", catch)

    R = "$B$1:$B$%d" % last
    S = "$C$1:$C$%d" % last
    s.label("H1", "Catch by species and reach (Calc COUNTIFS)", bold=True)
    s.row("H2", ["species", "upper", "middle", "lower"])
    for i, sp in enumerate(species):
        s.put("H%d" % (3 + i), sp)
        for j, col in enumerate("IJK"):
            s.formula("%s%d" % (col, 3 + i), 'COUNTIFS(%s;%s$2;%s;$H%d)' % (R, col, S, 3 + i))

    s.label("H8", "Species mix by reach? χ² (COMPARE.COUNTS)", bold=True)
    s.label("H9", "p-value")
    s.formula("K9", "COMPARE.COUNTS(%s;%s)" % (S, R))
    s.number_format("K9:K9", "0.0000")
    s.number_format("K10:K10", "0.00")
    s.label("H10", "effect size: Cramér's V (0 to 1)")
    s.formula("K10", 'COMPARE.COUNTS(%s;%s;"chi-square";"effect")' % (S, R))
    s.sentence("H11", '=COMPARE.COUNTS(%s;%s;"chi-square";"report")' % (S, R), 7, 2)
    s.label("H13", "Whole result — COMPARE.COUNTS table", italic=True)
    rows_, _ = s.array("H14", 'COMPARE.COUNTS(%s;%s;"chi-square";"table")' % (S, R))
    r = 14 + rows_ + 1
    s.label("H%d" % r, "Trout sex ratio 1:1? (COMPARE.EXPECTED)", bold=True)
    s.row("H%d" % (r + 1), ["sex", "trout caught"])
    for i, sex in enumerate(["female", "male"]):
        s.put("H%d" % (r + 2 + i), sex)
        s.formula("I%d" % (r + 2 + i), 'COUNTIFS(%s;"brown trout";$D$1:$D$%d;H%d)' % (S, last, r + 2 + i))
    s.label("H%d" % (r + 4), "p-value (equal expected)")
    s.formula("K%d" % (r + 4), "COMPARE.EXPECTED($I$%d:$I$%d)" % (r + 2, r + 3))
    s.sentence("H%d" % (r + 5), "=COMPARE.EXPECTED($I$%d:$I$%d;;\"report\")" % (r + 2, r + 3), 7, 2)
    s.sentence("H%d" % (r + 7), CAUTION.replace(
        "(one quadrat per zone and transect is not independent of its neighbours on the same transect in every study)",
        "(fish from one pass of one reach are not independent samples of the river)"), 7, 3)
    s.cell("H%d" % (r + 7)).CharColor = 0x9C2A00
    s.chart("catch", "O1", 12.0, 8.0, "H2:K6", "columns",
            "Fish caught by species and reach", "species", "fish caught", headers=(True, True))
    chart = s.sheet.getCharts().getByName("catch").getEmbeddedObject()
    chart.HasLegend = True
    s.widths([2.2, 1.6, 2.4, 1.6, 2.0, 4.6, 0.6, 3.0])

    # Sites: presence/absence of brown trout against temperature and canopy.
    rng = random.Random(20260824)
    sites = []
    for i in range(40):
        temperature = round(rng.uniform(12.5, 21.5), 1)
        canopy = round(rng.uniform(5, 90))
        eta = 9.0 - 0.62 * temperature + 0.025 * canopy
        present = "present" if rng.random() < 1 / (1 + pow(2.718281828459045, -eta)) else "absent"
        sites.append(["S%02d" % (i + 1), ["upper", "middle", "lower"][i * 3 // 40], temperature, canopy, present,
                      None])
    sites[8][4], sites[8][5] = "n/a", "too turbid to fish"
    sites[27][2], sites[27][5] = None, "logger not recovered"
    t.row("A1", ["site", "reach", "water temp °C", "canopy %", "brown trout", "note"])
    t.block("A2", sites)
    Y = "$E$1:$E$200"
    X = "$C$1:$D$200"
    t.label("H1", "Brown trout presence against summer water temperature and canopy — FIT.LOGISTIC "
            "(odds ratio per °C, per % canopy)", bold=True)
    rows_, _ = t.array("H2", "FIT.LOGISTIC(%s;%s)" % (Y, X))
    r = 2 + rows_ + 1
    t.label("H%d" % r, "Model — FIT.LOGISTIC model", bold=True)
    rows_, _ = t.array("H%d" % (r + 1), 'FIT.LOGISTIC(%s;%s;"model")' % (Y, X))
    r += rows_ + 2
    t.sentence("H%d" % r, "An odds ratio below 1 means lower odds of finding trout per unit more; the interval "
               "says how well the data pin it down. Sites were not chosen at random here: "
               "say so when reporting.", 8, 2)
    t.widths([1.4, 1.8, 2.6, 2.0, 2.3, 3.8, 0.6, 3.2])
    doc.calculateAll()
    store(doc, os.path.join(ROOT, "sample_sheets", "fish-counts.fods"))
    doc.close(True)


def main():
    parser = argparse.ArgumentParser(description="write the sample workbooks with charts")
    parser.add_argument("--oxt", required=True)
    parser.add_argument("which", nargs="*", default=["marsh", "forest", "fish"])
    args = parser.parse_args()
    available = available_functions()
    with Office() as office:
        office.start()
        office.install(args.oxt)
        for name in args.which:
            {"marsh": marsh, "forest": forest, "fish": fish}[name](office, available)
    return 0


if __name__ == "__main__":
    sys.exit(main())
