"""What the Python scripts of tests/ and tools/ share: Quadrat's workbooks from writing to reading.

- `cells`: A1 cell addresses (column_name, cell_address, cell_position).
- `fods`: a writer of flat ODF spreadsheets (the office test workbooks, the sample sheets).
- `office`: a private headless LibreOffice with the .oxt installed (needs Debian's python3-uno).
- `report_numbers`: the catalogue's number rules for report sentences.
- `report_scenarios`: the invented data of the report-sentence checks.

Scripts in tools/ import it directly (their folder is on Python's path when they run);
tests/office/ and tests/reference/ hold a symbolic link `quadrat_sheets` to this folder, so that
`/usr/bin/python3 tests/office/<script>.py` finds it from any working directory, with no path set
by hand.
"""
