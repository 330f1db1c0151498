"""Whole figures for ``lampcalc plot``: one function per kind, each returning a Figure."""

import numpy as np

from ..errors import InputError
from .diagram import draw_chromaticity_diagram
from .efficacy import draw_blackbody_efficacy, draw_peak_and_exitance
from .hue import draw_hue_bars, draw_hue_graphic
from .spectrum import draw_spectrum
from .style import new_figure

KINDS = ("locus", "spectrum", "efficacy", "hue")


def _select(ratings, lamps, single):
    names = list(ratings["name"])
    if lamps:
        missing = [n for n in lamps if n not in names]
        if missing:
            raise InputError(f"no lamp named {missing[0]!r}; the lamps are {', '.join(names)}")
        chosen = [names.index(n) for n in lamps]
    else:
        chosen = list(range(len(names)))
    if single and len(chosen) != 1:
        chosen = chosen[:1]
    return chosen


def locus_figure(ratings, lamps=(), space="xy", zoom=False, duv_span=0.02, nominal_cct_K=None, quadrangles=True):
    """A chromaticity diagram with the chosen lamps (all by default)."""
    idx = _select(ratings, lamps, single=False)
    fig = new_figure((6.3, 5.6) if zoom else (6.3, 6.3))
    ax = fig.add_subplot()
    draw_chromaticity_diagram(
        ax, [(ratings["name"][i], (ratings["x"][i], ratings["y"][i])) for i in idx], space=space, zoom=zoom,
        duv_span=duv_span, nominal_cct_K=nominal_cct_K, quadrangles=quadrangles,
    )
    return fig


def spectrum_figure(ratings, lamps=(), v_lambda=True, melanopic=True):
    """One lamp's spectrum with its reference illuminant (the first lamp unless one is named)."""
    (i,) = _select(ratings, lamps, single=True)
    fig = new_figure((6.3, 3.8))
    ax = fig.add_subplot()
    batch = ratings.extras["batch"]
    draw_spectrum(ax, batch.values[i], cct_K=ratings["cct_K"][i], name=ratings["name"][i],
                  measured_range_nm=batch.measured_range_nm[i], v_lambda=v_lambda, melanopic=melanopic)
    ax.set_title(f"{ratings['name'][i]}: spectrum and reference", loc="left")
    return fig


def efficacy_figure(ratings, lamps=()):
    """Blackbody efficacy against temperature with the lamps' LERs, and Wien's peak and σT⁴."""
    idx = _select(ratings, lamps, single=False)
    fig = new_figure((6.3, 7.0))
    draw_blackbody_efficacy(fig.add_subplot(2, 1, 1), [(ratings["name"][i], ratings["cct_K"][i], ratings["ler_lm_per_W"][i]) for i in idx])
    draw_peak_and_exitance(fig.add_subplot(2, 1, 2))
    return fig


def hue_figure(ratings, lamps=()):
    """One lamp's TM-30-18 hue-bin graphic and its local chroma and hue shifts."""
    (i,) = _select(ratings, lamps, single=True)
    ref, test = ratings.extras["ref_ab_bins"][i], ratings.extras["test_ab_bins"][i]
    if not (np.all(np.isfinite(ref)) and np.all(np.isfinite(test))):
        raise InputError(f"{ratings['name'][i]}: no TM-30 hue bins (no reference illuminant: no CCT in range)")
    fig = new_figure((6.3, 3.6))
    grid = fig.add_gridspec(2, 2, width_ratios=(1.0, 1.25))
    draw_hue_graphic(fig.add_subplot(grid[:, 0]), ref, test, title=f"{ratings['name'][i]}: hue bins (TM-30-18)")
    draw_hue_bars(fig.add_subplot(grid[0, 1]), fig.add_subplot(grid[1, 1]),
                  ratings["chroma_shift_hue_bins_percent"][i], ratings["hue_shift_hue_bins_rad"][i])
    return fig


FIGURES = {"locus": locus_figure, "spectrum": spectrum_figure, "efficacy": efficacy_figure, "hue": hue_figure}
