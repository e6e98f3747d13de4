#!/usr/bin/python3
"""The main job's office part: open each sample sheet in a headless Calc with the extension,
recompute, print the Quadrat results of every sheet as a text table, and write a PDF per sheet.

    /usr/bin/python3 tools/main_job.py --oxt build/quadrat.oxt --out out sample_sheets/*.fods

The extension goes into a throwaway private profile (tools/quadrat_sheets/office.py): your own
LibreOffice profile and installation are not touched.
"""

import argparse
import os
import re
import subprocess
import sys
import xml.etree.ElementTree as ET
import zipfile

import uno
from com.sun.star.beans import PropertyValue

from make_sample_sheets import cut_cells, short_sentences
from quadrat_sheets.cells import column_name
from quadrat_sheets.office import Office, file_url, props

STORED_PREFIX = "ORG.QUADRAT.FUNCTIONS."
FORMULA = 16  # com.sun.star.sheet.CellFlags.FORMULA
ERROR_NAMES = {532: "#DIV/0!", 519: "#VALUE!", 524: "#REF!", 525: "#NAME?", 503: "#NUM!", 521: "#NULL!",
               32767: "#N/A"}


def display_names(oxt):
    """ORG.QUADRAT.FUNCTIONS.DESCRIBEGROUPS → DESCRIBE.GROUPS, from the .oxt's CalcAddIns.xcu."""
    name = "{http://openoffice.org/2001/registry}name"
    with zipfile.ZipFile(oxt) as z:
        root = ET.fromstring(z.read("CalcAddIns.xcu"))
    names = {}
    for node in root.iter("node"):
        if node.get(name) == "AddInFunctions":
            for f in node.findall("node"):
                display = [p.findtext("value") for p in f.findall("prop") if p.get(name) == "DisplayName"]
                names[STORED_PREFIX + f.get(name).upper()] = display[0] if display else f.get(name)
    return names


def readable(formula, names):
    return re.sub(re.escape(STORED_PREFIX) + r"[A-Z]+", lambda m: names.get(m.group(0), m.group(0)), formula)


def shown(cell):
    """The cell's value as the sheet shows it (in its number format), errors by name."""
    code = cell.getError()
    if code:
        return ERROR_NAMES.get(code, "Err:%d" % code)
    return cell.getString()


def address_text(a):
    start = "%s%d" % (column_name(a.StartColumn), a.StartRow + 1)
    if a.StartRow == a.EndRow and a.StartColumn == a.EndColumn:
        return start
    return "%s:%s%d" % (start, column_name(a.EndColumn), a.EndRow + 1)


def quadrat_results(sheet):
    """Each Quadrat formula of the sheet (an array formula once, as its block), in reading order."""
    found = []
    seen = set()
    ranges = sheet.queryContentCells(FORMULA)
    for block in ranges.getRangeAddresses():
        for r in range(block.StartRow, block.EndRow + 1):
            for c in range(block.StartColumn, block.EndColumn + 1):
                if (r, c) in seen:
                    continue
                cell = sheet.getCellByPosition(c, r)
                formula = cell.getFormula()
                if STORED_PREFIX not in formula:
                    continue
                if formula.startswith("{"):
                    cursor = sheet.createCursorByRange(cell)
                    cursor.collapseToCurrentArray()
                    a = cursor.getRangeAddress()
                    for rr in range(a.StartRow, a.EndRow + 1):
                        for cc in range(a.StartColumn, a.EndColumn + 1):
                            seen.add((rr, cc))
                else:
                    a = cell.getRangeAddress()
                    seen.add((r, c))
                found.append((a, formula, sheet.getCellRangeByPosition(a.StartColumn, a.StartRow, a.EndColumn, a.EndRow)))
    found.sort(key=lambda f: (f[0].StartRow, f[0].StartColumn))
    return found


def grid(rows, indent="      "):
    widths = [max(len(r[c]) for r in rows) for c in range(len(rows[0]))]
    return "\n".join(indent + " | ".join(v.ljust(w) for v, w in zip(r, widths)).rstrip() for r in rows)


def error_cells(sheet):
    """Addresses and names of the cells of the sheet's used area that show an error."""
    cursor = sheet.createCursor()
    cursor.gotoStartOfUsedArea(False)
    cursor.gotoEndOfUsedArea(True)
    a = cursor.getRangeAddress()
    found = []
    for r in range(a.StartRow, a.EndRow + 1):
        for c in range(a.StartColumn, a.EndColumn + 1):
            code = sheet.getCellByPosition(c, r).getError()
            if code:
                found.append("%s%d %s" % (column_name(c), r + 1, ERROR_NAMES.get(code, "Err:%d" % code)))
    return found


def layout_problems(doc, sheet):
    """Error cells, cut labels or numbers and sentences taller than their cells, as lines of text."""
    lines = ["    error: %s" % e for e in error_cells(sheet)]
    for address, text, need, have in cut_cells(doc, sheet):
        lines.append("    cut: %s %r needs %.1f cm, has %.1f cm" % (address, text[:50], need, have))
    for address, text, need, have in short_sentences(doc, sheet):
        lines.append("    cut: %s %r needs %.1f cm of height, has %.1f cm" % (address, text[:50], need, have))
    return lines


def report_sheet(sheet, names):
    results = quadrat_results(sheet)
    if not results:
        return None
    lines = ['  sheet "%s": %d Quadrat formulas' % (sheet.getName(), len(results))]
    for address, formula, cells in results:
        a = address
        values = [[shown(cells.getCellByPosition(c, r)) for c in range(a.EndColumn - a.StartColumn + 1)]
                  for r in range(a.EndRow - a.StartRow + 1)]
        text = readable(formula, names)
        if len(values) == 1 and len(values[0]) == 1:
            lines.append("    %-8s %s  →  %s" % (address_text(a), text, values[0][0]))
        else:
            lines.append("    %-8s %s" % (address_text(a), text))
            lines.append(grid(values))
    return "\n".join(lines)


def export_pdf(doc, sheet, path):
    """One PDF of the sheet's used area as the workbook lays it out (its own column widths and
    number formats), landscape, one page wide (changed in the open copy only; the workbook file
    is not written)."""
    cursor = sheet.createCursor()
    cursor.gotoStartOfUsedArea(False)
    cursor.gotoEndOfUsedArea(True)
    # Down to the last row that shows something: array blocks read far below the data (so that a
    # new season's rows are included) and would otherwise print pages of empty rows.
    a = cursor.getRangeAddress()
    shown_rows = [j for j, row in enumerate(sheet.getCellRangeByPosition(
        a.StartColumn, a.StartRow, a.EndColumn, a.EndRow).getDataArray()) if any(v != "" for v in row)]
    if shown_rows:
        cursor = sheet.getCellRangeByPosition(a.StartColumn, a.StartRow, a.EndColumn, a.StartRow + shown_rows[-1])
    style = doc.StyleFamilies.getByName("PageStyles").getByName(sheet.PageStyle)
    if not style.IsLandscape:
        width, height = style.Width, style.Height
        style.IsLandscape = True
        style.Width, style.Height = max(width, height), min(width, height)
    style.ScaleToPagesX = 1
    style.ScaleToPagesY = 0
    selection = PropertyValue()
    selection.Name = "Selection"
    selection.Value = cursor
    doc.storeToURL(file_url(path), props(
        FilterName="calc_pdf_Export",
        FilterData=uno.Any("[]com.sun.star.beans.PropertyValue", (selection,))))


def export_png(pdf, png):
    """The first page of a sheet's PDF as a PNG (poppler's pdftoppm), for the README's pictures."""
    stem = os.path.splitext(png)[0]
    subprocess.run(["pdftoppm", "-png", "-singlefile", "-f", "1", "-l", "1", "-r", "110", pdf, stem], check=True)


def main():
    parser = argparse.ArgumentParser(description="recompute the sample sheets, print results, write PDFs")
    parser.add_argument("--oxt", required=True)
    parser.add_argument("--out", default="out")
    parser.add_argument("--images", help="also write the first page of each workbook's first sheet "
                        "to IMAGES/<workbook>.png (e.g. docs/images)")
    parser.add_argument("workbooks", nargs="+")
    args = parser.parse_args()
    os.makedirs(args.out, exist_ok=True)
    names = display_names(args.oxt)
    problems = layout = 0
    with Office() as office:
        office.start()
        office.install(args.oxt)
        for path in args.workbooks:
            doc = office.load(path)
            if doc is None:
                print("%s: could not be loaded" % path)
                problems += 1
                continue
            try:
                doc.calculateAll()
                stem = os.path.splitext(os.path.basename(path))[0]
                print("\n%s" % os.path.basename(path))
                for index, sheet in enumerate([doc.Sheets.getByIndex(i) for i in range(doc.Sheets.getCount())]):
                    text = report_sheet(sheet, names)
                    if text:
                        print(text)
                    problems_here = layout_problems(doc, sheet)
                    if problems_here:  # reported for a person to fix in the generator; the job goes on
                        print("\n".join(problems_here))
                        layout += len(problems_here)
                    pdf = os.path.join(args.out, "%s-%s.pdf" % (stem, re.sub(r"[^\w.-]+", "_", sheet.getName())))
                    export_pdf(doc, sheet, pdf)
                    print("    → %s" % pdf)
                    if args.images and index == 0:
                        os.makedirs(args.images, exist_ok=True)
                        png = os.path.join(args.images, stem + ".png")
                        export_png(pdf, png)
                        print("    → %s" % png)
            finally:
                doc.close(True)
        alive = office.alive()
    if layout:
        print("%d cells show an error or a cut label or number (listed above)" % layout)
    if not alive:
        print("soffice did not survive the run")
        problems += 1
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
