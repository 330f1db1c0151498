"""A lot: many samples of one product, rated together and summarised.

:func:`lot_statistics` takes the :class:`~lampcalc.rating.ratings.Ratings` of the samples and
returns a flat dict whose keys are documented in ``docs/output-fields.md`` (``lampcalc lot``):

* per rating of :data:`LOT_RATINGS`: ``<rating>_n``, ``_mean``, ``_sd`` (sample standard
  deviation), ``_min``, ``_max``, ``_p05``, ``_p95`` (:func:`~lampcalc.verdicts.spread.describe`);
* the mean point: ``mean_x``, ``mean_y``, the means of the samples' CIE 1931 x and y, and
  ``mean_u_prime``, ``mean_v_prime``, the means of their CIE 1976 u′ and v′ (not the u′, v′
  of the mean x, y, from which they differ slightly);
* the covariance ellipse of the samples' x, y that holds 95 % of a normal distribution, in
  x, y and in colour-consistency steps;
* the steps of each sample from the lot's centre (a claimed nominal CCT, else the ANSI
  C78.377 category nearest the mean point) and the share within 1 … 7 steps;
* the largest Δu′v′ between two samples, the largest from the mean point, how many
  samples fall in each ANSI C78.377-2017 category, and in each bin of the bin set the
  samples were rated with (the ANSI quadrangles, or a user's set);
* ``flags``: conditions of the whole lot, in words in :mod:`lampcalc.rating.flags`.

The per-sample values are under the key ``samples`` (a dict of columns), and the ellipse set
the steps were counted with under ``steps_ellipse_set``: :data:`NOT_SUMMARY`, the keys that
are not numbers or words of the summary (the files leave the set out, and put the samples in
a table of their own).
"""

import numpy as np

from ..colorimetry.locus import locate
from ..colorimetry.tristimulus import xy_to_uv
from ..errors import InputError
from ..rating.flags import doubtful_keys
from ..standards.ansi_bins import category, classify
from ..standards.bin_sets import TO_XY
from ..standards.ellipse_sets import FROM_XY, shipped_ellipse_set
from ..standards.steps import centre_xy, ellipse_steps, steps_from_nominal
from .spread import ELLIPSE_PROBABILITY, STATISTICS, covariance_ellipse, describe, ellipse_boundary, farthest_pair

#: Ratings summarised over a lot: output key -> unit for tables ("" for an index or ratio).
LOT_RATINGS = {
    "cct_K": "K",
    "duv": "",
    "ra": "",
    "r9": "",
    "rf": "",
    "rg": "",
    "ler_lm_per_W": "lm/W",
    "luminous_flux_lm": "lm",
    "radiant_flux_W": "W",
    "illuminance_lx": "lx",
    "luminance_cd_per_m2": "cd/m2",
    "efficacy_lm_per_W": "lm/W",
    "sp_ratio": "",
    "melanopic_der": "",
    "melanopic_edi_lx": "lx",
    "sdcm_steps": "steps",
}
#: Step counts whose share of samples is reported (``within_<n>_steps_percent``).
STEP_COUNTS = (1, 2, 3, 4, 5, 6, 7)
#: Numeric keys of the lot's chromaticity and spread (beside ``<rating>_<statistic>``): what a lot claim may name.
SPREAD_KEYS = (
    "n_samples", "mean_x", "mean_y", "mean_u_prime", "mean_v_prime", "mean_point_cct_K", "mean_point_duv",
    *(f"within_{k}_steps_percent" for k in STEP_COUNTS),
    "cov_xx", "cov_xy", "cov_yy", "ellipse_semi_major_xy", "ellipse_semi_minor_xy", "ellipse_max_steps_from_mean",
    "ellipse_min_steps_from_mean", "ellipse_max_steps_from_centre", "max_pairwise_delta_uv_prime",
    "max_delta_uv_prime_from_mean", "ansi_bins_none_count", "bins_none_count",
)
#: Keys of :func:`lot_statistics` that are not part of the summary: the per-sample table and the ellipse set.
NOT_SUMMARY = ("samples", "steps_ellipse_set")
#: Columns of the per-sample table, in output order.
SAMPLE_COLUMNS = ("name", "source", "x", "y", "u_prime", "v_prime", "cct_K", "duv", "ra", "r9", "rf", "rg",
                  "sdcm_steps", "delta_uv_prime_from_mean", "ansi_nominal_cct_K", "bin", "flags")
#: Beyond this |Duv| CIE 015:2018 advises against a CCT: a lot there has no centre of its own.
WHITE_DUV = 0.05
#: A rating taken from a list column is doubtful when that column is (flags name ``ri``, not R9).
DOUBT_SOURCE = {"r9": "ri"}
_BOUNDARY_POINTS = 3601  # points on the covariance ellipse when it is measured in steps


def rating_values(ratings, key):
    """One rating of every lamp as floats, shape (n,): a column of ``ratings``, or R9 (from ``ri``)."""
    if key == "r9":
        return np.asarray(ratings["ri"], dtype=float)[:, 8]
    return np.asarray(ratings[key], dtype=float)


def lot_centre(mean_xy, nominal_cct_K=None):
    """The nominal CCT the lot's steps count from, and how it was chosen.

    Returns
    -------
    nominal_cct_K : float
        The claimed nominal CCT; else the ANSI C78.377-2017 category nearest the mean point;
        NaN when the mean point has no CCT or lies more than :data:`WHITE_DUV` from the
        Planckian locus (no white light, so no centre).
    chosen : {"claimed", "nearest category", "none"}

    Raises
    ------
    InputError
        For a claimed nominal CCT outside 2200–6500 K.
    """
    if nominal_cct_K is not None and np.isfinite(nominal_cct_K):
        category(nominal_cct_K)
        return float(nominal_cct_K), "claimed"
    cct, duv, _ = locate(xy_to_uv(mean_xy))
    if not (np.isfinite(cct) and abs(duv) <= WHITE_DUV):
        return float("nan"), "none"
    return float(classify(np.asarray(mean_xy)[None])["nearest_nominal_cct_K"][0]), "nearest category"


def ellipse_set_of(steps):
    """The ellipse set ``steps`` names: a shipped one ("ellipse", "circle") or an EllipseSet itself."""
    return shipped_ellipse_set(steps) if isinstance(steps, str) else steps


def steps_between(xy, point_xy, nominal_cct_K, steps="ellipse"):
    """Colour-consistency steps of chromaticities from any point, shape (...).

    The one-step metric of the ellipse set ``steps`` at the nominal CCT
    (:meth:`lampcalc.standards.ellipse_sets.EllipseSet.metric`), in the set's coordinates:
    ``"ellipse"`` the shipped IEC 60081 ellipses, ``"circle"`` the CIE TN 001 u′v′ circles,
    or an :class:`~lampcalc.standards.ellipse_sets.EllipseSet` read from a file.
    """
    ellipse_set = ellipse_set_of(steps)
    to_space = FROM_XY[ellipse_set.space]
    return ellipse_steps(to_space(xy), to_space(point_xy), ellipse_set.metric(nominal_cct_K)[0])


def steps_ring_xy(point_xy, nominal_cct_K, n_steps, steps="ellipse", n_points=241):
    """Points (x, y) at ``n_steps`` steps from a point, shape (n_points, 2), closed.

    The ellipse of the set's metric at the nominal CCT around ``point_xy``, drawn in the
    set's coordinates and brought back to (x, y): what :func:`steps_between` measures as
    exactly ``n_steps``.
    """
    ellipse_set = ellipse_set_of(steps)
    g = ellipse_set.metric(nominal_cct_K)[0]
    form = 1e4 * np.array([[g[0], g[1]], [g[1], g[2]]])
    centre = FROM_XY[ellipse_set.space](np.asarray(point_xy, dtype=float))
    ring = ellipse_boundary(centre, np.linalg.inv(form), float(n_steps) ** 2, n_points)
    return TO_XY[ellipse_set.space](ring)


def _steps_keys(xy, nominal, chosen, method, centre, flags):
    n = xy.shape[0]
    ellipse_set = ellipse_set_of(method)
    confirmed = True
    if np.isfinite(nominal):
        steps, outside, unconfirmed = steps_from_nominal(xy, np.full(n, nominal), ellipse_set, centre)
        point = np.asarray(centre_xy(nominal, centre, ellipse_set), dtype=float)
        confirmed = not unconfirmed.any()
        if outside.any():
            flags.append("steps_metric_outside_set_range")
        if not confirmed:
            flags.append("steps_metric_unconfirmed")
    else:
        steps, point = np.full(n, np.nan), np.full(2, np.nan)
        flags.append("lot_not_white")
    keys = {
        "steps_method": method if isinstance(method, str) else "set",
        "steps_set": ellipse_set.name,
        "steps_ellipse_set": ellipse_set,
        "steps_metric_confirmed": confirmed,
        "steps_centre": centre,
        "steps_centre_nominal_cct_K": nominal,
        "steps_centre_chosen": chosen,
        "steps_centre_x": point[0],
        "steps_centre_y": point[1],
    }
    for k in STEP_COUNTS:
        keys[f"within_{k}_steps_percent"] = 100.0 * np.mean(steps <= k) if np.isfinite(nominal) else np.nan
    return keys, steps, point


def _ellipse_keys(xy, probability, nominal, point, method, flags):
    keys = {"ellipse_probability": probability}
    if xy.shape[0] < 3:
        flags.append("lot_too_small_for_ellipse")
        names = ("cov_xx", "cov_xy", "cov_yy", "ellipse_semi_major_xy", "ellipse_semi_minor_xy", "ellipse_angle_deg",
                 "ellipse_max_steps_from_mean", "ellipse_min_steps_from_mean", "ellipse_max_steps_from_centre")
        return keys | dict.fromkeys(names, np.nan)
    e = covariance_ellipse(xy, probability)
    cov = e["covariance"]
    keys |= {
        "cov_xx": cov[0, 0],
        "cov_xy": cov[0, 1],
        "cov_yy": cov[1, 1],
        "ellipse_semi_major_xy": e["semi_axes"][0],
        "ellipse_semi_minor_xy": e["semi_axes"][1],
        "ellipse_angle_deg": e["angle_deg"],
    }
    steps = (np.nan, np.nan, np.nan)
    if np.isfinite(nominal):
        boundary = ellipse_boundary(e["mean"], cov, e["chi2"], _BOUNDARY_POINTS)
        from_mean = steps_between(boundary, e["mean"], nominal, method)
        steps = (from_mean.max(), from_mean.min(), steps_between(boundary, point, nominal, method).max())
    return keys | dict(zip(("ellipse_max_steps_from_mean", "ellipse_min_steps_from_mean",
                            "ellipse_max_steps_from_centre"), steps))


def _rating_keys(ratings, sample_steps, flags):
    n = len(ratings)
    doubt = set().union(*(doubtful_keys(f) for f in set(ratings["flags"])))  # each distinct set of flags once
    keys, doubtful, partial = {}, [], []
    for key in LOT_RATINGS:
        values = sample_steps if key == "sdcm_steps" else rating_values(ratings, key)
        stats = describe(values)
        for name in STATISTICS:
            keys[f"{key}_{name}"] = int(stats[name]) if name == "n" else float(stats[name])
        if stats["n"] and DOUBT_SOURCE.get(key, key) in doubt:
            doubtful.append(key)
        if 0 < stats["n"] < n:
            partial.append(key)
    if doubtful:
        flags.append("lot_doubtful_values")
    if partial:
        flags.append("lot_partial_values")
    return keys | {"doubtful_ratings": doubtful, "partial_ratings": partial}


def _bin_keys(ratings):
    """How many samples lie in each bin of the set they were rated with (``bin`` of the ratings), and in none."""
    from collections import Counter

    held = Counter(b for b in ratings["bin"] if b is not None)
    names = sorted(held)
    return {
        "bin_set": ratings["bin_set"][0],
        "bins_name": names,
        "bins_count": [held[b] for b in names],
        "bins_none_count": len(ratings) - sum(held.values()),
    }


def lot_statistics(ratings, *, nominal_cct_K=None, steps="ellipse", centre="ansi", probability=ELLIPSE_PROBABILITY):
    """Statistics of a lot: the samples' ratings, their spread in colour, their bins.

    Parameters
    ----------
    ratings : Ratings
        One row per sample (from :func:`lampcalc.rate_spectra`).
    nominal_cct_K : float, optional
        The lot's claimed nominal CCT: its centre is the one the steps count from. Default:
        the ANSI C78.377-2017 category nearest the mean point.
    steps : {"ellipse", "circle"} or EllipseSet
        The shipped IEC 60081 ellipses or CIE TN 001 u′v′ circles, or a user's ellipse set
        (:mod:`lampcalc.standards.ellipse_sets`).
    centre : {"ansi", "set"}
        The ANSI C78.377 target of the nominal CCT, or the ellipse set's own colour centre.
    probability : float
        Probability held by the covariance ellipse for a normal distribution.

    Returns
    -------
    dict
        The keys listed in the module docstring and ``docs/output-fields.md``; ``samples``
        holds the per-sample columns of :data:`SAMPLE_COLUMNS`.

    Raises
    ------
    InputError
        For an empty lot, a nominal CCT outside 2200–6500 K, or a set centre that does not exist.
    """
    n = len(ratings)
    if n == 0:
        raise InputError("a lot needs at least one sample")
    names = tuple(ratings["name"])
    xy = np.stack([ratings["x"], ratings["y"]], axis=-1).astype(float)
    upvp = np.stack([ratings["u_prime"], ratings["v_prime"]], axis=-1).astype(float)
    mean_xy, mean_upvp = xy.mean(axis=0), upvp.mean(axis=0)
    point_cct, point_duv, _ = locate(xy_to_uv(mean_xy))
    flags = []
    out = {
        "n_samples": n,
        "mean_x": mean_xy[0],
        "mean_y": mean_xy[1],
        "mean_u_prime": mean_upvp[0],
        "mean_v_prime": mean_upvp[1],
        "mean_point_cct_K": float(point_cct),
        "mean_point_duv": float(point_duv),
    }
    nominal, chosen = lot_centre(mean_xy, nominal_cct_K)
    steps_keys, sample_steps, point = _steps_keys(xy, nominal, chosen, steps, centre, flags)
    out |= steps_keys
    out |= _ellipse_keys(xy, probability, nominal, point, steps, flags)
    if n < 2:
        flags.append("lot_too_small_for_sd")
    distance, (a, b) = farthest_pair(upvp)
    from_mean = np.hypot(*(upvp - mean_upvp).T)
    out |= {
        "max_pairwise_delta_uv_prime": distance,
        "max_pairwise_samples": [names[a], names[b]] if a >= 0 else [],
        "max_delta_uv_prime_from_mean": from_mean.max(),
    }
    found = classify(xy)["nominal_cct_K"]
    bins = np.unique(found[np.isfinite(found)])
    out |= {
        "ansi_bins_nominal_cct_K": bins,
        "ansi_bins_count": [int(np.sum(found == b)) for b in bins],
        "ansi_bins_none_count": int(np.sum(~np.isfinite(found))),
    }
    out |= _bin_keys(ratings)
    out |= _rating_keys(ratings, sample_steps, flags)
    out["flags"] = flags
    columns = {
        "name": names,
        "source": tuple(ratings["source"]),
        "bin": tuple(ratings["bin"]),
        "sdcm_steps": sample_steps,
        "delta_uv_prime_from_mean": from_mean,
        "ansi_nominal_cct_K": found,
        "flags": tuple(ratings["flags"]),
    }
    out["samples"] = {k: columns[k] if k in columns else rating_values(ratings, k) for k in SAMPLE_COLUMNS}
    return out
