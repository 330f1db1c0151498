"""Rating a batch of lamps: every number lampcalc reports for each spectrum.

:func:`rate_spectra` brings the spectra onto the CIE 015:2018 grid, computes every
rating for the whole batch at once and returns a :class:`~lampcalc.rating.ratings.Ratings`
table: one column per quantity, one row per lamp.
"""

import numpy as np

from ..colorimetry.locus import locate, status_words
from ..colorimetry.photometry import luminous_efficacy_of_radiation, luminous_quantity, radiant_quantity
from ..colorimetry.tristimulus import XYZ_to_xy, tristimulus, xy_to_upvp, xy_to_uv
from ..rendering.cie13 import DC_LIMIT, cie13_rendering
from ..rendering.cie224 import cie224_fidelity
from ..rendering.photoreceptors import ALPHA_OPIC, alpha_opic_der, alpha_opic_elr, scotopic_photopic_ratio
from ..spectra.batch import SpectralBatch
from ..spectra.resampling import GRID_NM
from ..standards.ansi_bins import EDITION, NOMINAL_CCTS_K, category, classify
from ..standards.steps import steps_from_nominal
from .ratings import Ratings

_LUMINOUS_FIELD = {"flux": "luminous_flux_lm", "irradiance": "illuminance_lx", "radiance": "luminance_cd_per_m2"}


def _as_grid_batch(spectra, interpolation):
    if isinstance(spectra, SpectralBatch):
        spectra = [spectra]
    return SpectralBatch.concatenate([b.on_grid(interpolation) for b in spectra])


def _rendering(values, cct):
    """Colour rendering columns for the batch (CIE 13.3 and CIE 224 / TM-30-18), and the bin means."""
    cri = cie13_rendering(values, cct)
    fid = cie224_fidelity(values, cct)
    return fid, {
        "ra": cri["ra"],
        "ri": cri["ri"],
        "cri_dc": cri["dc"],
        "rf": fid["rf"],
        "rg": fid["rg"],
        "rf_hue_bins": fid["rf_bins"],
        "chroma_shift_hue_bins_percent": 100.0 * fid["rcs_bins"],
        "hue_shift_hue_bins_rad": fid["rhs_bins"],
    }


def _categories(xy, cct, duv, nominal):
    """ANSI C78.377 category and colour-consistency columns."""
    found = classify(xy)
    nearest = found["nearest_nominal_cct_K"]
    targets = {n: category(n) for n in NOMINAL_CCTS_K}
    target_cct = np.array([targets[n].target_cct_K if np.isfinite(n) else np.nan for n in nearest])
    target_duv = np.array([targets[n].target_duv if np.isfinite(n) else np.nan for n in nearest])
    # Steps from the claimed nominal CCT, else the nearest category; none for a non-white source.
    centre = np.where(np.isfinite(nominal), nominal, np.where(np.isfinite(cct), nearest, np.nan))
    steps, outside = steps_from_nominal(xy, centre)
    return {
        "ansi_edition": (EDITION,) * xy.shape[0],
        "ansi_nominal_cct_K": found["nominal_cct_K"],
        "ansi_nearest_nominal_cct_K": nearest,
        "ansi_margin_uv": found["margin_uv"],
        "ansi_delta_cct_K": cct - target_cct,
        "ansi_delta_duv": duv - target_duv,
        "sdcm_centre_nominal_cct_K": centre,
        "sdcm_steps": steps,
    }, outside


def rate_spectra(spectra, *, observer="1931_2deg", interpolation="linear", nominal_cct_K=None):
    """Rate every lamp in one or more batches of spectra.

    Parameters
    ----------
    spectra : SpectralBatch or sequence of SpectralBatch
        Spectra as read, on any grid; they are resampled onto 360–830 nm at 1 nm.
    observer : {"1931_2deg", "1964_10deg"}
        Observer for the reported chromaticities, CCT and Duv. The ANSI categories, the
        steps and CIE 13.3 are defined with the 2° observer and always use it (CIE 224 its
        10° observer).
    interpolation : {"linear", "sprague"}
        See :mod:`lampcalc.spectra.resampling`.
    nominal_cct_K : array_like, shape (n_lamps,), optional
        Claimed nominal CCT per lamp (NaN where none): the centre the colour-consistency
        steps are counted from. Where not given, the nearest ANSI category's centre.

    Returns
    -------
    Ratings
    """
    batch = _as_grid_batch(spectra, interpolation)
    n = batch.n_lamps
    values = batch.values
    xy = XYZ_to_xy(tristimulus(values, observer))
    uv = xy_to_uv(xy)
    upvp = xy_to_upvp(xy)
    cct, duv, status = locate(uv, observer)
    if observer == "1931_2deg":
        xy2, cct2, duv2 = xy, cct, duv
    else:
        xy2 = XYZ_to_xy(tristimulus(values))
        cct2, duv2, _ = locate(xy_to_uv(xy2))
    nominal = np.full(n, np.nan) if nominal_cct_K is None else np.asarray(nominal_cct_K, dtype=float).reshape(n)
    categories, steps_outside = _categories(xy2, cct2, duv2, nominal)
    fidelity, rendering = _rendering(values, cct2)
    lo, hi = batch.measured_range_nm[:, 0], batch.measured_range_nm[:, 1]
    cols = {
        "name": batch.names,
        "source": batch.sources,
        "quantity": batch.quantity,
        "range_start_nm": lo,
        "range_end_nm": hi,
        "step_nm": batch.measured_step_nm,
        "peak_nm": GRID_NM[np.argmax(values, axis=1)],
        "x": xy[:, 0],
        "y": xy[:, 1],
        "u": uv[:, 0],
        "v": uv[:, 1],
        "u_prime": upvp[:, 0],
        "v_prime": upvp[:, 1],
        "cct_K": cct,
        "duv": duv,
        **rendering,
        **categories,
        "ler_lm_per_W": luminous_efficacy_of_radiation(values),
        "ler_range_nm": np.stack([np.maximum(lo, GRID_NM[0]), np.minimum(hi, GRID_NM[-1])], axis=1),
    }
    luminous = luminous_quantity(values)
    radiant = radiant_quantity(values)
    quantity = np.array(batch.quantity)
    for q, key in _LUMINOUS_FIELD.items():
        cols[key] = np.where(quantity == q, luminous, np.nan)
    cols["radiant_flux_W"] = np.where(quantity == "flux", radiant, np.nan)
    cols["electrical_W"] = batch.electrical_W
    cols["efficacy_lm_per_W"] = cols["luminous_flux_lm"] / batch.electrical_W
    cols["sp_ratio"] = scotopic_photopic_ratio(values)
    elr, der = alpha_opic_elr(values), alpha_opic_der(values)
    for k, name in enumerate(ALPHA_OPIC):
        cols[f"{name}_elr_mW_per_lm"] = elr[:, k]
    for k, name in enumerate(ALPHA_OPIC):
        cols[f"{name}_der"] = der[:, k]
    cols["melanopic_edi_lx"] = cols["illuminance_lx"] * der[:, 4]
    flags = [list(f) + status_words(st) for f, st in zip(batch.flags, status)]
    for i in range(n):
        if np.isfinite(batch.electrical_W[i]) and batch.quantity[i] != "flux":
            flags[i].append("efficacy_needs_flux_spectrum")
        if steps_outside[i]:
            flags[i].append("steps_metric_outside_iec_range")
        if not np.isfinite(cols["ra"][i]):
            flags[i].append("rendering_not_meaningful")
        elif cols["cri_dc"][i] > DC_LIMIT:
            flags[i].append("cri_outside_validity")
    cols["flags"] = tuple(tuple(f) for f in flags)
    extras = {"batch": batch, "ref_ab_bins": fidelity["ref_ab_bins"], "test_ab_bins": fidelity["test_ab_bins"]}
    return Ratings(cols, extras)

