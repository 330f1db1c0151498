"""Plain Python values for JSON and CSV output: NaN becomes null, arrays become lists."""

import csv
import io
import math

import numpy as np


def plain(value):
    """A JSON-ready copy of ``value``: floats, ints, strings, lists; NaN and inf as None."""
    if isinstance(value, float):  # the common case first: this runs once per output number
        return value if math.isfinite(value) else None
    if isinstance(value, np.ndarray) and value.ndim == 0:
        return plain(value.item())
    if isinstance(value, (tuple, list, np.ndarray)):
        return [plain(v) for v in value]
    if isinstance(value, dict):
        return {k: plain(v) for k, v in value.items()}
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
        # float's own repr (shortest round trip), also for NumPy floats, whose repr depends on print options
        return float.__repr__(value)
    return str(value)


def records(columns):
    """A table given as columns (a dict of equal-length sequences) as JSON-ready rows, one dict each."""
    keys = list(columns)
    n = len(columns[keys[0]]) if keys else 0
    return [{k: plain(columns[k][i]) for k in keys} for i in range(n)]


def csv_text(rows):
    """CSV text of JSON-ready rows (dicts with the same keys): a header, then one line per row."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    keys = list(rows[0]) if rows else []
    writer.writerow(keys)
    for row in rows:
        writer.writerow([cell(row[k]) for k in keys])
    return out.getvalue()
