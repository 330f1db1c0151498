"""Planck's law and what follows from it, against CODATA, closed forms and colour-science."""

import math

import numpy as np
import pytest
from scipy import integrate

from lampcalc.physics import blackbody as bb
from lampcalc.physics.constants import A_J_per_m3K4, C_m_per_s, C1_Wm2, C2_CIE_mK, C2_mK, SIGMA_W_per_m2K4
from lampcalc.errors import InputError

TEMPERATURES = [300.0, 2856.0, 5772.0, 10000.0]


def test_planck_integral_is_pi4_over_15():
    # Standard integral: ∫₀^∞ x³/(eˣ − 1) dx = π⁴/15.
    assert bb.planck_integral(0.0, np.inf) == pytest.approx(math.pi**4 / 15, rel=1e-13)
    # Cross-check against scipy's adaptive quadrature on a band.
    expected, _ = integrate.quad(lambda x: x**3 / math.expm1(x), 1.0, 7.0, epsabs=0, epsrel=1e-13)
    assert bb.planck_integral(1.0, 7.0) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize("t", TEMPERATURES)
def test_integrated_exitance_is_stefan_boltzmann(t):
    # Stefan–Boltzmann with CODATA 2018 σ = 5.670374419e-8 W m⁻² K⁻⁴.
    numeric = bb.band_exitance(t)
    assert numeric == pytest.approx(5.670374419e-8 * t**4, rel=1e-6)
    assert numeric == pytest.approx(bb.radiant_exitance(t), rel=1e-12)
    # The trade's rounded σ = 5.67e-8 (common practice, no source), a coarse check.
    assert numeric == pytest.approx(5.67e-8 * t**4, rel=1e-3)


def test_spectral_exitance_sums_to_sigma_t4_on_a_fine_grid():
    # Independent of the quadrature: trapezoid of π·L over 50 nm … 1 mm at 5772 K.
    wl = np.geomspace(50.0, 1e6, 200001)
    m = bb.blackbody_spectrum(5772.0, wl, quantity="exitance")
    assert np.trapezoid(m, wl) == pytest.approx(SIGMA_W_per_m2K4 * 5772.0**4, rel=1e-6)


def test_per_frequency_and_per_wavelength_integrate_to_the_same_total():
    t = 3000.0
    wl = np.geomspace(20.0, 2e6, 400001)
    nu = np.geomspace(C_m_per_s / 2e-3, C_m_per_s / 20e-9, 400001)
    per_wl = np.trapezoid(bb.spectral_radiance(t, wl), wl)
    per_nu = np.trapezoid(bb.spectral_radiance_frequency(t, nu), nu)
    assert per_wl == pytest.approx(per_nu, rel=1e-6)
    assert per_wl == pytest.approx(bb.total_radiance(t), rel=1e-6)


def test_energy_density_is_4pi_over_c_radiance_and_integrates_to_aT4():
    # u = (4π/c)·L for isotropic radiation (common practice); ∫u = aT⁴ with a = 4σ/c.
    t = 5000.0
    wl = np.geomspace(20.0, 2e6, 400001)
    u = bb.blackbody_spectrum(t, wl, quantity="energy_density")
    np.testing.assert_allclose(u, 4 * math.pi / C_m_per_s * bb.spectral_radiance(t, wl), rtol=1e-14)
    assert np.trapezoid(u, wl) == pytest.approx(A_J_per_m3K4 * t**4, rel=1e-6)
    assert bb.total_energy_density(t) == pytest.approx(7.565733e-16 * t**4, rel=1e-6)


def test_photon_radiance_is_radiance_over_photon_energy():
    wl = np.array([400.0, 555.0, 700.0])
    n = bb.blackbody_spectrum(3000.0, wl, quantity="photon_radiance")
    L = bb.spectral_radiance(3000.0, wl)
    np.testing.assert_allclose(n * 6.62607015e-34 * C_m_per_s / (wl * 1e-9), L, rtol=1e-14)


def test_agrees_with_colour_science_planck_law():
    from colour.colorimetry import planck_law

    # Reference library: colour-science's planck_law (spectral radiance per metre).
    wl = np.arange(200.0, 3001.0, 7.0)
    for t in (1000.0, 2856.0, 6504.0, 25000.0):
        ours = bb.spectral_radiance(t, wl) * 1e9
        np.testing.assert_allclose(ours, planck_law(wl * 1e-9, t, c1=C1_Wm2, c2=C2_mK), rtol=1e-10)
        ours_cie = bb.spectral_radiance(t, wl, c2_mK=C2_CIE_mK) * 1e9
        np.testing.assert_allclose(ours_cie, planck_law(wl * 1e-9, t, c1=C1_Wm2, c2=C2_CIE_mK), rtol=1e-10)


def test_wien_displacement():
    # CODATA 2018: b = 2.897771955e-3 m·K; ν_max/T = 5.878925757e10 Hz/K.
    assert bb.peak_wavelength_nm(5772.0) == pytest.approx(2.897771955e-3 / 5772.0 * 1e9, rel=1e-9)
    assert bb.peak_frequency_Hz(5772.0) == pytest.approx(5.878925757e10 * 5772.0, rel=2e-10)
    # The peaks are true maxima of the computed spectra.
    wl = np.linspace(400.0, 600.0, 200001)
    assert wl[np.argmax(bb.spectral_radiance(5772.0, wl))] == pytest.approx(bb.peak_wavelength_nm(5772.0), abs=2e-3)
    nu = np.linspace(2e14, 5e14, 300001)
    assert nu[np.argmax(bb.spectral_radiance_frequency(5772.0, nu))] == pytest.approx(
        bb.peak_frequency_Hz(5772.0), rel=1e-5
    )
    # The two peaks are not related by c/λ (they are densities over different variables).
    assert C_m_per_s / (bb.peak_wavelength_nm(5772.0) * 1e-9) / bb.peak_frequency_Hz(5772.0) == pytest.approx(
        4.965114231744276 / 2.821439372122079, rel=1e-12
    )


def test_rayleigh_jeans_and_wien_limits():
    # Rayleigh–Jeans → Planck as hc/λkT → 0; Wien → Planck as hc/λkT → ∞ (textbook limits).
    t = 5000.0
    long_wl = np.array([1e5, 1e6, 1e7])  # x = 2.9e-2 … 2.9e-4
    err_rj = bb.rayleigh_jeans_radiance(t, long_wl) / bb.spectral_radiance(t, long_wl) - 1
    assert np.all(np.abs(err_rj) < [0.02, 0.002, 0.0002]) and np.all(np.diff(np.abs(err_rj)) < 0)
    np.testing.assert_allclose(bb.approximation_error(t, long_wl, "rayleigh-jeans"), err_rj, rtol=1e-6)
    short_wl = np.array([500.0, 200.0, 100.0])  # x = 5.8, 14, 29
    err_w = bb.wien_radiance(t, short_wl) / bb.spectral_radiance(t, short_wl) - 1
    assert np.all(np.abs(err_w) < [4e-3, 1e-6, 1e-12]) and np.all(err_w <= 0)
    np.testing.assert_allclose(bb.approximation_error(t, short_wl, "wien"), err_w, rtol=1e-6, atol=1e-15)


def test_band_fraction_visible():
    # The visible fraction of a blackbody grows from 2856 K to 5772 K and stays below 1.
    f = bb.band_fraction([2856.0, 5772.0])
    assert 0.09 < f[0] < 0.12 and 0.43 < f[1] < 0.49
    wl = np.arange(380.0, 780.001, 0.01)
    trap = np.trapezoid(math.pi * bb.spectral_radiance(2856.0, wl), wl) / bb.radiant_exitance(2856.0)
    assert f[0] == pytest.approx(trap, rel=1e-8)


def test_graybody_scales_and_emissivity_curve():
    wl = np.array([400.0, 600.0, 800.0])
    np.testing.assert_allclose(
        bb.spectral_radiance(3000.0, wl, emissivity=0.4), 0.4 * bb.spectral_radiance(3000.0, wl), rtol=1e-15
    )
    curve = np.array([0.5, 0.45, 0.4])
    np.testing.assert_allclose(
        bb.spectral_radiance(3000.0, wl, emissivity=curve), curve * bb.spectral_radiance(3000.0, wl), rtol=1e-15
    )
    assert bb.radiant_exitance(3000.0, emissivity=0.3) == pytest.approx(0.3 * SIGMA_W_per_m2K4 * 3000.0**4)


def test_broadcasting_temperatures_against_wavelengths():
    out = bb.spectral_radiance(np.array([[2000.0, 3000.0], [4000.0, 5000.0]]), np.arange(400.0, 411.0))
    assert out.shape == (2, 2, 11)
    assert bb.radiant_exitance(np.ones((3, 4)) * 1000).shape == (3, 4)


@pytest.mark.parametrize("bad", [0.0, -5.0, np.nan, np.inf])
def test_bad_temperatures_are_refused(bad):
    with pytest.raises(InputError, match="temperature"):
        bb.spectral_radiance(bad, [500.0])


def test_unknown_quantity_and_axis():
    with pytest.raises(ValueError, match="radiance, exitance"):
        bb.blackbody_spectrum(3000.0, [500.0], quantity="power")
    with pytest.raises(ValueError, match="wavelength, frequency"):
        bb.blackbody_spectrum(3000.0, [500.0], per="wavenumber")
