"""Tables of chromaticities in CSV files, converted to CCT and Duv in chunks.

The input is a CSV file with a header row naming the coordinates as ``x,y`` (CIE 1931),
``u,v`` (CIE 1960) or ``u_prime,v_prime`` (CIE 1976); other columns are carried
through. The output repeats each input row with ``cct_K``, ``duv``, ``ansi_nominal_cct_K``
and ``flag`` added (``docs/cct.md``). Files of any length stream through in chunks of rows.
"""

import contextlib
import csv
import json
import math
from pathlib import Path

import numpy as np

from ..errors import InputError
from .atomic import atomic_path
from .serialise import cell, plain

#: Coordinate column pairs, in the order they are looked for, and the coordinate system
#: they name (a key of :data:`lampcalc.colorimetry.locus.COORDINATE_SYSTEMS`).
COORDINATE_COLUMNS = {("x", "y"): "xy", ("u", "v"): "uv", ("u_prime", "v_prime"): "upvp"}
OUTPUT_COLUMNS = ("cct_K", "duv", "ansi_nominal_cct_K", "flag")


def _find_columns(header, path):
    names = [h.strip() for h in header]
    for pair in COORDINATE_COLUMNS:
        if all(p in names for p in pair):
            return pair, (names.index(pair[0]), names.index(pair[1]))
    raise InputError(
        f"{path}, line 1: no coordinate columns; the header needs x,y or u,v or u_prime,v_prime "
        f"(found {', '.join(names) or 'nothing'})"
    )


def iter_chunks(path, chunk_rows=100_000):
    """Read a chromaticity CSV in chunks.

    Yields
    ------
    header : list of str
    kind : tuple of str
        The coordinate pair found, e.g. ``("x", "y")``.
    rows : list of list of str
        The input rows of the chunk.
    coords : ndarray, shape (len(rows), 2)
        NaN for rows that could not be read.
    problems : list of str
        One message per unreadable row, naming its line.
    fraction : float
        Fraction of the file read so far (for a progress bar).
    """
    path = Path(path)
    size = max(path.stat().st_size, 1)
    read = [0]

    def counted(handle):
        for text in handle:
            read[0] += len(text)
            yield text

    with open(path, newline="", encoding="utf-8-sig") as handle:
        reader = csv.reader(counted(handle))
        try:
            header = next(reader)
        except StopIteration:
            raise InputError(f"{path}: the file is empty") from None
        except (UnicodeDecodeError, csv.Error):
            raise InputError(f"{path}: not a text CSV file") from None
        kind, (iu, iv) = _find_columns(header, path)
        rows, coords, problems = [], [], []
        line = 1
        while True:
            try:
                row = next(reader)
            except StopIteration:
                break
            except (UnicodeDecodeError, csv.Error) as err:
                raise InputError(f"{path}, line {line + 1}: cannot be read ({err})") from None
            line = reader.line_num
            if not "".join(row).strip():
                continue
            pair = [math.nan, math.nan]
            if len(row) != len(header):
                problems.append(f"{path}, line {line}: {len(row)} fields where the header has {len(header)}")
            else:
                try:
                    pair = [float(row[iu]), float(row[iv])]
                    if not (math.isfinite(pair[0]) and math.isfinite(pair[1])):
                        raise ValueError
                except ValueError:
                    problems.append(
                        f"{path}, line {line}: {kind[0]}, {kind[1]} = {row[iu]!r}, {row[iv]!r} are not two finite numbers"
                    )
                    pair = [math.nan, math.nan]
            rows.append(row)
            coords.append(pair)
            if len(rows) >= chunk_rows:
                yield header, kind, rows, np.array(coords), problems, min(read[0] / size, 1.0)
                rows, coords, problems = [], [], []
        yield header, kind, rows, np.array(coords).reshape(-1, 2), problems, 1.0


class RowWriter:
    """Writes converted rows as CSV or JSON to an open text file."""

    def __init__(self, handle, form):
        self.handle = handle
        self.form = form
        self.csv = csv.writer(handle, lineterminator="\n") if form == "csv" else None
        self.count = 0
        self.header = None

    def write(self, header, rows, cct, duv, nominal, flags):
        """Write rows with their CCT, Duv, ANSI nominal CCT (NaN: in none) and flag text."""
        if self.header is None:
            self.header = list(header) + list(OUTPUT_COLUMNS)
            if self.csv:
                self.csv.writerow(self.header)
            else:
                self.handle.write("[")
        cct, duv, nominal = ([plain(v) for v in np.asarray(a).tolist()] for a in (cct, duv, nominal))
        if self.csv:
            self.csv.writerows(
                row + [cell(c), cell(d), cell(n), f] for row, c, d, n, f in zip(rows, cct, duv, nominal, flags)
            )
            self.count += len(rows)
            return
        for row, c, d, n, f in zip(rows, cct, duv, nominal, flags):
            record = dict(zip(header, row))
            record.update(zip(OUTPUT_COLUMNS, (c, d, n, f)))
            self.handle.write(("," if self.count else "") + "\n " + json.dumps(record))
            self.count += 1

    def finish(self):
        if self.form == "json":
            self.handle.write(("[" if self.header is None else "") + "\n]\n")


@contextlib.contextmanager
def open_rows(path, form):
    """A :class:`RowWriter` on ``path`` (``form`` "csv" or "json"), written atomically.

    The file appears, complete, only when the ``with`` block ends without an error.
    """
    with atomic_path(path) as tmp, open(tmp, "w", newline="", encoding="utf-8") as handle:
        writer = RowWriter(handle, form)
        yield writer
        writer.finish()
