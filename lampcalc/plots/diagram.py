"""Chromaticity diagrams: CIE 1931 (x, y), CIE 1976 (u′, v′) and CIE 1960 (u, v).

Drawn: the spectrum locus, the Planckian locus with isotemperature lines, the CIE daylight
locus, the ANSI C78.377-2017 quadrangles, colour-consistency ellipses around a nominal
centre and the lamps as labelled points. Each element carries a ``gid``:
``spectrum_locus``, ``planckian_locus``, ``daylight_locus``, ``isotherm:<T>``,
``quadrangle:<nominal>``, ``ellipse:<n>``, ``lamp:<name>``, ``label:<name>``, ``region:<name>``
(a lamp's 95 % region over Monte Carlo draws, :mod:`lampcalc.rating.coverage_region`).

A :class:`ChromaticityDiagram` draws the fixed parts once and is then aimed at lamps as
often as needed (the report draws one diagram per page this way): :meth:`~ChromaticityDiagram.show`
adds the lamps, ellipses and labels and sets the window; :meth:`~ChromaticityDiagram.clear`
takes them away again. Labels stay inside the axes: isotherm labels sit at the visible end
of their line, quadrangle numbers inside their quadrangle, lamp labels beside their points
(:mod:`lampcalc.plots.labels`). In the white region the window always holds every ANSI
quadrangle whole.
"""

import numpy as np
from matplotlib.colors import to_rgb

from ..colorimetry.daylight import daylight_locus_xy
from ..colorimetry.locus import cct_duv_to_uv, isotemperature_lines
from ..colorimetry.tristimulus import XYZ_to_xy, upvp_to_xy, uv_to_xy, xy_to_upvp, xy_to_uv
from ..spectra.resampling import GRID_NM
from ..spectra.tables import colour_matching_functions
from ..standards.ansi_bins import NOMINAL_CCTS_K, category
from ..standards.steps import metric
from .labels import place_labels
from .style import ACCENT, DAYLIGHT, INK, LAMP, MUTED, PLANCK, plain_text

SPACES = {
    "xy": (lambda xy: np.asarray(xy, dtype=float), ("x", "y"), "CIE 1931 (x, y)"),
    "upvp": (xy_to_upvp, ("u′", "v′"), "CIE 1976 UCS (u′, v′)"),
    "uv": (xy_to_uv, ("u", "v"), "CIE 1960 UCS (u, v)"),
}
FULL_LIMITS = {"xy": ((0.0, 0.8), (0.0, 0.9)), "upvp": ((0.0, 0.65), (0.0, 0.6)), "uv": ((0.0, 0.65), (0.0, 0.4))}
TICKS_K = (1000, 1500, 2000, 2500, 3000, 3500, 4000, 5000, 6500, 10000)
TICKS_ZOOM_K = (2200, 2500, 2700, 3000, 3500, 4000, 4500, 5000, 5700, 6500, 8000)
#: Padding around what a window must hold, as a fraction of its larger side.
PAD = 0.06


def _locus_xy(t_K):
    return uv_to_xy(cct_duv_to_uv(np.stack([t_K, np.zeros_like(t_K)], -1)))


def ellipse_xy(centre_xy, g, n_steps=1.0, n_points=181):
    """Points (x, y) of the n-step ellipse n² = 1e4·(g11Δx² + 2g12ΔxΔy + g22Δy²), shape (n_points, 2)."""
    matrix = 1e4 * np.array([[g[0], g[1]], [g[1], g[2]]])
    values, vectors = np.linalg.eigh(matrix)
    angle = np.linspace(0.0, 2 * np.pi, n_points)
    unit = np.stack([np.cos(angle), np.sin(angle)], -1)
    return np.asarray(centre_xy) + n_steps * (unit / np.sqrt(values)) @ vectors.T


def white_region(space="xy"):
    """The window ((x0, x1), (y0, y1)) that holds every ANSI C78.377 quadrangle whole, padded."""
    to_space = SPACES[space][0]
    corners = to_space(np.vstack([category(n).corners_xy for n in NOMINAL_CCTS_K]))
    return _padded(corners)


def near_white(xy, space="xy", grow=0.5):
    """Which chromaticities (x, y), shape (n, 2), lie within the white region widened by ``grow`` of its size each way."""
    (x0, x1), (y0, y1) = white_region(space)
    p = SPACES[space][0](np.asarray(xy, dtype=float).reshape(-1, 2))
    dx, dy = grow * (x1 - x0), grow * (y1 - y0)
    with np.errstate(invalid="ignore"):
        return (p[:, 0] >= x0 - dx) & (p[:, 0] <= x1 + dx) & (p[:, 1] >= y0 - dy) & (p[:, 1] <= y1 + dy)


def step_ring_xy(nominal_cct_K, n_steps, ellipse_set=None, n_points=181):
    """The ``n_steps`` contour around the ANSI centre of ``nominal_cct_K`` in CIE 1931 (x, y), shape (n_points, 2).

    The metric is the ellipse set's (default IEC 60081, :mod:`lampcalc.standards.steps`), in the
    set's own coordinates, and the contour is brought back to (x, y).
    """
    from ..standards.ellipse_sets import FROM_XY

    space = getattr(ellipse_set, "space", "xy")
    g, _ = metric(nominal_cct_K, ellipse_set)
    centre = FROM_XY[space](category(nominal_cct_K).centre_xy)
    ring = ellipse_xy(centre, g, n_steps, n_points)
    return {"xy": lambda p: p, "uv": uv_to_xy, "upvp": upvp_to_xy}[space](ring)


def window_around(xy, nominal_cct_K, space="xy", steps=7, ellipse_set=None):
    """A window holding a lamp at ``xy`` (or the points, shape (n, 2), of it and its region), the ANSI quadrangle
    of ``nominal_cct_K`` whole (a flexible CCT has none) and its ``steps``-step contour."""
    to_space = SPACES[space][0]
    cat = category(nominal_cct_K)
    parts = [step_ring_xy(nominal_cct_K, steps, ellipse_set, 61), np.reshape(xy, (-1, 2))]
    if cat.corners_xy is not None:
        parts.append(cat.corners_xy)
    return _padded(to_space(np.vstack(parts)), pad=0.12)


def _padded(points, pad=PAD):
    lo, hi = np.nanmin(points, axis=0), np.nanmax(points, axis=0)
    margin = pad * max(hi - lo)
    return (lo[0] - margin, hi[0] + margin), (lo[1] - margin, hi[1] + margin)


def _inside(display, box, margin=(0.0, 0.0)):
    return ((display[:, 0] >= box.x0 + margin[0]) & (display[:, 0] <= box.x1 - margin[0])
            & (display[:, 1] >= box.y0 + margin[1]) & (display[:, 1] <= box.y1 - margin[1]))


class ChromaticityDiagram:
    """The fixed parts of a chromaticity diagram, drawn once into ``ax``; see :meth:`show`.

    Parameters
    ----------
    ax : matplotlib Axes
    space : {"xy", "upvp", "uv"}
    zoom : bool
        The white region (quadrangle numbers and CCT labels in kelvin) instead of the whole diagram.
    duv_span : float
        Isotemperature lines run from −duv_span to +duv_span in Duv.
    quadrangles : bool
        Draw the ANSI C78.377-2017 quadrangles.
    """

    def __init__(self, ax, *, space="xy", zoom=False, duv_span=0.02, quadrangles=True, legend=True,
                 isotherm_labels=True):
        if space not in SPACES:
            raise ValueError(f"unknown diagram space {space!r}; choose one of {', '.join(SPACES)}")
        self.ax, self.space, self.zoom = ax, space, zoom
        self.to_space, (xlabel, ylabel), self.space_title = SPACES[space]
        self._transient = []
        to_space = self.to_space
        cmf = colour_matching_functions("1931_2deg")
        sel = (GRID_NM >= 380) & (GRID_NM <= 700)  # beyond, the CIE 1931 locus folds onto one point
        locus = to_space(XYZ_to_xy(cmf[sel]))
        ax.plot(*np.vstack([locus, locus[:1]]).T, color=MUTED, lw=0.8, gid="spectrum_locus")
        self._wavelength_labels = []
        if not zoom:
            for wl in (460, 480, 500, 520, 540, 560, 580, 600, 620):
                text = ax.annotate(f"{wl}", locus[wl - 380], xytext=(4, 0), textcoords="offset points", fontsize=6,
                                   color=MUTED, va="center")
                text.set_in_layout(False)
        t = np.geomspace(1000.0, 100000.0, 600)
        ax.plot(*to_space(_locus_xy(t)).T, color=PLANCK, lw=1.1, gid="planckian_locus", label="Planckian locus")
        self._isotherms = []
        for tick in TICKS_ZOOM_K if zoom else TICKS_K:
            line = to_space(uv_to_xy(isotemperature_lines(float(tick), (-duv_span, duv_span), 9)))
            ax.plot(*line.T, color=PLANCK, lw=0.45, alpha=0.45 if zoom else 0.7, gid=f"isotherm:{tick}")
            fine = to_space(uv_to_xy(isotemperature_lines(float(tick), (-duv_span, duv_span), 41)))
            text = ax.text(0, 0, f"{tick:g} K" if zoom else f"{tick / 1000:g}k", fontsize=5.5, color=PLANCK,
                           ha="center", gid=f"isotherm_label:{tick}", visible=False)
            text.set_in_layout(False)
            if isotherm_labels:
                self._isotherms.append((fine, text))
        day = to_space(daylight_locus_xy(np.geomspace(4000.0, 25000.0, 200)))
        ax.plot(*day.T, color=DAYLIGHT, lw=0.9, ls=(0, (4, 2)), gid="daylight_locus", label="CIE daylight locus")
        self._quadrangle_labels = []
        if quadrangles:
            for nominal in NOMINAL_CCTS_K:
                corners = to_space(category(nominal).corners_xy)
                ax.fill(*corners.T, facecolor="none", edgecolor=INK, lw=0.45, alpha=0.55, gid=f"quadrangle:{nominal}")
                if zoom:
                    top = corners[:2].mean(axis=0)
                    text = ax.annotate(f"{nominal}", top, xytext=(0, -2), textcoords="offset points", fontsize=5,
                                       color=INK, ha="center", va="top", alpha=0.75, gid=f"quadrangle_label:{nominal}")
                    text.set_in_layout(False)
                    self._quadrangle_labels.append((top, text))
        ax.set_xlabel(xlabel)
        ax.set_ylabel(ylabel)
        ax.set_aspect("equal", adjustable="box")
        ax.grid(True)
        if legend:
            ax.legend(loc="upper left" if zoom else "lower right", handlelength=2.0)

    def show(self, lamps=(), *, labels=None, nominal_cct_K=None, steps=(1, 2, 3, 4, 5, 6, 7), window=None,
             title=None, label_colour=LAMP, ellipse_set=None, regions=None):
        """Mark and label ``lamps``, draw ellipses, set the window; replaces what the last call drew.

        Parameters
        ----------
        lamps : sequence of (name, (x, y))
        labels : sequence of str, optional
            The text beside each lamp (default: its name), always plain text.
        nominal_cct_K : float, optional
            Draw colour-consistency ellipses of ``steps`` steps around this nominal CCT's centre.
        ellipse_set : EllipseSet, optional
            The metric of those ellipses (default: the shipped IEC 60081 set).
        window : ((x0, x1), (y0, y1)), optional
            The region that must be seen (it is widened to the axes' shape); by default the
            white region (zoom) or the whole diagram, widened to hold every lamp.
        title : str, optional
            Default: the diagram's space; "" for none.
        regions : sequence of array_like, optional
            Each lamp's 95 % region, CIE 1931 (x, y) vertices of shape (k, 2)
            (:func:`~lampcalc.rating.coverage_region.coverage_region`), drawn under its point: a
            polygon, or a segment or point when the draws are degenerate; the default window holds it.
        """
        self.clear()
        ax, to_space = self.ax, self.to_space
        lamps = list(lamps)
        labels = [name for name, _ in lamps] if labels is None else list(labels)
        if nominal_cct_K is not None and np.isfinite(nominal_cct_K):
            centre = category(nominal_cct_K).centre_xy
            for n in steps:
                ring = to_space(step_ring_xy(nominal_cct_K, n, ellipse_set))
                self._transient += ax.plot(*ring.T, color=ACCENT, lw=0.5 if n != 6 else 0.9, alpha=0.85, gid=f"ellipse:{n}")
            self._transient += ax.plot(*to_space(centre), marker="+", color=ACCENT, ms=5, gid="ellipse_centre")
        points = np.array([to_space(np.asarray(xy, dtype=float)) for _, xy in lamps]).reshape(-1, 2)
        outlines = [to_space(np.asarray(r, dtype=float).reshape(-1, 2)) for r in regions or ()]
        for (name, _), outline in zip(lamps, outlines):
            gid = f"region:{plain_text(name)}"
            if outline.shape[0] >= 3:
                self._transient += ax.fill(*outline.T, facecolor=(*to_rgb(LAMP), 0.25), edgecolor=LAMP, lw=0.7,
                                           zorder=2, gid=gid)
            elif outline.shape[0]:
                self._transient += ax.plot(*outline.T, color=LAMP, lw=0.9, zorder=2, gid=gid)
        for (name, _), p in zip(lamps, points):
            self._transient += ax.plot(p[0], p[1], marker="D", ms=3.6, mfc=LAMP, mec="white", mew=0.5, ls="none",
                                       gid=f"lamp:{plain_text(name)}")
        if window is None:
            (x0, x1), (y0, y1) = white_region(self.space) if self.zoom else FULL_LIMITS[self.space]
            seen = np.vstack([points, *outlines])
            finite = seen[np.all(np.isfinite(seen), axis=1)]
            if finite.size:
                (fx0, fx1), (fy0, fy1) = _padded(finite, pad=0.15)
                (x0, x1), (y0, y1) = (min(x0, fx0), max(x1, fx1)), (min(y0, fy0), max(y1, fy1))
            window = ((x0, x1), (y0, y1))
        default = self.space_title + (": white region" if self.zoom else "")
        ax.set_title(default if title is None else plain_text(title), loc="left")
        engine = ax.figure.get_layout_engine()
        if engine is not None:
            engine.execute(ax.figure)
        (x0, x1), (y0, y1) = _fit_to_box(ax, window)
        ax.set_xlim(x0, x1)
        ax.set_ylim(y0, y1)
        ax.apply_aspect()
        self._label_fixed_parts()
        named = [k for k, text in enumerate(labels) if text]
        if named:
            placed = place_labels(ax, points[named], [labels[k] for k in named], label_colour)
            for text in placed:
                if text is not None:
                    text.set_in_layout(False)
                    self._transient.append(text)
        return self

    def _label_fixed_parts(self):
        """Isotherm labels at the lower visible end of their line, quadrangle numbers when seen."""
        ax = self.ax
        renderer = ax.figure.canvas.get_renderer()
        frame = ax.get_window_extent(renderer)
        placed = []
        for fine, text in self._isotherms:
            text.set_visible(False)
            display = ax.transData.transform(fine)
            seen = np.flatnonzero(_inside(display, frame, (14, 10)))
            for index, va, dy in ((seen[:1], "top", -2.0), (seen[-1:], "bottom", 2.0)):
                if index.size == 0:
                    continue
                text.set_position(tuple(fine[index[0]]))
                text.set_va(va)
                text.set_transform(ax.transData + _offset(ax, dy))
                text.set_visible(True)  # an invisible text has no extent
                box = text.get_window_extent(renderer)
                inside = box.x0 >= frame.x0 + 1 and box.x1 <= frame.x1 - 1 and box.y0 >= frame.y0 + 1 and box.y1 <= frame.y1 - 1
                if inside and not any(box.overlaps(other) for other in placed):
                    placed.append(box)
                    break
                text.set_visible(False)
        for top, text in self._quadrangle_labels:
            text.set_visible(bool(_inside(ax.transData.transform(top[None]), frame, (8, 8))[0]))
            if text.get_visible():
                box = text.get_window_extent(renderer)
                text.set_visible(not any(box.overlaps(other) for other in placed))
                placed.append(box)

    def clear(self):
        """Remove the lamps, ellipses and labels of the last :meth:`show`."""
        for artist in self._transient:
            artist.remove()
        self._transient = []


def _fit_to_box(ax, window):
    """``window`` widened about its centre to the shape of the axes' box (equal scales on x and y)."""
    (x0, x1), (y0, y1) = window
    box = ax.get_position(original=True)
    width_in, height_in = box.width * ax.figure.get_figwidth(), box.height * ax.figure.get_figheight()
    dx, dy = x1 - x0, y1 - y0
    if dx / dy < width_in / height_in:
        grow = dy * width_in / height_in - dx
        x0, x1 = x0 - grow / 2, x1 + grow / 2
    else:
        grow = dx * height_in / width_in - dy
        y0, y1 = y0 - grow / 2, y1 + grow / 2
    return (x0, x1), (y0, y1)


def _offset(ax, dy_pt):
    from matplotlib.transforms import ScaledTranslation

    return ScaledTranslation(0, dy_pt / 72.0, ax.figure.dpi_scale_trans)


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
        Lamps to mark and label (labels placed beside their points, clear of each other).
    space : {"xy", "upvp", "uv"}
    zoom : bool
        The white region only (every ANSI quadrangle whole, widened to hold every lamp).
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
    diagram = ChromaticityDiagram(ax, space=space, zoom=zoom, duv_span=duv_span, quadrangles=quadrangles)
    window = None
    if zoom and around_xy is not None:
        cx, cy = diagram.to_space(np.asarray(around_xy, dtype=float))
        window = ((cx - half_width, cx + half_width), (cy - half_width, cy + half_width))
    diagram.show(lamps, nominal_cct_K=nominal_cct_K, steps=steps, window=window, title=title)
    return ax
