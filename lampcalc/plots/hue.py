"""TM-30-18 hue-bin graphics: lamp against reference by hue bin, and bars of the 16 bins.

Bars are drawn on fixed scales (:data:`BAR_SCALES`), stated on their axes, so that a lamp
that shifts nothing shows small bars and a poor lamp large ones; a value beyond its scale
is drawn to the scale's edge with an open triangle, and its value written beside it (when no
more than :data:`MAX_NUMBERED` bars are beyond the scale; the numbers are in the tables anyway).
:class:`HueBars` and :class:`HueGraphic` draw their fixed parts once and are updated per lamp.
"""

import numpy as np

from .style import FAINT, INK, LAMP, MUTED, REFERENCE

N_BINS = 16
#: Bar chart -> (lower, upper limit, axis label); the scales are fixed, never fitted to the data.
BAR_SCALES = {
    "fidelity": (0.0, 100.0, "local fidelity Rf,h"),
    "chroma": (-40.0, 40.0, "chroma shift Rcs,h (%)"),
    "hue": (-0.4, 0.4, "hue shift Rhs,h (rad)"),
}
_CENTRES = np.deg2rad(22.5 * np.arange(N_BINS) + 11.25)
#: Values beyond the scale are written beside their triangle when there are at most this many.
MAX_NUMBERED = 4


def normalised_bins(ref_ab_bins, test_ab_bins):
    """The lamp's 16 bin means with the reference as the unit circle, shape (16, 2).

    Each bin's lamp mean is divided by the reference mean's chroma and rotated with it, as
    TM-30-18 does for its graphic: components along and across each bin's centre angle.
    """
    ref = np.asarray(ref_ab_bins, dtype=float)
    test = np.asarray(test_ab_bins, dtype=float)
    cos, sin = np.cos(_CENTRES), np.sin(_CENTRES)
    rel = (test - ref) / np.linalg.norm(ref, axis=-1)[:, None]
    along = rel[:, 0] * cos + rel[:, 1] * sin
    across = -rel[:, 0] * sin + rel[:, 1] * cos
    unit = np.stack([cos, sin], -1)
    return unit * (1 + along)[:, None] + across[:, None] * np.stack([-sin, cos], -1)


class HueGraphic:
    """The hue-bin graphic: reference as a dashed unit circle, the lamp as a solid 16-gon, each bin's shift a line."""

    def __init__(self, ax, *, title="Hue bins (TM-30-18)", legend=True, axis_labels=True):
        self.ax = ax
        circle = np.linspace(0, 2 * np.pi, 361)
        ax.plot(np.cos(circle), np.sin(circle), color=REFERENCE, lw=0.8, ls=(0, (4, 2)), gid="reference_circle",
                label="reference")
        unit = np.stack([np.cos(_CENTRES), np.sin(_CENTRES)], -1)
        (self.polygon,) = ax.plot([], [], color=LAMP, lw=1.3, gid="test_polygon", label="lamp")
        # Each bin's shift: a thin line from the reference point to the lamp's, a dot at the lamp's end.
        (self.shifts,) = ax.plot([], [], color=LAMP, lw=0.6, gid="bin_shifts")
        (self.ends,) = ax.plot([], [], ls="none", marker="o", ms=2.2, mfc=LAMP, mec=LAMP, gid="bin_means")
        for k, p in enumerate(unit):
            ax.text(*(1.22 * p), f"{k + 1}", ha="center", va="center", fontsize=6, color=MUTED)
        edges = np.deg2rad(22.5 * np.arange(N_BINS))
        ends = 1.12 * np.stack([np.cos(edges), np.sin(edges)], -1)
        ax.plot(np.column_stack([np.zeros(N_BINS), ends[:, 0], np.full(N_BINS, np.nan)]).ravel(),
                np.column_stack([np.zeros(N_BINS), ends[:, 1], np.full(N_BINS, np.nan)]).ravel(),
                color=FAINT, lw=0.3)
        ax.set_xlim(-1.4, 1.4)
        ax.set_ylim(-1.4, 1.4)
        ax.set_aspect("equal")
        ax.set_xticks([])
        ax.set_yticks([])
        if axis_labels:
            ax.set_xlabel("a′ (normalised)")
            ax.set_ylabel("b′ (normalised)")
        if legend:  # in a band of its own under the circle, clear of the bin numbers
            ax.set_ylim(-1.68, 1.4)
            ax.legend(loc="lower center", fontsize=6.5, ncol=2)
        ax.set_title(title, loc="left")
        self._unit = unit

    def update(self, ref_ab_bins, test_ab_bins):
        """Show one lamp's bins; returns the normalised bin means, shape (16, 2)."""
        shifted = normalised_bins(ref_ab_bins, test_ab_bins)
        closed = np.vstack([shifted, shifted[:1]])
        self.polygon.set_data(closed[:, 0], closed[:, 1])
        gaps = np.full(N_BINS, np.nan)
        self.shifts.set_data(np.column_stack([self._unit[:, 0], shifted[:, 0], gaps]).ravel(),
                             np.column_stack([self._unit[:, 1], shifted[:, 1], gaps]).ravel())
        self.ends.set_data(shifted[:, 0], shifted[:, 1])
        return shifted


def draw_hue_graphic(ax, ref_ab_bins, test_ab_bins, *, title="Hue bins (TM-30-18)"):
    """The 16 bins' mean a′b′ under the lamp, normalised so the reference is a unit circle.

    A line from each bin's circle point to its dot shows the shift in chroma (radial) and
    hue (tangential). Returns the normalised bin means, shape (16, 2).
    """
    return HueGraphic(ax, title=title).update(ref_ab_bins, test_ab_bins)


class HueBars:
    """One bar chart of the 16 bins on the fixed scale ``BAR_SCALES[kind]``.

    The bars are two patches (filled above zero, open below, so a greyscale print keeps
    them apart); values beyond the scale end at its edge with a triangle and their number.
    """

    def __init__(self, ax, kind, *, xlabel=True, ylabel=None):
        from matplotlib.patches import PathPatch
        from matplotlib.path import Path

        low, high, label = BAR_SCALES[kind]
        self.ax, self.kind, self.low, self.high = ax, kind, low, high
        empty = Path(np.zeros((1, 2)))
        self.above = ax.add_patch(PathPatch(empty, facecolor=LAMP, edgecolor=LAMP, lw=0.6, gid=f"bars:{label}"))
        self.below = ax.add_patch(PathPatch(empty, facecolor="white", edgecolor=LAMP, lw=0.6, gid=f"bars_below:{label}"))
        bins = np.arange(1, N_BINS + 1)
        self.beyond = [ax.text(b, 0, "", ha="center", fontsize=5, color=INK, visible=False) for b in bins]
        self.clipped = {
            side: ax.plot([], [], ls="none", marker=marker, ms=3.2, mfc="white", mec=INK, mew=0.6, clip_on=False,
                          gid=f"beyond_scale:{kind}")[0]
            for side, marker in (("above", "^"), ("below", "v"))
        }
        for artist in [*self.clipped.values(), *self.beyond]:
            artist.set_in_layout(False)  # not in a layout's reckoning while empty or hidden
        if low < 0:
            ax.axhline(0, color=INK, lw=0.5)
        ax.set_xticks(bins[[0, 3, 7, 11, 15]])  # 1, 4, 8, 12, 16: enough to count the bars by
        ax.tick_params(axis="x", length=0)
        ax.set_xlim(0.3, N_BINS + 0.7)
        ax.set_ylim(low, high)
        ax.set_yticks([low, (low + high) / 2, high] if low < 0 else [low, high / 2, high])
        ax.set_ylabel(label if ylabel is None else ylabel)
        ax.grid(True, axis="y")
        if xlabel:
            ax.set_xlabel("hue bin")
        else:
            ax.set_xticks([])

    @staticmethod
    def _path(bins, heights):
        from matplotlib.path import Path

        if len(bins) == 0:
            return Path(np.zeros((1, 2)))
        x0, x1 = bins - 0.35, bins + 0.35
        zero = np.zeros_like(heights)
        corners = np.stack([np.stack([x0, zero], -1), np.stack([x0, heights], -1), np.stack([x1, heights], -1),
                            np.stack([x1, zero], -1), np.stack([x0, zero], -1)], axis=1)
        codes = np.tile([Path.MOVETO, Path.LINETO, Path.LINETO, Path.LINETO, Path.CLOSEPOLY], len(bins))
        return Path(corners.reshape(-1, 2), codes)

    def update(self, values):
        """Show the 16 values (NaN: no bar); returns the heights drawn."""
        values = np.asarray(values, dtype=float)
        shown = np.clip(np.nan_to_num(values, nan=0.0), self.low, self.high)
        bins = np.arange(1, N_BINS + 1, dtype=float)
        up = np.isfinite(values) & (shown >= 0)
        down = np.isfinite(values) & (shown < 0)
        self.above.set_path(self._path(bins[up], shown[up]))
        self.below.set_path(self._path(bins[down], shown[down]))
        span = self.high - self.low
        beyond = {"above": [], "below": []}
        numbered = np.sum((values > self.high) | (values < self.low)) <= MAX_NUMBERED
        for k, (v, note) in enumerate(zip(values, self.beyond)):
            side = "above" if v > self.high else "below" if v < self.low else None
            note.set_visible(side is not None and bool(numbered))
            if side:
                edge = self.high if side == "above" else self.low
                beyond[side].append((k + 1, edge))
                note.set_text(f"{v:.2g}" if abs(v) < 1 else f"{v:.0f}")
                note.set_position((k + 1, edge - 0.14 * span if side == "above" else edge + 0.06 * span))
        for side, line in self.clipped.items():
            xy = np.array(beyond[side], dtype=float).reshape(-1, 2)
            line.set_data(xy[:, 0], xy[:, 1])
        return shown


def draw_hue_bars(ax_chroma, ax_hue, chroma_shift_percent, hue_shift_rad):
    """Bar charts of the local chroma shift (%) and hue shift (rad) of the 16 bins, on fixed scales."""
    HueBars(ax_chroma, "chroma", xlabel=False).update(chroma_shift_percent)
    HueBars(ax_hue, "hue").update(hue_shift_rad)
    return ax_chroma, ax_hue
