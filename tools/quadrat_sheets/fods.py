"""A small writer of flat ODF spreadsheets (.fods) for the office test workbooks.

Plain XML that diffs well; no office needed to write it. Formulas are written in OpenFormula as
a saved workbook holds them: references in brackets ([.B2:.B40], [$field.A:.A]), arguments
separated by `;`, inline arrays with `;` between columns and `|` between rows ({"a"|"b"|"a"} is
one column). A Quadrat display name (DESCRIBE.GROUPS) may be written as such: it is stored as the
office stores it, ORG.QUADRAT.FUNCTIONS.DESCRIBEGROUPS (the display name without its dots).

    book = Workbook()
    field = book.sheet("field")
    field.column("A1", ["site", "upstream", "downstream"])
    field.formula("D2", "DESCRIBE.GROUPS([.B1:.B3];[.A1:.A3])", array=(3, 10))
    book.write("tests/office/example.fods")
"""

import re
from xml.sax.saxutils import escape, quoteattr

from .cells import cell_address, cell_position

FAMILIES = ("CHECK", "COMPARE", "RELATE", "TRACK", "FIT", "LIMIT", "PLAN", "ADJUST", "DESCRIBE", "ADVISE")
_DISPLAY_NAME = re.compile(r"\b(%s)\.([A-Z]+)\(" % "|".join(FAMILIES))


def stored_formula(formula):
    """OpenFormula text as saved: `of:=` prefix, Quadrat display names as service.method."""
    formula = formula[1:] if formula.startswith("=") else formula
    return "of:=" + _DISPLAY_NAME.sub(lambda m: "ORG.QUADRAT.FUNCTIONS.%s%s(" % (m.group(1), m.group(2)), formula)


class Sheet:
    def __init__(self, name):
        self.name = name
        self.cells = {}  # (row, column) → XML of the cell

    def put(self, ref, value):
        """A number, a text, or None (an empty cell)."""
        row, column = cell_position(ref)
        if value is None:
            self.cells.pop((row, column), None)
        elif isinstance(value, bool):
            raise ValueError("write logicals as numbers 1/0: the office hands them over as numbers anyway")
        elif isinstance(value, (int, float)):
            number = repr(float(value)) if isinstance(value, float) else str(value)
            self.cells[(row, column)] = '<table:table-cell office:value-type="float" office:value="%s"/>' % number
        else:
            self.cells[(row, column)] = ('<table:table-cell office:value-type="string"><text:p>%s</text:p>'
                                         '</table:table-cell>' % escape(str(value)))

    def formula(self, ref, formula, array=None):
        """A formula; `array=(rows, columns)` enters it as an array formula over that block."""
        row, column = cell_position(ref)
        span = ""
        if array:
            span = ' table:number-matrix-rows-spanned="%d" table:number-matrix-columns-spanned="%d"' % array
        self.cells[(row, column)] = "<table:table-cell table:formula=%s%s/>" % (quoteattr(stored_formula(formula)), span)

    def row(self, ref, values):
        row, column = cell_position(ref)
        for i, v in enumerate(values):
            self.put(cell_address(row, column + i), v)

    def column(self, ref, values):
        row, column = cell_position(ref)
        for i, v in enumerate(values):
            self.put(cell_address(row + i, column), v)

    def block(self, ref, rows):
        row, column = cell_position(ref)
        for i, values in enumerate(rows):
            self.row(cell_address(row + i, column), values)

    def rows(self, ref, rows):
        """A block like `block`, in which a text starting with '=' is written as a formula."""
        row, column = cell_position(ref)
        for i, values in enumerate(rows):
            for j, v in enumerate(values):
                address = cell_address(row + i, column + j)
                if isinstance(v, str) and v.startswith("="):
                    self.formula(address, v)
                else:
                    self.put(address, v)

    def xml(self):
        out = ["  <table:table table:name=%s>" % quoteattr(self.name)]
        if self.cells:
            last_row = max(r for r, _ in self.cells)
            last_column = max(c for _, c in self.cells)
            out.append('   <table:table-column table:number-columns-repeated="%d"/>' % (last_column + 1))
            for r in range(last_row + 1):
                cells = []
                empty_run = 0
                for c in range(last_column + 1):
                    xml = self.cells.get((r, c))
                    if xml is None:
                        empty_run += 1
                        continue
                    if empty_run:
                        cells.append(_empty(empty_run))
                        empty_run = 0
                    cells.append(xml)
                if empty_run:
                    cells.append(_empty(empty_run))
                out.append("   <table:table-row>" + "".join(cells) + "</table:table-row>")
        else:
            out.append("   <table:table-column/><table:table-row><table:table-cell/></table:table-row>")
        out.append("  </table:table>")
        return "\n".join(out)


def _empty(n):
    return "<table:table-cell/>" if n == 1 else '<table:table-cell table:number-columns-repeated="%d"/>' % n


class Checks:
    """The `checks` sheet the harness reads (README.md): a header, then one row per check with the
    result's address, the expected value (a text starting with '=' is a formula), the tolerance and
    the source."""

    def __init__(self, book):
        self.sheet = book.sheet("checks")
        self.sheet.row("A1", ["result", "expected", "tolerance", "source"])
        self.next_row = 2

    def add(self, result, expected, tolerance, source):
        self.sheet.rows("A%d" % self.next_row, [[result, expected, tolerance, source]])
        self.next_row += 1

    def formula(self, sheet, ref, formula, expected, tolerance, source):
        """Types `formula` at `ref` of `sheet` and checks that one cell (add for the rest)."""
        sheet.formula(ref, formula)
        self.add("%s.%s" % (sheet.name, ref), expected, tolerance, source)


class Workbook:
    def __init__(self):
        self.sheets = []

    def sheet(self, name):
        s = Sheet(name)
        self.sheets.append(s)
        return s

    def write(self, path, comment=None):
        head = (
            '<?xml version="1.0" encoding="UTF-8"?>\n'
            + ("<!-- %s -->\n" % escape(comment) if comment else "")
            + '<office:document xmlns:office="urn:oasis:names:tc:opendocument:xmlns:office:1.0"'
            ' xmlns:table="urn:oasis:names:tc:opendocument:xmlns:table:1.0"'
            ' xmlns:text="urn:oasis:names:tc:opendocument:xmlns:text:1.0"'
            ' xmlns:of="urn:oasis:names:tc:opendocument:xmlns:of:1.2"'
            ' office:version="1.3" office:mimetype="application/vnd.oasis.opendocument.spreadsheet">\n'
            " <office:body>\n  <office:spreadsheet>\n"
        )
        body = "\n".join(s.xml() for s in self.sheets)
        tail = "\n  </office:spreadsheet>\n </office:body>\n</office:document>\n"
        with open(path, "w", encoding="utf-8") as f:
            f.write(head + body + tail)
