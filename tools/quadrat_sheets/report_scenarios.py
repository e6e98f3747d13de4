"""The invented field scenarios of the report-sentence checks: tests/reference/generate_reports.py
computes their reference numbers, tests/office/make_reports_workbook.py puts them in cells, and
tests/core/report_sentences_test.cpp holds the same data."""

# Dissolved oxygen (mg/L) at two stream sites, riffle and pool; no ties (exact rank-sum p).
RIFFLE = [9.1, 8.7, 9.4, 8.9, 9.6, 9.0, 8.6, 9.3]
POOL = [8.2, 8.85, 7.8, 9.2, 8.5, 8.0, 8.35]
# Mayfly nymphs per kick sample, gravel and silt beds: counts with ties and a zero.
GRAVEL = [12, 7, 9, 15, 7, 11, 9, 14, 10, 12]
SILT = [4, 6, 0, 7, 3, 5, 6, 2, 9]
# Nitrate (mg/L) in drains from three land uses; odd group sizes so each median is one value.
FOREST = [0.42, 0.61, 0.38, 0.55, 0.47, 0.71, 0.50]
PASTURE = [0.65, 0.98, 0.52, 1.10, 0.58, 0.81, 0.91]
CROPLAND = [0.6, 1.9, 0.5, 1.2, 2.2, 0.8, 2.9, 0.45, 1.4]
# Conductivity (µS/cm) above and below a road culvert at ten sampling points.
ABOVE = [212, 198, 240, 225, 187, 260, 231, 205, 219, 248]
BELOW = [232, 204, 251, 229, 215, 263, 258, 203, 238, 270]
# pH of nine farm ponds, against neutral 7.
PH = [7.42, 6.91, 7.85, 7.23, 7.61, 7.08, 7.36, 7.96, 7.18]
# Water temperature (°C) logged at twenty springs: skewed, a few warm ones.
SPRINGS = [9.8, 10.1, 9.6, 10.4, 9.9, 10.0, 11.2, 9.7, 10.2, 11.9,
           9.5, 10.3, 10.0, 10.8, 9.9, 10.6, 9.8, 12.4, 10.1, 9.7]
# Mayfly presence in kick samples by habitat: rows present/absent, columns riffle/pool.
MAYFLY = [[18, 7], [5, 14]]
# Heron nest sites by tree species (alder, willow, oak) in two marshes, small counts.
NESTS = [[5, 2, 1], [1, 4, 6]]
# Newts caught by sex in pitfall traps, against 1:1.
NEWTS = [34, 22]
# Stream width (m) and canopy cover (%), twelve reaches; no ties.
WIDTH = [2.1, 3.4, 1.6, 4.8, 2.9, 5.5, 3.9, 1.2, 4.3, 2.5, 6.1, 3.0]
CANOPY = [78, 52, 85, 61, 58, 66, 47, 72, 40, 70, 55, 35]
# Survey effort: crayfish counted (whole numbers, ties) against traps set per reach.
TRAPS = [2, 2, 3, 3, 4, 4, 5, 5, 6, 6, 7, 8]
CRAYFISH = [3, 5, 4, 6, 6, 9, 7, 11, 9, 12, 14, 13]
# Bankside willow cover (%) as a second predictor of canopy, for FIT.LINEAR with two predictors.
WILLOW = [10, 22, 5, 30, 12, 35, 18, 4, 26, 15, 40, 20]
# Dissolved lead (µg/L) in wells upgradient and downgradient of a landfill; "<1" is a value below
# the lab's detection limit of 1 µg/L (two limits over the record: 1 and 0.5).
LEAD_UP = ["<1", 0.6, "<0.5", 1.2, "<1", 0.8, 1.5, "<0.5", 0.9, 2.1]
LEAD_DOWN = [1.4, "<1", 2.6, 1.9, 3.3, "<0.5", 2.2, 1.1, 4.0]
