#!/usr/bin/python3
"""Live edits: no Quadrat cell ever shows a stale value after the sheet changes.

    /usr/bin/python3 tests/office/run_live_edits.py --oxt build/quadrat.oxt [-v] [case ...]

Builds an invented field survey (dissolved oxygen at an upstream and a downstream site, 310 rows:
site, oxygen, water temperature, a probe's raw millivolts, and the probe's oxygen as a formula
column) with Quadrat cells that read the SAME ranges through several functions: bounded ranges
(B2:B301, the first 300 rows), a whole column (B:B), an open-ended range (B2:B20000), a range of
formula cells (E2:E301), an INDEX into a table, an array-entered table, a second sheet reading the
first, and a third sheet `lab` with other data at the same addresses and the same formulas.

Each case loads that workbook afresh, recomputes, edits it the way a person would (typing, paste,
undo, rows inserted and deleted, sort, clear, fill, cut and paste from another sheet, save and
reload, automatic recalculation off, two documents with the same sheet names, ...), and after
every step compares every formula cell with a fresh computation: the current cells copied as plain
values into a new document with the same layout and the same formulas, calculateAll() there. The
reference is that fresh computation in the same office (common practice, no source); numbers must
agree within 1e-12 relative (the same doubles through the same code, so only an order of
summation could move a last digit), texts, blanks and errors exactly. Each step is compared twice:
as read straight after the edit (with automatic recalculation on, Calc recomputes dirty cells
when they are read: where a stale store of decoded ranges would show), and after calculateAll().
Every step also states what the edit must do to the Quadrat cells: change at least one of them
(else the step proves nothing), or change none (an edit elsewhere, a recalculation).

Prints one line per failing case (and its details), then `N passed, N failed`; exits non-zero on
any failure. Cases may be named on the command line to run only those.
"""

import argparse
import os
import random
import sys
import tempfile
import time
import traceback

import uno
from com.sun.star.sheet.FillDirection import TO_BOTTOM
from com.sun.star.table import CellAddress, TableSortField

import run_office_tests as harness
from quadrat_sheets.office import Office, file_url, props

TOLERANCE = 1e-12          # relative: see the module text
ROWS = 310                 # data rows 2..311
BOUNDED = 301              # the bounded ranges stop at row 301: rows 302..311 lie below them
QUADRAT = harness.STORED_PREFIX
MOST_LINES = 12            # failure lines shown per case (all with -v)
VALUE = uno.getConstantByName("com.sun.star.sheet.CellFlags.VALUE")
STRING = uno.getConstantByName("com.sun.star.sheet.CellFlags.STRING")

HEADER = ["site", "oxygen (mg/L)", "temperature (°C)", "probe (mV)", "probe oxygen (mg/L)"]

# field: the survey and the cells that read it. Same ranges through several functions: this is
# what a document-wide store of decoded ranges shares between cells.
FIELD_CELLS = [
    ("Welch p, B2:B301 by site", '=COMPARE.GROUPS(B2:B301;A2:A301)'),
    ("Welch t", '=COMPARE.GROUPS(B2:B301;A2:A301;"welch";"statistic")'),
    ("mean difference", '=COMPARE.GROUPS(B2:B301;A2:A301;;"estimate")'),
    ("rank-sum p", '=COMPARE.GROUPS(B2:B301;A2:A301;"ranks";"p")'),
    ("first site's mean", '=INDEX(DESCRIBE.GROUPS(B2:B301;A2:A301);2;3)'),
    ("second site's median", '=INDEX(DESCRIBE.GROUPS(B2:B301;A2:A301);3;11)'),
    ("slope on temperature", '=FIT.LINEAR(B2:B301;C2:C301;"slope")'),
    ("r-squared", '=FIT.LINEAR(B2:B301;C2:C301;"r-squared")'),
    ("residual of row 6", '=INDEX(FIT.POINTS(B2:B301;C2:C301;"residual");5;1)'),
    ("Shapiro-Wilk p", '=CHECK.NORMAL(B2:B301)'),
    ("W of the residuals by site", '=CHECK.NORMAL(B2:B301;A2:A301;"shapiro-wilk";"statistic")'),
    ("Brown-Forsythe p", '=CHECK.VARIANCE(B2:B301;A2:A301)'),
    ("Pearson p", '=RELATE.CORRELATION(C2:C301;B2:B301)'),
    ("Spearman rho", '=RELATE.CORRELATION(C2:C301;B2:B301;"spearman";"estimate")'),
    ("whole column: Shapiro-Wilk p", '=CHECK.NORMAL(B:B)'),
    ("whole column: mean", '=INDEX(DESCRIBE.GROUPS(B:B);2;3)'),
    ("whole column: Welch t", '=COMPARE.GROUPS(B:B;A:A;;"statistic")'),
    ("open range: second site's mean", '=INDEX(DESCRIBE.GROUPS(B2:B20000;A2:A20000);3;3)'),
    ("open range: slope", '=FIT.LINEAR(B2:B20000;C2:C20000;"slope")'),
    ("formula cells: Welch p of the probe", '=COMPARE.GROUPS(E2:E301;A2:A301)'),
    ("formula cells: probe on titration slope", '=FIT.LINEAR(E2:E301;B2:B301;"slope")'),
]
FIELD_TABLE = ("H24:T26", '=DESCRIBE.GROUPS(B2:B301;A2:A301)')   # 3 rows (header, 2 sites) x 13 columns

# summary: a second sheet reading the first, partly through the same ranges.
SUMMARY_CELLS = [
    ("Welch p (same cells as field.H2)", '=COMPARE.GROUPS($field.B2:B301;$field.A2:A301)'),
    ("pooled p", '=COMPARE.GROUPS($field.B2:B301;$field.A2:A301;"pooled";"p")'),
    ("intercept", '=FIT.LINEAR($field.B2:B301;$field.C2:C301;"intercept")'),
    ("whole column: SD", '=INDEX(DESCRIBE.GROUPS($field.B:B);2;6)'),
    ("open range: Kendall tau", '=RELATE.CORRELATION($field.C2:C20000;$field.B2:B20000;"kendall";"estimate")'),
    ("formula cells: probe mean difference", '=COMPARE.GROUPS($field.E2:E301;$field.A2:A301;;"estimate")'),
]

# lab: other data at the same addresses, read by the same formula texts as field.
LAB_CELLS = FIELD_CELLS[:1] + FIELD_CELLS[6:7] + FIELD_CELLS[14:15] + FIELD_CELLS[17:18] + FIELD_CELLS[19:20]


def survey(seed):
    """Invented readings: a site, oxygen falling with temperature, a probe that reads oxygen x 22 mV."""
    rng = random.Random(seed)
    rows = []
    for i in range(ROWS):
        site = "upstream" if rng.random() < 0.5 else "downstream"
        temperature = round(rng.uniform(6.0, 22.0), 1)
        oxygen = round((11.5 if site == "upstream" else 11.2) - 0.2 * temperature + rng.gauss(0.0, 0.45), 2)
        millivolts = round(oxygen * 22.0 + rng.gauss(0.0, 4.0), 1)
        rows.append([site, oxygen, temperature, millivolts])
    for i in (16, 151, 305):      # a field sheet's gaps: a reading not taken
        rows[i][1] = "n/a"
    return rows


def fill_sheet(sheet, rows, cells, table=None):
    sheet.getCellRangeByPosition(0, 0, 3, ROWS).setDataArray(tuple([tuple(HEADER[:4])] + [tuple(r) for r in rows]))
    sheet.getCellByPosition(4, 0).setString(HEADER[4])
    sheet.getCellRangeByPosition(4, 1, 4, ROWS).setFormulaArray(tuple(("=D%d/22" % (r + 1),) for r in range(1, ROWS + 1)))
    sheet.getCellByPosition(6, 0).setString("result")
    for i, (label, formula) in enumerate(cells):
        sheet.getCellByPosition(6, i + 1).setString(label)
        sheet.getCellByPosition(7, i + 1).setFormula(formula)
    if table:
        sheet.getCellRangeByName(table[0]).setArrayFormula(table[1])


def build_workbook(office, path, seed):
    """The workbook every case starts from, stored as .ods."""
    doc = office.new_calc()
    try:
        sheets = doc.Sheets
        sheets.getByIndex(0).setName("field")
        sheets.insertNewByName("summary", 1)
        sheets.insertNewByName("lab", 2)
        fill_sheet(sheets.getByName("field"), survey(seed), FIELD_CELLS, FIELD_TABLE)
        fill_sheet(sheets.getByName("lab"), survey(seed + 1000), LAB_CELLS)
        summary = sheets.getByName("summary")
        for i, (label, formula) in enumerate(SUMMARY_CELLS):
            summary.getCellByPosition(0, i + 1).setString(label)
            summary.getCellByPosition(1, i + 1).setFormula(formula)
        doc.calculateAll()
        doc.storeToURL(file_url(path), props(FilterName="calc8"))
    finally:
        doc.close(True)


# --- reading and the fresh computation ------------------------------------------------------------

def used_block(sheet):
    cursor = sheet.createCursor()
    cursor.gotoEndOfUsedArea(False)
    end = cursor.getRangeAddress()
    return sheet.getCellRangeByPosition(0, 0, end.EndColumn, end.EndRow)


def a1(column, row):
    name = ""
    column += 1
    while column:
        column, rest = divmod(column - 1, 26)
        name = chr(65 + rest) + name
    return "%s%d" % (name, row + 1)


def read_formula_cells(doc, prefix="", shift=0):
    """{sheet: [(address, formula, value)]} for every formula cell, in reading order. A Quadrat cell
    is read one by one through the cell (Calc interprets a dirty cell when it is read); Calc's own
    formula cells (the probe column) through getDataArray. `prefix` and `shift`: the fresh copy's
    sheets are named prefix + name and its cells sit `shift` columns right (see fresh_computation);
    addresses are given as in the original."""
    out = {}
    for name in doc.Sheets.getElementNames():
        if not name.startswith(prefix) or name == prefix + "spare":
            continue
        sheet = doc.Sheets.getByName(name)
        block = used_block(sheet)
        formulas = block.getFormulaArray()
        cells = []
        for r, row in enumerate(formulas):
            for c, f in enumerate(row[shift:], start=shift):
                if QUADRAT in f:
                    cells.append((a1(c - shift, r), f, harness.Value.of(sheet.getCellByPosition(c, r))))
        data = block.getDataArray()
        for r, row in enumerate(formulas):
            for c, f in enumerate(row[shift:], start=shift):
                if f.startswith("=") and QUADRAT not in f:
                    v = data[r][c]
                    cells.append((a1(c - shift, r), f, ("number", v) if isinstance(v, float) else
                                  (("text", v) if v != "" else ("blank", None))))
        out[name[len(prefix):]] = cells
    return out


def quadrat_values(snapshot, sheet):
    return [v for _, f, v in snapshot[sheet] if QUADRAT in f]


FRESH = "fresh_"


def fresh_computation(office, doc):
    """The same formulas over the same values, computed in a new document. So that nothing can be
    shared with `doc` whatever a store of decoded ranges were keyed by (document, sheet index or
    name, address), the copy also has a spare sheet in front, its sheets renamed, and a column
    inserted on the left of each (Calc moves the references along)."""
    fresh = office.new_calc()
    try:
        fresh.enableAutomaticCalculation(False)
        names = doc.Sheets.getElementNames()
        fresh.Sheets.getByIndex(0).setName(FRESH + "spare")
        for i, name in enumerate(names, start=1):
            fresh.Sheets.insertNewByName(name, i)
        for name in names:
            source = doc.Sheets.getByName(name)
            block = used_block(source)
            address = block.getRangeAddress()
            target = fresh.Sheets.getByName(name)
            target.getCellRangeByPosition(0, 0, address.EndColumn, address.EndRow).setDataArray(block.getDataArray())
            formulas = block.getFormulaArray()
            arrays = set()
            # Runs of plain formulas down a column go in with one setFormulaArray each (one call per
            # cell costs 2 ms over the bridge); array formulas once per array, over its range.
            for c in range(address.EndColumn + 1):
                run = []
                for r in range(address.EndRow + 2):
                    f = formulas[r][c] if r <= address.EndRow else ""
                    if f.startswith("{="):
                        cursor = source.createCursorByRange(source.getCellByPosition(c, r))
                        cursor.collapseToCurrentArray()
                        a = cursor.getRangeAddress()
                        key = (a.StartColumn, a.StartRow, a.EndColumn, a.EndRow)
                        if key not in arrays:
                            arrays.add(key)
                            target.getCellRangeByPosition(*key).setArrayFormula(f[1:-1])
                        f = ""
                    if f.startswith("="):
                        run.append(f)
                        continue
                    if run:
                        top = r - len(run)
                        target.getCellRangeByPosition(c, top, c, r - 1).setFormulaArray(tuple((x,) for x in run))
                        run = []
        for name in names:
            target = fresh.Sheets.getByName(name)
            target.Columns.insertByIndex(0, 1)
            target.setName(FRESH + name)
        fresh.calculateAll()
        return read_formula_cells(fresh, FRESH, 1)
    finally:
        fresh.close(True)


def differences(got, fresh, when):
    failures = []
    for sheet, cells in got.items():
        reference = {address: (f, v) for address, f, v in fresh.get(sheet, [])}
        if len(reference) != len(cells):
            failures.append("%s %s: %d formula cells, the fresh copy has %d" % (when, sheet, len(cells), len(reference)))
        for address, f, v in cells:
            if address not in reference:
                failures.append("%s %s.%s %s: not in the fresh copy" % (when, sheet, address, f))
                continue
            want = reference[address][1]
            if not harness.agrees(v, want, TOLERANCE):
                failures.append("%s %s.%s %s: shows %s, a fresh computation gives %s (tolerance %g)" % (
                    when, sheet, address, f, harness.show(v), harness.show(want), TOLERANCE))
    return failures


def same_values(a, b):
    return len(a) == len(b) and all(harness.agrees(x, y, TOLERANCE) for x, y in zip(a, b))


# --- a case: one document (or two) and its steps ------------------------------------------------------

class Book:
    """An open workbook in a case, with the Quadrat values of its last step."""

    def __init__(self, case, path, label):
        self.case = case
        self.label = label
        self.doc = case.office.load(path)
        self.doc.calculateAll()
        self.last = read_formula_cells(self.doc)

    @property
    def field(self):
        return self.doc.Sheets.getByName("field")

    @property
    def lab(self):
        return self.doc.Sheets.getByName("lab")

    def cell(self, address):
        sheet, _, cell = address.rpartition(".")
        return self.doc.Sheets.getByName(sheet or "field").getCellRangeByName(cell)

    def step(self, label, changed=(), same=(), recalculate=True):
        """Compares every formula cell with a fresh computation, as read and after calculateAll();
        the Quadrat cells of the sheets in `changed` must differ from the last step (else the
        step tests nothing), those of `same` must not."""
        where = "%s%s" % (self.label + ": " if self.label else "", label)
        as_read = read_formula_cells(self.doc)
        fresh = fresh_computation(self.case.office, self.doc)
        failures = differences(as_read, fresh, where + ", as read:")
        if recalculate:
            self.doc.calculateAll()
            failures += differences(read_formula_cells(self.doc), fresh, where + ", after calculateAll:")
        for sheet in changed:
            if same_values(quadrat_values(as_read, sheet), quadrat_values(self.last, sheet)):
                failures.append("%s: no Quadrat cell on %s changed; the step tests nothing" % (where, sheet))
        for sheet in same:
            if not same_values(quadrat_values(as_read, sheet), quadrat_values(self.last, sheet)):
                failures.append("%s: Quadrat cells on %s changed, and nothing they read did" % (where, sheet))
        self.case.failures += failures
        self.last = as_read
        return as_read

    def close(self):
        if self.doc is not None:
            self.doc.close(True)
            self.doc = None


class Case:
    def __init__(self, office, workbooks, scratch):
        self.office = office
        self.workbooks = workbooks
        self.scratch = scratch
        self.failures = []
        self.books = []

    def open(self, which="first", label=""):
        book = Book(self, self.workbooks[which], label)
        self.books.append(book)
        return book

    def expect(self, condition, text):
        if not condition:
            self.failures.append(text)

    def close(self):
        for book in self.books:
            book.close()


CASES = []


def case(function):
    CASES.append((function.__name__.replace("_", " "), function))
    return function


FIELD = ("field", "summary")     # the sheets whose Quadrat cells read field's cells


def set_row(sheet, row, site, oxygen, temperature, millivolts):
    """Types one survey row (1-based `row`), the probe column as its formula."""
    sheet.getCellRangeByPosition(0, row - 1, 3, row - 1).setDataArray(((site, oxygen, temperature, millivolts),))
    sheet.getCellByPosition(4, row - 1).setFormula("=D%d/22" % row)


# --- the cases ----------------------------------------------------------------------------------------
# Expectations name what the edit must do to the Quadrat cells; the values themselves are always
# those of the fresh computation (common practice, no source).

@case
def typed_edit(c):
    book = c.open()
    book.cell("B10").setValue(14.2)                      # a number typed over a reading: changes
    book.step("number typed in B10", changed=FIELD, same=("lab",))
    book.cell("B11").setString("n/a")                    # a reading struck out: changes
    book.step("n/a typed in B11", changed=FIELD, same=("lab",))
    book.cell("A12").setString("upstream" if book.cell("A12").getString() == "downstream" else "downstream")
    book.step("site label retyped in A12", changed=FIELD, same=("lab",))
    book.cell("B13").setFormula("=C13/2")                # the value range now holds a formula cell
    book.step("formula typed in B13", changed=FIELD, same=("lab",))
    book.cell("C13").setValue(book.cell("C13").getValue() + 9.0)   # what that formula reads: changes B13
    book.step("C13 edited, read by the formula in B13", changed=FIELD, same=("lab",))


@case
def paste_block(c):
    book = c.open()
    block = tuple((round(6.0 + 0.1 * i, 2), round(25.0 - 0.2 * i, 1)) for i in range(20))
    book.field.getCellRangeByName("B40:C59").setDataArray(block)    # a block pasted over B and C: changes
    book.step("setDataArray over B40:C59", changed=FIELD, same=("lab",))


@case
def paste_clipboard(c):
    """A real paste: the controller's transferable of lab.B2:C21 inserted at field.B60."""
    book = c.open()
    controller = book.doc.getCurrentController()
    controller.select(book.lab.getCellRangeByName("B2:C21"))
    transferable = controller.getTransferable()
    controller.select(book.field.getCellRangeByName("B60"))
    controller.insertTransferable(transferable)
    c.expect(book.cell("B60").getValue() == book.cell("lab.B2").getValue(), "the paste did not reach field.B60")
    book.step("lab.B2:C21 pasted at B60", changed=FIELD, same=("lab",))


@case
def undo_and_redo(c):
    book = c.open()
    start = book.last
    old = book.cell("B10").getValue()
    book.cell("B10").setValue(old + 7.5)
    edited = book.step("B10 edited", changed=FIELD, same=("lab",))
    undo = book.doc.getUndoManager()
    undo.undo()
    c.expect(book.cell("B10").getValue() == old, "undo did not bring B10 back (%r, was %r)" % (book.cell("B10").getValue(), old))
    undone = book.step("undo", changed=FIELD, same=("lab",))
    c.expect(all(same_values(quadrat_values(undone, s), quadrat_values(start, s)) for s in FIELD),
             "after undo the Quadrat cells differ from before the edit")
    undo.redo()
    c.expect(book.cell("B10").getValue() == old + 7.5, "redo did not bring the edit back")
    redone = book.step("redo", changed=FIELD, same=("lab",))
    c.expect(all(same_values(quadrat_values(redone, s), quadrat_values(edited, s)) for s in FIELD),
             "after redo the Quadrat cells differ from after the edit")
    # A structural edit undone: row 50 deleted (changes), then restored (back to the start).
    book.field.Rows.removeByIndex(49, 1)
    book.step("row 50 deleted", changed=FIELD, same=("lab",))
    undo.undo()
    book.step("row deletion undone", changed=FIELD, same=("lab",))
    undo.undo()
    undone = book.step("edit of B10 undone too", changed=FIELD, same=("lab",))
    c.expect(all(same_values(quadrat_values(undone, s), quadrat_values(start, s)) for s in FIELD),
             "after both undos the Quadrat cells differ from the start")


@case
def insert_row_inside(c):
    book = c.open()
    book.field.Rows.insertByIndex(100, 1)     # an empty row in the ranges: a blank row is not data, nothing changes
    book.step("empty row inserted at 101", same=FIELD + ("lab",))
    set_row(book.field, 101, "upstream", 3.1, 21.5, 68.2)    # filled: inside every range, changes
    book.step("row 101 filled", changed=FIELD, same=("lab",))


@case
def insert_row_above(c):
    book = c.open()
    book.field.Rows.insertByIndex(1, 1)       # between the header and the data: the ranges move down, nothing changes
    book.step("empty row inserted at 2", same=FIELD + ("lab",))
    set_row(book.field, 2, "downstream", 15.9, 4.0, 350.0)   # inside B:B only (bounded ranges start at row 3 now): changes
    book.step("row 2 filled", changed=FIELD, same=("lab",))
    book.cell("B3").setValue(2.5)              # the first row of the moved ranges: changes
    book.step("B3 edited", changed=FIELD, same=("lab",))


@case
def insert_row_below(c):
    book = c.open()
    book.field.Rows.insertByIndex(BOUNDED, 1)  # row 302, below B2:B301, inside B:B and B2:B20000: nothing changes
    book.step("empty row inserted at 302", same=FIELD + ("lab",))
    set_row(book.field, BOUNDED + 1, "downstream", 19.5, 5.0, 429.0)   # changes the whole-column and open ranges
    book.step("row 302 filled", changed=FIELD, same=("lab",))


@case
def delete_row_inside(c):
    book = c.open()
    book.field.Rows.removeByIndex(49, 1)       # a reading gone: changes
    book.step("row 50 deleted", changed=FIELD, same=("lab",))
    book.cell("B50").setValue(1.5)             # the range after it shrank: changes
    book.step("B50 edited", changed=FIELD, same=("lab",))


@case
def delete_row_above(c):
    book = c.open()
    book.field.Rows.removeByIndex(0, 1)        # the header row: the data move up, same numbers, nothing changes
    book.step("header row deleted", same=FIELD + ("lab",))
    book.cell("B1").setValue(16.0)             # the first row of the moved ranges: changes
    book.step("B1 edited", changed=FIELD, same=("lab",))


@case
def delete_row_below(c):
    book = c.open()
    book.field.Rows.removeByIndex(BOUNDED + 2, 1)   # row 304, below B2:B301, inside B:B: changes the whole column
    book.step("row 304 deleted", changed=FIELD, same=("lab",))
    book.cell("B300").setValue(15.0)                # inside every range: changes
    book.step("B300 edited", changed=FIELD, same=("lab",))


@case
def sort_rows(c):
    book = c.open()
    key = TableSortField()
    key.Field = 2                  # temperature
    key.IsAscending = False
    descriptor = props(SortFields=uno.Any("[]com.sun.star.table.TableSortField", (key,)), ContainsHeader=False)
    uno.invoke(book.field.getCellRangeByName("A2:E%d" % (ROWS + 1)), "sort", (descriptor,))
    # Rows 302..311 mix into B2:B301 and row 6's residual moves: changes.
    book.step("rows sorted by temperature, descending", changed=FIELD, same=("lab",))


@case
def clear(c):
    book = c.open()
    book.field.getCellRangeByName("B100:B120").clearContents(VALUE | STRING)   # 21 readings gone: changes
    book.step("B100:B120 cleared", changed=FIELD, same=("lab",))


@case
def fill_down(c):
    book = c.open()
    column = book.field.getCellRangeByName("B200:B215")
    before = column.getDataArray()
    column.fillAuto(TO_BOTTOM, 1)             # B200 filled down (Calc adds 1 a row): changes
    c.expect(column.getDataArray()[1:] != before[1:], "fill down left B201:B215 as they were")
    book.step("B200 filled down to B215", changed=FIELD, same=("lab",))


@case
def cut_and_paste_from_another_sheet(c):
    book = c.open()
    field_index = 0
    target = CellAddress(field_index, 1, 1)   # field.B2
    book.field.moveRange(target, book.lab.getCellRangeByName("B2:B21").getRangeAddress())
    # field's B2:B21 now hold lab's readings, lab's are gone: both change.
    book.step("lab.B2:B21 moved to field.B2", changed=FIELD + ("lab",))
    book.field.copyRange(CellAddress(field_index, 1, 29), book.lab.getCellRangeByName("B30:C49").getRangeAddress())
    book.step("lab.B30:C49 copied to field.B30", changed=FIELD, same=("lab",))


@case
def edit_on_another_sheet(c):
    book = c.open()
    book.cell("lab.B5").setValue(30.0)        # lab only, at an address field's ranges also hold: field's cells must not change
    book.step("lab.B5 edited", changed=("lab",), same=FIELD)
    book.cell("lab.B40").setString("n/a")
    book.step("lab.B40 struck out", changed=("lab",), same=FIELD)
    book.cell("summary.D2").setValue(1.0)     # a cell nothing reads: no change anywhere
    book.step("summary.D2 typed", same=FIELD + ("lab",))


@case
def save_and_reload(c):
    book = c.open()
    book.cell("B10").setValue(13.0)
    saved = book.step("B10 edited", changed=FIELD, same=("lab",))
    path = os.path.join(c.scratch, "saved.ods")
    book.doc.storeToURL(file_url(path), props(FilterName="calc8"))
    book.close()
    book.doc = c.office.load(path)
    book.step("reloaded, as stored", same=FIELD + ("lab",))      # same values as saved
    book.doc.calculateAll()
    book.step("reloaded, after calculateAll", same=FIELD + ("lab",))
    c.expect(all(same_values(quadrat_values(book.last, s), quadrat_values(saved, s)) for s in FIELD),
             "after reload the Quadrat cells differ from before saving")
    book.cell("B20").setValue(2.0)            # the reloaded document still follows edits: changes
    book.step("B20 edited after reload", changed=FIELD, same=("lab",))


@case
def automatic_recalculation_off_and_on(c):
    book = c.open()
    book.doc.enableAutomaticCalculation(False)
    book.cell("B10").setValue(15.5)
    book.doc.calculate()                      # recomputes what is dirty: changes
    book.step("B10 edited with automatic recalculation off, calculate()", changed=FIELD, same=("lab",), recalculate=False)
    book.cell("B11").setValue(1.5)
    book.doc.calculate()
    book.step("B11 edited, calculate()", changed=FIELD, same=("lab",), recalculate=False)
    book.doc.enableAutomaticCalculation(True)  # turned on again: nothing left to change
    book.step("automatic recalculation on again", same=FIELD + ("lab",))
    book.cell("B12").setValue(16.5)           # read without calculate: changes
    book.step("B12 edited with automatic recalculation on", changed=FIELD, same=("lab",))


@case
def hard_recalculation(c):
    book = c.open()
    book.doc.calculateAll()                   # nothing edited: nothing changes
    book.step("calculateAll with no edit", same=FIELD + ("lab",))
    book.cell("B10").setValue(1.0)
    book.cell("A20").setString("upstream" if book.cell("A20").getString() == "downstream" else "downstream")
    book.doc.calculateAll()                   # after edits: changes
    book.step("B10 and A20 edited, calculateAll", changed=FIELD, same=("lab",))


@case
def two_documents_same_sheet_names(c):
    one = c.open("first", "document 1")
    two = c.open("second", "document 2")      # same sheets and formulas, other data
    c.expect(not same_values(quadrat_values(one.last, "field"), quadrat_values(two.last, "field")),
             "the two documents show the same values; their data differ")
    one.cell("B10").setValue(14.0)            # document 1 changes, document 2 must not
    one.step("B10 edited", changed=FIELD, same=("lab",))
    two.step("B10 edited in document 1", same=FIELD + ("lab",))
    two.cell("B10").setValue(14.0)            # the same edit in document 2: now it changes, document 1 not
    two.step("B10 edited", changed=FIELD, same=("lab",))
    one.step("B10 edited in document 2", same=FIELD + ("lab",))


@case
def edit_read_by_a_formula_range(c):
    book = c.open()
    before = book.last
    book.cell("D100").setValue(book.cell("D100").getValue() + 150.0)   # E100 = D100/22 follows: cells over E change
    after = book.step("D100 edited, read by E100", changed=FIELD, same=("lab",))
    cells = [(address, f) for address, f, _ in before["field"] if QUADRAT in f]
    moved = [address for (address, f), x, y in zip(cells, quadrat_values(before, "field"), quadrat_values(after, "field"))
             if not harness.agrees(x, y, TOLERANCE)]
    # Only the cells over E2:E301 read D100's consequence; the others read B, C and A.
    c.expect(moved and all(("E2:E301" in f) for address, f in cells if address in moved),
             "cells not over E changed: %s" % moved)


@case
def append_row_below_the_used_area(c):
    book = c.open()
    set_row(book.field, ROWS + 2, "upstream", 17.5, 3.0, 385.0)   # row 312: B:B and B2:B20000 grow, changes
    book.step("row 312 appended", changed=FIELD, same=("lab",))
    set_row(book.field, ROWS + 3, "downstream", 0.5, 24.0, 11.0)  # and one more
    book.step("row 313 appended", changed=FIELD, same=("lab",))


def no_replace_warning(office):
    """Pasting over filled cells asks "replace the contents?" in a dialog; headless, with no one to
    answer, soffice 7.4 goes down inside insertTransferable. Turned off in the throwaway profile."""
    provider = office.context.ServiceManager.createInstanceWithContext(
        "com.sun.star.configuration.ConfigurationProvider", office.context)
    access = provider.createInstanceWithArguments("com.sun.star.configuration.ConfigurationUpdateAccess",
                                                  props(nodepath="/org.openoffice.Office.Calc/Input"))
    access.setPropertyValue("ReplaceCellsWarning", False)
    access.commitChanges()


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--oxt", required=True, help="the built extension (build/quadrat.oxt)")
    parser.add_argument("--verbose", "-v", action="store_true", help="print passing cases too")
    parser.add_argument("cases", nargs="*", help="run only these cases (names with _ or spaces)")
    args = parser.parse_args()
    harness.VERBOSE = args.verbose
    wanted = {n.replace("_", " ") for n in args.cases}
    cases = [(n, f) for n, f in CASES if not wanted or n in wanted]
    if wanted - {n for n, _ in cases}:
        parser.error("no such case: %s" % ", ".join(sorted(wanted - {n for n, _ in CASES})))
    started = time.time()
    run = harness.Run()
    print("live edits: %d cases, every formula cell against a fresh computation after each step" % len(cases))
    with Office() as office, tempfile.TemporaryDirectory(prefix="quadrat-live-edits-") as scratch:
        office.start()
        office.install(args.oxt)
        no_replace_warning(office)
        workbooks = {"first": os.path.join(scratch, "survey.ods"), "second": os.path.join(scratch, "survey2.ods")}
        build_workbook(office, workbooks["first"], 1)
        build_workbook(office, workbooks["second"], 2)
        for name, function in cases:
            one = Case(office, workbooks, scratch)
            t = time.time()
            try:
                function(one)
            except Exception as e:  # a case that breaks is a failure, not the end of the run
                one.failures.append("%s: %s" % (type(e).__name__, e))
                if args.verbose:
                    traceback.print_exc()
            finally:
                try:
                    one.close()
                except Exception:
                    pass
            failures = one.failures
            if len(failures) > MOST_LINES and not args.verbose:
                failures = failures[:MOST_LINES] + ["... and %d more (-v shows all)" % (len(failures) - MOST_LINES)]
            run.record("%s (%.1f s)" % (name, time.time() - t) if args.verbose else name, failures)
            if not office.alive():
                run.record("soffice after %s" % name, ["the office process died"])
                break
        run.record("soffice still alive at the end", [] if office.alive() else ["the office process is gone"])
    print("(%.0f s)" % (time.time() - started))
    print("%d passed, %d failed" % (run.passed, run.failed))
    return 1 if run.failed else 0


if __name__ == "__main__":
    sys.exit(main())
