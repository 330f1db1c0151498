"""The comparison figure: a test spectrum and its reference at equal luminous quantity, and their ratio.

Draws from :func:`lampcalc.verdicts.comparison.normalised_spectra`. Tags (``gid``):
``reference_spectrum``, ``test_spectrum``, ``spectral_ratio``, ``unit_ratio``.
"""

import numpy as np

from ..spectra.resampling import GRID_NM
from ..verdicts.comparison import RATIO_FLOOR, normalised_spectra
from .style import INK, LAMP, MUTED, REFERENCE, new_figure


def draw_normalised_spectra(ax, reference, test, *, reference_name="reference", test_name="test",
                            reference_range_nm=None, test_range_nm=None):
    """Both spectra (on the 360–830 nm grid) at equal luminous quantity, the reference's peak at 1."""
    ref, tst, _ = normalised_spectra(reference, test)
    for values, rng, colour, style, name, gid in (
        (ref, reference_range_nm, REFERENCE, (0, (5, 2)), reference_name, "reference_spectrum"),
        (tst, test_range_nm, LAMP, "-", test_name, "test_spectrum"),
    ):
        shown = values if rng is None else np.where((GRID_NM >= rng[0]) & (GRID_NM <= rng[1]), values, np.nan)
        ax.plot(GRID_NM, shown, color=colour, ls=style, lw=1.0, label=name, gid=gid)
    ax.set_xlim(360, 830)
    ax.set_ylim(0, max(1.05, float(np.nanmax(tst)) * 1.05))
    ax.set_ylabel("relative (equal luminous quantity)")
    ax.grid(True)
    ax.legend(loc="upper right")
    return ax


def draw_spectral_ratio(ax, reference, test, *, reference_range_nm=None, test_range_nm=None):
    """test / reference at equal luminous quantity, where the reference has light (:data:`RATIO_FLOOR` of its peak)."""
    _, _, ratio = normalised_spectra(reference, test, reference_range_nm, test_range_nm)
    ax.axhline(1.0, color=MUTED, lw=0.7, gid="unit_ratio")
    ax.plot(GRID_NM, ratio, color=INK, lw=1.0, gid="spectral_ratio", label="test / reference")
    finite = ratio[np.isfinite(ratio)]
    if finite.size:
        spread = max(0.1, float(np.max(np.abs(np.clip(finite, 0, 3) - 1.0))) * 1.1)
        ax.set_ylim(max(0.0, 1.0 - spread), 1.0 + spread)
    ax.set_xlim(360, 830)
    ax.set_xlabel("wavelength (nm)")
    ax.set_ylabel("ratio")
    ax.set_title(f"test / reference (where the reference is above {100 * RATIO_FLOOR:g} % of its peak)", loc="left")
    ax.grid(True)
    return ax


def comparison_figure(reference, test, comparison, k=0):
    """Pair ``k`` of a comparison: both spectra and their ratio, as a Figure.

    ``reference`` and ``test`` are the two :class:`~lampcalc.rating.ratings.Ratings`;
    ``comparison`` is :func:`lampcalc.verdicts.comparison.compare_ratings`' result.
    """
    p = comparison["pairs"]
    i = list(reference["name"]).index(p["reference_name"][k])
    j = list(test["name"]).index(p["test_name"][k])
    ref_batch, test_batch = reference.extras["batch"], test.extras["batch"]
    ranges = {"reference_range_nm": ref_batch.measured_range_nm[i], "test_range_nm": test_batch.measured_range_nm[j]}
    fig = new_figure((6.3, 5.6))
    top = fig.add_subplot(2, 1, 1)
    draw_normalised_spectra(top, ref_batch.values[i], test_batch.values[j], reference_name=p["reference_name"][k],
                            test_name=p["test_name"][k], **ranges)
    top.set_title(f"{p['test_name'][k]} (test) against {p['reference_name'][k]} (reference)\n"
                  f"Δu′v′ {p['delta_uv_prime'][k]:.5f}, ΔCCT {p['delta_cct_K'][k]:+.0f} K, ΔDuv {p['delta_duv'][k]:+.4f}",
                  loc="left")
    draw_spectral_ratio(fig.add_subplot(2, 1, 2, sharex=top), ref_batch.values[i], test_batch.values[j], **ranges)
    return fig
