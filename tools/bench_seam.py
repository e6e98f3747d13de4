#!/usr/bin/python3
"""Cost at the seam: how long a Quadrat recalculation takes in headless Calc, by how the range
reaches the add-in, next to Calc's own AVERAGE and T.TEST on the same cells.

    /usr/bin/python3 tools/bench_seam.py --oxt build/quadrat.oxt [--rows 100000] [--repeat 5]

A sheet gets 100,000 filled rows (fixed seed): A a site label (upstream/downstream), B and C
numbers. For each formula, `copies` identical cells are set, calculateAll() is timed `repeat`
times, and the fastest run, less the fastest run of the sheet without formulas, is divided by the
copies: the cost of one call. The fastest run, not the median, because on a shared machine the
other runs measure the neighbours. Compared:
  DESCRIBE.GROUPS(B)        values as an XCellRange (clipped to the used area, getDataArray)
  DESCRIBE.GROUPS(B; A)     the same plus groups, an `any` argument: Calc builds any[][] itself
  AVERAGE(B), T.TEST(B;C;2;3)  Calc's own functions on the same cells
on 10k rows, 100k rows, and whole columns (B:B, A:A) over the 100k filled rows.
The core's own share per call is measured by the benchmark command (tools/benchmark.sh).
Prints a Markdown table. Timings depend on the machine and its load; compare within one run.
"""

import argparse
import os
import random
import sys
import time

from quadrat_sheets.office import Office


def soffice_rss_mb(office):
    """Resident memory of soffice.bin (the child of oosplash), in MB; None where not found."""
    for pid in os.listdir("/proc"):
        if not pid.isdigit():
            continue
        try:
            with open("/proc/%s/stat" % pid) as f:
                fields = f.read().rsplit(")", 1)[1].split()
            if int(fields[1]) != office.process.pid and int(pid) != office.process.pid:
                continue
            with open("/proc/%s/status" % pid) as f:
                for line in f:
                    if line.startswith("VmRSS:") and "soffice.bin" in open("/proc/%s/cmdline" % pid).read():
                        return int(line.split()[1]) / 1024.0
        except (OSError, IndexError, ValueError):
            continue
    return None


def fill(sheet, rows):
    rng = random.Random(1234)
    data = [("site", "oxygen", "oxygen2")]
    for i in range(rows):
        data.append(("upstream" if i % 2 == 0 else "downstream", round(rng.gauss(8.0, 0.8), 3), round(rng.gauss(7.6, 0.9), 3)))
    sheet.getCellRangeByPosition(0, 0, 2, rows).setDataArray(tuple(data))


def time_recalc(doc, repeat):
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        doc.calculateAll()
        times.append(time.perf_counter() - t)
    return min(times)


def measure(doc, sheet, formula, copies, repeat, baseline):
    cells = [sheet.getCellByPosition(5 + i, 0) for i in range(copies)]
    for c in cells:
        c.setFormula(formula)
    doc.calculateAll()  # first call loads the library and warms caches
    check = cells[0].getString() or repr(cells[0].getValue())
    seconds = max(time_recalc(doc, repeat) - baseline, 0.0) / copies
    for c in cells:
        c.setFormula("")
    return seconds * 1000.0, check


def main():
    parser = argparse.ArgumentParser(description="time the seam")
    parser.add_argument("--oxt", required=True)
    parser.add_argument("--rows", type=int, default=100000)
    parser.add_argument("--repeat", type=int, default=9)
    args = parser.parse_args()
    n = args.rows
    small = min(10000, n)
    with Office() as office:
        office.start()
        office.install(args.oxt)
        doc = office.new_calc()
        sheet = doc.Sheets.getByIndex(0)
        fill(sheet, n)
        baseline = time_recalc(doc, args.repeat)
        rss_start = soffice_rss_mb(office)
        rows = []
        cases = [
            ("DESCRIBE.GROUPS(values): XCellRange", "=DESCRIBE.GROUPS(B1:B{n})", "=DESCRIBE.GROUPS(B:B)"),
            ("DESCRIBE.GROUPS(values; groups): XCellRange + any[][]", "=DESCRIBE.GROUPS(B1:B{n};A1:A{n})",
             "=DESCRIBE.GROUPS(B:B;A:A)"),
            ("Calc AVERAGE(values)", "=AVERAGE(B1:B{n})", "=AVERAGE(B:B)"),
            ("Calc T.TEST(values; second; 2; 3)", "=T.TEST(B1:B{n};C1:C{n};2;3)", "=T.TEST(B:B;C:C;2;3)"),
        ]
        for label, bounded, whole in cases:
            figures = []
            for rows_used, text in ((small, bounded.format(n=small + 1)), (n, bounded.format(n=n + 1)), (n, whole)):
                copies = 5 if rows_used <= 10000 else 3
                ms, check = measure(doc, sheet, text, copies, args.repeat, baseline)
                figures.append(ms)
                print("  %-60s %9.2f ms   (top-left: %s)" % (text, ms, check[:30]), file=sys.stderr)
            rows.append((label, figures))
        rss_end = soffice_rss_mb(office)
        doc.close(True)
    print("| per call, fastest of %d recalculations | %dk rows | %dk rows | whole column (%dk filled) |" % (
        args.repeat, small // 1000, n // 1000, n // 1000))
    print("| --- | --- | --- | --- |")
    for label, (a, b, c) in rows:
        print("| %s | %.2f ms | %.2f ms | %.2f ms |" % (label, a, b, c))
    print("\nempty-sheet calculateAll baseline subtracted: %.2f ms" % (baseline * 1000))
    with open("/proc/loadavg") as f:
        print("load average during the run: %s" % " ".join(f.read().split()[:3]))
    if rss_start is not None and rss_end is not None:
        print("soffice.bin resident memory: %.0f MB before the formulas, %.0f MB after" % (rss_start, rss_end))


if __name__ == "__main__":
    sys.exit(main())
