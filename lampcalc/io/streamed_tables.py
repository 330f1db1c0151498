"""Tables of results written as JSON and CSV a chunk of rows at a time.

A table is given as columns (a dict of equal-length columns: NumPy arrays of numbers, 1-D
or with a list per row, or sequences of text, None, numbers or lists). Its text is made a
column at a time, so that a million rows cost seconds, and is the same, byte for byte, as
the standard library writes for the rows one by one: ``json.dumps(rows, indent=1)`` (NaN
as ``null``) and ``csv.writer`` with lists joined by ``;`` and empty cells for nulls
(:mod:`~lampcalc.io.serialise`). :class:`JsonRows` and :class:`CsvRows` write chunks to an
open file as they come; :func:`json_of_columns` and :func:`csv_of_columns` give a whole table's text.
"""

import csv
import io
from json.encoder import encode_basestring_ascii

import numpy as np

from .serialise import plain

_ITEM = ",\n   "  # between items of a list inside a row object (json.dumps, indent=1)


def _float_texts(values, null):
    """repr of each float (what json and the csv cells write), ``null`` where not finite."""
    texts = list(map(float.__repr__, values.ravel().tolist()))
    for i in np.flatnonzero(~np.isfinite(values.ravel())).tolist():
        texts[i] = null
    return texts


def _json_scalar(value):
    value = plain(value)
    if value is None:
        return "null"
    if isinstance(value, str):
        return encode_basestring_ascii(value)
    if value is True or value is False:
        return "true" if value else "false"
    if isinstance(value, float):
        return float.__repr__(value)
    if isinstance(value, int):
        return int.__repr__(value)
    if isinstance(value, list):
        return "[\n   " + _ITEM.join(_json_scalar(v) for v in value) + "\n  ]" if value else "[]"
    raise TypeError(f"cannot write {type(value).__name__} to JSON")


def _csv_cell(value):
    value = plain(value)
    if value is None:
        return ""
    if isinstance(value, list):
        return ";".join(_csv_cell(v) for v in value)
    return float.__repr__(value) if isinstance(value, float) else str(value)


def _grouped(texts, n, width, empty, wrap):
    if width == 0:
        return [empty] * n
    return [wrap(texts[i * width : (i + 1) * width]) for i in range(n)]


def _json_column(column, n):
    """The JSON text of each row's value in ``column``."""
    if isinstance(column, np.ndarray) and column.dtype.kind == "f" and column.ndim in (1, 2):
        texts = _float_texts(column, "null")
        if column.ndim == 1:
            return texts
        return _grouped(texts, n, column.shape[1], "[]", lambda t: "[\n   " + _ITEM.join(t) + "\n  ]")
    return [_json_scalar(v) for v in column]


def _csv_column(column, n):
    """The CSV cell of each row's value in ``column``."""
    if isinstance(column, np.ndarray) and column.dtype.kind == "f" and column.ndim in (1, 2):
        texts = _float_texts(column, "")
        return texts if column.ndim == 1 else _grouped(texts, n, column.shape[1], "", ";".join)
    return [_csv_cell(v) for v in column]


def _length(columns):
    return len(next(iter(columns.values()))) if columns else 0


def json_items(columns):
    """Each row as the JSON text ``json.dumps(rows, indent=1)`` writes for it inside the list."""
    n = _length(columns)
    parts = [[f'  {encode_basestring_ascii(key)}: {text}' for text in _json_column(col, n)] for key, col in columns.items()]
    if not parts:
        return [" {}"] * n
    return [" {\n" + ",\n".join(row) + "\n }" for row in zip(*parts)]


def csv_rows(columns):
    """Each row as the list of CSV cells of :func:`~lampcalc.io.serialise.cell`."""
    n = _length(columns)
    return list(zip(*(_csv_column(col, n) for col in columns.values()))) if columns else [()] * n


class JsonRows:
    """A JSON list of row objects written to ``handle`` a chunk at a time; :meth:`finish` closes it."""

    def __init__(self, handle):
        self.handle = handle
        self.count = 0

    def write(self, columns):
        items = json_items(columns)
        if items:
            self.handle.write(("[\n" if self.count == 0 else ",\n") + ",\n".join(items))
            self.count += len(items)

    def finish(self):
        self.handle.write("[]\n" if self.count == 0 else "\n]\n")


class CsvRows:
    """CSV rows written to ``handle`` a chunk at a time, after a header of the column names."""

    def __init__(self, handle, header):
        self.writer = csv.writer(handle, lineterminator="\n")
        self.writer.writerow(header)

    def write(self, columns):
        self.writer.writerows(csv_rows(columns))

    def finish(self):
        """Nothing to close: every row is written."""


def json_of_columns(columns):
    """The whole table as ``json.dumps(rows, indent=1) + "\\n"`` writes it."""
    out = io.StringIO()
    writer = JsonRows(out)
    writer.write(columns)
    writer.finish()
    return out.getvalue()


def csv_of_columns(columns):
    """The whole table as CSV text: a header of the keys, then one line per row."""
    out = io.StringIO()
    writer = CsvRows(out, list(columns))
    writer.write(columns)
    return out.getvalue()
