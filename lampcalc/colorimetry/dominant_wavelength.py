"""Dominant and complementary wavelength and excitation purity (CIE 015:2018, clause 9.1).

A stimulus' dominant wavelength is where the straight line from the achromatic point
through the stimulus meets the spectrum locus in the CIE 1931 (x, y) diagram; its
excitation purity is the ratio of the distances stimulus–achromatic point and boundary
point–achromatic point. When the line meets the purple line (joining the ends of the
locus, 360 and 830 nm) instead, the stimulus has no dominant wavelength: its
complementary wavelength is where the line, extended backwards through the achromatic
point, meets the locus, and the purity is measured to the purple line. lampcalc uses the
equal-energy point E (x = y = 1/3) as the achromatic point for light sources, the CIE 1931
2° observer, and the spectrum locus of the 1 nm colour-matching functions (360–830 nm),
joined by straight lines: the wavelength is interpolated linearly between the grid's
whole nanometres.

Near the ends of the locus (below about 420 nm and above about 700 nm) the locus folds
onto nearly one point, so a dominant wavelength there is poorly defined by x, y alone.
"""

import numpy as np

from ..spectra.resampling import GRID_NM
from ..spectra.tables import colour_matching_functions
from .tristimulus import XYZ_to_xy

#: The achromatic point for light sources: the equal-energy stimulus E.
EQUAL_ENERGY_XY = (1.0 / 3.0, 1.0 / 3.0)
_CHUNK = 4096


def _boundary(observer):
    """Spectrum locus points (n, 2), their wavelengths, and the purple line closing them."""
    locus = XYZ_to_xy(colour_matching_functions(observer))
    start = np.vstack([locus, locus[-1:]])  # the last segment is the purple line, 830 → 360 nm
    end = np.vstack([locus[1:], locus[:1], locus[:1]])[: start.shape[0]]
    return start[:-1], end[:-1]


def _first_crossing(origin, direction, a, b):
    """Nearest crossing of rays origin + t·direction (t > 0) with segments a→b.

    Returns the segment index (−1 for none), the fraction along it and t, each shape (n,).
    """
    edge = b - a  # (m, 2)
    d = direction[:, None, :]
    w = a[None, :, :] - origin[:, None, :]
    denom = d[..., 0] * edge[None, :, 1] - d[..., 1] * edge[None, :, 0]
    with np.errstate(invalid="ignore", divide="ignore"):
        t = (w[..., 0] * edge[None, :, 1] - w[..., 1] * edge[None, :, 0]) / denom
        s = (w[..., 0] * d[..., 1] - w[..., 1] * d[..., 0]) / denom
    hit = np.isfinite(t) & (t > 0) & (s >= 0) & (s <= 1)
    t_hit = np.where(hit, t, np.inf)
    k = np.argmin(t_hit, axis=1)
    rows = np.arange(k.size)
    found = np.isfinite(t_hit[rows, k])
    return np.where(found, k, -1), s[rows, k], t_hit[rows, k]


def dominant_wavelength(xy, white_xy=EQUAL_ENERGY_XY, observer="1931_2deg"):
    """Dominant or complementary wavelength and excitation purity of chromaticities.

    Parameters
    ----------
    xy : array_like, shape (..., 2)
        CIE 1931 chromaticities (of ``observer``).
    white_xy : array_like, shape (2,)
        The achromatic point; by default the equal-energy point E.
    observer : {"1931_2deg", "1964_10deg"}

    Returns
    -------
    dict of ndarray, shape (...)
        ``dominant_wavelength_nm`` (NaN for a purple stimulus and at the white point),
        ``complementary_wavelength_nm`` (NaN unless purple), ``excitation_purity``
        (0 at the white point, 1 on the boundary) and ``purple`` (bool).

    References
    ----------
    CIE 015:2018, Colorimetry, 4th edition, clause 9.1 (dominant wavelength and purity).

    Examples
    --------
    >>> out = dominant_wavelength([0.6, 0.35])
    >>> round(float(out["dominant_wavelength_nm"]), 1), round(float(out["excitation_purity"]), 3)
    (604.6, 0.851)
    """
    xy = np.asarray(xy, dtype=float)
    shape = xy.shape[:-1]
    flat = xy.reshape(-1, 2)
    white = np.asarray(white_xy, dtype=float)
    a, b = _boundary(observer)
    n_locus = a.shape[0] - 1  # segments 0..n_locus-1 are the locus; the last is the purple line
    out = {k: np.full(flat.shape[0], np.nan) for k in ("dominant_wavelength_nm", "complementary_wavelength_nm", "excitation_purity")}
    purple = np.zeros(flat.shape[0], dtype=bool)
    for lo in range(0, flat.shape[0], _CHUNK):
        sl = slice(lo, lo + _CHUNK)
        d = flat[sl] - white
        at_white = np.hypot(d[:, 0], d[:, 1]) < 1e-12
        k, s, t = _first_crossing(np.broadcast_to(white, d.shape), d, a, b)
        is_purple = k == n_locus
        wl = GRID_NM[0] + np.clip(k, 0, None) + s
        out["dominant_wavelength_nm"][sl] = np.where((k >= 0) & ~is_purple & ~at_white, wl, np.nan)
        out["excitation_purity"][sl] = np.where(at_white, 0.0, np.where(k >= 0, 1.0 / t, np.nan))
        # Purples only: the line back through the white point meets the locus itself.
        rows = np.flatnonzero(is_purple & ~at_white)
        kc, sc, _ = _first_crossing(np.broadcast_to(white, (rows.size, 2)), -d[rows], a[:n_locus], b[:n_locus])
        out["complementary_wavelength_nm"][lo + rows] = np.where(kc >= 0, GRID_NM[0] + kc + sc, np.nan)
        purple[sl] = is_purple & ~at_white
    result = {key: value.reshape(shape) for key, value in out.items()}
    result["purple"] = purple.reshape(shape)
    return result
