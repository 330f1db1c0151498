"""Large text tables of spectra: numbers parsed by NumPy, values kept on disk, lamps read in chunks.

A supplier's database export or a goniospectroradiometer's run is one plain table of
thousands to millions of lamps: one lamp per column (a wide CSV) or one lamp per row (a
long CSV). For such a file (:data:`FAST_MIN_BYTES` and more) the lines before the table and
its first rows go through the careful reader (:mod:`~lampcalc.io.spectrum_table`), which
finds the layout, the names, units and metadata; the numbers are then parsed by NumPy's
text reader (``numpy.loadtxt``, C) a block of lines at a time and written to a temporary
file that has no name on disk (removed by the system when the file closes, also when
lampcalc is interrupted or killed), from which each chunk of lamps is read back. Every check of the careful reader is made, on the
whole file, before any lamp is handed on: a file is rated whole or refused whole.

Anything that is not a plain table (quotes, decimal commas, comment or footer lines among
the numbers, a ragged row, a cell NumPy cannot read, NaN, another encoding) sends the file
back to the careful reader, so that the user gets its exact one-line message.
"""

import tempfile

import numpy as np

from ..spectra.batch import SpectralBatch
from .delimited_text import text_rows
from .spectrum_checks import NEGATIVE_NOISE_LIMIT, Where, check_names, lamp_sources, value_problem
from .spectrum_table import ParsedNumbers, find_start, table_frame
from .text_cells import COMMENT_MARKS, looks_numeric, parse_number

#: Text files at least this large are read by this module; smaller ones by the careful reader.
FAST_MIN_BYTES = 4 << 20
#: Lines read with the careful reader at most to find the table (metadata, header, first rows).
HEAD_LINES = 200
#: Larger files that are not plain tables are refused: the careful reader holds about ten times a
#: file's size in memory.
CAREFUL_MAX_BYTES = 1 << 30
#: Text parsed by NumPy in one go, bytes (a block of lines).
BLOCK_BYTES = 8 << 20
_DATA_START = frozenset(b"0123456789+-.")
# Bytes that make a line not plain: quotes, and the line breaks of str.splitlines other than \n.
_ODD_BYTES = (b'"', b"\x0b", b"\x0c", b"\x1c", b"\x1d", b"\x1e")


class _NotPlain(Exception):
    """The file is not a plain table: the careful reader takes it. ``args``: (place, problem) when known."""


def _first_problem(block, delimiter, width, first_number):
    """(place, problem) of the first line of a block NumPy could not read, in the careful reader's words.

    ``width``: cells in a row of the table; ``first_number``: the first of them that holds a number.
    """
    from .text_cells import show, split_cells

    for number, raw in block:
        try:
            cells = split_cells(raw.decode("utf-8", "replace"), delimiter)
        except ValueError as err:
            return f"line {number}", f"cannot be split into cells ({err})"
        if len(cells) != width:
            return f"line {number}", f"{len(cells)} fields where the table has {width}"
        for c, cell in enumerate(cells[first_number:], start=first_number):
            try:
                parse_number(cell)
            except ValueError as err:
                return f"line {number}, column {c + 1}", f"{show(cell)} {err}"
    return None


def _odd(raw):
    return any(b in raw for b in _ODD_BYTES) or b"\r" in raw.rstrip(b"\r\n")


def _start(handle):
    """Skip a UTF-8 byte-order mark; _NotPlain for UTF-16, binary files and zip archives."""
    start = handle.read(4)
    if start[:2] in (b"\xff\xfe", b"\xfe\xff") or b"\x00" in start or start[:2] == b"PK":
        raise _NotPlain
    handle.seek(3 if start[:3] == b"\xef\xbb\xbf" else 0)


def _head_lines(handle, lines):
    """Add lines (text) to ``lines`` up to the next that starts with a number; False at the end of the file."""
    while len(lines) < HEAD_LINES:
        raw = handle.readline()
        if not raw:
            return False
        if _odd(raw.replace(b'"', b"")):
            raise _NotPlain
        try:
            lines.append(raw.decode("utf-8").rstrip("\r\n"))
        except UnicodeDecodeError:
            raise _NotPlain from None
        first = raw.lstrip()[:1]
        if first and first[0] in _DATA_START:
            return True
    return False


def _table_head(handle, where):
    """The first lines, read until the careful reader finds the table in them: (lines, rows, start, layout).

    A wide table's head ends at its first row of numbers (its other rows are parsed by NumPy);
    a long table's holds up to :data:`HEAD_LINES` lines.
    """
    _start(handle)
    lines = []
    while True:
        more = _head_lines(handle, lines)
        rows = text_rows("\n".join(lines), where)
        start, layout = find_start(rows)
        if layout == "columns" or not more:
            return lines, rows, start, layout


class LargeText:
    """The spectra of one large text table, checked, their values in a temporary file.

    Use :func:`open_large_text`; then :meth:`chunks` hands out the lamps in order as
    :class:`SpectralBatch` objects on the file's wavelengths, and :meth:`close` (or a
    ``with`` block) removes the values from the disk.
    """

    def __init__(self, where, frame, layout, spool, n_wavelengths, raw_min):
        self.where, self.frame, self.layout = where, frame, layout
        self.spool, self.n_wavelengths = spool, n_wavelengths
        self.negative = raw_min < 0
        self.n_lamps = len(frame.names)

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()
        return False

    def close(self):
        """Remove the values from the disk."""
        self.spool.close()

    def _values(self, a, b):
        """Lamps ``a`` to ``b`` from the disk, shape (b - a, n_wavelengths).

        Read with ``pread`` rather than mapped: pages of a mapped file count in the process's
        resident memory, and the kernel maps them generously for a column cut across rows.
        """
        import os

        n, m, size = self.n_lamps, self.n_wavelengths, np.dtype(float).itemsize
        fd = self.spool.fileno()
        if self.layout == "columns":  # wavelength by wavelength on disk, as the file's rows
            rows = [os.pread(fd, (b - a) * size, (i * n + a) * size) for i in range(m)]
            return np.frombuffer(b"".join(rows), dtype=float).reshape(m, b - a).T.copy()
        data = os.pread(fd, (b - a) * m * size, a * m * size)
        return np.frombuffer(data, dtype=float).reshape(b - a, m).copy()

    def chunks(self, n_lamps):
        """Batches of at most ``n_lamps`` lamps each, in the file's order."""
        f = self.frame
        for a in range(0, self.n_lamps, n_lamps):
            b = min(a + n_lamps, self.n_lamps)
            values = np.clip(self._values(a, b) * f.scales[a:b, None], 0.0, None)
            yield SpectralBatch(
                wavelength_nm=f.wavelength_nm,
                values=values,
                names=f.names[a:b],
                quantity=f.quantities[a:b],
                sources=lamp_sources(self.where, f.lamp_places[a:b], f.units[a:b]),
                electrical_W=None if f.watts is None else f.watts[a:b],
                flags=[("negative_noise_clipped",) if neg else () for neg in self.negative[a:b]],
                angle_deg=f.angles[a:b],
            )

    def whole(self):
        """Every lamp in one batch (in memory)."""
        return SpectralBatch.concatenate(list(self.chunks(max(self.n_lamps, 1))))


def _blocks(handle, first):
    """Blocks of ``(line number, bytes)`` of the data lines, about :data:`BLOCK_BYTES` each."""
    block, size, number = [], 0, first
    for raw in handle:
        number += 1
        if not raw.strip():
            continue  # blank lines are passed over, as the careful reader does
        if _odd(raw):
            raise _NotPlain
        block.append((number, raw))
        size += len(raw)
        if size >= BLOCK_BYTES:
            yield block
            block, size = [], 0
    if block:
        yield block


def _parse(lines, delimiter, width, block=(), first_number=0):
    """The numbers of data lines (bytes), shape (len(lines), width); _NotPlain for anything odd.

    ``block``: the ``(line number, bytes)`` of the whole lines, to say which is not plain;
    ``first_number``: cells before the numbers on a whole line (a lamp row's name).
    """
    try:
        if not all(line.isascii() for line in lines):
            raise ValueError
        text = [line.decode("ascii") for line in lines]
        if any(t.lstrip().startswith(COMMENT_MARKS) for t in text):
            raise ValueError
        data = np.loadtxt(text, delimiter=delimiter, dtype=float, comments=None, quotechar=None, ndmin=2)
        if data.shape[1] != width or not np.all(np.isfinite(data)):
            raise ValueError
    except ValueError:
        raise _NotPlain(*(_first_problem(block, delimiter, width + first_number, first_number) or ())) from None
    return data


def _split_labels(lines, delimiter):
    """The first cells of lamp rows and the rest of each line."""
    labels, rest = [], []
    for line in lines:
        if delimiter is None:
            parts = line.split(None, 1)
            label, numbers = parts[0], parts[1] if len(parts) > 1 else b""
        else:
            label, _, numbers = line.partition(delimiter.encode())
        try:
            labels.append(label.decode("utf-8").strip())
        except UnicodeDecodeError:
            raise _NotPlain from None
        rest.append(numbers)
    if any(not label or looks_numeric(label) for label in labels):
        raise _NotPlain  # the careful reader ends the table there
    return labels, rest


def _spool_body(handle, rows, start, layout, width, spool, n_head_lines):
    """Parse the table's lines into ``spool``; returns wavelengths, labels, line numbers and per-lamp min, max, argmin."""
    delimiter = rows.delimiter
    joiner = delimiter or " "
    head = list(zip(rows.numbers[start:], rows.cells[start:]))
    numbers = []
    if layout == "rows":
        numbers.append(head[0][0])
        head = head[1:]
    first = [[(n, joiner.join(str(c) for c in cells).encode()) for n, cells in head]] if head else []
    labels, wavelengths, lows, highs, ats = [], [], [], [], []
    seen = 0
    for block in _chain(first, _blocks(handle, n_head_lines)):
        lines = [raw for _, raw in block]
        numbers.extend(n for n, _ in block)
        if layout == "rows":
            block_labels, lines = _split_labels(lines, delimiter)
            labels.extend(block_labels)
            data = _parse(lines, delimiter, width - 1, block, 1)
            lows.append(data.min(axis=1))
            highs.append(data.max(axis=1))
            ats.append(data.argmin(axis=1))
        else:
            data = _parse(lines, delimiter, width, block)
            wavelengths.append(data[:, 0].copy())  # not a view: it would keep the whole block
            data = np.ascontiguousarray(data[:, 1:])
            if not lows:
                lows, highs, ats = [data[0].copy()], [data[0].copy()], [np.zeros(width - 1, dtype=np.intp)]
            for row in data:  # row by row over all lamps: fast where a column-wise reduction is not
                lower = row < lows[0]  # strictly: on a tie the first wavelength stays, as argmin's
                np.copyto(lows[0], row, where=lower)
                np.copyto(ats[0], seen, where=lower)
                np.maximum(highs[0], row, out=highs[0])
                seen += 1
        spool.write(data.tobytes())
    spool.flush()
    if not lows:
        raise _NotPlain
    wl = np.concatenate(wavelengths) if wavelengths else None
    return wl, labels, numbers, (np.concatenate(lows), np.concatenate(highs), np.concatenate(ats))


def _chain(first, rest):
    yield from first
    yield from rest


def open_large_text(path, *, wavelength_unit=None, quantity=None):
    """The spectra of a large plain text table as a :class:`LargeText`, or None for the careful reader.

    None when the file is under :data:`FAST_MIN_BYTES` or is not a plain table (see the
    module docstring); :func:`~lampcalc.io.spectrum_files.read_spectra` then reads it.

    Raises
    ------
    InputError
        The careful reader's message for a plain table it would refuse (a wavelength that
        does not increase, a zero or negative spectrum, a lamp name used twice, metadata).
    """
    from pathlib import Path

    from ..errors import InputError

    where = Where(path)
    try:
        size = Path(path).stat().st_size if Path(path).is_file() else 0
    except OSError:
        return None
    if size < FAST_MIN_BYTES:
        return None
    spool = tempfile.TemporaryFile(prefix="lampcalc-spectra-")
    parsed = None
    try:
        with open(path, "rb") as handle:
            lines, rows, start, layout = _table_head(handle, where)
            if start is None or rows.decimal_comma or rows.broken:
                raise _NotPlain
            width = len(rows.cells[start])
            wl, labels, numbers, stats = _spool_body(handle, rows, start, layout, width, spool, len(lines))
        if layout == "columns":  # the first rows' cells are on disk now: keep only what finds the table
            rows.cells[start:] = [[rows.cells[start][0]] + [""] * (width - 1)]
        if layout == "rows":
            wl = np.array([parse_number(c) for c in rows.cells[start][1:]])
        rows.numbers[start:] = numbers
        rows.cells += [[]] * (start + len(numbers) - len(rows.cells))  # the rows past the head: parsed above
        parsed = ParsedNumbers(end=start + len(numbers), labels=labels, wavelengths=wl)
        frame, _ = table_frame(rows, where, Path(str(path)).stem, parsed=parsed, wavelength_unit=wavelength_unit,
                               quantity=quantity)
        large = _checked(where, frame, layout, spool, stats)
    except (_NotPlain, ValueError) as err:
        spool.close()
        if size > CAREFUL_MAX_BYTES:  # the careful reader would need tens of GB: say what is not plain
            place, problem = err.args if isinstance(err, _NotPlain) and err.args else (None, "is not a plain table")
            raise where(f"{problem}; a file over {CAREFUL_MAX_BYTES >> 30} GB is read only as a plain table "
                        "(docs/scale.md)", place) from None
        return None
    except InputError:
        spool.close()
        if parsed is None:  # in the first lines only: the careful reader reads the whole file
            return None
        raise
    except BaseException:
        spool.close()
        raise
    return large


def _checked(where, frame, layout, spool, stats):
    """The careful reader's checks of values and names, in its order, on the whole table."""
    lo, hi, at = stats
    low, high = lo * frame.scales, hi * frame.scales
    if not (np.all(np.isfinite(low)) and np.all(np.isfinite(high))):
        raise _NotPlain  # beyond a float once scaled: the careful reader says where
    bad = np.flatnonzero((high <= 0) | (low < -NEGATIVE_NOISE_LIMIT * high))
    if bad.size:
        k = int(bad[0])
        raise value_problem(k, float(high[k]), int(at[k]), low[k], frame.wavelength_nm, frame.names,
                            frame.lamp_places, frame.value_place, where)
    check_names(frame.names, frame.lamp_places, where)
    return LargeText(where, frame, layout, spool, frame.wavelength_nm.size, lo)
