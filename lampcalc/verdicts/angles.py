"""Colour over angle: how the chromaticity of one source changes with the direction of emission.

Each spectrum carries the angle it was measured at (``SpectralBatch.angle_deg``, read from a
file's ``angle_deg`` metadata). :func:`colour_over_angle` gives, for every angle, the distance
Δu′v′ in the CIE 1976 UCS diagram from the mean point, and CCT and Duv; and for the set, the
largest Δu′v′, at which angle, and a verdict against a limit the user gives.

The mean point is weighted by light when the spectra are absolute: each angle's u′, v′
counts in proportion to its luminous quantity Km·Σ V(λ)·S(λ)·Δλ (the illuminance at the
detector of a goniometer at fixed distance, which is proportional to the luminous intensity;
or luminous flux, or luminance), so the mean is the colour where the light is. Relative
spectra carry no such weight, and every angle counts the same. ``angle_weighting`` says which
was used. Angles are taken as measured: no solid-angle (zonal) weighting is applied.

There is no limit by default. ``docs/lots.md`` names the published criteria we know of.
"""

import numpy as np

from ..colorimetry.locus import locate
from ..colorimetry.tristimulus import upvp_to_uv
from ..errors import InputError
from .comparison import LUMINOUS_KEYS
#: Columns of the per-angle table, in output order (sorted by angle).
ANGLE_COLUMNS = ("angle_deg", "name", "u_prime", "v_prime", "cct_K", "duv", "delta_uv_prime", "weight")


def angles_of(ratings):
    """The angle of emission of each rated spectrum, degrees, shape (n,); NaN where none is known."""
    return np.asarray(ratings.extras["batch"].angle_deg, dtype=float)


def has_angles(ratings):
    """True when every rated spectrum carries an angle of emission."""
    return bool(np.all(np.isfinite(angles_of(ratings))))


def angle_weights(ratings):
    """Weights of each spectrum for the mean point: ``(weights, weighting)``.

    ``weighting`` is the output key of the luminous quantity used (``"illuminance_lx"`` …)
    when every spectrum is absolute and in the same quantity, else ``"none"`` with equal
    weights.
    """
    quantities = set(ratings["quantity"])
    if len(quantities) == 1 and (quantity := quantities.pop()) in LUMINOUS_KEYS:
        weights = np.asarray(ratings[LUMINOUS_KEYS[quantity]], dtype=float)
        if np.sum(weights) > 0:
            return weights, LUMINOUS_KEYS[quantity]
    return np.ones(len(ratings)), "none"


def colour_over_angle(ratings, *, limit_delta_uv_prime=None):
    """Δu′v′ from the mean point, CCT and Duv of one source over its angles of emission.

    Parameters
    ----------
    ratings : Ratings
        Spectra of one source at several angles (each with ``angle_deg``), as rated.
    limit_delta_uv_prime : float, optional
        The user's limit on the largest Δu′v′ from the mean point.

    Returns
    -------
    dict
        Keys of ``docs/output-fields.md`` (colour over angle); ``angles`` holds the
        per-angle columns of :data:`ANGLE_COLUMNS`, sorted by angle.

    Raises
    ------
    InputError
        When a spectrum carries no angle (naming it), or for a negative limit.
    """
    batch = ratings.extras["batch"]
    angle = angles_of(ratings)
    if not np.all(np.isfinite(angle)):
        i = int(np.flatnonzero(~np.isfinite(angle))[0])
        raise InputError(f"{batch.sources[i] or batch.names[i]}: no angle of emission (give angle_deg in the file)")
    if limit_delta_uv_prime is not None and not limit_delta_uv_prime >= 0:
        raise InputError(f"the Δu′v′ limit must be a non-negative number, got {limit_delta_uv_prime!r}")
    upvp = np.stack([ratings["u_prime"], ratings["v_prime"]], axis=-1).astype(float)
    weights, weighting = angle_weights(ratings)
    mean = weights @ upvp / weights.sum()
    delta = np.hypot(*(upvp - mean).T)
    order = np.argsort(angle, kind="stable")
    worst = int(np.argmax(delta))
    mean_cct, mean_duv, _ = locate(upvp_to_uv(mean))
    cct, duv = np.asarray(ratings["cct_K"], dtype=float), np.asarray(ratings["duv"], dtype=float)
    with np.errstate(invalid="ignore"):
        cct_range = (np.nanmin(cct), np.nanmax(cct)) if np.any(np.isfinite(cct)) else (np.nan, np.nan)
        duv_range = (np.nanmin(duv), np.nanmax(duv)) if np.any(np.isfinite(duv)) else (np.nan, np.nan)
    columns = {"angle_deg": angle, "name": np.array(batch.names, dtype=object), "u_prime": upvp[:, 0],
               "v_prime": upvp[:, 1], "cct_K": cct, "duv": duv, "delta_uv_prime": delta, "weight": weights}
    largest = float(delta[worst])
    margin = np.nan if limit_delta_uv_prime is None else limit_delta_uv_prime - largest
    return {
        "n_angles": int(angle.size),
        "angle_min_deg": float(angle.min()),
        "angle_max_deg": float(angle.max()),
        "angle_weighting": weighting,
        "angle_mean_u_prime": mean[0],
        "angle_mean_v_prime": mean[1],
        "angle_mean_point_cct_K": float(mean_cct),
        "angle_mean_point_duv": float(mean_duv),
        "max_delta_uv_prime_over_angle": largest,
        "angle_of_max_delta_uv_prime_deg": float(angle[worst]),
        "cct_min_over_angle_K": cct_range[0],
        "cct_max_over_angle_K": cct_range[1],
        "duv_min_over_angle": duv_range[0],
        "duv_max_over_angle": duv_range[1],
        "limit_delta_uv_prime": limit_delta_uv_prime,
        "angle_margin_delta_uv_prime": margin,
        "angle_pass": None if limit_delta_uv_prime is None else bool(margin >= 0),
        "angles": {key: columns[key][order] for key in ANGLE_COLUMNS},
    }
