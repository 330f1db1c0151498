"""Dominant and complementary wavelength and excitation purity (CIE 015:2018) against colour-science."""

import warnings

import numpy as np
import pytest

from lampcalc.colorimetry.dominant_wavelength import EQUAL_ENERGY_XY, dominant_wavelength
from lampcalc.colorimetry.tristimulus import XYZ_to_xy, tristimulus
from lampcalc.spectra.resampling import GRID_NM


def _narrow_band(peaks_nm, fwhm_nm):
    sigma = fwhm_nm / (2.0 * np.sqrt(2.0 * np.log(2.0)))
    return np.exp(-0.5 * ((GRID_NM[None, :] - np.asarray(peaks_nm)[:, None]) / sigma) ** 2)


def _library(xy):
    import colour

    cmfs = colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"]
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # colour-science's own notices, not ours
        wl, _, _ = colour.dominant_wavelength(xy, np.array(EQUAL_ENERGY_XY), cmfs)
        purity = colour.excitation_purity(xy, np.array(EQUAL_ENERGY_XY), cmfs)
    return wl, purity


@pytest.mark.parametrize("fwhm_nm", [2.0, 20.0, 40.0])
def test_narrow_band_sources_against_colour_science(fwhm_nm):
    # Reference library: colour-science's dominant_wavelength and excitation_purity (CIE 015) with the
    # equal-energy point. colour-science gives the nearest whole nanometre of the locus; lampcalc
    # interpolates between them, so the wavelengths agree within 0.5 nm and the purities exactly.
    peaks = np.arange(440.0, 661.0, 3.7)
    xy = XYZ_to_xy(tristimulus(_narrow_band(peaks, fwhm_nm)))
    ours = dominant_wavelength(xy)
    wl, purity = _library(xy)
    assert np.abs(ours["dominant_wavelength_nm"] - wl).max() <= 0.5
    np.testing.assert_allclose(ours["excitation_purity"], purity, atol=1e-12)
    assert not ours["purple"].any() and np.isnan(ours["complementary_wavelength_nm"]).all()
    # A line 2 nm wide is nearly monochromatic: its dominant wavelength is its peak and its purity ~1.
    if fwhm_nm == 2.0:
        assert np.abs(ours["dominant_wavelength_nm"] - peaks).max() < 0.3
        assert ours["excitation_purity"].min() > 0.97


def test_purples_get_a_complementary_wavelength():
    # A mix of a blue and a red line is purple: no dominant wavelength; colour-science marks the
    # complementary wavelength with a minus sign, lampcalc gives it in its own key.
    spd = _narrow_band([450.0], 15.0) + 1.5 * _narrow_band([640.0], 15.0)
    xy = XYZ_to_xy(tristimulus(spd))
    ours = dominant_wavelength(xy)
    wl, purity = _library(xy)
    assert ours["purple"][0] and np.isnan(ours["dominant_wavelength_nm"][0])
    assert wl[0] < 0 and abs(ours["complementary_wavelength_nm"][0] + wl[0]) <= 0.5
    assert ours["excitation_purity"][0] == pytest.approx(purity[0], abs=1e-12)


def test_white_point_and_shapes():
    # At the achromatic point there is no dominant wavelength and the purity is 0 (CIE 015).
    out = dominant_wavelength(np.array([[EQUAL_ENERGY_XY, [0.6, 0.35]], [[np.nan, np.nan], [0.2, 0.7]]]))
    assert out["excitation_purity"].shape == (2, 2)
    assert out["excitation_purity"][0, 0] == 0 and np.isnan(out["dominant_wavelength_nm"][0, 0])
    assert np.isnan(out["excitation_purity"][1, 0])
    # Purity grows along a line from E towards a spectral colour, with the same dominant wavelength.
    line = dominant_wavelength(np.array(EQUAL_ENERGY_XY) + np.linspace(0.1, 1.0, 5)[:, None] * [0.25, 0.0])
    assert np.all(np.diff(line["excitation_purity"]) > 0)
    np.testing.assert_allclose(line["dominant_wavelength_nm"], line["dominant_wavelength_nm"][0], atol=1e-9)
