"""Colour-consistency steps: the shipped IEC 60081 ellipses and CIE TN 001 circles (both from memory)."""

import numpy as np
import pytest

from lampcalc.colorimetry.tristimulus import upvp_to_xy, xy_to_upvp
from lampcalc.errors import InputError
from lampcalc.standards import steps
from lampcalc.standards.ellipse_sets import read_ellipse_set, shipped_ellipse_set

IEC = shipped_ellipse_set("ellipse")


def _axes(g):
    """Semi-axis lengths and directions of the one-step ellipse of a metric g (units of 1e4)."""
    matrix = 1e4 * np.array([[g[0], g[1]], [g[1], g[2]]])
    values, vectors = np.linalg.eigh(matrix)
    return 1 / np.sqrt(values), vectors.T


@pytest.mark.parametrize("nominal", [2700, 3000, 3500, 4000, 5000, 6500])
def test_centre_is_zero_and_one_semi_axis_is_one_step(nominal):
    # By construction of the metric (IEC 60081 Annex D): n = 1 on the one-step ellipse.
    centre, g = IEC.centre_xy(nominal), IEC.metric(nominal)[0]
    assert steps.steps_from_nominal([centre], [nominal], centre="set")[0][0] == 0
    lengths, directions = _axes(g)
    for length, direction in zip(lengths, directions):
        for sign in (1, -1):
            point = np.array(centre) + sign * length * direction
            assert steps.steps_from_nominal([point], [nominal], centre="set")[0][0] == pytest.approx(1.0, rel=1e-12)
    # Three steps away is three steps (the metric is quadratic).
    point = np.array(centre) + 3 * lengths[0] * directions[0]
    assert steps.ellipse_steps(point, centre, g) == pytest.approx(3.0)


def test_f6500_against_macadam_1942():
    from colour.models.datasets.macadam_ellipses import DATA_MACADAM_1942_ELLIPSES

    # MacAdam (1942) ellipse near (0.305, 0.323), a 2.3e-3, b 0.9e-3, θ 58° (Wyszecki & Stiles, via
    # colour-science). The IEC F6500 metric (from memory), for a nearby centre, measures its semi-axes as
    # about one step: a check of the held values that could fail.
    row = next(r for r in DATA_MACADAM_1942_ELLIPSES if abs(r[0] - 0.305) < 1e-9 and abs(r[1] - 0.323) < 1e-9)
    x0, y0, a, b, theta = row[0], row[1], row[2] * 1e-3, row[3] * 1e-3, np.deg2rad(row[4])
    g = IEC.metric(6500)[0]
    for length, angle in ((a, theta), (b, theta + np.pi / 2)):
        point = (x0 + length * np.cos(angle), y0 + length * np.sin(angle))
        assert 0.75 < steps.ellipse_steps(point, (x0, y0), g) < 1.33


def test_metric_interpolates_in_mired_and_flags_outside_and_unconfirmed():
    between = 1e6 / ((1e6 / 2700 + 1e6 / 3000) / 2)
    g, outside, unconfirmed = IEC.metric([2700.0, between, 3000.0, 2200.0, 7000.0, np.nan])
    g2700, g3000 = IEC.g[IEC.nominal_cct_K == 2700][0], IEC.g[IEC.nominal_cct_K == 3000][0]
    np.testing.assert_allclose(g[0], g2700)
    np.testing.assert_allclose(g[1], 0.5 * (g2700 + g3000))
    np.testing.assert_allclose(g[3], g2700)
    np.testing.assert_allclose(g[4], IEC.g[-1])
    assert outside[:5].tolist() == [False, False, False, True, True]
    # Every shipped IEC value is unconfirmed (the file says confirmed: no); NaN uses no row.
    assert unconfirmed.tolist() == [True] * 5 + [False]
    assert steps.metric(4000.0)[0].tolist() == IEC.metric(4000.0)[0].tolist()


def test_unconfirmed_only_where_an_unconfirmed_row_enters(write):
    # A set with a confirmed 3000 K row and an unconfirmed 4000 K row: 3000 K alone is confirmed,
    # anything that draws on the 4000 K row is not (internal bookkeeping, no published source).
    path = write(
        "mixed.csv",
        "# name: mixed\n# source: test\n# edition: 1\n# confirmed: yes\n# space: xy\n"
        "name,nominal_cct_K,confirmed,x,y,g11,g12,g22\n"
        "A,3000,,0.44,0.40,39,-19.5,27.5\nB,4000,no,0.38,0.38,39.5,-21.5,26\n",
    )
    _, _, unconfirmed = read_ellipse_set(path).metric([2500.0, 3000.0, 3500.0, 4000.0, 5000.0])
    assert unconfirmed.tolist() == [False, False, True, True, True]


def test_circles():
    # CIE TN 001:2014 (from memory): one step is a u'v' circle of radius 0.0011, shipped as a set.
    circles = shipped_ellipse_set("circle")
    assert circles.uniform and circles.space == "upvp" and not circles.confirmed
    centre = steps.centre_xy(4000)
    for angle in (0.0, 1.0, 2.5):
        upvp = xy_to_upvp(centre) + [0.0011 * np.cos(angle), 0.0011 * np.sin(angle)]
        found, outside, unconfirmed = steps.steps_from_nominal([upvp_to_xy(upvp)], [4000], circles)
        assert found[0] == pytest.approx(1.0) and not outside[0] and unconfirmed[0]


def test_axes_and_angle_give_the_same_steps_as_the_metric(write):
    # An ellipse given as a, b, θ: a point a along θ and one b across it are one step each.
    path = write(
        "axes.csv",
        "# name: axes\n# source: test\n# edition: 1\n# confirmed: yes\n# space: xy\n"
        "name,nominal_cct_K,x,y,a,b,theta_deg\nE,4000,0.38,0.38,0.0023,0.0009,58\n",
    )
    ellipses = read_ellipse_set(path)
    g = ellipses.metric(4000.0)[0]
    theta = np.deg2rad(58.0)
    for length, angle in ((0.0023, theta), (0.0009, theta + np.pi / 2), (0.0023, theta + np.pi)):
        point = (0.38 + length * np.cos(angle), 0.38 + length * np.sin(angle))
        assert steps.ellipse_steps(point, (0.38, 0.38), g) == pytest.approx(1.0, rel=1e-12)
        assert steps.steps_from_nominal([point], [4000.0], ellipses, centre="set")[0][0] == pytest.approx(1.0, rel=1e-12)


def test_ansi_centre_and_bad_choices():
    from lampcalc.standards.ansi_bins import category

    np.testing.assert_allclose(steps.centre_xy(3000), category(3000).centre_xy)
    with pytest.raises(InputError, match="no centre for 3200 K"):
        steps.centre_xy(3200, "set")
    with pytest.raises(ValueError, match="ansi, set"):
        steps.centre_xy(3000, "cie")
    with pytest.raises(ValueError, match="ellipse, circle"):
        shipped_ellipse_set("square")
