"""Colour-consistency steps: IEC 60081 ellipses (from memory) and CIE TN 001 circles."""

import numpy as np
import pytest

from lampcalc.standards import steps
from lampcalc.colorimetry.tristimulus import upvp_to_xy, xy_to_upvp
from lampcalc.errors import InputError


def _axes(g):
    """Semi-axis lengths and directions of the one-step ellipse of a metric g (units of 1e4)."""
    matrix = 1e4 * np.array([[g[0], g[1]], [g[1], g[2]]])
    values, vectors = np.linalg.eigh(matrix)
    return 1 / np.sqrt(values), vectors.T


@pytest.mark.parametrize("nominal", sorted(steps.IEC_60081_ELLIPSES))
def test_centre_is_zero_and_one_semi_axis_is_one_step(nominal):
    # By construction of the metric (IEC 60081 Annex D): n = 1 on the one-step ellipse.
    centre, g = steps.IEC_60081_ELLIPSES[nominal]
    assert steps.steps_from_nominal([centre], [nominal], centre="iec")[0][0] == 0
    lengths, directions = _axes(g)
    for length, direction in zip(lengths, directions):
        for sign in (1, -1):
            point = np.array(centre) + sign * length * direction
            assert steps.steps_from_nominal([point], [nominal], centre="iec")[0][0] == pytest.approx(1.0, rel=1e-12)
    # Three steps away is three steps (the metric is quadratic).
    point = np.array(centre) + 3 * lengths[0] * directions[0]
    assert steps.ellipse_steps(point, centre, g) == pytest.approx(3.0)


def test_f6500_against_macadam_1942():
    from colour.models.datasets.macadam_ellipses import DATA_MACADAM_1942_ELLIPSES

    # MacAdam (1942) ellipse near (0.305, 0.323), a 2.3e-3, b 0.9e-3, θ 58° (Wyszecki & Stiles, via
    # colour-science). The IEC F6500 metric, for a nearby centre, measures its semi-axes as about one step.
    row = next(r for r in DATA_MACADAM_1942_ELLIPSES if abs(r[0] - 0.305) < 1e-9 and abs(r[1] - 0.323) < 1e-9)
    x0, y0, a, b, theta = row[0], row[1], row[2] * 1e-3, row[3] * 1e-3, np.deg2rad(row[4])
    _, g = steps.IEC_60081_ELLIPSES[6500]
    for length, angle in ((a, theta), (b, theta + np.pi / 2)):
        point = (x0 + length * np.cos(angle), y0 + length * np.sin(angle))
        assert 0.75 < steps.ellipse_steps(point, (x0, y0), g) < 1.33


def test_metric_interpolates_in_mired_and_flags_outside():
    g, outside = steps.metric([2700.0, 1e6 / ((1e6 / 2700 + 1e6 / 3000) / 2), 3000.0, 2200.0, 7000.0])
    np.testing.assert_allclose(g[0], steps.IEC_60081_ELLIPSES[2700][1])
    np.testing.assert_allclose(g[1], 0.5 * (np.array(steps.IEC_60081_ELLIPSES[2700][1]) + steps.IEC_60081_ELLIPSES[3000][1]))
    np.testing.assert_allclose(g[3], steps.IEC_60081_ELLIPSES[2700][1])
    assert list(outside) == [False, False, False, True, True]


def test_circles():
    # CIE TN 001:2014 (from memory): one step is a u'v' circle of radius 0.0011.
    centre = steps.centre_xy(4000)
    upvp = xy_to_upvp(centre) + [0.0011 * np.cos(1.0), 0.0011 * np.sin(1.0)]
    assert steps.steps_from_nominal([upvp_to_xy(upvp)], [4000], method="circle")[0][0] == pytest.approx(1.0)


def test_ansi_centre_and_bad_choices():
    from lampcalc.standards.ansi_bins import category

    np.testing.assert_allclose(steps.centre_xy(3000), category(3000).centre_xy)
    with pytest.raises(InputError, match="no colour centre for 3200 K"):
        steps.centre_xy(3200, "iec")
    with pytest.raises(ValueError, match="ansi, iec"):
        steps.centre_xy(3000, "cie")
    with pytest.raises(ValueError, match="ellipse, circle"):
        steps.steps_from_nominal([(0.4, 0.4)], [4000], method="square")
