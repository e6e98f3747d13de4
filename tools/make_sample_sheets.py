#!/usr/bin/python3
"""Writes the four sample workbooks: sample_sheets/stream-survey.fods, marsh-vegetation.fods,
forest-regression.fods and fish-counts.fods.

    /usr/bin/python3 tools/make_sample_sheets.py --oxt build/quadrat.oxt [stream marsh forest fish]

All data are invented and generated with fixed seeds (nothing measured anywhere). Each workbook
is built through UNO in a headless Calc with the extension installed in a throwaway profile
(tools/quadrat_sheets/office.py): the raw long-format table is filled in (header row with units, a few
blanks and an `n/a`, as real field sheets have), the Quadrat formulas are typed beside it under
their display names, array formulas are sized to their result, every result gets the number
format of its quantity (p as 0.000 with `< 0.001` below that, estimates in the data's unit and
digits), the columns are widened until no label or number is cut, each sheet gets its caution
note, the charts are added, and the document is stored as flat ODF. Rerunning the script
reproduces the files.

Functions missing from the .oxt are left out, so that no cell shows #NAME?.
"""

import argparse
import datetime
import os
import random
import re
import sys
import xml.etree.ElementTree as ET
import zipfile

import uno  # noqa: F401  (sets up the UNO types used below)
from com.sun.star.awt import Rectangle

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
from quadrat_sheets.cells import column_name
from quadrat_sheets.office import Office, file_url, props

NOT_AVAILABLE = 32767  # the office's #N/A: a cell of an array block beyond the result

# Number formats, one per kind of quantity, the same in every workbook.
P = '[<0.001]"< 0.001";0.000'  # a p-value: three decimals, "< 0.001" below that (the report style)
DATE = "YYYY-MM-DD"
WHOLE = "0"
CAUTION_COLOUR = 0x9C2A00
SENTENCE_SLACK = 1500  # 1/100 mm kept free at the right of a wrapped sentence

CAUTION = ("Read with care: a test that finds nothing is not proof of the opposite (\"no clear sign of a "
           "difference\" is not \"no difference\"), and a p-value is not an effect size: read the estimates "
           "and their intervals beside it. {design} For decisions that matter, defer to the study design and "
           "ask a statistician.")


def available_functions(oxt):
    """Display names of the functions in the .oxt (its CalcAddIns.xcu)."""
    name = "{http://openoffice.org/2001/registry}name"
    with zipfile.ZipFile(oxt) as z:
        root = ET.fromstring(z.read("CalcAddIns.xcu"))
    names = set()
    for node in root.iter("node"):
        if node.get(name) == "AddInFunctions":
            for f in node.findall("node"):
                for prop in f.findall("prop"):
                    if prop.get(name) == "DisplayName":
                        names.add(prop.findtext("value"))
    return names


def position(ref):
    m = re.fullmatch(r"([A-Z]+)(\d+)", ref)
    column = 0
    for ch in m.group(1):
        column = column * 26 + (ord(ch) - 64)
    return column - 1, int(m.group(2)) - 1


def serial(date):
    """A date as the office's day number (1899-12-30 is day 0)."""
    return (date - datetime.date(1899, 12, 30)).days


def enum(kind, value):
    return uno.Enum("com.sun.star.table." + kind, value)


class Builder:
    """One sheet being filled: values, labelled formulas, sized array formulas, formats, charts."""

    def __init__(self, doc, sheet):
        self.doc = doc
        self.sheet = sheet
        self.arrays = []  # (column, row, columns, rows) of each array result
        self.charts = []  # charts to draw once the columns have their final widths

    def cell(self, ref):
        return self.sheet.getCellRangeByName(ref)

    def put(self, ref, value):
        cell = self.cell(ref)
        if value is None:
            return
        if isinstance(value, datetime.date):
            cell.setValue(serial(value))
            self.format(ref, DATE)
            cell.HoriJustify = enum("CellHoriJustify", "CENTER")
        elif isinstance(value, (int, float)):
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

    def header(self, ref, values, wrap=False):
        """A table's header row, bold. With wrap (the raw table's first row), a long header takes
        two lines rather than width; elsewhere a taller row would open a gap in the raw table."""
        self.row(ref, values)
        c, r = position(ref)
        cells = self.sheet.getCellRangeByPosition(c, r, c + len(values) - 1, r)
        cells.CharWeight = 150.0
        if wrap:
            cells.IsTextWrapped = True
            cells.VertJustify = enum("CellVertJustify", "BOTTOM")

    def formula(self, ref, formula, code=None):
        self.cell(ref).setFormula("=" + formula)
        if code:
            self.format(ref, code)

    def sentence(self, ref, formula, columns, rows=2, colour=None, italic=False):
        """A sentence (a report formula or a note): merged over `columns` × `rows`, wrapped."""
        c, r = position(ref)
        block = self.sheet.getCellRangeByPosition(c, r, c + columns - 1, r + rows - 1)
        block.merge(True)
        block.IsTextWrapped = True
        block.VertJustify = enum("CellVertJustify", "TOP")
        # Slack on the right: printed text runs a little wider than the screen layout that placed
        # its line breaks, and would be clipped at the merged area's edge.
        block.ParaRightMargin = SENTENCE_SLACK
        if formula.startswith("="):
            self.cell(ref).setFormula(formula)
        else:
            self.cell(ref).setString(formula)
        if colour is not None:
            self.cell(ref).CharColor = colour
        if italic:
            self.cell(ref).CharPosture = uno.Enum("com.sun.star.awt.FontSlant", "ITALIC")

    def caution(self, ref, design, columns, rows=3):
        self.sentence(ref, CAUTION.format(design=design), columns, rows, colour=CAUTION_COLOUR)

    def result(self, ref, label, formula, code, label_columns):
        """A labelled single result: the label merged over `label_columns` cells from `ref`, the
        value in the next cell with its number format."""
        c, r = position(ref)
        self.sheet.getCellRangeByPosition(c, r, c + label_columns - 1, r).merge(True)
        self.label(ref, label)
        value = "%s%d" % (column_name(c + label_columns), r + 1)
        self.formula(value, formula, code)
        return value

    def array(self, ref, formula, rows=None, columns=None, bold_header=True, wrap_header=False):
        """An array formula at `ref`. Without a size, the result is measured first in a probe
        block far below (its rows are removed afterwards), so the block has the exact size the
        function gives and no cell shows #N/A. Data references must be absolute."""
        if rows is None or columns is None:
            # Far right and far down, outside any whole-column reference of the data.
            probe_row, probe_column = 5000, 60
            probe = self.sheet.getCellRangeByPosition(probe_column, probe_row, probe_column + 14, probe_row + 59)
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
        if bold_header and rows > 1:
            top = self.sheet.getCellRangeByPosition(c, r, c + columns - 1, r)
            top.CharWeight = 150.0
            if wrap_header:  # only where the row is a header row anyway (row 1 beside the raw header)
                top.IsTextWrapped = True
                top.VertJustify = enum("CellVertJustify", "BOTTOM")
        self.arrays.append((c, r, columns, rows))
        return rows, columns

    def formats_by_label(self, ref, rows, codes):
        """Number formats for a label/value table whose labels start at `ref`: over `rows` rows,
        the value beside a label takes codes[label] (labels come from the computed table)."""
        self.doc.calculateAll()
        c, r = position(ref)
        for k in range(rows):
            key = self.sheet.getCellByPosition(c, r + k).getString()
            if key in codes:
                self.format("%s%d" % (column_name(c + 1), r + 1 + k), codes[key])

    def widths(self, widths):
        """Column widths in cm, from column A (None keeps a column as it is)."""
        columns = self.sheet.getColumns()
        for i, w in enumerate(widths):
            if w:
                columns.getByIndex(i).Width = int(w * 1000)

    def format(self, ref_range, code):
        formats = self.doc.getNumberFormats()
        locale = uno.createUnoStruct("com.sun.star.lang.Locale")
        key = formats.queryKey(code, locale, False)
        if key == -1:
            key = formats.addNew(code, locale)
        self.sheet.getCellRangeByName(ref_range).NumberFormat = key

    def formats(self, ref, codes):
        """Number formats for consecutive columns of one row block, e.g. ("K3:K6", …)."""
        m = re.fullmatch(r"([A-Z]+)(\d+):([A-Z]+)?(\d+)", ref)
        c, _ = position(m.group(1) + m.group(2))
        for i, code in enumerate(codes):
            if code:
                col = column_name(c + i)
                self.format("%s%s:%s%s" % (col, m.group(2), col, m.group(4)), code)

    def chart(self, *args, **kwargs):
        """A chart, drawn by draw_charts() after fit(): a chart sits at a fixed position on the page,
        so it is placed only once the columns under it have their final widths."""
        self.charts.append((args, kwargs))

    def draw_charts(self):
        for args, kwargs in self.charts:
            self._chart(*args, **kwargs)

    def _chart(self, name, anchor, width_cm, height_cm, data_range, kind, title, x_title, y_title,
               headers=(False, False), data_sheet=None, legend=False):
        """A chart over `data_range` (on `data_sheet` when given), its top-left corner at cell
        `anchor`. kind: 'columns' (first column = categories), 'lines' (first column =
        categories, one line per further column) or 'scatter' (first column = x)."""
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
        elif kind == "lines":
            chart.setDiagram(chart.createInstance("com.sun.star.chart.LineDiagram"))
            diagram = chart.getDiagram()
            diagram.SymbolType = -2
        diagram = chart.getDiagram()
        start = uno.Enum("com.sun.star.chart.ChartAxisPosition", "START")
        for axis in (diagram.getXAxis(), diagram.getYAxis()):
            axis.CrossoverPosition = start
        if kind == "scatter":  # axis labels in the General format (-2, -1.5, 10), not the cells' 0.00
            general = self.doc.getNumberFormats().queryKey("General", uno.createUnoStruct("com.sun.star.lang.Locale"),
                                                           False)
            for axis in (diagram.getXAxis(), diagram.getYAxis()):
                axis.LinkNumberFormatToSource = False
                axis.NumberFormat = max(general, 0)
        chart.HasMainTitle = True
        chart.getTitle().String = title
        chart.getTitle().CharHeight = 11.0
        chart.HasLegend = legend
        if legend:
            chart.getLegend().Alignment = uno.Enum("com.sun.star.chart.ChartLegendPosition", "BOTTOM")
        diagram.HasXAxisTitle = True
        diagram.getXAxisTitle().String = x_title
        diagram.HasYAxisTitle = True
        diagram.getYAxisTitle().String = y_title
        # A caption under the chart, its data range under the chart's right edge, so that the
        # sheet's used area (what prints) covers the chart.
        c, r = position(anchor)
        rows = self.sheet.getRows()
        below, y = r, corner.Y
        while y < corner.Y + int(height_cm * 1000):
            y += rows.getByIndex(below).Height
            below += 1
        below += 1
        self.label("%s%d" % (column_name(c), below + 1), "Chart: %s" % title, italic=True)
        right = c
        x = corner.X + int(width_cm * 1000)
        columns = self.sheet.getColumns()
        while columns.getByIndex(right).Position.X + columns.getByIndex(right).Width < x:
            right += 1
        self.label("%s%d" % (column_name(right), below + 2), "data: %s.%s" % (source.getName(), data_range),
                   italic=True)
        self.cell("%s%d" % (column_name(right), below + 2)).HoriJustify = enum("CellHoriJustify", "RIGHT")
        return chart

    # --- fitting: no label, header or number cut -------------------------------------------
    def fit(self):
        """Recompute, then widen every column whose cells would be cut (text running into a
        filled neighbour, a number shown as ###), and give wrapped rows the height they need."""
        self.doc.calculateAll()
        for _ in range(3):
            if not widen(self.doc, self.sheet):
                break
        self.sheet.getRows().OptimalHeight = True
        heighten(self.doc, self.sheet)


def _scratch(doc):
    if not doc.Sheets.hasByName("_measure"):
        doc.Sheets.insertNewByName("_measure", doc.Sheets.getCount())
    return doc.Sheets.getByName("_measure")


_widths = {}


def needed_width(doc, cell, text, wrapped):
    """The width (1/100 mm) `text` needs in `cell`'s font; for wrapped text, its longest word."""
    longest = max(text.split(), key=len) if wrapped and text.split() else text
    key = (longest, cell.CharWeight, cell.CharPosture.value, cell.CharHeight)
    if key in _widths:
        return _widths[key]
    scratch = _scratch(doc)
    probe = scratch.getCellByPosition(0, 0)
    probe.setString(longest)
    probe.CharWeight = cell.CharWeight
    probe.CharPosture = cell.CharPosture
    probe.CharHeight = cell.CharHeight
    column = scratch.getColumns().getByIndex(0)
    column.OptimalWidth = True
    _widths[key] = column.Width
    return column.Width


def needed_height(doc, text, width, cell):
    """The height (1/100 mm) `text` needs wrapped in a column `width` wide, in `cell`'s font."""
    scratch = _scratch(doc)
    probe = scratch.getCellByPosition(1, 1)
    probe.setString(text)
    probe.IsTextWrapped = True
    probe.ParaRightMargin = cell.ParaRightMargin
    probe.CharWeight = cell.CharWeight
    probe.CharPosture = cell.CharPosture
    probe.CharHeight = cell.CharHeight
    scratch.getColumns().getByIndex(1).Width = width
    row = scratch.getRows().getByIndex(1)
    row.OptimalHeight = True
    return row.Height


def merged_sentences(sheet):
    """(cell, columns width, rows range) of every merged, wrapped cell with text."""
    for c, r in cells_of(sheet):
        cell = sheet.getCellByPosition(c, r)
        if cell.getIsMerged() and cell.IsTextWrapped and cell.getString():
            cursor = sheet.createCursorByRange(cell)
            cursor.collapseToMergedArea()
            a = cursor.getRangeAddress()
            width = sum(sheet.getColumns().getByIndex(k).Width for k in range(a.StartColumn, a.EndColumn + 1))
            yield cell, width, a


def heighten(doc, sheet):
    """Gives each merged sentence the height of its wrapped text: first by merging empty rows below
    into it (so that the rows of the raw table beside it keep their height), else by making its
    last row taller."""
    rows = sheet.getRows()
    filled = set(cells_of(sheet))
    for cell, width, a in list(merged_sentences(sheet)):
        need = needed_height(doc, cell.getString(), width, cell) + 50
        have = sum(rows.getByIndex(k).Height for k in range(a.StartRow, a.EndRow + 1))
        end = a.EndRow
        while need > have and not any((c, end + 1) in filled for c in range(a.StartColumn, a.EndColumn + 1)) \
                and not any((c, end + 2) in filled for c in range(a.StartColumn, a.EndColumn + 1)):
            end += 1  # keep one empty row under the sentence
            have += rows.getByIndex(end).Height
        if end != a.EndRow:
            sheet.getCellRangeByPosition(a.StartColumn, a.StartRow, a.EndColumn, a.EndRow).merge(False)
            sheet.getCellRangeByPosition(a.StartColumn, a.StartRow, a.EndColumn, end).merge(True)
            for k in range(a.EndRow + 1, end + 1):
                filled.update((c, k) for c in range(a.StartColumn, a.EndColumn + 1))
            a.EndRow = end
        if need > have:
            last = rows.getByIndex(a.EndRow)
            last.Height = last.Height + need - have


def short_sentences(doc, sheet):
    """Merged sentences whose wrapped text runs below their cells."""
    rows = sheet.getRows()
    out = []
    for cell, width, a in list(merged_sentences(sheet)):
        need = needed_height(doc, cell.getString(), width, cell)
        have = sum(rows.getByIndex(k).Height for k in range(a.StartRow, a.EndRow + 1))
        if need > have:
            out.append(("%s%d" % (column_name(a.StartColumn), a.StartRow + 1), cell.getString(), need / 1000.0,
                        have / 1000.0))
    return out


def cells_of(sheet):
    """Every non-empty cell of the sheet's used area, as (column, row, cell)."""
    cursor = sheet.createCursor()
    cursor.gotoStartOfUsedArea(False)
    cursor.gotoEndOfUsedArea(True)
    a = cursor.getRangeAddress()
    # Formulas too: a formula cell showing nothing (an array's blank) still stops text running on.
    data = sheet.getCellRangeByPosition(a.StartColumn, a.StartRow, a.EndColumn, a.EndRow).getFormulaArray()
    for j, values in enumerate(data):
        for i, v in enumerate(values):
            if v != "":
                yield a.StartColumn + i, a.StartRow + j


def cut_cells(doc, sheet, fix=False):
    """Cells whose shown text does not fit: (address, text, needed cm, available cm). Text may run
    on into empty cells to its right (as Calc shows it); numbers and text in a merged or wrapped
    cell must fit their own cells. With fix, the cell's own column is widened instead."""
    columns = sheet.getColumns()
    problems = []
    filled = set(cells_of(sheet))
    for c, r in sorted(filled, key=lambda p: (p[1], p[0])):
        cell = sheet.getCellByPosition(c, r)
        text = cell.getString()
        if not text:
            continue
        wrapped = cell.IsTextWrapped
        merged_columns = 1
        if cell.getIsMerged():
            cursor = sheet.createCursorByRange(cell)
            cursor.collapseToMergedArea()
            ma = cursor.getRangeAddress()
            merged_columns = ma.EndColumn - ma.StartColumn + 1
        available = sum(columns.getByIndex(c + k).Width for k in range(merged_columns))
        is_text = cell.getType().value == "TEXT" or (
            cell.getType().value == "FORMULA" and cell.getPropertyValue("FormulaResultType2") != 1)
        if is_text and not wrapped and merged_columns == 1:
            step = -1 if cell.HoriJustify.value == "RIGHT" else 1
            k = c + step
            while k >= 0 and (k, r) not in filled and abs(k - c) < 40:
                available += columns.getByIndex(k).Width
                k += step
        if not is_text and "#" in text and text.strip("#") == "":
            need = available + 1  # Calc's ### for a number too wide
        elif len(text) * 320 < available:
            continue  # fits for certain (no character of a bold 10-point font is 3.2 mm wide)
        else:
            need = needed_width(doc, cell, text, wrapped)
        if need > available:
            if fix and merged_columns == 1:
                columns.getByIndex(c).Width = need
            problems.append(("%s%d" % (column_name(c), r + 1), text, need / 1000.0, available / 1000.0))
    return problems


def widen(doc, sheet):
    doc.calculateAll()
    fixed = cut_cells(doc, sheet, fix=True)
    if os.environ.get("QUADRAT_SHEETS_DEBUG"):
        for f in fixed:
            print("  widened for %s %r: %.1f cm (had %.1f)" % f)
    return bool(fixed)


def store(doc, path):
    if doc.Sheets.hasByName("_measure"):
        doc.Sheets.removeByName("_measure")
    doc.storeToURL(file_url(path), props(FilterName="OpenDocument Spreadsheet Flat XML"))
    print("wrote %s" % os.path.relpath(path, ROOT))


def report_cuts(doc):
    """Prints every cut cell left over (the fitting above should leave none)."""
    left = 0
    for sheet in doc.Sheets:
        if sheet.getName() == "_measure":
            continue
        for address, text, need, available in cut_cells(doc, sheet):
            print("  cut: %s.%s %r needs %.1f cm, has %.1f cm" % (sheet.getName(), address, text[:40], need, available))
            left += 1
        for address, text, need, available in short_sentences(doc, sheet):
            print("  cut: %s.%s %r needs %.1f cm of height, has %.1f cm" % (sheet.getName(), address, text[:40],
                                                                        need, available))
            left += 1
    return left


def new_workbook(office, first, others=()):
    doc = office.new_calc()
    sheet = doc.Sheets.getByIndex(0)
    sheet.setName(first)
    builders = [Builder(doc, sheet)]
    for i, name in enumerate(others):
        doc.Sheets.insertNewByName(name, i + 1)
        builders.append(Builder(doc, doc.Sheets.getByName(name)))
    return doc, builders


def finish(doc, builders, path, style_charts=None, opens_on=None):
    """Fits every sheet, draws the charts, reports the cells left cut, stores and closes the
    workbook; returns how many cells are cut. style_charts(), when given, runs once the charts are
    drawn (line styles, symbols); opens_on names a sheet to move to the front before storing."""
    for b in builders:
        b.fit()
    for b in builders:
        b.draw_charts()
    if style_charts:
        style_charts()
    left = report_cuts(doc)
    if opens_on:
        doc.Sheets.moveByName(opens_on, 0)
    store(doc, path)
    doc.close(True)
    return left


def run_in_office(oxt, builds):
    """Starts a headless office with the .oxt installed and runs each build(office, available) in it
    (available: the display names of the functions the .oxt holds; a build returns how many cells it
    left cut). Returns the exit code: 1 while any cell is cut."""
    available = available_functions(oxt)
    left = 0
    with Office() as office:
        office.start()
        office.install(oxt)
        for build in builds:
            left += build(office, available)
    if left:
        print("%d cells still cut (see above)" % left)
    return 1 if left else 0


def run_builder(description, build):
    """The command line of a one-workbook generator (--oxt PATH): run_in_office with that build."""
    parser = argparse.ArgumentParser(description=description)
    parser.add_argument("--oxt", required=True)
    return run_in_office(parser.parse_args().oxt, [build])


HELPER_NOTE = ("Helper cells for the charts on the {sheet} sheet: they are read from the results there and "
               "recompute with them. The caution on that sheet applies here too.")


# ------------------------------------------------------------------------------------------------
# 1. Stream survey: oxygen and EPT larvae upstream and downstream of an outfall
# ------------------------------------------------------------------------------------------------

def stream(office, available):
    """Ten visits in spring to four kick-sampling stations of a small stream, two upstream and
    two downstream of a fictional outfall, all four on the same day. Each row is one station
    visit: dissolved oxygen (mg/L), water temperature (°C) and the number of mayfly, stonefly and
    caddisfly larvae (EPT) in the kick sample."""
    rng = random.Random(20260502)

    def poisson(mean):
        # Knuth's multiplication method: fine for the small means of a kick sample.
        limit, k, p = pow(2.718281828459045, -mean), 0, 1.0
        while True:
            p *= rng.random()
            if p <= limit:
                return k
            k += 1

    stations = [("upstream", "U1"), ("upstream", "U2"), ("downstream", "D1"), ("downstream", "D2")]
    dates = [datetime.date(2026, 4, 3) + datetime.timedelta(days=3 * v) for v in range(10)]
    rows = []
    for visit, date in enumerate(dates):
        for site, station in stations:
            up = site == "upstream"
            oxygen = round(rng.gauss(9.1 if up else 7.7, 0.55 if up else 0.75), 1)
            temperature = round(rng.gauss(9.5 + 0.25 * visit + (0.0 if up else 0.6), 0.4), 1)
            ept = poisson(31 if up else 18)
            rows.append([date, site, station, oxygen, temperature, ept, None])
    # What a field sheet looks like after a season.
    rows[5][3], rows[5][6] = None, "meter battery flat"
    rows[6][3], rows[6][6] = None, "meter battery flat"
    rows[21][3], rows[21][6] = "n/a", "probe fouled by algae"
    rows[30][5], rows[30][6] = None, "kick sample jar broken"
    last = len(rows) + 1

    doc, (s, q) = new_workbook(office, "survey", ["chart data"])
    s.header("A1", ["date", "site", "station", "oxygen mg/L", "temperature °C", "EPT larvae per sample", "note"],
             wrap=True)
    s.block("A2", rows)
    s.format("D2:E%d" % last, "0.0")
    s.format("F2:F%d" % last, WHOLE)
    s.widths([2.3, 2.3, 1.7, 2.0, 2.4, 2.3, 4.0, 0.5, 2.3, 0.9] + [1.55] * 11)

    D, E, F, B = ("$%s$1:$%s$%d" % (x, x, last) for x in "DEFB")
    describe_mgl = ["", WHOLE, "0.00", "0.00", "0.00", "0.00", "0.00", "0.0", "0.0", "0.00", "0.00", "0.00", "0.0"]
    s.label("I1", "Dissolved oxygen by site, mg/L (DESCRIBE.GROUPS)", bold=True)
    s.array("I2", "DESCRIBE.GROUPS(%s;%s)" % (D, B))
    s.formats("I3:U4", describe_mgl)
    s.label("I6", "EPT larvae per kick sample by site (DESCRIBE.GROUPS with log(x+1): back-transformed mean)",
            bold=True)
    s.array("I7", 'DESCRIBE.GROUPS(%s;%s;"log(x+1)")' % (F, B))
    s.formats("I8:U9", ["", WHOLE, "0.0", "0.0", "0.0", "0.0", "0.00", "0.0", WHOLE, "0.0", "0.0", "0.0", WHOLE])
    s.label("I11", "Water temperature by site, °C (DESCRIBE.GROUPS over whole columns)", bold=True)
    s.array("I12", "DESCRIBE.GROUPS($E:$E;$B:$B)")
    s.formats("I13:U14", describe_mgl)

    s.label("I16", "Oxygen: upstream against downstream", bold=True)
    results = [
        ("Residuals from the site means, Shapiro–Wilk p", "CHECK.NORMAL(%s;%s)" % (D, B), P),
        ("Spread, Brown–Forsythe p", "CHECK.VARIANCE(%s;%s)" % (D, B), P),
        ("Welch's t-test p", "COMPARE.GROUPS(%s;%s)" % (D, B), P),
        ("Difference of means, upstream − downstream, mg/L", 'COMPARE.GROUPS(%s;%s;;"estimate")' % (D, B), "0.00"),
        ("95% interval, low, mg/L", 'COMPARE.GROUPS(%s;%s;;"ci-low")' % (D, B), "0.00"),
        ("95% interval, high, mg/L", 'COMPARE.GROUPS(%s;%s;;"ci-high")' % (D, B), "0.00"),
        ("Effect size, Hedges' g", 'COMPARE.GROUPS(%s;%s;;"effect")' % (D, B), "0.00"),
    ]
    for i, (label, formula, code) in enumerate(results):
        s.result("I%d" % (17 + i), label, formula, code, 6)
    s.sentence("I24", '=COMPARE.GROUPS(%s;%s;;"report")' % (D, B), 13, 2)

    s.label("I27", "EPT larvae per kick sample: upstream against downstream (rank test)", bold=True)
    s.result("I28", "Wilcoxon–Mann–Whitney p", 'COMPARE.GROUPS(%s;%s;"ranks")' % (F, B), P, 6)
    s.result("I29", "Hodges–Lehmann shift, upstream − downstream, larvae", 'COMPARE.GROUPS(%s;%s;"ranks";"estimate")'
             % (F, B), "0.0", 6)
    s.sentence("I30", '=COMPARE.GROUPS(%s;%s;"ranks";"report")' % (F, B), 13, 2)

    A = "$A$1:$A$%d" % last
    s.label("I33", "Upstream against downstream within sampling dates (COMPARE.BLOCKS: each date a block)", bold=True)
    s.result("I34", "Oxygen, paired t-test by date, p", "COMPARE.BLOCKS(%s;%s;%s)" % (D, B, A), P, 6)
    s.result("I35", "EPT larvae, Wilcoxon signed-rank test by date, p", 'COMPARE.BLOCKS(%s;%s;%s;"ranks")' % (F, B, A),
             P, 6)
    s.sentence("I36", '=COMPARE.BLOCKS(%s;%s;%s;;"report")' % (D, B, A), 13, 2)
    s.sentence("I38", '=COMPARE.BLOCKS(%s;%s;%s;"ranks";"report")' % (F, B, A), 13, 2)
    s.sentence("I40", "Sampling dates are blocks: the four stations were visited on the same ten dates, and each date's "
               "flow, weather and time of day move all four together (see the chart below). The tests further up treat "
               "every visit as an independent reading of its site, so their p-values are likely too small. COMPARE.BLOCKS "
               "compares the sites within each date and averages the two stations of a site first (they are "
               "subsamples of it, not replicates), so it rests on ten dates, not forty visits.", 13, 4, italic=True)
    s.caution("I45", "Only two stations per site were sampled, so the difference between sites may be the "
              "difference between these stations.", 13, 4)

    # Chart data: the mean oxygen of each site on each date; the Q-Q points of the residuals.
    q.sentence("A1", HELPER_NOTE.format(sheet="survey"), 6, 2, colour=CAUTION_COLOUR)
    q.header("A3", ["visit", "upstream mg/L", "downstream mg/L", "date"])
    for i, date in enumerate(dates):
        r = 4 + i
        q.put("D%d" % r, date)
        q.formula("A%d" % r, 'TEXT(D%d;"D MMM")' % r)  # a text label: the chart shows it as typed
        for col, site in (("B", "upstream"), ("C", "downstream")):
            q.formula("%s%d" % (col, r), 'AVERAGEIFS($survey.%s;$survey.%s;"%s";$survey.$A$1:$A$%d;$D%d)'
                      % (D, B, site, last, r), "0.00")
    q.header("F3", ["normal quantile", "residual mg/L"])
    q.array("F4", "CHECK.QQ($survey.%s;$survey.%s)" % (D, B), last, 2, bold_header=False)
    q.format("F4:G%d" % (last + 3), "0.00")
    q.widths([1.8, 2.6, 2.9, 2.3, 0.5, 2.4, 2.4])
    s.chart("dates", "I50", 13.0, 8.0, "A3:C13", "lines", "Mean dissolved oxygen on each sampling date",
            "sampling date", "oxygen (mg/L)", headers=(True, True), data_sheet=q.sheet, legend=True)
    s.chart("qq", "Q50", 11.0, 8.0, "F4:G%d" % (last + 3), "scatter",
            "Normal Q-Q plot of oxygen residuals (CHECK.QQ)", "normal quantile", "residual (mg/L)",
            data_sheet=q.sheet)
    return finish(doc, [s, q], os.path.join(ROOT, "sample_sheets", "stream-survey.fods"))


# ------------------------------------------------------------------------------------------------
# 2. Marsh vegetation: plant height in four zones along transects
# ------------------------------------------------------------------------------------------------

def marsh(office, available):
    """Fifteen invented transects from the creek bank to the upland edge, one 1 m² quadrat per
    zone; the height (cm) of the tallest shoot in each quadrat."""
    rng = random.Random(20260611)
    zones = [("low marsh", 78, 11), ("mid marsh", 56, 9), ("high marsh", 41, 7), ("upland edge", 47, 10)]
    rows = []
    for t in range(15):
        date = datetime.date(2026, 7, 6 + t // 3 * 2)
        for z, (zone, mean, sd) in enumerate(zones):
            height = round(rng.gauss(mean, sd), 1)
            rows.append([date, "T%02d" % (t + 1), zone, height, None])
    rows[9][3], rows[9][4] = None, "quadrat under water at high tide"
    rows[26][3], rows[26][4] = "n/a", "tallest shoot grazed"
    rows[43][3], rows[43][4] = None, "flag lost, quadrat not found"
    last = 500  # read down to row 500: a new season's rows below are picked up

    doc, (s, q) = new_workbook(office, "survey", ["chart data"])
    s.header("A1", ["date", "transect", "zone", "height cm", "note"], wrap=True)
    s.block("A2", rows)
    s.format("D2:D%d" % last, "0.0")
    s.widths([2.3, 1.8, 2.3, 1.8, 5.6, 0.5, 2.5, 1.0] + [1.6] * 11)

    H = "$D$1:$D$%d" % last
    Z = "$C$1:$C$%d" % last
    cm = ["", WHOLE, "0.0", "0.0", "0.0", "0.0", "0.00", "0.0", "0.0", "0.0", "0.0", "0.0", "0.0"]
    s.label("G1", "Plant height by zone, cm (DESCRIBE.GROUPS, rows 1–%d)" % last, bold=True)
    s.array("G2", "DESCRIBE.GROUPS(%s;%s)" % (H, Z))
    s.formats("G3:S6", cm)

    s.label("G8", "Assumptions", bold=True)
    s.result("G9", "Residuals from the zone means, Shapiro–Wilk p", "CHECK.NORMAL(%s;%s)" % (H, Z), P, 5)
    s.result("G10", "Spread, Brown–Forsythe p", "CHECK.VARIANCE(%s;%s)" % (H, Z), P, 5)
    s.label("G11", "Which test? ADVISE.TEST (a guide, not a verdict):", italic=True)
    s.sentence("G12", "=ADVISE.TEST(%s;%s)" % (H, Z), 13, 5)

    # The test follows the advice: its method, transform and post-hoc method are cells computed
    # from ADVISE.TEST, so a new season's data that change the advice change the test with it.
    s.sentence("G17", "The advice as keywords: method, transform, post-hoc method", 6, 1)
    s.formula("M17", 'ADVISE.TEST(%s;%s;"method")' % (H, Z))
    s.formula("N17", 'ADVISE.TEST(%s;%s;"transform")' % (H, Z))
    s.formula("O17", 'ADVISE.TEST(%s;%s;"posthoc")' % (H, Z))
    M, T, PH = "$M$17", "$N$17", "$O$17"
    s.label("G18", "Do the zones differ? (COMPARE.GROUPS with the method the advice picks)", bold=True)
    s.result("G19", "p-value", 'COMPARE.GROUPS(%s;%s;%s;"p";%s)' % (H, Z, M, T), P, 5)
    s.result("G20", "F statistic", 'COMPARE.GROUPS(%s;%s;%s;"statistic";%s)' % (H, Z, M, T), "0.00", 5)
    s.result("G21", "Effect size ω²", 'COMPARE.GROUPS(%s;%s;%s;"effect";%s)' % (H, Z, M, T), "0.00", 5)
    s.sentence("G22", '=COMPARE.GROUPS(%s;%s;%s;"report";%s)' % (H, Z, M, T), 13, 2)
    s.caution("G25", "One quadrat per zone on each transect: quadrats of one transect share its exposure and "
              "are not fully independent; the block analysis below compares the zones within transects.", 13, 3)
    TR = "$B$1:$B$%d" % last
    s.label("G29", "Zones compared within transects (COMPARE.BLOCKS: each transect a block)", bold=True)
    s.result("G30", "Randomized block ANOVA p", "COMPARE.BLOCKS(%s;%s;%s)" % (H, Z, TR), P, 5)
    s.result("G31", "Effect size, partial η²", 'COMPARE.BLOCKS(%s;%s;%s;;"effect")' % (H, Z, TR), "0.00", 5)
    s.sentence("G32", '=COMPARE.BLOCKS(%s;%s;%s;;"report")' % (H, Z, TR), 13, 2)

    row = 35
    letters_block = None
    if "COMPARE.POSTHOC" in available:
        s.label("G%d" % row, "Pairs of zones by the advised post-hoc method: difference in cm with its 95% interval "
                "(COMPARE.POSTHOC)", bold=True)
        rows_, _ = s.array("G%d" % (row + 1), "COMPARE.POSTHOC(%s;%s;%s;;%s)" % (H, Z, PH, T))
        s.formats("G%d:O%d" % (row + 2, row + rows_), ["", "", "0.0", "0.0", "0.0", "0.00", P, P, ""])
        s.cell("O%d:O%d" % (row + 2, row + rows_)).HoriJustify = enum("CellHoriJustify", "CENTER")
        row += rows_ + 2
    if "COMPARE.LETTERS" in available:
        s.label("G%d" % row, "Zones sharing a letter show no clear difference (same method, 5%; COMPARE.LETTERS)",
                bold=True)
        rows_, _ = s.array("G%d" % (row + 1), "COMPARE.LETTERS(%s;%s;%s;;%s)" % (H, Z, PH, T))
        s.formats("G%d:J%d" % (row + 2, row + rows_), ["", WHOLE, "0.0", ""])
        s.cell("J%d:J%d" % (row + 2, row + rows_)).HoriJustify = enum("CellHoriJustify", "CENTER")
        letters_block = row + 2  # first group row
        row += rows_ + 2

    # Bar chart data: zone (with its letters) and mean, from the cells of the survey sheet.
    q.sentence("A1", HELPER_NOTE.format(sheet="survey"), 6, 2, colour=CAUTION_COLOUR)
    q.header("A3", ["zone", "mean height cm"])
    for i in range(4):
        r = 4 + i
        if letters_block:
            q.formula("A%d" % r, '$survey.G%d&CHAR(10)&"("&$survey.J%d&")"' % (3 + i, letters_block + i))
        else:
            q.formula("A%d" % r, "$survey.G%d" % (3 + i))
        q.formula("B%d" % r, "$survey.I%d" % (3 + i), "0.0")
    q.header("D3", ["normal quantile", "residual cm"])
    q.array("D4", "CHECK.QQ($survey.%s;$survey.%s)" % (H, Z), last, 2, bold_header=False)
    q.format("D4:E%d" % (last + 3), "0.00")
    q.widths([3.4, 2.6, 0.5, 2.4, 2.4])
    s.chart("means", "U1", 12.0, 8.5, "A3:B7", "columns",
            "Mean plant height by zone" + (" (letters: the advised post-hoc method)" if letters_block else ""),
            "zone", "mean height (cm)", headers=(True, True), data_sheet=q.sheet)
    s.chart("qq", "U23", 12.0, 8.5, "D4:E%d" % (last + 3), "scatter",
            "Normal Q-Q plot of residuals (CHECK.QQ)", "normal quantile", "residual (cm)", data_sheet=q.sheet)
    return finish(doc, [s, q], os.path.join(ROOT, "sample_sheets", "marsh-vegetation.fods"))


# ------------------------------------------------------------------------------------------------
# 3. Forest regression: stand biomass against elevation and soil moisture
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

    doc, (s, d, q, th) = new_workbook(office, "plots", ["diagnostics", "chart data", "thinning"])
    s.header("A1", ["plot", "elevation m", "soil moisture %", "biomass t/ha", "note"], wrap=True)
    s.block("A2", rows)
    s.format("B2:B%d" % last, WHOLE)
    s.format("C2:D%d" % last, "0.0")
    s.widths([1.3, 2.0, 2.0, 2.0, 5.0])

    Y = "$D$1:$D$%d" % last
    X = "$B$1:$C$%d" % last
    # FIT.POINTS beside the raw rows: its header replaces the raw header row, one row per plot.
    s.array("F1", "FIT.POINTS(%s;%s)" % (Y, X), last, 6, wrap_header=True)
    s.formats("F2:K%d" % last, ["0.0", "0.0", "0.00", "0.00", "0.000", "0.000"])
    s.widths([None] * 5 + [1.9, 1.9, 2.3, 2.3, 1.9, 1.9, 0.5])
    s.label("M1", "Biomass, t/ha, from elevation and soil moisture (FIT.LINEAR coefficients, rows 1–%d)" % last,
            bold=True)
    rows_, _ = s.array("M2", "FIT.LINEAR(%s;%s)" % (Y, X))
    # Each coefficient in the digits of its own unit: t/ha, t/ha per m, t/ha per % moisture.
    for r, code in ((3, "0.0"), (4, "0.0000"), (5, "0.00")):
        s.formats("M%d:T%d" % (r, r), ["", code, code, "0.00", P, code, code, "0.00"])
    r = 2 + rows_ + 1
    s.sentence("M%d" % r, '=FIT.LINEAR(%s;%s;"report")' % (Y, X), 8, 2)
    r += 3
    s.label("M%d" % r, "Model fit (FIT.LINEAR model)", bold=True)
    model_rows, _ = s.array("M%d" % (r + 1), 'FIT.LINEAR(%s;%s;"model")' % (Y, X))
    model_codes = {"r-squared": "0.000", "r-squared-adjusted": "0.000", "statistic": "0.00", "df": WHOLE,
                   "df2": WHOLE, "p": P, "residual-sd": "0.0", "aic": "0.0", "bic": "0.0", "n": WHOLE,
                   "n dropped": WHOLE}
    s.formats_by_label("M%d" % (r + 1), model_rows, model_codes)
    r = r + 1 + model_rows + 1
    s.label("M%d" % r, "Correlation with biomass (Pearson; RELATE.CORRELATION)", bold=True)
    s.header("M%d" % (r + 1), ["variable", "r", "ci-low", "ci-high", "p"])
    for i, (name, col) in enumerate([("elevation", "B"), ("soil moisture", "C")]):
        x = "$%s$1:$%s$%d" % (col, col, last)
        rr = r + 2 + i
        s.put("M%d" % rr, name)
        s.formula("N%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"estimate")' % (x, Y), "0.00")
        s.formula("O%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"ci-low")' % (x, Y), "0.00")
        s.formula("P%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"ci-high")' % (x, Y), "0.00")
        s.formula("Q%d" % rr, 'RELATE.CORRELATION(%s;%s;"pearson";"p")' % (x, Y), P)
    s.sentence("M%d" % (r + 4), '=RELATE.CORRELATION($C$1:$C$%d;%s;"pearson";"report")' % (last, Y), 8, 2)
    s.sentence("M%d" % (r + 6), "The regression's diagnostics (CHECK.REGRESSION) are on the diagnostics sheet.",
               8, 1, italic=True)
    r += 8
    s.caution("M%d" % r, "Neighbouring plots on one slope are not always independent, and a regression on "
              "surveyed plots shows association, not cause.", 8, 3)
    chart_row = r + 4
    s.chart("residuals", "M%d" % chart_row, 10.0, 7.5, "F2:G%d" % last, "scatter",
            "Residuals against fitted values (FIT.POINTS)", "fitted biomass (t/ha)", "residual (t/ha)")

    q.sentence("A1", HELPER_NOTE.format(sheet="plots"), 6, 2, colour=CAUTION_COLOUR)
    q.header("A3", ["normal quantile", "residual t/ha"])
    q.array("A4", "CHECK.QQ($plots.$G$1:$G$%d)" % last, last, 2, bold_header=False)
    q.format("A4:B%d" % (last + 3), "0.00")
    q.widths([2.4, 2.4])
    s.chart("qq", "R%d" % chart_row, 10.0, 7.5, "A4:B%d" % (last + 3), "scatter",
            "Normal Q-Q plot of residuals (CHECK.QQ)", "normal quantile", "residual (t/ha)", data_sheet=q.sheet)

    d.label("A1", "Does the model hold? Biomass against elevation and soil moisture (CHECK.REGRESSION)", bold=True)
    check_rows, _ = d.array("A2", "CHECK.REGRESSION($plots.%s;$plots.%s)" % (Y, X))
    d.widths([2.6, 2.0, 1.8, 12.0, 1.8])
    d.sheet.getCellRangeByPosition(3, 2, 3, 1 + check_rows).IsTextWrapped = True
    d.format("C3:C%d" % (1 + check_rows), P)
    d.sheet.getCellRangeByPosition(0, 1, 4, 1 + check_rows).VertJustify = enum("CellVertJustify", "TOP")
    check_codes = {"normality": "0.000", "spread": "0.00", "independence": "0.00", "linearity": "0.00",
                   "collinearity": "0.00", "influence": "0.000", "outliers": WHOLE}
    d.formats_by_label("A2", check_rows, check_codes)
    d.sentence("A%d" % (check_rows + 3), "\u2018look\u2019 means: look at the residual plots on the plots sheet and at "
               "the rows named, not that the model is wrong; \u2018ok\u2019 means the rule found no clear sign of trouble, not that "
               "the model holds. The plots are numbered, not visited in an order that matters, so no order is "
               "given and independence is not judged.", 5, 3, italic=True)
    d.caution("A%d" % (check_rows + 7), "Neighbouring plots on one slope are not always independent.", 5, 3)
    thinning(th, rng)
    return finish(doc, [s, d, q, th], os.path.join(ROOT, "sample_sheets", "forest-regression.fods"))


def thinning(t, rng):
    """Thirty invented plots of a thinning trial on the same hillside: half thinned five years ago,
    half left as controls, the plots spread over the slope so that elevation differs between them.
    Basal-area growth (m²/ha over five years) is compared between treatments adjusted for elevation
    (a factor and a covariate in FIT.LINEAR), and FIT.PREDICT gives the growth expected at chosen
    elevations."""
    rows = []
    for p in range(30):
        treatment = "control" if p % 2 == 0 else "thinned"
        elevation = round(rng.uniform(350, 1100) + (120 if treatment == "thinned" else 0))
        growth = round(4.6 - 0.0021 * elevation + (0.9 if treatment == "thinned" else 0) + rng.gauss(0, 0.45), 2)
        rows.append(["T%02d" % (p + 1), treatment, elevation, growth, None])
    rows[11][3], rows[11][4] = None, "tag lost: plot not remeasured"
    last = 100
    t.header("A1", ["plot", "treatment", "elevation m", "basal-area growth m²/ha", "note"], wrap=True)
    t.block("A2", rows)
    t.format("C2:C%d" % last, WHOLE)
    t.format("D2:D%d" % last, "0.00")
    t.widths([1.3, 2.0, 2.0, 2.6, 4.6, 0.5])
    Y, X = "$D$1:$D$%d" % last, "$B$1:$C$%d" % last
    t.label("G1", "Growth by treatment, adjusted for elevation (FIT.LINEAR with a factor; m²/ha over five years)",
            bold=True)
    rows_, _ = t.array("G2", "FIT.LINEAR(%s;%s)" % (Y, X))
    for r, code in ((3, "0.00"), (4, "0.00"), (5, "0.0000")):
        t.formats("G%d:N%d" % (r, r), ["", code, code, "0.00", P, code, code, "0.00"])
    r = 2 + rows_ + 1
    t.label("G%d" % r, "Model, with the joint test of the treatment factor (FIT.LINEAR model)", bold=True)
    model_rows, _ = t.array("G%d" % (r + 1), 'FIT.LINEAR(%s;%s;"model")' % (Y, X))
    codes = {"r-squared": "0.000", "r-squared-adjusted": "0.000", "statistic": "0.00", "df": WHOLE, "df2": WHOLE,
             "p": P, "residual-sd": "0.00", "aic": "0.0", "bic": "0.0", "n": WHOLE, "n dropped": WHOLE,
             "treatment: F": "0.00", "treatment: df": WHOLE, "treatment: p": P}
    t.formats_by_label("G%d" % (r + 1), model_rows, codes)
    r += model_rows + 2
    t.sentence("G%d" % r, "The row ‘treatment: thinned’ is the thinned plots’ growth minus the "
               "controls’ at the same elevation. The thinned plots happen to lie higher on the slope, where "
               "growth is slower, so comparing the raw means would understate the difference.", 8, 3, italic=True)
    r += 4
    t.label("G%d" % r, "Growth expected at chosen elevations (FIT.PREDICT; m²/ha over five years)", bold=True)
    t.header("G%d" % (r + 1), ["treatment", "elevation m"])
    at = [["control", 500], ["thinned", 500], ["control", 900], ["thinned", 900]]
    t.block("G%d" % (r + 2), at)
    t.format("H%d:H%d" % (r + 2, r + 5), WHOLE)
    t.array("I%d" % (r + 1), "FIT.PREDICT(%s;%s;$G$%d:$H$%d)" % (Y, X, r + 1, r + 5), 5, 5)
    t.format("I%d:M%d" % (r + 2, r + 5), "0.00")
    t.sentence("G%d" % (r + 7), "‘mean’ limits bound the average growth of such plots; ‘reading’ "
               "limits are where the growth of one new plot is expected to fall (95%). Both assume the straight "
               "line holds at that elevation.", 8, 2, italic=True)
    t.caution("G%d" % (r + 10), "The plots of each treatment were not spread evenly over the slope, the trial has "
              "one site, and the model assumes the same elevation slope for both treatments.", 8, 3)
    t.chart("growth", "G%d" % (r + 14), 12.0, 7.5, "C2:D%d" % (len(rows) + 1), "scatter",
            "Basal-area growth against elevation (both treatments)", "elevation (m)", "growth (m²/ha, 5 years)")


# ------------------------------------------------------------------------------------------------
# 4. Fish counts: species by reach, trout sex ratio, trout presence at electrofishing sites
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
            catch.append([datetime.date(2026, 8, {"upper": 11, "middle": 12, "lower": 13}[reach]), reach, sp, sex,
                          length, None])
    catch[17][4], catch[17][5] = None, "escaped before measuring"
    catch[75][2], catch[75][5] = None, "juvenile, species not told"
    catch[120][4], catch[120][5] = "n/a", "measuring board lost"
    last = 400

    doc, (s, t, ps) = new_workbook(office, "catch", ["sites", "passes"])
    s.header("A1", ["date", "reach", "species", "sex", "fork length mm", "note"], wrap=True)
    s.block("A2", catch)
    s.format("E2:E%d" % last, WHOLE)
    s.widths([2.3, 1.6, 2.4, 1.6, 2.2, 4.8, 0.5])

    R = "$B$1:$B$%d" % last
    S = "$C$1:$C$%d" % last
    s.label("H1", "Fish caught by species and reach (Calc COUNTIFS)", bold=True)
    s.header("H2", ["species", "upper", "middle", "lower"])
    for i, sp in enumerate(species):
        s.put("H%d" % (3 + i), sp)
        for col in "IJK":
            s.formula("%s%d" % (col, 3 + i), "COUNTIFS(%s;%s$2;%s;$H%d)" % (R, col, S, 3 + i), WHOLE)

    s.label("H8", "Does the species mix differ between reaches? (COMPARE.COUNTS)", bold=True)
    s.result("H9", "χ² test p-value", "COMPARE.COUNTS(%s;%s)" % (S, R), P, 3)
    s.result("H10", "Effect size, Cramér's V (0 to 1)", 'COMPARE.COUNTS(%s;%s;"chi-square";"effect")' % (S, R),
             "0.00", 3)
    s.sentence("H11", '=COMPARE.COUNTS(%s;%s;"chi-square";"report")' % (S, R), 7, 2)
    s.label("H14", "The whole result (COMPARE.COUNTS table)", italic=True)
    rows_, _ = s.array("H15", 'COMPARE.COUNTS(%s;%s;"chi-square";"table")' % (S, R))
    table_codes = {"statistic": "0.00", "df": WHOLE, "p": P, "n": WHOLE, "n dropped": WHOLE, "effect": "0.00",
                   "smallest expected count": "0.0", "cells expected below 5": WHOLE}
    s.formats_by_label("H15", rows_, table_codes)
    r = 15 + rows_ + 1
    s.label("H%d" % r, "Trout sex ratio 1:1? (COMPARE.EXPECTED)", bold=True)
    s.header("H%d" % (r + 1), ["sex", "trout caught"])
    for i, sex in enumerate(["female", "male"]):
        s.put("H%d" % (r + 2 + i), sex)
        s.formula("I%d" % (r + 2 + i), 'COUNTIFS(%s;"brown trout";$D$1:$D$%d;H%d)' % (S, last, r + 2 + i), WHOLE)
    s.result("H%d" % (r + 4), "p-value (equal shares expected)", "COMPARE.EXPECTED($I$%d:$I$%d)" % (r + 2, r + 3),
             P, 3)
    s.sentence("H%d" % (r + 5), '=COMPARE.EXPECTED($I$%d:$I$%d;;"report")' % (r + 2, r + 3), 7, 2)
    s.caution("H%d" % (r + 8), "Fish from one pass of one reach are not independent samples of the river, and "
              "catchability differs between species.", 7, 4)
    s.chart("catch", "P1", 12.0, 8.0, "H2:K6", "columns",
            "Fish caught by species and reach", "species", "fish caught", headers=(True, True), legend=True)

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
    t.header("A1", ["site", "reach", "summer water temp °C", "canopy %", "brown trout", "note"], wrap=True)
    t.block("A2", sites)
    t.format("C2:C41", "0.0")
    t.format("D2:D41", WHOLE)
    t.widths([1.3, 1.7, 2.6, 1.9, 2.2, 3.9, 0.5])
    Y = "$E$1:$E$200"
    X = "$C$1:$D$200"
    t.label("H1", "Brown trout presence against summer water temperature and canopy (FIT.LOGISTIC; odds ratio "
            "per °C and per % canopy)", bold=True)
    rows_, _ = t.array("H2", "FIT.LOGISTIC(%s;%s)" % (Y, X))
    t.formats("H3:O%d" % (1 + rows_), ["", "0.000", "0.000", "0.00", P, "0.000", "0.000", "0.000"])
    r = 2 + rows_ + 1
    t.label("H%d" % r, "Model (FIT.LOGISTIC model)", bold=True)
    model_rows, _ = t.array("H%d" % (r + 1), 'FIT.LOGISTIC(%s;%s;"model")' % (Y, X))
    model_codes = {"deviance": "0.00", "null deviance": "0.00", "statistic": "0.00", "df": WHOLE, "p": P,
                   "aic": "0.0", "pseudo-r-squared": "0.000", "n": WHOLE, "n dropped": WHOLE, "iterations": WHOLE}
    t.formats_by_label("H%d" % (r + 1), model_rows, model_codes)
    r += model_rows + 2
    t.sentence("H%d" % r, "An odds ratio below 1 means lower odds of finding trout for each unit more (each °C, "
               "each % of canopy); the interval says how well the data pin it down.", 8, 2, italic=True)
    t.caution("H%d" % (r + 3), "The sites were not chosen at random, 40 sites give few events per predictor, "
              "and presence depends on detection as well as on the fish: say so when reporting.", 8, 3)
    passes(ps)
    return finish(doc, [s, t, ps], os.path.join(ROOT, "sample_sheets", "fish-counts.fods"))


def passes(p):
    """Trout caught per electrofishing pass in the three reaches, with the pass duration (minutes
    of fishing) as effort and the mean depth of the fished stretch. Passes were of unequal length,
    so counts are compared as catch rates in FIT.COUNTS (effort as a log offset)."""
    rng = random.Random(20260825)
    rate = {"upper": 0.55, "middle": 0.35, "lower": 0.18}  # trout per minute at 0.5 m
    rows = []
    for reach in ["upper", "middle", "lower"]:
        for i in range(12):
            minutes = rng.choice([10, 12, 15, 15, 20, 25])
            depth = round(rng.uniform(0.25, 0.95), 2)
            mean = minutes * rate[reach] * pow(2.718281828459045, -1.1 * (depth - 0.5))
            # Clumped catches: a gamma-mixed Poisson (negative binomial with k = 3).
            lam = rng.gammavariate(3.0, mean / 3.0)
            limit, k, q = pow(2.718281828459045, -lam), 0, 1.0
            while True:
                q *= rng.random()
                if q <= limit:
                    break
                k += 1
            rows.append(["P%02d" % (len(rows) + 1), reach, depth, minutes, k, None])
    rows[7][4], rows[7][5] = None, "net torn: catch not counted"
    last = 100
    p.header("A1", ["pass", "reach", "mean depth m", "minutes fished", "trout caught", "note"], wrap=True)
    p.block("A2", rows)
    p.format("C2:C%d" % last, "0.00")
    p.format("D2:E%d" % last, WHOLE)
    p.widths([1.3, 1.7, 2.0, 2.0, 2.0, 4.4, 0.5])
    COUNT, XS, EFFORT = "$E$1:$E$%d" % last, "$B$1:$C$%d" % last, "$D$1:$D$%d" % last
    p.label("H1", "Trout catch rate by reach and depth (FIT.COUNTS, minutes fished as effort; rate ratios)",
            bold=True)
    rows_, _ = p.array("H2", "FIT.COUNTS(%s;%s;%s)" % (COUNT, XS, EFFORT))
    p.formats("H3:O%d" % (1 + rows_), ["", "0.000", "0.000", "0.00", P, "0.00", "0.00", "0.00"])
    r = 2 + rows_ + 1
    p.label("H%d" % r, "Model (FIT.COUNTS model): which count model, and the joint test of the reach", bold=True)
    model_rows, _ = p.array("H%d" % (r + 1), 'FIT.COUNTS(%s;%s;%s;;"model")' % (COUNT, XS, EFFORT))
    codes = {"deviance": "0.00", "null deviance": "0.00", "statistic": "0.00", "df": WHOLE, "p": P, "aic": "0.0",
             "pseudo-r-squared": "0.000", "n": WHOLE, "n dropped": WHOLE, "iterations": WHOLE,
             "overdispersion": "0.00", "aggregation k": "0.00", "reach: χ²": "0.00", "reach: df": WHOLE,
             "reach: p": P}
    p.formats_by_label("H%d" % (r + 1), model_rows, codes)
    r += model_rows + 2
    p.sentence("H%d" % r, "A rate ratio is the factor by which the catch per minute changes: ‘reach: lower’ "
               "compares the lower reach with the upper one at equal depth, ‘mean depth m’ is per metre "
               "deeper. The model row says whether the counts were more clumped than a Poisson model allows.",
               8, 3, italic=True)
    r += 4
    p.header("H%d" % r, ["reach", "trout per minute"])
    for i, reach in enumerate(["upper", "middle", "lower"]):
        p.put("H%d" % (r + 1 + i), reach)
        p.formula("I%d" % (r + 1 + i), 'SUMIFS(%s;$B$1:$B$%d;H%d)/SUMIFS(%s;$B$1:$B$%d;H%d;%s;"<>")'
                  % (COUNT, last, r + 1 + i, EFFORT, last, r + 1 + i, COUNT), "0.00")
    p.sentence("H%d" % (r + 4), "Raw catch per minute of each reach (Calc SUMIFS), not adjusted for depth.", 8, 1,
               italic=True)
    p.caution("H%d" % (r + 6), "Catchability changes with flow, turbidity and fish size, and one pass catches only "
              "part of the fish present: a catch rate indexes abundance, it does not measure it.", 8, 3)
    p.chart("rates", "H%d" % (r + 10), 10.0, 7.0, "H%d:I%d" % (r, r + 3), "columns",
            "Trout caught per minute of fishing, by reach", "reach", "trout per minute", headers=(True, True))


def main():
    parser = argparse.ArgumentParser(description="write the sample workbooks with charts")
    parser.add_argument("--oxt", required=True)
    parser.add_argument("which", nargs="*", default=["stream", "marsh", "forest", "fish"])
    args = parser.parse_args()
    builds = {"stream": stream, "marsh": marsh, "forest": forest, "fish": fish}
    return run_in_office(args.oxt, [builds[name] for name in args.which])


if __name__ == "__main__":
    sys.exit(main())
