"""The 95 % region of a lamp's chromaticity over its Monte Carlo draws: what the diagrams draw.

A rating has a 95 % coverage interval (JCGM 101:2008 7.7.2); a chromaticity, two correlated
coordinates, needs a region. lampcalc draws this one, its own construction (it is not the
elliptical or smallest coverage region of JCGM 102:2011, which lampcalc does not claim):

1. the draws are put in a fixed order (by x, then y), so that nothing below depends on the
   order in which they were drawn;
2. their centre c is the median of each coordinate, which a few wild draws cannot pull away;
3. each draw's distance from c is measured in the metric of the draws' covariance S,
   d² = (p − c)ᵀ S⁻¹ (p − c) (the Mahalanobis distance), so that the region follows the
   shape of the spread, not the axes of the diagram;
4. the q = ⌊pM + ½⌋ draws nearest c are kept (p = 0.95 and M draws, q as for the interval);
5. the region is the convex hull of the kept draws.

The region holds at least q of the M draws (every kept draw, and any other that falls inside
the hull); for a normal spread it approaches the ellipse d² ≤ χ²₂(p) = −2 ln(1 − p) from
inside. It is convex, so a diagram may draw it as a polygon in (x, y), or in (u′, v′) or
(u, v): a projective map, as those are of (x, y), keeps straight edges straight.
"""

import numpy as np

from .uncertainty import COVERAGE


def _kept(points, coverage):
    """The ``coverage`` share of ``points`` (in a fixed order) nearest their median in the covariance's metric."""
    m = points.shape[0]
    q = max(1, int(np.floor(coverage * m + 0.5)))
    offset = points - np.median(points, axis=0)
    inverse = np.linalg.pinv(np.cov(points, rowvar=False)) if m > 1 else np.zeros((2, 2))
    d2 = np.einsum("ni,ij,nj->n", offset, inverse, offset)
    return points[np.argsort(d2, kind="stable")[:q]]


def _hull(points):
    """Vertices of the convex hull, counterclockwise from the one of least x (then y); fewer when degenerate."""
    from scipy.spatial import ConvexHull, QhullError

    unique = np.unique(points, axis=0)  # sorted by x, then y
    if unique.shape[0] < 3:
        return unique
    try:
        vertices = unique[ConvexHull(unique).vertices]
    except QhullError:  # all on one line: the segment between its ends
        return unique[[0, -1]]
    start = np.lexsort((vertices[:, 1], vertices[:, 0]))[0]
    return np.roll(vertices, -start, axis=0)


def coverage_region(xy, coverage=COVERAGE):
    """The coverage region of chromaticity draws, one polygon per lamp.

    Parameters
    ----------
    xy : array_like, shape (..., M, 2)
        Monte Carlo draws of a chromaticity (e.g. CIE 1931 x, y), the draws on the second-last
        axis; the leading axes are lamps. Draws that are not finite are left out.
    coverage : float
        The share of the draws the region is built to hold.

    Returns
    -------
    list of ndarray, shape (k, 2), nested as the leading axes (an ndarray (k, 2) for a single set)
        The region's vertices, counterclockwise, starting at the vertex of least x (then y);
        k = 2 (a segment) or 1 (a point) when the draws are on one line or all equal, 0 when
        no draw is finite.

    Examples
    --------
    Twenty draws on a unit square and one wild draw: 20 of 21 are kept, the wild one is not.

    >>> draws = [[0, 0], [1, 0], [0, 1], [1, 1], [0.5, 0.5]] * 4 + [[9, 9]]
    >>> coverage_region(draws).tolist()
    [[0.0, 0.0], [1.0, 0.0], [1.0, 1.0], [0.0, 1.0]]

    References
    ----------
    JCGM 101:2008, 7.7 (coverage intervals of Monte Carlo draws), whose q this region shares;
    the region itself is lampcalc's, described in this module.
    """
    xy = np.asarray(xy, dtype=float)
    if xy.ndim < 2 or xy.shape[-1] != 2:
        raise ValueError(f"chromaticity draws must have shape (..., M, 2), got {xy.shape}")
    if xy.ndim > 2:
        return [coverage_region(lamp, coverage) for lamp in xy]
    points = xy[np.all(np.isfinite(xy), axis=1)]
    if points.shape[0] == 0:
        return np.empty((0, 2))
    points = points[np.lexsort((points[:, 1], points[:, 0]))]
    return _hull(_kept(points, coverage))
