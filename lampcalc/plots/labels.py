"""Point labels placed so that they do not overlap one another or the points."""

import numpy as np


def place_labels(ax, points, names, colour, fontsize=6.5):
    """Labels beside points, greedily placed so that no two overlap (display coordinates)."""
    renderer = ax.figure.canvas.get_renderer()
    ax.apply_aspect()  # final axes box, so that data-to-display transforms hold
    display = ax.transData.transform(points)
    offsets = [(7, 6), (7, -11), (-7, 6), (-7, -11), (0, 12), (0, -16), (14, 0), (-14, 0), (12, 16), (-12, -20)]
    placed, texts = [], []
    marker_boxes = [(p[0] - 4, p[1] - 4, p[0] + 4, p[1] + 4) for p in display]
    order = np.argsort(display[:, 0])
    for i in order:
        best = None
        for dx, dy in offsets:
            ha = "left" if dx > 0 else "right" if dx < 0 else "center"
            text = ax.annotate(
                names[i], points[i], xytext=(dx, dy), textcoords="offset points", ha=ha, va="bottom" if dy >= 0 else "top",
                fontsize=fontsize, color=colour, annotation_clip=False,
            )
            box = text.get_window_extent(renderer)
            rect = (box.x0, box.y0, box.x1, box.y1)
            clash = any(_overlap(rect, other) for other in placed + marker_boxes)
            if not clash:
                best = (text, rect)
                break
            text.remove()
        if best is None:  # crowded: the last position, with a leader line
            text = ax.annotate(
                names[i], points[i], xytext=(18, 22), textcoords="offset points", fontsize=fontsize, color=colour,
                arrowprops={"arrowstyle": "-", "color": colour, "lw": 0.4}, annotation_clip=False,
            )
            box = text.get_window_extent(renderer)
            best = (text, (box.x0, box.y0, box.x1, box.y1))
        placed.append(best[1])
        texts.append(best[0])
    return texts


def _overlap(a, b):
    return not (a[2] <= b[0] or b[2] <= a[0] or a[3] <= b[1] or b[3] <= a[1])
