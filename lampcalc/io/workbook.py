"""Writing tables to an Excel workbook (``.xlsx``) with openpyxl, atomically.

One sheet per table, a bold header row that stays in view, numbers as numbers and
nulls as empty cells. Text is always written as text: a lamp name beginning with ``=``
from a supplier's file never becomes a formula.
"""

import math
import warnings

from .atomic import atomic_path

#: Excel's longest text in a cell.
MAX_CELL_CHARACTERS = 32767
#: Excel's rows in a sheet (the header is one of them).
MAX_ROWS = 1_048_576


def _cell(sheet, value, bold=False):
    from openpyxl.cell import WriteOnlyCell
    from openpyxl.cell.cell import ILLEGAL_CHARACTERS_RE
    from openpyxl.styles import Font

    if isinstance(value, float) and not math.isfinite(value):
        value = None
    if isinstance(value, (list, tuple)):
        value = "; ".join(str(v) for v in value)
    cell = WriteOnlyCell(sheet, value=None)
    if isinstance(value, str):
        value = ILLEGAL_CHARACTERS_RE.sub("", value)
        if len(value) > MAX_CELL_CHARACTERS:
            value = value[: MAX_CELL_CHARACTERS - 1] + "…"
        cell.value = value
        cell.data_type = "s"  # text stays text, also when it starts with "="
    else:
        cell.value = value
    if bold:
        cell.font = Font(bold=True)
    return cell


class WorkbookWriter:
    """A workbook written a sheet at a time, each sheet a chunk of rows at a time (openpyxl's write-only mode).

    Rows go to the sheet's temporary file as they are added, so a workbook of a million
    rows is written in flat memory; :meth:`save` writes the file, through a temporary file.
    """

    def __init__(self):
        import openpyxl

        with warnings.catch_warnings():
            warnings.simplefilter("ignore")  # openpyxl's notes are not the user's business
            self.book = openpyxl.Workbook(write_only=True)
        self.sheet = None
        self.rows = 0

    def add_sheet(self, title, header):
        """Start a sheet with a bold header row that stays in view."""
        self.sheet = self.book.create_sheet(title[:31])
        self.sheet.freeze_panes = "A2"
        self.sheet.append([_cell(self.sheet, h, bold=True) for h in header])
        self.rows = 1

    def add_rows(self, rows):
        """Append rows to the current sheet; values are numbers, text, booleans or None."""
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            for row in rows:
                self.sheet.append([_cell(self.sheet, v) for v in row])
                self.rows += 1

    def save(self, path):
        """Write the workbook to ``path`` (through a temporary file)."""
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            with atomic_path(path) as tmp:
                self.book.save(tmp)


def write_workbook(path, sheets):
    """Write ``sheets`` to ``path`` as one workbook, through a temporary file.

    Parameters
    ----------
    path : str or Path
    sheets : sequence of (str, sequence of str, iterable of sequence)
        ``(title, header, rows)`` per sheet; values are numbers, text, booleans or None.
    """
    book = WorkbookWriter()
    for title, header, rows in sheets:
        book.add_sheet(title, header)
        book.add_rows(rows)
    book.save(path)
