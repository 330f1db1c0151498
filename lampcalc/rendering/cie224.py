"""Colour fidelity and gamut: CIE 224:2017 Rf and ANSI/IES TM-30-18 Rf, Rg and hue bins.

Method (CIE 224:2017, clauses 4–5; ANSI/IES TM-30-18, clauses 4–6), for every lamp of a
batch at once, over 380–780 nm at 1 nm:

1. Reference illuminant at the lamp's CCT (:func:`~lampcalc.rendering.reference.reference_cie224`):
   Planckian below 4000 K, CIE daylight above 5000 K, a luminance-matched mixture between.
2. CIE 1964 10° tristimulus values of the 99 colour evaluation samples (CES) under lamp and
   reference, each source scaled to Y = 100.
3. CIECAM02 (L_A = 100 cd/m², Y_b = 20, average surround, illuminant discounted) and
   CAM02-UCS J′a′b′, computed with colour-science's array implementations.
4. ΔE′ per sample; Rf = 10·ln(exp((100 − 6.73·mean ΔE′)/10) + 1), and the same transform
   per sample.
5. TM-30: 16 hue bins of 22.5° by the reference hue angle h of each sample; the mean a′b′
   of the samples in each bin under lamp and reference; Rg = 100 × area of the lamp's
   16-gon / area of the reference's. Per bin: local fidelity Rf,hj (the transform of the
   bin's mean ΔE′), chroma shift Rcs,hj and hue shift Rhs,hj relative to the bin's
   reference chroma, along and across the bin's centre angle.

Edition: the calculation follows ANSI/IES TM-30-18 (whose Rf is CIE 224:2017's); later
TM-30 editions are not claimed. CCT for the reference comes from lampcalc's exact
Planckian-locus solution (CIE 1931 2°).
"""

import functools

import numpy as np

from ..spectra.resampling import GRID_NM
from ..spectra.row_products import row_dot
from ..spectra.tables import colour_matching_functions, read_table
from .reference import reference_cie224

#: The CIE 224 computation band, 380–780 nm on the 1 nm grid.
BAND = slice(int(380 - GRID_NM[0]), int(780 - GRID_NM[0]) + 1)
#: Scaling factor of the Rf transform (CIE 224:2017).
CF = 6.73
N_BINS = 16


@functools.lru_cache(maxsize=None)
def colour_evaluation_samples():
    """Spectral radiance factors of the 99 CES over 380–780 nm at 1 nm, shape ``(99, 401)``."""
    _, _, values = read_table("cie224_colour_evaluation_samples.csv")
    out = values.T.copy()
    out.flags.writeable = False
    return out


def rf_from_delta_e(delta_e):
    """Rf = 10·ln(exp((100 − 6.73·ΔE′)/10) + 1) (CIE 224:2017, eq. 11)."""
    return 10.0 * np.log1p(np.exp((100.0 - CF * np.asarray(delta_e)) / 10.0))


@functools.lru_cache(maxsize=None)
def _sample_weights():
    """R(λ)·cmf(λ) of every CES, shape (401, 99·3): one matrix product gives all sample XYZ."""
    cmf = colour_matching_functions("1964_10deg")[BAND]
    weights = colour_evaluation_samples().T[:, :, None] * cmf[:, None, :]
    return np.ascontiguousarray(weights.reshape(cmf.shape[0], -1))


def _cam02(samples, white):
    """CIECAM02 J, M, h of samples (m, 99, 3) under whites (m, 3), for CIE 224's viewing conditions.

    CIE 224:2017, clause 4.3: L_A = 100 cd/m², Y_b = 20, average surround, illuminant
    discounted (D = 1). Built from colour-science's CIECAM02 steps, keeping only the
    correlates CAM02-UCS needs and computing the white's terms once per lamp.
    """
    from colour.adaptation import CAT_CAT02
    from colour.appearance import ciecam02 as cam
    from colour.appearance.hunt import MATRIX_XYZ_TO_HPE

    surround = cam.VIEWING_CONDITIONS_CIECAM02["Average"]
    L_A, Y_b = np.array(100.0), np.array(20.0)
    Y_w = white[:, 1:2]
    n, F_L, N_bb, N_cb, z = cam.viewing_conditions_dependent_parameters(Y_b, Y_w, L_A)
    # colour-science's matrices, applied with one matrix product each (its RGB_to_rgb step).
    to_hpe = (MATRIX_XYZ_TO_HPE @ cam.CAT_INVERSE_CAT02).T
    RGB_w = row_dot(white, CAT_CAT02.T)[:, None, :]
    D = np.ones(Y_w.shape)
    RGB_a = cam.post_adaptation_non_linear_response_compression_forward(
        cam.full_chromatic_adaptation_forward(samples @ CAT_CAT02.T, RGB_w, Y_w, D) @ to_hpe, F_L[..., None]
    )
    RGB_aw = cam.post_adaptation_non_linear_response_compression_forward(
        cam.full_chromatic_adaptation_forward(RGB_w, RGB_w, Y_w, D) @ to_hpe, F_L[..., None]
    )
    opponent = cam.opponent_colour_dimensions_forward(RGB_a)
    a, b = opponent[..., 0], opponent[..., 1]
    h = cam.hue_angle(a, b)
    A = cam.achromatic_response_forward(RGB_a, N_bb)
    A_w = cam.achromatic_response_forward(RGB_aw, N_bb)
    J = cam.lightness_correlate(A, A_w, surround.c, z)
    C = cam.chroma_correlate(J, n, surround.N_c, N_cb, cam.eccentricity_factor(h), a, b, RGB_a)
    return J, cam.colourfulness_correlate(C, F_L), h


def _jab(source):
    """CAM02-UCS J′a′b′ and CIECAM02 hue of the CES under each source, shapes (n, 99, 3), (n, 99)."""
    from colour.models import JMh_CIECAM02_to_CAM02UCS

    white = row_dot(source, colour_matching_functions("1964_10deg")[BAND])
    k = 100.0 / white[:, 1]
    samples = row_dot(source, _sample_weights()).reshape(-1, 99, 3) * k[:, None, None]
    J, M, h = _cam02(samples, white * k[:, None])
    return JMh_CIECAM02_to_CAM02UCS(np.stack([J, M, h], axis=-1)), h


def _polygon_area(points):
    """Shoelace area of closed polygons, points of shape (n, k, 2)."""
    x, y = points[..., 0], points[..., 1]
    return 0.5 * np.sum(x * np.roll(y, -1, axis=-1) - np.roll(x, -1, axis=-1) * y, axis=-1)


def cie224_fidelity(values, cct_K, daylight_interpolation="linear"):
    """CIE 224:2017 / TM-30-18 fidelity and gamut of spectra on the grid.

    Parameters
    ----------
    values : array_like, shape (n, 471)
        Lamp spectra on the 360–830 nm, 1 nm grid; only 380–780 nm is used.
    cct_K : array_like, shape (n,)
        CCT of each lamp, which selects its reference. NaN, or above 25 000 K, gives NaN.
    daylight_interpolation : {"linear", "sprague"}
        How the 5 nm daylight components reach 1 nm for the reference (CIE 015 practice:
        linear). colour-science's TM-30-18 uses Sprague, which moves Rf of a daylight-
        referenced lamp by up to about 0.01.

    Returns
    -------
    dict
        ``rf`` (n,), ``rg`` (n,), ``rf_samples`` (n, 99), and per hue bin (n, 16):
        ``rf_bins`` local fidelity, ``rcs_bins`` chroma shift (fraction, ×100 for %),
        ``rhs_bins`` hue shift (radians relative to the bin's reference chroma), and
        ``ref_ab_bins`` / ``test_ab_bins`` (n, 16, 2) mean a′b′ per bin, for plotting.

    References
    ----------
    CIE 224:2017, CIE 2017 colour fidelity index for accurate scientific use.
    ANSI/IES TM-30-18, IES method for evaluating light source color rendition.
    """
    values = np.atleast_2d(np.asarray(values, dtype=float))[:, BAND]
    cct = np.atleast_1d(np.asarray(cct_K, dtype=float))
    reference = reference_cie224(cct, BAND, daylight_interpolation)
    ok = np.all(np.isfinite(reference), axis=1)
    n = values.shape[0]
    out_nan = np.full((n, N_BINS), np.nan)
    result = {
        "rf": np.full(n, np.nan),
        "rg": np.full(n, np.nan),
        "rf_samples": np.full((n, 99), np.nan),
        "rf_bins": out_nan.copy(),
        "rcs_bins": out_nan.copy(),
        "rhs_bins": out_nan.copy(),
        "ref_ab_bins": np.full((n, N_BINS, 2), np.nan),
        "test_ab_bins": np.full((n, N_BINS, 2), np.nan),
    }
    if not np.any(ok):
        return result
    m = int(np.count_nonzero(ok))
    # Lamps and references in one pass through the appearance model.
    jab, hue = _jab(np.concatenate([values[ok], reference[ok]]))
    jab_t, jab_r, hue_r = jab[:m], jab[m:], hue[m:]
    delta_e = np.linalg.norm(jab_t - jab_r, axis=-1)
    # TM-30-18, clause 5: bins by the reference hue angle; per-bin means by weighted bin counts.
    bins = np.floor(hue_r / 22.5).astype(np.intp) % N_BINS
    index = (bins + N_BINS * np.arange(bins.shape[0])[:, None]).ravel()

    def bin_sum(weights):
        return np.bincount(index, weights.ravel(), minlength=bins.size // 99 * N_BINS).reshape(-1, N_BINS)

    count = bin_sum(np.ones(bins.shape))
    with np.errstate(invalid="ignore", divide="ignore"):
        mean_t = np.stack([bin_sum(jab_t[..., 1]), bin_sum(jab_t[..., 2])], -1) / count[..., None]
        mean_r = np.stack([bin_sum(jab_r[..., 1]), bin_sum(jab_r[..., 2])], -1) / count[..., None]
        bin_de = bin_sum(delta_e) / count
    angle = np.deg2rad(22.5 * np.arange(N_BINS) + 11.25)
    cos, sin = np.cos(angle), np.sin(angle)
    norm = np.linalg.norm(mean_r, axis=-1)
    da, db = mean_t[..., 0] - mean_r[..., 0], mean_t[..., 1] - mean_r[..., 1]
    result["rf"][ok] = rf_from_delta_e(delta_e.mean(axis=1))
    result["rf_samples"][ok] = rf_from_delta_e(delta_e)
    result["rg"][ok] = 100.0 * _polygon_area(mean_t) / _polygon_area(mean_r)
    result["rf_bins"][ok] = rf_from_delta_e(bin_de)
    result["rcs_bins"][ok] = (da * cos + db * sin) / norm
    result["rhs_bins"][ok] = (-da * sin + db * cos) / norm
    result["ref_ab_bins"][ok] = mean_r
    result["test_ab_bins"][ok] = mean_t
    return result
