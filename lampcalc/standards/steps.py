"""Colour-consistency steps (MacAdam ellipses, SDCM) of chromaticities from a nominal centre.

Steps are counted with an ellipse set (:mod:`.ellipse_sets`): the one-step metric of the
set at the nominal CCT (interpolated in mired between its colour centres, the nearest
one outside them), n = √(1e4·(g11·Δ₁² + 2·g12·Δ₁·Δ₂ + g22·Δ₂²)) with Δ in the set's
coordinates (IEC 60081, Annex D). Shipped sets: IEC 60081 Annex D ellipses
(``--steps ellipse``, the default) and CIE TN 001:2014 u′v′ circles (``--steps circle``);
neither's values are confirmed from the published text, and every result counted with an
unconfirmed value says so. A user's set replaces them (``--ellipses FILE``).

The centre is the chromaticity of the nominal CCT: by default ANSI C78.377's target
(CCT, Duv) (``centre="ansi"``), or the set's own colour centre for that nominal CCT
(``centre="set"``, e.g. IEC 60081's F2700 … F6500).

The EU ecodesign regulation asks for colour consistency within 6 steps; lampcalc shows
that as one possible target, not as legal advice.
"""

import numpy as np

from .ansi_bins import category
from .ellipse_sets import FROM_XY, shipped_ellipse_set

CENTRES = ("ansi", "set")


def ellipse_steps(point, centre_point, g):
    """Steps n = √(1e4·(g11·Δ₁² + 2·g12·Δ₁·Δ₂ + g22·Δ₂²)) from a centre (IEC 60081, Annex D).

    Parameters
    ----------
    point, centre_point : array_like, shape (..., 2)
        In the coordinates of the metric (broadcast against each other).
    g : array_like, shape (..., 3)
        Metric (g11, g12, g22) in units of 1e4.

    Returns
    -------
    ndarray, shape (...)
    """
    d = np.asarray(point, dtype=float) - np.asarray(centre_point, dtype=float)
    g = np.asarray(g, dtype=float)
    n2 = 1e4 * (g[..., 0] * d[..., 0] ** 2 + 2 * g[..., 1] * d[..., 0] * d[..., 1] + g[..., 2] * d[..., 1] ** 2)
    return np.sqrt(n2)


def metric(cct_K, ellipse_set=None):
    """Metric (g11, g12, g22) in units of 1e4 of ``ellipse_set`` (default IEC 60081) at nominal CCTs.

    Returns
    -------
    g : ndarray, shape (..., 3)
    outside : ndarray of bool, shape (...)
        True where the nominal CCT lies outside the set's colour centres.
    """
    g, outside, _ = (ellipse_set or shipped_ellipse_set()).metric(cct_K)
    return g, outside


def centre_xy(nominal_cct_K, centre="ansi", ellipse_set=None):
    """Chromaticity (x, y) of the centre of a nominal CCT.

    Parameters
    ----------
    centre : {"ansi", "set"}
        ANSI C78.377-2017 target (CCT, Duv) of the nominal CCT (default), or the ellipse
        set's own colour centre, which exists only at the set's nominal CCTs.

    Raises
    ------
    InputError
        For ``"set"`` at a nominal CCT the set has no centre for.
    """
    if centre == "ansi":
        return category(nominal_cct_K).centre_xy
    if centre == "set":
        return (ellipse_set or shipped_ellipse_set()).centre_xy(nominal_cct_K)
    raise ValueError(f"unknown centre {centre!r}; choose one of {', '.join(CENTRES)}")


def steps_from_nominal(xy, nominal_cct_K, ellipse_set=None, centre="ansi"):
    """Colour-consistency steps of chromaticities from the centre of nominal CCTs.

    Parameters
    ----------
    xy : array_like, shape (n, 2)
    nominal_cct_K : array_like, shape (n,)
        NaN gives NaN.
    ellipse_set : EllipseSet, optional
        Default: the shipped IEC 60081 Annex D set.
    centre : {"ansi", "set"}

    Returns
    -------
    steps : ndarray, shape (n,)
    outside : ndarray of bool, shape (n,)
        The metric is the nearest centre's (nominal CCT outside the set's centres).
    unconfirmed : ndarray of bool, shape (n,)
        The metric used holds values not confirmed from a published source.
    """
    ellipse_set = ellipse_set or shipped_ellipse_set()
    xy = np.atleast_2d(np.asarray(xy, dtype=float))
    nominal = np.atleast_1d(np.asarray(nominal_cct_K, dtype=float))
    centres = np.full(xy.shape, np.nan)
    for value in np.unique(nominal[np.isfinite(nominal)]):
        centres[nominal == value] = centre_xy(value, centre, ellipse_set)
    g, outside, unconfirmed = ellipse_set.metric(nominal)
    to_space = FROM_XY[ellipse_set.space]
    steps = ellipse_steps(to_space(xy), to_space(centres), g)
    known = np.isfinite(nominal)
    return steps, outside & known, unconfirmed & known
