"""CIE 13.3-1995 colour rendering: general index Ra and special indices R1–R15.

Method (CIE 13.3-1995, clauses 5–6), for every lamp of a batch at once:

1. Reference illuminant at the lamp's CCT: Planckian below 5000 K, CIE daylight from 5000 K
   (:mod:`lampcalc.rendering.reference`).
2. Tristimulus values (CIE 1931 2°, 1 nm sums over 360–830 nm) of the lamp, of the
   reference and of each test colour sample under each, normalised to Y = 100 for the source.
3. Von Kries adaptation of the samples under the lamp to the reference white, in the CIE
   1960 UCS with the c, d coordinates of clause 5.3.
4. CIE 1964 U*V*W* of every sample (W* = 25·Y^(1/3) − 17, U* = 13W*(u − u_r),
   V* = 13W*(v − v_r), with u_r, v_r the reference white).
5. Rᵢ = 100 − 4.6·ΔEᵢ; Ra is the mean of R1–R8.

Samples 1–14 are those of CIE 13.3 (5 nm, interpolated to 1 nm by Sprague as CIE 167
recommends for smooth data); sample 15 is the skin-tone sample of JIS Z 8726 (CIE data set
10.25039/CIE.DS.7chm7z5h), tabulated 380–780 nm and extended by its end values.

The method is valid only when the lamp is close to its reference: CIE 13.3 limits the
distance DC between them in CIE 1960 (u, v) to 5.4e-3. Beyond, the indices are computed
and flagged. Values are unrounded: CIE tables publish Ra from Rᵢ rounded first, which can
differ in the last digit (FL8: 95.5 from unrounded Rᵢ, 95 published).
"""

import functools

import numpy as np

from ..colorimetry.tristimulus import XYZ_to_xy, xy_to_uv
from ..spectra.resampling import GRID_NM, sprague
from ..spectra.row_products import row_dot
from ..spectra.tables import colour_matching_functions, read_table
from .reference import reference_cie13

#: CIE 13.3 limit on the distance between lamp and reference in CIE 1960 (u, v).
DC_LIMIT = 5.4e-3


@functools.lru_cache(maxsize=None)
def tcs_reflectances():
    """Spectral radiance factors of TCS01–TCS15 on the grid, shape ``(15, 471)``."""
    wl, _, values = read_table("cie13_test_colour_samples.csv")
    samples = sprague(wl, values.T)
    wl15, _, v15 = read_table("cie13_tcs15.csv")
    tcs15 = sprague(wl15, v15[:, 0])
    # A reflectance sample does not stop reflecting at the end of its table: extend by end values.
    tcs15 = np.where(GRID_NM < wl15[0], v15[0, 0], np.where(GRID_NM > wl15[-1], v15[-1, 0], tcs15))
    out = np.vstack([samples, tcs15])
    out.flags.writeable = False
    return out


@functools.lru_cache(maxsize=None)
def _sample_weights(wavelength_range_nm):
    """Band mask and R(λ)·cmf(λ) of all samples as one matrix: one product gives every sample's XYZ."""
    band = (GRID_NM >= wavelength_range_nm[0]) & (GRID_NM <= wavelength_range_nm[1])
    cmf = colour_matching_functions("1931_2deg")[band]
    weights = (tcs_reflectances()[:, band].T[:, :, None] * cmf[:, None, :]).reshape(cmf.shape[0], -1)
    return band, cmf, weights


def _sample_colorimetry(source, wavelength_range_nm):
    """Tristimulus of the source (Y = 100), its (u, v), and the samples' Y and (u, v)."""
    band, cmf, weights = _sample_weights(tuple(float(w) for w in wavelength_range_nm))
    source = source[:, band]
    XYZ = row_dot(source, cmf)
    k = 100.0 / XYZ[:, 1]
    samples = row_dot(source, weights).reshape(source.shape[0], -1, 3) * k[:, None, None]
    uv = xy_to_uv(XYZ_to_xy(XYZ))
    return uv, samples[..., 1], xy_to_uv(XYZ_to_xy(samples))


def _cd(uv):
    u, v = uv[..., 0], uv[..., 1]
    return (4.0 - u - 10.0 * v) / v, (1.708 * v + 0.404 - 1.481 * u) / v


def _uvw(Y, uv, white_uv):
    W = 25.0 * np.cbrt(Y) - 17.0
    return np.stack([13 * W * (uv[..., 0] - white_uv[:, None, 0]), 13 * W * (uv[..., 1] - white_uv[:, None, 1]), W], -1)


def cie13_rendering(values, cct_K, wavelength_range_nm=(360.0, 830.0)):
    """CIE 13.3 colour rendering of spectra on the grid.

    Parameters
    ----------
    values : array_like, shape (n, 471)
        Lamp spectra on the 360–830 nm, 1 nm grid (any scale).
    cct_K : array_like, shape (n,)
        CCT of each lamp, which selects its reference illuminant. NaN (no CCT in range)
        gives NaN indices.
    wavelength_range_nm : (float, float)
        Range of the sums. CIE 015:2018's 360–830 nm by default; (360, 780) reproduces
        implementations that sum over the ASTM E308 practice range (colour-science's
        default), which moves Rᵢ of lamps with strong deep-red or near-infrared
        emission by up to about 0.1.

    Returns
    -------
    dict
        ``ra`` (n,), ``ri`` (n, 15) for R1–R15, ``dc`` (n,) the lamp–reference distance in
        CIE 1960 (u, v), and ``valid`` (n,) True where DC ≤ 5.4e-3.

    References
    ----------
    CIE 13.3-1995, Method of measuring and specifying colour rendering properties of
    light sources, clauses 5 and 6.
    """
    values = np.atleast_2d(np.asarray(values, dtype=float))
    reference = reference_cie13(np.atleast_1d(np.asarray(cct_K, dtype=float)))
    with np.errstate(invalid="ignore", divide="ignore"):
        uv_t, Y_t, uv_ti = _sample_colorimetry(values, wavelength_range_nm)
        uv_r, Y_r, uv_ri = _sample_colorimetry(reference, wavelength_range_nm)
        # Step 3: von Kries adaptation in c, d (CIE 13.3, clause 5.3).
        c_t, d_t = _cd(uv_t)
        c_r, d_r = _cd(uv_r)
        c_ti, d_ti = _cd(uv_ti)
        cc = (c_r / c_t)[:, None] * c_ti
        dd = (d_r / d_t)[:, None] * d_ti
        den = 16.518 + 1.481 * cc - dd
        adapted = np.stack([(10.872 + 0.404 * cc - 4.0 * dd) / den, 5.520 / den], -1)
        # Steps 4 and 5.
        delta_e = np.linalg.norm(_uvw(Y_t, adapted, uv_r) - _uvw(Y_r, uv_ri, uv_r), axis=-1)
    ri = 100.0 - 4.6 * delta_e
    dc = np.linalg.norm(uv_t - uv_r, axis=-1)
    return {"ra": ri[:, :8].mean(axis=1), "ri": ri, "dc": dc, "valid": dc <= DC_LIMIT}
