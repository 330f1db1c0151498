"""Figures of colour over angle: Δu′v′ from the mean point, and CCT and Duv, against the angle.

Both draw from the dict of :func:`lampcalc.verdicts.angles.colour_over_angle`. Tags
(``gid``): ``delta_uv_prime``, ``limit``, ``largest``; ``cct``, ``duv``.
"""

import numpy as np

from .style import ACCENT, DAYLIGHT, INK, LAMP, PLANCK, new_figure

#: How the mean point was weighted, in words (by ``angle_weighting``).
WEIGHTING_WORDS = {
    "none": "every angle weighted alike",
    "illuminance_lx": "weighted by illuminance",
    "luminous_flux_lm": "weighted by luminous flux",
    "luminance_cd_per_m2": "weighted by luminance",
}


def draw_delta_uv_over_angle(ax, angles):
    """Δu′v′ of each angle from the mean point, with the user's limit when one was given."""
    t = angles["angles"]
    ax.plot(t["angle_deg"], t["delta_uv_prime"], color=LAMP, marker="o", ms=3.5, lw=1.0, gid="delta_uv_prime",
            label="Δu′v′ from the mean point")
    worst = angles["angle_of_max_delta_uv_prime_deg"], angles["max_delta_uv_prime_over_angle"]
    ax.plot(*worst, marker="o", ms=7, mfc="none", mec=INK, ls="none", gid="largest",
            label=f"largest: {worst[1]:.5f} at {worst[0]:g}°")
    limit = angles["limit_delta_uv_prime"]
    top = max(worst[1], limit or 0.0)
    if limit is not None:
        ax.axhline(limit, color=ACCENT if angles["angle_pass"] else PLANCK, lw=1.0, ls=(0, (5, 2)), gid="limit",
                   label=f"your limit {limit:g}")
    weighting = WEIGHTING_WORDS.get(angles["angle_weighting"], angles["angle_weighting"])
    ax.set_title(f"Colour over angle: Δu′v′ from the mean point, {weighting}", loc="left")
    ax.set_xlabel("angle of emission (°)")
    ax.set_ylabel("Δu′v′")
    ax.set_ylim(0, top * 1.18 if top > 0 else 1e-3)
    ax.grid(True)
    ax.legend(loc="upper left")
    return ax


def draw_cct_duv_over_angle(ax, angles):
    """CCT (left axis) and Duv (right axis) against the angle; returns the Duv axes."""
    t = angles["angles"]
    ax.plot(t["angle_deg"], t["cct_K"], color=PLANCK, marker="s", ms=3, lw=1.0, gid="cct", label="CCT")
    ax.set_xlabel("angle of emission (°)")
    ax.set_ylabel("CCT (K)", color=PLANCK)
    ax.grid(True)
    right = ax.twinx()
    right.plot(t["angle_deg"], t["duv"], color=DAYLIGHT, marker="^", ms=3, lw=1.0, ls=(0, (4, 2)), gid="duv", label="Duv")
    right.set_ylabel("Duv", color=DAYLIGHT)
    handles = ax.get_legend_handles_labels()[0] + right.get_legend_handles_labels()[0]
    ax.legend(handles, [h.get_label() for h in handles], loc="center left")
    ax.set_title("CCT and Duv over angle", loc="left")
    finite = np.asarray(t["cct_K"], dtype=float)
    if np.any(np.isfinite(finite)):
        lo, hi = np.nanmin(finite), np.nanmax(finite)
        pad = max(10.0, 0.1 * (hi - lo))
        ax.set_ylim(lo - pad, hi + pad)
    return right


def angle_figure(angles):
    """Δu′v′ and CCT, Duv over angle, as a Figure."""
    fig = new_figure((6.3, 6.0))
    draw_delta_uv_over_angle(fig.add_subplot(2, 1, 1), angles)
    draw_cct_duv_over_angle(fig.add_subplot(2, 1, 2), angles)
    return fig
