"""Delimited text spectra, as instruments and spreadsheets export them.

Comma, semicolon, tab or whitespace separated; the first column is the wavelength and
every further column one lamp. Comment lines (``#``, ``%``, ``//``) and metadata lines
may come before the table; a header row of names is optional. Semicolon-, tab- and
whitespace-separated files may use decimal commas (``0,123``). Metadata lines of the
form ``key: value`` (or ``key = value``, or ``key<delimiter>value``) may set
``quantity`` (relative, flux, irradiance, radiance), ``electrical_W`` and ``angle_deg``
(one value, or one per lamp) and ``wavelength_unit`` (nm or um). See ``docs/spectrum-files.md``.
"""

import re
from pathlib import Path

import numpy as np

from ..spectra.batch import QUANTITY_UNITS
from .spectrum_checks import Where, build_batch, check_wavelengths, to_nm

_COMMENT = ("#", "%", "//")
_NUMBER = re.compile(r"^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$")
_NONFINITE = re.compile(r"^[+-]?(nan|inf|infinity)$", re.IGNORECASE)
_META = re.compile(r"^\s*([A-Za-z_][\w ]*?)\s*[:=]\s*(.*?)\s*$")


def _split(line, delimiter):
    line = line.strip()
    if delimiter is None:
        cells = line.split()
    else:
        if line.endswith(delimiter):
            line = line[: -len(delimiter)]
        cells = [c.strip() for c in line.split(delimiter)]
    return [c[1:-1].strip() if len(c) >= 2 and c[0] == c[-1] and c[0] in "\"'" else c for c in cells]


def _is_number(cell, decimal_comma=False):
    if decimal_comma:
        cell = cell.replace(",", ".")
    return bool(_NUMBER.match(cell))


def _choose_delimiter(line):
    """Delimiter of a data line, and whether its numbers use decimal commas."""
    for delimiter in ("\t", ";"):
        if delimiter in line:
            return delimiter, "," in line
    if "," in line:
        if all(_is_number(c) for c in _split(line, ",")):
            return ",", False
        if all(_is_number(c, True) for c in _split(line, None)):
            return None, True
        return ",", False
    return None, False


def _parse_metadata(lines, delimiter):
    """``{key: value}`` from metadata and comment lines before the table."""
    meta = {}
    for number, line in lines:
        text = line.strip()
        for mark in _COMMENT:
            if text.startswith(mark):
                text = text[len(mark):]
                break
        match = _META.match(text)
        if match:
            key, value = match.group(1), match.group(2)
        elif delimiter is not None and delimiter in text:
            key, _, value = text.partition(delimiter)
        else:
            continue
        key = key.strip().lower().replace(" ", "_")
        meta[key] = (number, value.strip().strip(delimiter or " ").strip())
    return meta


def _metadata_quantity(meta, where):
    if "quantity" not in meta:
        return None
    line, value = meta["quantity"]
    value = value.lower()
    if value not in QUANTITY_UNITS:
        raise where(f"unknown quantity {value!r}; use one of {', '.join(QUANTITY_UNITS)}", line)
    return value


def _metadata_per_lamp(meta, key, label, n_lamps, where, decimal_comma, positive):
    """One number for every lamp, or one per lamp, from a metadata line (None if absent)."""
    if key not in meta:
        return None
    line, value = meta[key]
    cells = [c for c in re.split(r"[;\t ]+" if decimal_comma else r"[,;\t ]+", value) if c]
    try:
        numbers = [_number(c, decimal_comma) for c in cells]
    except ValueError:
        raise where(f"{label} {value!r} is not a number", line) from None
    if len(numbers) == 1:
        numbers = numbers * n_lamps
    if len(numbers) != n_lamps or (positive and any(not (w > 0) for w in numbers)):
        kind = "positive value" if positive else "value"
        raise where(f"{label} needs one {kind} or one per lamp ({n_lamps}), got {value!r}", line)
    return numbers


def _number(cell, decimal_comma):
    if _NONFINITE.match(cell):
        raise ValueError("non-finite")
    if not _is_number(cell, decimal_comma):
        raise ValueError("not a number")
    return float(cell.replace(",", ".") if decimal_comma else cell)


def read_spectra_text(text, path="<text>", *, wavelength_unit=None, quantity=None):
    """Parse delimited text (see the module docstring) into a :class:`SpectralBatch`.

    Parameters
    ----------
    text : str
    path : str
        Used in messages and provenance.
    wavelength_unit : {"nm", "um"}, optional
        Overrides the file's ``wavelength_unit`` metadata; nm if neither says.
    quantity : str, optional
        Overrides the file's ``quantity`` metadata; ``"relative"`` if neither says.

    Raises
    ------
    InputError
    """
    where = Where(path)
    numbered = [(i + 1, line) for i, line in enumerate(text.splitlines())]
    content = [(n, line) for n, line in numbered if line.strip() and not line.strip().startswith(_COMMENT)]
    if not content:
        raise where("no table found: every line is blank or a comment")
    delimiter, decimal_comma = _choose_delimiter(content[-1][1])

    start = next(
        (
            i
            for i, (_, line) in enumerate(content)
            if len(cells := _split(line, delimiter)) >= 2 and _is_number(cells[0], decimal_comma)
        ),
        None,
    )
    if start is None:
        raise where("no numeric table found (a wavelength column and at least one spectrum column)")
    width = len(_split(content[start][1], delimiter))
    header = None
    if start > 0 and len(cells := _split(content[start - 1][1], delimiter)) == width:
        header = cells
    before = [(n, line) for n, line in numbered if n < content[start][0]]
    meta = _parse_metadata(before, delimiter)

    rows, lines = [], []
    for number, line in content[start:]:
        cells = _split(line, delimiter)
        if len(cells) != width:
            raise where(f"ragged row: {len(cells)} fields where the table has {width}", number)
        row = []
        for column, cell in enumerate(cells, start=1):
            try:
                row.append(_number(cell, decimal_comma))
            except ValueError as err:
                name = header[column - 1] if header else None
                problem = "is not finite (NaN or infinity)" if str(err) == "non-finite" else "is not a number"
                raise where(f"{cell!r} {problem}", number, column, name) from None
        rows.append(row)
        lines.append(number)
    if len(rows) < 2:
        raise where("the table has fewer than two rows")
    data = np.array(rows)

    check_wavelengths(data[:, 0], lines, where)
    if wavelength_unit is None:
        wavelength_unit = meta.get("wavelength_unit", (None, "nm"))[1].lower().replace("µ", "u").replace("μ", "u")
    wl = to_nm(data[:, 0], wavelength_unit, header[0] if header else None, where)
    n_lamps = width - 1
    stem = Path(path).stem
    names = tuple(
        (header[k + 1] if header and header[k + 1] else f"{stem}_{k + 1}") for k in range(n_lamps)
    )
    quantity = quantity or _metadata_quantity(meta, where) or "relative"
    watts = _metadata_per_lamp(meta, "electrical_w", "electrical_W", n_lamps, where, decimal_comma, positive=True)
    angles = _metadata_per_lamp(meta, "angle_deg", "angle_deg", n_lamps, where, decimal_comma, positive=False)
    return build_batch(
        wl, data[:, 1:].T, names, quantity, watts, path, list(range(2, width + 1)), lines, where, angles
    )
