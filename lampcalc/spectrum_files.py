"""Reading and writing spectrum files.

Delimited text as instruments and spreadsheets export it, and lampcalc's own JSON form;
both are described in ``docs/spectrum-files.md``.

Delimited text
    Comma, semicolon, tab or whitespace separated; the first column is the wavelength and
    every further column one lamp. Comment lines (``#``, ``%``, ``//``) and metadata lines
    may come before the table; a header row of names is optional. Semicolon-, tab- and
    whitespace-separated files may use decimal commas (``0,123``). Metadata lines of the
    form ``key: value`` (or ``key = value``, or ``key<delimiter>value``) may set
    ``quantity`` (relative, flux, irradiance, radiance), ``electrical_W`` (one value,
    or one per lamp) and ``wavelength_unit`` (nm or um).

JSON
    ``{"lampcalc_spectra": 1, "quantity": ..., "wavelength_nm": [...],
    "lamps": [{"name": ..., "values": [...], "electrical_W": ...}, ...]}``.

Every problem raises :class:`~lampcalc.errors.InputError` with one line naming the file,
the line (1-based, as an editor counts) and the column.
"""

import json
import math
import re
from pathlib import Path

import numpy as np

from .atomic import write_atomic
from .errors import InputError
from .spectra import QUANTITY_UNITS, SpectralBatch

#: Negative values down to this fraction of the peak are taken as noise and clipped.
NEGATIVE_NOISE_LIMIT = 0.005
WAVELENGTH_UNITS = ("nm", "um")
JSON_FORMAT_KEY = "lampcalc_spectra"
JSON_FORMAT_VERSION = 1

_COMMENT = ("#", "%", "//")
_NUMBER = re.compile(r"^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$")
_NONFINITE = re.compile(r"^[+-]?(nan|inf|infinity)$", re.IGNORECASE)
_META = re.compile(r"^\s*([A-Za-z_][\w ]*?)\s*[:=]\s*(.*?)\s*$")
_MICRO = re.compile(r"(µm|μm|\bum\b|micro)", re.IGNORECASE)


class _Where:
    """Formats locations in one file for error messages."""

    def __init__(self, path):
        self.path = str(path)

    def __call__(self, message, line=None, column=None, name=None):
        where = [self.path]
        if line is not None:
            where.append(f"line {line}")
        if column is not None:
            where.append(f"column {column}" + (f" ({name!r})" if name else ""))
        return InputError(f"{', '.join(where)}: {message}")


def _decode(raw, where):
    if not raw.strip():
        raise where("the file is empty")
    if b"\x00" in raw[:8192]:
        raise where("this is a binary file, not a text table of spectra")
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        text = raw.decode("latin-1")
    control = sum(ch < " " and ch not in "\t\r\n\f" for ch in text[:8192])
    if control > 8:
        raise where("this is a binary file, not a text table of spectra")
    return text


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


def _metadata_watts(meta, n_lamps, where, decimal_comma):
    if "electrical_w" not in meta:
        return None
    line, value = meta["electrical_w"]
    cells = [c for c in re.split(r"[;\t ]+" if decimal_comma else r"[,;\t ]+", value) if c]
    try:
        watts = [_number(c, decimal_comma) for c in cells]
    except ValueError:
        raise where(f"electrical_W {value!r} is not a number", line) from None
    if len(watts) == 1:
        watts = watts * n_lamps
    if len(watts) != n_lamps or any(not (w > 0) for w in watts):
        raise where(f"electrical_W needs one positive value or one per lamp ({n_lamps}), got {value!r}", line)
    return watts


def _number(cell, decimal_comma):
    if _NONFINITE.match(cell):
        raise ValueError("non-finite")
    if not _is_number(cell, decimal_comma):
        raise ValueError("not a number")
    return float(cell.replace(",", ".") if decimal_comma else cell)


def _check_wavelengths(wl, lines, where):
    steps = np.diff(wl)
    bad = np.flatnonzero(steps <= 0)
    if bad.size:
        i = int(bad[0]) + 1
        if steps[i - 1] == 0:
            raise where(f"duplicate wavelength {wl[i]:g} (also on line {lines[i - 1]})", lines[i], 1)
        raise where(
            f"wavelength {wl[i]:g} is below the previous one, {wl[i - 1]:g}; wavelengths must increase",
            lines[i],
            1,
        )


def _to_nm(wl, unit, header_cell, where):
    if unit == "um":
        return wl * 1000.0
    if unit != "nm":
        raise where(f"unknown wavelength unit {unit!r}; use nm or um")
    looks_micro = 0.1 <= wl[0] and wl[-1] <= 20.0
    if looks_micro or (header_cell and _MICRO.search(header_cell)):
        raise where(
            f"wavelengths run from {wl[0]:g} to {wl[-1]:g}: these look like micrometres; "
            "if they are, say so with --wavelength-unit um (or 'wavelength_unit: um' in the file)"
        )
    if wl[0] < 100.0 or wl[-1] > 100000.0:
        raise where(f"wavelengths run from {wl[0]:g} to {wl[-1]:g} nm, which is not an optical spectrum")
    return wl


def _check_values(values, wl_nm, names, columns, lines, where):
    """Refuse all-zero and clearly negative spectra; clip negative noise."""
    flags = []
    for k in range(values.shape[0]):
        col, row = values[k], columns[k]
        peak = float(col.max())
        if peak <= 0:
            raise where("the spectrum is zero (or negative) everywhere", column=row, name=names[k])
        low = int(col.argmin())
        if col[low] < -NEGATIVE_NOISE_LIMIT * peak:
            raise where(
                f"value {col[low]:g} at {wl_nm[low]:g} nm is negative, {-100 * col[low] / peak:.2g} % of the "
                f"peak; only noise below {100 * NEGATIVE_NOISE_LIMIT:g} % of the peak is clipped to zero",
                lines[low],
                row,
                names[k],
            )
        flags.append(("negative_noise_clipped",) if col[low] < 0 else ())
    return np.clip(values, 0.0, None), flags


def _batch(wl, values, names, quantity, watts, path, columns, lines, where):
    """Checks shared by both file forms, then the batch."""
    values, flags = _check_values(values, wl, names, columns, lines, where)
    seen = {}
    for name, column in zip(names, columns):
        if name in seen:
            raise where(f"lamp name {name!r} is used twice (also column {seen[name]})", column=column)
        seen[name] = column
    return SpectralBatch(
        wavelength_nm=wl,
        values=values,
        names=names,
        quantity=quantity,
        sources=tuple(f"{Path(path).name}, column {c}" for c in columns),
        electrical_W=watts,
        flags=flags,
    )


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
    where = _Where(path)
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

    _check_wavelengths(data[:, 0], lines, where)
    if wavelength_unit is None:
        wavelength_unit = meta.get("wavelength_unit", (None, "nm"))[1].lower().replace("µ", "u").replace("μ", "u")
    wl = _to_nm(data[:, 0], wavelength_unit, header[0] if header else None, where)
    n_lamps = width - 1
    stem = Path(path).stem
    names = tuple(
        (header[k + 1] if header and header[k + 1] else f"{stem}_{k + 1}") for k in range(n_lamps)
    )
    quantity = quantity or _metadata_quantity(meta, where) or "relative"
    watts = _metadata_watts(meta, n_lamps, where, decimal_comma)
    return _batch(wl, data[:, 1:].T, names, quantity, watts, path, list(range(2, width + 1)), lines, where)


def _json_numbers(values, label, where):
    if not isinstance(values, list) or not values:
        raise where(f"{label} must be a non-empty list of numbers")
    for i, v in enumerate(values):
        if isinstance(v, bool) or not isinstance(v, (int, float)):
            raise where(f"{label}[{i}] is {v!r}, not a number")
        if not math.isfinite(v):
            raise where(f"{label}[{i}] is not finite")
    return np.array(values, dtype=float)


def read_spectra_json(text, path="<json>", *, quantity=None):
    """Parse lampcalc's JSON form (``docs/spectrum-files.md``) into a :class:`SpectralBatch`."""
    where = _Where(path)
    try:
        doc = json.loads(text, parse_constant=lambda c: float(c))
    except json.JSONDecodeError as err:
        raise where(f"not valid JSON ({err.msg})", err.lineno) from None
    if not isinstance(doc, dict) or doc.get(JSON_FORMAT_KEY) != JSON_FORMAT_VERSION:
        raise where(f'not a lampcalc spectra file: expected "{JSON_FORMAT_KEY}": {JSON_FORMAT_VERSION}')
    wl = _json_numbers(doc.get("wavelength_nm"), "wavelength_nm", where)
    lamps = doc.get("lamps")
    if not isinstance(lamps, list) or not lamps:
        raise where("lamps must be a non-empty list")
    index = list(range(len(wl)))
    _check_wavelengths(wl, [f"wavelength_nm[{i}]" for i in index], _JsonWhere(where))
    wl = _to_nm(wl, "nm", None, where)
    q = quantity or doc.get("quantity", "relative")
    if q not in QUANTITY_UNITS:
        raise where(f"unknown quantity {q!r}; use one of {', '.join(QUANTITY_UNITS)}")
    values, names, watts = [], [], []
    for k, lamp in enumerate(lamps):
        label = f"lamps[{k}]"
        if not isinstance(lamp, dict) or not isinstance(lamp.get("name"), str) or not lamp["name"]:
            raise where(f"{label} needs a non-empty string 'name'")
        v = _json_numbers(lamp.get("values"), f"{label}.values", where)
        if v.size != wl.size:
            raise where(f"{label}.values has {v.size} numbers for {wl.size} wavelengths")
        w = lamp.get("electrical_W")
        if w is not None and (isinstance(w, bool) or not isinstance(w, (int, float)) or not w > 0):
            raise where(f"{label}.electrical_W must be a positive number of watts, got {w!r}")
        values.append(v)
        names.append(lamp["name"])
        watts.append(np.nan if w is None else float(w))
    return _batch(
        wl, np.array(values), tuple(names), q, np.array(watts), path,
        [f"lamps[{k}]" for k in range(len(lamps))], [f"wavelength_nm[{i}]" for i in index], _JsonWhere(where),
    )


class _JsonWhere:
    """Locations in a JSON file: 'line' and 'column' become JSON paths."""

    def __init__(self, where):
        self.where = where

    def __call__(self, message, line=None, column=None, name=None):
        parts = [p for p in (column, line) if isinstance(p, str)]
        label = f"{name!r}: " if name else ""
        return self.where(f"{label}{' at '.join(parts) + ': ' if parts else ''}{message}")


def read_spectra(path, *, wavelength_unit=None, quantity=None):
    """Read a spectrum file: lampcalc JSON (``.json``) or delimited text (anything else).

    Parameters
    ----------
    path : str or Path
    wavelength_unit : {"nm", "um"}, optional
        For text files whose wavelengths are in micrometres.
    quantity : str, optional
        Radiometric quantity, overriding what the file says.

    Returns
    -------
    SpectralBatch
        On the file's own wavelengths; call :meth:`SpectralBatch.on_grid` to compute.

    Raises
    ------
    InputError
        One line naming the file, line and column.
    """
    where = _Where(path)
    try:
        raw = Path(path).read_bytes()
    except IsADirectoryError:
        raise where("is a folder; pass -r to read the spectrum files inside it") from None
    except OSError as err:
        raise where(f"cannot be read ({err.strerror or err})") from None
    text = _decode(raw, where)
    if str(path).lower().endswith(".json"):
        return read_spectra_json(text, path, quantity=quantity)
    return read_spectra_text(text, path, wavelength_unit=wavelength_unit, quantity=quantity)


def _single_quantity(batch):
    kinds = set(batch.quantity)
    if len(kinds) != 1:
        raise ValueError(f"a spectrum file holds one quantity; this batch mixes {', '.join(sorted(kinds))}")
    return kinds.pop()


def spectra_to_csv(batch):
    """CSV text for a batch: metadata lines, a header row, one row per wavelength."""
    lines = [f"# quantity: {_single_quantity(batch)}"]
    if np.any(np.isfinite(batch.electrical_W)):
        if not np.all(np.isfinite(batch.electrical_W)):
            raise ValueError("electrical_W is known for some lamps only; the CSV form needs all or none")
        lines.append("# electrical_W: " + " ".join(repr(float(w)) for w in batch.electrical_W))
    for name in batch.names:
        if any(ch in name for ch in ',"\n'):
            raise ValueError(f"lamp name {name!r} cannot be written to CSV (comma, quote or newline)")
    lines.append(",".join(["wavelength_nm", *batch.names]))
    for wl, row in zip(batch.wavelength_nm, batch.values.T):
        lines.append(",".join([repr(float(wl)), *(repr(float(v)) for v in row)]))
    return "\n".join(lines) + "\n"


def spectra_to_json(batch):
    """lampcalc JSON text for a batch."""
    doc = {
        JSON_FORMAT_KEY: JSON_FORMAT_VERSION,
        "quantity": _single_quantity(batch),
        "wavelength_nm": batch.wavelength_nm.tolist(),
        "lamps": [
            {"name": name, "values": values.tolist(), **({"electrical_W": float(w)} if np.isfinite(w) else {})}
            for name, values, w in zip(batch.names, batch.values, batch.electrical_W)
        ],
    }
    return json.dumps(doc, indent=1) + "\n"


def write_spectra_csv(batch, path):
    """Write a batch as CSV (readable by :func:`read_spectra`), atomically."""
    write_atomic(path, spectra_to_csv(batch))


def write_spectra_json(batch, path):
    """Write a batch as lampcalc JSON (readable by :func:`read_spectra`), atomically."""
    write_atomic(path, spectra_to_json(batch))
