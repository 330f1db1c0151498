"""Photometric sums: luminous and radiant quantities and luminous efficacies.

Every weighted integral is the sum Σ S(λ)·w(λ)·Δλ over the CIE 015:2018 grid (360–830 nm,
Δλ = 1 nm), not a trapezoid rule; Km = 683 lm/W (CIE 015:2018, clause 7.1). Spectra have
shape ``(..., 471)``.
"""

import numpy as np

from ..physics.blackbody import radiant_exitance, spectral_radiance
from ..physics.constants import KM_lm_per_W
from ..spectra.resampling import GRID_NM
from ..spectra.row_products import row_dot
from ..spectra.tables import luminous_efficiency
from .tristimulus import ratio_or_nan


def radiant_quantity(values):
    """Σ S·Δλ over the grid: radiant flux (W), irradiance (W/m²) or radiance, by the spectrum's unit."""
    return np.asarray(values, dtype=float).sum(axis=-1)


def luminous_quantity(values):
    """Km·Σ V(λ)·S·Δλ: luminous flux (lm), illuminance (lx) or luminance (cd/m²).

    The unit follows the spectrum's (lm for W/nm, lx for W/(m² nm), cd/m² for W/(sr m² nm)); Km = 683 lm/W.
    """
    return KM_lm_per_W * row_dot(values, luminous_efficiency())


def luminous_efficacy_of_radiation(values):
    """LER = Km·Σ V·S / Σ S, lm/W, over the grid (360–830 nm) where the spectrum is measured.

    This is the efficacy of the radiation, not of the lamp: a lamp's efficacy divides
    the luminous flux by the electrical power instead.

    Examples
    --------
    >>> from lampcalc.physics.blackbody import spectral_radiance
    >>> from lampcalc.spectra.resampling import GRID_NM
    >>> round(float(luminous_efficacy_of_radiation(spectral_radiance(3000.0, GRID_NM))), 1)
    130.2
    """
    values = np.asarray(values, dtype=float)
    return ratio_or_nan(luminous_quantity(values), radiant_quantity(values))


def luminous_efficacy_of_blackbody(temperature_K):
    """Luminous efficacy of blackbody radiation over all wavelengths, lm/W.

    Km·Σ V(λ)·M_λ·Δλ over 360–830 nm at 1 nm (V(λ) is zero outside) divided by the
    total exitance σT⁴. It peaks near 95 lm/W around 6600 K.
    """
    m = np.pi * spectral_radiance(temperature_K, GRID_NM)
    return KM_lm_per_W * (m @ luminous_efficiency()) / radiant_exitance(temperature_K)
