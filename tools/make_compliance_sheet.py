#!/usr/bin/python3
"""Writes sample_sheets/effluent-compliance.fods: an invented year of effluent monitoring judged
against an invented permit, with LIMIT.*, CHECK.OUTLIERS and PLAN.* beside the raw readings.

    /usr/bin/python3 tools/make_compliance_sheet.py --oxt build/quadrat.oxt

All data are invented and generated with a fixed seed (nothing measured anywhere): weekly
ammonia readings (mg/L, 24-hour composite samples) at the outfall of a fictional small treatment
works, and fortnightly readings at a point upstream of it. The field sheet has what real ones
have: a week the sampler failed, a broken bottle (`n/a`), and one value copied from the lab
sheet with its decimal point in the wrong place. The permit is made up too: the upper 95%
confidence limit of the year's mean below 1.0 mg/L, and no more than 10% of samples above
1.5 mg/L. The workbook is built through UNO (tools/make_sample_sheets.py's Builder) in a headless
Calc with the extension installed, and stored as flat ODF; rerunning reproduces it.
"""

import datetime
import math
import os
import random
import sys

import uno  # noqa: F401  (sets up the UNO types used below)

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
from make_sample_sheets import CAUTION_COLOUR, HELPER_NOTE, WHOLE, finish, new_workbook, run_builder  # noqa: E402

MEAN_STANDARD, SAMPLE_STANDARD, SHARE_ALLOWED = 1.0, 1.5, 0.10
MGL, SHARE = "0.00", "0.0%"

DESIGN = ("Every limit here uses every reading and assumes independent samples: weekly composites from one "
          "outfall can run in spells, and then these limits are too low. A flagged value is one to check "
          "against the lab sheet or the sampler log, not one to delete: Quadrat removes nothing. The permit "
          "and its figures are invented.")


def readings():
    rng = random.Random(20261204)
    effluent = []
    first = datetime.date(2026, 1, 5)
    for week in range(1, 53):
        value = round(math.exp(rng.gauss(math.log(0.68), 0.38)), 2)  # log-normal, as concentrations often are
        effluent.append([week, first + datetime.timedelta(days=7 * (week - 1)), value, None])
    effluent[11][2], effluent[11][3] = None, "autosampler failed"
    effluent[39][2], effluent[39][3] = "n/a", "bottle broken in transit"
    effluent[30][2] = round(effluent[30][2] * 10, 1)  # the decimal point slipped
    effluent[30][3] = "as copied from the lab sheet"
    upstream = []
    for visit in range(1, 27):
        upstream.append([visit, first + datetime.timedelta(days=14 * (visit - 1)), round(max(0.02, rng.gauss(0.11, 0.025)), 3)])
    return effluent, upstream


def build(office, available):
    effluent, upstream = readings()
    doc, (s, u, q) = new_workbook(office, "effluent", ["upstream", "chart data"])

    # The raw sheet, and the flags beside it: one cell per row, `outlier` marks a value to look at again.
    s.header("A1", ["week", "date", "ammonia mg/L", "note", "look again?"], wrap=True)
    s.block("A2", effluent)
    last = len(effluent) + 1
    s.format("C2:C%d" % last, MGL)
    C = "$C$1:$C$%d" % last
    s.array("E2", "CHECK.OUTLIERS($C$2:$C$%d)" % last, last - 1, 1, bold_header=False)
    s.cell("E2:E%d" % last).CharColor = CAUTION_COLOUR

    s.label("G1", "Effluent ammonia 2026 against the (invented) permit", bold=True)
    rows = [
        ("readings used", 'LIMIT.MEAN(%s;;"n")' % C, WHOLE),
        ("mean, mg/L", 'LIMIT.MEAN(%s;;"estimate")' % C, MGL),
        ("upper 95% limit of the mean, t, mg/L", "LIMIT.MEAN(%s)" % C, MGL),
        ("upper 95% limit of the mean, bootstrap BCa, mg/L", 'LIMIT.MEAN(%s;"bootstrap")' % C, MGL),
        ("upper 95% limit of the mean, Chebyshev, mg/L", 'LIMIT.MEAN(%s;"chebyshev")' % C, MGL),
        ("permit: the mean's upper limit below, mg/L", None, MGL),
        ("90th percentile (as PERCENTILE.INC), mg/L", 'LIMIT.PERCENTILE(%s;0.9;"estimate")' % C, MGL),
        ("upper 95% limit of the 90th percentile, mg/L", "LIMIT.PERCENTILE(%s;0.9)" % C, MGL),
        ("samples above %.1f mg/L" % SAMPLE_STANDARD, 'LIMIT.EXCEEDANCE(%s;%s;"count")' % (C, SAMPLE_STANDARD), WHOLE),
        ("share above %.1f mg/L" % SAMPLE_STANDARD, 'LIMIT.EXCEEDANCE(%s;%s;"estimate")' % (C, SAMPLE_STANDARD), SHARE),
        ("upper 95% limit of that share", "LIMIT.EXCEEDANCE(%s;%s)" % (C, SAMPLE_STANDARD), SHARE),
        ("permit: share above %.1f mg/L at most" % SAMPLE_STANDARD, None, SHARE),
        ("values to look at again (CHECK.OUTLIERS)", 'CHECK.OUTLIERS(%s;;"count")' % C, WHOLE),
    ]
    for i, (label, formula, code) in enumerate(rows):
        ref = "G%d" % (2 + i)
        s.result(ref, label, formula or "%s" % (MEAN_STANDARD if "mean" in label else SHARE_ALLOWED), code, 4)
    # K4 the t limit, K7 the mean standard; K12 the share's limit, K13 the permitted share.
    s.sentence("G15", '=IF(K4<K7;"Mean: its upper 95% limit is below the standard, so the mean complies with 95% '
               'confidence.";"Mean: its upper 95% limit is not below the standard, so these readings cannot show with '
               '95% confidence that the mean complies.")', 5, 2, colour=CAUTION_COLOUR)
    s.sentence("G17", '=IF(K12<K13;"Samples above 1.5 mg/L: the upper 95% limit of their share is below 10%.";'
               '"Samples above 1.5 mg/L: the upper 95% limit of their share is not below 10%, so compliance cannot be '
               'shown with 95% confidence.")', 5, 2, colour=CAUTION_COLOUR)
    s.sentence("G20", '=LIMIT.MEAN(%s;;"report")' % C, 5, 2)
    s.sentence("G22", '=LIMIT.EXCEEDANCE(%s;%s;"report")' % (C, SAMPLE_STANDARD), 5, 2)
    s.sentence("G24", '=CHECK.OUTLIERS(%s;;"report")' % C, 5, 3)
    # Next season: how many samples, and what the present design can see.
    r = 28
    s.label("G%d" % r, "Next season: will the plant upgrade show in the effluent? (PLAN.*)", bold=True)
    base = r + 1
    plan = [
        ("drop in the mean to detect, mg/L", None, 0.2, MGL),
        ("SD this year without week 31 (under check), mg/L", "STDEV(C2:C31;C33:C53)", None, MGL),
        ("readings per year, this year against next, 80% power", "PLAN.SAMPLES(K%d;K%d)" % (base, base + 1), None, WHOLE),
        ("power with weekly readings (50 a year)", "PLAN.POWER(50;K%d;K%d)" % (base, base + 1), None, "0.00"),
        ("smallest drop 26 fortnightly readings detect (80%), mg/L", "PLAN.DETECTABLE(26;K%d)" % (base + 1), None, MGL),
        ("readings per year to compare three years, 80%", 'PLAN.SAMPLES(K%d;K%d;"several-groups";;;3)'
         % (base, base + 1), None, WHOLE),
    ]
    for i, (label, formula, value, code) in enumerate(plan):
        s.result("G%d" % (base + i), label, formula if formula else "%s" % value, code, 4)
    s.sentence("G%d" % (base + len(plan) + 1), "PLAN.* plan a two-sided test at 5%, with readings as independent as "
               "the SD above assumes; several-groups takes the least favourable spread of the yearly means.", 5, 2,
               italic=True)
    s.caution("G%d" % (base + len(plan) + 4), DESIGN, 5, 5)

    # Below the raw rows, where a tall row opens no gap in them: the values the test looked at.
    r = last + 3
    s.label("A%d" % r, "Values that stand out (generalized ESD, Rosner 1983): CHECK.OUTLIERS table", bold=True)
    table_rows, _ = s.array("A%d" % (r + 1), 'CHECK.OUTLIERS(%s;;"table")' % C)
    s.format("B%d:C%d" % (r + 2, r + table_rows - 1), "0.000")
    note = s.cell("B%d" % (r + table_rows))
    note.IsTextWrapped = True  # the table's note row: wrapped in its cell, not a column as wide as the note
    note.VertJustify = 1  # TOP
    slipped = effluent[30][2]
    s.sentence("G%d" % (r + 1), "In this invented year the flagged week 31 reads %.1f mg/L on the field sheet where the "
               "lab sheet has %.2f: the decimal point slipped when it was copied. Correct the cell once the lab sheet "
               "confirms it, and every limit above follows (with %.2f in C32 the mean's upper limit falls below the "
               "standard). Until then the figures above stand as computed." % (slipped, slipped / 10, slipped / 10),
               5, 4, italic=True)
    s.widths([1.1, 2.3, 1.9, 4.6, 1.9, 0.5, 2.6, 2.6, 2.6, 2.6, 2.0])

    # Background: the upstream point, and the limits a new upstream reading is judged against.
    u.header("A1", ["visit", "date", "ammonia mg/L"], wrap=True)
    u.block("A2", upstream)
    u.format("C2:C27", "0.000")
    B = "$C$1:$C$27"
    u.label("E1", "Upstream background (normal methods)", bold=True)
    background = [
        ("upper tolerance limit, 95% below at 95% confidence, mg/L", "LIMIT.TOLERANCE(%s;0.95)" % B, "0.000"),
        ("its k-factor (mean + k·SD)", 'LIMIT.TOLERANCE(%s;0.95;"k-factor")' % B, "0.000"),
        ("upper 95% prediction limit for the next reading, mg/L", "LIMIT.PREDICTION(%s)" % B, "0.000"),
        ("upper 95% prediction limit for each of the next 4, mg/L", "LIMIT.PREDICTION(%s;4)" % B, "0.000"),
        ("this month's upstream reading, mg/L", "0.19", "0.000"),
    ]
    for i, (label, formula, code) in enumerate(background):
        u.result("E%d" % (2 + i), label, formula, code, 5)
    u.formula("E8", 'IF(J6>J4;"above the prediction limit: check the sample and look upstream";"within the background")')
    u.sentence("E10", '=LIMIT.TOLERANCE(%s;0.95;"report")' % B, 6, 2)
    u.sentence("E12", '=LIMIT.PREDICTION(%s;4;"report")' % B, 6, 2)
    u.caution("E15", "The normal limits assume the background readings normal and independent; with 26 readings "
              "a distribution-free tolerance limit is not possible: LIMIT.TOLERANCE(…; \"distribution-free\") names the n "
              "needed (59).", 6, 4)
    u.widths([1.1, 2.3, 2.0, 0.5, 2.4, 2.4, 2.4, 2.4, 2.4, 1.8])

    # Chart: the weekly readings with the sample standard and the mean's upper limit.
    q.sentence("A1", HELPER_NOTE.format(sheet="effluent"), 5, 2, colour=CAUTION_COLOUR)
    q.header("A3", ["week", "ammonia mg/L", "sample standard", "upper 95% limit of the mean"])
    for i in range(len(effluent)):
        rr = 4 + i
        q.formula("A%d" % rr, 'TEXT($effluent.A%d;"0")' % (2 + i))  # a text label: the chart shows it as typed
        q.formula("B%d" % rr, 'IF(ISNUMBER($effluent.C%d);$effluent.C%d;"")' % (2 + i, 2 + i), MGL)
        q.put("C%d" % rr, SAMPLE_STANDARD)
        q.formula("D%d" % rr, "$effluent.$K$4", MGL)
    q.widths([1.2, 2.6, 2.6, 3.0])
    s.chart("weekly", "M2", 16.0, 8.5, "A3:D%d" % (3 + len(effluent)), "lines",
            "Weekly effluent ammonia, the 1.5 mg/L sample standard and the mean's upper 95% limit", "week",
            "ammonia (mg/L)", headers=(True, True), data_sheet=q.sheet, legend=True)

    def style_charts():
        """The chart's standard and limit drawn as lines without symbols."""
        diagram = s.sheet.getCharts().getByName("weekly").getEmbeddedObject().getDiagram()
        measured = diagram.getDataRowProperties(0)
        measured.SymbolSize = uno.createUnoStruct("com.sun.star.awt.Size", 150, 150)
        for series in (1, 2):  # the standard and the mean's limit: lines without symbols
            diagram.getDataRowProperties(series).SymbolType = -3  # com.sun.star.chart.ChartSymbolType.NONE

    return finish(doc, [s, u, q], os.path.join(ROOT, "sample_sheets", "effluent-compliance.fods"), style_charts)


if __name__ == "__main__":
    sys.exit(run_builder("write sample_sheets/effluent-compliance.fods", build))
