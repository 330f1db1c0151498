"""Checks every spectrum reader applies, and the batch they build.

Wavelengths must increase and lie in the optical range (micrometres are recognised and
refused unless declared); a spectrum may not be zero or clearly negative (noise down to
0.5 % of the peak is clipped and flagged); lamp names must be unique in a file. Every
problem is one :class:`~lampcalc.errors.InputError` naming the file, the line (1-based,
as an editor counts) and the column.
"""

import re
from pathlib import Path

import numpy as np

from ..errors import InputError
from ..spectra.batch import SpectralBatch

#: Negative values down to this fraction of the peak are taken as noise and clipped.
NEGATIVE_NOISE_LIMIT = 0.005
WAVELENGTH_UNITS = ("nm", "um")

_MICRO = re.compile(r"(µm|μm|\bum\b|micro)", re.IGNORECASE)


class Where:
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


def decode_text(raw, where):
    """The text of a file's bytes: UTF-8 (with or without BOM), else Latin-1; binary files refused."""
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


def check_wavelengths(wl, lines, where):
    """Refuse wavelengths that repeat or decrease, naming the line of the first one."""
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


def to_nm(wl, unit, header_cell, where):
    """Wavelengths in nm from ``unit`` ("nm" or "um"); micrometres not declared as such are refused."""
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


def check_values(values, wl_nm, names, columns, lines, where):
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


def build_batch(wl, values, names, quantity, watts, path, columns, lines, where, angles=None):
    """Checks shared by both file forms, then the batch."""
    values, flags = check_values(values, wl, names, columns, lines, where)
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
        angle_deg=angles,
    )


class JsonWhere:
    """Locations in a JSON file: 'line' and 'column' become JSON paths."""

    def __init__(self, where):
        self.where = where

    def __call__(self, message, line=None, column=None, name=None):
        parts = [p for p in (column, line) if isinstance(p, str)]
        label = f"{name!r}: " if name else ""
        return self.where(f"{label}{' at '.join(parts) + ': ' if parts else ''}{message}")


def single_quantity(batch):
    """The one radiometric quantity of a batch about to be written to a file."""
    kinds = set(batch.quantity)
    if len(kinds) != 1:
        raise ValueError(f"a spectrum file holds one quantity; this batch mixes {', '.join(sorted(kinds))}")
    return kinds.pop()
