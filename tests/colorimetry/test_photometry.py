"""Photometric sums: luminous and radiant quantities, LER, and the efficacy of blackbody radiation."""

import numpy as np
import pytest

from lampcalc.colorimetry import photometry as pm
from lampcalc.colorimetry.photometry import luminous_efficacy_of_blackbody
from lampcalc.spectra.resampling import GRID_NM


def test_photometry_of_an_absolute_spectrum():
    # 1 W/nm flat over 555 nm only: 683 lm (Km, CIE 015:2018); LER at 555 nm ≈ 683 lm/W.
    s = np.zeros(471)
    s[555 - 360] = 1.0
    assert pm.luminous_quantity(s) == pytest.approx(683.0)
    assert pm.radiant_quantity(s) == pytest.approx(1.0)
    assert pm.luminous_efficacy_of_radiation(s) == pytest.approx(683.0)


def test_ler_of_3000K_blackbody_over_360_830():
    from lampcalc.physics.blackbody import spectral_radiance

    # PITFALLS: a 3000 K blackbody has LER ≈ 130 lm/W over 360–830 nm (not lamp efficacy).
    assert pm.luminous_efficacy_of_radiation(spectral_radiance(3000.0, GRID_NM)) == pytest.approx(130, abs=1)


def test_luminous_efficacy_of_blackbody_peaks_near_95_lm_per_W_around_6600K():
    # Trade fact and colour-science values (shared/REFERENCE_VALUES.md): max ≈ 95.4 lm/W near 6600 K;
    # 2856 K ≈ 16.4, 4000 K ≈ 54.7, 5000 K ≈ 81.4 lm/W.
    t = np.arange(5000.0, 8001.0, 10.0)
    ler = luminous_efficacy_of_blackbody(t)
    assert ler.max() == pytest.approx(95.4, abs=0.1)
    assert 6400 <= t[np.argmax(ler)] <= 6800
    np.testing.assert_allclose(luminous_efficacy_of_blackbody([2856.0, 4000.0, 5000.0]), [16.4, 54.7, 81.4], atol=0.06)
