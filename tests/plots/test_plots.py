"""Figures hold the right data: locus, lamp markers, quadrangles, isotemperature lines; files are real."""

import numpy as np
import pytest

from lampcalc.standards.ansi_bins import NOMINAL_CCTS_K, category
from lampcalc.colorimetry.tristimulus import xy_to_upvp, xy_to_uv
from lampcalc.colorimetry.locus import cct_duv_to_uv, planckian_uv
from lampcalc.plots import draw_chromaticity_diagram, figure_style, new_figure, save_figure
from lampcalc.plots.diagram import ellipse_xy
from lampcalc.standards.ellipse_sets import shipped_ellipse_set
from lampcalc.standards.steps import ellipse_steps

LAMPS = [("A", (0.4578, 0.4101)), ("B", (0.3805, 0.3768)), ("C", (0.3127, 0.3290))]


def _by_gid(ax, prefix):
    artists = list(ax.lines) + list(ax.patches)
    return {a.get_gid(): a for a in artists if a.get_gid() and a.get_gid().startswith(prefix)}


def _xy_data(artist):
    if hasattr(artist, "get_xydata"):
        return np.asarray(artist.get_xydata())
    return np.asarray(artist.get_xy())


@pytest.mark.parametrize("space, convert", [("xy", lambda xy: xy), ("upvp", xy_to_upvp), ("uv", xy_to_uv)])
def test_drawn_locus_lamps_and_quadrangles(space, convert):
    with figure_style():
        fig = new_figure()
        ax = fig.add_subplot()
        draw_chromaticity_diagram(ax, LAMPS, space=space, zoom=True, nominal_cct_K=4000)
    # The drawn Planckian locus is the computed one (CIE 015 locus, exact in lampcalc.colorimetry.locus).
    (locus,) = _by_gid(ax, "planckian_locus").values()
    data = _xy_data(locus)
    from lampcalc.colorimetry.tristimulus import uv_to_xy

    t = np.geomspace(1000.0, 100000.0, data.shape[0])
    np.testing.assert_allclose(data, convert(uv_to_xy(planckian_uv(t))), atol=1e-12)
    # Lamp markers sit at the lamps' chromaticities.
    markers = _by_gid(ax, "lamp:")
    for name, xy in LAMPS:
        np.testing.assert_allclose(_xy_data(markers[f"lamp:{name}"])[0], convert(np.array(xy)), atol=1e-15)
    # ANSI C78.377 quadrangles at the standard's corners (2700 K published corners, within 1e-4 in x, y).
    quads = _by_gid(ax, "quadrangle:")
    assert set(quads) == {f"quadrangle:{n}" for n in NOMINAL_CCTS_K}
    corners = _xy_data(quads["quadrangle:2700"])[:4]
    np.testing.assert_allclose(corners, convert(category(2700).corners_xy), atol=1e-12)
    if space == "xy":
        np.testing.assert_allclose(
            corners, [(0.4813, 0.4319), (0.4562, 0.4260), (0.4373, 0.3893), (0.4593, 0.3944)], atol=1e-4
        )


def test_isotemperature_lines_perpendicular_in_uv():
    # CIE 015:2018: isotemperature lines are normal to the Planckian locus in CIE 1960 (u, v).
    with figure_style():
        fig = new_figure()
        ax = fig.add_subplot()
        draw_chromaticity_diagram(ax, space="uv")
    lines = _by_gid(ax, "isotherm:")
    assert len(lines) >= 8
    for gid, line in lines.items():
        t = float(gid.split(":")[1])
        data = _xy_data(line)
        direction = data[-1] - data[0]
        tangent = planckian_uv(t * 1.0001) - planckian_uv(t / 1.0001)
        cos = abs(direction @ tangent) / (np.linalg.norm(direction) * np.linalg.norm(tangent))
        assert cos < 1e-6, gid
        # ±0.02 Duv by default.
        np.testing.assert_allclose(data[[0, -1]], cct_duv_to_uv([[t, -0.02], [t, 0.02]]), atol=1e-12)


def test_ellipses_are_n_steps():
    # The drawn ellipses are the n-step contours of the IEC 60081 metric (from memory) around the centre.
    iec = shipped_ellipse_set()
    centre, g = iec.centre_xy(4000), iec.metric(4000)[0]
    for n in (1, 3, 7):
        ring = ellipse_xy(centre, g, n)
        np.testing.assert_allclose(ellipse_steps(ring, centre, g), n, rtol=1e-12)


def test_png_is_not_blank_and_has_the_expected_size(tmp_path):
    from matplotlib.image import imread

    with figure_style():
        fig = new_figure((6.0, 5.0))
        ax = fig.add_subplot()
        draw_chromaticity_diagram(ax, LAMPS, zoom=True)
        save_figure(fig, tmp_path / "d.png")
    image = imread(tmp_path / "d.png")
    assert image.shape[:2] == (1000, 1200)  # 6 × 5 in at 200 dpi
    assert image[..., :3].std() > 0.05  # not blank
    for suffix in (".svg", ".pdf"):
        save_figure(fig, tmp_path / f"d{suffix}")
        assert (tmp_path / f"d{suffix}").stat().st_size > 10_000


def test_unknown_format_is_refused(tmp_path):
    from lampcalc.errors import InputError

    with pytest.raises(InputError, match="unknown figure format .jpg"):
        save_figure(new_figure(), tmp_path / "d.jpg")


@pytest.mark.parametrize("kind", ["locus", "spectrum", "efficacy", "hue"])
def test_plot_command(run, tmp_path, kind):
    from lampcalc.io.demo_data import demo_files

    out = tmp_path / f"{kind}.png"
    result = run("plot", kind, *demo_files(), "-o", out, "--lamp", "QF-VS-3500")
    assert result.exit_code == 0, result.output
    assert out.stat().st_size > 20_000


def test_plot_command_bad_lamp_and_no_reference(run, write, tmp_path):
    from lampcalc.io.demo_data import demo_files

    result = run("plot", "spectrum", *demo_files(), "-o", tmp_path / "s.png", "--lamp", "nope")
    assert result.exit_code == 2 and "no lamp named 'nope'" in result.stderr
    red = write("red.csv", "\n".join(f"{w},{np.exp(-((w - 630) / 10) ** 2):.6f}" for w in range(380, 781)))
    result = run("plot", "hue", red, "-o", tmp_path / "h.png")
    assert result.exit_code == 2 and "no TM-30 hue bins" in result.stderr


def test_locus_figure_marks_the_computed_chromaticities():
    import lampcalc
    from lampcalc.io.demo_data import demo_files
    from lampcalc.plots.figures import locus_figure

    ratings = lampcalc.rate_spectra([lampcalc.read_spectra(f) for f in demo_files()])
    with figure_style():
        fig = locus_figure(ratings, space="upvp", zoom=True)
    markers = _by_gid(fig.axes[0], "lamp:")
    assert len(markers) == len(ratings)
    for i, name in enumerate(ratings["name"]):
        np.testing.assert_allclose(
            _xy_data(markers[f"lamp:{name}"])[0], [ratings["u_prime"][i], ratings["v_prime"][i]], atol=1e-12
        )


def test_white_region_holds_every_quadrangle_whole():
    # ANSI C78.377-2017 Table 1 quadrangles, 2200 K included (the issue found it clipped).
    with figure_style():
        fig = new_figure((6.0, 4.0))
        ax = fig.add_subplot()
        draw_chromaticity_diagram(ax, LAMPS, zoom=True)
    (x0, x1), (y0, y1) = ax.get_xlim(), ax.get_ylim()
    for nominal in NOMINAL_CCTS_K:
        corners = category(nominal).corners_xy
        assert np.all((corners[:, 0] > x0) & (corners[:, 0] < x1) & (corners[:, 1] > y0) & (corners[:, 1] < y1))


def test_names_are_plain_text(tmp_path):
    # "$\\foo$" is not math text: the label prints as typed, and saving does not fail.
    with figure_style():
        fig = new_figure()
        ax = fig.add_subplot()
        draw_chromaticity_diagram(ax, [("$\\foo$", (0.38, 0.38))], zoom=True)
        save_figure(fig, tmp_path / "math.png")
    labels = [t.get_text() for t in ax.texts if (t.get_gid() or "").startswith("label:")]
    assert labels == ["$\\foo$"]


@pytest.mark.parametrize("space, convert", [("xy", lambda xy: xy), ("upvp", xy_to_upvp)])
def test_regions_are_drawn_under_their_lamps_and_held_by_the_window(space, convert):
    # A lamp's 95 % region (lampcalc.rating.coverage_region) as given, in the diagram's own space; a
    # segment where the draws were on one line. The default window widens to hold a region far out.
    from lampcalc.plots.diagram import ChromaticityDiagram

    square = np.array([[0.455, 0.405], [0.462, 0.405], [0.462, 0.414], [0.455, 0.414]])
    wide = np.array([[0.30, 0.30], [0.58, 0.46], [0.58, 0.30]])
    segment = np.array([[0.378, 0.374], [0.383, 0.379]])
    with figure_style():
        ax = new_figure().add_subplot()
        diagram = ChromaticityDiagram(ax, space=space, zoom=True)
        diagram.show(LAMPS, regions=[square, segment, wide])
    regions = _by_gid(ax, "region:")
    assert set(regions) == {"region:A", "region:B", "region:C"}
    np.testing.assert_allclose(_xy_data(regions["region:A"])[:4], convert(square), atol=1e-12)
    np.testing.assert_allclose(_xy_data(regions["region:B"]), convert(segment), atol=1e-12)
    (x0, x1), (y0, y1) = ax.get_xlim(), ax.get_ylim()
    far = convert(wide)
    assert x0 <= far[:, 0].min() and far[:, 0].max() <= x1 and y0 <= far[:, 1].min() and far[:, 1].max() <= y1
    diagram.show(LAMPS)  # shown again without regions: none left over
    assert not _by_gid(ax, "region:")
