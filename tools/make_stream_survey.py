#!/usr/bin/python3
"""Writes sample_sheets/stream-survey.fods: an invented stream survey with Quadrat beside it.

    /usr/bin/python3 tools/make_stream_survey.py --oxt build/quadrat.oxt

The workbook is built like the other three sample workbooks, through a headless Calc with the
extension (number formats, column widths, caution notes and charts need the office), so this is
`tools/make_sample_sheets.py --oxt … stream`; the data and layout are in its stream() function.
"""

import sys

import make_sample_sheets

if __name__ == "__main__":
    sys.argv = sys.argv[:1] + [a for a in sys.argv[1:] if a != "stream"] + ["stream"]
    sys.exit(make_sample_sheets.main())
