"""Checks every spectrum reader applies, and the batch they build.

Wavelengths must increase and lie in the optical range (micrometres are recognised and
refused unless declared); a spectrum needs two wavelengths at least, may not be zero or
clearly negative (noise down to 0.5 % of the peak is clipped and flagged); lamp names must
be unique in a file. Every problem is one :class:`~lampcalc.errors.InputError` naming the
file by its path as given, the place in it (line and column, sheet and cell, or JSON path)
and what is wrong.
"""

import re

import numpy as np

from ..errors import InputError
from ..spectra.batch import SpectralBatch
from .text_cells import show

#: Negative values down to this fraction of the peak are taken as noise and clipped.
NEGATIVE_NOISE_LIMIT = 0.005
WAVELENGTH_UNITS = ("nm", "um")

_MICRO = re.compile(r"µm|μm|\bum\b|micro", re.IGNORECASE)


class Where:
    """Makes the one-line :class:`InputError` of a file: its path as given, the place, the problem."""

    def __init__(self, path):
        self.path = str(path)

    def __call__(self, message, at=None, name=None):
        place = f", {at}" if at else ""
        label = f" ({show(name)})" if name else ""
        return InputError(f"{self.path}{place}{label}: {message}")


def check_wavelengths(wl, places, where):
    """Refuse fewer than two wavelengths, and wavelengths that repeat or decrease.

    ``places[i]`` names where wavelength ``i`` stands (``"line 12, column 1"``).
    """
    if wl.size < 2:
        raise where("a spectrum needs at least two wavelengths", places[0] if len(places) else None)
    steps = np.diff(wl)
    bad = np.flatnonzero(~(steps > 0))
    if bad.size:
        i = int(bad[0]) + 1
        if steps[i - 1] == 0:
            raise where(f"duplicate wavelength {wl[i]:g} (also at {places[i - 1]})", places[i])
        raise where(f"wavelength {wl[i]:g} is below the previous one, {wl[i - 1]:g}; wavelengths must increase", places[i])


def to_nm(wl, unit, header_cell, where):
    """Wavelengths in nm from ``unit`` ("nm" or "um"); micrometres not declared as such are refused."""
    if unit == "um":
        wl = wl * 1000.0
    elif unit != "nm":
        raise where(f"unknown wavelength unit {show(unit)}; use nm or um")
    elif (0.1 <= wl[0] and wl[-1] <= 20.0) or (header_cell and _MICRO.search(header_cell[:100])):
        raise where(
            f"wavelengths run from {wl[0]:g} to {wl[-1]:g}: these look like micrometres; "
            "if they are, say so with --wavelength-unit um (or 'wavelength_unit: um' in the file)"
        )
    if wl[0] < 100.0 or wl[-1] > 100000.0:
        raise where(f"wavelengths run from {wl[0]:g} to {wl[-1]:g} nm, which is not an optical spectrum")
    return wl


def check_values(values, wl_nm, names, lamp_places, value_place, where):
    """Refuse all-zero and clearly negative spectra; clip negative noise.

    ``lamp_places[k]`` names lamp ``k``'s column (or row); ``value_place(k, i)`` its value at
    wavelength ``i``.
    """
    flags = []
    for k in range(values.shape[0]):
        col = values[k]
        low = int(col.argmin())
        problem = value_problem(k, float(col.max()), low, col[low], wl_nm, names, lamp_places, value_place, where)
        if problem is not None:
            raise problem
        flags.append(("negative_noise_clipped",) if col[low] < 0 else ())
    return np.clip(values, 0.0, None), flags


def value_problem(k, peak, low, low_value, wl_nm, names, lamp_places, value_place, where):
    """The error for lamp ``k`` whose maximum is ``peak`` and minimum ``low_value`` (at index ``low``), or None."""
    if peak <= 0:
        return where("the spectrum is zero (or negative) everywhere", lamp_places[k], names[k])
    if low_value < -NEGATIVE_NOISE_LIMIT * peak:
        return where(
            f"value {low_value:g} at {wl_nm[low]:g} nm is negative, {-100 * low_value / peak:.3g} % of the "
            f"peak; only noise below {100 * NEGATIVE_NOISE_LIMIT:g} % of the peak is clipped to zero",
            value_place(k, low),
            names[k],
        )
    return None


def check_names(names, lamp_places, where):
    """Refuse a lamp name used twice in one file."""
    seen = {}
    for name, place in zip(names, lamp_places):
        if name in seen:
            raise where(f"lamp name {show(name)} is used twice (also {seen[name]})", place)
        seen[name] = place


def lamp_sources(where, lamp_places, units):
    """Each lamp's ``source``: the path as given, its place in the file and the unit it was given in."""
    return tuple(f"{where.path}, {p}" + (f" (in {u})" if u else "") for p, u in zip(lamp_places, units))


def build_batch(wl, values, names, quantity, *, where, lamp_places, value_place, watts=None, angles=None, units=None):
    """Checks every file form shares, then the batch.

    Parameters
    ----------
    wl : ndarray, shape (n_wavelengths,)
        Checked wavelengths, nm.
    values : ndarray, shape (n_lamps, n_wavelengths)
        Values already scaled to the units of ``quantity``.
    names : tuple of str
    quantity : str or tuple of str
    where : Where
    lamp_places : sequence of str
        Where each lamp stands in the file (``"column 3"``, ``"sheet 'A', column C"``); with
        the path as given, the lamp's ``source``.
    value_place : callable
        ``value_place(k, i)``: where lamp ``k``'s value at wavelength ``i`` stands.
    watts, angles : ndarray, shape (n_lamps,), optional
    units : sequence of str or None, optional
        The unit each lamp's values were given in, recorded in its source.
    """
    bad = ~np.isfinite(values)
    if bad.any():  # a finite number times a unit's scale can still leave the range of a float
        k, i = (int(n) for n in np.argwhere(bad)[0])
        raise where("is beyond the range of a float once scaled to SI units", value_place(k, i), names[k])
    values, flags = check_values(values, wl, names, lamp_places, value_place, where)
    check_names(names, lamp_places, where)
    units = units or [None] * len(names)
    return SpectralBatch(
        wavelength_nm=wl,
        values=values,
        names=names,
        quantity=quantity,
        sources=lamp_sources(where, lamp_places, units),
        electrical_W=watts,
        flags=flags,
        angle_deg=angles,
    )


def single_quantity(batch):
    """The one radiometric quantity of a batch about to be written to a file."""
    kinds = set(batch.quantity)
    if len(kinds) != 1:
        raise ValueError(f"a spectrum file holds one quantity; this batch mixes {', '.join(sorted(kinds))}")
    return kinds.pop()
