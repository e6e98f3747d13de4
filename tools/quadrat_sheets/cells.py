"""Cell addresses in A1 notation, as every workbook script writes and reads them."""

import re


def column_name(c):
    """0 → 'A', 26 → 'AA': a sheet's column letters."""
    letters = ""
    c += 1
    while c:
        c, rest = divmod(c - 1, 26)
        letters = chr(65 + rest) + letters
    return letters


def cell_address(row, column):
    """(11, 1) → 'B12', from 0-based row and column."""
    return "%s%d" % (column_name(column), row + 1)


def cell_position(ref):
    """'B12' → (row 11, column 1)."""
    m = re.fullmatch(r"([A-Z]+)(\d+)", ref)
    if not m:
        raise ValueError("not a cell address: %r" % ref)
    column = 0
    for ch in m.group(1):
        column = column * 26 + (ord(ch) - 64)
    return int(m.group(2)) - 1, column - 1
