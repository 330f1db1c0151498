"""Delimited text spectra, as instruments and spreadsheets export them.

Comma, semicolon, tab or whitespace separated; quoted cells; decimal commas (``0,123``,
also quoted in a comma-separated file: ``"0,123"``). One lamp per column (a wavelength
column first) or one lamp per row (a row of wavelengths first). Comment lines (``#``,
``%``, ``//``), metadata lines and a header row before the table; blank lines anywhere and
footer lines after it. See :mod:`~lampcalc.io.spectrum_table` for how the table is found
and ``docs/spectrum-files.md`` for the forms. Reading is linear in the size of the text.
"""

import re
from pathlib import Path

from .spectrum_checks import Where
from .spectrum_table import Rows, read_table
from .text_cells import choose_delimiter, split_cells, strip_comment

_DATA_START = frozenset("0123456789+-.\"'")
_DIGIT_COMMA_DIGIT = re.compile(r"[0-9],[0-9]")


def _sample_line(content):
    """A line of the table to tell the separator by: the middle one of those that start like a number."""
    numeric = [line for _, line in content if line[:1] in _DATA_START]
    pool = numeric or [line for _, line in content]
    return pool[len(pool) // 2]


def text_rows(text, where):
    """The rows of cells of a text table (see :class:`~lampcalc.io.spectrum_table.Rows`)."""
    content, comments = [], []
    for number, line in enumerate(text.splitlines(), start=1):
        stripped = line.strip()
        if not stripped:
            continue
        comment = strip_comment(stripped)
        if comment is None:
            content.append((number, stripped))
        else:
            comments.append((number, comment))
    if not content:
        raise where("no table found: every line is blank or a comment")
    delimiter, decimal_comma = choose_delimiter(_sample_line(content))
    if delimiter != ",":
        # Decimal commas anywhere in the table's lines decide for the whole file.
        decimal_comma = decimal_comma or any(
            _DIGIT_COMMA_DIGIT.search(line) for _, line in content if delimiter is None or delimiter in line
        )
    cells, numbers, fast, broken = [], [], [], {}
    for number, line in content:
        try:
            row = split_cells(line, delimiter)
        except ValueError as err:
            broken[len(cells)] = f"cannot be split into cells ({err})"
            row = [line]
        cells.append(row)
        numbers.append(number)
        fast.append(line.isascii() and "_" not in line and not (decimal_comma and "." in line))
    return Rows(
        cells=cells,
        numbers=numbers,
        row_place=lambda r: f"line {numbers[r]}",
        cell_place=lambda r, c: f"line {numbers[r]}, column {c + 1}",
        column_place=lambda r, c: f"column {c + 1}",
        decimal_comma=decimal_comma,
        fast=fast,
        comments=comments,
        broken=broken,
        delimiter=delimiter,
    )


def read_spectra_text(text, path="<text>", *, wavelength_unit=None, quantity=None):
    """Parse delimited text (see the module docstring) into a :class:`SpectralBatch`.

    Parameters
    ----------
    text : str
    path : str
        The path as given: named in messages and in each lamp's ``source``.
    wavelength_unit : {"nm", "um"}, optional
        Overrides the file's ``wavelength_unit`` metadata and header; nm if none says.
    quantity : str, optional
        Overrides the file's ``quantity`` metadata; ``"relative"`` if neither it nor a unit says.

    Raises
    ------
    InputError
    """
    where = Where(path)
    return read_table(text_rows(text, where), where, Path(str(path)).stem, wavelength_unit=wavelength_unit,
                      quantity=quantity)
