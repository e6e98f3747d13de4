"""Recalculation in headless Calc, for tools/benchmark.py (run with Debian's /usr/bin/python3).

A sheet holds 2·N + pad filled rows (fixed seed, N = 100,000): B and C two sites' oxygen
readings (wide form, N rows), D the same 2·N values stacked with their site in A (long form,
readings interleaved), E a response for a regression on B. Each formula is set in a few cells
over ranges shifted by a row (so that no two cells share data and neither the store of read
ranges nor the result cache can answer them); before each timed calculate() one data cell inside
every range gets a new value, so every recalculation computes, as after a typed edit. The fastest
recalculation, less that of the same sheet without formulas, divided by the cells: the cost of
one formula.

Then many cells over the same ranges (one read and one computation per method shared by all),
and a workbook of 200 Quadrat cells over 10,000 rows, stored, reopened in a fresh office and
recomputed.
"""

import os
import random
import shutil
import sys
import tempfile
import time

from quadrat_sheets.office import Office, file_url, props

SEED = 20261202
PAD = 20  # spare rows below the data, room for the shifted copies


def fill(sheet, n):
    rng = random.Random(SEED)
    up = [round(rng.gauss(8.0, 0.8), 4) for _ in range(n + PAD)]
    down = [round(rng.gauss(7.9, 0.9), 4) for _ in range(n + PAD)]
    y = [round(2.0 + 0.5 * u + rng.gauss(0.0, 0.7), 4) for u in up]
    wide = [("oxygen up", "oxygen down", "")] + [(u, d, "") for u, d in zip(up, down)]
    long = [("site", "oxygen")]
    for u, d in zip(up, down):
        long.append(("upstream", u))
        long.append(("downstream", d))
    sheet.getCellRangeByPosition(1, 0, 3, len(wide) - 1).setDataArray(tuple(wide))
    sheet.getCellRangeByPosition(4, 0, 4, len(y)).setDataArray(tuple([("response",)] + [(v,) for v in y]))
    labels = tuple((s,) for s, _ in long)
    values = tuple((v,) for _, v in long)
    sheet.getCellRangeByPosition(0, 0, 0, len(long) - 1).setDataArray(labels)
    sheet.getCellRangeByPosition(3, 0, 3, len(long) - 1).setDataArray(values)


class Poker:
    """Gives one data cell inside every shifted range a new value: the next recalculation computes."""

    def __init__(self, sheet):
        self.sheet = sheet
        self.rng = random.Random(7)

    def __call__(self):
        for column in (1, 2, 3, 4):
            self.sheet.getCellByPosition(column, 40).setValue(round(self.rng.gauss(8.0, 0.8), 4))


def recalc(doc, poke, repeat, hard=False):
    """Fastest of `repeat` recalculations. After a poke: calculate(), which computes the cells the
    edit made dirty, as Calc does after a typed edit; `hard`: calculateAll(), every formula cell."""
    best = float("inf")
    for _ in range(repeat):
        if poke:
            poke()
        start = time.perf_counter()
        if hard:
            doc.calculateAll()
        else:
            doc.calculate()
        best = min(best, time.perf_counter() - start)
    return best


def place(sheet, formulas):
    """Sets each (formula, rows, columns) side by side from column K; array formulas where wider than a cell."""
    cells = []
    column = 10
    for text, rows, columns in formulas:
        if rows == 1 and columns == 1:
            cell = sheet.getCellByPosition(column, 0)
            cell.setFormula(text)
        else:
            cell = sheet.getCellRangeByPosition(column, 0, column + columns - 1, rows - 1)
            cell.setArrayFormula(text)
        cells.append((cell, rows, columns))
        column += columns + 1
    return cells


def clear(sheet, cells):
    for cell, rows, columns in cells:
        if rows == 1 and columns == 1:
            cell.setFormula("")
        else:
            cell.setArrayFormula("")


def top_left(sheet, cells):
    """What the first cell shows (for arrays the second row's second cell: a number), for the log."""
    cell, rows, columns = cells[0]
    return (cell if rows == 1 and columns == 1 else cell.getCellByPosition(1, 1)).getString()


def per_formula(doc, sheet, make, copies, repeat, baseline, poke):
    formulas = [make(k) for k in range(copies)]
    cells = place(sheet, formulas)
    doc.calculateAll()
    check = top_left(sheet, cells)
    seconds = max(recalc(doc, poke, repeat) - baseline, 0.0) / copies
    clear(sheet, cells)
    return seconds * 1000.0, check


def cases(n):
    """(label, maker of the k-th shifted copy) for N rows; the long form holds the same 2N values."""
    def wide(k):
        return "B%d:C%d" % (2 + k, n + 1 + k)

    def col(c, k):
        return "%s%d:%s%d" % (c, 2 + k, c, n + 1 + k)

    def long_values(k):
        return "D%d:D%d" % (2 + 2 * k, 2 * n + 1 + 2 * k)

    def long_labels(k):
        return "A%d:A%d" % (2 + 2 * k, 2 * n + 1 + 2 * k)

    return [
        ("Calc T.TEST(up; down; 2; 3)", lambda k: ("=T.TEST(%s;%s;2;3)" % (col("B", k), col("C", k)), 1, 1)),
        ("COMPARE.GROUPS(up:down;) wide, welch", lambda k: ("=COMPARE.GROUPS(%s;)" % wide(k), 1, 1)),
        ("COMPARE.GROUPS(values; site) long, welch, 2N rows",
         lambda k: ("=COMPARE.GROUPS(%s;%s)" % (long_values(k), long_labels(k)), 1, 1)),
        ("Calc LINEST(y; x; 1; 1), 5×2 array", lambda k: ("=LINEST(%s;%s;1;1)" % (col("E", k), col("B", k)), 5, 2)),
        ("FIT.LINEAR(y; x), 3×8 array", lambda k: ("=FIT.LINEAR(%s;%s)" % (col("E", k), col("B", k)), 3, 8)),
        ("Calc AVERAGE(up)", lambda k: ("=AVERAGE(%s)" % col("B", k), 1, 1)),
        ("DESCRIBE.GROUPS(up), 2×10 array", lambda k: ("=DESCRIBE.GROUPS(%s)" % col("B", k), 2, 10)),
    ]


RATIOS = [
    ("COMPARE.GROUPS wide / T.TEST", "COMPARE.GROUPS(up:down;) wide, welch", "Calc T.TEST(up; down; 2; 3)"),
    ("COMPARE.GROUPS long / T.TEST", "COMPARE.GROUPS(values; site) long, welch, 2N rows", "Calc T.TEST(up; down; 2; 3)"),
    ("FIT.LINEAR / LINEST", "FIT.LINEAR(y; x), 3×8 array", "Calc LINEST(y; x; 1; 1), 5×2 array"),
    ("DESCRIBE.GROUPS / AVERAGE", "DESCRIBE.GROUPS(up), 2×10 array", "Calc AVERAGE(up)"),
]


def seam_section(office, sizes, repeat):
    doc = office.new_calc()
    sheet = doc.Sheets.getByIndex(0)
    fill(sheet, max(sizes))
    poke = Poker(sheet)
    baseline = recalc(doc, poke, repeat)
    figures = {}
    for n in sizes:
        copies = 4 if n <= 10000 else 2
        for label, make in cases(n):
            ms, check = per_formula(doc, sheet, make, copies, repeat, baseline, poke)
            figures[(label, n)] = ms
            print("  calc %-52s N=%-7d %9.2f ms  (%s)" % (label, n, ms, check[:30]), file=sys.stderr)

    # Many cells over the same ranges (the store of read ranges and the result cache): one cell,
    # the eight outputs of one method, and three methods × eight outputs over one long column pair.
    n = max(sizes)
    values, labels = "D2:D%d" % (2 * n + 1), "A2:A%d" % (2 * n + 1)
    outputs = ["p", "statistic", "df", "n", "estimate", "ci-low", "ci-high", "effect"]
    methods = ["welch", "pooled", "ranks"]
    shared = [
        ("1 cell (welch p)", [("welch", "p")]),
        ("3 cells (p of welch, pooled, ranks)", [(m, "p") for m in methods]),
        ("8 cells (welch, 8 outputs)", [("welch", o) for o in outputs]),
        ("24 cells (3 methods × 8 outputs)", [(m, o) for m in methods for o in outputs]),
    ]
    hard_baseline = recalc(doc, None, repeat, hard=True)
    many = {}
    for label, asks in shared:
        cells = place(sheet, [('=COMPARE.GROUPS(%s;%s;"%s";"%s")' % (values, labels, m, o), 1, 1) for m, o in asks])
        doc.calculateAll()
        many[(label, "edited")] = (recalc(doc, poke, repeat) - baseline) * 1000.0
        many[(label, "hard")] = (recalc(doc, None, repeat, hard=True) - hard_baseline) * 1000.0
        clear(sheet, cells)
    doc.close(True)

    print("\n### 3. Recalculation in headless Calc (per formula)\n")
    print("Fastest of %d recalculations (calculate) after an edit inside the ranges (so no cache can answer), less the"
          " sheet without formulas (%.1f ms), divided by the cells; each cell over its own rows." % (repeat, baseline * 1000))
    print("Wide form: two columns of N readings; long form: the same 2N readings stacked in one column"
          " beside their site labels.\n")
    print("| formula | " + " | ".join("N = %dk" % (n // 1000) for n in sizes) + " |")
    print("| --- |" + " --- |" * len(sizes))
    for label, _ in cases(sizes[0]):
        print("| %s | %s |" % (label, " | ".join("%.2f ms" % figures[(label, n)] for n in sizes)))
    print("\n| ratio (target: two-group test within 2× of T.TEST) | " + " | ".join("N = %dk" % (n // 1000) for n in sizes) + " |")
    print("| --- |" + " --- |" * len(sizes))
    for name, a, b in RATIOS:
        cells = []
        for n in sizes:
            denominator = figures[(b, n)]
            cells.append("%.1f×" % (figures[(a, n)] / denominator) if denominator > 0.005 else
                         "%.2f ms vs < 0.01 ms" % figures[(a, n)])
        print("| %s | %s |" % (name, " | ".join(cells)))
    print("\nMany cells over the same long pair, COMPARE.GROUPS(%s;%s;method;output), N = %dk (2N rows):\n"
          % (values, labels, n // 1000))
    print("| cells | after an edit (calculate) | × one cell | hard recalculation, nothing changed (calculateAll) |")
    print("| --- | --- | --- | --- |")
    one = many[(shared[0][0], "edited")]
    for label, _ in shared:
        print("| %s | %.1f ms | %.1f× | %.1f ms |" % (label, many[(label, "edited")], many[(label, "edited")] / one,
                                                   many[(label, "hard")]))


# --- the 200-cell workbook ------------------------------------------------------------------------

ROWS = 10000


def field_sheet(sheet):
    """An invented survey: 10,000 rows of sites, banks, zones, readings, pairs, presence, species."""
    rng = random.Random(SEED + 1)
    sites = ["alder creek", "birch run", "cedar brook", "dunlin marsh"]
    banks = ["left", "right"]
    zones = ["riffle", "pool", "run"]
    species = ["dace", "minnow", "sculpin", "trout"]
    data = [("site", "bank", "zone", "oxygen", "temperature", "conductivity", "before", "after", "present",
             "species", "depth")]
    for i in range(ROWS):
        s, b, z = rng.randrange(4), rng.randrange(2), rng.randrange(3)
        temperature = rng.gauss(12 + s * 0.5, 2)
        oxygen = 11 - 0.2 * temperature + 0.1 * b + 0.05 * z + rng.gauss(0, 0.6)
        before = rng.gauss(7.5, 1)
        present = 1 if rng.random() < 1 / (1 + 2.718281828 ** (-(-3 + 0.25 * temperature))) else 0
        data.append((sites[s], banks[b], zones[z], round(oxygen, 3), round(temperature, 2),
                     round(rng.lognormvariate(5.5, 0.3), 1), round(before, 3), round(before + rng.gauss(0.1, 0.5), 3),
                     present, species[(s + rng.randrange(3)) % 4], round(rng.uniform(0.1, 2.5), 2)))
    sheet.getCellRangeByPosition(0, 0, 10, ROWS).setDataArray(tuple(data))


def workbook_formulas():
    r = lambda c: "$%s$2:$%s$%d" % (c, c, ROWS + 1)  # noqa: E731
    f = []
    for v in "DEFK":
        for m in ("welch", "pooled", "ranks"):
            for o in ("p", "statistic", "estimate", "ci-low", "ci-high", "effect"):
                f.append('=COMPARE.GROUPS(%s;%s;"%s";"%s")' % (r(v), r("B"), m, o))
            for o in ("p", "statistic", "n"):
                f.append('=COMPARE.GROUPS(%s;%s;"%s";"%s")' % (r(v), r("A"), m, o))
        for m in ("anderson-darling", "lilliefors", "dagostino-pearson", "jarque-bera"):
            f.append('=CHECK.NORMAL(%s;%s;"%s";"p")' % (r(v), r("A"), m))
        for m in ("brown-forsythe", "levene", "bartlett", "fligner"):
            f.append('=CHECK.VARIANCE(%s;%s;"%s";"p")' % (r(v), r("A"), m))
    for m in ("t", "signed-rank", "sign"):
        for o in ("p", "statistic", "estimate", "ci-low", "ci-high"):
            f.append('=COMPARE.PAIRED(%s;%s;"%s";"%s")' % (r("G"), r("H"), m, o))
    for x, y in (("D", "E"), ("D", "F"), ("E", "K")):
        for m in ("pearson", "spearman", "kendall"):
            for o in ("p", "estimate"):
                f.append('=RELATE.CORRELATION(%s;%s;"%s";"%s")' % (r(x), r(y), m, o))
    xs = "$E$2:$F$%d" % (ROWS + 1)
    for o in ("r-squared", "p", "residual-sd"):
        f.append('=FIT.LINEAR(%s;%s;"%s")' % (r("D"), xs, o))
    f.append("=INDEX(FIT.LINEAR(%s;%s);3;2)" % (r("D"), xs))
    for o in ("slope", "intercept", "r-squared", "p"):
        f.append('=FIT.LINEAR(%s;%s;"%s")' % (r("D"), r("E"), o))
    for row, column in ((2, 2), (3, 2), (3, 5)):
        f.append("=INDEX(FIT.LOGISTIC(%s;%s);%d;%d)" % (r("I"), xs, row, column))
    for o in ("p-factor1", "p-factor2", "p-interaction"):
        f.append('=FIT.FACTORIAL(%s;%s;%s;"%s")' % (r("D"), r("B"), r("C"), o))
    for m in ("chi-square", "g"):
        for o in ("p", "statistic", "effect"):
            f.append('=COMPARE.COUNTS(%s;%s;"%s";"%s")' % (r("A"), r("J"), m, o))
    for row, column in ((2, 3), (3, 3), (4, 4), (5, 6)):
        f.append("=INDEX(DESCRIBE.GROUPS(%s;%s);%d;%d)" % (r("D"), r("A"), row, column))
    for row in (2, 3, 4):
        f.append('=INDEX(COMPARE.POSTHOC(%s;%s;"tukey");%d;6)' % (r("D"), r("A"), row))
    return f


def workbook_section(office, oxt, repeat):
    formulas = workbook_formulas()
    folder = tempfile.mkdtemp(prefix="quadrat-bench-ods-")
    path = os.path.join(folder, "survey-200.ods")
    try:
        doc = office.new_calc()
        data = doc.Sheets.getByIndex(0)
        field_sheet(data)
        doc.Sheets.insertNewByName("results", 1)
        results = doc.Sheets.getByName("results")
        for i, text in enumerate(formulas):
            results.getCellByPosition(1, i).setFormula(qualify(text))
        doc.calculateAll()
        answers = [results.getCellByPosition(1, i) for i in range(len(formulas))]
        texts = [(formulas[i], c.getString()) for i, c in enumerate(answers)
                 if c.getError() == 0 and not _is_number(c.getString())]
        errors = [(formulas[i], c.getString()) for i, c in enumerate(answers) if c.getError() != 0]
        doc.storeToURL(file_url(path), props(FilterName="calc8"))
        doc.close(True)

        # A fresh office: nothing cached, the library not loaded yet.
        office.stop()
        office.start()
        start = time.perf_counter()
        doc = office.desktop.loadComponentFromURL(file_url(path), "_blank", 0, props(Hidden=True))
        opened = time.perf_counter() - start
        start = time.perf_counter()
        doc.calculateAll()
        first = time.perf_counter() - start
        unchanged = recalc(doc, None, repeat, hard=True)
        data = doc.Sheets.getByIndex(0)
        rng = random.Random(11)

        def poke():  # one new reading in every data column: every Quadrat cell computes again
            for column in range(3, 11):
                if column != 9:
                    data.getCellByPosition(column, 5000).setValue(round(rng.uniform(0.5, 1.5), 2) if column != 8 else
                                                                  rng.randrange(2))
        edited = recalc(doc, poke, repeat)
        doc.close(True)
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    print("\n### 4. A workbook of %d Quadrat cells over %d rows (target: recomputed in < 2 s)\n" % (len(formulas), ROWS))
    print("| step | time |")
    print("| --- | --- |")
    print("| open the stored .ods in a fresh office | %.2f s |" % opened)
    print("| first calculateAll (loads the add-in, computes every cell) | %.2f s |" % first)
    print("| calculate after a new reading in every data column (fastest of %d) | %.2f s |" % (repeat, edited))
    print("| calculateAll (hard recalculation), data unchanged (fastest of %d) | %.2f s |" % (repeat, unchanged))
    print("\n%d cells answered a number, %d text (refusals), %d an error." % (
        len(formulas) - len(texts) - len(errors), len(texts), len(errors)))
    for f, t in (texts + errors)[:10]:
        print("  %s → %s" % (f, t[:80]))


def qualify(text):
    """References to the data sheet from the results sheet."""
    import re
    return re.sub(r"\$([A-K])\$(\d+):\$([A-K])\$(\d+)", r"$Sheet1.$\1$\2:$\3$\4", text)


def _is_number(s):
    try:
        float(s.replace(",", ""))
        return True
    except ValueError:
        return False


def run(oxt, sizes=(10000, 100000), repeat=5):
    with Office() as office:
        office.start()
        office.install(oxt)
        seam_section(office, list(sizes), repeat)
        workbook_section(office, oxt, repeat)
