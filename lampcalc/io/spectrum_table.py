"""Finding the table of spectra in rows of cells, as text files and spreadsheets hold them.

The rows come from a text file (:mod:`~lampcalc.io.delimited_text`) or a sheet of a workbook
(:mod:`~lampcalc.io.xlsx_spectra`); both are read here the same way (``docs/spectrum-files.md``):

- **one lamp per column**: a wavelength column, then one column per lamp; or
- **one lamp per row**: a row of wavelengths (its first cell a label), then one row per lamp
  with the lamp's name in its first cell.

Rows before the table are metadata (``quantity``, ``unit``, ``electrical_W``, ``angle_deg``,
``wavelength_unit``); a header row names the lamps and may give each a unit
(``Lamp A [mW/nm]``) and an angle (``QF-DL-4000@30deg``); a row of units may follow the header.
The table ends at the first row that does not continue it; text after it (a footer) is
ignored, numbers after it are refused.
"""

from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from .metadata import Metadata
from .radiometric_units import parse_unit, unit_in_header
from .spectrum_checks import build_batch, check_wavelengths, to_nm
from .text_cells import looks_numeric, parse_number, show


@dataclass
class Rows:
    """The non-blank rows of one text file or sheet, and how to name places in them.

    ``cells[r]`` is a list of str (text) or float (a spreadsheet's numbers), trailing empty
    cells removed. ``numbers[r]`` is the row's line or row number. ``fast[r]`` is true for
    text rows whose cells Python's ``float`` reads exactly as :func:`parse_number` would.
    """

    cells: list
    numbers: list
    row_place: callable
    cell_place: callable
    column_place: callable
    decimal_comma: bool = False
    fast: list = None
    comments: list = field(default_factory=list)  # (number, text) of comment lines
    broken: dict = field(default_factory=dict)  # row index -> why its cells could not be split
    delimiter: str = None  # of a text table (None: runs of blanks)

    def is_number(self, cell):
        if isinstance(cell, float):
            return True
        return isinstance(cell, str) and looks_numeric(cell, self.decimal_comma)


def _wavelength_row(rows, r):
    """True if row ``r`` is a label then at least two increasing numbers, and the row after names a lamp."""
    cells = rows.cells[r]
    if len(cells) < 3 or rows.is_number(cells[0]) or r + 1 >= len(rows.cells):
        return False
    after = rows.cells[r + 1]
    if len(after) != len(cells) or rows.is_number(after[0]) or after[0] == "" or not rows.is_number(after[1]):
        return False
    try:
        wl = [parse_number(c, rows.decimal_comma) if isinstance(c, str) else c for c in cells[1:]]
    except ValueError:
        return False
    return all(b > a for a, b in zip(wl, wl[1:]))


def find_start(rows):
    """Row index where the table starts and its layout ("columns" or "rows"); (None, None) if none."""
    for r, cells in enumerate(rows.cells):
        if len(cells) >= 2 and rows.is_number(cells[0]):
            return r, "columns"
        if _wavelength_row(rows, r):
            return r, "rows"
    return None, None


def _extent(rows, start, width, layout, where):
    """The first row after the table, checking each row of it is as wide as the table."""
    def continues(cells):
        if layout == "columns":
            return len(cells) >= 1 and rows.is_number(cells[0])
        return len(cells) >= 2 and cells[0] != "" and not rows.is_number(cells[0]) and rows.is_number(cells[1])

    end = start + 1
    while end < len(rows.cells) and continues(rows.cells[end]):
        if len(rows.cells[end]) != width:
            raise where(f"ragged row: {len(rows.cells[end])} fields where the table has {width}", rows.row_place(end))
        end += 1
    if end < len(rows.cells) and end in rows.broken:
        raise where(rows.broken[end], rows.row_place(end))
    for r in range(end + 1, len(rows.cells)):
        cells = rows.cells[r]
        if len(cells) >= 2 and (continues(cells) or rows.is_number(cells[0])):
            raise where(
                f"numbers after the end of the table, which ended at {rows.row_place(end)} "
                f"({show(rows.cells[end][0])}); a table must not be broken by text",
                rows.row_place(r),
            )
    return end


def _numbers(rows, r_range, c0, where, label):
    """The numbers of rows ``r_range`` from column ``c0`` on: an array, each cell read strictly.

    ``label(r, c)`` names the lamp a cell belongs to, for messages.
    """
    block = np.empty((len(r_range), len(rows.cells[r_range[0]]) - c0))
    for j, r in enumerate(r_range):
        cells = rows.cells[r][c0:]
        if rows.fast is not None and rows.fast[r]:
            try:
                block[j] = [float(c.replace(",", ".")) for c in cells] if rows.decimal_comma else cells
                continue
            except ValueError:
                pass
        for c, cell in enumerate(cells):
            block[j, c] = _cell_number(rows, r, c0 + c, cell, where, label)
    bad = ~np.isfinite(block)
    if bad.any():  # "nan", "inf" and "1e999" pass float(); say which it was, where it stands
        j, c = (int(n) for n in np.argwhere(bad)[0])
        _cell_number(rows, r_range[j], c0 + c, rows.cells[r_range[j]][c0 + c], where, label)
    return block


def _cell_number(rows, r, c, cell, where, label):
    if isinstance(cell, float):
        if np.isfinite(cell):
            return cell
        problem = "is not finite (NaN)" if cell != cell else "is beyond the range of a float (about ±1.8e308)"
        raise where(problem, rows.cell_place(r, c), label(r, c))
    if cell == "":
        raise where("is empty where the table needs a number", rows.cell_place(r, c), label(r, c))
    try:
        return parse_number(cell, rows.decimal_comma)
    except ValueError as err:
        raise where(f"{show(cell)} {err}", rows.cell_place(r, c), label(r, c)) from None


def _lamp_header(cell, where, place):
    """Name, unit and angle from a lamp's header cell: ``"QF-DL-4000@30deg [mW/nm]"``."""
    name, unit = unit_in_header(str(cell))
    angle = np.nan
    head, at, tail = name.rpartition("@")
    if at and tail.lower().endswith("deg"):
        try:
            angle = parse_number(tail[:-3].strip())
        except ValueError as err:
            raise where(f"the angle in the lamp name {show(name)} {err}", place) from None
    return name, unit, angle


def _quantities(units, meta_quantity, override, places, where):
    """Quantity and scale of each lamp from its unit, the file's ``quantity`` and the option."""
    quantities, scales = [], []
    for unit, place in zip(units, places):
        unit_quantity, scale = "relative", 1.0
        if unit is not None:
            try:
                unit_quantity, scale = parse_unit(unit) or (None, None)
            except ValueError as err:
                if override != "relative":
                    raise where(str(err), place) from None
            if unit_quantity is None:
                raise where(f"unknown unit {show(unit)}; see docs/spectrum-files.md for the units read", place)
        quantity = override or meta_quantity or unit_quantity
        absolute = unit_quantity != "relative"
        if absolute and quantity != unit_quantity and quantity != "relative":
            said = "--quantity" if override else "the file's quantity line"
            raise where(f"the unit {show(unit)} is a spectral {unit_quantity}, but {said} says {quantity}", place)
        quantities.append(quantity)
        scales.append(scale if absolute and quantity != "relative" else 1.0)
    return tuple(quantities), np.array(scales)


class Places(Sequence):
    """Where each lamp stands (``"column 3"``), made when asked: a million lamps need no million strings."""

    def __init__(self, place, n):
        self.place, self.n = place, n

    def __len__(self):
        return self.n

    def __getitem__(self, k):
        if isinstance(k, slice):
            return [self.place(i) for i in range(*k.indices(self.n))]
        if not -self.n <= k < self.n:
            raise IndexError(k)
        return self.place(k % self.n)


@dataclass
class TableFrame:
    """Everything of a table but its values: lamps, their units and places, wavelengths in nm.

    What :func:`table_frame` reads; :meth:`batch` adds the values. A reader that parses the
    numbers itself (:mod:`~lampcalc.io.large_tables`) uses the frame for the same checks
    and messages.
    """

    wavelength_nm: np.ndarray
    names: tuple
    quantities: tuple
    scales: np.ndarray  # per lamp: file values times scale are in the units of its quantity
    units: list  # per lamp, the unit its values were given in (None when relative)
    lamp_places: Sequence
    value_place: callable  # (k, i) -> place of lamp k's value at wavelength i
    watts: list
    angles: np.ndarray

    def batch(self, values, where):
        """The batch of these lamps from ``values`` (n_lamps, n_wavelengths) as in the file."""
        return build_batch(
            self.wavelength_nm, values * self.scales[:, None], self.names, self.quantities, where=where,
            lamp_places=self.lamp_places, value_place=self.value_place, watts=self.watts, angles=self.angles,
            units=self.units,
        )


@dataclass
class ParsedNumbers:
    """The numbers of a table that a fast parser read: rows ``start`` to ``end`` of the :class:`Rows`.

    ``data`` is what :func:`_numbers` would return (None when the numbers stay on disk);
    ``labels`` the first cells of the lamp rows (layout "rows"); ``wavelengths`` the
    wavelength cells as numbers.
    """

    end: int
    data: np.ndarray = None
    labels: list = None
    wavelengths: np.ndarray = None


def read_table(rows, where, stem, *, wavelength_unit=None, quantity=None):
    """The spectra of one text file or sheet (see the module docstring) as a :class:`SpectralBatch`.

    Parameters
    ----------
    rows : Rows
    where : Where
    stem : str
        Names lamps that have no header: ``<stem>_1``, ``<stem>_2`` …
    wavelength_unit, quantity : str, optional
        Override what the file says.

    Raises
    ------
    InputError
    """
    frame, values = table_frame(rows, where, stem, wavelength_unit=wavelength_unit, quantity=quantity)
    return frame.batch(values, where)


def table_frame(rows, where, stem, *, wavelength_unit=None, quantity=None, parsed=None):
    """The :class:`TableFrame` of a table and its values as in the file, shape (n_lamps, n_wavelengths).

    ``parsed``: the numbers as a fast parser read them (:class:`ParsedNumbers`); the values
    returned are then None when ``parsed.data`` is None. The checks and their order are the
    careful reader's, so that every message is the same.

    Raises
    ------
    InputError
    """
    start, layout = find_start(rows)
    if start is None:
        raise where(
            "no numeric table found (a wavelength column and a column per lamp, "
            "or a row of wavelengths and a row per lamp)"
        )
    width = len(rows.cells[start])
    end = parsed.end if parsed else _extent(rows, start, width, layout, where)
    header_row = unit_row = None
    if layout == "columns":
        above = [r for r in (start - 1, start - 2) if r >= 0 and len(rows.cells[r]) == width]
        if above and above[0] == start - 1:
            header_row = start - 1
            if all(unit_in_header(str(c))[0] == "" and unit_in_header(str(c))[1] for c in rows.cells[header_row][1:]):
                unit_row, header_row = header_row, (start - 2 if start - 2 in above else None)
        if end - start < 2:
            raise where("the table has fewer than two rows", rows.row_place(start))
        names_row = rows.cells[header_row] if header_row is not None else None
        if parsed:
            data = parsed.data
            wl, values = parsed.wavelengths, None if data is None else data[:, 1:].T
        else:
            data = _numbers(rows, range(start, end), 0, where, lambda r, c: names_row[c] if names_row and c else None)
            wl, values = data[:, 0], data[:, 1:].T
        wl_places = [rows.cell_place(r, 0) for r in range(start, end)]
        lamp_places = Places(lambda k: rows.column_place(start, k + 1), width - 1)
        value_place = lambda k, i: rows.cell_place(start + i, k + 1)  # noqa: E731
        label_cells = rows.cells[header_row] if header_row is not None else [""] * width
        unit_cells = rows.cells[unit_row] if unit_row is not None else None
        first_data_row = header_row if header_row is not None else unit_row if unit_row is not None else start
    else:
        if end - start < 2:
            raise where("no lamp rows under the row of wavelengths", rows.row_place(start))
        if parsed:
            data = parsed.data
            wl, values = parsed.wavelengths, None if data is None else data[1:]
        else:
            data = _numbers(rows, range(start, end), 1, where, lambda r, c: rows.cells[r][0] if r > start else None)
            wl, values = data[0], data[1:]
        wl_places = [rows.cell_place(start, c) for c in range(1, width)]
        lamp_places = Places(lambda k: rows.row_place(start + 1 + k), end - start - 1)
        value_place = lambda k, i: rows.cell_place(start + 1 + k, i + 1)  # noqa: E731
        labels = parsed.labels if parsed else [rows.cells[r][0] for r in range(start + 1, end)]
        label_cells = [rows.cells[start][0], *labels]
        unit_cells, first_data_row = None, start
    n_lamps = len(lamp_places)

    names, units, angles = [], [], []
    for k in range(n_lamps):
        name, unit, angle = _lamp_header(label_cells[k + 1], where, lamp_places[k])
        if unit_cells is not None:
            unit = unit_in_header(str(unit_cells[k + 1]))[1]
        names.append(name or f"{stem}_{k + 1}")
        units.append(unit)
        angles.append(angle)
    first_number = rows.numbers[first_data_row]
    meta = Metadata.from_rows(
        [(rows.row_place(r), rows.cells[r]) for r in range(first_data_row)]
        + [(f"line {n}", [text]) for n, text in rows.comments if n < first_number],
        rows.decimal_comma,
        where,
    )
    file_unit = meta.text("unit")
    units = [u if u is not None else file_unit for u in units]
    quantities, scales = _quantities(units, meta.quantity(), quantity, lamp_places, where)

    wl_header = unit_in_header(str(unit_cells[0] if unit_cells is not None else label_cells[0]))
    declared = {"nm": "nm", "um": "um", "µm": "um", "μm": "um"}.get((wl_header[1] or "").strip())
    check_wavelengths(wl, wl_places, where)
    unit = wavelength_unit or meta.wavelength_unit() or declared or "nm"
    wl = to_nm(wl, unit, None if declared else str(label_cells[0]), where)
    watts = meta.per_lamp("electrical_w", "electrical_W", n_lamps, positive=True)
    file_angles = meta.per_lamp("angle_deg", "angle_deg", n_lamps, positive=False)
    angles = np.array(angles)
    if file_angles is not None:
        clash = np.isfinite(angles) & (angles != file_angles)
        if clash.any():
            k = int(np.flatnonzero(clash)[0])
            raise where(f"the lamp's name says {angles[k]:g} deg, the file's angle_deg line {file_angles[k]:g}",
                        lamp_places[k], names[k])
        angles = np.where(np.isfinite(angles), angles, file_angles)
    units = [u if q != "relative" else None for u, q in zip(units, quantities)]
    frame = TableFrame(wl, tuple(names), quantities, scales, units, lamp_places, value_place, watts, angles)
    return frame, values
