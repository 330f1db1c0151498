"""Spectrum plot: a lamp against its reference illuminant, with V(λ) and the melanopic curve."""

import numpy as np

from ..rendering.reference import reference_cie224
from ..spectra.resampling import GRID_NM
from ..spectra.tables import (
    action_spectra_s026,
    colour_matching_functions,
    luminous_efficiency,
)
from .style import INK, LAMP, MUTED, REFERENCE, plain_text

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


def reference_at_equal_luminance(values, reference):
    """``reference`` spectra scaled to the luminance of ``values`` (both (..., 471) on the grid)."""
    ybar = luminous_efficiency()
    values, reference = np.asarray(values, dtype=float), np.asarray(reference, dtype=float)
    return reference * ((values @ ybar) / (reference @ ybar))[..., None]


class SpectrumPanel:
    """A lamp's relative spectrum against its reference, with V(λ) and the melanopic curve drawn once.

    The lamp is a solid, heavier line; the reference a thinner dashed one: the two stay
    apart in a greyscale print.
    """

    def __init__(self, ax, *, v_lambda=True, melanopic=True):
        self.ax = ax
        (self.lamp,) = ax.plot(GRID_NM, np.full(GRID_NM.size, np.nan), color=LAMP, lw=1.3, label="lamp",
                               gid="lamp_spectrum")
        (self.reference,) = ax.plot(GRID_NM, np.full(GRID_NM.size, np.nan), color=REFERENCE, lw=0.8, ls=(0, (5, 2)),
                                    label="reference", gid="reference_spectrum")
        if v_lambda:
            ax.plot(GRID_NM, luminous_efficiency(), color=INK, lw=0.6, ls=":", label="V(λ)", gid="v_lambda")
        if melanopic:
            mel = action_spectra_s026()[:, 4]
            ax.plot(GRID_NM, mel / mel.max(), color=MUTED, lw=0.6, ls="-.", label="melanopic action spectrum", gid="melanopic")
        ax.set_xlim(360, 830)
        ax.set_ylim(0, 1.05)
        ax.set_xlabel("wavelength (nm)")
        ax.set_ylabel("relative spectral power")
        ax.grid(True)

    def update(self, values, *, reference=None, measured_range_nm=None, name="lamp", reference_label="reference"):
        """Show one lamp (values on the grid; ``reference`` already at equal luminance, or None)."""
        values = np.asarray(values, dtype=float)
        scale = values.max()
        shown = values / scale
        if measured_range_nm is not None:
            shown = np.where((GRID_NM >= measured_range_nm[0]) & (GRID_NM <= measured_range_nm[1]), shown, np.nan)
        self.lamp.set_ydata(shown)
        self.lamp.set_label(name)
        has_reference = reference is not None and np.all(np.isfinite(reference))
        self.reference.set_ydata(np.asarray(reference) / scale if has_reference else np.full(GRID_NM.size, np.nan))
        self.reference.set_visible(has_reference)
        self.reference.set_label(reference_label if has_reference else "_none")
        # The axis holds the reference where the lamp was measured; beyond, the reference may run off the top.
        held = self.reference.get_ydata() if has_reference else np.zeros(1)
        if has_reference and measured_range_nm is not None:
            held = np.where((GRID_NM >= measured_range_nm[0]) & (GRID_NM <= measured_range_nm[1]), held, np.nan)
        top = max(1.05, float(np.nanmax(held)) * 1.05 if np.any(np.isfinite(held)) else 1.05)
        self.ax.set_ylim(0, top)
        return self


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
    panel = SpectrumPanel(ax, v_lambda=v_lambda, melanopic=melanopic)
    reference, label = None, "reference"
    if cct_K is not None and np.isfinite(cct_K):
        reference = reference_at_equal_luminance(values, reference_cie224([cct_K])[0])
        label = f"reference at {cct_K:.0f} K"
    panel.update(values, reference=reference, measured_range_nm=measured_range_nm, name=plain_text(name or "lamp"),
                 reference_label=label)
    ax.set_ylabel("relative spectral power (equal luminance)")
    ax.legend(loc="upper right")
    if band:
        strip = ax.inset_axes([0.0, 0.0, 1.0, 0.03], transform=ax.transAxes, zorder=0.5)
        wl = np.arange(360.0, 831.0)
        strip.imshow(spectral_band_rgb(wl)[None], aspect="auto", extent=(360, 830, 0, 1), interpolation="bilinear")
        strip.set_axis_off()
        ax.set_ylim(-0.04 * ax.get_ylim()[1], ax.get_ylim()[1])
    return ax
