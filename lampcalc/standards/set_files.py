"""The file format of lampcalc's bin sets and ellipse sets: ``# key: value`` lines, then a CSV table.

A set file is UTF-8 text (``docs/standard-sets.md``)::

    # name: ANSI C78.377-2017 nominal CCT quadrangles
    # source: ANSI C78.377-2017, corner table
    # edition: ANSI C78.377-2017
    # confirmed: yes
    # space: xy
    bin,nominal_cct_K,x1,y1,x2,y2,x3,y3,x4,y4
    2700,2700,0.4813,0.4319,0.4562,0.4260,0.4373,0.3893,0.4593,0.3944

The metadata come first, one ``# key: value`` per line; ``name``, ``source``, ``edition``,
``confirmed`` (``yes`` or ``no``: whether the values were checked against the published
source) and ``space`` (``xy``, ``uv`` or ``upvp``: the chromaticity coordinates of the
table) are required, ``note`` is optional, and any other key is refused. Other lines
starting with ``#`` and blank lines are ignored. Then a header row and one row per bin or
ellipse, comma-separated, with a decimal point. This module reads that common frame; the
meaning of the columns belongs to :mod:`.bin_sets` and :mod:`.ellipse_sets`.
"""

import csv
import math
from dataclasses import dataclass

from ..errors import InputError

REQUIRED_KEYS = ("name", "source", "edition", "confirmed", "space")
OPTIONAL_KEYS = ("note",)
SPACES = ("xy", "uv", "upvp")
YES_NO = {"yes": True, "no": False}


@dataclass(frozen=True)
class SetTable:
    """A set file as read: its metadata, header and rows (each with its line number)."""

    path: str
    metadata: dict
    header: tuple
    rows: tuple  # ((line number, {column: cell text}), ...)

    @property
    def confirmed(self):
        return YES_NO[self.metadata["confirmed"]]

    def fail(self, line, message):
        """An InputError naming this file and ``line``."""
        return InputError(f"{self.path}, line {line}: {message}")


def read_set_table(path, allowed_columns, required_columns):
    """Read a set file's metadata and table.

    Parameters
    ----------
    path : str or path-like
    allowed_columns : sequence of str
        Every column the table may have; any other is refused.
    required_columns : sequence of str

    Raises
    ------
    InputError
        With the file and line: unreadable file, missing or unknown metadata, a bad
        ``confirmed`` or ``space`` value, an unknown, missing or repeated column, a ragged
        row, or no rows at all.
    """
    try:
        with open(path, encoding="utf-8-sig", newline="") as handle:
            text = handle.read()
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"{path}: cannot be read as a UTF-8 text file ({err})") from None
    metadata, table = {}, []
    for number, line in enumerate(text.splitlines(), start=1):
        stripped = line.strip()
        if not stripped:
            continue
        if stripped.startswith("#"):
            if table:
                continue
            key, sep, value = stripped[1:].partition(":")
            key = key.strip().lower()
            if not sep or " " in key:
                continue
            if key not in REQUIRED_KEYS + OPTIONAL_KEYS:
                raise InputError(
                    f"{path}, line {number}: unknown metadata key {key!r}; the keys are "
                    f"{', '.join(REQUIRED_KEYS + OPTIONAL_KEYS)}"
                )
            if key in metadata:
                raise InputError(f"{path}, line {number}: metadata key {key!r} is given twice")
            metadata[key] = value.strip()
            continue
        table.append((number, line))
    first = table[0][0] if table else 1
    for key in REQUIRED_KEYS:
        if not metadata.get(key):
            raise InputError(f"{path}, line {first}: metadata '# {key}: ...' is missing or empty before the table")
    if metadata["confirmed"].lower() not in YES_NO:
        raise InputError(f"{path}: '# confirmed: {metadata['confirmed']}' must be yes or no")
    metadata["confirmed"] = metadata["confirmed"].lower()
    if metadata["space"] not in SPACES:
        raise InputError(f"{path}: '# space: {metadata['space']}' must be one of {', '.join(SPACES)}")
    if len(table) < 2:
        raise InputError(f"{path}, line {first}: the table needs a header row and at least one row")
    try:
        cells = list(csv.reader([line for _, line in table]))
    except csv.Error as err:
        raise InputError(f"{path}: cannot be read as CSV ({err})") from None
    header = tuple(h.strip() for h in cells[0])
    if len(header) == 1 and ";" in header[0]:
        raise InputError(
            f"{path}, line {first}: the table is separated by ';'; set files are comma-separated with a decimal point"
        )
    for column in header:
        if column not in allowed_columns:
            raise InputError(
                f"{path}, line {first}: unknown column {column!r}; the columns are {', '.join(allowed_columns)}"
            )
        if header.count(column) > 1:
            raise InputError(f"{path}, line {first}: column {column!r} appears twice")
    for column in required_columns:
        if column not in header:
            raise InputError(f"{path}, line {first}: no {column!r} column (columns: {', '.join(header)})")
    rows = []
    for (number, _), row in zip(table[1:], cells[1:]):
        if len(row) != len(header):
            raise InputError(f"{path}, line {number}: {len(row)} fields where the header has {len(header)}")
        rows.append((number, dict(zip(header, (c.strip() for c in row)))))
    return SetTable(str(path), metadata, header, tuple(rows))


def number(table, line, row, column, *, positive=False, blank_ok=False):
    """The cell ``column`` of ``row`` as a finite float (NaN for a blank cell when ``blank_ok``).

    Raises
    ------
    InputError
        Naming the file, line and column, for a blank (unless allowed), malformed,
        non-finite or (with ``positive``) non-positive value.
    """
    text = row.get(column, "")
    if not text:
        if blank_ok:
            return math.nan
        raise table.fail(line, f"column {column!r} is blank")
    try:
        value = float(text)
    except ValueError:
        value = math.nan
    if not math.isfinite(value):
        raise table.fail(line, f"column {column!r}: {text!r} is not a number")
    if positive and value <= 0:
        raise table.fail(line, f"column {column!r}: {text!r} must be positive")
    return value


def row_confirmed(table, line, row):
    """The row's ``confirmed`` cell (yes/no), else the file's ``# confirmed``."""
    text = row.get("confirmed", "").lower()
    if not text:
        return table.confirmed
    if text not in YES_NO:
        raise table.fail(line, f"column 'confirmed': {row['confirmed']!r} must be yes, no or blank")
    return YES_NO[text]
