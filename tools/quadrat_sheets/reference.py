"""The reference values the office test workbooks are checked against: tests/reference/*.json,
written by the committed generator scripts beside them (SciPy, statsmodels, mpmath)."""

import json
import os

# This package lives in tools/ and is linked from tests/office/: the real path finds the repository.
REFERENCE_DIR = os.path.join(os.path.dirname(os.path.dirname(os.path.dirname(os.path.realpath(__file__)))),
                             "tests", "reference")


def reference(name):
    """The parsed tests/reference/<name> (e.g. "blocks.json")."""
    with open(os.path.join(REFERENCE_DIR, name)) as f:
        return json.load(f)
