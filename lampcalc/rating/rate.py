"""Rating a batch of lamps: every number lampcalc reports for each spectrum.

:func:`rate_spectra` brings the spectra onto the CIE 015:2018 grid, computes every
rating for the whole batch at once and returns a :class:`~lampcalc.rating.ratings.Ratings`
table: one column per quantity, one row per lamp. Every value that cannot be computed, or
must not be used as an ordinary value, comes with a flag that says why
(:mod:`lampcalc.rating.flags`).
"""

import numpy as np

from ..colorimetry.dominant_wavelength import dominant_wavelength
from ..colorimetry.locus import locate, status_words
from ..colorimetry.photometry import luminous_efficacy_of_radiation, luminous_quantity, radiant_quantity
from ..colorimetry.tristimulus import XYZ_to_xy, tristimulus, xy_to_upvp, xy_to_uv
from ..rendering.cie13 import DC_LIMIT, cie13_rendering
from ..rendering.cie224 import cie224_fidelity
from ..rendering.photoreceptors import ALPHA_OPIC, alpha_opic_der, alpha_opic_elr, scotopic_photopic_ratio
from ..rendering.reference import reference_available
from ..spectra.batch import SpectralBatch
from ..spectra.features import spectral_features
from ..spectra.resampling import GRID_NM
from ..standards.ansi_bins import EDITION, NOMINAL_CCTS_K, ansi_bin_set, category, classify
from ..standards.bin_sets import classify as classify_in_set
from ..standards.ellipse_sets import shipped_ellipse_set
from ..standards.steps import steps_from_nominal
from .ratings import Ratings

_LUMINOUS_FIELD = {"flux": "luminous_flux_lm", "irradiance": "illuminance_lx", "radiance": "luminance_cd_per_m2"}
#: LER is flagged when the mean of the 5 nm at an end of its range reaches 5 % of the spectrum's
#: peak (lampcalc's own threshold: a white LED measured 380–780 nm stays below it, a
#: tungsten lamp, whose power keeps rising into the infrared, does not).
LER_END_FRACTION = 0.05
LER_END_WIDTH_NM = 5
#: A lamp within this distance (CIE 1960 u, v) outside a bin with unconfirmed corners is flagged with it:
#: corners off by the rounding of a table (1e-4) could change its verdict (lampcalc's own margin).
UNCONFIRMED_REACH_UV = 1e-3
#: Below this FWHM on the 1 nm grid a peak is narrower than the grid resolves (lampcalc's own choice).
FWHM_RESOLVED_NM = 3.0


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


def _categories(xy, cct, duv, nominal, bin_set, ellipse_set):
    """ANSI C78.377 category, bin and colour-consistency columns, and the per-lamp conditions."""
    found = classify(xy)
    nearest = found["nearest_nominal_cct_K"]
    targets = {n: category(n) for n in NOMINAL_CCTS_K}
    target_cct = np.array([targets[n].target_cct_K if np.isfinite(n) else np.nan for n in nearest])
    target_duv = np.array([targets[n].target_duv if np.isfinite(n) else np.nan for n in nearest])
    bins = classify_in_set(xy, bin_set)
    names = np.array(bin_set.names + (None,), dtype=object)  # index −1 → no bin
    bin_confirmed = np.append(bin_set.bin_confirmed, True)[bins["nearest"]]
    # Steps from the claimed nominal CCT, else the nearest category; none for a non-white source.
    centre = np.where(np.isfinite(nominal), nominal, np.where(np.isfinite(cct), nearest, np.nan))
    steps, outside, unconfirmed = steps_from_nominal(xy, centre, ellipse_set)
    columns = {
        "ansi_edition": (EDITION,) * xy.shape[0],
        "ansi_nominal_cct_K": found["nominal_cct_K"],
        "ansi_nearest_nominal_cct_K": nearest,
        "ansi_margin_uv": found["margin_uv"],
        "ansi_delta_cct_K": cct - target_cct,
        "ansi_delta_duv": duv - target_duv,
        "bin_set": (bin_set.name,) * xy.shape[0],
        "bin": tuple(names[bins["index"]].tolist()),
        "bin_nearest": tuple(names[bins["nearest"]].tolist()),
        "bin_margin_uv": bins["margin_uv"],
        "sdcm_ellipse_set": (ellipse_set.name,) * xy.shape[0],
        "sdcm_centre_nominal_cct_K": centre,
        "sdcm_steps": steps,
    }
    # The ANSI quadrangle or the bin the lamp is in, or close to, was not read from a published table.
    near_ansi = np.isfinite(nearest) & (found["margin_uv"] > -UNCONFIRMED_REACH_UV)
    near_bin = (bins["nearest"] >= 0) & (bins["margin_uv"] > -UNCONFIRMED_REACH_UV)
    conditions = {
        "bin_corners_unconfirmed": (~found["bin_confirmed"] & near_ansi) | (~bin_confirmed & near_bin),
        "steps_metric_outside_set_range": outside,
        "steps_metric_unconfirmed": unconfirmed,
    }
    return columns, conditions


def _colour(xy, values, measured_range_nm):
    """Columns that describe coloured and narrow-band sources, and their conditions."""
    dom = dominant_wavelength(xy)
    feat = spectral_features(values, measured_range_nm)
    columns = {
        "peak_nm": feat["peak_nm"],
        "centroid_nm": feat["centroid_nm"],
        "fwhm_nm": feat["fwhm_nm"],
        "dominant_wavelength_nm": dom["dominant_wavelength_nm"],
        "complementary_wavelength_nm": dom["complementary_wavelength_nm"],
        "excitation_purity": dom["excitation_purity"],
    }
    at_white = np.isfinite(dom["excitation_purity"]) & (dom["excitation_purity"] == 0)
    return columns, {
        "purple_complementary_wavelength": dom["purple"],
        "at_equal_energy_point": at_white,
        "fwhm_at_range_end": feat["fwhm_at_range_end"],
        "fwhm_below_grid_resolution": feat["fwhm_nm"] < FWHM_RESOLVED_NM,
    }


def _ler_range_conditions(values, lo, hi):
    """True where the spectrum carries real power at an end of the range LER is computed over."""
    inside = (GRID_NM >= lo[:, None]) & (GRID_NM <= hi[:, None])
    s = np.where(inside, values, np.nan)
    peak = np.nanmax(s, axis=1)
    first = np.argmax(inside, axis=1)
    last = GRID_NM.size - 1 - np.argmax(inside[:, ::-1], axis=1)
    offsets = np.arange(LER_END_WIDTH_NM)
    rows = np.arange(values.shape[0])[:, None]
    start = np.nanmean(s[rows, np.clip(first[:, None] + offsets, 0, GRID_NM.size - 1)], axis=1)
    end = np.nanmean(s[rows, np.clip(last[:, None] - offsets, 0, GRID_NM.size - 1)], axis=1)
    return np.maximum(start, end) >= LER_END_FRACTION * peak


def _rendering_conditions(rendering, cct):
    """Why rendering values are null or doubtful, per lamp (``cct``: the 2° CCT they used)."""
    missing = np.isnan(rendering["ra"])
    beyond = missing & np.isfinite(cct) & ~reference_available(cct)
    return {
        "rendering_not_meaningful": missing & ~beyond,
        "no_reference_above_25000K": beyond,
        "cri_outside_validity": ~missing & (rendering["cri_dc"] > DC_LIMIT),
        "tm30_hue_bin_empty": np.isfinite(rendering["rf"]) & np.isnan(rendering["rg"]),
    }


def _flags(batch, status, conditions):
    """Every lamp's flags: as read, the CCT status, then each condition found true, in order."""
    return tuple(
        tuple(list(batch.flags[i]) + status_words(status[i]) + [name for name, mask in conditions.items() if mask[i]])
        for i in range(batch.n_lamps)
    )


def rate_spectra(
    spectra, *, observer="1931_2deg", interpolation="auto", nominal_cct_K=None, bin_set=None, ellipse_set=None
):
    """Rate every lamp in one or more batches of spectra.

    Parameters
    ----------
    spectra : SpectralBatch or sequence of SpectralBatch
        Spectra as read, on any grid; they are resampled onto 360–830 nm at 1 nm.
    observer : {"1931_2deg", "1964_10deg"}
        Observer for the reported chromaticities, CCT and Duv. The ANSI categories, the
        bins, the steps, the dominant wavelength and CIE 13.3 are defined with the 2°
        observer and always use it (CIE 224 its 10° observer).
    interpolation : {"auto", "linear", "sprague"}
        See :mod:`lampcalc.spectra.resampling`; the method used per lamp is the column
        ``interpolation``.
    nominal_cct_K : array_like, shape (n_lamps,), optional
        Claimed nominal CCT per lamp (NaN where none): the centre the colour-consistency
        steps are counted from. Where not given, the nearest ANSI category's centre.
    bin_set : BinSet, optional
        The bins of the ``bin`` columns; by default the shipped ANSI C78.377 quadrangles.
    ellipse_set : EllipseSet, optional
        The metric of the steps; by default the shipped IEC 60081 ellipses.

    Returns
    -------
    Ratings
    """
    bin_set = bin_set or ansi_bin_set()
    ellipse_set = ellipse_set or shipped_ellipse_set()
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
    categories, conditions = _categories(xy2, cct2, duv2, nominal, bin_set, ellipse_set)
    colour, colour_conditions = _colour(xy2, values, batch.measured_range_nm)
    fidelity, rendering = _rendering(values, cct2)
    lo = np.maximum(batch.measured_range_nm[:, 0], GRID_NM[0])
    hi = np.minimum(batch.measured_range_nm[:, 1], GRID_NM[-1])
    cols = {
        "name": batch.names,
        "source": batch.sources,
        "quantity": batch.quantity,
        "range_start_nm": batch.measured_range_nm[:, 0],
        "range_end_nm": batch.measured_range_nm[:, 1],
        "step_nm": batch.measured_step_nm,
        "interpolation": batch.interpolation,
        **colour,
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
        "ler_range_nm": np.stack([lo, hi], axis=1),
    }
    luminous = luminous_quantity(values)
    radiant = radiant_quantity(values)
    quantity = np.array(batch.quantity)
    for q, key in _LUMINOUS_FIELD.items():
        cols[key] = np.where(quantity == q, luminous, np.nan)
    cols["radiant_flux_W"] = np.where(quantity == "flux", radiant, np.nan)
    cols["electrical_W"] = batch.electrical_W
    # More light out than electricity in is impossible: a unit error (mW/nm read as W/nm) or
    # a wrong power. Such a lamp gets no efficacy at all.
    impossible = cols["radiant_flux_W"] > batch.electrical_W
    cols["efficacy_lm_per_W"] = np.where(impossible, np.nan, cols["luminous_flux_lm"] / batch.electrical_W)
    cols["sp_ratio"] = scotopic_photopic_ratio(values)
    elr, der = alpha_opic_elr(values), alpha_opic_der(values)
    for k, name in enumerate(ALPHA_OPIC):
        cols[f"{name}_elr_mW_per_lm"] = elr[:, k]
    for k, name in enumerate(ALPHA_OPIC):
        cols[f"{name}_der"] = der[:, k]
    cols["melanopic_edi_lx"] = cols["illuminance_lx"] * der[:, 4]
    conditions = {
        "efficacy_needs_flux_spectrum": np.isfinite(batch.electrical_W) & (quantity != "flux"),
        **_rendering_conditions(rendering, cct2),
        **conditions,
        **colour_conditions,
        "efficacy_impossible_flux_exceeds_power": impossible,
        "ler_depends_on_range": _ler_range_conditions(values, lo, hi),
    }
    cols["flags"] = _flags(batch, status, conditions)
    extras = {"batch": batch, "ref_ab_bins": fidelity["ref_ab_bins"], "test_ab_bins": fidelity["test_ab_bins"]}
    return Ratings(cols, extras)
