"""Blackbody (Planckian) radiation: Planck's law and what follows from it.

Every function broadcasts: temperatures of shape ``(...)`` against a spectral axis of
shape ``(n,)`` give spectra of shape ``(..., n)``; totals keep the temperatures' shape.

Radiometry here uses the CODATA second radiation constant c2 = hc/k
(:data:`lampcalc.physics.constants.C2_mK`). The colorimetric Planckian radiator of CIE 015:2018
uses c2 = 1.4388e-2 m·K instead; pass ``c2_mK=C2_CIE_mK`` to get it (the Planckian locus
in :mod:`lampcalc.colorimetry.locus` does). See ``docs/blackbody.md``.

Quantities (``quantity=``) and their units per wavelength (nm) and per frequency (Hz):

=================  ============================  ============================
quantity           per wavelength                per frequency
=================  ============================  ============================
radiance           W·sr⁻¹·m⁻²·nm⁻¹               W·sr⁻¹·m⁻²·Hz⁻¹
exitance           W·m⁻²·nm⁻¹  (π·L)             W·m⁻²·Hz⁻¹
energy_density     J·m⁻³·nm⁻¹  (4π/c·L)          J·m⁻³·Hz⁻¹
photon_radiance    s⁻¹·sr⁻¹·m⁻²·nm⁻¹ (L/(hc/λ))  s⁻¹·sr⁻¹·m⁻²·Hz⁻¹ (L/(hν))
=================  ============================  ============================
"""

import math

import numpy as np

from ..errors import InputError
from .constants import (
    A_J_per_m3K4,
    C1L_Wm2_per_sr,
    C2_mK,
    C_m_per_s,
    H_Js,
    K_J_per_K,
    SIGMA_W_per_m2K4,
    WIEN_B_mK,
    WIEN_FREQUENCY_Hz_per_K,
)

QUANTITIES = ("radiance", "exitance", "energy_density", "photon_radiance")
PER = ("wavelength", "frequency")

#: Units of :func:`blackbody_spectrum` by ``(quantity, per)``.
SPECTRUM_UNITS = {
    ("radiance", "wavelength"): "W/(sr m2 nm)",
    ("radiance", "frequency"): "W/(sr m2 Hz)",
    ("exitance", "wavelength"): "W/(m2 nm)",
    ("exitance", "frequency"): "W/(m2 Hz)",
    ("energy_density", "wavelength"): "J/(m3 nm)",
    ("energy_density", "frequency"): "J/(m3 Hz)",
    ("photon_radiance", "wavelength"): "1/(s sr m2 nm)",
    ("photon_radiance", "frequency"): "1/(s sr m2 Hz)",
}

_QUANTITY_FACTOR = {"radiance": 1.0, "exitance": math.pi, "energy_density": 4 * math.pi / C_m_per_s}


def temperatures(temperature_K):
    """Validate temperatures: a float array, every value finite and > 0.

    Raises
    ------
    InputError
        Naming the first offending value.
    """
    t = np.asarray(temperature_K, dtype=float)
    bad = ~(np.isfinite(t) & (t > 0))
    if np.any(bad):
        raise InputError(f"temperature must be a finite number of kelvin above 0, got {t[bad].flat[0]!r}")
    return t


def _x_wavelength(t, wavelength_nm, c2_mK):
    """hc/(λkT) (or c2/(λT)) with T on leading axes and λ on the last."""
    return c2_mK / (np.asarray(wavelength_nm, dtype=float) * 1e-9 * t[..., None])


def spectral_radiance(temperature_K, wavelength_nm, *, emissivity=1.0, c2_mK=C2_mK):
    """Planck's law per wavelength: spectral radiance in W·sr⁻¹·m⁻²·nm⁻¹.

    L_λ = ε·c1L / λ⁵ / (exp(c2/(λT)) − 1), with c1L = 2hc².

    Parameters
    ----------
    temperature_K : array_like, shape (...)
    wavelength_nm : array_like, shape (n,)
    emissivity : float or array_like broadcastable to (..., n)
        1 for a blackbody; a constant for a graybody; a curve over the wavelengths.
    c2_mK : float
        Second radiation constant; CODATA by default, ``C2_CIE_mK`` for colorimetry.

    Returns
    -------
    ndarray, shape (..., n)

    Examples
    --------
    >>> round(float(spectral_radiance(5772.0, [500.0])[0]), 1)
    26238.5
    """
    t = temperatures(temperature_K)
    wl_m = np.asarray(wavelength_nm, dtype=float) * 1e-9
    x = _x_wavelength(t, wavelength_nm, c2_mK)
    return emissivity * C1L_Wm2_per_sr / wl_m**5 / np.expm1(x) * 1e-9


def spectral_radiance_frequency(temperature_K, frequency_Hz, *, emissivity=1.0):
    """Planck's law per frequency: spectral radiance in W·sr⁻¹·m⁻²·Hz⁻¹.

    L_ν = ε·2hν³/c² / (exp(hν/(kT)) − 1).

    Parameters
    ----------
    temperature_K : array_like, shape (...)
    frequency_Hz : array_like, shape (n,)
    emissivity : float or array_like broadcastable to (..., n)

    Returns
    -------
    ndarray, shape (..., n)
    """
    t = temperatures(temperature_K)
    nu = np.asarray(frequency_Hz, dtype=float)
    x = H_Js * nu / (K_J_per_K * t[..., None])
    return emissivity * 2 * H_Js * nu**3 / C_m_per_s**2 / np.expm1(x)


def blackbody_spectrum(temperature_K, axis, *, quantity="radiance", per="wavelength", emissivity=1.0):
    """Blackbody or graybody spectrum of the named quantity (see the module table).

    Parameters
    ----------
    temperature_K : array_like, shape (...)
    axis : array_like, shape (n,)
        Wavelengths in nm when ``per="wavelength"``, frequencies in Hz when
        ``per="frequency"``.
    quantity : {"radiance", "exitance", "energy_density", "photon_radiance"}
    per : {"wavelength", "frequency"}
    emissivity : float or array_like

    Returns
    -------
    ndarray, shape (..., n), in :data:`SPECTRUM_UNITS` ``[(quantity, per)]``.
    """
    if quantity not in QUANTITIES:
        raise ValueError(f"unknown quantity {quantity!r}; choose one of {', '.join(QUANTITIES)}")
    if per not in PER:
        raise ValueError(f"unknown spectral axis {per!r}; choose one of {', '.join(PER)}")
    axis = np.asarray(axis, dtype=float)
    if per == "wavelength":
        radiance = spectral_radiance(temperature_K, axis, emissivity=emissivity)
        photon_energy_J = H_Js * C_m_per_s / (axis * 1e-9)
    else:
        radiance = spectral_radiance_frequency(temperature_K, axis, emissivity=emissivity)
        photon_energy_J = H_Js * axis
    if quantity == "photon_radiance":
        return radiance / photon_energy_J
    return radiance * _QUANTITY_FACTOR[quantity]


def rayleigh_jeans_radiance(temperature_K, wavelength_nm):
    """Rayleigh–Jeans approximation 2ckT/λ⁴, W·sr⁻¹·m⁻²·nm⁻¹ (good where hc/(λkT) ≪ 1)."""
    t = temperatures(temperature_K)
    wl_m = np.asarray(wavelength_nm, dtype=float) * 1e-9
    return 2 * C_m_per_s * K_J_per_K * t[..., None] / wl_m**4 * 1e-9


def wien_radiance(temperature_K, wavelength_nm):
    """Wien approximation c1L/λ⁵·exp(−c2/(λT)), W·sr⁻¹·m⁻²·nm⁻¹ (good where hc/(λkT) ≫ 1)."""
    t = temperatures(temperature_K)
    wl_m = np.asarray(wavelength_nm, dtype=float) * 1e-9
    return C1L_Wm2_per_sr / wl_m**5 * np.exp(-_x_wavelength(t, wavelength_nm, C2_mK)) * 1e-9


def approximation_error(temperature_K, wavelength_nm, approximation):
    """Relative error of an approximation against Planck's law: approx/Planck − 1.

    Both are closed forms in x = hc/(λkT): Rayleigh–Jeans gives (eˣ − 1)/x − 1 and Wien
    gives −e⁻ˣ, computed so that neither loses precision at small or large x.

    Parameters
    ----------
    approximation : {"rayleigh-jeans", "wien"}
    """
    x = _x_wavelength(temperatures(temperature_K), wavelength_nm, C2_mK)
    if approximation == "rayleigh-jeans":
        return np.expm1(x) / x - 1.0
    if approximation == "wien":
        return -np.exp(-x)
    raise ValueError(f"unknown approximation {approximation!r}; choose rayleigh-jeans or wien")


def radiant_exitance(temperature_K, emissivity=1.0):
    """Total exitance in closed form, Stefan–Boltzmann εσT⁴, W/m²."""
    return emissivity * SIGMA_W_per_m2K4 * temperatures(temperature_K) ** 4


def total_radiance(temperature_K, emissivity=1.0):
    """Total radiance εσT⁴/π, W·sr⁻¹·m⁻² (Lambertian: M = πL)."""
    return radiant_exitance(temperature_K, emissivity) / math.pi


def total_energy_density(temperature_K):
    """Total energy density of cavity radiation u = aT⁴ with a = 4σ/c, J/m³."""
    return A_J_per_m3K4 * temperatures(temperature_K) ** 4


_GL_X, _GL_W = np.polynomial.legendre.leggauss(20)
_PANELS = 48
_X_MAX = 90.0  # x³/(eˣ−1) < 1e-33 beyond: far below double precision of the total


def planck_integral(x_low, x_high):
    """∫ t³/(eᵗ − 1) dt from ``x_low`` to ``x_high`` by composite Gauss–Legendre quadrature.

    The whole integral from 0 to ∞ is π⁴/15. Broadcasts over its arguments; ``x_high``
    may be ``inf``.

    Examples
    --------
    >>> round(float(planck_integral(0.0, np.inf)) / (np.pi**4 / 15), 12)
    1.0
    """
    a = np.clip(np.asarray(x_low, dtype=float), 0.0, _X_MAX)
    b = np.clip(np.asarray(x_high, dtype=float), 0.0, _X_MAX)
    a, b = np.broadcast_arrays(a, b)
    edges = a[..., None] + (b - a)[..., None] * np.linspace(0.0, 1.0, _PANELS + 1)
    half = 0.5 * np.diff(edges, axis=-1)
    mid = 0.5 * (edges[..., 1:] + edges[..., :-1])
    t = mid[..., None] + half[..., None] * _GL_X  # (..., panels, nodes)
    with np.errstate(invalid="ignore", divide="ignore"):
        f = np.where(t > 0, t**3 / np.expm1(t), 0.0)
    return np.sum(half * np.sum(f * _GL_W, axis=-1), axis=-1)


def band_exitance(temperature_K, low_nm=0.0, high_nm=np.inf, emissivity=1.0):
    """Exitance of a blackbody (or constant-ε graybody) between two wavelengths, W/m².

    Integrated numerically (:func:`planck_integral`) in x = hc/(λkT); with the default
    band, 0 to ∞, it reproduces σT⁴ to about 1e-14.
    """
    t = temperatures(temperature_K)
    low = np.asarray(low_nm, dtype=float) * 1e-9
    high = np.asarray(high_nm, dtype=float) * 1e-9
    with np.errstate(divide="ignore"):
        x_high = np.where(low > 0, C2_mK / (low * t), np.inf)
        x_low = C2_mK / (high * t)
    scale = 2 * math.pi * K_J_per_K**4 * t**4 / (H_Js**3 * C_m_per_s**2)
    return emissivity * scale * planck_integral(x_low, x_high)


def band_fraction(temperature_K, low_nm=380.0, high_nm=780.0):
    """Fraction of a blackbody's total power emitted between two wavelengths."""
    return band_exitance(temperature_K, low_nm, high_nm) / radiant_exitance(temperature_K)


def peak_wavelength_nm(temperature_K):
    """Peak of the per-wavelength spectrum, Wien's displacement law λ_max = b/T, in nm."""
    return WIEN_B_mK / temperatures(temperature_K) * 1e9


def peak_frequency_Hz(temperature_K):
    """Peak of the per-frequency spectrum, ν_max = (5.8789e10 Hz/K)·T.

    Not c/λ_max: the two spectra are densities over different variables, dν = −c/λ²·dλ,
    so their maxima sit at x = 4.965 and x = 2.821 in x = hc/(λkT).
    """
    return WIEN_FREQUENCY_Hz_per_K * temperatures(temperature_K)
