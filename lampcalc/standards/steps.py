"""Colour-consistency steps (MacAdam ellipses, SDCM) of chromaticities from a nominal centre.

Ellipses (default): IEC 60081:1997, Annex D, gives the metric of one-step ellipses for
six fluorescent-lamp colour centres F6500 … F2700 as n² = g11·Δx² + 2·g12·Δx·Δy + g22·Δy²
with the g in units of 10⁴. The values here are reproduced from memory of that annex
(shared/REFERENCE_VALUES.md rates them medium confidence) and are cross-checked in the
tests against MacAdam's 1942 ellipse near (0.305, 0.323).

For a nominal CCT between two of those colour centres lampcalc interpolates the metric
(each g) linearly in reciprocal nominal CCT between the two neighbours; outside 2700–6500 K
it uses the nearest one and flags the result ``steps_metric_outside_iec_range``. The centre itself is
the chromaticity of the nominal value: by default ANSI C78.377's target (CCT, Duv), or
the IEC colour centre for one of the six F values when asked for.

Circles: CIE TN 001:2014 proposes circles in CIE 1976 (u′, v′); one step is taken here as
a radius of 0.0011 (from memory of the note).

The EU ecodesign regulation asks for colour consistency within 6 steps; lampcalc shows
that as one possible target, not as legal advice.
"""

import numpy as np

from ..colorimetry.tristimulus import xy_to_upvp
from ..errors import InputError
from .ansi_bins import category

#: IEC 60081 Annex D colour centres: CCT -> ((x, y), (g11, g12, g22) in units of 1e4). From memory.
IEC_60081_ELLIPSES = {
    6500: ((0.313, 0.337), (86.0, -40.0, 45.0)),
    5000: ((0.346, 0.359), (56.0, -25.0, 28.0)),
    4000: ((0.380, 0.380), (39.5, -21.5, 26.0)),
    3500: ((0.409, 0.394), (38.0, -20.0, 25.0)),
    3000: ((0.440, 0.403), (39.0, -19.5, 27.5)),
    2700: ((0.463, 0.420), (44.0, -18.6, 27.0)),
}
#: One step of CIE TN 001:2014 as a u′v′ radius (from memory).
TN001_STEP_UPVP = 0.0011
CENTRES = ("ansi", "iec")


def metric(cct_K):
    """Ellipse metric (g11, g12, g22) in units of 1e4 for nominal CCTs, shape (..., 3).

    Linear in reciprocal CCT between the IEC 60081 colour centres; the nearest one outside.

    Returns
    -------
    g : ndarray, shape (..., 3)
    outside : ndarray of bool, shape (...)
        True where the CCT lies outside 2700–6500 K.
    """
    t = np.asarray(cct_K, dtype=float)
    ccts = np.array(sorted(IEC_60081_ELLIPSES))
    g = np.array([IEC_60081_ELLIPSES[c][1] for c in ccts])
    mired = 1e6 / ccts[::-1]
    g = g[::-1]
    m = 1e6 / t
    out = np.stack([np.interp(m, mired, g[:, k]) for k in range(3)], axis=-1)
    return out, (t < ccts[0]) | (t > ccts[-1])


def centre_xy(nominal_cct_K, centre="ansi"):
    """Chromaticity (x, y) of the centre of a nominal CCT.

    Parameters
    ----------
    centre : {"ansi", "iec"}
        ANSI C78.377-2017 target (CCT, Duv) of the category (default), or the IEC 60081
        colour centre, which exists for 2700, 3000, 3500, 4000, 5000 and 6500 K only.
    """
    if centre == "ansi":
        return category(nominal_cct_K).centre_xy
    if centre == "iec":
        key = round(float(nominal_cct_K))
        if key not in IEC_60081_ELLIPSES or key != float(nominal_cct_K):
            raise InputError(
                f"IEC 60081 has no colour centre for {float(nominal_cct_K):g} K (only 2700, 3000, 3500, 4000, "
                "5000, 6500 K); use the ANSI centre"
            )
        return np.array(IEC_60081_ELLIPSES[key][0])
    raise ValueError(f"unknown centre {centre!r}; choose one of {', '.join(CENTRES)}")


def ellipse_steps(xy, centre_point_xy, g):
    """Steps n = √(g11·Δx² + 2·g12·Δx·Δy + g22·Δy²) from a centre (IEC 60081, Annex D).

    Parameters
    ----------
    xy : array_like, shape (..., 2)
    centre_point_xy : array_like, shape (..., 2)
        Broadcasts against ``xy``.
    g : array_like, shape (..., 3)
        Metric (g11, g12, g22) in units of 1e4, from :func:`metric`.

    Returns
    -------
    ndarray, shape (...)
    """
    xy = np.asarray(xy, dtype=float)
    c = np.asarray(centre_point_xy, dtype=float)
    g = np.asarray(g, dtype=float)
    d = xy - c
    n2 = 1e4 * (g[..., 0] * d[..., 0] ** 2 + 2 * g[..., 1] * d[..., 0] * d[..., 1] + g[..., 2] * d[..., 1] ** 2)
    return np.sqrt(n2)


def circle_steps(xy, centre_point_xy):
    """Steps as u′v′ distance over 0.0011 (CIE TN 001:2014 circles), shape (...)."""
    d = xy_to_upvp(np.asarray(xy, dtype=float)) - xy_to_upvp(np.asarray(centre_point_xy, dtype=float))
    return np.hypot(d[..., 0], d[..., 1]) / TN001_STEP_UPVP


def steps_from_nominal(xy, nominal_cct_K, method="ellipse", centre="ansi"):
    """Colour-consistency steps of chromaticities from the centre of nominal CCTs.

    Parameters
    ----------
    xy : array_like, shape (n, 2)
    nominal_cct_K : array_like, shape (n,)
        NaN gives NaN.
    method : {"ellipse", "circle"}
        IEC 60081 ellipses or CIE TN 001 u′v′ circles.
    centre : {"ansi", "iec"}

    Returns
    -------
    steps : ndarray, shape (n,)
    outside : ndarray of bool, shape (n,)
        Ellipse metric taken from the nearest IEC centre (nominal outside 2700–6500 K).
    """
    xy = np.atleast_2d(np.asarray(xy, dtype=float))
    nominal = np.atleast_1d(np.asarray(nominal_cct_K, dtype=float))
    centres = np.full(xy.shape, np.nan)
    for value in np.unique(nominal[np.isfinite(nominal)]):
        centres[nominal == value] = centre_xy(value, centre)
    if method == "circle":
        return circle_steps(xy, centres), np.zeros(nominal.shape, dtype=bool)
    if method == "ellipse":
        g, outside = metric(nominal)
        return ellipse_steps(xy, centres, g), outside & np.isfinite(nominal)
    raise ValueError(f"unknown steps method {method!r}; choose one of ellipse, circle")
