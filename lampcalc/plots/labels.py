"""Point labels placed next to their points, clear of other labels, points and drawn lines.

Each label is tried at positions around its point, nearest first: in twelve directions just
beside the marker, then further out (joined to the point by a thin leader line), and furthest
only when every nearer place is taken. A position
is refused when the label would overlap a label already placed, another text in the axes,
the legend, a marker or the axes' edge; among the rest the one crossing the fewest drawn
lines (quadrangle edges, loci, isotherms) wins, nearer before further. Everything is
measured in display coordinates once the axes have their final box.
"""

import numpy as np

from .style import plain_text

#: Radii tried, in points from the point: beside the marker, then with a leader line; the last ones
#: only when every nearer place is taken (a tight cluster of points).
RADII_PT = (3.0, 10.0, 18.0, 28.0, 40.0, 54.0, 70.0)
_DIRECTIONS = np.deg2rad([30, 150, 330, 210, 90, 270, 0, 180, 60, 120, 300, 240])
_LEADER_FROM = 1  # radii from this index on get a leader line
_FALLBACK_FROM = 4  # radii from this index on only when no nearer place is free


#: How much crossing a drawn line costs a label, by the line's gid prefix (default 1).
LINE_WEIGHTS = {"quadrangle": 3.0, "planckian_locus": 2.0, "spectrum_locus": 2.0, "daylight_locus": 2.0,
                "ellipse": 0.4, "isotherm": 0.7, "leader": 3.0}


def _segments(ax):
    """Display-space segments of the lines and patch outlines drawn in ``ax`` (m, 4), and their weights (m,)."""
    pieces, weights = [], []
    for artist in list(ax.lines) + list(ax.patches):
        if not artist.get_visible():
            continue
        if hasattr(artist, "get_xydata"):
            if artist.get_linestyle() in ("None", "none", " ", ""):
                continue
            data = np.asarray(artist.get_xydata(), dtype=float)
        else:
            data = np.asarray(artist.get_path().vertices, dtype=float)
        if data.shape[0] < 2:
            continue
        display = artist.get_transform().transform(data)
        seg = np.hstack([display[:-1], display[1:]])
        seg = seg[np.all(np.isfinite(seg), axis=1)]
        gid = (artist.get_gid() or "").split(":")[0]
        pieces.append(seg)
        weights.append(np.full(len(seg), LINE_WEIGHTS.get(gid, 1.0)))
    if not pieces:
        return np.empty((0, 4)), np.empty(0)
    return np.vstack(pieces), np.concatenate(weights)


def _hits(boxes, segments):
    """Whether each segment meets each box: bool (n_boxes, n_segments); boxes as x0, y0, x1, y1 (Liang–Barsky)."""
    boxes = np.asarray(boxes, dtype=float).reshape(-1, 4)
    segments = np.asarray(segments, dtype=float).reshape(-1, 4)
    x0, y0, x1, y1 = (boxes[:, k, None] for k in range(4))
    px, py = segments[None, :, 0], segments[None, :, 1]
    dx, dy = segments[None, :, 2] - px, segments[None, :, 3] - py
    shape = (len(boxes), len(segments))
    t_lo, t_hi = np.zeros(shape), np.ones(shape)
    outside = np.zeros(shape, dtype=bool)
    with np.errstate(divide="ignore", invalid="ignore"):
        for p, q in ((-dx, px - x0), (dx, x1 - px), (-dy, py - y0), (dy, y1 - py)):
            p, q = np.broadcast_to(p, shape), np.broadcast_to(q, shape)
            parallel = p == 0
            outside |= parallel & (q < 0)
            t = q / p
            t_lo = np.where(~parallel & (p < 0), np.maximum(t_lo, t), t_lo)
            t_hi = np.where(~parallel & (p > 0), np.minimum(t_hi, t), t_hi)
    return ~outside & (t_lo <= t_hi)


def _cross(a, b):
    """Whether segments ``a`` (n, 4) properly cross segments ``b`` (m, 4): bool (n, m)."""
    a, b = np.asarray(a, dtype=float).reshape(-1, 4), np.asarray(b, dtype=float).reshape(-1, 4)

    def side(p, q, r):  # sign of the turn p → q → r
        return np.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]))

    a1, a2 = (a[:, None, 0], a[:, None, 1]), (a[:, None, 2], a[:, None, 3])
    b1, b2 = (b[None, :, 0], b[None, :, 1]), (b[None, :, 2], b[None, :, 3])
    return (side(a1, a2, b1) * side(a1, a2, b2) < 0) & (side(b1, b2, a1) * side(b1, b2, a2) < 0)


def _overlaps(boxes, others):
    """True where a box overlaps any of ``others`` (shape (k, 4)), for each of ``boxes``."""
    if len(others) == 0:
        return np.zeros(len(boxes), dtype=bool)
    o = np.asarray(others)
    return np.any(
        (boxes[:, None, 0] < o[None, :, 2]) & (o[None, :, 0] < boxes[:, None, 2])
        & (boxes[:, None, 1] < o[None, :, 3]) & (o[None, :, 1] < boxes[:, None, 3]),
        axis=1,
    )


def _text_boxes(ax, renderer):
    """Boxes of the texts in ``ax`` (of the words only: a leader line is a segment, not a box) and its legend."""
    from matplotlib.text import Text

    boxes = []
    for text in ax.texts:
        if text.get_visible() and text.get_text():
            if hasattr(text, "update_positions"):
                text.update_positions(renderer)
            b = Text.get_window_extent(text, renderer)
            boxes.append((b.x0, b.y0, b.x1, b.y1))
    legend = ax.get_legend()
    if legend is not None and legend.get_visible():
        b = legend.get_window_extent(renderer)
        boxes.append((b.x0, b.y0, b.x1, b.y1))
    return boxes


def place_labels(ax, points, names, colour, fontsize=6.5, gid_prefix="label:"):
    """Label each point of ``points`` (data coordinates, shape (n, 2)) with its name.

    Returns the annotations in the order of ``points`` (None for a point that is not finite);
    each has the gid ``gid_prefix + name`` and, when moved away from its point, a leader line.
    """
    points = np.asarray(points, dtype=float).reshape(-1, 2)
    names = [plain_text(n) for n in names]
    if len(points) == 0:
        return []
    fig = ax.figure
    renderer = fig.canvas.get_renderer()
    ax.apply_aspect()  # the final axes box, so that data-to-display transforms hold
    px_per_pt = fig.dpi / 72.0
    display = ax.transData.transform(points)
    frame = ax.get_window_extent(renderer)
    inner = (frame.x0 + 2, frame.y0 + 2, frame.x1 - 2, frame.y1 - 2)
    finite = np.all(np.isfinite(display), axis=1)
    half = 2.5 * px_per_pt
    markers = np.array([(p[0] - half, p[1] - half, p[0] + half, p[1] + half) for p in display])
    segments, weights = _segments(ax)
    blocked = _text_boxes(ax, renderer)
    leaders = []
    radii = np.asarray(RADII_PT) * px_per_pt
    r = np.repeat(radii, _DIRECTIONS.size)
    a = np.tile(_DIRECTIONS, radii.size)
    far = np.repeat(np.arange(radii.size), _DIRECTIONS.size)
    texts = [None] * len(points)
    for i in np.argsort(display[:, 0] + 1e-3 * display[:, 1]):
        if not finite[i]:
            continue
        probe = ax.annotate(names[i], points[i], xytext=(0, 0), textcoords="offset points", fontsize=fontsize,
                            color=colour, ha="left", va="bottom", annotation_clip=False, gid=f"{gid_prefix}{names[i]}")
        box = probe.get_window_extent(renderer)
        w, h = box.width, box.height
        p = display[i]
        lx = p[0] + r * np.cos(a) - w * (1 - np.cos(a)) / 2
        ly = p[1] + r * np.sin(a) - h * (1 - np.sin(a)) / 2
        boxes = np.stack([lx, ly, lx + w, ly + h], axis=1)
        others = markers[finite & (np.arange(len(points)) != i)]
        refused = (
            _overlaps(boxes, blocked) | _overlaps(boxes, others)
            | (boxes[:, 0] < inner[0]) | (boxes[:, 1] < inner[1]) | (boxes[:, 2] > inner[2]) | (boxes[:, 3] > inner[3])
        )
        # A leader runs from the point to the nearest point of its label's box.
        ends = np.stack([np.clip(p[0], boxes[:, 0], boxes[:, 2]), np.clip(p[1], boxes[:, 1], boxes[:, 3])], axis=1)
        leader = np.hstack([np.broadcast_to(p, ends.shape), ends])
        with_leader = far >= _LEADER_FROM
        fallback = far >= _FALLBACK_FROM
        # A leader over another label or marker: refused nearby; out of a tight cluster it cannot be helped.
        crossed = np.zeros(len(boxes))
        if blocked:
            crossed += _hits(np.asarray(blocked), leader).sum(axis=0)
        if len(others):
            crossed += _hits(others, leader).sum(axis=0)
        refused |= with_leader & ~fallback & (crossed > 0)
        cost = (np.where(refused, 1e6, 0.0) + 1e3 * fallback + 50.0 * fallback * crossed + 2.5 * far
                + 0.01 * np.arange(len(boxes)))
        if segments.size:
            cost += 2.0 * (_hits(boxes, segments) @ weights)
        if leaders:
            cost += 5.0 * with_leader * _cross(leader, np.asarray(leaders)).sum(axis=1)
        best = int(np.argmin(cost))
        offset = ((boxes[best, 0] - p[0]) / px_per_pt, (boxes[best, 1] - p[1]) / px_per_pt)
        probe.set_position(offset)
        if with_leader[best]:
            probe.remove()
            probe = ax.annotate(
                names[i], points[i], xytext=offset, textcoords="offset points", fontsize=fontsize, color=colour,
                ha="left", va="bottom", annotation_clip=False, gid=f"{gid_prefix}{names[i]}",
                arrowprops={"arrowstyle": "-", "color": colour, "lw": 0.4, "shrinkA": 0.5, "shrinkB": 2.5},
            )
            leaders.append(leader[best])
            segments = np.vstack([segments, leader[best][None]])
            weights = np.append(weights, LINE_WEIGHTS["leader"])
        blocked.append(tuple(boxes[best]))
        texts[i] = probe
    return texts
