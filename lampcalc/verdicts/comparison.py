"""A test spectrum set beside a reference: colour shift and the difference of every rating.

Uses: a measured sample against the supplier's data-sheet spectrum, an aged lamp against its
initial measurement. :func:`compare_ratings` pairs the lamps (a single spectrum on each side
is a pair whatever the names; otherwise lamps are paired by name) and gives, per pair, the
colour shift Δu′v′ (Euclidean distance in the CIE 1976 UCS diagram), and for every rating of
:data:`COMPARED` the reference value, the test value and the difference test − reference.
A verdict compares Δu′v′ with a limit the user gives; without one there is no verdict.

:func:`normalised_spectra` gives both spectra at equal luminous quantity and their ratio, for
the comparison figure.
"""

import numpy as np

from ..errors import InputError
from ..spectra.batch import SpectralBatch
from ..spectra.resampling import GRID_NM
from ..spectra.tables import luminous_efficiency
from .lot import rating_values

#: Ratings compared, by output key (each gives ``reference_<key>``, ``test_<key>``, ``delta_<key>``).
COMPARED = (
    "x", "y", "u_prime", "v_prime", "cct_K", "duv", "peak_nm", "ra", "r9", "rf", "rg", "cri_dc", "ler_lm_per_W",
    "luminous_flux_lm", "illuminance_lx", "luminance_cd_per_m2", "radiant_flux_W", "efficacy_lm_per_W", "sp_ratio",
    "s_cone_elr_mW_per_lm", "m_cone_elr_mW_per_lm", "l_cone_elr_mW_per_lm", "rhodopic_elr_mW_per_lm",
    "melanopic_elr_mW_per_lm", "s_cone_der", "m_cone_der", "l_cone_der", "rhodopic_der", "melanopic_der",
    "melanopic_edi_lx",
)
#: List ratings compared element by element (``delta_<key>`` is a list).
COMPARED_LISTS = ("ri", "rf_hue_bins")
#: Luminous quantity compared in ``luminous_ratio``, by the spectra's radiometric quantity.
LUMINOUS_KEYS = {"flux": "luminous_flux_lm", "irradiance": "illuminance_lx", "radiance": "luminance_cd_per_m2"}
#: Reference values below this fraction of the reference's peak give no spectral ratio.
RATIO_FLOOR = 0.05


def match_lamps(reference_names, test_names):
    """Pairs of indices (reference, test): by name, or the only lamp of each side.

    Returns
    -------
    pairs : list of (int, int)
    unmatched_reference, unmatched_test : list of str

    Raises
    ------
    InputError
        When a side names a lamp twice, or no name is common to both sides.
    """
    for side, names in (("reference", reference_names), ("test", test_names)):
        seen = set()
        for name in names:
            if name in seen:
                raise InputError(f"the {side} spectra name lamp {name!r} twice: lamps are paired by name")
            seen.add(name)
    if len(reference_names) == 1 and len(test_names) == 1:
        return [(0, 0)], [], []
    position = {name: j for j, name in enumerate(test_names)}
    pairs = [(i, position[name]) for i, name in enumerate(reference_names) if name in position]
    if not pairs:
        raise InputError(
            "no lamp name is common to the reference and the test spectra (reference: "
            f"{', '.join(reference_names)}; test: {', '.join(test_names)})"
        )
    paired = {name for name in reference_names if name in position}
    return (pairs, [n for n in reference_names if n not in paired], [n for n in test_names if n not in paired])


def _luminous_ratio(reference, test, i, j):
    """Test over reference luminous quantity, where both are absolute in the same quantity; else NaN."""
    ratio = np.full(i.size, np.nan)
    for quantity, key in LUMINOUS_KEYS.items():
        same = (np.array(reference["quantity"])[i] == quantity) & (np.array(test["quantity"])[j] == quantity)
        ratio[same] = np.asarray(test[key])[j[same]] / np.asarray(reference[key])[i[same]]
    return ratio


def compare_ratings(reference, test, *, limit_delta_uv_prime=None):
    """Compare every pair of lamps of two rated sets.

    Parameters
    ----------
    reference, test : Ratings
    limit_delta_uv_prime : float, optional
        The user's limit on the colour shift Δu′v′.

    Returns
    -------
    dict
        ``pairs``: the columns of one row per pair (keys in ``docs/output-fields.md``);
        ``unmatched_reference``, ``unmatched_test``: names with no partner.

    Raises
    ------
    InputError
        See :func:`match_lamps`; and for a negative limit.
    """
    if limit_delta_uv_prime is not None and not limit_delta_uv_prime >= 0:
        raise InputError(f"the Δu′v′ limit must be a non-negative number, got {limit_delta_uv_prime!r}")
    pairs, lone_reference, lone_test = match_lamps(list(reference["name"]), list(test["name"]))
    i, j = (np.array(side) for side in zip(*pairs))
    cols = {
        "reference_name": tuple(reference["name"][k] for k in i),
        "test_name": tuple(test["name"][k] for k in j),
        "reference_source": tuple(reference["source"][k] for k in i),
        "test_source": tuple(test["source"][k] for k in j),
    }
    d_upvp = np.stack([rating_values(test, k)[j] - rating_values(reference, k)[i] for k in ("u_prime", "v_prime")], -1)
    shift = np.hypot(d_upvp[:, 0], d_upvp[:, 1])
    cols |= {"delta_uv_prime": shift, "delta_u_prime": d_upvp[:, 0], "delta_v_prime": d_upvp[:, 1]}
    for key in COMPARED:
        ref, tst = rating_values(reference, key)[i], rating_values(test, key)[j]
        cols |= {f"reference_{key}": ref, f"test_{key}": tst, f"delta_{key}": tst - ref}
    for key in COMPARED_LISTS:
        cols[f"delta_{key}"] = np.asarray(test[key], dtype=float)[j] - np.asarray(reference[key], dtype=float)[i]
    ratio = _luminous_ratio(reference, test, i, j)
    limit = np.nan if limit_delta_uv_prime is None else limit_delta_uv_prime
    margin = limit - shift
    cols |= {
        "luminous_ratio": ratio,
        "limit_delta_uv_prime": np.full(i.size, limit),
        "margin_delta_uv_prime": margin,
        "pass": tuple(None if limit_delta_uv_prime is None else bool(m >= 0) for m in margin),
        "reference_flags": tuple(reference["flags"][k] for k in i),
        "test_flags": tuple(test["flags"][k] for k in j),
        "flags": tuple(() if np.isfinite(r) else ("luminous_ratio_needs_absolute_spectra",) for r in ratio),
    }
    return {"pairs": cols, "unmatched_reference": lone_reference, "unmatched_test": lone_test}


def _joined_extra(key, a, b):
    """One extra of both sides as one (spectra, TM-30 bin means, Monte Carlo draws); None when it cannot be joined."""
    if isinstance(a, SpectralBatch):
        return SpectralBatch.concatenate([a, b])
    if isinstance(a, np.ndarray):
        return np.concatenate([a, b])
    if key == "uncertainty":  # the same model drew both sides: the lamps' draws one after the other
        import dataclasses

        kept = {k: np.concatenate([a.kept[k], b.kept[k]]) for k in (a.kept or {}) if k in (b.kept or {})}
        return dataclasses.replace(a, xy=np.concatenate([a.xy, b.xy]), kept=kept)
    return None


def both_sides(reference, test):
    """The ratings of both sides as one table: the reference's lamps, then the test's.

    Each name is followed by its side ("… (reference)", "… (test)"): sides paired by name
    carry the same names. For a report that shows every lamp of a comparison.
    """
    from ..rating.ratings import Ratings
    from ..rating.streaming import join_ratings

    columns = dict(join_ratings([Ratings(reference.columns), Ratings(test.columns)]).columns)
    columns["name"] = tuple(f"{n} (reference)" for n in reference["name"]) + tuple(f"{n} (test)" for n in test["name"])
    extras = {key: _joined_extra(key, reference.extras[key], test.extras[key])
              for key in reference.extras if key in test.extras}
    return Ratings(columns, {key: value for key, value in extras.items() if value is not None})


def normalised_spectra(reference_values, test_values, reference_range_nm=None, test_range_nm=None):
    """Both spectra at equal luminous quantity, and the ratio test / reference.

    Parameters
    ----------
    reference_values, test_values : array_like, shape (..., 471)
        Spectra on the 360–830 nm grid.
    reference_range_nm, test_range_nm : array_like, shape (..., 2), optional
        Measured ranges; outside either, the ratio is NaN (no data).

    Returns
    -------
    reference, test : ndarray, shape (..., 471)
        Scaled so that Σ V(λ)·S(λ) is equal and the reference's peak is 1.
    ratio : ndarray, shape (..., 471)
        test / reference; NaN where the reference is below :data:`RATIO_FLOOR` of its peak
        or outside a measured range.
    """
    ref = np.asarray(reference_values, dtype=float)
    tst = np.asarray(test_values, dtype=float)
    v = luminous_efficiency()
    with np.errstate(invalid="ignore", divide="ignore"):  # a spectrum with no visible light has no equal-luminance copy
        tst = tst * ((ref @ v) / (tst @ v))[..., None]
        peak = ref.max(axis=-1, keepdims=True)
        ref, tst = ref / peak, tst / peak
    valid = ref >= RATIO_FLOOR
    for rng in (reference_range_nm, test_range_nm):
        if rng is not None:
            rng = np.asarray(rng, dtype=float)
            valid &= (GRID_NM >= rng[..., :1]) & (GRID_NM <= rng[..., 1:])
    with np.errstate(invalid="ignore", divide="ignore"):
        ratio = np.where(valid, tst / np.where(valid, ref, 1.0), np.nan)
    return ref, tst, ratio
