"""TM-30-18 hue-bin graphics: lamp against reference by hue bin, and local chroma and hue shifts."""

import numpy as np

from .style import INK, LAMP, MUTED, REFERENCE

N_BINS = 16


def draw_hue_graphic(ax, ref_ab_bins, test_ab_bins, *, title="Hue bins (TM-30-18)"):
    """The 16 bins' mean a′b′ under the lamp, normalised so the reference is a unit circle.

    Each bin's lamp mean is divided by the reference mean's chroma and rotated with it, as
    TM-30-18 does for its graphic: the reference becomes the unit circle, and an arrow from
    each bin's circle point shows its shift in chroma (radial) and hue (tangential).
    """
    ref = np.asarray(ref_ab_bins, dtype=float)
    test = np.asarray(test_ab_bins, dtype=float)
    angle = np.deg2rad(22.5 * np.arange(N_BINS) + 11.25)
    norm = np.linalg.norm(ref, axis=-1)
    ref_unit = np.stack([np.cos(angle), np.sin(angle)], -1)
    rel = (test - ref) / norm[:, None]
    rel_local = np.stack(  # components along and across each bin's centre angle
        [rel[:, 0] * np.cos(angle) + rel[:, 1] * np.sin(angle), -rel[:, 0] * np.sin(angle) + rel[:, 1] * np.cos(angle)], -1
    )
    shifted = ref_unit + rel_local[:, :1] * ref_unit + rel_local[:, 1:] * np.stack([-np.sin(angle), np.cos(angle)], -1)
    circle = np.linspace(0, 2 * np.pi, 361)
    ax.plot(np.cos(circle), np.sin(circle), color=REFERENCE, lw=0.8, ls=(0, (4, 2)), gid="reference_circle",
            label="reference")
    closed = np.vstack([shifted, shifted[:1]])
    ax.plot(*closed.T, color=LAMP, lw=1.1, gid="test_polygon", label="lamp")
    for p0, p1 in zip(ref_unit, shifted):
        ax.annotate("", p1, xytext=p0, arrowprops={"arrowstyle": "-|>", "color": LAMP, "lw": 0.6, "mutation_scale": 6})
    for k, p in enumerate(ref_unit):
        ax.annotate(f"{k + 1}", 1.22 * p, ha="center", va="center", fontsize=6, color=MUTED)
    for k in range(N_BINS):
        edge = np.deg2rad(22.5 * k)
        ax.plot([0, 1.12 * np.cos(edge)], [0, 1.12 * np.sin(edge)], color=MUTED, lw=0.25, alpha=0.6)
    ax.set_xlim(-1.4, 1.4)
    ax.set_ylim(-1.4, 1.4)
    ax.set_aspect("equal")
    ax.set_xticks([])
    ax.set_yticks([])
    ax.set_xlabel("a′ (normalised)")
    ax.set_ylabel("b′ (normalised)")
    ax.legend(loc="lower right", fontsize=6.5)
    ax.set_title(title, loc="left")
    return shifted


def draw_hue_bars(ax_chroma, ax_hue, chroma_shift_percent, hue_shift_rad):
    """Bar charts of the local chroma shift (%) and hue shift (rad) of the 16 bins."""
    bins = np.arange(1, N_BINS + 1)
    for ax, values, label in ((ax_chroma, chroma_shift_percent, "chroma shift (%)"), (ax_hue, hue_shift_rad, "hue shift (rad)")):
        values = np.asarray(values, dtype=float)
        colours = [LAMP if v >= 0 else REFERENCE for v in values]
        ax.bar(bins, values, color=colours, width=0.7, gid=f"bars:{label}")
        ax.axhline(0, color=INK, lw=0.5)
        ax.set_xticks(bins)
        ax.set_xlim(0.3, N_BINS + 0.7)
        ax.set_ylabel(label)
        ax.grid(True, axis="y")
    ax_hue.set_xlabel("hue bin")
    return ax_chroma, ax_hue
