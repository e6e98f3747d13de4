#!/usr/bin/python3
"""The benchmark command (issue #7): Quadrat's speed beside the reference libraries and Calc.

    bash tools/benchmark.sh            # builds what it needs, then runs this script
    /usr/bin/python3 tools/benchmark.py --core build/quadrat_bench_core [--oxt build/quadrat.oxt]
        [--sizes 1000,10000,100000,1000000] [--cases groups-welch,describe-groups] [--skip-office]

Run with Debian's /usr/bin/python3 (python3-scipy, python3-statsmodels, python3-uno:
`bash tools/install-deps.sh --reference`). Prints, in one run:
 1. the core per call (quadrat_bench_core: through call_fenced, cells in, answer out) against
    SciPy 1.10 / statsmodels 0.13 / NumPy on the same arrays, n = 1e3 … 1e6 (Shapiro–Wilk to
    5000). The arrays are generated here once with a fixed seed and written to a temporary folder
    that the C++ program reads, so both sides see the same numbers. A library gets its natural
    input (NumPy arrays and integer group codes, split by group inside the timed call); the core
    gets cells (numbers, text labels, a header row), as from a sheet.
 1b. for the cases that read labels, the core's reading (cells into groups) and its statistics
    timed apart, the statistics beside the library's on the arrays already split by group.
 2. the result cache (src/addin/memo.*): a computing call, a call answered from the cache, ten
    outputs of one test with and without it.
 3. recalculation in headless Calc (with --oxt): Quadrat functions against T.TEST, LINEST and
    AVERAGE on the same 10k and 100k rows, the cache seen from cells, and a 200-cell workbook.
Every time is the fastest of several runs: the machine may be shared, and the slower runs
measure the neighbours. Compare within one run; the load average is printed.
"""

import argparse
import os
import shutil
import subprocess
import sys
import tempfile
import time
import warnings

import numpy as np

SEED = 20261202


# --- 1. The arrays ------------------------------------------------------------------------------

def write_arrays(folder, n):
    """Invented field-like data, fixed seed; every case at size m uses the first m rows."""
    rng = np.random.default_rng(SEED)
    g4 = rng.integers(0, 4, n).astype(np.int32)                  # four sites
    g2 = (g4 % 2).astype(np.int32)                               # two sites
    v = rng.normal(8.0 + 0.05 * g4, 0.8 + 0.1 * g4)               # oxygen, by site
    a = rng.normal(8.0, 0.8, n)                                  # a reading …
    b = a + rng.normal(0.03, 1.5, n)                             # … and its repeat
    x2 = rng.normal(0.0, 1.0, n)
    x3 = rng.normal(0.0, 1.0, n)
    y = 1.0 + 0.5 * a - 0.3 * x2 + 0.2 * x3 + rng.normal(0.0, 1.0, n)
    yb = (rng.random(n) < 1.0 / (1.0 + np.exp(-(-0.5 + 0.8 * x2 + 0.4 * x3)))).astype(np.int32)
    f1 = rng.integers(0, 3, n).astype(np.int32)                  # treatment, 3 levels
    f2 = rng.integers(0, 4, n).astype(np.int32)                  # zone, 4 levels
    vf = 10.0 + 0.3 * f1 - 0.2 * f2 + 0.1 * (f1 * f2 == 2) + rng.normal(0.0, 1.0, n)
    c1 = rng.integers(0, 3, n).astype(np.int32)                  # habitat, 3 categories
    c2 = np.where(rng.random(n) < 0.1, c1, rng.integers(0, 4, n)).astype(np.int32)  # species, 4
    p = rng.random(n) ** 2                                       # p-values to adjust
    eff = rng.uniform(5.0, 25.0, n)                              # minutes fished
    cnt = rng.poisson(eff * np.exp(-2.0 + 0.1 * (a - 8.0) + 0.3 * x2 - 0.2 * x3)).astype(float)  # fish per pass
    arrays = dict(g4=g4, g2=g2, v=v, a=a, b=b, x2=x2, x3=x3, y=y, yb=yb, f1=f1, f2=f2, vf=vf, c1=c1, c2=c2, p=p,
                  eff=eff, cnt=cnt)
    for name, x in arrays.items():
        x.astype("<i4" if x.dtype == np.int32 else "<f8").tofile(os.path.join(folder, name + (".i32" if x.dtype == np.int32 else ".f64")))
    return arrays


# --- 1. The reference libraries, case by case -----------------------------------------------------

def describe_parts(parts):
    """DESCRIBE.GROUPS' numbers per group with NumPy (and SciPy's t quantile)."""
    from scipy import stats
    rows = []
    for s in parts:
        m, sd = s.mean(), s.std(ddof=1)
        se = sd / np.sqrt(len(s))
        h = stats.t.ppf(0.975, len(s) - 1) * se
        rows.append((len(s), m, sd, se, m - h, m + h, np.median(s), s.min(), s.max()))
    return rows


def library_cases():
    """case name → (Quadrat call, reference call, function of (arrays, n) → thunk)."""
    from scipy import stats
    import statsmodels.api as sm
    import statsmodels.formula.api as smf
    from statsmodels.stats.anova import anova_lm
    from statsmodels.stats.diagnostic import normal_ad
    from statsmodels.stats.multicomp import pairwise_tukeyhsd
    from statsmodels.stats.multitest import multipletests
    import pandas as pd

    # Both sides get values and group codes; splitting by group is part of the library's job too
    # (the core reads label cells), so it is inside the timed call.
    def split(x, g, k):
        return [x[g == i] for i in range(k)]

    def ols_table(d, n):
        X = sm.add_constant(np.column_stack([d["a"][:n], d["x2"][:n], d["x3"][:n]]))
        y = d["y"][:n]

        def run():
            fit = sm.OLS(y, X).fit()
            return fit.params, fit.bse, fit.tvalues, fit.pvalues, fit.conf_int()
        return run

    def logit_table(d, n):
        X = sm.add_constant(np.column_stack([d["x2"][:n], d["x3"][:n]]))
        y = d["yb"][:n]

        def run():
            fit = sm.Logit(y, X).fit(disp=0)
            return fit.params, fit.bse, fit.pvalues, fit.conf_int(), fit.llr_pvalue
        return run

    def counts_table(d, n):
        # Five predictors: two of them (b, v) carry nothing, as in a survey that measured more than mattered.
        X = sm.add_constant(np.column_stack([d["a"][:n], d["b"][:n], d["x2"][:n], d["x3"][:n], d["v"][:n]]))
        y, offset = d["cnt"][:n], np.log(d["eff"][:n])

        def run():
            fit = sm.GLM(y, X, family=sm.families.Poisson(), offset=offset).fit()
            return fit.params, fit.bse, fit.pvalues, fit.conf_int(), fit.pearson_chi2
        return run

    def factorial_table(d, n):
        frame = pd.DataFrame({"v": d["vf"][:n], "f1": d["f1"][:n], "f2": d["f2"][:n]})
        return lambda: anova_lm(smf.ols("v ~ C(f1) * C(f2)", data=frame).fit(), typ=2)

    def contingency(d, n):
        c1, c2 = d["c1"][:n], d["c2"][:n]
        # the tabulation is part of the job: COMPARE.COUNTS reads the two label columns
        return lambda: stats.chi2_contingency(np.bincount(c1 * 4 + c2, minlength=12).reshape(3, 4), correction=False)

    def describe(d, n):
        x, g = d["v"][:n], d["g4"][:n]
        return lambda: describe_parts([x[g == i] for i in range(4)])

    def two(d, n, f):
        x, g = d["v"][:n], d["g2"][:n]
        return lambda: f(*split(x, g, 2))

    def four(d, n, f):
        x, g = d["v"][:n], d["g4"][:n]
        return lambda: f(*split(x, g, 4))

    return [
        ("normal-shapiro-wilk", "CHECK.NORMAL shapiro-wilk", "scipy.stats.shapiro",
         lambda d, n: (lambda: stats.shapiro(d["a"][:n]))),
        ("normal-anderson-darling", "CHECK.NORMAL anderson-darling", "statsmodels normal_ad",
         lambda d, n: (lambda: normal_ad(d["a"][:n]))),
        ("variance-brown-forsythe", "CHECK.VARIANCE brown-forsythe, 4 groups", "scipy levene(center='median')",
         lambda d, n: four(d, n, lambda *g: stats.levene(*g, center="median"))),
        ("groups-welch", "COMPARE.GROUPS welch", "scipy ttest_ind(equal_var=False)",
         lambda d, n: two(d, n, lambda x, y: stats.ttest_ind(x, y, equal_var=False))),
        ("groups-ranks-2", "COMPARE.GROUPS ranks, 2 groups", "scipy mannwhitneyu",
         lambda d, n: two(d, n, lambda x, y: stats.mannwhitneyu(x, y, alternative="two-sided"))),
        ("groups-pooled-4", "COMPARE.GROUPS pooled, 4 groups", "scipy f_oneway",
         lambda d, n: four(d, n, stats.f_oneway)),
        ("groups-ranks-4", "COMPARE.GROUPS ranks, 4 groups", "scipy kruskal",
         lambda d, n: four(d, n, stats.kruskal)),
        ("paired-t", "COMPARE.PAIRED t", "scipy ttest_rel",
         lambda d, n: (lambda: stats.ttest_rel(d["a"][:n], d["b"][:n]))),
        ("paired-signed-rank", "COMPARE.PAIRED signed-rank", "scipy wilcoxon",
         lambda d, n: (lambda: stats.wilcoxon(d["a"][:n], d["b"][:n]))),
        ("posthoc-tukey", "COMPARE.POSTHOC tukey, 4 groups", "statsmodels pairwise_tukeyhsd",
         lambda d, n: (lambda: pairwise_tukeyhsd(d["v"][:n], d["g4"][:n]))),
        ("adjust-holm", "ADJUST.P holm", "statsmodels multipletests",
         lambda d, n: (lambda: multipletests(d["p"][:n], method="holm"))),
        ("correlation-pearson", "RELATE.CORRELATION pearson", "scipy pearsonr",
         lambda d, n: (lambda: stats.pearsonr(d["a"][:n], d["b"][:n]))),
        ("correlation-spearman", "RELATE.CORRELATION spearman", "scipy spearmanr",
         lambda d, n: (lambda: stats.spearmanr(d["a"][:n], d["b"][:n]))),
        ("correlation-kendall", "RELATE.CORRELATION kendall", "scipy kendalltau",
         lambda d, n: (lambda: stats.kendalltau(d["a"][:n], d["b"][:n]))),
        ("fit-linear", "FIT.LINEAR, 3 predictors", "statsmodels OLS (+ SE, t, p, CI)", ols_table),
        ("fit-logistic", "FIT.LOGISTIC, 2 predictors", "statsmodels Logit (+ SE, p, CI, LR)", logit_table),
        ("fit-factorial", "FIT.FACTORIAL 3×4, type II", "statsmodels ols + anova_lm(typ=2)", factorial_table),
        ("fit-counts", "FIT.COUNTS poisson, 5 predictors, effort", "statsmodels GLM Poisson with offset", counts_table),
        ("counts-chi-square", "COMPARE.COUNTS chi-square, 3×4 labels", "numpy bincount + scipy chi2_contingency",
         contingency),
        ("describe-groups", "DESCRIBE.GROUPS, 4 groups", "numpy per group (+ scipy t.ppf)", describe),
    ]


def time_thunk(thunk, most=9, budget=3.0):
    """Fastest of up to `most` runs within `budget` seconds (at least 3 when they fit); and the answer."""
    best, runs, spent, answer = float("inf"), 0, 0.0, None
    while runs < most and (runs < 3 or spent < budget):
        start = time.perf_counter()
        out = thunk()
        seconds = time.perf_counter() - start
        if answer is None:
            answer = out
        best, spent, runs = min(best, seconds), spent + seconds, runs + 1
        if seconds > budget:
            break
    return best * 1000.0, runs, answer


def reference_p(answer):
    """The p-value of a SciPy result, where it has one, for the sanity check."""
    p = getattr(answer, "pvalue", None)
    if p is None and isinstance(answer, tuple) and len(answer) >= 2 and np.isscalar(answer[1]):
        p = answer[1]
    try:
        return float(p)
    except (TypeError, ValueError):
        return None


def run_libraries(cases, sizes, arrays, limit_seconds):
    """Times every case; a case whose previous size predicts more than `limit_seconds` is skipped."""
    results = {}
    for name, _, _, make in cases:
        previous = None
        for n in sizes:
            if name == "normal-shapiro-wilk" and n > 5000:
                continue
            if previous is not None:
                predicted = previous[1] / 1000.0 * (n / previous[0]) * 1.2
                if predicted > limit_seconds:
                    results[(name, n)] = ("skipped", "predicted %.0f s from n = %d" % (predicted, previous[0]))
                    continue
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                ms, runs, answer = time_thunk(make(arrays, n))
            results[(name, n)] = (ms, runs, reference_p(answer))
            previous = (n, ms)
            print("  library %-26s n=%-8d %10.3f ms (%d runs)" % (name, n, ms, runs), file=sys.stderr)
    return results


def run_core(core, folder, cases, sizes):
    """One process per case and size: no case inherits the heap another left behind."""
    results = {}
    for name, _, _, _ in cases:
        for n in sizes:
            if name == "normal-shapiro-wilk" and n > 5000:
                continue
            line = subprocess.run([core, folder, name, str(n)], check=True, capture_output=True, text=True).stdout
            name_, n_, ms, runs, answer = line.rstrip("\n").split("\t")
            results[(name, n)] = (float(ms), int(runs), answer)
            print("  core    %-26s n=%-8s %10.3f ms (%s runs) %s" % (name, n, float(ms), runs, answer[:40]),
                  file=sys.stderr)
    return results


# Cases that read labels: the core's reading (cells into groups or a table) and its statistics timed
# apart (quadrat_bench_core --stages), beside the library's statistics alone on the arrays already
# split by group (issue #19: "core statistics on grouped doubles / SciPy on the same arrays").
def stage_cases():
    from scipy import stats

    def presplit(d, n, k, f):
        x, g = d["v"][:n], d["g2" if k == 2 else "g4"][:n]
        parts = [x[g == i] for i in range(k)]
        return lambda: f(*parts)

    def describe_presplit(d, n):
        x, g = d["v"][:n], d["g4"][:n]
        parts = [x[g == i] for i in range(4)]
        return lambda: describe_parts(parts)

    def tabulate(d, n):
        c1, c2 = d["c1"][:n], d["c2"][:n]
        return lambda: np.bincount(c1 * 4 + c2, minlength=12).reshape(3, 4)

    def chi_square_on_table(d, n):
        table = np.bincount(d["c1"][:n] * 4 + d["c2"][:n], minlength=12).reshape(3, 4)
        return lambda: stats.chi2_contingency(table, correction=False)

    # case → (library statistics on split arrays, library reading or None)
    return {
        "groups-welch": (lambda d, n: presplit(d, n, 2, lambda x, y: stats.ttest_ind(x, y, equal_var=False)), None),
        "groups-ranks-2": (lambda d, n: presplit(d, n, 2, lambda x, y: stats.mannwhitneyu(x, y, alternative="two-sided")), None),
        "groups-pooled-4": (lambda d, n: presplit(d, n, 4, stats.f_oneway), None),
        "groups-ranks-4": (lambda d, n: presplit(d, n, 4, stats.kruskal), None),
        "variance-brown-forsythe": (lambda d, n: presplit(d, n, 4, lambda *g: stats.levene(*g, center="median")), None),
        "describe-groups": (describe_presplit, None),
        "counts-chi-square": (chi_square_on_table, tabulate),
    }


def print_stages(core, folder, cases, sizes, arrays):
    print("\n### 1b. Reading and statistics apart, cases that read labels\n")
    print("reading: the core's cells (values beside a label column, or two label columns) into groups or a")
    print("table, per row; statistics: the core on the groups already read, against the library on the")
    print("arrays already split by group (NumPy's bincount as the reading of COMPARE.COUNTS).")
    print("ratio = library / core (above 1: the core is faster). Fastest of up to 9 runs each.\n")
    print("| case | n | core reading | per row | library reading | core statistics | library statistics | ratio statistics |")
    print("| --- | --- | --- | --- | --- | --- | --- | --- |")
    extra = stage_cases()
    for name, quadrat, _, _ in cases:
        if name not in extra:
            continue
        statistics, reading = extra[name]
        for n in sizes:
            line = subprocess.run([core, folder, "--stages", name, str(n)], check=True, capture_output=True, text=True).stdout
            _, _, read_ms, stat_ms = line.rstrip("\n").split("\t")
            read_ms, stat_ms = float(read_ms), float(stat_ms)
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                lib_stat = time_thunk(statistics(arrays, n))[0]
                lib_read = time_thunk(reading(arrays, n))[0] if reading else None
            print("| %s | %d | %s | %.1f ns | %s | %s | %s | %s |" % (
                quadrat, n, fmt_ms(read_ms), read_ms * 1e6 / n, fmt_ms(lib_read) if lib_read else "—",
                fmt_ms(stat_ms), fmt_ms(lib_stat), "%.2g×" % (lib_stat / stat_ms) if stat_ms > 0 else "—"))
            sys.stdout.flush()


def fmt_ms(ms):
    return "%.3g ms" % ms if ms < 1000 else "%.2f s" % (ms / 1000.0)


def print_core_table(cases, sizes, core, library):
    print("### 1. The core per call against the reference libraries (same arrays)\n")
    print("ratio = library time / core time (above 1: the core is faster); fastest of up to 9 runs each.")
    print("The core reads cells (numbers, text labels, a header row); a library gets NumPy arrays and")
    print("integer group codes, and its time includes splitting them by group where it takes samples.\n")
    print("| Quadrat (core, through call_fenced) | reference | n | core | library | ratio |")
    print("| --- | --- | --- | --- | --- | --- |")
    worst, notes = None, []
    for name, quadrat, reference, _ in cases:
        for n in sizes:
            if (name, n) not in core:
                continue
            c_ms, _, answer = core[(name, n)]
            lib = library.get((name, n))
            if lib is None:
                continue
            if lib[0] == "skipped":
                print("| %s | %s | %d | %s | skipped: %s | — |" % (quadrat, reference, n, fmt_ms(c_ms), lib[1]))
                continue
            l_ms, _, p = lib
            ratio = l_ms / c_ms if c_ms > 0 else float("inf")
            flag = ""
            if answer.startswith("text:"):
                flag = " (core answered text!)"
                notes.append("%s n=%d: the core answered %r" % (name, n, answer))
            elif p is not None and name not in ("posthoc-tukey", "adjust-holm", "fit-linear", "fit-logistic",
                                                 "fit-factorial", "fit-counts", "describe-groups"):
                # a sanity check that both sides ran the same test, not an accuracy test
                q = float(answer)
                if abs(q - p) > 1e-3 * max(abs(p), 1e-300) and abs(q - p) > 1e-12:
                    notes.append("%s n=%d: p %.10g (core) vs %.10g (library)" % (name, n, q, p))
            print("| %s | %s | %d | %s | %s | %s%s |" % (quadrat, reference, n, fmt_ms(c_ms), fmt_ms(l_ms),
                                                        "%.1f×" % ratio, flag))
            if worst is None or ratio < worst[0]:
                worst = (ratio, name, n)
    # The same ratios at a glance.
    print("\n| ratio library/core | " + " | ".join("n = %g" % n for n in sizes) + " |")
    print("| --- |" + " --- |" * len(sizes))
    for name, quadrat, _, _ in cases:
        row = []
        for n in sizes:
            c, lib = core.get((name, n)), library.get((name, n))
            if c is None or lib is None:
                row.append("—")
            elif lib[0] == "skipped":
                row.append("skipped")
            else:
                row.append("%.2g×" % (lib[0] / c[0]) if c[0] > 0 else "—")
        print("| %s | %s |" % (quadrat, " | ".join(row)))
    if worst:
        print("\nsmallest ratio: %.2f× (%s, n = %d)" % worst)
    for note in notes:
        print("note: " + note)


def print_cache(core, folder, largest):
    out = subprocess.run([core, folder, "--cache", str(largest)], check=True, capture_output=True, text=True).stdout
    print("\n### 2. The result cache (src/addin/memo.*), core only\n")
    print("| test | n | computing call | answered from the cache | 10 outputs, no cache | 10 outputs, cache |")
    print("| --- | --- | --- | --- | --- | --- |")
    if not out.strip():
        print("| (needs a size of 10⁴ or more in --sizes) | | | | | |")
    for line in out.splitlines():
        _, test, n, miss, hit, without, with_ = line.split("\t")
        print("| %s | %s | %s | %s | %s | %s |" % (test, n, fmt_ms(float(miss)), fmt_ms(float(hit)),
                                                  fmt_ms(float(without)), fmt_ms(float(with_))))


def load_average():
    with open("/proc/loadavg") as f:
        return " ".join(f.read().split()[:3])


def main():
    parser = argparse.ArgumentParser(description="Quadrat benchmark (issue #7)")
    parser.add_argument("--core", required=True, help="the quadrat_bench_core executable")
    parser.add_argument("--oxt", help="build/quadrat.oxt: also measure recalculation in headless Calc")
    parser.add_argument("--sizes", default="1000,10000,100000,1000000")
    parser.add_argument("--limit", type=float, default=60.0,
                        help="skip a library case predicted to take longer than this many seconds per call")
    parser.add_argument("--skip-libraries", action="store_true")
    parser.add_argument("--cases", help="only these cases, comma-separated (e.g. groups-welch,describe-groups)")
    args = parser.parse_args()
    sizes = [int(s) for s in args.sizes.split(",")]
    import scipy
    import statsmodels
    print("## Quadrat benchmark\n")
    print("machine: %s, %d cores; load average at start %s; SciPy %s, statsmodels %s, NumPy %s" % (
        os.uname().machine, os.cpu_count(), load_average(), scipy.__version__, statsmodels.__version__, np.__version__))
    print("Times are the fastest of several runs (the machine may be shared: the slower runs measure the neighbours).\n")
    folder = tempfile.mkdtemp(prefix="quadrat-bench-")
    try:
        arrays = write_arrays(folder, max(sizes))
        cases = library_cases()
        if args.cases:
            cases = [c for c in cases if c[0] in args.cases.split(",")]
        core = run_core(args.core, folder, cases, sizes)
        library = {} if args.skip_libraries else run_libraries(cases, sizes, arrays, args.limit)
        print_core_table(cases, sizes, core, library)
        if not args.skip_libraries:
            print_stages(args.core, folder, cases, sizes, arrays)
        print_cache(args.core, folder, max(sizes))
        if args.oxt:
            import bench_calc
            bench_calc.run(args.oxt)
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    print("\nload average at the end: %s" % load_average())
    return 0


if __name__ == "__main__":
    sys.exit(main())
