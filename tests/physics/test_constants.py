"""Constants against scipy.constants (CODATA 2018) and CIE 015:2018."""

import math

import pytest
import scipy.constants as sc

from lampcalc.physics import constants as k


@pytest.mark.parametrize(
    "ours, codata_name",
    [
        (k.H_Js, "Planck constant"),
        (k.C_m_per_s, "speed of light in vacuum"),
        (k.K_J_per_K, "Boltzmann constant"),
        (k.SIGMA_W_per_m2K4, "Stefan-Boltzmann constant"),
        (k.C1_Wm2, "first radiation constant"),
        (k.C1L_Wm2_per_sr, "first radiation constant for spectral radiance"),
        (k.C2_mK, "second radiation constant"),
        (k.WIEN_B_mK, "Wien wavelength displacement law constant"),
        (k.WIEN_FREQUENCY_Hz_per_K, "Wien frequency displacement law constant"),
    ],
)
def test_matches_scipy_codata(ours, codata_name):
    # Source: scipy.constants.physical_constants (CODATA 2018; exact SI 2019 values).
    assert ours == pytest.approx(sc.physical_constants[codata_name][0], rel=1e-15)


def test_published_values():
    # Source: CODATA 2018 as listed in shared/REFERENCE_VALUES.md.
    assert k.SIGMA_W_per_m2K4 == pytest.approx(5.670374419e-8, rel=1e-10)
    assert k.WIEN_B_mK == pytest.approx(2.897771955e-3, rel=1e-10)
    # CODATA prints this exact-derived value truncated ("5.878 925 757..."), hence 2e-10.
    assert k.WIEN_FREQUENCY_Hz_per_K == pytest.approx(5.878925757e10, rel=2e-10)
    assert k.A_J_per_m3K4 == pytest.approx(7.565733e-16, rel=1e-6)
    # The trade's rounded sigma (common practice, no source).
    assert k.SIGMA_W_per_m2K4 == pytest.approx(5.67e-8, rel=1e-3)


def test_colorimetric_c2_differs_from_codata():
    # CIE 015:2018: the Planckian radiator of colorimetry uses c2 = 1.4388e-2 m·K exactly.
    assert k.C2_CIE_mK == 1.4388e-2
    assert not math.isclose(k.C2_CIE_mK, k.C2_mK, rel_tol=1e-6)


def test_photometric_constants():
    # CIE 015:2018 / ISO 23539: Km = 683 lm/W, K'm = 1700 lm/W.
    assert k.KM_lm_per_W == 683.0
    assert k.KM_SCOTOPIC_lm_per_W == 1700.0
