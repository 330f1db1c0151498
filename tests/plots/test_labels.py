"""Labels next to their points: never on each other, inside the axes, off the quadrangle edges where they can be.

Checks of the figures' own layout rules (no published source); the lamps are chromaticities of
Planckian radiators (CIE 015:2018 locus) and of points near them.
"""

import numpy as np

from lampcalc.plots import figure_style, new_figure
from lampcalc.plots.diagram import ChromaticityDiagram
from lampcalc.plots.labels import _cross, _hits


def _crowd(n, seed):
    from lampcalc.colorimetry.locus import cct_duv_to_xy

    rng = np.random.default_rng(seed)
    cct_duv = np.stack([rng.uniform(2600, 6000, n), rng.uniform(-0.006, 0.006, n)], -1)
    return cct_duv_to_xy(cct_duv)


def _boxes(fig, texts):
    """The boxes of the texts themselves (an annotation's own extent includes its leader line)."""
    from matplotlib.text import Text

    renderer = fig.canvas.get_renderer()
    for t in texts:
        if hasattr(t, "update_positions"):
            t.update_positions(renderer)
    return [Text.get_window_extent(t, renderer) for t in texts]


def test_labels_never_overlap_and_stay_inside_the_axes():
    xy = _crowd(24, 5)
    with figure_style():
        fig = new_figure((6.0, 4.5))
        fig.set_layout_engine(None)
        ax = fig.add_axes([0.12, 0.12, 0.8, 0.8])
        diagram = ChromaticityDiagram(ax, zoom=True, legend=False)
        diagram.show([(f"lamp {k}", p) for k, p in enumerate(xy)], labels=[str(k + 1) for k in range(len(xy))])
        labels = [t for t in ax.texts if (t.get_gid() or "").startswith("label:")]
        assert len(labels) == len(xy)
        boxes = _boxes(fig, labels)
        frame = ax.get_window_extent(fig.canvas.get_renderer())
        for k, a in enumerate(boxes):
            assert frame.x0 <= a.x0 and a.x1 <= frame.x1 and frame.y0 <= a.y0 and a.y1 <= frame.y1
            for b in boxes[k + 1:]:
                assert not a.overlaps(b)
        # Fixed labels (isotherms, quadrangle numbers) are inside the axes and apart from each other too.
        fixed = [t for t in ax.texts if t.get_visible() and (t.get_gid() or "").startswith(("isotherm_label",
                                                                                           "quadrangle_label"))]
        fixed_boxes = _boxes(fig, fixed)
        assert len(fixed) >= 8
        for k, a in enumerate(fixed_boxes):
            assert frame.x0 <= a.x0 and a.x1 <= frame.x1 and frame.y0 <= a.y0 and a.y1 <= frame.y1
            for b in fixed_boxes[k + 1:]:
                assert not a.overlaps(b)
            for b in boxes:
                assert not a.overlaps(b)


def test_a_lone_label_sits_near_its_point_clear_of_quadrangle_edges():
    # A point in the middle of the 4000 K quadrangle (ANSI C78.377-2017 Table 1 target 3985 K, Duv 0.0010)
    # has room around it: its label stays close (beside it, or a short leader away from the locus) and
    # crosses no edge of the quadrangle.
    from lampcalc.standards.ansi_bins import category

    centre = category(4000).centre_xy
    with figure_style():
        fig = new_figure((5.0, 4.0))
        fig.set_layout_engine(None)
        ax = fig.add_axes([0.12, 0.12, 0.8, 0.8])
        ChromaticityDiagram(ax, zoom=True, legend=False).show([("A", centre)])
        (label,) = [t for t in ax.texts if t.get_gid() == "label:A"]
        (box,) = _boxes(fig, [label])
        point = ax.transData.transform(centre)
        assert np.hypot(*(np.array([box.x0 + box.x1, box.y0 + box.y1]) / 2 - point)) < 40  # display px, at 100 dpi
        edges = ax.transData.transform(category(4000).corners_xy)
        segments = np.hstack([edges, np.roll(edges, -1, axis=0)])
        assert not _hits([(box.x0, box.y0, box.x1, box.y1)], segments).any()


def test_segment_geometry():
    # Elementary geometry (no source needed): a diagonal crosses a box it passes through, not one beside it;
    # two crossing diagonals cross, parallel segments do not.
    assert _hits([(0, 0, 1, 1)], [(-1, -1, 2, 2)])[0, 0]
    assert not _hits([(0, 0, 1, 1)], [(2, 0, 3, 1)])[0, 0]
    assert _hits([(0, 0, 1, 1)], [(0.5, -1, 0.5, 2)])[0, 0]  # vertical, through the middle
    assert _cross([(0, 0, 1, 1)], [(0, 1, 1, 0)])[0, 0] and not _cross([(0, 0, 1, 0)], [(0, 1, 1, 1)])[0, 0]


def test_a_tight_cluster_still_gets_labels_apart():
    # A lot of 12 samples within ±0.002 of one point, on the whole white-region diagram (the summary
    # page of a lot): the labels stay apart even when every place beside the points is taken.
    from lampcalc.colorimetry.locus import cct_duv_to_xy

    rng = np.random.default_rng(12)
    xy = cct_duv_to_xy([3000.0, 0.001]) + rng.uniform(-0.002, 0.002, (12, 2))
    with figure_style():
        fig = new_figure((6.5, 4.4))
        fig.set_layout_engine(None)
        ax = fig.add_axes([0.1, 0.1, 0.85, 0.85])
        ChromaticityDiagram(ax, zoom=True, legend=False).show([(f"S{k}", p) for k, p in enumerate(xy)],
                                                               labels=[str(k + 1) for k in range(12)])
        labels = [t for t in ax.texts if (t.get_gid() or "").startswith("label:")]
        boxes = _boxes(fig, labels)
        assert len(boxes) == 12
        for k, a in enumerate(boxes):
            for b in boxes[k + 1:]:
                assert not a.overlaps(b)
