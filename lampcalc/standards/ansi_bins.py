"""Nominal CCT categories of ANSI C78.377-2017 and their quadrangles.

ANSI C78.377-2017 ("Specifications for the chromaticity of solid-state lighting
products"), Table 1, defines ten nominal CCT categories by a target CCT with a
tolerance and a target Duv with a tolerance of ±0.006. Each category's quadrangle in the
CIE 1931 (x, y) diagram has its corners at (T_target ± ΔT, Duv_target ± 0.006), joined
by straight lines; a chromaticity belongs to the category when it lies inside (or on) the
quadrangle. For a nominal CCT not in the table (the standard's flexible CCTs, 2200 to
6500 K) the target CCT is the nominal value, the target Duv follows
Duv = 57700/T² − 44.6/T + 0.00854, and the CCT tolerance follows the standard's
polynomial ΔT = 1.1900e-8·T³ − 1.5434e-4·T² + 0.7168·T − 902.55 (reproduced from
memory of the standard: verify it against your copy before relying on it in a dispute).
"""

from dataclasses import dataclass

import numpy as np

from ..colorimetry.locus import cct_duv_to_xy
from ..colorimetry.tristimulus import xy_to_uv
from ..errors import InputError

EDITION = "ANSI C78.377-2017"
DUV_TOLERANCE = 0.006
FLEXIBLE_RANGE_K = (2200.0, 6500.0)

#: Table 1: nominal CCT -> (target CCT K, CCT tolerance K, target Duv).
TABLE_1 = {
    2200: (2238.0, 102.0, 0.0000),
    2500: (2460.0, 120.0, 0.0000),
    2700: (2725.0, 145.0, 0.0000),
    3000: (3045.0, 175.0, 0.0001),
    3500: (3465.0, 245.0, 0.0005),
    4000: (3985.0, 275.0, 0.0010),
    4500: (4503.0, 243.0, 0.0015),
    5000: (5029.0, 283.0, 0.0020),
    5700: (5667.0, 355.0, 0.0025),
    6500: (6532.0, 510.0, 0.0031),
}
NOMINAL_CCTS_K = tuple(TABLE_1)


def flexible_duv_centre(cct_K):
    """Target Duv of a flexible nominal CCT: 57700/T² − 44.6/T + 0.00854 (ANSI C78.377)."""
    t = np.asarray(cct_K, dtype=float)
    return 57700.0 / t**2 - 44.6 / t + 0.00854


def flexible_cct_tolerance(cct_K):
    """CCT tolerance of a flexible nominal CCT, K (the standard's polynomial, from memory)."""
    t = np.asarray(cct_K, dtype=float)
    return 1.1900e-8 * t**3 - 1.5434e-4 * t**2 + 0.7168 * t - 902.55


@dataclass(frozen=True)
class Category:
    """One nominal CCT category: its target, tolerances and quadrangle."""

    nominal_cct_K: float
    target_cct_K: float
    cct_tolerance_K: float
    target_duv: float
    flexible: bool

    @property
    def corners_xy(self):
        """Quadrangle corners (x, y), shape (4, 2): (low T, +Duv), (high T, +Duv), (high T, −Duv), (low T, −Duv)."""
        t0, t1 = self.target_cct_K - self.cct_tolerance_K, self.target_cct_K + self.cct_tolerance_K
        d0, d1 = self.target_duv + DUV_TOLERANCE, self.target_duv - DUV_TOLERANCE
        return cct_duv_to_xy(np.array([[t0, d0], [t1, d0], [t1, d1], [t0, d1]]))

    @property
    def centre_xy(self):
        """The target chromaticity (target CCT, target Duv), (x, y)."""
        return cct_duv_to_xy([self.target_cct_K, self.target_duv])

    def label(self):
        kind = "flexible" if self.flexible else "Table 1"
        return f"{self.nominal_cct_K:g} K ({EDITION}, {kind})"


def category(nominal_cct_K):
    """The category of a nominal CCT: a Table 1 category, or a flexible one.

    Raises
    ------
    InputError
        For a nominal CCT outside 2200–6500 K.
    """
    nominal = float(nominal_cct_K)
    if round(nominal) in TABLE_1 and nominal == round(nominal):
        target, tol, duv = TABLE_1[round(nominal)]
        return Category(nominal, target, tol, duv, False)
    if not FLEXIBLE_RANGE_K[0] <= nominal <= FLEXIBLE_RANGE_K[1]:
        raise InputError(
            f"nominal CCT {nominal:g} K: {EDITION} defines categories from 2200 to 6500 K only"
        )
    return Category(nominal, nominal, float(flexible_cct_tolerance(nominal)), float(flexible_duv_centre(nominal)), True)


def _inside_margin(xy, corners):
    """Signed edge distance (CIE 1960 u, v) of each point from a quadrangle; ≥ 0 inside.

    The smallest signed distance to the four edge lines (inward normals): inside the
    convex quadrangle it is the distance to the nearest edge; outside it is negative and
    its magnitude is the largest violation of any edge.
    """
    p = xy_to_uv(np.asarray(xy, dtype=float))[..., None, :]  # (..., 1, 2)
    c = xy_to_uv(corners)  # (4, 2)
    a, b = c, np.roll(c, -1, axis=0)
    edge = b - a
    normal = np.stack([edge[:, 1], -edge[:, 0]], axis=-1) / np.linalg.norm(edge, axis=-1)[:, None]
    centre = c.mean(axis=0)
    orient = np.sign(np.sum((centre - a) * normal, axis=-1))  # make the normals point inwards
    dist = np.sum((p - a) * normal, axis=-1) * orient  # (..., 4)
    return dist.min(axis=-1)


def quadrangle_margin(xy, nominal_cct_K):
    """Signed edge distance of chromaticities from a category's quadrangle, in CIE 1960 (u, v).

    Positive inside, zero on the boundary, negative outside. The quadrangle is ANSI
    C78.377's: its corners joined by straight lines in (x, y).
    """
    return _inside_margin(xy, category(nominal_cct_K).corners_xy)


def classify(xy):
    """The Table 1 category each chromaticity falls in.

    Parameters
    ----------
    xy : array_like, shape (n, 2)

    Returns
    -------
    dict of arrays, shape (n,)
        ``nominal_cct_K``: the category the point is inside (NaN if none; on a boundary
        shared by two, the lower nominal CCT); ``nearest_nominal_cct_K``: the
        category whose quadrangle is nearest (the same one when inside); ``margin_uv``:
        the signed edge distance from that quadrangle in CIE 1960 (u, v).
    """
    xy = np.atleast_2d(np.asarray(xy, dtype=float))
    margins = np.stack([quadrangle_margin(xy, nominal) for nominal in NOMINAL_CCTS_K], axis=-1)  # (n, 10)
    finite = np.where(np.isfinite(margins), margins, -np.inf)
    nearest = np.argmax(finite, axis=-1)
    best = finite[np.arange(xy.shape[0]), nearest]
    nominal = np.array(NOMINAL_CCTS_K, dtype=float)
    inside = best >= -1e-12
    return {
        "nominal_cct_K": np.where(inside, nominal[nearest], np.nan),
        "nearest_nominal_cct_K": np.where(np.isfinite(best), nominal[nearest], np.nan),
        "margin_uv": np.where(np.isfinite(best), best, np.nan),
    }
