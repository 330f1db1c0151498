"""Peak, centroid and FWHM of spectra on the grid, against the closed forms of a Gaussian line."""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from lampcalc.spectra.features import spectral_features
from lampcalc.spectra.resampling import GRID_NM

FULL = [[360.0, 830.0]]


@settings(max_examples=60, deadline=None)
@given(st.floats(470.0, 720.0), st.floats(5.0, 60.0))
def test_gaussian_line(peak_nm, fwhm_nm):
    # A Gaussian of standard deviation σ has FWHM 2√(2 ln 2)·σ (a closed form); its centroid is its peak.
    # Lines well inside the range (±4σ), so no tail is cut. Linear interpolation of the half-height crossings
    # on the 1 nm grid is good to 0.15 nm (measured: 0.11 nm for a 5 nm line, less for wider ones).
    sigma = fwhm_nm / (2.0 * np.sqrt(2.0 * np.log(2.0)))
    s = np.exp(-0.5 * ((GRID_NM - peak_nm) / sigma) ** 2)
    out = spectral_features(s[None], FULL)
    assert abs(out["peak_nm"][0] - peak_nm) <= 0.5
    assert out["centroid_nm"][0] == pytest.approx(peak_nm, abs=0.01)
    assert out["fwhm_nm"][0] == pytest.approx(fwhm_nm, abs=0.15)
    assert not out["fwhm_at_range_end"][0]


def test_highest_peak_of_a_white_led_and_open_peaks():
    from lampcalc.physics.blackbody import spectral_radiance

    # A white LED: a 20 nm blue pump over a broad phosphor; the FWHM is the pump's (the highest peak).
    sigma = 20.0 / (2.0 * np.sqrt(2.0 * np.log(2.0)))
    led = 1.0 * np.exp(-0.5 * ((GRID_NM - 450.0) / sigma) ** 2) + 0.3 * np.exp(-0.5 * ((GRID_NM - 570.0) / 45.0) ** 2)
    # A 2700 K radiator still rises at 830 nm (Wien's law: peak near 1073 nm): no FWHM within the range.
    bb = spectral_radiance(2700.0, GRID_NM)
    # A line cut by the end of the measured range (data to 700 nm) has no FWHM either.
    red = np.where(GRID_NM <= 700, np.exp(-0.5 * ((GRID_NM - 700.0) / 10.0) ** 2), 0.0)
    out = spectral_features(np.stack([led, bb, red]), [[360.0, 830.0], [360.0, 830.0], [380.0, 700.0]])
    assert out["peak_nm"].tolist() == [450.0, 830.0, 700.0]
    assert out["fwhm_nm"][0] == pytest.approx(20.0, abs=0.3)
    assert np.isnan(out["fwhm_nm"][1:]).all() and out["fwhm_at_range_end"].tolist() == [False, True, True]
