"""The lot's figures hold the lot's data: samples, mean, ellipse, step rings, histograms.

Sources: the definition of the covariance ellipse (its quadratic form equals the chi-square
95 % quantile, 5.9915, on the boundary; SciPy); the IEC 60081 Annex D F3000 metric (from memory);
the ANSI C78.377-2017 3000 K centre in shared/REFERENCE_VALUES.md; counts made directly.
"""

import numpy as np
import pytest

from lampcalc.plots import figure_style, new_figure, save_figure
from lampcalc.plots.lot import draw_lot_diagram, draw_lot_histogram, lot_diagram_figure, lot_histograms_figure
from lampcalc.verdicts.lot import lot_statistics

ANSI_3000 = (0.4339, 0.4033)  # REFERENCE_VALUES.md
F3000 = 1e4 * np.array([[39.0, -19.5], [-19.5, 27.5]])  # IEC 60081 Annex D (from memory)


@pytest.fixture
def lot(invent, around):
    return lot_statistics(invent(around(ANSI_3000, n=14, spread=0.0015, seed=11)), nominal_cct_K=3000)


def _gid(ax, name):
    found = [a for a in list(ax.lines) + list(ax.patches) + list(ax.texts) if a.get_gid() == name]
    assert found, name
    return found


def test_diagram_draws_samples_mean_ellipse_and_rings(lot):
    with figure_style():
        ax = new_figure().add_subplot()
        draw_lot_diagram(ax, lot)
    (samples,) = _gid(ax, "lot_samples")
    np.testing.assert_allclose(samples.get_xydata(), np.stack([lot["samples"]["x"], lot["samples"]["y"]], -1))
    (mean,) = _gid(ax, "lot_mean")
    assert tuple(mean.get_xydata()[0]) == pytest.approx((lot["mean_x"], lot["mean_y"]))
    (ellipse,) = _gid(ax, "lot_ellipse")
    d = ellipse.get_xydata() - [lot["mean_x"], lot["mean_y"]]
    cov = np.array([[lot["cov_xx"], lot["cov_xy"]], [lot["cov_xy"], lot["cov_yy"]]])
    np.testing.assert_allclose(np.einsum("ni,ij,nj->n", d, np.linalg.inv(cov), d), 5.991464547107979, rtol=1e-8)
    (centre,) = _gid(ax, "steps_centre")
    assert tuple(centre.get_xydata()[0]) == pytest.approx(ANSI_3000, abs=6e-5)
    largest = int(np.ceil(np.nanmax(lot["samples"]["sdcm_steps"])))
    for n in range(1, max(3, largest) + 1):
        (ring,) = _gid(ax, f"steps_ring:{n}")
        d = ring.get_xydata() - [lot["steps_centre_x"], lot["steps_centre_y"]]
        np.testing.assert_allclose(np.sqrt(np.einsum("ni,ij,nj->n", d, F3000, d)), n, rtol=1e-9)
    # the diagram's own elements are there too (ANSI quadrangles, Planckian locus)
    assert _gid(ax, "planckian_locus") and _gid(ax, "quadrangle:3000")
    # The legend lists what shows: the CIE daylight locus starts at 4000 K (CIE 015:2018), far from a 3000 K lot.
    listed = [t.get_text() for t in ax.get_legend().get_texts()]
    assert "Planckian locus" in listed and "mean point" in listed and "CIE daylight locus" not in listed


def test_diagram_in_upvp(lot):
    import colour

    with figure_style():
        ax = new_figure().add_subplot()
        draw_lot_diagram(ax, lot, space="upvp")
    (samples,) = _gid(ax, "lot_samples")
    xy = np.stack([lot["samples"]["x"], lot["samples"]["y"]], -1)
    np.testing.assert_allclose(samples.get_xydata(), colour.xy_to_Luv_uv(xy), rtol=1e-12)  # colour-science


def test_histograms_count_every_sample(lot):
    with figure_style():
        ax = new_figure().add_subplot()
        draw_lot_histogram(ax, lot, "ra")
    bars = _gid(ax, "histogram:ra")
    assert sum(b.get_height() for b in bars) == lot["n_samples"]
    (mean,) = _gid(ax, "mean:ra")
    assert mean.get_xdata()[0] == pytest.approx(np.mean(lot["samples"]["ra"]))
    (p95,) = _gid(ax, "p95:ra")
    assert p95.get_xdata()[0] == pytest.approx(np.percentile(lot["samples"]["ra"], 95))  # NumPy, linear


def test_histogram_of_a_rating_no_sample_has(lot):
    lot = dict(lot, samples=dict(lot["samples"], rf=np.full(lot["n_samples"], np.nan)))
    with figure_style():
        ax = new_figure().add_subplot()
        draw_lot_histogram(ax, lot, "rf")
    assert any("no Rf" in t.get_text() for t in ax.texts)


def test_whole_figures_save(lot, tmp_path):
    with figure_style():
        for name, fig in (("d.png", lot_diagram_figure(lot)), ("h.svg", lot_histograms_figure(lot))):
            save_figure(fig, tmp_path / name)
            assert (tmp_path / name).stat().st_size > 10_000


def test_rings_of_a_users_ellipse_set(invent, around, write):
    # A laboratory's set of u′v′ circles of radius 0.002 (a set file of our own, docs/standard-sets.md): a ring of
    # n steps lies at n × 0.002 from the centre in u′v′ (colour-science's xy_to_Luv_uv, reference library).
    import colour

    from lampcalc.standards.ellipse_sets import read_ellipse_set

    circles = read_ellipse_set(write("circles.csv", "# name: lab circles\n# source: laboratory procedure\n# edition: 1\n"
                                     "# confirmed: yes\n# space: upvp\nname,nominal_cct_K,x,y,a,b,theta_deg\n"
                                     "circle,,,,0.002,0.002,0\n"))
    lot = lot_statistics(invent(around(ANSI_3000, n=14, spread=0.0015, seed=11)), nominal_cct_K=3000, steps=circles)
    assert lot["steps_method"] == "set" and lot["steps_ellipse_set"] is circles
    with figure_style():
        ax = new_figure().add_subplot()
        draw_lot_diagram(ax, lot)
    centre = colour.xy_to_Luv_uv(np.array([lot["steps_centre_x"], lot["steps_centre_y"]]))
    rings = [line for line in ax.lines if str(line.get_gid()).startswith("steps_ring:")]
    assert len(rings) >= 3  # 1, 2, 3 … steps
    for ring in rings:
        n = int(ring.get_gid().split(":")[1])
        radius = np.hypot(*(colour.xy_to_Luv_uv(ring.get_xydata()) - centre).T)
        np.testing.assert_allclose(radius, n * 0.002, rtol=1e-9)
    # A lot read back from JSON has no set: its rings cannot be drawn, and the figure says why.
    with pytest.raises(ValueError, match="a user's ellipse set"):
        draw_lot_diagram(new_figure().add_subplot(), dict(lot, steps_ellipse_set=None))
