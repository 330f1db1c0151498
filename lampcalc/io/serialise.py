"""Plain Python values for JSON and CSV output: NaN becomes null, arrays become lists."""

import math

import numpy as np


def plain(value):
    """A JSON-ready copy of ``value``: floats, ints, strings, lists; NaN and inf as None."""
    if isinstance(value, float):  # the common case first: this runs once per output number
        return value if math.isfinite(value) else None
    if isinstance(value, (tuple, list, np.ndarray)):
        return [plain(v) for v in value]
    if isinstance(value, np.floating):
        return float(value) if math.isfinite(value) else None
    if isinstance(value, np.integer):
        return int(value)
    if isinstance(value, np.bool_):
        return bool(value)
    return value


def cell(value):
    """A CSV cell: empty for None, lists joined with ';', floats in full precision."""
    if value is None:
        return ""
    if isinstance(value, list):
        return ";".join(cell(v) for v in value)
    if isinstance(value, float):
        return repr(value)
    return str(value)
