#!/usr/bin/python3
"""Office tests: the extension in real cells of a headless LibreOffice Calc.

    /usr/bin/python3 tests/office/run_office_tests.py --oxt build/quadrat.oxt [workbook.fods ...]

Installs the .oxt into a private, throwaway profile (tools/quadrat_sheets/office.py), then for every
workbook (default: tests/office/*.fods):
  1. load, calculateAll(), and compare every row of its `checks` sheet (see README.md);
  2. store it as .ods, reload, recompute: every check must give the same value again;
  3. type each single-cell Quadrat formula again with its display name (=DESCRIBE.GROUPS(…))
     through setFormula beside the original: same value, stored under the service name;
and once: every shipped function is known to the function wizard with its texts (from the
.oxt's CalcAddIns.xcu), and soffice is still alive at the end.
Prints one line per failure naming workbook, sheet, cell and formula, then `N passed, N failed`;
exits non-zero on any failure.
"""

import argparse
import glob
import math
import os
import re
import sys
import tempfile
import time
import xml.etree.ElementTree as ET
import zipfile

import uno

from quadrat_sheets.office import Office, file_url, props

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))

DEFAULT_TOLERANCE = 1e-12   # relative, when a number's tolerance cell is blank
FORMULA_RESULT_VALUE = 1    # com.sun.star.sheet.FormulaResult
FORMULA_RESULT_STRING = 2
FORMULA_RESULT_ERROR = 4
STORED_PREFIX = "ORG.QUADRAT.FUNCTIONS."

# Calc's names for its error codes (the same table as src/addin/uno/component.cpp).
ERROR_NAMES = {532: "#DIV/0!", 519: "#VALUE!", 524: "#REF!", 525: "#NAME?", 503: "#NUM!", 521: "#NULL!",
               32767: "#N/A"}
ERROR_TEXT = re.compile(r"^(#DIV/0!|#VALUE!|#REF!|#NAME\?|#NUM!|#NULL!|#N/A|Err:\d+)$")


def error_name(code):
    return ERROR_NAMES.get(code, "Err:%d" % code)


class Value:
    """What a cell shows: ('blank', None), ('number', x), ('text', s) or ('error', name)."""

    @staticmethod
    def of(cell):
        code = cell.getError()
        if code:
            return ("error", error_name(code))
        kind = cell.getType().value
        if kind == "EMPTY":
            return ("blank", None)
        if kind == "VALUE":
            return ("number", cell.getValue())
        if kind == "TEXT":
            s = cell.getString()
            return ("blank", None) if s == "" else ("text", s)
        result = cell.getPropertyValue("FormulaResultType2")
        if result == FORMULA_RESULT_VALUE:
            return ("number", cell.getValue())
        s = cell.getString()
        return ("blank", None) if s == "" else ("text", s)


def show(value):
    kind, v = value
    if kind == "blank":
        return "(blank)"
    if kind == "number":
        return repr(v)
    if kind == "error":
        return v
    return '"%s"' % v


def agrees(got, expected, tolerance):
    """Numbers within a relative tolerance (absolute when the expected value is 0); texts, blanks
    and errors exactly. An expected text that is an error name (#DIV/0!, Err:504) expects that
    error in the cell."""
    if expected[0] == "text" and ERROR_TEXT.match(expected[1]):
        expected = ("error", expected[1])
    if got[0] != expected[0]:
        return False
    if got[0] == "number":
        if not math.isfinite(got[1]):
            return False
        return abs(got[1] - expected[1]) <= tolerance * (abs(expected[1]) if expected[1] != 0 else 1.0)
    return got[1] == expected[1]


def resolve(doc, address):
    """'field.D1' or 'field.D1:M4' → cell range object."""
    sheet_name, _, cells = address.rpartition(".")
    sheet_name = sheet_name.lstrip("$")
    if not doc.Sheets.hasByName(sheet_name):
        raise KeyError("no sheet %r" % sheet_name)
    return doc.Sheets.getByName(sheet_name).getCellRangeByName(cells)


def formula_of(cell_range):
    cell = cell_range.getCellByPosition(0, 0)
    array = cell_range.getArrayFormula() if hasattr(cell_range, "getArrayFormula") else ""
    return "{%s}" % array if array else cell.getFormula()


class Check:
    def __init__(self, row, result, expected_cell, tolerance_cell, source):
        self.row = row              # 1-based row in `checks`
        self.result = result        # address text
        self.expected_cell = expected_cell
        self.tolerance_cell = tolerance_cell
        self.source = source


def read_checks(doc):
    if not doc.Sheets.hasByName("checks"):
        return None
    sheet = doc.Sheets.getByName("checks")
    cursor = sheet.createCursor()
    cursor.gotoEndOfUsedArea(False)
    last_row = cursor.getRangeAddress().EndRow
    checks = []
    for r in range(1, last_row + 1):  # row 0 is the header
        result = sheet.getCellByPosition(0, r).getString().strip()
        if not result:
            continue
        checks.append(Check(r + 1, result, sheet.getCellByPosition(1, r), sheet.getCellByPosition(2, r),
                            sheet.getCellByPosition(3, r).getString()))
    return checks


def evaluate(doc, check):
    """→ (list of failure texts, snapshot of the values read)."""
    tolerance_value = Value.of(check.tolerance_cell)
    tolerance = tolerance_value[1] if tolerance_value[0] == "number" else DEFAULT_TOLERANCE
    try:
        result = resolve(doc, check.result)
    except Exception as e:
        return ["checks row %d: cannot find %s (%s)" % (check.row, check.result, e)], None
    formula = formula_of(result)
    expected_value = Value.of(check.expected_cell)
    if expected_value[0] == "text" and expected_value[1].startswith("block "):
        expected_range = resolve(doc, expected_value[1][len("block "):].strip())
    else:
        expected_range = None
    rows = result.getRows().getCount()
    columns = result.getColumns().getCount()
    if expected_range is None and (rows, columns) != (1, 1):
        return ["checks row %d: %s is a block; write `block <sheet>.<range>` as expected" % (check.row, check.result)], None
    if expected_range is not None and (expected_range.getRows().getCount(), expected_range.getColumns().getCount()) != (rows, columns):
        return ["checks row %d: expected block %s has not the shape of %s" % (check.row, expected_value[1], check.result)], None
    failures = []
    snapshot = []
    sheet_name = check.result.rpartition(".")[0]
    for r in range(rows):
        for c in range(columns):
            cell = result.getCellByPosition(c, r)
            got = Value.of(cell)
            snapshot.append(got)
            want = Value.of(expected_range.getCellByPosition(c, r)) if expected_range is not None else expected_value
            if not agrees(got, want, tolerance):
                address = cell.AbsoluteName.split(".")[-1].replace("$", "")
                within = "tolerance %g; " % tolerance if want[0] == "number" else ""
                failures.append("%s.%s %s: got %s, expected %s (%s%s)" % (
                    sheet_name, address, formula, show(got), show(want), within, check.source or "no source given"))
    return failures, snapshot


def shipped_functions(oxt):
    """method → (display name, description, [parameter display names]) from the .oxt's CalcAddIns.xcu."""
    ns = {"oor": "http://openoffice.org/2001/registry"}
    name = "{%s}name" % ns["oor"]
    with zipfile.ZipFile(oxt) as z:
        root = ET.fromstring(z.read("CalcAddIns.xcu"))
    functions = {}
    for node in root.iter("node"):
        if node.get(name) != "AddInFunctions":
            continue
        for f in node.findall("node"):
            texts = {p.get(name): p.findtext("value") for p in f.findall("prop")}
            # The wizard shows each parameter's DisplayName (the catalogue's name), not its node name
            # (the IDL name, the same word for every argument of the catalogue today).
            params = [next((v.findtext("value") for v in p.findall("prop") if v.get(name) == "DisplayName"), p.get(name))
                      for p in f.find("node").findall("node")] if f.find("node") is not None else []
            functions[f.get(name)] = (texts.get("DisplayName"), texts.get("Description"), params)
    return functions


class Run:
    def __init__(self):
        self.passed = 0
        self.failed = 0

    def record(self, name, failures):
        if failures:
            self.failed += 1
            print("FAIL %s" % name)
            for f in failures:
                print("     " + f)
        else:
            self.passed += 1
            if VERBOSE:
                print("ok   %s" % name)


VERBOSE = False


def check_wizard(office, functions, run):
    """Every shipped function reaches the function wizard under its display name, in the
    Statistical category, with its description and parameter names."""
    descriptions = office.context.ServiceManager.createInstanceWithContext(
        "com.sun.star.sheet.FunctionDescriptions", office.context)
    known = {}
    for i in range(descriptions.getCount()):
        d = {p.Name: p.Value for p in descriptions.getByIndex(i)}
        known[d["Name"]] = d
    statistical = uno.getConstantByName("com.sun.star.sheet.FunctionCategory.STATISTICAL")
    for method, (display, description, params) in sorted(functions.items()):
        failures = []
        d = known.get(display)
        if d is None:
            failures.append("%s (%s) is not in the function list" % (display, method))
        else:
            if d["Category"] != statistical:
                failures.append("%s: category %s, expected Statistical" % (display, d["Category"]))
            if d["Description"] != description:
                failures.append("%s: description %r differs from the registry's" % (display, d["Description"]))
            names = [a.Name for a in d["Arguments"]]
            if names != params:
                failures.append("%s: parameters %s, expected %s" % (display, names, params))
        run.record("wizard %s" % display, failures)


def retype_with_display_names(doc, checks, functions, run, workbook):
    """Types each single-cell Quadrat formula again as a person would (=DESCRIBE.GROUPS(…)) in a
    free cell of the same sheet, and compares with the stored formula's value."""
    display_of = {method.upper(): display for method, (display, _, _) in functions.items()}
    stored = re.compile(re.escape(STORED_PREFIX) + r"([A-Z]+)\(")
    typed_cells = []  # (check, original cell, spare cell, typed text)
    used_end = {}
    taken = set()
    for check in checks:
        try:
            result = resolve(doc, check.result)
        except Exception:
            continue
        if result.getRows().getCount() != 1 or result.getColumns().getCount() != 1:
            continue
        cell = result.getCellByPosition(0, 0)
        formula = cell.getFormula()
        if STORED_PREFIX not in formula or formula.startswith("{"):
            continue
        typed = stored.sub(lambda m: display_of.get(m.group(1), m.group(1)) + "(", formula)
        sheet = result.getSpreadsheet()
        name = sheet.getName()
        if name not in used_end:
            cursor = sheet.createCursor()
            cursor.gotoEndOfUsedArea(False)
            used_end[name] = cursor.getRangeAddress().EndColumn
        # Same row, right of the used area: the used rows, and so every clipped A:A, stay as they are.
        row = result.getRangeAddress().StartRow
        column = used_end[name] + 2
        while (name, row, column) in taken:
            column += 1
        taken.add((name, row, column))
        spare = sheet.getCellByPosition(column, row)
        spare.setFormula(typed)
        typed_cells.append((check, cell, spare, typed, formula))
    if not typed_cells:
        return
    doc.calculateAll()
    failures = []
    for check, cell, spare, typed, formula in typed_cells:
        got, want = Value.of(spare), Value.of(cell)
        if spare.getFormula() != formula:
            failures.append("%s: typed %s was stored as %s" % (check.result, typed, spare.getFormula()))
        if not agrees(got, want, 0.0):
            failures.append("%s: typed %s gives %s, the stored formula %s" % (check.result, typed, show(got), show(want)))
        spare.setFormula("")
    run.record("%s: %d formulas typed with display names" % (workbook, len(typed_cells)), failures)


def run_workbook(office, path, functions, run, scratch):
    name = os.path.basename(path)
    started = time.time()
    doc = office.load(path)
    if doc is None:
        run.record("%s: load" % name, ["could not be loaded"])
        return
    try:
        doc.calculateAll()
        checks = read_checks(doc)
        if not checks:
            run.record("%s: checks" % name, ["no `checks` sheet, or it is empty (see tests/office/README.md)"])
            return
        first = []
        for check in checks:
            failures, snapshot = evaluate(doc, check)
            first.append(snapshot)
            run.record("%s: %s" % (name, check.result), failures)

        # Save as .ods, reload, recompute: the formulas must survive under their stored names.
        ods = os.path.join(scratch, os.path.splitext(name)[0] + ".ods")
        doc.storeToURL(file_url(ods), props(FilterName="calc8"))
    finally:
        doc.close(True)
    reloaded = office.load(ods)
    try:
        reloaded.calculateAll()
        failures = []
        for check, before in zip(read_checks(reloaded) or [], first):
            after_failures, after = evaluate(reloaded, check)
            if after_failures:
                failures.extend("after reload: " + f for f in after_failures)
            elif before is not None and after != before:
                failures.append("after reload: %s changed from %s to %s" % (
                    check.result, [show(v) for v in before], [show(v) for v in after]))
        run.record("%s: saved as .ods, reloaded, recomputed" % name, failures)
        retype_with_display_names(reloaded, checks_for(reloaded), functions, run, name)
    finally:
        reloaded.close(True)
    if VERBOSE:
        print("     (%s: %.1f s)" % (name, time.time() - started))


def checks_for(doc):
    return read_checks(doc) or []


def main():
    global VERBOSE
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[1])
    parser.add_argument("--oxt", required=True, help="the built extension (build/quadrat.oxt)")
    parser.add_argument("--verbose", "-v", action="store_true", help="print passing checks too")
    parser.add_argument("workbooks", nargs="*", help="default: tests/office/*.fods")
    args = parser.parse_args()
    VERBOSE = args.verbose
    workbooks = args.workbooks or sorted(glob.glob(os.path.join(HERE, "*.fods")))
    functions = shipped_functions(args.oxt)
    run = Run()
    print("office tests: %d workbooks, %d functions shipped (%s)" % (
        len(workbooks), len(functions), ", ".join(sorted(d for d, _, _ in functions.values()))))
    with Office() as office, tempfile.TemporaryDirectory(prefix="quadrat-office-tests-") as scratch:
        office.start()
        office.install(args.oxt)
        check_wizard(office, functions, run)
        for path in workbooks:
            try:
                run_workbook(office, path, functions, run, scratch)
            except Exception as e:  # a broken workbook is a failure, not the end of the run
                run.record("%s" % os.path.basename(path), ["%s: %s" % (type(e).__name__, e)])
            if not office.alive():
                run.record("soffice after %s" % os.path.basename(path), ["the office process died"])
                break
        run.record("soffice still alive at the end", [] if office.alive() else ["the office process is gone"])
    print("%d passed, %d failed" % (run.passed, run.failed))
    return 1 if run.failed else 0


if __name__ == "__main__":
    sys.exit(main())
