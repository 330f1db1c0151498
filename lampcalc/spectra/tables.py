"""The CIE tables lampcalc computes with, read from package data on first use.

Each table is a CSV file in ``lampcalc/data`` written by ``scripts/make_tables.py``;
the file's ``#`` lines name its source and ``data/SOURCES.md`` gives the attribution.
The accessors here return the tables on the CIE 015:2018 grid (360–830 nm, 1 nm,
:data:`lampcalc.spectra.resampling.GRID_NM`), zero where a table is not defined, so that every
weighted sum in lampcalc runs over the same grid. Results are cached and read-only.
"""

import functools
from importlib import resources

import numpy as np

from .resampling import GRID_NM, linear, sprague

#: Observer names accepted wherever an ``observer`` is asked for.
OBSERVERS = ("1931_2deg", "1964_10deg")


@functools.lru_cache(maxsize=None)
def read_table(file_name):
    """Read a shipped table: ``(wavelength_nm, column_names, values)``.

    ``values`` has shape ``(n_wavelengths, n_columns)``. The arrays are read-only.
    """
    text = resources.files("lampcalc").joinpath("data").joinpath(file_name).read_text(encoding="utf-8")
    lines = [line for line in text.splitlines() if line and not line.startswith("#")]
    columns = tuple(lines[0].split(",")[1:])
    body = np.array([[float(v) for v in line.split(",")] for line in lines[1:]])
    wavelength_nm, values = body[:, 0].copy(), body[:, 1:].copy()
    wavelength_nm.flags.writeable = False
    values.flags.writeable = False
    return wavelength_nm, columns, values


def _on_grid(file_name, interpolation=None):
    """Table on the 1 nm grid: copied where tabulated at 1 nm, else interpolated as named."""
    wl, _, values = read_table(file_name)
    if interpolation == "sprague":
        out = sprague(wl, values.T).T
    elif interpolation == "linear":
        out = linear(wl, values.T).T
    else:
        out = np.zeros((GRID_NM.size, values.shape[1]))
        sel = np.isin(GRID_NM, wl)
        out[sel] = values[np.isin(wl, GRID_NM)]
    out.flags.writeable = False
    return out


def _check_observer(observer):
    if observer not in OBSERVERS:
        raise ValueError(f"unknown observer {observer!r}; choose one of {', '.join(OBSERVERS)}")


@functools.lru_cache(maxsize=None)
def colour_matching_functions(observer="1931_2deg"):
    """CIE colour-matching functions x̄, ȳ, z̄ on the grid, shape ``(471, 3)``.

    Parameters
    ----------
    observer : {"1931_2deg", "1964_10deg"}
        CIE 1931 2° (default) or CIE 1964 10° standard observer (CIE 015:2018, clause 3).
    """
    _check_observer(observer)
    return _on_grid(f"cmf_{observer}.csv")


@functools.lru_cache(maxsize=None)
def luminous_efficiency():
    """CIE 1924 photopic V(λ) on the grid, shape ``(471,)`` (CIE 015:2018)."""
    return _on_grid("luminous_efficiency.csv")[:, 0]


@functools.lru_cache(maxsize=None)
def scotopic_luminous_efficiency():
    """CIE 1951 scotopic V′(λ) on the grid, shape ``(471,)``; tabulated 380–780 nm, zero outside."""
    return _on_grid("scotopic_luminous_efficiency.csv")[:, 0]


@functools.lru_cache(maxsize=None)
def daylight_components(interpolation="linear"):
    """CIE daylight components S0, S1, S2 on the grid, shape ``(471, 3)``.

    Tabulated at 5 nm (CIE 015:2018), where the values between the original 10 nm ones
    are themselves linear interpolations (Kránicz & Schanda, Color Res. Appl. 25, 2000);
    brought to 1 nm linearly by default, as CIE 015 does. ``"sprague"`` is offered because
    some implementations of the fidelity index interpolate them so (see docs/rendering.md).
    """
    if interpolation not in ("linear", "sprague"):
        raise ValueError(f"unknown interpolation {interpolation!r}; choose one of linear, sprague")
    return _on_grid("daylight_components.csv", interpolation)


@functools.lru_cache(maxsize=None)
def action_spectra_s026():
    """CIE S 026/E:2018 α-opic action spectra on the grid, shape ``(471, 5)``.

    Columns s-cone, m-cone, l-cone, rhodopic, melanopic; tabulated 380–780 nm at
    1 nm, zero outside. Published by the CIE under CC BY-SA 4.0 (``data/SOURCES.md``).
    """
    return _on_grid("cie_s026_action_spectra.csv")
