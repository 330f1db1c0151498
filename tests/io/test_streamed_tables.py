"""JSON and CSV of tables written a chunk at a time: the same bytes as the standard library's.

The reference is Python's own ``json.dumps(rows, indent=1)`` and ``csv.writer`` on the rows
one by one (NaN as null, lists joined with ';': lampcalc.io.serialise), whatever the chunks.
"""

import csv
import io
import json

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st
from hypothesis.extra import numpy as hnp

from lampcalc.io.serialise import cell, records
from lampcalc.io.streamed_tables import CsvRows, JsonRows, csv_of_columns, json_of_columns

_FLOATS = st.floats(allow_nan=True, allow_infinity=True, width=64)
_TEXT = st.text(max_size=6)


@st.composite
def tables(draw):
    n = draw(st.integers(0, 6))
    columns = {
        "x": draw(hnp.arrays(float, n, elements=_FLOATS)),
        "ri": draw(hnp.arrays(float, (n, draw(st.integers(0, 3))), elements=_FLOATS)),
        "name": tuple(draw(st.lists(_TEXT, min_size=n, max_size=n))),
        "bin": tuple(draw(st.lists(st.none() | _TEXT, min_size=n, max_size=n))),
        "flags": tuple(tuple(f) for f in draw(st.lists(st.lists(_TEXT, max_size=3), min_size=n, max_size=n))),
    }
    return columns, n


def _reference_csv(columns):
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(list(columns))
    for row in records(columns):
        writer.writerow([cell(v) for v in row.values()])
    return out.getvalue()


@settings(max_examples=80, deadline=None)
@given(tables(), st.integers(1, 4))
def test_same_bytes_as_the_standard_library_in_any_chunks(table, chunk):
    columns, n = table
    expected_json = json.dumps(records(columns), indent=1, allow_nan=False) + "\n"  # Python's json (reference)
    assert json_of_columns(columns) == expected_json
    assert csv_of_columns(columns) == _reference_csv(columns)  # Python's csv module (reference)
    js, cs = io.StringIO(), io.StringIO()
    json_rows, csv_rows = JsonRows(js), CsvRows(cs, list(columns))
    for a in range(0, max(n, 1), chunk):
        part = {k: v[a : a + chunk] for k, v in columns.items()}
        json_rows.write(part)
        csv_rows.write(part)
    json_rows.finish()
    assert js.getvalue() == expected_json
    assert cs.getvalue() == _reference_csv(columns)


def test_numpy_floats_are_written_as_python_floats_whatever_the_print_options():
    # repr of a NumPy float changes with numpy's print options (colour-science sets legacy ones);
    # a CSV cell is the float's own shortest repr (Python's float.__repr__, reference)
    old = np.get_printoptions()
    try:
        np.set_printoptions(legacy="1.13")
        assert cell(np.float64(0.1) + np.float64(0.2)) == repr(0.1 + 0.2)
    finally:
        np.set_printoptions(**old)
    assert cell(np.float64(0.1) + np.float64(0.2)) == repr(0.1 + 0.2)
