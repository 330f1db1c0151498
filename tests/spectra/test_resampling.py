"""Resampling onto the CIE 015:2018 grid: the auto choice, Sprague (CIE 167:2005), linear, integration."""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from lampcalc.spectra.resampling import GRID_NM, integrate, linear, method_for, resample, sprague


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


@pytest.mark.parametrize("step, offset", [(5.0, 0.37), (2.0, -0.8), (10.0, 3.3)])
def test_sprague_on_shifted_axes_matches_colour_science(step, offset):
    from colour.algebra import SpragueInterpolator

    # A Monte Carlo draw shifts the measured wavelengths by a fraction of a nanometre: the grid then falls
    # anywhere between the nodes, and near both ends. Reference library: colour-science's SpragueInterpolator.
    rng = np.random.default_rng(4)
    wl = np.arange(380.0, 781.0, step) + offset
    y = rng.random(wl.size)
    target = np.arange(np.ceil(wl[0]), np.floor(wl[-1]) + 1.0)
    np.testing.assert_allclose(sprague(wl, y, target), SpragueInterpolator(wl, y)(target), atol=1e-12)


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
        out, used = resample(wl, y, method)
        assert used == method
        assert np.all(out[GRID_NM < 400] == 0) and np.all(out[GRID_NM > 700] == 0)
        assert np.all(out[(GRID_NM >= 400) & (GRID_NM <= 700)] == pytest.approx(1.0))


def test_batches_keep_leading_dimensions():
    wl = np.arange(380.0, 781.0, 2.0)
    y = np.ones((2, 3, wl.size))
    for method in ("auto", "linear", "sprague"):
        assert resample(wl, y, method)[0].shape == (2, 3, 471)
    fine = np.arange(380.0, 780.01, 0.25)
    assert resample(fine, np.ones((2, 3, fine.size)))[0].shape == (2, 3, 471)


def test_sprague_needs_uniform_spacing():
    with pytest.raises(ValueError, match="uniformly spaced"):
        sprague([400, 405, 411, 415, 420, 425, 430], np.ones(7))


def test_unknown_method_lists_the_valid_ones():
    with pytest.raises(ValueError, match="auto, linear, sprague"):
        resample([400, 700], [1, 1], "cubic")


@pytest.mark.parametrize(
    "wavelengths, requested, expected",
    [
        # CIE 015:2018 clause 7.2 / CIE 167:2005: Sprague for uniformly spaced coarse data, linear where
        # Sprague is not defined (uneven spacing, fewer than 6 points), the data themselves at 1 nm, and
        # integration of data finer than the grid (issue 10).
        (np.arange(380.0, 781.0, 5.0), "auto", "sprague"),
        (np.arange(380.0, 781.0, 2.0), "auto", "sprague"),
        (np.array([380.0, 385.0, 391.0, 400.0, 500.0, 600.0, 700.0, 780.0]), "auto", "linear"),
        (np.array([380.0, 480.0, 580.0, 680.0, 780.0]), "auto", "linear"),
        (np.arange(360.0, 831.0, 1.0), "auto", "none"),
        (np.arange(360.0, 831.0, 1.0), "sprague", "none"),
        (np.arange(360.5, 830.0, 1.0), "auto", "integrated"),
        (np.arange(380.0, 780.01, 0.1), "auto", "integrated"),
        (np.arange(380.0, 780.01, 0.1), "linear", "integrated"),
        (np.arange(380.0, 781.0, 5.0), "linear", "linear"),
    ],
)
def test_method_for(wavelengths, requested, expected):
    assert method_for(wavelengths, requested) == expected


def test_sprague_refused_where_it_is_not_defined():
    with pytest.raises(ValueError, match="only 5 points"):
        method_for([380.0, 480.0, 580.0, 680.0, 780.0], "sprague")
    with pytest.raises(ValueError, match="steps range from 5 to 100 nm; use auto or linear"):
        method_for([380.0, 385.0, 390.0, 400.0, 500.0, 600.0, 700.0], "sprague")


def test_default_reproduces_the_reference_calculators():
    import colour
    from colour.quality.tests.test_cri import DATA_SAMPLE

    from lampcalc.rating.rate import rate_spectra
    from lampcalc.spectra.batch import SpectralBatch

    # colour-science's tests hold the official calculators' values (shared/REFERENCE_VALUES.md): FL2 (5 nm)
    # CIE 224 / TM-30-18 Rf 70.1208, and the CIE 13.3 LED sample Ra 70.8153. With the default (auto →
    # Sprague) lampcalc gives them within 0.002; linear interpolation misses by 0.09 and 0.37.
    fl2 = colour.SDS_ILLUMINANTS["FL2"]
    led_wl = np.array(sorted(DATA_SAMPLE), dtype=float)
    led = SpectralBatch(led_wl, [[DATA_SAMPLE[w] for w in led_wl]], names=["LED"])
    both = [SpectralBatch(fl2.wavelengths, fl2.values[None], names=["FL2"]), led]
    auto = rate_spectra(both)
    assert auto["interpolation"] == ("sprague", "sprague")
    assert auto["rf"][0] == pytest.approx(70.1208244, abs=2e-3)
    assert auto["ra"][1] == pytest.approx(70.815265381660197, abs=2e-3)
    lin = rate_spectra(both, interpolation="linear")
    assert abs(lin["rf"][0] - 70.1208244) > 0.05 and abs(lin["ra"][1] - 70.815265381660197) > 0.3


def _lines(wl, positions, heights, fwhm_nm=0.5):
    """Gaussian emission lines of the given full width at half maximum (a physical line model)."""
    sigma = fwhm_nm / (2.0 * np.sqrt(2.0 * np.log(2.0)))
    return sum(h * np.exp(-0.5 * ((wl - p) / sigma) ** 2) for p, h in zip(positions, heights))


@settings(max_examples=60, deadline=None)
@given(
    st.lists(st.floats(400.0, 700.0), min_size=1, max_size=4),
    st.lists(st.floats(0.1, 1.0), min_size=4, max_size=4),
)
def test_fine_data_integrated_every_watt_once(positions, heights):
    from lampcalc.colorimetry.tristimulus import XYZ_to_xy
    from lampcalc.spectra.tables import colour_matching_functions

    # Issue 10: 0.1 nm data of 0.5 nm-wide lines at any positions give x, y within 2e-4 of a direct
    # integration at the data's own step (CMFs interpolated linearly to 0.1 nm, Σ S·cmf·Δλ, CIE 015);
    # and the grid holds the data's integral, every watt once.
    wl = np.round(np.arange(360.0, 830.0001, 0.1), 10)
    s = _lines(wl, positions, heights[: len(positions)])
    cmf = colour_matching_functions("1931_2deg")
    direct = XYZ_to_xy(linear(GRID_NM, cmf.T, wl) @ s * 0.1)
    on_grid, used = resample(wl, s)
    assert used == "integrated"
    assert np.abs(XYZ_to_xy(on_grid @ cmf) - direct).max() < 2e-4
    assert on_grid.sum() == pytest.approx(np.trapezoid(s, wl), rel=1e-9)


def test_point_sampling_fine_data_would_lose_the_lines():
    # The pitfall the integration avoids (shared/PITFALLS.md): lines between whole nanometres vanish
    # when the data are sampled at the grid, and move x, y by 0.04 or more.
    wl = np.round(np.arange(360.0, 830.0001, 0.1), 10)
    s = _lines(wl, [450.5, 545.5, 610.5], [1.0, 1.0, 1.0])
    assert integrate(wl, s).sum() == pytest.approx(np.trapezoid(s, wl), rel=1e-9)
    assert linear(wl, s).sum() < 0.5 * np.trapezoid(s, wl)


@settings(max_examples=40, deadline=None)
@given(st.floats(380.0, 780.0), st.floats(0.05, 0.9))
def test_integration_of_a_narrow_line_splits_it_by_position(position, step):
    # A line narrower than the grid lands on the nearest whole nanometres in proportion to its distance
    # from each (the weights of linear interpolation, which reproduce a linear function): its power and
    # its centroid are kept exactly, and it spreads no further than its own width plus 1 nm each side.
    wl = np.arange(370.0, 790.0, step)
    s = np.where(np.abs(wl - wl[np.argmin(np.abs(wl - position))]) < step / 2, 1.0, 0.0)
    out = integrate(wl, s)
    assert (out @ GRID_NM) / out.sum() == pytest.approx((s @ wl) / s.sum(), abs=1e-9)
    assert out.sum() == pytest.approx(np.trapezoid(s, wl), rel=1e-9)
    spread = GRID_NM[out > 1e-12]
    assert spread.max() - spread.min() <= 2 * step + 2
