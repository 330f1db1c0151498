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
* the largest Δu′v′ between two samples, the largest from the mean point, and how many
  samples fall in each ANSI C78.377-2017 category;
* ``flags``: conditions of the whole lot, in words in :mod:`lampcalc.rating.flags`.

The per-sample values are under the key ``samples`` (a dict of columns).
"""

import numpy as np

from ..colorimetry.locus import locate
from ..colorimetry.tristimulus import upvp_to_xy, xy_to_upvp, xy_to_uv
from ..errors import InputError
from ..rating.flags import doubtful_keys
from ..standards.ansi_bins import category, classify
from ..standards.steps import TN001_STEP_UPVP, centre_xy, circle_steps, ellipse_steps, metric, steps_from_nominal
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
    "max_delta_uv_prime_from_mean", "ansi_bins_none_count",
)
#: Columns of the per-sample table, in output order.
SAMPLE_COLUMNS = ("name", "source", "x", "y", "u_prime", "v_prime", "cct_K", "duv", "ra", "r9", "rf", "rg",
                  "sdcm_steps", "delta_uv_prime_from_mean", "ansi_nominal_cct_K", "flags")
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


def steps_between(xy, point_xy, nominal_cct_K, method="ellipse"):
    """Colour-consistency steps of chromaticities from any point, shape (...).

    ``method="ellipse"``: the IEC 60081 metric of the nominal CCT
    (:func:`lampcalc.standards.steps.metric`); ``"circle"``: CIE TN 001 u′v′ circles.
    """
    if method == "ellipse":
        return ellipse_steps(xy, point_xy, metric(nominal_cct_K)[0])
    if method == "circle":
        return circle_steps(xy, point_xy)
    raise ValueError(f"unknown steps method {method!r}; choose one of ellipse, circle")


def steps_ring_xy(point_xy, nominal_cct_K, n_steps, method="ellipse", n_points=241):
    """Points (x, y) at ``n_steps`` steps from a point, shape (n_points, 2), closed.

    The IEC 60081 ellipse of the nominal CCT's metric (``method="ellipse"``), or the CIE
    TN 001 circle in u′v′ (``"circle"``), around ``point_xy``: what :func:`steps_between`
    measures as exactly ``n_steps``.
    """
    if method == "ellipse":
        g = metric(nominal_cct_K)[0]
        form = 1e4 * np.array([[g[0], g[1]], [g[1], g[2]]])
        return ellipse_boundary(point_xy, np.linalg.inv(form), float(n_steps) ** 2, n_points)
    if method == "circle":
        centre = xy_to_upvp(np.asarray(point_xy, dtype=float))
        return upvp_to_xy(ellipse_boundary(centre, np.eye(2) * TN001_STEP_UPVP**2, float(n_steps) ** 2, n_points))
    raise ValueError(f"unknown steps method {method!r}; choose one of ellipse, circle")


def _steps_keys(xy, nominal, chosen, method, centre, flags):
    n = xy.shape[0]
    if np.isfinite(nominal):
        steps, outside = steps_from_nominal(xy, np.full(n, nominal), method, centre)
        point = np.asarray(centre_xy(nominal, centre), dtype=float)
        if method == "ellipse" and outside.any():
            flags.append("steps_metric_outside_iec_range")
    else:
        steps, point = np.full(n, np.nan), np.full(2, np.nan)
        flags.append("lot_not_white")
    keys = {
        "steps_method": method,
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


def lot_statistics(ratings, *, nominal_cct_K=None, steps="ellipse", centre="ansi", probability=ELLIPSE_PROBABILITY):
    """Statistics of a lot: the samples' ratings, their spread in colour, their bins.

    Parameters
    ----------
    ratings : Ratings
        One row per sample (from :func:`lampcalc.rate_spectra`).
    nominal_cct_K : float, optional
        The lot's claimed nominal CCT: its centre is the one the steps count from. Default:
        the ANSI C78.377-2017 category nearest the mean point.
    steps : {"ellipse", "circle"}
        IEC 60081 ellipses or CIE TN 001 u′v′ circles (:mod:`lampcalc.standards.steps`).
    centre : {"ansi", "iec"}
        The ANSI C78.377 target of the nominal CCT, or the IEC 60081 colour centre.
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
        For an empty lot, a nominal CCT outside 2200–6500 K, or an IEC centre that does not exist.
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
    out |= _rating_keys(ratings, sample_steps, flags)
    out["flags"] = flags
    columns = {
        "name": names,
        "source": tuple(ratings["source"]),
        "sdcm_steps": sample_steps,
        "delta_uv_prime_from_mean": from_mean,
        "ansi_nominal_cct_K": found,
        "flags": tuple(ratings["flags"]),
    }
    out["samples"] = {k: columns[k] if k in columns else rating_values(ratings, k) for k in SAMPLE_COLUMNS}
    return out
