"""CIE tristimulus values and chromaticity coordinates.

Spectra are arrays on the CIE 015:2018 grid, shape ``(..., 471)`` for 360–830 nm at
1 nm (:data:`lampcalc.spectra.resampling.GRID_NM`). Every weighted integral is the sum
Σ S(λ)·w(λ)·Δλ over that grid with Δλ = 1 nm (CIE 015:2018, clause 7.1), not a
trapezoid rule. Chromaticities have their two components on the last axis.
"""

import numpy as np

from ..spectra.row_products import row_dot
from ..spectra.tables import colour_matching_functions


def tristimulus(values, observer="1931_2deg"):
    """Tristimulus sums X, Y, Z = Σ S·(x̄, ȳ, z̄)·Δλ, shape ``(..., 3)``.

    Parameters
    ----------
    values : array_like, shape (..., 471)
        Spectra on the grid, in any unit; the result is in the same unit times nm.
    observer : {"1931_2deg", "1964_10deg"}

    Notes
    -----
    For absolute spectra, Km·Y is the luminous quantity (CIE 015:2018, eq. 7.1);
    :func:`relative_XYZ` normalises to Y = 100.
    """
    return row_dot(values, colour_matching_functions(observer))


def relative_XYZ(values, observer="1931_2deg"):
    """Tristimulus values of light sources normalised to Y = 100, shape ``(..., 3)``.

    k = 100 / Σ S·ȳ·Δλ (CIE 015:2018, clause 7.1, for sources).

    Examples
    --------
    >>> from lampcalc.spectra.resampling import GRID_NM
    >>> XYZ = relative_XYZ(np.ones_like(GRID_NM))  # equal-energy spectrum
    >>> [round(float(c), 2) for c in XYZ]
    [100.01, 100.0, 100.03]
    """
    XYZ = tristimulus(values, observer)
    with np.errstate(invalid="ignore", divide="ignore"):
        return 100.0 * XYZ / XYZ[..., 1:2]


def ratio_or_nan(num, den):
    with np.errstate(invalid="ignore", divide="ignore"):
        return np.where(den != 0, num / np.where(den != 0, den, 1.0), np.nan)


def XYZ_to_xy(XYZ):
    """Chromaticity x, y = X/(X+Y+Z), Y/(X+Y+Z); NaN where X+Y+Z = 0."""
    XYZ = np.asarray(XYZ, dtype=float)
    s = XYZ.sum(axis=-1, keepdims=True)
    return ratio_or_nan(XYZ[..., :2], s)


def xy_to_XYZ(xy, Y=1.0):
    """Tristimulus values with luminance ``Y`` at chromaticity ``xy``, shape ``(..., 3)``."""
    xy = np.asarray(xy, dtype=float)
    x, y = xy[..., 0], xy[..., 1]
    Y = np.broadcast_to(np.asarray(Y, dtype=float), x.shape)
    return np.stack([ratio_or_nan(x * Y, y), Y, ratio_or_nan((1 - x - y) * Y, y)], axis=-1)


def xy_to_uv(xy):
    """CIE 1960 UCS u, v from x, y: u = 4x/(−2x+12y+3), v = 6y/(−2x+12y+3) (CIE 015:2018)."""
    xy = np.asarray(xy, dtype=float)
    x, y = xy[..., 0], xy[..., 1]
    d = -2 * x + 12 * y + 3
    return np.stack([ratio_or_nan(4 * x, d), ratio_or_nan(6 * y, d)], axis=-1)


def uv_to_xy(uv):
    """x, y from CIE 1960 u, v: x = 3u/(2u−8v+4), y = 2v/(2u−8v+4)."""
    uv = np.asarray(uv, dtype=float)
    u, v = uv[..., 0], uv[..., 1]
    d = 2 * u - 8 * v + 4
    return np.stack([ratio_or_nan(3 * u, d), ratio_or_nan(2 * v, d)], axis=-1)


def xy_to_upvp(xy):
    """CIE 1976 UCS u′, v′ from x, y: u′ = 4x/(−2x+12y+3), v′ = 9y/(−2x+12y+3)."""
    uv = xy_to_uv(xy)
    return uv * np.array([1.0, 1.5])


def upvp_to_xy(upvp):
    """x, y from CIE 1976 u′, v′."""
    return uv_to_xy(np.asarray(upvp, dtype=float) / np.array([1.0, 1.5]))


def uv_to_upvp(uv):
    """u′, v′ from CIE 1960 u, v: u′ = u, v′ = 1.5·v."""
    return np.asarray(uv, dtype=float) * np.array([1.0, 1.5])


def upvp_to_uv(upvp):
    """CIE 1960 u, v from u′, v′: u = u′, v = v′/1.5."""
    return np.asarray(upvp, dtype=float) / np.array([1.0, 1.5])
