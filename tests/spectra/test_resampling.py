"""Resampling onto the CIE 015:2018 grid: linear (default) and Sprague (CIE 167:2005)."""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from lampcalc.spectra.resampling import GRID_NM, linear, resample, sprague


def test_grid_is_cie_015():
    # CIE 015:2018: 360–830 nm at 1 nm.
    assert GRID_NM[0] == 360 and GRID_NM[-1] == 830 and GRID_NM.size == 471
    assert np.all(np.diff(GRID_NM) == 1)


spectra = st.integers(min_value=8, max_value=60).flatmap(
    lambda n: st.tuples(
        arrays(float, n, elements=st.floats(0.5, 4.0)),
        arrays(float, n, elements=st.floats(0.0, 1e3)),
    )
)


@settings(max_examples=60, deadline=None)
@given(spectra)
def test_linear_exact_at_nodes_and_non_negative(data):
    steps, values = data
    wl = 380.0 + np.cumsum(steps)
    out = linear(wl, values, wl)
    np.testing.assert_allclose(out, values, rtol=1e-12, atol=1e-12)
    dense = linear(wl, values, np.linspace(wl[0] - 5, wl[-1] + 5, 997))
    assert np.all(dense >= 0)
    # Linear interpolation never leaves the range of the data (no overshoot).
    assert dense.max() <= values.max() * (1 + 1e-12)


@settings(max_examples=40, deadline=None)
@given(arrays(float, st.integers(6, 40), elements=st.floats(0.0, 10.0)))
def test_sprague_exact_at_nodes(values):
    wl = 400.0 + 5.0 * np.arange(values.size)
    np.testing.assert_allclose(sprague(wl, values, wl), values, atol=1e-9)


def test_sprague_matches_colour_science():
    from colour.algebra import SpragueInterpolator

    # Reference library: colour-science's SpragueInterpolator (CIE 167:2005 coefficients).
    rng = np.random.default_rng(3)
    wl = np.arange(360.0, 835.0, 5.0)
    y = rng.random((3, wl.size))
    target = np.arange(360.0, 831.0)
    ours = sprague(wl, y, target)
    for row, expected in zip(ours, y):
        np.testing.assert_allclose(row, SpragueInterpolator(wl, expected)(target), atol=1e-12)


def test_sprague_rings_around_a_narrow_line_linear_does_not():
    # PITFALLS: Sprague overshoots below zero around narrow emission lines; linear cannot.
    wl = np.arange(360.0, 835.0, 5.0)
    y = np.zeros(wl.size)
    y[40] = 1.0  # a line at 560 nm
    assert sprague(wl, y).min() < 0
    assert linear(wl, y).min() == 0


def test_zero_outside_the_data_never_extrapolated():
    wl = np.arange(400.0, 701.0, 5.0)
    y = np.ones(wl.size)
    for method in ("linear", "sprague"):
        out = resample(wl, y, method)
        assert np.all(out[GRID_NM < 400] == 0) and np.all(out[GRID_NM > 700] == 0)
        assert np.all(out[(GRID_NM >= 400) & (GRID_NM <= 700)] == pytest.approx(1.0))


def test_batches_keep_leading_dimensions():
    wl = np.arange(380.0, 781.0, 2.0)
    y = np.ones((2, 3, wl.size))
    assert resample(wl, y).shape == (2, 3, 471)
    assert resample(wl, y, "sprague").shape == (2, 3, 471)


def test_sprague_needs_uniform_spacing():
    with pytest.raises(ValueError, match="uniformly spaced"):
        sprague([400, 405, 411, 415, 420, 425, 430], np.ones(7))


def test_unknown_method_lists_the_valid_ones():
    with pytest.raises(ValueError, match="linear, sprague"):
        resample([400, 700], [1, 1], "cubic")
