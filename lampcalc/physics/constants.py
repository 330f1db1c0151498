"""Physical and photometric constants.

The radiometric constants follow from the exact SI defining constants h, c and k
(CODATA 2018, identical in scipy.constants); the derived ones (sigma, a, c1, c2, the
Wien constants) are computed from them here so that ``import lampcalc`` does not pay
for importing scipy. ``tests/test_constants.py`` checks every value against
``scipy.constants``.

Colorimetry uses a different second radiation constant: CIE 015:2018 (clause 3.1,
in line with ITS-90) defines the Planckian radiator for the locus with
``C2_CIE_mK = 1.4388e-2`` m·K, not the CODATA value ``C2_mK = 1.438776877e-2``.
"""

import math

#: Planck constant, J·s (exact, SI 2019).
H_Js = 6.62607015e-34
#: Speed of light in vacuum, m/s (exact).
C_m_per_s = 299792458.0
#: Boltzmann constant, J/K (exact).
K_J_per_K = 1.380649e-23

#: Stefan–Boltzmann constant, W·m⁻²·K⁻⁴: 2π⁵k⁴ / (15h³c²).
SIGMA_W_per_m2K4 = 2 * math.pi**5 * K_J_per_K**4 / (15 * H_Js**3 * C_m_per_s**2)
#: Radiation constant a = 4σ/c, J·m⁻³·K⁻⁴ (energy density u = aT⁴).
A_J_per_m3K4 = 4 * SIGMA_W_per_m2K4 / C_m_per_s
#: First radiation constant for spectral radiance, c1L = 2hc², W·m²·sr⁻¹.
C1L_Wm2_per_sr = 2 * H_Js * C_m_per_s**2
#: First radiation constant, c1 = 2πhc², W·m².
C1_Wm2 = math.pi * C1L_Wm2_per_sr
#: Second radiation constant, c2 = hc/k, m·K (CODATA).
C2_mK = H_Js * C_m_per_s / K_J_per_K
#: Second radiation constant of the colorimetric Planckian radiator (CIE 015:2018).
C2_CIE_mK = 1.4388e-2


def _wien_root(n):
    """Root x > 0 of x = n·(1 − e^−x): the peak of Planck's law in x = hν/kT form."""
    x = float(n)
    for _ in range(60):
        f = x - n * (1 - math.exp(-x))
        x -= f / (1 - n * math.exp(-x))
    return x


#: x = hc/(λkT) at the peak of the per-wavelength spectrum: x = 5(1 − e⁻ˣ).
WIEN_X_WAVELENGTH = _wien_root(5)
#: x = hν/(kT) at the peak of the per-frequency spectrum: x = 3(1 − e⁻ˣ).
WIEN_X_FREQUENCY = _wien_root(3)
#: Wien wavelength displacement constant b = hc/(k·x₅), m·K.
WIEN_B_mK = C2_mK / WIEN_X_WAVELENGTH
#: Wien frequency displacement constant ν_max/T = x₃·k/h, Hz/K.
WIEN_FREQUENCY_Hz_per_K = WIEN_X_FREQUENCY * K_J_per_K / H_Js

#: Maximum luminous efficacy for photopic vision, lm/W (CIE 015:2018; 683.002 at 555 nm is
#: the exact SI value at 540 THz, 683 the conventional one used for V(λ)).
KM_lm_per_W = 683.0
#: Maximum luminous efficacy for scotopic vision, lm/W (CIE 015:2018).
KM_SCOTOPIC_lm_per_W = 1700.0
