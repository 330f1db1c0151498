"""Chromaticity diagrams: CIE 1931 (x, y), CIE 1976 (u′, v′) and CIE 1960 (u, v).

Drawn: the spectrum locus, the Planckian locus with CCT ticks, isotemperature lines, the
CIE daylight locus, the ANSI C78.377-2017 quadrangles, colour-consistency ellipses around
a nominal centre and the lamps as labelled points. Each element carries a ``gid``:
``spectrum_locus``, ``planckian_locus``, ``daylight_locus``, ``isotherm:<T>``,
``quadrangle:<nominal>``, ``ellipse:<n>``, ``lamp:<name>``.
"""

import numpy as np

from ..colorimetry.daylight import daylight_locus_xy
from ..colorimetry.locus import cct_duv_to_uv, isotemperature_lines
from ..colorimetry.tristimulus import XYZ_to_xy, uv_to_xy, xy_to_upvp, xy_to_uv
from ..spectra.resampling import GRID_NM
from ..spectra.tables import colour_matching_functions
from ..standards.ansi_bins import NOMINAL_CCTS_K, category
from ..standards.steps import metric
from .labels import place_labels
from .style import ACCENT, DAYLIGHT, INK, LAMP, MUTED, PLANCK

SPACES = {
    "xy": (lambda xy: np.asarray(xy, dtype=float), ("x", "y"), "CIE 1931 (x, y)"),
    "upvp": (xy_to_upvp, ("u′", "v′"), "CIE 1976 UCS (u′, v′)"),
    "uv": (xy_to_uv, ("u", "v"), "CIE 1960 UCS (u, v)"),
}
FULL_LIMITS = {"xy": ((0.0, 0.8), (0.0, 0.9)), "upvp": ((0.0, 0.65), (0.0, 0.6)), "uv": ((0.0, 0.65), (0.0, 0.4))}
ZOOM_LIMITS = {"xy": ((0.28, 0.52), (0.29, 0.45)), "upvp": ((0.17, 0.29), (0.44, 0.54)), "uv": ((0.17, 0.29), (0.293, 0.36))}
TICKS_K = (1000, 1500, 2000, 2500, 3000, 3500, 4000, 5000, 6500, 10000)
TICKS_ZOOM_K = (2200, 2500, 2700, 3000, 3500, 4000, 4500, 5000, 5700, 6500, 8000)


def _locus_xy(t_K):
    return uv_to_xy(cct_duv_to_uv(np.stack([t_K, np.zeros_like(t_K)], -1)))


def ellipse_xy(centre_xy, g, n_steps=1.0, n_points=181):
    """Points (x, y) of the n-step ellipse n² = 1e4·(g11Δx² + 2g12ΔxΔy + g22Δy²), shape (n_points, 2)."""
    matrix = 1e4 * np.array([[g[0], g[1]], [g[1], g[2]]])
    values, vectors = np.linalg.eigh(matrix)
    angle = np.linspace(0.0, 2 * np.pi, n_points)
    unit = np.stack([np.cos(angle), np.sin(angle)], -1)
    return np.asarray(centre_xy) + n_steps * (unit / np.sqrt(values)) @ vectors.T


def draw_chromaticity_diagram(
    ax,
    lamps=(),
    *,
    space="xy",
    zoom=False,
    duv_span=0.02,
    quadrangles=True,
    nominal_cct_K=None,
    steps=(1, 2, 3, 4, 5, 6, 7),
    title=None,
    around_xy=None,
    half_width=0.04,
):
    """Draw a chromaticity diagram into ``ax``.

    Parameters
    ----------
    ax : matplotlib Axes
    lamps : sequence of (name, (x, y))
        Lamps to mark and label (labels placed so they do not overlap).
    space : {"xy", "upvp", "uv"}
    zoom : bool
        The white region only (widened to hold every lamp), sized for a report page.
    duv_span : float
        Isotemperature lines run from −duv_span to +duv_span in Duv.
    quadrangles : bool
        Draw the ANSI C78.377-2017 quadrangles.
    nominal_cct_K : float, optional
        Draw colour-consistency ellipses of ``steps`` steps around this nominal CCT's centre.
    around_xy : (x, y), optional
        With ``zoom``, a square window of ± ``half_width`` (in the diagram's coordinates)
        around this chromaticity instead of the whole white region.
    """
    if space not in SPACES:
        raise ValueError(f"unknown diagram space {space!r}; choose one of {', '.join(SPACES)}")
    to_space, (xlabel, ylabel), space_title = SPACES[space]
    lamps = list(lamps)

    # Spectrum locus (380–700 nm: beyond, the CIE 1931 locus folds onto one point) and purple line.
    cmf = colour_matching_functions("1931_2deg")
    sel = (GRID_NM >= 380) & (GRID_NM <= 700)
    locus = to_space(XYZ_to_xy(cmf[sel]))
    ax.plot(*np.vstack([locus, locus[:1]]).T, color=MUTED, lw=0.8, gid="spectrum_locus")
    if not zoom:
        for wl in (460, 480, 500, 520, 540, 560, 580, 600, 620):
            p = locus[wl - 380]
            ax.annotate(f"{wl}", p, xytext=(4, 0), textcoords="offset points", fontsize=6, color=MUTED)

    t = np.geomspace(1000.0, 100000.0, 600)
    planck = to_space(_locus_xy(t))
    ax.plot(*planck.T, color=PLANCK, lw=1.1, gid="planckian_locus", label="Planckian locus")
    ticks = TICKS_ZOOM_K if zoom else TICKS_K
    for tick in ticks:
        line = to_space(uv_to_xy(isotemperature_lines(float(tick), (-duv_span, duv_span), 9)))
        ax.plot(*line.T, color=PLANCK, lw=0.45, alpha=0.45 if zoom else 0.7, gid=f"isotherm:{tick}")
        ax.annotate(
            f"{tick:g} K" if zoom else f"{tick / 1000:g}k", line[0], xytext=(0, -3), textcoords="offset points",
            fontsize=5.5, color=PLANCK, ha="center", va="top",
        )

    day = to_space(daylight_locus_xy(np.geomspace(4000.0, 25000.0, 200)))
    ax.plot(*day.T, color=DAYLIGHT, lw=0.9, ls=(0, (4, 2)), gid="daylight_locus", label="CIE daylight locus")

    if quadrangles:
        for nominal in NOMINAL_CCTS_K:
            corners = to_space(category(nominal).corners_xy)
            ax.fill(*corners.T, facecolor="none", edgecolor=INK, lw=0.45, alpha=0.55, gid=f"quadrangle:{nominal}")
            if zoom:
                top = corners[:2].mean(axis=0)
                ax.annotate(f"{nominal}", top, xytext=(0, 2), textcoords="offset points", fontsize=5.5, color=INK,
                            ha="center", va="bottom", alpha=0.7)

    if nominal_cct_K is not None:
        centre = category(nominal_cct_K).centre_xy
        g, _ = metric(nominal_cct_K)
        for n in steps:
            ring = to_space(ellipse_xy(centre, g, n))
            ax.plot(*ring.T, color=ACCENT, lw=0.5 if n != 6 else 0.9, alpha=0.85, gid=f"ellipse:{n}")
        ax.plot(*to_space(centre), marker="+", color=ACCENT, ms=5, gid="ellipse_centre")

    if lamps:
        points = np.array([to_space(np.asarray(xy, dtype=float)) for _, xy in lamps])
        for (name, _), p in zip(lamps, points):
            ax.plot(p[0], p[1], marker="D", ms=3.6, mfc=LAMP, mec="white", mew=0.5, ls="none", gid=f"lamp:{name}")

    (x0, x1), (y0, y1) = (ZOOM_LIMITS if zoom else FULL_LIMITS)[space]
    if zoom and around_xy is not None:
        cx, cy = to_space(np.asarray(around_xy, dtype=float))
        (x0, x1), (y0, y1) = (cx - half_width, cx + half_width), (cy - half_width, cy + half_width)
    elif zoom and lamps:
        finite = points[np.all(np.isfinite(points), axis=1)]
        if finite.size:
            pad = 0.1 * max(x1 - x0, y1 - y0)
            x0, x1 = min(x0, finite[:, 0].min() - pad), max(x1, finite[:, 0].max() + pad)
            y0, y1 = min(y0, finite[:, 1].min() - pad), max(y1, finite[:, 1].max() + pad)
    ax.set_xlim(x0, x1)
    ax.set_ylim(y0, y1)
    ax.set_aspect("equal", adjustable="box")
    ax.set_xlabel(xlabel)
    ax.set_ylabel(ylabel)
    ax.grid(True)
    ax.set_title(title or space_title + (": white region" if zoom else ""), loc="left")
    ax.legend(loc="upper left" if zoom else "lower right", handlelength=2.0)
    if lamps:
        place_labels(ax, points, [name for name, _ in lamps], LAMP)
    return ax

