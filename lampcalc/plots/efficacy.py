"""Blackbody luminous efficacy against temperature, and Wien's peak and the total exitance."""

import numpy as np

from ..colorimetry.photometry import (
    luminous_efficacy_of_blackbody,
    luminous_efficacy_of_radiation,
)
from ..physics.blackbody import peak_wavelength_nm, radiant_exitance, spectral_radiance
from ..spectra.resampling import GRID_NM
from .labels import place_labels
from .style import DAYLIGHT, INK, LAMP, PLANCK, plain_log_ticks


def draw_blackbody_efficacy(ax, lamps=(), t_range_K=(500.0, 20000.0)):
    """LER of Planck radiation against temperature, with lamps' LERs marked at their CCTs.

    Two curves, because LER depends on the wavelengths it is taken over: over all wavelengths
    (the radiation's total, σT⁴; peak about 95 lm/W near 6600 K) and over 360–830 nm, the range
    of the lamps' LER.

    Parameters
    ----------
    lamps : sequence of (name, cct_K, ler_lm_per_W)
    """
    t = np.geomspace(*t_range_K, 400)
    total = luminous_efficacy_of_blackbody(t)
    ax.plot(t, total, color=PLANCK, lw=1.1, label="blackbody, all wavelengths", gid="ler_all_wavelengths")
    band = luminous_efficacy_of_radiation(spectral_radiance(t, GRID_NM))
    ax.plot(t, band, color=DAYLIGHT, lw=1.0, ls=(0, (5, 2)), label="blackbody, 360–830 nm", gid="ler_360_830")
    i = int(np.argmax(total))
    ax.annotate(f"{total[i]:.1f} lm/W at {t[i]:.0f} K", (t[i], total[i]), xytext=(0, 8), textcoords="offset points",
                ha="center", fontsize=7, color=PLANCK)
    shown = [(n, c, v) for n, c, v in lamps if c is not None and v is not None and np.isfinite(c) and np.isfinite(v)]
    for name, cct, ler in shown:
        ax.plot(cct, ler, marker="D", ms=3.6, mfc=LAMP, mec="white", mew=0.5, ls="none", gid=f"lamp:{name}")
    ax.set_xscale("log")
    plain_log_ticks(ax.xaxis)
    ax.set_xlim(*t_range_K)
    ax.set_ylim(0, max([total.max(), band.max()] + [v for _, _, v in shown]) * 1.12)
    ax.set_xlabel("temperature (K)")
    ax.set_ylabel("luminous efficacy of radiation (lm/W)")
    ax.grid(True, which="both")
    ax.legend(loc="upper left")
    ax.set_title("Luminous efficacy of blackbody radiation; lamps over 360–830 nm", loc="left")
    if shown:
        place_labels(ax, np.array([(c, v) for _, c, v in shown]), [n for n, _, _ in shown], LAMP, fontsize=6)
    return ax


def draw_peak_and_exitance(ax, t_range_K=(500.0, 20000.0)):
    """Wien peak wavelength (left axis) and total exitance σT⁴ (right axis, log) against temperature."""
    t = np.geomspace(*t_range_K, 300)
    ax.plot(t, peak_wavelength_nm(t), color=PLANCK, lw=1.1, gid="peak_wavelength", label="peak wavelength (Wien)")
    ax.axhspan(380, 780, color="#f0e6d2", zorder=0, lw=0)
    ax.set_xscale("log")
    ax.set_yscale("log")
    plain_log_ticks(ax.xaxis)
    plain_log_ticks(ax.yaxis)
    ax.set_xlim(*t_range_K)
    ax.set_xlabel("temperature (K)")
    ax.set_ylabel("peak wavelength (nm)", color=PLANCK)
    right = ax.twinx()
    right.plot(t, radiant_exitance(t), color=INK, lw=0.9, ls=(0, (5, 2)), gid="exitance", label="exitance σT⁴")
    right.set_yscale("log")
    plain_log_ticks(right.yaxis)
    right.set_ylabel("radiant exitance (W/m²)")
    ax.grid(True, which="both")
    ax.set_title("Wien peak (shaded: 380–780 nm) and Stefan–Boltzmann exitance", loc="left")
    handles = ax.get_legend_handles_labels()[0] + right.get_legend_handles_labels()[0]
    ax.legend(handles, [h.get_label() for h in handles], loc="upper center")
    return ax, right
