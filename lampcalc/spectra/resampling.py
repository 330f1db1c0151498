"""Resampling spectra onto the CIE 015:2018 computation grid.

CIE 015:2018 (clause 7.1) computes tristimulus values as sums over 360–830 nm at 1 nm.
Measured spectra arrive on other grids, and lampcalc brings them onto that one once, on
import, keeping the raw data beside the result. How depends on the data, as CIE 015:2018
(clause 7.2) and CIE 167:2005 prescribe; the default, ``auto``, chooses per file:

uniformly spaced data coarser than 1 nm, at least six points → ``sprague``
    The fifth-order Sprague (1880) interpolant with the end conditions of CIE 167:2005,
    which CIE 015:2018 recommends for uniformly spaced data and with which the reference
    calculators of CIE 13.3, CIE 224 and TM-30-18 reproduce their published values from
    5 nm data. Around narrow lines it rings and can go below zero; lampcalc keeps the
    values and flags the lamp (``interpolation_undershoot``).
non-uniformly spaced data, or fewer than six points → ``linear``
    Piecewise linear between measured points (Sprague is defined for uniform spacing only).
data finer than 1 nm → ``integrated``
    The piecewise-linear data are integrated onto the grid with the weights of linear
    interpolation (a triangle 2 nm wide around each grid wavelength; :func:`integrate`),
    so that every watt in the data counts once and at its own wavelength; sampling fine
    data at whole nanometres would drop or double narrow lines.
data at exactly 1 nm on whole nanometres → ``none``
    Taken as they are.

``linear`` and ``sprague`` may also be asked for; data finer than 1 nm are integrated
whatever is asked. Outside the measured range the resampled values are zero: lampcalc
never extrapolates.
"""

import numpy as np

from .row_products import row_dot

#: The CIE 015:2018 computation grid, 360–830 nm at 1 nm.
GRID_NM = np.arange(360.0, 831.0)

#: Methods a caller may ask for; ``auto`` chooses one of the others per file (:func:`method_for`).
INTERPOLATION_METHODS = ("auto", "linear", "sprague")
#: Shortest data Sprague interpolation accepts (CIE 167:2005: six neighbours per interval).
SPRAGUE_MIN_POINTS = 6

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
    if wl.size < SPRAGUE_MIN_POINTS:
        raise ValueError(f"Sprague interpolation needs at least {SPRAGUE_MIN_POINTS} points, got {wl.size}")
    if not is_uniform(wl):
        step = np.diff(wl)
        raise ValueError(
            "Sprague interpolation needs uniformly spaced wavelengths; "
            f"steps range from {step.min():g} to {step.max():g} nm"
        )
    # The interpolant is linear in the data: interpolate the unit vectors once, then one matrix product
    # gives every spectrum of the batch.
    return row_dot(values, _sprague_weights(wl, target))


def _sprague_weights(wl, target):
    """Weights (n, m) such that data (n,) @ weights is the Sprague interpolant at ``target``.

    Each target takes six neighbours f[i-2..i+3] with the polynomial weights of CIE 167:2005; the
    two points added at each end are the Table 1 combinations of the first (last) six nodes.
    Built column by column in O(m), so that a new axis (a shifted draw) costs little.
    """
    n, h = wl.size, wl[1] - wl[0]
    inside = (target >= wl[0]) & (target <= wl[-1])
    pos = np.where(inside, (target - wl[0]) / h, 0.0)
    i = np.clip(np.floor(pos).astype(int), 0, n - 2)
    x = pos - i
    # Weight of the padded point i + k (k = 0..5, i.e. f[i-2..i+3]) in the interpolant at each target.
    padded = np.zeros((n + 4, target.size))
    padded[i[:, None] + np.arange(6), np.arange(target.size)[:, None]] = (x[:, None] ** np.arange(6)) @ _SPRAGUE_POLY
    weights = padded[2:n + 2].copy()
    weights[:6] += _SPRAGUE_START.T @ padded[:2]  # f[-2], f[-1] from the first six nodes
    weights[n - 6:] += (_SPRAGUE_START.T @ padded[[n + 3, n + 2]])[::-1]  # f[n+1], f[n] from the last six
    return np.where(inside, weights, 0.0)


def integrate(wavelength_nm, values, target_nm=GRID_NM):
    """Fine data onto a 1 nm grid, integrated so that every watt counts once, at its wavelength.

    Each value on the grid is the integral of the piecewise-linear data weighted by the
    triangle of base 2 nm centred on the grid wavelength: the weights of linear
    interpolation between grid points, transposed. Two properties follow, whatever the
    data's step and wherever a narrow line sits:

    - the sum over the grid equals the integral of the data (every watt counts once);
    - Σ S(λₖ)·w(λₖ) over the grid equals ∫ S(λ)·w(λ) dλ with the weighting function w
      (a colour-matching function, V(λ)) interpolated linearly from its 1 nm table: the
      direct integration at the data's own step.

    Zero outside the data.

    Parameters
    ----------
    wavelength_nm : array_like, shape (n,)
        Strictly increasing measurement wavelengths.
    values : array_like, shape (..., n)
    target_nm : array_like, shape (m,)
        Grid wavelengths, 1 nm apart; by default the CIE 015:2018 grid.

    Returns
    -------
    ndarray, shape (..., m)

    Examples
    --------
    A line of area 1 at 550.25 nm splits 3 : 1 between 550 and 551 nm:

    >>> wl = np.arange(549.0, 552.01, 0.05)
    >>> line = np.where(np.abs(wl - 550.25) < 0.01, 20.0, 0.0)  # triangle 0.1 nm wide, area 1
    >>> [round(float(v), 9) for v in integrate(wl, line, [549.0, 550.0, 551.0, 552.0])]
    [0.0, 0.75, 0.25, 0.0]
    """
    wl = np.asarray(wavelength_nm, dtype=float)
    values = np.asarray(values, dtype=float)
    target = np.asarray(target_nm, dtype=float)
    h = np.diff(wl)
    s0, slope = values[..., :-1], np.diff(values, axis=-1) / h
    # First and second antiderivatives of the piecewise-linear data at the nodes.
    f1_steps = s0 * h + slope * h**2 / 2
    f1 = np.concatenate([np.zeros(values.shape[:-1] + (1,)), np.cumsum(f1_steps, axis=-1)], axis=-1)
    f2_steps = f1[..., :-1] * h + s0 * h**2 / 2 + slope * h**3 / 6
    f2 = np.concatenate([np.zeros(values.shape[:-1] + (1,)), np.cumsum(f2_steps, axis=-1)], axis=-1)

    def second_antiderivative(t):
        inside = np.clip(t, wl[0], wl[-1])
        i = np.clip(np.searchsorted(wl, inside, side="right") - 1, 0, wl.size - 2)
        dt = inside - wl[i]
        at = f2[..., i] + f1[..., i] * dt + s0[..., i] * dt**2 / 2 + slope[..., i] * dt**3 / 6
        # Zero below the data; beyond them the first antiderivative stays at the total.
        return at + f1[..., -1:] * np.maximum(t - wl[-1], 0.0)

    # ∫ S(t)·triangle(t − λ) dt = F2(λ + 1) − 2·F2(λ) + F2(λ − 1).
    return second_antiderivative(target + 1.0) - 2.0 * second_antiderivative(target) + second_antiderivative(target - 1.0)


def is_uniform(wavelength_nm):
    """True when the wavelengths are equally spaced (to 1e-9 nm)."""
    step = np.diff(np.asarray(wavelength_nm, dtype=float))
    return bool(np.allclose(step, step[0], rtol=0.0, atol=1e-9))


def method_for(wavelength_nm, requested="auto"):
    """The method :func:`resample` uses for data on ``wavelength_nm`` when ``requested`` is asked for.

    Returns one of ``"none"`` (1 nm data on whole nanometres), ``"integrated"`` (data
    finer than 1 nm, whatever is asked), ``"sprague"`` or ``"linear"``; see the module
    notes for the ``auto`` rules (CIE 015:2018, clause 7.2; CIE 167:2005).

    Raises
    ------
    ValueError
        For an unknown method (the message lists the valid ones), or ``"sprague"`` asked
        for data that are not uniformly spaced or have fewer than six points.
    """
    if requested not in INTERPOLATION_METHODS:
        raise ValueError(
            f"unknown interpolation method {requested!r}; choose one of {', '.join(INTERPOLATION_METHODS)}"
        )
    wl = np.asarray(wavelength_nm, dtype=float)
    step = np.diff(wl)
    if np.all(step <= 1.0 + 1e-9):
        on_whole_nm = np.allclose(step, 1.0, rtol=0.0, atol=1e-9) and np.allclose(wl, np.round(wl), rtol=0.0, atol=1e-9)
        return "none" if on_whole_nm else "integrated"
    sprague_fits = wl.size >= SPRAGUE_MIN_POINTS and is_uniform(wl)
    if requested == "sprague" and not sprague_fits:
        reason = (
            f"only {wl.size} points (at least {SPRAGUE_MIN_POINTS} are needed)"
            if wl.size < SPRAGUE_MIN_POINTS
            else f"the steps range from {step.min():g} to {step.max():g} nm"
        )
        raise ValueError(f"Sprague interpolation needs uniformly spaced data: {reason}; use auto or linear")
    if requested == "linear" or not sprague_fits:
        return "linear"
    return "sprague"


def resample(wavelength_nm, values, method="auto", target_nm=GRID_NM):
    """Resample spectra onto ``target_nm`` with ``method`` (see :func:`method_for`).

    Returns
    -------
    values : ndarray, shape (..., m)
    used : str
        The method used: ``"none"``, ``"integrated"``, ``"sprague"`` or ``"linear"``.

    Raises
    ------
    ValueError
        As :func:`method_for`.
    """
    used = method_for(wavelength_nm, method)
    if used == "integrated":
        return integrate(wavelength_nm, values, target_nm), used
    if used == "sprague":
        return sprague(wavelength_nm, values, target_nm), used
    return linear(wavelength_nm, values, target_nm), used
