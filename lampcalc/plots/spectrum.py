"""Spectrum plot: a lamp against its reference illuminant, with V(λ) and the melanopic curve."""

import numpy as np

from ..rendering.reference import reference_cie224
from ..spectra.resampling import GRID_NM
from ..spectra.tables import (
    action_spectra_s026,
    colour_matching_functions,
    luminous_efficiency,
)
from .style import INK, LAMP, MUTED, REFERENCE

# IEC 61966-2-1 (sRGB): CIE XYZ to linear RGB.
_XYZ_TO_SRGB = np.array([[3.2406, -1.5372, -0.4986], [-0.9689, 1.8758, 0.0415], [0.0557, -0.2040, 1.0570]])


def spectral_band_rgb(wavelength_nm):
    """Display colours (sRGB, 0–1) that suggest monochromatic light, shape (n, 3).

    Linear sRGB of the CIE 1931 colour-matching functions, clipped at zero, brought to full
    brightness and dimmed towards the ends of the visible range; then the sRGB curve. An
    impression of the spectral colours for a legend band, not a colorimetric rendering.
    """
    cmf = colour_matching_functions("1931_2deg")
    xyz = np.stack([np.interp(wavelength_nm, GRID_NM, cmf[:, k]) for k in range(3)], -1)
    rgb = np.clip(xyz @ _XYZ_TO_SRGB.T, 0.0, None)
    rgb /= np.maximum(rgb.max(axis=1, keepdims=True), 1e-12)
    rgb *= (np.interp(wavelength_nm, GRID_NM, cmf[:, 1]) / cmf[:, 1].max())[:, None] ** 0.25
    return np.where(rgb <= 0.0031308, 12.92 * rgb, 1.055 * rgb ** (1 / 2.4) - 0.055)


def draw_spectrum(ax, values, *, cct_K=None, name="", measured_range_nm=None, v_lambda=True, melanopic=True, band=True):
    """Relative spectrum of one lamp on the grid, with the reference illuminant at its CCT.

    Parameters
    ----------
    ax : matplotlib Axes
    values : array_like, shape (471,)
        The lamp's spectrum on the 360–830 nm grid.
    cct_K : float, optional
        The lamp's CCT: draws the CIE 224 reference (Planckian below 4000 K, daylight above
        5000 K, a mixture between) at equal luminance. Omitted when NaN or None.
    measured_range_nm : (float, float), optional
        The lamp is drawn only where it was measured (outside, lampcalc's zeros are no data).
    """
    values = np.asarray(values, dtype=float)
    ybar = luminous_efficiency()
    scale = values.max()
    shown = values / scale
    if measured_range_nm is not None:
        shown = np.where((GRID_NM >= measured_range_nm[0]) & (GRID_NM <= measured_range_nm[1]), shown, np.nan)
    ax.plot(GRID_NM, shown, color=LAMP, lw=1.1, label=name or "lamp", gid="lamp_spectrum")
    if cct_K is not None and np.isfinite(cct_K):
        ref = reference_cie224([cct_K])[0]
        if np.all(np.isfinite(ref)):
            ref = ref * (values @ ybar) / (ref @ ybar) / scale
            ax.plot(GRID_NM, ref, color=REFERENCE, lw=0.9, ls=(0, (5, 2)), label=f"reference at {cct_K:.0f} K",
                    gid="reference_spectrum")
    if v_lambda:
        ax.plot(GRID_NM, ybar, color=INK, lw=0.6, ls=":", label="V(λ)", gid="v_lambda")
    if melanopic:
        mel = action_spectra_s026()[:, 4]
        ax.plot(GRID_NM, mel / mel.max(), color=MUTED, lw=0.6, ls="-.", label="melanopic s_mel(λ)", gid="melanopic")
    ax.set_xlim(360, 830)
    ax.set_ylim(0, max(1.05, ax.get_ylim()[1]))
    ax.set_xlabel("wavelength (nm)")
    ax.set_ylabel("relative spectral power (equal luminance)")
    ax.grid(True)
    ax.legend(loc="upper right")
    if band:
        strip = ax.inset_axes([0.0, 0.0, 1.0, 0.03], transform=ax.transAxes, zorder=0.5)
        wl = np.arange(360.0, 831.0)
        strip.imshow(spectral_band_rgb(wl)[None], aspect="auto", extent=(360, 830, 0, 1), interpolation="bilinear")
        strip.set_axis_off()
        ax.set_ylim(-0.04 * ax.get_ylim()[1], ax.get_ylim()[1])
    return ax
