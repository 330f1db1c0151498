"""TM-30-18 hue-bin figures: fixed, stated scales; values beyond the scale marked; the graphic's geometry."""

import numpy as np
import pytest

from lampcalc.plots import figure_style, new_figure
from lampcalc.plots.hue import BAR_SCALES, HueBars, normalised_bins


@pytest.mark.parametrize("values", [np.full(16, 0.15), np.linspace(-30, 30, 16)])
def test_bars_keep_their_fixed_scale(values):
    # The case: a near-perfect halogen (±0.15 %) must not look like a poor lamp: the axis does not
    # follow the data.
    with figure_style():
        fig = new_figure()
        bars = HueBars(fig.add_subplot(), "chroma")
        bars.update(values)
    low, high, label = BAR_SCALES["chroma"]
    assert bars.ax.get_ylim() == (low, high) and bars.ax.get_ylabel() == label


def test_values_beyond_the_scale_are_marked_with_their_number():
    values = np.zeros(16)
    values[3], values[9] = 55.0, -70.0
    with figure_style():
        fig = new_figure()
        bars = HueBars(fig.add_subplot(), "chroma")
        shown = bars.update(values)
    assert shown[3] == BAR_SCALES["chroma"][1] and shown[9] == BAR_SCALES["chroma"][0]
    assert list(bars.clipped["above"].get_xdata()) == [4] and list(bars.clipped["below"].get_xdata()) == [10]
    notes = [t.get_text() for t in bars.beyond if t.get_visible()]
    assert notes == ["55", "-70"]


def test_graphic_normalises_the_reference_to_the_unit_circle():
    # ANSI/IES TM-30-18: the reference's bin means become the unit circle; a lamp equal to its reference
    # lies on it, and a lamp with 10 % more chroma in every bin lies on a circle of radius 1.1.
    angles = np.deg2rad(22.5 * np.arange(16) + 11.25)
    ref = 30.0 * np.stack([np.cos(angles), np.sin(angles)], -1)
    np.testing.assert_allclose(np.linalg.norm(normalised_bins(ref, ref), axis=1), 1.0, atol=1e-12)
    np.testing.assert_allclose(np.linalg.norm(normalised_bins(ref, 1.1 * ref), axis=1), 1.1, atol=1e-12)
