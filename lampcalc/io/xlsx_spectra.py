"""Spectra in Excel workbooks (``.xlsx``), read with openpyxl.

Every sheet that holds a table of spectra is read as a text file is
(:mod:`~lampcalc.io.spectrum_table`): wavelengths in a column or a row, metadata cells above
the table (``quantity`` | ``flux``; ``electrical_W`` | 10 | 12 …), a header row with names,
units and angles. Sheets without a table (notes, charts) are passed over; the sheets' tables
must share one wavelength axis. Places in messages are the sheet and the cell (``sheet
'LED', cell C14``). Formulas are read by their saved values.
"""

import io
import warnings
import zipfile
from pathlib import Path

import numpy as np

from ..errors import InputError

from .spectrum_checks import Where
from .spectrum_table import Rows, find_start, read_table
from .text_cells import looks_numeric

#: Largest uncompressed workbook read, bytes: a guard against archives that expand without end.
MAX_UNCOMPRESSED_BYTES = 1 << 30
#: Most cells read from one workbook.
MAX_CELLS = 20_000_000


def _cell(value):
    if value is None:
        return ""
    if isinstance(value, bool):
        return str(value).upper()
    if isinstance(value, int):
        try:
            return float(value)
        except OverflowError:
            return float("inf")
    if isinstance(value, float):
        return value
    return str(value).strip()


def _load_sheets(raw, where):
    """``[(title, [(row_number, offset, cells), …]), …]`` of every worksheet, read with openpyxl."""
    import openpyxl

    try:
        with zipfile.ZipFile(io.BytesIO(raw)) as archive:
            if sum(info.file_size for info in archive.infolist()) > MAX_UNCOMPRESSED_BYTES:
                raise where(f"the workbook expands to more than {MAX_UNCOMPRESSED_BYTES >> 20} MB; not read")
    except zipfile.BadZipFile:
        raise where("not an .xlsx workbook (not a zip archive)") from None
    sheets, n_cells = [], 0
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")  # openpyxl's notes on styles and extensions it does not read
            book = openpyxl.load_workbook(io.BytesIO(raw), read_only=True, data_only=True)
            try:
                for sheet in book.worksheets:
                    sheet.reset_dimensions()  # a sheet's stated size may be wrong; read what is there
                    rows = []
                    for number, row in enumerate(sheet.iter_rows(values_only=True), start=1):
                        n_cells += len(row)
                        if n_cells > MAX_CELLS:
                            raise where(f"the workbook has more than {MAX_CELLS:,} cells; not read")
                        cells = [_cell(v) for v in row]
                        filled = [i for i, c in enumerate(cells) if c != ""]
                        if filled:
                            rows.append((number, filled[0], cells[filled[0] : filled[-1] + 1]))
                    sheets.append((sheet.title, rows))
            finally:
                book.close()
    except InputError:
        raise
    except Exception as err:  # noqa: BLE001 - openpyxl raises many kinds on a damaged workbook
        detail = (str(err).splitlines() or [""])[0][:80]
        raise where(f"not a readable .xlsx workbook ({type(err).__name__}{': ' + detail if detail else ''})") from None
    return sheets


def sheet_rows(title, rows):
    """The :class:`~lampcalc.io.spectrum_table.Rows` of one sheet."""
    from openpyxl.utils import get_column_letter

    numbers = [n for n, _, _ in rows]
    offsets = [o for _, o, _ in rows]
    cells = [c for _, _, c in rows]
    decimal_comma = any(isinstance(c, str) and "," in c and looks_numeric(c, True) for row in cells for c in row)
    sheet = f"sheet {title!r}"
    return Rows(
        cells=cells,
        numbers=numbers,
        row_place=lambda r: f"{sheet}, row {numbers[r]}",
        cell_place=lambda r, c: f"{sheet}, cell {get_column_letter(offsets[r] + c + 1)}{numbers[r]}",
        column_place=lambda r, c: f"{sheet}, column {get_column_letter(offsets[r] + c + 1)}",
        decimal_comma=decimal_comma,
    )


def read_spectra_xlsx(raw, path="<xlsx>", *, wavelength_unit=None, quantity=None):
    """The spectra of every sheet of a workbook that holds a table, as one :class:`SpectralBatch`.

    Parameters
    ----------
    raw : bytes
        The workbook file's bytes.
    path : str
        The path as given: named in messages and in each lamp's ``source``.

    Raises
    ------
    InputError
    """
    from ..spectra.batch import SpectralBatch

    where = Where(path)
    tables = [(title, sheet_rows(title, rows)) for title, rows in _load_sheets(raw, where) if rows]
    tables = [(title, rows) for title, rows in tables if find_start(rows)[0] is not None]
    if not tables:
        raise where("no sheet holds a table of spectra (a wavelength column and a column per lamp, or rows)")
    stem = Path(str(path)).stem
    batches = [
        read_table(rows, where, title if len(tables) > 1 else stem, wavelength_unit=wavelength_unit, quantity=quantity)
        for title, rows in tables
    ]
    seen = {}
    for batch in batches:
        for name, source in zip(batch.names, batch.sources):
            if name in seen:
                raise where(f"lamp name {name!r} is used twice ({seen[name]} and {source})")
            seen[name] = source
    for (title, _), batch in zip(tables, batches):
        if not np.array_equal(batch.wavelength_nm, batches[0].wavelength_nm):
            raise where(
                f"sheet {title!r} has other wavelengths than sheet {tables[0][0]!r}; a workbook is read with one "
                "wavelength axis: put each sheet in a file of its own"
            )
    return SpectralBatch.concatenate(batches)
