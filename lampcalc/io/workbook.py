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


def write_workbook(path, sheets):
    """Write ``sheets`` to ``path`` as one workbook, through a temporary file.

    Parameters
    ----------
    path : str or Path
    sheets : sequence of (str, sequence of str, iterable of sequence)
        ``(title, header, rows)`` per sheet; values are numbers, text, booleans or None.
    """
    import openpyxl

    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # openpyxl's notes are not the user's business
        book = openpyxl.Workbook(write_only=True)
        for title, header, rows in sheets:
            sheet = book.create_sheet(title[:31])
            sheet.freeze_panes = "A2"
            sheet.append([_cell(sheet, h, bold=True) for h in header])
            for row in rows:
                sheet.append([_cell(sheet, v) for v in row])
        with atomic_path(path) as tmp:
            book.save(tmp)
