"""Features of a spectrum's shape on the 1 nm grid: peak, centroid and full width at half maximum.

These describe coloured and narrow-band sources (an LED's peak and FWHM) and are given for
every lamp. They are read from the spectrum on the CIE 015:2018 grid (360–830 nm, 1 nm)
within the lamp's measured range.
"""

import numpy as np

from .resampling import GRID_NM
from .row_products import row_dot


def spectral_features(values, measured_range_nm):
    """Peak, centroid and FWHM of spectra on the grid.

    Parameters
    ----------
    values : array_like, shape (n, 471)
        Spectra on :data:`~lampcalc.spectra.resampling.GRID_NM`.
    measured_range_nm : array_like, shape (n, 2)
        First and last measured wavelength of each lamp.

    Returns
    -------
    dict of ndarray, shape (n,)
        ``peak_nm``: the grid wavelength of the maximum; ``centroid_nm``: Σ λ·S / Σ S;
        ``fwhm_nm``: the width of the highest peak where it falls to half the maximum,
        the two crossings interpolated linearly between grid points (NaN when the
        spectrum stays above half the maximum up to an end of the measured range, as a
        warm white source does at the red end); ``fwhm_at_range_end`` (bool) marks those.

    Examples
    --------
    >>> g = np.exp(-0.5 * ((GRID_NM - 530.0) / (30.0 / 2.3548)) ** 2)
    >>> out = spectral_features(g[None], [[360.0, 830.0]])
    >>> float(out["peak_nm"][0]), round(float(out["centroid_nm"][0]), 2), round(float(out["fwhm_nm"][0]), 1)
    (530.0, 530.0, 30.0)
    """
    values = np.atleast_2d(np.asarray(values, dtype=float))
    lo, hi = np.asarray(measured_range_nm, dtype=float).reshape(-1, 2).T
    inside = (GRID_NM[None, :] >= lo[:, None] - 1e-9) & (GRID_NM[None, :] <= hi[:, None] + 1e-9)
    s = np.where(inside, values, 0.0)
    n, m = s.shape
    peak = np.argmax(s, axis=1)
    rows = np.arange(n)
    half = 0.5 * s[rows, peak]
    index = np.arange(m)[None, :]
    below = (s < half[:, None]) & inside
    # Last grid point below half the maximum left of the peak, first one right of it.
    left = np.max(np.where(below & (index < peak[:, None]), index, -1), axis=1)
    right = np.min(np.where(below & (index > peak[:, None]), index, m), axis=1)
    found = (left >= 0) & (right < m)
    li, ri = np.clip(left, 0, m - 2), np.clip(right, 1, m - 1)
    with np.errstate(invalid="ignore", divide="ignore"):
        x_left = li + (half - s[rows, li]) / (s[rows, li + 1] - s[rows, li])
        x_right = ri - 1 + (half - s[rows, ri - 1]) / (s[rows, ri] - s[rows, ri - 1])
        centroid = row_dot(s, GRID_NM) / s.sum(axis=1)
        fwhm = np.where(found, x_right - x_left, np.nan)
    return {
        "peak_nm": GRID_NM[peak],
        "centroid_nm": centroid,
        "fwhm_nm": fwhm,
        "fwhm_at_range_end": ~found,
    }
