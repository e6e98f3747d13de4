"""FIT.LINEAR beside Calc's own LINEST on the 11 NIST StRD linear-regression sets, in real cells.

Run with /usr/bin/python3 (Debian's python3-uno provides the `uno` module):

    /usr/bin/python3 tools/compare_linest.py --oxt build/quadrat.oxt --markdown docs/accuracy-linest.md

For each set in tests/data/nist-strd/linreg/ a sheet of one new hidden Calc document gets y and
the predictor columns: Longley its six columns; the polynomial sets (Pontius degree 2, Filip degree
10, Wampler1–5 degree 5) x, x², …, x^k computed here by repeated binary64 multiplication, the same
numbers tests/core/strd_linreg_test.cpp hands to the core; Norris and NoInt1/2 the single x. Then
`=LINEST(y; X; 1; 1)` (NoInt1/2: `=LINEST(y; X; 0; 1)`) and `=FIT.LINEAR(y; X)` are entered as array
formulas, the document is recomputed, and the cells are read back.

Per set and per function the table gives the smallest log relative error (LRE) over the
coefficients and over their standard errors, capped at 15; where the certified value is 0 (the
Wampler1/2 standard deviations) the log absolute error −log10|computed| is used, as the StRD README
says. LINEST's first row holds the coefficients in reverse column order with the intercept last,
its second row their standard errors. FIT.LINEAR always fits an intercept, so the no-intercept sets
are not run through it in cells (tests/core/strd_linreg_test.cpp covers that model in the core).
The ceiling column is the README's binary64 ceiling (coefficients / their SDs). The README takes
the powers of x correctly rounded; the cells hold repeated products, so the script also solves the
least-squares problem on the cells' own doubles in 100-digit mpmath (python3-mpmath) and adds a note
under the table where that exact answer scores 0.2 or more away from the README's ceiling (Filip).
"""

import argparse
import math
import os
import re
import sys

from quadrat_sheets.cells import column_name
from quadrat_sheets.office import Office

HERE = os.path.dirname(os.path.abspath(__file__))

STRD = os.path.join(HERE, "..", "tests", "data", "nist-strd")
SETS = ["Norris", "Pontius", "NoInt1", "NoInt2", "Filip", "Longley",
        "Wampler1", "Wampler2", "Wampler3", "Wampler4", "Wampler5"]
CAP = 15.0
NO_INTERCEPT = "n/a in cells (core test covers the no-intercept model)"


# --- the NIST files ------------------------------------------------------------------------
def read_set(name):
    """Certified B0.. estimates and SDs (found by keyword in the header), and the data rows."""
    estimate, sd, rows = [], [], []
    with open(os.path.join(STRD, "linreg", name + ".dat")) as f:
        for number, line in enumerate(f, start=1):
            words = line.split()
            if not words:
                continue  # blank lines, and Norris's line of spaces after the data
            if number < 61:
                if len(words) == 3 and re.fullmatch(r"B\d+", words[0]):
                    estimate.append(float(words[1]))
                    sd.append(float(words[2]))
            else:
                rows.append([float(w) for w in words])
    return estimate, sd, rows


def ceilings():
    """The README's binary64 ceilings for linear regression: {set: (coefficients, SDs)}."""
    with open(os.path.join(STRD, "README.md"), encoding="utf-8") as f:
        text = f.read()
    section = text[text.index("Linear regression — smallest"):]
    out = {}
    for name, values in re.findall(r"\|\s*(\w+)\s*\|\s*([\d.]+(?:\s*/\s*[\d.]+){3})", section):
        parts = [float(v) for v in values.split("/")]
        out.setdefault(name, (parts[0], parts[1]))
    return out


def design(name, certified_terms, rows):
    """y and the predictor columns, as tests/core/strd_linreg_test.cpp builds them."""
    y = [row[0] for row in rows]
    if name == "Longley":
        xs = [[row[j] for row in rows] for j in range(1, 7)]
    else:
        degree = 1 if name.startswith("NoInt") else certified_terms - 1
        xs = [[] for _ in range(degree)]
        for row in rows:
            power = 1.0
            for d in range(degree):
                power *= row[1]  # binary64 product, in the same order as the core test
                xs[d].append(power)
    return y, xs


def exact_answer(name, certified_terms, rows, digits=100):
    """Least squares in `digits`-digit arithmetic on the very doubles the cells hold: the smallest
    LRE of its coefficients and SDs is the ceiling for these columns (the README's ceiling takes
    the powers of x correctly rounded; the cells hold repeated binary64 products)."""
    import mpmath as mp
    mp.mp.dps = digits
    y, xs = design(name, certified_terms, rows)
    intercept = [] if name.startswith("NoInt") else [1]
    X = mp.matrix([intercept + [mp.mpf(x[i]) for x in xs] for i in range(len(y))])
    Y = mp.matrix([mp.mpf(v) for v in y])
    inverse = mp.inverse(X.T * X)
    b = inverse * (X.T * Y)
    residual = Y - X * b
    s2 = sum(r ** 2 for r in residual) / (len(y) - X.cols)
    se = [mp.sqrt(s2 * inverse[j, j]) for j in range(X.cols)]
    return [float(v) for v in b], [float(v) for v in se]


def lre(computed, certified):
    error = abs(computed) if certified == 0 else abs(computed - certified) / abs(certified)
    if error == 0:
        return CAP
    return min(CAP, -math.log10(error))


# --- the cells ------------------------------------------------------------------------------
def cell_content(cell):
    """A number, a text, or ('error', code) for what a formula cell shows."""
    if cell.getError():
        return ("error", cell.getError())
    text = cell.getString()
    try:
        value = cell.getValue()
    except Exception:
        value = None
    # A formula cell that shows text has value 0; tell them apart by the text.
    formula_result = cell.FormulaResultType2 if hasattr(cell, "FormulaResultType2") else None
    if formula_result is not None and formula_result == 2:  # com.sun.star.sheet.FormulaResult.STRING
        return text
    return value


def fill_sheet(sheet, y, xs):
    """Header row (y, x1, …), then the data from row 2; returns the last data row (0-based)."""
    header = tuple(["y"] + ["x%d" % (j + 1) for j in range(len(xs))])
    data = [header] + [tuple([y[i]] + [x[i] for x in xs]) for i in range(len(y))]
    sheet.getCellRangeByPosition(0, 0, len(xs), len(y)).setDataArray(tuple(data))
    return len(y)


def run_set(doc, index, name, certified, ceiling):
    estimate, sd, rows = certified
    y, xs = design(name, len(estimate), rows)
    no_intercept = name.startswith("NoInt")
    sheets = doc.getSheets()
    sheets.insertNewByName(name, index)
    sheet = sheets.getByName(name)
    last = fill_sheet(sheet, y, xs)
    k = len(xs)
    y_data = "A2:A%d" % (last + 1)
    x_data = "B2:%s%d" % (column_name(k), last + 1)
    y_named = "A1:A%d" % (last + 1)
    x_named = "B1:%s%d" % (column_name(k), last + 1)
    left = k + 2  # one blank column after the data

    linest = sheet.getCellRangeByPosition(left, 0, left + k, 4)  # 5 rows × (k + 1) columns
    linest.setArrayFormula("=LINEST(%s;%s;%d;1)" % (y_data, x_data, 0 if no_intercept else 1))
    fit = None
    if not no_intercept:
        fit = sheet.getCellRangeByPosition(left, 6, left + 7, 6 + k + 1)  # header + (k + 1) terms, 8 columns
        fit.setArrayFormula("=FIT.LINEAR(%s;%s)" % (y_named, x_named))
    doc.calculateAll()

    # LINEST: row 1 = b_k … b_1, intercept; row 2 = their standard errors.
    got_b, got_se = [], []
    for j in range(1, k + 1):
        column = k - j
        got_b.append(cell_content(linest.getCellByPosition(column, 0)))
        got_se.append(cell_content(linest.getCellByPosition(column, 1)))
    if not no_intercept:
        got_b.insert(0, cell_content(linest.getCellByPosition(k, 0)))
        got_se.insert(0, cell_content(linest.getCellByPosition(k, 1)))
    result = {"set": name, "ceiling": ceiling, "linest": score(got_b, got_se, estimate, sd)}
    exact_b, exact_se = exact_answer(name, len(estimate), rows)
    result["exact"] = score(exact_b, exact_se, estimate, sd)

    if fit is None:
        result["fit"] = None
    else:
        header = [cell_content(fit.getCellByPosition(c, 0)) for c in range(3)]
        if header[1:] != ["coefficient", "SE"]:
            result["fit"] = "FIT.LINEAR gave %r in its header row" % (header,)
        else:
            got_b = [cell_content(fit.getCellByPosition(1, 1 + j)) for j in range(k + 1)]
            got_se = [cell_content(fit.getCellByPosition(2, 1 + j)) for j in range(k + 1)]
            terms = [cell_content(fit.getCellByPosition(0, 1 + j)) for j in range(k + 1)]
            result["terms"] = terms
            result["fit"] = score(got_b, got_se, estimate, sd)
    return result


def score(got_b, got_se, estimate, sd):
    """(smallest LRE over coefficients, over SEs), or a text saying what the cells held."""
    bad = [v for v in got_b + got_se if not isinstance(v, float)]
    if bad:
        return "cells held %r" % (bad[0],)
    return (min(lre(g, c) for g, c in zip(got_b, estimate)),
            min(lre(g, c) for g, c in zip(got_se, sd)))


# --- the table ------------------------------------------------------------------------------
def cells_of(outcome):
    if outcome is None:
        return [NO_INTERCEPT, NO_INTERCEPT]
    if isinstance(outcome, str):
        return [outcome, outcome]
    return ["%.1f" % outcome[0], "%.1f" % outcome[1]]


def table(results):
    lines = ["| set | LINEST coef | LINEST SE | FIT.LINEAR coef | FIT.LINEAR SE | ceiling (coef / SE) |",
             "| --- | ---: | ---: | ---: | ---: | ---: |"]
    for r in results:
        ceiling = "%.1f / %.1f" % r["ceiling"] if r["ceiling"] else "?"
        lines.append("| " + " | ".join([r["set"]] + cells_of(r["linest"]) + cells_of(r["fit"]) + [ceiling]) + " |")
    return "\n".join(lines)


def main():
    parser = argparse.ArgumentParser(description="LRE of Calc's LINEST and Quadrat's FIT.LINEAR on NIST StRD linreg")
    parser.add_argument("--oxt", default=os.path.join(HERE, "..", "build", "quadrat.oxt"))
    parser.add_argument("--markdown", metavar="FILE", help="also write the table to FILE")
    args = parser.parse_args()

    limits = ceilings()
    results = []
    with Office() as office:
        office.start()
        office.install(args.oxt)
        doc = office.new_calc()
        try:
            for index, name in enumerate(SETS):
                results.append(run_set(doc, index, name, read_set(name), limits.get(name)))
        finally:
            doc.close(True)
        alive = office.alive()
    text = table(results)
    notes = ["%s: %.1f / %.1f" % ((r["set"],) + r["exact"]) for r in results
             if r["ceiling"] and max(abs(a - b) for a, b in zip(r["exact"], r["ceiling"])) >= 0.2]
    if notes:
        text += ("\n\nThe polynomial columns in the cells are repeated binary64 products (as in the core tests); "
                 "where the README's ceiling (correctly rounded powers) differs by 0.2 or more, the exact "
                 "least-squares answer on the cells' own doubles (100-digit mpmath) scores: " + "; ".join(notes) + ".")
    print(text)
    for r in results:
        if "terms" in r and r["terms"][0] != "intercept":
            print("note: %s FIT.LINEAR term column reads %r" % (r["set"], r["terms"]))
    if args.markdown:
        with open(args.markdown, "w", encoding="utf-8") as f:
            f.write("# FIT.LINEAR and Calc's LINEST on the NIST StRD linear-regression sets\n\n")
            f.write("Smallest log relative error (digits, capped at 15) over the coefficients and over their "
                    "standard errors, measured in headless Calc cells against the certified values; "
                    "ceiling = what binary64 inputs allow (tests/data/nist-strd/README.md).\n\n")
            f.write("Produced by tools/compare_linest.py with the built extension: "
                    "`/usr/bin/python3 tools/compare_linest.py --oxt build/quadrat.oxt "
                    "--markdown docs/accuracy-linest.md`\n\n")
            f.write(text + "\n")
    if not alive:
        print("soffice did not survive the run")
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
