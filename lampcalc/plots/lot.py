"""Figures of a lot: its samples on the chromaticity diagram, and histograms of its ratings.

Both draw from the dict of :func:`lampcalc.verdicts.lot.lot_statistics`. Tags (``gid``):
``lot_samples``, ``lot_mean``, ``lot_ellipse``, ``steps_centre``, ``steps_ring:<n>`` on the
diagram (beside the diagram's own); ``histogram:<rating>``, ``mean:<rating>``,
``p05:<rating>``, ``p95:<rating>`` on the histograms.
"""

import math

import numpy as np

from ..colorimetry.tristimulus import upvp_to_xy, uv_to_xy
from ..verdicts.lot import steps_ring_xy
from ..verdicts.spread import chi_square_2dof, ellipse_boundary
from .diagram import SPACES, draw_chromaticity_diagram
from .style import ACCENT, INK, LAMP, MUTED, new_figure

#: From each diagram's coordinates back to CIE 1931 x, y.
SPACES_INVERSE = {"xy": lambda p: p, "upvp": upvp_to_xy, "uv": uv_to_xy}
#: Ratings drawn as histograms: key -> (label, unit, format).
HISTOGRAMS = {"cct_K": ("CCT", "K", ".0f"), "duv": ("Duv", "", "+.4f"), "ra": ("Ra", "", ".1f"), "rf": ("Rf", "", ".1f")}
MAX_RINGS = 7


def _rings(lot):
    """Step counts to draw around the centre: 1 … the largest sample's steps rounded up (3 to 7)."""
    steps = np.asarray(lot["samples"]["sdcm_steps"], dtype=float)
    largest = np.nanmax(steps) if np.any(np.isfinite(steps)) else 3.0
    return tuple(range(1, int(min(MAX_RINGS, max(3, math.ceil(largest)))) + 1))


def _steps_set(lot):
    """The ellipse set the lot's steps were counted with: the set itself, else the shipped one it names."""
    steps = lot.get("steps_ellipse_set") or lot["steps_method"]
    if steps == "set":
        raise ValueError("the lot's steps were counted with a user's ellipse set: keep it as 'steps_ellipse_set'")
    return steps


def draw_lot_diagram(ax, lot, *, space="xy", title=None):
    """The lot's samples, mean point and 95 % covariance ellipse on a zoomed chromaticity diagram.

    Drawn over the diagram (spectrum and Planckian loci, ANSI C78.377-2017 quadrangles):
    each sample, the mean point, the covariance ellipse (``lot["ellipse_probability"]``),
    and the centre the steps count from with its rings of 1, 2, … steps of the ellipse set
    the steps were counted with (``lot["steps_ellipse_set"]``, a user's set included).

    Parameters
    ----------
    ax : matplotlib Axes
    lot : dict
        From :func:`lampcalc.verdicts.lot.lot_statistics`.
    space : {"xy", "upvp", "uv"}
    """
    to_space = SPACES[space][0]
    samples = np.stack([lot["samples"]["x"], lot["samples"]["y"]], axis=-1)
    mean = np.array([lot["mean_x"], lot["mean_y"]])
    centre = np.array([lot["steps_centre_x"], lot["steps_centre_y"]])
    has_centre = bool(np.all(np.isfinite(centre)))
    ellipse = None
    if np.isfinite(lot["cov_xx"]):
        cov = np.array([[lot["cov_xx"], lot["cov_xy"]], [lot["cov_xy"], lot["cov_yy"]]])
        ellipse = ellipse_boundary(mean, cov, float(chi_square_2dof(lot["ellipse_probability"])))
    shown = to_space(np.vstack([samples, mean[None]] + ([centre[None]] if has_centre else [])
                               + ([ellipse] if ellipse is not None else [])))
    lo, hi = np.nanmin(shown, axis=0), np.nanmax(shown, axis=0)
    half_width = max(0.006 if space == "xy" else 0.004, 0.62 * float(np.max(hi - lo)))
    middle = (lo + hi) / 2
    draw_chromaticity_diagram(ax, space=space, zoom=True, around_xy=SPACES_INVERSE[space](middle), half_width=half_width,
                              title=title or f"Lot of {lot['n_samples']} sample{'s' if lot['n_samples'] != 1 else ''}: "
                              f"{SPACES[space][2]}")
    if has_centre:
        steps = _steps_set(lot)
        for n in _rings(lot):
            ring = to_space(steps_ring_xy(centre, lot["steps_centre_nominal_cct_K"], n, steps))
            ax.plot(*ring.T, color=ACCENT, lw=0.45, alpha=0.8, gid=f"steps_ring:{n}",
                    label=f"1–{n} steps around the centre" if n == _rings(lot)[-1] else None)
            # label each ring where it crosses the way from the centre towards the lot
            toward = to_space(mean) - to_space(centre)
            at = ring[np.argmax((ring - to_space(centre)) @ toward)] if np.any(toward) else ring[0]
            ax.annotate(f"{n}", at, xytext=(2, 2), textcoords="offset points", fontsize=6, color=ACCENT, gid=f"ring_label:{n}")
        ax.plot(*to_space(centre), marker="+", ms=7, color=ACCENT, ls="none", gid="steps_centre",
                label=f"centre of {lot['steps_centre_nominal_cct_K']:g} K ({lot['steps_centre'].upper()})")
    if ellipse is not None:
        ax.plot(*to_space(ellipse).T, color=INK, lw=0.9, ls=(0, (4, 2)), gid="lot_ellipse",
                label=f"{100 * lot['ellipse_probability']:g} % covariance ellipse")
    points = to_space(samples)
    ax.plot(points[:, 0], points[:, 1], ls="none", marker="o", ms=3.2, mfc=LAMP, mec="white", mew=0.4, alpha=0.9,
            gid="lot_samples", label=f"samples ({lot['n_samples']})")
    ax.plot(*to_space(mean), marker="D", ms=5, mfc="white", mec=INK, mew=1.0, ls="none", gid="lot_mean",
            label="mean point")
    _legend_in_view(ax, loc="upper left", handlelength=2.0)
    return ax


def _legend_in_view(ax, **options):
    """A legend of the labelled lines that show inside the axes' limits (a locus out of view is not listed)."""
    (x0, x1), (y0, y1) = sorted(ax.get_xlim()), sorted(ax.get_ylim())
    shown = []
    for line in ax.get_lines():
        xy = np.asarray(line.get_xydata(), dtype=float).reshape(-1, 2)
        inside = (xy[:, 0] >= x0) & (xy[:, 0] <= x1) & (xy[:, 1] >= y0) & (xy[:, 1] <= y1)
        if not line.get_label().startswith("_") and inside.any():
            shown.append(line)
    return ax.legend(shown, [line.get_label() for line in shown], **options)


def draw_lot_histogram(ax, lot, key):
    """Histogram of one rating over the lot's samples, with its mean and 5th and 95th percentiles."""
    label, unit, spec = HISTOGRAMS[key]
    values = np.asarray(lot["samples"][key], dtype=float)
    values = values[np.isfinite(values)]
    name = f"{label} ({unit})" if unit else label
    ax.set_xlabel(name)
    ax.set_ylabel("samples")
    if values.size == 0:
        ax.text(0.5, 0.5, f"no {label} for these spectra", transform=ax.transAxes, ha="center", color=MUTED)
        return ax
    bins = min(12, max(4, int(np.ceil(np.sqrt(values.size)))))
    spread = np.ptp(values)
    if spread == 0:  # one value (or all alike): one bar centred on it
        half = max(abs(values[0]) * 1e-3, 1e-4)
        bins = [values[0] - half, values[0] + half]
    counts, _, _ = ax.hist(values, bins=bins, color=LAMP, alpha=0.75, edgecolor="white", linewidth=0.6,
                           gid=f"histogram:{key}")
    mean, p05, p95 = lot[f"{key}_mean"], lot[f"{key}_p05"], lot[f"{key}_p95"]
    ax.axvline(mean, color=INK, lw=1.0, gid=f"mean:{key}", label="mean")
    ax.axvline(p05, color=INK, lw=0.7, ls=(0, (3, 2)), gid=f"p05:{key}", label="5th, 95th percentile")
    ax.axvline(p95, color=INK, lw=0.7, ls=(0, (3, 2)), gid=f"p95:{key}")
    doubt = "\n(includes values outside the method's validity)" if key in lot["doubtful_ratings"] else ""
    sd = lot[f"{key}_sd"]
    unit_text = f" {unit}" if unit else ""
    sd_text = f", sd {format(sd, spec.replace('+', ''))}{unit_text}" if np.isfinite(sd) else ""
    ax.set_title(f"{label}: n = {values.size}, mean {format(mean, spec)}{unit_text}{sd_text}{doubt}", loc="left")
    ax.set_ylim(0, max(counts) * 1.45)
    if spread == 0:
        ax.set_xlim(values[0] - 8 * half, values[0] + 8 * half)
    ax.ticklabel_format(axis="x", useOffset=False)
    ax.locator_params(axis="x", nbins=5)
    ax.yaxis.get_major_locator().set_params(integer=True)
    ax.grid(True, axis="y")
    ax.legend(loc="upper right", ncol=2, handlelength=1.6, columnspacing=1.0, frameon=True, framealpha=0.9,
              edgecolor="none")
    return ax


def lot_diagram_figure(lot, space="xy"):
    """The lot on a zoomed chromaticity diagram, as a Figure."""
    fig = new_figure((6.3, 5.8))
    draw_lot_diagram(fig.add_subplot(), lot, space=space)
    return fig


def lot_histograms_figure(lot):
    """Histograms of CCT, Duv, Ra and Rf over the lot, as a Figure."""
    fig = new_figure((6.3, 5.2))
    for k, key in enumerate(HISTOGRAMS):
        draw_lot_histogram(fig.add_subplot(2, 2, k + 1), lot, key)
    n = lot["n_samples"]
    fig.suptitle(f"Lot of {n} sample{'s' if n != 1 else ''}: ratings", x=0.02, ha="left", fontsize=9.5)
    return fig

