"""The colour-over-angle figure holds the per-angle Δu′v′, CCT and Duv, and the user's limit.

The data are invented; the checks compare what is drawn with what was given (no published source).
"""

import numpy as np
import pytest

from lampcalc.plots import figure_style, save_figure
from lampcalc.plots.angles import angle_figure

ANGLES = {
    "angles": {
        "angle_deg": np.array([0.0, 20.0, 40.0, 60.0, 80.0]),
        "delta_uv_prime": np.array([0.001, 0.0008, 0.0004, 0.002, 0.006]),
        "cct_K": np.array([4000.0, 3990.0, 3970.0, 3930.0, 3840.0]),
        "duv": np.array([0.0015, 0.0016, 0.0019, 0.0027, 0.0069]),
    },
    "angle_of_max_delta_uv_prime_deg": 80.0,
    "max_delta_uv_prime_over_angle": 0.006,
    "limit_delta_uv_prime": 0.004,
    "angle_pass": False,
    "angle_weighting": "illuminance_lx",
}


def _line(fig, gid):
    (line,) = [a for ax in fig.axes for a in ax.lines if a.get_gid() == gid]
    return line


def test_figure_draws_what_it_is_given(tmp_path):
    with figure_style():
        fig = angle_figure(ANGLES)
        save_figure(fig, tmp_path / "a.png")
    t = ANGLES["angles"]
    np.testing.assert_array_equal(_line(fig, "delta_uv_prime").get_xydata(), np.stack([t["angle_deg"], t["delta_uv_prime"]], -1))
    assert _line(fig, "limit").get_ydata()[0] == 0.004
    assert tuple(_line(fig, "largest").get_xydata()[0]) == (80.0, 0.006)
    # Its label quotes Δu′v′ with the digits of the terminal and the report (verdicts.wording.DIGITS).
    from lampcalc.verdicts.wording import format_value

    assert _line(fig, "largest").get_label() == f"largest: {format_value('delta_uv_prime', 0.006)} at 80°"
    np.testing.assert_array_equal(_line(fig, "cct").get_ydata(), t["cct_K"])
    np.testing.assert_array_equal(_line(fig, "duv").get_ydata(), t["duv"])
    assert (tmp_path / "a.png").stat().st_size > 10_000


def test_no_limit_no_limit_line():
    with figure_style():
        fig = angle_figure(dict(ANGLES, limit_delta_uv_prime=None, angle_pass=None))
    assert not [a for ax in fig.axes for a in ax.lines if a.get_gid() == "limit"]
    assert fig.axes[0].get_ylim()[1] == pytest.approx(0.006 * 1.18)
