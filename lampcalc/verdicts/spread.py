"""The spread of many samples: summary statistics, the covariance ellipse, the farthest pair.

General statistics that the lot and angle verdicts build on, each computed for whole arrays
at once. Missing values (NaN) are left out of each statistic, never counted as zeros.

* Summary statistics: n, mean, sample standard deviation (divisor n − 1), minimum, maximum
  and the 5th and 95th percentiles, interpolated linearly between order statistics as
  NumPy's default ``method="linear"`` does (definition 7 of Hyndman and Fan, 1996).
* Covariance ellipse: the ellipse (p − m)ᵀ S⁻¹ (p − m) = χ²₂(P) around the mean m of
  points p with sample covariance S. For a two-dimensional normal distribution it holds
  the probability P; χ²₂(P) = −2·ln(1 − P) is the quantile of the chi-square distribution
  with two degrees of freedom (5.991 for P = 0.95).
* Farthest pair: the largest distance between any two points. It joins two vertices of
  the points' convex hull, so large sets compare only the hull's vertices; the comparison
  runs in square blocks, so memory stays flat however many points there are.
"""

import numpy as np

#: Probability the covariance ellipse holds for a normal distribution.
ELLIPSE_PROBABILITY = 0.95
#: Percentiles reported beside the mean, with their key suffixes.
PERCENTILES = {"p05": 5.0, "p95": 95.0}
#: Keys of :func:`describe`, in output order.
STATISTICS = ("n", "mean", "sd", "min", "max", "p05", "p95")
_BLOCK = 1024  # points per side of one block of pairwise distances (16 MB of differences)
_HULL_ABOVE = 2048  # sets larger than this compare only their convex hull's vertices


def describe(values):
    """Summary statistics over the first axis, ignoring NaN.

    Parameters
    ----------
    values : array_like, shape (n_samples, ...)

    Returns
    -------
    dict of ndarray, shape (...)
        ``n`` (finite values), ``mean``, ``sd`` (sample standard deviation, divisor n − 1;
        NaN for n < 2), ``min``, ``max``, ``p05`` and ``p95`` (NumPy's linear method); NaN
        where there is no finite value.

    Examples
    --------
    >>> stats = describe([1.0, 2.0, 4.0, float("nan")])
    >>> [round(float(stats[k]), 4) for k in ("n", "mean", "sd", "p95")]
    [3.0, 2.3333, 1.5275, 3.8]
    """
    v = np.asarray(values, dtype=float)
    finite = np.isfinite(v)
    n = finite.sum(axis=0)
    with np.errstate(invalid="ignore", divide="ignore"):
        mean = np.where(finite, v, 0.0).sum(axis=0) / n
        squares = np.where(finite, v - mean, 0.0) ** 2
        sd = np.where(n >= 2, np.sqrt(squares.sum(axis=0) / (n - 1)), np.nan)
    ordered = np.sort(np.where(finite, v, np.nan), axis=0)  # NaN sort last

    def order_statistic(position):
        """Linear interpolation between the order statistics around ``position`` (0-based)."""
        lo = np.clip(np.floor(position), 0, None).astype(int)
        hi = np.minimum(lo + 1, np.maximum(n - 1, 0))
        below = np.take_along_axis(ordered, lo[None], axis=0)[0]
        above = np.take_along_axis(ordered, hi[None], axis=0)[0]
        t = position - lo
        return np.where(n > 0, below + t * (above - below), np.nan)

    last = np.maximum(n - 1, 0).astype(float)
    out = {"n": n, "mean": mean, "sd": sd, "min": order_statistic(np.zeros_like(last)), "max": order_statistic(last)}
    for key, q in PERCENTILES.items():
        out[key] = order_statistic(q / 100.0 * last)
    return out


def chi_square_2dof(probability):
    """Quantile of the chi-square distribution with 2 degrees of freedom, −2·ln(1 − P).

    Examples
    --------
    >>> round(float(chi_square_2dof(0.95)), 4)
    5.9915
    """
    return -2.0 * np.log1p(-np.asarray(probability, dtype=float))


def covariance_ellipse(points, probability=ELLIPSE_PROBABILITY):
    """Mean, sample covariance and the P-ellipse of two-dimensional points.

    Parameters
    ----------
    points : array_like, shape (..., n, 2)
        n ≥ 3 finite points per set.
    probability : float
        P, the probability the ellipse holds for a normal distribution.

    Returns
    -------
    dict
        ``mean`` (..., 2); ``covariance`` (..., 2, 2), divisor n − 1; ``chi2`` χ²₂(P);
        ``semi_axes`` (..., 2), major then minor, in the points' units; ``angle_deg`` (...),
        the major axis from the first coordinate axis, 0–180°.
    """
    p = np.asarray(points, dtype=float)
    n = p.shape[-2]
    mean = p.mean(axis=-2)
    d = p - mean[..., None, :]
    covariance = np.einsum("...ni,...nj->...ij", d, d) / (n - 1)
    eigenvalues, eigenvectors = np.linalg.eigh(covariance)  # ascending
    chi2 = float(chi_square_2dof(probability))
    semi_axes = np.sqrt(chi2 * np.clip(eigenvalues[..., ::-1], 0.0, None))
    major = eigenvectors[..., :, 1]
    angle = np.degrees(np.arctan2(major[..., 1], major[..., 0])) % 180.0
    return {"mean": mean, "covariance": covariance, "chi2": chi2, "semi_axes": semi_axes, "angle_deg": angle}


def ellipse_boundary(mean, covariance, chi2, n_points=721):
    """Points on the ellipse (p − m)ᵀ S⁻¹ (p − m) = chi2, shape (n_points, 2), closed (last = first)."""
    eigenvalues, eigenvectors = np.linalg.eigh(np.asarray(covariance, dtype=float))
    angle = np.linspace(0.0, 2.0 * np.pi, n_points)
    unit = np.stack([np.cos(angle), np.sin(angle)], axis=-1)
    return np.asarray(mean, dtype=float) + (unit * np.sqrt(chi2 * np.clip(eigenvalues, 0.0, None))) @ eigenvectors.T


def hull_vertices(points):
    """Indices of the convex hull's vertices; every index when the points are degenerate (on a line)."""
    from scipy.spatial import ConvexHull, QhullError

    try:
        return ConvexHull(points).vertices
    except QhullError:
        return np.arange(points.shape[0])


def farthest_pair(points, block=_BLOCK):
    """The largest distance between two of the points, and which two.

    Parameters
    ----------
    points : array_like, shape (n, 2)
        Finite points.
    block : int
        Points per side of each block of distances compared at once (memory ∝ block²).

    Returns
    -------
    distance : float
        NaN for fewer than two points.
    pair : tuple of int
        Indices of the two points (the lower first); (-1, -1) for fewer than two.
    """
    p = np.asarray(points, dtype=float)
    n = p.shape[0]
    if n < 2:
        return float("nan"), (-1, -1)
    candidates = hull_vertices(p) if n > _HULL_ABOVE else np.arange(n)
    q = p[candidates]
    best, pair = -1.0, (0, 0)
    for i0 in range(0, q.shape[0], block):
        for j0 in range(i0, q.shape[0], block):
            d = q[i0 : i0 + block, None, :] - q[None, j0 : j0 + block, :]
            d2 = np.einsum("ijk,ijk->ij", d, d)
            i, j = np.unravel_index(int(np.argmax(d2)), d2.shape)
            if d2[i, j] > best:
                best, pair = float(d2[i, j]), (int(candidates[i0 + i]), int(candidates[j0 + j]))
    return float(np.sqrt(best)), tuple(sorted(pair))
