"""CIE daylight locus and D-series spectra (CIE 015:2018, clause 4.1.2)."""

import numpy as np
import pytest

from lampcalc.colorimetry import tristimulus as cm
from lampcalc.colorimetry.daylight import daylight_locus_xy, daylight_spectrum
from lampcalc.errors import InputError


def test_daylight_locus_matches_colour_science():
    import colour

    # Reference library: colour-science's CCT_to_xy_CIE_D (the same CIE 015 polynomials).
    t = np.linspace(4000, 25000, 43)
    np.testing.assert_allclose(daylight_locus_xy(t), colour.temperature.CCT_to_xy_CIE_D(t), atol=1e-12)


def test_d65_phase():
    # CIE 015:2018: D65's correlated colour temperature is 6500·1.4388/1.4380 ≈ 6504 K and its
    # daylight-locus chromaticity (x_D, y_D) is about (0.3127, 0.3291).
    np.testing.assert_allclose(daylight_locus_xy(6504.0), [0.3127, 0.3291], atol=1e-4)


def test_d_series_matches_colour_science():
    import colour

    # Reference library: colour-science's sd_CIE_illuminant_D_series (M1, M2 rounded to 3 decimals),
    # aligned to 1 nm with its Sprague interpolator.
    for t in (4000.0, 5003.0, 6504.0, 9000.0, 25000.0):
        sd = colour.sd_CIE_illuminant_D_series(colour.temperature.CCT_to_xy_CIE_D(t))
        expected = sd.copy().align(colour.SpectralShape(360, 830, 1)).values
        np.testing.assert_allclose(daylight_spectrum(t), expected, rtol=1e-9, atol=1e-9)


def test_d65_spectrum_close_to_the_table():
    import colour

    # CIE D65 table (colour-science's copy, 5 nm, 300–780 nm): the D-series formula gives it back
    # to within the 3-decimal rounding of M1, M2 (max difference 0.08 on values near 100, measured).
    d65 = colour.SDS_ILLUMINANTS["D65"]
    ours = daylight_spectrum(6504.0)[:: 5][: (780 - 360) // 5 + 1]
    table = d65.values[(d65.wavelengths >= 360)]
    assert np.max(np.abs(ours - table)) < 0.1


def test_d_series_chromaticity_on_the_daylight_locus():
    xy = cm.XYZ_to_xy(cm.tristimulus(daylight_spectrum(np.array([4000.0, 6504.0, 20000.0]))))
    # Sums of the rounded-M spectra land within 1e-4 of the locus polynomial (CIE 015 tolerance of its tables).
    np.testing.assert_allclose(xy, daylight_locus_xy([4000.0, 6504.0, 20000.0]), atol=1.5e-4)


@pytest.mark.parametrize("bad", [3999.0, 25001.0, np.nan])
def test_outside_the_daylight_range_is_refused(bad):
    with pytest.raises(InputError, match="4000-25000 K"):
        daylight_locus_xy(bad)
