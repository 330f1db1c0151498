"""Resampling spectra onto the CIE 015:2018 computation grid.

CIE 015:2018 (clause 7.1) computes tristimulus values as sums over 360–830 nm at 1 nm.
Measured spectra arrive on other grids, and lampcalc brings them onto that one once, on
import, keeping the raw data beside the result.

Two interpolants are offered:

``linear`` (default)
    Piecewise linear between measured points. It cannot overshoot, so a narrow emission
    line stays a line and non-negative data stay non-negative. This is the right choice for
    measured emission spectra.
``sprague``
    The fifth-order Sprague (1880) interpolant with the end conditions of CIE 167:2005,
    for uniformly spaced, smooth data (reflectances, daylight components). Around narrow
    lines it rings and can go negative; lampcalc flags that rather than hiding it.

Outside the measured range the resampled values are zero: lampcalc never extrapolates.
"""

import numpy as np

#: The CIE 015:2018 computation grid, 360–830 nm at 1 nm.
GRID_NM = np.arange(360.0, 831.0)

INTERPOLATION_METHODS = ("linear", "sprague")

# CIE 167:2005, Table 1: coefficients of the two points added at each end.
_SPRAGUE_START = np.array(
    [[884, -1960, 3033, -2648, 1080, -180], [508, -540, 488, -367, 144, -24]], dtype=float
) / 209.0
# Coefficients of a0..a5 in terms of f[i-2..i+3] (Sprague 1880; CIE 167:2005, eq. 1).
_SPRAGUE_POLY = np.array(
    [
        [0, 0, 24, 0, 0, 0],
        [2, -16, 0, 16, -2, 0],
        [-1, 16, -30, 16, -1, 0],
        [-9, 39, -70, 66, -33, 7],
        [13, -64, 126, -124, 61, -12],
        [-5, 25, -50, 50, -25, 5],
    ],
    dtype=float,
) / 24.0


def linear(wavelength_nm, values, target_nm=GRID_NM):
    """Interpolate spectra linearly onto ``target_nm``; zero outside the data.

    Parameters
    ----------
    wavelength_nm : array_like, shape (n,)
        Strictly increasing measurement wavelengths.
    values : array_like, shape (..., n)
        Spectra; leading dimensions are kept.
    target_nm : array_like, shape (m,)
        Wavelengths to interpolate to; by default the CIE 015:2018 grid.

    Returns
    -------
    ndarray, shape (..., m)

    Examples
    --------
    >>> linear([400, 410], [1.0, 3.0], [395, 400, 405, 410, 415]).tolist()
    [0.0, 1.0, 2.0, 3.0, 0.0]
    """
    wl = np.asarray(wavelength_nm, dtype=float)
    values = np.asarray(values, dtype=float)
    target = np.asarray(target_nm, dtype=float)
    inside = (target >= wl[0]) & (target <= wl[-1])
    idx = np.clip(np.searchsorted(wl, target, side="right") - 1, 0, wl.size - 2)
    frac = np.where(inside, (target - wl[idx]) / (wl[idx + 1] - wl[idx]), 0.0)
    out = values[..., idx] * (1.0 - frac) + values[..., idx + 1] * frac
    return np.where(inside, out, 0.0)


def sprague(wavelength_nm, values, target_nm=GRID_NM):
    """Sprague (1880) interpolation of uniformly spaced spectra (CIE 167:2005).

    Parameters
    ----------
    wavelength_nm : array_like, shape (n,)
        Uniformly spaced, increasing wavelengths, n ≥ 6.
    values : array_like, shape (..., n)
    target_nm : array_like, shape (m,)

    Returns
    -------
    ndarray, shape (..., m)
        The interpolant, exact at the nodes, zero outside the data.

    Raises
    ------
    ValueError
        If the wavelengths are not uniformly spaced or there are fewer than six.

    References
    ----------
    CIE 167:2005, Recommended practice for tabulating spectral data for use in
    colour computations, clause 3 and Table 1.

    Examples
    --------
    >>> wl = np.arange(400.0, 460.0, 10.0)
    >>> sprague(wl, 2.0 * wl + 1.0, [405.0, 432.5]).round(9).tolist()
    [811.0, 866.0]
    """
    wl = np.asarray(wavelength_nm, dtype=float)
    values = np.asarray(values, dtype=float)
    target = np.asarray(target_nm, dtype=float)
    if wl.size < 6:
        raise ValueError(f"Sprague interpolation needs at least 6 points, got {wl.size}")
    step = np.diff(wl)
    if not np.allclose(step, step[0], rtol=1e-9, atol=1e-9):
        raise ValueError(
            "Sprague interpolation needs uniformly spaced wavelengths; "
            f"steps range from {step.min():g} to {step.max():g} nm"
        )
    h = step[0]
    head = values[..., :6] @ _SPRAGUE_START.T  # f[-2], f[-1]
    tail = values[..., -6:][..., ::-1] @ _SPRAGUE_START.T  # f[n+2], f[n+1]
    padded = np.concatenate([head, values, tail[..., ::-1]], axis=-1)
    inside = (target >= wl[0]) & (target <= wl[-1])
    pos = np.where(inside, (target - wl[0]) / h, 0.0)
    i = np.clip(np.floor(pos).astype(int), 0, wl.size - 2)
    x = pos - i
    # Six neighbours f[i-2..i+3] sit at padded[i..i+5].
    window = padded[..., i[:, None] + np.arange(6)]  # (..., m, 6)
    coeff = window @ _SPRAGUE_POLY.T  # (..., m, 6): a0..a5
    powers = x[:, None] ** np.arange(6)
    out = np.sum(coeff * powers, axis=-1)
    return np.where(inside, out, 0.0)


def resample(wavelength_nm, values, method="linear", target_nm=GRID_NM):
    """Resample spectra with the named method (``"linear"`` or ``"sprague"``).

    Raises
    ------
    ValueError
        For an unknown method; the message lists the valid ones.
    """
    if method == "linear":
        return linear(wavelength_nm, values, target_nm)
    if method == "sprague":
        return sprague(wavelength_nm, values, target_nm)
    raise ValueError(
        f"unknown interpolation method {method!r}; choose one of {', '.join(INTERPOLATION_METHODS)}"
    )
