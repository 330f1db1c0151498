"""The uncertainty that the measurement adds to a lot's statistics.

**What it is.** Every sample of the lot is rated with the measurement model by Monte Carlo
(:func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`), each sample in its own draws,
independent of the others'. Draw m of the lot is the set of every sample's draw m; each statistic
of :func:`~lampcalc.verdicts.lot.lot_statistics` is computed again for every draw of the lot, and
its standard uncertainty (the standard deviation over the draws, JCGM 101:2008 7.6) and 95 %
interval (7.7.2) say how far the statistic of *these samples* could move through the measurement
alone.

**What it is not.** It is not the lot's sampling uncertainty: how far the statistics of this
delivery may lie from those of the production it was taken from, or of the next delivery. That
depends on the number of samples and how they were chosen, not on the instrument, and lampcalc
does not compute it; the lot's ``sd`` and percentiles describe the samples, not a promise.

The samples are drawn independently, as if each were measured on its own. Effects common to the
whole lot (one calibration for every sample, one wavelength scale) move every sample together
and do not average out in a mean; with independent draws a mean's uncertainty from such effects
is understated by up to √n. A model of only the independent effects (noise) is exact here.
"""

import numpy as np

from ..colorimetry.locus import locate
from ..colorimetry.tristimulus import xy_to_uv
from ..rating.uncertainty import coverage_interval
from ..standards.steps import steps_from_nominal
from .lot import LOT_RATINGS, STEP_COUNTS, ellipse_set_of
from .spread import STATISTICS, covariance_ellipse, describe, farthest_pair, hull_vertices

#: Keys kept from every draw of every sample (R9 is read from ``ri``; the steps are the lot's own).
KEPT = ("x", "y", "u_prime", "v_prime", *(k for k in LOT_RATINGS if k not in ("r9", "sdcm_steps")), "ri")
#: Statistics of each rating that get an uncertainty (``n`` is a count, not a measured value).
STATISTICS_WITH_UNCERTAINTY = tuple(s for s in STATISTICS if s != "n")
_PAIRS_AT_ONCE = 4_000_000  # sample pairs × draws compared at once for the largest Δu′v′
_VECTORISED_UP_TO = 64  # samples; beyond, each draw's convex hull first


def _largest_pairwise(upvp):
    """The largest Δu′v′ between two samples in each draw; upvp shape (n, M, 2).

    Small lots compare every pair of every draw at once; larger ones, draw by draw, only the
    vertices of the draw's convex hull, where the farthest pair lies.
    """
    n, m = upvp.shape[:2]
    if n < 2:
        return np.full(m, np.nan)
    if n > _VECTORISED_UP_TO:
        return np.array([farthest_pair(upvp[hull_vertices(upvp[:, k]), k])[0] for k in range(m)])
    step = max(1, _PAIRS_AT_ONCE // (n * n))
    out = np.empty(m)
    for start in range(0, m, step):
        part = upvp[:, start:start + step]  # (n, k, 2)
        d = np.hypot(*np.moveaxis(part[:, None] - part[None, :], -1, 0))  # (n, n, k)
        out[start:start + step] = d.max(axis=(0, 1))
    return out


def _lot_draws(lot, kept, steps, centre):
    """Each statistic of the lot for every draw: key -> array (M,)."""
    xy = np.stack([kept["x"], kept["y"]], axis=-1)  # (n, M, 2)
    upvp = np.stack([kept["u_prime"], kept["v_prime"]], axis=-1)
    n, m = xy.shape[:2]
    mean_xy, mean_upvp = xy.mean(axis=0), upvp.mean(axis=0)
    cct, duv, _ = locate(xy_to_uv(mean_xy))
    out = {"mean_x": mean_xy[:, 0], "mean_y": mean_xy[:, 1], "mean_u_prime": mean_upvp[:, 0],
           "mean_v_prime": mean_upvp[:, 1], "mean_point_cct_K": cct, "mean_point_duv": duv,
           "max_pairwise_delta_uv_prime": _largest_pairwise(upvp),
           "max_delta_uv_prime_from_mean": np.hypot(*np.moveaxis(upvp - mean_upvp, -1, 0)).max(axis=0)}
    nominal = lot["steps_centre_nominal_cct_K"]
    sample_steps = np.full((n, m), np.nan)
    if np.isfinite(nominal):
        sample_steps = steps_from_nominal(xy.reshape(-1, 2), np.full(n * m, nominal), ellipse_set_of(steps),
                                          centre)[0].reshape(n, m)
        out |= {f"within_{k}_steps_percent": 100.0 * np.mean(sample_steps <= k, axis=0) for k in STEP_COUNTS}
    if n >= 3:
        semi = covariance_ellipse(np.moveaxis(xy, 0, 1), lot["ellipse_probability"])["semi_axes"]
        out |= {"ellipse_semi_major_xy": semi[:, 0], "ellipse_semi_minor_xy": semi[:, 1]}
    for key in LOT_RATINGS:
        values = sample_steps if key == "sdcm_steps" else kept["ri"][..., 8] if key == "r9" else kept[key]
        stats = describe(values)  # over the samples, for every draw at once
        out |= {f"{key}_{s}": stats[s] for s in STATISTICS_WITH_UNCERTAINTY}
    return out


def lot_uncertainty(lot, ratings, *, steps="ellipse", centre="ansi"):
    """The lot's statistics with the uncertainty that the measurement adds to each.

    Parameters
    ----------
    lot : dict
        From :func:`~lampcalc.verdicts.lot.lot_statistics` of ``ratings`` with the same ``steps`` and ``centre``.
    ratings : Ratings
        From :func:`~lampcalc.rating.uncertainty.rate_with_uncertainty` with ``keep=KEPT``.
    steps, centre
        As for ``lot_statistics``.

    Returns
    -------
    dict
        A copy of ``lot`` in which each statistic measured from the samples' values (the means,
        standard deviations, extremes and percentiles of every rating, the mean point, the steps'
        shares, the ellipse's semi-axes, the largest Δu′v′) is followed by ``<key>_u`` and
        ``<key>_interval95``; NaN where the statistic, or any draw of it, has no value. Also
        ``measurement_model``: the model in words.
    """
    found = ratings.extras["uncertainty"]
    draws = _lot_draws(lot, found.kept, steps, centre)
    out = {}
    for key, value in lot.items():
        out[key] = value
        if key in draws:
            values = draws[key]
            ok = bool(np.isfinite(value) and np.all(np.isfinite(values)))
            low, high = coverage_interval(values)
            out[f"{key}_u"] = float(np.std(values, ddof=1)) if ok else np.nan
            out[f"{key}_interval95"] = [float(low), float(high)] if ok else [np.nan, np.nan]
    out["measurement_model"] = found.model.describe()
    return out
